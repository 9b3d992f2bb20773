"""The ply list: one row per ply (name, material, x, y, width, height), edited in place.

A cell edit is parsed like the unit-aware fields (a bare number is in the display unit);
a bad entry is refused, marked in its cell and named in ``error``, and changes nothing.
Selecting a row selects the ply on the canvas (``picked``).
"""

from __future__ import annotations

from dataclasses import replace

from PySide6.QtCore import Qt, Signal
from PySide6.QtGui import QColor
from PySide6.QtWidgets import QAbstractItemView, QHeaderView, QTableWidget, QTableWidgetItem

from plystack.app.document import Document
from plystack.app.quantity import parse_entry
from plystack.app.safe import guarded, plain_tip
from plystack.core.model import units

COLUMNS = ("Name", "Material", "x", "y", "Width", "Height")
KEYS = ("name", "material", "x", "y", "width", "height")


class PlyTable(QTableWidget):
    """Every ply of the project; edits go to the document as one undo step each."""

    picked = Signal(object)
    error = Signal(str)

    def __init__(self, document: Document):
        super().__init__(0, len(COLUMNS))
        self.document = document
        self.setHorizontalHeaderLabels(COLUMNS)
        self.verticalHeader().setVisible(False)
        self.setSelectionBehavior(QAbstractItemView.SelectionBehavior.SelectRows)
        self.setSelectionMode(QAbstractItemView.SelectionMode.SingleSelection)
        self.setEditTriggers(QAbstractItemView.EditTrigger.DoubleClicked
                             | QAbstractItemView.EditTrigger.EditKeyPressed
                             | QAbstractItemView.EditTrigger.AnyKeyPressed)
        header = self.horizontalHeader()
        header.setSectionResizeMode(QHeaderView.ResizeMode.ResizeToContents)
        header.setStretchLastSection(False)
        self.setWordWrap(False)
        self._filling = False
        self.cellChanged.connect(self._cell_changed)
        self.itemSelectionChanged.connect(self._selection_changed)
        document.changed.connect(self.refresh)
        document.drag_finished.connect(self._drag_finished)
        self.refresh()

    def _hold_widths(self, on: bool) -> None:
        """During a drag the columns keep their widths (no measuring on every step); after
        it they fit their contents again, as in a fresh window.
        """
        mode = (QHeaderView.ResizeMode.Interactive if on
                else QHeaderView.ResizeMode.ResizeToContents)
        header = self.horizontalHeader()
        if header.sectionResizeMode(0) != mode:
            header.setSectionResizeMode(mode)

    def _drag_finished(self) -> None:
        self._hold_widths(False)

    def refresh(self) -> None:
        """Show the model's plies."""
        p = self.document.project
        self._hold_widths(self.document.dragging)
        u = p.display_units
        self._filling = True
        self.blockSignals(True)
        self.setRowCount(len(p.plies))
        for r, ply in enumerate(p.plies):
            cells = [ply.name, ply.material] + [
                units.display_string(getattr(ply, k), "length", u, 6) for k in KEYS[2:]]
            for c, text in enumerate(cells):
                self._put(r, c, text)
        self.blockSignals(False)
        self._filling = False

    def _put(self, row: int, column: int, text: str) -> None:
        """One cell in place: only what changed is set (each change re-measures the
        column), and a mark of bad input is cleared.
        """
        item = self.item(row, column)
        tip = plain_tip(text)
        if item is None:
            item = QTableWidgetItem(text)
            item.setToolTip(tip)
            self.setItem(row, column, item)
            return
        if item.text() != text:
            item.setText(text)
        if item.toolTip() != tip:
            item.setToolTip(tip)
        if item.data(Qt.ItemDataRole.BackgroundRole) is not None:
            item.setData(Qt.ItemDataRole.BackgroundRole, None)

    def select_row(self, index: int | None) -> None:
        """Follow the canvas selection (without echoing it back)."""
        self.blockSignals(True)
        if index is None or not 0 <= index < self.rowCount():
            self.clearSelection()
        else:
            self.selectRow(index)
        self.blockSignals(False)

    def _selection_changed(self) -> None:
        rows = {i.row() for i in self.selectedIndexes()}
        self.picked.emit(min(rows) if rows else None)

    @guarded("Editing the ply table")
    def _cell_changed(self, row: int, column: int) -> None:
        if self._filling:
            return
        p = self.document.project
        if not 0 <= row < len(p.plies):
            return
        item = self.item(row, column)
        text = item.text().strip() if item is not None else ""
        key = KEYS[column]
        try:
            value = self._parse(key, text, p, row)
        except ValueError as exc:
            self._mark(row, column, str(exc))
            return
        plies = list(p.plies)
        plies[row] = replace(plies[row], **{key: value})
        self.error.emit("")
        self.document.apply(p.with_plies(tuple(plies)), f"Set {key}")
        if self.document.project == p:
            self.refresh()

    @staticmethod
    def _parse(key: str, text: str, p, row: int) -> object:  # type: ignore[no-untyped-def]
        field = f"plies[{row}].{key}"
        if key == "name":
            if not text:
                raise ValueError(f"{field}: must not be empty")
            if any(q.name == text for i, q in enumerate(p.plies) if i != row):
                raise ValueError(f"{field}: \u201c{text}\u201d is the name of another ply")
            return text
        if key == "material":
            mats = p.all_materials()
            mid = text.split(" \u2014 ")[0].strip()
            if mid not in mats:
                raise ValueError(f"{field}: \u201c{text}\u201d is not a known material")
            return mid
        try:
            value = parse_entry(text, "length", p.display_units, field)
        except units.UnitError as exc:
            raise ValueError(str(exc)) from None
        if key in ("width", "height") and not value > 0:
            raise ValueError(f"{field}: must be greater than zero")
        return value

    def _mark(self, row: int, column: int, message: str) -> None:
        self.error.emit(message)
        item = self.item(row, column)
        if item is not None:
            self.blockSignals(True)
            item.setBackground(QColor(255, 217, 217))
            item.setToolTip(plain_tip(message))
            self.blockSignals(False)

    def sizeHintForColumn(self, column: int) -> int:  # noqa: D102 - Qt API
        return min(super().sizeHintForColumn(column), 140)

