"""The sheet's title block, loads page inputs and page layout (issue 21), read back with
pypdf; the new optional project keys (info job/address/licence, load description)
round-trip through the project file.
"""

from __future__ import annotations

import io
import json
import re
from pathlib import Path

import pytest
from pypdf import PdfReader

from plystack.core.io.project_file import dumps, from_dict, load, loads
from plystack.core.model.errors import ProjectError
from plystack.core.report.numbers import feet_inches, num, plain
from plystack.core.report.sheet import build_sheet

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo"
US = DEMO / "porch-header.plystack.json"
EU = DEMO / "stair-trimmer-eu.plystack.json"


def pages_of(project, paper="letter"):
    buf = io.BytesIO()
    build_sheet(project, buf, paper)
    return [p.extract_text() for p in PdfReader(io.BytesIO(buf.getvalue())).pages]


def with_info(**info):
    d = json.loads(US.read_text())
    d["info"].update(info)
    return d


def test_title_block_is_complete_on_every_page():
    d = with_info(job="J-17", address="1 Invented Road", licence="PE 00000 (invented)",
                  checked_by="A. Checker", date="2026-03-04")
    pages = pages_of(from_dict(d))
    for k, page in enumerate(pages, start=1):
        text = re.sub(r"\s+", " ", page)
        for piece in ("Job: J-17", "Address: 1 Invented Road", "Member: FB-1", "Description:",
                      "Prepared by:", "Demo Engineer", "Checked by:", "A. Checker", "Date:",
                      "2026-03-04", "Revision:", f"page {k} of {len(pages)}",
                      "Seal and signature", "Licence No.: PE 00000 (invented)", "Caution:"):
            assert piece in text, (k, piece)


def test_long_title_wraps_instead_of_vanishing():
    d = json.loads(US.read_text())
    d["title"] = "An invented project title long enough to need two lines in the title " \
                 "block of the sheet, ending here"
    first = re.sub(r"\s+", " ", pages_of(from_dict(d))[0])
    assert "ending here" in first


def test_info_keys_and_load_descriptions_round_trip():
    d = with_info(job="J-17", address="1 Invented Road", licence="L-1")
    project = from_dict(d)
    again = loads(dumps(project))
    assert again.info == project.info
    assert again.info["licence"] == "L-1"
    assert [ld.description for ld in again.beam.loads] == \
        [ld.description for ld in project.beam.loads]
    assert project.beam.loads[0].description == "floor dead load (invented)"
    d["beam"]["loads"][1].pop("description")
    plain_load = from_dict(d).beam.loads[1]
    assert plain_load.description == ""
    assert "description" not in json.loads(dumps(from_dict(d)))["beam"]["loads"][1]


def test_bad_load_description_is_named():
    d = json.loads(US.read_text())
    d["beam"]["loads"][0]["description"] = 12
    with pytest.raises(ProjectError, match=r"beam\.loads\[0\]\.description: must be text"):
        from_dict(d)


@pytest.mark.parametrize("path", [US, EU])
def test_loads_page_lists_descriptions(path):
    text = re.sub(r"\s+", " ", " ".join(pages_of(load(path))))
    for ld in json.loads(path.read_text())["beam"]["loads"]:
        assert ld["description"] in text


@pytest.mark.parametrize(("path", "paper"), [(US, "letter"), (EU, "a4"), (US, "a4")])
def test_no_page_holds_only_a_few_lines_except_the_last(path, paper):
    pages = pages_of(load(path), paper)
    for k, page in enumerate(pages[:-1], start=1):
        lines = [ln for ln in page.splitlines() if ln.strip()]
        assert len(lines) >= 30, (k, len(lines))


def test_numbers_have_separators_and_sensible_figures():
    # hand-written expectations
    assert num(1600000.0, 4) == "1.600\u00a0\u00d7\u00a010\u2076"
    assert plain(1600000.0) == "1,600,000"
    assert num(6547.31, 5) == "6,547.3"
    assert num(0.0625, 3) == "0.0625"
    assert num(-629.41) == "\u2212629.4"
    assert plain(0.375) == "0.375" and plain(2.5) == "2.5" and plain(900.0) == "900"
    assert feet_inches(6 * 0.3048) == "6\u2032-0\u2033"
    assert feet_inches(4.5 * 0.3048 + 0.5 * 0.0254) == "4\u2032-6\u00a01/2\u2033"


@pytest.mark.parametrize("path", [US, EU])
def test_no_ascii_units_left(path):
    text = " ".join(pages_of(load(path)))
    for ascii_unit in ("lbf*ft", "in^2", "in^4", "kN*m", "mm^4", "lbf*in^2", "kg/m^3"):
        assert ascii_unit not in text
    assert "(from memory)" not in text
    assert text.count("verify against the published table") == 1
