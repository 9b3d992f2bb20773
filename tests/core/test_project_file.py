"""Project file: round trip, named messages for every kind of bad input, fuzzing."""

from __future__ import annotations

import copy
import json
import math
import os
from dataclasses import replace
from pathlib import Path

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from plystack.core.io.project_file import dumps, from_dict, load, loads, save
from plystack.core.model.design import Bolt
from plystack.core.model.errors import ProjectError

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"


def base() -> dict:
    return json.loads(DEMO.read_text())


def problems_of(data) -> list[str]:
    with pytest.raises(ProjectError) as info:
        from_dict(data)
    return [str(p) for p in info.value.problems]


def test_demo_loads_and_round_trips(tmp_path):
    p = load(DEMO)
    out = tmp_path / "copy.plystack.json"
    save(p, out)
    assert load(out) == p
    assert loads(dumps(p)) == p


def test_si_round_trip(tmp_path):
    from dataclasses import replace

    p = replace(load(DEMO), display_units="SI")
    save(p, tmp_path / "si.json")
    assert load(tmp_path / "si.json") == p


def test_failed_save_keeps_old_file(tmp_path, monkeypatch):
    p = load(DEMO)
    target = tmp_path / "keep.plystack.json"
    save(p, target)
    before = target.read_bytes()

    def boom(*a, **k):
        raise OSError("disk full")

    monkeypatch.setattr(os, "replace", boom)
    with pytest.raises(ProjectError, match="file: cannot write .*: disk full"):
        save(p, target)
    assert target.read_bytes() == before
    assert [f.name for f in tmp_path.iterdir()] == ["keep.plystack.json"]


@pytest.mark.parametrize("mutate,expected", [
    (lambda d: d.update(format="other"), "format: must be"),
    (lambda d: d.update(version=99), "version: 99 is newer"),
    (lambda d: d.update(colour="red"), "colour: is not a known key"),
    (lambda d: d["plies"][2].update(height="12 apples"),
     'plies[2].height: "12 apples" is not a length'),
    (lambda d: d["plies"][0].update(width="12"), 'plies[0].width: "12" has no unit'),
    (lambda d: d["plies"][1].pop("material"), "plies[1].material: is missing"),
    (lambda d: d["plies"][1].update(material="unobtainium"),
     'plies[1].material: "unobtainium" is not a known material'),
    (lambda d: d["plies"][0].update(width="-2 in"), "plies[0].width: must be greater than zero"),
    (lambda d: d["plies"][0].update(height="0 in"), "plies[0].height: must be greater than zero"),
    (lambda d: d["plies"][0].update(depth="2 in"), "plies[0].depth: is not a known key"),
    (lambda d: d.update(materials={"m": {"kind": "timber", "E": "lots", "density": "500 kg/m^3"}}),
     'materials.m.E: "lots" has no number'),
    (lambda d: d.update(materials={"m": {"kind": "wood", "E": "11 GPa", "density": "5 pcf"}}),
     "materials.m.kind: must be one of"),
    (lambda d: d.update(materials={"m": {"kind": "timber", "E": "11 GPa", "density": "5 pcf",
                                         "G": "heavy"}}), "materials.m.G: must be a plain"),
    (lambda d: d["beam"].update(spans=["0 ft"]), "beam.spans[0]: must be greater than zero"),
    (lambda d: d["beam"].update(supports="hinged"), 'beam.supports: "hinged" is not one of'),
    (lambda d: d["beam"].update(spans=["10 ft", "10 ft"], supports="propped"),
     'beam.supports: "propped" needs exactly one span'),
    (lambda d: d["beam"].update(bearing_length="10 ft"),  # two bearings on a 12 ft span
     "beam.bearing_length: 120.0 in is longer than half the shortest span (72.00 in): the "
     "bearings would overlap the member"),
    (lambda d: d["beam"]["loads"][2].update(at="40 ft"),
     "beam.loads[2].at: is outside the member (0 to 12.00 ft)"),  # the file's units
    (lambda d: d["plies"][1].update({"from": "20 ft"}),
     "plies[1].from: is outside the member (0 to 12.00 ft)"),
    (lambda d: d["beam"].update(holes=[{"diameter": "1 in", "at": "30 ft", "y": "4 in"}]),
     "beam.holes[0].at: is outside the member (0 to 12.00 ft)"),
    (lambda d: d["beam"]["loads"][0].update(case="X"),
     'beam.loads[0].case: "X" is not a load case'),
    (lambda d: d["beam"]["loads"][0].update(value="40 psi m"), "beam.loads[0].value"),
    (lambda d: d["beam"].update(combinations="LRFD"), 'beam.combinations: "LRFD" is not a known'),
    (lambda d: d["design"].update(basis="CSA"), 'design.basis: "CSA" must be one of'),
])
def test_bad_input_named(mutate, expected):
    data = base()
    mutate(data)
    msgs = problems_of(data)
    assert any(expected in m for m in msgs), msgs


def test_every_problem_reported_at_once():
    data = base()
    data["plies"][0]["width"] = "wide"
    data["plies"][2]["height"] = "12 apples"
    data["version"] = 7
    msgs = problems_of(data)
    assert len(msgs) >= 3


def test_not_json():
    with pytest.raises(ProjectError, match="not valid JSON"):
        loads("{nope")


def test_missing_file(tmp_path):
    with pytest.raises(ProjectError, match="cannot read"):
        load(tmp_path / "none.json")


json_values = st.recursive(
    st.none() | st.booleans() | st.integers() | st.floats(allow_nan=True) | st.text(max_size=12),
    lambda inner: st.lists(inner, max_size=4) | st.dictionaries(st.text(max_size=10), inner,
                                                                 max_size=4),
    max_leaves=20)


@settings(max_examples=300, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(json_values)
def test_fuzz_random_json_only_raises_project_error(value):
    try:
        from_dict(value)
    except ProjectError:
        pass


keys = st.sampled_from(["plies", "beam", "design", "materials", "title", "version"])


@settings(max_examples=200, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(key=keys, value=json_values, idx=st.integers(0, 2), sub=st.text(max_size=8))
def test_fuzz_mutated_demo_only_raises_project_error(key, value, idx, sub):
    data = copy.deepcopy(base())
    target = data.get(key)
    if isinstance(target, list) and target:
        target[idx % len(target)] = value
    elif isinstance(target, dict):
        target[sub or "x"] = value
    else:
        data[key] = value
    try:
        from_dict(data)
    except ProjectError:
        pass


def test_material_without_density_loads_and_warns():
    from plystack.core.pipeline import run

    p = from_dict({"format": "plystack", "version": 1,
                   "materials": {"w": {"kind": "timber", "E": "11 GPa"}},
                   "plies": [{"name": "a", "material": "w", "x": "0 mm", "y": "0 mm",
                              "width": "50 mm", "height": "200 mm"}],
                   "beam": {"spans": ["3 m"], "supports": "simple",
                            "loads": [{"case": "L", "type": "line", "value": "2 kN/m"}]}})
    a = run(p)
    assert any("materials.w.density" in str(w) for w in a.warnings)
    assert a.section.mass_per_length == 0.0


@pytest.mark.parametrize("mutate,expected", [
    (lambda d: d["plies"][0].update(material=None), "plies[0].material: null is not a known"),
    (lambda d: d["plies"][1].update(height=True), "plies[1].height: true must be a string"),
    (lambda d: d["plies"][1].update(width=False), "plies[1].width: false must be a string"),
    (lambda d: d.update(format="it's"), '''format: must be "plystack" (got "it's")'''),
    (lambda d: d["design"].update(basis=None), "design.basis: null must be one of"),
])
def test_values_are_quoted_as_the_file_spells_them(mutate, expected):
    """A value echoed in a message is spelt as JSON (null, true, "text"), never in
    Python's spelling (None, True, 'text').
    """
    d = json.loads(DEMO.read_text())
    mutate(d)
    with pytest.raises(ProjectError) as info:
        loads(json.dumps(d))
    text = "\n".join(str(p) for p in info.value.problems)
    assert expected in text
    assert not any(w in text for w in ("None", "True", "False", "'it")), text


def test_saving_adds_no_bolt_strength_the_basis_does_not_read():
    """The US demo says no ``fu`` (EN 1995-1-1 (8.30) only): its save adds none; an EU
    bolt at the default ``Fyb`` (NDS only) is saved without it; a value the user gave is
    kept on either basis.
    """
    us = json.loads(dumps(load(DEMO)))
    assert set(us["design"]["bolt"]) == {"diameter", "Fyb", "rows"}
    p = load(DEMO)
    bolt = replace(p.design.bolt, Fyb=Bolt().Fyb, diameter=0.016)
    eu = replace(p, design=replace(p.design, basis="EU-LSD", bolt=bolt))
    assert "Fyb" not in json.loads(dumps(eu))["design"]["bolt"]
    given = replace(p, design=replace(p.design, bolt=replace(p.design.bolt, fu=500e6)))
    assert json.loads(dumps(given))["design"]["bolt"]["fu"] == "500 MPa"
    assert load_text_round(given) == given


def load_text_round(project):
    return loads(dumps(project))


@pytest.mark.parametrize("text,reason", [
    ("3,6 m", "has a comma: write a decimal point and no thousands separator"),
    ("12,5 ft", "has a comma"),
    ("1,000 in", "has a comma"),
    ("12.5.1 ft", 'has a malformed number "12.5.1"'),
    ("1_000 in", 'has a malformed number "1_000"'),
    ("2 3 ft", "has two numbers side by side"),
    ("1 000 in", "has two numbers side by side"),
    ("1 1/2/2 ft", "has a fraction of a fraction"),
    ("ft 12", "must begin with its number"),
    ("5 m 2", "has two numbers side by side"),
    ('6" 1/2', "has two numbers side by side"),
    ("2 (3) ft", "has two numbers side by side"),
    ("2 1/2 1/2 in", "has two numbers side by side"),
])
def test_number_notations_read_as_another_value_are_refused(text, reason):
    """"3,6 m" was read as 36 m, "12.5.1 ft" as 1.25 ft and "2 3 ft" as 6 ft, silently."""
    d = json.loads(DEMO.read_text())
    d["beam"]["spans"] = [text]
    with pytest.raises(ProjectError) as info:
        loads(json.dumps(d))
    assert str(info.value.problems[0]).startswith(f'beam.spans[0]: "{text}" {reason}')


@pytest.mark.parametrize("text,inches", [("9 1/4 in", 9.25), ("12 ft 6 in", 150.0),
                                         ('12\' 6"', 150.0), ("1 3/4 in", 1.75),
                                         ("9-1/4 in", 9.25), ("12E1 in", 120.0),
                                         (".5 in", 0.5), ("12 ft 6 1/2 in", 150.5),
                                         ("6 in.", 6.0), ("1/4 in.", 0.25), ("14 ft.", 168.0),
                                         ("9\u00bd in", 9.5), ("11\u215e in", 11.875),
                                         ("\u00bd in", 0.5), ("9 1\u20444 in", 9.25),
                                         ("12'6\"", 150.0), ("2'-0 3/4\"", 24.75)])
def test_trade_notations_still_read(text, inches):
    """Abbreviations with a period, Unicode fractions (9\u00bd in was read as 9 in) and the
    fraction slash read as the trade means them."""
    from plystack.core.model import units

    assert math.isclose(units.parse(text, "length", "x"), inches * 0.0254, rel_tol=1e-15)
