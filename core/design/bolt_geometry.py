"""The geometry rules of a plate's bolt layout as checks (``bolt-spacing``, ``bolt-edge``,
``bolt-end``), and the factors the layout sets: C_Delta and C_g on the US basis.

The bolts of a flitch or side plate are loaded perpendicular to the grain (the vertical
load passing between plate and timbers), so a row in the direction of the load is the
vertical line of bolts at one station (NDS 2018 11.3.6), the spacing in it is the gap
between the heights of the bolts there, and the spacing between rows is the distance
between stations. Both timber edges are taken as loaded edges (along the span the bolts
push the timber up, at a support the plate does not bear on they push it down).
"""

from __future__ import annotations

from dataclasses import dataclass

from ..codes import en1995_fasteners as en
from ..codes import nds_fasteners as nf
from ..model.design import DesignSpec
from ..model.units import fmt
from ..section.transformed import Section
from .bolt_layout import BoltLayout
from .check import Check, CheckId
from .common import Joint


@dataclass(frozen=True)
class Rule:
    """One geometry rule of a layout.

    Attributes:
        id: the check id.
        name: the rule's short name (the check's location).
        required: the required distance, m (for a largest distance: the provided one).
        provided: the distance of the layout, m (for a largest distance: the limit).
        multiple: required / D (for the sheet), None for a largest distance.
        x: where along the member the governing bolt is, m.
        text: the rule and its source.

    """

    id: CheckId
    name: str
    required: float
    provided: float
    multiple: float | None
    x: float
    text: str


def _gaps(values: tuple[float, ...] | list[float]) -> list[float]:
    return [b - a for a, b in zip(values, values[1:], strict=False)]


def _station_heights(layout: BoltLayout, k: int) -> list[float]:
    return sorted(layout.rows[r] for r in layout.station_rows[k])


def _edges(section: Section, joint: Joint, layout: BoltLayout) -> tuple[float, float]:
    """The smallest distances from the top and the bottom bolt to the timber edges, m."""
    top = min(float(section.y_top[j]) for j in joint.timbers) - max(layout.rows)
    bottom = min(layout.rows) - max(float(section.y_bottom[j]) for j in joint.timbers)
    return top, bottom


def _common(section: Section, joint: Joint, layout: BoltLayout,
            length: float) -> tuple[float, float, float | None, float | None, float]:
    """(end distance, its x, smallest gap at a station, smallest station gap, edge)."""
    first, last = layout.stations[0], layout.stations[-1]
    end = min(first, length - last)
    x_end = first if first <= length - last else last
    vertical = [g for k in range(len(layout.stations))
                for g in _gaps(_station_heights(layout, k))]
    along = _gaps(layout.stations)
    edge = min(_edges(section, joint, layout))
    return (end, x_end, min(vertical) if vertical else None, min(along) if along else None,
            edge)


def us_rules(section: Section, joint: Joint, layout: BoltLayout, D: float,
             length: float) -> list[Rule]:
    """NDS 2018 Tables 12.5.1A-D (from memory) for loading perpendicular to grain."""
    end, x_end, vertical, along, edge = _common(section, joint, layout, length)
    out = []
    r_end = nf.end_distance_perpendicular(D)
    out.append(Rule("bolt-end", "end distance", r_end.minimum, end, r_end.minimum / D, x_end,
                    r_end.rule + f"; C_Delta = {nf.C_Delta(end, r_end):.3g}"))
    r_edge = nf.edge_distance_perpendicular(D, loaded=True)
    out.append(Rule("bolt-edge", "edge distance", r_edge.full, edge, r_edge.full / D,
                    layout.stations[0], r_edge.rule + "; both timber edges taken as loaded"))
    if vertical is not None:
        out.append(Rule("bolt-spacing", "spacing in a row (across the depth)", 3 * D, vertical,
                        3.0, layout.stations[0], "spacing in a row perpendicular to grain: "
                        "the attached steel plate's, 3D (NDS 2018 Table 12.5.1B; AISC 360-16 "
                        "J3.3, from memory)"))
        spread = max(layout.rows) - min(layout.rows)
        out.append(Rule("bolt-spacing", "spread of the outer rows in one plate", spread,
                        nf.OUTER_ROWS_MAX, None, layout.stations[0], "outer rows of bolts in "
                        "one steel plate at most 5 in apart (shrinkage across the grain; NDS "
                        "2018 12.5.1.3, from memory; common practice)"))
    if along is not None:
        # the footnote counts the bolt's length in wood only: a steel side plate leaves
        # the wood main member (l_m / D), a steel main plate the wood side members
        # (their total, 2 l_s / D with the thinner side member)
        thick_wood = min(section.plies[j].width for j in joint.timbers)
        r_rows = nf.row_spacing_perpendicular(
            D, 2 * thick_wood / D if joint.steel_is_main else thick_wood / D)
        out.append(Rule("bolt-spacing", "spacing between rows (stations)", r_rows.full, along,
                        r_rows.full / D, layout.stations[0], r_rows.rule))
    return out


def eu_rules(section: Section, joint: Joint, layout: BoltLayout, d: float,
             length: float) -> list[Rule]:
    """EN 1995-1-1 Table 8.4 (from memory) for bolts loaded at 90 degrees to the grain."""
    end, x_end, vertical, along, edge = _common(section, joint, layout, length)
    need_end = max(en.a3t(d), en.a3c(d, 90.0))
    out = [Rule("bolt-end", "end distance a3", need_end, end, need_end / d, x_end,
                "a3,t = max(7d, 80 mm), a3,c = max((1 + 6 sin a) d, 4d) at a = 90 degrees, "
                "the larger (EN 1995-1-1 Table 8.4, from memory)"),
           Rule("bolt-edge", "edge distance a4,t", en.a4t(d, 90.0), edge, en.a4t(d, 90.0) / d,
                layout.stations[0], "a4,t = max((2 + 2 sin a) d, 3d) at a = 90 degrees, both "
                "timber edges taken as loaded (EN 1995-1-1 Table 8.4, from memory)")]
    if vertical is not None:
        out.append(Rule("bolt-spacing", "spacing across the grain a2", en.a2(d), vertical, 4.0,
                        layout.stations[0], "a2 = 4d (EN 1995-1-1 Table 8.4, from memory)"))
    if along is not None:
        out.append(Rule("bolt-spacing", "spacing along the grain a1", en.a1(d, 90.0), along,
                        en.a1(d, 90.0) / d, layout.stations[0],
                        "a1 = (4 + |cos a|) d at a = 90 degrees (EN 1995-1-1 Table 8.4, from "
                        "memory)"))
    return out


def geometry_checks(section: Section, joint: Joint, layout: BoltLayout,
                    design: DesignSpec, length: float, system: str) -> list[Check]:
    """One check per rule: demand the required distance, capacity the layout's."""
    d = design.bolt.diameter
    rules = (us_rules if design.us else eu_rules)(section, joint, layout, d, length)
    steel = section.plies[joint.steel].name
    out = []
    for r in rules:
        largest = r.multiple is None
        shown = fmt(r.required if largest else r.provided, "length", system)
        out.append(Check(
            id=r.id, ply=steel, combination=None, demand=r.required, capacity=r.provided,
            quantity="length", reference=("limit" if largest else "provided", r.provided),
            sources={"limit" if largest else "provided": "the rule's largest distance"
                     if largest else "the bolt layout", "required": r.text},
            equation=("spread <= limit" if largest else "required <= provided"),
            location=r.name, x=r.x,
            notes=(f"{r.name}: {r.text}; layout {shown}.",)))
    return out


def layout_factors(section: Section, joint: Joint, layout: BoltLayout, design: DesignSpec,
                   length: float) -> tuple[dict[str, float], dict[str, str]]:
    """C_Delta (NDS 2018 12.5.1, from the end distance) and C_g (NDS 2018 11.3.6, the
    vertical row of bolts at a station) of a US layout, with their sources; empty on the
    EU basis (EN 1995-1-1 8.5.1.1: n_ef = n for a force perpendicular to the grain).
    """
    if not design.us:
        return {}, {}
    D = design.bolt.diameter
    end = min(layout.stations[0], length - layout.stations[-1])
    c_delta = nf.C_Delta(end, nf.end_distance_perpendicular(D))
    n = max(layout.at_station(k) for k in range(len(layout.stations)))
    k = next(k for k in range(len(layout.stations)) if layout.at_station(k) == n)
    heights = _station_heights(layout, k)
    gaps = _gaps(heights)
    width = layout.spacing
    steel = section.plies[joint.steel]
    EA_plate = float(section.E[joint.steel]) * steel.width * width
    EA_wood = sum(float(section.E[j]) * section.plies[j].width * width for j in joint.timbers)
    main, side = (EA_plate, EA_wood) if joint.steel_is_main else (EA_wood, EA_plate)
    gap = min(gaps) if gaps else None
    coincide = gap is not None and not gap > 0  # rows at one height: the plate too shallow
    cg = (nf.C_g(n, main, side, gap, nf.gamma_bolt_steel(D))
          if gap is not None and not coincide else 1.0)
    cg_text = (f"NDS 2018 11.3.6 (from memory): a row of {n} bolts across the depth at "
               "a station (the direction of the load), A_m and A_s = thickness x the station "
               "spacing, gamma = 270,000 D^1.5 lbf/in (wood to steel)")
    if coincide:
        cg_text += ("; here bolts of the row stand at one height (the plate's shared depth "
                    "leaves no room between the rows), where the factor is its limit 1.0 "
                    "and the bolt-spacing check across the depth fails")
    return ({"C_g": cg, "C_Delta": c_delta},
            {"C_g": cg_text,
             "C_Delta": "NDS 2018 12.5.1 (from memory): end distance / 4D where between 2D "
             "and 4D, else 1.0 (see bolt-end)"})
