"""The steel side of a bolt through a steel plate: the bolt's shear and the bearing at
the plate's hole (AISC 360-16 J3.6, J3.10; EN 1993-1-8 Table 3.4; all from memory).

The timber side of the same bolt is the yield limit of NDS 2018 12.3 / EN 1995-1-1 8.2;
these are its steel counterparts, taken conservatively where the geometry is a
simplification: threads in every shear plane, the least edge distance and the least
spacing of the plate's bolts in whatever direction the force has.
"""

from __future__ import annotations

import math

OMEGA_BOLT = 2.00  # AISC 360-16 J3.6 and J3.10, ASD (from memory)
GAMMA_M2 = 1.25  # EN 1993-1-8 Table 2.1 (from memory)
#: EN 1993-1-8 Table 3.4: alpha_v where the shear plane passes through the threads, the
#: lower value (grades 4.8, 5.8, 6.8, 10.9; 0.6 for 4.6, 5.6, 8.8), from memory.
ALPHA_V = 0.5
#: Tensile stress area over the gross area of ISO metric coarse threads, at most this for
#: M8 and larger (M8 36.6 / 50.3 = 0.728 mm^2, M12 84.3 / 113.1 = 0.745, M16 157 / 201 =
#: 0.781, M20 245 / 314 = 0.780; ISO 898-1, from memory): the lower bound taken.
STRESS_AREA_RATIO = 0.72


def aisc_shear(d: float, Fu_bolt: float) -> float:
    """Allowable shear of one plane, R_n / Omega, N: AISC 360-16 J3.6 (J3-1) with Table
    J3.2's F_nv = 0.450 F_u, threads not excluded (A307 27 ksi of F_u 60 ksi; Group A
    54 ksi of 120 ksi; from memory) on the nominal area A_b = pi d^2 / 4.
    """
    return 0.450 * Fu_bolt * math.pi * d * d / 4 / OMEGA_BOLT


def aisc_bearing(d: float, t: float, Fu_plate: float, clear: float) -> float:
    """Allowable bearing and tearout at one hole, R_n / Omega, N: AISC 360-16 J3.10(a)(1),
    deformation at the hole a design consideration: R_n = 1.2 l_c t F_u <= 2.4 d t F_u
    (J3-6a, J3-6c; from memory), l_c the least clear distance.
    """
    return min(1.2 * clear * t * Fu_plate, 2.4 * d * t * Fu_plate) / OMEGA_BOLT


def en_shear(d: float, fub: float) -> float:
    """Design shear of one plane, F_v,Rd, N: EN 1993-1-8 Table 3.4 alpha_v f_ub A_s /
    gamma_M2 with :data:`ALPHA_V` and A_s = :data:`STRESS_AREA_RATIO` pi d^2 / 4.
    """
    return ALPHA_V * fub * STRESS_AREA_RATIO * math.pi * d * d / 4 / GAMMA_M2


def en_bearing(d: float, d0: float, t: float, fu_plate: float, fub: float, e: float,
               p: float) -> float:
    """Design bearing at one hole, F_b,Rd = k1 alpha_b f_u d t / gamma_M2, N: EN 1993-1-8
    Table 3.4 with the end and edge bolt's factors and the inner bolt's both taken at
    their lowest over the plate (e the least edge or end distance, p the least spacing;
    math.inf where there is a single bolt): alpha_b = min(e / 3d0, p / 3d0 - 1/4,
    f_ub / f_u, 1), k1 = min(2.8 e / d0 - 1.7, 1.4 p / d0 - 1.7, 2.5); from memory.
    Zero where the geometry leaves nothing (the layout's own rules then fail).
    """
    alpha_b = min(e / (3 * d0), p / (3 * d0) - 0.25, fub / fu_plate, 1.0)
    k1 = min(2.8 * e / d0 - 1.7, 1.4 * p / d0 - 1.7, 2.5)
    return max(0.0, k1) * max(0.0, alpha_b) * fu_plate * d * t / GAMMA_M2
