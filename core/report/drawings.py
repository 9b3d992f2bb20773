"""Vector drawings for the calculation sheet (reportlab graphics): the section to scale,
line plots for shear, moment and deflection, and strain and stress profiles.

Fills read in greyscale print: timber is light with diagonal grain lines, steel is solid
dark grey, other materials are mid grey with cross lines.
"""

from __future__ import annotations

import math
from collections.abc import Sequence

import numpy as np
from reportlab.graphics.shapes import Drawing, Group, Line, Polygon, PolyLine, Rect
from reportlab.lib import colors
from reportlab.lib.units import mm
from reportlab.pdfbase.pdfmetrics import stringWidth
from shapely.geometry import LineString, MultiPolygon
from shapely.geometry import Polygon as ShapelyPolygon

from ..model.units import sig, to_display, unit_label
from ..section.transformed import Section
from .fonts import FONT
from .fonts import drawn_string as String
from .numbers import num

TIMBER = colors.Color(0.93, 0.86, 0.72)
GRAIN = colors.Color(0.55, 0.42, 0.25)
STEEL = colors.Color(0.30, 0.32, 0.36)
OTHER = colors.Color(0.75, 0.75, 0.78)


def new_drawing(width: float, height: float) -> Drawing:
    """A drawing whose initial font is the embedded face (not reportlab's Helvetica)."""
    d = Drawing(width, height)
    d.initialFontName = FONT
    return d


def nice_ticks(lo: float, hi: float, count: int = 5) -> list[float]:
    """Round tick values covering [lo, hi]."""
    if not math.isfinite(lo) or not math.isfinite(hi) or hi <= lo:
        return [lo]
    raw = (hi - lo) / count
    mag = 10 ** math.floor(math.log10(raw))
    step = next(m * mag for m in (1, 2, 2.5, 5, 10) if m * mag >= raw)
    start = math.ceil(lo / step - 1e-9) * step
    out = []
    t = start
    while t <= hi + 1e-9 * step:
        out.append(0.0 if abs(t) < step * 1e-9 else t)
        t += step
    return out


def _hatch(poly: ShapelyPolygon, spacing: float, angle_deg: float) -> list[tuple[float, ...]]:
    """Line segments of a hatch clipped exactly to a polygon (drawing units)."""
    minx, miny, maxx, maxy = poly.bounds
    d = max(maxx - minx, maxy - miny)
    a = math.radians(angle_deg)
    ux, uy = math.cos(a), math.sin(a)
    nx, ny = -uy, ux
    cx, cy = (minx + maxx) / 2, (miny + maxy) / 2
    out = []
    k = -d
    while k <= d:
        px, py = cx + nx * k, cy + ny * k
        line = LineString([(px - ux * d, py - uy * d), (px + ux * d, py + uy * d)])
        cut = poly.intersection(line)
        for seg in getattr(cut, "geoms", [cut]):
            coords = list(getattr(seg, "coords", []))
            if len(coords) >= 2:
                out.append((*coords[0], *coords[-1]))
        k += spacing
    return out


def section_drawing(section: Section, system: str, width: float = 80 * mm,
                    height: float = 80 * mm) -> tuple[Drawing, float]:
    """The section drawn to scale with its overall dimensions, ply numbers and the
    neutral axis. Returns the drawing and the scale (drawing length / real length).
    """
    x0 = min(p.x for p in section.plies)
    x1 = max(p.x + p.width for p in section.plies)
    y0 = float(section.y_bottom.min())
    y1 = float(section.y_top.max())
    margin = 14 * mm
    scale = min((width - 2 * margin) / max(x1 - x0, 1e-9),
                (height - 2 * margin) / max(y1 - y0, 1e-9))
    d = new_drawing(width, height)

    def tx(x: float) -> float:
        return float(margin + (x - x0) * scale)

    def ty(y: float) -> float:
        return float(margin + (y - y0) * scale)

    for i, (ply, geom, mat) in enumerate(zip(section.plies, section.geoms, section.materials,
                                             strict=True)):
        polys = geom.geoms if isinstance(geom, MultiPolygon) else [geom]
        for poly in polys:
            if poly.is_empty:
                continue
            fill = {"timber": TIMBER, "steel": STEEL}.get(mat.kind, OTHER)
            pts = [v for x, y in poly.exterior.coords for v in (tx(x), ty(y))]
            d.add(Polygon(pts, fillColor=fill, strokeColor=colors.black, strokeWidth=0.6))
            for hole in poly.interiors:
                hp = [v for x, y in hole.coords for v in (tx(x), ty(y))]
                d.add(Polygon(hp, fillColor=colors.white, strokeColor=colors.black,
                              strokeWidth=0.6))
            drawn = ShapelyPolygon([(tx(x), ty(y)) for x, y in poly.exterior.coords],
                                   [[(tx(x), ty(y)) for x, y in h.coords] for h in poly.interiors])
            if mat.kind == "timber":
                for seg in _hatch(drawn, 2.2 * mm, 45):
                    d.add(Line(*seg, strokeColor=GRAIN, strokeWidth=0.35))
            elif mat.kind != "steel":
                for ang in (45, -45):
                    for seg in _hatch(drawn, 2.0 * mm, ang):
                        d.add(Line(*seg, strokeColor=colors.grey, strokeWidth=0.3))
        if section.area[i] > 0:
            probe = LineString([(x0 - 1, ply.y + 0.75 * ply.height),
                                (x1 + 1, ply.y + 0.75 * ply.height)]).intersection(geom)
            c = probe.centroid if not probe.is_empty else geom.representative_point()
            cx, cy = tx(c.x), ty(c.y)
            d.add(Rect(cx - 3.2, cy - 3.6, 6.4, 7.6, fillColor=colors.white,
                       strokeColor=colors.black, strokeWidth=0.4))
            d.add(String(cx, cy - 2.4, str(i + 1), fontName=FONT, fontSize=6.5,
                         textAnchor="middle"))
    # neutral axis
    yna = ty(section.neutral_axis_y)
    d.add(Line(tx(x0) - 4 * mm, yna, tx(x1) + 6 * mm, yna, strokeColor=colors.red,
               strokeDashArray=[4, 2, 1, 2], strokeWidth=0.8))
    d.add(String(tx(x0) - 4.5 * mm, yna - 2, "NA", fontName=FONT, fontSize=7,
                 fillColor=colors.red, textAnchor="end"))
    na_text = (f"NA: y = {sig(to_display(section.neutral_axis_y, 'length', system), 4)} "
               f"{unit_label('length', system)}")
    d.add(String(tx(x0), ty(y0) - 11.5 * mm, na_text, fontName=FONT, fontSize=6.5,
                 fillColor=colors.red))
    # overall dimensions
    yb = ty(y0) - 4 * mm
    d.add(Line(tx(x0), yb, tx(x1), yb, strokeWidth=0.5))
    for xx in (tx(x0), tx(x1)):
        d.add(Line(xx, yb - 1.5 * mm, xx, yb + 1.5 * mm, strokeWidth=0.5))
    d.add(String((tx(x0) + tx(x1)) / 2, yb - 3.5 * mm,
                 f"{sig(to_display(x1 - x0, 'length', system), 4)} {unit_label('length', system)}",
                 fontName=FONT, fontSize=7, textAnchor="middle"))
    xr = tx(x1) + 3 * mm
    d.add(Line(xr, ty(y0), xr, ty(y1), strokeWidth=0.5))
    for yy in (ty(y0), ty(y1)):
        d.add(Line(xr - 1.5 * mm, yy, xr + 1.5 * mm, yy, strokeWidth=0.5))
    g = Group(String(0, 0, f"{sig(to_display(y1 - y0, 'length', system), 4)} "
                     f"{unit_label('length', system)}", fontName=FONT, fontSize=7,
                     textAnchor="middle"))
    g.transform = (0, 1, -1, 0, xr + 4.5 * mm, (ty(y0) + ty(y1)) / 2)
    d.add(g)
    return d, scale


def line_plot(x: Sequence[float] | np.ndarray, y: Sequence[float] | np.ndarray, xlabel: str,
              ylabel: str,
              width: float = 160 * mm, height: float = 38 * mm, label_max: bool = True,
              marks: Sequence[float] = (), legend: str = "") -> Drawing:
    """A filled line plot with axes, ticks, a legend and its largest |value| labelled."""
    xs, ys = np.asarray(x, dtype=float), np.asarray(y, dtype=float)
    d = new_drawing(width, height)
    left, bottom, right, top = 18 * mm, 9 * mm, 4 * mm, 4 * mm
    w, h = width - left - right, height - bottom - top
    lo, hi = float(min(ys.min(), 0.0)), float(max(ys.max(), 0.0))
    if hi - lo <= 0:
        hi, lo = hi + 1.0, lo - 1.0
    pad = (hi - lo) * 0.15
    lo, hi = lo - pad, hi + pad
    xa, xb = float(xs.min()), float(xs.max())

    def px(v: float) -> float:
        return float(left + (v - xa) / (xb - xa) * w)

    def py(v: float) -> float:
        return float(bottom + (v - lo) / (hi - lo) * h)

    d.add(Rect(left, bottom, w, h, fillColor=None, strokeColor=colors.black, strokeWidth=0.5))
    for t in nice_ticks(lo, hi, 4):
        d.add(Line(left - 1.2 * mm, py(t), left, py(t), strokeWidth=0.4))
        d.add(String(left - 1.6 * mm, py(t) - 2, num(t, 3), fontName=FONT, fontSize=6,
                     textAnchor="end"))
    for t in nice_ticks(xa, xb, 8):
        d.add(Line(px(t), bottom, px(t), bottom - 1.2 * mm, strokeWidth=0.4))
        d.add(String(px(t), bottom - 4 * mm, sig(t, 3), fontName=FONT, fontSize=6,
                     textAnchor="middle"))
    for m in marks:
        d.add(Line(px(m), bottom, px(m), bottom + h, strokeColor=colors.lightgrey,
                   strokeWidth=0.4, strokeDashArray=[1, 2]))
    d.add(Line(left, py(0), left + w, py(0), strokeColor=colors.grey, strokeWidth=0.4))
    pts = [v for a, b in zip(xs, ys, strict=True) for v in (px(a), py(b))]
    fill = [px(xa), py(0), *pts, px(xb), py(0)]
    d.add(Polygon(fill, fillColor=colors.Color(0.85, 0.85, 0.85), strokeColor=None))
    d.add(PolyLine(pts, strokeColor=colors.black, strokeWidth=0.9))
    if label_max and ys.size:
        k = int(np.argmax(np.abs(ys)))
        d.add(String(min(px(xs[k]) + 1.5, left + w - 30), py(ys[k]) + (2 if ys[k] >= 0 else -7),
                     f"{num(float(ys[k]), 4)} at x = {num(float(xs[k]), 3)}", fontName=FONT,
                     fontSize=6.5))
    d.add(String(left + w / 2, 1.2, xlabel, fontName=FONT, fontSize=6.5, textAnchor="middle"))
    g = Group(String(0, 0, ylabel, fontName=FONT, fontSize=6.5, textAnchor="middle"))
    g.transform = (0, 1, -1, 0, 3.5 * mm, bottom + h / 2)
    d.add(g)
    if legend:
        entries = [(legend, colors.black, 0.9)]
        if marks:
            entries.append(("supports", colors.lightgrey, 0.4))
        _legend(d, left + w - 2 * mm, bottom + h - 2 * mm, entries)
    return d


def _legend(d: Drawing, right: float, top: float,
            entries: Sequence[tuple[str, colors.Color, float]]) -> None:
    """A boxed legend whose top right corner is at (right, top)."""
    size = 6.0
    text_w = max(stringWidth(t, FONT, size) for t, _, _ in entries)
    box_w = text_w + 9 * mm
    box_h = len(entries) * 3.2 * mm + 1.2 * mm
    x = right - box_w
    d.add(Rect(x, top - box_h, box_w, box_h, fillColor=colors.white, strokeColor=colors.grey,
               strokeWidth=0.3))
    for k, (text, col, lw) in enumerate(entries):
        yy = top - (k + 1) * 3.2 * mm + 0.6 * mm
        d.add(Line(x + 1.2 * mm, yy + 0.7 * mm, x + 6 * mm, yy + 0.7 * mm, strokeColor=col,
                   strokeWidth=max(lw, 0.8)))
        d.add(String(x + 7.2 * mm, yy, text, fontName=FONT, fontSize=size))


def _legend_row(d: Drawing, x: float, y: float,
                entries: Sequence[tuple[str, colors.Color, float]]) -> None:
    """Legend entries in one row starting at (x, y)."""
    for text, col, lw in entries:
        d.add(Line(x, y + 0.8 * mm, x + 4.5 * mm, y + 0.8 * mm, strokeColor=col,
                   strokeWidth=lw, strokeDashArray=[4, 2, 1, 2] if col == colors.red else None))
        d.add(String(x + 5.5 * mm, y, text, fontName=FONT, fontSize=6))
        x += 5.5 * mm + stringWidth(text, FONT, 6) + 4 * mm


def _place_labels(labels: list[tuple[float, float, str, str]], size: float,
                  lo: float, hi: float) -> list[tuple[float, float, str, str]]:
    """Move labels (x, y, text, anchor) vertically so that no two overlap; each stays
    as near its point as it can, within [lo, hi].
    """
    placed: list[tuple[float, float, float, float]] = []
    out = []
    step = size * 1.15
    for x, y, text, anchor in sorted(labels, key=lambda t: t[1]):
        w = stringWidth(text, FONT, size)
        x0 = x - w if anchor == "end" else x
        for k in range(40):
            shift = (k + 1) // 2 * step * (1 if k % 2 else -1)
            yy = min(max(y + shift, lo), hi - size)
            box = (x0, yy, x0 + w, yy + size)
            if not any(box[0] < b[2] and b[0] < box[2] and box[1] < b[3] and b[1] < box[3]
                       for b in placed):
                break
        placed.append(box)
        out.append((x, yy, text, anchor))
    return out


def profile_drawing(section: Section, moment: float, system: str, width: float = 160 * mm,
                    height: float = 70 * mm) -> Drawing:
    """Strain (left) and stress (right) over the height, aligned, values at every
    interface and extreme fibre.
    """
    d = new_drawing(width, height)
    k = to_display(1.0, "length", system)
    ks = to_display(1.0, "stress", system)
    y0, y1 = float(section.y_bottom.min()), float(section.y_top.max())
    bottom, top = 10 * mm, 8 * mm
    h = height - bottom - top

    def py(y: float) -> float:
        return float(bottom + (y - y0) / (y1 - y0) * h)

    top_s, bot_s = section.ply_extreme_stresses(moment)
    strain = section.strain(moment, np.array([y0, y1])) * 1e6
    panels = (("strain (\u00b5\u03b5, tension +)", 16 * mm, 52 * mm,
               [(float(strain[0]), float(strain[1]), y0, y1, colors.black)]),
              (f"stress ({unit_label('stress', system)}, tension +)", 86 * mm, 70 * mm,
               [(float(bot_s[i]) * ks, float(top_s[i]) * ks, float(section.y_bottom[i]),
                 float(section.y_top[i]), STEEL if m.kind == "steel" else GRAIN)
                for i, m in enumerate(section.materials) if section.area[i] > 0]))
    for title, left, w, segs in panels:
        vals = [v for s in segs for v in s[:2]] + [0.0]
        lo, hi = min(vals), max(vals)
        pad = (hi - lo) * 0.25 or 1.0
        lo, hi = lo - pad, hi + pad

        def px(v: float, lo: float = lo, hi: float = hi, left: float = left,
               w: float = w) -> float:
            return left + (v - lo) / (hi - lo) * w

        d.add(Rect(left, bottom, w, h, fillColor=None, strokeWidth=0.5))
        d.add(Line(px(0), bottom, px(0), bottom + h, strokeColor=colors.grey, strokeWidth=0.4))
        for t in nice_ticks(lo, hi, 4):
            d.add(String(px(t), bottom - 4 * mm, num(t, 3), fontName=FONT, fontSize=6,
                         textAnchor="middle"))
        seen: set[tuple[float, float]] = set()
        labels = []
        for vb, vt, yb, yt, col in segs:
            d.add(Line(px(vb), py(yb), px(vt), py(yt), strokeColor=col, strokeWidth=1.2))
            for v, y in ((vb, yb), (vt, yt)):
                key = (round(v, 6), round(y, 9))
                if key in seen:
                    continue
                seen.add(key)
                labels.append((px(v) + (2 if v >= 0 else -2), py(y) - 2, num(v, 3),
                               "start" if v >= 0 else "end"))
        for x, y, text, anchor in _place_labels(labels, 6, bottom + 1, bottom + h - 1):
            d.add(String(x, y, text, fontName=FONT, fontSize=6, textAnchor=anchor))
        kinds = {("steel" if c == STEEL else "timber" if c == GRAIN else "strain") for *_, c
                 in segs}
        entries = [(name, col, 1.2) for name, col in (("strain", colors.black),
                                                      ("timber plies", GRAIN),
                                                      ("steel plies", STEEL))
                   if name.split()[0] in kinds]
        entries.append(("neutral axis", colors.red, 0.6))
        _legend_row(d, left, bottom + h + 2.2 * mm, entries)
        yna = py(section.neutral_axis_y)
        d.add(Line(left, yna, left + w, yna, strokeColor=colors.red, strokeWidth=0.6,
                   strokeDashArray=[4, 2, 1, 2]))
        d.add(String(left + w / 2, 1.5, title, fontName=FONT, fontSize=6.5, textAnchor="middle"))
    for t in nice_ticks(y0 * k, y1 * k, 5):
        d.add(String(15 * mm, py(t / k) - 2, sig(t, 3), fontName=FONT, fontSize=6,
                     textAnchor="end"))
    g = Group(String(0, 0, f"height ({unit_label('length', system)})", fontName=FONT,
                     fontSize=6.5, textAnchor="middle"))
    g.transform = (0, 1, -1, 0, 4 * mm, bottom + h / 2)
    d.add(g)
    return d
