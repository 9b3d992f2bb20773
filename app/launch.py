"""The ``plystack`` console script: core's command line, plus the desktop program.

Only the ``gui`` command (or no command at all) loads Qt, so ``plystack check`` starts
as fast as core/ alone.
"""

from __future__ import annotations

from plystack.core.cli import main as cli_main


def open_gui(path: str | None, screenshot: str | None) -> int:
    """Open ``path`` (None: the bundled demo) in the desktop program, or render it to
    the PNG ``screenshot``.
    """
    from plystack.app.main import run_gui

    return run_gui(path, screenshot)


def main(argv: list[str] | None = None) -> int:
    """Entry point of the ``plystack`` console script."""
    return cli_main(argv, gui=open_gui)


if __name__ == "__main__":
    raise SystemExit(main())
