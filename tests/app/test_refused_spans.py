"""A span typed into the Beam panel that the member cannot take is refused in place: the
field is marked, the message names the field in the project's units and says that the
results shown are still those of the spans as they were; the model does not change. Keys
are typed with real key events.
"""

from __future__ import annotations

from PySide6.QtCore import Qt
from PySide6.QtTest import QTest

from plystack.app.beam_panel import SPANS_TIP
from plystack.app.quantity import BAD_STYLE
from plystack.core.model import units

WAS = "Not applied: the results shown are for the spans 12.00 ft."


def _enter(edit, qtbot, text: str) -> None:
    """Type ``text`` into ``edit`` with real key events, replacing what it held, and Enter."""
    edit.setFocus()
    edit.selectAll()
    QTest.keyClicks(edit, text)
    QTest.keyClick(edit, Qt.Key.Key_Return)
    qtbot.wait(50)


def _type(window, qtbot, text: str) -> None:
    _enter(window.beam_panel.spans, qtbot, text)


def _show_beam_tab(window, qtbot) -> None:
    from PySide6.QtWidgets import QTabWidget

    tabs = window.beam_panel.parentWidget()
    while not isinstance(tabs, QTabWidget):
        tabs = tabs.parentWidget()
    tabs.setCurrentWidget(window.beam_panel)
    qtbot.wait(20)


def test_refused_spans_are_marked_and_leave_the_model(window, qtbot):
    panel = window.beam_panel
    _show_beam_tab(window, qtbot)
    before = window.document.project
    cases = [
        ("0 ft", "beam.spans[0]: must be greater than zero."),
        # the demo's point load stands at 6 ft: a 2 ft member cannot hold it (US units)
        ("2 ft", "beam.loads[2].at: is outside the member (0 to 2.000 ft)."),
        ("abc", 'beam.spans[0]: "abc" has no number; expected a length.'),
        ("12 ft, -3 ft", "beam.spans[1]: must be greater than zero."),
    ]
    for text, expected in cases:
        _type(window, qtbot, text)
        assert panel.error.text() == f"{expected} {WAS}", text
        assert panel.error.isVisible()  # above the scrolled fields, in view
        assert panel.error.mapTo(panel, panel.error.rect().topLeft()).y() < \
            panel.spans.mapTo(panel, panel.spans.rect().topLeft()).y()
        assert panel.spans.styleSheet() == BAD_STYLE
        assert panel.spans.toolTip() == panel.error.text()
        assert window.document.project == before
        assert panel.spans.text() == text  # kept to be corrected
    _type(window, qtbot, "14 ft")
    assert panel.error.text() == "" and not panel.error.isVisible()
    assert panel.spans.styleSheet() == ""
    assert panel.spans.toolTip() == SPANS_TIP
    assert window.document.project.beam.layout.spans == (units.parse("14 ft", "length", "x"),)
    window.document.undo_stack.undo()
    assert window.document.project == before


def test_refused_overhang_marks_its_field(window, qtbot):
    panel = window.beam_panel
    before = window.document.project
    edit = panel.over_left
    _enter(edit, qtbot, "-2 ft")
    assert edit.styleSheet() == BAD_STYLE
    assert window.document.project == before


def _refused_in(window, qtbot, field: str, text: str, message: str):
    """Type ``text`` into the beam panel's ``field``: marked, ``message`` shown, the
    model unchanged. Returns the field."""
    panel = window.beam_panel
    _show_beam_tab(window, qtbot)
    before = window.document.project
    edit = getattr(panel, field)
    _enter(edit, qtbot, text)
    assert edit.styleSheet() == BAD_STYLE
    assert panel.error.text() == message
    assert window.document.project == before
    return edit


def test_bolt_diameter_outside_the_equations_is_refused_as_the_file_does(window, qtbot):
    edit = _refused_in(window, qtbot, "bolt_diameter", "2 in",
                       "bolt diameter: 2 in is outside the bolt diameters the equations hold "
                       "for: 1/4 in to 1 in (NDS 2018 12.3, Table 12.3.1B)")
    _enter(edit, qtbot, "5/8 in")
    assert edit.styleSheet() == ""
    assert window.document.project.design.bolt.diameter == units.parse("5/8 in", "length", "x")


def test_bearing_longer_than_half_the_span_is_refused(window, qtbot):
    _refused_in(window, qtbot, "bearing", "10 ft",
                "bearing length: 120.0 in is longer than half the shortest span (72.00 in): "
                "the bearings would overlap the member")


def test_a_refused_limit_loses_its_mark_when_the_model_shows_again(window, qtbot):
    panel = window.beam_panel
    _show_beam_tab(window, qtbot)

    _enter(panel.live_limit, qtbot, "0")
    assert panel.live_limit.styleSheet() == BAD_STYLE
    assert panel.error.text().startswith("deflection limit live:")
    _enter(panel.bearing, qtbot, "4 in")  # another edit: the panel shows the model again
    assert panel.live_limit.text() == "360"
    assert panel.live_limit.styleSheet() == ""
    assert not panel.error.text().startswith("deflection limit live:")


def test_an_overhang_too_short_for_the_bearing_is_refused_as_the_file_does(window, qtbot):
    """The demo's 3 in bearings: an overhang of 1 in would leave the bearing centred on
    support 2 standing half an inch past the member's end."""
    panel = window.beam_panel
    _show_beam_tab(window, qtbot)
    before = window.document.project
    _enter(panel.over_right, qtbot, "1 in")
    assert panel.over_right.styleSheet() == BAD_STYLE
    assert "beam.bearing_length: 3.000 in centred on support 2 would run past the " \
        "member's end" in panel.error.text()
    assert window.document.project == before
    _enter(panel.over_right, qtbot, "2 in")  # half the bearing and more: taken
    assert panel.over_right.styleSheet() == ""
    assert window.document.project.beam.layout.overhang_right == units.parse(
        "2 in", "length", "x")
