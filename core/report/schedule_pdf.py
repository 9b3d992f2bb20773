"""Calculation sheets of a member schedule: one sheet per member, and one combined PDF
whose first page(s) summarise the schedule (reportlab), followed by every member's sheet
(joined with pypdf, one bookmark per mark).
"""

from __future__ import annotations

import datetime as _dt
import io
from collections import Counter
from collections.abc import Sequence
from dataclasses import replace
from pathlib import Path
from typing import Any

from pypdf import PdfReader, PdfWriter
from reportlab.lib import colors
from reportlab.lib.pagesizes import A4, LETTER, landscape
from reportlab.lib.styles import ParagraphStyle
from reportlab.lib.units import mm
from reportlab.platypus import Paragraph, SimpleDocTemplate, Table, TableStyle

from .. import __version__
from ..io.atomic import write_bytes
from ..io.schedule_file import MemberJob, analyse_job, failed
from ..model.caution import ASSUMPTIONS, CAUTION
from ..model.errors import ProjectError
from ..study.schedule import (
    INCOMPLETE,
    NOT_OK,
    VERDICTS,
    MemberResult,
    RowProblem,
    fasteners_text,
    mass_text,
    plates_text,
)
from .fonts import drawable, register_fonts
from .layout import BODY, CAUTION_STYLE, FONT, H1, H2, SMALL
from .sheet import build_sheet

COMBINED = "schedule.pdf"
RED = colors.Color(1.0, 0.84, 0.84)
GREY = colors.Color(0.86, 0.86, 0.86)
CELL = ParagraphStyle("cell", fontName=FONT, fontSize=7, leading=8.6)


def evaluate_with_sheet(job: MemberJob) -> MemberResult:
    """One member's result, its calculation sheet written to ``job.sheet`` (the worker of
    ``plystack schedule --sheets``). A member without checks gets no sheet.
    """
    try:
        result, project, _analysis = analyse_job(job)
        if project is None or job.sheet is None or result.summary is None:
            return result
        if result.summary.governing is None:
            return result
        paper = "letter" if project.display_units == "US" else "a4"
        try:
            pages = build_sheet(project, job.sheet, paper)
        except (OSError, ProjectError) as exc:
            message = (exc.strerror or str(exc)) if isinstance(exc, OSError) else str(exc)
            return replace(result, problems=(RowProblem(
                job.row, None, f"the calculation sheet {job.sheet} was not written: "
                f"{message}"),))
        return replace(result, sheet=Path(job.sheet).name, sheet_pages=pages)
    except Exception as exc:  # rows are independent: a fault in one never stops the run
        return failed(job.row, job.mark, job.base, job.alternative, [RowProblem(
            job.row, None, "could not be analysed: an unexpected fault of the program "
            f"(please report it with this row): {exc}")])


def _esc(text: str) -> str:
    return drawable(text).replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;")


def _p(text: str, style: ParagraphStyle = CELL) -> Paragraph:
    return Paragraph(_esc(text), style)


def _governing(r: MemberResult) -> str:
    gov = r.summary.governing if r.summary else None
    if gov is None:
        return ""
    where = ", ".join(x for x in (gov[1], gov[2]) if x)
    return f"{gov[0]} ({where})" if where else gov[0]


def _table(results: Sequence[MemberResult], first_pages: dict[int, int], width: float
           ) -> Table:
    head = ["Mark", "Verdict", "Governing check (ply, combination)", "Ratio", "Defl. ratio",
            "Plate", "Bolts / connectors", "Mass", "Page"]
    rows: list[list[Any]] = [[_p(h) for h in head]]
    style = [("GRID", (0, 0), (-1, -1), 0.3, colors.grey),
             ("VALIGN", (0, 0), (-1, -1), "TOP"),
             ("BACKGROUND", (0, 0), (-1, 0), colors.Color(0.8, 0.8, 0.8)),
             ("LEFTPADDING", (0, 0), (-1, -1), 2), ("RIGHTPADDING", (0, 0), (-1, -1), 2),
             ("TOPPADDING", (0, 0), (-1, -1), 1), ("BOTTOMPADDING", (0, 0), (-1, -1), 1)]
    for k, r in enumerate(results, start=1):
        s = r.summary
        gov = s.governing if s else None
        defl = s.deflection if s else None
        page = first_pages.get(r.row)
        rows.append([_p(r.mark or f"(row {r.row})"), _p(r.verdict if r.ran else
                                                        f"{r.verdict} (not run)"),
                     _p(_governing(r)), _p(f"{gov[3]:.3f}" if gov else ""),
                     _p(f"{defl[1]:.3f}" if defl else ""),
                     _p(plates_text(s) if s else ""), _p(fasteners_text(s) if s else ""),
                     _p(mass_text(s) if s else ""), _p(str(page) if page else "")])
        if r.verdict == NOT_OK:
            style.append(("BACKGROUND", (0, k), (-1, k), RED))
        elif r.verdict == INCOMPLETE:
            style.append(("BACKGROUND", (0, k), (-1, k), GREY))
    fractions = (0.07, 0.09, 0.22, 0.05, 0.06, 0.17, 0.20, 0.07, 0.04)
    table = Table(rows, colWidths=[f * width for f in fractions], repeatRows=1, hAlign="LEFT")
    table.setStyle(TableStyle(style))
    return table


def summary_story(results: Sequence[MemberResult], title: str, width: float,
                  first_pages: dict[int, int]) -> list[Any]:
    """The flowables of the schedule's summary page(s)."""
    counts = Counter(r.verdict for r in results)
    not_run = sum(1 for r in results if not r.ran)
    tally = ", ".join(f"{counts[v]} {v}" for v in VERDICTS)
    out: list[Any] = [
        _p(f"Member schedule: {title}", H1),
        _p(f"{len(results)} members: {tally}" + (f" ({not_run} could not be analysed)"
                                                  if not_run else "")
           + f". Plystack {__version__}, {_dt.date.today().isoformat()}. Every member's "
           "calculation sheet follows in schedule order; rows failing a check are red, "
           "incomplete ones grey.", BODY),
        _p(CAUTION, CAUTION_STYLE),
        _table(results, first_pages, width)]
    notes = [(r, [str(p) for p in r.problems] + list(r.summary.reasons if r.summary else ()))
             for r in results]
    notes = [(r, n) for r, n in notes if n]
    if notes:
        out.append(_p("Problems and incomplete members", H2))
        for r, lines in notes:
            for line in lines:
                out.append(_p(f"{r.mark or '(no mark)'}: {line}", SMALL))
    out.append(_p("Assumptions: " + " ".join(ASSUMPTIONS), SMALL))
    return out


def _summary_pdf(results: Sequence[MemberResult], title: str, paper: str,
                 first_pages: dict[int, int]) -> bytes:
    register_fonts()
    size = landscape(LETTER if paper == "letter" else A4)
    buffer = io.BytesIO()
    doc = SimpleDocTemplate(buffer, pagesize=size, leftMargin=12 * mm, rightMargin=12 * mm,
                            topMargin=12 * mm, bottomMargin=14 * mm,
                            title=f"Member schedule: {title}", creator=f"Plystack {__version__}")

    def footer(canvas: Any, document: Any) -> None:
        canvas.saveState()
        canvas.setFont(FONT, 7.5)
        canvas.drawString(12 * mm, 7 * mm, f"Plystack {__version__} \u2014 member schedule "
                          f"{drawable(title)} \u2014 summary page {document.page}")
        canvas.restoreState()

    doc.build(summary_story(results, title, size[0] - 24 * mm, first_pages),
              onFirstPage=footer, onLaterPages=footer)
    return buffer.getvalue()


def write_combined(results: Sequence[MemberResult], folder: Path, title: str) -> tuple[Path, int]:
    """The combined PDF (summary first, then each member's sheet) in ``folder``; returns
    its path and page count.
    """
    members = [r for r in results if r.sheet is not None]
    paper = "letter"
    if members and members[0].summary is not None:
        paper = "letter" if members[0].summary.display_units == "US" else "a4"
    first: dict[int, int] = {}
    summary = _summary_pdf(results, title, paper, first)
    for _attempt in range(3):  # the page numbers may lengthen the summary; settle them
        page = len(PdfReader(io.BytesIO(summary)).pages) + 1
        numbered: dict[int, int] = {}
        for r in members:
            numbered[r.row] = page
            page += r.sheet_pages
        if numbered == first:
            break
        first = numbered
        summary = _summary_pdf(results, title, paper, first)
    writer = PdfWriter()
    writer.append(PdfReader(io.BytesIO(summary)), outline_item="Schedule summary")
    for r in members:
        writer.append(str(folder / str(r.sheet)), outline_item=r.mark)
    writer.add_metadata({"/Title": f"Member schedule: {title}",
                         "/Creator": f"Plystack {__version__}"})
    buffer = io.BytesIO()
    writer.write(buffer)
    target = folder / COMBINED
    write_bytes(target, buffer.getvalue(), "--sheets")
    return target, len(writer.pages)
