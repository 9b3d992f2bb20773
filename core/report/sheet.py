"""The calculation sheet: a PDF a reviewer can follow by hand.

Built with reportlab's flowables and tables (real, selectable text in an embedded
TrueType font, DejaVu Sans from assets/fonts) and reportlab vector graphics for the
drawings and plots. Every page carries the title block with "page X of Y".
"""

from __future__ import annotations

import datetime as _dt
import gc
import io
from collections.abc import Iterator
from contextlib import contextmanager
from dataclasses import replace
from functools import lru_cache
from pathlib import Path
from typing import Any

from reportlab import rl_config
from reportlab.lib import colors
from reportlab.lib.pagesizes import A4, LETTER
from reportlab.lib.units import mm
from reportlab.lib.utils import simpleSplit
from reportlab.pdfbase import pdfmetrics
from reportlab.pdfgen import canvas as rl_canvas
from reportlab.platypus import SimpleDocTemplate

from .. import __version__
from ..model.caution import CAUTION
from ..model.errors import Problem, ProjectError, named_under
from ..model.project import Project
from ..pipeline import Analysis, run
from .content import story
from .fonts import drawable, register_fonts

PAPERS = {"letter": LETTER, "a4": A4}
TITLE_BLOCK_HEIGHT = 32 * mm


def _fit(text: str, font: str, size: float, width: float, lines: int = 1) -> tuple[str, ...]:
    """:func:`_fit_drawn` of the text as the font can draw it."""
    return _fit_drawn(drawable(text), font, size, width, lines)


def _by_characters(lines: list[str], font: str, size: float, width: float) -> list[str]:
    """``lines`` with every line wider than ``width`` broken between characters."""
    out: list[str] = []
    for line in lines:
        rest = line
        while rest and pdfmetrics.stringWidth(rest, font, size) > width:
            k = len(rest)
            while k > 1 and pdfmetrics.stringWidth(rest[:k], font, size) > width:
                k -= 1
            out.append(rest[:k])
            rest = rest[k:]
        out.append(rest)
    return out


@lru_cache(maxsize=256)
def _fit_drawn(text: str, font: str, size: float, width: float, lines: int = 1
               ) -> tuple[str, ...]:
    """``text`` wrapped to at most ``lines`` lines of ``width``, the last one ellipsized
    (remembered: every page's title block sets the same texts).
    """
    wrapped = simpleSplit(text, font, size, width) or [""]
    if any(pdfmetrics.stringWidth(t, font, size) > width for t in wrapped):
        wrapped = _by_characters(wrapped, font, size, width)  # a word longer than the box
    if len(wrapped) <= lines:
        return tuple(wrapped)
    kept = wrapped[:lines]
    last = kept[-1]
    while last and pdfmetrics.stringWidth(last + "\u2026", font, size) > width:
        last = last[:-1]
    kept[-1] = last.rstrip() + "\u2026"
    return tuple(kept)


@lru_cache(maxsize=8)
def _footer_lines(width: float) -> tuple[str, ...]:
    """The caution note of the footer wrapped to ``width`` (the same on every page)."""
    return tuple(simpleSplit(CAUTION, "PlyStackSans", 6, width))


def _title_block_maker(project: Project, paper: tuple[float, float],
                       counter: list[int]) -> type:
    info = project.info
    date = info.get("date") or _dt.date.today().isoformat()

    class TitledCanvas(rl_canvas.Canvas):  # type: ignore[misc]
        """Canvas that holds pages back to write 'page X of Y' and the title block."""

        def __init__(self, *args: Any, **kwargs: Any) -> None:
            kwargs["initialFontName"] = kwargs.get("initialFontName") or "PlyStackSans"
            super().__init__(*args, **kwargs)
            self._pages: list[dict[str, Any]] = []

        def showPage(self) -> None:
            self._pages.append(dict(self.__dict__))
            self._startPage()

        def save(self) -> None:
            total = len(self._pages)
            counter.append(total)
            for state in self._pages:
                self.__dict__.update(state)
                self._draw_block(total)
                self._draw_footer()
                super().showPage()
            super().save()

        def _text(self, x: float, y: float, label: str, value: str, width: float,
                  size: float = 7.2) -> None:
            self.setFont("PlyStackSans", size)
            self.drawString(x, y, _fit(label + value, "PlyStackSans", size, width)[0])

        def _draw_block(self, total: int) -> None:
            w, h = paper
            x0, y0 = 15 * mm, h - 10 * mm - TITLE_BLOCK_HEIGHT
            bw = w - 30 * mm
            seal = 38 * mm
            left = bw - seal
            top = y0 + TITLE_BLOCK_HEIGHT
            r1, r2, r3 = top - 8 * mm, top - 14 * mm, top - 23 * mm
            pad = 1.8 * mm
            self.setLineWidth(0.6)
            self.rect(x0, y0, bw, TITLE_BLOCK_HEIGHT)
            self.setLineWidth(0.4)
            for yy in (r1, r2, r3):
                self.line(x0, yy, x0 + left, yy)
            self.line(x0 + left, y0, x0 + left, top)
            c_mid = x0 + left * 0.36
            self.line(c_mid, r1, c_mid, r3)
            quarters = [x0 + left * f for f in (0.27, 0.50, 0.68, 0.82)]
            for xx in quarters:
                self.line(xx, y0, xx, r3)
            one = _fit(project.title, "PlyStackSans-Bold", 9.5, left - 2 * pad)
            if not one[0].endswith("\u2026"):
                self.setFont("PlyStackSans-Bold", 9.5)
                self.drawString(x0 + pad, r1 + 2.6 * mm, one[0])
            else:
                self.setFont("PlyStackSans-Bold", 7.6)
                two = _fit(project.title, "PlyStackSans-Bold", 7.6, left - 2 * pad, 2)
                for k, line in enumerate(two):
                    self.drawString(x0 + pad, r1 + (4.6 - 3.1 * k) * mm, line)
            self._text(x0 + pad, r2 + 1.9 * mm, "Job: ", info.get("job", ""),
                       c_mid - x0 - 2 * pad)
            self._text(c_mid + pad, r2 + 1.9 * mm, "Address: ", info.get("address", ""),
                       x0 + left - c_mid - 2 * pad)
            self._text(x0 + pad, r3 + 5.4 * mm, "Member: ", info.get("member", ""),
                       c_mid - x0 - 2 * pad)
            self.setFont("PlyStackSans", 6.3)
            self.drawString(x0 + pad, r3 + 1.8 * mm, f"Plystack {__version__} calculation sheet")
            self.drawString(c_mid + pad, r3 + 6.6 * mm, "Description:")
            desc = _fit(info.get("description", ""), "PlyStackSans", 6.3,
                        x0 + left - c_mid - 2 * pad - 14 * mm, 3)
            for k, line in enumerate(desc):
                self.drawString(c_mid + pad + 14 * mm, r3 + (6.6 - 2.5 * k) * mm, line)
            checked = info.get("checked_by", "") or "______________"
            cells = [("Prepared by:", info.get("prepared_by", "")), ("Checked by:", checked),
                     ("Date:", date), ("Revision:", info.get("revision", "")),
                     ("Page:", f"page {self._pageNumber} of {total}")]
            edges = [x0, *quarters, x0 + left]
            for (lab, val), xa, xb in zip(cells, edges[:-1], edges[1:], strict=False):
                self.setFont("PlyStackSans", 6.3)
                self.drawString(xa + pad, r3 - 2.8 * mm, lab)
                self.setFont("PlyStackSans-Bold", 7.5)
                self.drawString(xa + pad, y0 + 2.2 * mm,
                                _fit(val, "PlyStackSans-Bold", 7.5, xb - xa - 2 * pad)[0])
            self.setFont("PlyStackSans", 6.3)
            self.drawString(x0 + left + pad, top - 3.4 * mm, "Seal and signature")
            licence = _fit(f"Licence No.: {info.get('licence', '')}", "PlyStackSans", 6.3,
                           seal - 2 * pad, 2)
            for k, line in enumerate(licence):
                self.drawString(x0 + left + pad, y0 + (1.8 + 2.5 * (len(licence) - 1 - k)) * mm,
                                line)
            self.setStrokeColor(colors.black)

        def _draw_footer(self) -> None:
            w, _ = paper
            self.setFont("PlyStackSans", 6)
            self.setFillColor(colors.Color(0.3, 0.3, 0.3))
            for k, line in enumerate(_footer_lines(w - 30 * mm)):
                self.drawString(15 * mm, 9 * mm - k * 2.6 * mm, line)
            self.setFillColor(colors.black)

    return TitledCanvas


@contextmanager
def _cycles_collected_after() -> Iterator[None]:
    """Python's cycle collector paused while the sheet is set: reportlab makes many
    short-lived objects and the collector's passes over them take about a tenth of the
    time; reference counting still frees them, and the collector runs as usual after.
    """
    was_enabled = gc.isenabled()
    gc.disable()
    try:
        yield
    finally:
        if was_enabled:
            gc.enable()


@contextmanager
def _streams_without_base85() -> Iterator[None]:
    """The PDF's compressed streams written as binary, not also ASCII85-encoded (reportlab's
    ``rl_config.useA85``, read when the pages and fonts are written): the same content
    once decoded, a smaller file, and without the pure-Python encoder (about a twelfth of
    the sheet's build). Restored after.
    """
    was = rl_config.useA85
    rl_config.useA85 = 0
    try:
        yield
    finally:
        rl_config.useA85 = was


def analysis_for(project: Project, alternative: str | None) -> Analysis:
    """The analysis of the project (or of one of its alternatives)."""
    where = None
    if alternative is not None:
        k, alt = project.alternative_named(alternative)
        project = replace(project.with_plies(alt.plies),
                          title=f"{project.title} \u2014 {alt.name}")
        where = f"alternatives[{k}]"
    with named_under(where):
        a = run(project)
    if a.beam is None or not a.checks:
        raise ProjectError(Problem("beam", "the project has no beam with checks; a calculation "
                                   "sheet needs spans, supports and loads"))
    return a


def build_sheet(project: Project, out: str | Path | io.BytesIO, paper: str = "letter",
                alternative: str | None = None) -> int:
    """Write the calculation sheet; returns the page count.

    Raises:
        ProjectError: the project cannot be analysed (nothing is written).

    """
    if paper not in PAPERS:
        raise ProjectError(Problem("--paper", f'"{paper}" must be letter or a4'))
    a = analysis_for(project, alternative)
    register_fonts()
    size = PAPERS[paper]
    buffer = io.BytesIO()
    doc = SimpleDocTemplate(buffer, pagesize=size, leftMargin=15 * mm, rightMargin=15 * mm,
                            topMargin=14 * mm + TITLE_BLOCK_HEIGHT, bottomMargin=14 * mm,
                            title=f"{a.project.title} \u2014 calculation sheet",
                            author=a.project.info.get("prepared_by", ""),
                            creator=f"Plystack {__version__}")
    counter: list[int] = []
    with _cycles_collected_after(), _streams_without_base85():
        doc.build(story(a, project, size[0] - 30 * mm),
                  canvasmaker=_title_block_maker(a.project, size, counter))
    data = buffer.getvalue()
    if isinstance(out, io.BytesIO):
        out.write(data)
    else:
        target = Path(out)
        tmp = target.with_name(f".{target.name}.tmp")
        tmp.write_bytes(data)
        tmp.replace(target)
    return counter[-1]
