"""A joist strengthened under its dead load (staged loading), checked by hand.

Invented scenario: an existing 2x10 Douglas Fir-Larch No.2 joist, 15 ft simple span,
carries 40 plf dead load when a 1/4 in x 9 1/4 in A36 side plate is bolted on; 100 plf
live load comes afterwards. Hand calculation (superposition of the two stages):
stage 1, M1 = w_D L^2 / 8 on the 2x10 alone, f = M c / I; stage 2, M2 = w_L L^2 / 8 on
the transformed section (plate width times n = E_steel / E_timber), f = M c / I_t;
deflection 5 w L^4 / (384 EI) per stage on that stage's EI.
"""

from __future__ import annotations

import pytest

from plystack.core.io.output import check_json
from plystack.core.io.project_file import from_dict
from plystack.core.model.constants import INCH, LBF
from plystack.core.pipeline import run
from tests.helpers import unit_load_deflection

FT = 12 * INCH
PLF = LBF / FT


def _project(shored: bool = False, plate_stage: str = "added") -> dict:
    return {
        "format": "plystack", "version": 1, "display_units": "US",
        "title": "Invented test: 2x10 joist plated under its dead load",
        "materials": {},
        "plies": [
            {"name": "joist", "material": "DFL-No2", "x": "0 in", "y": "0 in",
             "width": "1.5 in", "height": "9.25 in"},
            {"name": "plate", "material": "A36", "x": "1.5 in", "y": "0 in",
             "width": "0.25 in", "height": "9.25 in", "stage": plate_stage},
        ],
        "beam": {"spans": ["15 ft"], "supports": "simple", "self_weight": False,
                 "shored": shored, "combinations": "ASD",
                 "loads": [{"case": "D", "type": "line", "value": "40 plf",
                            "stage": "before"},
                           {"case": "L", "type": "line", "value": "100 plf"}]},
        "design": {"basis": "US-ASD", "bolt": {"diameter": "1/2 in", "Fyb": "45000 psi",
                                               "rows": 1}},
    }


def _hand(p):
    mats = p.all_materials()
    Et, Es = mats["DFL-No2"].E, mats["A36"].E
    L = 15 * FT
    b, t, d = 1.5 * INCH, 0.25 * INCH, 9.25 * INCH
    I_timber = b * d**3 / 12
    n = Es / Et
    I_t = (b + n * t) * d**3 / 12  # same depth and position: neutral axis at d / 2
    M1 = 40 * PLF * L**2 / 8
    M2 = 100 * PLF * L**2 / 8
    f_timber = M1 * (d / 2) / I_timber + M2 * (d / 2) / I_t
    w_total = (5 * 40 * PLF * L**4 / (384 * Et * I_timber)
               + 5 * 100 * PLF * L**4 / (384 * Et * I_t))
    return f_timber, w_total, n * M2 * (d / 2) / I_t


def test_staged_timber_stress_and_deflection_equal_the_two_hand_stages():
    p = from_dict(_project())
    a = run(p)
    f_timber, w_total, _ = _hand(p)
    bend = [c for c in a.checks if c.id == "bending" and c.ply == "joist"
            and c.combination == "D + L"]
    assert bend[0].demand == pytest.approx(f_timber, rel=1e-9)
    assert bend[0].x == pytest.approx(7.5 * FT, rel=1e-9)
    tot = [c for c in a.checks if c.id == "deflection-total" and c.combination == "D + L"]
    assert tot[0].demand == pytest.approx(w_total, rel=1e-9)


def test_shored_member_acts_as_built_up_for_every_load():
    staged = run(from_dict(_project()))
    shored = run(from_dict(_project(shored=True)))
    assert shored.stages is None
    j = [c for c in shored.checks if c.id == "bending" and c.ply == "joist"
         and c.combination == "D + L"][0]
    k = [c for c in staged.checks if c.id == "bending" and c.ply == "joist"
         and c.combination == "D + L"][0]
    assert k.demand > j.demand
    # every ply existing: no stages, the same as shored
    same = run(from_dict(_project(plate_stage="existing")))
    assert check_json(same)["checks"] == check_json(shored)["checks"]


def test_stages_in_json():
    p = from_dict(_project())
    out = check_json(run(p))
    st = out["stages"]
    before = {c["combination"]: c for c in st["before"]["combinations"]}
    L = 15 * FT
    assert before["D + L"]["M_max"] == pytest.approx(40 * PLF * L**2 / 8, rel=1e-9)
    after = {c["combination"]: c for c in st["after"]["combinations"]}
    assert after["D + L"]["M_max"] == pytest.approx(100 * PLF * L**2 / 8, rel=1e-9)
    assert st["before"]["plies"] == ["joist"] and st["after"]["plies"] == ["joist", "plate"]
    assert st["shored"] is False


def test_stages_in_the_text_output_add_up_to_the_deflection_checked():
    """The text of ``check`` shows both stages beside the built-up section's table: the
    deflections 5 w L^4 / (384 EI) of each stage (midspan, both uniform) and their sum,
    the deflection-total check's demand (to the 3 figures printed)."""
    from plystack.core.io.output import check_text
    from plystack.core.model.units import fmt

    p = from_dict(_project())
    a = run(p)
    text = check_text(a)
    assert "Stages (strengthened under load" in text
    mats = p.all_materials()
    L, Et = 15 * FT, mats["DFL-No2"].E
    w1 = 5 * 40 * PLF * L**4 / (384 * Et * 1.5 * INCH * (9.25 * INCH) ** 3 / 12)
    _, w_total, _ = _hand(p)
    row = next(t for t in text.splitlines() if t.strip().startswith("D + L ")
               and t.count(" in") == 3)
    assert row.split()[-6:] == [*fmt(w1, "deflection", "US", 3).split(),
                                *fmt(w_total - w1, "deflection", "US", 3).split(),
                                *fmt(w_total, "deflection", "US", 3).split()]


def test_staged_long_term_deflection_creeps_the_dead_load_on_the_joist_alone():
    """US: the sustained part is D (no sustained live fraction given); NDS 2018 3.5.2
    K_cr divides the timber modulus under it (from memory); the live load is short-term
    on the built-up section."""
    p = from_dict(_project())
    a = run(p)
    mats = p.all_materials()
    Et = mats["DFL-No2"].E
    L = 15 * FT
    b, t, d = 1.5 * INCH, 0.25 * INCH, 9.25 * INCH
    I_t = (b + mats["A36"].E / Et * t) * d**3 / 12
    K = a.beam.creep_factor
    ref = (5 * 40 * PLF * L**4 * K / (384 * Et * b * d**3 / 12)
           + 5 * 100 * PLF * L**4 / (384 * Et * I_t))
    lt = [c for c in a.checks if c.id == "deflection-long-term" and c.combination == "D + L"]
    assert lt[0].demand == pytest.approx(ref, rel=1e-9)


def test_stage_keys_read_write_and_name_bad_values():
    from plystack.core.io.project_file import to_dict
    from plystack.core.model.errors import ProjectError

    p = from_dict(_project())
    back = to_dict(p)
    assert back["plies"][1]["stage"] == "added" and "stage" not in back["plies"][0]
    assert back["beam"]["loads"][0]["stage"] == "before"
    assert from_dict(back) == p
    assert from_dict(to_dict(from_dict(_project(shored=True)))).beam.shored is True
    bad = _project()
    bad["plies"][1]["stage"] = "new"
    bad["beam"]["loads"][1]["stage"] = "later"
    bad["beam"]["shored"] = "yes"
    with pytest.raises(ProjectError) as info:
        from_dict(bad)
    paths = {q.path for q in info.value.problems}
    assert {"plies[1].stage", "beam.loads[1].stage", "beam.shored"} <= paths


# --- stepped and staged together -------------------------------------------------------
# The plate of _project() stops 1.5 ft short of each support. Sources: the hand stages
# above; the deflection of each stage by the unit-load method (virtual work, delta =
# integral M m / EI(x) dx) integrated exactly by sympy over the stage's piecewise EI; a
# propped member's reaction by compatibility (any structural analysis text).

def _stepped(shored: bool = False, supports: str = "simple") -> dict:
    d = _project(shored)
    d["plies"][1]["from"] = "1.5 ft"
    d["plies"][1]["to"] = "13.5 ft"
    d["beam"]["supports"] = supports
    return d


def test_stepped_and_staged_timber_stress_by_segment_by_hand():
    """Simple span, so both stages' moments are the statics' w x (L - x) / 2 whatever the
    stiffness. Middle segment: f = M1 c / I_joist + M2 c / I_t at midspan; end segment
    (joist alone in both stages): f = (M1 + M2) c / I_joist at the plate's end, 1.5 ft."""
    p = from_dict(_stepped())
    a = run(p)
    assert a.stages is not None and len(a.segments) == 3
    f_mid, _, _ = _hand(p)
    L, d, b = 15 * FT, 9.25 * INCH, 1.5 * INCH
    x = 1.5 * FT
    f_end = (140 * PLF) * x * (L - x) / 2 * (d / 2) / (b * d**3 / 12)
    bend = {c.segment: c for c in a.checks if c.id == "bending" and c.ply == "joist"
            and c.combination == "D + L"}
    assert bend[1].demand == pytest.approx(f_mid, rel=1e-9)
    assert bend[1].x == pytest.approx(7.5 * FT, rel=1e-9)
    assert bend[0].demand == pytest.approx(f_end, rel=1e-9)
    assert bend[0].x == pytest.approx(x, rel=1e-9)


def test_stepped_and_staged_deflection_againstunit_load_deflection():
    """Before-stage (40 plf) on the joist alone (prismatic: 5 w L^4 / 384 EI); after-stage
    (100 plf) on the stepped EI, joist alone beyond the plate. Long-term (US, D wholly
    sustained): the before-stage on EI_joist / K_cr, the after-stage short-term."""
    import sympy as sp
    p = from_dict(_stepped())
    a = run(p)
    mats = p.all_materials()
    Et, Es = mats["DFL-No2"].E, mats["A36"].E
    b, t, d = 1.5 * INCH, 0.25 * INCH, 9.25 * INCH
    EI_j = Et * b * d**3 / 12
    EI_b = Et * (b + Es / Et * t) * d**3 / 12
    L = sp.nsimplify(15 * FT)
    c1, c2 = sp.nsimplify(1.5 * FT), sp.nsimplify(13.5 * FT)
    after = [(0, c1, sp.Float(EI_j, 30)), (c1, c2, sp.Float(EI_b, 30)),
             (c2, L, sp.Float(EI_j, 30))]
    w1 = 40 * PLF
    w2 = sp.Float(100 * PLF, 30)
    Lf = 15 * FT
    before = 5 * w1 * Lf**4 / (384 * EI_j)
    ref = before + unit_load_deflection(L, w2, after, L / 2)
    tot = [c for c in a.checks if c.id == "deflection-total" and c.combination == "D + L"]
    assert tot[0].demand == pytest.approx(ref, rel=1e-9)
    K = a.beam.creep_factor
    lt = [c for c in a.checks if c.id == "deflection-long-term" and c.combination == "D + L"]
    assert lt[0].demand == pytest.approx(before * K + unit_load_deflection(L, w2, after, L / 2),
                                         rel=1e-9)


def test_stepped_and_staged_propped_member_redistributes_each_stage():
    """Fixed left, pinned right: each stage's right reaction from compatibility on its own
    stiffness, R = -int M0 m / EI / int m^2 / EI (M0 the cantilever's moment, m = s = L - x);
    before-stage: joist alone (prismatic, 3 w L / 8); after-stage: the stepped EI. The
    stage moments are checked through the stages' JSON (M_max of each stage)."""
    import sympy as sp
    p = from_dict(_stepped(supports="propped"))
    a = run(p)
    mats = p.all_materials()
    Et, Es = mats["DFL-No2"].E, mats["A36"].E
    b, t, d = 1.5 * INCH, 0.25 * INCH, 9.25 * INCH
    EI_j = sp.Float(Et * b * d**3 / 12, 30)
    EI_b = sp.Float(Et * (b + Es / Et * t) * d**3 / 12, 30)
    L = sp.nsimplify(15 * FT)
    c1, c2 = sp.nsimplify(1.5 * FT), sp.nsimplify(13.5 * FT)
    x, R = sp.symbols("x R")
    s = L - x
    w2 = sp.Float(100 * PLF, 30)
    Mx = R * s - w2 * s**2 / 2
    eq = sum(sp.integrate(Mx * s / EI, (x, lo, hi))
             for lo, hi, EI in ((0, c1, EI_j), (c1, c2, EI_b), (c2, L, EI_j)))
    R2 = float(sp.solve(eq, R)[0])
    R1 = 3 * 40 * PLF * float(L) / 8
    # the largest sagging moment of each stage: at s = R / w from the pinned end, R^2 / 2w
    out = check_json(a)["stages"]
    before = {c["combination"]: c for c in out["before"]["combinations"]}["D + L"]
    after = {c["combination"]: c for c in out["after"]["combinations"]}["D + L"]
    assert before["M_max"] == pytest.approx(R1**2 / (2 * 40 * PLF), rel=1e-9)
    assert after["M_max"] == pytest.approx(R2**2 / (2 * float(w2)), rel=1e-9)
    assert abs(R2 - 3 * float(w2 * L) / 8) > 1e-4 * float(w2 * L)


def test_stepped_and_staged_needs_an_existing_ply_everywhere():
    d = _stepped()
    d["plies"][0]["from"] = "1 ft"  # the existing joist no longer reaches the left end
    d["plies"][1]["from"] = "0 ft"
    from plystack.core.model.errors import ProjectError
    with pytest.raises(ProjectError) as err:
        run(from_dict(d))
    assert "existing ply" in str(err.value)
