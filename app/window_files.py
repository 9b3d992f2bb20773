"""The main window's file handling: open, save, save as, autosave, recovery, locks.

A mixin of :class:`~plystack.app.main_window.MainWindow` (it uses the window's
``document``, ``settings``, ``canvas``, ``ask`` and ``warn``).

- Save As starts in the folder last used (QSettings ``last_dir``) with a name from the
  current file or the title, and adds ``.plystack.json`` to a name without ``.json``.
  Files are written by core's atomic writer (through links, keeping the mode; new files
  get the umask's mode).
- Saving over the document's own file asks first when the file changed on disk since it
  was opened or last saved here (another program or another Plystack saved it).
- Autosaves and locks: see :mod:`plystack.app.autosave`. Saving, discarding and closing
  remove this window's autosave; opening another file releases the lock.
- Export plate drawings asks for a folder and writes what ``plystack plates`` writes
  (``plystack.core.fabrication.export``) for the plies on screen.
"""

from __future__ import annotations

import hashlib
import os
import re
from pathlib import Path

from PySide6.QtCore import QStandardPaths
from PySide6.QtWidgets import QFileDialog, QMessageBox

from plystack.app.autosave import AutosaveStore, Found
from plystack.core.io.project_file import dumps, load
from plystack.core.model.errors import ProjectError
from plystack.core.model.project import Project

SUFFIX = ".plystack.json"
FILTER = "Plystack projects (*.plystack.json *.json)"


def autosave_dir() -> Path:
    """Folder for autosaves (the platform's application-data folder)."""
    base = QStandardPaths.writableLocation(QStandardPaths.StandardLocation.AppDataLocation)
    return Path(base or Path.home() / ".plystack") / "autosave"


def with_suffix(name: str) -> Path:
    """The file a Save As name stands for: ``.plystack.json`` added unless it ends in
    ``.json``.
    """
    return Path(name if name.lower().endswith(".json") else name + SUFFIX)


def fingerprint(path: Path) -> str | None:
    """A hash of a file's bytes (None when it cannot be read)."""
    try:
        return hashlib.sha256(Path(path).read_bytes()).hexdigest()
    except OSError:
        return None


def _problem_text(exc: BaseException) -> str:
    if isinstance(exc, ProjectError):
        return "\n".join(str(p) for p in exc.problems)
    if isinstance(exc, OSError):
        return exc.strerror or str(exc)
    return str(exc)


class FileActions:
    """Open, save, autosave and recover (mixed into the main window)."""

    def _init_files(self) -> None:
        self.autosaves = AutosaveStore(autosave_dir())
        self._on_disk: str | None = None
        path = self.document.path  # type: ignore[attr-defined]
        if path is not None:
            self._opened(Path(path))

    # --- asking (replaced in tests) -----------------------------------------------------

    def ask_save_path(self, start: str) -> str:
        """The Save As dialog: a file name, or "" when cancelled."""
        name, _ = QFileDialog.getSaveFileName(self, "Save project", start, FILTER)  # type: ignore[arg-type]
        return name

    def ask_open_path(self, start: str) -> str:
        """The Open dialog: a file name, or "" when cancelled."""
        name, _ = QFileDialog.getOpenFileName(self, "Open project", start, FILTER)  # type: ignore[arg-type]
        return name

    def ask_plates_dir(self, start: str) -> str:
        """The folder dialog of Export plate drawings: a folder, or "" when cancelled."""
        return QFileDialog.getExistingDirectory(self, "Export plate drawings", start)  # type: ignore[arg-type]

    def _last_dir(self) -> str:
        """The folder a file dialog opens in: the open project's own folder, else the
        last folder used, else home.
        """
        current = self.document.path  # type: ignore[attr-defined]
        if current is not None and Path(current).parent.is_dir():
            return str(Path(current).parent)
        value = self.settings.value("last_dir", "")  # type: ignore[attr-defined]
        folder = str(value) if value else ""
        return folder if folder and os.path.isdir(folder) else str(Path.home())

    # --- the document's file ------------------------------------------------------------

    def _opened(self, path: Path) -> None:
        """``path`` is now the document's file: remember its bytes, lock it, flag others."""
        self._on_disk = fingerprint(path)
        self.autosaves.lock(path)
        others = self.autosaves.other_instances(path)
        if others:
            ids = ", ".join(str(p) for p in others)
            self.flag(f"{path.name} is also open in another running Plystack (process {ids}); "
                      "whichever saves last replaces the other's work.")
        else:
            self.flag("")

    def flag(self, text: str) -> None:
        """Show (or clear) a lasting warning about the file in the status bar."""
        self.file_flag.setText(text)  # type: ignore[attr-defined]
        self.file_flag.setVisible(bool(text))  # type: ignore[attr-defined]

    def maybe_save(self) -> bool:
        """True when it is fine to drop the current document (its autosave goes too)."""
        if not self.document.modified:  # type: ignore[attr-defined]
            return True
        b = QMessageBox.StandardButton
        answer = self.ask("Unsaved changes", "Save the changes to this project first?",  # type: ignore[attr-defined]
                          b.Save | b.Discard | b.Cancel, b.Save)
        if answer == b.Save:
            return self.save()
        if answer == b.Discard:
            self._clear_autosave()
            return True
        return False

    def open_path(self, path: Path) -> bool:
        """Open a project file; show its problems if it cannot be read."""
        try:
            project = load(path)
        except ProjectError as exc:
            self.warn("Cannot open", f"{path}:\n{_problem_text(exc)}")  # type: ignore[attr-defined]
            return False
        self._clear_autosave()
        self.document.replace_all(project, Path(path))  # type: ignore[attr-defined]
        self._opened(Path(path))
        self.canvas.request_fit()  # type: ignore[attr-defined]
        self.canvas.select(None)  # type: ignore[attr-defined]
        self.canvas.rebuild()  # type: ignore[attr-defined]
        self._remember(Path(path))
        return True

    def replace_project(self, project: Project) -> None:
        """Start on a new untitled project (the old one was saved or discarded)."""
        self._clear_autosave()
        self.autosaves.unlock()
        self.flag("")
        self._on_disk = None
        self.document.replace_all(project, None)  # type: ignore[attr-defined]
        self.canvas.request_fit()  # type: ignore[attr-defined]
        self.canvas.rebuild()  # type: ignore[attr-defined]

    def open_dialog(self) -> None:
        """File > Open."""
        if not self.maybe_save():
            return
        name = self.ask_open_path(self._last_dir())
        if name:
            self.settings.setValue("last_dir", str(Path(name).parent))  # type: ignore[attr-defined]
            self.open_path(Path(name))

    def save(self) -> bool:
        """File > Save (asks for a name the first time)."""
        path = self.document.path  # type: ignore[attr-defined]
        if path is None:
            return self.save_as()
        return self._save_to(Path(path))

    def _suggested_name(self) -> str:
        path = self.document.path  # type: ignore[attr-defined]
        if path is not None:
            return Path(path).name
        title = self.document.project.title  # type: ignore[attr-defined]
        slug = re.sub(r"[^A-Za-z0-9._-]+", "-", title).strip("-.").lower()[:60]
        return (slug or "untitled") + SUFFIX

    def save_as(self) -> bool:
        """File > Save as: the last-used folder, the suffix added."""
        name = self.ask_save_path(str(Path(self._last_dir()) / self._suggested_name()))
        if not name:
            return False
        target = with_suffix(name)
        if target != Path(name) and target.exists():
            b = QMessageBox.StandardButton
            answer = self.ask("Replace file", f"{target} exists already. Replace it?",  # type: ignore[attr-defined]
                              b.Yes | b.Cancel, b.Cancel)
            if answer != b.Yes:
                return False
        self.settings.setValue("last_dir", str(target.parent))  # type: ignore[attr-defined]
        return self._save_to(target)

    def _changed_on_disk(self, path: Path) -> bool:
        own = self.document.path  # type: ignore[attr-defined]
        if own is None or os.path.realpath(own) != os.path.realpath(path):
            return False
        now = fingerprint(path)
        return now is not None and now != self._on_disk

    def _save_to(self, path: Path) -> bool:
        if self._changed_on_disk(path):
            b = QMessageBox.StandardButton
            answer = self.ask("File changed on disk",  # type: ignore[attr-defined]
                              f"{path} has changed on disk since it was opened here (another "
                              "program or another Plystack saved it). Replace it with this "
                              "project?", b.Save | b.Cancel, b.Cancel)
            if answer != b.Save:
                return False
        old = self.document.path  # type: ignore[attr-defined]
        try:
            self.document.save_to(path)  # type: ignore[attr-defined]
        except (OSError, ProjectError, ValueError) as exc:
            self.warn("Save failed", f"{path}: {_problem_text(exc)}\nThe file on disk is "  # type: ignore[attr-defined]
                      "unchanged; your work is still here.")
            return False
        self.autosaves.clear(old)
        self.autosaves.clear(Path(path))
        self._opened(Path(path))
        self._remember(Path(path))
        self.statusBar().showMessage(f"Saved {path}", 5000)  # type: ignore[attr-defined]
        return True

    def export_plates(self, target: Path | None = None) -> bool:
        """File > Export plate drawings: a DXF drawing of every steel plate and the cut
        list, into a folder the user picks (``target`` skips the dialog).
        """
        from plystack.core.fabrication.export import CUT_LIST, export_plates

        if target is None:
            name = self.ask_plates_dir(self._last_dir())
            if not name:
                return False
            target = Path(name)
        try:
            plates, _written = export_plates(self.document.project, target,  # type: ignore[attr-defined]
                                             field="folder")
        except (OSError, ProjectError) as exc:
            self.warn("Export plate drawings", f"{target}: {_problem_text(exc)}")  # type: ignore[attr-defined]
            return False
        marks = ", ".join(f"{p.mark}.dxf" for p in plates.plates)
        self.statusBar().showMessage(f"Wrote {marks} and {CUT_LIST} to {target}")  # type: ignore[attr-defined]
        return True

    def _remember(self, path: Path) -> None:
        recent = [str(path)] + [p for p in self._recent() if p != str(path)]
        self.settings.setValue("recent", recent[:8])  # type: ignore[attr-defined]
        self._fill_recent()

    def _recent(self) -> list[str]:
        value = self.settings.value("recent", [])  # type: ignore[attr-defined]
        return [str(v) for v in value] if isinstance(value, list) else (
            [str(value)] if value else [])

    def _fill_recent(self) -> None:
        self.recent_menu.clear()  # type: ignore[attr-defined]
        for p in self._recent():
            act = self.recent_menu.addAction(p)  # type: ignore[attr-defined]
            act.triggered.connect(lambda _c=False, p=p: self.maybe_save() and self.open_path(
                Path(p)))

    # --- autosave -----------------------------------------------------------------------

    def autosave(self) -> Path | None:
        """Write the project to the autosave folder while it has unsaved changes."""
        if not self.document.modified:  # type: ignore[attr-defined]
            return None
        try:
            return self.autosaves.write(self.document.path,  # type: ignore[attr-defined]
                                        dumps(self.document.project))  # type: ignore[attr-defined]
        except (OSError, ValueError) as exc:
            self.statusBar().showMessage(f"Autosave failed: {_problem_text(exc)}")  # type: ignore[attr-defined]
            return None

    def _clear_autosave(self) -> None:
        self.autosaves.clear(self.document.path)  # type: ignore[attr-defined]

    def close_files(self) -> None:
        """The window closes: its autosave and lock go."""
        self._clear_autosave()
        self.autosaves.unlock()

    def recover(self, found: Found) -> bool:
        """Apply an autosave left behind to this document (one undoable edit)."""
        try:
            project = load(found.project_file)
        except ProjectError:
            return False
        self.document.apply(project, "Recover autosave")  # type: ignore[attr-defined]
        if self.autosave() is not None:  # this window's own autosave holds it now
            self.autosaves.discard(found)
        return True
