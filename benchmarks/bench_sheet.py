"""Time to export the demo's calculation sheet in-process, part by part, beside the
analysis alone; then the whole `plystack sheet` process (goal: at most 1.0 s) from
bench_cli. Not a test; prints numbers.

In-process figures are the least CPU time of several builds after a warm-up (fonts
registered): the flowables (``story``: the text, tables and drawings made), reportlab
setting them on the pages (frames, tables, text), the title blocks and footers drawn
on every page, and the PDF file written (fonts subset, streams compressed).
"""

from __future__ import annotations

import io
import time
from collections.abc import Callable
from pathlib import Path
from typing import Any

from reportlab.lib.units import mm
from reportlab.pdfgen import canvas as rl_canvas
from reportlab.platypus import SimpleDocTemplate

from plystack.core.io.project_file import load
from plystack.core.pipeline import run
from plystack.core.report import sheet
from plystack.core.report.content import story

DEMO = Path(__file__).resolve().parents[1] / "assets" / "demo" / "porch-header.plystack.json"


def _least(fn: Callable[[], Any], repeat: int) -> float:
    times = []
    for _ in range(repeat):
        t = time.process_time()
        fn()
        times.append(time.process_time() - t)
    return min(times)


def _parts(project: Any, repeat: int) -> dict[str, float]:
    """CPU seconds of each part of one build (least of ``repeat``)."""
    a = run(project)
    size = sheet.PAPERS["letter"]
    out: dict[str, list[float]] = {"story": [], "pages set": [], "title blocks": [],
                                   "file written": []}
    marks: dict[str, float] = {}
    maker = sheet._title_block_maker(a.project, size, [])

    class Timed(maker):  # type: ignore[misc, valid-type]
        def save(self) -> None:
            marks["set"] = time.process_time()
            total = len(self._pages)
            for state in self._pages:
                self.__dict__.update(state)
                self._draw_block(total)
                self._draw_footer()
                rl_canvas.Canvas.showPage(self)
            marks["blocks"] = time.process_time()
            rl_canvas.Canvas.save(self)

    for _ in range(repeat):
        t0 = time.process_time()
        flowables = story(a, project, size[0] - 30 * mm)
        t1 = time.process_time()
        doc = SimpleDocTemplate(io.BytesIO(), pagesize=size, leftMargin=15 * mm,
                                rightMargin=15 * mm, bottomMargin=14 * mm,
                                topMargin=14 * mm + sheet.TITLE_BLOCK_HEIGHT)
        with sheet._cycles_collected_after(), sheet._streams_without_base85():
            doc.build(flowables, canvasmaker=Timed)
        t2 = time.process_time()
        out["story"].append(t1 - t0)
        out["pages set"].append(marks["set"] - t1)
        out["title blocks"].append(marks["blocks"] - marks["set"])
        out["file written"].append(t2 - marks["blocks"])
    return {k: min(v) for k, v in out.items()}


def main(repeat: int = 7) -> None:
    project = load(DEMO)
    pages = sheet.build_sheet(project, io.BytesIO())  # fonts registered, caches warm
    whole = _least(lambda: sheet.build_sheet(project, io.BytesIO()), repeat)
    analysis = _least(lambda: run(project), repeat)
    print(f"sheet export ({pages} pages), in-process: {whole * 1000:7.1f} ms CPU "
          f"(least of {repeat})")
    for name, seconds in _parts(project, repeat).items():
        print(f"  {name:14s} {seconds * 1000:7.1f} ms")
    print(f"analysis alone         : {analysis * 1000:7.1f} ms "
          f"(the sheet runs it once, and once more per alternative)")
    print()
    import bench_cli

    bench_cli.main(repeat)


if __name__ == "__main__":
    main()
