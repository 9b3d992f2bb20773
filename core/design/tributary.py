"""The distributed load on the tributary of each bolt station of a plate (halfway to the
neighbouring stations, or to the plate's end; see ``transfer``), element by element of the
beam's mesh: the terms q (s1 - s0) + dq (s1^2 - s0^2) / 2 of the solution's load
q + dq s along each element, taken away one by one in the order of the elements.

The terms of the elements a tributary covers whole are the same for every layout tried,
so they are found once per combination (:func:`whole_terms`) and taken away as found.
"""

from __future__ import annotations

import operator
from bisect import bisect_left, bisect_right
from functools import reduce

from .bolt_layout import BoltLayout
from .zones import ascending


def tributaries(layout: BoltLayout) -> list[tuple[float, float]]:
    """(a, b) of every station's tributary (``BoltLayout.tributary``, all at once)."""
    xs = layout.stations
    last = len(xs) - 1
    return [(layout.extent[0] if k == 0 else (xs[k - 1] + xs[k]) / 2,
             layout.extent[1] if k == last else (xs[k] + xs[k + 1]) / 2)
            for k in range(len(xs))]


def whole_terms(nodes: tuple[float, ...], q: tuple[float, ...],
                dq: tuple[float, ...]) -> tuple[float, ...]:
    """The terms ``q (s1 - s0) + dq (s1^2 - s0^2) / 2`` of every element covered whole
    (s0 = 0, s1 its length; 0.0 where it has none, which :func:`load_between` leaves
    out), or () where the nodes do not ascend.
    """
    if not ascending(nodes) or len(q) != len(nodes) - 1 or len(dq) != len(q):
        return ()
    out = []
    for e in range(len(q)):
        s0 = 0.0
        s1 = nodes[e + 1] - nodes[e]
        out.append(q[e] * (s1 - s0) + dq[e] * (s1**2 - s0**2) / 2 if s1 > s0 else 0.0)
    return tuple(out)


def load_between(nodes: tuple[float, ...], q: tuple[float, ...], dq: tuple[float, ...],
                 whole: tuple[float, ...], a: float, b: float) -> float:
    """The distributed load between a and b, N (downward positive; q is upward positive):
    the terms of the elements that can overlap (a, b), in order, those covered whole
    from ``whole`` (:func:`whole_terms` of the same nodes and loads, or () to find every
    term here).
    """
    first = bisect_right(nodes, a, 1) - 1  # searchsorted(nodes[1:], a, "right")
    last = bisect_left(nodes, b, 0, len(nodes) - 1)  # searchsorted(nodes[:-1], b, "left")
    end = max(first, last)
    if not (whole and a == a and b == b):
        return _terms_between(nodes, q, dq, a, b, first, end, 0.0)
    # the elements with a <= x0 and x1 <= b, one run of the ascending nodes: their terms
    # are those of ``whole`` (s0 = max(a, x0) - x0 = 0, s1 = min(b, x1) - x0 = x1 - x0)
    inner = min(max(first, bisect_left(nodes, a)), end)
    stop = min(max(inner, bisect_right(nodes, b) - 1), end)
    total = _terms_between(nodes, q, dq, a, b, first, inner, 0.0)
    total = reduce(operator.sub, whole[inner:stop], total)  # total -= each, in order
    return _terms_between(nodes, q, dq, a, b, stop, end, total)


def _terms_between(nodes: tuple[float, ...], q: tuple[float, ...], dq: tuple[float, ...],
                   a: float, b: float, first: int, end: int, total: float) -> float:
    """``total`` less the terms of the elements ``first`` to ``end`` (excluded) on (a, b)."""
    for e in range(first, end):
        x0 = nodes[e]
        s0 = max(a, x0) - x0
        s1 = min(b, nodes[e + 1]) - x0
        if s1 > s0:
            total -= q[e] * (s1 - s0) + dq[e] * (s1**2 - s0**2) / 2
    return total
