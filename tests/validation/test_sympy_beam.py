"""Beam actions against sympy.physics.continuum_mechanics.beam, a general-purpose
symbolic beam solver (singularity functions). Loads positive downward in both; sympy's
reactions are negative when upward, its moment is sagging positive and its deflection
positive downward for downward loads (checked on a simple span in the handbook test).
Tolerance 0.1 % (the issue's)."""

from __future__ import annotations

import numpy as np
import pytest
import sympy
from sympy.physics.continuum_mechanics.beam import Beam

from plystack.core.actions.beam import BeamModel
from plystack.core.actions.extremes import diagram
from plystack.core.model.member import BeamLayout, Load

EI = 2.0e6  # N m^2, any value


def _sympy(layout: BeamLayout, loads: list[Load]):
    L = layout.length
    b = Beam(sympy.nsimplify(L), sympy.Integer(int(EI)), 1)
    unknowns = []
    for x, kind in zip(layout.support_positions(), layout.support_kinds(), strict=True):
        r = b.apply_support(sympy.nsimplify(x), "fixed" if kind == "fixed" else "pin")
        unknowns.extend(r if isinstance(r, tuple) else [r])
    for ld in loads:
        if ld.type == "point":
            b.apply_load(sympy.nsimplify(ld.value), sympy.nsimplify(ld.at), -1)
        else:
            start = 0 if ld.start is None else ld.start
            end = L if ld.end is None else ld.end
            b.apply_load(sympy.nsimplify(ld.line_value), sympy.nsimplify(start), 0,
                         end=sympy.nsimplify(end))
    b.solve_for_reaction_loads(*unknowns)
    return b


def _compare(layout, loads):
    model = BeamModel(layout, loads)
    sol = model.solve(loads)
    b = _sympy(layout, loads)
    # reactions: sympy's are negative upward
    forces = [v for k, v in b.reaction_loads.items() if str(k).startswith("R")]
    xs_sorted = sorted(b.reaction_loads.items(), key=lambda kv: str(kv[0]))
    del xs_sorted
    sympy_R = sorted(-float(v) for v in forces)
    assert sorted(sol.reactions) == pytest.approx(sympy_R, rel=1e-3, abs=1e-6)
    total = sum(ld.value if ld.type == "point" else ld.line_value * (
        (layout.length if ld.end is None else ld.end) - (ld.start or 0.0)) for ld in loads)
    assert sol.reactions.sum() == pytest.approx(total, rel=1e-9)
    d = diagram(model, sol, EI, per_element=6)
    x = sympy.Symbol("x")
    M = sympy.lambdify(x, b.bending_moment(), "math")
    V = sympy.lambdify(x, b.shear_force(), "math")
    W = sympy.lambdify(x, b.deflection(), "math")
    scale_m = np.abs(d.M).max()
    scale_v = np.abs(d.V).max()
    scale_w = np.abs(d.deflection).max()
    for xi, mi, vi, wi in zip(d.x, d.M, d.V, d.deflection, strict=True):
        if np.min(np.abs(model.nodes - xi)) < 1e-9:
            continue  # shear jumps at nodes; sympy's value there is one side's
        assert mi == pytest.approx(M(xi), abs=1e-3 * scale_m)
        assert vi == pytest.approx(V(xi), abs=1e-3 * scale_v)
        assert wi == pytest.approx(W(xi), abs=1e-3 * scale_w)


def test_simple_span_partial_and_point_loads():
    _compare(BeamLayout((5.0,), "simple"),
             [Load("D", "line", 1500.0, start=1.0, end=3.5), Load("L", "point", 4000.0, at=2.2),
              Load("L", "area", 2000.0, tributary_width=0.4)])


def test_propped_cantilever():
    _compare(BeamLayout((6.0,), "propped"),
             [Load("D", "line", 2000.0), Load("L", "point", 3000.0, at=4.0)])


def test_fixed_fixed():
    _compare(BeamLayout((4.5,), "fixed-fixed"),
             [Load("D", "line", 1000.0, start=0.5, end=2.0), Load("L", "point", 2500.0, at=3.0)])


def test_two_span_continuous_unequal():
    _compare(BeamLayout((4.0, 6.0), "simple"),
             [Load("D", "line", 1200.0), Load("L", "point", 5000.0, at=7.0)])


def test_three_span_continuous_unequal():
    _compare(BeamLayout((3.0, 5.0, 4.0), "simple"),
             [Load("D", "line", 800.0), Load("L", "line", 1500.0, start=3.0, end=8.0),
              Load("L", "point", 2000.0, at=1.5)])


def test_overhangs():
    _compare(BeamLayout((5.0,), "simple", 1.0, 1.5),
             [Load("D", "line", 900.0), Load("L", "point", 1200.0, at=7.5),
              Load("L", "point", 800.0, at=0.0)])


def test_cantilever():
    _compare(BeamLayout((3.0,), "cantilever"),
             [Load("D", "line", 700.0, start=1.0, end=3.0), Load("L", "point", 900.0, at=2.0)])
