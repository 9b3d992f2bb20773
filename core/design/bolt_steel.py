"""The steel side of a plate's bolts, screened against the bolts' own demand.

The ``bolts`` check values a bolt by its timber side (NDS 2018 12.3 / EN 1995-1-1 8.2),
which governs a flitch or side plate of ordinary proportions by a wide margin. The
steel side (the bolt's shear, the bearing at the plate's hole: ``codes.steel_bolts``) is
found here for the plate's least edge distance and least spacing in any direction and
compared with the largest load per bolt of the ``bolts`` checks: where it carries that
load, each ``bolts`` check says so in a note with the numbers; where it does not, it is a
named missing check (the verdict INCOMPLETE), since the screen's simplifications may
be what fails, not the bolt.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import replace

from ..codes import steel_bolts as sb
from ..model.design import DesignSpec
from ..model.errors import MissingCheck, Problem
from ..model.units import fmt
from ..section.transformed import Section
from .bolt_layout import BoltLayout, gaps
from .check import Check
from .common import Joint
from .net_section import hole_diameter

#: EN 1995-1-1 10.4.3 (from memory): a hole in a steel plate at most 2 mm or 0.1 d larger
#: than the bolt; the larger hole is taken for the plate's bearing.
EN_STEEL_CLEARANCE = 0.002


def least_distances(section: Section, layout: BoltLayout) -> tuple[float, float]:
    """(the least distance from a bolt to the plate's edge or end, the least gap between
    neighbouring stations or neighbouring rows, which is at most the least spacing of
    two bolts; math.inf with a single bolt), m.
    """
    plate = section.plies[layout.plate]
    lo, hi = layout.extent
    xs, ys = layout.stations, layout.rows
    edge = min(min(ys) - plate.y, plate.top - max(ys), xs[0] - lo, hi - xs[-1])
    return edge, min(layout.station_gaps + gaps(ys), default=math.inf)


def steel_capacity(section: Section, joint: Joint, layout: BoltLayout,
                   design: DesignSpec) -> tuple[float, str]:
    """The steel side's capacity per bolt on the plate, N (US allowable, EU design), and
    how it was found (display units).
    """
    bolt = design.bolt
    d, t = bolt.diameter, section.plies[joint.steel].width
    planes = 2 if joint.steel_is_main else 1
    fu = section.materials[joint.steel].value("Fu") or 0.0
    edge, gap = least_distances(section, layout)
    system = "US" if design.us else "SI"
    if design.us:
        d_h = hole_diameter(design)
        clear = min(edge - d_h / 2, gap - d_h)
        shear = sb.aisc_shear(d, bolt.fu)
        bearing = sb.aisc_bearing(d, t, fu, max(clear, 0.0))
        how = (f"AISC 360-16 J3.6: {planes} x F_nv A_b / Omega = {planes} x "
               f"{fmt(shear, 'force', system)} (F_nv = 0.450 F_u of the bolt, threads "
               f"not excluded); J3.10: min(1.2 l_c, 2.4 d) t F_u / Omega = "
               f"{fmt(bearing, 'force', system)} with the least clear distance l_c = "
               f"{fmt(max(clear, 0.0), 'length', system)}")
    else:
        d0 = d + max(EN_STEEL_CLEARANCE, 0.1 * d)
        shear = sb.en_shear(d, bolt.fu)
        bearing = sb.en_bearing(d, d0, t, fu, bolt.fu, edge, gap)
        how = (f"EN 1993-1-8 Table 3.4: {planes} x F_v,Rd = {planes} x "
               f"{fmt(shear, 'force', system)} (alpha_v 0.5, A_s 0.72 A); F_b,Rd = "
               f"{fmt(bearing, 'force', system)} (d0 = {fmt(d0, 'length', system)}, the "
               f"least edge distance {fmt(edge, 'length', system)} and spacing "
               f"{fmt(gap, 'length', system) if gap < math.inf else 'none'})")
    return min(planes * shear, bearing), how


def screened(checks: Sequence[Check], section: Section, joint: Joint, layout: BoltLayout,
             design: DesignSpec, warnings: list[Problem] | None) -> list[Check]:
    """``checks`` with the steel side's note on each ``bolts`` check; a named missing
    check in ``warnings`` where the steel side does not carry the largest of them.
    """
    bolts = [c for c in checks if c.id == "bolts"]
    if not bolts:
        return list(checks)
    capacity, how = steel_capacity(section, joint, layout, design)
    top = max(c.demand for c in bolts)
    plate = section.plies[joint.steel].name
    system = "US" if design.us else "SI"
    if top <= capacity:
        note = (f"Steel side of the bolts (the bolt's shear, the bearing at {plate}'s "
                f"holes): {fmt(capacity, 'force', system)} per bolt, carrying the largest "
                f"load per bolt {fmt(top, 'force', system)}; {how}.")
        return [replace(c, notes=(*c.notes[:-1], note, c.notes[-1])) if c.id == "bolts"
                else c for c in checks]
    if warnings is not None:
        warnings.append(MissingCheck("design.bolt", (
            f"the steel side of the bolts of {plate} (the bolt's shear, the bearing at the "
            f"plate's holes), screened at {fmt(capacity, 'force', system)} per bolt, is "
            f"below the largest load per bolt {fmt(top, 'force', system)}: {how}; it is "
            "not checked further (a larger edge distance, spacing, plate or bolt)")))
    return list(checks)
