"""NDS 2018 rules for bolted connections: the geometry of Tables 12.5.1A-D with the
geometry factor C_Delta (12.5.1), the group action factor C_g (11.3.6) and the wet service
factor of Table 11.3.3. All from memory; verify against the current edition.

Lengths in m (any consistent unit where a ratio is returned); D is the bolt diameter.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ..model.constants import INCH, LBF


@dataclass(frozen=True)
class DistanceRule:
    """A required distance with its reduced range.

    Attributes:
        full: distance for C_Delta = 1.0, m.
        minimum: smallest distance allowed (C_Delta = minimum / full there), m; equal to
            ``full`` where no reduced value is allowed.
        rule: the rule in words with its source.

    """

    full: float
    minimum: float
    rule: str


def end_distance_perpendicular(D: float) -> DistanceRule:
    """NDS 2018 Table 12.5.1A, loading perpendicular to grain: 4 D for C_Delta = 1.0,
    2 D minimum (from memory).
    """
    return DistanceRule(4 * D, 2 * D, "end distance, load perpendicular to grain: 4D for "
                        "C_Delta = 1.0, 2D minimum (NDS 2018 Table 12.5.1A, from memory)")


def spacing_in_row(D: float) -> DistanceRule:
    """NDS 2018 Table 12.5.1B, spacing between fasteners in a row: 4 D for C_Delta = 1.0,
    3 D minimum (from memory).
    """
    return DistanceRule(4 * D, 3 * D, "spacing in a row: 4D for C_Delta = 1.0, 3D minimum "
                        "(NDS 2018 Table 12.5.1B, from memory)")


def edge_distance_perpendicular(D: float, loaded: bool) -> DistanceRule:
    """NDS 2018 Table 12.5.1C, loading perpendicular to grain: loaded edge 4 D, unloaded
    edge 1.5 D (from memory). No reduced range.
    """
    if loaded:
        return DistanceRule(4 * D, 4 * D, "loaded edge, load perpendicular to grain: 4D "
                            "(NDS 2018 Table 12.5.1C, from memory)")
    return DistanceRule(1.5 * D, 1.5 * D, "unloaded edge, load perpendicular to grain: 1.5D "
                        "(NDS 2018 Table 12.5.1C, from memory)")


def row_spacing_perpendicular(D: float, l_over_D: float) -> DistanceRule:
    """NDS 2018 Table 12.5.1D, spacing between rows for loading perpendicular to grain
    (from memory): l/D <= 2: 2.5 D; 2 < l/D < 6: (5 l + 10 D) / 8; l/D >= 6: 5 D, where
    l/D is the lesser of l_m/D and l_s/D of the wood members: the bolt's length in the
    wood main member and its total length in the wood side members (the table's
    footnote; a steel member does not count).
    """
    if l_over_D <= 2:
        need = 2.5 * D
    elif l_over_D < 6:
        need = (5 * l_over_D * D + 10 * D) / 8
    else:
        need = 5 * D
    return DistanceRule(need, need, f"spacing between rows, load perpendicular to grain, "
                        f"l/D = {l_over_D:.3g} (NDS 2018 Table 12.5.1D, from memory)")


#: Largest spacing between the outer rows of bolts in one steel plate (NDS 2018
#: 12.5.1.3 and Table 12.5.1D footnote, shrinkage across the grain; from memory).
OUTER_ROWS_MAX = 5 * INCH


def C_Delta(provided: float, rule: DistanceRule) -> float:
    """NDS 2018 12.5.1: provided / full between the minimum and the full distance, 1.0
    at or above the full distance; 0 below the minimum (not allowed). From memory.
    """
    if provided >= rule.full * (1 - 1e-12):
        return 1.0
    if provided < rule.minimum * (1 - 1e-12):
        return 0.0
    return provided / rule.full


def gamma_bolt_steel(D: float) -> float:
    """NDS 2018 11.3.6 load/slip modulus of a bolt, wood-to-steel:
    gamma = 270,000 D^1.5 lbf/in with D in in (from memory). Returns N/m.
    """
    return 270000.0 * math.pow(D / INCH, 1.5) * LBF / INCH


def C_g(n: int, EA_main: float, EA_side: float, s: float, gamma: float) -> float:
    """NDS 2018 11.3.6 group action factor of a row of n fasteners (from memory):
    C_g = m (1 - m^2n) / (n [(1 + R_EA m^n)(1 + m) - 1 + m^2n]) x (1 + R_EA) / (1 - m),
    R_EA = the lesser of E_s A_s / (E_m A_m) and its inverse, u = 1 + gamma s / 2
    (1 / (E_m A_m) + 1 / (E_s A_s)), m = u - sqrt(u^2 - 1).

    Args:
        n: fasteners in the row (a line in the direction of the load).
        EA_main: E_m A_m of the main member, N.
        EA_side: E_s A_s of the side members together, N.
        s: spacing of the fasteners in the row, m.
        gamma: load/slip modulus of one fastener, N/m.

    """
    if n <= 1:
        return 1.0
    R_EA = min(EA_side / EA_main, EA_main / EA_side)
    u = 1 + gamma * s / 2 * (1 / EA_main + 1 / EA_side)
    m = u - math.sqrt(u * u - 1)
    mn = math.pow(m, n)
    m2n = mn * mn
    head = m * (1 - m2n) / (n * ((1 + R_EA * mn) * (1 + m) - 1 + m2n))
    return head * (1 + R_EA) / (1 - m)


def C_M_bolts(wet_service: bool, fabricated_wet: bool, single_row: bool) -> float:
    """NDS 2018 Table 11.3.3 wet service factor of dowel-type fasteners, lateral (from
    memory): in service wet 0.7; fabricated wet and used dry 0.4, except a single
    fastener or a single row parallel to grain (1.0); dry 1.0.
    """
    if wet_service:
        return 0.7
    if fabricated_wet and not single_row:
        return 0.4
    return 1.0
