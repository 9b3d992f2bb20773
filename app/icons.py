"""The application icon, read from the installed package data."""

from __future__ import annotations

from PySide6.QtGui import QIcon, QPixmap

from plystack.core.io.resources import read_bytes


def app_icon() -> QIcon:
    """Plystack's window icon (assets/icons/plystack.png); an empty icon if unreadable."""
    pixmap = QPixmap()
    try:
        pixmap.loadFromData(read_bytes("icons/plystack.png", "the application icon"))
    except Exception:
        return QIcon()
    return QIcon(pixmap)
