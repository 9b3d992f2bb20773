"""The extremes of a beam's solutions and their diagrams: the shear, moment and
deflection of every element as polynomials in its local x (exact: see ``beam``), their
largest and smallest values along the member, in each span and overhang and in each
segment of a stepped member, for many solutions at once (the moment where V = 0, the
deflection at the real roots of its slope), and the sampled diagrams.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from typing import Any

import numpy as np

from .beam import BeamModel, CaseSolution


@dataclass(frozen=True)
class Extremes:
    """Extreme actions of one solution (SI). Deflection positive downward."""

    M_max: float
    x_M_max: float
    M_min: float
    x_M_min: float
    V_max_abs: float
    x_V_max_abs: float
    deflection_max_abs: float
    x_deflection_max: float
    deflection_by_region: tuple[tuple[str, float, float], ...]


def element_polynomials(model: BeamModel, sol: CaseSolution,
                        EI: float) -> list[dict[str, np.ndarray]]:
    """Per element, polynomial coefficients (numpy order, highest first, local x) of
    V, M and downward deflection.
    """
    out = []
    for e, le in enumerate(model.lengths):
        v1, t1, v2, t2 = sol.u[2 * e : 2 * e + 4]
        q, dq = sol.q[e], sol.dq[e]
        wq, wdq = (a[e] for a in sol.deflection_loads())
        out.append({
            "V": np.array([dq / 2, q, sol.V0[e]]),
            "M": np.array([dq / 6, q / 2, sol.V0[e], sol.M0[e]]),
            "w": -w_up_coefficients(v1, t1, v2, t2, wq, wdq, le) / EI,
        })
    return out


def w_up_coefficients(v1: Any, t1: Any, v2: Any, t2: Any, q: Any, dq: Any,
                       le: Any, scalar_powers: bool = False) -> np.ndarray:
    """Upward deflection times EI in local x, coefficients highest power (x^5) first,
    on the last axis: Hermite cubic plus the clamped particular solutions
    q x^2 (L - x)^2 / 24 and dq (x^5 / 120 - L^2 x^3 / 40 + L^3 x^2 / 60).
    ``scalar_powers``: le^2 and le^3 of arrays taken as a scalar's ``**`` takes them
    (``float_power``; numpy squares arrays by multiplying, which can differ in the last
    bit), for the same numbers as element-by-element evaluation.
    """
    l2, l3 = ((np.float_power(le, 2), np.float_power(le, 3)) if scalar_powers
              else (le**2, le**3))
    a2 = (3 * (v2 - v1) / le - 2 * t1 - t2) / le
    a3 = (2 * (v1 - v2) / le + t1 + t2) / l2
    p = q / 24
    columns = (dq / 120, p + 0 * dq, a3 - 2 * le * p - dq * l2 / 40,
               a2 + le * le * p + dq * l3 / 60, t1 + 0 * q, v1 + 0 * q)
    out = np.empty((*np.broadcast_shapes(*(np.shape(c) for c in columns)), 6))
    for j, c in enumerate(columns):  # the columns side by side, as numpy's stack puts them
        out[..., j] = c
    return out


def _real_roots_batched(coeffs: np.ndarray, le: np.ndarray) -> np.ndarray:
    """Real roots inside (0, le) of per-row polynomials (n, d + 1), highest power first.

    Returns (n, d) local positions, NaN where there is no root. Each row is scaled to
    t = x / le and normalised, so negligible leading terms are treated as zero; rows are
    grouped by their true degree and solved by the eigenvalues of companion matrices.
    """
    n, d1 = coeffs.shape
    d = d1 - 1
    out = np.full((n, d), np.nan)
    scaled = coeffs * le[:, None] ** np.arange(d, -1, -1)
    big = np.abs(scaled).max(axis=1)
    ok = np.isfinite(big) & (big > 0)
    scaled = np.where(ok[:, None], scaled / np.where(ok, big, 1.0)[:, None], 0.0)
    scaled = np.where(np.abs(scaled) < 1e-12, 0.0, scaled)
    nonzero = scaled != 0
    lead = np.where(nonzero.any(axis=1), np.argmax(nonzero, axis=1), d1)
    degree = d - lead
    for deg in sorted({g for g in degree[ok].tolist() if g >= 1}):  # the degrees present
        k = np.flatnonzero(ok & (degree == deg))
        c = scaled[k, d - deg:]
        if deg == 1:
            roots = (-c[:, 1] / c[:, 0])[:, None].astype(complex)
        else:
            comp = np.zeros((k.size, deg, deg))
            comp[:, 0, :] = -c[:, 1:] / c[:, :1]
            comp[:, np.arange(1, deg), np.arange(deg - 1)] = 1.0
            roots = np.linalg.eigvals(comp)
        real = (np.abs(roots.imag) < 1e-9) & (roots.real > 0) & (roots.real < 1)
        out[k, :deg] = np.where(real, roots.real, np.nan)
    return np.asarray(out * le[:, None])


def extremes(model: BeamModel, sol: CaseSolution, EI: float) -> Extremes:
    """True extrema of M, |V| and deflection, found from each element's polynomials."""
    return extremes_many(model, [sol], [EI])[0]


def extremes_many(model: BeamModel, sols: Sequence[CaseSolution],
                  EIs: Sequence[float] | np.ndarray,
                  elements: tuple[int, int] | None = None) -> list[Extremes]:
    """Extremes of many solutions on one mesh at once (vectorised over solutions and
    elements): moment at element ends and where V = 0, |V| at element ends, deflection
    at element ends and at the real roots of its derivative inside each element.
    ``elements`` (first, last + 1) limits the search to those elements (a segment).
    """
    e0, e1 = (0, model.lengths.size) if elements is None else elements
    distinct, stiffness, back = _distinct(sols, EIs)
    ext = _reduce(model, _element_values(model, distinct, stiffness, e0, e1, [(e0, e1)]),
                  e0, e1)
    return ext if back is None else [ext[i] for i in back]


def extremes_within(model: BeamModel, sols: Sequence[CaseSolution],
                    EIs: Sequence[float] | np.ndarray,
                    ranges: Sequence[tuple[int, int]]) -> list[list[Extremes]]:
    """:func:`extremes_many` of the whole member and of each range of elements (first,
    last + 1), from one pass over the elements (each element's candidates are its own).
    """
    n = model.lengths.size
    distinct, stiffness, back = _distinct(sols, EIs)
    values = _element_values(model, distinct, stiffness, 0, n, [(0, n), *ranges])
    out = [_reduce(model, values, 0, n)] + [_reduce(model, values.part(a, b), a, b)
                                            for a, b in ranges]
    return out if back is None else [[ext[i] for i in back] for ext in out]


def _distinct(sols: Sequence[CaseSolution], EIs: Sequence[float] | np.ndarray
              ) -> tuple[Sequence[CaseSolution], Sequence[float] | np.ndarray, list[int] | None]:
    """The distinct (solution, EI) pairs of a batch, by their numbers (a batch asks for
    the same numbers several times: a combination of one case, a total without creep),
    and the distinct pair each asked one is (None where all are distinct). Every
    solution's extremes are found from its own numbers alone, so the same numbers have
    the same extremes.
    """
    stiffness = np.asarray(EIs, dtype=float).reshape(-1).tolist()
    seen: dict[tuple[bytes, int, int, bool, str], int] = {}
    back = [seen.setdefault((s.data.tobytes(), s._e, s._s, s._w, ei.hex()), len(seen))
            for s, ei in zip(sols, stiffness, strict=True)]
    if len(seen) == len(back):
        return sols, EIs, None
    first = [back.index(j) for j in range(len(seen))]
    return [sols[i] for i in first], [stiffness[i] for i in first], back


@dataclass(frozen=True, eq=False)
class _ElementValues:
    """Every solution's candidate extremes in each element (shape (solutions, elements,
    stations)): moments at ``xm`` (valid where ``ok``), |V| at ``xv`` (-1: not a
    candidate), deflections ``w`` at ``xw`` (local positions; ``x0`` the elements' starts).
    """

    x0: np.ndarray
    xm: np.ndarray
    ok: np.ndarray
    m: np.ndarray
    xv: np.ndarray
    v: np.ndarray
    w: np.ndarray
    xw: np.ndarray

    def part(self, a: int, b: int) -> _ElementValues:
        """The values of elements a to b - 1 (of those held)."""
        return _ElementValues(self.x0[a:b], *(arr[:, a:b] for arr in (
            self.xm, self.ok, self.m, self.xv, self.v, self.w, self.xw)))


def _groups(model: BeamModel, e0: int, e1: int,
            ranges: Sequence[tuple[int, int]]) -> np.ndarray:
    """A label for every element of e0 to e1: the same for the elements that share every
    search made over them (each range of elements, and each region within it), so that
    the smallest set of elements any search of an element covers is its label's.
    """
    names = {n_: r for r, (n_, _, _) in enumerate(model.layout.regions())}
    keys = []
    for e in range(e0, e1):
        inside = tuple(k for k, (a, b) in enumerate(ranges) if a <= e < b)
        keys.append((inside, names.get(model.element_regions[e], -1)))
    labels: dict[tuple[tuple[int, ...], int], int] = {}
    return np.array([labels.setdefault(k, len(labels)) for k in keys], dtype=int)


def _needs_roots(w_c: np.ndarray, le: np.ndarray, groups: np.ndarray) -> np.ndarray:
    """Where an element's deflection can be largest inside it: (solutions, elements).

    |w(x)| on the element is at most the sum of |c_j| le^j (its coefficients); where that
    bound (with a margin far above rounding) is below the largest |w| at the element ends
    of its group (the elements every search of this one covers), no point inside it can
    be the largest of any search, and its roots need not be found. Elsewhere (and where
    the numbers are not finite) they are.
    """
    k, n = w_c.shape[0], w_c.shape[1]
    powers = le[:, None] ** np.arange(5, -1, -1)
    bound = (np.abs(w_c) * powers).sum(axis=-1) * (1 + 1e-6)
    ends = np.zeros((k, n, 2))
    x = np.stack([np.zeros(n), le], axis=-1)
    for j in range(6):
        ends = ends * x + w_c[..., j : j + 1]
    end_max = np.abs(ends).max(axis=-1)
    top = np.zeros((k, n))
    for g in range(int(groups.max()) + 1 if groups.size else 0):  # labels 0, 1, ...
        members = groups == g
        top[:, members] = end_max[:, members].max(axis=1, keepdims=True)
    return np.asarray(~(bound < top))


def _element_values(model: BeamModel, sols: Sequence[CaseSolution],
                    EIs: Sequence[float] | np.ndarray, e0: int, e1: int,
                    searches: Sequence[tuple[int, int]] | None = None) -> _ElementValues:
    """Every element's candidates; ``searches``: the ranges of elements whose extremes
    will be sought (each with its regions), which lets the deflection roots be left out
    where no search can find its largest deflection (None: every root is sought).
    """
    le = model.lengths[e0:e1]
    x0 = model.nodes[e0:e1]
    k, n = len(sols), le.size
    V0, M0, q, dq, wq, wdq, U = _stacked(sols, e0, e1)
    EI = np.asarray(EIs, dtype=float).reshape(k, 1)
    le_k = np.tile(le, k)
    v1, t1, v2, t2 = U[:, 0:-2:2], U[:, 1:-2:2], U[:, 2::2], U[:, 3::2]
    w_c = -w_up_coefficients(v1, t1, v2, t2, wq, wdq, le) / EI[..., None]
    dw = w_c[..., :5] * np.array([5.0, 4.0, 3.0, 2.0, 1.0])
    # the roots of V = V0 + q x + dq x^2 / 2 (moment) and of the deflection's derivative
    # inside each element, in one search (V's rows led by zeros: the same degree)
    need = (None if searches is None or k * n < 64  # else only where the largest
            else _needs_roots(w_c, le, _groups(model, e0, e1, searches)).reshape(k * n))
    v_rows = np.concatenate([np.zeros((k * n, 2)),
                             np.stack([dq / 2, q, V0], axis=-1).reshape(k * n, 3)], axis=1)
    w_rows = dw.reshape(k * n, 5)
    found = _real_roots_batched(
        np.concatenate([v_rows, w_rows if need is None else w_rows[need]]),
        np.concatenate([le_k, le_k if need is None else le_k[need]]))
    v_roots = found[: k * n, :2].reshape(k, n, 2)
    if need is None:
        roots = found[k * n :].reshape(k, n, 4)
    else:  # deflection roots only where the largest deflection of a search can be inside
        flat = np.full((k * n, 4), np.nan)
        flat[need] = found[k * n :]
        roots = flat.reshape(k, n, 4)
    # moment: element ends and where V = 0 inside the element (roots are finite or NaN,
    # so NaN -> 0 is numpy's nan_to_num of them)
    no_root = np.isnan(v_roots)
    xm = _ends_and(le, np.where(no_root, 0.0, v_roots))
    ok = np.ones((k, n, 4), dtype=bool)
    ok[..., 2:] = ~no_root
    m = (M0[..., None] + V0[..., None] * xm + q[..., None] * xm**2 / 2
         + dq[..., None] * xm**3 / 6)
    # |V|: element ends and where dV/dx = q + dq x = 0
    with np.errstate(divide="ignore", invalid="ignore"):
        xv_in = np.where(dq != 0, -q / dq, np.nan)
    inside = (xv_in > 0) & (xv_in < le)
    xv_loc = _ends_and(le, np.where(inside, xv_in, 0.0)[..., None])
    v_all = V0[..., None] + q[..., None] * xv_loc + dq[..., None] * xv_loc**2 / 2
    candidate = np.ones((k, n, 3), dtype=bool)
    candidate[..., 2] = inside
    v = np.where(candidate, np.abs(v_all), -1.0)
    no_root = np.isnan(roots)
    xw_safe = _ends_and(le, np.where(no_root, 0.0, roots))
    w = np.zeros_like(xw_safe)
    for j in range(6):
        w = w * xw_safe + w_c[..., j : j + 1]
    w[..., 2:] = np.where(no_root, 0.0, w[..., 2:])
    return _ElementValues(x0, xm, ok, m, xv_loc, v, w, xw_safe)


def _ends_and(le: np.ndarray, inner: np.ndarray) -> np.ndarray:
    """Local stations (solutions, elements, 2 + inner): 0, the element's length, then
    ``inner``.
    """
    out = np.empty((*inner.shape[:-1], inner.shape[-1] + 2))
    out[..., 0] = 0.0
    out[..., 1] = le
    out[..., 2:] = inner
    return out


def _reduce(model: BeamModel, values: _ElementValues, e0: int, e1: int) -> list[Extremes]:
    """The extremes of every solution over the elements ``values`` holds (e0 to e1)."""
    x0, xm, m, xv_loc = values.x0, values.xm, values.m, values.xv
    k = m.shape[0]
    i_max = np.argmax(np.where(values.ok, m, -np.inf).reshape(k, -1), axis=1)
    i_min = np.argmin(np.where(values.ok, m, np.inf).reshape(k, -1), axis=1)
    v = values.v.reshape(k, -1)
    i_v = np.argmax(v, axis=1)
    w = values.w
    aw = np.abs(w)
    i_w = np.argmax(aw.reshape(k, -1), axis=1)
    pos_w = x0[None, :, None] + values.xw
    by_region = _by_region(model, e0, e1, aw, w, pos_w)
    out = []
    xm_flat = (x0[None, :, None] + xm).reshape(k, -1)
    xv_flat = (x0[None, :, None] + xv_loc).reshape(k, -1)
    m_hi = np.take_along_axis(m.reshape(k, -1), i_max[:, None], axis=1)[:, 0].tolist()
    m_lo = np.take_along_axis(m.reshape(k, -1), i_min[:, None], axis=1)[:, 0].tolist()
    rows = np.arange(k)  # each solution's value at its own index, all at once
    x_hi, x_lo = xm_flat[rows, i_max].tolist(), xm_flat[rows, i_min].tolist()
    v_top, x_v = v[rows, i_v].tolist(), xv_flat[rows, i_v].tolist()
    w_top = aw.reshape(k, -1)[rows, i_w].tolist()
    x_w = pos_w.reshape(k, -1)[rows, i_w].tolist()
    for c in range(k):
        m_max, m_min = m_hi[c], m_lo[c]
        scale = max(abs(m_max), abs(m_min), 1e-300)
        if abs(m_max) < 1e-9 * scale:
            m_max = 0.0
        if abs(m_min) < 1e-9 * scale:
            m_min = 0.0
        out.append(Extremes(
            M_max=m_max, x_M_max=x_hi[c], M_min=m_min, x_M_min=x_lo[c],
            V_max_abs=v_top[c], x_V_max_abs=x_v[c],
            deflection_max_abs=w_top[c], x_deflection_max=x_w[c],
            deflection_by_region=by_region[c]))
    return out


def _stacked(sols: Sequence[CaseSolution], e0: int, e1: int) -> tuple[np.ndarray, ...]:
    """V0, M0, q, dq, wq, wdq (elements e0 to e1) and u (their nodes) of every solution,
    one row each: one stack of the solutions' numbers where they share a layout.
    """
    first = sols[0]
    e, w = first._e, first._w
    if all(s._e == e and s._s == first._s and s._w == w for s in sols):
        D = np.stack([s.data for s in sols])
        k = (6 if w else 4) * e

        def cut(a: int, b: int) -> np.ndarray:
            return np.ascontiguousarray(D[:, a:b])
        V0, M0, q, dq = (cut(j * e + e0, j * e + e1) for j in range(4))
        wq, wdq = (cut(4 * e + e0, 4 * e + e1), cut(5 * e + e0, 5 * e + e1)) if w else (q, dq)
        return V0, M0, q, dq, wq, wdq, cut(k + 2 * e0, k + 2 * e1 + 2)
    return (np.stack([s.V0[e0:e1] for s in sols]), np.stack([s.M0[e0:e1] for s in sols]),
            np.stack([s.q[e0:e1] for s in sols]), np.stack([s.dq[e0:e1] for s in sols]),
            np.stack([s.deflection_loads()[0][e0:e1] for s in sols]),
            np.stack([s.deflection_loads()[1][e0:e1] for s in sols]),
            np.stack([s.u[2 * e0 : 2 * e1 + 2] for s in sols]))


def _by_region(model: BeamModel, e0: int, e1: int, aw: np.ndarray, w: np.ndarray,
               pos_w: np.ndarray) -> list[tuple[tuple[str, float, float], ...]]:
    """Per solution, (region, deflection, x) where |deflection| is largest in each region
    (span, overhang) holding elements ``e0`` to ``e1``: the first of the largest in the
    order of the elements and their stations, as one search over the region would find.

    ``aw``, ``w`` and ``pos_w`` have shape (solutions, elements, stations). The elements
    of a region are gathered once; each region's search covers only its own elements, so
    the work grows with the elements, not with elements times regions.
    """
    k = aw.shape[0]
    names = [n_ for n_, _, _ in model.layout.regions()]
    members: dict[int, list[int]] = {}
    for e, region in enumerate(model.element_regions[e0:e1]):
        if region in names:
            members.setdefault(names.index(region), []).append(e)
    every = np.arange(k)
    found = sorted(members)
    worst = np.empty((2, len(found), k))  # the deflection and its x, region by region
    for i, r in enumerate(found):
        els = np.array(members[r], dtype=int)
        a_r = aw[:, els].reshape(k, -1)
        j = np.argmax(a_r, axis=1)
        worst[0, i] = w[:, els].reshape(k, -1)[every, j]
        worst[1, i] = pos_w[:, els].reshape(k, -1)[every, j]
    labels = [names[r] for r in found]
    return [tuple(zip(labels, w_c, x_c, strict=True))
            for w_c, x_c in zip(worst[0].T.tolist(), worst[1].T.tolist(), strict=True)]


@dataclass(frozen=True, eq=False)
class Diagram:
    """Shear, moment and downward deflection sampled along the member (SI).

    Stations include every node from both sides (shear jumps at point loads) and the
    element extrema of moment and deflection.
    """

    x: np.ndarray
    V: np.ndarray
    M: np.ndarray
    deflection: np.ndarray


def diagram(model: BeamModel, sol: CaseSolution, EI: float, per_element: int = 24) -> Diagram:
    """Sample V, M and deflection along the member (load-aware stations)."""
    polys = element_polynomials(model, sol, EI)
    xs, vs, ms, ws = [], [], [], []
    for e, le in enumerate(model.lengths):
        P = polys[e]
        local = list(np.linspace(0.0, le, per_element + 1))
        local.extend(_roots_inside(np.polyder(P["M"]), le))
        local.extend(_roots_inside(np.polyder(P["w"]), le))
        loc = np.array(sorted(local))
        xs.append(model.nodes[e] + loc)
        vs.append(np.polyval(P["V"], loc))
        ms.append(np.polyval(P["M"], loc))
        ws.append(np.polyval(P["w"], loc))
    return Diagram(np.concatenate(xs), np.concatenate(vs), np.concatenate(ms), np.concatenate(ws))


def _roots_inside(poly: np.ndarray, le: float) -> list[float]:
    """Real roots of a polynomial in local x strictly inside (0, le).

    Coefficients are compared on the element's scale (c_k le^k) so that negligible
    leading terms do not produce spurious huge roots.
    """
    poly = np.asarray(poly, dtype=float)
    n = poly.size - 1
    scaled = poly * le ** np.arange(n, -1, -1)
    big = np.abs(scaled).max() if scaled.size else 0.0
    if not np.isfinite(big) or big == 0.0:
        return []
    scaled = np.where(np.abs(scaled) < 1e-12 * big, 0.0, scaled / big)
    scaled = np.trim_zeros(scaled, "f")
    if scaled.size < 2:
        return []
    out = []
    for r in np.roots(scaled):
        if abs(r.imag) < 1e-9 and 0 < r.real < 1:
            out.append(float(r.real) * le)
    return out
