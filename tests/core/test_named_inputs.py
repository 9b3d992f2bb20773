"""What the user asks for by name is either applied or said: overrides of a ply or a
factor no check takes, design fields of the other basis, notches and holes in plies that
are not there, and plies without a name.
"""

from __future__ import annotations

import copy
import json
from pathlib import Path

import pytest

from plystack.core.io.project_file import loads
from plystack.core.model.errors import ProjectError
from plystack.core.pipeline import run

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo"
US = json.loads((DEMO / "porch-header.plystack.json").read_text())
EU = json.loads((DEMO / "stair-trimmer-eu.plystack.json").read_text())


def _run(data: dict):
    return run(loads(json.dumps(data)))


def _said(analysis, prefix: str) -> list[str]:
    return [str(w) for w in analysis.warnings if w.path.startswith(prefix)]


def test_an_applied_override_is_not_said_and_takes_effect():
    d = copy.deepcopy(US)
    d["design"]["overrides"] = {"left 2x10": {"C_D": 0.9}}
    a = _run(d)
    assert _said(a, "design.overrides") == []
    bending = [c for c in a.checks if c.id == "bending" and c.ply == "left 2x10"]
    assert bending and all(c.factors["C_D"] == 0.9 and c.sources["C_D"] == "user override"
                           for c in bending)


def test_unapplied_overrides_are_named():
    d = copy.deepcopy(US)
    d["design"]["overrides"] = {"ghost": {"C_D": 0.9}, "left 2x10": {"CD": 0.9},
                                "flitch plate": {"k_mod": 0.8}}
    a = _run(d)
    assert _said(a, "design.overrides") == [
        'design.overrides.ghost: no ply is named "ghost"; its overrides are not applied',
        'design.overrides.left 2x10.CD: no check of "left 2x10" has the factor CD on the '
        "US-ASD basis; not applied",
        'design.overrides.flitch plate.k_mod: no check of "flitch plate" has the factor '
        "k_mod on the US-ASD basis; not applied"]


@pytest.mark.parametrize("data,field,value,expected", [
    (US, "k_def", 0.6, "design.k_def: is the EN 1995-1-1 Table 3.2 creep factor, read only "
     "on the EU-LSD basis; not used on the US-ASD basis"),
    (US, "service_class", 2, "design.service_class: is the EN 1995-1-1 2.3.1.3 service "
     "class, read only on the EU-LSD basis; not used on the US-ASD basis"),
    (EU, "K_cr", 2.0, "design.K_cr: is the NDS 2018 3.5.2 creep factor, read only on the "
     "US-ASD basis; not used on the EU-LSD basis"),
    (EU, "wet_service", True, "design.wet_service: is the NDS wet service factors C_M, read "
     "only on the US-ASD basis; not used on the EU-LSD basis"),
])
def test_a_field_of_the_other_basis_is_said(data, field, value, expected):
    d = copy.deepcopy(data)
    d["design"][field] = value
    a = _run(d)
    assert _said(a, f"design.{field}") == [expected]
    same = _run(data)
    assert [(c.id, c.ratio) for c in a.checks] == [(c.id, c.ratio) for c in same.checks]


def test_the_demos_say_no_field_of_the_other_basis():
    for data in (US, EU):
        a = _run(data)
        assert _said(a, "design.") == []


@pytest.mark.parametrize("name", ["", "   "])
def test_a_ply_without_a_name_is_refused(name):
    d = copy.deepcopy(US)
    d["plies"][0]["name"] = name
    with pytest.raises(ProjectError) as info:
        loads(json.dumps(d))
    assert [str(p) for p in info.value.problems] == [
        "plies[0].name: is empty; every ply needs a name (the checks, overrides and --ply "
        "name it)"]


NOTCH = {"face": "bottom", "depth": "1 in", "length": "3 in", "at": "0 in"}
HOLE = {"diameter": "1 in", "at": "3 ft", "y": "4 in"}
PLIES = '"left 2x10", "flitch plate", "right 2x10"'


@pytest.mark.parametrize("key,item,expected", [
    ("notches", {**NOTCH, "plies": ["ghost"]},
     f'beam.notches[0].plies: "ghost" is not a ply of the member at x = 0 ft ({PLIES})'),
    ("notches", {**NOTCH, "plies": ["flitch plate"]},
     'beam.notches[0].plies: "flitch plate" is not timber; a notch is checked in timber '
     "plies (name them, or none for every timber ply)"),
    ("holes", {**HOLE, "plies": ["left 2x10", "ghost"]},
     f'beam.holes[0].plies: "ghost" is not a ply of the member at x = 3.000 ft ({PLIES})'),
])
def test_an_opening_in_a_ply_that_is_not_there_is_refused(key, item, expected):
    d = copy.deepcopy(US)
    d["beam"][key] = [item]
    with pytest.raises(ProjectError) as info:
        _run(d)
    assert [str(p) for p in info.value.problems] == [expected]


def test_a_notch_in_a_named_timber_is_checked():
    d = copy.deepcopy(US)
    d["beam"]["notches"] = [{**NOTCH, "plies": ["left 2x10"]}]
    a = _run(d)
    notch = [c for c in a.checks if "notch" in (c.location or "")]
    assert notch and {c.ply for c in notch} == {"left 2x10"}


def test_a_load_no_strength_combination_takes_makes_the_verdict_incomplete():
    d = copy.deepcopy(US)
    d["beam"]["combinations"] = [{"name": "D", "factors": {"D": 1}, "duration": "permanent",
                                  "kind": "ASD"}]
    a = _run(d)
    assert a.verdict == "INCOMPLETE"
    assert [str(p) for p in a.incomplete_reasons] == [
        "beam.combinations: no strength combination takes case L of beam.loads[1]; the "
        "strength checks leave that load out"]
    d["beam"]["combinations"].append({"name": "D + L", "factors": {"D": 1, "L": 1},
                                      "duration": "ten-years", "kind": "ASD"})
    assert _run(d).verdict == "OK"
    d["beam"]["combinations"] = [{"name": "L", "factors": {"L": 1}, "duration": "ten-years",
                                  "kind": "ASD"}]
    reasons = [str(p) for p in _run(d).incomplete_reasons]
    assert reasons[0] == ("beam.combinations: no strength combination takes case D, which "
                          "holds the self-weight; the strength checks leave it out")
    assert len(reasons) == 1  # the demo's D loads are said with the self-weight


def test_eu_deflections_without_a_characteristic_combination_are_a_missing_check():
    """EN 1995-1-1 7.2 limits the deflection of the characteristic combination (EN 1990
    6.5.3): a user's list of ULS combinations only makes no deflection check, so the
    verdict is INCOMPLETE; a characteristic combination without L leaves the L loads out
    of the deflection checks, and says so.
    """
    d = copy.deepcopy(EU)
    d["beam"]["combinations"] = [{"name": "U1", "factors": {"D": 1.35, "L": 1.5},
                                  "duration": "medium-term", "kind": "ULS"}]
    a = _run(d)
    assert not any(c.id.startswith("deflection") for c in a.checks)
    assert a.verdict == "INCOMPLETE"
    assert [str(p) for p in a.incomplete_reasons] == [
        "beam.combinations: has no SLS-characteristic combination: the deflection checks "
        "(EN 1995-1-1 7.2, EN 1990 6.5.3) are not made"]
    d["beam"]["combinations"].append({"name": "S1", "factors": {"D": 1.0},
                                      "kind": "SLS-characteristic"})
    assert [str(p) for p in _run(d).incomplete_reasons] == [
        f"beam.combinations: no SLS-characteristic combination takes case L of "
        f"beam.loads[{i}]; the deflection checks leave that load out" for i in (1, 3)]
    d["beam"]["combinations"][1]["factors"]["L"] = 1.0
    assert _run(d).incomplete_reasons == ()


def test_a_ply_cut_by_a_later_overlapping_ply_is_said():
    """The demo's plate widened to 1/2 in without moving the right 2x10: the plate is cut
    where they overlap (the later ply wins, by design); that changes its bolts, so it is
    said."""
    d = copy.deepcopy(US)
    d["plies"][1]["width"] = "1/2 in"
    a = _run(d)
    assert _said(a, "plies[1]") == [
        'plies[1]: "flitch plate" is cut by the later "right 2x10" where they overlap (the '
        "later ply wins there): check the widths and positions"]
    assert _said(_run(US), "plies") == []


def test_bolts_the_user_did_not_give_are_said_as_the_default():
    d = copy.deepcopy(US)
    del d["design"]["bolt"]
    a = _run(d)
    assert _said(a, "design.bolt") == [
        "design.bolt: the plates' bolts are the program's default, 0.5000 in diameter, F_yb "
        "45000 psi, 2 rows (design.bolt gives nothing else): give design.bolt for the bolts "
        "to be used"]
    assert _said(_run(US), "design.bolt") == []  # the demo gives its bolts
    e = copy.deepcopy(EU)
    del e["design"]["bolt"]
    assert _said(_run(e), "design.bolt")[0].startswith(
        "design.bolt: the plates' bolts are the program's default, 12.70 mm diameter, f_u "
        "400.0 MPa")


def test_a_hole_without_plies_at_a_plates_height_says_the_plate_is_not_bored():
    d = copy.deepcopy(US)
    d["beam"]["holes"] = [{"diameter": "2 in", "at": "6 ft", "y": "4.625 in"}]
    assert _said(_run(d), "beam.holes") == [
        'beam.holes[0].plies: are not given: the hole bores the timber plies only, and '
        '"flitch plate" at its height is taken as not bored; name every ply it passes through']
    d["beam"]["holes"][0]["plies"] = ["left 2x10", "flitch plate", "right 2x10"]
    assert _said(_run(d), "beam.holes") == []


def test_a_hole_at_a_plies_start_names_it_and_a_hole_in_a_gap_is_checked():
    """A ply's extent is closed: a hole at the very start of a plate that stops short
    may name it (it was refused there and accepted at the plate's end); a hole in the
    joists beside the plate's gap forms a net section of parts apart at two heights,
    which is a net section, not plies that form no member (it was refused)."""
    d = copy.deepcopy(US)
    d["plies"][1]["from"], d["plies"][1]["to"] = "1 ft", "11 ft"
    for at, plies in (("1 ft", ["flitch plate", "left 2x10"]),
                      ("11 ft", ["flitch plate", "left 2x10"]), ("0.5 ft", ["left 2x10"])):
        d["beam"]["holes"] = [{"diameter": "1 in", "at": at, "y": "4 in", "plies": plies}]
        a = _run(d)
        assert any(c.location.startswith("hole 1") for c in a.checks), at


def test_end_distance_and_spacing_beside_stations_are_said_as_not_used():
    d = copy.deepcopy(US)
    d["design"]["bolt"].update(stations=["1 ft", "6 ft", "11 ft"], end_distance="3 in",
                               spacing="24 in")
    a = _run(d)
    assert _said(a, "design.bolt.") == [
        "design.bolt.spacing: is not used: the stations give the bolts' positions",
        "design.bolt.end_distance: is not used: the stations give the bolts' positions"]
