"""Lateral torsional buckling of steel plates and their bending demand with creep.

Unbraced length L_b (the project's rule, stated on every check): the user's
``plate_unbraced_length``; else a vertical plate between two timbers is braced by them
(a flitch plate); a vertical plate on one face is braced at its fasteners, so L_b is the
largest gap between the given bolt stations, else the bolt spacing (the user's, else the
largest stock spacing, 24 in or 600 mm); a plate lying
flat (a cover plate) bends about its minor axis, where lateral torsional buckling does
not occur.
US: AISC 360-16 F11 (rectangular bars, major axis), C_b = 1.0 (conservative), Omega_b
1.67. EU: EN 1993-1-1 6.3.2.2, M_cr = C1 (pi / L) sqrt(E I_z G I_t) with C1 = 1.0
(uniform moment, conservative), G = 81,000 MPa (EN 1993-1-1 3.2.6), lambda_LT =
sqrt(W_el f_y / M_cr), chi_LT with curve d (Table 6.4, "other cross-sections"), elastic
resistance chi_LT f_y / gamma_M1. All from memory.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

from ..codes import aisc, en1993
from ..model.constants import INCH
from ..model.design import DesignSpec
from ..section.transformed import Section
from .bolt_layout import gaps
from .common import Joint, side_by_side_joints


@dataclass(frozen=True)
class PlateBracing:
    """L_b of a plate (None: braced) and why."""

    L_b: float | None
    note: str


def plate_bracing(section: Section, i: int, design: DesignSpec,
                  joints: Sequence[Joint] | None = None) -> PlateBracing:
    """The unbraced length of steel ply i (see the module docstring); ``joints``: the
    section's side-by-side joints where already found.
    """
    ply = section.plies[i]
    if ply.width >= ply.height:
        return PlateBracing(None, "plate lies flat (minor-axis bending): no lateral "
                                  "torsional buckling")
    if design.plate_unbraced_length is not None:
        return PlateBracing(design.plate_unbraced_length, "L_b = the user's plate unbraced "
                                                          "length")
    found = side_by_side_joints(section) if joints is None else joints
    joint = next((j for j in found if j.steel == i), None)
    if joint is not None and joint.steel_is_main:
        return PlateBracing(None, "plate between two timbers: braced by them")
    between = gaps(sorted(design.bolt.stations))
    if between:
        return PlateBracing(max(between), "plate on a face: braced at its bolts, L_b = the largest "
                                 "gap between the given bolt stations")
    stock = 24 * INCH if section.materials[i].id and design.us else 0.6
    s = design.bolt.spacing or stock
    return PlateBracing(s, "plate on a face: braced at its bolts, L_b = the bolt spacing"
                        + ("" if design.bolt.spacing else " (largest stock spacing)"))


def us_plate_allowable(Fy: float, E: float, height: float, thickness: float,
                       L_b: float | None) -> tuple[float, str]:
    """AISC 360-16 F11 allowable bending stress (M_n / S) / Omega_b, Pa, and the
    equation that governs.
    """
    if L_b is None:
        return 1.5 * Fy / aisc.OMEGA_B, "F11-1 (yielding, braced)"
    mn_s, eq = aisc.rectangular_bar_Mn(Fy, E, height, thickness, L_b)
    return mn_s / aisc.OMEGA_B, eq


def eu_plate_chi(fy: float, E: float, height: float, thickness: float,
                 L_b: float | None) -> tuple[float, float]:
    """(chi_LT, lambda_LT) of a plate by EN 1993-1-1 6.3.2.2 (1, 0 where braced)."""
    if L_b is None:
        return 1.0, 0.0
    G = 81.0e9
    mcr = en1993.M_cr_plate(E, G, height, thickness, L_b)
    W = thickness * height**2 / 6
    lam = (W * fy / mcr) ** 0.5
    return en1993.chi_LT(lam, "d"), lam
