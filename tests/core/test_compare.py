"""Sweeps, auto-size and longest span, each confirmed through the normal check path
(a separate `check` of a file written with the candidate's value)."""

from __future__ import annotations

import json
from pathlib import Path

import pytest

from plystack.core.cli import main
from plystack.core.io.project_file import load, save
from plystack.core.study.compare import (
    auto_size,
    longest_span,
    scaled_spans,
    sweep,
    with_dimension,
)

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"
IN = 0.0254


def check_file(project, tmp_path, capsys, name="candidate"):
    path = tmp_path / f"{name}.plystack.json"
    save(project, path)
    assert main(["check", str(path), "--json"]) == 0
    return json.loads(capsys.readouterr().out)


def test_sweep_matches_separate_checks(tmp_path, capsys):
    project = load(DEMO)
    values = [0.125 * IN, 0.25 * IN, 0.375 * IN, 0.625 * IN]
    rows = sweep(project, "flitch plate", "width", values)
    assert [r.value for r in rows] == values
    for r in rows:
        plies = with_dimension(project.plies, "flitch plate", "width", r.value)
        out = check_file(project.with_plies(plies), tmp_path, capsys)
        assert out["governing"]["ratio"] == pytest.approx(r.governing_ratio, rel=1e-12)
        assert out["governing"]["id"] == r.governing_id
        assert out["section"]["mass_per_length"] == pytest.approx(r.mass_per_length, rel=1e-12)
        assert out["ok"] == r.ok


def test_sweep_keeps_touching_plies_touching():
    project = load(DEMO)
    plies = with_dimension(project.plies, "flitch plate", "width", 0.5 * IN)
    plate, right = plies[1], plies[2]
    assert right.x == pytest.approx(plate.x + plate.width)
    assert plies[0] == project.plies[0]


def test_sweep_command_json(capsys):
    assert main(["sweep", str(DEMO), "--ply", "flitch plate", "--dimension", "width",
                 "--values", "1/4 in, 3/8 in, 1/2 in", "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    assert [round(r["value"] / IN, 6) for r in out["rows"]] == [0.25, 0.375, 0.5]
    for r in out["rows"]:
        assert set(r) >= {"value", "governing_ratio", "governing_id", "deflection_max_abs",
                          "mass_per_length", "ok"}


def test_auto_size_passes_and_next_smaller_fails(tmp_path, capsys):
    project = load(DEMO)
    options = [x * IN for x in (0.0625, 0.125, 0.1875, 0.25, 0.375)]
    result = auto_size(project, "flitch plate", "width", options)
    assert result.chosen is not None and result.next_smaller is not None
    ok = check_file(project.with_plies(with_dimension(project.plies, "flitch plate", "width",
                                                      result.chosen.value)), tmp_path, capsys)
    assert ok["ok"] is True
    bad = check_file(project.with_plies(with_dimension(project.plies, "flitch plate", "width",
                                                       result.next_smaller.value)),
                     tmp_path, capsys, "smaller")
    assert bad["ok"] is False
    assert options.index(result.chosen.value) == options.index(result.next_smaller.value) + 1


def test_auto_size_none_passing_says_so(capsys):
    assert main(["size", str(DEMO), "--ply", "flitch plate", "--values",
                 "1/64 in, 1/32 in", "--json"]) == 1
    out = json.loads(capsys.readouterr().out)
    assert out["value"] is None and out["ok"] is False
    assert "no option passes" in out["message"]


def test_size_command_json(capsys):
    assert main(["size", str(DEMO), "--ply", "flitch plate", "--values",
                 "1/8 in, 3/16 in, 1/4 in", "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    assert set(out) >= {"ply", "dimension", "value", "ok", "next_smaller"}
    assert out["ok"] is True and out["next_smaller"]["ok"] is False


def test_longest_span_passes_and_one_more_step_fails(tmp_path, capsys):
    project = load(DEMO)
    r = longest_span(project)
    assert r.tolerance == pytest.approx(IN / 8)
    at = check_file(scaled_spans(project, r.span), tmp_path, capsys, "at")
    beyond = check_file(scaled_spans(project, r.span + r.tolerance), tmp_path, capsys, "beyond")
    assert at["ok"] is True and beyond["ok"] is False
    assert main(["span", str(DEMO), "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    assert out["span"] == pytest.approx(r.span) and out["governing_id"] == r.governing_id


def test_compare_lists_every_alternative(capsys):
    assert main(["compare", str(DEMO), "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    project = load(DEMO)
    assert [o["name"] for o in out] == [a.name for a in project.alternatives]
    for o in out:
        assert {"section", "plies", "beam", "checks", "governing", "units"} <= set(o)


def _incomplete_file(tmp_path):
    """The demo with EN 1990 combinations on the US basis: the timber strength checks are
    skipped (a named missing check), and every check that is made passes."""
    import dataclasses

    project = load(DEMO)
    project = dataclasses.replace(project, beam=dataclasses.replace(project.beam,
                                                                    combinations="EN1990"))
    path = tmp_path / "incomplete.plystack.json"
    save(project, path)
    return project, path


def test_studies_say_incomplete_never_ok_where_a_check_is_missing(tmp_path, capsys):
    project, path = _incomplete_file(tmp_path)
    out = check_file(project, tmp_path, capsys)
    assert out["verdict"] == "INCOMPLETE"  # the check path's own verdict, the reference
    rows = sweep(project, "flitch plate", "width", [0.25 * IN, 0.375 * IN])
    assert all(r.ok and r.verdict == "INCOMPLETE" for r in rows)
    assert all(r.to_dict()["verdict"] == "INCOMPLETE" for r in rows)

    assert main(["sweep", str(path), "--ply", "flitch plate", "--dimension", "width",
                 "--values", "1/4 in, 3/8 in"]) == 0
    lines = [ln for ln in capsys.readouterr().out.splitlines() if " in " in ln
             and ln.strip()[:1].isdigit()]
    assert len(lines) == 2 and all(ln.rstrip().endswith("INCOMPLETE") for ln in lines)

    assert main(["compare", str(path)]) == 0
    table = capsys.readouterr().out
    assert "INCOMPLETE" in table and not any(ln.rstrip().endswith(" OK")
                                             for ln in table.splitlines())

    size = auto_size(project, "flitch plate", "width", [0.25 * IN, 0.375 * IN])
    assert size.chosen is not None and "INCOMPLETE" in size.message
    assert size.to_dict()["verdict"] == "INCOMPLETE"
    assert main(["size", str(path), "--ply", "flitch plate", "--dimension", "width"]) == 0
    assert "INCOMPLETE" in capsys.readouterr().out


def test_a_complete_study_says_ok_as_before():
    rows = sweep(load(DEMO), "flitch plate", "width", [0.375 * IN])
    assert rows[0].verdict == "OK" and rows[0].ok


def test_longest_span_of_an_incomplete_member_says_so(tmp_path, capsys):
    project, path = _incomplete_file(tmp_path)
    r = longest_span(project)
    assert r.verdict == "INCOMPLETE" and r.to_dict()["verdict"] == "INCOMPLETE"
    assert main(["span", str(path)]) == 0
    assert "INCOMPLETE" in capsys.readouterr().out


def test_alternatives_on_one_evaluator_equal_each_run_alone():
    """``alternative_analyses`` against ``run`` of each alternative on its own (the plain
    path): every check and warning the same, as text."""
    from plystack.core.pipeline import run
    from plystack.core.study.compare import alternative_analyses, alternatives_with_current

    project = load(DEMO)
    alts = alternatives_with_current(project)
    assert len(alts) > 1
    first = run(project.with_plies(alts[0].plies))
    got = list(alternative_analyses(project, alts, first))
    assert got[0] is first
    for alt, a in zip(alts, got, strict=True):
        alone = run(project.with_plies(alt.plies))
        assert repr(a.checks) == repr(alone.checks) and repr(a.warnings) == repr(alone.warnings)
        assert a.section.EI == alone.section.EI


def test_size_tries_timber_thicknesses_for_a_timber_ply(capsys):
    """Dressed 2x, 3x, 4x thicknesses (1.5, 2.5, 3.5 in, common practice) for a timber
    ply's width, stock plate thicknesses for a plate's; the demo's 2x10 passes at its own
    1.5 in (it found no plate thickness that passes before).
    """
    from plystack.core.study.compare import width_options

    p = load(DEMO)
    inch = 0.0254  # exact by definition
    assert width_options(p, "left 2x10") == [1.5 * inch, 2.5 * inch, 3.5 * inch]
    assert width_options(p, "flitch plate")[:3] == [0.25 * inch, 0.3125 * inch, 0.375 * inch]
    eu = load(DEMO.parent / "stair-trimmer-eu.plystack.json")
    assert width_options(eu, "left joist") == [0.045, 0.047, 0.063, 0.075]
    assert main(["size", str(DEMO), "--ply", "left 2x10", "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    assert out["value"] == 1.5 * inch and out["ok"] is True


def test_size_asks_for_the_widths_of_glulam_and_lvl():
    """Sawn thicknesses are no stock of glulam or LVL (their widths are the maker's):
    without --values the search is refused by name rather than run on sizes not made."""
    from dataclasses import replace

    from plystack.core.model.errors import ProjectError
    from plystack.core.study.compare import width_options

    p = load(DEMO)
    mats = p.all_materials()
    for product in ("glulam", "lvl"):
        mid = next(m.id for m in mats.values() if m.product == product)
        q = p.with_plies(tuple(replace(x, material=mid) if x.name == "left 2x10" else x
                               for x in p.plies))
        with pytest.raises(ProjectError) as info:
            width_options(q, "left 2x10")
        assert str(info.value.problems[0]).startswith(
            f'--values: is needed for "left 2x10" ({mid}, {product})')
