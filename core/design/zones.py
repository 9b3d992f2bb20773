"""The transfer zone of a support or load on a plate's bolts: the stations within the
member depth d of it, at least the nearest (the load spreads at about 45 degrees through
the depth, common practice; see ``transfer``), found one at a time or, for many
transfers, all at once (the same stations).
"""

from __future__ import annotations

import math
from bisect import bisect_left
from dataclasses import dataclass

import numpy as np

from .bolt_layout import BoltLayout


def zone(layout: BoltLayout, x: float, depth: float) -> tuple[int, ...]:
    """The transfer zone of a support or load at ``x``: the stations within ``depth``
    of it, at least the nearest (and any as near).
    """
    xs = layout.stations
    near = tuple(k for k, s in enumerate(xs) if abs(s - x) <= depth * (1 + 1e-9))
    if near:
        return near
    best = min(abs(s - x) for s in xs)
    return tuple(k for k, s in enumerate(xs) if abs(s - x) <= best * (1 + 1e-9) + 1e-12)


def _around(xs: tuple[float, ...], x: float, i: int, reach: float) -> tuple[int, ...]:
    """The stations k with |xs[k] - x| <= reach, found outwards from index i (the first
    station at or right of x) in ascending ``xs``: |xs[k] - x| grows away from x on either
    side (rounded subtraction keeps order), so they are one run of indices.
    """
    lo, hi = i, i
    while lo > 0 and abs(xs[lo - 1] - x) <= reach:
        lo -= 1
    while hi < len(xs) and abs(xs[hi] - x) <= reach:
        hi += 1
    return tuple(range(lo, hi))


def zone_ascending(xs: tuple[float, ...], x: float, depth: float) -> tuple[int, ...]:
    """:func:`zone` for ascending stations, by bisection: the same stations."""
    i = bisect_left(xs, x)
    near = _around(xs, x, i, depth * (1 + 1e-9))
    if near:
        return near
    best = min(abs(xs[k] - x) for k in (i - 1, i) if 0 <= k < len(xs))
    return _around(xs, x, i, best * (1 + 1e-9) + 1e-12)


def zone_bounds(xs: tuple[float, ...], at: list[float] | np.ndarray,
                 depth: float) -> tuple[list[int], list[int]] | None:
    """For ascending stations ``xs``, the zone of a transfer at each of ``at`` as the run
    of station indices ``range(lo, hi)``: the stations :func:`zone_ascending` finds, by
    the same comparisons made on all of them at once (|xs[k] - x| grows away from x on
    either side, so the stations within a reach are one run). None where it cannot tell
    (no stations, or a position that is not a number).
    """
    n = len(xs)
    if n == 0 or len(at) == 0:
        return None
    gap = np.abs(np.asarray(xs, dtype=float)[None, :] - np.asarray(at, dtype=float)[:, None])
    inside = gap <= depth * (1 + 1e-9)
    bare = ~inside.any(axis=1)
    if bare.any():  # no station within the depth: the nearest (and any as near)
        i = np.searchsorted(np.asarray(xs, dtype=float), np.asarray(at, dtype=float)[bare],
                            side="left")
        rows = gap[bare]
        pick = np.arange(rows.shape[0])
        left = np.where(i >= 1, rows[pick, np.clip(i - 1, 0, n - 1)], np.inf)
        right = np.where(i < n, rows[pick, np.clip(i, 0, n - 1)], np.inf)
        reach = np.minimum(left, right) * (1 + 1e-9) + 1e-12
        inside[bare] = rows <= reach[:, None]
    if not inside.any(axis=1).all():
        return None
    lo = inside.argmax(axis=1)
    hi = n - inside[:, ::-1].argmax(axis=1)
    return lo.tolist(), hi.tolist()


def zone_runs(xs: tuple[float, ...], at: list[float] | np.ndarray,
          depth: float) -> tuple[list[int], list[int]] | None:
    """``(lo, hi)`` of every zone of transfers at ``at`` among ascending stations ``xs``:
    by bisection for a few transfers, all at once for many (:func:`zone_bounds`; the
    same runs).
    """
    if len(at) < 16:
        zones = [zone_ascending(xs, x, depth) for x in at]
        if not all(zones):
            return None
        return [z[0] for z in zones], [z[-1] + 1 for z in zones]
    return zone_bounds(xs, at, depth)


#: Transfers from which :func:`station_sums` adds with numpy (fewer: plain floats).
MANY_SUMS = 16


@dataclass(frozen=True)
class ForceArrays:
    """The positions, forces and signs (+1 a point load, -1 a reaction) of many
    transfers (kind, label, x, force) as arrays, found once for every spacing tried.
    """

    at: np.ndarray
    force: np.ndarray
    sign: np.ndarray


def force_arrays(forces: tuple[tuple[str, str, float, float], ...]) -> ForceArrays | None:
    """The arrays of ``forces``; None for fewer than :data:`MANY_SUMS`."""
    if len(forces) < MANY_SUMS:
        return None
    return ForceArrays(np.array([f[2] for f in forces], dtype=float),
                       np.array([f[3] for f in forces], dtype=float),
                       np.array([1.0 if f[0] == "point" else -1.0 for f in forces]))


def station_sums(forces: tuple[tuple[str, str, float, float], ...], lo: list[int],
                 hi: list[int], station_rows: tuple[tuple[int, ...], ...],
                 share: float,
                 arrays: ForceArrays | None = None) -> tuple[list[float], list[float]]:
    """For every station, the sum of the shares per bolt of the transfers whose zone
    ``range(lo[j], hi[j])`` holds it, and of the same signed (point loads push the plate
    down, reactions up): each transfer (kind, label, x, force) shares alpha |force| over
    its zone's bolts (infinite with none), the sums made from 0.0 in the transfers' order,
    the floats ``sum`` makes of them; with numpy for many (``bincount`` adds its weights
    one by one in their order: the same additions; ``arrays``: those of ``forces``).
    """
    n = len(station_rows)
    if len(forces) < MANY_SUMS:
        ahead = [0]  # bolts at the stations before each index: a zone's bolts by difference
        for rs in station_rows:
            ahead.append(ahead[-1] + len(rs))
        own, signed = [0.0] * n, [0.0] * n
        for (kind, _, _, force), a, b in zip(forces, lo, hi, strict=True):
            bolts = ahead[b] - ahead[a]
            p = abs(share * force) / bolts if bolts else math.inf  # Transfer.per_bolt
            q = p * (1.0 if kind == "point" else -1.0)
            for k in range(a, b):
                own[k] += p
                signed[k] += q
        return own, signed
    if arrays is None:
        arrays = ForceArrays(np.zeros(0), np.array([f[3] for f in forces], dtype=float),
                             np.array([1.0 if f[0] == "point" else -1.0 for f in forces]))
    with np.errstate(all="ignore"):  # as plain floats: inf and nan, never a warning
        ahead_a = np.zeros(n + 1, dtype=np.int64)
        np.cumsum([len(rs) for rs in station_rows], out=ahead_a[1:])
        lo_a, hi_a = np.asarray(lo, dtype=np.int64), np.asarray(hi, dtype=np.int64)
        bolts_a = ahead_a[hi_a] - ahead_a[lo_a]
        demand = np.abs(share * arrays.force)
        per = np.full(len(forces), np.inf)
        np.divide(demand, bolts_a, out=per, where=bolts_a != 0)
        sizes = hi_a - lo_a
        each = np.repeat(np.arange(len(forces)), sizes)  # transfer by transfer, in order
        at = lo_a[each] + np.arange(each.size) - np.repeat(np.cumsum(sizes) - sizes, sizes)
        own_a = np.bincount(at, weights=per[each], minlength=n)
        signed_a = np.bincount(at, weights=(per * arrays.sign)[each], minlength=n)
    return own_a.tolist(), signed_a.tolist()


def ascending(xs: tuple[float, ...]) -> bool:
    """Whether the stations never go back along the member."""
    return all(a <= b for a, b in zip(xs, xs[1:], strict=False))
