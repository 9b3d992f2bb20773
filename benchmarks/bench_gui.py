"""Offscreen: the drag path of the desktop program. A resize drag on the flitch plate's top
edge of the demo, 100 steps of real mouse events (press, moves, release on the canvas's
viewport), each step timed from the mouse move to the view, the results table and the
shown plot painted; beside every step, core's ``run`` of the same project, so the part
the GUI adds (step minus run) and the ratio step / run come from the same moments of a
busy machine. Beside the times, what Qt painted in a step: the paint events and the
pixels of their regions (a count, unmoved by the machine's load), and what the views
set again in a step: the checks table's cells handed to Qt (of all its cells), the
canvas's plies and the elevation's parts drawn again (of all of them). Three windows: plots
hidden, the strain and stress plot, the shear, moment and deflection plot. Goals (issue
18): view + table <= 12 ms median; with a plot <= 25 ms median, p95 <= 40 ms.

Times are CPU seconds of this process (``time.process_time``: the others' load on a
shared machine moves them less than wall time) unless ``--wall`` is given. Not a test;
prints one run's numbers. ``--steps N`` changes the number of steps; ``--project FILE``
drags the second ply (the plate in both demos) of another project file, such as a demo
whose plate stops short of the supports; ``--widgets`` also
prints, for each window, the widgets painted in the steps (by class, parent and object
name) with their paint events and pixels a step, the largest first.
"""

from __future__ import annotations

import math
import os
import statistics
import sys
import time
from collections import Counter
from collections.abc import Callable
from pathlib import Path

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

from PySide6.QtCore import QEvent, QObject, QPoint, QPointF, QStandardPaths, Qt
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QApplication

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "assets" / "demo" / "porch-header.plystack.json"
CLOCK: Callable[[], float] = time.perf_counter if "--wall" in sys.argv else time.process_time


def _project_path() -> Path:
    """The project dragged: ``--project FILE``, else the US demo."""
    if "--project" in sys.argv:
        return Path(sys.argv[sys.argv.index("--project") + 1])
    return DEMO


def _percentile(values: list[float], q: float) -> float:
    ordered = sorted(values)
    return ordered[min(len(ordered) - 1, int(q * len(ordered)))]


class PaintCounter(QObject):
    """Counts the paint events of every widget and the pixels of their regions."""

    def __init__(self) -> None:
        super().__init__()
        self.events = 0
        self.pixels = 0
        self.by_widget: Counter[str] = Counter()  # pixels by widget
        self.events_by_widget: Counter[str] = Counter()

    def eventFilter(self, watched: QObject, event: QEvent) -> bool:
        if event.type() == QEvent.Type.Paint:
            pixels = sum(r.width() * r.height() for r in event.region())
            self.events += 1
            self.pixels += pixels
            parent = watched.parent()
            name = (f"{type(watched).__name__} {watched.objectName()!r} in "
                    f"{type(parent).__name__ if parent is not None else 'the screen'}")
            self.by_widget[name] += pixels
            self.events_by_widget[name] += 1
        return False


def _set_again(w) -> tuple[int, int, int]:  # type: ignore[no-untyped-def]
    """Cells handed to Qt, canvas plies and elevation parts drawn so far."""
    return (w.results._check_cells.cells_put, w.canvas.plies_drawn,
            sum(w.elevation.drawing.parts_drawn.values()))


def drag_steps(tab: int | None, steps: int) -> tuple[list[float], list[float], int,
                                                     PaintCounter, dict[str, float]]:
    """Step times and run times (s) of one drag, the plots' full redraws in it, what was
    painted in its steps and what the views set again a step (of all there is).
    """
    from plystack.app.main_window import MainWindow
    from plystack.core.io.project_file import load
    from plystack.core.pipeline import run

    app = QApplication.instance() or QApplication([])
    left, none = Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier
    w = MainWindow(load(_project_path()), None)
    w.resize(1600, 950)
    w.show()
    w.plot_tabs.setVisible(tab is not None)
    if tab is not None:
        w.plot_tabs.setCurrentIndex(tab)
    for _ in range(5):
        app.processEvents()
    c = w.canvas
    c.fit()
    app.processEvents()
    ply = w.document.project.plies[1]
    vp = c.viewport()
    at = c.mapFromScene(QPointF((ply.x + ply.width / 2) * 1000, -ply.top * 1000))
    QTest.mouseClick(vp, left, none, c.mapFromScene(QPointF(
        (ply.x + ply.width / 2) * 1000, -(ply.y + ply.height / 2) * 1000)))
    app.processEvents()
    draws0 = w.profiles.full_draws + w.diagrams.full_draws
    QTest.mousePress(vp, left, none, at)
    set0 = _set_again(w)
    painted = PaintCounter()
    app.installEventFilter(painted)
    step_t, run_t = [], []
    for k in range(1, steps + 1):
        dy = round(40 * math.sin(k / 8))  # up and down, a few pixels a step
        t = CLOCK()
        QTest.mouseMove(vp, at + QPoint(0, -dy - 12))
        if w.analysis_model._timer.isActive():  # what the debounce timer would run
            w.analysis_model.recompute()
        app.processEvents()  # paints: the view, the table and a visible plot
        step_t.append(CLOCK() - t)
        app.removeEventFilter(painted)  # not while core runs beside the step
        project = w.document.project
        t = CLOCK()
        run(project)
        run_t.append(CLOCK() - t)
        app.installEventFilter(painted)
    app.removeEventFilter(painted)
    draws = w.profiles.full_draws + w.diagrams.full_draws - draws0
    set1 = _set_again(w)
    kept = {"cells": (set1[0] - set0[0]) / steps, "of cells": w.results.checks.rowCount() * 7,
            "plies": (set1[1] - set0[1]) / steps, "of plies": len(w.document.project.plies),
            "parts": (set1[2] - set0[2]) / steps, "of parts": 4}
    QTest.mouseRelease(vp, left, none, at)
    app.processEvents()
    w.document.undo_stack.setClean()
    w.close()
    app.processEvents()
    return step_t, run_t, draws, painted, kept


def main() -> None:
    QStandardPaths.setTestModeEnabled(True)
    steps = int(sys.argv[sys.argv.index("--steps") + 1]) if "--steps" in sys.argv else 100
    clock = "wall" if "--wall" in sys.argv else "CPU"
    print(f"GUI drag step ({steps} steps of a resize drag on the top edge of the second ply "
          f"of {_project_path().name}, {clock} time)")
    print(f"{'':44}{'median':>8}{'p95':>8}{'run':>8}{'- run':>8}{'/ run':>7}  full draws"
          "  paints/step  kpx/step")
    for label, tab, goal in (("view + results table (plots hidden)", None, "goal 12 ms"),
                             ("... with the strain and stress plot", 0, "goal 25, p95 40"),
                             ("... with the shear, moment, deflection plot", 1,
                              "goal 25, p95 40")):
        step_t, run_t, draws, painted, kept = drag_steps(tab, steps)
        med, p95 = statistics.median(step_t), _percentile(step_t, 0.95)
        core = statistics.median(run_t)
        extra = statistics.median(s - r for s, r in zip(step_t, run_t, strict=True))
        print(f"{label:<44}{med * 1e3:8.1f}{p95 * 1e3:8.1f}{core * 1e3:8.1f}"
              f"{extra * 1e3:8.1f}{med / core:7.2f}  {draws:4d}  "
              f"{painted.events / steps:11.1f}{painted.pixels / steps / 1e3:10.1f}   {goal}")
        print(f"{'':4}set again a step: {kept['cells']:.1f} of {kept['of cells']} cells of the "
              f"checks, {kept['plies']:.2f} of {kept['of plies']} canvas plies, "
              f"{kept['parts']:.2f} of {kept['of parts']} elevation parts")
        if "--widgets" in sys.argv:
            for name, pixels in painted.by_widget.most_common():
                print(f"{'':8}{painted.events_by_widget[name] / steps:6.2f} paints "
                      f"{pixels / steps / 1e3:8.1f} kpx  {name}")


if __name__ == "__main__":
    main()
