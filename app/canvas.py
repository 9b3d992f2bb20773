"""The section canvas: plies drawn to scale on a snapping grid, edited with the mouse.

Scene units are millimetres with y pointing up in the model and down in Qt, so a model
point (x, y) in metres sits at scene (1000 x, -1000 y).
"""

from __future__ import annotations

import math
from dataclasses import replace

from PySide6.QtCore import QPointF, QRectF, Qt, Signal
from PySide6.QtGui import (
    QBrush,
    QColor,
    QFont,
    QKeyEvent,
    QMouseEvent,
    QPainter,
    QPainterPath,
    QPen,
    QWheelEvent,
)
from PySide6.QtWidgets import (
    QGraphicsItem,
    QGraphicsPathItem,
    QGraphicsRectItem,
    QGraphicsScene,
    QGraphicsSimpleTextItem,
    QGraphicsView,
)
from shapely.geometry import MultiPolygon, Polygon
from shapely.geometry.base import BaseGeometry

from plystack.app.analysis_model import AnalysisModel
from plystack.app.document import Document
from plystack.app.interactions import DrawGesture, Gesture, MoveGesture, ResizeGesture
from plystack.core.model.constants import INCH as IN
from plystack.core.model.units import fmt
from plystack.core.section.transformed import Section

HANDLE_PX = 8

#: Fills by material kind that read in greyscale print: timber light with diagonal grain
#: lines, steel dark and solid, other materials mid grey with cross-hatching.
FILLS = {
    "timber": (QColor(236, 214, 170), Qt.BrushStyle.BDiagPattern, QColor(150, 110, 60)),
    "steel": (QColor(70, 78, 90), Qt.BrushStyle.SolidPattern, QColor(70, 78, 90)),
    "other": (QColor(190, 190, 200), Qt.BrushStyle.DiagCrossPattern, QColor(110, 110, 120)),
}


def geometry_path(geom: BaseGeometry) -> QPainterPath:
    """A painter path of a (multi)polygon with holes, in scene units."""
    path = QPainterPath()
    path.setFillRule(Qt.FillRule.OddEvenFill)
    polys = geom.geoms if isinstance(geom, MultiPolygon) else [geom]
    for poly in polys:
        if not isinstance(poly, Polygon) or poly.is_empty:
            continue
        for ring in [poly.exterior, *poly.interiors]:
            pts = [QPointF(x * 1000, -y * 1000) for x, y in ring.coords]
            path.moveTo(pts[0])
            for p in pts[1:]:
                path.lineTo(p)
            path.closeSubpath()
    return path


class SectionCanvas(QGraphicsView):
    """Draw, select, move and resize plies; grid, scale, neutral axis and dimensions."""

    selection_changed = Signal(int)
    status = Signal(str)

    def __init__(self, document: Document, analysis: AnalysisModel):
        super().__init__()
        self.document = document
        self.analysis = analysis
        self.setScene(QGraphicsScene(self))
        self.setRenderHint(QPainter.RenderHint.Antialiasing)
        self.setMouseTracking(True)
        self.setFocusPolicy(Qt.FocusPolicy.StrongFocus)
        self.setTransformationAnchor(QGraphicsView.ViewportAnchor.AnchorUnderMouse)
        self.setViewportUpdateMode(QGraphicsView.ViewportUpdateMode.FullViewportUpdate)
        self.selected: int | None = None
        self.show_transformed = False
        self.snap_override: float | None = None
        self.gesture: Gesture | None = None
        self._fitted = False
        analysis.section_changed.connect(self.rebuild)
        self.rebuild()

    @property
    def section(self) -> Section | None:
        """The section the analysis model published for the current plies."""
        return self.analysis.section

    def request_fit(self) -> None:
        """Fit the section in the view at the next redraw (a new project was loaded)."""
        self._fitted = False

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
        if self.snap_override:
            return round(value / self.snap_override) * self.snap_override
        if self.system == "US":
            per_in = round(IN / self.snap_step)
            return round(value / IN * per_in) / per_in * IN
        per_mm = 0.001 / self.snap_step
        return round(value * 1000 / per_mm) * per_mm / 1000

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

    def rebuild(self) -> None:
        """Redraw every item from the model."""
        scene = self.scene()
        scene.clear()
        project = self.document.project
        if self.selected is not None and self.selected >= len(project.plies):
            self.selected = None
            self.selection_changed.emit(-1)
        if not project.plies:
            scene.setSceneRect(QRectF(-200, -200, 400, 400))
            return
        mats = project.all_materials()
        section = self.section
        if section is not None and section.plies != project.plies:
            section = None  # published for other plies (cannot happen once signals settle)
        geoms = section.geoms if section else [p.rectangle() for p in project.plies]
        for i, (ply, geom) in enumerate(zip(project.plies, geoms, strict=True)):
            kind = mats[ply.material].kind if ply.material in mats else "other"
            color, style, line = FILLS.get(kind, FILLS["other"])
            item = QGraphicsPathItem(geometry_path(geom))
            brush = QBrush(line if style != Qt.BrushStyle.SolidPattern else color, style)
            back = QGraphicsPathItem(geometry_path(geom))
            back.setBrush(QBrush(color if style != Qt.BrushStyle.SolidPattern else color))
            back.setPen(QPen(Qt.PenStyle.NoPen))
            back.setZValue(2 * i)
            scene.addItem(back)
            item.setBrush(brush)
            pen = QPen(QColor(20, 20, 20), 0)
            pen.setCosmetic(True)
            pen.setWidthF(2.5 if i == self.selected else 1.0)
            if i == self.selected:
                pen.setColor(QColor(0, 90, 200))
            item.setPen(pen)
            item.setZValue(2 * i + 1)
            item.setData(0, i)
            item.setToolTip(f"{ply.name} ({ply.material})")
            scene.addItem(item)
            # dashed outline of the uncut rectangle where the ply is clipped
            clipped = section is not None and not section.is_unclipped(i)
            if clipped:
                ghost = QGraphicsRectItem(self._rect(ply))
                gp = QPen(QColor(120, 120, 120), 0, Qt.PenStyle.DotLine)
                gp.setCosmetic(True)
                ghost.setPen(gp)
                ghost.setZValue(1000)
                scene.addItem(ghost)
        if section is not None and self.show_transformed:
            for i in range(len(project.plies)):
                t = QGraphicsPathItem(geometry_path(section.transformed_geometry(i)))
                tp = QPen(QColor(200, 40, 40), 0, Qt.PenStyle.DashLine)
                tp.setCosmetic(True)
                t.setPen(tp)
                t.setZValue(1500)
                scene.addItem(t)
        self._draw_annotations()
        if self.selected is not None:
            self._draw_handles(project.plies[self.selected])
        bounds = scene.itemsBoundingRect().adjusted(-40, -40, 40, 40)
        scene.setSceneRect(bounds.united(QRectF(-50, -50, 100, 100)))
        if not self._fitted:
            self.fit()

    def _rect(self, ply) -> QRectF:  # type: ignore[no-untyped-def]
        return QRectF(ply.x * 1000, -(ply.y + ply.height) * 1000, ply.width * 1000,
                      ply.height * 1000)

    def _label(self, text: str, x: float, y: float, color: QColor | None = None,
               centre_y: bool = False, line: int = 0) -> None:
        item = QGraphicsSimpleTextItem(text)
        item.setFlag(QGraphicsItem.GraphicsItemFlag.ItemIgnoresTransformations)
        item.setBrush(QBrush(color or QColor(30, 30, 30)))
        f = QFont()
        f.setPointSizeF(9)
        item.setFont(f)
        item.setPos(x, y)
        h = item.boundingRect().height()
        if centre_y or line:
            from PySide6.QtGui import QTransform

            item.setTransform(QTransform.fromTranslate(0, -h / 2 if centre_y else h * line))
        item.setZValue(3000)
        self.scene().addItem(item)

    def _draw_annotations(self) -> None:
        plies = self.document.project.plies
        x0 = min(p.x for p in plies) * 1000
        x1 = max(p.x + p.width for p in plies) * 1000
        y0 = min(p.y for p in plies) * 1000
        y1 = max(p.y + p.height for p in plies) * 1000
        pen = QPen(QColor(60, 60, 60), 0)
        pen.setCosmetic(True)
        gap = max(x1 - x0, y1 - y0) * 0.08 + 5
        # overall width below, overall depth to the right
        self.scene().addLine(x0, -y0 + gap, x1, -y0 + gap, pen).setZValue(2000)
        self.scene().addLine(x1 + gap, -y0, x1 + gap, -y1, pen).setZValue(2000)
        u = self.system
        self._label(f"width {fmt((x1 - x0) / 1000, 'length', u)}", x0, -y0 + gap + 2)
        self._label(f"depth {fmt((y1 - y0) / 1000, 'length', u)}", x1 + gap + 3, -(y0 + y1) / 2)
        if self.section is not None:
            yna = self.section.neutral_axis_y * 1000
            na_pen = QPen(QColor(200, 30, 30), 0, Qt.PenStyle.DashDotLine)
            na_pen.setCosmetic(True)
            na_pen.setWidthF(1.5)
            self.scene().addLine(x0 - gap * 0.6, -yna, x1 + gap * 0.6, -yna,
                                 na_pen).setZValue(2500)
            self._label("NA", x1 + gap * 0.6, -yna, QColor(170, 20, 20), centre_y=True)
            self._label(f"neutral axis y = {fmt(yna / 1000, 'length', u)} (red dash-dot line)",
                        x0, -y0 + gap + 2, QColor(170, 20, 20), line=1)

    def _handle_positions(self, ply) -> dict[str, QPointF]:  # type: ignore[no-untyped-def]
        r = self._rect(ply)
        cx, cy = r.center().x(), r.center().y()
        return {"lt": r.topLeft(), "t": QPointF(cx, r.top()), "rt": r.topRight(),
                "r": QPointF(r.right(), cy), "rb": r.bottomRight(),
                "b": QPointF(cx, r.bottom()), "lb": r.bottomLeft(), "l": QPointF(r.left(), cy)}

    def _draw_handles(self, ply) -> None:  # type: ignore[no-untyped-def]
        for edges, pos in self._handle_positions(ply).items():
            h = QGraphicsRectItem(-HANDLE_PX / 2, -HANDLE_PX / 2, HANDLE_PX, HANDLE_PX)
            h.setFlag(QGraphicsItem.GraphicsItemFlag.ItemIgnoresTransformations)
            h.setPos(pos)
            h.setBrush(QBrush(QColor(255, 255, 255)))
            h.setPen(QPen(QColor(0, 90, 200), 1.5))
            h.setZValue(4000)
            h.setData(1, edges)
            self.scene().addItem(h)

    def drawBackground(self, painter: QPainter, rect: QRectF) -> None:  # noqa: D102
        painter.fillRect(rect, QColor(252, 252, 250))
        px_per_mm = self.transform().m11() or 1.0
        steps = ([25.4 / 16, 25.4 / 8, 25.4 / 4, 25.4 / 2, 25.4, 50.8, 152.4, 304.8]
                 if self.system == "US" else [1, 2, 5, 10, 20, 50, 100, 200])
        minor = next((s for s in steps if s * px_per_mm >= 10), steps[-1])
        major = next((s for s in steps if s >= minor * 4.9), steps[-1])
        for step, color in ((minor, QColor(234, 234, 234)), (major, QColor(205, 205, 205))):
            pen = QPen(color, 0)
            pen.setCosmetic(True)
            painter.setPen(pen)
            x = math.floor(rect.left() / step) * step
            while x <= rect.right():
                painter.drawLine(QPointF(x, rect.top()), QPointF(x, rect.bottom()))
                x += step
            y = math.floor(rect.top() / step) * step
            while y <= rect.bottom():
                painter.drawLine(QPointF(rect.left(), y), QPointF(rect.right(), y))
                y += step

    def drawForeground(self, painter: QPainter, rect: QRectF) -> None:
        """A scale bar in the lower left corner of the view."""
        px_per_mm = self.transform().m11() or 1.0
        options = ([25.4 / 4, 25.4 / 2, 25.4, 50.8, 101.6, 152.4, 304.8]
                   if self.system == "US" else [5, 10, 20, 50, 100, 200, 500])
        length = next((s for s in options if s * px_per_mm >= 60), options[-1])
        painter.save()
        painter.resetTransform()
        h = self.viewport().height()
        x0, y0 = 16, h - 18
        w = length * px_per_mm
        painter.setPen(QPen(QColor(30, 30, 30), 2))
        painter.drawLine(QPointF(x0, y0), QPointF(x0 + w, y0))
        painter.drawLine(QPointF(x0, y0 - 5), QPointF(x0, y0 + 3))
        painter.drawLine(QPointF(x0 + w, y0 - 5), QPointF(x0 + w, y0 + 3))
        painter.drawText(QPointF(x0 + w + 6, y0 + 4), fmt(length / 1000, "length", self.system, 3))
        painter.restore()

    def fit(self) -> None:
        """Fit the section in the view (and follow the window's size again)."""
        self._user_zoomed = False
        rect = self.scene().itemsBoundingRect().adjusted(-20, -20, 20, 20)
        if rect.width() > 0 and rect.height() > 0:
            self.fitInView(rect, Qt.AspectRatioMode.KeepAspectRatio)
            self._fitted = True

    # --- mouse and keys -----------------------------------------------------------------

    def model_point(self, event: QMouseEvent, snap: bool = True) -> tuple[float, float]:
        """Model coordinates (m) of a mouse event, snapped unless Shift is held."""
        p = self.mapToScene(event.position().toPoint())
        x, y = p.x() / 1000, -p.y() / 1000
        if snap and not event.modifiers() & Qt.KeyboardModifier.ShiftModifier:
            x, y = self.snap(x), self.snap(y)
        return x, y

    def _hit(self, event: QMouseEvent) -> tuple[str, int | None, str | None]:
        for item in self.items(event.position().toPoint()):
            edges = item.data(1)
            if edges and self.selected is not None:
                return "handle", self.selected, str(edges)
        for item in self.items(event.position().toPoint()):
            idx = item.data(0)
            if idx is not None and isinstance(item, QGraphicsPathItem):
                return "ply", int(idx), None
        return "empty", None, None

    def mousePressEvent(self, event: QMouseEvent) -> None:  # noqa: D102
        if event.button() != Qt.MouseButton.LeftButton:
            return super().mousePressEvent(event)
        what, idx, edges = self._hit(event)
        x, y = self.model_point(event)
        if what == "handle" and idx is not None and edges:
            self.gesture = ResizeGesture(self, x, y, idx, edges)
        elif what == "ply" and idx is not None:
            self.select(idx)
            self.gesture = MoveGesture(self, x, y, idx)
        else:
            self.select(None)
            self.gesture = DrawGesture(self, x, y)
        event.accept()

    def mouseMoveEvent(self, event: QMouseEvent) -> None:  # noqa: D102
        x, y = self.model_point(event)
        if self.gesture is not None:
            self.gesture.move(x, y)
            return
        what, idx, _ = self._hit(event)
        u = self.system
        pos = f"x = {fmt(x, 'length', u)}, y = {fmt(y, 'length', u)}"
        if what == "handle":
            self.status.emit(f"{pos}. Drag the handle to resize the ply.")
        elif what == "ply" and idx is not None:
            name = self.document.project.plies[idx].name
            self.status.emit(f"{pos}. Click to select \u201c{name}\u201d, drag to move it.")
        else:
            self.status.emit(f"{pos}. Drag to draw a new ply; Shift turns snapping off; "
                             "wheel zooms, F fits.")

    def mouseReleaseEvent(self, event: QMouseEvent) -> None:  # noqa: D102
        if self.gesture is not None:
            x, y = self.model_point(event)
            self.gesture.release(x, y)
            self.gesture = None
            event.accept()
            return
        super().mouseReleaseEvent(event)

    def wheelEvent(self, event: QWheelEvent) -> None:  # noqa: D102
        factor = 1.15 if event.angleDelta().y() > 0 else 1 / 1.15
        self.scale(factor, factor)
        self._user_zoomed = True

    def resizeEvent(self, event) -> None:  # type: ignore[no-untyped-def]  # noqa: D102
        super().resizeEvent(event)
        if not getattr(self, "_user_zoomed", False):
            self.fit()

    def keyPressEvent(self, event: QKeyEvent) -> None:  # noqa: D102
        key = event.key()
        if key == Qt.Key.Key_F:
            self.fit()
            return
        moves = {Qt.Key.Key_Left: (-1, 0), Qt.Key.Key_Right: (1, 0), Qt.Key.Key_Up: (0, 1),
                 Qt.Key.Key_Down: (0, -1)}
        if key in moves and self.selected is not None:
            dx, dy = moves[key]
            plies = list(self.document.project.plies)
            p = plies[self.selected]
            step = self.snap_step
            plies[self.selected] = replace(p, x=self.snap(p.x + dx * step),
                                           y=self.snap(p.y + dy * step))
            self.document.apply(self.document.project.with_plies(tuple(plies)), "Nudge ply")
            return
        super().keyPressEvent(event)
