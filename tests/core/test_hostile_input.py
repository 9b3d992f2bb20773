"""Hostile input from the fault campaign: every finding of core and the command line,
with its input kept in tests/data/hostile/. Each gives a named problem (field and what is
wrong, no Python class names), exit status 2, and, where it hung before, it answers
within a time bound.
"""

from __future__ import annotations

import json
import math
import time
from pathlib import Path

import pytest

from plystack.core.cli import main
from plystack.core.io.project_file import dumps, load, loads, save
from plystack.core.model import units
from plystack.core.model.errors import ProjectError
from plystack.core.pipeline import MAX_PLIES, run

HOSTILE = Path(__file__).resolve().parents[1] / "data" / "hostile"
DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"
#: Seconds a refused input may take (they took minutes, or for ever, before).
FAST = 5.0
PYTHON_CLASS_NAMES = ("Error", "Exception", "Traceback", "<class", "TypeError")

# (file, expected text of the named problem); numbers refer to the findings
CASES = [
    ("nesting-1000-deep.plystack.json", "nested more than 32 deep"),  # 6
    ("load-type-list.plystack.json", "beam.loads[0].type: a list is not one of"),  # 7
    ("load-type-object.plystack.json", "beam.loads[0].type: an object is not one of"),  # 7
    ("quantity-400-digit-integer.plystack.json",  # 8
     "plies[0].width: \"1000000000000000000000000000000000000...\" is longer than 200"),
    ("quantity-power-2-99999999.plystack.json",  # 8
     'plies[0].width: "2**99999999 in" raises a number to a power'),
    ("us-bolt-fyb-negative.plystack.json", "design.bolt.Fyb: must be greater than zero"),  # 9
    ("eu-bolt-fu-negative.plystack.json", "design.bolt.fu: must be greater than zero"),  # 9
    ("eu-bolt-diameter-100-mm.plystack.json",  # 9
     "design.bolt.diameter: 100 mm is outside the bolt diameters"),
    ("eu-bolt-diameter-1-m.plystack.json",  # 9
     "design.bolt.diameter: 1000 mm is outside the bolt diameters"),
    ("us-bolt-diameter-1e308-in.plystack.json",  # 9
     'design.bolt.diameter: "1e308 in" is out of range'),
    ("overhang-1e308-in.plystack.json", 'beam.overhang_right: "1e308 in" is out of range'),  # 9
    ("title-lone-surrogate.plystack.json", "title: holds a character that cannot be written"),
    ("quantity-power-9-9-9.plystack.json",  # 12
     'plies[0].width: "9**9**9 in" raises a number to a power'),
    ("quantity-power-10-10-10.plystack.json",  # 12
     'plies[0].width: "10**10**10 in" raises a number to a power'),
    ("quantity-100000-digits.plystack.json", "plies[0].width: \"11111"),  # 12
    ("quantity-100000-letter-unit.plystack.json", "plies[0].width: \"1 xxxx"),  # 12
    ("plies-1000-side-by-side.plystack.json",  # 15
     f"plies: has 1000 plies; Plystack analyses at most {MAX_PLIES}"),
    ("span-1e308-in.plystack.json", 'beam.spans[0]: "1e308 in" is out of range'),  # 16
    ("tributary-width-1e308-in.plystack.json",  # 16
     'beam.loads[0].tributary_width: "1e308 in" is out of range'),
    ("factor-infinity.plystack.json",  # 16 (and the GUI's segfault, 5)
     "beam.combinations[0].factors.L: Infinity must be a number between 0 and 10"),
    ("factor-huge-integer.plystack.json",
     "beam.combinations[0].factors.D: a very large number must be a number between"),
    ("unbraced-length-negative.plystack.json",  # 17
     "design.unbraced_length: must be greater than zero"),
    ("unbraced-length-zero.plystack.json", "design.unbraced_length: must be greater than zero"),
    ("us-bolt-fyb-zero.plystack.json", "design.bolt.Fyb: must be greater than zero"),  # 17
    ("us-bolt-rows-fractional.plystack.json",  # 17
     "design.bolt.rows: 1.9 must be a whole number (a count)"),
    ("duplicate-ply-names.plystack.json",  # 17
     'plies[2].name: "left 2x10" is the name of an earlier ply'),
    ("ply-x-1e308-in.plystack.json", 'plies[2].x: "1e308 in" is out of range'),  # 18
    ("span-1e-9-m-singular.plystack.json",  # 9 (LinAlgError), 18 (numpy warnings)
     "beam: the analysis cannot be completed for these inputs: the beam's equations"),
]


def _run_cli(args: list[str], capsys: pytest.CaptureFixture[str]) -> tuple[int, str, str, float]:
    start = time.monotonic()
    code = main(args)
    elapsed = time.monotonic() - start
    cap = capsys.readouterr()
    return code, cap.out, cap.err, elapsed


@pytest.mark.parametrize("name,expected", CASES)
@pytest.mark.parametrize("command", [["check"], ["check", "--json"], ["sheet", "-o", "OUT"]])
def test_hostile_file_named_problem_exit_2(name, expected, command, capsys, tmp_path):
    args = [command[0], str(HOSTILE / name), *command[1:]]
    if "OUT" in args:
        args[args.index("OUT")] = str(tmp_path / "out.pdf")
    code, out, err, elapsed = _run_cli(args, capsys)
    assert code == 2, err
    assert out == ""
    assert expected in err, err
    assert not any(word in err for word in PYTHON_CLASS_NAMES), err
    assert elapsed < FAST
    assert not (tmp_path / "out.pdf").exists()


def test_every_hostile_file_is_tested():
    named = {name for name, _ in CASES} | {"grade-rule-and-current-alternative.plystack.json",
                                           "modulus-1e-300-pa-overflow.plystack.json"}
    assert {p.name for p in HOSTILE.iterdir()} == named


@pytest.mark.parametrize("text", [
    "9**9**9 in", "10**10**10 in", "2**99999999 in", "1" * 100_000 + " in",
    "1 " + "x" * 100_000, "1" + "0" * 400 + " in", "(" * 100 + "1" + ")" * 100 + " in",
    "99999999999999999999*" * 9 + "1 in", "1e99999 in", "9^9^9 in", "(9**9)**9 in",
    "2 in**99", "1e308 in", "-1e308 in",
])
def test_quantities_that_hung_or_overflowed_are_named_quickly(text):
    start = time.monotonic()
    with pytest.raises(units.UnitError) as info:
        units.parse(text, "length", "plies[0].width")
    assert time.monotonic() - start < FAST
    message = str(info.value)
    assert message.startswith("plies[0].width: ")
    assert len(message) < 200
    assert not any(word in message for word in PYTHON_CLASS_NAMES)


@pytest.mark.parametrize("dimension,inside,outside", [
    ("length", "999 m", "1001 m"),
    ("stress", "999 GPa", "1001 GPa"),
    ("modulus", "999 GPa", "1001 GPa"),
    ("force", "999 MN", "1001 MN"),
    ("line_load", "99 MN/m", "101 MN/m"),
    ("area_load", "9 MPa", "11 MPa"),
    ("density", "99000 kg/m^3", "101000 kg/m^3"),
    ("moment", "9 GN*m", "11 GN*m"),
])
def test_range_per_kind(dimension, inside, outside):
    assert math.isfinite(units.parse(inside, dimension, "f"))
    assert units.parse("-" + inside, dimension, "f") < 0
    with pytest.raises(units.UnitError, match="is out of range"):
        units.parse(outside, dimension, "f")
    with pytest.raises(units.UnitError, match="is out of range"):
        units.parse("-" + outside, dimension, "f")


def test_units_with_powers_still_read():
    lb, ft = 0.45359237, 0.3048
    assert units.parse("490 lb/ft^3", "density", "f") == pytest.approx(490 * lb / ft**3,
                                                                      rel=1e-12)
    assert units.parse("490 lb/ft**3", "density", "f") == pytest.approx(490 * lb / ft**3,
                                                                       rel=1e-12)
    assert units.parse("7850 kg*m**-3", "density", "f") == pytest.approx(7850.0, rel=1e-12)
    assert units.parse("1 m**3/m**2", "length", "f") == 1.0


def test_division_by_zero_named_without_class_name():
    with pytest.raises(units.UnitError) as info:
        units.parse("1/0 in", "length", "x")
    assert str(info.value) == 'x: "1/0 in" is not a length (divides by zero)'


def _problems(text: str) -> list[str]:
    with pytest.raises(ProjectError) as info:
        loads(text)
    return [str(p) for p in info.value.problems]


def test_deep_nesting_anywhere_named():
    for depth in (33, 1000, 100_000):
        start = time.monotonic()
        msgs = _problems('{"format": "plystack", "title": ' + "[" * depth + "]" * depth + "}")
        assert time.monotonic() - start < FAST
        assert any("nested more than 32 deep" in m for m in msgs), msgs


def test_deep_nesting_given_as_python_data_named():
    from plystack.core.io.project_file import from_dict

    value: list = []
    for _ in range(5000):
        value = [value]
    with pytest.raises(ProjectError, match="nested more than 32 deep"):
        from_dict({"format": "plystack", "version": 1, "plies": [], "title": value})


def test_duplicate_keys_named():
    data = json.loads(DEMO.read_text())
    text = json.dumps(data).replace('"title":', '"title": "a", "title":', 1)
    assert any('the key "title" appears twice' in m for m in _problems(text))


def test_huge_integer_in_json_named():
    text = DEMO.read_text().replace('"version": 1', '"version": 1' + "0" * 5000)
    assert any("more than 30 digits" in m for m in _problems(text))


def test_lone_surrogate_anywhere_named_on_load_and_save(tmp_path, capsys):
    data = json.loads(DEMO.read_text())
    data["plies"][1]["name"] = "plate \ud800"
    msgs = _problems(json.dumps(data))
    assert any(m.startswith("plies[1].name: holds a character") for m in msgs), msgs
    from dataclasses import replace

    p = replace(load(DEMO), title="bad \udcff")
    target = tmp_path / "p.plystack.json"
    with pytest.raises(ProjectError, match="^title: holds a character"):
        save(p, target)
    assert not target.exists()
    assert list(tmp_path.iterdir()) == []


def test_lone_surrogate_in_arguments_never_crashes(capsys, tmp_path):
    out = tmp_path / "sheet \udcff.pdf"
    code = main(["sheet", str(DEMO), "-o", str(out)])
    assert code in (0, 2)
    code = main(["sweep", str(DEMO), "--ply", "plate \udcff", "--dimension", "width",
                 "--values", "1/4 in"])
    assert code == 2
    assert "is not a ply of this project" in capsys.readouterr().err


@pytest.mark.parametrize("args,expected", [
    (["check", str(DEMO), "--moment", ""], "--moment: is empty"),
    (["check", str(DEMO), "--shear", " "], "--shear: is empty"),
    (["check", str(DEMO), "--reference", ""], "--reference: is empty"),
    (["check", str(DEMO), "--reference", "nope"], '--reference: "nope" is not a material id '
     'of this project (its plies use "DFL-No2", "A36")'),
    (["size", str(DEMO), "--ply", "flitch plate", "--values", ""], "--values: is empty"),
    (["sheet", str(DEMO), "-o", ""], "-o/--output: is empty"),
    (["span", str(DEMO), "--tributary-widths", "0 in, -12 in"],
     '--tributary-widths[0]: "0 in" must be greater than zero'),
    (["span", str(DEMO), "--tributary-widths", "12 in, -12 in"],
     '--tributary-widths[1]: "-12 in" must be greater than zero'),
    (["sweep", str(DEMO), "--ply", "flitch plate", "--dimension", "width", "--values",
      "1/4 in,,3/8 in"], "--values[1]: is empty"),
    (["check", ""], "FILE: is empty"),
    (["sheet", str(DEMO), "-o", "/dev/null"], "/dev/null is not a regular file"),
    (["check", str(DEMO), "--moment", "1e308 kip*ft"],
     '--moment: "1e308 kip*ft" is not a finite number'),
])
def test_empty_or_bad_arguments_refused(args, expected, capsys):
    code, out, err, _ = _run_cli(args, capsys)
    assert code == 2
    assert out == ""
    assert expected in err, err


def test_grade_rule_and_current_alternative_kept(tmp_path):
    source = HOSTILE / "grade-rule-and-current-alternative.plystack.json"
    p = load(source)
    assert p.materials["DF-SS-user"].grade_rule == "visually graded dimension lumber"
    target = tmp_path / "again.plystack.json"
    save(p, target)
    data = json.loads(target.read_text())
    assert data["materials"]["DF-SS-user"]["grade_rule"] == "visually graded dimension lumber"
    assert data["current_alternative"] == "1/4 in plate"
    assert load(target) == p


def test_library_grade_rule_read():
    p = load(DEMO)
    assert p.library["DFL-No2"].grade_rule == "visually graded dimension lumber"


def test_ply_limit_in_the_pipeline_for_projects_built_in_memory():
    from dataclasses import replace

    p = load(DEMO)
    ply = p.plies[0]
    many = tuple(replace(ply, name=f"p{i}", x=i * ply.width) for i in range(MAX_PLIES + 1))
    start = time.monotonic()
    with pytest.raises(ProjectError, match=f"at most {MAX_PLIES}"):
        run(p.with_plies(many))
    assert time.monotonic() - start < FAST


def test_json_output_strict_and_finite(capsys):
    code, out, _err, _ = _run_cli(["check", str(DEMO), "--json", "--moment", "5 kip*ft",
                                   "--shear", "2 kip"], capsys)
    assert code == 0

    def reject(token: str) -> float:
        raise AssertionError(f"{token} in the JSON output")

    json.loads(out, parse_constant=reject)


def test_round_trip_of_demo_is_short_and_exact():
    p = load(DEMO)
    text = dumps(p)
    assert loads(text) == p
    data = json.loads(text)
    assert data["beam"]["spans"] == ["12 ft"]
    assert data["plies"][1]["y"] == "0.25 in"
    assert "fu" not in data["design"]["bolt"]  # EN 1995-1-1 (8.30) only: not said on US


def test_zero_capacity_gives_valid_json_with_null_ratio(tmp_path, capsys):
    """A factor override of 0 leaves a check with no capacity: NOT OK, ratio null."""
    data = json.loads(DEMO.read_text())
    data["design"]["overrides"] = {"left 2x10": {"C_D": 0}}
    path = tmp_path / "zero.plystack.json"
    path.write_text(json.dumps(data))
    code, out, _err, _ = _run_cli(["check", str(path), "--json"], capsys)
    assert code == 0
    result = json.loads(out, parse_constant=lambda token: pytest.fail(token))
    assert result["governing"]["ratio"] is None
    assert result["ok"] is False


def test_non_finite_result_stops_with_a_named_problem():
    """An unbraced length of 1e-300 m makes the bending capacity non-finite."""
    data = json.loads(DEMO.read_text())
    data["design"].update(compression_edge_braced=False, unbraced_length="1e-300 m")
    from plystack.core.io.project_file import from_dict

    with pytest.raises(ProjectError, match="is not a finite number") as info:
        run(from_dict(data))
    assert "bending check (left 2x10" in str(info.value)


def test_singular_beam_stops_with_a_named_problem():
    """A 1e-6 mm span between two 999 m overhangs: the stiffness equations are singular."""
    data = json.loads(DEMO.read_text())
    data["beam"].update(spans=["1e-6 mm"], overhang_left="999 m", overhang_right="999 m",
                        loads=[])
    data["beam"].pop("bearing_length")  # longer than the span: refused before the solve
    from plystack.core.io.project_file import from_dict

    with pytest.raises(ProjectError, match="the analysis cannot be completed for these inputs"):
        run(from_dict(data))


@pytest.mark.parametrize("name,code", [("span-1e-9-m-singular.plystack.json", 2),
                                       ("modulus-1e-300-pa-overflow.plystack.json", 0)])
def test_numpy_warnings_never_printed(name, code):
    """Both inputs make numpy warn (divide by zero, overflow) inside the analysis; with
    every warning shown (-W always) nothing but the named problem reaches stderr.
    """
    import subprocess
    import sys

    r = subprocess.run([sys.executable, "-W", "always", "-m", "plystack.core.cli", "check",
                        str(HOSTILE / name), "--json"], capture_output=True, text=True,
                       timeout=120)
    assert r.returncode == code, r.stderr
    assert "Warning" not in r.stderr
    if code == 0:
        assert r.stderr == ""
        json.loads(r.stdout, parse_constant=lambda token: pytest.fail(token))
    else:
        assert r.stdout == ""
        assert r.stderr.count("\n") == 1


def test_total_plies_of_a_file_bounded():
    data = json.loads((HOSTILE / "plies-1000-side-by-side.plystack.json").read_text())
    plies = data["plies"][:MAX_PLIES]
    data["plies"] = plies
    data["alternatives"] = [{"name": f"a{i}", "plies": plies} for i in range(10)]
    start = time.monotonic()
    msgs = _problems(json.dumps(data))
    assert time.monotonic() - start < FAST
    assert msgs == [f"plies: the design and its alternatives hold {11 * MAX_PLIES} plies; a "
                    "project file holds at most 1000"]


def test_the_most_plies_allowed_are_analysed_without_hanging(capsys):
    """MAX_PLIES side-by-side plies (the worst case of the cubic checks) finish; the bound
    is generous for a slow machine (about 0.5 s on a desktop).
    """
    data = json.loads((HOSTILE / "plies-1000-side-by-side.plystack.json").read_text())
    data["plies"] = data["plies"][:MAX_PLIES]
    start = time.monotonic()
    analysis = run(loads(json.dumps(data)))
    assert time.monotonic() - start < 30
    assert len(analysis.section.plies) == MAX_PLIES


EU_DEMO = DEMO.parent / "stair-trimmer-eu.plystack.json"


@pytest.mark.parametrize("demo,change,expected", [
    (EU_DEMO, {"diameter": 0.1}, "a division by zero"),
    (EU_DEMO, {"diameter": 1.0}, "an equation is used outside its range"),
    (EU_DEMO, {"fu": -400e6}, "an equation is used outside its range"),
    (DEMO, {"Fyb": -310e6}, "an equation is used outside its range"),
    (DEMO, {"diameter": 1e306}, "a number grows too large"),
])
def test_pipeline_names_faults_of_projects_built_in_memory(demo, change, expected):
    """The desktop program builds projects without the file reader: the pipeline turns
    the arithmetic faults of out-of-range bolts into a named problem.
    """
    from dataclasses import replace

    p = load(demo)
    d = p.design_or_default()
    p = replace(p, design=replace(d, bolt=replace(d.bolt, **change)))
    with pytest.raises(ProjectError, match=expected) as info:
        run(p)
    assert str(info.value).startswith("the analysis cannot be completed for these inputs")


def test_negative_capacity_is_a_named_problem():
    from dataclasses import replace

    p = load(DEMO)
    d = p.design_or_default()
    p = replace(p, design=replace(d, compression_edge_braced=False, unbraced_length=-0.0254))
    # a negative unbraced length now fails inside the stability equations themselves
    with pytest.raises(ProjectError, match=r"is negative|outside its range"):
        run(p)


def test_thousands_of_point_loads_are_refused_by_name(tmp_path, capsys):
    """A member cut at more points than ``MAX_NODES`` (a solve that rounding defeats
    falls back on the whole stiffness matrix: 30,000 point loads would ask for 27 GB) is
    a named problem, quickly, in the pipeline and on the command line; 2,000 point loads
    are still analysed."""
    from dataclasses import replace

    from plystack.core.actions.beam import MAX_NODES
    from plystack.core.model.member import Load

    p = load(DEMO)
    assert p.beam is not None
    L = p.beam.layout.length

    def with_points(n: int):
        extra = tuple(Load(case="L", type="point", value=10.0, at=L * (k + 0.5) / n)
                      for k in range(n))
        assert p.beam is not None
        return replace(p, beam=replace(p.beam, loads=p.beam.loads + extra))

    start = time.monotonic()
    with pytest.raises(ProjectError, match=f"beam.loads: need the member cut at 30,00[0-9] "
                                           f"points.*at most {MAX_NODES:,}"):
        run(with_points(30_000))
    assert time.monotonic() - start < FAST
    assert run(with_points(2_000)).checks
    path = tmp_path / "many-loads.plystack.json"
    save(with_points(MAX_NODES), path)
    code, out, err, _ = _run_cli(["check", str(path)], capsys)
    assert code == 2
    assert f"at most {MAX_NODES:,}" in out + err
    assert not any(name in out + err for name in PYTHON_CLASS_NAMES)


def test_argument_errors_quote_values_as_the_rest_does(capsys):
    """argparse quotes choices the Python way ('width'); the command line says "width"."""
    with pytest.raises(SystemExit) as info:
        main(["sweep", str(DEMO), "--ply", "p", "--dimension", "depth", "--values", "1 in"])
    assert info.value.code == 2
    err = capsys.readouterr().err
    assert ('plystack: argument --dimension: invalid choice: "depth" (choose from "width", '
            '"height")') in err
    assert "'" not in err.splitlines()[-1]
