"""The triangular solves written out for the beam's half bandwidth (``banded._solve_list_3``)
against the loops for any bandwidth (``_solve_list_any``): the same subtractions in the
same order, so the same floats, on random banded positive definite matrices of every
order from 1 to 40 and one of 2,000 (the reference is the general loop; numpy's dense
solve checks that both solve the system).
"""

from __future__ import annotations

import random

import numpy as np
import pytest

from plystack.core.actions import banded


def _band_matrix(rng: random.Random, n: int) -> np.ndarray:
    a = np.zeros((n, n))
    for i in range(n):
        for j in range(max(0, i - 3), i):
            a[i, j] = a[j, i] = rng.uniform(-1.0, 1.0) * 10 ** rng.uniform(-3, 3)
    for i in range(n):
        a[i, i] = np.abs(a[i]).sum() * (1.0 + rng.random()) + 1e-3
    return a


@pytest.mark.parametrize("n", [*range(1, 41), 2000])
def test_written_out_equals_the_loops(n: int) -> None:
    rng = random.Random(n)
    a = _band_matrix(rng, n)
    w = min(3, max(n - 1, 0))
    factor = banded.cholesky_band([np.diagonal(a, -k).tolist() for k in range(w + 1)], n, w)
    for _ in range(3):
        rhs = [rng.uniform(-1e4, 1e4) * (0.0 if rng.random() < 0.1 else 1.0)
               for _ in range(n)]
        plain = banded._solve_list_any(factor, rhs, w)
        assert banded.solve_list(factor, rhs, w) == plain
        assert [repr(v) for v in banded.solve_list(factor, rhs, w)] == [repr(v) for v in plain]
        if n <= 200:
            np.testing.assert_allclose(a @ np.array(plain), rhs, rtol=1e-9,
                                       atol=1e-9 * max(map(abs, rhs), default=1.0))


@pytest.mark.parametrize("n", [*range(1, 41), 2000])
def test_the_written_out_factor_equals_the_loops(n: int) -> None:
    rng = random.Random(1000 + n)
    a = _band_matrix(rng, n)
    w = min(3, max(n - 1, 0))
    diagonals = [np.diagonal(a, -k).tolist() for k in range(w + 1)]
    plain = banded._cholesky_band_any(diagonals, n, w)
    quick = banded.cholesky_band(diagonals, n, w)
    assert [[repr(v) for v in r] for r in quick] == [[repr(v) for v in r] for r in plain]


@pytest.mark.parametrize("bad", [0, 2, 3, 9, 39])
def test_a_matrix_that_is_not_positive_definite_is_refused_alike(bad: int) -> None:
    rng = random.Random(bad)
    a = _band_matrix(rng, 40)
    a[bad, bad] = -1.0
    diagonals = [np.diagonal(a, -k).tolist() for k in range(4)]
    for factor in (banded.cholesky_band, banded._cholesky_band_any):
        with pytest.raises(np.linalg.LinAlgError):
            factor(diagonals, 40, 3)
