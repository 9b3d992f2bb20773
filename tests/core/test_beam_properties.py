"""Equilibrium of every solved case (statics, common practice), over random layouts.

Positions closer than 1e-7 of the member length share a node, so moments about the
origin are compared to 1e-6 of (total load x length)."""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from plystack.core.actions.beam import BeamModel
from plystack.core.actions.extremes import diagram
from plystack.core.model.errors import ProjectError
from plystack.core.model.member import BeamLayout, Load


@st.composite
def layouts_and_loads(draw):
    kind = draw(st.sampled_from(["simple", "cantilever", "fixed-fixed", "propped", "multi"]))
    if kind == "multi":
        spans = tuple(draw(st.lists(st.floats(1.0, 8.0), min_size=2, max_size=4)))
        kind = "simple"
    else:
        spans = (draw(st.floats(1.0, 10.0)),)
    left = right = 0.0
    if kind == "simple":
        left = draw(st.sampled_from([0.0, draw(st.floats(0.2, 2.0))]))
        right = draw(st.sampled_from([0.0, draw(st.floats(0.2, 2.0))]))
    layout = BeamLayout(spans, kind, left, right)
    L = layout.length
    loads = []
    for _ in range(draw(st.integers(1, 5))):
        typ = draw(st.sampled_from(["point", "line", "area"]))
        value = draw(st.floats(-5e3, 2e4))
        if typ == "point":
            loads.append(Load("L", "point", value, at=draw(st.floats(0, 1)) * L))
        else:
            a, b = sorted([draw(st.floats(0, 1)) * L, draw(st.floats(0, 1)) * L])
            if b - a < 1e-3:
                a, b = None, None
            loads.append(Load("D", typ, value, tributary_width=0.5 if typ == "area" else None,
                              start=a, end=b))
    return layout, loads


@settings(max_examples=80, deadline=None)
@given(layouts_and_loads())
def test_equilibrium(case):
    layout, loads = case
    model = BeamModel(layout, loads)
    try:
        sol = model.solve(loads)
    except ProjectError as exc:  # refused by name only where two points nearly meet
        assert "too close for the stiffness solve to settle" in str(exc)
        assert float(model.lengths.min()) < 1e-3 * float(model.lengths.max())
        return
    L = layout.length
    total = 0.0
    moment = 0.0  # about x = 0, clockwise (downward load times arm) positive
    for ld in loads:
        if ld.type == "point":
            total += ld.value
            moment += ld.value * ld.at
        else:
            a = 0.0 if ld.start is None else ld.start
            b = L if ld.end is None else ld.end
            f = ld.line_value * (b - a)
            total += f
            moment += f * (a + b) / 2
    scale = max(abs(total), sum(abs(ld.value) for ld in loads), 1.0)
    assert sol.reactions.sum() == pytest.approx(total, abs=1e-6 * scale)
    xs = np.array(layout.support_positions())
    # reaction moments act counter-clockwise positive in the stiffness convention
    resisting = float((sol.reactions * xs).sum() + sol.reaction_moments.sum())
    assert resisting == pytest.approx(moment, abs=1e-6 * scale * max(L, 1.0))
    d = diagram(model, sol, 1.0, per_element=4)
    # free ends carry no moment and no shear
    if layout.supports in ("simple",):
        assert abs(d.M[0]) <= 1e-7 * scale * L and abs(d.M[-1]) <= 1e-7 * scale * L


def test_points_too_close_to_settle_are_refused_by_name():
    """A point load 2.4e-7 m from the tip of a 1 m overhang (just past the merging of
    nodes): the element there is so nearly rigid that the refined solve cannot settle,
    and the solve is refused by name instead of answered wrongly (before the refinement
    the banded factor lost its last pivot to rounding and the LU fallback answered).
    """
    layout = BeamLayout(spans=(1.0,), supports="simple", overhang_left=1.0, overhang_right=0.0)
    load = Load("L", "point", 1000.0, at=2.384185792e-07)
    with pytest.raises(ProjectError, match="stand 0.000238 mm apart at x = 0 m, too close"):
        BeamModel(layout, [load]).solve([load])
