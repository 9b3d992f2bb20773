"""A ply of the built-up section: a rectangle in the section plane, in stacking order.

Coordinates: x to the right, y up, in metres, lower left corner plus width and height.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace

from shapely.geometry import Polygon, box

from .errors import Problem
from .units import fmt

#: Ply ends closer than this fraction of the member length to each other or to the
#: member's ends are taken as the same position (the beam's node tolerance).
EXTENT_TOLERANCE = 1e-7


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
        start: where the ply begins along the member, m from its left end (JSON
            ``"from"``); None: at the left end.
        end: where it stops, m (JSON ``"to"``); None: at the right end.
        stage: "existing" (in the member before it is strengthened) or "added" (put on
            while the member carries its before-loads; see BeamSpec.shored).

    """

    name: str
    material: str
    x: float
    y: float
    width: float
    height: float
    start: float | None = None
    end: float | None = None
    stage: str = "existing"

    @property
    def x_centre(self) -> float:
        """Horizontal centre line of the rectangle, m."""
        return self.x + self.width / 2

    @property
    def top(self) -> float:
        """Top edge of the rectangle, m."""
        return self.y + self.height

    def extent(self, length: float) -> tuple[float, float]:
        """Where the ply runs along a member of ``length``, (from, to) in m."""
        return (0.0 if self.start is None else self.start,
                length if self.end is None else self.end)

    def covers_whole(self, length: float) -> bool:
        """True where the ply runs the whole member (within the node tolerance)."""
        a, b = self.extent(length)
        tol = EXTENT_TOLERANCE * max(length, 1.0)
        return a <= tol and b >= length - tol

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


#: The stages a ply may belong to.
PLY_STAGES = ("existing", "added")


def validate_extent(ply: Ply, length: float, path: str, system: str = "SI") -> list[Problem]:
    """Named problems of a ply's extent along a member of ``length`` (its "from"/"to")."""
    problems = []
    tol = EXTENT_TOLERANCE * max(length, 1.0)
    for field, value in (("from", ply.start), ("to", ply.end)):
        if value is None:
            continue
        if not math.isfinite(value):
            problems.append(Problem(f"{path}.{field}", "is not a finite number"))
        elif not -tol <= value <= length + tol:
            problems.append(Problem(f"{path}.{field}", f"is outside the member (0 to "
                                    f"{fmt(length, 'span', system)})"))
    if problems or (ply.start is None and ply.end is None):
        return problems
    a, b = ply.extent(length)
    if b - a <= tol:
        problems.append(Problem(f"{path}.to", "must be greater than from (the ply would "
                                "have no length)"))
    return problems
