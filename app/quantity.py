"""Unit-aware entry: a line edit that parses quantities and marks bad input in place."""

from __future__ import annotations

from collections.abc import Callable

from PySide6.QtCore import Signal
from PySide6.QtWidgets import QLineEdit

from plystack.core.model import units

BAD_STYLE = "QLineEdit { background: #ffd9d9; border: 1px solid #b00000; }"


def parse_entry(text: str, kind: str, system: str, field: str) -> float:
    """Parse user text; a bare number takes the display unit of ``kind``."""
    dimension = "length" if kind in ("length", "span") else kind
    stripped = text.strip()
    if stripped and (stripped[-1].isdigit() or stripped.endswith(".")):
        stripped = f"{stripped} {units.unit_label(kind, system).replace('^', '**')}"
    return units.parse(stripped, dimension, field)


class QuantityEdit(QLineEdit):
    """Emits ``accepted(value_SI)`` on a valid entry; marks errors in place otherwise.

    A bad entry changes nothing: the field keeps the text so the user can correct it,
    shows the message as its tooltip and in ``error_text``.
    """

    accepted = Signal(float)
    rejected = Signal(str)

    def __init__(self, kind: str, field: str, system: Callable[[], str],
                 check: Callable[[float], str | None] | None = None):
        super().__init__()
        self.kind, self.field, self._system, self._check = kind, field, system, check
        self.error_text = ""
        self.editingFinished.connect(self._commit)

    def set_value(self, value: float | None) -> None:
        """Show an SI value in display units (clears any error mark)."""
        self.blockSignals(True)
        if value is None:
            self.setText("")
        else:
            self.setText(units.display_string(value, self.kind, self._system(), 6))
        self.blockSignals(False)
        self._mark("")

    def _mark(self, message: str) -> None:
        self.error_text = message
        self.setStyleSheet(BAD_STYLE if message else "")
        self.setToolTip(message)

    def _commit(self) -> None:
        try:
            value = parse_entry(self.text(), self.kind, self._system(), self.field)
        except units.UnitError as exc:
            self._mark(str(exc))
            self.rejected.emit(str(exc))
            return
        problem = self._check(value) if self._check else None
        if problem:
            msg = f"{self.field}: {problem}"
            self._mark(msg)
            self.rejected.emit(msg)
            return
        self._mark("")
        self.accepted.emit(value)
