"""The sheet's plain text lines (``layout.TextLine``) set text exactly as reportlab's
Paragraph of the same text and style does.

Source: reportlab's Paragraph itself, the reference the sheet used before. Each case
draws the same text both ways on a canvas with ``invariant=1`` and no compression and
compares the PDF bytes: same size from ``wrap``, same text operators, same places. A
whole document of mixed text (page breaks, keep-with-next headings, tables with
repeated headers) is compared the same way.
"""

from __future__ import annotations

import io

import pytest
from reportlab.lib.units import mm
from reportlab.pdfgen.canvas import Canvas
from reportlab.platypus import Paragraph, SimpleDocTemplate, Table

from plystack.core.report import layout
from plystack.core.report.fonts import register_fonts as _register_fonts
from plystack.core.report.layout import (
    BODY,
    CAUTION_STYLE,
    EQ,
    H1,
    H2,
    SMALL,
    WHERE,
    TextLine,
    esc,
)

TEXTS = [
    "Assumptions:",
    "9.25\u00a0in",
    "1,600,000\u00a0psi \u00d7 123.4\u00a0in\u2074 = 197.4\u00a0\u00d7\u00a010\u2076",
    "\u2022 Plies act together (full composite action).",
    "M = 12.5\u00a0kip\u00b7ft",
    "f_b = M / S = 1,234 psi <= F'b = 1,500 psi",  # markup characters: Paragraph
    "a & b",
    "two  spaces",  # collapsed by Paragraph
    " leading space",
    "trailing space ",
    "soft\u00adhyphen",
    "",
    "Averyveryverylongwordthatcannotfitinanarrowcolumnatallwhatsoever",
    "A long sentence of many words that needs more than one line in a narrow column "
    "and wraps at the spaces between its words.",
]
STYLES = [BODY, SMALL, EQ, WHERE, H1, H2, CAUTION_STYLE, layout._cell_style(layout.FONT, 7.2, 0),
          layout._cell_style(layout.FONT, 6.6, 2), layout._cell_style(layout.BOLD, 6.8, 0)]
WIDTHS = [30.0, 61.3, 180.0, 500.0]


def _drawn(flowable: object, width: float) -> tuple[tuple[float, float], bytes]:
    _register_fonts()
    buf = io.BytesIO()
    canvas = Canvas(buf, invariant=1, pageCompression=0)
    size = flowable.wrapOn(canvas, width, 700)
    flowable.drawOn(canvas, 40, 300)
    canvas.showPage()
    canvas.save()
    return size, buf.getvalue()


@pytest.mark.parametrize("style", STYLES, ids=lambda s: s.name)
def test_text_line_draws_as_paragraph(style):
    _register_fonts()  # before any Paragraph reads its font family
    for text in TEXTS:
        for width in WIDTHS:
            ref = _drawn(Paragraph(esc(text), style), width)
            assert _drawn(TextLine(text, style), width) == ref, (text, style.name, width)


def test_one_line_texts_skip_the_paragraph():
    """The plain line is taken where it fits; text that does not fit, markup
    characters, irregular spaces and boxed styles go to a Paragraph."""
    _register_fonts()
    line = TextLine("9.25\u00a0in", BODY)
    line.wrap(100, 100)
    assert line._paragraph is None
    for text, style, width in [("f <= g", BODY, 500), ("two  spaces", BODY, 500),
                               ("Assumptions:", CAUTION_STYLE, 500),
                               (TEXTS[-1], BODY, 100)]:
        line = TextLine(text, style)
        line.wrap(width, 100)
        assert line._paragraph is not None, text


def _document(make) -> bytes:
    _register_fonts()
    story = []
    for k in range(30):
        story.append(make(f"{k + 1}  Heading of part {k + 1}", H1))
        story.append(make("Sub-heading", H2))
        for text in TEXTS:
            story.append(make(text, BODY))
        rows = [[make(f"r{r}c{c} {TEXTS[(r + c) % 5]}", layout._cell_style(
            layout.BOLD if r == 0 else layout.FONT, 7.2, 2 if c else 0)) for c in range(4)]
            for r in range(12)]
        story.append(Table(rows, colWidths=[40 * mm, 30 * mm, 50 * mm, 60 * mm], repeatRows=1,
                           hAlign="LEFT"))
    buf = io.BytesIO()
    SimpleDocTemplate(buf, invariant=1, pageCompression=0).build(story)
    return buf.getvalue()


def test_documents_are_the_same():
    _register_fonts()

    def paragraph(text, style):
        return Paragraph(esc(text), style)

    assert _document(TextLine) == _document(paragraph)


def _long_paragraphs(make) -> bytes:
    """Paragraphs of 1 to 12 lines one after another, so that page ends fall at every
    line of them: split, moved on whole (orphan control) and set again on the next page.
    """
    _register_fonts()
    base = TEXTS[-1] + " "
    story = [make((base * (1 + k % 7)).strip() + f" ({k})", (BODY, SMALL, EQ, WHERE)[k % 4])
             for k in range(80)]
    buf = io.BytesIO()
    SimpleDocTemplate(buf, invariant=1, pageCompression=0).build(story)
    return buf.getvalue()


def test_split_paragraphs_are_the_same():
    _register_fonts()

    def paragraph(text, style):
        return Paragraph(esc(text), style)

    assert _long_paragraphs(TextLine) == _long_paragraphs(paragraph)


def test_a_paragraph_moved_on_whole_is_set_again():
    """A split that finds no room (reportlab drops the lines it had set) is followed
    by a wrap that sets them again."""
    _register_fonts()
    line = TextLine(TEXTS[-1], BODY)
    width, height = line.wrap(100, 500)
    assert line.split(100, BODY.leading * 1.5) == []
    assert line.wrap(100, 500) == (width, height)
    assert _drawn(line, 100) == _drawn(Paragraph(esc(TEXTS[-1]), BODY), 100)
