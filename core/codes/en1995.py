"""EN 1995-1-1:2004+A1:2008 factors (timber) and EN 1993-1-1 partial factors, from memory.

Values are the recommended ones; national annexes may change them.
"""

from __future__ import annotations

import math

from ..model.combination import EU_DURATIONS

#: EN 1995-1-1 Table 3.1: k_mod for solid timber, glulam and LVL, service classes 1 and
#: 2 (same values) and 3.
K_MOD = {
    1: {"permanent": 0.6, "long-term": 0.7, "medium-term": 0.8, "short-term": 0.9,
        "instantaneous": 1.1},
    2: {"permanent": 0.6, "long-term": 0.7, "medium-term": 0.8, "short-term": 0.9,
        "instantaneous": 1.1},
    3: {"permanent": 0.5, "long-term": 0.55, "medium-term": 0.65, "short-term": 0.7,
        "instantaneous": 0.9},
}


def k_mod(duration: str, service_class: int) -> float:
    """EN 1995-1-1 3.1.3 and Table 3.1 modification factor (solid timber, glulam, LVL)."""
    if duration not in K_MOD[service_class]:
        raise ValueError(f"unknown EU load duration {duration!r}; use one of "
                         + ", ".join(EU_DURATIONS))
    return K_MOD[service_class][duration]


def gamma_M(product: str) -> float:
    """EN 1995-1-1 Table 2.3 partial factor: solid timber 1.3, glulam 1.25, LVL 1.2."""
    return {"glulam": 1.25, "lvl": 1.2}.get(product, 1.3)


def k_h(depth: float, product: str) -> float:
    """Depth factor for bending. Solid timber (3.2(3), rho_k <= 700 kg/m3):
    min((150/h)^0.2, 1.3) for h < 150 mm; glulam (3.3(3)): min((600/h)^0.1, 1.1) for
    h < 600 mm; LVL 1.0 here (the manufacturer's size effect governs). h in m.
    """
    h = depth * 1000.0
    if product == "glulam":
        return min((600 / h) ** 0.1, 1.1) if h < 600 else 1.0
    if product == "sawn":
        return min((150 / h) ** 0.2, 1.3) if h < 150 else 1.0
    return 1.0


def k_cr(product: str) -> float:
    """EN 1995-1-1 6.1.7(2) crack factor for shear: 0.67 for solid timber and glulam;
    1.0 for LVL and other products.
    """
    return 0.67 if product in ("sawn", "glulam") else 1.0


def k_def(service_class: int) -> float:
    """EN 1995-1-1 Table 3.2 for solid timber, glulam and LVL: 0.6, 0.8, 2.0."""
    return {1: 0.6, 2: 0.8, 3: 2.0}[service_class]


GAMMA_M0 = 1.0  # EN 1993-1-1 6.1 recommended value
GAMMA_M_CONNECTION = 1.3  # EN 1995-1-1 Table 2.3, connections


# --- EN 1995-1-1 7.3.3: residential floors (vibration), from memory ------------------

#: EN 1995-1-1 7.3.3(1): below this fundamental frequency a special investigation is
#: needed (the method of 7.3.3(2)-(5) does not apply). Hz.
F_1_LIMIT = 8.0
#: The static point load of the stiffness criterion (7.3), N.
F_POINT = 1000.0


def f_1(span: float, EI_l: float, m: float) -> float:
    """EN 1995-1-1 7.3.3(3), Eq. (7.5): fundamental frequency of a rectangular floor
    simply supported along its four edges (or two), f_1 = (pi / (2 l^2)) sqrt((EI)_l / m).

    Args:
        span: l, m.
        EI_l: equivalent plate bending stiffness about an axis perpendicular to the
            beams, N m^2/m.
        m: mass per unit area, kg/m^2.

    Returns:
        Hz.

    """
    return math.pi / (2 * span**2) * math.sqrt(EI_l / m)


def w_over_F(span: float, EI: float) -> float:
    """Instantaneous deflection per unit static point load of one simply supported
    member under a load at midspan, w / F = l^3 / (48 EI) (beam formula), used for the
    stiffness criterion of EN 1995-1-1 7.3.3(2), Eq. (7.3), without the floor's lateral
    distribution (conservative). span m, EI N m^2. Returns m/N.
    """
    return span**3 / (48 * EI)


def n_40(f1: float, width: float, span: float, EI_l: float, EI_b: float) -> float:
    """EN 1995-1-1 7.3.3(5), Eq. (7.7): number of first-order modes with natural
    frequencies up to 40 Hz, n_40 = {((40/f_1)^2 - 1)(b/l)^4 (EI)_l/(EI)_b}^0.25.
    Where f_1 >= 40 Hz no mode lies below 40 Hz and 0 is returned.

    Args:
        f1: fundamental frequency, Hz.
        width: b, floor width, m.
        span: l, m.
        EI_l: bending stiffness along the beams, N m^2/m.
        EI_b: bending stiffness across the beams, N m^2/m.

    """
    bracket = (40.0 / f1) ** 2 - 1.0
    if bracket <= 0:
        return 0.0
    return float((bracket * (width / span) ** 4 * EI_l / EI_b) ** 0.25)


def v_unit_impulse(n40: float, m: float, width: float, span: float) -> float:
    """EN 1995-1-1 7.3.3(5), Eq. (7.6): unit impulse velocity response,
    v = 4 (0.4 + 0.6 n_40) / (m b l + 200), m/(N s^2); m kg/m^2, b and l in m.
    """
    return 4.0 * (0.4 + 0.6 * n40) / (m * width * span + 200.0)


def v_limit(b: float, f1: float, zeta: float) -> float:
    """EN 1995-1-1 7.3.3(2), Eq. (7.4): limit of the unit impulse velocity response,
    b^(f_1 zeta - 1), m/(N s^2); b from Figure 7.2 or the national annex, zeta the modal
    damping ratio (7.3.1(5): 0.01 unless other values are proven).
    """
    return float(b ** (f1 * zeta - 1.0))

#: Defaults of the 7.3.3(2) criteria where the user gives none: a = 1.5 mm/kN and
#: b = 100, a pair inside the recommended ranges of EN 1995-1-1 Figure 7.2 and on its
#: a-b relation (b = 160 - 40 a for a > 1 mm/kN), national-annex style values recalled
#: from memory. National annexes set their own: give yours in design.vibration.
A_DEFAULT = 1.5e-6  # m/N (1.5 mm/kN)
B_DEFAULT = 100.0
#: EN 1995-1-1 7.3.1(5): modal damping ratio unless other values are proven.
ZETA_DEFAULT = 0.01
