"""The member in elevation (reportlab vector graphics): the loads by case above it, the
member with its notches, holes, hidden plates and bolt stations, the supports and spans
below it, and every ply's extent along the member as a bar with its from / to.

Horizontal positions are to scale; the member's depth is drawn at a fixed height, and
notches, holes and bolt rows at that height's scale (a drawing convention: the depth of
a beam is small beside its span). A notch at a member-end support runs from the end
inwards by its length; any other notch and every hole is centred on its position.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

from reportlab.graphics.shapes import Circle, Drawing, Line, Polygon, Rect
from reportlab.lib import colors
from reportlab.lib.units import mm
from reportlab.pdfbase.pdfmetrics import stringWidth

from ..design.bolt_layout import BoltLayout
from ..model.member import CASES, BeamSpec, Load
from ..model.openings import Notch
from ..pipeline import Analysis
from .drawings import STEEL, TIMBER, new_drawing
from .fonts import FONT
from .fonts import drawn_string as String
from .numbers import exact, feet_inches, q

LEFT, RIGHT = 30 * mm, 8 * mm
LANE = 7 * mm
BAND = 14 * mm
BAR_ROW = 5.6 * mm
MAX_LANES = 6
MAX_BARS = 16
GREY = colors.Color(0.35, 0.35, 0.35)


def position_text(x: float, system: str) -> str:
    """A position along the member as drawings write it: feet-inches (US), metres (SI)."""
    return feet_inches(x) if system == "US" else exact(x, "span", system)


@dataclass(frozen=True)
class Lane:
    """One row of loads above the member: a case and the loads drawn in it."""

    label: str
    loads: tuple[Load, ...]


def load_lanes(spec: BeamSpec, staged: bool) -> list[Lane]:
    """Lanes of loads, case by case: each distributed load its own lane, the point loads of
    a case together; where that makes more than ``MAX_LANES`` the distributed loads of a
    case share one lane.
    """
    def build(merge: bool) -> list[Lane]:
        out = []
        for case in CASES:
            for stage in (("before", "after") if staged else ("",)):
                mine = [ld for ld in spec.loads if ld.case == case
                        and (not staged or ld.stage == stage)]
                tag = f" ({stage})" if staged else ""
                spread = [ld for ld in mine if ld.type != "point"]
                points = tuple(ld for ld in mine if ld.type == "point")
                if merge and spread:
                    out.append(Lane(case + tag, tuple(spread)))
                else:
                    out += [Lane(case + tag, (ld,)) for ld in spread]
                if points:
                    out.append(Lane(case + tag, points))
        return out

    lanes = build(False)
    return lanes if len(lanes) <= MAX_LANES else build(True)


def _arrow(d: Drawing, x: float, top: float, base: float, width: float = 0.5) -> None:
    d.add(Line(x, top, x, base, strokeWidth=width))
    d.add(Polygon([x, base, x - 0.7 * mm, base + 1.6 * mm, x + 0.7 * mm, base + 1.6 * mm],
                  fillColor=colors.black, strokeColor=None))


class _Frame:
    """Positions on the drawing: x along the member, the member's y within the band."""

    def __init__(self, length: float, width: float, y0: float, y1: float):
        self.length = length
        self.sx = (width - LEFT - RIGHT) / max(length, 1e-12)
        self.y0, self.y1 = y0, y1

    def x(self, v: float) -> float:
        return float(LEFT + min(max(v, 0.0), self.length) * self.sx)

    def y(self, v: float, band_bottom: float) -> float:
        return float(band_bottom + (v - self.y0) / max(self.y1 - self.y0, 1e-12) * BAND)

    def h(self, v: float) -> float:
        return float(v / max(self.y1 - self.y0, 1e-12) * BAND)


def _lane(d: Drawing, f: _Frame, lane: Lane, base: float, u: str) -> None:
    d.add(String(2 * mm, base + 1.5 * mm, lane.label, fontName=FONT, fontSize=6.5))
    taken: list[tuple[float, float]] = []

    def label(x: float, y: float, text: str) -> None:
        w = stringWidth(text, FONT, 6)
        a, b = x, x + w
        if any(a < tb and ta < b for ta, tb in taken):
            return
        taken.append((a, b + 1 * mm))
        d.add(String(a, y, text, fontName=FONT, fontSize=6))

    spread = [ld for ld in lane.loads if ld.type != "point"]
    peak = max((max(abs(ld.line_value), abs(ld.line_value_end)) for ld in spread), default=0.0)
    for ld in spread:
        xa = f.x(ld.start or 0.0)
        xb = f.x(f.length if ld.end is None else ld.end)
        ha = 3.2 * mm * abs(ld.line_value) / peak if peak else 0.0
        hb = 3.2 * mm * abs(ld.line_value_end) / peak if peak else 0.0
        top = base + 1.8 * mm
        d.add(Polygon([xa, top, xa, top + ha, xb, top + hb, xb, top],
                      fillColor=colors.Color(0.9, 0.9, 0.9), strokeColor=colors.black,
                      strokeWidth=0.4))
        n = min(max(2, int((xb - xa) / (6 * mm)) + 1), 40)
        for k in range(n):
            xx = xa + (xb - xa) * k / (n - 1)
            _arrow(d, xx, top, base, 0.35)
        value = q(ld.line_value, "line_load", u, 4)
        if ld.value_end is not None:
            value += " \u2192 " + q(ld.line_value_end, "line_load", u, 4)
        label(xa + 1 * mm, top + max(ha, hb) + 0.5 * mm, value)
    for ld in lane.loads:
        if ld.type == "point" and ld.at is not None:
            xx = f.x(ld.at)
            _arrow(d, xx, base + LANE - 1.5 * mm, base, 0.7)
            label(xx + 1 * mm, base + LANE - 3.2 * mm, q(ld.value, "force", u, 4))


def _band(d: Drawing, a: Analysis, f: _Frame, bottom: float,
          layouts: Sequence[BoltLayout]) -> None:
    s = a.section
    spec = a.project.beam
    assert spec is not None
    fill = TIMBER if any(m.kind == "timber" for m in s.materials) else STEEL
    d.add(Rect(f.x(0), bottom, f.x(f.length) - f.x(0), BAND, fillColor=fill,
               strokeColor=colors.black, strokeWidth=0.6))
    for k, notch in enumerate(spec.notches, start=1):
        xa, xb = notch_extent(notch, f.length)
        hh = f.h(notch.depth)
        yb = bottom if notch.face == "bottom" else bottom + BAND - hh
        d.add(Rect(f.x(xa), yb, f.x(xb) - f.x(xa), hh, fillColor=colors.white,
                   strokeColor=colors.black, strokeWidth=0.6))
        ty = yb + hh + 0.6 * mm if notch.face == "bottom" else yb - 2.4 * mm
        d.add(String(min(f.x(xb) + 0.6 * mm, f.x(f.length) - 4 * mm), ty, f"N{k}",
                     fontName=FONT, fontSize=5.5))
    for k, hole in enumerate(spec.holes, start=1):
        r = max(f.h(hole.diameter) / 2, 0.6)
        d.add(Circle(f.x(hole.x), f.y(hole.y, bottom), r, fillColor=colors.white,
                     strokeColor=colors.black, strokeWidth=0.6))
        d.add(String(f.x(hole.x) + r + 0.6 * mm, f.y(hole.y, bottom) - 1.8, f"H{k}",
                     fontName=FONT, fontSize=5.5))
    length = f.length
    for i, (ply, mat) in enumerate(zip(s.plies, s.materials, strict=True)):
        if mat.kind != "steel" or s.area[i] <= 0:
            continue
        xa, xb = ply.extent(length)
        ya, yb = f.y(float(s.y_bottom[i]), bottom), f.y(float(s.y_top[i]), bottom)
        d.add(Rect(f.x(xa), ya, f.x(xb) - f.x(xa), yb - ya, fillColor=None,
                   strokeColor=STEEL, strokeWidth=0.6, strokeDashArray=[2, 1.2]))
    for lay in layouts:
        for x, y in lay.bolts:
            d.add(Circle(f.x(x), f.y(y, bottom), 0.55 * mm, fillColor=colors.black,
                         strokeColor=None))


def notch_extent(notch: Notch, length: float) -> tuple[float, float]:
    """Where a notch runs along the member, m (see the module docstring)."""
    tol = 1e-9 * max(length, 1.0)
    if notch.support is not None and notch.x <= tol:
        return 0.0, min(notch.length, length)
    if notch.support is not None and notch.x >= length - tol:
        return max(length - notch.length, 0.0), length
    return max(notch.x - notch.length / 2, 0.0), min(notch.x + notch.length / 2, length)


def _supports(d: Drawing, a: Analysis, f: _Frame, top: float, u: str) -> None:
    spec = a.project.beam
    assert spec is not None
    lay = spec.layout
    for k, (xs, kind) in enumerate(zip(lay.support_positions(), lay.support_kinds(),
                                       strict=True)):
        x = f.x(xs)
        if kind == "pin":
            d.add(Polygon([x, top, x - 1.8 * mm, top - 3.2 * mm, x + 1.8 * mm, top - 3.2 * mm],
                          fillColor=colors.white, strokeColor=colors.black, strokeWidth=0.6))
        else:
            side = -1 if xs <= f.length / 2 else 1
            d.add(Rect(x + (0 if side > 0 else -1.6 * mm), top - 3.2 * mm, 1.6 * mm,
                       3.2 * mm + BAND, fillColor=GREY, strokeColor=colors.black,
                       strokeWidth=0.4))
        d.add(String(x, top - 6 * mm, f"R{k + 1}", fontName=FONT, fontSize=6,
                     textAnchor="middle"))
    # span chain
    y = top - 9.5 * mm
    marks = sorted({0.0, f.length, *lay.support_positions()})
    d.add(Line(f.x(0), y, f.x(f.length), y, strokeWidth=0.4))
    for m in marks:
        d.add(Line(f.x(m), y - 1.2 * mm, f.x(m), y + 1.2 * mm, strokeWidth=0.4))
    for xa, xb in zip(marks[:-1], marks[1:], strict=False):
        text = position_text(xb - xa, u)
        if stringWidth(text, FONT, 6) < f.x(xb) - f.x(xa) - 1 * mm:
            d.add(String((f.x(xa) + f.x(xb)) / 2, y + 0.8 * mm, text, fontName=FONT,
                         fontSize=6, textAnchor="middle"))


def _bars(d: Drawing, a: Analysis, f: _Frame, top: float, u: str,
          layouts: Sequence[BoltLayout]) -> None:
    s = a.section
    stations = {lay.plate: lay.stations for lay in layouts}
    for i, (ply, mat) in enumerate(zip(s.plies[:MAX_BARS], s.materials, strict=False)):
        base = top - (i + 1) * BAR_ROW
        name = f"{i + 1} {ply.name}"
        while name and stringWidth(name, FONT, 6) > LEFT - 3 * mm:
            name = name[:-1]
        d.add(String(2 * mm, base + 0.4 * mm, name, fontName=FONT, fontSize=6))
        xa, xb = ply.extent(f.length)
        d.add(Rect(f.x(xa), base, f.x(xb) - f.x(xa), 2.0 * mm,
                   fillColor=STEEL if mat.kind == "steel" else TIMBER,
                   strokeColor=colors.black, strokeWidth=0.4))
        for x in stations.get(i, ()):
            d.add(Circle(f.x(x), base + 1.0 * mm, 0.5 * mm, fillColor=colors.white,
                         strokeColor=colors.black, strokeWidth=0.3))
        text = (f"from {position_text(xa, u)} to {position_text(xb, u)} "
                f"({position_text(xb - xa, u)})")
        d.add(String((f.x(xa) + f.x(xb)) / 2, base + 2.5 * mm, text, fontName=FONT,
                     fontSize=5.8, textAnchor="middle"))
    if len(s.plies) > MAX_BARS:
        d.add(String(2 * mm, top - (MAX_BARS + 1) * BAR_ROW + 1 * mm,
                     f"and {len(s.plies) - MAX_BARS} more plies (their from / to in the "
                     "section's table)", fontName=FONT, fontSize=6))


def elevation_drawing(a: Analysis, width: float,
                      layouts: Sequence[BoltLayout] = ()) -> Drawing:
    """The member in elevation (see the module docstring)."""
    spec = a.project.beam
    assert spec is not None
    u = a.project.display_units
    s = a.section
    lanes = load_lanes(spec, a.stages is not None)
    if spec.self_weight:
        lanes.insert(0, Lane("D", ()))
    bars = min(len(s.plies), MAX_BARS) + (1 if len(s.plies) > MAX_BARS else 0)
    height = len(lanes) * LANE + BAND + 13 * mm + bars * BAR_ROW + 4 * mm
    d = new_drawing(width, height)
    f = _Frame(spec.layout.length, width, float(s.y_bottom.min()), float(s.y_top.max()))
    y = height - 1 * mm
    for lane in lanes:
        y -= LANE
        if lane.loads:
            _lane(d, f, lane, y, u)
        else:
            d.add(String(2 * mm, y + 1.5 * mm, "D", fontName=FONT, fontSize=6.5))
            d.add(Rect(f.x(0), y + 1.8 * mm, f.x(f.length) - f.x(0), 1.2 * mm,
                       fillColor=colors.Color(0.9, 0.9, 0.9), strokeColor=colors.black,
                       strokeWidth=0.3))
            d.add(String(f.x(0) + 1 * mm, y + 3.6 * mm, "self-weight of the member",
                         fontName=FONT, fontSize=6))
    band_bottom = y - 0.5 * mm - BAND
    _band(d, a, f, band_bottom, layouts)
    _supports(d, a, f, band_bottom, u)
    _bars(d, a, f, band_bottom - 13 * mm, u, layouts)
    return d
