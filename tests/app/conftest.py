"""GUI tests run offscreen with Qt's test-mode paths (autosave and settings go to a
throwaway location)."""

from __future__ import annotations

import os

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

import pytest
from PySide6.QtCore import QStandardPaths

QStandardPaths.setTestModeEnabled(True)


@pytest.fixture
def window(qtbot):
    """A fresh main window on a fresh copy of the demo project."""
    from pathlib import Path

    from plystack.app.main_window import MainWindow
    from plystack.core.io.project_file import load

    demo = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"
    w = MainWindow(load(demo), None)
    w.ask = lambda *a, **k: None  # tests set their own answer where they need one
    qtbot.addWidget(w)
    w.resize(1400, 900)
    w.show()
    qtbot.waitExposed(w)
    w.canvas.fit()
    return w
