"""Scene items of the member's elevation: labels, pools of items updated in place, arrows,
dimension lines and the colours of the load cases.

The elevation's scene is laid out in view pixels (see ``elevation.Frame``), so an item's
coordinates are the pixels it covers; nothing here knows about the model.
"""

from __future__ import annotations

from collections.abc import Callable
from typing import Generic, TypeVar

from PySide6.QtCore import QPointF, QRectF, Qt
from PySide6.QtGui import QBrush, QColor, QFont, QPainterPath, QPen
from PySide6.QtWidgets import (
    QGraphicsItem,
    QGraphicsRectItem,
    QGraphicsScene,
    QGraphicsSimpleTextItem,
)

#: Colour of each load case's bands, arrows and labels (ASCE 7 symbols).
CASE_COLOURS = {"D": QColor(90, 90, 90), "L": QColor(30, 90, 190), "Lr": QColor(20, 130, 130),
                "S": QColor(60, 150, 210), "W": QColor(40, 140, 60)}
#: Colour of a failing geometry rule and of the station marker.
FAIL = QColor(205, 25, 25)
STATION = QColor(0, 100, 210)
#: Point size of every label.
FONT_PT = 8.0

T = TypeVar("T", bound=QGraphicsItem)


def pen(color: QColor, width: float = 1.0,
        style: Qt.PenStyle = Qt.PenStyle.SolidLine) -> QPen:
    """A pen of ``width`` pixels.

    Dashed and dotted pens are kept to one pixel: Qt strokes a wider cosmetic dash
    pattern as an antialiased outline, many times slower (the plate's dashed edge, 1.2
    px across the member, took half the elevation's paint and 2 ms of a drag step).
    """
    if style != Qt.PenStyle.SolidLine:
        width = min(width, 1.0)
    p = QPen(color, width, style)
    p.setCosmetic(True)
    return p


class Label(QGraphicsRectItem):
    """Plain text on an optional pale box, placed by an anchor point."""

    def __init__(self, size: float = FONT_PT, background: bool = True):
        super().__init__()
        self.text_item = QGraphicsSimpleTextItem(self)
        font = QFont()
        font.setPointSizeF(size)
        self.text_item.setFont(font)
        self.setPen(QPen(Qt.PenStyle.NoPen))
        self.setBrush(QBrush(QColor(255, 255, 255, 215)) if background else QBrush())
        self.setZValue(50)

    def text(self) -> str:
        """The text shown."""
        return self.text_item.text()

    def size_of(self, text: str) -> tuple[float, float]:
        """Width and height (px) the label takes with ``text``."""
        if self.text_item.text() != text:  # setting even the same text repaints it
            self.text_item.setText(text)
        r = self.text_item.boundingRect()
        return r.width() + 4, r.height()

    def place(self, text: str, x: float, y: float, dx: float = 0.0, dy: float = 0.0,
              color: QColor | None = None) -> QRectF:
        """Show ``text`` with the point (x, y) at the fraction (dx, dy) of its box (0, 0 the
        top left, 1, 1 the bottom right); returns the box in scene pixels.
        """
        w, h = self.size_of(text)
        self.text_item.setBrush(QBrush(color or QColor(30, 30, 30)))
        self.text_item.setPos(2, 0)
        self.setRect(QRectF(0, 0, w, h))
        left, top = round(x - dx * w), round(y - dy * h)
        self.setPos(left, top)
        self.setVisible(bool(text))
        return QRectF(left, top, w, h)


class Pool(Generic[T]):
    """Items of one kind kept in the scene between updates: ``sized(n)`` adds or removes
    items so that there are n, and the caller sets each one's geometry (an update moves
    items instead of rebuilding the scene).
    """

    def __init__(self, scene: QGraphicsScene, factory: Callable[[], T]):
        self.scene, self.factory = scene, factory
        self.items: list[T] = []

    def sized(self, n: int) -> list[T]:
        """Exactly n items, in the scene."""
        while len(self.items) < n:
            item = self.factory()
            self.scene.addItem(item)
            self.items.append(item)
        while len(self.items) > n:
            self.scene.removeItem(self.items.pop())
        return self.items


def arrow_path(x: float, tail: float, head: float, size: float = 5.0) -> QPainterPath:
    """A vertical arrow at x from ``tail`` to ``head`` (pixels; either way up)."""
    path = QPainterPath(QPointF(x, tail))
    path.lineTo(x, head)
    back = -size if head > tail else size
    path.moveTo(x - size * 0.7, head + back)
    path.lineTo(x, head)
    path.lineTo(x + size * 0.7, head + back)
    return path


def dimension_path(xs: list[float], y: float, tick: float = 4.0) -> QPainterPath:
    """A horizontal dimension line through the points ``xs`` at height y, with a slanted
    tick at each point (the drafting convention for a chain of dimensions).
    """
    path = QPainterPath()
    if len(xs) < 2:
        return path
    path.moveTo(min(xs), y)
    path.lineTo(max(xs), y)
    for x in xs:
        path.moveTo(x - tick / 2, y + tick / 2)
        path.lineTo(x + tick / 2, y - tick / 2)
        path.moveTo(x, y - tick)
        path.lineTo(x, y + tick)
    return path


def vertical_dimension_path(x: float, y0: float, y1: float, tick: float = 4.0) -> QPainterPath:
    """A vertical dimension line at x from y0 to y1 with a tick at each end."""
    path = QPainterPath(QPointF(x, y0))
    path.lineTo(x, y1)
    for y in (y0, y1):
        path.moveTo(x - tick, y)
        path.lineTo(x + tick, y)
    return path
