"""Plies in the section plane, clipping by stacking order, and exact polygon properties.

Coordinates: x to the right, y up, in metres. A ply is a rectangle given by its lower
left corner, width and height. Later plies win where plies overlap: the earlier ply is
clipped by shapely and may become a polygon with holes, or several polygons.

Polygon area and moments use the shoelace (Green's theorem) formulas, exact for any
polygon; the width of a ply at height y is piecewise linear in y, which gives exact
first moments of the part above any horizontal cut (used for shear flow).
"""

from __future__ import annotations

from bisect import bisect_right
from dataclasses import dataclass
from typing import Any

import numpy as np
import shapely
from shapely.geometry import MultiPolygon, Polygon
from shapely.geometry.base import BaseGeometry

from ..model.plies import Ply

#: Relative tolerance for "touching" and "level with" tests, a fraction of the section size.
TOUCH_TOLERANCE = 1e-7
#: Relative tolerance of the "is this ply clipped" test, a fraction of its own area.
CLIP_TOLERANCE = 1e-12


def is_unclipped(area: float, ply: Ply) -> bool:
    """True where ``area`` (after clipping) is the ply's whole rectangle."""
    whole = ply.width * ply.height
    return abs(area - whole) <= CLIP_TOLERANCE * max(whole, 1e-30)


def near_pairs(plies: tuple[Ply, ...] | list[Ply], tol: float) -> list[tuple[int, int]]:
    """Pairs (i, j), i < j, sorted, of rectangles that come within ``tol`` of each other.

    A superset of every pair that overlaps, touches or lies within ``tol`` (the test is
    made with a slightly larger margin, so rounding never drops a pair); callers apply
    their own exact test to these pairs only. A sort and sweep along the axis where the
    rectangles' intervals overlap least: O(n log n) plus the number of pairs, instead of
    testing all n (n - 1) / 2 pairs.
    """
    n = len(plies)
    if n < 2:
        return []
    big = max(max(abs(p.x), abs(p.y), abs(p.x + p.width), abs(p.top)) for p in plies)
    grow = 2 * tol + 1e-12 * (1.0 + big)
    spans = {"x": ([p.x - grow for p in plies], [p.x + p.width + grow for p in plies]),
             "y": ([p.y - grow for p in plies], [p.top + grow for p in plies])}
    sweeps = {}
    for axis, (lo, hi) in spans.items():
        order = sorted(range(n), key=lo.__getitem__)
        starts = [lo[i] for i in order]
        ends = [bisect_right(starts, hi[i]) for i in order]
        sweeps[axis] = (order, ends, sum(e - r - 1 for r, e in enumerate(ends)))
    axis = "x" if sweeps["x"][2] <= sweeps["y"][2] else "y"
    order, ends, _ = sweeps[axis]
    lo, hi = spans["y" if axis == "x" else "x"]
    pairs = []
    for r, i in enumerate(order):
        for s in range(r + 1, ends[r]):
            j = order[s]
            if lo[j] <= hi[i] and lo[i] <= hi[j]:
                pairs.append((i, j) if i < j else (j, i))
    pairs.sort()
    return pairs


def clip_plies(plies: tuple[Ply, ...] | list[Ply]) -> list[BaseGeometry]:
    """Clip each ply by every later ply (later plies win). Returns one geometry per ply."""
    return clip_plies_marked(plies)[0]


def clip_plies_marked(plies: tuple[Ply, ...] | list[Ply]
                      ) -> tuple[list[BaseGeometry], list[bool]]:
    """:func:`clip_plies`, and for each ply whether it is its own whole rectangle (no
    later ply overlaps it).
    """
    rects = list(shapely.box([p.x for p in plies], [p.y for p in plies],
                             [p.x + p.width for p in plies], [p.top for p in plies]))
    later_of: dict[int, list[int]] = {}
    for i, j in near_pairs(plies, 0.0):
        if overlap(plies[i], plies[j]):
            later_of.setdefault(i, []).append(j)
    out: list[BaseGeometry] = []
    whole: list[bool] = []
    for i, rect in enumerate(rects):
        later = [rects[j] for j in later_of.get(i, [])]
        if later:
            cut = rect.difference(shapely.union_all(later))
            out.append(_polygons_only(cut))
        else:
            out.append(rect)
        whole.append(not later)
    return out, whole


def overlap(a: Ply, b: Ply) -> bool:
    """True where two rectangles share area (touching edges do not count)."""
    return (min(a.x + a.width, b.x + b.width) > max(a.x, b.x)
            and min(a.top, b.top) > max(a.y, b.y))


def rectangles_touch(a: Ply, b: Ply, tol: float) -> bool:
    """True where two rectangles overlap or share an edge or a corner (within tol)."""
    return (min(a.x + a.width, b.x + b.width) >= max(a.x, b.x) - tol
            and min(a.top, b.top) >= max(a.y, b.y) - tol)


def _polygons_only(geom: BaseGeometry) -> BaseGeometry:
    """Drop lines and points that a difference may leave behind."""
    if isinstance(geom, Polygon | MultiPolygon):
        return geom
    polys = [g for g in getattr(geom, "geoms", []) if isinstance(g, Polygon) and g.area > 0]
    return MultiPolygon(polys) if polys else Polygon()


def _rings(geom: BaseGeometry) -> list[np.ndarray]:
    """Return the rings of a (multi)polygon, exteriors counter-clockwise, holes clockwise."""
    rings: list[np.ndarray] = []
    polys = geom.geoms if isinstance(geom, MultiPolygon) else [geom]
    for poly in polys:
        if poly.is_empty:
            continue
        poly = shapely.geometry.polygon.orient(poly, sign=1.0)
        rings.append(np.asarray(poly.exterior.coords))
        rings.extend(np.asarray(r.coords) for r in poly.interiors)
    return rings


@dataclass(frozen=True)
class PolygonMoments:
    """Exact area moments of a (multi)polygon about the axes x = 0 and y = 0.

    Attributes:
        area: integral of dA, m^2.
        first_y: integral of y dA, m^3.
        second_y: integral of y^2 dA, m^4.
        first_x: integral of x dA, m^3.

    """

    area: float
    first_y: float
    second_y: float
    first_x: float


def polygon_moments(geom: BaseGeometry) -> PolygonMoments:
    """Shoelace formulas for area, first and second moments (exact for polygons)."""
    return _shoelace(_rings(geom))


def rectangle_moments(ply: Ply) -> PolygonMoments:
    """:func:`polygon_moments` of the ply's whole rectangle, without building it: the
    counter-clockwise ring a box has (from its lower right corner), the same arithmetic
    in plain floats (:func:`_shoelace` of that ring: each of its four edges' terms as the
    arrays hold them, added from zero one by one as numpy sums four numbers).
    """
    x0, x1, y0, y1 = ply.x, ply.x + ply.width, ply.y, ply.top
    return _box_shoelace((x1, x1, x0, x0), (y0, y1, y1, y0), (x1, x0, x0, x1),
                         (y1, y1, y0, y0))


def _box_shoelace(xa: tuple[float, ...], ya: tuple[float, ...], xb: tuple[float, ...],
                  yb: tuple[float, ...]) -> PolygonMoments:
    """:func:`_shoelace` of one ring of four edges from (xa, ya) to (xb, yb)."""
    area = sy = iy = sx = 0.0
    for k in range(4):
        cross = xa[k] * yb[k] - xb[k] * ya[k]
        area += cross
        sy += cross * (ya[k] + yb[k])
        sx += cross * (xa[k] + xb[k])
        iy += cross * (ya[k] * ya[k] + ya[k] * yb[k] + yb[k] * yb[k])
    return PolygonMoments(0.0 + area / 2, 0.0 + sy / 6, 0.0 + iy / 12, 0.0 + sx / 6)


def rectangle_profile(ply: Ply) -> WidthProfile:
    """:func:`width_profile` of the ply's whole rectangle, without building it."""
    w = np.array([(ply.x + ply.width) - ply.x])
    return WidthProfile(np.array([ply.y, ply.top]), w, w.copy())


def _shoelace(rings: list[np.ndarray]) -> PolygonMoments:
    area = sy = iy = sx = 0.0
    for ring in rings:
        x0, y0 = ring[:-1, 0], ring[:-1, 1]
        x1, y1 = ring[1:, 0], ring[1:, 1]
        cross = x0 * y1 - x1 * y0
        area += float(cross.sum()) / 2
        sy += float((cross * (y0 + y1)).sum()) / 6
        sx += float((cross * (x0 + x1)).sum()) / 6
        iy += float((cross * (y0 * y0 + y0 * y1 + y1 * y1)).sum()) / 12
    return PolygonMoments(area, sy, iy, sx)


@dataclass(frozen=True)
class WidthProfile:
    """The width of a geometry as a piecewise linear function of height.

    Between consecutive breakpoints ``y[k]`` and ``y[k+1]`` the width runs linearly from
    ``b_start[k]`` to ``b_end[k]``. Exact for polygons.
    """

    y: np.ndarray
    b_start: np.ndarray
    b_end: np.ndarray

    def width_inside(self, y: np.ndarray) -> np.ndarray:
        """Width at heights ``y``, taking the larger side at breakpoints (a cut's material)."""
        y = np.asarray(y, dtype=float)
        out = np.zeros_like(y)
        for k in range(self.y.size - 1):
            lo, hi = self.y[k], self.y[k + 1]
            t = np.clip((y - lo) / (hi - lo), 0.0, 1.0)
            inside = (y >= lo) & (y <= hi)
            value = self.b_start[k] + t * (self.b_end[k] - self.b_start[k])
            out = np.where(inside, np.maximum(out, value), out)
        return out

    def above(self, cut: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
        """Area and first moment (about y = 0) of the part above each height in ``cut``."""
        cut = np.asarray(cut, dtype=float)
        area = np.zeros_like(cut)
        first = np.zeros_like(cut)
        for k in range(self.y.size - 1):
            seg_area, seg_first = _segment_above(cut, self.y[k], self.y[k + 1],
                                                 self.b_start[k], self.b_end[k])
            area += seg_area
            first += seg_first
        return area, first


@dataclass(frozen=True, eq=False)
class ProfileStack:
    """The width profiles of every ply of a section, their segments side by side, so the
    widths and the parts above a set of cuts are found for all plies in one pass.

    Per segment, the same arithmetic as :meth:`WidthProfile.width_inside` and
    :meth:`WidthProfile.above` (element by element, so the numbers are the same), and the
    segments of a ply added up in their own order.
    """

    count: int
    owner: np.ndarray
    lo: np.ndarray
    hi: np.ndarray
    b_start: np.ndarray
    b_end: np.ndarray
    single: bool

    @staticmethod
    def of(profiles: tuple[WidthProfile, ...] | list[WidthProfile]) -> ProfileStack:
        """Stack the segments of ``profiles`` (one per ply)."""
        owner: list[int] = []
        lo: list[float] = []
        hi: list[float] = []
        b0: list[float] = []
        b1: list[float] = []
        for i, prof in enumerate(profiles):
            ys = prof.y.tolist()
            owner.extend([i] * (len(ys) - 1) if ys else [])
            lo.extend(ys[:-1])
            hi.extend(ys[1:])
            b0.extend(prof.b_start.tolist())
            b1.extend(prof.b_end.tolist())
        single = owner == list(range(len(profiles)))
        return ProfileStack(len(profiles), np.array(owner, dtype=int), np.array(lo),
                            np.array(hi), np.array(b0), np.array(b1), single)

    def _gather(self, seg: np.ndarray, ny: int, use_max: bool) -> np.ndarray:
        out = np.zeros((self.count, ny))
        if self.single:
            return np.asarray(np.maximum(out, seg) if use_max else out + seg)
        if use_max:
            np.maximum.at(out, self.owner, seg)
        else:
            np.add.at(out, self.owner, seg)  # in segment order, as a loop would
        return out

    def width_inside(self, y: np.ndarray) -> np.ndarray:
        """Width of every ply at heights ``y``, shape (plies, len(y))."""
        y = np.asarray(y, dtype=float)[None, :]
        lo, hi = self.lo[:, None], self.hi[:, None]
        b0, b1 = self.b_start[:, None], self.b_end[:, None]
        t = np.clip((y - lo) / (hi - lo), 0.0, 1.0)
        inside = (y >= lo) & (y <= hi)
        value = b0 + t * (b1 - b0)
        return self._gather(np.where(inside, np.maximum(0.0, value), 0.0), y.size, True)

    def above(self, cut: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
        """Area and first moment (about y = 0) of every ply's part above each cut,
        each of shape (plies, len(cut)).
        """
        cut = np.asarray(cut, dtype=float)[None, :]
        seg_area, seg_first = _segment_above(cut, self.lo[:, None], self.hi[:, None],
                                             self.b_start[:, None], self.b_end[:, None])
        return (self._gather(seg_area, cut.size, False),
                self._gather(seg_first, cut.size, False))


def _segment_above(cut: Any, lo: Any, hi: Any, b0: Any, b1: Any) -> tuple[Any, Any]:
    """Area and first moment (about y = 0) of the part above ``cut`` of a segment from
    ``lo`` to ``hi`` whose width runs linearly from ``b0`` to ``b1`` (element by element:
    scalars, arrays or broadcast rows alike).
    """
    slope = (b1 - b0) / (hi - lo)
    a = np.clip(cut, lo, hi)
    # width b(y) = b0 + slope (y - lo); integrate from a to hi
    ba = b0 + slope * (a - lo)
    area = (ba + b1) / 2 * (hi - a)
    # integral of y b(y) dy from a to hi, exact for linear b (Simpson on a cubic)
    mid = (a + hi) / 2
    bm = b0 + slope * (mid - lo)
    return area, (hi - a) / 6 * (a * ba + 4 * mid * bm + hi * b1)


def width_profile(geom: BaseGeometry) -> WidthProfile:
    """Build the exact piecewise-linear width function of a (multi)polygon."""
    if geom.is_empty:
        empty = np.zeros(0)
        return WidthProfile(empty, empty, empty)
    if isinstance(geom, Polygon) and not geom.interiors and len(geom.exterior.coords) == 5:
        minx, miny, maxx, maxy = geom.bounds
        if abs(geom.area - (maxx - minx) * (maxy - miny)) <= CLIP_TOLERANCE * max(
                geom.area, 1e-30):
            w = np.array([maxx - minx])
            return WidthProfile(np.array([miny, maxy]), w, w.copy())
    ys = np.unique(np.concatenate([ring[:, 1] for ring in _rings(geom)]))
    b_start = np.zeros(max(ys.size - 1, 0))
    b_end = np.zeros(max(ys.size - 1, 0))
    minx, _, maxx, _ = geom.bounds
    pad = (maxx - minx) + 1.0
    for k in range(ys.size - 1):
        lo, hi = ys[k], ys[k + 1]
        y1 = lo + (hi - lo) / 4
        y3 = lo + 3 * (hi - lo) / 4
        w1 = _chord(geom, y1, minx - pad, maxx + pad)
        w3 = _chord(geom, y3, minx - pad, maxx + pad)
        slope = (w3 - w1) / (y3 - y1)
        b_start[k] = w1 + slope * (lo - y1)
        b_end[k] = w1 + slope * (hi - y1)
    return WidthProfile(ys, b_start, b_end)


def _chord(geom: BaseGeometry, y: float, x0: float, x1: float) -> float:
    line = shapely.geometry.LineString([(x0, y), (x1, y)])
    return float(geom.intersection(line).length)


def touches_any(index: int, geoms: list[BaseGeometry], size: float,
                candidates: list[int] | None = None) -> bool:
    """True where geometry ``index`` touches or overlaps at least one other one.

    ``candidates``: the only indices that can touch it (from :func:`touch_candidates`);
    all others when None.
    """
    me = geoms[index]
    if me.is_empty:
        return False
    tol = max(size, 1e-9) * TOUCH_TOLERANCE
    grown = me.buffer(tol, join_style="mitre")
    others = range(len(geoms)) if candidates is None else candidates
    return any(
        j != index and not geoms[j].is_empty and grown.intersects(geoms[j]) for j in others
    )


def touch_candidates(plies: tuple[Ply, ...] | list[Ply], size: float) -> list[list[int]]:
    """Per ply, the other plies whose rectangles come near enough that their clipped
    geometries may touch it in :func:`touches_any` (ascending indices).

    A clipped ply lies inside its rectangle and the mitred buffer of ``touches_any``
    reaches at most its mitre limit (5) times its distance beyond a corner, so rectangles
    farther apart than ten times that distance never touch.
    """
    near: list[list[int]] = [[] for _ in plies]
    for i, j in near_pairs(plies, 10 * max(size, 1e-9) * TOUCH_TOLERANCE):
        near[i].append(j)
        near[j].append(i)
    for row in near:
        row.sort()
    return near
