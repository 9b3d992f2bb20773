"""``plystack plates FILE -o DIR``: the cut list equals the plies, and bad input exits 2 with
a named message and writes nothing.

Sources: the plies of the bundled demos (their sizes as given in the files); mass =
thickness x depth x length x density, with 490 pcf for A36 (the library's value, as used
with AISC 360-16, from memory) and 7850 kg/m^3 for steel without a density (EN 1991-1-1
Table A.4, 78.5 kN/m^3, from memory); 1 in = 25.4 mm and 1 ft^3 = 1728 in^3 exactly.
"""

from __future__ import annotations

import csv
import json
from pathlib import Path

import ezdxf
import pytest

from plystack.core.cli import main

DEMOS = Path(__file__).resolve().parents[2] / "assets" / "demo"
US_DEMO = DEMOS / "porch-header.plystack.json"
EU_DEMO = DEMOS / "stair-trimmer-eu.plystack.json"


def _rows(path: Path) -> list[dict[str, str]]:
    with path.open(encoding="utf-8", newline="") as fh:
        return list(csv.DictReader(fh))


def _write(tmp_path: Path, data: dict, name: str = "p") -> Path:
    path = tmp_path / f"{name}.plystack.json"
    path.write_text(json.dumps(data), encoding="utf-8")
    return path


def _demo(demo: Path = US_DEMO) -> dict:
    data = json.loads(demo.read_text(encoding="utf-8"))
    data.pop("alternatives", None)
    return data


def _no_class_names(text: str) -> None:
    for word in ("Traceback", "Error", "Exception", "NoneType", "KeyError"):
        assert word not in text, text


def test_cut_list_equals_the_us_plies(tmp_path, capsys):
    out = tmp_path / "out"
    assert main(["plates", str(US_DEMO), "-o", str(out)]) == 0
    assert "PL1" in capsys.readouterr().out
    assert sorted(p.name for p in out.iterdir()) == ["PL1.dxf", "cut-list.csv"]
    (row,) = _rows(out / "cut-list.csv")
    assert list(row) == ["mark", "ply", "grade", "thickness (in)", "width (in)",
                         "length (in)", "hole count", "hole diameter (in)",
                         "hole positions x;y (in)", "mass (lb)"]
    assert row["mark"] == "PL1" and row["ply"] == "flitch plate"
    assert row["grade"] == "ASTM A36 steel plate"
    assert float(row["thickness (in)"]) == pytest.approx(0.375, abs=1e-9)
    assert float(row["width (in)"]) == pytest.approx(8.75, abs=1e-9)
    assert float(row["length (in)"]) == pytest.approx(144.0, abs=1e-9)
    assert row["hole count"] == "12"
    assert float(row["hole diameter (in)"]) == pytest.approx(0.5625, abs=1e-9)
    pairs = [tuple(float(v) for v in p.split(";"))
             for p in row["hole positions x;y (in)"].split()]
    assert pairs == [(x, y) for x in (12.0, 36.0, 60.0, 84.0, 108.0, 132.0)
                     for y in (2.0, 6.75)]
    # 490 lb/ft^3 x 0.375 x 8.75 x 144 in^3 / 1728 = 133.984375 lb
    assert float(row["mass (lb)"]) == pytest.approx(133.984375, rel=1e-9)
    # the drawing holds the same holes as the cut list
    doc = ezdxf.readfile(out / "PL1.dxf")
    drawn = sorted((c.dxf.center.x, c.dxf.center.y) for c in doc.modelspace().query("CIRCLE"))
    for (x, y), (ex, ey) in zip(drawn, sorted(pairs), strict=True):
        assert abs(x - ex) <= 1e-9 and abs(y - ey) <= 1e-9


def test_cut_list_equals_the_eu_plies(tmp_path):
    out = tmp_path / "out"
    assert main(["plates", str(EU_DEMO), "-o", str(out)]) == 0
    (row,) = _rows(out / "cut-list.csv")
    assert row["thickness (mm)"] == "10" and row["width (mm)"] == "200"
    assert row["length (mm)"] == "3600" and row["hole diameter (mm)"] == "13"
    # 7850 kg/m^3 x 0.010 x 0.200 x 3.6 m^3 = 56.52 kg
    assert float(row["mass (kg)"]) == pytest.approx(56.52, rel=1e-9)


def test_alternative_plate(tmp_path):
    out = tmp_path / "out"
    assert main(["plates", str(US_DEMO), "-o", str(out), "--alternative", "1/4 in plate"]) == 0
    (row,) = _rows(out / "cut-list.csv")
    assert float(row["thickness (in)"]) == pytest.approx(0.25, abs=1e-9)
    # 490 x 0.25 x 8.75 x 144 / 1728 lb
    assert float(row["mass (lb)"]) == pytest.approx(490 * 0.25 * 8.75 * 144 / 1728, rel=1e-9)


def test_default_density_and_a_cover_plate_without_holes(tmp_path):
    """A steel of the project without a density weighs 7850 kg/m^3; a plate under the
    timbers (no timber against its faces) takes no through-bolts and has no holes.
    """
    data = _demo(EU_DEMO)
    data["materials"] = {"PLATE-STEEL": {"kind": "steel", "name": "plate steel",
                                         "E": "210000 MPa", "Fy": "275 MPa", "Fu": "430 MPa"}}
    data["plies"].append({"name": "cover", "material": "PLATE-STEEL", "x": "0 mm",
                          "y": "-8 mm", "width": "100 mm", "height": "8 mm"})
    out = tmp_path / "out"
    assert main(["plates", str(_write(tmp_path, data)), "-o", str(out)]) == 0
    rows = _rows(out / "cut-list.csv")
    assert [r["mark"] for r in rows] == ["PL1", "PL2"]
    cover = rows[1]
    assert cover["ply"] == "cover" and cover["hole count"] == "0"
    assert cover["hole positions x;y (mm)"] == ""
    # 7850 x 0.100 x 0.008 x 3.6 = 22.608 kg
    assert float(cover["mass (kg)"]) == pytest.approx(22.608, rel=1e-9)
    doc = ezdxf.readfile(out / "PL2.dxf")
    assert len(doc.modelspace().query("CIRCLE")) == 0
    text = "\n".join(e.dxf.text for e in doc.modelspace().query("TEXT"))
    assert "Holes: none" in text and "ply 4 of 4" in text


def test_a_design_that_fails_is_marked(tmp_path, capsys):
    """A plate on one face of one 2x10 fails its checks (``plystack check``): the files are
    written, the drawing and the message say NOT OK and not for fabrication.
    """
    data = _demo()
    data["plies"] = data["plies"][:2]
    out = tmp_path / "out"
    assert main(["plates", str(_write(tmp_path, data)), "-o", str(out)]) == 0
    assert "NOT OK. Not for fabrication" in capsys.readouterr().err
    doc = ezdxf.readfile(out / "PL1.dxf")
    text = "\n".join(e.dxf.text for e in doc.modelspace().query("TEXT"))
    assert "Design checks: NOT OK. Not for fabrication" in text
    assert "Caution:" in text


def test_formula_like_names_are_quoted(tmp_path):
    data = _demo()
    data["plies"][1]["name"] = "=1+1"
    out = tmp_path / "out"
    assert main(["plates", str(_write(tmp_path, data)), "-o", str(out)]) == 0
    (row,) = _rows(out / "cut-list.csv")
    assert row["ply"] == "'=1+1"


def test_rewrites_over_earlier_files(tmp_path):
    out = tmp_path / "out"
    assert main(["plates", str(US_DEMO), "-o", str(out)]) == 0
    assert main(["plates", str(US_DEMO), "-o", str(out), "--alternative", "1/2 in plate"]) == 0
    (row,) = _rows(out / "cut-list.csv")
    assert float(row["thickness (in)"]) == pytest.approx(0.5, abs=1e-9)
    assert not [p for p in out.iterdir() if p.name.startswith(".")]


def _fails(argv: list[str], capsys, *expected: str) -> str:
    assert main(argv) == 2
    err = capsys.readouterr().err
    for part in expected:
        assert part in err, err
    _no_class_names(err)
    return err


def test_missing_file_exits_2(tmp_path, capsys):
    _fails(["plates", str(tmp_path / "none.plystack.json"), "-o", str(tmp_path / "o")], capsys,
           "none.plystack.json")
    assert not (tmp_path / "o").exists()


def test_file_that_is_not_json_exits_2(tmp_path, capsys):
    bad = tmp_path / "bad.plystack.json"
    bad.write_text("{ not json", encoding="utf-8")
    _fails(["plates", str(bad), "-o", str(tmp_path / "o")], capsys, "bad.plystack.json")
    assert not (tmp_path / "o").exists()


def test_no_steel_plate_exits_2(tmp_path, capsys):
    data = _demo()
    data["plies"] = [data["plies"][0]]
    _fails(["plates", str(_write(tmp_path, data)), "-o", str(tmp_path / "o")], capsys,
           "plies: hold no steel plate")
    assert not (tmp_path / "o").exists()


def test_unknown_alternative_exits_2(tmp_path, capsys):
    _fails(["plates", str(US_DEMO), "-o", str(tmp_path / "o"), "--alternative", "nope"],
           capsys, '--alternative: "nope" is not an alternative')


def test_output_that_is_a_file_exits_2(tmp_path, capsys):
    target = tmp_path / "a-file"
    target.write_text("x", encoding="utf-8")
    _fails(["plates", str(US_DEMO), "-o", str(target)], capsys,
           "-o/--output", "is a file, not a folder")
    assert target.read_text(encoding="utf-8") == "x"


def test_station_outside_a_short_plate_exits_2(tmp_path, capsys):
    """Plate from 2 ft to 10 ft, stations at 1, 6 and 11 ft: the first and last stations
    lie off the plate. The analysis itself refuses them (a bolt must pass through the
    plate), naming the first, so nothing is drawn.
    """
    data = _demo()
    data["plies"][1].update({"from": "2 ft", "to": "10 ft"})
    data["design"]["bolt"]["stations"] = ["1 ft", "6 ft", "11 ft"]
    _fails(["plates", str(_write(tmp_path, data)), "-o", str(tmp_path / "o")], capsys,
           "design.bolt.stations: 1.0000 ft is outside the length of the plate "
           '"flitch plate" (2.000 ft to 10.000 ft)')
    assert not (tmp_path / "o").exists()


def test_row_outside_the_plate_exits_2(tmp_path, capsys):
    """Rows at 0.1 in and 5 in in the section: the plate starts at 1/4 in, so the lower row
    is below its bottom edge; the analysis refuses it, one problem, nothing drawn.
    """
    data = _demo()
    data["design"]["bolt"]["rows"] = ["0.1 in", "5 in"]
    err = _fails(["plates", str(_write(tmp_path, data)), "-o", str(tmp_path / "o")], capsys,
                 "design.bolt.rows: 0.1000 in is outside the height the plate "
                 '"flitch plate" shares with its timbers (0.2500 in to 9.000 in)')
    assert err.count("design.bolt.rows") == 1
    assert not (tmp_path / "o").exists()


def test_bolts_that_cannot_be_checked_need_a_spacing(tmp_path, capsys):
    """A steel without Fu: no bolt value, so no spacing was chosen; the message says so and
    names the field that gives one. With a spacing the plate is drawn.
    """
    data = _demo()
    data["materials"] = {"NO-FU": {"kind": "steel", "name": "steel without Fu",
                                   "E": "29000 ksi", "Fy": "36 ksi"}}
    data["plies"][1]["material"] = "NO-FU"
    _fails(["plates", str(_write(tmp_path, data)), "-o", str(tmp_path / "o")], capsys,
           'plies[1].material: steel "NO-FU" has no Fu',
           'design.bolt.spacing: the bolts of "flitch plate" cannot be checked')
    data["design"]["bolt"]["spacing"] = "24 in"
    assert main(["plates", str(_write(tmp_path, data)), "-o", str(tmp_path / "o")]) == 0
    (row,) = _rows(tmp_path / "o" / "cut-list.csv")
    assert row["hole count"] == "12"


def test_control_characters_leave_the_drawing(tmp_path):
    data = _demo()
    data["plies"][1]["name"] = "two\nlines %%c"
    out = tmp_path / "out"
    assert main(["plates", str(_write(tmp_path, data)), "-o", str(out)]) == 0
    doc = ezdxf.readfile(out / "PL1.dxf")
    title = doc.modelspace().query("TEXT")[0].dxf.text
    assert title == 'PL1: steel plate "two lines % %c" (ply 2 of 3)'


def test_plate_cut_by_an_overlapping_ply_exits_2(tmp_path, capsys):
    """The right 2x10 moved 1/8 in left overlaps the plate, and the later ply wins: the
    plate analysed is not the rectangle that would be drawn.
    """
    data = _demo()
    data["plies"][2]["x"] = "1 3/4 in"
    _fails(["plates", str(_write(tmp_path, data)), "-o", str(tmp_path / "o")], capsys,
           'plies[1]: "flitch plate" is cut by a later ply that overlaps it')
    assert not (tmp_path / "o").exists()


def test_no_beam_exits_2(tmp_path, capsys):
    data = _demo()
    data.pop("beam")
    _fails(["plates", str(_write(tmp_path, data)), "-o", str(tmp_path / "o")], capsys,
           "beam: is not given")


def test_empty_output_exits_2(capsys):
    _fails(["plates", str(US_DEMO), "-o", ""], capsys, "-o/--output: is empty")


def test_help_lists_the_command(capsys):
    with pytest.raises(SystemExit):
        main(["--help"])
    assert "plates" in capsys.readouterr().out


@pytest.mark.parametrize("demo, diameter, hole, closer", [
    (US_DEMO, "3/4 in", 0.8125, False),  # AISC 360-16 Table J3.3: 3/4 in bolt, 13/16 in hole
    (US_DEMO, "1 in", 1.0625, True),  # standard hole 1 1/8 in: the checked 1 1/16 in is kept
    (EU_DEMO, "16 mm", 17.0, True),  # EN 1090-2 Table 11: M16 normal clearance 2 mm
    (EU_DEMO, "12 mm", 13.0, False),  # M12: 1 mm
])
def test_hole_is_the_checked_hole_and_says_where_the_standard_is_larger(
        tmp_path, demo, diameter, hole, closer):
    """Holes D + 1/16 in and d + 1 mm (the net-section check's); where the standard hole
    is larger (from memory of the tables named beside each case), the drawing says so.
    """
    data = _demo(demo)
    data["design"]["bolt"]["diameter"] = diameter
    data["design"]["bolt"]["spacing"] = "24 in" if demo == US_DEMO else "600 mm"
    out = tmp_path / "out"
    assert main(["plates", str(_write(tmp_path, data)), "-o", str(out)]) == 0
    (row,) = _rows(out / "cut-list.csv")
    unit = "in" if demo == US_DEMO else "mm"
    assert float(row[f"hole diameter ({unit})"]) == pytest.approx(hole, abs=1e-9)
    doc = ezdxf.readfile(out / "PL1.dxf")
    text = " ".join(e.dxf.text for e in doc.modelspace().query("TEXT"))
    assert ("keeps the closer fit that was checked" in text) == closer
