"""Mouse gestures on the section canvas, one small object each: draw, move, resize.

A press starts a :class:`Press`, which edits nothing: it becomes a gesture only once the
pointer has travelled the platform's drag distance (``QApplication.startDragDistance()``)
in view pixels, so a click, even with a hand's jitter, only selects. A gesture then turns
the pointer's travel since the press into model edits through the document, with one
merge key per gesture so that the whole gesture is one undo step. Positions are model
coordinates (m, y up); the edge or ply being dragged keeps its offset from the pointer
(it moves by the pointer's travel, snapped), so it stays under the hand.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import replace
from typing import Protocol

from plystack.app.document import Document, new_gesture_key
from plystack.core.model.plies import Ply


class GestureHost(Protocol):
    """What a gesture needs from the view it runs in (the section canvas)."""

    @property
    def document(self) -> Document:
        """The document the gesture edits."""
        ...

    @property
    def snap_step(self) -> float:
        """The snap step, m."""
        ...

    def snap(self, value: float) -> float:
        """A model length rounded to the snap step."""
        ...

    def default_material(self) -> str:
        """Material id for a newly drawn ply."""
        ...

    def next_name(self) -> str:
        """A fresh ply name."""
        ...

    def select(self, index: int | None) -> None:
        """Select a ply (None clears)."""
        ...


class Gesture:
    """Base class: started at a press point, then moved and released (m, y up).

    ``snapping`` says whether results are rounded to the host's snap step (Shift held
    turns it off, decided by the host per event).
    """

    text = "Edit ply"

    def __init__(self, host: GestureHost, x: float, y: float):
        self.host = host
        self.start = (x, y)
        self.key = new_gesture_key(type(self).__name__)

    def _round(self, value: float, snapping: bool) -> float:
        return self.host.snap(value) if snapping else value

    def move(self, x: float, y: float, snapping: bool = True) -> None:  # noqa: D102
        raise NotImplementedError

    def release(self, x: float, y: float, snapping: bool = True) -> None:  # noqa: D102
        self.move(x, y, snapping)

    def _replace_ply(self, index: int, ply: Ply) -> None:
        doc = self.host.document
        plies = list(doc.project.plies)
        if index >= len(plies):
            return
        plies[index] = ply
        doc.apply(doc.project.with_plies(tuple(plies)), self.text, self.key)


class DrawGesture(Gesture):
    """Drag on empty space: a new rectangular ply between press and pointer."""

    text = "Draw ply"

    def __init__(self, host: GestureHost, x: float, y: float):
        super().__init__(host, x, y)
        self.index: int | None = None

    def move(self, x: float, y: float, snapping: bool = True) -> None:  # noqa: D102
        x0, y0 = (self._round(v, snapping) for v in self.start)
        x, y = self._round(x, snapping), self._round(y, snapping)
        w, h = abs(x - x0), abs(y - y0)
        if w <= 0 or h <= 0:
            return
        doc = self.host.document
        if self.index is None:
            ply = Ply(self.host.next_name(), self.host.default_material(), min(x, x0),
                      min(y, y0), w, h)
            self.index = len(doc.project.plies)
            doc.apply(doc.project.with_plies((*doc.project.plies, ply)), self.text, self.key)
        else:
            old = doc.project.plies[self.index]
            self._replace_ply(self.index, replace(old, x=min(x, x0), y=min(y, y0), width=w,
                                                  height=h))
        self.host.select(self.index)


class MoveGesture(Gesture):
    """Drag a ply: it moves by the pointer's travel, snapped."""

    text = "Move ply"

    def __init__(self, host: GestureHost, x: float, y: float, index: int):
        super().__init__(host, x, y)
        self.index = index
        self.original = host.document.project.plies[index]

    def move(self, x: float, y: float, snapping: bool = True) -> None:  # noqa: D102
        p = self.original
        nx = self._round(p.x + x - self.start[0], snapping)
        ny = self._round(p.y + y - self.start[1], snapping)
        self._replace_ply(self.index, replace(p, x=nx, y=ny))


class ResizeGesture(Gesture):
    """Drag a handle: the edges it stands for (l, r, b, t) move by the pointer's travel."""

    text = "Resize ply"

    def __init__(self, host: GestureHost, x: float, y: float, index: int, edges: str):
        super().__init__(host, x, y)
        self.index, self.edges = index, edges
        self.original = host.document.project.plies[index]

    def move(self, x: float, y: float, snapping: bool = True) -> None:  # noqa: D102
        p = self.original
        dx, dy = x - self.start[0], y - self.start[1]
        left, right, bottom, top = p.x, p.x + p.width, p.y, p.y + p.height
        if "l" in self.edges:
            left = self._round(left + dx, snapping)
        if "r" in self.edges:
            right = self._round(right + dx, snapping)
        if "b" in self.edges:
            bottom = self._round(bottom + dy, snapping)
        if "t" in self.edges:
            top = self._round(top + dy, snapping)
        step = self.host.snap_step
        if right - left < step or top - bottom < step:
            return
        self._replace_ply(self.index, replace(p, x=left, y=bottom, width=right - left,
                                              height=top - bottom))


class Press:
    """A button held down that is not a gesture yet: it edits nothing.

    Args:
        view_pos: where the press happened, view pixels.
        model_pos: the same point in model coordinates (m, unsnapped).
        threshold: travel in view pixels (Manhattan length, as Qt measures it) at which
            the press becomes a gesture: ``QApplication.startDragDistance()``.
        start_gesture: builds the gesture from the press point when the threshold is
            reached (None: this press never becomes one).

    """

    def __init__(self, view_pos: tuple[float, float], model_pos: tuple[float, float],
                 threshold: int, start_gesture: Callable[[float, float], Gesture] | None):
        self.view_pos, self.model_pos = view_pos, model_pos
        self.threshold = max(1, threshold)
        self._start_gesture = start_gesture
        self.gesture: Gesture | None = None

    def past_threshold(self, view_pos: tuple[float, float]) -> bool:
        """True once the pointer has travelled the drag distance from the press."""
        travel = abs(view_pos[0] - self.view_pos[0]) + abs(view_pos[1] - self.view_pos[1])
        return travel >= self.threshold

    def move(self, view_pos: tuple[float, float], model_pos: tuple[float, float],
             snapping: bool) -> None:
        """The pointer moved with the button held: start or continue the gesture."""
        if self.gesture is None:
            if self._start_gesture is None or not self.past_threshold(view_pos):
                return
            self.gesture = self._start_gesture(*self.model_pos)
        self.gesture.move(*model_pos, snapping)

    def release(self, view_pos: tuple[float, float], model_pos: tuple[float, float],
                snapping: bool) -> bool:
        """The button came up; True when a gesture ran (an edit), False for a click."""
        if self.gesture is None:
            return False
        self.gesture.release(*model_pos, snapping)
        return True
