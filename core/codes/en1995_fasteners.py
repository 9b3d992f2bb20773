"""EN 1995-1-1:2004+A1:2008 rules for dowel-type fasteners: the minimum spacings and
distances of bolts (Table 8.4), the effective number along the grain (8.5.1.1(4)), the
slip modulus K_ser (Table 7.1) and splitting by a force perpendicular to the grain
(8.1.4), with K_u (7.1(4)), the joint's creep (2.3.2.2) and the effective spacing of
Annex B. All from memory; verify against the current edition and the national annex.

d and distances in m; densities in kg/m^3; alpha the angle between force and grain, deg.
"""

from __future__ import annotations

import math


def a1(d: float, alpha: float) -> float:
    """Table 8.4: spacing parallel to grain (in a row along the grain), (4 + |cos a|) d."""
    return (4 + abs(math.cos(math.radians(alpha)))) * d


def a2(d: float) -> float:
    """Table 8.4: spacing perpendicular to grain (between rows), 4 d."""
    return 4 * d


def a3t(d: float) -> float:
    """Table 8.4: loaded end, max(7 d, 80 mm)."""
    return max(7 * d, 0.080)


def a3c(d: float, alpha: float) -> float:
    """Table 8.4: unloaded end: 90 <= a < 150: max((1 + 6 sin a) d, 4 d); 150 <= a < 210:
    4 d; 210 <= a <= 270: max((1 + 6 |sin a|) d, 4 d).
    """
    s = abs(math.sin(math.radians(alpha)))
    a = alpha % 360
    if 150 <= a < 210:
        return 4 * d
    return max((1 + 6 * s) * d, 4 * d)


def a4t(d: float, alpha: float) -> float:
    """Table 8.4: loaded edge, max((2 + 2 sin a) d, 3 d)."""
    return max((2 + 2 * math.sin(math.radians(alpha))) * d, 3 * d)


def a4c(d: float) -> float:
    """Table 8.4: unloaded edge, 3 d."""
    return 3 * d


def n_ef(n: int, a_1: float, d: float, alpha: float = 0.0) -> float:
    """8.5.1.1(4), bolts in a row along the grain loaded parallel to it:
    n_ef = min(n, n^0.9 (a1 / (13 d))^0.25); perpendicular to the grain n_ef = n
    (between, EN 1995-1-1 (8.35) interpolates linearly; here the parallel value is used
    below 90 degrees, conservative).
    """
    if n <= 1 or abs(alpha % 180 - 90) < 1e-9:
        return float(n)
    count = float(n)
    return min(count, math.pow(count, 0.9) * math.pow(a_1 / (13 * d), 0.25))


def K_ser_dowel(rho_m: float, d: float) -> float:
    """Table 7.1: bolts, dowels, screws and nails predrilled, rho_m^1.5 d / 23 in N/mm
    with d in mm. Returns N/m.
    """
    return math.pow(rho_m, 1.5) * (d * 1000) / 23 * 1000


def K_ser_nail(rho_m: float, d: float) -> float:
    """Table 7.1: nails without predrilling, rho_m^1.5 d^0.8 / 30 in N/mm (d in mm).
    Returns N/m.
    """
    return math.pow(rho_m, 1.5) * math.pow(d * 1000, 0.8) / 30 * 1000


def F90_Rk(b: float, h_e: float, h: float, w: float = 1.0) -> float:
    """8.1.4 (8.4): splitting capacity of softwood, F90,Rk = 14 b w sqrt(h_e / (1 - h_e / h))
    in N with b, h_e, h in mm. Returns N.
    """
    he, hh, bb = h_e * 1000, h * 1000, b * 1000
    return 14 * bb * w * math.sqrt(he / (1 - he / hh))


def rho_m_joint(rho_m1: float, rho_m2: float) -> float:
    """7.1(2): two wood-based members of different mean density, rho_m = sqrt(rho_m1
    rho_m2), kg/m^3.
    """
    return math.sqrt(rho_m1 * rho_m2)


def K_ser(kind: str, rho_m: float, d: float, predrilled: bool = False,
          steel_to_timber: bool = False) -> float:
    """Table 7.1 slip modulus per shear plane per fastener for serviceability, N/m:
    dowels, bolts, screws (lag screws among them) and predrilled nails rho_m^1.5 d / 23,
    nails without predrilling rho_m^1.5 d^0.8 / 30 (N/mm, d in mm); 7.1(3): steel-to-timber
    joints take twice the value of the timber (rho_m of the timber).

    Args:
        kind: "screw", "lag-screw", "bolt" or "nail".
        rho_m: mean density, kg/m^3 (rho_m_joint for two timbers).
        d: diameter, m.
        predrilled: nails in predrilled holes.
        steel_to_timber: one member is steel.

    """
    if kind == "nail" and not predrilled:
        value = K_ser_nail(rho_m, d)
    else:
        value = K_ser_dowel(rho_m, d)
    return 2 * value if steel_to_timber else value


def K_u(K_ser_value: float) -> float:
    """7.1(4): slip modulus for the ultimate limit states, K_u = 2/3 K_ser."""
    return 2 * K_ser_value / 3


def s_ef(s_min: float, s_max: float | None = None) -> float:
    """Annex B (from memory): where the spacing varies with the shear force between s_min
    and s_max (<= 4 s_min), s_ef = 0.75 s_min + 0.25 s_max; constant spacing: s_min. m.
    """
    return s_min if s_max is None else 0.75 * s_min + 0.25 * s_max


def k_def_joint(k_def_1: float, k_def_2: float | None) -> float:
    """2.3.2.2(3), (4) (from memory): creep factor of a joint. Two timbers of the same
    creep: 2 k_def; of different creep: 2 sqrt(k_def,1 k_def,2); steel to timber
    (``k_def_2`` None): the timber's k_def.
    """
    if k_def_2 is None:
        return k_def_1
    return 2 * math.sqrt(k_def_1 * k_def_2)
