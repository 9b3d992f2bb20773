"""Launch to first paint of the window, as a ratio to the bare imports of PySide6 and
matplotlib (what any Qt program with matplotlib plots pays before drawing anything).

Each number is the median of several fresh interpreters (offscreen). "First paint" is
the moment the visible plot has finished its first paint event after the window was
shown (the plots draw once, when shown). Target: at most 2x. Not a test; prints numbers.
"""

from __future__ import annotations

import statistics
import subprocess
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "assets" / "demo" / "porch-header.plystack.json"

BARE = """
import time
t = time.perf_counter()
from PySide6.QtWidgets import QApplication
from matplotlib.backends.backend_qtagg import FigureCanvasQTAgg
from matplotlib.figure import Figure
print(time.perf_counter() - t)
"""

LAUNCH = """
import os, sys, time
t = time.perf_counter()
os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
from PySide6.QtCore import QEvent, QObject, QStandardPaths, QTimer
from PySide6.QtWidgets import QApplication
QStandardPaths.setTestModeEnabled(True)
app = QApplication([])
from plystack.app.main_window import MainWindow
from plystack.core.io.project_file import load
window = MainWindow(load(sys.argv[1]), None)
done = []

class FirstPaint(QObject):
    def eventFilter(self, obj, event):
        if event.type() == QEvent.Type.Paint and not done:
            QTimer.singleShot(0, lambda: done.append(time.perf_counter() - t) or app.quit())
        return False

watcher = FirstPaint()
window.profiles.installEventFilter(watcher)
window.show()
app.exec()
print(done[0], window.profiles.full_draws, window.diagrams.full_draws)
window.document.undo_stack.setClean()
"""


def _run(code: str, *args: str) -> list[float]:
    out = subprocess.run([sys.executable, "-c", code, *args], capture_output=True, text=True,
                         check=True, env={**__import__("os").environ,
                                          "QT_QPA_PLATFORM": "offscreen"})
    return [float(x) for x in out.stdout.split()]


def main(repeats: int = 5) -> None:
    bare = [_run(BARE)[0] for _ in range(repeats)]
    launches = [_run(LAUNCH, str(DEMO)) for _ in range(repeats)]
    b = statistics.median(bare)
    first = statistics.median(x[0] for x in launches)
    print(f"bare imports (PySide6 QtWidgets + matplotlib Qt canvas) {b * 1000:8.0f} ms "
          f"(median of {repeats})")
    print(f"launch to first paint of the window               {first * 1000:8.0f} ms "
          f"(median of {repeats})")
    print(f"ratio                                              {first / b:8.2f} (target <= 2)")
    print(f"full plot draws before the first paint: strain/stress {launches[0][1]:.0f}, "
          f"diagrams {launches[0][2]:.0f}")


if __name__ == "__main__":
    main()
