"""The member on the calculation sheet: the one-line description, the elevation drawing
(plies' extents, notches, holes, bolts, supports, loads) and the caution on every page
of the variants (a plate stopping short, a staged member, a notch and a hole).

Sources: dressed sizes of US dimension lumber (2x10 is 1 1/2 x 9 1/4 in, common
practice); grade names of the NDS Supplement Table 4A / 4B and EN 338 (from memory);
the drawing notation (count-size, "w/", "PL", "@ ... o.c.", "M12") is common practice.
"""

from __future__ import annotations

import io
import json
from pathlib import Path

import pytest
from pypdf import PdfReader
from reportlab.graphics.shapes import Circle, Rect, String
from reportlab.lib import colors

from plystack.core.io.project_file import from_dict, load
from plystack.core.model.caution import CAUTION
from plystack.core.model.constants import INCH, MM
from plystack.core.pipeline import run
from plystack.core.report.connections import plate_layouts
from plystack.core.report.description import describe, inch_text, member_description
from plystack.core.report.elevation import LEFT, RIGHT, elevation_drawing
from plystack.core.report.fonts import register_fonts as _register_fonts
from plystack.core.report.sheet import build_sheet

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo"
US, EU = DEMO / "porch-header.plystack.json", DEMO / "stair-trimmer-eu.plystack.json"
FT = 12 * INCH


def _demo(path: Path, change=None) -> dict:
    d = json.loads(path.read_text())
    d.pop("alternatives", None)
    if change is not None:
        change(d)
    return d


@pytest.mark.parametrize(("value", "text"), [(0.375, "3/8"), (8.75, "8 3/4"), (1.5, "1 1/2"),
                                             (24.0, "24"), (0.5625, "9/16"), (0.3, "0.3")])
def test_inch_text_in_sixteenths(value, text):
    assert inch_text(value * INCH) == text


def test_us_demo_in_one_line():
    """Two 2x10 DF-L No.2 (1 1/2 x 9 1/4 in dressed), a 3/8 x 8 3/4 in A36 plate the full
    12 ft, 1/2 in bolts in 2 rows at the 24 in the checks place."""
    a = run(load(US))
    assert plate_layouts(a)[0][1].spacing == pytest.approx(24 * INCH, rel=1e-12)
    assert member_description(a) == ("2-2x10 DF-L No.2 w/ 3/8 x 8 3/4 x 12′-0″ A36 PL, "
                                      "1/2 in dia bolts @ 24 in o.c., 2 rows")


def test_southern_pine_staggered_bolts_given_by_the_user():
    def change(d: dict) -> None:
        for k in (0, 2):
            d["plies"][k]["material"] = "SP-No2-2x10"
        d["plies"][1].update(width="1/2 in", y="0 in", height="9 1/4 in")
        d["plies"][2]["x"] = "2 in"
        d["design"]["bolt"].update(spacing="16 in", stagger=True)

    a = run(from_dict(_demo(US, change)))
    assert member_description(a) == ("2-2x10 SYP No.2 w/ 1/2 x 9 1/4 x 12′-0″ A36 PL, "
                                      "1/2 in dia bolts @ 16 in o.c., 2 rows staggered")


def test_eu_demo_in_one_line_and_a_plate_stopping_short():
    a = run(load(EU))
    assert member_description(a) == ("2 x 45x220 C24 + PL 10x200x3600 S275, M12 bolts at "
                                      "600 mm, 2 rows")
    short = run(from_dict(_demo(EU, lambda d: d["plies"][1].update({"from": "0.3 m",
                                                                     "to": "3.3 m"}))))
    assert member_description(short).startswith("2 x 45x220 C24 + PL 10x200x3000 S275, M12")


def test_actual_sizes_where_no_stock_size_and_no_bolts_without_plates():
    a = run(load(US))
    mats = a.section.materials
    ply = a.section.plies[0]
    odd = [ply.__class__(ply.name, ply.material, 0.0, 0.0, 1.75 * INCH, 9.5 * INCH)]
    assert describe(odd, mats[:1], 12 * FT, "US") == "1 3/4 x 9 1/2 DF-L No.2"
    si = [ply.__class__("a", "C24", 0.0, 0.0, 45 * MM, 195 * MM),
          ply.__class__("b", "C24", 45 * MM, 0.0, 45 * MM, 195 * MM)]
    c24 = run(load(EU)).section.materials[0]
    assert describe(si, [c24, c24], 3.6, "SI") == "2 x 45x195 C24"


def _strings(d) -> list[str]:
    out = []
    for item in d.contents:
        if isinstance(item, String):
            out.append(item.text)
        elif hasattr(item, "contents"):
            out += _strings(item)
    return out


def test_elevation_dimensions_every_ply_and_draws_the_bolts():
    """The plate from 1 ft to 11 ft: its bar says so and its length, 11 - 1 = 10 ft; every
    bolt of the layout is a dot in the member, every station a circle on the plate's bar."""
    a = run(from_dict(_demo(US, lambda d: d["plies"][1].update({"from": "1 ft",
                                                                 "to": "11 ft"}))))
    layouts = [lay for _jt, lay in plate_layouts(a)]
    _register_fonts()  # the drawing measures its text in the sheet's font
    d = elevation_drawing(a, 180 * 72 / 25.4, layouts)
    texts = _strings(d)
    assert "from 1′-0″ to 11′-0″ (10′-0″)" in texts
    assert texts.count("from 0′-0″ to 12′-0″ (12′-0″)") == 2
    assert {"R1", "R2", "12′-0″", "300.0\u00a0lbf"} <= set(texts)
    dots = [c for c in d.contents if isinstance(c, Circle) and c.fillColor == colors.black]
    assert len(dots) == layouts[0].count
    rings = [c for c in d.contents if isinstance(c, Circle) and c.fillColor == colors.white]
    assert len(rings) == len(layouts[0].stations)
    # stations drawn to the horizontal scale
    scale = (d.width - LEFT - RIGHT) / (12 * FT)
    xs = sorted(c.cx for c in rings)
    assert xs == pytest.approx([LEFT + x * scale for x in layouts[0].stations], abs=1e-9)


def test_elevation_cuts_the_notch_and_bores_the_hole():
    """A 1 1/2 in notch 3 in long at support 1 (the left end) and a 1 1/2 in hole at 3 ft:
    the notch is a white cut from x = 0 to 3 in at the bottom face, 1.5 / 9.25 of the
    member's drawn depth; the hole a white circle at x = 3 ft."""
    def change(d: dict) -> None:
        d["beam"]["notches"] = [{"at": "support 1", "face": "bottom", "depth": "1.5 in",
                                 "length": "3 in"}]
        d["beam"]["holes"] = [{"at": "3 ft", "y": "4.625 in", "diameter": "1.5 in"}]

    a = run(from_dict(_demo(US, change)))
    _register_fonts()
    d = elevation_drawing(a, 180 * 72 / 25.4)
    scale = (d.width - LEFT - RIGHT) / (12 * FT)
    cuts = [r for r in d.contents if isinstance(r, Rect) and r.fillColor == colors.white]
    assert len(cuts) == 1
    band = next(r for r in d.contents if isinstance(r, Rect) and r.width == pytest.approx(
        12 * FT * scale) and r.height > 30)
    assert cuts[0].x == pytest.approx(LEFT) and cuts[0].width == pytest.approx(3 * INCH * scale)
    assert cuts[0].y == pytest.approx(band.y)
    assert cuts[0].height == pytest.approx(band.height * 1.5 / 9.25, rel=1e-12)
    hole = next(c for c in d.contents if isinstance(c, Circle) and c.fillColor == colors.white)
    assert hole.cx == pytest.approx(LEFT + 3 * FT * scale)
    assert hole.r == pytest.approx(band.height * 0.75 / 9.25, rel=1e-12)


VARIANTS = {
    "plate stopping short": lambda d: d["plies"][1].update({"from": "1 ft", "to": "11 ft"}),
    "staged": lambda d: (d["plies"][1].update(stage="added"),
                         [ld.update(stage="before") for ld in d["beam"]["loads"]
                          if ld["case"] == "D"]),
    "notch and hole": lambda d: d["beam"].update(
        notches=[{"at": "support 1", "face": "bottom", "depth": "1.5 in", "length": "3 in"}],
        holes=[{"at": "3 ft", "y": "4.625 in", "diameter": "1.5 in"}]),
}


@pytest.mark.parametrize("variant", sorted(VARIANTS))
def test_every_page_of_the_variants_keeps_the_caution(variant):
    buf = io.BytesIO()
    pages = build_sheet(from_dict(_demo(US, VARIANTS[variant])), buf)
    reader = PdfReader(io.BytesIO(buf.getvalue()))
    assert len(reader.pages) == pages
    head = " ".join(CAUTION.split()[:6])
    for k, page in enumerate(reader.pages, start=1):
        text = " ".join(page.extract_text().split())
        assert head in text, (variant, k)
        assert f"page {k} of {pages}" in text
    full = " ".join(" ".join(p.extract_text().split()) for p in reader.pages)
    assert "Member elevation" in full and "8 Plate details and bolt schedule" in full


def test_stations_given_unevenly_are_described_as_detailed():
    """Stations at 1, 2, 5, 9 and 11 ft have no one spacing: the line refers to the detail."""
    a = run(from_dict(_demo(US, lambda d: d["design"]["bolt"].update(
        stations=["1 ft", "2 ft", "5 ft", "9 ft", "11 ft"], stagger=True,
        rows=["2 in", "4.625 in", "7.25 in"]))))
    assert member_description(a).endswith("1/2 in dia bolts as detailed, 3 rows staggered")


LAYOUTS = {
    "cantilever": lambda d: d["beam"].update(supports="cantilever", spans=["6 ft"]),
    "three spans with overhangs": lambda d: d["beam"].update(
        spans=["8 ft", "10 ft", "8 ft"], overhang_left="2 ft", overhang_right="1 ft"),
    "fixed-fixed": lambda d: d["beam"].update(supports="fixed-fixed"),
    "two plates, three timbers": lambda d: d.update(plies=[
        d["plies"][0], d["plies"][1], d["plies"][2],
        {**d["plies"][1], "name": "plate 2", "x": "3 3/8 in"},
        {**d["plies"][0], "name": "third <2x10> & co", "x": "3.75 in"}]),
    "cover plate, no bolts": lambda d: (d.update(plies=[
        {"name": "joist", "material": "DFL-No2", "x": "0 in", "y": "0 in", "width": "1.5 in",
         "height": "9.25 in"},
        {"name": "cover", "material": "A36", "x": "0 in", "y": "9.25 in", "width": "1.5 in",
         "height": "1/4 in"}]),
        d["design"].update(connector={"type": "screw", "allowable": "300 lbf", "rows": 2})),
    "many point loads": lambda d: d["beam"]["loads"].extend(
        [{"case": "S", "type": "point", "value": "50 lbf", "at": f"{k / 2} ft"}
         for k in range(1, 24)]),
}


@pytest.mark.parametrize("layout", sorted(LAYOUTS))
def test_sheet_builds_for_other_layouts_with_a_detail_per_plate(layout):
    """Every support kind, several spans, two plates, none, markup characters in a name."""
    p = from_dict(_demo(US, LAYOUTS[layout]))
    buf = io.BytesIO()
    build_sheet(p, buf)
    text = " ".join(" ".join(pg.extract_text().split())
                    for pg in PdfReader(io.BytesIO(buf.getvalue())).pages)
    a = run(p)
    plates = plate_layouts(a)
    assert "Member elevation" in text and "8 Plate details and bolt schedule" in text
    for k, (jt, _lay) in enumerate(plates, start=1):
        assert f"Steel plate “{a.section.plies[jt.steel].name}” (bolts B{k})" in text
    if not plates:
        assert "no steel plate bolted to timbers beside it" in text
