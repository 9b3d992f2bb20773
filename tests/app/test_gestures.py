"""Mouse and key gestures on the section canvas, driven with real events on the viewport.

A click (press and release within the platform's drag distance) selects and never edits;
a drag moves or resizes by the pointer's travel; the view never re-fits during a gesture.
"""

from __future__ import annotations

import pytest
from PySide6.QtCore import QEvent, QPoint, QPointF, Qt
from PySide6.QtGui import QKeyEvent
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QApplication

IN = 0.0254
STEP_MM = 25.4 / 16  # the US snap step in scene units (mm)
LEFT = Qt.MouseButton.LeftButton
NONE = Qt.KeyboardModifier.NoModifier


def to_view(canvas, x_m, y_m) -> QPoint:
    return canvas.mapFromScene(QPointF(x_m * 1000, -y_m * 1000))


def centre(ply):
    return ply.x + ply.width / 2, ply.y + ply.height / 2


def press_release(canvas, at: QPoint, path: list[QPoint]):
    vp = canvas.viewport()
    QTest.mousePress(vp, LEFT, NONE, at)
    for p in path:
        QTest.mouseMove(vp, p)
    QTest.mouseRelease(vp, LEFT, NONE, path[-1] if path else at)


@pytest.mark.parametrize("jitter", [[], [(1, 0)], [(1, 1)], [(2, 0), (1, -1)], [(0, 2)]])
@pytest.mark.parametrize("index", [0, 1, 2])
def test_a_click_selects_and_never_edits(window, qtbot, index, jitter):
    c, doc = window.canvas, window.document
    assert QApplication.startDragDistance() > 2  # the jitter stays below it
    before = doc.project
    at = to_view(c, *centre(before.plies[index]))
    press_release(c, at, [at + QPoint(dx, dy) for dx, dy in jitter])
    assert c.selected == index
    assert doc.project == before
    assert doc.undo_stack.count() == 0
    assert not doc.modified


def test_clicking_every_ply_in_turn_and_on_empty_space_edits_nothing(window, qtbot):
    c, doc = window.canvas, window.document
    before = doc.project
    for ply in before.plies * 2:
        at = to_view(c, *centre(ply))
        press_release(c, at, [at + QPoint(1, 1), at + QPoint(2, 1)])
    empty = to_view(c, -3 * IN, -3 * IN)
    press_release(c, empty, [empty + QPoint(1, 2)])
    assert c.selected is None
    assert doc.undo_stack.count() == 0 and doc.project == before


def test_a_move_starts_only_at_the_drag_distance(window, qtbot):
    c, doc = window.canvas, window.document
    ply = doc.project.plies[2]
    at = to_view(c, *centre(ply))
    d = QApplication.startDragDistance()
    vp = c.viewport()
    QTest.mousePress(vp, LEFT, NONE, at)
    QTest.mouseMove(vp, at + QPoint(d - 1, 0))
    assert doc.undo_stack.count() == 0
    scale = c.transform().m11()
    far = at + QPoint(int(round(4 * STEP_MM * scale)) + d, 0)
    QTest.mouseMove(vp, far)
    QTest.mouseRelease(vp, LEFT, NONE, far)
    assert doc.undo_stack.count() == 1
    moved = doc.project.plies[2]
    travel_mm = (far.x() - at.x()) / scale
    assert abs((moved.x - ply.x) * 1000 - travel_mm) <= STEP_MM / 2 + 1e-9
    assert moved.y == ply.y and moved.width == ply.width and moved.height == ply.height


@pytest.mark.parametrize("pixels", [40, 73, -25])
def test_a_resize_drag_changes_the_ply_by_the_pointer_travel(window, qtbot, pixels):
    c, doc = window.canvas, window.document
    index = 1  # the flitch plate: resize its top edge
    ply = doc.project.plies[index]
    QTest.mouseClick(c.viewport(), LEFT, NONE, to_view(c, *centre(ply)))
    assert c.selected == index and doc.undo_stack.count() == 0
    transform = c.transform()
    origin = c.mapToScene(QPoint(0, 0))
    handle = to_view(c, ply.x + ply.width / 2, ply.y + ply.height)
    vp = c.viewport()
    QTest.mousePress(vp, LEFT, NONE, handle)
    steps = 8
    for k in range(1, steps + 1):
        QTest.mouseMove(vp, handle + QPoint(0, -round(pixels * k / steps)))
        assert c.transform() == transform  # no re-fit, no zoom during the gesture
        assert c.mapToScene(QPoint(0, 0)) == origin  # and no scrolling
    end = handle + QPoint(0, -pixels)
    QTest.mouseRelease(vp, LEFT, NONE, end)
    resized = doc.project.plies[index]
    scale = transform.m11()
    assert abs((resized.height - ply.height) * 1000 - pixels / scale) <= STEP_MM
    assert resized.y == ply.y and resized.x == ply.x and resized.width == ply.width
    assert doc.undo_stack.count() == 1
    # the dragged edge is under the pointer (within one snap step)
    edge = to_view(c, resized.x + resized.width / 2, resized.y + resized.height)
    assert abs(edge.y() - end.y()) <= STEP_MM * scale + 1
    doc.undo_stack.undo()
    assert doc.project.plies[index] == ply


def test_a_drawn_ply_follows_the_pointer_without_refit(window, qtbot):
    c, doc = window.canvas, window.document
    n = len(doc.project.plies)
    transform = c.transform()
    a = to_view(c, 6 * IN, 1 * IN)
    b = a + QPoint(60, -90)
    press_release(c, a, [a + QPoint(20, -30), a + QPoint(40, -60), b])
    assert c.transform() == transform
    new = doc.project.plies[n]
    scale = transform.m11()
    assert abs(new.width * 1000 - 60 / scale) <= STEP_MM
    assert abs(new.height * 1000 - 90 / scale) <= STEP_MM
    assert doc.undo_stack.count() == 1


def _key(widget, key, repeat=False):
    for kind in (QEvent.Type.KeyPress, QEvent.Type.KeyRelease):
        QApplication.sendEvent(widget, QKeyEvent(kind, key, NONE, "", repeat))


def test_arrow_keys_nudge_one_undo_step_per_press_merged_while_held(window, qtbot):
    c, doc = window.canvas, window.document
    c.select(2)
    c.setFocus()
    x0 = doc.project.plies[2].x
    _key(c, Qt.Key.Key_Right)
    _key(c, Qt.Key.Key_Right)
    assert doc.undo_stack.count() == 2
    assert doc.project.plies[2].x == pytest.approx(x0 + 2 * IN / 16, abs=1e-12)
    _key(c, Qt.Key.Key_Up)
    for _ in range(4):
        _key(c, Qt.Key.Key_Up, repeat=True)  # the key held down: auto-repeat
    assert doc.undo_stack.count() == 3
    assert doc.project.plies[2].y == pytest.approx(5 * IN / 16, abs=1e-12)
    doc.undo_stack.undo()
    assert doc.project.plies[2].y == 0.0
    assert doc.project.plies[2].x == pytest.approx(x0 + 2 * IN / 16, abs=1e-12)
