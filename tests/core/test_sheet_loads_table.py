"""The sheet's loads table gives both ends of a varying load (it showed the start value
only; the end value was in the elevation drawing alone)."""

from __future__ import annotations

import io
import json
from pathlib import Path

from pypdf import PdfReader

from plystack.core.io.project_file import loads
from plystack.core.report.sheet import build_sheet

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"


def test_a_varying_load_shows_both_ends():
    d = json.loads(DEMO.read_text())
    d["beam"]["loads"].append({"case": "D", "type": "line", "value": "50 plf",
                               "value_end": "150 plf", "from": "2 ft", "to": "9 ft",
                               "description": "tapered load (invented)"})
    d["beam"]["loads"].append({"case": "L", "type": "area", "value": "20 psf",
                               "value_end": "40 psf", "tributary_width": "2 ft",
                               "from": "1 ft", "to": "5 ft"})
    buf = io.BytesIO()
    build_sheet(loads(json.dumps(d)), buf)
    text = "\n".join(p.extract_text() for p in PdfReader(io.BytesIO(buf.getvalue())).pages)
    assert "50 plf \u2192 150 plf" in text  # the value as entered
    assert "50.00 plf \u2192 150.0 plf" in text  # the line load
    assert "20 psf \u2192 40 psf" in text
    assert "40.00 plf \u2192 80.00 plf" in text  # q s at each end: 20 x 2, 40 x 2
