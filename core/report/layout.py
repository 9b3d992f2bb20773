"""Paragraph styles and tables of the calculation sheet.

Tables size their columns from their content: no column is narrower than its widest
unbreakable piece (a number with its unit is one piece, joined by a no-break space), so
no cell ever wraps a unit away from its number or splits a word.
"""

from __future__ import annotations

from typing import Any

from reportlab.lib import colors
from reportlab.lib.styles import ParagraphStyle
from reportlab.lib.units import mm
from reportlab.pdfbase.pdfmetrics import stringWidth
from reportlab.platypus import Paragraph, Table, TableStyle

FONT = "PlyStackSans"
BOLD = "PlyStackSans-Bold"
BODY = ParagraphStyle("body", fontName=FONT, fontSize=8.5, leading=11)
SMALL = ParagraphStyle("small", fontName=FONT, fontSize=7, leading=9)
EQ = ParagraphStyle("eq", fontName=FONT, fontSize=8, leading=10.5, leftIndent=6 * mm,
                    firstLineIndent=-3 * mm)
WHERE = ParagraphStyle("where", parent=EQ, fontSize=7.2, leading=9.2,
                       textColor=colors.Color(0.18, 0.18, 0.18))
H1 = ParagraphStyle("h1", fontName=BOLD, fontSize=11.5, leading=15, spaceBefore=6,
                    spaceAfter=4, keepWithNext=1)
H2 = ParagraphStyle("h2", fontName=BOLD, fontSize=9.5, leading=12, spaceBefore=5,
                    spaceAfter=2, keepWithNext=1)
H3 = ParagraphStyle("h3", fontName=BOLD, fontSize=8.5, leading=11, spaceBefore=5,
                    spaceAfter=1, keepWithNext=1)
CAUTION_STYLE = ParagraphStyle("caution", parent=BODY, backColor=colors.Color(1, 0.96, 0.84),
                               borderColor=colors.Color(0.6, 0.45, 0.0), borderWidth=0.5,
                               borderPadding=4, spaceBefore=6, spaceAfter=6)
PAD = 2.0


def esc(text: str) -> str:
    """Text for a reportlab paragraph (markup characters escaped)."""
    return text.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;")


def para(text: str, style: ParagraphStyle = BODY) -> Paragraph:
    """A paragraph of plain text."""
    return Paragraph(esc(text), style)


def _pieces(text: str) -> list[str]:
    return [p for p in text.split(" ") if p] or [""]


def column_widths(rows: list[list[str]], font_size: float, width: float,
                  bold_header: bool = True) -> list[float]:
    """Column widths that fit the table in ``width`` without breaking any piece.

    Each column gets at least its widest unbreakable piece; the rest of the width is
    shared in proportion to what each column needs to show its cells on one line.
    """
    ncol = max(len(r) for r in rows)
    least = [0.0] * ncol
    natural = [0.0] * ncol
    for k, row in enumerate(rows):
        font = BOLD if (k == 0 and bold_header) else FONT
        for j, cell in enumerate(row):
            w = stringWidth(cell, font, font_size) + 2 * PAD + 1
            natural[j] = max(natural[j], w)
            widest = max(stringWidth(p, font, font_size) for p in _pieces(cell)) + 2 * PAD + 1
            least[j] = max(least[j], widest)
    if sum(natural) <= width:
        return natural
    spare = width - sum(least)
    if spare <= 0:
        return least
    extra = [n - m for n, m in zip(natural, least, strict=True)]
    total = sum(extra) or 1.0
    return [m + spare * e / total for m, e in zip(least, extra, strict=True)]


def table(rows: list[list[Any]], width: float, header: bool = True, font_size: float = 7.2,
          align_right: tuple[int, ...] = (), widths: list[float] | None = None) -> Table:
    """A gridded table of text cells, the header row repeated on every page."""
    text_rows = [[str(c) for c in row] for row in rows]
    cols = widths or column_widths(text_rows, font_size, width, header)
    cells = []
    for k, row in enumerate(text_rows):
        out = []
        for j, c in enumerate(row):
            style = ParagraphStyle(f"c{j}", fontName=BOLD if (k == 0 and header) else FONT,
                                   fontSize=font_size, leading=font_size + 1.8,
                                   alignment=2 if (j in align_right and k > 0) else 0)
            out.append(Paragraph(esc(c), style))
        cells.append(out)
    t = Table(cells, colWidths=cols, repeatRows=1 if header else 0, hAlign="LEFT")
    style = [("GRID", (0, 0), (-1, -1), 0.3, colors.grey),
             ("FONTNAME", (0, 0), (-1, -1), FONT),
             ("VALIGN", (0, 0), (-1, -1), "TOP"),
             ("LEFTPADDING", (0, 0), (-1, -1), PAD), ("RIGHTPADDING", (0, 0), (-1, -1), PAD),
             ("TOPPADDING", (0, 0), (-1, -1), 1), ("BOTTOMPADDING", (0, 0), (-1, -1), 1.5)]
    if header:
        style.append(("BACKGROUND", (0, 0), (-1, 0), colors.Color(0.88, 0.88, 0.88)))
    t.setStyle(TableStyle(style))
    return t
