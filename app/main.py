"""Start the desktop program: ``plystack``, ``plystack gui FILE [--screenshot OUT.png]``."""

from __future__ import annotations

import os
import sys
from pathlib import Path


def run_gui(path: str | None, screenshot: str | None = None) -> int:
    """Open ``path`` in the main window; with ``screenshot``, render a PNG and exit.

    Without a path the bundled demo opens as an untitled copy (saving asks for a new
    file, so the installed demo is never overwritten). Returns the exit status (2 when
    the file cannot be read).
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
    from PySide6.QtWidgets import QApplication, QMessageBox

    from plystack.app.icons import app_icon
    from plystack.app.main_window import MainWindow, autosave_dir
    from plystack.core.io.project_file import load, loads
    from plystack.core.io.resources import demo_text
    from plystack.core.model.errors import ProjectError

    app = QApplication.instance() or QApplication(sys.argv[:1])
    app.setApplicationName("Plystack")
    app.setOrganizationName("Plystack")
    app.setWindowIcon(app_icon())
    try:
        project = load(path) if path is not None else loads(demo_text())
    except ProjectError as exc:
        for p in exc.problems:
            print(f"{path or 'demo'}: {p}", file=sys.stderr)
        return 2
    window = MainWindow(project, Path(path) if path is not None else None)
    if screenshot:
        window.resize(1700, 1000)
        window.show()
        for _ in range(5):
            app.processEvents()
        window.recompute()
        window.canvas.fit()
        window.profiles.draw()
        window.diagrams.draw()
        app.processEvents()
        ok = window.grab().save(screenshot)
        window.document.undo_stack.setClean()
        window.close()
        if not ok:
            print(f"could not write {screenshot}", file=sys.stderr)
            return 2
        return 0
    offer_recovery(window, autosave_dir(), QMessageBox)
    window.show()
    return int(app.exec())


def offer_recovery(window, folder: Path, box) -> None:  # type: ignore[no-untyped-def]
    """After a crash, offer the autosaved projects left behind."""
    from plystack.core.io.project_file import load
    from plystack.core.model.errors import ProjectError

    if not folder.is_dir():
        return
    for f in sorted(folder.glob("*.json")):
        answer = box.question(window, "Recover unsaved work",
                              f"Plystack found unsaved work from an earlier session:\n{f.name}"
                              "\nRecover it?")
        if answer == box.StandardButton.Yes:
            try:
                project = load(f)
            except ProjectError:
                continue
            window.document.apply(project, "Recover autosave")
            return
        f.unlink(missing_ok=True)
