"""The sheet's font (DejaVu Sans, bundled) and the text it can draw.

A character the font has no glyph for would be set as an empty box, so that two names
differing only there ("左 joist", "右 joist") would look the same to a reviewer. Such a
character is written as its code point instead ("[U+5DE6] joist"); the sheet then says
so (:func:`undrawn`). The file and the desktop program keep the text as typed.
"""

from __future__ import annotations

import io
from typing import Any

from reportlab.graphics.shapes import String
from reportlab.pdfbase import pdfmetrics
from reportlab.pdfbase.ttfonts import TTFont

from ..io.resources import read_bytes

FONT = "PlyStackSans"
BOLD = "PlyStackSans-Bold"

_DRAWN: list[frozenset[int]] = []


def register_fonts() -> None:
    """Register the regular and bold faces with reportlab (once)."""
    if FONT in pdfmetrics.getRegisteredFontNames():
        return
    regular = read_bytes("fonts/DejaVuSans.ttf", "the sheet's font")
    bold = read_bytes("fonts/DejaVuSans-Bold.ttf", "the sheet's bold font")
    pdfmetrics.registerFont(TTFont(FONT, io.BytesIO(regular)))
    pdfmetrics.registerFont(TTFont(BOLD, io.BytesIO(bold)))
    pdfmetrics.registerFontFamily(FONT, normal=FONT, bold=BOLD, italic=FONT, boldItalic=BOLD)


def _drawn() -> frozenset[int]:
    """The code points both faces have glyphs for."""
    if not _DRAWN:
        register_fonts()
        faces = [pdfmetrics.getFont(name).face.charToGlyph for name in (FONT, BOLD)]
        _DRAWN.append(frozenset(faces[0]).intersection(faces[1]))
    return _DRAWN[0]


def undrawn(text: str) -> list[str]:
    """The characters of ``text`` the font cannot draw, each once, in order (line breaks
    and tabs are layout, not glyphs).
    """
    if text.isascii():
        return []
    drawn = _drawn()
    return list(dict.fromkeys(c for c in text if ord(c) not in drawn and c not in "\n\t\r"))


def drawable(text: str) -> str:
    """``text`` with every character the font cannot draw written as ``[U+XXXX]``."""
    missing = undrawn(text)
    if not missing:
        return text
    return "".join(f"[U+{ord(c):04X}]" if c in missing else c for c in text)


def drawn_string(x: float, y: float, text: str, **kw: Any) -> String:
    """A reportlab drawing's String of the text as the font can draw it."""
    return String(x, y, drawable(text), **kw)
