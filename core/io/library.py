"""The material library bundled with the program (``assets/materials.json``)."""

from __future__ import annotations

import json
from functools import lru_cache

from ..model.errors import Problem
from ..model.materials import Material, material_from_record
from .resources import DataFileError, read_text

LIBRARY_FILE = "materials.json"


@lru_cache(maxsize=1)
def _library() -> tuple[tuple[str, Material], ...]:
    text = read_text(LIBRARY_FILE, "the material library")
    try:
        data = json.loads(text)
        records = data["materials"]
        if not isinstance(records, dict):
            raise TypeError
    except (ValueError, KeyError, TypeError):
        raise DataFileError(Problem("installation", f"the material library ({LIBRARY_FILE}) "
                                    "cannot be read: it is not a library of materials; "
                                    "reinstall Plystack")) from None
    out = []
    problems: list[Problem] = []
    for mid, rec in records.items():
        m, probs = material_from_record(mid, rec, f"library.materials.{mid}")
        problems.extend(probs)
        if m is not None:
            out.append((mid, m))
    if problems:
        raise DataFileError([Problem("installation", "the material library "
                                     f"({LIBRARY_FILE}) has a bad record: {p}")
                             for p in problems])
    return tuple(out)


def load_library() -> dict[str, Material]:
    """The bundled material library, by id (read once per process)."""
    return dict(_library())
