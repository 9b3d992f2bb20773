"""The PDF calculation sheet, read back with pypdf: sections in order, numbers equal to
`check --json` after conversion and rounding, title block and page numbering."""

from __future__ import annotations

import io
import json
import re
from pathlib import Path

import pytest
from pypdf import PdfReader

from plystack.core.cli import main
from plystack.core.io.project_file import from_dict, load
from plystack.core.model.errors import ProjectError
from plystack.core.model.units import fmt
from plystack.core.report.numbers import q
from plystack.core.report.sheet import build_sheet

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"
SECTIONS = ["1  Design basis and assumptions", "2  Section", "3  Transformed section",
            "4  Beam actions", "5  Strain and stress", "6  Design checks", "7  Summary"]


def sheet_text(project, paper="letter"):
    buf = io.BytesIO()
    pages = build_sheet(project, buf, paper)
    reader = PdfReader(io.BytesIO(buf.getvalue()))
    assert len(reader.pages) == pages
    return [p.extract_text() for p in reader.pages]


def squash(text: str) -> str:
    return re.sub(r"\s+", " ", text)


def test_sections_in_order_and_numbers_match_check_json(capsys):
    pages = sheet_text(load(DEMO))
    text = squash(" ".join(pages))
    positions = [text.find(squash(s)) for s in SECTIONS]
    assert all(p >= 0 for p in positions), positions
    assert positions == sorted(positions)
    assert main(["check", str(DEMO), "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    sec = out["section"]
    assert "y_na = " in text and fmt(sec["neutral_axis_y"], "length", "US", 5) in text
    # issue 21: thousands separators and unit typography (was "923697949 lbf*in^2")
    assert squash(q(sec["EI"], "EI", "US", 5)) in text
    for c in out["checks"]:
        assert f"{c['ratio']:.3f}" in text
    assert "Verdict: OK" in text
    gov = out["governing"]
    assert f"ratio {gov['ratio']:.3f}" in text


def test_every_page_has_title_block_and_page_x_of_y():
    pages = sheet_text(load(DEMO), "a4")
    n = len(pages)
    assert n >= 3
    for k, page in enumerate(pages, start=1):
        assert f"page {k} of {n}" in page
        assert "Invented demo" in page
        assert "Checked by:" in page and "Plystack" in page and "Revision" in page
        assert "Member: FB-1" in page


def test_failing_project_says_not_ok():
    d = json.loads(DEMO.read_text())
    d["beam"]["spans"] = ["24 ft"]
    text = squash(" ".join(sheet_text(from_dict(d))))
    summary = text[text.find("7 Summary"):]
    assert "Verdict: NOT OK" in summary


def test_project_with_an_error_refuses_to_export(tmp_path, capsys):
    d = json.loads(DEMO.read_text())
    del d["beam"]
    with pytest.raises(ProjectError, match="beam"):
        build_sheet(from_dict(d), io.BytesIO())
    bad = tmp_path / "bad.plystack.json"
    d = json.loads(DEMO.read_text())
    d["plies"][0]["height"] = "tall"
    bad.write_text(json.dumps(d))
    out = tmp_path / "out.pdf"
    assert main(["sheet", str(bad), "-o", str(out)]) == 2
    assert "plies[0].height" in capsys.readouterr().err
    assert not out.exists()


def test_sheet_command_and_alternative(tmp_path, capsys):
    out = tmp_path / "sheet.pdf"
    assert main(["sheet", str(DEMO), "-o", str(out), "--alternative", "1/4 in plate",
                 "--paper", "a4"]) == 0
    text = " ".join(p.extract_text() for p in PdfReader(out).pages)
    assert "1/4 in plate" in text
    assert main(["sheet", str(DEMO), "-o", str(out), "--alternative", "nope"]) == 2


def test_fonts_are_embedded():
    buf = io.BytesIO()
    build_sheet(load(DEMO), buf)
    reader = PdfReader(io.BytesIO(buf.getvalue()))
    fonts = reader.pages[0]["/Resources"]["/Font"]
    for ref in fonts.values():
        font = ref.get_object()
        desc = font.get("/FontDescriptor") or font["/DescendantFonts"][0].get_object()[
            "/FontDescriptor"]
        desc = desc.get_object()
        assert any(k in desc for k in ("/FontFile", "/FontFile2", "/FontFile3"))


def test_the_ratio_line_prints_figures_enough_to_divide_back():
    """A reader divides the printed demand by the printed capacity: with four figures,
    1,633 lbf / 721.6 lbf = 2.2630 would not give the printed 2.262 (the ratio of the
    unrounded values 1632.6 / 721.62 = 2.2624); five figures do (1,632.6 / 721.62 =
    2.2624)."""
    from plystack.core.design.check import Check
    from plystack.core.model.constants import LBF
    from plystack.core.report.derive import ratio_line

    c = Check(id="splitting", ply="L", combination="D + L", demand=1632.6 * LBF,
              capacity=721.62 * LBF, quantity="force", reference=("V", 1.0))
    line = ratio_line(c, "US")
    assert line == ("ratio = 1,632.6\u00a0lbf / 721.62\u00a0lbf = 2.262 > 1 \u2192 NOT OK")
    plain = Check(id="splitting", ply="L", combination="D + L", demand=500.0 * LBF,
                  capacity=800.0 * LBF, quantity="force", reference=("V", 1.0))
    assert ratio_line(plain, "US").startswith("ratio = 500.0\u00a0lbf / 800.0\u00a0lbf = 0.625")
