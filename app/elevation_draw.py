"""The items of the member's elevation and how each update moves them (see elevation.py).

Every kind of item has its own pool; an update sizes the pools to the project and sets
each item's geometry, text and tooltip, so a drag moves items instead of rebuilding them.
"""

from __future__ import annotations

from collections import Counter
from collections.abc import Callable, Sequence

from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtGui import QBrush, QColor, QPen, QPolygonF
from PySide6.QtWidgets import (
    QGraphicsEllipseItem,
    QGraphicsPathItem,
    QGraphicsPolygonItem,
    QGraphicsRectItem,
    QGraphicsScene,
)

from plystack.app.canvas_items import FILLS
from plystack.app.elevation_frame import Frame
from plystack.app.elevation_items import (
    CASE_COLOURS,
    FAIL,
    Label,
    Pool,
    arrow_path,
    dimension_path,
    pen,
    vertical_dimension_path,
)
from plystack.app.elevation_model import PlateBolts, notch_span
from plystack.app.safe import plain_tip
from plystack.core.model.member import Load
from plystack.core.model.project import Project
from plystack.core.model.units import display_string

BOLT_RADIUS = 3.5
RING_RADIUS = 7.0
#: Height of a support symbol below the member, pixels.
SUPPORT_PX = 12.0
#: Pixels kept between two labels on one row.
GAP = 6.0


def _rect_item() -> QGraphicsRectItem:
    return QGraphicsRectItem()


def _ellipse_item() -> QGraphicsEllipseItem:
    return QGraphicsEllipseItem()


def _path_item() -> QGraphicsPathItem:
    return QGraphicsPathItem()


def _polygon_item() -> QGraphicsPolygonItem:
    return QGraphicsPolygonItem()


class Row:
    """Labels along one row that must not overlap: each goes right of the last one."""

    def __init__(self) -> None:
        self.right = -1e9

    def free_x(self, x: float) -> float:
        """The leftmost x at or after ``x`` clear of the labels already placed."""
        return max(x, self.right + GAP)

    def took(self, box: QRectF) -> None:
        """A label was placed in ``box``."""
        self.right = max(self.right, box.right())


class ElevationDrawing:
    """Pools of items of the elevation, updated from a project, a frame and the bolts."""

    def __init__(self, scene: QGraphicsScene):
        self.scene = scene
        self.plies = Pool(scene, _rect_item)
        self.notches = Pool(scene, _rect_item)
        self.holes = Pool(scene, _ellipse_item)
        self.supports = Pool(scene, _polygon_item)
        self.bands = Pool(scene, _polygon_item)
        self.arrows = Pool(scene, _path_item)
        self.load_labels = Pool(scene, Label)
        self.bolt_items = Pool(scene, _ellipse_item)
        self.rings = Pool(scene, _ellipse_item)
        self.dims = Pool(scene, _path_item)
        self.dim_labels = Pool(scene, Label)
        self.bars = Pool(scene, _rect_item)
        self.grips = Pool(scene, _rect_item)
        self.bar_labels = Pool(scene, Label)
        self._drawn: dict[str, tuple[tuple[object, ...], tuple[object, ...]]] = {}
        self._member_drawn: dict[int, tuple[object, ...]] = {}
        self.parts_drawn: Counter[str] = Counter()  # parts drawn again (for tests)
        self.station_label = Label()
        self.station_label.setZValue(90)
        self.station_label.setVisible(False)
        scene.addItem(self.station_label)

    def update(self, project: Project, frame: Frame | None,
               bolts: Sequence[PlateBolts], step: float) -> None:
        """Move every item to ``project`` drawn in ``frame`` (None: draw nothing)."""
        if frame is None or project.beam is None:
            for pool in (self.plies, self.notches, self.holes, self.supports, self.bands,
                         self.arrows, self.load_labels, self.bolt_items, self.rings, self.dims,
                         self.dim_labels, self.bars, self.grips, self.bar_labels):
                pool.sized(0)
            self._drawn.clear()
            self._member_drawn.clear()
            return
        beam, u = project.beam, project.display_units
        self._member(project, frame)
        self._openings(project, frame)
        self._part("supports", (beam.layout,), (frame, u), lambda: self._supports(project, frame))
        self._part("loads", (beam,), (frame, u), lambda: self._loads(project, frame))
        self._part("bolts", (), (repr(tuple(bolts)), frame, u),
                   lambda: self._bolts(project, frame, bolts))
        mats = project.all_materials()
        lanes = tuple((p.name, p.material, repr(p.start), repr(p.end),
                       mats[p.material].kind if p.material in mats else "other")
                      for p in project.plies)
        self._part("lanes", (), (lanes, frame, u), lambda: self._lanes(project, frame))

    def _part(self, part: str, objects: tuple[object, ...], values: tuple[object, ...],
              draw: Callable[[], None]) -> None:
        """Draw ``part`` unless it was drawn last from the same objects (compared by
        identity: a frozen object kept is the same content) and equal values (a float
        that reaches a text is compared through its repr, which tells -0.0 from 0.0).
        """
        kept = self._drawn.pop(part, None)  # forgotten while drawing: a failed draw redraws
        if kept is not None and len(kept[0]) == len(objects) and all(
                a is b for a, b in zip(kept[0], objects, strict=True)) and kept[1] == values:
            self._drawn[part] = kept
            return
        draw()
        self._drawn[part] = (objects, values)
        self.parts_drawn[part] += 1

    # --- the member --------------------------------------------------------------------

    def _member(self, project: Project, f: Frame) -> None:
        mats = project.all_materials()
        items = self.plies.sized(len(project.plies))
        order = sorted(range(len(project.plies)), key=lambda i: (
            mats[project.plies[i].material].kind == "steel"
            if project.plies[i].material in mats else False))
        kept, self._member_drawn = self._member_drawn, {}
        for z, i in enumerate(order):
            ply, item = project.plies[i], items[i]
            kind = mats[ply.material].kind if ply.material in mats else "other"
            drawn = kept.get(i)  # this item drawn from this ply (the same object) alike
            if drawn is not None and drawn[0] is item and drawn[1] is ply and (
                    drawn[2:] == (kind, z, f)):
                self._member_drawn[i] = drawn
                continue
            a, b = ply.extent(f.length)
            top, bottom = f.y_px(ply.top), f.y_px(ply.y)
            item.setRect(QRectF(f.x_px(a), top, f.x_px(b) - f.x_px(a), bottom - top))
            color = FILLS.get(kind, FILLS["other"])[0]
            if kind == "steel":  # hidden between timbers: a dashed outline (drafting)
                item.setBrush(QBrush(QColor(color.red(), color.green(), color.blue(), 70)))
                item.setPen(pen(QColor(40, 45, 55), 1.0, Qt.PenStyle.DashLine))
            else:
                item.setBrush(QBrush(color))
                item.setPen(pen(QColor(120, 90, 50), 1.0))
            item.setZValue(1 + z * 0.01)
            item.setToolTip(plain_tip(f"{ply.name} ({ply.material})"))
            self._member_drawn[i] = (item, ply, kind, z, f)

    def _openings(self, project: Project, f: Frame) -> None:
        beam = project.beam
        assert beam is not None
        u = project.display_units
        mats = project.all_materials()
        timber = [p for p in project.plies if p.material in mats
                  and mats[p.material].kind == "timber"] or list(project.plies)
        for item, notch in zip(self.notches.sized(len(beam.notches)), beam.notches,
                               strict=True):
            cut = [p for p in project.plies if p.name in notch.plies] or timber
            a, b = notch_span(notch, beam.layout)
            if notch.face == "bottom":
                y0 = min(p.y for p in cut)
                y1 = y0 + notch.depth
            else:
                y1 = max(p.top for p in cut)
                y0 = y1 - notch.depth
            item.setRect(QRectF(f.x_px(a), f.y_px(y1), f.x_px(b) - f.x_px(a),
                                f.y_px(y0) - f.y_px(y1)))
            item.setBrush(QBrush(QColor(252, 252, 250)))
            item.setPen(pen(QColor(150, 60, 20), 1.2))
            item.setZValue(5)
            item.setToolTip(plain_tip(f"notch, {notch.face} face: {fmt(notch.depth, 'length', u)}"
                                      f" deep, {fmt(notch.length, 'length', u)} long"))
        for item, hole in zip(self.holes.sized(len(beam.holes)), beam.holes, strict=True):
            r = hole.diameter / 2
            x0, x1 = f.x_px(hole.x - r), f.x_px(hole.x + r)
            y0, y1 = f.y_px(hole.y + r), f.y_px(hole.y - r)
            item.setRect(QRectF(x0, y0, max(x1 - x0, 3.0), max(y1 - y0, 3.0)))
            item.setBrush(QBrush(QColor(252, 252, 250)))
            item.setPen(pen(QColor(150, 60, 20), 1.2))
            item.setZValue(5)
            item.setToolTip(plain_tip(f"hole {fmt(hole.diameter, 'length', u)} across, centre "
                                      f"at x = {fmt(hole.x, 'span', u)}, y = "
                                      f"{fmt(hole.y, 'length', u)}"))

    def _supports(self, project: Project, f: Frame) -> None:
        beam = project.beam
        assert beam is not None
        xs = beam.layout.support_positions()
        kinds = beam.layout.support_kinds()
        y = f.member_bottom
        h = SUPPORT_PX
        for item, x, kind in zip(self.supports.sized(len(xs)), xs, kinds, strict=True):
            px = f.x_px(x)
            if kind == "pin":
                poly = QPolygonF([QPointF(px, y), QPointF(px - 7, y + h),
                                  QPointF(px + 7, y + h)])
                item.setBrush(QBrush(QColor(255, 255, 255)))
            else:  # fixed: a wall across the member's end
                w = -6 if x <= f.length / 2 else 6
                poly = QPolygonF([QPointF(px, f.member_top - 6), QPointF(px + w, f.member_top - 6),
                                  QPointF(px + w, y + 6), QPointF(px, y + 6)])
                item.setBrush(QBrush(QColor(60, 60, 60), Qt.BrushStyle.BDiagPattern))
            item.setPolygon(poly)
            item.setPen(pen(QColor(40, 40, 40), 1.2))
            item.setZValue(6)
            item.setToolTip(plain_tip(f"{'pinned' if kind == 'pin' else 'fixed'} support at "
                                      f"x = {fmt(x, 'span', project.display_units)}"))

    # --- loads ----------------------------------------------------------------------------

    def _loads(self, project: Project, f: Frame) -> None:
        beam = project.beam
        assert beam is not None
        u = project.display_units
        lines = [ld for ld in beam.loads if ld.type != "point"]
        points = [ld for ld in beam.loads if ld.type == "point"]
        labels = self.load_labels.sized(len(lines) + len(points))
        rows = {c: Row() for c in f.cases}
        for k, (item, ld) in enumerate(zip(self.bands.sized(len(lines)), lines, strict=True)):
            row = f.cases.index(ld.case)
            base = f.bands_top + (row + 1) * f.band_height - 2
            most = max(max(abs(o.line_value), abs(o.line_value_end)) for o in lines
                       if o.case == ld.case) or 1.0
            a = 0.0 if ld.start is None else ld.start
            b = f.length if ld.end is None else ld.end
            h0 = 3 + (f.band_height - 7) * abs(ld.line_value) / most
            h1 = 3 + (f.band_height - 7) * abs(ld.line_value_end) / most
            x0, x1 = f.x_px(a), f.x_px(b)
            item.setPolygon(QPolygonF([QPointF(x0, base), QPointF(x0, base - h0),
                                       QPointF(x1, base - h1), QPointF(x1, base)]))
            c = CASE_COLOURS.get(ld.case, QColor(90, 90, 90))
            item.setBrush(QBrush(QColor(c.red(), c.green(), c.blue(), 80)))
            item.setPen(pen(c, 1.0))
            item.setZValue(10)
            text = _load_text(ld, u)
            item.setToolTip(plain_tip(text + (f": {ld.description}" if ld.description else "")))
            r = rows[ld.case]
            labels[k].setZValue(12)
            r.took(labels[k].place(text, r.free_x(x0 + 3), base - 1, 0.0, 1.0, c))
        row = Row()
        for item, label, ld in zip(self.arrows.sized(len(points)), labels[len(lines):], points,
                                   strict=True):
            px = f.x_px(ld.at or 0.0)
            tail, head = f.arrows_top + 15, f.member_top - 1
            if ld.value < 0:  # upward
                tail, head = head, tail
            item.setPath(arrow_path(px, tail, head))
            c = CASE_COLOURS.get(ld.case, QColor(90, 90, 90))
            item.setPen(pen(c, 1.6))
            item.setZValue(11)
            text = _load_text(ld, u)
            item.setToolTip(plain_tip(text + (f": {ld.description}" if ld.description else "")))
            w = label.size_of(text)[0]
            x = px - w / 2
            x = min(max(row.free_x(x), 2.0), f.view_width - w - 2)
            row.took(label.place(text, x, f.arrows_top + 1, 0.0, 0.0, c))

    # --- bolts ------------------------------------------------------------------------------

    def _bolts(self, project: Project, f: Frame, plates: Sequence[PlateBolts]) -> None:
        u = project.display_units
        every = [(pb, b, x, y) for pb in plates for b, (x, y) in enumerate(pb.layout.bolts)]
        for item, (pb, _b, x, y) in zip(self.bolt_items.sized(len(every)), every, strict=True):
            px, py = f.x_px(x), f.y_px(y)
            item.setRect(QRectF(px - BOLT_RADIUS, py - BOLT_RADIUS, 2 * BOLT_RADIUS,
                                2 * BOLT_RADIUS))
            item.setBrush(QBrush(QColor(35, 35, 35)))
            item.setPen(pen(QColor(255, 255, 255), 0.8))
            item.setZValue(20)
            item.setToolTip(plain_tip(f"bolt of {pb.name} at x = {fmt(x, 'span', u)}, "
                                      f"y = {fmt(y, 'length', u)}"))
        marked = [(pb, b, x, y) for pb, b, x, y in every if b in pb.marks]
        for item, (pb, b, x, y) in zip(self.rings.sized(len(marked)), marked, strict=True):
            px, py = f.x_px(x), f.y_px(y)
            item.setRect(QRectF(px - RING_RADIUS, py - RING_RADIUS, 2 * RING_RADIUS,
                                2 * RING_RADIUS))
            item.setBrush(QBrush(Qt.BrushStyle.NoBrush))
            item.setPen(pen(FAIL, 2.0))
            item.setZValue(21)
            item.setToolTip(plain_tip("\n".join(pb.marks[b])))
            item.setData(0, "; ".join(pb.marks[b]))
        self._dimensions(project, f, plates)

    def _dimensions(self, project: Project, f: Frame, plates: Sequence[PlateBolts]) -> None:
        """End distances and spacing along the member below it, edge distances beside the
        first station: the distances the geometry rules measure.
        """
        u = project.display_units
        paths = self.dims.sized(3 * len(plates))
        texts: list[tuple[str, float, float, float, float]] = []
        for k, pb in enumerate(plates):
            xs = pb.layout.stations
            y = f.dims_top + 8 + k * f.DIM_ROW
            start, end = pb.layout.extent  # end distances from the plate's own ends
            chain = [start, *xs, end]
            paths[3 * k].setPath(dimension_path([f.x_px(v) for v in chain], y))
            count = f" ({len(xs)} stations, {pb.layout.count} bolts)"
            pairs = [(start, xs[0], "end ", ""), (xs[-1], end, "end ", "")]
            if len(xs) > 1:
                pairs.insert(1, (xs[0], xs[1], "spacing ", count))
            else:
                pairs[0] = (start, xs[0], "end ", count)
            for a, b, what, more in pairs:
                texts.append((f"{what}{fmt(b - a, 'length', u)}{more}",
                              (f.x_px(a) + f.x_px(b)) / 2, y + 3, 0.5, 0.0))
            x_dim, side = _edge_dimension_x(f, xs)
            rows = pb.layout.rows
            paths[3 * k + 1].setPath(vertical_dimension_path(x_dim, f.y_px(pb.timber_top),
                                                             f.y_px(max(rows))))
            paths[3 * k + 2].setPath(vertical_dimension_path(x_dim, f.y_px(min(rows)),
                                                             f.y_px(pb.timber_bottom)))
            tx, anchor = (x_dim - 3, 1.0) if side < 0 else (x_dim + 3, 0.0)
            texts.append((f"edge {fmt(pb.edge_top, 'length', u)}", tx,
                          (f.y_px(pb.timber_top) + f.y_px(max(rows))) / 2, anchor, 0.5))
            texts.append((f"edge {fmt(pb.edge_bottom, 'length', u)}", tx,
                          (f.y_px(min(rows)) + f.y_px(pb.timber_bottom)) / 2, anchor, 0.5))
        for p in paths:
            p.setPen(pen(QColor(60, 60, 60), 1.0))
            p.setZValue(30)
        labels = self.dim_labels.sized(len(texts))
        rows: dict[float, Row] = {}  # one per plate's chain of dimensions
        beside: list[QRectF] = []  # the edge labels placed so far
        for label, (text, x, y, dx, dy) in zip(labels, texts, strict=True):
            label.setZValue(31)
            if dx == 0.5:  # along the chain: never over the previous one
                row = rows.setdefault(y, Row())
                w = label.size_of(text)[0]
                x = row.free_x(x - w / 2) + w / 2
                row.took(label.place(text, x, y, dx, dy, QColor(40, 40, 40)))
            else:  # beside the stations: moved down until clear of the others
                box = label.place(text, x, y, dx, dy, QColor(40, 40, 40))
                for _ in range(4 * len(beside) + 1):  # a bound on the moves
                    if not any(box.intersects(b.adjusted(-GAP, -1, GAP, 1)) for b in beside):
                        break
                    y += box.height() + 3
                    box = label.place(text, x, y, dx, dy, QColor(40, 40, 40))
                beside.append(box)

    # --- one bar per ply ------------------------------------------------------------------

    def _lanes(self, project: Project, f: Frame) -> None:
        mats = project.all_materials()
        u = project.display_units
        n = len(project.plies)
        bars, grips = self.bars.sized(n), self.grips.sized(2 * n)
        labels = self.bar_labels.sized(n)
        for i, ply in enumerate(project.plies):
            a, b = ply.extent(f.length)
            top, bottom = f.lane(i)
            x0, x1 = f.x_px(a), f.x_px(b)
            kind = mats[ply.material].kind if ply.material in mats else "other"
            color = FILLS.get(kind, FILLS["other"])[0]
            bars[i].setRect(QRectF(x0, top, max(x1 - x0, 1.0), bottom - top))
            bars[i].setBrush(QBrush(color))
            bars[i].setPen(pen(QColor(50, 50, 50), 1.0))
            bars[i].setZValue(40)
            for g, x in ((grips[2 * i], x0), (grips[2 * i + 1], x1)):
                g.setRect(QRectF(x - 2, top - 1, 4, bottom - top + 2))
                g.setBrush(QBrush(QColor(0, 90, 200)))
                g.setPen(QPen(Qt.PenStyle.NoPen))
                g.setZValue(42)
            whole = ply.covers_whole(f.length)
            where = ("whole member" if whole else
                     f"{fmt(a, 'span', u)} to {fmt(b, 'span', u)}")
            text = f"{ply.name}: {where}"
            bars[i].setToolTip(plain_tip(f"{text}. Drag an end to change where it runs."))
            w, _h = labels[i].size_of(text)
            mid = (top + bottom) / 2
            light = kind == "steel"
            if w + 8 <= x1 - x0:
                labels[i].setBrush(QBrush())
                labels[i].place(text, x0 + 5, mid, 0.0, 0.5,
                                QColor(255, 255, 255) if light else QColor(30, 30, 30))
            else:
                labels[i].setBrush(QBrush(QColor(255, 255, 255, 215)))
                right = x1 + 6 + w <= f.view_width - 2
                labels[i].place(text, x1 + 6 if right else x0 - 6, mid,
                                0.0 if right else 1.0, 0.5, QColor(30, 30, 30))
            labels[i].setZValue(43)



def _edge_dimension_x(f: Frame, stations: Sequence[float]) -> tuple[float, int]:
    """Where the edge distances are dimensioned: beside the station with the most room on
    one side (before the first, after the last, or in the widest gap), 10 px from it;
    returns the pixel column and the side its text goes (-1 left, +1 right).
    """
    xs = [f.x_px(x) for x in stations]
    options = [(xs[0] - f.x_px(0.0), xs[0] - 10, -1),
               (f.x_px(f.length) - xs[-1], xs[-1] + 10, 1)]
    options += [(b - a, a + 10, 1) for a, b in zip(xs, xs[1:], strict=False)]
    _room, x, side = max(options, key=lambda o: o[0])
    return x, side


def _load_text(ld: Load, u: str) -> str:
    """A load's label: its case and intensity (both ends for a varying one)."""
    if ld.type == "point":
        return f"{ld.case} {fmt(ld.value, 'force', u)}"
    if ld.value_end is not None and ld.line_value_end != ld.line_value:
        return (f"{ld.case} {fmt(ld.line_value, 'line_load', u)} to "
                f"{fmt(ld.line_value_end, 'line_load', u)}")
    return f"{ld.case} {fmt(ld.line_value, 'line_load', u)}"


def fmt(value: float, kind: str, system: str) -> str:
    """A quantity as the elevation writes it: four significant figures, no trailing
    zeros (1 ft, 24 in, 2.25 in).
    """
    return display_string(value, kind, system, 4)
