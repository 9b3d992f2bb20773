"""The connector of stacked plies in the beam panel, driven with real key and mouse events
(pytest-qt, offscreen): every edit is one undo step, bad entries are refused in place with
the field named, and a diameter brings the slip of the fasteners into the analysis.

The slip is checked against a hand calculation of EN 1995-1-1:2004 Annex B (B.1)-(B.6)
with the slip modulus of Table 7.1 (from memory), in N and mm: a web of C24 50 x 200 mm
with a flange of C24 100 x 40 mm on top, screws d = 6 mm at s = 100 mm, one per station,
simply supported span l = 4000 mm. EN 338 C24 (from memory): E_0,mean = 11000 N/mm^2,
rho_mean = 420 kg/m^3. K_ser = rho_m^1.5 d / 23 = 420^1.5 x 6 / 23 = 2245.41878 N/mm.
"""

from __future__ import annotations

import json
import math
from pathlib import Path

import pytest
from PySide6.QtCore import QPoint, Qt
from PySide6.QtWidgets import QApplication, QTabWidget

from plystack.core.io.output import check_json
from plystack.core.model.design import Connector
from plystack.core.section.gamma import PartialSection

E = 11000.0                      # N/mm^2, both plies
K_SER = 420**1.5 * 6 / 23        # N/mm, Table 7.1 screws, timber to timber
L, S = 4000.0, 100.0             # mm


def stacked_project(tmp_path: Path, connector: dict) -> Path:
    """Two timbers stacked (a 100 x 40 mm flange on a 50 x 200 mm web), on a 4 m span."""
    data = {
        "format": "plystack", "version": 1, "title": "stacked", "display_units": "SI",
        "plies": [{"name": "web", "material": "C24", "x": "25 mm", "y": "0 mm",
                   "width": "50 mm", "height": "200 mm"},
                  {"name": "flange", "material": "C24", "x": "0 mm", "y": "200 mm",
                   "width": "100 mm", "height": "40 mm"}],
        "beam": {"spans": ["4 m"], "supports": "simple", "self_weight": False,
                 "loads": [{"case": "D", "type": "line", "value": "1 kN/m"},
                           {"case": "L", "type": "line", "value": "2 kN/m"}],
                 "combinations": "EN1990"},
        "design": {"basis": "EU-LSD", "service_class": 1, "connector": connector}}
    path = tmp_path / "stacked.plystack.json"
    path.write_text(json.dumps(data), encoding="utf-8")
    return path


SCREWS = {"type": "screw", "allowable": "2.6 kN", "rows": 1, "spacing": "100 mm"}


@pytest.fixture
def panel(window, qtbot, tmp_path):
    """The beam panel, shown, on the stacked project opened from its file."""
    assert window.open_path(stacked_project(tmp_path, SCREWS))
    tabs = next(t for t in window.findChildren(QTabWidget)
                if t.indexOf(window.beam_panel) >= 0)
    tabs.setCurrentWidget(window.beam_panel)
    qtbot.waitExposed(window.beam_panel)
    return window.beam_panel


def type_into(qtbot, edit, text: str) -> None:
    """Replace the field's text by typing, then Enter."""
    edit.setFocus()
    qtbot.keyClick(edit, Qt.Key.Key_A, Qt.KeyboardModifier.ControlModifier)
    qtbot.keyClick(edit, Qt.Key.Key_Delete)
    qtbot.keyClicks(edit, text)
    qtbot.keyClick(edit, Qt.Key.Key_Return)


def connector(window) -> Connector:
    return window.document.project.design.connector


def annex_b_EI() -> float:
    """(EI)_ef with K_ser of the flange on the web, N mm^2 (EN 1995-1-1 Annex B)."""
    A1, I1, h1 = 100 * 40.0, 100 * 40.0**3 / 12, 40.0
    A2, I2, h2 = 50 * 200.0, 50 * 200.0**3 / 12, 200.0
    g1 = 1 / (1 + math.pi**2 * E * A1 * S / (K_SER * L**2))               # (B.5)
    a2 = g1 * E * A1 * (h1 + h2) / (2 * (g1 * E * A1 + E * A2))           # (B.6)
    a1 = (h1 + h2) / 2 - a2
    return E * I1 + E * I2 + g1 * E * A1 * a1**2 + E * A2 * a2**2         # (B.1)


def test_opening_the_file_shows_its_connector(window, panel):
    assert connector(window) == Connector("screw", 2600.0, 1, 0.1)
    assert panel.connector_type.currentText() == "screw"
    assert panel.connector_spacing.text() == "100 mm"
    assert panel.connector_diameter.text() == panel.connector_spacing_max.text() == ""
    assert panel.connector_rows.value() == 1
    assert not panel.connector_predrilled.isEnabled()


def test_typing_a_diameter_brings_the_slip_into_the_analysis(window, panel, qtbot):
    window.recompute()
    assert not isinstance(window.analysis.section, PartialSection)
    before = window.document.project
    type_into(qtbot, panel.connector_diameter, "6 mm")
    c = connector(window)
    assert c == Connector("screw", 2600.0, 1, 0.1, c.diameter)
    assert c.diameter == pytest.approx(0.006, rel=1e-15)
    window.recompute()
    sec = window.analysis.section
    assert isinstance(sec, PartialSection)
    assert annex_b_EI() / 1e6 == pytest.approx(615408.6, rel=1e-6)  # the hand value
    assert sec.EI == pytest.approx(annex_b_EI() * 1e-6, rel=1e-12)  # N mm^2 -> N m^2
    assert check_json(window.analysis)["section"]["EI_effective"] == sec.EI
    # one undo step restores the project; redo shows the diameter again
    window.document.undo_stack.undo()
    assert window.document.project == before
    assert panel.connector_diameter.text() == ""
    window.document.undo_stack.redo()
    assert connector(window) == c
    assert panel.connector_diameter.text() == "6 mm"
    # emptying the field takes the diameter away (full composite action again)
    type_into(qtbot, panel.connector_diameter, "")
    assert connector(window) == Connector("screw", 2600.0, 1, 0.1)


def test_bad_largest_spacing_is_refused_with_its_field_named(window, panel, qtbot):
    before = window.document.project
    steps = window.document.undo_stack.count()
    type_into(qtbot, panel.connector_spacing_max, "450 mm")      # more than 4 x 100 mm
    assert window.document.project == before
    assert window.document.undo_stack.count() == steps
    message = panel.error.text()
    assert message.startswith("design.connector.spacing_max: ") and "4 times" in message
    assert panel.connector_spacing_max.error_text == message
    assert panel.connector_spacing_max.text() == "450 mm"          # kept, to correct
    type_into(qtbot, panel.connector_spacing_max, "400 mm")        # exactly 4 x: allowed
    assert connector(window).spacing_max == pytest.approx(0.4, rel=1e-15)
    assert panel.connector_spacing_max.error_text == "" and panel.error.text() == ""
    # a smaller spacing that would leave the largest above 4 times it is refused too
    type_into(qtbot, panel.connector_spacing, "90 mm")
    assert connector(window).spacing == 0.1
    assert "design.connector.spacing_max" in panel.connector_spacing.error_text


@pytest.mark.parametrize(("text", "words"), [
    ("6 kg", "connector diameter"),
    ("-6 mm", "connector diameter: must be greater than zero"),
    ("40 mm", "design.connector.diameter: 40 mm is larger than a dowel-type fastener"),
])
def test_bad_diameter_marked_in_place(window, panel, qtbot, text, words):
    before = window.document.project
    type_into(qtbot, panel.connector_diameter, text)
    assert window.document.project == before
    assert words in panel.connector_diameter.error_text
    assert "Error" not in panel.error.text() and "float" not in panel.error.text()


def test_type_rows_and_predrilled(window, panel, qtbot):
    combo = panel.connector_type
    combo.setFocus()
    qtbot.keyClicks(combo, "n")                                  # the only type with "n"
    assert combo.currentText() == "nail" and connector(window).type == "nail"
    assert panel.connector_predrilled.isEnabled()
    box = panel.connector_predrilled                              # click on its indicator
    qtbot.mouseClick(box, Qt.MouseButton.LeftButton, pos=QPoint(8, box.height() // 2))
    assert connector(window).predrilled
    type_into(qtbot, panel.connector_diameter, "3.1 mm")
    type_into(qtbot, panel.connector_rows.lineEdit(), "3")
    c = connector(window)
    assert c == Connector("nail", 2600.0, 3, 0.1, c.diameter, True)
    assert c.diameter == pytest.approx(0.0031, rel=1e-15)     # 3.1 mm read in SI
    nails = window.document.project
    # glue: the diameter and predrilling do not apply and go in the same step
    qtbot.wait(QApplication.keyboardInputInterval() + 50)      # a new search, not "ng"
    combo.setFocus()
    qtbot.keyClicks(combo, "g")
    assert connector(window) == Connector("glue", 2600.0, 3, 0.1)
    assert not panel.connector_diameter.isEnabled()
    assert not panel.connector_predrilled.isEnabled()
    window.document.undo_stack.undo()
    assert window.document.project == nails
    assert combo.currentText() == "nail" and panel.connector_predrilled.isChecked()
    assert panel.connector_diameter.text() == "3.1 mm"
    window.document.undo_stack.undo()                             # the rows, one step
    assert connector(window).rows == 1 and panel.connector_rows.value() == 1
