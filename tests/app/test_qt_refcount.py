"""Guard against Qt bindings that leak references to None (seen in PySide6 6.12.0 on
Python 3.11, where a long editing session then aborts)."""

import sys

from PySide6.QtCore import QPointF
from PySide6.QtGui import QPainterPath


def test_void_methods_keep_none_refcount():
    path = QPainterPath()
    before = sys.getrefcount(None)
    for _ in range(2000):
        path.moveTo(QPointF(0, 0))
        path.lineTo(QPointF(1, 2))
        path.closeSubpath()
    assert abs(sys.getrefcount(None) - before) < 100
