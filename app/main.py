"""Start the desktop program: ``plystack``, ``plystack gui FILE [--screenshot OUT.png]``."""

from __future__ import annotations

import logging
import os
import sys
from pathlib import Path

from PySide6.QtWidgets import QMessageBox


def _setup_logging(folder: Path) -> None:
    """Log to ``plystack.log`` in the application-data folder (and stderr)."""
    log = logging.getLogger("plystack.app")
    if log.handlers:
        return
    log.setLevel(logging.INFO)
    log.addHandler(logging.StreamHandler(sys.stderr))
    try:
        folder.mkdir(parents=True, exist_ok=True)
        handler = logging.FileHandler(folder / "plystack.log", encoding="utf-8")
        handler.setFormatter(logging.Formatter("%(asctime)s %(levelname)s %(message)s"))
        log.addHandler(handler)
    except OSError:
        pass


def _install_excepthook() -> None:
    """An exception that escapes a slot is logged and shown in the status bar."""
    from plystack.app.safe import reporter

    def hook(kind, exc, tb):  # type: ignore[no-untyped-def]
        if issubclass(kind, KeyboardInterrupt):
            sys.__excepthook__(kind, exc, tb)
            return
        reporter().report("An action", exc.with_traceback(tb))

    sys.excepthook = hook


def run_gui(path: str | None, screenshot: str | None = None) -> int:
    """Open ``path`` in the main window; with ``screenshot``, render a PNG and exit.

    Without a path the bundled demo opens as an untitled copy (saving asks for a new
    file, so the installed demo is never overwritten). A file that cannot be read opens
    the window on a new untitled project with a dialog naming every problem (with
    ``screenshot``, the problems are printed and the exit status is 2).
    """
    no_display = (sys.platform.startswith("linux") and not os.environ.get("DISPLAY")
                  and not os.environ.get("WAYLAND_DISPLAY"))
    if screenshot and no_display:
        os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
    elif no_display and not os.environ.get("QT_QPA_PLATFORM"):
        print("plystack: no display to open a window on (DISPLAY is not set). Use "
              "`plystack check FILE`, or `plystack gui FILE --screenshot OUT.png`.",
              file=sys.stderr)
        return 2
    from PySide6.QtWidgets import QApplication

    from plystack.app.icons import app_icon
    from plystack.app.main_window import MainWindow, autosave_dir
    from plystack.app.safe import show_message
    from plystack.core.io.project_file import load, loads
    from plystack.core.io.resources import demo_text
    from plystack.core.model.errors import ProjectError

    app = QApplication.instance() or QApplication(sys.argv[:1])
    app.setApplicationName("Plystack")
    app.setOrganizationName("Plystack")
    app.setWindowIcon(app_icon())
    _setup_logging(autosave_dir().parent)
    _install_excepthook()
    problems: list[str] = []
    try:
        project = load(path) if path is not None else loads(demo_text())
    except ProjectError as exc:
        problems = [f"{path or 'demo'}: {p}" for p in exc.problems]
        for line in problems:
            print(line, file=sys.stderr)
        if screenshot:
            return 2
        project = _empty_project()
    window = MainWindow(project, Path(path) if path is not None and not problems else None)
    if screenshot:
        return _screenshot(app, window, screenshot)
    window.show()
    if problems:
        show_message(window, QMessageBox.Icon.Warning, "Cannot open",
                     "The project could not be opened; a new untitled project is open "
                     "instead.\n\n" + "\n".join(problems))
    else:  # work of another session is offered only when the asked-for document opened
        offer_recovery(window, autosave_dir(), PlainBox)
    return int(app.exec())


def _empty_project():  # type: ignore[no-untyped-def]
    from plystack.app.beam_panel import default_beam
    from plystack.core.model.project import Project

    return Project(title="New section", display_units="US", beam=default_beam("US"))


def _screenshot(app, window, target: str) -> int:  # type: ignore[no-untyped-def]
    """Render the window once it is shown (plots drawn once, on show) and save a PNG."""
    window.resize(1700, 1000)
    window.show()
    for _ in range(5):
        app.processEvents()
    window.canvas.fit()
    app.processEvents()
    from PySide6.QtCore import QBuffer, QByteArray, QIODevice

    from plystack.core.io.atomic import write_bytes
    from plystack.core.model.errors import Problem, ProjectError

    data = QByteArray()
    buffer = QBuffer(data)
    buffer.open(QIODevice.OpenModeFlag.WriteOnly)
    ok = window.grab().save(buffer, "PNG")
    buffer.close()
    window.document.undo_stack.setClean()
    window.close()
    try:
        if not ok:
            raise ProjectError(Problem("--screenshot", "the window could not be rendered"))
        write_bytes(target, bytes(data.data()), "--screenshot")
    except ProjectError as exc:
        for problem in exc.problems:
            print(f"plystack gui: {problem}", file=sys.stderr)
        return 2
    return 0


class PlainBox:
    """The question box ``offer_recovery`` asks with (plain text, Yes / No)."""

    StandardButton = QMessageBox.StandardButton

    @staticmethod
    def question(parent, title: str, text: str):  # type: ignore[no-untyped-def]
        """Ask ``text``; Yes or No."""
        from plystack.app.safe import show_message

        b = QMessageBox.StandardButton
        return show_message(parent, QMessageBox.Icon.Question, title, text, b.Yes | b.No,
                            b.Yes)


def offer_recovery(window, folder: Path, box) -> None:  # type: ignore[no-untyped-def]
    """After a crash, offer the autosaves left behind for this window's document only.

    Autosaves of a running Plystack are never offered nor deleted; one the user declines
    is deleted; one the user accepts becomes this window's unsaved work (undoable).
    """
    from plystack.app.autosave import AutosaveStore

    store = window.autosaves if folder == window.autosaves.folder else AutosaveStore(folder)
    for found in store.left_behind(window.document.path):
        what = found.document or "an untitled project"
        answer = box.question(window, "Recover unsaved work",
                              f"Plystack found unsaved work on {what} from an earlier session "
                              f"that ended without saving ({found.written}; "
                              f"{found.project_file.name}).\nRecover it?")
        if answer == box.StandardButton.Yes:
            if window.recover(found):
                return
            continue
        store.discard(found)
