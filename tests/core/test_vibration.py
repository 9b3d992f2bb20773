"""Floor vibration: when the checks are made, when they cannot be and how that is
reported, the "vibration" object of the project file, and the fire note in the output.

Facts of the project's own design and of the clauses' algebra (EN 1995-1-1 7.3.3,
from memory); the hand calculations are in tests/validation/test_hand_floor_vibration.py.
"""

from __future__ import annotations

import copy
import io
import json
import math

import pytest
from pypdf import PdfReader

from plystack.core.codes import en1995
from plystack.core.design.vibration import (
    WARNING_PATH,
    expected_vibration_ids,
    missing_vibration_ids,
)
from plystack.core.io.output import check_json, check_text
from plystack.core.io.project_file import dumps, from_dict, loads
from plystack.core.model.caution import FIRE_NOTE
from plystack.core.model.errors import ProjectError
from plystack.core.model.units import parse
from plystack.core.pipeline import run
from plystack.core.report.sheet import build_sheet

EU_IDS = ("vibration-frequency", "vibration-stiffness", "vibration-velocity")


def floor(basis: str = "EU-LSD", **beam) -> dict:
    data = {
        "format": "plystack", "version": 1, "title": "invented joist floor",
        "display_units": "SI",
        "plies": [{"name": "joist", "material": "C24", "x": "0 mm", "y": "0 mm",
                   "width": "45 mm", "height": "220 mm"}],
        "beam": {"spans": ["4 m"], "supports": "simple", "self_weight": True,
                 "loads": [{"case": "D", "type": "area", "value": "0.5 kPa",
                            "tributary_width": "400 mm"},
                           {"case": "L", "type": "area", "value": "1.5 kPa",
                            "tributary_width": "400 mm"}]},
        "design": {"basis": basis, "vibration": {
            "floor_width": "4.5 m", "spacing": "400 mm", "damping": 0.01,
            "transverse_EI": "2.7 kN*m^2/m"}},
    }
    data["beam"].update(beam)
    return data


def ids(a) -> set[str]:
    return {c.id for c in a.checks if c.id.startswith("vibration")}


def vibration_warnings(a) -> list[str]:
    return [p.message for p in a.warnings if p.path == WARNING_PATH]


def test_off_when_absent():
    data = floor()
    del data["design"]["vibration"]
    a = run(from_dict(data))
    assert ids(a) == set()
    assert expected_vibration_ids(a.design) == ()
    assert not vibration_warnings(a)


@pytest.mark.parametrize("beam", [
    {"spans": ["3 m", "3 m"]},
    {"supports": "cantilever", "spans": ["2 m"]},
    {"supports": "fixed-fixed"},
    {"supports": "propped"},
    {"overhang_right": "600 mm"},
], ids=["continuous", "cantilever", "fixed-fixed", "propped", "overhang"])
@pytest.mark.parametrize("basis", ["EU-LSD", "US-ASD"])
def test_not_a_single_simple_span_is_reported_and_missing(beam, basis):
    a = run(from_dict(floor(basis, **beam)))
    assert ids(a) == set()
    messages = vibration_warnings(a)
    assert len(messages) == 1 and "single simple span" in messages[0]
    want = EU_IDS if basis == "EU-LSD" else EU_IDS[:2]
    assert missing_vibration_ids(a.design, a.checks) == want
    assert all(i in messages[0] for i in want)


def test_uneven_permanent_mass_leaves_frequency_and_velocity_out():
    data = floor()
    data["beam"]["loads"].append({"case": "D", "type": "point", "value": "1 kN", "at": "1 m"})
    a = run(from_dict(data))
    assert ids(a) == {"vibration-stiffness"}
    assert missing_vibration_ids(a.design, a.checks) == ("vibration-frequency",
                                                         "vibration-velocity")
    assert any("beam.loads[2]" in m for m in vibration_warnings(a))


def test_partial_D_load_is_uneven_but_a_full_length_one_counts():
    data = floor()
    data["beam"]["loads"].append({"case": "D", "type": "line", "value": "0.1 kN/m",
                                  "from": "0 m", "to": "2 m"})
    assert ids(run(from_dict(data))) == {"vibration-stiffness"}
    data["beam"]["loads"][-1]["to"] = "4 m"
    a = run(from_dict(data))
    assert ids(a) == set(EU_IDS)
    base = run(from_dict(floor()))
    f_more = next(c for c in a.checks if c.id == "vibration-frequency").capacity
    f_base = next(c for c in base.checks if c.id == "vibration-frequency").capacity
    mu_base = 420 * 0.045 * 0.22 + 500 * 0.4 / 9.80665
    mu_more = mu_base + 100 / 9.80665
    assert f_more == pytest.approx(f_base * math.sqrt(mu_base / mu_more), rel=1e-9)


def test_no_permanent_mass_is_reported():
    data = floor(self_weight=False)
    data["beam"]["loads"] = data["beam"]["loads"][1:]
    a = run(from_dict(data))
    assert ids(a) == {"vibration-stiffness"}
    assert any("no permanent mass" in m for m in vibration_warnings(a))


@pytest.mark.parametrize("key", ["floor_width", "transverse_EI"])
def test_velocity_needs_the_floor_width_and_transverse_stiffness(key):
    data = floor()
    del data["design"]["vibration"][key]
    a = run(from_dict(data))
    assert ids(a) == {"vibration-frequency", "vibration-stiffness"}
    assert missing_vibration_ids(a.design, a.checks) == ("vibration-velocity",)
    assert any(key in m for m in vibration_warnings(a))


def test_us_basis_needs_only_the_spacing():
    data = floor("US-ASD")
    data["design"]["vibration"] = {"spacing": "16 in"}
    a = run(from_dict(data))
    assert ids(a) == {"vibration-frequency", "vibration-stiffness"}
    assert not vibration_warnings(a)
    assert all("common practice" in " ".join(c.notes).lower() for c in a.checks
               if c.id.startswith("vibration"))


def test_n40_is_zero_above_40_hz_and_the_formula_below():
    assert en1995.n_40(40.0, 4.0, 4.0, 1e6, 1e3) == 0.0
    assert en1995.n_40(55.0, 4.0, 4.0, 1e6, 1e3) == 0.0
    assert en1995.n_40(20.0, 4.0, 4.0, 1e6, 1e3) == pytest.approx((3 * 1000) ** 0.25,
                                                                   rel=1e-12)


def test_transverse_stiffness_units():
    """1 lbf in^2 / ft = 4.4482216152605 N x 0.0254^2 m^2 / 0.3048 m (exact definitions)."""
    assert parse("1 lbf*in^2/ft", "EI_per_width", "x") == pytest.approx(
        4.4482216152605 * 0.0254**2 / 0.3048, rel=1e-12)
    assert parse("2.7 kN*m^2/m", "EI_per_width", "x") == pytest.approx(2700.0, rel=1e-12)


@pytest.mark.parametrize("units", ["SI", "US"])
def test_file_round_trip(units):
    data = floor()
    data["display_units"] = units
    data["design"]["vibration"].update({"a_mm_per_kN": 1.3, "b": 110, "frequency_min_Hz": 14,
                                        "point_load": "1 kN",
                                        "point_deflection_limit": "1.2 mm"})
    p = from_dict(data)
    again = loads(dumps(p))
    assert again.design == p.design
    assert again.design is not None and again.design.vibration is not None
    assert json.loads(dumps(p))["design"]["vibration"]["a_mm_per_kN"] == 1.3


@pytest.mark.parametrize("vibration, path, words", [
    ({"floor_width": "4 m"}, "design.vibration.spacing", "missing"),
    ({"spacing": "12 apples"}, "design.vibration.spacing", "not a length"),
    ({"spacing": "-400 mm"}, "design.vibration.spacing", "greater than zero"),
    ({"spacing": "400 mm", "transverse_EI": "3 m"}, "design.vibration.transverse_EI",
     "bending stiffness per width"),
    ({"spacing": "400 mm", "damping": "1 %"}, "design.vibration.damping", "plain number"),
    ({"spacing": "400 mm", "damping": 0.5}, "design.vibration.damping", "at most 0.2"),
    ({"spacing": "400 mm", "a_mm_per_kN": True}, "design.vibration.a_mm_per_kN",
     "plain number"),
    ({"spacing": "400 mm", "colour": "red"}, "design.vibration.colour", "not a known key"),
    ("on", "design.vibration", "must be an object"),
])
def test_bad_input_names_the_field(vibration, path, words):
    data = floor()
    data["design"]["vibration"] = vibration
    with pytest.raises(ProjectError) as err:
        from_dict(data)
    found = [p for p in err.value.problems if p.path == path]
    assert found and words in found[0].message, err.value.problems


def test_fire_note_in_text_and_json_and_the_checks_on_the_sheet():
    a = run(from_dict(floor()))
    assert FIRE_NOTE in check_text(a)
    assert check_json(a)["fire_note"] == FIRE_NOTE
    for word in ("EN 1995-1-2", "NDS", "Chapter 16", "no fire check", "steel"):
        assert word in FIRE_NOTE
    buf = io.BytesIO()
    build_sheet(from_dict(copy.deepcopy(floor())), buf)
    text = " ".join(p.extract_text() for p in PdfReader(io.BytesIO(buf.getvalue())).pages)
    for check_id in EU_IDS:
        assert check_id in text
    assert "mm/kN" in text and "Hz" in text
