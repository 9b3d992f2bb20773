"""The drag path: a drag on the section updates the views in place, holds their layout
still, and leaves the window showing exactly what a fresh window shows for the project
the drag produced. Real mouse events (press, moves, release on the canvas's viewport).

References outside the project: a fresh ``MainWindow`` on the same project (the state
every update must end in), matplotlib's own layout of a text (``Text.get_window_extent``)
for the labels Qt paints over the plots, and core's ``run`` for the numbers.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from PySide6.QtCore import QPoint, QPointF, Qt
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QApplication, QTableWidget

from plystack.app.canvas_items import Tag
from plystack.app.main_window import MainWindow
from plystack.app.plots import painted_by_qt, text_anchor
from plystack.core.pipeline import run

LEFT, NONE = Qt.MouseButton.LeftButton, Qt.KeyboardModifier.NoModifier


def settle(qtbot, window) -> None:
    """Let the debounced analysis run and every paint happen."""
    qtbot.waitUntil(lambda: not window.analysis_model._timer.isActive(), timeout=5000)
    for _ in range(3):
        QApplication.processEvents()


def top_edge(window) -> QPoint:
    c = window.canvas
    ply = window.document.project.plies[1]  # the flitch plate
    return c.mapFromScene(QPointF((ply.x + ply.width / 2) * 1000, -ply.top * 1000))


def select_plate(window) -> None:
    c = window.canvas
    ply = window.document.project.plies[1]
    QTest.mouseClick(c.viewport(), LEFT, NONE, c.mapFromScene(QPointF(
        (ply.x + ply.width / 2) * 1000, -(ply.y + ply.height / 2) * 1000)))


def drag_top_edge(qtbot, window, steps: int = 24, release: bool = True) -> None:
    """Press on the plate's top edge handle and move up and down (as the benchmark does),
    each step's analysis run as the debounce timer would run it.
    """
    select_plate(window)
    vp = window.canvas.viewport()
    at = top_edge(window)
    QTest.mousePress(vp, LEFT, NONE, at)
    for k in range(1, steps + 1):
        dy = round(40 * math.sin(k / 4))
        QTest.mouseMove(vp, at + QPoint(0, -dy - 12))
        if window.analysis_model._timer.isActive():
            window.analysis_model.recompute()
        QApplication.processEvents()
    if release:
        QTest.mouseRelease(vp, LEFT, NONE, at + QPoint(0, -30))
        settle(qtbot, window)


def fresh_window(qtbot, window) -> MainWindow:
    """A new window on the dragged window's project, shown at the same size."""
    w = MainWindow(window.document.project, None)
    w.ask = lambda *a, **k: None
    qtbot.addWidget(w)
    w.resize(window.size())
    w.show()
    qtbot.waitExposed(w)
    w.canvas.fit()
    w.plot_tabs.setCurrentIndex(window.plot_tabs.currentIndex())
    settle(qtbot, w)
    return w


def table_texts(table: QTableWidget) -> list[list[str]]:
    return [[table.horizontalHeaderItem(c).text() if table.horizontalHeaderItem(c) else ""
             for c in range(table.columnCount())]] + [
        [table.item(r, c).text() if table.item(r, c) else "" for c in range(table.columnCount())]
        for r in range(table.rowCount())]


def tables(w: MainWindow) -> dict[str, QTableWidget]:
    r = w.results
    return {"checks": r.checks, "plies": r.plies, "section": r.section, "beam": r.beam,
            "ply list": w.ply_panel.table, "reactions": w.beam_panel.reactions,
            "loads": w.beam_panel.loads}


def plot_state(plot) -> dict[str, object]:
    """What a plot shows: every line's data, every text, every axes' limits."""
    state: dict[str, object] = {}
    for k, ax in enumerate(plot.figure.axes):
        state[f"axes {k} limits"] = (ax.get_xlim(), ax.get_ylim())
        state[f"axes {k} lines"] = [(np.asarray(line.get_xdata(), float).tolist(),
                                     np.asarray(line.get_ydata(), float).tolist())
                                    for line in ax.get_lines()]
        state[f"axes {k} texts"] = [(t.get_text(), tuple(np.asarray(getattr(t, "xy", (0, 0)),
                                                                    float)))
                                    for t in ax.texts]
    state["figure texts"] = [t.get_text() for t in plot.figure.texts]
    return state


def canvas_texts(w: MainWindow) -> list[tuple[str, bool]]:
    """The canvas's labels (text, shown) in stacking order."""
    return [(it.label.text(), it.isVisible()) for it in w.canvas.scene().items(
        Qt.SortOrder.AscendingOrder) if isinstance(it, Tag)]


@pytest.mark.parametrize("tab", [0, 1])
def test_after_a_drag_the_window_shows_what_a_fresh_window_shows(window, qtbot, tab):
    window.plot_tabs.setCurrentIndex(tab)
    settle(qtbot, window)
    start = window.document.project
    drag_top_edge(qtbot, window)
    assert window.document.project != start  # the plate's height changed
    fresh = fresh_window(qtbot, window)
    # the selection is the dragged window's own state: the fresh one selects the same ply
    fresh.canvas.select(window.canvas.selected)
    settle(qtbot, fresh)
    for name, table in tables(window).items():
        assert table_texts(table) == table_texts(tables(fresh)[name]), name
        widths = [table.columnWidth(c) for c in range(table.columnCount())]
        assert widths == [tables(fresh)[name].columnWidth(c)
                          for c in range(table.columnCount())], name
    assert window.results.verdict.text() == fresh.results.verdict.text()
    for shown in (tab, 1 - tab):  # the plot on top, then the other one once shown
        for w in (window, fresh):
            w.plot_tabs.setCurrentIndex(shown)
            settle(qtbot, w)
        plot = ("profiles", "diagrams")[shown]
        assert plot_state(getattr(window, plot)) == plot_state(getattr(fresh, plot)), plot
    assert canvas_texts(window) == canvas_texts(fresh)
    assert cell_state(window.results.checks) == cell_state(fresh.results.checks)
    assert scene_state(window.elevation) == scene_state(fresh.elevation)
    for w in (window, fresh):  # the reactions, filled once their tab is shown
        assert not w.beam_panel.isVisible()
        w.beam_panel.parentWidget().parentWidget().setCurrentWidget(w.beam_panel)
        settle(qtbot, w)
    reactions = window.beam_panel.reactions
    assert reactions.rowCount() > 0
    assert cell_state(reactions) == cell_state(fresh.beam_panel.reactions)
    assert [reactions.columnWidth(c) for c in range(reactions.columnCount())] == [
        fresh.beam_panel.reactions.columnWidth(c) for c in range(reactions.columnCount())]
    assert [(type(i).__name__, i.data(0)) for i in window.elevation.scene().items(
        Qt.SortOrder.AscendingOrder)] == [(type(i).__name__, i.data(0)) for i in
                                          fresh.elevation.scene().items(
                                              Qt.SortOrder.AscendingOrder)]
    # and the numbers shown are core's for the dragged project
    expected = run(window.document.project)
    table = window.results.section
    values = {table.item(r, 0).text(): table.item(r, 1).data(Qt.ItemDataRole.UserRole)
              for r in range(table.rowCount())}
    assert values["EI"] == expected.section.EI


def test_during_a_drag_the_columns_and_the_plot_layout_hold_still(window, qtbot):
    settle(qtbot, window)
    checks = window.results.checks
    widths = [checks.columnWidth(c) for c in range(checks.columnCount())]
    plies = window.ply_panel.table
    ply_widths = [plies.columnWidth(c) for c in range(plies.columnCount())]
    passes = window.profiles.layout_passes
    drag_top_edge(qtbot, window, release=False)
    assert window.document.dragging
    assert [checks.columnWidth(c) for c in range(checks.columnCount())] == widths
    assert [plies.columnWidth(c) for c in range(plies.columnCount())] == ply_widths
    assert window.profiles.layout_passes == passes  # no layout pass while dragging
    QTest.mouseRelease(window.canvas.viewport(), LEFT, NONE, top_edge(window))
    settle(qtbot, window)
    assert not window.document.dragging
    assert window.profiles.layout_passes > passes  # laid out once the drag is over


def test_a_drag_moves_the_canvas_items_instead_of_rebuilding_them(window, qtbot):
    settle(qtbot, window)
    select_plate(window)
    settle(qtbot, window)
    before = {id(it) for it in window.canvas.scene().items()}
    items = list(window.canvas.scene().items())  # keep them alive: ids stay unique
    drag_top_edge(qtbot, window, steps=6, release=False)
    after = {id(it) for it in window.canvas.scene().items()}
    assert after == before
    plate = window.document.project.plies[1]
    path = next(it for it in window.canvas.scene().items() if it.data(0) == 1)
    rect = path.path().boundingRect()
    assert rect.top() == pytest.approx(-plate.top * 1000, abs=1e-9)
    QTest.mouseRelease(window.canvas.viewport(), LEFT, NONE, top_edge(window))
    settle(qtbot, window)
    del items


def test_a_hidden_plot_computes_nothing_until_it_is_shown(window, qtbot):
    window.plot_tabs.setCurrentIndex(0)  # the diagrams are hidden
    settle(qtbot, window)
    draws = window.diagrams.full_draws
    drag_top_edge(qtbot, window, steps=8)
    assert window.diagrams.full_draws == draws
    assert window.diagrams._pending is not None
    # asked for, the values are those of the latest analysis (computed on demand)
    expected = run(window.document.project)
    combo = max(expected.beam.combinations, key=lambda c: abs(c.M_governing))
    assert window.diagrams.last["moment"] == pytest.approx(combo.extremes.M_max, rel=1e-6)
    window.plot_tabs.setCurrentIndex(1)
    settle(qtbot, window)
    assert window.diagrams._pending is None


def test_qt_paints_the_labels_where_matplotlib_lays_them_out(window, qtbot):
    """Each label Qt paints has its anchor where matplotlib's own layout of that text puts
    it: the left, right or middle of the text's box and its middle, top or baseline.
    """
    for tab, plot in enumerate((window.profiles, window.diagrams)):
        window.plot_tabs.setCurrentIndex(tab)
        settle(qtbot, window)
        renderer = plot.figure.canvas.get_renderer()
        labels = [a for a in plot.dynamic if painted_by_qt(a) and a.get_text()]
        assert labels
        for a in labels:
            at = text_anchor(a, plot.figure)
            if at is None:
                continue
            box = a.get_window_extent(renderer)
            x = {"left": box.x0, "right": box.x1, "center": (box.x0 + box.x1) / 2}[
                a.get_horizontalalignment()]
            assert at[0] == pytest.approx(x, abs=1e-6), a.get_text()
            va = a.get_verticalalignment()
            if va == "center":
                assert at[1] == pytest.approx((box.y0 + box.y1) / 2, abs=1e-6)
            elif va == "top":
                assert at[1] == pytest.approx(box.y1, abs=1e-6)
            else:  # baseline: inside the box, above its bottom by the descent
                assert box.y0 <= at[1] <= box.y1


def test_a_label_of_a_point_outside_its_axes_is_not_painted(window, qtbot):
    window.plot_tabs.setCurrentIndex(1)
    settle(qtbot, window)
    label = window.diagrams.labels[0]
    ax = label.axes
    x0, x1 = ax.get_xlim()
    old = label.xy
    label.xy = (x1 + 10 * (x1 - x0), old[1])  # as matplotlib's annotation clip leaves it
    assert text_anchor(label, window.diagrams.figure) is None
    label.xy = old


def shown_pixels(widget):
    """What the window shows of ``widget`` now (the window's painted surface, not a new
    rendering of the widget).
    """
    at = widget.mapToGlobal(QPoint(0, 0))
    return widget.screen().grabWindow(0, at.x(), at.y(), widget.width(),
                                      widget.height()).toImage()


def test_during_a_drag_the_canvas_shows_what_a_full_repaint_shows(window, qtbot):
    """The canvas repaints only the changed items' regions during a gesture; after every
    step its pixels are those of a repaint of the whole viewport, and the gesture ends
    with the whole viewport repainted.
    """
    from PySide6.QtWidgets import QGraphicsView

    full = QGraphicsView.ViewportUpdateMode.FullViewportUpdate
    settle(qtbot, window)
    select_plate(window)
    settle(qtbot, window)
    c = window.canvas
    vp = c.viewport()
    assert c.viewportUpdateMode() == full
    at = top_edge(window)
    QTest.mousePress(vp, LEFT, NONE, at)
    assert c.viewportUpdateMode() != full
    changed = 0
    before = shown_pixels(vp)
    for k in range(1, 17):
        QTest.mouseMove(vp, at + QPoint(0, -round(40 * math.sin(k / 4)) - 12))
        if window.analysis_model._timer.isActive():
            window.analysis_model.recompute()
        for _ in range(2):
            QApplication.processEvents()
        painted = shown_pixels(vp)
        changed += painted != before
        vp.repaint()
        QApplication.processEvents()
        assert painted == shown_pixels(vp), k
        before = painted
    assert changed > 4  # the plate moved on the screen
    QTest.mouseRelease(vp, LEFT, NONE, at + QPoint(0, -30))
    settle(qtbot, window)
    assert c.viewportUpdateMode() == full


def test_the_verdict_box_lays_out_as_the_label_alone(qtbot):
    """The box around the verdict gives the layout the label's hints: with the same texts,
    held or not, the label has the geometry it has straight in the same layout.
    """
    from PySide6.QtWidgets import QVBoxLayout, QWidget

    from plystack.app.results import LabelBox
    from plystack.app.safe import plain_label

    def panel(boxed: bool):
        w = QWidget()
        qtbot.addWidget(w)
        layout = QVBoxLayout(w)
        label = plain_label("")
        label.setStyleSheet("font-weight: bold; font-size: 13px; padding: 4px;")
        box = LabelBox(label) if boxed else None
        layout.addWidget(box if box is not None else label)
        layout.addWidget(QTableWidget(3, 3), 1)
        w.resize(420, 300)
        w.show()
        return w, label, box

    plain, plain_text, _ = panel(False)
    boxed, boxed_text, box = panel(True)
    texts = ["OK \u2014 governing: bending in flitch plate, D + L, ratio 0.812",
             "OK \u2014 governing: bending in flitch plate, D + L, ratio 0.813",
             "OK (close) \u2014 governing: splitting in left 2x10, D + L, ratio 0.9",
             "NOT OK \u2014 governing: splitting\n  not checked: one\n  not checked: two",
             "OK \u2014 short", "OK \u2014 short too"]
    held_back = 0
    for hold in (False, True, False):
        box.hold(hold)
        for text in texts + texts[::-1]:
            passed = box.passed_on
            for label in (plain_text, boxed_text):
                label.setText(text)
            for _ in range(3):
                QApplication.processEvents()
            held_back += box.passed_on == passed
            assert boxed_text.mapTo(boxed, QPoint(0, 0)) == plain_text.mapTo(plain, QPoint(0, 0))
            assert boxed_text.size() == plain_text.size(), text
            assert boxed_text.height() >= boxed_text.heightForWidth(boxed_text.width())
    assert held_back > 0  # the box did hold requests back
    box.hold(False)
    for w in (plain, boxed):
        w.resize(300, 340)
        QApplication.processEvents()
    assert boxed_text.size() == plain_text.size()


def test_the_verdict_box_holds_back_a_new_width_that_fits(qtbot):
    """While held, a text of another width on the same one line changes no geometry of a
    vertical box layout: the box passes nothing on; a text that needs another line does
    pass on. The label's geometry is the plain label's in the same layout throughout.
    """
    from PySide6.QtWidgets import QVBoxLayout, QWidget

    from plystack.app.results import LabelBox
    from plystack.app.safe import plain_label

    def panel(boxed: bool):
        w = QWidget()
        qtbot.addWidget(w)
        layout = QVBoxLayout(w)
        label = plain_label("OK \u2014 short")
        box = LabelBox(label) if boxed else None
        layout.addWidget(box if box is not None else label)
        layout.addWidget(QTableWidget(3, 3), 1)
        w.resize(600, 300)
        w.show()
        for _ in range(3):
            QApplication.processEvents()
        return w, label, box

    plain, plain_text, _ = panel(False)
    boxed, boxed_text, box = panel(True)
    box.hold(True)
    passed = box.passed_on

    def show(text: str) -> None:
        for label in (plain_text, boxed_text):
            label.setText(text)
        for _ in range(3):
            QApplication.processEvents()
        assert boxed_text.size() == plain_text.size(), text
        assert boxed_text.mapTo(boxed, QPoint(0, 0)) == plain_text.mapTo(plain, QPoint(0, 0))

    one_line = ["OK \u2014 governing: bending in flitch plate, D + L, ratio 0.812",
                "OK \u2014 short", "NOT OK \u2014 governing: splitting in left 2x10, D + L"]
    widths = set()
    for text in one_line:
        show(text)
        widths.add(boxed_text.sizeHint().width())
    assert len(widths) == len(one_line)  # each text asks for another width ...
    assert box.passed_on == passed  # ... and none of them is passed on
    show("NOT OK \u2014 governing: splitting\n  not checked: one")  # a second line
    assert box.passed_on == passed + 1
    box.hold(False)
    for _ in range(3):
        QApplication.processEvents()
    assert boxed_text.size() == plain_text.size()


def test_after_a_drag_the_results_are_laid_out_as_in_a_fresh_window(window, qtbot):
    settle(qtbot, window)
    passed = window.results.verdict_box.passed_on
    drag_top_edge(qtbot, window, steps=32)
    fresh = fresh_window(qtbot, window)
    fresh.canvas.select(window.canvas.selected)
    settle(qtbot, fresh)
    for name in ("verdict", "error", "tabs", "caution", "fire", "checks"):
        a, b = getattr(window.results, name), getattr(fresh.results, name)
        assert (a.geometry(), a.mapTo(window, QPoint(0, 0))) == (
            b.geometry(), b.mapTo(fresh, QPoint(0, 0))), name
    assert window.results.verdict.text() == fresh.results.verdict.text()
    assert window.results.verdict_box.passed_on >= passed


def test_the_labels_paint_the_same_with_the_paint_memo(window, qtbot):
    """One paint keeps the axes' outlines and the fonts in a memo: the anchors (in and
    outside the axes) and the pixels are those of each label made on its own.
    """
    from PySide6.QtGui import QImage, QPainter

    from plystack.app.plots import paint_text

    for tab, plot in enumerate((window.profiles, window.diagrams)):
        window.plot_tabs.setCurrentIndex(tab)
        settle(qtbot, window)
        labels = [a for a in plot.dynamic if painted_by_qt(a) and a.get_text()]
        assert len(labels) > 1
        memo: dict[object, object] = {}
        for a in labels:
            assert text_anchor(a, plot.figure, memo) == text_anchor(a, plot.figure)
        outside = next(a for a in labels if hasattr(a, "xy"))
        old = outside.xy
        x0, x1 = outside.axes.get_xlim()
        outside.xy = (x1 + 10 * (x1 - x0), old[1])
        assert text_anchor(outside, plot.figure, memo) is None
        assert text_anchor(outside, plot.figure) is None
        outside.xy = old
        images = []
        for memo_or_none in ({}, None):
            image = QImage(plot.size(), QImage.Format.Format_ARGB32_Premultiplied)
            image.fill(0)
            painter = QPainter(image)
            for a in labels:
                paint_text(painter, a, plot.figure, plot.device_pixel_ratio, memo_or_none)
            painter.end()
            images.append(image)
        assert images[0] == images[1]
        blank = QImage(plot.size(), QImage.Format.Format_ARGB32_Premultiplied)
        blank.fill(0)
        assert images[0] != blank


# --- what the views keep from one step to the next ------------------------------------------


def _pen(p) -> tuple[object, ...]:
    return (p.color().rgba(), p.widthF(), p.style(), p.isCosmetic(), p.capStyle(),
            p.joinStyle())


def _brush(b) -> tuple[object, ...]:
    return (b.color().rgba(), b.style())


def item_state(item) -> tuple[object, ...]:
    """Everything a scene item shows (exact floats): kind, place, stacking, visibility,
    tooltip, data, transform, and its own geometry, pen, brush, text and font.
    """
    from PySide6.QtWidgets import (
        QAbstractGraphicsShapeItem,
        QGraphicsEllipseItem,
        QGraphicsLineItem,
        QGraphicsPathItem,
        QGraphicsPolygonItem,
        QGraphicsRectItem,
        QGraphicsSimpleTextItem,
    )

    t = item.transform()
    state: list[object] = [type(item).__name__, item.pos().x(), item.pos().y(), item.zValue(),
                           item.isVisible(), item.toolTip(), item.data(0), item.data(1),
                           (t.m11(), t.m12(), t.m21(), t.m22(), t.dx(), t.dy()),
                           int(item.flags().value)]
    if isinstance(item, QAbstractGraphicsShapeItem):
        state += [_pen(item.pen()), _brush(item.brush())]
    if isinstance(item, QGraphicsRectItem | QGraphicsEllipseItem):
        r = item.rect()
        state.append((r.x(), r.y(), r.width(), r.height()))
    if isinstance(item, QGraphicsPathItem):
        path = item.path()
        state.append((path.fillRule(), [(e.x, e.y, e.type) for e in
                                        (path.elementAt(k) for k in range(path.elementCount()))]))
    if isinstance(item, QGraphicsPolygonItem):
        state.append([(p.x(), p.y()) for p in item.polygon()])
    if isinstance(item, QGraphicsLineItem):
        line = item.line()
        state += [_pen(item.pen()), (line.x1(), line.y1(), line.x2(), line.y2())]
    if isinstance(item, QGraphicsSimpleTextItem):
        state += [item.text(), item.font().toString()]
    return tuple(state)


def scene_state(view) -> list[tuple[object, ...]]:
    """Every item of a view's scene in stacking order."""
    return [item_state(it) for it in view.scene().items(Qt.SortOrder.AscendingOrder)]


def cell_state(table: QTableWidget) -> list[list[tuple[object, ...]]]:
    """Every cell: text, value (a float by its bits), text colour and tooltip."""
    def value(v: object) -> object:
        return float.hex(v) if isinstance(v, float) else v

    return [[(it.text(), value(it.data(Qt.ItemDataRole.UserRole)),
              it.foreground().color().rgba(), it.foreground().style(), it.toolTip())
             if (it := table.item(r, c)) is not None else None
             for c in range(table.columnCount())] for r in range(table.rowCount())]


def redrawn_in_full(window) -> None:
    """Forget what the views kept from the last step and draw them again from the model
    (every item set as on a first drawing).
    """
    window.canvas._ply_drawn.clear()
    window.canvas.rebuild()
    window.elevation.drawing._drawn.clear()
    window.elevation.drawing._member_drawn.clear()
    window.elevation.refresh()


def fresh_checks(window) -> list[list[tuple[object, ...]]]:
    """The checks table of a new results panel given the window's analysis."""
    from plystack.app.results import ResultsPanel

    panel = ResultsPanel(window.settings)
    panel.show_analysis(window.analysis_model.analysis)
    state = cell_state(panel.checks)
    panel.deleteLater()
    return state


@pytest.mark.parametrize("gesture", ["resize", "move"])
def test_during_a_drag_the_views_hold_what_a_full_redraw_makes(window, qtbot, gesture):
    """The canvas, the elevation and the checks table keep what did not change from one
    step to the next; after every step of a real drag (the plate's top edge up and down,
    or the plate moved sideways into a timber, which clips the timber) each holds exactly
    what drawing it from nothing makes (every item's geometry, pen, brush, text, tooltip;
    every cell's text, value, colour and tooltip), and the steps did pass over unchanged
    parts.
    """
    settle(qtbot, window)
    select_plate(window)
    settle(qtbot, window)
    vp = window.canvas.viewport()
    c = window.canvas
    plate = window.document.project.plies[1]
    at = top_edge(window) if gesture == "resize" else c.mapFromScene(QPointF(  # off the handles
        (plate.x + plate.width / 2) * 1000, -(plate.y + plate.height * 0.3) * 1000))
    px_per_mm = c.transform().m11()
    drawing = window.elevation.drawing
    cells = window.results._check_cells
    put = plies = loads = 0  # what the steps set again, full redraws apart
    clipped = 0  # steps where the left timber was cut by the plate
    QTest.mousePress(vp, LEFT, NONE, at)
    steps = 20
    for k in range(1, steps + 1):
        before = (cells.cells_put, window.canvas.plies_drawn, drawing.parts_drawn["loads"])
        swing = math.sin(k / 3)
        QTest.mouseMove(vp, at + (QPoint(0, -round(60 * swing) - 12) if gesture == "resize"
                                  else QPoint(-round(abs(swing) * 30 * px_per_mm) - 8, 0)))
        if window.analysis_model._timer.isActive():
            window.analysis_model.recompute()
        QApplication.processEvents()
        put += cells.cells_put - before[0]
        plies += window.canvas.plies_drawn - before[1]
        loads += drawing.parts_drawn["loads"] - before[2]
        kept = (scene_state(window.canvas), scene_state(window.elevation),
                cell_state(window.results.checks))
        assert kept[2] == fresh_checks(window), k
        redrawn_in_full(window)
        assert kept[:2] == (scene_state(window.canvas), scene_state(window.elevation)), k
        section = window.canvas.section
        clipped += section is not None and not section.is_unclipped(0)
    assert clipped > 0 if gesture == "move" else clipped == 0  # the plate cut the timber
    QTest.mouseRelease(vp, LEFT, NONE, at)
    settle(qtbot, window)
    assert 0 < put < steps * window.results.checks.rowCount() * 7  # some cells held
    assert 0 < plies < steps * len(window.document.project.plies)  # the timbers held
    assert loads < steps  # the loads held (drawn again only where the frame changed)


def test_dragging_a_ply_end_keeps_the_elevation_what_a_full_redraw_makes(qtbot, tmp_path):
    """A drag of a bar's end on the elevation (real mouse events on its viewport): after
    every step the elevation holds what drawing it from nothing makes.
    """
    import json
    from pathlib import Path

    from plystack.app.main_window import MainWindow
    from plystack.core.io.project_file import load

    demo = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"
    data = json.loads(demo.read_text(encoding="utf-8"))
    data["plies"][1].update({"from": "1 ft", "to": "11 ft"})
    path = tmp_path / "short.plystack.json"
    path.write_text(json.dumps(data), encoding="utf-8")
    w = MainWindow(load(path), None)
    w.ask = lambda *a, **k: None
    qtbot.addWidget(w)
    w.resize(1400, 950)
    w.show()
    qtbot.waitExposed(w)
    settle(qtbot, w)
    before = w.document.project
    view = w.elevation
    f = view.frame
    top, bottom = f.lane(1)
    at = view.mapFromScene(QPointF(f.x_px(w.document.project.plies[1].end), (top + bottom) / 2))
    vp = view.viewport()
    QTest.mousePress(vp, LEFT, NONE, at)
    for k in range(1, 16):
        QTest.mouseMove(vp, at + QPoint(round(-90 * math.sin(k / 3)), 0))
        if w.analysis_model._timer.isActive():
            w.analysis_model.recompute()
        QApplication.processEvents()
        kept = scene_state(view)
        redrawn_in_full(w)
        assert kept == scene_state(view), k
    QTest.mouseRelease(vp, LEFT, NONE, at)
    settle(qtbot, w)
    assert w.document.project.plies[1].end != before.plies[1].end  # the end moved
    assert view.drawing.parts_drawn["lanes"] > 1  # the bars followed the drag


def test_clicking_another_ply_draws_both_outlines_as_a_full_redraw(window, qtbot):
    """The outline of the ply that loses the selection is drawn again although the ply
    did not change (real clicks on the canvas's viewport).
    """
    settle(qtbot, window)
    c = window.canvas
    for index in (1, 0, 2, 1):
        ply = window.document.project.plies[index]
        QTest.mouseClick(c.viewport(), LEFT, NONE, c.mapFromScene(QPointF(
            (ply.x + ply.width / 2) * 1000, -(ply.y + ply.height * 0.3) * 1000)))
        settle(qtbot, window)
        assert c.selected == index
        kept = scene_state(c)
        redrawn_in_full(window)
        assert kept == scene_state(c), index


def test_a_cell_takes_a_value_of_another_type_or_the_next_float(qtbot):
    """The cells remembered compare values by type and to the bit: 2.5 then the next
    float, None, a text, None, another float, with the same text, each reach the item
    (Qt's own comparison takes 3.0 and "3.0" for the same, so the test keeps clear of it).
    """
    from plystack.app.results import ShownCells

    table = QTableWidget(0, 2)
    qtbot.addWidget(table)
    cells = ShownCells(table)
    cells.shape(1)
    role = Qt.ItemDataRole.UserRole
    for value in (2.5, 2.5000000000000004, None, "a place", None, 3.0):
        cells.put(0, 0, "same text", value)
        got = table.item(0, 0).data(role)
        assert (type(got), got) == (type(value), value)
    put = cells.cells_put
    cells.put(0, 0, "same text", 3.0)
    assert cells.cells_put == put  # the same text and value: Qt is not asked
    cells.shape(0)
    cells.shape(1)  # the row went and came back: its cell is made again
    cells.put(0, 0, "same text", 3.0)
    assert (table.item(0, 0).text(), table.item(0, 0).data(role)) == ("same text", 3.0)


@pytest.mark.parametrize("ratio", [0.0, -0.0, 0.5, 0.95, 1.0, 1.5, math.inf, math.nan,
                                   np.float64(0.7), np.float64(math.nan)])
def test_the_verdict_finds_incomplete_checks_as_the_verdict_text_does(ratio):
    """The overall verdict looks for a ratio that is not a number directly: the same
    answer as asking each check's verdict text for INCOMPLETE.
    """
    from plystack.app.results import verdict_of

    for ok in (True, False):
        assert math.isnan(ratio) == (verdict_of(float(ratio), ok, 0.9) == "INCOMPLETE")
