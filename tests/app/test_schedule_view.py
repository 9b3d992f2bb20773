"""File > Open schedule: the table of members, sorting, colours, and a double-click that
opens a member as an untitled project (real mouse events on the view)."""

from __future__ import annotations

from pathlib import Path

from PySide6.QtCore import QPoint, Qt
from PySide6.QtTest import QTest

from plystack.app.schedule_view import COLUMNS, FAILING, INCOMPLETE_BACKGROUND, open_schedule

SCHEDULE = Path(__file__).resolve().parents[2] / "assets" / "demo" / "renovation-schedule.csv"


def _column(name: str) -> int:
    return [h for h, _k in COLUMNS].index(name)


def _texts(view, name: str) -> list[str]:
    c = _column(name)
    return [view.model.item(r, c).text() for r in range(view.model.rowCount())]


def test_menu_has_open_schedule(window):
    file_menu = window.menuBar().actions()[0].menu()
    assert any(a.text().replace("&", "") == "Open schedule\u2026" for a in file_menu.actions())


def test_schedule_table_sorts_colours_and_opens_a_member(window, qtbot):
    view = open_schedule(window, SCHEDULE)
    assert view is not None
    qtbot.addWidget(view)
    qtbot.waitExposed(view)
    assert view.model.rowCount() == 12
    verdicts = dict(zip(_texts(view, "Mark"), _texts(view, "Verdict"), strict=True))
    assert verdicts["H-5"] == "NOT OK" and verdicts["T-4"] == "NOT OK"
    assert verdicts["H-1"] == "OK"
    for r in range(view.model.rowCount()):
        item = view.model.item(r, 0)
        colour = item.background().color() if item.background().style() != Qt.NoBrush else None
        verdict = view.model.item(r, _column("Verdict")).text()
        assert (colour == FAILING) == (verdict == "NOT OK")
        assert (colour == INCOMPLETE_BACKGROUND) == (verdict == "INCOMPLETE")
    # click the header of the ratio column: sorted by the number, not the text
    header = view.table.horizontalHeader()
    c = _column("Ratio")
    x = header.sectionViewportPosition(c) + header.sectionSize(c) // 2
    QTest.mouseClick(header.viewport(), Qt.MouseButton.LeftButton,
                     pos=QPoint(x, header.height() // 2))
    ratios = [float(t) for t in _texts(view, "Ratio")]
    assert ratios in (sorted(ratios), sorted(ratios, reverse=True))
    assert _texts(view, "Mark") != sorted(_texts(view, "Mark"))  # no longer in row order
    # double-click the row of T-2: the main window shows that member, untitled
    row = _texts(view, "Mark").index("T-2")
    rect = view.table.visualRect(view.model.index(row, _column("Mark")))
    # a real double-click: press and release, then the second press as a double-click
    QTest.mouseClick(view.table.viewport(), Qt.MouseButton.LeftButton, pos=rect.center())
    QTest.mouseDClick(view.table.viewport(), Qt.MouseButton.LeftButton, pos=rect.center())
    project = window.document.project
    assert window.document.path is None
    assert project.info["member"] == "T-2"
    assert project.beam.layout.spans == (4.2,)
    assert project.display_units == "SI"
