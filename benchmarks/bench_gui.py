"""Offscreen: time from a model edit to (a) the section view redrawn and (b) results
table and plots updated, as medians over many edits of the demo, beside core alone.
Targets: section view and table within a 60 Hz frame (16 ms); with plots under 50 ms.
Not a test; prints one run's numbers and ratios."""

from __future__ import annotations

import os
import statistics
import time
from dataclasses import replace
from pathlib import Path

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

from PySide6.QtCore import QStandardPaths
from PySide6.QtWidgets import QApplication

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "assets" / "demo" / "porch-header.plystack.json"


def main(edits: int = 60) -> None:
    QStandardPaths.setTestModeEnabled(True)
    app = QApplication.instance() or QApplication([])
    from plystack.app.main_window import MainWindow
    from plystack.core.io.project_file import load
    from plystack.core.pipeline import run
    from plystack.core.section.transformed import analyse

    project = load(DEMO)
    w = MainWindow(project, None)
    w.resize(1600, 950)
    w.show()
    app.processEvents()
    core_t, section_t, view_t, table_t, full_t = [], [], [], [], []
    for k in range(edits):
        p = w.document.project
        plies = list(p.plies)
        plies[1] = replace(plies[1], height=plies[1].height + (1 if k % 2 else -1) * 0.0015875)
        new = p.with_plies(tuple(plies))
        t = time.perf_counter()
        run(new)
        core_t.append(time.perf_counter() - t)
        t = time.perf_counter()
        analyse(new.plies, new.all_materials())
        section_t.append(time.perf_counter() - t)
        t0 = time.perf_counter()
        w.document.apply(new, "bench")  # the canvas redraws synchronously
        view_t.append(time.perf_counter() - t0)
        w.analysis_model._timer.stop()  # run what the debounce timer would run, in the open
        t1 = time.perf_counter()
        w.analysis_model.recompute()  # publishes: results table (and plots) follow
        table_t.append(time.perf_counter() - t1 + view_t[-1])
        app.processEvents()  # the plots blit their data over cached axes, or redraw
        full_t.append(time.perf_counter() - t0)
    med = {name: statistics.median(v) * 1000 for name, v in (
        ("core section", section_t), ("core full (section, beam, checks)", core_t),
        ("edit -> section view", view_t), ("edit -> view + results table", table_t),
        ("edit -> view + table + plots drawn", full_t))}
    for name, ms in med.items():
        print(f"{name:<38}{ms:8.2f} ms (median of {edits})")
    base = med["core full (section, beam, checks)"]
    table = med["edit -> view + results table"] / base
    everything = med["edit -> view + table + plots drawn"] / base
    print(f"ratio view+table / core full           {table:8.2f}")
    print(f"ratio all / core full                  {everything:8.2f}")
    print(f"full redraws of the plots: {w.profiles.full_draws + w.diagrams.full_draws} "
          f"in {edits} edits (the rest were blits)")
    w.document.undo_stack.setClean()
    w.close()


if __name__ == "__main__":
    main()
