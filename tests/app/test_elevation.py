"""The member's elevation, driven with real mouse events on its viewport.

Expected values are hand calculations written out beside each test: the pointer's travel
in pixels times the member's length over the drawn width, rounded to the snap step of
1/16 in (DEVELOPERS.md, GUI choices); the segments a ply's "from"/"to" cut (the input
file); the bolt stations of a plate by the placing rule of core/design/bolt_layout.py
(``placed_stations``, written out by hand); the end distance of NDS 2018 Table 12.5.1A
(from memory: 2 D minimum for loading perpendicular to grain).
"""

from __future__ import annotations

import json
import math
from dataclasses import replace
from pathlib import Path

import pytest
from PySide6.QtCore import QEvent, QPoint, QPointF, Qt
from PySide6.QtGui import QMouseEvent
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QApplication, QGraphicsPathItem

from plystack.app.elevation_items import pen
from plystack.app.elevation_model import (
    concerned_bolts,
    dragged_extent,
    notch_span,
    plate_bolts,
    segment_at,
)
from plystack.core.design.bolt_layout import BoltLayout
from plystack.core.design.check import Check
from plystack.core.model.member import BeamLayout
from plystack.core.model.openings import Notch
from plystack.core.model.plies import Ply
from plystack.core.section.segments import Segment

IN = 0.0254
FT = 12 * IN
LEFT = Qt.MouseButton.LeftButton
NONE = Qt.KeyboardModifier.NoModifier
DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"


def snap_sixteenth(v: float) -> float:
    """Hand rule: the nearest 1/16 in."""
    return round(v / IN * 16) / 16 * IN


def project_file(tmp_path: Path, plate: dict | None = None, bolt: dict | None = None,
                 openings: bool = True) -> Path:
    data = json.loads(DEMO.read_text(encoding="utf-8"))
    data["plies"][1].update(plate if plate is not None else {"from": "1 ft", "to": "11 ft"})
    if openings:
        data["beam"]["notches"] = [{"at": "support 1", "face": "bottom", "depth": "1 in",
                                    "length": "3 in"}]
        data["beam"]["holes"] = [{"at": "6 ft", "y": "4 5/8 in", "diameter": "1 in"}]
    if bolt:
        data["design"]["bolt"].update(bolt)
    path = tmp_path / "member.plystack.json"
    path.write_text(json.dumps(data), encoding="utf-8")
    return path


def open_window(qtbot, path: Path):
    from plystack.app.main_window import MainWindow
    from plystack.core.io.project_file import load

    w = MainWindow(load(path), None)
    w.ask = lambda *a, **k: None
    qtbot.addWidget(w)
    w.resize(1400, 950)
    w.show()
    qtbot.waitExposed(w)
    w.recompute()
    w.elevation.refresh()
    return w


@pytest.fixture
def short_plate(qtbot, tmp_path):
    """The demo with its plate from 1 ft to 11 ft, a notch at support 1 and a hole."""
    return open_window(qtbot, project_file(tmp_path))


def view_point(view, x_px: float, y_px: float) -> QPoint:
    return view.mapFromScene(QPointF(x_px, y_px))


def lane_mid(frame, i: int) -> float:
    top, bottom = frame.lane(i)
    return (top + bottom) / 2


def drag(view, start: QPoint, path: list[QPoint]) -> None:
    vp = view.viewport()
    QTest.mousePress(vp, LEFT, NONE, start)
    for p in path:
        QTest.mouseMove(vp, p)
    QTest.mouseRelease(vp, LEFT, NONE, path[-1] if path else start)


def canvas_plies(window) -> set[int]:
    """The plies the section canvas draws (the outlines carry their index)."""
    return {int(it.data(0)) for it in window.canvas.scene().items()
            if isinstance(it, QGraphicsPathItem) and it.data(0) is not None}


# --- dragging a ply's end -----------------------------------------------------------------


@pytest.mark.parametrize("travel_px", [37, 52, -61, -140])
def test_dragging_the_plate_end_moves_its_to_by_the_travel_snapped(short_plate, travel_px):
    w = short_plate
    view, doc = w.elevation, w.document
    f = view.frame
    before = doc.project
    at = view_point(view, f.x_px(11 * FT), lane_mid(f, 1))
    d = QApplication.startDragDistance()
    path = [at + QPoint(int(math.copysign(d + 1, travel_px)), 0),
            at + QPoint(travel_px // 2, 1), at + QPoint(travel_px, 0)]
    drag(view, at, path)
    # hand: scene pixels are view pixels, so the travel is travel_px * L / width
    travel_m = (view.mapToScene(path[-1]).x() - view.mapToScene(at).x()) * f.length / f.width
    expected = snap_sixteenth(11 * FT + travel_m)
    plate = doc.project.plies[1]
    assert plate.end == pytest.approx(expected, abs=1e-12)
    assert plate.start == before.plies[1].start  # the other end stays
    assert doc.undo_stack.count() == 1  # one undo step for the whole drag
    # the bar's end is under the pointer (within half a snap step and a pixel's rounding)
    bar = view.drawing.bars.items[1].rect()
    half_step_px = IN / 32 / f.length * f.width
    assert abs(bar.right() - view.mapToScene(path[-1]).x()) <= half_step_px + 1.0
    doc.undo_stack.undo()
    assert doc.project == before


def test_dragging_the_start_moves_from_and_shift_turns_snapping_off(short_plate):
    w = short_plate
    view, doc = w.elevation, w.document
    f = view.frame
    at = view_point(view, f.x_px(1 * FT), lane_mid(f, 1))
    vp = view.viewport()
    shift = Qt.KeyboardModifier.ShiftModifier
    QTest.mousePress(vp, LEFT, NONE, at)
    QTest.mouseMove(vp, at + QPoint(10, 0))
    end = at + QPoint(23, 0)
    QTest.mouseRelease(vp, LEFT, shift, end)
    travel_m = (view.mapToScene(end).x() - view.mapToScene(at).x()) * f.length / f.width
    # hand: pressed on the start; with Shift held at the release the value is not rounded
    # (the press point is the pixel nearest 1 ft, so it is offset from 1 ft by the pixel's
    # rounding, which the end's travel keeps)
    assert doc.project.plies[1].start == pytest.approx(1 * FT + travel_m, abs=1e-12)
    assert doc.project.plies[1].end == 11 * FT
    assert doc.undo_stack.count() == 1


def test_an_end_dragged_to_the_member_end_means_the_whole_member(short_plate):
    w = short_plate
    view, doc = w.elevation, w.document
    f = view.frame
    at = view_point(view, f.x_px(11 * FT), lane_mid(f, 1))
    far = view_point(view, f.x_px(12 * FT) + 30, lane_mid(f, 1))
    drag(view, at, [at + QPoint(8, 0), far])
    assert doc.project.plies[1].end is None  # "to" left out: the whole member
    at = view_point(view, f.x_px(1 * FT), lane_mid(f, 1))
    drag(view, at, [at - QPoint(8, 0), view_point(view, f.x_px(0.0) - 20, lane_mid(f, 1))])
    plate = doc.project.plies[1]
    assert plate.start is None and plate.end is None
    assert plate.covers_whole(f.length)
    assert doc.undo_stack.count() == 2
    doc.undo_stack.undo()
    doc.undo_stack.undo()
    assert doc.project.plies[1].start == 1 * FT and doc.project.plies[1].end == 11 * FT


def test_a_tiny_move_below_the_drag_distance_only_selects_the_station(short_plate):
    w = short_plate
    view, doc = w.elevation, w.document
    f = view.frame
    before = doc.project
    d = QApplication.startDragDistance()
    assert d > 2
    at = view_point(view, f.x_px(11 * FT), lane_mid(f, 1))
    drag(view, at, [at + QPoint(1, 0), at + QPoint(d - 1, 0)])
    assert doc.project == before and doc.undo_stack.count() == 0
    assert w.analysis_model.station == pytest.approx(f.x_m(view.mapToScene(at).x()), abs=1e-12)


# --- stations -----------------------------------------------------------------------------


def test_a_click_shows_the_segment_at_the_station_and_again_the_full_section(short_plate,
                                                                             qtbot):
    w = short_plate
    view = w.elevation
    f = view.frame
    assert canvas_plies(w) == {0, 1, 2}
    at = view_point(view, f.x_px(0.5 * FT), f.member_top + f.member_height / 2)
    drag(view, at, [])
    # hand: the plate runs from 1 ft to 11 ft, so from 0 to 1 ft only the two 2x10s act
    assert w.analysis_model.shown_plies() == (0, 2)
    assert canvas_plies(w) == {0, 2}
    caption = w.section_caption.text()
    assert "from 0 ft to 1 ft" in caption and "left 2x10, right 2x10" in caption
    assert w.profiles.kinds == ("timber",)  # no steel panel: the plate is not there
    section = w.analysis_model.shown_section()
    assert section is not None and [p.name for p in section.plies] == ["left 2x10",
                                                                       "right 2x10"]
    # the station's marker stands at the click
    assert w.elevation.marker.isVisible()
    assert abs(w.elevation.marker.line().x1() - view.mapToScene(at).x()) <= 1e-9
    drag(view, at, [])  # the same place again: the full section
    assert w.analysis_model.station is None
    assert canvas_plies(w) == {0, 1, 2}
    assert w.profiles.kinds == ("timber", "steel")
    assert "every ply" in w.section_caption.text()


def test_escape_returns_to_the_full_section_and_the_middle_shows_the_plate(short_plate):
    w = short_plate
    view = w.elevation
    f = view.frame
    at = view_point(view, f.x_px(6 * FT), f.member_top + 3)
    drag(view, at, [])
    # hand: 6 ft lies between 1 ft and 11 ft, where all three plies act
    assert w.analysis_model.shown_plies() == (0, 1, 2)
    assert "from 1 ft to 11 ft" in w.section_caption.text()
    QTest.keyClick(view, Qt.Key.Key_Escape)
    assert w.analysis_model.station is None
    assert w.analysis_model.shown_plies() is None


def test_a_member_whose_plies_all_run_its_length_keeps_the_full_section(window):
    view = window.elevation
    f = view.frame
    at = view_point(view, f.x_px(2 * FT), f.member_top + 3)
    drag(view, at, [])
    assert window.analysis_model.station is not None
    assert window.analysis_model.shown_plies() is None
    assert canvas_plies(window) == {0, 1, 2}
    assert window.profiles.kinds == ("timber", "steel")
    assert "every ply runs the whole member" in window.section_caption.text()


# --- bolts ----------------------------------------------------------------------------------


def _bolt_centres(view) -> list[tuple[float, float]]:
    f = view.frame
    return sorted((round(f.x_m(it.rect().center().x()) / IN, 6),
                   it.rect().center().y()) for it in view.drawing.bolt_items.items)


def test_the_bolts_drawn_are_the_bolts_of_the_layout(short_plate):
    w = short_plate
    view = w.elevation
    checks = [c for c in w.analysis.checks if c.id == "bolts"]
    assert checks and all(len(view.drawing.bolt_items.items) == c.fasteners.count
                          for c in checks)
    # hand, the placing rule: a 120 in plate at the 24 in stock spacing holds
    # max(2, floor(120 / 24)) = 5 stations, centred: the first at 12 + (120 - 4 x 24) / 2
    # = 24 in, then every 24 in; 2 rows each: 10 bolts
    xs = sorted({x for x, _y in _bolt_centres(view)})
    assert len(view.drawing.bolt_items.items) == 10
    assert xs == pytest.approx([24, 48, 72, 96, 120], abs=1e-6)
    assert not view.drawing.rings.items  # every geometry rule passes


def test_staggered_bolts_drawn_equal_the_layout_count(qtbot, tmp_path):
    path = project_file(tmp_path, plate={}, bolt={"rows": 3, "stagger": True,
                                                  "spacing": "16 in"}, openings=False)
    w = open_window(qtbot, path)
    counts = {c.fasteners.count for c in w.analysis.checks if c.id == "bolts"}
    # hand: a 144 in plate at 16 in: max(2, floor(144 / 16)) = 9 stations; staggered over
    # 3 rows, odd stations take rows 1 and 3, even ones row 2: 5 x 2 + 4 x 1 = 14 bolts
    assert counts == {14}
    assert len(w.elevation.drawing.bolt_items.items) == 14


def test_a_failing_end_distance_marks_its_bolts(qtbot, tmp_path):
    path = project_file(tmp_path, plate={}, openings=False,
                        bolt={"stations": ["1/2 in", "3 ft", "6 ft", "9 ft", "11 ft"]})
    w = open_window(qtbot, path)
    view = w.elevation
    end = next(c for c in w.analysis.checks if c.id == "bolt-end")
    # hand: NDS 2018 Table 12.5.1A (from memory): at least 2 D = 1 in for D = 1/2 in;
    # the first station is 1/2 in from the member's end
    assert end.demand == pytest.approx(2 * 0.5 * IN, abs=1e-12)
    assert end.capacity == pytest.approx(0.5 * IN, abs=1e-12) and not end.ok
    rings = view.drawing.rings.items
    assert len(rings) == 2  # the two bolts of the first station
    f = view.frame
    for ring in rings:
        assert f.x_m(ring.rect().center().x()) == pytest.approx(0.5 * IN, abs=1e-9)
        tip = ring.toolTip()
        assert "bolt-end" in tip and "required 1 in" in tip and "provided 0.5 in" in tip


def test_the_dimensions_name_the_end_distance_and_spacing(short_plate):
    texts = [label.text() for label in short_plate.elevation.drawing.dim_labels.items]
    # hand: stations at 24 .. 120 in on the plate from 12 in to 132 in: 12 in from each of
    # the plate's ends (the end distance the bolt-end rule measures), 24 in apart;
    # the rows 4 D = 2 in from the plate's shared height (1/4 in to 9 in) lie 2 1/4 in
    # inside the 2x10s' edges (0 and 9 1/4 in)
    assert texts.count("end 12 in") == 2 and "end 24 in" not in texts
    assert "spacing 24 in (5 stations, 10 bolts)" in texts
    assert texts.count("edge 2.25 in") == 2


def test_dragging_redraws_in_place(short_plate):
    w = short_plate
    view = w.elevation
    f = view.frame
    before = {id(it) for it in view.scene().items()}
    at = view_point(view, f.x_px(11 * FT), lane_mid(f, 1))
    drag(view, at, [at + QPoint(10, 0), at + QPoint(20, 0), at + QPoint(30, 0)])
    bars = view.drawing.bars.items
    assert {id(it) for it in bars} <= before  # the same bar items, moved


# --- the pure rules ---------------------------------------------------------------------------


def test_dragged_extent_keeps_the_ply_on_the_member_and_a_step_long():
    ply = Ply("p", "A36", 0, 0, 0.01, 0.2, 1.0, 3.0)
    step = 0.001
    # hand: each case by the rule in its docstring
    assert dragged_extent(ply, 4.0, "end", 3.5, step).end == 3.5
    assert dragged_extent(ply, 4.0, "end", 3.9995, step).end is None  # within a step of 4
    assert dragged_extent(ply, 4.0, "end", 3.999, step).end == 3.999  # a full step away
    assert dragged_extent(ply, 4.0, "end", 9.0, step).end is None
    assert dragged_extent(ply, 4.0, "end", 0.2, step).end == pytest.approx(1.001, abs=1e-15)
    assert dragged_extent(ply, 4.0, "start", 0.0004, step).start is None
    assert dragged_extent(ply, 4.0, "start", -2.0, step).start is None
    assert dragged_extent(ply, 4.0, "start", 3.5, step).start == pytest.approx(2.999,
                                                                                abs=1e-15)


def test_notch_span_and_segment_at():
    layout = BeamLayout((4.0,))
    # hand: at an end support the notch runs from the end into the span; elsewhere it is
    # centred on its position
    assert notch_span(Notch(0.0, "bottom", 0.02, 0.1, support=1), layout) == (0.0, 0.1)
    assert notch_span(Notch(4.0, "top", 0.02, 0.1, support=2), layout) == (3.9, 4.0)
    assert notch_span(Notch(2.0, "top", 0.02, 0.2), layout) == pytest.approx((1.9, 2.1),
                                                                             abs=1e-15)
    segs = (Segment(0.0, 1.0, (0,)), Segment(1.0, 4.0, (0, 1)))
    assert segment_at(segs, 0.5) is segs[0]
    assert segment_at(segs, 1.0) is segs[1]  # at a cut: the segment to its right
    assert segment_at(segs, 4.0) is segs[1]


def _rule(cid: str, location: str, required: float, provided: float,
          equation: str = "required <= provided") -> Check:
    return Check(id=cid, ply="plate", combination=None, demand=required, capacity=provided,
                 quantity="length", reference=("provided", provided), equation=equation,
                 location=location)


def test_concerned_bolts_of_each_rule():
    # two stations 0.1 and 0.3 m on a 1 m member, rows at 0.05 and 0.09 m
    lay = BoltLayout(0, (0.1, 0.3), (0.05, 0.09), ((0, 1), (0, 1)), 0.2, (0.0, 1.0), False)
    bolts = lay.bolts  # (0.1, 0.05), (0.1, 0.09), (0.3, 0.05), (0.3, 0.09)
    # hand: the end distance 0.1 m is the first station's
    assert concerned_bolts(_rule("bolt-end", "end distance", 0.2, 0.1), lay, 1.0, 0.03,
                           0.05) == {0, 1}
    # the top edge distance 0.03 m governs: the top row
    assert concerned_bolts(_rule("bolt-edge", "edge distance", 0.05, 0.03), lay, 1.0, 0.03,
                           0.05) == {1, 3}
    # the gap across the depth 0.04 m: both bolts of each station
    assert concerned_bolts(_rule("bolt-spacing", "spacing in a row (across the depth)",
                                 0.06, 0.04), lay, 1.0, 0.03, 0.05) == {0, 1, 2, 3}
    # the gap between stations 0.2 m
    assert concerned_bolts(_rule("bolt-spacing", "spacing between rows (stations)", 0.3,
                                 0.2), lay, 1.0, 0.03, 0.05) == {0, 1, 2, 3}
    # a spread: the outer rows
    assert concerned_bolts(_rule("bolt-spacing", "spread", 0.04, 0.03, "spread <= limit"),
                           lay, 1.0, 0.03, 0.05) == {0, 1, 2, 3}
    assert [bolts[b] for b in (0, 1)] == [(0.1, 0.05), (0.1, 0.09)]


def test_hovering_a_marked_bolt_names_the_rule_in_the_status_bar(qtbot, tmp_path):
    path = project_file(tmp_path, plate={}, openings=False,
                        bolt={"stations": ["1/2 in", "3 ft", "6 ft", "9 ft", "11 ft"]})
    w = open_window(qtbot, path)
    view = w.elevation
    ring = view.drawing.rings.items[0]
    at = QPointF(view.mapFromScene(ring.rect().center()))
    move = QMouseEvent(QEvent.Type.MouseMove, at, view.viewport().mapToGlobal(at),
                       Qt.MouseButton.NoButton, Qt.MouseButton.NoButton, NONE)
    with qtbot.waitSignal(view.status) as blocker:
        QApplication.sendEvent(view.viewport(), move)
    assert "bolt-end" in blocker.args[0] and "required 1 in" in blocker.args[0]


def test_supports_loads_and_openings_are_drawn_one_item_each(short_plate):
    d = short_plate.elevation.drawing
    beam = short_plate.document.project.beam
    # the demo: two pinned supports; area loads D and L as bands, one point load (D 300
    # lbf) as an arrow; one notch and one hole from the test file
    assert len(d.supports.items) == 2
    assert len(d.bands.items) == 2 and len(d.arrows.items) == 1
    labels = [label.text() for label in d.load_labels.items]
    # hand: 12 psf x 6 ft = 72 plf, 40 psf x 6 ft = 240 plf
    assert labels == ["D 72 plf", "L 240 plf", "D 300 lbf"]
    assert len(d.notches.items) == len(beam.notches) == 1
    assert len(d.holes.items) == len(beam.holes) == 1
    f = short_plate.elevation.frame
    hole = d.holes.items[0].rect()
    # hand: the hole's centre 6 ft along and 4 5/8 in up, 1 in across
    assert f.x_m(hole.center().x()) == pytest.approx(6 * FT, abs=1e-9)
    assert hole.width() == pytest.approx(1 * IN / f.length * f.width, abs=1e-9)


def test_the_hidden_plate_and_the_station_marker_are_dashed_one_pixel_wide(short_plate):
    # a dashed cosmetic pen wider than one pixel is stroked as an antialiased outline by
    # Qt's raster engine (several times slower: see elevation_items.pen); the demo's
    # plate (the second ply) is drawn hidden between its timbers, dashed
    view = short_plate.elevation
    plate = view.drawing.plies.items[1].pen()
    assert plate.style() == Qt.PenStyle.DashLine and plate.isCosmetic()
    assert plate.widthF() == 1.0
    assert view.marker.pen().style() == Qt.PenStyle.DashLine
    assert view.marker.pen().widthF() == 1.0
    assert pen(Qt.GlobalColor.black, 2.0, Qt.PenStyle.DotLine).widthF() == 1.0
    assert pen(Qt.GlobalColor.black, 2.0).widthF() == 2.0  # solid pens keep their width


def test_plies_that_leave_a_stretch_empty_draw_and_pick_without_a_crash(qtbot, tmp_path):
    data = json.loads(DEMO.read_text(encoding="utf-8"))
    for ply in data["plies"]:
        ply["from"] = "2 ft"  # nothing from 0 to 2 ft: the analysis names the problem
    path = tmp_path / "gap.plystack.json"
    path.write_text(json.dumps(data), encoding="utf-8")
    w = open_window(qtbot, path)
    assert w.analysis is None and "no ply runs" in (w.analysis_model.error or "")
    view = w.elevation
    f = view.frame
    assert len(view.drawing.bars.items) == 3 and not view.drawing.bolt_items.items
    drag(view, view_point(view, f.x_px(1 * FT), f.member_top + 3), [])
    assert w.analysis_model.station is not None
    assert w.analysis_model.shown_plies() is None  # no segment to show: every ply drawn
    assert canvas_plies(w) == {0, 1, 2}


def test_a_project_without_a_beam_draws_an_empty_elevation(qtbot):
    from plystack.app.main_window import MainWindow
    from plystack.core.io.project_file import load

    w = MainWindow(replace(load(DEMO), beam=None), None)
    qtbot.addWidget(w)
    w.show()
    qtbot.waitExposed(w)
    assert w.elevation.frame is None
    assert not w.elevation.drawing.bars.items
    QTest.mouseClick(w.elevation.viewport(), LEFT, NONE, QPoint(50, 50))
    assert w.analysis_model.station is None


def test_the_elevation_draws_the_layouts_the_analysis_carries():
    """No layout is placed again for the drawing: each plate's bolts are the very layout
    its checks used (``Analysis.layouts``), for the demo and for a plate stopping short."""
    from plystack.core.io.project_file import from_dict
    from plystack.core.pipeline import run

    data = json.loads(DEMO.read_text(encoding="utf-8"))
    data.pop("alternatives", None)
    for extent in ({}, {"from": "1 ft", "to": "11 ft"}):
        data["plies"][1].update(extent)
        a = run(from_dict(data))
        drawn = plate_bolts(a)
        assert len(drawn) == len(a.layouts) == 1
        assert drawn[0].layout is a.layouts[0].layout
        assert drawn[0].plate == a.layouts[0].ply == 1


def test_edge_labels_of_two_plates_do_not_cover_each_other(window, qtbot):
    """Two flitch plates with their stations at the same positions: their edge labels
    beside the first station were drawn one over the other."""
    from dataclasses import replace

    from plystack.core.model.plies import Ply

    p = window.document.project
    IN = 0.0254
    plies = (Ply("t1", "DFL-No2", 0.0, 0.0, 1.5 * IN, 9.25 * IN),
             Ply("pl1", "A36", 1.5 * IN, 0.25 * IN, 0.375 * IN, 8.75 * IN),
             Ply("t2", "DFL-No2", 1.875 * IN, 0.0, 1.5 * IN, 9.25 * IN),
             Ply("pl2", "A36", 3.375 * IN, 1.0 * IN, 0.375 * IN, 7.0 * IN),
             Ply("t3", "DFL-No2", 3.75 * IN, 0.0, 1.5 * IN, 9.25 * IN))
    window.document.apply(replace(p.with_plies(plies), alternatives=()), "two plates")
    window.elevation.refresh()
    qtbot.wait(50)
    edge = [item.sceneBoundingRect() for item in window.elevation.drawing.dim_labels.items
            if item.isVisible() and item.text_item.text().startswith("edge ")]
    assert len(edge) == 4
    assert not any(a.intersects(b) for k, a in enumerate(edge) for b in edge[k + 1:])
    # each plate's chain of end and spacing labels keeps to its own row: the second one's
    # was pushed right of the first one's, past the member's end
    ends = [item.sceneBoundingRect() for item in window.elevation.drawing.dim_labels.items
            if item.isVisible() and item.text_item.text().startswith("end ")]
    assert len(ends) == 4
    left = sorted(ends, key=lambda r: r.left())
    assert abs(left[0].left() - left[1].left()) < 60  # both first end labels at the left
    assert abs(left[2].right() - left[3].right()) < 60  # both last ones at the right
