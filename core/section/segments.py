"""Segments along the member: the stretches over which the same plies act together.

A ply may stop short of the member's ends (its ``start`` / ``end``, JSON "from" / "to").
Every ply end cuts the member; between two cuts the section is constant, so it is
analysed once per segment. At a cut the segment that does not hold the stopped ply is
the one whose section governs there (the remaining plies act alone), and each segment
is taken as closed, so its checks include both of its ends.
"""

from __future__ import annotations

from collections.abc import Callable, Mapping, Sequence
from dataclasses import dataclass

from ..model.errors import Problem, ProjectError
from ..model.materials import Material
from ..model.plies import EXTENT_TOLERANCE, Ply
from ..model.units import fmt
from .transformed import Section, analyse


@dataclass(frozen=True)
class Segment:
    """One stretch of constant section.

    Attributes:
        start: m from the member's left end.
        end: m.
        plies: indices (into the member's plies) of the plies acting here.

    """

    start: float
    end: float
    plies: tuple[int, ...]


def is_stepped(plies: Sequence[Ply], length: float) -> bool:
    """True where some ply stops short of the member's ends."""
    return any(not p.covers_whole(length) for p in plies)


def segments_of(plies: Sequence[Ply], length: float, system: str = "SI"
                ) -> tuple[Segment, ...]:
    """The segments of a member of ``length``: cut at every ply end, left to right.

    Raises a named problem where some stretch of the member holds no ply (its ends in the
    display units of ``system``).
    """
    tol = EXTENT_TOLERANCE * max(length, 1.0)
    cuts = sorted({0.0, length, *(min(max(v, 0.0), length) for p in plies
                                  for v in p.extent(length))})
    merged = [cuts[0]]
    for c in cuts[1:]:
        if c - merged[-1] > tol:
            merged.append(c)
    merged[-1] = length
    out = []
    for a, b in zip(merged[:-1], merged[1:], strict=True):
        mid = (a + b) / 2
        held = tuple(i for i, p in enumerate(plies)
                     if p.extent(length)[0] - tol <= mid <= p.extent(length)[1] + tol)
        if not held:
            raise ProjectError(Problem("plies", f"no ply runs from {fmt(a, 'span', system)} "
                                       f"to {fmt(b, 'span', system)} along the member (check "
                                       "the plies' from and to)"))
        out.append(Segment(a, b, held))
    return tuple(out)


def segment_sections(plies: Sequence[Ply], segments: Sequence[Segment],
                     materials: Mapping[str, Material], reference: str,
                     make: Callable[[Sequence[Ply], Mapping[str, Material], str], Section]
                     = analyse) -> tuple[Section, ...]:
    """The transformed section of each segment, all to the same reference material
    (``make``: :func:`~.transformed.analyse`, or what gives the same section).
    """
    return tuple(make(tuple(plies[i] for i in s.plies), materials, reference)
                 for s in segments)
