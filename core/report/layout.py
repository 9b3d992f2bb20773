"""Paragraph styles and tables of the calculation sheet.

Tables size their columns from their content: no column is narrower than its widest
unbreakable piece (a number with its unit is one piece, joined by a no-break space), so
no cell ever wraps a unit away from its number or splits a word.
"""

from __future__ import annotations

from functools import lru_cache
from typing import Any
from weakref import WeakKeyDictionary

from reportlab import rl_config
from reportlab.lib import colors
from reportlab.lib.enums import TA_LEFT, TA_RIGHT
from reportlab.lib.styles import ParagraphStyle
from reportlab.lib.units import mm
from reportlab.pdfbase.pdfmetrics import stringWidth as _string_width
from reportlab.platypus import Flowable, Paragraph, Table, TableStyle
from reportlab.platypus.paragraph import split as _paragraph_words

from .fonts import BOLD as BOLD
from .fonts import FONT as FONT
from .fonts import drawable

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


@lru_cache(maxsize=8192)
def stringWidth(text: str, font: str, size: float, encoding: str = "utf8") -> float:
    """The width of ``text`` in a registered font (reportlab's), remembered: the sheet measures
    the same words and numbers many times, and a font's metrics do not change once it
    is registered.
    """
    return float(_string_width(text, font, size, encoding))


def esc(text: str) -> str:
    """Text for a reportlab paragraph (markup characters escaped)."""
    return text.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;")


def para(text: str, style: ParagraphStyle = BODY) -> Any:
    """A paragraph of plain text (a :class:`TextLine`, which sets it exactly as a
    reportlab Paragraph would).
    """
    return TextLine(text, style)


#: :func:`_plain_style` of each style met (styles are made once and not changed).
_PLAIN_STYLES: WeakKeyDictionary[ParagraphStyle, bool] = WeakKeyDictionary()


def _plain_style(style: ParagraphStyle) -> bool:
    """Whether a Paragraph of ``style`` sets one line of plain text as :class:`TextLine`
    does: left or right aligned, no background, border, word-wrap mode, shaping, text
    transform, end dots, hyphenation, underline, strike-through or automatic leading.
    """
    known = _PLAIN_STYLES.get(style)
    if known is None:
        known = _PLAIN_STYLES[style] = _plain_style_of(style)
    return known


def _plain_style_of(style: ParagraphStyle) -> bool:
    def value(name: str) -> Any:
        return getattr(style, name, None)

    return (value("alignment") in (TA_LEFT, TA_RIGHT)
            and not (value("borderWidth") and value("borderColor"))
            and not any(value(name) for name in ("backColor", "wordWrap", "shaping",
                                                 "textTransform", "endDots",
                                                 "hyphenationLang", "underline", "strike"))
            and value("autoLeading") in ("", "off", None))


#: The text operators :meth:`TextLine.draw` wrote, per PDF document and per line drawn
#: (text, font, size, leading, origin, offset, direction of y): the same line drawn again
#: in the same document gives the same operators (the font's subset already holds its
#: characters), so they are written again without setting the text again.
_TEXT_CODES: WeakKeyDictionary[Any, dict[tuple[Any, ...], str]] = WeakKeyDictionary()


class TextLine(Flowable):  # type: ignore[misc]
    """Plain text that a reportlab Paragraph of the same style would set on one line,
    drawn with the same text operators at the same place, without parsing markup or
    breaking lines; text that needs more than one line (or a style this does not
    reproduce) is handed to a real Paragraph, built when first needed.

    Mirrors reportlab's Paragraph (``breakLines`` and ``drawPara``, the single-fragment
    case): the line's width is summed word by word as Paragraph sums it, the baseline
    is ``leading - fontSize`` below the top (``rl_config.paraFontSizeHeightOffset``),
    and a right-aligned line is moved by the same unused width. tests/core/
    test_sheet_text_line.py compares the drawn bytes with Paragraph's.
    """

    def __init__(self, text: str, style: ParagraphStyle) -> None:
        text = drawable(text)
        self.text = text
        self.style = style
        self.encoding = "utf8"
        self._paragraph: Any = None
        self._line_width: float | None = None
        self._extra = 0.0
        self._delegate: Any = None
        self._wrapped_at = -1.0
        words = _paragraph_words(text)
        self._words = words
        # an escaped & < > makes the Paragraph's parser split the text into fragments,
        # a soft hyphen allows a break: both are left to the Paragraph
        self._plain = (bool(text) and " ".join(words) == text
                       and not any(ch in text for ch in "&<>\xad")
                       and rl_config.paraFontSizeHeightOffset and _plain_style(style))

    def paragraph(self) -> Paragraph:
        """The reportlab Paragraph of the same text and style."""
        if self._paragraph is None:
            self._paragraph = Paragraph(esc(self.text), self.style)
        return self._paragraph

    def _width(self) -> float:
        """The line's width, summed as Paragraph.breakLines sums it."""
        if self._line_width is None:
            st = self.style
            space = stringWidth(" ", st.fontName, st.fontSize, self.encoding)
            current = -space
            for word in self._words:
                current = current + space + stringWidth(word, st.fontName, st.fontSize,
                                                        self.encoding)
            self._line_width = current
        return self._line_width

    def wrap(self, availWidth: float, availHeight: float) -> tuple[float, float]:
        """One line of the style's leading where the text fits, else the Paragraph's."""
        st = self.style
        first = availWidth - (st.leftIndent + st.firstLineIndent) - st.rightIndent
        if not self._plain or availWidth < rl_config._FUZZ or self._width() > first:
            paragraph = self.paragraph()
            if self._delegate is not paragraph or self._wrapped_at != availWidth:
                # a Paragraph's lines depend on the width alone: set again only when
                # the width changes
                self.width, self.height = paragraph.wrap(availWidth, availHeight)
                self._delegate, self._wrapped_at = paragraph, availWidth
            return self.width, self.height
        self._delegate = None
        self._extra = first - self._width()
        self.width, self.height = availWidth, st.leading
        return availWidth, st.leading

    def split(self, availWidth: float, availHeight: float) -> list[Any]:
        """As the Paragraph splits (a line that does not fit moves on whole). Splitting
        may drop the Paragraph's lines, so the next wrap sets them again.
        """
        parts: list[Any] = self.paragraph().split(availWidth, availHeight)
        self._delegate, self._wrapped_at = None, -1.0
        return parts

    def minWidth(self) -> float:
        """The Paragraph's minimum width."""
        return float(self.paragraph().minWidth())

    def draw(self) -> None:
        """Draw the line as Paragraph.drawPara draws one line of one fragment."""
        if self._delegate is not None:
            self._delegate.canv = self.canv
            try:
                self._delegate.draw()
            finally:
                del self._delegate.canv
            return
        canvas, st = self.canv, self.style
        canvas.saveState()
        canvas.setFillColor(st.textColor)
        offset = st.firstLineIndent + (self._extra if st.alignment == TA_RIGHT else 0)
        key = (self.text, st.fontName, st.fontSize, st.leading, st.leftIndent,
               self.height - st.fontSize, offset, canvas.bottomup)
        drawn = _TEXT_CODES.get(canvas._doc)
        if drawn is None:
            drawn = _TEXT_CODES[canvas._doc] = {}
        code = drawn.get(key)
        if code is None:
            tx = canvas.beginText(st.leftIndent, self.height - st.fontSize)
            tx.preformatted = False
            tx.direction = None
            tx.setFont(st.fontName, st.fontSize, st.leading)
            _x_move(tx, offset)
            tx._textOut(self.text, 1)
            _x_move(tx, -offset)
            code = drawn[key] = str(tx.getCode())
        canvas._code.append(code)  # as canvas.drawText(tx) appends it
        canvas.restoreState()

    def getPlainText(self) -> str:
        """The text, as Paragraph.getPlainText gives it."""
        return str(self.paragraph().getPlainText())


def _x_move(tx: Any, dx: float) -> None:
    """Move the text position by ``dx`` as Paragraph does (not at all when tiny)."""
    if dx > 1e-6 or dx < -1e-6:
        tx.setXPos(dx)


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


@lru_cache(maxsize=64)
def _cell_style(font: str, font_size: float, alignment: int) -> ParagraphStyle:
    """The paragraph style of a table cell (styles are not changed once made)."""
    return ParagraphStyle(f"cell-{font}-{font_size:g}-{alignment}", fontName=font,
                          fontSize=font_size, leading=font_size + 1.8, alignment=alignment)


def table(rows: list[list[Any]], width: float, header: bool = True, font_size: float = 7.2,
          align_right: tuple[int, ...] = (), widths: list[float] | None = None) -> Table:
    """A gridded table of text cells, the header row repeated on every page."""
    text_rows = [[str(c) for c in row] for row in rows]
    cols = widths or column_widths(text_rows, font_size, width, header)
    cells = [[TextLine(c, _cell_style(BOLD if (k == 0 and header) else FONT, font_size,
                                      2 if (j in align_right and k > 0) else 0))
              for j, c in enumerate(row)] for k, row in enumerate(text_rows)]
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
