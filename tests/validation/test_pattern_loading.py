"""Pattern (skip) live load against sympy.physics.continuum_mechanics.beam.

Source: sympy's symbolic beam solver (singularity functions), one solve per arrangement
of the live load (each span and overhang loaded or not); the envelope of Plystack must
equal the worst arrangement. Loads positive downward in both; sympy's moment is sagging
positive and its deflection positive downward for downward loads (see
test_sympy_beam.py). The arrangement rule is ASCE 7-16 4.3.3 (from memory).
"""

from __future__ import annotations

import itertools

import numpy as np
import pytest
import sympy
from sympy.physics.continuum_mechanics.beam import Beam

from plystack.core.io.project_file import from_dict
from plystack.core.pipeline import run

FT = 0.3048
PLF = 4.4482216152605 / FT


def project(spans_ft, overhang_right_ft=0.0, live_point_tip=None, pattern=True):
    loads = [{"case": "D", "type": "line", "value": "15 plf"},
             {"case": "L", "type": "line", "value": "40 plf"}]
    if live_point_tip is not None:
        loads.append({"case": "L", "type": "point", "value": f"{live_point_tip} lbf",
                      "at": f"{sum(spans_ft) + overhang_right_ft} ft"})
    beam = {"spans": [f"{s} ft" for s in spans_ft], "supports": "continuous",
            "self_weight": False, "loads": loads, "combinations": "ASD",
            "pattern_live_load": pattern}
    if overhang_right_ft:
        beam["overhang_right"] = f"{overhang_right_ft} ft"
    return from_dict({
        "format": "plystack", "version": 1, "title": "pattern", "display_units": "US",
        "plies": [{"name": "joist", "material": "DFL-No2", "x": "0 in", "y": "0 in",
                   "width": "3.5 in", "height": "11.25 in"}],
        "beam": beam})


def sympy_actions(spans, overhang, w_d, w_l, loaded, EI, tip=None):
    """M max, M min and |deflection| max of D everywhere plus L on the loaded regions."""
    length = sum(spans) + overhang
    b = Beam(sympy.nsimplify(length), sympy.Rational(EI), 1)
    unknowns = []
    xs = [0.0]
    for s in spans:
        xs.append(xs[-1] + s)
    for x in xs:
        unknowns.append(b.apply_support(sympy.nsimplify(x), "pin"))
    regions = [(xs[i], xs[i + 1]) for i in range(len(spans))]
    if overhang:
        regions.append((xs[-1], length))
    b.apply_load(sympy.Rational(w_d), 0, 0, end=sympy.nsimplify(length))
    for r in loaded:
        a, c = regions[r]
        b.apply_load(sympy.Rational(w_l), sympy.nsimplify(a), 0, end=sympy.nsimplify(c))
    if tip is not None and overhang and (len(regions) - 1) in loaded:
        b.apply_load(sympy.Rational(tip), sympy.nsimplify(length), -1)
    b.solve_for_reaction_loads(*unknowns)
    x = sympy.Symbol("x")
    M = sympy.lambdify(x, b.bending_moment(), "numpy")
    W = sympy.lambdify(x, b.deflection(), "numpy")
    grid = np.unique(np.concatenate([np.linspace(0.0, length, 20001), xs, [length]]))
    m = np.asarray(M(grid), dtype=float)
    w = np.asarray(W(grid), dtype=float)
    return m.max(), m.min(), np.abs(w).max()


CASES = [
    ([12.0, 12.0], 0.0, None),
    ([12.0, 12.0, 12.0], 0.0, None),
    ([14.0], 4.0, None),
    ([10.0, 13.0], 3.0, 300.0),
]


@pytest.mark.parametrize("spans, overhang, tip", CASES)
def test_envelope_equals_worst_arrangement(spans, overhang, tip):
    a = run(project(spans, overhang, tip))
    combo = next(c for c in a.beam.combinations if c.name == "D + L")
    n_regions = len(spans) + (1 if overhang else 0)
    worst_max = worst_min = worst_w = 0.0
    for k in range(n_regions + 1):
        for loaded in itertools.combinations(range(n_regions), k):
            mx, mn, w = sympy_actions([s * FT for s in spans], overhang * FT, 15 * PLF,
                                      40 * PLF, loaded, a.section.EI,
                                      None if tip is None else tip * 4.4482216152605)
            worst_max, worst_min, worst_w = max(worst_max, mx), min(worst_min, mn), max(
                worst_w, w)
    e = combo.extremes
    # sympy sampled on a 20,001-point grid plus the supports: agreement to 1e-6 relative
    assert e.M_max == pytest.approx(worst_max, rel=1e-6)
    assert e.M_min == pytest.approx(worst_min, rel=1e-6)
    assert e.deflection_max_abs == pytest.approx(worst_w, rel=1e-6)


def test_two_equal_spans_patterned_moment_is_larger():
    """The issue's case: two equal 12 ft spans, positive span moment 5,491 lbf*ft with L
    on both spans against 6,950 with L on one span (values of this test's loads differ;
    the all-spans result is the regression guard: the pattern must govern)."""
    on = run(project([12.0, 12.0]))
    off = run(project([12.0, 12.0], pattern=False))
    m_on = next(c for c in on.beam.combinations if c.name == "D + L").extremes.M_max
    m_off = next(c for c in off.beam.combinations if c.name == "D + L").extremes.M_max
    # hand (AISC Manual beam diagrams, two equal spans, uniform load on both, from
    # memory): M+ = 9 w L^2 / 128 at 3L/8 from the end supports
    L = 12 * FT
    hand_off = 9 / 128 * (55 * PLF) * L**2
    assert m_off == pytest.approx(hand_off, rel=1e-9)
    assert m_on > m_off * 1.1
    combo = next(c for c in on.beam.combinations if c.name == "D + L")
    assert combo.governing_patterns["M_max"] in (("span 1",), ("span 2",))
    assert combo.patterns_tried > 1


def test_uplift_at_the_back_span_support():
    """A heavy live point load at the overhang tip lifts the far support: the reaction
    envelope's minimum is negative and the uplift check is NOT OK without a hold-down."""
    a = run(project([8.0], 6.0, live_point_tip=2000.0))
    env = a.beam.reaction_envelope
    assert env[0].min < 0
    up = [c for c in a.checks if c.id == "uplift"]
    assert up and not up[0].ok and up[0].demand == pytest.approx(-env[0].strength_min)
    assert "support 1" in up[0].location
