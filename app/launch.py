"""The ``plystack`` console script: core's command line, plus the desktop program.

Only the ``gui`` command (or no command at all) loads Qt, so ``plystack check`` starts
as fast as core/ alone.
"""

from __future__ import annotations

import gc

from plystack.core.cli import main as cli_main


def open_gui(path: str | None, screenshot: str | None) -> int:
    """Open ``path`` (None: the bundled demo) in the desktop program, or render it to
    the PNG ``screenshot``.
    """
    from plystack.app.main import run_gui

    return run_gui(path, screenshot)


def main(argv: list[str] | None = None) -> int:
    """Entry point of the ``plystack`` console script.

    Run as the script (``argv`` None), the process ends as soon as the command has
    finished, so the objects it made are frozen out of Python's cycle collector
    (``gc.freeze``): the interpreter's last collections at exit then have nothing to
    walk (about 0.1 s of ``plystack sheet`` on the demo). Destructors and exit handlers
    run as before.
    """
    code = cli_main(argv, gui=open_gui)
    if argv is None:
        gc.freeze()
    return code


if __name__ == "__main__":
    raise SystemExit(main())
