"""The stiffness of the beam's mesh: the element stiffness and the assembled matrix's
band, and the band of the free degrees of freedom scaled for the factor.

Only the band is assembled (a degree of freedom couples only with those of its own and
the neighbouring nodes: entries more than three places off the diagonal are zero), so
the assembly and the factor take work in proportion to the elements. The residuals and
reactions are found element by element (``refine``), not from this matrix.
"""

from __future__ import annotations

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
