"""The desktop program, driven like a user (pytest-qt, offscreen). Numbers shown are
compared with core/ for the same project, not pixels."""

from __future__ import annotations

import random
from dataclasses import replace
from pathlib import Path

import pytest
from PySide6.QtCore import QPoint, QPointF, Qt
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QMessageBox

from plystack.core.io.project_file import load, loads
from plystack.core.pipeline import run

IN = 0.0254


def to_view(canvas, x_m, y_m) -> QPoint:
    return canvas.mapFromScene(QPointF(x_m * 1000, -y_m * 1000))


def drag(canvas, a, b, steps=4):
    vp = canvas.viewport()
    p0, p1 = to_view(canvas, *a), to_view(canvas, *b)
    QTest.mousePress(vp, Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier, p0)
    for k in range(1, steps + 1):
        p = p0 + (p1 - p0) * (k / steps)
        QTest.mouseMove(vp, p)
    QTest.mouseRelease(vp, Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier, p1)


def is_snapped(v, step=IN / 16):
    return abs(v / step - round(v / step)) < 1e-9


def test_draw_move_resize_and_undo(window, qtbot):
    c = window.canvas
    doc = window.document
    start = doc.project
    n0 = len(start.plies)
    drag(c, (5.0 * IN, 1.0 * IN), (6.03 * IN, 4.51 * IN))
    assert len(doc.project.plies) == n0 + 1
    new = doc.project.plies[-1]
    for v in (new.x, new.y, new.width, new.height):
        assert is_snapped(v)
    assert new.width == pytest.approx(1.0 * IN, abs=IN / 16)
    after_draw = doc.project
    assert doc.undo_stack.count() == 1  # the whole drag is one step
    drag(c, (new.x + new.width / 2, new.y + new.height / 2),
         (new.x + new.width / 2 + 1.0 * IN, new.y + new.height / 2 + 0.5 * IN))
    moved = doc.project.plies[-1]
    assert moved.x == pytest.approx(new.x + 1.0 * IN, abs=IN / 16)
    assert (moved.width, moved.height) == (new.width, new.height)
    after_move = doc.project
    assert doc.undo_stack.count() == 2
    # resize from the right edge handle
    right_mid = (moved.x + moved.width, moved.y + moved.height / 2)
    drag(c, right_mid, (right_mid[0] + 0.5 * IN, right_mid[1]))
    resized = doc.project.plies[-1]
    assert resized.width == pytest.approx(moved.width + 0.5 * IN, abs=IN / 16)
    assert resized.x == moved.x
    after_resize = doc.project
    doc.undo_stack.undo()
    assert doc.project == after_move
    doc.undo_stack.undo()
    assert doc.project == after_draw
    doc.undo_stack.undo()
    assert doc.project == start
    doc.undo_stack.redo()
    doc.undo_stack.redo()
    doc.undo_stack.redo()
    assert doc.project == after_resize


def test_typing_dimensions_updates_results_and_plots(window, qtbot):
    window.canvas.select(1)  # the flitch plate
    panel = window.ply_panel
    edit = panel.fields["height"]
    edit.setText("8")  # bare number: the display unit (in)
    edit.editingFinished.emit()
    assert window.document.project.plies[1].height == pytest.approx(8 * IN)
    window.recompute()
    expected = run(window.document.project)
    table = window.results.section
    values = {table.item(r, 0).text(): table.item(r, 1).data(Qt.ItemDataRole.UserRole)
              for r in range(table.rowCount())}
    assert values["EI"] == pytest.approx(expected.section.EI, rel=1e-12)
    assert values["Neutral axis y"] == pytest.approx(expected.section.neutral_axis_y)
    gov = max(expected.checks, key=lambda c: c.ratio)
    top_ratio = window.results.checks.item(0, 5).data(Qt.ItemDataRole.UserRole)
    assert top_ratio == pytest.approx(gov.ratio, rel=1e-12)
    combo = max(expected.beam.combinations, key=lambda c: abs(c.M_governing))
    assert window.diagrams.last["moment"] == pytest.approx(combo.extremes.M_max, rel=1e-6)
    top, bot = expected.section.ply_extreme_stresses(combo.M_governing)
    assert window.profiles.last["top"] == pytest.approx(top, rel=1e-12)


def test_picking_a_material_changes_results(window, qtbot):
    window.canvas.select(1)
    combo = window.ply_panel.material
    k = combo.findData("A572-50")
    combo.setCurrentIndex(k)
    combo.activated.emit(k)
    assert window.document.project.plies[1].material == "A572-50"
    window.recompute()
    expected = run(window.document.project)
    steel = next(c for c in expected.checks if c.id == "bending" and c.ply == "flitch plate")
    rows = window.results.checks
    shown = [rows.item(r, 4).data(Qt.ItemDataRole.UserRole) for r in range(rows.rowCount())
             if rows.item(r, 0).text() == "bending" and rows.item(r, 1).text() == "flitch plate"]
    assert shown == [pytest.approx(steel.capacity)]


@pytest.mark.parametrize("text", ["abc", "-2 in", "", "12 apples"])
def test_bad_entries_refused_in_place(window, qtbot, text):
    window.canvas.select(0)
    before = window.document.project
    edit = window.ply_panel.fields["width"]
    edit.setText(text)
    edit.editingFinished.emit()
    assert window.document.project == before
    assert edit.error_text.startswith("width")
    assert "background" in edit.styleSheet()


def test_bad_load_cell_refused(window, qtbot):
    before = window.document.project
    table = window.beam_panel.loads
    table.item(0, 2).setText("lots")
    assert window.document.project == before
    assert "loads[0].value" in window.beam_panel.error.text()


def test_editing_a_load_keeps_its_description(window, qtbot):
    table = window.beam_panel.loads
    before = window.document.project.beam.loads[0]
    assert before.description
    table.item(0, 2).setText("15 psf")
    after = window.document.project.beam.loads[0]
    assert after.value != before.value
    assert after.description == before.description


def test_save_reopen_and_prompt(window, qtbot, tmp_path):
    window.canvas.select(1)
    edit = window.ply_panel.fields["width"]
    edit.setText("1/2 in")
    edit.editingFinished.emit()
    assert window.document.modified and "*" in window.windowTitle()
    target = tmp_path / "edited.plystack.json"
    assert window._save_to(target)
    assert not window.document.modified and "*" not in window.windowTitle()
    assert load(target) == window.document.project
    assert load(target).plies[1].width == pytest.approx(0.5 * IN)
    # an edit, then closing: the prompt appears; Cancel keeps the window and the work
    edit.setText("5/8 in")
    edit.editingFinished.emit()
    asked = []
    window.ask = lambda *a, **k: asked.append(a) or QMessageBox.StandardButton.Cancel
    assert not window.maybe_save()
    assert asked and window.document.modified
    window.ask = lambda *a, **k: QMessageBox.StandardButton.Discard
    assert window.maybe_save()
    assert window.open_path(target)
    assert window.document.project.plies[1].width == pytest.approx(0.5 * IN)


def test_units_switch_converts(window, qtbot):
    window.canvas.select(0)
    panel = window.ply_panel
    us_text = panel.fields["height"].text()
    assert us_text.endswith("in")
    window.set_units("SI")
    si_text = panel.fields["height"].text()
    assert si_text.endswith("mm")
    assert float(si_text.split()[0]) == pytest.approx(float(us_text.split()[0]) * 25.4)
    window.recompute()
    rows = window.results.section
    ei_text = next(rows.item(r, 1).text() for r in range(rows.rowCount())
                   if rows.item(r, 0).text() == "EI")
    assert ei_text.endswith("kN*m^2")
    window.document.undo_stack.undo()
    assert window.document.project.display_units == "US"


def test_autosave_writes_recoverable_copy(window, qtbot):
    window.canvas.select(0)
    edit = window.ply_panel.fields["height"]
    edit.setText("11.25")
    edit.editingFinished.emit()
    path = window.autosave()
    assert path is not None and path.exists()
    assert loads(path.read_text()) == window.document.project
    window._clear_autosave()


def test_keyboard_edits(window, qtbot):
    c = window.canvas
    c.select(1)
    c.setFocus()
    x0 = window.document.project.plies[1].x
    QTest.keyClick(c, Qt.Key.Key_Right)
    assert window.document.project.plies[1].x == pytest.approx(x0 + IN / 16)
    n = len(window.document.project.plies)
    window.duplicate_ply()
    assert len(window.document.project.plies) == n + 1
    window.delete_ply()
    assert len(window.document.project.plies) == n
    c.select(0)
    window.mirror_ply()
    assert window.document.project.plies[0].x == pytest.approx(1.875 * IN)
    window.restack(+1)
    assert window.document.project.plies[1].name == "left 2x10"


def test_random_actions_never_break_the_model(window, qtbot):
    rng = random.Random(7)
    c = window.canvas
    for _ in range(300):
        action = rng.choice(["draw", "drag", "key", "select", "delete", "dup", "mirror",
                             "undo", "redo", "restack"])
        plies = window.document.project.plies
        if action == "draw":
            a = (rng.uniform(-2, 6) * IN, rng.uniform(-2, 11) * IN)
            b = (a[0] + rng.uniform(-3, 3) * IN, a[1] + rng.uniform(-3, 3) * IN)
            drag(c, a, b, steps=2)
        elif action == "drag" and plies:
            p = rng.choice(plies)
            drag(c, (p.x + p.width / 2, p.y + p.height / 2),
                 (p.x + rng.uniform(-1, 1) * IN, p.y + rng.uniform(-1, 1) * IN), steps=2)
        elif action == "key":
            QTest.keyClick(c, rng.choice([Qt.Key.Key_Left, Qt.Key.Key_Right, Qt.Key.Key_Up,
                                          Qt.Key.Key_Down, Qt.Key.Key_F]))
        elif action == "select":
            c.select(rng.randrange(-1, len(plies) + 1))
        elif action == "delete":
            window.delete_ply()
        elif action == "dup":
            window.duplicate_ply()
        elif action == "mirror":
            window.mirror_ply()
        elif action == "undo":
            window.document.undo_stack.undo()
        elif action == "redo":
            window.document.undo_stack.redo()
        elif action == "restack":
            window.restack(rng.choice([-1, 1]))
    project = window.document.project
    from plystack.core.io.project_file import dumps

    assert loads(dumps(project)) == project  # a model the file format accepts
    if project.plies:
        run(replace(project))  # core accepts it (or raises its own ProjectError)


def test_screenshot_command(tmp_path):
    from plystack.app.launch import main

    demo = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"
    out = tmp_path / "shot.png"
    assert main(["gui", str(demo), "--screenshot", str(out)]) == 0
    assert out.stat().st_size > 10_000
    assert out.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n"


def test_screenshot_into_a_folder_names_the_option(tmp_path, capsys):
    from plystack.app.launch import main

    demo = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"
    assert main(["gui", str(demo), "--screenshot", str(tmp_path)]) == 2
    assert (f"plystack gui: --screenshot: {tmp_path} is a folder; give the name of a file"
            in capsys.readouterr().err)


def test_alternatives_side_by_side_promote_and_undo(window, qtbot):
    from dataclasses import replace as dc_replace

    from plystack.core.study.compare import summarise

    doc = window.document
    doc.apply(dc_replace(doc.project, alternatives=()), "clear alternatives")
    window.alternatives.add_current("as drawn")
    window.canvas.select(1)
    edit = window.ply_panel.fields["width"]
    edit.setText("1/2 in")
    edit.editingFinished.emit()
    window.alternatives.add_current("half inch")
    window.right_tabs.setCurrentWidget(window.alternatives)
    window.recompute()
    panel = window.alternatives
    assert panel.names == ["as drawn", "half inch"]
    for col, alt in enumerate(doc.project.alternatives):
        expected = summarise(run(doc.project.with_plies(alt.plies)))
        ei = panel.table.item(0, col).data(Qt.ItemDataRole.UserRole)
        ratio = panel.table.item(2, col).data(Qt.ItemDataRole.UserRole)
        assert ei == pytest.approx(expected.EI, rel=1e-12)
        assert ratio == pytest.approx(expected.governing_ratio, rel=1e-12)
    before = doc.project
    panel.promote("as drawn")
    assert doc.project.plies == doc.project.alternatives[0].plies
    assert doc.project.plies[1].width == pytest.approx(0.375 * IN)
    doc.undo_stack.undo()
    assert doc.project == before


def test_export_sheet_from_the_window(window, qtbot, tmp_path):
    from pypdf import PdfReader

    from plystack.app.dialogs import SheetDialog

    dlg = SheetDialog(window.document.project, window)
    assert dlg.pages >= 3 and "pages" in dlg.preview.text()
    dlg.paper.setCurrentText("a4")
    assert dlg.pages >= 3
    out = tmp_path / "sheet.pdf"
    assert window.export_sheet(out)
    assert len(PdfReader(out).pages) >= 3
    from dataclasses import replace as dc_replace

    window.document.apply(dc_replace(window.document.project, beam=None), "no beam")
    bad = SheetDialog(window.document.project, window)
    assert bad.pages == 0 and "Cannot export" in bad.preview.text()
    assert not bad.save_button.isEnabled()


def test_crash_recovery_offers_the_autosave(window, qtbot, tmp_path):
    from plystack.app.main import offer_recovery
    from plystack.core.io.project_file import save

    edited = window.document.project.with_plies(window.document.project.plies[:2])
    save(edited, tmp_path / "untitled.plystack.json")

    class Box:
        class StandardButton:
            Yes, No = 1, 0

        asked = []

        @staticmethod
        def question(parent, title, text):
            Box.asked.append(text)
            return Box.StandardButton.Yes

    offer_recovery(window, tmp_path, Box)
    assert Box.asked and "untitled.plystack.json" in Box.asked[0]
    assert window.document.project == edited
    assert window.document.modified


def test_design_choices_in_the_loads_panel(window, qtbot):
    panel = window.beam_panel
    panel.live_limit.setText("480")
    panel.live_limit.editingFinished.emit()
    assert window.document.project.design.live_limit == 480
    before = window.document.project
    panel.total_limit.setText("lots")
    panel.total_limit.editingFinished.emit()
    assert window.document.project == before
    assert "deflection limit total" in panel.error.text()
    panel.bolt_diameter.setText("5/8 in")
    panel.bolt_diameter.editingFinished.emit()
    assert window.document.project.design.bolt.diameter == pytest.approx(0.625 * IN)
    panel.incised.setChecked(True)
    window.recompute()
    c = next(c for c in window.analysis.checks if c.id == "bending" and c.ply == "left 2x10")
    assert c.factors["C_i"] == 0.8
