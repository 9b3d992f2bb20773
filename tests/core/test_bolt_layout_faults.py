"""Bolt layouts the plate cannot hold are named, never a crash or a silent pass: rows or
stations the file puts outside the plate are refused by field; a plate too shallow for
its default rows fails its ``bolt-spacing`` check (rows at one height, NDS 2018 11.3.6's
C_g at its limit 1.0 as the spacing goes to zero, from memory) instead of dividing by
zero; holes that take a whole half of the plate leave the AISC 360-16 F13.1 / EN 1993-1-1
6.2.5(4) factor at 0 (no net area), so ``bending-net`` fails instead of a negative
capacity; the sizing of the demos' plates runs through such candidates.
"""

from __future__ import annotations

import json
from dataclasses import replace
from pathlib import Path

import pytest

from plystack.core.cli import main
from plystack.core.codes import nds_fasteners as nf
from plystack.core.io.project_file import load
from plystack.core.model.errors import ProjectError
from plystack.core.pipeline import run
from plystack.core.study.compare import auto_size

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo"
US = DEMO / "porch-header.plystack.json"
EU = DEMO / "stair-trimmer-eu.plystack.json"
IN = 0.0254


def _with_bolt(tmp_path: Path, **bolt: object) -> Path:
    data = json.loads(US.read_text())
    data.pop("alternatives", None)
    data["design"]["bolt"].update(bolt)
    out = tmp_path / "p.plystack.json"
    out.write_text(json.dumps(data))
    return out


@pytest.mark.parametrize(("bolt", "field"), [
    ({"rows": ["2 in", "20 in"]}, "design.bolt.rows"),
    ({"rows": ["20 in"]}, "design.bolt.rows"),
    ({"stations": ["30 ft"]}, "design.bolt.stations"),
])
def test_a_bolt_outside_the_plate_is_refused_by_field(tmp_path: Path, bolt: dict[str, object],
                                                       field: str) -> None:
    with pytest.raises(ProjectError) as err:
        run(load(_with_bolt(tmp_path, **bolt)))
    (problem,) = err.value.problems
    assert problem.path == field
    assert "outside" in problem.message and "flitch plate" in problem.message


def test_a_bolt_row_outside_the_plate_is_a_named_error_on_the_command_line(
        tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    path = _with_bolt(tmp_path, rows=["2 in", "20 in"])
    assert main(["check", str(path)]) == 2
    err = capsys.readouterr().err
    assert "design.bolt.rows: 20.00 in is outside" in err and "Traceback" not in err


def test_a_plate_too_shallow_for_its_rows_fails_its_spacing_instead_of_dividing_by_zero(
        ) -> None:
    p = load(US)
    plies = list(p.plies)
    plies[1] = replace(plies[1], height=4 * IN)  # 2 rows of 1/2 in bolts need 8 D = 4 in
    a = run(p.with_plies(tuple(plies)))
    assert a.verdict == "NOT OK"
    spacing = [c for c in a.checks if c.id == "bolt-spacing" and not c.ok]
    assert spacing and spacing[0].capacity == 0.0  # the rows stand at one height
    bolts = [c for c in a.checks if c.id == "bolts"]
    assert bolts and all(c.factors["C_g"] == 1.0 for c in bolts)
    assert all("one height" in c.sources["C_g"] for c in bolts)


def test_group_action_factor_tends_to_one_as_the_spacing_vanishes() -> None:
    # NDS 2018 11.3.6 (from memory): m -> 1 as s -> 0, and C_g -> 1, the limit taken
    # where the rows coincide
    D = 0.5 * IN
    for s in (1e-6, 1e-9):
        assert nf.C_g(2, 1e8, 2e8, s, nf.gamma_bolt_steel(D)) == pytest.approx(1.0, abs=1e-3)


@pytest.mark.parametrize(("demo", "ply"), [(US, "flitch plate"), (EU, "plate")])
def test_sizing_a_demos_plate_height_runs_through_the_shallow_candidates(demo: Path,
                                                                        ply: str) -> None:
    p = load(demo)
    step = 0.0127 if p.display_units == "US" else 0.01
    result = auto_size(p, ply, "height", [step * k for k in range(2, 20)])
    assert result.chosen is not None and result.chosen.ok
    assert result.next_smaller is not None and not result.next_smaller.ok


def test_the_net_capacity_is_never_negative_on_a_shallow_plate() -> None:
    p = load(US)
    plies = list(p.plies)
    plies[1] = replace(plies[1], height=1.0 * IN)
    a = run(p.with_plies(tuple(plies)))
    net = [c for c in a.checks if c.id == "bending-net" and c.ply == "flitch plate"]
    assert net and all(c.capacity == 0.0 and not c.ok for c in net)
    assert all(c.factors["F13.1"] == 0.0 for c in net)


def test_size_prints_the_caution_also_when_no_option_passes(
        capsys: pytest.CaptureFixture[str]) -> None:
    code = main(["size", str(US), "--ply", "flitch plate", "--dimension", "height",
                 "--values", "2 in, 3 in"])
    out = capsys.readouterr().out
    assert code == 1
    assert "no option passes: the largest, 3.000 in, still has" in out
    assert "Caution:" in out


def test_demo_onto_an_existing_file_is_a_named_error(tmp_path: Path,
                                                     capsys: pytest.CaptureFixture[str]) -> None:
    target = tmp_path / "d.plystack.json"
    target.write_text("keep")
    assert main(["demo", str(target)]) == 2
    err = capsys.readouterr().err
    assert "exists already" in err and "Traceback" not in err and "Namespace" not in err
    assert target.read_text() == "keep"


def test_the_longest_span_of_the_eu_demo_is_found_from_its_own_span() -> None:
    # a 0.3 m member of the EU demo fails (its bolts no longer fit); the search starts
    # from the file's 3.6 m span, which passes, and ends with a passing span whose next
    # step (5 mm) fails, both checked by running them
    from plystack.core.study.compare import longest_span, scaled_spans

    p = load(EU)
    found = longest_span(p)
    assert found.span > p.beam.layout.spans[0]
    assert run(scaled_spans(p, found.span)).verdict == "OK"
    assert run(scaled_spans(p, found.span + found.tolerance)).verdict != "OK"


def test_a_spacing_that_cannot_be_used_is_refused_not_replaced(tmp_path, capsys):
    """A spacing of 30 ft on a 12 ft plate was laid out every 72 in without a word."""
    import json as _json

    from plystack.core.cli import main as _main

    data = _json.loads(US.read_text())
    data["design"]["bolt"]["spacing"] = "30 ft"
    path = tmp_path / "far.plystack.json"
    path.write_text(_json.dumps(data))
    assert _main(["check", str(path)]) == 2
    assert ('design.bolt.spacing: 30.00 ft does not fit two bolt locations on the plate '
            '"flitch plate" (12.00 ft long): give a shorter spacing or the stations'
            ) in capsys.readouterr().err
    data["design"]["bolt"]["spacing"] = "24 in"  # beside the stations: said, not used
    data["design"]["bolt"]["stations"] = ["1 ft", "3 ft"]
    path.write_text(_json.dumps(data))
    assert _main(["check", str(path)]) in (0, 1)
    assert ("design.bolt.spacing: is not used: the stations give the bolts' positions"
            in capsys.readouterr().out)
