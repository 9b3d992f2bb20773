"""The project file (``*.plystack.json``): read, write, atomic save.

Loading reports one :class:`Problem` per fault, each naming the path of the field.
Saving writes a temporary file beside the target and renames it over the target, so a
failed save never destroys the old file.
"""

from __future__ import annotations

import json
import os
import stat
from collections.abc import Mapping
from pathlib import Path
from typing import Any

from ..model.errors import Problem, ProjectError
from ..model.materials import Material
from ..model.project import Alternative, Project
from .atomic import write_text
from .library import load_library
from .project_read import read_beam, read_design, read_material_map, read_plies
from .project_write import write_beam, write_design, write_materials, write_plies

FORMAT = "plystack"
VERSION = 1
TOP_KEYS = frozenset({"format", "version", "title", "display_units", "materials", "plies",
                      "reference_material", "beam", "design", "info", "alternatives",
                      "current_alternative"})
INFO_KEYS = ("member", "prepared_by", "checked_by", "date", "revision", "description",
             "job", "address", "licence")


def from_dict(data: Any, library: Mapping[str, Material] | None = None) -> Project:
    """Build a project from parsed JSON. Raises ProjectError with every problem found.

    Args:
        data: the parsed JSON.
        library: the material library (default: the packaged one).

    """
    lib = load_library() if library is None else dict(library)
    problems: list[Problem] = []
    if not isinstance(data, dict):
        raise ProjectError(Problem("", "a project file must hold one JSON object"))
    for key in data:
        if key not in TOP_KEYS:
            problems.append(Problem(key, "is not a known key of a project file"))
    if data.get("format") != FORMAT:
        problems.append(Problem("format", f'must be "{FORMAT}" (got {data.get("format")!r})'))
    version = data.get("version")
    if isinstance(version, bool) or not isinstance(version, int):
        problems.append(Problem("version", "must be a whole number"))
    elif version > VERSION:
        problems.append(Problem("version", f"{version} is newer than this program reads "
                                f"({VERSION}); update Plystack"))
    elif version < 1:
        problems.append(Problem("version", "must be 1 or more"))
    title = data.get("title", "Untitled")
    if not isinstance(title, str):
        problems.append(Problem("title", "must be text"))
        title = "Untitled"
    units = data.get("display_units", "US")
    if units not in ("US", "SI"):
        problems.append(Problem("display_units", 'must be "US" or "SI"'))
        units = "US"
    materials = read_material_map(data.get("materials", {}), "materials", problems)
    known = {**lib, **materials}
    if "plies" not in data:
        problems.append(Problem("plies", "is missing"))
    plies = read_plies(data.get("plies", []), "plies", known, problems)
    ref = data.get("reference_material")
    if ref is not None and (not isinstance(ref, str) or ref not in known):
        problems.append(Problem("reference_material", f"{ref!r} is not a known material"))
        ref = None
    beam_spec = None
    if "beam" in data:
        beam_spec = read_beam(data["beam"], "beam", problems)
    design = None
    if "design" in data:
        design = read_design(data["design"], "design", problems)
    info: dict[str, str] = {}
    raw_info = data.get("info", {})
    if not isinstance(raw_info, dict):
        problems.append(Problem("info", "must be an object"))
    else:
        for k, v in raw_info.items():
            if k not in INFO_KEYS:
                problems.append(Problem(f"info.{k}", "is not a known key; use one of "
                                        + ", ".join(INFO_KEYS)))
            elif not isinstance(v, str):
                problems.append(Problem(f"info.{k}", "must be text"))
            else:
                info[k] = v
    alternatives = []
    raw_alt = data.get("alternatives", [])
    if not isinstance(raw_alt, list):
        problems.append(Problem("alternatives", "must be a list"))
    else:
        for i, alt in enumerate(raw_alt):
            p = f"alternatives[{i}]"
            if not isinstance(alt, dict) or not isinstance(alt.get("name"), str):
                problems.append(Problem(p, 'must be an object with a "name" and "plies"'))
                continue
            for k in alt:
                if k not in ("name", "plies"):
                    problems.append(Problem(f"{p}.{k}", "is not a known key"))
            alternatives.append(Alternative(alt["name"], read_plies(
                alt.get("plies", []), f"{p}.plies", known, problems)))
    current = data.get("current_alternative")
    if current is not None and not isinstance(current, str):
        problems.append(Problem("current_alternative", "must be text (an alternative's name)"))
        current = None
    if problems:
        raise ProjectError(problems)
    return Project(title=title, display_units=units, materials=materials, plies=plies,
                   reference_material=ref, beam=beam_spec, design=design, info=info,
                   alternatives=tuple(alternatives), current_alternative=current,
                   library=lib)


def to_dict(project: Project) -> dict[str, Any]:
    """The JSON object of a project (quantities as strings in its display units)."""
    system = project.display_units
    out: dict[str, Any] = {"format": FORMAT, "version": VERSION, "title": project.title,
                           "display_units": system}
    if project.info:
        out["info"] = dict(project.info)
    out["materials"] = write_materials(project.materials, system)
    out["plies"] = write_plies(project.plies, system)
    if project.reference_material:
        out["reference_material"] = project.reference_material
    if project.beam is not None:
        out["beam"] = write_beam(project.beam, system)
    if project.design is not None:
        out["design"] = write_design(project.design, system)
    if project.alternatives:
        out["alternatives"] = [{"name": a.name, "plies": write_plies(a.plies, system)}
                               for a in project.alternatives]
    if project.current_alternative is not None:
        out["current_alternative"] = project.current_alternative
    return out


def loads(text: str) -> Project:
    """Parse a project from JSON text."""
    try:
        data = json.loads(text)
    except json.JSONDecodeError as exc:
        raise ProjectError(Problem("", f"not valid JSON: {exc.msg} at line {exc.lineno}, "
                                   f"column {exc.colno}")) from None
    return from_dict(data)


def load(path: str | os.PathLike[str]) -> Project:
    """Read a project file. Raises ProjectError (file problems included).

    Only a regular file is read: a FIFO, device or folder is refused at once (reading a
    FIFO would wait for ever).
    """
    try:
        info = os.stat(path)
        if not stat.S_ISREG(info.st_mode):
            kind = "a folder" if stat.S_ISDIR(info.st_mode) else "not a regular file"
            raise ProjectError(Problem("", f"cannot read {os.fspath(path)}: it is {kind}"))
        text = Path(path).read_text(encoding="utf-8")
    except OSError as exc:
        raise ProjectError(Problem("", f"cannot read {os.fspath(path)}: "
                                   f"{exc.strerror or exc}")) from None
    except UnicodeDecodeError:
        raise ProjectError(Problem("", f"cannot read {os.fspath(path)}: it is not UTF-8 "
                                   "text")) from None
    return loads(text)


def dumps(project: Project) -> str:
    """The project as JSON text."""
    return json.dumps(to_dict(project), indent=2, ensure_ascii=False) + "\n"


def save(project: Project, path: str | os.PathLike[str]) -> None:
    """Write a project atomically (temporary file in the same folder, then rename),
    through a symbolic link to its target, keeping the file's permission bits.
    """
    write_text(path, dumps(project), "file")
