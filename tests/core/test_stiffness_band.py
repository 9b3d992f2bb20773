"""The beam's stiffness held as its band (``actions.stiffness``).

- The band equals, bit for bit, the matrix assembled element by element from the
  textbook Euler-Bernoulli element stiffness (common practice: 12, 6L, 4L^2, 2L^2 over
  L^3), on uniform and stepped meshes; the dense matrix made from it (``BeamModel.K``)
  is that matrix.
- Continuous beams against the classic coefficients of equal spans under a uniform load
  (two spans: 3/8, 10/8, 3/8 wL; three spans: 0.4, 1.1, 1.1, 0.4 wL; common practice,
  exact fractions of the three-moment equation) to 1e-12.
"""

from __future__ import annotations

import math
from fractions import Fraction

import numpy as np
import pytest

from plystack.core.actions.beam import BeamModel
from plystack.core.actions.stiffness import element_stiffness
from plystack.core.model.member import BeamLayout, Load


def _assembled(model: BeamModel) -> np.ndarray:
    """The stiffness assembled element by element into a dense matrix."""
    n = 2 * model.nodes.size
    K = np.zeros((n, n))
    for e, le in enumerate(model.lengths):
        k_e = element_stiffness(le)
        if model.flexibility is not None:
            k_e = k_e / model.flexibility[e]
        K[2 * e : 2 * e + 4, 2 * e : 2 * e + 4] += k_e
    return K


MESHES = [
    (BeamLayout(spans=(3.0,), supports="simple"), ()),
    (BeamLayout(spans=(2.0, 5.0, 0.01), supports="simple", overhang_left=0.8,
                overhang_right=0.4), ()),
    (BeamLayout(spans=(4.0,) * 6, supports="simple"), ()),
    (BeamLayout(spans=(3.0,), supports="fixed-fixed"), ((0.0, 1.0, 2e6), (1.0, 2.2, 5e6),
                                                         (2.2, 3.0, 2e6))),
    (BeamLayout(spans=(3.0,), supports="propped"), ((0.0, 0.5, 1e6), (0.5, 3.0, 3e6))),
    (BeamLayout(spans=(3.0, 4.0), supports="simple"), ((0.0, 0.5, 1e6), (0.5, 7.0, 3e6))),
    (BeamLayout(spans=(3.0,), supports="cantilever"), ()),
]


@pytest.mark.parametrize(("layout", "steps"), MESHES)
def test_band_is_the_assembled_matrix(layout: BeamLayout,
                                      steps: tuple[tuple[float, float, float], ...]) -> None:
    L = layout.length
    loads = tuple(Load("L", "point", 1.0, at=L * (k + 0.37) / 40) for k in range(40))
    model = BeamModel(layout, loads, steps)
    K = _assembled(model)
    assert model.K.tobytes() == K.tobytes()
    for d in range(4):
        i = np.arange(K.shape[0] - d)
        assert model.band[d, : K.shape[0] - d].tobytes() == K[i + d, i].tobytes()


@pytest.mark.parametrize(("spans", "coefficients"), [
    (2, (Fraction(3, 8), Fraction(10, 8), Fraction(3, 8))),
    (3, (Fraction(2, 5), Fraction(11, 10), Fraction(11, 10), Fraction(2, 5)))])
def test_continuous_beam_reactions(spans: int, coefficients: tuple[Fraction, ...]) -> None:
    span, w = 3.7, 2345.0
    model = BeamModel(BeamLayout(spans=(span,) * spans, supports="simple"),
                      [Load("D", "line", w)])
    sol = model.solve([Load("D", "line", w)])
    for got, c in zip(sol.reactions.tolist(), coefficients, strict=True):
        assert math.isclose(got, float(c) * w * span, rel_tol=1e-12)


@pytest.mark.parametrize("stepped", [False, True])
@pytest.mark.parametrize("n_el", [1, 2, 7, 48, 49, 120])
def test_band_and_diagonals_in_floats_are_the_arrays(n_el: int, stepped: bool) -> None:
    """The assembly and scaled diagonals of a short mesh in floats against the array
    path's (forced on the same mesh), bit for bit."""
    from plystack.core.actions import stiffness

    rng = np.random.default_rng(n_el)
    le = rng.uniform(1e-3, 2.0, n_el)
    flex = rng.uniform(1e-7, 1e-5, n_el) if stepped else None
    n_dof = 2 * (n_el + 1)
    quick = np.array(stiffness.band_floats(le.tolist(), None if flex is None
                                           else flex.tolist(), n_dof))
    saved = stiffness.FLOAT_BAND_ELEMENTS
    try:
        stiffness.FLOAT_BAND_ELEMENTS = -1
        plain = stiffness.stiffness_band(le, flex, n_dof)
        free = np.array([i for i in range(n_dof) if i not in (0, n_dof - 2)])
        scale = 1.0 / np.sqrt(plain[0, free])
        w = min(3, free.size - 1)
        plain_d = stiffness.scaled_diagonals(plain, free, scale, w)
    finally:
        stiffness.FLOAT_BAND_ELEMENTS = saved
    assert quick.tobytes() == plain.tobytes()
    assert stiffness.stiffness_band(le, flex, n_dof).tobytes() == plain.tobytes()
    quick_d = stiffness.scaled_diagonals(quick, free, scale, w)
    assert [np.array(r).tobytes() for r in quick_d] == [np.array(r).tobytes()
                                                        for r in plain_d]
