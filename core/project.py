"""The project: section, beam and design choices, and its JSON file (``*.plystack.json``).

Loading reports one :class:`Problem` per fault, each naming the path of the field.
Saving writes a temporary file beside the target and renames it over the target, so a
failed save never destroys the old file.
"""

from __future__ import annotations

import json
import os
import tempfile
from collections.abc import Mapping
from dataclasses import dataclass, field, replace
from pathlib import Path
from typing import Any

from core.beam import BeamLayout, Load
from core.combinations import Combination
from core.design import DesignSpec
from core.errors import Problem, ProjectError
from core.geometry import Ply
from core.materials import Material, load_library
from core.project_read import read_beam, read_design, read_material_map, read_plies
from core.project_write import write_beam, write_design, write_materials, write_plies

FORMAT = "plystack"
VERSION = 1
TOP_KEYS = frozenset({"format", "version", "title", "display_units", "materials", "plies",
                      "reference_material", "beam", "design", "info", "alternatives",
                      "current_alternative"})
INFO_KEYS = ("member", "prepared_by", "checked_by", "date", "revision", "description")


@dataclass(frozen=True)
class BeamSpec:
    """The beam: layout, loads and the choices that go with them.

    Attributes:
        layout: spans and supports.
        loads: the loads, by case.
        self_weight: add the member's weight as case D.
        bearing_length: m, for the bearing check (None: not checked).
        combinations: "ASD", "EN1990", an explicit tuple, or None for the design
            basis's own set (ASD for US-ASD, EN1990 for EU-LSD).
        sustained_live_fraction: part of L that is sustained (creep), 0 to 1.

    """

    layout: BeamLayout
    loads: tuple[Load, ...] = ()
    self_weight: bool = True
    bearing_length: float | None = None
    combinations: str | tuple[Combination, ...] | None = None
    sustained_live_fraction: float | None = None


@dataclass(frozen=True)
class Alternative:
    """A named variant of the section (its own plies; everything else shared)."""

    name: str
    plies: tuple[Ply, ...]


@dataclass(frozen=True)
class Project:
    """Everything the user entered. Frozen: edits return new projects (cheap undo)."""

    title: str = "Untitled"
    display_units: str = "US"
    materials: Mapping[str, Material] = field(default_factory=dict)
    plies: tuple[Ply, ...] = ()
    reference_material: str | None = None
    beam: BeamSpec | None = None
    design: DesignSpec | None = None
    info: Mapping[str, str] = field(default_factory=dict)
    alternatives: tuple[Alternative, ...] = ()

    def all_materials(self) -> dict[str, Material]:
        """Library materials overlaid by the project's own (project wins)."""
        return {**load_library(), **self.materials}

    def with_plies(self, plies: tuple[Ply, ...]) -> Project:
        """Return a copy with other plies."""
        return replace(self, plies=tuple(plies))

    def design_or_default(self) -> DesignSpec:
        """The design choices, or the defaults of the US basis."""
        return self.design or DesignSpec()


def from_dict(data: Any) -> Project:
    """Build a project from parsed JSON. Raises ProjectError with every problem found."""
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
    known = {**load_library(), **materials}
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
    if problems:
        raise ProjectError(problems)
    return Project(title=title, display_units=units, materials=materials, plies=plies,
                   reference_material=ref, beam=beam_spec, design=design, info=info,
                   alternatives=tuple(alternatives))


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
    """Read a project file. Raises ProjectError (file problems included)."""
    try:
        text = Path(path).read_text(encoding="utf-8")
    except (OSError, UnicodeDecodeError) as exc:
        raise ProjectError(Problem("", f"cannot read {path}: {exc}")) from None
    return loads(text)


def dumps(project: Project) -> str:
    """The project as JSON text."""
    return json.dumps(to_dict(project), indent=2, ensure_ascii=False) + "\n"


def save(project: Project, path: str | os.PathLike[str]) -> None:
    """Write a project atomically: temporary file in the same folder, then rename."""
    target = Path(path)
    text = dumps(project)
    fd, tmp = tempfile.mkstemp(prefix=f".{target.name}.", suffix=".tmp",
                               dir=str(target.parent or Path(".")))
    try:
        with os.fdopen(fd, "w", encoding="utf-8") as fh:
            fh.write(text)
            fh.flush()
            os.fsync(fh.fileno())
        os.replace(tmp, target)
    except BaseException:
        try:
            os.unlink(tmp)
        except OSError:
            pass
        raise
