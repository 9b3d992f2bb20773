"""The document: the single source of truth (a frozen Project) plus its undo stack.

Undo commands only swap one Project for another; views listen to ``changed`` and redraw.
A drag pushes commands with one merge key, so the whole drag is one undo step.

While a mouse button is held on a view that edits by dragging, the document says so
(``dragging``): views then keep their layout still (column widths, plot layout) and
catch up when ``drag_finished`` is emitted, so what shows after the drag is what a fresh
window shows for the same project.
"""

from __future__ import annotations

import itertools
from pathlib import Path

from PySide6.QtCore import QObject, Signal
from PySide6.QtGui import QUndoCommand, QUndoStack

from plystack.core.io.project_file import save
from plystack.core.model.project import Project

_MERGE_ID = 4242
_serial = itertools.count(1)


def new_gesture_key(kind: str) -> str:
    """A merge key unique to one mouse gesture (a drag or resize)."""
    return f"{kind}-{next(_serial)}"


class EditCommand(QUndoCommand):
    """Replace the project by another; commands with the same merge key merge."""

    def __init__(self, doc: Document, old: Project, new: Project, text: str,
                 merge_key: str | None = None):
        super().__init__(text)
        self.doc, self.old, self.new, self.merge_key = doc, old, new, merge_key

    def id(self) -> int:  # noqa: D102 - Qt API
        return _MERGE_ID if self.merge_key else -1

    def mergeWith(self, other: QUndoCommand) -> bool:  # noqa: D102 - Qt API
        if not isinstance(other, EditCommand) or other.merge_key != self.merge_key:
            return False
        self.new = other.new
        return True

    def redo(self) -> None:  # noqa: D102 - Qt API
        self.doc._set(self.new)

    def undo(self) -> None:  # noqa: D102 - Qt API
        self.doc._set(self.old)


class Document(QObject):
    """A project being edited."""

    changed = Signal()
    file_changed = Signal()
    drag_finished = Signal()

    def __init__(self, project: Project, path: Path | None = None):
        super().__init__()
        self._project = project
        self.path = path
        self._dragging = False
        self.undo_stack = QUndoStack(self)
        self.undo_stack.cleanChanged.connect(self._clean_changed)

    def _clean_changed(self, _clean: bool) -> None:
        self.file_changed.emit()

    @property
    def dragging(self) -> bool:
        """True while a mouse button is held on a view that edits by dragging."""
        return self._dragging

    def set_dragging(self, on: bool) -> None:
        """A button went down (True) or came up (False) on a dragging view; coming up
        emits ``drag_finished``.
        """
        was, self._dragging = self._dragging, on
        if was and not on:
            self.drag_finished.emit()

    @property
    def project(self) -> Project:
        """The current project."""
        return self._project

    def _set(self, project: Project) -> None:
        self._project = project
        self.changed.emit()

    def apply(self, project: Project, text: str, merge_key: str | None = None) -> None:
        """Make ``project`` current as one undoable edit (merged by ``merge_key``)."""
        if project == self._project:
            return
        self.undo_stack.push(EditCommand(self, self._project, project, text, merge_key))

    def replace_all(self, project: Project, path: Path | None) -> None:
        """Load another project (clears the undo history)."""
        self.undo_stack.clear()
        self.path = path
        self._set(project)
        self.undo_stack.setClean()
        self.file_changed.emit()

    @property
    def modified(self) -> bool:
        """True with unsaved changes."""
        return not self.undo_stack.isClean()

    def save_to(self, path: Path) -> None:
        """Save atomically and mark clean."""
        save(self._project, path)
        self.path = path
        self.undo_stack.setClean()
        self.file_changed.emit()
