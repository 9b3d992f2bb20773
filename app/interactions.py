"""Mouse gestures on the section canvas, one small object each: draw, move, resize.

Each gesture turns scene positions (mm, y up) into model edits through the document,
with one merge key per gesture so that the gesture is one undo step.
"""

from __future__ import annotations

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
    """Base class: press, move, release in model coordinates (m, y up)."""

    def __init__(self, canvas: GestureHost, x: float, y: float):
        self.canvas = canvas
        self.start = (x, y)
        self.key = new_gesture_key(type(self).__name__)

    def move(self, x: float, y: float) -> None:  # noqa: D102
        raise NotImplementedError

    def release(self, x: float, y: float) -> None:  # noqa: D102
        self.move(x, y)


class DrawGesture(Gesture):
    """Drag on empty space: a new rectangular ply between press and release."""

    def __init__(self, canvas: GestureHost, x: float, y: float):
        super().__init__(canvas, x, y)
        self.index: int | None = None

    def move(self, x: float, y: float) -> None:  # noqa: D102
        x0, y0 = self.start
        w, h = abs(x - x0), abs(y - y0)
        if w <= 0 or h <= 0:
            return
        doc = self.canvas.document
        plies = list(doc.project.plies)
        material = self.canvas.default_material()
        ply = Ply(self.canvas.next_name(), material, min(x, x0), min(y, y0), w, h)
        if self.index is None:
            self.index = len(plies)
            plies.append(ply)
        else:
            plies[self.index] = replace(plies[self.index], x=ply.x, y=ply.y, width=w, height=h)
        doc.apply(doc.project.with_plies(tuple(plies)), "Draw ply", self.key)
        self.canvas.select(self.index)


class MoveGesture(Gesture):
    """Drag a ply: move it by the snapped offset from the press point."""

    def __init__(self, canvas: GestureHost, x: float, y: float, index: int):
        super().__init__(canvas, x, y)
        self.index = index
        self.original = canvas.document.project.plies[index]

    def move(self, x: float, y: float) -> None:  # noqa: D102
        dx, dy = x - self.start[0], y - self.start[1]
        doc = self.canvas.document
        plies = list(doc.project.plies)
        if self.index >= len(plies):
            return
        plies[self.index] = replace(self.original, x=self.original.x + dx,
                                    y=self.original.y + dy)
        doc.apply(doc.project.with_plies(tuple(plies)), "Move ply", self.key)


class ResizeGesture(Gesture):
    """Drag a handle: move the edges the handle stands for (l, r, b, t)."""

    def __init__(self, canvas: GestureHost, x: float, y: float, index: int, edges: str):
        super().__init__(canvas, x, y)
        self.index, self.edges = index, edges
        self.original = canvas.document.project.plies[index]

    def move(self, x: float, y: float) -> None:  # noqa: D102
        p = self.original
        left, right, bottom, top = p.x, p.x + p.width, p.y, p.y + p.height
        if "l" in self.edges:
            left = x
        if "r" in self.edges:
            right = x
        if "b" in self.edges:
            bottom = y
        if "t" in self.edges:
            top = y
        step = self.canvas.snap_step
        if right - left < step or top - bottom < step:
            return
        doc = self.canvas.document
        plies = list(doc.project.plies)
        if self.index >= len(plies):
            return
        plies[self.index] = replace(p, x=left, y=bottom, width=right - left, height=top - bottom)
        doc.apply(doc.project.with_plies(tuple(plies)), "Resize ply", self.key)
