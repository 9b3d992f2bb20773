"""A ply of the built-up section: a rectangle in the section plane, in stacking order.

Coordinates: x to the right, y up, in metres, lower left corner plus width and height.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace

from shapely.geometry import Polygon, box

from .errors import Problem


@dataclass(frozen=True)
class Ply:
    """One rectangular ply of the built-up section, in stacking order.

    Attributes:
        name: the user's name for it.
        material: material id (project materials first, then the library).
        x: lower left corner, m.
        y: lower left corner, m.
        width: horizontal size, m.
        height: vertical size, m.

    """

    name: str
    material: str
    x: float
    y: float
    width: float
    height: float

    @property
    def x_centre(self) -> float:
        """Horizontal centre line of the rectangle, m."""
        return self.x + self.width / 2

    @property
    def top(self) -> float:
        """Top edge of the rectangle, m."""
        return self.y + self.height

    def moved(self, dx: float = 0.0, dy: float = 0.0) -> Ply:
        """Return a copy moved by (dx, dy)."""
        return replace(self, x=self.x + dx, y=self.y + dy)

    def rectangle(self) -> Polygon:
        """Return the uncut rectangle as a shapely polygon."""
        return box(self.x, self.y, self.x + self.width, self.y + self.height)


def validate_ply(ply: Ply, path: str) -> list[Problem]:
    """Return the errors of one ply's dimensions (zero, negative or non-finite)."""
    problems = []
    for field in ("x", "y", "width", "height"):
        value = getattr(ply, field)
        if not math.isfinite(value):
            problems.append(Problem(f"{path}.{field}", "is not a finite number"))
    for field in ("width", "height"):
        value = getattr(ply, field)
        if math.isfinite(value) and value <= 0:
            problems.append(Problem(f"{path}.{field}", "must be greater than zero"))
    return problems
