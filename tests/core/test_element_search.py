"""The element search of the beam's extremes (``actions.beam._element_values``: the
roots of V and of the deflection's derivative found in one batched search, over the
degrees present) and its reduction (``_reduce``: each solution's values at its indices
taken at once) against both as they were first written, kept here whole as the plain
reference (two searches, every degree tried; the values taken one by one): every
candidate array and every extreme equal bit for bit, on the batches the pipeline asks
for the demos and for several spans with pattern loading, point loads and a plate
stopping short, with and without the pruning of the deflection roots, and on random
polynomials of every degree. Regression guard.
"""

from __future__ import annotations

from collections.abc import Iterator, Sequence
from pathlib import Path
from typing import Any

import numpy as np
import pytest

from plystack.core import pipeline
from plystack.core.actions import analysis as an
from plystack.core.actions import extremes as ex
from plystack.core.actions.beam import BeamModel, CaseSolution
from plystack.core.actions.extremes import Extremes, _ElementValues, _groups, _needs_roots, _stacked
from plystack.core.model.project import Project

from .demo_variants import span_variants

DEMOS = Path(__file__).resolve().parents[2] / "assets" / "demo"


def _w_up_plain(v1: Any, t1: Any, v2: Any, t2: Any, q: Any, dq: Any,
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
    return np.stack(np.broadcast_arrays(
        dq / 120, p + 0 * dq, a3 - 2 * le * p - dq * l2 / 40,
        a2 + le * le * p + dq * l3 / 60, t1 + 0 * q, v1 + 0 * q), axis=-1)


def _real_roots_plain(coeffs: np.ndarray, le: np.ndarray) -> np.ndarray:
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
    for deg in range(1, d + 1):
        k = np.flatnonzero(ok & (degree == deg))
        if k.size == 0:
            continue
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


def _element_values_plain(model: BeamModel, sols: Sequence[CaseSolution],
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
    # moment: element ends and the roots of V = V0 + q x + dq x^2 / 2 inside the element
    v_roots = _real_roots_plain(
        np.stack([dq / 2, q, V0], axis=-1).reshape(k * n, 3), le_k).reshape(k, n, 2)
    xm = np.concatenate([np.zeros((k, n, 1)), np.broadcast_to(le[:, None], (k, n, 1)),
                         np.nan_to_num(v_roots)], axis=-1)
    ok = np.concatenate([np.ones((k, n, 2), dtype=bool), ~np.isnan(v_roots)], axis=-1)
    m = (M0[..., None] + V0[..., None] * xm + q[..., None] * xm**2 / 2
         + dq[..., None] * xm**3 / 6)
    # |V|: element ends and where dV/dx = q + dq x = 0
    with np.errstate(divide="ignore", invalid="ignore"):
        xv_in = np.where(dq != 0, -q / dq, np.nan)
    inside = (xv_in > 0) & (xv_in < le)
    xv_loc = np.stack([np.zeros((k, n)), np.broadcast_to(le, (k, n)),
                       np.where(inside, xv_in, 0.0)], axis=-1)
    v_all = V0[..., None] + q[..., None] * xv_loc + dq[..., None] * xv_loc**2 / 2
    v = np.where(np.concatenate([np.ones((k, n, 2), dtype=bool), inside[..., None]],
                                axis=-1), np.abs(v_all), -1.0)
    v1, t1, v2, t2 = U[:, 0:-2:2], U[:, 1:-2:2], U[:, 2::2], U[:, 3::2]
    w_c = -_w_up_plain(v1, t1, v2, t2, wq, wdq, le) / EI[..., None]
    dw = w_c[..., :5] * np.array([5.0, 4.0, 3.0, 2.0, 1.0])
    if searches is None or k * n < 64:
        roots = _real_roots_plain(dw.reshape(k * n, 5), le_k).reshape(k, n, 4)
    else:  # the roots only where the largest deflection of a search can be inside
        need = _needs_roots(w_c, le, _groups(model, e0, e1, searches)).reshape(k * n)
        flat = np.full((k * n, 4), np.nan)
        if need.any():
            flat[need] = _real_roots_plain(dw.reshape(k * n, 5)[need], le_k[need])
        roots = flat.reshape(k, n, 4)
    xw = np.concatenate([np.zeros((k, n, 1)), np.broadcast_to(le[:, None], (k, n, 1)),
                         roots], axis=-1)
    xw_safe = np.nan_to_num(xw)
    w = np.zeros_like(xw_safe)
    for j in range(6):
        w = w * xw_safe + w_c[..., j : j + 1]
    w = np.where(np.isnan(xw), 0.0, w)
    return _ElementValues(x0, xm, ok, m, xv_loc, v, w, xw_safe)


def _reduce_plain(model: BeamModel, values: _ElementValues, e0: int, e1: int) -> list[Extremes]:
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
    by_region = ex._by_region(model, e0, e1, aw, w, pos_w)
    out = []
    xm_flat = (x0[None, :, None] + xm).reshape(k, -1)
    xv_flat = (x0[None, :, None] + xv_loc).reshape(k, -1)
    m_hi = np.take_along_axis(m.reshape(k, -1), i_max[:, None], axis=1)[:, 0].tolist()
    m_lo = np.take_along_axis(m.reshape(k, -1), i_min[:, None], axis=1)[:, 0].tolist()
    for c in range(k):
        m_max, m_min = m_hi[c], m_lo[c]
        scale = max(abs(m_max), abs(m_min), 1e-300)
        if abs(m_max) < 1e-9 * scale:
            m_max = 0.0
        if abs(m_min) < 1e-9 * scale:
            m_min = 0.0
        out.append(Extremes(
            M_max=m_max, x_M_max=float(xm_flat[c, i_max[c]]),
            M_min=m_min, x_M_min=float(xm_flat[c, i_min[c]]),
            V_max_abs=float(v[c, i_v[c]]), x_V_max_abs=float(xv_flat[c, i_v[c]]),
            deflection_max_abs=float(aw[c].reshape(-1)[i_w[c]]),
            x_deflection_max=float(pos_w[c].reshape(-1)[i_w[c]]),
            deflection_by_region=by_region[c]))
    return out


def _projects() -> Iterator[tuple[str, Project]]:
    return span_variants((1, 2, 3, 4), varying_line=True)


FIELDS = ("x0", "xm", "ok", "m", "xv", "v", "w", "xw")


def _same(a: _ElementValues, b: _ElementValues) -> None:
    for name in FIELDS:
        x, y = np.asarray(getattr(a, name)), np.asarray(getattr(b, name))
        assert x.shape == y.shape and x.dtype == y.dtype, name
        assert x.tobytes() == y.tobytes(), name


@pytest.mark.parametrize("name_project", list(_projects()), ids=lambda np_: np_[0])
def test_element_search_equals_the_plain_one(name_project: tuple[str, Project]) -> None:
    project = name_project[1]
    ev = pipeline.Evaluator(project)
    assert ev.beam is not None
    batch = an._Batch()
    an._ask_section(ev.beam, ev.section(project.plies), ev.design, batch, defer=True)
    model, sols, EIs = ev.beam.model, batch.solutions, batch.stiffness
    n = model.lengths.size
    for searches in (None, [(0, n)], [(0, n), (0, max(n // 2, 1)), (max(n // 2, 1), n)]):
        for rows in (sols, sols * 8):  # past 64 rows x elements the pruning is on
            stiff = list(EIs) * (len(rows) // len(sols))
            _same(ex._element_values(model, rows, stiff, 0, n, searches),
                  _element_values_plain(model, rows, stiff, 0, n, searches))
    if n > 1:
        _same(ex._element_values(model, sols, EIs, 1, n, [(1, n)]),
              _element_values_plain(model, sols, EIs, 1, n, [(1, n)]))
    every = ex._element_values(model, sols, EIs, 0, n, [(0, n)])
    assert repr(ex._reduce(model, every, 0, n)) == repr(_reduce_plain(model, every, 0, n))
    for a, b in ((0, max(n // 2, 1)), (max(n // 2, 1), n), (n - 1, n)):
        if a < b:
            part = every.part(a, b)
            assert repr(ex._reduce(model, part, a, b)) == repr(_reduce_plain(model, part, a, b))


@pytest.mark.parametrize("seed", range(4))
def test_roots_of_every_degree_equal_the_plain_search(seed: int) -> None:
    rng = np.random.default_rng(seed)
    rows = rng.normal(0, 1, (400, 5)) * 10.0 ** rng.integers(-6, 6, (400, 5))
    rows[rng.random((400, 5)) < 0.3] = 0.0  # every degree, zero rows too
    rows[:20, :3] = 1e-14 * rows[:20, :3]  # negligible leading terms
    le = rng.uniform(0.01, 5.0, 400)
    assert ex._real_roots_batched(rows, le).tobytes() == _real_roots_plain(rows, le).tobytes()
    three = rows[:, 2:]
    padded = np.concatenate([np.zeros((400, 2)), three], axis=1)
    assert (ex._real_roots_batched(padded, le)[:, :2].tobytes()
            == _real_roots_plain(three, le).tobytes())


def test_deflection_coefficients_equal_the_plain_stack() -> None:
    rng = np.random.default_rng(7)
    for shape in ((), (7,), (5, 3)):
        args = [rng.normal(0, 1, shape) * 10.0 ** rng.integers(-6, 6, shape)
                for _ in range(6)]
        le = rng.uniform(0.01, 4.0, shape[-1:] if shape else ())
        if shape:  # signed zeros: -0.0 + 0 * dq keeps the sign only where dq < 0
            args[4][..., ::2] = -0.0
            args[0][..., ::3] = -0.0
        for powers in (False, True):
            got = ex.w_up_coefficients(*args, le, scalar_powers=powers)
            plain = _w_up_plain(*args, le, scalar_powers=powers)
            assert got.shape == plain.shape and got.tobytes() == plain.tobytes()
    floats = [float(v) for v in rng.normal(0, 1, 7)]
    assert (ex.w_up_coefficients(*floats).tobytes() == _w_up_plain(*floats).tobytes())
