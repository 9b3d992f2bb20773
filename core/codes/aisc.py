"""AISC 360-16 clauses for steel plates (from memory)."""

from __future__ import annotations

OMEGA_B = 1.67  # AISC 360-16 F1, ASD


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
