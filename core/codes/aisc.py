"""AISC 360-16 clauses for steel plates (from memory)."""

from __future__ import annotations

import math

OMEGA_B = 1.67  # AISC 360-16 F1, ASD
OMEGA_T = 1.67  # AISC 360-16 D2(a), tensile yielding, ASD
OMEGA_C = 1.67  # AISC 360-16 E1, ASD


def rectangular_bar_Mn(Fy: float, E: float, d: float, t: float, L_b: float,
                       C_b: float = 1.0) -> tuple[float, str]:
    """AISC 360-16 F11 nominal flexural strength of a rectangular bar, as M_n / S.

    Major-axis bending (depth ``d`` in the plane of bending, thickness ``t``), per unit
    of the elastic section modulus S = t d^2 / 6 (from memory):

    L_b d / t^2 <= 0.08 E / F_y: M_n = M_p = F_y Z <= 1.6 M_y (F11-1; Z/S = 1.5);
    <= 1.9 E / F_y: M_n = C_b [1.52 - 0.274 (L_b d / t^2) F_y / E] M_y <= M_p (F11-2);
    beyond: M_n = F_cr S <= M_p, F_cr = 1.9 E C_b / (L_b d / t^2) (F11-3, F11-4).

    Returns (M_n / S in Pa, the equation used). Lengths in m, stresses in Pa.
    """
    slender = L_b * d / t**2
    mp = 1.5 * Fy  # Z / S = 1.5 for a rectangle, and 1.5 <= 1.6
    if slender <= 0.08 * E / Fy:
        return mp, "F11-1 (yielding)"
    if slender <= 1.9 * E / Fy:
        return min(C_b * (1.52 - 0.274 * slender * Fy / E) * Fy, mp), "F11-2 (inelastic LTB)"
    return min(1.9 * E * C_b / slender, mp), "F11-3 (elastic LTB)"


def compression_Fcr(Fy: float, E: float, L_c: float | None, r: float) -> tuple[float, str]:
    """AISC 360-16 E3 flexural buckling stress (from memory): F_e = pi^2 E / (L_c/r)^2;
    F_y / F_e <= 2.25: F_cr = 0.658^(F_y/F_e) F_y (E3-2), else 0.877 F_e (E3-3).
    ``L_c`` None: braced along its length (F_cr = F_y). Returns (F_cr, the equation).
    """
    if L_c is None or L_c <= 0.0:
        return Fy, "braced along its length: F_cr = F_y"
    Fe = math.pi ** 2 * E / (L_c / r) ** 2
    if Fy / Fe <= 2.25:
        return 0.658 ** (Fy / Fe) * Fy, "E3-2 (inelastic buckling)"
    return 0.877 * Fe, "E3-3 (elastic buckling)"
