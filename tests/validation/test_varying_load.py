"""A linearly varying (trapezoidal, ramp) line load against sympy's beam solver
(order-1 singularity loads), on a simple span and on a propped cantilever. Loads
positive downward; sympy's moment sagging positive, deflection downward positive.
"""

from __future__ import annotations

import numpy as np
import pytest
import sympy
from sympy.physics.continuum_mechanics.beam import Beam

from plystack.core.actions.beam import BeamModel
from plystack.core.actions.extremes import diagram, extremes
from plystack.core.model.member import BeamLayout, Load

EI = 3.0e6


def sympy_beam(L, kinds, a, b, w0, w1):
    beam = Beam(sympy.Rational(L), sympy.Rational(EI), 1)
    unknowns = []
    for x, kind in zip((0, L), kinds, strict=True):
        r = beam.apply_support(sympy.Rational(x), kind)
        unknowns.extend(r if isinstance(r, tuple) else [r])
    A, B = sympy.Rational(a), sympy.Rational(b)
    W0, W1 = sympy.Rational(w0), sympy.Rational(w1)
    slope = (W1 - W0) / (B - A)
    # w0 from a to b, plus a ramp of slope (w1 - w0)/(b - a), both ending at b
    beam.apply_load(W0, A, 0, end=B)
    beam.apply_load(slope, A, 1, end=B)
    beam.solve_for_reaction_loads(*unknowns)
    return beam


@pytest.mark.parametrize("supports, kinds", [("simple", ("pin", "pin")),
                                            ("propped", ("fixed", "pin"))])
@pytest.mark.parametrize("a, b, w0, w1", [(0.0, 5.0, 0.0, 4000.0), (1.0, 4.0, 3000.0, 500.0)])
def test_ramp_load_against_sympy(supports, kinds, a, b, w0, w1):
    L = 5.0
    layout = BeamLayout((L,), supports)
    load = Load("S", "line", w0, None, a, b, None, w1)
    model = BeamModel(layout, [load])
    sol = model.solve([load])
    beam = sympy_beam(L, kinds, a, b, w0, w1)
    x = sympy.Symbol("x")
    M = sympy.lambdify(x, beam.bending_moment(), "numpy")
    V = sympy.lambdify(x, beam.shear_force(), "numpy")
    W = sympy.lambdify(x, beam.deflection(), "numpy")
    d = diagram(model, sol, EI, per_element=10)
    scale_m, scale_w = np.abs(d.M).max(), np.abs(d.deflection).max()
    inside = (d.x > 1e-9) & (d.x < L - 1e-9)
    assert np.asarray(M(d.x[inside]), float) == pytest.approx(d.M[inside], abs=1e-9 * scale_m)
    assert np.asarray(W(d.x[inside]), float) == pytest.approx(d.deflection[inside],
                                                               abs=1e-9 * scale_w)
    # sympy's shear force has the sign of V = sum of upward forces left of x here
    scale_v = np.abs(d.V).max()
    assert np.asarray(V(d.x[inside]), float) == pytest.approx(d.V[inside], abs=1e-9 * scale_v)
    e = extremes(model, sol, EI)
    grid = np.linspace(0, L, 200001)
    assert e.M_max == pytest.approx(np.asarray(M(grid), float).max(), rel=1e-8)
    assert e.deflection_max_abs == pytest.approx(np.abs(np.asarray(W(grid), float)).max(),
                                                 rel=1e-8)
    total = (w0 + w1) / 2 * (b - a)
    assert sol.reactions.sum() == pytest.approx(total, rel=1e-12)
