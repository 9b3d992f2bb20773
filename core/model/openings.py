"""Notches and holes in the member's timber plies (plain frozen data, SI units).

A notch is cut from the bottom or top face at a support or at a position along the
member; a hole is bored through the plies at a position and a height. Positions are
measured from the member's left end.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from .errors import Problem
from .units import fmt

FACES = ("bottom", "top")


@dataclass(frozen=True)
class Notch:
    """A notch in the timber plies.

    Attributes:
        x: the notch's position, m: the support's x for a notch at a support, else the
            given position (its centre).
        face: "bottom" or "top".
        depth: m cut from the face.
        length: m along the member.
        support: the support number (1-based) where the notch is at a support, else None.
        plies: names of the notched plies (empty: every timber ply).

    """

    x: float
    face: str
    depth: float
    length: float
    support: int | None = None
    plies: tuple[str, ...] = ()


@dataclass(frozen=True)
class Hole:
    """A round hole bored through plies.

    Attributes:
        x: m from the member's left end.
        y: height of its centre, m (the section's coordinates).
        diameter: m.
        plies: names of the bored plies (empty: every timber ply).

    """

    x: float
    y: float
    diameter: float
    plies: tuple[str, ...] = ()


def validate_opening(item: Notch | Hole, length: float, path: str, system: str = "SI"
                     ) -> list[Problem]:
    """Named problems of a notch's or hole's numbers."""
    problems = []
    sizes = ("depth", "length") if isinstance(item, Notch) else ("diameter",)
    for name in sizes:
        v = getattr(item, name)
        if not math.isfinite(v) or v <= 0:
            problems.append(Problem(f"{path}.{name}", "must be greater than zero"))
    if isinstance(item, Notch) and item.face not in FACES:
        problems.append(Problem(f"{path}.face", f'"{item.face}" is not one of '
                                + ", ".join(FACES)))
    tol = 1e-9 * max(length, 1.0)
    if not math.isfinite(item.x) or not -tol <= item.x <= length + tol:
        problems.append(Problem(f"{path}.at", "is outside the member (0 to "
                                f"{fmt(length, 'span', system)})"))
    return problems
