"""A dimensioned detail of every bolted steel plate: the plate in elevation with its
holes and dimension chains (end distances, spacing, overall length, edge distances), a
cross-section through a bolt station with the rows and the edge distances, and the bolt
schedule of the member.

Positions come from the layout the design checks use (``design.bolt_layout`` through
``connections.layout_for``), so the detail shows the bolts that were checked. Hole
diameter: ``design.net_section.hole_diameter`` (the bolt plus 1/16 in or 1 mm).
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from typing import Any

from reportlab.graphics.shapes import Circle, Drawing, Group, Line, Rect
from reportlab.lib import colors
from reportlab.lib.units import mm
from reportlab.pdfbase.pdfmetrics import stringWidth
from reportlab.platypus import CondPageBreak, Table

from ..design.bolt_layout import BoltLayout
from ..design.common import Joint
from ..design.net_section import hole_diameter
from ..pipeline import Analysis
from .connections import plate_layouts
from .description import inch_text, member_description, mm_text
from .drawings import STEEL, TIMBER, new_drawing
from .elevation import position_text
from .fonts import FONT
from .fonts import drawn_string as String
from .layout import BODY, H1, H2, SMALL, para, table
from .numbers import feet_inches

PLATE_H = 24 * mm
MAX_LISTED = 40


def length_text(value: float, system: str) -> str:
    """A detail dimension: inches to 1/16 in (US), millimetres (SI), with the unit."""
    if system == "US":
        return f"{inch_text(value)}\u00a0in"
    return f"{mm_text(value)}\u00a0mm"


@dataclass(frozen=True)
class PlateDims:
    """The dimensions of one plate's bolts (SI, m).

    Attributes:
        start: the plate's start along the member.
        end: its end.
        gaps: from the start to the first station, between stations, from the last
            station to the end.
        bottom: the plate's bottom edge (the section's y).
        top: its top edge.
        rows: heights of the bolt rows, ascending.
        timber_bottom: the lowest bottom edge of the plate's timbers.
        timber_top: the highest top edge of its timbers.

    """

    start: float
    end: float
    gaps: tuple[float, ...]
    bottom: float
    top: float
    rows: tuple[float, ...]
    timber_bottom: float
    timber_top: float

    @property
    def length(self) -> float:
        """The plate's length, m."""
        return self.end - self.start

    @property
    def edges(self) -> tuple[float, float]:
        """Edge distances in the plate: bottom row to bottom edge, top row to top edge."""
        return self.rows[0] - self.bottom, self.top - self.rows[-1]

    @property
    def timber_edges(self) -> tuple[float, float]:
        """Edge distances in the timbers: to their lowest bottom and highest top edge."""
        return self.rows[0] - self.timber_bottom, self.timber_top - self.rows[-1]

    @property
    def uniform(self) -> bool:
        """True where the stations are equally spaced (to 1e-9 of the plate length)."""
        inner = self.gaps[1:-1]
        return bool(inner) and max(inner) - min(inner) <= 1e-9 * max(self.length, 1.0)


def plate_dims(a: Analysis, jt: Joint, lay: BoltLayout) -> PlateDims:
    """The dimensions of a plate's layout."""
    s = a.section
    start, end = lay.extent
    xs = lay.stations
    gaps = (xs[0] - start, *(b - c for c, b in zip(xs, xs[1:], strict=False)), end - xs[-1])
    i = jt.steel
    return PlateDims(start, end, gaps, float(s.y_bottom[i]), float(s.y_top[i]),
                     tuple(sorted(lay.rows)),
                     min(float(s.y_bottom[j]) for j in jt.timbers),
                     max(float(s.y_top[j]) for j in jt.timbers))


def _dim_h(d: Drawing, xa: float, xb: float, y: float, text: str, size: float = 6,
           outside: str | None = None) -> None:
    """A horizontal dimension from xa to xb at height y, its text above the middle of the
    line; where it does not fit between the ticks and ``outside`` is "start" or "end",
    beside that end of the line instead.
    """
    d.add(Line(xa, y, xb, y, strokeWidth=0.4))
    for x in (xa, xb):
        d.add(Line(x, y - 1.2 * mm, x, y + 1.2 * mm, strokeWidth=0.4))
        d.add(Line(x - 0.7 * mm, y - 0.7 * mm, x + 0.7 * mm, y + 0.7 * mm, strokeWidth=0.6))
    if not text:
        return
    if stringWidth(text, FONT, size) + 1 * mm <= xb - xa or outside is None:
        d.add(String((xa + xb) / 2, y + 0.9 * mm, text, fontName=FONT, fontSize=size,
                     textAnchor="middle"))
    elif outside == "start":  # too short: the text before the dimension's start
        d.add(String(xa - 1.2 * mm, y + 0.9 * mm, text, fontName=FONT, fontSize=size,
                     textAnchor="end"))
    else:
        d.add(String(xb + 1.2 * mm, y + 0.9 * mm, text, fontName=FONT, fontSize=size))


def _dim_v(d: Drawing, x: float, ya: float, yb: float, text: str, right: bool) -> None:
    d.add(Line(x, ya, x, yb, strokeWidth=0.4))
    for y in (ya, yb):
        d.add(Line(x - 1.2 * mm, y, x + 1.2 * mm, y, strokeWidth=0.4))
        d.add(Line(x - 0.7 * mm, y - 0.7 * mm, x + 0.7 * mm, y + 0.7 * mm, strokeWidth=0.6))
    if not text or abs(yb - ya) < 0.1:
        return
    if stringWidth(text, FONT, 5.6) + 1 * mm > abs(yb - ya):
        # too short to hold the text along it: the text beside it, horizontal
        d.add(String(x + (1.6 * mm if right else -1.6 * mm), (ya + yb) / 2 - 2,
                     text, fontName=FONT, fontSize=5.6, textAnchor="start" if right else "end"))
        return
    g = Group(String(0, 0, text, fontName=FONT, fontSize=5.6, textAnchor="middle"))
    off = 2.0 * mm if right else -1.0 * mm
    g.transform = (0, 1, -1, 0, x + off, (ya + yb) / 2)
    d.add(g)


def plate_elevation(dims: PlateDims, lay: BoltLayout, hole: float, system: str,
                    width: float) -> tuple[Drawing, bool]:
    """The plate in elevation with its holes and dimension chains; returns the drawing
    and whether its depth is drawn enlarged (True where to scale would be too small).
    """
    left, right = 11 * mm, 16 * mm
    sx = (width - left - right) / max(dims.length, 1e-12)
    depth = dims.top - dims.bottom
    sy = max(sx, PLATE_H / max(depth, 1e-12)) if depth * sx < PLATE_H else sx
    plate_h = depth * sy
    chain_room = 16 * mm
    height = plate_h + chain_room + 6 * mm
    d = new_drawing(width, height)
    base = chain_room

    def px(x: float) -> float:
        return float(left + (x - dims.start) * sx)

    def py(y: float) -> float:
        return float(base + (y - dims.bottom) * sy)

    d.add(Rect(px(dims.start), base, dims.length * sx, plate_h, fillColor=colors.Color(
        0.82, 0.83, 0.86), strokeColor=colors.black, strokeWidth=0.7))
    r = max(hole * sy / 2, 0.5 * mm)
    for x, y in lay.bolts:
        d.add(Circle(px(x), py(y), r, fillColor=colors.white, strokeColor=colors.black,
                     strokeWidth=0.5))
        d.add(Line(px(x) - r * 1.6, py(y), px(x) + r * 1.6, py(y), strokeWidth=0.25))
        d.add(Line(px(x), py(y) - r * 1.6, px(x), py(y) + r * 1.6, strokeWidth=0.25))
    # chain 1: end distance, spacing, end distance
    y1 = base - 5 * mm
    marks = [dims.start, *lay.stations, dims.end]
    if dims.uniform and len(lay.stations) > 2:
        n = len(lay.stations) - 1
        _dim_h(d, px(marks[0]), px(marks[1]), y1, length_text(dims.gaps[0], system),
               outside="start")
        _dim_h(d, px(marks[1]), px(marks[-2]), y1,
               f"{n} @ {length_text(dims.gaps[1], system)} = "
               f"{length_text(n * dims.gaps[1], system)}")
        _dim_h(d, px(marks[-2]), px(marks[-1]), y1, length_text(dims.gaps[-1], system),
               outside="end")
    else:
        last = len(dims.gaps) - 1
        for k, (xa, xb, g) in enumerate(zip(marks[:-1], marks[1:], dims.gaps, strict=True)):
            text = length_text(g, system)
            fits = stringWidth(text, FONT, 6) < px(xb) - px(xa) - 1 * mm
            side = "start" if k == 0 else "end" if k == last else None
            _dim_h(d, px(xa), px(xb), y1, text if fits or side else "", outside=side)
    # chain 2: overall length
    overall = (f"{feet_inches(dims.length)} ({length_text(dims.length, system)})"
               if system == "US" else length_text(dims.length, system))
    _dim_h(d, px(dims.start), px(dims.end), base - 12 * mm, "overall " + overall)
    # edge distances and row spacing at the right end
    xr = px(dims.end) + 4 * mm
    levels = [dims.bottom, *dims.rows, dims.top]
    for ya, yb in zip(levels[:-1], levels[1:], strict=True):
        _dim_v(d, xr, py(ya), py(yb), length_text(yb - ya, system), True)
    for y in dims.rows:
        d.add(Line(px(lay.stations[-1]), py(y), xr + 1.2 * mm, py(y), strokeWidth=0.2,
                   strokeColor=colors.grey, strokeDashArray=[1, 1]))
    d.add(String(px(dims.start), base + plate_h + 1.8 * mm,
                 f"from x = {position_text(dims.start, system)} to "
                 f"{position_text(dims.end, system)} along the member",
                 fontName=FONT, fontSize=6))
    return d, sy > sx * (1 + 1e-9)


def plate_section(a: Analysis, jt: Joint, dims: PlateDims, system: str,
                  width: float = 62 * mm, height: float = 58 * mm) -> Drawing:
    """A cross-section through a bolt station: the plate and its timbers to scale, the
    bolt rows, and the edge distances to the timbers (left) and the plate (right).
    """
    s = a.section
    idx = (jt.steel, *jt.timbers)
    x0 = min(s.plies[i].x for i in idx)
    x1 = max(s.plies[i].x + s.plies[i].width for i in idx)
    y0, y1 = dims.timber_bottom, dims.timber_top
    margin = 12 * mm
    scale = min((width - 2 * margin) / max(x1 - x0, 1e-12),
                (height - 2 * 5 * mm) / max(y1 - y0, 1e-12))
    d = new_drawing(width, height)
    ox = (width - (x1 - x0) * scale) / 2
    oy = (height - (y1 - y0) * scale) / 2

    def tx(x: float) -> float:
        return float(ox + (x - x0) * scale)

    def ty(y: float) -> float:
        return float(oy + (y - y0) * scale)

    for i in idx:
        p = s.plies[i]
        steel = s.materials[i].kind == "steel"
        d.add(Rect(tx(p.x), ty(float(s.y_bottom[i])), p.width * scale,
                   (float(s.y_top[i]) - float(s.y_bottom[i])) * scale,
                   fillColor=STEEL if steel else TIMBER, strokeColor=colors.black,
                   strokeWidth=0.5))
    for y in dims.rows:
        d.add(Line(tx(x0) - 1.5 * mm, ty(y), tx(x1) + 1.5 * mm, ty(y), strokeWidth=1.4))
        for x in (tx(x0) - 1.5 * mm, tx(x1) + 1.1 * mm):
            d.add(Rect(x, ty(y) - 1.1 * mm, 0.4 * mm, 2.2 * mm, fillColor=colors.black,
                       strokeColor=None))
    levels = [dims.timber_bottom, *dims.rows, dims.timber_top]
    for ya, yb in zip(levels[:-1], levels[1:], strict=True):
        _dim_v(d, tx(x0) - 5 * mm, ty(ya), ty(yb), length_text(yb - ya, system), False)
    plate_levels = [dims.bottom, dims.rows[0]], [dims.rows[-1], dims.top]
    for ya, yb in plate_levels:
        _dim_v(d, tx(x1) + 5 * mm, ty(ya), ty(yb), length_text(yb - ya, system), True)
    d.add(String(width / 2, 1.2 * mm, "timber edges left, plate edges right", fontName=FONT,
                 fontSize=5.6, textAnchor="middle"))
    return d


def schedule_rows(a: Analysis, items: Sequence[tuple[Joint, BoltLayout]]) -> list[list[str]]:
    """The bolt schedule: one row per plate, header first."""
    u = a.project.display_units
    D = a.design.bolt.diameter
    rows = [["Mark", "Plate", "Diameter", "Count", "Rows", "Stations", "Spacing",
             "End distances", "Edge distances, plate", "Edge distances, timber", "Hole"]]
    for k, (jt, lay) in enumerate(items, start=1):
        dims = plate_dims(a, jt, lay)
        stagger = any(len(r) != len(lay.rows) for r in lay.station_rows)
        rows.append([f"B{k}", a.section.plies[jt.steel].name, length_text(D, u),
                     str(lay.count), f"{len(lay.rows)}" + (" staggered" if stagger else ""),
                     str(len(lay.stations)),
                     length_text(lay.spacing, u) if dims.uniform or len(lay.stations) <= 2
                     else "as drawn",
                     f"{length_text(dims.gaps[0], u)} / {length_text(dims.gaps[-1], u)}",
                     " / ".join(length_text(e, u) for e in dims.edges),
                     " / ".join(length_text(e, u) for e in dims.timber_edges),
                     length_text(hole_diameter(a.design), u)])
    return rows


def _stations_line(lay: BoltLayout, u: str) -> str:
    xs = [position_text(x, u) for x in lay.stations[:MAX_LISTED]]
    more = len(lay.stations) - MAX_LISTED
    return ("Stations at x = " + ", ".join(xs) + (f" and {more} more" if more > 0 else "")
            + " (from the member's left end).")


def plate_details(a: Analysis, width: float) -> list[Any]:
    """Section 8: the plate details and the bolt schedule (nothing without bolted plates)."""
    items = plate_layouts(a)
    # room for the heading, its lines and the first plate's drawings (about 40 mm of
    # elevation and 60 mm of cross-section), so the heading never stands alone
    head = [CondPageBreak(150 * mm if items else 30 * mm),
            para("8  Plate details and bolt schedule", H1),
            para("Member: " + member_description(a), BODY)]
    if not items:
        return [*head, para("The member has no steel plate bolted to timbers beside it, so "
                            "there is no bolt layout to detail.", SMALL)]
    u = a.project.display_units
    hole = hole_diameter(a.design)
    out: list[Any] = [*head,
                      para("Bolt positions as the design checks place them. End distances "
                           "from the plate's ends, edge distances from the outer rows to the "
                           "plate's and the timbers' edges; hole diameter the bolt's plus "
                           + ("1/16 in." if u == "US" else "1 mm."), SMALL)]
    for k, (jt, lay) in enumerate(items, start=1):
        dims = plate_dims(a, jt, lay)
        name = a.section.plies[jt.steel].name
        elev, enlarged = plate_elevation(dims, lay, hole, u, width)
        section = plate_section(a, jt, dims, u)
        notes = [f"Bolts B{k}: {lay.count} bolts of {length_text(a.design.bolt.diameter, u)} "
                 f"diameter in {len(lay.rows)} row{'s' if len(lay.rows) > 1 else ''} at "
                 f"{len(lay.stations)} stations; holes {length_text(hole, u)}.",
                 _stations_line(lay, u)]
        if enlarged:
            notes.append("Plate elevation: lengths to scale; the depth, holes and rows "
                         "enlarged for reading.")
        side = Table([[section, [para(t, SMALL) for t in notes]]],
                     colWidths=[64 * mm, width - 64 * mm], hAlign="LEFT",
                     style=[("VALIGN", (0, 0), (-1, -1), "TOP"),
                            ("FONTNAME", (0, 0), (-1, -1), FONT)])
        out += [CondPageBreak(elev.height + 80 * mm),
                para(f"Steel plate \u201c{name}\u201d (bolts B{k})", H2), elev, side]
    out += [para("Bolt schedule", H2), table(schedule_rows(a, items), width, font_size=6.6)]
    return out
