"""The stiffness of the beam's mesh: the element stiffness, the assembled matrix's band,
and the supports' rows, whose residuals R = K u - f are the reactions.

Only the band is assembled (a degree of freedom couples only with those of its own and
the neighbouring nodes: entries more than three places off the diagonal are zero), so
the assembly, the factor and the reactions take work in proportion to the elements.
The reactions are each row's products summed by ``math.fsum``: correctly rounded, in an
order that does not depend on the machine's BLAS.
"""

from __future__ import annotations

import math
from collections.abc import Sequence

import numpy as np

from .banded import BEAM_HALF_BANDWIDTH


def element_stiffness(le: float) -> np.ndarray:
    """Euler-Bernoulli beam element stiffness for EI = 1, dofs (v1, t1, v2, t2)."""
    l2 = le * le
    return np.array([
        [12, 6 * le, -12, 6 * le],
        [6 * le, 4 * l2, -6 * le, 2 * l2],
        [-12, -6 * le, 12, -6 * le],
        [6 * le, 2 * l2, -6 * le, 4 * l2],
    ]) / (l2 * le)


#: Most elements whose band is assembled in plain floats (numpy's calls cost more than
#: the arithmetic on rows this short; the same operations, so the same numbers).
FLOAT_BAND_ELEMENTS = 48


def stiffness_band(lengths: np.ndarray, flexibility: np.ndarray | None, n_dof: int
                   ) -> np.ndarray:
    """The lower band of the assembled stiffness, ``band[d, i]`` = K[i + d, i]: the
    entries of :func:`element_stiffness` of every element (divided by its 1 / EI on a
    stepped member) added where the elements' dofs meet, each entry the same number as
    the element-by-element assembly makes (at most two elements meet at an entry, and
    the sum of two does not depend on their order). A mesh of at most
    ``FLOAT_BAND_ELEMENTS`` elements is assembled in floats (:func:`band_floats`).
    """
    if lengths.size <= FLOAT_BAND_ELEMENTS:
        return np.array(band_floats(lengths.tolist(), None if flexibility is None
                                    else flexibility.tolist(), n_dof))
    le = lengths
    l2 = le * le
    l3 = l2 * le
    six, four, two = 6 * le, 4 * l2, 2 * l2
    lower = {(0, 0): 12.0, (1, 0): six, (1, 1): four, (2, 0): -12.0, (2, 1): -six,
             (2, 2): 12.0, (3, 0): six, (3, 1): two, (3, 2): -six, (3, 3): four}
    band = np.zeros((BEAM_HALF_BANDWIDTH + 1, n_dof))
    n_el = le.size
    for (a, b), top in lower.items():
        entry = top / l3
        if flexibility is not None:
            entry = entry / flexibility
        band[a - b, b : b + 2 * n_el : 2] += entry
    return band


def band_floats(lengths: list[float], flexibility: list[float] | None, n_dof: int
                ) -> list[list[float]]:
    """:func:`stiffness_band` in floats: element by element, the same operations."""
    band = [[0.0] * n_dof for _ in range(BEAM_HALF_BANDWIDTH + 1)]
    for e, le in enumerate(lengths):
        l2 = le * le
        l3 = l2 * le
        six, four, two = 6 * le, 4 * l2, 2 * l2
        f = None if flexibility is None else flexibility[e]
        for (a, b), top in (((0, 0), 12.0), ((1, 0), six), ((1, 1), four), ((2, 0), -12.0),
                            ((2, 1), -six), ((2, 2), 12.0), ((3, 0), six), ((3, 1), two),
                            ((3, 2), -six), ((3, 3), four)):
            entry = top / l3
            if f is not None:
                entry = entry / f
            band[a - b][2 * e + b] += entry
    return band


def scaled_diagonals(band: np.ndarray, free: np.ndarray, scale: np.ndarray, w: int
                     ) -> list[list[float]]:
    """The band of the free dofs' matrix scaled to a unit diagonal, diagonal by diagonal:
    entry (j + k, j) is K[free[j + k], free[j]] * (scale[j + k] * scale[j]), k = 0..w
    (in floats on a short mesh: the same products).
    """
    m = free.size
    if band.shape[1] <= 2 * (FLOAT_BAND_ELEMENTS + 1):
        rows, f, s = band.tolist(), free.tolist(), scale.tolist()
        return [[(rows[f[j + k] - f[j]][f[j]] if f[j + k] - f[j] <= BEAM_HALF_BANDWIDTH
                  else 0.0) * (s[j + k] * s[j]) for j in range(m - k)]
                for k in range(w + 1)]
    out = []
    for k in range(w + 1):
        lower, upper = free[: m - k], free[k:]
        d = upper - lower
        entries = np.where(d <= BEAM_HALF_BANDWIDTH,
                           band[np.minimum(d, BEAM_HALF_BANDWIDTH), lower], 0.0)
        out.append((entries * (scale[k:] * scale[: m - k])).tolist())
    return out


class SupportRows:
    """The stiffness rows of the supports' degrees of freedom, to find the reactions
    as residuals of the solution: R = K u - f on each supported row.

    ``cols[i]``, ``values[i]``: the columns and entries of row ``rows[i]`` inside the
    band; ``rows`` lists every support's vertical row, then, for a fixed support, its
    rotation's row (``rotations[k]``: index into ``rows``, or -1).
    """

    def __init__(self, rows: list[int], cols: list[list[int]], values: list[list[float]],
                 verticals: list[int], rotations: list[int]):
        self.rows = rows
        self.cols = cols
        self.values = values
        self.verticals = verticals
        self.rotations = rotations
        self._flat = np.array([c for cs in cols for c in cs], dtype=int)
        self._values = np.array([v for vs in values for v in vs])

    def residuals_of(self, u: Sequence[float], total: Sequence[float]
                     ) -> tuple[list[float], list[float]]:
        """The reactions and reaction moments (zero where a support is not fixed) of the
        solution ``u`` under the nodal loads ``total`` (lists of floats): each residual
        is the correctly rounded sum (``math.fsum``) of the row's products and -f.
        """
        r = [math.fsum([v * u[c] for c, v in zip(cs, vs, strict=True)] + [-total[row]])
             for row, cs, vs in zip(self.rows, self.cols, self.values, strict=True)]
        return ([r[i] for i in self.verticals],
                [r[i] if i >= 0 else 0.0 for i in self.rotations])

    def residuals(self, u: np.ndarray, total: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
        """:meth:`residuals_of` of arrays: the same products (one gather) and sums."""
        products = (self._values * u[self._flat]).tolist()
        out, at = [], 0
        for row, cs in zip(self.rows, self.cols, strict=True):
            out.append(math.fsum(products[at : at + len(cs)] + [-float(total[row])]))
            at += len(cs)
        return (np.array([out[i] for i in self.verticals]),
                np.array([out[i] if i >= 0 else 0.0 for i in self.rotations]))


def support_rows(band: np.ndarray, support_nodes: Sequence[int],
                 kinds: Sequence[str]) -> SupportRows:
    """The :class:`SupportRows` of a mesh's supports (``band`` as :func:`stiffness_band`)."""
    n = band.shape[1]
    rows: list[int] = []
    verticals, rotations = [], []
    for node, kind in zip(support_nodes, kinds, strict=True):
        verticals.append(len(rows))
        rows.append(2 * node)
        if kind == "fixed":
            rotations.append(len(rows))
            rows.append(2 * node + 1)
        else:
            rotations.append(-1)
    cols, values = [], []
    entries = band.tolist()
    for r in rows:
        cs = list(range(max(r - BEAM_HALF_BANDWIDTH, 0), min(r + BEAM_HALF_BANDWIDTH + 1, n)))
        cols.append(cs)
        values.append([entries[abs(r - c)][min(r, c)] for c in cs])
    return SupportRows(rows, cols, values, verticals, rotations)
