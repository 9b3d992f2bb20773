"""Existing timber of unknown grade: an "existing" record takes the assumed grade's values
with its strengths times the condition factor, says so in the check sources and the
warnings, reads and writes back in its own form, and refuses bad records by field; and
the glulam Fbx- warning under negative moment.

Facts of the project's own design; the assumed grade's values are the library's
(NDS Supplement 2018 Table 4A, from memory).
"""

from __future__ import annotations

import io
import json

import pytest
from pypdf import PdfReader

from plystack.core.io.project_file import dumps, from_dict, loads
from plystack.core.model.errors import ProjectError
from plystack.core.model.materials import STRENGTH_KEYS
from plystack.core.pipeline import run
from plystack.core.report.sheet import build_sheet


def header(material: str, existing: dict | None = None, supports: str = "simple",
           spans: list[str] | None = None) -> dict:
    data = {
        "format": "plystack", "version": 1, "title": "invented existing joist",
        "display_units": "US",
        "plies": [{"name": "joist", "material": material, "x": "0 in", "y": "0 in",
                   "width": "1.5 in", "height": "9.25 in"}],
        "beam": {"spans": spans or ["12 ft"], "supports": supports, "bearing_length": "3 in",
                 "loads": [{"case": "D", "type": "line", "value": "40 plf"},
                           {"case": "L", "type": "line", "value": "100 plf"}]},
        "design": {"basis": "US-ASD"},
    }
    if existing is not None:
        data["materials"] = {"old-joist": existing}
    return data


def test_values_are_the_assumed_grades_times_the_factor():
    p = from_dict(header("old-joist", {"existing": {"assumed": "DFL-No2",
                                                    "condition_factor": 0.9}}))
    m, base = p.all_materials()["old-joist"], p.library["DFL-No2"]
    assert m.kind == "timber" and m.product == base.product
    assert m.E == base.E and m.density == base.density
    for key, v in base.values.items():
        assert m.values[key] == (v * 0.9 if key in STRENGTH_KEYS else v), key
    assert m.name == "existing, assumed Douglas Fir-Larch No.2"
    assert "condition factor 0.9" in m.source_of("Fb") and "verify" in m.source_of("Fb")


def test_checks_use_the_reduced_values_and_carry_the_caution():
    old = run(from_dict(header("old-joist", {"existing": {"assumed": "DFL-No2",
                                                          "condition_factor": 0.9}})))
    new = run(from_dict(header("DFL-No2")))
    for check_id in ("bending", "shear", "bearing"):
        a = max((c for c in old.checks if c.id == check_id), key=lambda c: c.ratio)
        b = max((c for c in new.checks if c.id == check_id), key=lambda c: c.ratio)
        assert a.capacity == pytest.approx(0.9 * b.capacity, rel=1e-12), check_id
        assert a.demand == pytest.approx(b.demand, rel=1e-12)
        assert any("condition factor 0.9" in s and "verify" in s for s in a.sources.values())
    warned = [w for w in old.warnings if w.path == "materials.old-joist"]
    assert len(warned) == 1 and "DFL-No2" in warned[0].message
    assert "verify" in warned[0].message


def test_default_factor_is_one_and_a_name_may_be_given():
    p = from_dict(header("old-joist", {"existing": {"assumed": "HF-No2"},
                                       "name": "joist found on site"}))
    m = p.all_materials()["old-joist"]
    assert m.values == p.library["HF-No2"].values
    assert m.existing is not None and m.existing.condition_factor == 1.0
    assert m.name == "joist found on site"


def test_round_trip_keeps_the_record_form():
    p = from_dict(header("old-joist", {"existing": {"assumed": "DFL-No2",
                                                    "condition_factor": 0.85}}))
    text = dumps(p)
    rec = json.loads(text)["materials"]["old-joist"]
    assert rec["existing"] == {"assumed": "DFL-No2", "condition_factor": 0.85}
    assert "Fb" not in rec
    assert loads(text) == p


def test_the_sheet_prints_the_assumed_grade_and_factor():
    p = from_dict(header("old-joist", {"existing": {"assumed": "DFL-No2",
                                                    "condition_factor": 0.9}}))
    buf = io.BytesIO()
    build_sheet(p, buf)
    text = " ".join(pg.extract_text() for pg in PdfReader(io.BytesIO(buf.getvalue())).pages)
    text = " ".join(text.split())
    assert "condition factor 0.9" in text and "verify" in text


@pytest.mark.parametrize("record, path, words", [
    ({"existing": {"assumed": "NOPE"}}, "materials.old-joist.existing.assumed",
     "not a known timber grade"),
    ({"existing": {"assumed": "A36"}}, "materials.old-joist.existing.assumed",
     "not a known timber grade"),
    ({"existing": {"assumed": "DFL-No2", "condition_factor": 0}},
     "materials.old-joist.existing.condition_factor", "greater than 0"),
    ({"existing": {"assumed": "DFL-No2", "condition_factor": 1.2}},
     "materials.old-joist.existing.condition_factor", "at most 1"),
    ({"existing": {"assumed": "DFL-No2", "condition_factor": "0.9"}},
     "materials.old-joist.existing.condition_factor", "plain number"),
    ({"existing": {"assumed": "DFL-No2", "grade": "No.2"}},
     "materials.old-joist.existing.grade", "not one of"),
    ({"existing": {"assumed": "DFL-No2"}, "Fb": "900 psi"}, "materials.old-joist.Fb",
     "assumed grade"),
    ({"existing": "DFL-No2"}, "materials.old-joist.existing", "must be an object"),
])
def test_bad_records_name_the_field(record, path, words):
    with pytest.raises(ProjectError) as err:
        from_dict(header("old-joist", record))
    found = [p for p in err.value.problems if p.path == path]
    assert found and words in found[0].message, err.value.problems


@pytest.mark.parametrize("material, supports, spans, hogging", [
    ("GLU-24F-V4-DF", "simple", ["12 ft", "12 ft"], True),
    ("GLU-24F-V4-DF", "cantilever", ["6 ft"], True),
    ("GLU-24F-V4-DF", "simple", ["12 ft"], False),
])
def test_glulam_hogging_bending_uses_fbx_minus(material, supports, spans, hogging):
    """NDS Supplement Table 5A (from memory): Fbx- where the compression-zone laminations
    are stressed in tension (hogging moment of a layup for sagging)."""
    data = header(material, supports=supports, spans=spans)
    data["plies"][0].update({"width": "3.125 in", "height": "12 in"})
    a = run(from_dict(data))
    mat = a.section.materials[0]
    refs = {c.reference for c in a.checks if c.id == "bending"}
    if hogging:
        assert ("Fb_neg", mat.value("Fb_neg")) in refs
    else:
        assert refs == {("Fb", mat.value("Fb"))}


def test_existing_timber_cannot_assume_existing_timber():
    from plystack.core.io.library import load_library
    from plystack.core.model.materials import existing_from_record, existing_material

    lib = load_library()
    first = existing_material("old", lib["DFL-No2"], 0.9)
    m, problems = existing_from_record("older", {"existing": {"assumed": "old"}},
                                       {**lib, "old": first}, "materials.older")
    assert m is None
    assert [p.path for p in problems] == ["materials.older.existing.assumed"]
    assert "itself existing timber" in problems[0].message
