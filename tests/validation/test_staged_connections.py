"""A member strengthened under load: combined stresses, net sections at the bolt holes,
bearing and the connections, by stage, worked by hand.

Sources (outside the project):
- superposition of the two stages (the beam is linear): before-loads on the existing plies
  alone, after-loads on the built-up section (common practice for members strengthened
  under load);
- statics of a simple span, M = w L^2 / 8 at midspan (any structural handbook, from
  memory); a propped member's reaction by compatibility (virtual work, integrated by
  sympy on the stepped stiffness);
- NDS 2018 3.9.1 bending and axial tension f_t / F't + f_b / F*b <= 1 and (f_b - f_t) /
  F**b <= 1; NDS Supplement 2018 Table 4A DF-L No.2 Fb 900 psi, Ft 575 psi, C_F = 1.1 for
  a 2x10 in bending and tension; C_D = 1.0 for D + L (NDS 2018 Table 2.3.2) (all from
  memory);
- bolt holes D + 1/16 in (NDS 2018 12.1.3.2, from memory); a hole at the centroid of a
  rectangle takes b d_h^3 / 12 off its second moment (parallel-axis theorem).
"""

from __future__ import annotations

import pytest
import sympy as sp

from plystack.core.io.project_file import from_dict
from plystack.core.model.constants import INCH, LBF, PSI
from plystack.core.pipeline import run
from tests.validation.test_staged_loading import _project, _stepped

FT = 12 * INCH
PLF = LBF / FT


def _stacked() -> dict:
    """An existing 2x10 (DF-L No.2) with a second 2x10 added on top of it (connectors given
    by the user), 15 ft simple span: 40 plf D before, 100 plf L after."""
    return {
        "format": "plystack", "version": 1, "display_units": "US",
        "title": "Invented test: a 2x10 doubled on top under its dead load",
        "materials": {},
        "plies": [
            {"name": "old", "material": "DFL-No2", "x": "0 in", "y": "0 in",
             "width": "1.5 in", "height": "9.25 in"},
            {"name": "new", "material": "DFL-No2", "x": "0 in", "y": "9.25 in",
             "width": "1.5 in", "height": "9.25 in", "stage": "added"}],
        "beam": {"spans": ["15 ft"], "supports": "simple", "self_weight": False,
                 "combinations": "ASD",
                 "loads": [{"case": "D", "type": "line", "value": "40 plf",
                            "stage": "before"},
                           {"case": "L", "type": "line", "value": "100 plf"}]},
        "design": {"basis": "US-ASD",
                   "connector": {"type": "screw", "allowable": "300 lbf", "rows": 1}},
    }


def test_staged_tension_and_bending_of_the_existing_lower_ply_by_hand():
    """The lower (existing) 2x10 lies wholly below the built-up neutral axis (y = 9.25 in).
    Before-stage on it alone: no axial stress, f_b1 = M1 c / I_j (c = 4.625 in). After-stage
    on the doubled section I_t = 1.5 x 18.5^3 / 12: centroid stress f_t = M2 x 4.625 / I_t,
    own bending M2 x 4.625 / I_t. At midspan: f_t = M2 c / I_t, f_b = M1 c / I_j + M2 c / I_t;
    ratio max(f_t / F't + f_b / F*b, (f_b - f_t) / F**b)."""
    a = run(from_dict(_stacked()))
    L = 15 * FT
    M1, M2 = 40 * PLF * L**2 / 8, 100 * PLF * L**2 / 8
    c = 4.625 * INCH
    I_j = 1.5 * INCH * (9.25 * INCH) ** 3 / 12
    I_t = 1.5 * INCH * (18.5 * INCH) ** 3 / 12
    f_t = M2 * c / I_t
    f_b = M1 * c / I_j + M2 * c / I_t
    Ft = 575 * PSI * 1.1
    Fb = 900 * PSI * 1.1
    want = max(f_t / Ft + f_b / Fb, (f_b - f_t) / Fb)
    chk = next(k for k in a.checks if k.id == "tension-bending" and k.ply == "old"
               and k.combination == "D + L")
    assert chk.demand == pytest.approx(want, rel=1e-9)
    # the finished member under every load would give less: (M1 + M2) on the doubled section
    f_fin = (M1 + M2) * c / I_t
    assert chk.demand > f_fin / Ft + f_fin / Fb
    assert any("Staged loading" in n for n in chk.notes)


def test_connectors_to_the_added_ply_are_an_upper_bound():
    """The connectors joining the added ply carry its share of the after-stage only; the
    finished member's value under every load is kept, with the reason stated."""
    a = run(from_dict(_stacked()))
    conn = [k for k in a.checks if k.id == "connectors"]
    assert conn and all(any("upper bound" in n for n in k.notes) for k in conn)
    assert not [w for w in a.incomplete_reasons if "staged loading" in w.message]


def test_staged_net_section_at_a_centre_hole_by_hand():
    """The joist of _project() with a 1/4 in side plate, one row of 1/2 in bolts at mid-depth
    (4.625 in): a 9/16 in hole at the centroid of both sections. Before-stage on the joist
    less the hole: I_j,net = I_j - 1.5 (9/16)^3 / 12; after-stage on the transformed section
    (width 1.5 + n 0.25) less the hole through both: I_t,net = I_t - (1.5 + n 0.25) (9/16)^3
    / 12; the neutral axis stays at 4.625 in. Joist fibre at midspan: M1 c / I_j,net + M2 c /
    I_t,net."""
    p = from_dict(_project())
    a = run(p)
    mats = p.all_materials()
    n = mats["A36"].E / mats["DFL-No2"].E
    L = 15 * FT
    M1, M2 = 40 * PLF * L**2 / 8, 100 * PLF * L**2 / 8
    b, t, d, dh = 1.5 * INCH, 0.25 * INCH, 9.25 * INCH, 9 / 16 * INCH
    I_jn = b * d**3 / 12 - b * dh**3 / 12
    I_tn = (b + n * t) * d**3 / 12 - (b + n * t) * dh**3 / 12
    want = M1 * (d / 2) / I_jn + M2 * (d / 2) / I_tn
    chk = next(k for k in a.checks if k.id == "bending-net" and k.ply == "joist"
               and k.combination == "D + L")
    assert chk.demand == pytest.approx(want, rel=1e-9)
    assert chk.x == pytest.approx(7.5 * FT, rel=1e-9)


def test_staged_bearing_takes_the_reaction_of_the_two_stages():
    """Propped member (fixed left, pinned right), plate from 1.5 ft to 13.5 ft, bearing
    3 in: the pinned reaction of the stages is 3 w1 L / 8 (before, the joist alone,
    prismatic) plus R2 of the after-stage on the stepped stiffness (compatibility, sympy);
    the finished member takes R of (w1 + w2) on the stepped stiffness. Bearing f = R /
    (1.5 in x 3 in) with the larger."""
    d = _stepped(supports="propped")
    d["beam"]["bearing_length"] = "3 in"
    p = from_dict(d)
    a = run(p)
    mats = p.all_materials()
    Et, Es = mats["DFL-No2"].E, mats["A36"].E
    b, t, dd = 1.5 * INCH, 0.25 * INCH, 9.25 * INCH
    EI_j = sp.Float(Et * b * dd**3 / 12, 30)
    EI_b = sp.Float(Et * (b + Es / Et * t) * dd**3 / 12, 30)
    L = sp.nsimplify(15 * FT)
    c1, c2 = sp.nsimplify(1.5 * FT), sp.nsimplify(13.5 * FT)
    x, R = sp.symbols("x R")
    s = L - x

    def pinned_reaction(w):
        eq = sum(sp.integrate((R * s - w * s**2 / 2) * s / EI, (x, lo, hi))
                 for lo, hi, EI in ((0, c1, EI_j), (c1, c2, EI_b), (c2, L, EI_j)))
        return float(sp.solve(eq, R)[0])

    w1, w2 = 40 * PLF, 100 * PLF
    total = (w1 + w2) * float(L)
    staged = 3 * w1 * float(L) / 8 + pinned_reaction(sp.Float(w2, 30))
    finished = pinned_reaction(sp.Float(w1 + w2, 30))
    pinned = next(k for k in a.checks if k.id == "bearing" and k.location == "support 2")
    assert pinned.demand == pytest.approx(max(staged, finished) / (b * 3 * INCH), rel=1e-9)
    # the fixed end takes the rest of the load (vertical equilibrium); there the stages
    # give more than the finished member
    fixed = next(k for k in a.checks if k.id == "bearing" and k.location == "support 1")
    assert total - staged > total - finished
    assert fixed.demand == pytest.approx((total - staged) / (b * 3 * INCH), rel=1e-9)


def test_stages_acting_against_each_other_make_the_bolt_check_a_missing_check():
    """An overhang loaded before strengthening (hogging over the support) and the span
    loaded after (sagging): the moments of the stages have opposite signs somewhere, so the
    bolts checked for every load on the finished member are not an upper bound."""
    d = _project()
    d["beam"]["spans"] = ["12 ft"]
    d["beam"]["overhang_right"] = "3 ft"
    d["beam"]["loads"] = [
        {"case": "D", "type": "point", "value": "400 lbf", "at": "15 ft", "stage": "before"},
        {"case": "L", "type": "line", "value": "100 plf", "from": "0 ft", "to": "12 ft"}]
    a = run(from_dict(d))
    reasons = [w for w in a.incomplete_reasons if "acts against the after-stage" in w.message]
    assert reasons and a.verdict != "OK"
