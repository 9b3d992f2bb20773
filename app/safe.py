"""Guards for the window: user text is shown as plain text, and an exception in a slot
or a paint is caught, logged and shown in the status bar instead of reaching Qt.

Qt guesses whether a label, a message box or a tooltip holds rich text; a ply name such
as ``<img src=...>`` would then be rendered (and could load a local file or fake a
verdict). Every widget that shows text from a project goes through these helpers.
"""

from __future__ import annotations

import functools
import html
import logging
import math
import traceback
from collections.abc import Callable
from typing import Any, TypeVar

from PySide6.QtCore import QObject, Qt, Signal
from PySide6.QtWidgets import QLabel, QMessageBox, QWidget

log = logging.getLogger("plystack.app")
F = TypeVar("F", bound=Callable[..., Any])


class ErrorReporter(QObject):
    """Where caught exceptions go: the log, and ``message`` (the status bar listens)."""

    message = Signal(str)

    def report(self, where: str, exc: BaseException) -> None:
        """Log ``exc`` with its traceback and announce a one-line message."""
        log.error("%s failed:\n%s", where, "".join(traceback.format_exception(exc)))
        text = str(exc).splitlines()[0] if str(exc) else type(exc).__name__
        self.message.emit(f"{where} failed: {text} (details in the log)")


#: The one reporter of the process (created on first use, after the QApplication).
_reporter: ErrorReporter | None = None


def reporter() -> ErrorReporter:
    """The process's error reporter."""
    global _reporter
    if _reporter is None:
        _reporter = ErrorReporter()
    return _reporter


def guarded(where: str) -> Callable[[F], F]:
    """Decorate a slot: an exception is reported (log and status bar), not raised."""

    def wrap(fn: F) -> F:
        @functools.wraps(fn)
        def inner(*args: Any, **kwargs: Any) -> Any:
            try:
                return fn(*args, **kwargs)
            except Exception as exc:
                reporter().report(where, exc)
                return None

        return inner  # type: ignore[return-value]

    return wrap


def plain_label(text: str = "", word_wrap: bool = True) -> QLabel:
    """A label that never interprets its text as markup."""
    label = QLabel()
    label.setTextFormat(Qt.TextFormat.PlainText)
    label.setWordWrap(word_wrap)
    label.setText(text)
    return label


def plain_tip(text: str) -> str:
    """Tooltip text that shows ``text`` literally (Qt would guess rich text otherwise)."""
    if not text:
        return ""
    body = html.escape(text).replace("\n", "<br>")
    return f"<p style='white-space:pre-wrap'>{body}</p>"


def show_message(parent: QWidget | None, icon: QMessageBox.Icon, title: str, text: str,
                 buttons: QMessageBox.StandardButton = QMessageBox.StandardButton.Ok,
                 default: QMessageBox.StandardButton = QMessageBox.StandardButton.NoButton,
                 ) -> QMessageBox.StandardButton:
    """A modal message box whose text is plain text; returns the button pressed."""
    box = QMessageBox(icon, title, text, buttons, parent)
    box.setTextFormat(Qt.TextFormat.PlainText)
    if default != QMessageBox.StandardButton.NoButton:
        box.setDefaultButton(default)
    return QMessageBox.StandardButton(box.exec())


def finite(value: object) -> bool:
    """True for a finite real number."""
    return isinstance(value, int | float) and math.isfinite(value)
