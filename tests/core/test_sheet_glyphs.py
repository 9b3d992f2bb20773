"""Text the sheet's font cannot draw is written as its code point, never an empty box
(two names differing only there would look alike to a reviewer), and the sheet says so.
"""

from __future__ import annotations

import io
from dataclasses import replace
from pathlib import Path

from pypdf import PdfReader
from reportlab.pdfbase import pdfmetrics

from plystack.core.io.project_file import load
from plystack.core.report.fonts import BOLD, FONT, drawable, register_fonts, undrawn
from plystack.core.report.sheet import build_sheet

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"


def test_drawable_keeps_what_both_faces_draw():
    register_fonts()
    for name in (FONT, BOLD):  # DejaVu Sans has Latin, Greek, Cyrillic and these signs
        glyphs = pdfmetrics.getFont(name).face.charToGlyph
        assert all(ord(c) in glyphs for c in "é ß Ω ж ° ± × ≤ — ·")
    assert drawable("plain 2x10") == "plain 2x10"
    assert drawable("Träger Ω ≤ 1 — ok") == "Träger Ω ≤ 1 — ok"
    assert drawable("左 joist") == "[U+5DE6] joist"
    assert drawable("右 joist") == "[U+53F3] joist"  # distinct names stay distinct
    assert drawable("🏠 a\nb") == "[U+1F3E0] a\nb"
    assert undrawn("左右左 🏠") == ["左", "右", "🏠"]


def test_the_sheet_writes_code_points_and_says_so():
    p = load(DEMO)
    plies = list(p.plies)
    plies[0] = replace(plies[0], name="左 joist")
    p = replace(p.with_plies(tuple(plies)), title="Porch 梁 header 🏠",
                design=replace(p.design, overrides={}))
    buf = io.BytesIO()
    build_sheet(p, buf)
    text = "\n".join(page.extract_text() for page in PdfReader(io.BytesIO(buf.getvalue())).pages)
    assert "Porch [U+6881] header [U+1F3E0]" in text
    assert "[U+5DE6]" in text
    assert "左" not in text and "梁" not in text
    squashed = " ".join(text.split())
    assert ("The sheet's font cannot draw some characters of the project's text (U+6881, "
            "U+1F3E0, U+5DE6)") in squashed  # in the order of the file: title, then plies
    plain = io.BytesIO()
    build_sheet(load(DEMO), plain)
    assert "cannot draw" not in "\n".join(
        page.extract_text() for page in PdfReader(io.BytesIO(plain.getvalue())).pages)


def test_title_block_texts_fit_their_boxes_even_without_spaces():
    """A title of one long word ran over the seal box and off the page; a long licence
    number ran past the seal box."""
    from plystack.core.report.sheet import _fit

    register_fonts()
    width = 300.0
    for text, lines in (("W" * 200, 2), ("Licence No.: PE-123456789 State of Washington", 2),
                        ("x" * 50 + " " + "y" * 80, 1)):
        out = _fit(text, BOLD, 9.5, width, lines)
        assert 1 <= len(out) <= lines
        assert all(pdfmetrics.stringWidth(t, BOLD, 9.5) <= width for t in out), out
        joined = "".join(out).replace("\u2026", "")
        assert text.replace(" ", "").startswith(joined.replace(" ", ""))
