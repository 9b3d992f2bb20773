"""A banded symmetric positive definite solve (Cholesky factor kept inside the band).

The stiffness matrix of a beam of two-node elements with two degrees of freedom per
node couples a degree of freedom only with those of its own and the neighbouring
nodes, so every entry more than three places off the diagonal is zero (also after the
rows and columns of supported degrees of freedom are removed). The Cholesky factor of
such a matrix has the same band (no fill-in outside it), so the solve costs about
n w^2 operations instead of the n^3 / 3 of a dense factorisation: the work grows
linearly with the number of elements. No pivoting is needed for a positive definite
matrix.
"""

from __future__ import annotations

import math

import numpy as np

#: Half bandwidth of the beam's stiffness matrix: (v, theta) of one node couple with the
#: (v, theta) of the next node, so entries (i, j) with |i - j| > 3 are zero.
BEAM_HALF_BANDWIDTH = 3


def cholesky_band(diagonals: list[list[float]], n: int, w: int) -> list[list[float]]:
    """The lower Cholesky factor of a banded symmetric positive definite matrix.

    Args:
        diagonals: ``diagonals[k][j]`` is the entry (j + k, j), k = 0..w.
        n: the order of the matrix.
        w: its half bandwidth.

    Returns:
        Rows of the factor: ``rows[i][j - max(0, i - w)]`` is L[i, j] for the columns
        j = max(0, i - w) .. i.

    Raises:
        numpy.linalg.LinAlgError: the matrix is not positive definite (a pivot is not
            greater than zero).

    """
    rows: list[list[float]] = []
    for i in range(n):
        j0 = max(0, i - w)
        row = [0.0] * (i - j0 + 1)
        for j in range(j0, i + 1):
            s = diagonals[i - j][j]
            other = rows[j] if j < i else row
            k0 = max(0, j - w)
            for m in range(max(j0, k0), j):
                s -= row[m - j0] * other[m - k0]
            if j < i:
                row[j - j0] = s / other[j - k0]
            elif s > 0.0 and math.isfinite(s):
                row[i - j0] = math.sqrt(s)
            else:
                raise np.linalg.LinAlgError("matrix is not positive definite")
        rows.append(row)
    return rows


def solve_banded_spd(a: np.ndarray, b: np.ndarray,
                     half_bandwidth: int = BEAM_HALF_BANDWIDTH) -> np.ndarray:
    """Solve a x = b for a symmetric positive definite matrix with the given band.

    Only the lower band of ``a`` (entries (i, j) with 0 <= i - j <= half_bandwidth) is
    read; the caller guarantees that every other entry is zero.

    Args:
        a: the (n, n) matrix.
        b: the (n,) right-hand side.
        half_bandwidth: largest |i - j| of a non-zero entry.

    Returns:
        x, shape (n,).

    """
    n = a.shape[0]
    w = min(half_bandwidth, max(n - 1, 0))
    diagonals = [np.diagonal(a, -k).tolist() for k in range(w + 1)]
    rows = cholesky_band(diagonals, n, w)
    rhs = np.asarray(b, dtype=float).tolist()
    y = [0.0] * n
    for i in range(n):  # L y = b
        j0 = max(0, i - w)
        row = rows[i]
        s = rhs[i]
        for m in range(j0, i):
            s -= row[m - j0] * y[m]
        y[i] = s / row[i - j0]
    x = [0.0] * n
    for i in range(n - 1, -1, -1):  # L^T x = y
        s = y[i]
        for m in range(i + 1, min(n, i + w + 1)):
            s -= rows[m][i - max(0, m - w)] * x[m]
        x[i] = s / rows[i][i - max(0, i - w)]
    return np.array(x, dtype=float)
