"""The calculation sheet: a PDF a reviewer can follow by hand.

Built with reportlab's flowables and tables (real, selectable text in an embedded
TrueType font, DejaVu Sans from assets/fonts) and reportlab vector graphics for the
drawings and plots. Every page carries the title block with "page X of Y".
"""

from __future__ import annotations

import datetime as _dt
import io
from dataclasses import replace
from pathlib import Path
from typing import Any

from reportlab.lib import colors
from reportlab.lib.pagesizes import A4, LETTER
from reportlab.lib.units import mm
from reportlab.pdfbase import pdfmetrics
from reportlab.pdfbase.ttfonts import TTFont
from reportlab.pdfgen import canvas as rl_canvas
from reportlab.platypus import SimpleDocTemplate

from .. import __version__
from ..io.resources import read_bytes
from ..model.errors import Problem, ProjectError
from ..model.project import Project
from ..pipeline import Analysis, run
from .content import story

PAPERS = {"letter": LETTER, "a4": A4}
TITLE_BLOCK_HEIGHT = 22 * mm


def _register_fonts() -> None:
    if "PlyStackSans" in pdfmetrics.getRegisteredFontNames():
        return
    regular = read_bytes("fonts/DejaVuSans.ttf", "the sheet's font")
    bold = read_bytes("fonts/DejaVuSans-Bold.ttf", "the sheet's bold font")
    pdfmetrics.registerFont(TTFont("PlyStackSans", io.BytesIO(regular)))
    pdfmetrics.registerFont(TTFont("PlyStackSans-Bold", io.BytesIO(bold)))
    pdfmetrics.registerFontFamily("PlyStackSans", normal="PlyStackSans",
                                  bold="PlyStackSans-Bold", italic="PlyStackSans",
                                  boldItalic="PlyStackSans-Bold")



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
                super().showPage()
            super().save()

        def _draw_block(self, total: int) -> None:
            w, h = paper
            x0, y0 = 15 * mm, h - 12 * mm - TITLE_BLOCK_HEIGHT
            bw = w - 30 * mm
            row = 7 * mm
            self.setLineWidth(0.6)
            self.rect(x0, y0, bw, TITLE_BLOCK_HEIGHT)
            self.line(x0, y0 + TITLE_BLOCK_HEIGHT - row, x0 + bw, y0 + TITLE_BLOCK_HEIGHT - row)
            c1, c2 = x0 + bw * 0.40, x0 + bw * 0.75
            self.line(c1, y0, c1, y0 + TITLE_BLOCK_HEIGHT - row)
            self.line(c2, y0, c2, y0 + TITLE_BLOCK_HEIGHT - row)
            self.setFont("PlyStackSans-Bold", 9)
            title = project.title
            while title and pdfmetrics.stringWidth(title, "PlyStackSans-Bold", 9) > bw - 4 * mm:
                title = title[:-2]
            if title != project.title:
                title = title[:-1] + "\u2026"
            self.drawString(x0 + 2 * mm, y0 + TITLE_BLOCK_HEIGHT - 5 * mm, title)
            self.setFont("PlyStackSans", 7.5)
            mid = y0 + (TITLE_BLOCK_HEIGHT - row) / 2
            self.drawString(x0 + 2 * mm, mid + 1.5 * mm, f"Member: {info.get('member', '')}")
            self.drawString(x0 + 2 * mm, y0 + 2 * mm,
                            f"Plystack {__version__} \u2014 calculation sheet")
            self.drawString(c1 + 2 * mm, mid + 1.5 * mm,
                            f"Prepared by: {info.get('prepared_by', '')}")
            self.drawString(c1 + 2 * mm, y0 + 2 * mm, "Checked by: ______________________")
            self.drawString(c2 + 2 * mm, mid + 1.5 * mm,
                            f"Date: {date}   Revision: {info.get('revision', '')}")
            self.setFont("PlyStackSans-Bold", 9)
            self.drawString(c2 + 2 * mm, y0 + 2 * mm, f"page {self._pageNumber} of {total}")
            self.setStrokeColor(colors.black)

    return TitledCanvas


def analysis_for(project: Project, alternative: str | None) -> Analysis:
    """The analysis of the project (or of one of its alternatives)."""
    if alternative is not None:
        alt = next((a for a in project.alternatives if a.name == alternative), None)
        if alt is None:
            names = ", ".join(f'"{a.name}"' for a in project.alternatives) or "none"
            raise ProjectError(Problem("--alternative", f'"{alternative}" is not an '
                                       f"alternative of this project ({names})"))
        project = replace(project.with_plies(alt.plies),
                          title=f"{project.title} \u2014 {alt.name}")
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
    _register_fonts()
    size = PAPERS[paper]
    buffer = io.BytesIO()
    doc = SimpleDocTemplate(buffer, pagesize=size, leftMargin=15 * mm, rightMargin=15 * mm,
                            topMargin=16 * mm + TITLE_BLOCK_HEIGHT, bottomMargin=14 * mm,
                            title=f"{a.project.title} \u2014 calculation sheet",
                            author=a.project.info.get("prepared_by", ""),
                            creator=f"Plystack {__version__}")
    counter: list[int] = []
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
