"""Closed-form beam results, from memory of the AISC Steel Construction Manual's beam
diagrams and formulas (Table 3-23): simple span UDL M = wL^2/8, delta = 5wL^4/384EI;
midspan point load M = PL/4, delta = PL^3/48EI; cantilever UDL M = wL^2/2,
delta = wL^4/8EI; two equal spans UDL: interior support moment wL^2/8."""

from __future__ import annotations

import pytest

from plystack.core.actions.beam import BeamModel
from plystack.core.actions.extremes import extremes
from plystack.core.model.member import BeamLayout, Load

EI = 3.1e6
W, P, L = 1750.0, 4200.0, 5.3


def _solve(layout, loads):
    model = BeamModel(layout, loads)
    sol = model.solve(loads)
    return sol, extremes(model, sol, EI)


def test_simple_span_udl():
    sol, e = _solve(BeamLayout((L,)), [Load("D", "line", W)])
    assert e.M_max == pytest.approx(W * L**2 / 8, rel=1e-12)
    assert e.x_M_max == pytest.approx(L / 2, rel=1e-9)
    assert e.V_max_abs == pytest.approx(W * L / 2, rel=1e-12)
    assert e.deflection_max_abs == pytest.approx(5 * W * L**4 / (384 * EI), rel=1e-12)
    assert e.x_deflection_max == pytest.approx(L / 2, rel=1e-6)


def test_midspan_point_load():
    _, e = _solve(BeamLayout((L,)), [Load("L", "point", P, at=L / 2)])
    assert e.M_max == pytest.approx(P * L / 4, rel=1e-12)
    assert e.deflection_max_abs == pytest.approx(P * L**3 / (48 * EI), rel=1e-12)


def test_cantilever_udl():
    sol, e = _solve(BeamLayout((L,), "cantilever"), [Load("D", "line", W)])
    assert e.M_min == pytest.approx(-W * L**2 / 2, rel=1e-12)
    assert e.deflection_max_abs == pytest.approx(W * L**4 / (8 * EI), rel=1e-12)
    assert e.x_deflection_max == pytest.approx(L)
    assert sol.reaction_moments[0] == pytest.approx(W * L**2 / 2, rel=1e-12)


def test_two_equal_spans_udl():
    sol, e = _solve(BeamLayout((L, L)), [Load("D", "line", W)])
    assert e.M_min == pytest.approx(-W * L**2 / 8, rel=1e-12)
    assert e.x_M_min == pytest.approx(L)
    assert sol.reactions[1] == pytest.approx(10 * W * L / 8, rel=1e-12)


def test_fixed_fixed_udl():
    """Handbook: end moments wL^2/12, midspan wL^2/24, deflection wL^4/384EI."""
    _, e = _solve(BeamLayout((L,), "fixed-fixed"), [Load("D", "line", W)])
    assert e.M_min == pytest.approx(-W * L**2 / 12, rel=1e-12)
    assert e.M_max == pytest.approx(W * L**2 / 24, rel=1e-12)
    assert e.deflection_max_abs == pytest.approx(W * L**4 / (384 * EI), rel=1e-12)


def test_propped_udl():
    """Handbook: fixed-end moment wL^2/8, max positive 9wL^2/128 at 5L/8 from the fixed end."""
    _, e = _solve(BeamLayout((L,), "propped"), [Load("D", "line", W)])
    assert e.M_min == pytest.approx(-W * L**2 / 8, rel=1e-12)
    assert e.M_max == pytest.approx(9 * W * L**2 / 128, rel=1e-12)
    assert e.x_M_max == pytest.approx(5 * L / 8, rel=1e-9)
