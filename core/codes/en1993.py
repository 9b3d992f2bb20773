"""EN 1993-1-1 clauses for steel plates (from memory)."""

from __future__ import annotations

import math

GAMMA_M1 = 1.0  # EN 1993-1-1 6.1 recommended value
#: EN 1993-1-1 Table 6.3 imperfection factors; Table 6.4 gives curve d for "other
#: cross-sections" (a flat plate bent about its major axis).
ALPHA_LT = {"a": 0.21, "b": 0.34, "c": 0.49, "d": 0.76}


def M_cr_plate(E: float, G: float, d: float, t: float, L: float, C1: float = 1.0) -> float:
    """Elastic critical moment of a flat plate (warping constant I_w ~ 0), EN 1993-1-1
    6.3.2.2 with the classical formula M_cr = C1 (pi / L) sqrt(E I_z G I_t), I_z = d t^3
    / 12, I_t = d t^3 / 3 (thin rectangle). N m.
    """
    Iz = d * t**3 / 12
    It = d * t**3 / 3
    return C1 * math.pi / L * math.sqrt(E * Iz * G * It)


def chi_LT(lambda_LT: float, curve: str = "d") -> float:
    """EN 1993-1-1 6.3.2.2 (6.56) reduction factor for lateral torsional buckling:
    Phi = 0.5 [1 + alpha (lambda - 0.2) + lambda^2], chi = 1 / (Phi + sqrt(Phi^2 -
    lambda^2)) <= 1.
    """
    a = ALPHA_LT[curve]
    phi = 0.5 * (1 + a * (lambda_LT - 0.2) + lambda_LT**2)
    return min(1.0, 1.0 / (phi + math.sqrt(phi * phi - lambda_LT**2)))
