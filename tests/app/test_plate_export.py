"""File > Export plate drawings: the folder dialog, the files of ``plystack plates`` for the
plies on screen, and the named problem where there is no steel plate.

Sources: the demo's plies (3/8 x 8 3/4 in plate over the 12 ft span, as in the file) and
the holes worked out by hand in tests/validation/test_plate_dxf.py.
"""

from __future__ import annotations

import csv
from dataclasses import replace

import ezdxf


def _file_action(window, text):
    menu = next(a.menu() for a in window.menuBar().actions() if a.text() == "&File")
    return next(a for a in menu.actions() if a.text() == text)


def test_menu_writes_the_drawings_and_the_cut_list(window, qtbot, tmp_path):
    asked = []
    window.ask_plates_dir = lambda start: asked.append(start) or str(tmp_path)
    _file_action(window, "Export &plate drawings\u2026").trigger()
    assert len(asked) == 1
    assert sorted(p.name for p in tmp_path.iterdir()) == ["PL1.dxf", "cut-list.csv"]
    with (tmp_path / "cut-list.csv").open(encoding="utf-8", newline="") as fh:
        (row,) = list(csv.DictReader(fh))
    assert row["ply"] == "flitch plate" and row["thickness (in)"] == "0.375"
    assert row["length (in)"] == "144" and row["hole count"] == "12"
    assert len(ezdxf.readfile(tmp_path / "PL1.dxf").modelspace().query("CIRCLE")) == 12
    assert "PL1.dxf" in window.statusBar().currentMessage()


def test_the_plies_on_screen_are_drawn(window, qtbot, tmp_path):
    """An edit of the plate's depth is what the cut list holds."""
    p = window.document.project
    plies = list(p.plies)
    plies[1] = replace(plies[1], height=8.25 * 0.0254)
    window.document.apply(p.with_plies(tuple(plies)), "shallower plate")
    assert window.export_plates(tmp_path)
    with (tmp_path / "cut-list.csv").open(encoding="utf-8", newline="") as fh:
        (row,) = list(csv.DictReader(fh))
    assert row["width (in)"] == "8.25"


def test_cancel_writes_nothing(window, qtbot, tmp_path):
    window.ask_plates_dir = lambda start: ""
    assert not window.export_plates()
    assert list(tmp_path.iterdir()) == []


def test_no_steel_plate_is_named(window, qtbot, tmp_path):
    warned = []
    window.warn = lambda title, text: warned.append((title, text))
    p = window.document.project
    window.document.apply(p.with_plies((p.plies[0],)), "timber only")
    assert not window.export_plates(tmp_path / "out")
    assert warned and warned[0][0] == "Export plate drawings"
    assert "plies: hold no steel plate" in warned[0][1]
    assert "Error" not in warned[0][1]
    assert not (tmp_path / "out").exists()
