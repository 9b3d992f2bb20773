"""The section canvas: plies drawn to scale on a snapping grid, edited with the mouse.

Scene units are millimetres with y pointing up in the model and down in Qt, so a model
point (x, y) in metres sits at scene (1000 x, -1000 y). The scene rectangle is fixed and
large, so redrawing the plies never scrolls or re-scales the view: the view changes only
when the user zooms, pans or fits (F), when a project is loaded, and when the window is
resized while the user has not zoomed. A gesture never re-fits the view.
"""

from __future__ import annotations

import math
from dataclasses import replace

from PySide6.QtCore import QPointF, QRectF, Qt, Signal
from PySide6.QtGui import (
    QBrush,
    QColor,
    QKeyEvent,
    QMouseEvent,
    QPainter,
    QPen,
    QTransform,
    QWheelEvent,
)
from PySide6.QtWidgets import (
    QApplication,
    QGraphicsItem,
    QGraphicsLineItem,
    QGraphicsPathItem,
    QGraphicsRectItem,
    QGraphicsScene,
    QGraphicsView,
)

from plystack.app.analysis_model import AnalysisModel
from plystack.app.canvas_items import FILLS, Slots, Tag, draw_grid, geometry_path
from plystack.app.document import Document, new_gesture_key
from plystack.app.interactions import DrawGesture, MoveGesture, Press, ResizeGesture
from plystack.app.safe import guarded, reporter
from plystack.core.model.constants import INCH as IN
from plystack.core.model.units import fmt
from plystack.core.section.transformed import Section

HANDLE_PX = 8
#: Scene extent, mm (a square 200 m across): fixed, so redraws never move the view.
SCENE_HALF = 100_000.0
#: Zoom bounds, px per mm.
MIN_SCALE, MAX_SCALE = 1e-4, 2000.0
#: Margins kept free around the plies when fitting, px (the dimension labels sit there).
FIT_MARGINS = (48, 40, 120, 64)  # left, top, right, bottom


class SectionCanvas(QGraphicsView):
    """Draw, select, move and resize plies; grid, scale, neutral axis and dimensions."""

    selection_changed = Signal(int)
    status = Signal(str)

    def __init__(self, document: Document, analysis: AnalysisModel):
        super().__init__()
        self.document = document
        self.analysis = analysis
        self.setScene(QGraphicsScene(self))
        # items move on every step of a drag: no spatial index to keep up to date
        self.scene().setItemIndexMethod(QGraphicsScene.ItemIndexMethod.NoIndex)
        self.scene().setSceneRect(QRectF(-SCENE_HALF, -SCENE_HALF, 2 * SCENE_HALF,
                                         2 * SCENE_HALF))
        self.setRenderHint(QPainter.RenderHint.Antialiasing)
        self.setMouseTracking(True)
        self.setFocusPolicy(Qt.FocusPolicy.StrongFocus)
        self.setHorizontalScrollBarPolicy(Qt.ScrollBarPolicy.ScrollBarAlwaysOff)
        self.setVerticalScrollBarPolicy(Qt.ScrollBarPolicy.ScrollBarAlwaysOff)
        self.setTransformationAnchor(QGraphicsView.ViewportAnchor.AnchorUnderMouse)
        self.setViewportUpdateMode(QGraphicsView.ViewportUpdateMode.FullViewportUpdate)
        self.setMinimumSize(200, 160)
        self.selected: int | None = None
        self.hovered: int | None = None
        self.show_transformed = False
        self.snap_override: float | None = None
        self.press: Press | None = None
        self._pan: QPointF | None = None
        self._user_zoomed = False
        self._fitted = False
        self._nudge_key: str | None = None
        self._dimensions: dict[int, QGraphicsRectItem] = {}
        self._slots = Slots(self.scene())
        # what each ply's items were drawn from (items, ply, kind, selected, geometry)
        self._ply_drawn: dict[int, tuple] = {}  # type: ignore[type-arg]
        self.plies_drawn = 0  # plies whose items were set (for tests)
        self._grid_key: tuple[str, float] | None = None
        # the grid is drawn once per view (zoom, units, size; a pan shifts it), not on
        # every redraw
        self.setCacheMode(QGraphicsView.CacheModeFlag.CacheBackground)
        analysis.section_changed.connect(self.rebuild)
        analysis.station_changed.connect(self.rebuild)
        analysis.analysis_changed.connect(self._analysis_changed)
        self.rebuild()

    def _analysis_changed(self) -> None:
        """A segment's section comes with the full analysis: redraw when one is shown."""
        if self.analysis.shown_plies() is not None:
            self.rebuild()

    @property
    def section(self) -> Section | None:
        """The section the analysis model published for the current plies."""
        return self.analysis.section

    @property
    def gesture(self):  # type: ignore[no-untyped-def]
        """The gesture running now (None while no button is held or during a click)."""
        return self.press.gesture if self.press is not None else None

    def request_fit(self) -> None:
        """Fit the section in the view at the next redraw (a new project was loaded)."""
        self._fitted = False
        self._user_zoomed = False

    # --- state ------------------------------------------------------------------------

    @property
    def system(self) -> str:
        """Display unit system of the project."""
        return self.document.project.display_units

    @property
    def snap_step(self) -> float:
        """Snap step, m: 1/16 in (US) or 1 mm (SI) unless the user set another."""
        if self.snap_override:
            return self.snap_override
        return IN / 16 if self.system == "US" else 0.001

    def snap(self, value: float) -> float:
        """Round to the snap step, exactly in the display unit."""
        if not math.isfinite(value):
            return value
        if self.snap_override:
            return round(value / self.snap_override) * self.snap_override
        if self.system == "US":
            per_in = round(IN / self.snap_step)
            return round(value / IN * per_in) / per_in * IN
        return round(value * 1000) / 1000

    def default_material(self) -> str:
        """Material of a newly drawn ply: that of the selected ply, else a steel grade."""
        plies = self.document.project.plies
        if self.selected is not None and self.selected < len(plies):
            return plies[self.selected].material
        return "A36" if self.system == "US" else "S275"

    def next_name(self) -> str:
        """A fresh ply name."""
        names = {p.name for p in self.document.project.plies}
        k = len(names) + 1
        while f"ply {k}" in names:
            k += 1
        return f"ply {k}"

    def select(self, index: int | None) -> None:
        """Select a ply (None clears)."""
        n = len(self.document.project.plies)
        if index is not None and not 0 <= index < n:
            index = None
        if index != self.selected:
            self.selected = index
            self.selection_changed.emit(-1 if index is None else index)
        self.rebuild()

    # --- drawing ----------------------------------------------------------------------

    @guarded("Drawing the section")
    def rebuild(self) -> None:
        """Redraw every item from the model (the view itself stays where it is). Items
        are kept between redraws (``Slots``) and only what changed is set on them, so a
        drag moves the items instead of building the scene again.
        """
        grid = (self.system, self._scale())  # the grid's steps follow units and zoom
        if grid != self._grid_key:
            self._grid_key = grid
            self.resetCachedContent()
        self._slots.begin()
        try:
            self._draw_items()
        finally:
            self._slots.end()
        if not self._fitted and self.press is None and self.document.project.plies:
            self.fit()

    def _draw_items(self) -> None:
        self._dimensions = {}
        project = self.document.project
        if self.selected is not None and self.selected >= len(project.plies):
            self.selected = None
            self.selection_changed.emit(-1)
        if not project.plies:
            return
        mats = project.all_materials()
        shown, section = self._shown_section()
        plies = [project.plies[i] for i in shown]
        geoms = section.geoms if section else [p.rectangle() for p in plies]
        for k, (i, ply, geom) in enumerate(zip(shown, plies, geoms, strict=True)):
            kind = mats[ply.material].kind if ply.material in mats else "other"
            self._draw_ply(i, geom, kind, section is not None and not section.is_unclipped(k),
                           ply)
        if section is not None and self.show_transformed:
            for i in range(len(plies)):
                t = self._slots.get(("transformed", i), QGraphicsPathItem)
                t.setPath(geometry_path(section.transformed_geometry(i)))
                tp = QPen(QColor(200, 40, 40), 0, Qt.PenStyle.DashLine)
                tp.setCosmetic(True)
                t.setPen(tp)
                t.setZValue(1500)
        self._draw_annotations(plies, section)
        self._draw_names(shown)
        if self.selected is not None and self.selected in shown:
            self._draw_handles(project.plies[self.selected])

    def _shown_section(self) -> tuple[list[int], Section | None]:
        """The plies drawn (indices into the project's plies) and their section: every
        ply, or the plies of the segment chosen on the elevation; the section is None
        while the analysis of the current plies is not published yet (the plies are then
        drawn uncut).
        """
        plies = self.document.project.plies
        seg = self.analysis.shown_plies()
        if seg is None:
            section = self.section
            if section is not None and section.plies != plies:
                section = None  # published for other plies (not once signals settle)
            return list(range(len(plies))), section
        section = self.analysis.shown_section()
        if section is not None and section.plies != tuple(plies[i] for i in seg):
            section = None
        return list(seg), section

    def _draw_ply(self, i: int, geom, kind: str, clipped: bool, ply) -> None:  # type: ignore[no-untyped-def]
        back = self._slots.get(("back", i), QGraphicsPathItem)
        item = self._slots.get(("ply", i), QGraphicsPathItem)
        ghost = self._slots.get(("ghost", i), QGraphicsRectItem) if clipped else None
        selected = i == self.selected
        kept = self._ply_drawn.pop(i, None)
        if kept is not None and kept[0] is back and kept[1] is item and kept[2] is ghost and (
                kept[3] is ply and kept[4:6] == (kind, selected)
                and kept[6].equals_exact(geom, 0.0)):
            self._ply_drawn[i] = kept  # these items show this ply's outline already
            return
        self._draw_ply_items(back, item, ghost, i, geom, kind, ply)
        self.plies_drawn += 1
        self._ply_drawn[i] = (back, item, ghost, ply, kind, selected, geom)

    def _draw_ply_items(self, back: QGraphicsPathItem, item: QGraphicsPathItem,  # type: ignore[no-untyped-def]
                        ghost: QGraphicsRectItem | None, i: int, geom, kind: str,
                        ply) -> None:
        color, style, line = FILLS.get(kind, FILLS["other"])
        path = geometry_path(geom)
        back.setPath(path)
        back.setBrush(QBrush(color))
        back.setPen(QPen(Qt.PenStyle.NoPen))
        back.setZValue(2 * i)
        item.setPath(path)
        item.setBrush(QBrush(line if style != Qt.BrushStyle.SolidPattern else color, style))
        pen = QPen(QColor(0, 90, 200) if i == self.selected else QColor(20, 20, 20), 0)
        pen.setCosmetic(True)
        pen.setWidthF(2.5 if i == self.selected else 1.0)
        item.setPen(pen)
        item.setZValue(2 * i + 1)
        item.setData(0, i)
        if ghost is not None:  # dashed outline of the uncut rectangle where the ply is clipped
            ghost.setRect(self._rect(ply))
            gp = QPen(QColor(120, 120, 120), 0, Qt.PenStyle.DotLine)
            gp.setCosmetic(True)
            ghost.setPen(gp)
            ghost.setZValue(1000)

    def _rect(self, ply) -> QRectF:  # type: ignore[no-untyped-def]
        return QRectF(ply.x * 1000, -(ply.y + ply.height) * 1000, ply.width * 1000,
                      ply.height * 1000)

    def _place(self, item: QGraphicsRectItem, x: float, y: float, dx: float = 0.0,
               dy: float = 0.0) -> QGraphicsRectItem:
        """Put a tag at scene (x, y), shifted by (dx, dy) times its own size."""
        r = item.rect()
        item.setPos(x, y)
        item.setTransform(QTransform.fromTranslate(dx * r.width() - r.left(),
                                                         dy * r.height() - r.top()))
        return item

    def _tag(self, key: object, text: str, color: QColor | None = None, size: float = 9.0,
             z: float = 3000) -> Tag:
        """The tag kept under ``key``, showing ``text``."""
        return self._slots.get(("tag", key), Tag).show(text, color, size, z=z)

    def _line(self, key: object, x0: float, y0: float, x1: float, y1: float, pen: QPen,
              z: float) -> None:
        line = self._slots.get(("line", key), QGraphicsLineItem)
        line.setLine(x0, y0, x1, y1)
        line.setPen(pen)
        line.setZValue(z)

    def _draw_names(self, shown: list[int]) -> None:
        """Each drawn ply's name at its centre; its dimensions below it (shown on hover
        or selection).
        """
        u = self.system
        s = self._scale()
        plies = self.document.project.plies
        for i in shown:
            ply = plies[i]
            c = self._rect(ply).center()
            name = self._tag(("name", i), ply.name, size=8.5, z=3100)
            r = name.rect()
            w_px, h_px = ply.width * 1000 * s, ply.height * 1000 * s
            if r.width() > w_px - 4 and h_px > w_px:  # a tall narrow ply: read upwards
                t = QTransform()
                t.rotate(-90)
                t.translate(-r.width() / 2 - r.left(), -r.height() / 2 - r.top())
                name.setPos(c.x(), c.y())
                name.setTransform(t)
            else:
                self._place(name, c.x(), c.y(), -0.5, -1.0 if i in (self.selected,
                                                                    self.hovered) else -0.5)
            dims = self._tag(("dims", i), f"{fmt(ply.width, 'length', u)} \u00d7 "
                             f"{fmt(ply.height, 'length', u)}", QColor(0, 70, 160), size=8,
                             z=3200)
            self._place(dims, c.x(), c.y(), -0.5, 0.0)
            dims.setVisible(i in (self.selected, self.hovered))
            self._dimensions[i] = dims

    def _set_hovered(self, index: int | None) -> None:
        if index == self.hovered:
            return
        self.hovered = index
        for i, item in self._dimensions.items():
            item.setVisible(i in (self.selected, self.hovered))

    def _draw_annotations(self, plies, section: Section | None) -> None:  # type: ignore[no-untyped-def]
        if not plies:
            return
        x0 = min(p.x for p in plies) * 1000
        x1 = max(p.x + p.width for p in plies) * 1000
        y0 = min(p.y for p in plies) * 1000
        y1 = max(p.y + p.height for p in plies) * 1000
        if not all(math.isfinite(v) for v in (x0, x1, y0, y1)):
            return
        pen = QPen(QColor(60, 60, 60), 0)
        pen.setCosmetic(True)
        gap = 14 / self._scale()  # 14 px beyond the plies, whatever the zoom
        self._line("width", x0, -y0 + gap, x1, -y0 + gap, pen, 2000)
        self._line("depth", x1 + gap, -y0, x1 + gap, -y1, pen, 2000)
        u = self.system
        self._place(self._tag("width", f"width {fmt((x1 - x0) / 1000, 'length', u)}"),
                    (x0 + x1) / 2, -y0 + gap, -0.5, 0.1)
        self._place(self._tag("depth", f"depth {fmt((y1 - y0) / 1000, 'length', u)}"),
                    x1 + gap, -(y0 + y1) / 2, 0.05, -0.5)
        if section is not None and math.isfinite(section.neutral_axis_y):
            yna = section.neutral_axis_y * 1000
            na_pen = QPen(QColor(200, 30, 30), 0, Qt.PenStyle.DashDotLine)
            na_pen.setCosmetic(True)
            na_pen.setWidthF(1.5)
            self._line("na", x0 - gap, -yna, x1 + gap * 0.6, -yna, na_pen, 2500)
            red = QColor(170, 20, 20)
            self._place(self._tag("NA", "NA", red), x0 - gap, -yna, -1.05, -0.5)
            self._place(self._tag("na", f"neutral axis y = {fmt(yna / 1000, 'length', u)} "
                                  "(red dash-dot line)", red), (x0 + x1) / 2, -y0 + gap,
                        -0.5, 1.1)

    def _handle_positions(self, ply) -> dict[str, QPointF]:  # type: ignore[no-untyped-def]
        r = self._rect(ply)
        cx, cy = r.center().x(), r.center().y()
        return {"lt": r.topLeft(), "t": QPointF(cx, r.top()), "rt": r.topRight(),
                "r": QPointF(r.right(), cy), "rb": r.bottomRight(),
                "b": QPointF(cx, r.bottom()), "lb": r.bottomLeft(), "l": QPointF(r.left(), cy)}

    def _draw_handles(self, ply) -> None:  # type: ignore[no-untyped-def]
        for edges, pos in self._handle_positions(ply).items():
            h = self._slots.get(("handle", edges), QGraphicsRectItem)
            h.setRect(-HANDLE_PX / 2, -HANDLE_PX / 2, HANDLE_PX, HANDLE_PX)
            h.setFlag(QGraphicsItem.GraphicsItemFlag.ItemIgnoresTransformations)
            h.setPos(pos)
            h.setBrush(QBrush(QColor(255, 255, 255)))
            h.setPen(QPen(QColor(0, 90, 200), 1.5))
            h.setZValue(4000)
            h.setData(1, edges)

    def _scale(self) -> float:
        s = self.transform().m11()
        return s if math.isfinite(s) and s > 0 else 1.0

    def drawBackground(self, painter: QPainter, rect: QRectF) -> None:  # noqa: D102
        steps = ([25.4 / 16, 25.4 / 8, 25.4 / 4, 25.4 / 2, 25.4, 50.8, 152.4, 304.8]
                 if self.system == "US" else [1, 2, 5, 10, 20, 50, 100, 200])
        painter.save()
        try:
            painter.setRenderHint(QPainter.RenderHint.Antialiasing)  # the cache's painter
            draw_grid(painter, rect, self._scale(), steps)
        except Exception as exc:
            reporter().report("Drawing the grid", exc)
        finally:
            painter.restore()

    def drawForeground(self, painter: QPainter, rect: QRectF) -> None:
        """A scale bar in the upper left corner of the view."""
        painter.save()
        try:
            self._draw_scale_bar(painter)
        except Exception as exc:
            reporter().report("Drawing the scale bar", exc)
        finally:
            painter.restore()

    def _draw_scale_bar(self, painter: QPainter) -> None:
        px_per_mm = self._scale()
        options = ([25.4 / 4, 25.4 / 2, 25.4, 50.8, 101.6, 152.4, 304.8]
                   if self.system == "US" else [5, 10, 20, 50, 100, 200, 500])
        length = next((s for s in options if s * px_per_mm >= 60), options[-1])
        w = length * px_per_mm
        if not math.isfinite(w) or w > self.viewport().width():
            return
        painter.resetTransform()
        x0, y0 = 16, 18
        painter.setPen(QPen(QColor(30, 30, 30), 2))
        painter.drawLine(QPointF(x0, y0), QPointF(x0 + w, y0))
        painter.drawLine(QPointF(x0, y0 - 5), QPointF(x0, y0 + 3))
        painter.drawLine(QPointF(x0 + w, y0 - 5), QPointF(x0 + w, y0 + 3))
        painter.drawText(QPointF(x0 + w + 6, y0 + 4), fmt(length / 1000, "length", self.system, 3))

    def ply_bounds(self) -> QRectF | None:
        """The plies' bounding rectangle in scene units (None without finite plies)."""
        plies = self.document.project.plies
        if not plies:
            return None
        x0 = min(p.x for p in plies) * 1000
        x1 = max(p.x + p.width for p in plies) * 1000
        y0 = min(p.y for p in plies) * 1000
        y1 = max(p.y + p.height for p in plies) * 1000
        if not all(math.isfinite(v) for v in (x0, x1, y0, y1)) or x1 <= x0 or y1 <= y0:
            return None
        return QRectF(x0, -y1, x1 - x0, y1 - y0)

    def fit(self) -> None:
        """Fit the section in the view, labels included (and follow the window's size)."""
        self._user_zoomed = False
        rect = self.ply_bounds()
        vw, vh = self.viewport().width(), self.viewport().height()
        if rect is None or vw <= 0 or vh <= 0:
            return
        left, top, right, bottom = FIT_MARGINS
        aw, ah = max(vw - left - right, 40), max(vh - top - bottom, 40)
        s = min(aw / rect.width(), ah / rect.height())
        s = min(max(s, MIN_SCALE), MAX_SCALE)
        self.resetTransform()
        self.scale(s, s)
        # centre of the free area (between the margins) over the centre of the plies
        cx = rect.center().x() + (vw / 2 - (left + aw / 2)) / s
        cy = rect.center().y() + (vh / 2 - (top + ah / 2)) / s
        self.centerOn(QPointF(cx, cy))
        self._fitted = True
        self.rebuild()

    # --- mouse and keys -----------------------------------------------------------------

    def _model(self, pos: QPointF) -> tuple[float, float]:
        p = self.mapToScene(pos.toPoint())
        return p.x() / 1000, -p.y() / 1000

    def model_point(self, event: QMouseEvent, snap: bool = True) -> tuple[float, float]:
        """Model coordinates (m) of a mouse event, snapped unless Shift is held."""
        x, y = self._model(event.position())
        if snap and self._snapping(event):
            x, y = self.snap(x), self.snap(y)
        return x, y

    @staticmethod
    def _snapping(event: QMouseEvent) -> bool:
        return not event.modifiers() & Qt.KeyboardModifier.ShiftModifier

    def _hit(self, event: QMouseEvent) -> tuple[str, int | None, str | None]:
        at = event.position().toPoint()
        handles = [item for item in self.items(at) if item.data(1)]
        if handles and self.selected is not None:
            # on a narrow ply the handles overlap: the one whose centre is nearest wins
            def away(item: QGraphicsItem) -> float:
                c = self.mapFromScene(item.pos())
                return float((c.x() - at.x()) ** 2 + (c.y() - at.y()) ** 2)

            return "handle", self.selected, str(min(handles, key=away).data(1))
        for item in self.items(at):
            idx = item.data(0)
            if idx is not None and isinstance(item, QGraphicsPathItem):
                return "ply", int(idx), None
        return "empty", None, None

    @guarded("Mouse press")
    def mousePressEvent(self, event: QMouseEvent) -> None:  # noqa: D102
        if event.button() == Qt.MouseButton.MiddleButton:
            self._paint_changes_only(False)  # a pan scrolls the scale bar: paint it all
            self._pan = event.position()
            event.accept()
            return
        if event.button() != Qt.MouseButton.LeftButton:
            return super().mousePressEvent(event)
        what, idx, edges = self._hit(event)
        start = None
        if what == "handle" and idx is not None and edges:
            start = lambda x, y: ResizeGesture(self, x, y, idx, edges)  # noqa: E731
        elif what == "ply" and idx is not None:
            self.select(idx)
            start = lambda x, y: MoveGesture(self, x, y, idx)  # noqa: E731
        else:
            self.select(None)
            start = lambda x, y: DrawGesture(self, x, y)  # noqa: E731
        pos = event.position()
        self.press = Press((pos.x(), pos.y()), self._model(pos),
                           QApplication.startDragDistance(), start)
        self._paint_changes_only(True)
        self.document.set_dragging(True)
        event.accept()

    @guarded("Mouse move")
    def mouseMoveEvent(self, event: QMouseEvent) -> None:  # noqa: D102
        pos = event.position()
        if self._pan is not None:
            d = pos - self._pan
            self._pan = pos
            self.horizontalScrollBar().setValue(int(self.horizontalScrollBar().value() - d.x()))
            self.verticalScrollBar().setValue(int(self.verticalScrollBar().value() - d.y()))
            self._user_zoomed = True
            return
        if self.press is not None:
            self.press.move((pos.x(), pos.y()), self._model(pos), self._snapping(event))
            return
        x, y = self.model_point(event)
        what, idx, _ = self._hit(event)
        self._set_hovered(idx if what in ("ply", "handle") else None)
        u = self.system
        where = f"x = {fmt(x, 'length', u)}, y = {fmt(y, 'length', u)}"
        if what == "handle":
            self.status.emit(f"{where}. Drag the handle to resize the ply.")
        elif what == "ply" and idx is not None:
            name = self.document.project.plies[idx].name
            self.status.emit(f"{where}. Click to select \u201c{name}\u201d, drag to move it; "
                             "arrow keys nudge the selected ply.")
        else:
            self.status.emit(f"{where}. Drag to draw a new ply; Shift turns snapping off; "
                             "wheel zooms, middle button pans, F fits.")

    @guarded("Mouse release")
    def mouseReleaseEvent(self, event: QMouseEvent) -> None:  # noqa: D102
        if event.button() == Qt.MouseButton.MiddleButton:
            self._pan = None
            return
        if self.press is not None:
            press, self.press = self.press, None
            pos = event.position()
            try:
                press.release((pos.x(), pos.y()), self._model(pos), self._snapping(event))
                self.rebuild()
            finally:
                self._paint_changes_only(False)
                self.document.set_dragging(False)
            event.accept()
            return
        super().mouseReleaseEvent(event)

    def _paint_changes_only(self, on: bool) -> None:
        """During a gesture (on) the view repaints only the regions of the items that
        changed (the items' own rectangles, widened for antialiasing by the view); else,
        and once when the gesture ends, it repaints the whole viewport, which a pan, a
        zoom or the scale bar in the corner need.
        """
        mode = (QGraphicsView.ViewportUpdateMode.MinimalViewportUpdate if on
                else QGraphicsView.ViewportUpdateMode.FullViewportUpdate)
        if self.viewportUpdateMode() != mode:
            self.setViewportUpdateMode(mode)
            if not on:
                self.viewport().update()

    def leaveEvent(self, event) -> None:  # type: ignore[no-untyped-def]  # noqa: D102
        self._set_hovered(None)
        super().leaveEvent(event)

    def wheelEvent(self, event: QWheelEvent) -> None:  # noqa: D102
        factor = 1.15 if event.angleDelta().y() > 0 else 1 / 1.15
        s = self._scale()
        factor = min(max(s * factor, MIN_SCALE), MAX_SCALE) / s
        self.scale(factor, factor)
        self._user_zoomed = True
        self.rebuild()

    def resizeEvent(self, event) -> None:  # type: ignore[no-untyped-def]  # noqa: D102
        super().resizeEvent(event)
        if not self._user_zoomed and self.press is None:
            self.fit()

    @guarded("Key press")
    def keyPressEvent(self, event: QKeyEvent) -> None:  # noqa: D102
        key = event.key()
        if key == Qt.Key.Key_F and not event.modifiers():
            self.fit()
            return
        if key == Qt.Key.Key_Escape and self.analysis.station is not None:
            self.analysis.set_station(None)  # back to the full section
            return
        moves = {Qt.Key.Key_Left: (-1, 0), Qt.Key.Key_Right: (1, 0), Qt.Key.Key_Up: (0, 1),
                 Qt.Key.Key_Down: (0, -1)}
        if key in moves and self.selected is not None:
            self.nudge(*moves[key], held=event.isAutoRepeat())
            return
        super().keyPressEvent(event)

    def nudge(self, dx: int, dy: int, held: bool = False) -> None:
        """Move the selected ply by one snap step; a held key merges into one undo step."""
        if self.selected is None or self.selected >= len(self.document.project.plies):
            return
        if not held or self._nudge_key is None:
            self._nudge_key = new_gesture_key("nudge")
        plies = list(self.document.project.plies)
        p = plies[self.selected]
        step = self.snap_step
        plies[self.selected] = replace(p, x=self.snap(p.x + dx * step),
                                       y=self.snap(p.y + dy * step))
        self.document.apply(self.document.project.with_plies(tuple(plies)), "Nudge ply",
                            self._nudge_key)
