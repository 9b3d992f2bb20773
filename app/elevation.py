"""The elevation of the member: supports, loads by case, the member with its notches, holes
and bolts, and one bar per ply showing where it runs along the member.

Laid out in view pixels (``Frame``): x along the member fills the width, the member's
depth is drawn at its own vertical scale, and the loads, the supports, the bolt
dimensions and the ply bars each take a band. The view is model-driven: items are kept
between updates and moved in place (``Pool``), the scene is never rebuilt during a drag.

Mouse: a press on a ply bar's end becomes a drag past ``QApplication.startDragDistance()``
(``interactions.Press``); the end moves by the pointer's travel, snapped like the section
canvas (1/16 in or 1 mm; Shift turns snapping off), one undo step per drag, and an end
brought within one snap step of the member's end runs to that end ("from"/"to" left
out). A click without a drag chooses the station whose section is shown; a click at the
same place, or Escape, goes back to the full section.
"""

from __future__ import annotations

from PySide6.QtCore import QPointF, QRectF, Qt, Signal
from PySide6.QtGui import QBrush, QColor, QKeyEvent, QMouseEvent, QPainter
from PySide6.QtWidgets import QApplication, QGraphicsLineItem, QGraphicsScene, QGraphicsView

from plystack.app.analysis_model import AnalysisModel
from plystack.app.document import Document
from plystack.app.elevation_draw import ElevationDrawing
from plystack.app.elevation_frame import Frame
from plystack.app.elevation_items import STATION, pen
from plystack.app.elevation_model import dragged_extent, plate_bolts
from plystack.app.interactions import Gesture, GestureHost, Press
from plystack.app.safe import guarded
from plystack.core.model.units import display_string

__all__ = ["ElevationView", "ExtentGesture", "Frame", "segment_caption"]

#: Pixels either side of a bar's end where a press takes hold of that end.
END_GRIP_PX = 6


def segment_caption(analysis: AnalysisModel) -> str:
    """The line that says which section the canvas and the stress plot show."""
    project = analysis.document.project
    u = project.display_units
    if analysis.station is None:
        return "Section shown: every ply (the full section). Click the elevation to pick a station."
    at = _shown(analysis.station, "span", u)
    seg = analysis.shown_segment()
    if seg is None:
        return (f"Section shown at x = {at}: every ply (every ply runs the whole member). "
                "Esc or a click at the same place: the full section.")
    names = ", ".join(project.plies[i].name for i in seg.plies)
    return (f"Section shown at x = {at}: the segment from {_shown(seg.start, 'span', u)} to "
            f"{_shown(seg.end, 'span', u)} ({names}). Esc or a click at the same place: the "
            "full section.")


class ExtentGesture(Gesture):
    """Drag one end of a ply's bar: its "from" or "to" moves by the pointer's travel."""

    text = "Change where a ply runs"

    def __init__(self, host: GestureHost, x: float, y: float, index: int, which: str,
                 length: float):
        super().__init__(host, x, y)
        self.index, self.which, self.length = index, which, length
        self.original = host.document.project.plies[index]

    def move(self, x: float, y: float, snapping: bool = True) -> None:  # noqa: D102
        a, b = self.original.extent(self.length)
        value = self._round((a if self.which == "start" else b) + x - self.start[0],
                            snapping)
        ply = dragged_extent(self.original, self.length, self.which, value,
                             self.host.snap_step)
        self._replace_ply(self.index, ply)
        self.host.select(self.index)


class ElevationView(QGraphicsView):
    """The member seen from the side; ply ends dragged, stations picked."""

    ply_picked = Signal(int)
    status = Signal(str)

    def __init__(self, document: Document, analysis: AnalysisModel, snapper: GestureHost):
        super().__init__()
        self.document, self.analysis, self.snapper = document, analysis, snapper
        self.setScene(QGraphicsScene(self))
        # items move on every step of a drag: no spatial index to keep up to date
        self.scene().setItemIndexMethod(QGraphicsScene.ItemIndexMethod.NoIndex)
        self.setRenderHint(QPainter.RenderHint.Antialiasing)
        self.setMouseTracking(True)
        self.setFocusPolicy(Qt.FocusPolicy.StrongFocus)
        self.setHorizontalScrollBarPolicy(Qt.ScrollBarPolicy.ScrollBarAlwaysOff)
        self.setAlignment(Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignTop)
        self.setBackgroundBrush(QBrush(QColor(252, 252, 250)))
        self.setMinimumHeight(150)
        self.frame: Frame | None = None
        self.press: Press | None = None
        self.bolts = plate_bolts(None)
        self.drawing = ElevationDrawing(self.scene())
        self.marker = QGraphicsLineItem()
        self.marker.setPen(pen(STATION, 1.0, Qt.PenStyle.DashLine))
        self.marker.setZValue(80)
        self.scene().addItem(self.marker)
        document.changed.connect(self._document_changed)
        analysis.analysis_changed.connect(self._analysis_changed)
        analysis.station_changed.connect(self._draw_station)
        self._analysis_changed()

    # --- what a gesture needs (GestureHost) ----------------------------------------------

    @property
    def snap_step(self) -> float:
        """The section canvas's snap step, m."""
        return self.snapper.snap_step

    def snap(self, value: float) -> float:
        """A length rounded as the section canvas rounds it."""
        return self.snapper.snap(value)

    def default_material(self) -> str:
        """Not used: the elevation draws no plies."""
        return self.snapper.default_material()

    def next_name(self) -> str:
        """Not used: the elevation draws no plies."""
        return self.snapper.next_name()

    def select(self, index: int | None) -> None:
        """Select the ply whose end is dragged (in the canvas and the ply panel)."""
        if index is not None:
            self.ply_picked.emit(index)

    # --- drawing -------------------------------------------------------------------------

    def _analysis_changed(self) -> None:
        self.bolts = plate_bolts(self.analysis.analysis)
        self.refresh()

    def _document_changed(self) -> None:
        """An edit: redrawn now, except during a drag on another view (the section), where
        the analysis that every edit brings redraws it once, bolts included.
        """
        if self.document.dragging and self.press is None:
            return
        self.refresh()

    @guarded("Drawing the elevation")
    def refresh(self) -> None:
        """Move every item to the current project (items are reused, not rebuilt)."""
        vw, vh = self.viewport().width(), self.viewport().height()
        project = self.document.project
        frame = Frame.of(project, vw, vh)
        if self.press is not None and self.frame is not None and frame is not None and (
                frame.lanes == self.frame.lanes):
            frame = self.frame  # the layout holds still under a drag
        self.frame = frame
        self.scene().setSceneRect(QRectF(0, 0, vw, max(vh, frame.bottom if frame else vh)))
        bolts = self.bolts if self._bolts_current() else ()
        self.drawing.update(project, frame, bolts, self.snapper.snap_step)
        self._draw_station()

    def _bolts_current(self) -> bool:
        a = self.analysis.analysis
        return a is not None and a.project.plies == self.document.project.plies

    def _draw_station(self) -> None:
        f, x = self.frame, self.analysis.station
        label = self.drawing.station_label
        if f is None or x is None:
            self.marker.setVisible(False)
            label.setVisible(False)
            return
        px = f.x_px(x)
        self.marker.setLine(px, 2, px, f.bottom - 2)
        self.marker.setVisible(True)
        text = f"section at x = {_shown(x, 'span', self.document.project.display_units)}"
        w = label.size_of(text)[0]
        right = px + 4 + w <= f.view_width - 2
        label.place(text, px + 4 if right else px - 4, f.station_row, 0.0 if right else 1.0,
                    0.0, QColor(0, 80, 180))

    def resizeEvent(self, event) -> None:  # type: ignore[no-untyped-def]  # noqa: D102
        super().resizeEvent(event)
        self.refresh()

    # --- mouse and keys ------------------------------------------------------------------

    def _scene_pos(self, event: QMouseEvent) -> QPointF:
        return self.mapToScene(event.position().toPoint())

    def end_at(self, pos: QPointF) -> tuple[int, str] | None:
        """The ply end (index, "start" or "end") under a scene point, or None."""
        f = self.frame
        beam = self.document.project.beam
        if f is None or beam is None:
            return None
        for i, ply in enumerate(self.document.project.plies):
            top, bottom = f.lane(i)
            if not top - 2 <= pos.y() <= bottom + 2:
                continue
            a, b = (f.x_px(v) for v in ply.extent(f.length))
            da, db = abs(pos.x() - a), abs(pos.x() - b)
            if min(da, db) <= END_GRIP_PX:
                return i, ("start" if da < db else "end")
        return None

    @staticmethod
    def _snapping(event: QMouseEvent) -> bool:
        return not event.modifiers() & Qt.KeyboardModifier.ShiftModifier

    @guarded("Mouse press on the elevation")
    def mousePressEvent(self, event: QMouseEvent) -> None:  # noqa: D102
        if event.button() != Qt.MouseButton.LeftButton or self.frame is None:
            return super().mousePressEvent(event)
        pos = self._scene_pos(event)
        hit = self.end_at(pos)
        length = self.frame.length
        start = None
        if hit is not None:
            i, which = hit
            start = lambda x, y: ExtentGesture(self, x, y, i, which, length)  # noqa: E731
        view = event.position()
        self.press = Press((view.x(), view.y()), (self.frame.x_m(pos.x()), 0.0),
                           QApplication.startDragDistance(), start)
        self.document.set_dragging(True)
        event.accept()

    @guarded("Mouse move on the elevation")
    def mouseMoveEvent(self, event: QMouseEvent) -> None:  # noqa: D102
        pos = self._scene_pos(event)
        view = event.position()
        if self.press is not None and self.frame is not None:
            self.press.move((view.x(), view.y()), (self.frame.x_m(pos.x()), 0.0),
                            self._snapping(event))
            return
        self._hover(pos)

    def _hover(self, pos: QPointF) -> None:
        hit = self.end_at(pos)
        self.viewport().setCursor(Qt.CursorShape.SizeHorCursor if hit else
                                  Qt.CursorShape.ArrowCursor)
        f = self.frame
        if f is None:
            return
        u = self.document.project.display_units
        x = min(max(f.x_m(pos.x()), 0.0), f.length)
        where = f"x = {_shown(x, 'span', u)}"
        rule = next((str(it.data(0)) for it in self.drawing.rings.items
                     if it.isVisible() and it.contains(pos)), None)
        if rule is not None:  # a bolt a failing rule concerns: say which (as its tooltip)
            self.status.emit(f"{where}. {rule}")
        elif hit is not None:
            name = self.document.project.plies[hit[0]].name
            end = "start (from)" if hit[1] == "start" else "end (to)"
            self.status.emit(f"{where}. Drag to move the {end} of \u201c{name}\u201d; Shift "
                             "turns snapping off; back to the member's end: the whole member.")
        else:
            self.status.emit(f"{where}. Click to show the section here; click again or Esc: "
                             "the full section.")

    @guarded("Mouse release on the elevation")
    def mouseReleaseEvent(self, event: QMouseEvent) -> None:  # noqa: D102
        if self.press is None or self.frame is None:
            return super().mouseReleaseEvent(event)
        press, self.press = self.press, None
        pos = self._scene_pos(event)
        view = event.position()
        try:
            edited = press.release((view.x(), view.y()), (self.frame.x_m(pos.x()), 0.0),
                                   self._snapping(event))
            if not edited:
                self._click(press.view_pos[0], press.model_pos[0])
            self.refresh()
        finally:
            self.document.set_dragging(False)
        event.accept()

    def _click(self, view_x: float, x: float) -> None:
        """A click without a drag: choose the station there, or drop it when it is the
        station already shown (within the drag distance).
        """
        f = self.frame
        assert f is not None
        current = self.analysis.station
        near = max(QApplication.startDragDistance(), 4)
        if current is not None and abs(self.mapFromScene(QPointF(f.x_px(current), 0)).x()
                                       - view_x) <= near:
            self.analysis.set_station(None)
        else:
            self.analysis.set_station(min(max(x, 0.0), f.length))

    def keyPressEvent(self, event: QKeyEvent) -> None:  # noqa: D102
        if event.key() == Qt.Key.Key_Escape and self.analysis.station is not None:
            self.analysis.set_station(None)
            return
        super().keyPressEvent(event)


def _shown(value: float, kind: str, system: str) -> str:
    """A length as the elevation writes it: four significant figures, no trailing zeros."""
    return display_string(value, kind, system, 4)
