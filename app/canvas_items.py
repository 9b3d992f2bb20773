"""Scene items of the section canvas: ply outlines, fills, labels, the background grid.

Scene units are millimetres with y pointing up in the model and down in Qt, so a model
point (x, y) in metres sits at scene (1000 x, -1000 y).
"""

from __future__ import annotations

import math
from collections.abc import Callable
from typing import TypeVar

from PySide6.QtCore import QLineF, QPointF, QRectF, Qt
from PySide6.QtGui import QBrush, QColor, QFont, QPainter, QPainterPath, QPen
from PySide6.QtWidgets import (
    QGraphicsItem,
    QGraphicsRectItem,
    QGraphicsScene,
    QGraphicsSimpleTextItem,
)
from shapely.geometry import MultiPolygon, Polygon
from shapely.geometry.base import BaseGeometry

#: Fills by material kind that read in greyscale print: timber light with diagonal grain
#: lines, steel dark and solid, other materials mid grey with cross-hatching.
FILLS = {
    "timber": (QColor(236, 214, 170), Qt.BrushStyle.BDiagPattern, QColor(150, 110, 60)),
    "steel": (QColor(70, 78, 90), Qt.BrushStyle.SolidPattern, QColor(70, 78, 90)),
    "other": (QColor(190, 190, 200), Qt.BrushStyle.DiagCrossPattern, QColor(110, 110, 120)),
}

T = TypeVar("T", bound=QGraphicsItem)

#: Most grid lines drawn in one direction per repaint (a bound, whatever the zoom).
MAX_GRID_LINES = 400


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
            if not pts or not all(math.isfinite(p.x()) and math.isfinite(p.y()) for p in pts):
                continue
            path.moveTo(pts[0])
            for p in pts[1:]:
                path.lineTo(p)
            path.closeSubpath()
    return path


class Tag(QGraphicsRectItem):
    """A label that keeps its size on screen (plain text on a pale box), origin top left;
    ``show`` changes it in place (only what differs), so a redraw reuses it.
    """

    def __init__(self) -> None:
        super().__init__()
        self.setFlag(QGraphicsItem.GraphicsItemFlag.ItemIgnoresTransformations)
        self.label = QGraphicsSimpleTextItem(self)
        self.setPen(QPen(Qt.PenStyle.NoPen))
        self._shown: tuple[object, ...] | None = None

    def show(self, text: str, color: QColor | None = None, size: float = 9.0,
             background: bool = True, z: float = 3000) -> Tag:
        """Show ``text`` in ``color`` at ``size`` points, at height ``z``; returns itself."""
        colour = color or QColor(30, 30, 30)
        key = (text, colour.rgba(), size, background)
        if key != self._shown:
            self._shown = key
            self.label.setText(text)
            self.label.setBrush(QBrush(colour))
            f = QFont()
            f.setPointSizeF(size)
            self.label.setFont(f)
            self.setRect(self.label.boundingRect().adjusted(-2, 0, 2, 0))
            self.setBrush(QBrush(QColor(255, 255, 255, 200)) if background else QBrush())
        self.setZValue(z)
        return self


def tag(text: str, color: QColor | None = None, size: float = 9.0,
        background: bool = True) -> QGraphicsRectItem:
    """A label that keeps its size on screen (plain text on a pale box), origin top left."""
    return Tag().show(text, color, size, background)


class Slots:
    """Scene items kept between redraws, one per key (its role in the drawing): a redraw
    asks for each item it draws (``get``) and sets what changed; ``end`` takes out of the
    scene the items the redraw did not ask for. An item is added to the scene when it is
    first asked for, so items of equal z stack in the order a fresh drawing makes them.
    """

    def __init__(self, scene: QGraphicsScene):
        self.scene = scene
        self.items: dict[object, QGraphicsItem] = {}
        self._used: set[object] = set()

    def begin(self) -> None:
        """A redraw starts: no item asked for yet."""
        self._used = set()

    def get(self, key: object, factory: Callable[[], T]) -> T:
        """The item kept under ``key``, made by ``factory`` (and added) the first time."""
        item = self.items.get(key)
        if item is None:
            item = factory()
            self.scene.addItem(item)
            self.items[key] = item
        self._used.add(key)
        return item  # type: ignore[return-value]

    def end(self) -> None:
        """The redraw is done: items it did not ask for leave the scene."""
        for key in [k for k in self.items if k not in self._used]:
            self.scene.removeItem(self.items.pop(key))

    def clear(self) -> None:
        """Every item leaves the scene."""
        self.begin()
        self.end()


def grid_step(steps: list[float], px_per_mm: float, at_least_px: float) -> float:
    """The first step (mm) at least ``at_least_px`` wide on screen; past the list, the
    largest step times a power of ten.
    """
    for s in steps:
        if s * px_per_mm >= at_least_px:
            return s
    largest = steps[-1]
    power = math.ceil(math.log10(at_least_px / (largest * px_per_mm)))
    return largest * 10.0 ** max(power, 0)


def draw_grid(painter: QPainter, rect: QRectF, px_per_mm: float, steps: list[float]) -> None:
    """Minor and major grid lines over ``rect`` (scene units), bounded in number."""
    painter.fillRect(rect, QColor(252, 252, 250))
    values = (rect.left(), rect.right(), rect.top(), rect.bottom(), px_per_mm)
    if not all(math.isfinite(v) for v in values) or px_per_mm <= 0:
        return
    minor = grid_step(steps, px_per_mm, 10)
    major = grid_step([s for s in steps if s >= minor * 4.9] or [minor * 5], px_per_mm, 40)
    for step, color in ((minor, QColor(234, 234, 234)), (major, QColor(205, 205, 205))):
        if (rect.width() / step > MAX_GRID_LINES or rect.height() / step > MAX_GRID_LINES):
            continue
        pen = QPen(color, 0)
        pen.setCosmetic(True)
        painter.setPen(pen)
        k0 = math.floor(rect.left() / step)
        lines = [QLineF(k * step, rect.top(), k * step, rect.bottom())
                 for k in range(k0, k0 + int(rect.width() / step) + 2)]
        k0 = math.floor(rect.top() / step)
        lines += [QLineF(rect.left(), k * step, rect.right(), k * step)
                  for k in range(k0, k0 + int(rect.height() / step) + 2)]
        painter.drawLines(lines)  # one call for the whole grid
