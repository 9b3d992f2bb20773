"""A plate that stops short of the supports: stepped stiffness and the segment checks.

Sources (outside the project):
- deflection by the unit-load method, delta = integral of M m / EI(x) dx, integrated
  exactly by sympy over the piecewise EI (virtual work, any structural analysis text);
- a statically indeterminate member (fixed left, pinned right) by compatibility: the
  right reaction R makes the deflection there zero, integral (M0 + R m) m / EI = 0;
- the timber stress at a plate cut-off, f = M c / I of the two 2x10s alone, by hand.
The project is the invented porch-header demo with its loads made uniform.
"""

from __future__ import annotations

import json
from pathlib import Path

import numpy as np
import pytest
import sympy as sp

from plystack.core.actions.beam import BeamModel
from plystack.core.actions.extremes import element_polynomials
from plystack.core.io.output import check_json
from plystack.core.io.project_file import from_dict
from plystack.core.model.constants import INCH
from plystack.core.model.member import BeamLayout, Load
from plystack.core.pipeline import run
from tests.helpers import unit_load_deflection

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"
FT = 12 * INCH


def _demo(plate_from: str | None, plate_to: str | None, self_weight: bool = False) -> dict:
    d = json.loads(DEMO.read_text(encoding="utf-8"))
    d.pop("alternatives")
    if plate_from is not None:
        d["plies"][1]["from"] = plate_from
    if plate_to is not None:
        d["plies"][1]["to"] = plate_to
    d["beam"]["self_weight"] = self_weight
    d["beam"]["loads"] = [
        {"case": "D", "type": "line", "value": "72 plf"},
        {"case": "L", "type": "line", "value": "240 plf"},
    ]
    return d


def test_stepped_simple_span_deflection_against_virtual_work():
    L, w = sp.Rational(53, 10), sp.Integer(1750)
    EI_end, EI_mid = sp.Integer(2_000_000), sp.Integer(5_000_000)
    a, b = sp.Rational(8, 10), sp.Rational(45, 10)  # not symmetric on purpose
    pieces = [(0, a, EI_end), (a, b, EI_mid), (b, L, EI_end)]
    model = BeamModel(BeamLayout((float(L),)), [Load("D", "line", float(w))],
                      steps=[(float(p), float(q), float(e)) for p, q, e in pieces])
    sol = model.solve([Load("D", "line", float(w))])
    for x0 in (sp.Rational(1, 2), sp.Rational(265, 100), sp.Rational(47, 10)):
        e = int(model.node_index(float(x0)))
        if model.nodes[e] > float(x0):
            e -= 1
        e = min(e, model.lengths.size - 1)
        poly = element_polynomials(model, sol, 1.0)[e]["w"]
        ours = float(np.polyval(poly, float(x0) - model.nodes[e]))
        ref = unit_load_deflection(L, w, pieces, x0)
        assert ours == pytest.approx(ref, rel=1e-9)


def test_stepped_propped_member_redistributes():
    """Fixed left, pinned right: R_right from compatibility with the stepped EI."""
    L, w = sp.Integer(6), sp.Integer(1000)
    EI1, EI2 = sp.Integer(1_000_000), sp.Integer(4_000_000)
    c = sp.Integer(2)  # stiff over 0..2 m, flexible beyond
    x, R = sp.symbols("x R")
    # cantilever from the left support, measured from the free (right) end: s = L - x
    s = L - x
    M = R * s - w * s**2 / 2  # sagging positive
    m = s
    eq = sp.integrate(M * m / EI2, (x, c, L)) + sp.integrate(M * m / EI1, (x, 0, c))
    R_ref = float(sp.solve(eq, R)[0])
    load = Load("D", "line", float(w))
    model = BeamModel(BeamLayout((float(L),), "propped"), [load],
                      steps=[(0.0, float(c), float(EI1)), (float(c), float(L), float(EI2))])
    sol = model.solve([load])
    assert sol.reactions[1] == pytest.approx(R_ref, rel=1e-9)
    # the prismatic member's 3 w L / 8 differs: the moments did redistribute
    assert abs(sol.reactions[1] - 3 * float(w * L) / 8) > 1e-3 * float(w * L)


def test_timber_stress_at_plate_cut_off_is_M_c_over_I_of_the_timber():
    a = run(from_dict(_demo("1 ft", "11 ft")))
    L = 12 * FT
    w_total = (72 + 240) * 4.4482216152605 / FT  # plf -> N/m
    x = 1 * FT
    M = w_total * x * (L - x) / 2
    b, d = 1.5 * INCH, 9.25 * INCH
    I_t = 2 * b * d**3 / 12
    f_hand = M * (d / 2) / I_t
    seg0 = [c for c in a.checks if c.id == "bending" and c.segment == 0
            and c.combination == "D + L" and c.ply == "left 2x10"]
    assert len(seg0) == 1
    assert seg0[0].x == pytest.approx(x, rel=1e-9)
    assert seg0[0].demand == pytest.approx(f_hand, rel=1e-9)


def test_stepped_member_midspan_deflections_short_and_long_term():
    """Symmetric plate: largest deflection at midspan; total = D on the short-term
    stiffness; long-term = D on the crept stiffness (US: D wholly sustained, K_cr)."""
    a = run(from_dict(_demo("2 ft", "10 ft")))
    L = sp.nsimplify(12 * FT)
    w_D = sp.nsimplify(72 * 4.4482216152605 / FT)
    full, bare = a.segments[1].section, a.segments[0].section
    assert [s.plies for s in a.segments] == [(0, 2), (0, 1, 2), (0, 2)]
    cut1, cut2 = sp.nsimplify(2 * FT), sp.nsimplify(10 * FT)
    short = [(0, cut1, sp.Float(bare.EI, 30)), (cut1, cut2, sp.Float(full.EI, 30)),
             (cut2, L, sp.Float(bare.EI, 30))]
    K = a.beam.creep_factor
    creep_full = a.segments[1].beam.creep_section.EI
    long_ = [(0, cut1, sp.Float(bare.EI / K, 30)), (cut1, cut2, sp.Float(creep_full, 30)),
             (cut2, L, sp.Float(bare.EI / K, 30))]
    ref_short = unit_load_deflection(L, w_D, short, L / 2)
    ref_long = unit_load_deflection(L, w_D, long_, L / 2)
    tot = [c for c in a.checks if c.id == "deflection-total" and c.combination == "D"]
    lt = [c for c in a.checks if c.id == "deflection-long-term" and c.combination == "D"]
    assert tot[0].demand == pytest.approx(ref_short, rel=1e-9)
    assert lt[0].demand == pytest.approx(ref_long, rel=1e-9)
    assert tot[0].x == pytest.approx(float(L) / 2, rel=1e-6)


def test_regression_guard_full_length_plate_gives_todays_results():
    """Regression guard: a plate given "from" 0 and "to" the span is today's member."""
    for sw in (False, True):
        plain = check_json(run(from_dict(_demo(None, None, sw))))
        explicit = check_json(run(from_dict(_demo("0 ft", "12 ft", sw))))
        assert explicit == plain
        assert "segments" not in plain
    demo = json.loads(DEMO.read_text(encoding="utf-8"))
    plain = check_json(run(from_dict(demo)))
    demo["plies"][1]["from"] = "0 in"
    demo["plies"][1]["to"] = "144 in"
    assert check_json(run(from_dict(demo))) == plain


def test_segments_in_json_and_every_stress_check_has_its_segment():
    out = check_json(run(from_dict(_demo("1 ft", "11 ft", True))))
    segs = out["segments"]
    assert [v for s in segs for v in (s["from"], s["to"])] == pytest.approx(
        [0.0, FT, FT, 11 * FT, 11 * FT, 12 * FT], rel=1e-12)
    assert [len(s["plies"]) for s in segs] == [2, 3, 2]
    assert segs[0]["section"]["EI"] < segs[1]["section"]["EI"]
    for c in out["checks"]:
        if c["id"] in ("bending", "shear"):
            k = c["segment"]
            assert segs[k]["from"] - 1e-9 <= c["x"] <= segs[k]["to"] + 1e-9
    # the plate is checked only where it is
    assert {c["segment"] for c in out["checks"] if c["ply"] == "flitch plate"
            and c["id"] == "bending"} == {1}


def test_a_plate_ending_inside_the_member_is_checked_at_its_ends():
    """The plate's share of the section's actions just inside each end must enter through
    the bolts near it: a ``load-transfer`` check at each end (worked by hand in
    test_ply_end_transfer.py) instead of a missing check.
    """
    a = run(from_dict(_demo("1 ft", "11 ft", True)))
    paths = [r.path for r in a.incomplete_reasons]
    assert "plies[1].from" not in paths and "plies[1].to" not in paths
    ends = [c for c in a.checks if c.id == "load-transfer" and c.location.startswith("end of")]
    assert {round(c.x / FT, 9) for c in ends} == {1.0, 11.0}
    whole = run(from_dict(_demo("0 ft", "12 ft", True)))
    assert not [c for c in whole.checks if c.location.startswith("end of")]
