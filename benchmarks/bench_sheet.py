"""Time to export the demo's calculation sheet (target: well under two seconds), beside
the time of the analysis alone, from one run. Not a test."""

from __future__ import annotations

import io
import statistics
import time
from pathlib import Path

from plystack.core.io.project_file import load
from plystack.core.pipeline import run
from plystack.core.report.sheet import build_sheet

DEMO = Path(__file__).resolve().parents[1] / "assets" / "demo" / "porch-header.plystack.json"


def main(repeat: int = 5) -> None:
    project = load(DEMO)
    build_sheet(project, io.BytesIO())  # fonts registered, caches warm
    sheet, analysis = [], []
    for _ in range(repeat):
        t = time.perf_counter()
        pages = build_sheet(project, io.BytesIO())
        sheet.append(time.perf_counter() - t)
        t = time.perf_counter()
        run(project)
        analysis.append(time.perf_counter() - t)
    s, a = statistics.median(sheet), statistics.median(analysis)
    print(f"sheet export ({pages} pages): {s * 1000:8.1f} ms (median of {repeat})")
    print(f"analysis alone         : {a * 1000:8.1f} ms")
    print(f"ratio sheet / analysis : {s / a:8.1f}   (target: export well under 2000 ms)")


if __name__ == "__main__":
    main()
