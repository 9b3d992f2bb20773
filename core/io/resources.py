"""The program's bundled data (material library, fonts, demo projects, icons), read
through :mod:`importlib.resources`, so it works from a wheel, an editable install or a
zip archive alike. Nothing here builds a path from ``__file__``.
"""

from __future__ import annotations

from importlib import resources
from importlib.resources.abc import Traversable

from ..model.errors import Problem, ProjectError

#: The package that holds the data files: the root package (``assets/`` in the source tree).
ASSETS_PACKAGE = (__package__ or "plystack.core.io").split(".")[0]

DEMOS = {
    "porch-header": "demo/porch-header.plystack.json",
    "stair-trimmer-eu": "demo/stair-trimmer-eu.plystack.json",
}
DEFAULT_DEMO = "porch-header"


class DataFileError(ProjectError):
    """A bundled data file is missing or unreadable (a fault of the installation)."""


def asset(relative: str) -> Traversable:
    """The bundled data file ``relative`` (e.g. "fonts/DejaVuSans.ttf")."""
    node = resources.files(ASSETS_PACKAGE)
    for part in relative.split("/"):
        node = node.joinpath(part)
    return node


def read_bytes(relative: str, what: str) -> bytes:
    """The bytes of a bundled data file; a named installation problem if it is missing."""
    try:
        return asset(relative).read_bytes()
    except (OSError, ModuleNotFoundError) as exc:
        raise DataFileError(Problem("installation", f"{what} ({relative}) cannot be read "
                                    f"from the installed program: {exc.__class__.__name__}; "
                                    "reinstall Plystack")) from None


def read_text(relative: str, what: str) -> str:
    """The text (UTF-8) of a bundled data file."""
    try:
        return read_bytes(relative, what).decode("utf-8")
    except UnicodeDecodeError:
        raise DataFileError(Problem("installation", f"{what} ({relative}) is not UTF-8 "
                                    "text; reinstall Plystack")) from None


def demo_text(name: str = DEFAULT_DEMO) -> str:
    """The JSON text of a bundled demo project."""
    if name not in DEMOS:
        raise ProjectError(Problem("demo", f'"{name}" is not a demo; use one of '
                                   + ", ".join(DEMOS)))
    return read_text(DEMOS[name], f'the demo project "{name}"')
