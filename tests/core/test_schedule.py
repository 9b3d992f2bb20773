"""The member schedule: overrides equal the same change made by hand in the file, bad
rows are named and never stop the run, results do not depend on the number of processes.

Facts of the project's own contracts (no outside source): the reference for every
member is ``plystack check --json`` of a file changed by hand.
"""

from __future__ import annotations

import copy
import json
from pathlib import Path

import pytest

from plystack.core.cli import main
from plystack.core.design.check import Check
from plystack.core.io import overrides
from plystack.core.io.project_file import load
from plystack.core.model.errors import Problem
from plystack.core.pipeline import run
from plystack.core.study.schedule import (
    INCOMPLETE,
    NOT_OK,
    OK,
    derived_verdict,
    reported_verdict,
)

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo"
US = DEMO / "porch-header.plystack.json"
EU = DEMO / "stair-trimmer-eu.plystack.json"
#: Keys the schedule adds to each member's ``check --json`` object.
SCHEDULE_KEYS = {"mark", "row", "base", "alternative", "ran", "problems", "schedule", "sheet"}


def _csv(tmp_path: Path, text: str, name: str = "schedule.csv") -> Path:
    path = tmp_path / name
    path.write_text(text, encoding="utf-8")
    return path


def _schedule_json(capsys, csv_path: Path, *extra: str) -> tuple[int, list[dict]]:
    code = main(["schedule", str(csv_path), "--json", "--jobs", "1", *extra])
    return code, json.loads(capsys.readouterr().out)


def _check_json(capsys, data: dict, tmp_path: Path) -> dict:
    path = tmp_path / "by-hand.plystack.json"
    path.write_text(json.dumps(data), encoding="utf-8")
    assert main(["check", str(path), "--json"]) == 0
    return json.loads(capsys.readouterr().out)


def _as_check(member: dict) -> dict:
    out = {k: v for k, v in member.items() if k not in SCHEDULE_KEYS}
    return out


def _set_spans(d, v):
    d["beam"]["spans"] = v


def _set_supports(d, v):
    d["beam"]["supports"] = v


def _set_load_value(d, v):
    d["beam"]["loads"][1]["value"] = v


def _set_all_tributary(d, v):
    for ld in d["beam"]["loads"]:
        if "tributary_width" in ld:
            ld["tributary_width"] = v


def _set_ply_height(name):
    def change(d, v):
        next(p for p in d["plies"] if p["name"] == name)["height"] = v
    return change


def _set_bolt_rows(d, v):
    d["design"]["bolt"]["rows"] = v


def _set_self_weight(d, v):
    d["beam"]["self_weight"] = v


FORMS = [
    # (base, column, cell, value the hand edit writes into the file, hand edit)
    (US, "beam.spans", "14 ft", ["14 ft"], _set_spans),
    (US, "beam.spans", "9 ft; 9 ft", ["9 ft", "9 ft"], _set_spans),
    (EU, "beam.spans", "4.2 m", ["4.2 m"], _set_spans),
    (US, "beam.spans", "13'-6\"", ["13'-6\""], _set_spans),
    (US, "beam.supports", "fixed-fixed", "fixed-fixed", _set_supports),
    (US, "beam.loads[1].value", "55 psf", "55 psf", _set_load_value),
    (EU, "beam.loads[1].value", "2.5 kPa", "2.5 kPa", _set_load_value),
    (US, "beam.loads[*].tributary_width", "8 ft", "8 ft", _set_all_tributary),
    (EU, "beam.loads[*].tributary_width", "2 m", "2 m", _set_all_tributary),
    (US, "plies[flitch plate].height", "7 1/4 in", "7 1/4 in", _set_ply_height("flitch plate")),
    (EU, "plies[plate].height", "160 mm", "160 mm", _set_ply_height("plate")),
    (US, "design.bolt.rows", "3", 3, _set_bolt_rows),
    (US, "beam.self_weight", "false", False, _set_self_weight),
]


@pytest.mark.parametrize(("base", "column", "cell", "value", "edit"), FORMS,
                         ids=[f"{b.stem}:{c}={v}" for b, c, v, _x, _e in FORMS])
def test_each_override_equals_the_change_made_by_hand(tmp_path, capsys, base, column, cell,
                                                      value, edit):
    quoted = cell.replace('"', '""')
    path = _csv(tmp_path, f'mark,base,"{column}"\nM-1,{base},"{quoted}"\n')
    code, rows = _schedule_json(capsys, path)
    assert len(rows) == 1 and rows[0]["ran"], rows
    data = json.loads(base.read_text(encoding="utf-8"))
    edit(data, value)
    expected = _check_json(capsys, data, tmp_path)
    member = rows[0]
    if "verdict" not in expected:
        member = {k: v for k, v in member.items() if k != "verdict"}
    assert _as_check(member) == expected
    assert member["mark"] == "M-1"
    assert code == (0 if expected["ok"] else 1)


def test_alternative_equals_its_plies_copied_by_hand(tmp_path, capsys):
    path = _csv(tmp_path, f"mark,alternative,base\nH-2,1/4 in plate,{US}\n")
    _code, rows = _schedule_json(capsys, path)
    data = json.loads(US.read_text(encoding="utf-8"))
    alt = next(a for a in data["alternatives"] if a["name"] == "1/4 in plate")
    data["plies"] = copy.deepcopy(alt["plies"])
    expected = _check_json(capsys, data, tmp_path)
    member = {k: v for k, v in rows[0].items() if "verdict" in expected or k != "verdict"}
    assert _as_check(member) == expected
    plate = next(p for p in expected["plies"] if p["name"] == "flitch plate")
    assert plate["area"] == pytest.approx(0.25 * 8.75 * 0.0254**2, rel=1e-12)


def test_alternative_then_a_ply_override(tmp_path, capsys):
    """The alternative's plies are chosen first; a ply override then changes them."""
    path = _csv(tmp_path, "mark,base,alternative,plies[flitch plate].height\n"
                          f"H-9,{US},1/2 in plate,8 in\n")
    _code, rows = _schedule_json(capsys, path)
    data = json.loads(US.read_text(encoding="utf-8"))
    alt = next(a for a in data["alternatives"] if a["name"] == "1/2 in plate")
    data["plies"] = copy.deepcopy(alt["plies"])
    data["plies"][1]["height"] = "8 in"
    expected = _check_json(capsys, data, tmp_path)
    assert _as_check({k: v for k, v in rows[0].items() if k != "verdict"}) == {
        k: v for k, v in expected.items() if k != "verdict"}


def test_bad_rows_are_named_and_the_rest_run(tmp_path, capsys):
    path = _csv(tmp_path, "\n".join([
        "mark,base,beam.spam,beam.loads[1].value,plies[plat].height,beam.spans",
        f"A-1,{US},,,,10 ft",
        f"A-2,{US},3,,,",
        f"A-3,{US},,40 apples,,",
        f"A-4,{US},,,8 in,",
        f"A-5,{EU},,,,3.0 m",
    ]) + "\n")
    code = main(["schedule", str(path), "--json", "--jobs", "1"])
    captured = capsys.readouterr()
    rows = json.loads(captured.out)
    assert code == 1
    by_mark = {r["mark"]: r for r in rows}
    assert [r["mark"] for r in rows] == ["A-1", "A-2", "A-3", "A-4", "A-5"]
    for good in ("A-1", "A-5"):
        assert by_mark[good]["ran"] and by_mark[good]["verdict"] == OK
        assert by_mark[good]["problems"] == []
    expect = {"A-2": (3, "beam.spam", "not a known key"),
              "A-3": (4, "beam.loads[1].value", "apples"),
              "A-4": (5, "plies[plat].height", 'no entry named "plat"')}
    for mark, (row, column, words) in expect.items():
        r = by_mark[mark]
        assert not r["ran"] and r["verdict"] == INCOMPLETE
        assert len(r["problems"]) == 1
        problem = r["problems"][0]
        assert (problem["row"], problem["column"]) == (row, column)
        assert words in problem["message"]
        line = f"{path}: row {row}, column {column}: "
        assert line in captured.err
    for word in ("Error", "Exception", "Traceback"):
        assert word not in captured.err


def test_unknown_keys_at_any_depth_name_their_column(tmp_path, capsys):
    path = _csv(tmp_path, f"mark,base,colour.red,colour\nU-1,{US},1,\nU-2,{US},,blue\n"
                          f"U-3,{US},,\n")
    code, rows = _schedule_json(capsys, path)
    assert code == 1
    assert [(p["column"], p["message"]) for p in rows[0]["problems"]] == [
        ("colour.red", "colour: is not a known key of a project file")]
    assert [(p["column"], p["message"]) for p in rows[1]["problems"]] == [
        ("colour", "is not a known key of a project file")]
    assert rows[2]["ran"]


def test_extra_cells_are_named(tmp_path, capsys):
    path = _csv(tmp_path, f"mark,base\nE-1,{US},stray\nE-2,{US}\n")
    code, rows = _schedule_json(capsys, path)
    assert code == 1
    assert "more cells than the header" in rows[0]["problems"][0]["message"]
    assert rows[1]["ran"] and rows[1]["verdict"] == OK


def test_problem_outside_the_changed_key_keeps_its_path(tmp_path, capsys):
    """An area load without a tributary width is named by its own path (no column)."""
    path = _csv(tmp_path, f"mark,base,beam.loads[2].type\nP-1,{US},area\n")
    _code, rows = _schedule_json(capsys, path)
    problems = rows[0]["problems"]
    assert all(p["column"] is None and p["row"] == 2 for p in problems)
    assert any(p["message"].startswith("beam.loads[2].tributary_width: is missing")
               for p in problems)


def test_base_problems_are_named_under_the_base_column(tmp_path, capsys):
    bad = tmp_path / "bad.plystack.json"
    bad.write_text('{"format": "plystack", "version": 1, "plies": [], "colour": 1}',
                   encoding="utf-8")
    path = _csv(tmp_path, f"mark,base\nB-1,missing.plystack.json\nB-2,bad.plystack.json\n"
                          f"B-3,{EU}\n")
    code, rows = _schedule_json(capsys, path)
    assert code == 1
    assert rows[0]["problems"][0]["column"] == "base"
    assert "cannot read" in rows[0]["problems"][0]["message"]
    assert any("colour" in p["message"] for p in rows[1]["problems"])
    assert all(p["column"] == "base" for p in rows[1]["problems"])
    assert rows[2]["ran"]


def test_unknown_alternative_and_empty_mark(tmp_path, capsys):
    path = _csv(tmp_path, f"mark,base,alternative\nX-1,{US},no such plate\n,{US},\n")
    _code, rows = _schedule_json(capsys, path)
    assert rows[0]["problems"][0]["column"] == "alternative"
    assert '"1/4 in plate"' in rows[0]["problems"][0]["message"]
    assert rows[1]["problems"][0]["column"] == "mark"


def test_jobs_1_and_2_give_identical_output(tmp_path, capsys):
    schedule = DEMO / "renovation-schedule.csv"
    outputs = []
    for jobs in ("1", "2"):
        for fmt in ([], ["--json"]):
            code = main(["schedule", str(schedule), "--jobs", jobs, *fmt])
            outputs.append((code, capsys.readouterr().out))
    assert outputs[0] == outputs[2]
    assert outputs[1] == outputs[3]
    rows = json.loads(outputs[1][1])
    assert len(rows) == 12 and all(r["ran"] for r in rows)
    assert {r["base"] for r in rows} == {"porch-header.plystack.json",
                                        "stair-trimmer-eu.plystack.json"}


def test_bom_comments_and_any_column_order(tmp_path, capsys):
    plain = _csv(tmp_path, "mark,base,beam.spans,plies[flitch plate].height\n"
                           f"C-1,{US},10 ft,8 in\nC-2,{US},13 ft,\n", "plain.csv")
    odd = tmp_path / "odd.csv"
    odd.write_bytes(("\ufeff# a comment line, with \"quotes\" and commas\n"
                     "plies[flitch plate].height , BASE,beam.spans,Mark\n"
                     "\n"
                     f"8 in,{US},10 ft,C-1\n"
                     "   # another comment\n"
                     f",{US},13 ft,C-2\n").encode())
    _c1, a = _schedule_json(capsys, plain)
    _c2, b = _schedule_json(capsys, odd)
    strip = [{k: v for k, v in r.items() if k not in ("row", "base")} for r in a]
    assert strip == [{k: v for k, v in r.items() if k not in ("row", "base")} for r in b]
    assert [r["row"] for r in b] == [4, 6]


def test_results_csv_columns_and_caution(tmp_path, capsys):
    path = _csv(tmp_path, f"mark,base\nR-1,{US}\n")
    out = tmp_path / "results.csv"
    assert main(["schedule", str(path), "-o", str(out), "--jobs", "1"]) == 0
    assert capsys.readouterr().out == ""
    lines = out.read_text(encoding="utf-8").splitlines()
    header = lines[0].split(",")
    for column in ("mark", "verdict", "governing_check", "governing_ply",
                   "governing_combination", "governing_ratio", "deflection_ratio", "plate",
                   "bolts", "mass"):
        assert column in header
    import csv
    row = next(csv.DictReader(lines[:2]))
    # the governing check is the largest ratio of the demo's run (since bolts are
    # checked one by one, a bolt geometry rule governs the porch demo)
    governing = max(run(load(US)).checks, key=lambda c: c.ratio)
    assert row["verdict"] == OK and row["governing_check"] == governing.id
    assert row["plate"].startswith("flitch plate A36 0.375 x 8.750 in")
    assert "2 per location every 24.0 in (12)" in row["bolts"]
    assert lines[-1].startswith("# Caution")


def test_mass_is_mass_per_length_times_length(tmp_path, capsys):
    path = _csv(tmp_path, f"mark,base\nR-1,{EU}\n")
    _code, rows = _schedule_json(capsys, path)
    s = rows[0]["schedule"]
    assert s["length"] == pytest.approx(3.6, rel=1e-12)
    assert s["mass"] == pytest.approx(s["mass_per_length"] * 3.6, rel=1e-12)
    assert s["mass_per_length"] == rows[0]["section"]["mass_per_length"]


def test_incomplete_when_strength_checks_are_skipped(tmp_path, capsys):
    """EN 1990 combinations on the US basis: timber strength checks are skipped."""
    path = _csv(tmp_path, f"mark,base,beam.combinations\nI-1,{US},EN1990\n")
    code, rows = _schedule_json(capsys, path)
    assert code == 1
    assert rows[0]["ran"] and rows[0]["verdict"] == INCOMPLETE
    assert any("skipped" in r for r in rows[0]["schedule"]["incomplete_because"])


@pytest.mark.parametrize("text", ["", "# only a comment\n", "mark,base\n", "mark,spans\nA,1\n",
                                  "mark,base,mark\nA,b,c\n"])
def test_unreadable_schedule_exits_2(tmp_path, capsys, text):
    path = _csv(tmp_path, text)
    assert main(["schedule", str(path)]) == 2
    err = capsys.readouterr().err
    assert str(path) in err


def test_missing_or_binary_schedule_exits_2(tmp_path, capsys):
    assert main(["schedule", str(tmp_path / "none.csv")]) == 2
    binary = tmp_path / "binary.csv"
    binary.write_bytes(b"mark,base\n\xff\xfe\x00")
    assert main(["schedule", str(binary)]) == 2
    assert "not UTF-8" in capsys.readouterr().err


def test_jobs_must_be_positive(capsys):
    with pytest.raises(SystemExit) as exc:
        main(["schedule", "x.csv", "--jobs", "0"])
    assert exc.value.code == 2


def test_sheets_and_combined_pdf(tmp_path, capsys):
    from pypdf import PdfReader

    path = _csv(tmp_path, f"mark,base,beam.spans\nS/1,{US},\nS-2,{EU},9 m\n")
    sheets = tmp_path / "sheets"
    code = main(["schedule", str(path), "--sheets", str(sheets), "--jobs", "1"])
    assert code == 1  # S-2 over 9 m fails
    names = sorted(p.name for p in sheets.iterdir())
    assert names == ["S-2.pdf", "S_1.pdf", "schedule.pdf"]
    combined = PdfReader(str(sheets / "schedule.pdf"))
    each = [len(PdfReader(str(sheets / n)).pages) for n in ("S_1.pdf", "S-2.pdf")]
    assert len(combined.pages) == 1 + sum(each)
    first = combined.pages[0].extract_text()
    for words in ("Member schedule", "S/1", "S-2", "NOT OK", "Caution"):
        assert words in first
    assert "Member: S/1" in combined.pages[1].extract_text()
    assert [o.title for o in combined.outline] == ["Schedule summary", "S/1", "S-2"]


# --- pieces -----------------------------------------------------------------------------

def _check(ratio: float) -> Check:
    return Check(id="bending", ply="p", combination="D", demand=ratio, capacity=1.0,
                 quantity="stress", reference=("Fb", 1.0))


def test_derived_verdict():
    assert derived_verdict([], [])[0] == INCOMPLETE
    assert derived_verdict([_check(0.5)], []) == (OK, ())
    assert derived_verdict([_check(0.5), _check(1.2)], [])[0] == NOT_OK
    skipped = Problem("plies[0].material", '"X" has no NDS reference values (Fb, Fv); its '
                      "timber checks are skipped on the US basis")
    assert derived_verdict([_check(0.5)], [skipped]) == (INCOMPLETE, (str(skipped),))
    assert derived_verdict([_check(1.5)], [skipped])[0] == NOT_OK
    clipped = Problem("plies[1]", '"a" is clipped away completely by later plies and carries '
                      "nothing")
    assert derived_verdict([_check(0.5)], [clipped]) == (OK, ())
    unknown = Problem("beam", "a warning nobody has classified")
    assert derived_verdict([_check(0.5)], [unknown])[0] == INCOMPLETE


def test_reported_verdict_is_read_when_present():
    assert reported_verdict("OK") == OK
    assert reported_verdict("not_ok") == NOT_OK
    assert reported_verdict("Incomplete") == INCOMPLETE
    assert reported_verdict({"status": "NOT OK"}) == NOT_OK
    assert reported_verdict(None) is None
    assert reported_verdict("maybe") is None


def test_verdict_key_of_check_json_wins(tmp_path, capsys, monkeypatch):
    from plystack.core.io import schedule_file

    real = schedule_file.check_json
    monkeypatch.setattr(schedule_file, "check_json",
                        lambda a: {**real(a), "verdict": "INCOMPLETE"})
    path = _csv(tmp_path, f"mark,base\nV-1,{US}\n")
    code, rows = _schedule_json(capsys, path)
    assert rows[0]["verdict"] == INCOMPLETE and code == 1


@pytest.mark.parametrize(("key", "words"), [
    ("beam..spans", "empty key"), ("beam.spans.", "ends with a dot"), ("[0].x", "needs a key"),
    ("plies[0.height", 'no closing "]"'), ("plies[].height", "empty brackets"),
    ("plies]0[", 'no opening "["'), ("plies[-1].height", "counted from 0")])
def test_bad_keys(key, words):
    with pytest.raises(overrides.OverrideError, match=None) as exc:
        overrides.parse_key(key)
    assert words in str(exc.value)


def test_apply_finds_and_names_places():
    data = {"plies": [{"name": "a", "height": "1 in"}, {"name": "b", "height": "2 in"},
                      {"name": "b", "height": "3 in"}],
            "beam": {"spans": ["1 m"],
                     "loads": [{"value": "1 kN"}, {"value": "2 kN", "at": "1 m"}]}}
    assert overrides.apply(data, "plies[a].height", "4 in") == ["plies[0].height"]
    assert data["plies"][0]["height"] == "4 in"
    assert overrides.apply(data, "beam.loads[*].at", "0.5 m") == ["beam.loads[1].at"]
    assert overrides.apply(data, "beam.spans", "2 m; 3 m") == ["beam.spans"]
    assert data["beam"]["spans"] == ["2 m", "3 m"]
    assert overrides.apply(data, "beam.loads[0].value", "1,200 lbf") == ["beam.loads[0].value"]
    assert data["beam"]["loads"][0]["value"] == "1,200 lbf"
    for key, words in (("plies[b].height", "2 entries named"),
                       ("plies[7].height", "[0] to [2]"),
                       ("beam.loads[*].tributary_width", 'has "tributary_width"'),
                       ("beam.spans.x", "not an object"),
                       ("beam[0]", "not a list"),
                       ("design.connector[0].rows", "not in the base")):
        with pytest.raises(overrides.OverrideError) as exc:
            overrides.apply(copy.deepcopy(data), key, "1")
        assert words in str(exc.value), key


def test_convert_follows_the_form_in_the_file():
    assert overrides.convert(True, "no") is False
    assert overrides.convert(2, "3") == 3
    assert overrides.convert(2, "three") == "three"
    assert overrides.convert(None, "0.25") == 0.25
    assert overrides.convert(None, "12 ft") == "12 ft"
    assert overrides.convert("ASD", '[{"name": "D", "factors": {"D": 1}}]') == [
        {"name": "D", "factors": {"D": 1}}]
    assert overrides.convert(None, "2", "info") == "2"
    with pytest.raises(overrides.OverrideError):
        overrides.convert(None, "[1, 2")


def _square(x: int) -> int:
    return x * x


def test_rows_run_in_order_and_here_when_no_process_can_start(monkeypatch):
    from plystack.core.study import schedule

    ticks: list[int] = []
    assert schedule.run_rows(_square, list(range(7)), 2, lambda: ticks.append(1)) == [
        k * k for k in range(7)]
    assert len(ticks) == 7

    def refuse(*_a, **_k):
        raise OSError(38, "Function not implemented")

    monkeypatch.setattr(schedule, "ProcessPoolExecutor", refuse)
    assert schedule.run_rows(_square, list(range(5)), 2) == [k * k for k in range(5)]


def test_demo_members_without_overrides_equal_check_of_the_demo_files(capsys):
    code, rows = _schedule_json(capsys, DEMO / "renovation-schedule.csv")
    assert code == 1  # the demo has members that fail (H-5, T-4)
    by_mark = {r["mark"]: r for r in rows}
    # H-3, H-6 and H-7 fail the shear at the end bolts of a plate that does not bear on
    # its supports (NDS 2018 3.4.3.3, check "splitting")
    assert {m for m, r in by_mark.items() if r["verdict"] == NOT_OK} == {
        "H-3", "H-5", "H-6", "H-7", "T-4"}
    for mark, base in (("H-1", US), ("T-1", EU)):
        assert main(["check", str(base), "--json"]) == 0
        expected = json.loads(capsys.readouterr().out)
        member = {k: v for k, v in by_mark[mark].items()
                  if "verdict" in expected or k != "verdict"}
        assert _as_check(member) == expected


def test_a_mark_used_twice_fails_the_later_row(tmp_path, capsys):
    (tmp_path / "porch-header.plystack.json").write_text(
        (DEMO / "porch-header.plystack.json").read_text())
    path = _csv(tmp_path, "mark,base\nH-1,porch-header.plystack.json\n"
                "H-2,porch-header.plystack.json\nH-1,porch-header.plystack.json\n")
    code, rows = _schedule_json(capsys, path)
    assert code == 1
    assert [r["ran"] for r in rows] == [True, True, False]
    assert rows[2]["problems"] == [{"row": 4, "column": "mark", "message": '"H-1" is the '
                                    "mark of row 2; every member needs its own mark"}]


def test_a_nul_in_a_cell_is_named_and_not_echoed_raw(tmp_path, capsys):
    path = _csv(tmp_path, "mark,base\nH-1,\x00porch-header.plystack.json\n")
    out = tmp_path / "results.csv"
    assert main(["schedule", str(path), "-o", str(out), "--jobs", "1"]) == 1
    err = capsys.readouterr().err
    assert ("row 2, column base: holds a control character (such as NUL); the cell must be "
            "plain text") in err
    text = out.read_text()
    assert "\x00" not in text and "\\x00porch-header.plystack.json" in text
