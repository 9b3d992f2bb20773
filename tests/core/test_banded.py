"""The banded Cholesky solve of actions.banded against numpy.linalg.solve (LAPACK's
dense LU with partial pivoting), on beam stiffness matrices and on random banded
symmetric positive definite matrices."""

from __future__ import annotations

import numpy as np
import pytest

from plystack.core.actions.banded import cholesky_band, solve_banded_spd
from plystack.core.actions.beam import BeamModel
from plystack.core.model.member import BeamLayout, Load


def _random_band(n: int, w: int, seed: int) -> np.ndarray:
    rng = np.random.default_rng(seed)
    a = np.zeros((n, n))
    for k in range(1, min(w, n - 1) + 1):
        d = rng.uniform(-1.0, 1.0, n - k)
        a += np.diag(d, -k) + np.diag(d, k)
    # strictly diagonally dominant with a positive diagonal: positive definite
    a += np.diag(np.abs(a).sum(axis=1) + rng.uniform(0.5, 2.0, n))
    return a


@pytest.mark.parametrize(("n", "w", "seed"), [(1, 3, 0), (2, 3, 1), (4, 3, 2), (9, 3, 3),
                                             (40, 3, 4), (25, 1, 5), (30, 5, 6)])
def test_random_banded_matches_dense_solve(n: int, w: int, seed: int) -> None:
    a = _random_band(n, w, seed)
    b = np.random.default_rng(seed + 100).normal(size=n)
    x = solve_banded_spd(a, b, w)
    assert np.allclose(x, np.linalg.solve(a, b), rtol=1e-12, atol=1e-14)
    assert np.allclose(a @ x, b, rtol=1e-12, atol=1e-13)


def test_factor_reproduces_the_matrix() -> None:
    a = _random_band(12, 3, 7)
    diagonals = [np.diagonal(a, -k).tolist() for k in range(4)]
    rows = cholesky_band(diagonals, 12, 3)
    lower = np.zeros((12, 12))
    for i, row in enumerate(rows):
        for m, value in enumerate(row):
            if i - 3 + m >= 0:
                lower[i, i - 3 + m] = value
            else:
                assert value == 0.0
    assert np.allclose(lower @ lower.T, a, rtol=1e-13, atol=1e-13)
    assert np.allclose(lower, np.linalg.cholesky(a), rtol=1e-12, atol=1e-13)


def test_not_positive_definite_is_refused() -> None:
    a = np.array([[1.0, 2.0], [2.0, 1.0]])  # eigenvalues 3 and -1
    with pytest.raises(np.linalg.LinAlgError):
        solve_banded_spd(a, np.ones(2), 1)


@pytest.mark.parametrize(("spans", "supports", "overhang"), [
    ((3.0,), "simple", 0.0), ((2.0, 5.0, 0.01), "simple", 0.8), ((4.0,) * 20, "simple", 0.0),
    ((3.0,), "cantilever", 0.0), ((3.0,), "fixed-fixed", 0.0), ((3.0,), "propped", 0.0)])
def test_beam_stiffness_matches_dense_solve(spans: tuple[float, ...], supports: str,
                                            overhang: float) -> None:
    layout = BeamLayout(spans=spans, supports=supports, overhang_left=overhang,
                        overhang_right=overhang / 2)
    L = layout.length
    loads = tuple(Load(case="L", type="point", value=1.0, at=L * (k + 0.37) / 30)
                  for k in range(30))
    model = BeamModel(layout, loads)
    a = model.scaled_free_stiffness()
    assert np.abs(np.tril(a, -4)).max(initial=0.0) == 0.0  # the band the solve assumes
    b = np.linspace(-1.0, 2.0, a.shape[0])
    x = solve_banded_spd(a, b)
    dense = np.linalg.solve(a, b)
    assert np.allclose(x, dense, rtol=1e-9, atol=1e-12 * np.abs(dense).max())
