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
    h < 600 mm; LVL: see :func:`k_h_lvl` (1.0 here). h in m.
    """
    h = depth * 1000.0
    if product == "glulam":
        return min((600 / h) ** 0.1, 1.1) if h < 600 else 1.0
    if product == "sawn":
        return min((150 / h) ** 0.2, 1.3) if h < 150 else 1.0
    return 1.0


#: EN 1995-1-1 3.4(3) / 3.4(4) reference sizes of LVL (from memory): depth 300 mm in
#: bending, length 3,000 mm in tension, m.
LVL_DEPTH_REF = 0.300
LVL_LENGTH_REF = 3.000


def k_h_lvl(depth: float, s: float | None) -> float | None:
    """EN 1995-1-1 3.4(3) depth factor of LVL in edgewise bending (from memory):
    k_h = min((300/h)^s, 1.2), s the product's declared size effect exponent (3.4(5),
    EN 14374). Without s: 1.0 up to 300 mm (no increase taken: conservative); None
    deeper, where the factor reduces the strength and cannot be found.
    """
    if s is None:
        return 1.0 if depth <= LVL_DEPTH_REF + 1e-12 else None
    return float(min((LVL_DEPTH_REF / depth) ** s, 1.2))


def k_l_lvl(length: float, s: float | None) -> float | None:
    """EN 1995-1-1 3.4(4) length factor of LVL in tension parallel to the grain (from
    memory): k_l = min((3000/l)^(s/2), 1.1), l the member's length. Without s: 1.0 up to
    3 m (conservative); None longer.
    """
    if s is None:
        return 1.0 if length <= LVL_LENGTH_REF + 1e-12 else None
    return float(min((LVL_LENGTH_REF / length) ** (s / 2), 1.1))


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


def sigma_m_crit(b: float, h: float, E_005: float, l_ef: float) -> float:
    """EN 1995-1-1 6.3.3 (6.32), rectangular softwood section (from memory):
    sigma_m,crit = 0.78 b^2 E_0,05 / (h l_ef). b, h, l_ef in m; E in Pa; returns Pa.
    """
    return 0.78 * b**2 * E_005 / (h * l_ef)


def lambda_rel_m(f_mk: float, sigma_crit: float) -> float:
    """EN 1995-1-1 6.3.3 (6.30): lambda_rel,m = sqrt(f_m,k / sigma_m,crit)."""
    return float((f_mk / sigma_crit) ** 0.5)


def k_crit(lambda_rel: float) -> float:
    """EN 1995-1-1 6.3.3 (6.34), from memory: 1 (lambda <= 0.75),
    1.56 - 0.75 lambda (0.75 < lambda <= 1.4), 1 / lambda^2 (lambda > 1.4).
    """
    if lambda_rel <= 0.75:
        return 1.0
    if lambda_rel <= 1.4:
        return 1.56 - 0.75 * lambda_rel
    return 1.0 / lambda_rel**2


#: EN 1995-1-1 Table 6.1 l_ef / l (from memory).
L_EF_RATIO = {"simply supported, uniform load": 0.9, "simply supported, point load at centre":
              0.8, "constant moment": 1.0, "cantilever, uniform load": 0.5,
              "cantilever, point load at free end": 0.8}


def l_ef(length: float, case: str, h: float, load_on: str = "compression edge") -> float:
    """EN 1995-1-1 Table 6.1 and 6.3.3(3) effective length (from memory): l_ef/l by case,
    plus 2h where the load acts on the compression edge, less 0.5h on the tension edge.
    m.
    """
    base = L_EF_RATIO[case] * length
    if load_on == "compression edge":
        return base + 2 * h
    if load_on == "tension edge":
        return base - 0.5 * h
    return base


def k_c(lambda_rel_c: float, product: str) -> float:
    """EN 1995-1-1 6.3.2 (6.25)-(6.29), from memory: k = 0.5 (1 + beta_c (lambda_rel -
    0.3) + lambda_rel^2), k_c = 1 / (k + sqrt(k^2 - lambda_rel^2)); beta_c 0.2 solid timber,
    0.1 glulam and LVL; k_c = 1 where lambda_rel <= 0.3.
    """
    if lambda_rel_c <= 0.3:
        return 1.0
    beta = 0.2 if product == "sawn" else 0.1
    k = 0.5 * (1 + beta * (lambda_rel_c - 0.3) + lambda_rel_c**2)
    return float(1.0 / (k + (k * k - lambda_rel_c**2) ** 0.5))


def lambda_rel_c(l_ef: float, least: float, f_c0k: float, E_005: float) -> float:
    """EN 1995-1-1 6.3.2 (6.21): lambda = l_ef / i with i = b / sqrt(12) for a rectangle,
    lambda_rel,c = (lambda / pi) sqrt(f_c,0,k / E_0,05).
    """
    import math

    lam = l_ef / (least / math.sqrt(12))
    return float(lam / math.pi * math.sqrt(f_c0k / E_005))
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


def k_n(product: str) -> float:
    """EN 1995-1-1 6.5.2(2), from memory: 5 for solid timber, 6.5 for glulam, 4.5 for
    LVL.
    """
    return {"glulam": 6.5, "lvl": 4.5}.get(product, 5.0)


def k_v(product: str, h: float, h_ef: float, x: float, i: float = 0.0) -> float:
    """EN 1995-1-1 6.5.2(2), equation (6.62), from memory: a beam notched on the side of
    the support, k_v = min(1, k_n (1 + 1.1 i^1.5 / sqrt(h)) / (sqrt(h) (sqrt(alpha
    (1 - alpha)) + 0.8 (x / h) sqrt(1 / alpha - alpha^2)))), h in mm, alpha = h_ef / h,
    x the distance from the line of action of the reaction to the notch corner, i the
    notch inclination (0: a square notch).
    """
    h_mm = h * 1000.0
    a = h_ef / h
    num = k_n(product) * (1 + 1.1 * i**1.5 / h_mm**0.5)
    den = h_mm**0.5 * ((a * (1 - a)) ** 0.5 + 0.8 * (x / h) * (1 / a - a * a) ** 0.5)
    return float(min(1.0, num / den))
