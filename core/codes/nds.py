"""NDS 2018 adjustment factors for sawn lumber, glulam and LVL (ASD), from memory.

Each function is small and pure and cites its clause; values are dimensionless.
"""

from __future__ import annotations

import math

from ..model.combination import US_DURATIONS
from ..model.constants import INCH, PSI

#: NDS 2018 Table 2.3.2 load duration factors (from memory).
C_D_TABLE = {"permanent": 0.9, "ten-years": 1.0, "two-months": 1.15, "seven-days": 1.25,
             "ten-minutes": 1.6, "impact": 2.0}



def C_D(duration: str) -> float:
    """NDS 2018 2.3.2 load duration factor (Table 2.3.2). Applies to Fb, Fv, Ft, Fc and
    connections, not to Fc_perp or E.
    """
    if duration not in C_D_TABLE:
        raise ValueError(f"unknown US load duration {duration!r}; use one of "
                         + ", ".join(US_DURATIONS))
    return C_D_TABLE[duration]


def C_M(value: str, product: str, wet: bool, Fb_times_CF: float | None = None) -> float:
    """Wet service factor. Sawn lumber: NDS Supplement Table 4A adjustment factors
    (Fb 0.85 only where Fb C_F > 1150 psi, Ft 1.0, Fv 0.97, Fc_perp 0.67, Fc 0.8 where
    Fc C_F > 750 psi, E and Emin 0.9). Glulam: NDS Supplement Table 5A footnote (Fb 0.8,
    Fv 0.875, Fc_perp 0.53, E 0.833). LVL: taken as glulam (manufacturer governs).
    """
    if not wet:
        return 1.0
    if product == "sawn":
        if value == "Fb":
            return 0.85 if (Fb_times_CF or 0.0) > 1150 * PSI else 1.0
        return {"Fv": 0.97, "Fc_perp": 0.67, "E": 0.9, "Emin": 0.9, "Ft": 1.0,
                "Fc": 0.8}.get(value, 1.0)
    return {"Fb": 0.8, "Fv": 0.875, "Fc_perp": 0.53, "E": 0.833, "Emin": 0.833,
            "Ft": 0.8, "Fc": 0.73}.get(value, 1.0)


def C_t(value: str, temperature: str, wet: bool) -> float:
    """NDS 2018 2.3.3 temperature factor (Table 2.3.3): 'normal' is T <= 100 F."""
    if temperature == "normal":
        return 1.0
    if value in ("E", "Emin", "Ft"):
        return 0.9
    if temperature == "up-to-125F":
        return 0.7 if wet else 0.8
    return 0.5 if wet else 0.7


def C_F(depth: float, product: str, size_adjusted: bool, grade_rule: str = "",
        thickness: float | None = None) -> float:
    """Size factor for bending.

    Sawn visually graded dimension lumber (NDS Supplement Table 4A, Select Structural to
    No.3, from memory), by the width of the face that is the depth in bending (actual
    sizes): 2 in and 3 in thick: up to 3.5 in (2x4) 1.5; 4.5 in 1.4; 5.5 in (2x6) 1.3;
    7.25 in (2x8) 1.2; 9.25 in (2x10) 1.1; 11.25 in (2x12) 1.0; deeper 0.9. 4 in thick:
    up to 3.5 in 1.5, 4.5 in 1.4, 5.5 in 1.3, 7.25 in 1.3, 9.25 in 1.2, 11.25 in 1.1,
    wider 1.0. Size-adjusted values (Table 4B Southern Pine) 1.0 up to 12 in, deeper
    (12/d)^(1/9) (NDS 4.3.6.2). LVL: (12/d)^(1/9), typical of manufacturers (their
    values govern). Glulam uses C_V instead (returns 1.0).

    Args:
        depth: the width of the member's face that lies in the plane of bending: the
            ply's height when edgewise; for flat use the wider face (C_fu applies), m.
        thickness: the other dimension, m (None: 2x-3x lumber).

    """
    d = depth / INCH
    four_inch = thickness is not None and 3.0 + 1e-6 < thickness / INCH <= 4.0 + 1e-6
    if product == "glulam":
        return 1.0
    if product == "lvl" or size_adjusted:
        return 1.0 if d <= 12 else (12 / d) ** (1 / 9)
    if product != "sawn":
        return 1.0
    table = ((3.5, 1.5), (4.5, 1.4), (5.5, 1.3), (7.25, 1.3), (9.25, 1.2), (11.25, 1.1)) if (
        four_inch) else ((3.5, 1.5), (4.5, 1.4), (5.5, 1.3), (7.25, 1.2), (9.25, 1.1),
                         (11.25, 1.0))
    for limit, factor in table:
        if d <= limit + 1e-6:
            return factor
    return 1.0 if four_inch else 0.9


def C_V(length: float, depth: float, width: float, southern_pine: bool = False) -> float:
    """NDS 2018 5.3.6 glulam volume factor (5.3-1), from memory:
    C_V = (21/L)^(1/x) (12/d)^(1/x) (5.125/b)^(1/x) <= 1.0, x = 10 (20 for Southern Pine);
    L in ft, d and b in in.
    """
    x = 20.0 if southern_pine else 10.0
    L_ft = length / 0.3048
    d = depth / INCH
    b = width / INCH
    return float(min(1.0, (21 / L_ft) ** (1 / x) * (12 / d) ** (1 / x) * (5.125 / b) ** (1 / x)))


def C_i(value: str, incised: bool) -> float:
    """NDS 2018 4.3.8 incising factor (Table 4.3.8): Fb, Ft, Fc, Fv 0.80; E, Emin 0.95;
    Fc_perp 1.00.
    """
    if not incised:
        return 1.0
    return {"E": 0.95, "Emin": 0.95, "Fc_perp": 1.0}.get(value, 0.80)


#: The thickest sawn member that is dimension lumber (2 in to 4 in nominal, NDS 2018
#: 4.3.9; actual sizes up to 3.5 in dressed, 4 in rough), m.
DIMENSION_LUMBER_MAX = 4.0 * INCH


def C_r(repetitive: bool, product: str, thickness: float | None = None) -> float:
    """NDS 2018 4.3.9 repetitive member factor: 1.15 for dimension lumber (2 in to 4 in
    thick) in a repetitive system (the user's declaration); 1.0 for timbers (5 in and
    thicker, NDS Supplement Table 4D), glulam, LVL and steel. ``thickness``: the ply's
    lesser dimension, m (None: taken as dimension lumber).
    """
    if not repetitive or product != "sawn":
        return 1.0
    if thickness is not None and thickness > DIMENSION_LUMBER_MAX + 1e-9:
        return 1.0
    return 1.15


def C_b(bearing_length: float, at_end: bool) -> float:
    """NDS 2018 3.10.4 bearing area factor: (l_b + 0.375)/l_b for bearings shorter than
    6 in and at least 3 in from the member's end; 1.0 otherwise (l_b in in).
    """
    lb = bearing_length / INCH
    if at_end or lb >= 6:
        return 1.0
    return (lb + 0.375) / lb


#: NDS 2018 Table 3.3.3 effective-length cases (from memory).
LE_CASES = ("single span, uniform load", "single span, point load at centre",
            "cantilever, uniform load", "cantilever, point load at free end", "any other case")


def effective_length(unbraced: float, depth: float,
                     case: str = "single span, uniform load") -> float:
    """NDS 2018 Table 3.3.3 effective length l_e (from memory), m.

    single span, uniform load: 2.06 l_u (l_u/d < 7), 1.63 l_u + 3d (l_u/d >= 7); single
    span, point load at centre: 1.80 l_u / 1.37 l_u + 3d; cantilever, uniform load:
    1.33 l_u / 0.90 l_u + 3d; cantilever, point load at the free end: 1.87 l_u /
    1.44 l_u + 3d; any other case: 2.06 l_u (l_u/d < 7), 1.63 l_u + 3d (7 <= l_u/d <=
    14.3), 1.84 l_u (l_u/d > 14.3).
    """
    ratio = unbraced / depth
    short, long_a = {
        "single span, uniform load": (2.06, 1.63), "single span, point load at centre":
        (1.80, 1.37), "cantilever, uniform load": (1.33, 0.90),
        "cantilever, point load at free end": (1.87, 1.44), "any other case": (2.06, 1.63),
    }[case]
    if ratio < 7:
        return short * unbraced
    if case == "any other case" and ratio > 14.3:
        return 1.84 * unbraced
    return long_a * unbraced + 3 * depth


def R_B(effective: float, depth: float, breadth: float) -> float:
    """NDS 2018 3.3.3.6 slenderness ratio R_B = sqrt(l_e d / b^2) (3.3-5), from memory;
    it shall not exceed 50 (3.3.3.7). Dimensionless.
    """
    return math.sqrt(effective * depth / breadth**2)


def C_L(Fb_star: float, Emin_adj: float, depth: float, breadth: float, unbraced: float,
        case: str = "single span, uniform load") -> float:
    """NDS 2018 3.3.3 beam stability factor (3.3-6), from memory:
    R_B = sqrt(l_e d / b^2), F_bE = 1.20 E'min / R_B^2,
    C_L = (1 + F_bE/Fb*)/1.9 - sqrt(((1 + F_bE/Fb*)/1.9)^2 - (F_bE/Fb*)/0.95), with Fb*
    the reference value times every factor but C_fu, C_V and C_L (the combination's C_D
    included). Stresses in Pa, lengths in m.
    """
    le = effective_length(unbraced, depth, case)
    RB2 = le * depth / breadth**2
    FbE = 1.20 * Emin_adj / RB2
    a = FbE / Fb_star
    k = (1 + a) / 1.9
    return float(k - math.sqrt(k * k - a / 0.95))


def C_fu(width: float, thickness: float) -> float:
    """NDS Supplement Table 4A flat use factor (dimension lumber used flatwise, from
    memory), by the wide face ``width`` and the ``thickness``, m: 2-3 in thick: width
    2-3 in 1.0, 4 in 1.1, 5 in 1.1, 6 in 1.15, 8 in 1.15, 10 in and wider 1.2; 4 in
    thick: 4 in 1.0, 5-8 in 1.05, 10 in and wider 1.1.

    The table is by nominal size; a width is read as the largest nominal width whose
    dressed width (2x4 3.5 in, 2x6 5.5 in, 2x10 9.25 in, ...) it reaches, so a width
    between two sizes takes the smaller factor.
    """
    w, t = width / INCH, thickness / INCH
    steps = (((9.25, 1.2), (5.5, 1.15), (3.5, 1.1)) if t <= 3.0 + 1e-6
             else ((9.25, 1.1), (4.5, 1.05)))
    for reached, f in steps:
        if w >= reached - 1e-6:
            return f
    return 1.0


def K_cr(wet_service: bool) -> float:
    """NDS 2018 3.5.2 creep factor (from memory): 1.5 for seasoned lumber and glulam in
    dry service, 2.0 in wet service. Dimensionless.
    """
    return 2.0 if wet_service else 1.5


def C_F_compression(width: float) -> float:
    """NDS Supplement Table 4A size factor for Fc of 2 in to 4 in thick dimension lumber
    (from memory), by the wide face: up to 4 in 1.15, 5 in 1.1, 6 in 1.1, 8 in 1.05,
    10 in and 12 in 1.0, wider 0.9.
    """
    w = width / INCH
    for limit, f in ((3.5, 1.15), (4.5, 1.1), (5.5, 1.1), (7.25, 1.05), (11.25, 1.0)):
        if w <= limit + 1e-6:
            return f
    return 0.9


def C_P(Fc_star: float, Emin_adj: float, effective: float, least: float,
        product: str) -> float:
    """NDS 2018 3.7.1 column stability factor (3.7-1), from memory: F_cE = 0.822 E'min /
    (l_e / d)^2, C_P = (1 + F_cE/Fc*)/(2c) - sqrt(((1 + F_cE/Fc*)/(2c))^2 - (F_cE/Fc*)/c),
    c = 0.8 sawn lumber, 0.9 glulam and structural composite lumber.
    """
    FcE = 0.822 * Emin_adj / (effective / least) ** 2
    c = 0.8 if product == "sawn" else 0.9
    a = FcE / Fc_star
    k = (1 + a) / (2 * c)
    return float(k - math.sqrt(k * k - a / c))


def F_cE(Emin_adj: float, effective: float, least: float) -> float:
    """NDS 2018 3.7.1 / 3.9.2 critical buckling design value 0.822 E'min / (l_e/d)^2, Pa."""
    return 0.822 * Emin_adj / (effective / least) ** 2


def notch_tension_factor(d_n: float, d: float) -> float:
    """NDS 2018 3.4.3.2(a), equation 3.4-3 (from memory): a rectangular member notched
    on the tension face at its end, V'_r = (2/3) F'v b d_n (d_n / d)^2; written on the
    stress f_v = 3 V / (2 b d_n), the allowable is F'v times (d_n / d)^2.
    """
    return (d_n / d) ** 2


def d_e_compression_notch(d: float, d_n: float, e: float) -> float:
    """NDS 2018 3.4.3.2(c), equation 3.4-5 (from memory): a notch on the compression face
    at the end, V'_r = (2/3) F'v b [d - ((d - d_n) / d_n) e] for e <= d_n, and d_n in
    place of that bracket where e > d_n; returns the bracket (the effective depth).
    """
    return d - (d - d_n) / d_n * e if e <= d_n else d_n


def notch_depth_limit(at_end: bool, d: float) -> float:
    """NDS 2018 4.4.3 (from memory): a notch at the end of a sawn bending member at most
    d / 4 deep; elsewhere at most d / 6 (and never in the middle third of the span).
    """
    return d / 4 if at_end else d / 6
