"""The plate drawings of ``plystack plates`` read back with ezdxf, against layouts worked out
by hand in each test from the layout rules of the bolts and the standards' holes.

Sources:
- Bolt positions: the placement rules stated in ``design.bolt_layout`` and the project
  file's ``design.bolt`` keys (as many stations at the spacing as fit between the end
  distances, centred on the plate; rows given as a count centred on the height the plate
  shares with its timbers, 4 D from either edge, NDS 2018 Table 12.5.1C and EN 1995-1-1
  Table 8.4 a4,t = 4 d at 90 degrees, from memory; on the US basis at most 5 in between
  the outer rows, NDS 2018 12.5.1.3, from memory). Each expected position is written out
  below as a hand calculation.
- Hole diameter: D + 1/16 in, AISC 360-16 Table J3.3 standard hole for bolts under 1 in
  (from memory); d + 1 mm, EN 1090-2 Table 11 normal clearance for M12 (from memory).
- DXF header: $INSUNITS 1 = inches, 4 = millimetres; $MEASUREMENT 0 = imperial, 1 =
  metric; version AC1024 = R2010 (the DXF reference).
- Drawing units: 1 in = 25.4 mm exactly (the international inch).
"""

from __future__ import annotations

import json
from pathlib import Path

import ezdxf
import pytest

from plystack.core.cli import main

DEMOS = Path(__file__).resolve().parents[2] / "assets" / "demo"
US_DEMO = DEMOS / "porch-header.plystack.json"
EU_DEMO = DEMOS / "stair-trimmer-eu.plystack.json"
TOL = 1e-9  # drawing units


def _variant(tmp_path: Path, demo: Path, bolt: dict | None = None,
             plate: dict | None = None, name: str = "variant") -> Path:
    data = json.loads(demo.read_text(encoding="utf-8"))
    data.pop("alternatives", None)
    if bolt is not None:
        data["design"]["bolt"].update(bolt)
    if plate is not None:
        data["plies"][1].update(plate)
    path = tmp_path / f"{name}.plystack.json"
    path.write_text(json.dumps(data), encoding="utf-8")
    return path


def _run(path: Path, out: Path) -> None:
    assert main(["plates", str(path), "-o", str(out)]) == 0


def _circles(doc):
    return [(e.dxf.center.x, e.dxf.center.y, e.dxf.radius)
            for e in doc.modelspace().query("CIRCLE")]


def _assert_holes(doc, expected: list[tuple[float, float]], diameter: float) -> None:
    circles = _circles(doc)
    assert len(circles) == len(expected)
    got = sorted((x, y) for x, y, _ in circles)
    for (x, y), (ex, ey) in zip(got, sorted(expected), strict=True):
        assert abs(x - ex) <= TOL and abs(y - ey) <= TOL, ((x, y), (ex, ey))
    for _x, _y, r in circles:
        assert abs(2 * r - diameter) <= TOL
    assert {e.dxf.layer for e in doc.modelspace().query("CIRCLE")} == {"HOLES"}


def _outline(doc) -> list[tuple[float, float]]:
    lines = doc.modelspace().query('LWPOLYLINE[layer=="OUTLINE"]')
    assert len(lines) == 1 and lines[0].closed
    return [(p[0], p[1]) for p in lines[0].get_points("xy")]


def _assert_outline(doc, length: float, depth: float) -> None:
    pts = _outline(doc)
    assert len(pts) == 4
    for (x, y), (ex, ey) in zip(pts, [(0, 0), (length, 0), (length, depth), (0, depth)],
                                strict=True):
        assert abs(x - ex) <= TOL and abs(y - ey) <= TOL


def test_us_demo_layout_by_hand(tmp_path):
    """Porch header: 12 ft span, plate 3/8 x 8 3/4 in at y = 1/4 in between 2x10s
    (0 to 9 1/4 in), 1/2 in bolts in 2 rows, spacing chosen by the bolt check.

    Rows: shared height 1/4 in to 9 in, centre 4 5/8 in; room 8 3/4 - 8 (1/2) = 4 3/4 in,
    under the 5 in limit, so rows at 4 5/8 -/+ 2 3/8 = 2 1/4 and 7 in; from the plate's
    bottom edge 2 and 6 3/4 in. Stations: the spacing the check chose (read from its
    ``bolts`` check below, 24 in), no end distance given, so max(2, floor(144 / 24)) = 6
    stations centred: first at (144 - 5 x 24) / 2 = 12 in, then 36, 60, 84, 108, 132 in.
    """
    from plystack.core.io.project_file import load
    from plystack.core.pipeline import run

    bolts = next(c for c in run(load(US_DEMO)).checks if c.id == "bolts")
    assert bolts.fasteners.spacing == pytest.approx(24 * 0.0254, rel=1e-12)
    assert bolts.fasteners.count == 12
    out = tmp_path / "out"
    _run(US_DEMO, out)
    doc = ezdxf.readfile(out / "PL1.dxf")
    assert doc.header["$INSUNITS"] == 1 and doc.header["$MEASUREMENT"] == 0
    assert doc.dxfversion >= "AC1024"
    xs = [12.0, 36.0, 60.0, 84.0, 108.0, 132.0]
    _assert_holes(doc, [(x, y) for x in xs for y in (2.0, 6.75)], 0.5 + 1 / 16)
    _assert_outline(doc, 144.0, 8.75)
    assert {"OUTLINE", "HOLES", "TEXT", "DIMENSIONS"} <= {layer.dxf.name
                                                         for layer in doc.layers}


def test_us_spacing_end_distance_three_rows(tmp_path):
    """Spacing 16 in, end distance 4 in, 3 rows of 1/2 in bolts on the 144 in plate.

    Stations: floor((144 - 2 x 4) / 16) + 1 = floor(8.5) + 1 = 9, spread 8 x 16 = 128 in,
    centred: first at (144 - 128) / 2 = 8 in, then every 16 in to 136 in. Rows: 3 rows over
    the spread 4 3/4 in of the demo (see above): 2 1/4, 4 5/8, 7 in in the section, so 2,
    4 3/8, 6 3/4 in from the plate's bottom edge.
    """
    path = _variant(tmp_path, US_DEMO, {"spacing": "16 in", "end_distance": "4 in", "rows": 3})
    out = tmp_path / "out"
    _run(path, out)
    doc = ezdxf.readfile(out / "PL1.dxf")
    xs = [8.0 + 16.0 * k for k in range(9)]
    _assert_holes(doc, [(x, y) for x in xs for y in (2.0, 4.375, 6.75)], 0.5625)
    _assert_outline(doc, 144.0, 8.75)


def test_plate_stopping_short_gives_its_own_length(tmp_path):
    """A plate from 1 ft to 11 ft of the 12 ft member is 120 in long (Ply.extent), and its
    stations fill its own length: floor((120 - 2 x 4) / 16) + 1 = 8 stations, spread 112 in,
    first (120 - 112) / 2 = 4 in from the plate's left end (16 in along the member), then
    every 16 in to 116 in.
    """
    path = _variant(tmp_path, US_DEMO, {"spacing": "16 in", "end_distance": "4 in"},
                    {"from": "1 ft", "to": "11 ft"})
    out = tmp_path / "out"
    _run(path, out)
    doc = ezdxf.readfile(out / "PL1.dxf")
    _assert_outline(doc, 120.0, 8.75)
    xs = [4.0 + 16.0 * k for k in range(8)]
    _assert_holes(doc, [(x, y) for x in xs for y in (2.0, 6.75)], 0.5625)
    text = " ".join(e.dxf.text for e in doc.modelspace().query("TEXT"))
    assert "from 12 in to 132 in of 144 in" in text


def test_staggered_rows(tmp_path):
    """Stagger: row 1 at stations 1, 3, 5, ..., row 2 at stations 2, 4, 6 (the "stagger"
    key); spacing 24 in and end distance 6 in: floor((144 - 12) / 24) + 1 = 6 stations,
    spread 120 in, first at 12 in.
    """
    path = _variant(tmp_path, US_DEMO, {"spacing": "24 in", "end_distance": "6 in",
                                        "stagger": True})
    out = tmp_path / "out"
    _run(path, out)
    doc = ezdxf.readfile(out / "PL1.dxf")
    xs = [12.0 + 24.0 * k for k in range(6)]
    expected = [(x, 2.0 if k % 2 == 0 else 6.75) for k, x in enumerate(xs)]
    _assert_holes(doc, expected, 0.5625)


def test_eu_demo_in_millimetres(tmp_path):
    """Stair trimmer: 3.6 m span, plate 10 x 200 mm at y = 10 mm between 45 x 220 joists,
    M12 in 2 rows. Rows: shared height 10 to 210 mm, centre 110 mm, room 200 - 8 x 12 =
    104 mm (no spread limit on the EU basis): rows at 58 and 162 mm, so 48 and 152 mm from
    the plate's bottom edge. Stations: the check's spacing (600 mm, read from its ``bolts``
    check), max(2, floor(3600 / 600)) = 6 stations centred: first at (3600 - 3000) / 2 =
    300 mm, then every 600 mm. Hole 12 + 1 = 13 mm.
    """
    from plystack.core.io.project_file import load
    from plystack.core.pipeline import run

    bolts = next(c for c in run(load(EU_DEMO)).checks if c.id == "bolts")
    assert bolts.fasteners.spacing == pytest.approx(0.6, rel=1e-12)
    out = tmp_path / "out"
    _run(EU_DEMO, out)
    doc = ezdxf.readfile(out / "PL1.dxf")
    assert doc.header["$INSUNITS"] == 4 and doc.header["$MEASUREMENT"] == 1
    xs = [300.0 + 600.0 * k for k in range(6)]
    _assert_holes(doc, [(x, y) for x in xs for y in (48.0, 152.0)], 13.0)
    _assert_outline(doc, 3600.0, 200.0)


def test_eu_explicit_stations_and_rows(tmp_path):
    """Stations and rows given as lists are drawn where given: stations 300, 900, 1800,
    2700, 3300 mm along the member and rows at y = 60 and 170 mm in the section, which are
    50 and 160 mm above the plate's bottom edge (plate at y = 10 mm).
    """
    path = _variant(tmp_path, EU_DEMO, {"stations": ["300 mm", "900 mm", "1800 mm",
                                                     "2700 mm", "3300 mm"],
                                        "rows": ["60 mm", "170 mm"]})
    out = tmp_path / "out"
    _run(path, out)
    doc = ezdxf.readfile(out / "PL1.dxf")
    expected = [(x, y) for x in (300.0, 900.0, 1800.0, 2700.0, 3300.0) for y in (50.0, 160.0)]
    _assert_holes(doc, expected, 13.0)


def test_title_names_the_plate(tmp_path):
    """The title holds the mark and ply, grade, thickness, size, holes and project."""
    out = tmp_path / "out"
    _run(US_DEMO, out)
    doc = ezdxf.readfile(out / "PL1.dxf")
    texts = doc.modelspace().query("TEXT")
    assert {e.dxf.layer for e in texts} == {"TEXT"}
    text = "\n".join(e.dxf.text for e in texts)
    for part in ('PL1: steel plate "flitch plate" (ply 2 of 3)', "ASTM A36 steel plate",
                 "Thickness 3/8 in", "8 3/4 in deep x 144 in long",
                 "12 x diameter 9/16 in (bolt 1/2 in + 1/16 in)",
                 "Invented demo: widened opening in a 1920s bungalow"):
        assert part in text, part
    dims = doc.modelspace().query("DIMENSION")
    assert dims and {e.dxf.layer for e in dims} == {"DIMENSIONS"}
    measured = sorted(round(d.get_measurement(), 9) for d in dims)
    # overall 144 and 8 3/4; stations 12, 24 x 5, 12; rows 2, 4 3/4, 2 (hand sums above)
    assert measured == sorted([144.0, 8.75, 12.0, 12.0, *[24.0] * 5, 2.0, 4.75, 2.0])


def test_two_plates_two_files(tmp_path):
    """Two flitch plates (three 2x10s): PL1 and PL2 in ply order, each with its holes."""
    data = json.loads(US_DEMO.read_text(encoding="utf-8"))
    data.pop("alternatives", None)
    t = "1.5 in"
    data["plies"] = [
        {"name": "a", "material": "DFL-No2", "x": "0 in", "y": "0 in", "width": t,
         "height": "9 1/4 in"},
        {"name": "plate one", "material": "A36", "x": "1.5 in", "y": "1/4 in",
         "width": "1/4 in", "height": "8 3/4 in"},
        {"name": "b", "material": "DFL-No2", "x": "1.75 in", "y": "0 in", "width": t,
         "height": "9 1/4 in"},
        {"name": "plate two", "material": "A36", "x": "3.25 in", "y": "1/4 in",
         "width": "3/8 in", "height": "8 3/4 in"},
        {"name": "c", "material": "DFL-No2", "x": "3 5/8 in", "y": "0 in", "width": t,
         "height": "9 1/4 in"},
    ]
    data["design"]["bolt"]["spacing"] = "24 in"
    path = tmp_path / "two.plystack.json"
    path.write_text(json.dumps(data), encoding="utf-8")
    out = tmp_path / "out"
    _run(path, out)
    for mark, ply in (("PL1", "plate one"), ("PL2", "plate two")):
        doc = ezdxf.readfile(out / f"{mark}.dxf")
        text = "\n".join(e.dxf.text for e in doc.modelspace().query("TEXT"))
        assert f'{mark}: steel plate "{ply}"' in text
        # 6 stations at 24 in centred on 144 in (first at 12 in), rows 2 and 6 3/4 in
        _assert_holes(doc, [(12.0 + 24.0 * k, y) for k in range(6) for y in (2.0, 6.75)],
                      0.5625)


@pytest.mark.parametrize("demo, plies, plate", [
    (US_DEMO, None, {"stage": "added"}),
    (US_DEMO, None, {"from": "1 ft", "to": "11 ft"}),
    (US_DEMO, 2, None),
    (EU_DEMO, None, {"from": "300 mm"}),
])
def test_drawn_bolts_are_the_checked_bolts(tmp_path, demo, plies, plate):
    """Strengthened under load, stopping short, on one face, EU: the holes drawn are the
    bolts the ``bolts`` check counts (its locations, rows and count), at the spacing it
    states (the project's own record of the layout it checked).
    """
    from plystack.core.io.project_file import load
    from plystack.core.pipeline import run

    data = json.loads(demo.read_text(encoding="utf-8"))
    data.pop("alternatives", None)
    if plies is not None:
        data["plies"] = data["plies"][:plies]
    if plate is not None:
        data["plies"][1].update(plate)
    if data["plies"][1].get("stage") == "added":
        data["beam"]["shored"] = False
    path = tmp_path / "v.plystack.json"
    path.write_text(json.dumps(data), encoding="utf-8")
    checked = next(c for c in run(load(path)).checks if c.id == "bolts").fasteners
    out = tmp_path / "out"
    _run(path, out)
    circles = _circles(ezdxf.readfile(out / "PL1.dxf"))
    xs = sorted({x for x, _y, _r in circles})
    assert len(circles) == checked.count
    assert len(xs) == checked.locations
    assert len({y for _x, y, _r in circles}) == checked.rows
    unit = 0.0254 if demo == US_DEMO else 0.001
    gaps = [b - a for a, b in zip(xs, xs[1:], strict=False)]
    assert min(gaps) == pytest.approx(checked.spacing / unit, abs=TOL)
