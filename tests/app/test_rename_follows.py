"""Renaming a ply in the ply panel (typed with real key events) carries the design's
overrides and the notches and holes that name it, in one undoable step, so that nothing
the user asked for is left pointing at the old name.
"""

from __future__ import annotations

from dataclasses import replace

from PySide6.QtCore import Qt
from PySide6.QtTest import QTest

from plystack.core.model.openings import Hole, Notch


def test_rename_carries_overrides_notches_and_holes(window, qtbot):
    doc = window.document
    p = doc.project
    design = replace(p.design_or_default(), overrides={"left 2x10": {"C_D": 0.9},
                                                       "right 2x10": {"C_D": 0.8}})
    beam = replace(p.beam, notches=(Notch(0.0, "bottom", 0.0254, 0.0762, 1, ("left 2x10",)),),
                   holes=(Hole(0.9144, 0.1, 0.0254, ("left 2x10", "right 2x10")),))
    doc.apply(replace(p, design=design, beam=beam), "set up")
    before = doc.project
    window.canvas.select(0)
    qtbot.wait(20)
    edit = window.ply_panel.name
    edit.setFocus()
    edit.selectAll()
    QTest.keyClicks(edit, "old joist")
    QTest.keyClick(edit, Qt.Key.Key_Return)
    qtbot.wait(20)
    after = doc.project
    assert after.plies[0].name == "old joist"
    assert after.design.overrides == {"old joist": {"C_D": 0.9}, "right 2x10": {"C_D": 0.8}}
    assert after.beam.notches[0].plies == ("old joist",)
    assert after.beam.holes[0].plies == ("old joist", "right 2x10")
    window.analysis_model.recompute()
    a = window.analysis_model.analysis
    assert a is not None
    assert not [w for w in a.warnings if w.path.startswith("design.overrides")]
    doc.undo_stack.undo()
    assert doc.project == before
