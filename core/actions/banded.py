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
        Rows of the factor: ``rows[i][m]`` is L[i, i - w + m], m = 0..w (zero where the
        column would be negative).

    Raises:
        numpy.linalg.LinAlgError: the matrix is not positive definite (a pivot is not
            greater than zero).

    """
    if w == BEAM_HALF_BANDWIDTH and n > w:
        return _cholesky_band_3(diagonals, n)
    return _cholesky_band_any(diagonals, n, w)


def _cholesky_band_3(diagonals: list[list[float]], n: int) -> list[list[float]]:
    """:func:`_cholesky_band_any` for the beam's half bandwidth 3, the inner loops of the
    rows wholly inside the band written out: the same operations in the same order. The
    three rows before each one are carried along (no indexing into the rows made).
    """
    rows = _cholesky_band_any(diagonals, 3, 3)  # the first rows start inside the band
    d0, d1, d2, d3 = diagonals
    append = rows.append
    a, b, c = rows
    for e3, e2, e1, e0 in zip(d3, d2[1:], d1[2:], d0[3:n], strict=True):  # the entries of row i
        l0 = e3 / a[3]
        s = e2
        s -= l0 * b[2]
        l1 = s / b[3]
        s = e1
        s -= l0 * c[1]
        s -= l1 * c[2]
        l2 = s / c[3]
        s = e0
        s -= l0 * l0
        s -= l1 * l1
        s -= l2 * l2
        if not (s > 0.0 and math.isfinite(s)):
            raise np.linalg.LinAlgError("matrix is not positive definite")
        a, b, c = b, c, [l0, l1, l2, math.sqrt(s)]
        append(c)
    return rows


def _cholesky_band_any(diagonals: list[list[float]], n: int, w: int) -> list[list[float]]:
    """The factor of any half bandwidth ``w`` (see :func:`cholesky_band`)."""
    rows: list[list[float]] = []
    for i in range(n):
        row = [0.0] * (w + 1)
        for k in range(max(0, w - i), w + 1):  # column j = i - w + k, from the left
            j = i - w + k
            s = diagonals[w - k][j]
            if k < w:
                other = rows[j]
                shift = w - k  # L[j, c] sits at other[m + shift] for c = i - w + m
                for m in range(k):
                    s -= row[m] * other[m + shift]
                row[k] = s / other[w]
            else:
                for m in range(w):
                    s -= row[m] * row[m]
                if not (s > 0.0 and math.isfinite(s)):
                    raise np.linalg.LinAlgError("matrix is not positive definite")
                row[w] = math.sqrt(s)
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
    return solve_with_factor(cholesky_band(diagonals, n, w), b, w)


def solve_with_factor(rows: list[list[float]], b: np.ndarray, w: int) -> np.ndarray:
    """Solve a x = b with the banded Cholesky factor of ``a`` (:func:`cholesky_band`),
    so one factor serves every right-hand side of a matrix.
    """
    return np.array(solve_list(rows, np.asarray(b, dtype=float).tolist(), w), dtype=float)


def solve_list(rows: list[list[float]], rhs: list[float], w: int) -> list[float]:
    """:func:`solve_with_factor` of a right-hand side given as a list of floats, the
    solution as a list.
    """
    if w == BEAM_HALF_BANDWIDTH:
        return _solve_list_3(rows, rhs)
    return _solve_list_any(rows, rhs, w)


def _solve_list_3(rows: list[list[float]], rhs: list[float]) -> list[float]:
    """:func:`_solve_list_any` for the beam's half bandwidth 3, the inner loops written
    out: the same subtractions in the same order. The last three values found, and the
    rows they are read with, are carried along (no indexing into the lists made).
    """
    n = len(rows)
    if n <= 2 * 3:
        return _solve_list_any(rows, rhs, 3)
    y = [0.0] * 3
    for i in range(3):  # L y = b, the rows that start inside the band
        row = rows[i]
        s = rhs[i]
        for m in range(3 - i, 3):
            s -= row[m] * y[i - 3 + m]
        y[i] = s / row[3]
    y1, y2, y3 = y  # y[i - 3], y[i - 2], y[i - 1]
    append = y.append
    for (r0, r1, r2, r3), s in zip(rows[3:], rhs[3:], strict=True):
        s -= r0 * y1
        s -= r1 * y2
        s -= r2 * y3
        y1, y2, y3 = y2, y3, s / r3
        append(y3)
    tail = [0.0] * n
    for i in range(n - 1, n - 4, -1):  # L^T x = y, the rows whose band ends past n
        s = y[i]
        for r in range(i + 1, n):
            s -= rows[r][3 - r + i] * tail[r]
        tail[i] = s / rows[i][3]
    x1, x2, x3 = tail[n - 3], tail[n - 2], tail[n - 1]  # x[i + 1], x[i + 2], x[i + 3]
    p, q, t = rows[n - 3], rows[n - 2], rows[n - 1]  # rows i + 1, i + 2, i + 3
    x = [x3, x2, x1]  # from the last, reversed at the end
    push = x.append
    for row, s in zip(reversed(rows[: n - 3]), reversed(y[: n - 3]), strict=True):
        s -= p[2] * x1
        s -= q[1] * x2
        s -= t[0] * x3
        x1, x2, x3 = s / row[3], x1, x2
        push(x1)
        p, q, t = row, p, q
    x.reverse()
    return x


def _solve_list_any(rows: list[list[float]], rhs: list[float], w: int) -> list[float]:
    """The two triangular solves with the banded factor of any half bandwidth ``w``."""
    n = len(rows)
    y = [0.0] * n
    for i in range(n):  # L y = b
        row = rows[i]
        s = rhs[i]
        for m in range(max(0, w - i), w):
            s -= row[m] * y[i - w + m]
        y[i] = s / row[w]
    x = [0.0] * n
    for i in range(n - 1, -1, -1):  # L^T x = y; L[r, i] sits at rows[r][w - (r - i)]
        s = y[i]
        for r in range(i + 1, min(n, i + w + 1)):
            s -= rows[r][w - r + i] * x[r]
        x[i] = s / rows[i][w]
    return x
