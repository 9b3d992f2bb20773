"""The project file (``*.plystack.json``): read, write, atomic save.

Loading reports one :class:`Problem` per fault, each naming the path of the field.
Saving writes a temporary file beside the target and renames it over the target, so a
failed save never destroys the old file.
"""

from __future__ import annotations

import json
import os
import re
import stat
from collections.abc import Mapping, Sequence
from pathlib import Path
from typing import Any

from ..model.design import DesignSpec
from ..model.errors import Problem, ProjectError, shown
from ..model.materials import Material
from ..model.member import BeamSpec
from ..model.plies import Ply, validate_extent
from ..model.project import Alternative, Project
from .atomic import write_text
from .design_file import read_design, write_design
from .library import load_library
from .project_read import read_beam, read_material_map, read_plies
from .project_write import write_beam, write_materials, write_plies

FORMAT = "plystack"
VERSION = 1
TOP_KEYS = frozenset({"format", "version", "title", "display_units", "materials", "plies",
                      "reference_material", "beam", "design", "info", "alternatives",
                      "current_alternative"})
INFO_KEYS = ("member", "prepared_by", "checked_by", "date", "revision", "description",
             "job", "address", "licence")
#: Largest project file read, in bytes (the bundled demos are about 5 kB).
MAX_FILE_BYTES = 16 * 1024 * 1024
#: Deepest nesting of JSON objects and lists (a project needs 6).
MAX_DEPTH = 32
#: Most digits of a whole number in the JSON text.
MAX_INT_DIGITS = 30
#: Most alternatives in one project (each is analysed by ``compare``).
MAX_ALTERNATIVES = 100
#: Most plies in one file, the design's and every alternative's together.
MAX_TOTAL_PLIES = 1000

_JSON_TOKEN = re.compile(r'"(?:[^"\\]|\\.)*"|[\[\]{}]')


class _JsonLimit(Exception):
    """A bound of the JSON text was exceeded (turned into a named problem)."""


def _json_depth_ok(text: str) -> None:
    depth = 0
    for m in _JSON_TOKEN.finditer(text):
        c = m.group()
        if c in "[{":
            depth += 1
            if depth > MAX_DEPTH:
                raise _JsonLimit(f"objects and lists are nested more than {MAX_DEPTH} deep "
                                 f"(line {text.count(chr(10), 0, m.start()) + 1})")
        elif c in "]}":
            depth -= 1


def _int(text: str) -> int:
    if len(text.lstrip("-")) > MAX_INT_DIGITS:
        raise _JsonLimit(f"holds a number of more than {MAX_INT_DIGITS} digits")
    return int(text)


def _object(pairs: list[tuple[str, Any]]) -> dict[str, Any]:
    out: dict[str, Any] = {}
    for key, value in pairs:
        if key in out:
            raise _JsonLimit(f'the key "{shown(key)[1:-1]}" appears twice in one object; '
                             "give every key once (every material id, every name)")
        out[key] = value
    return out


def _text_problems(data: Any) -> list[Problem]:
    """Nesting deeper than MAX_DEPTH and text that cannot be written as UTF-8 (a lone
    surrogate such as U+D800), each at its path. Walks without recursion.
    """
    problems: list[Problem] = []
    stack: list[tuple[str, Any, int]] = [("", data, 0)]
    while stack:
        path, value, depth = stack.pop()
        if depth > MAX_DEPTH:
            problems.append(Problem(path, f"is nested more than {MAX_DEPTH} deep"))
            continue
        items: list[tuple[str, Any]] = []
        if isinstance(value, dict):
            items = [(f"{path}.{k}" if path else str(k), v) for k, v in value.items()]
            for k in value:
                if isinstance(k, str) and not _encodable(k):
                    problems.append(Problem(path or "(top level)", _SURROGATE))
        elif isinstance(value, list):
            items = [(f"{path}[{i}]", v) for i, v in enumerate(value)]
        elif isinstance(value, str) and not _encodable(value):
            problems.append(Problem(path, _SURROGATE))
        stack.extend((p, v, depth + 1) for p, v in reversed(items))
    return problems


_SURROGATE = ("holds a character that cannot be written as UTF-8 (a lone surrogate such "
              'as "\\ud800"); remove it')


def _refuse_hostile(data: dict[str, Any]) -> None:
    """Nesting, text and size that would make reading or analysing fail or hang."""
    bad_text = _text_problems(data)
    if bad_text:
        raise ProjectError(bad_text)
    total = _ply_count(data)
    if total > MAX_TOTAL_PLIES:
        raise ProjectError(Problem("plies", f"the design and its alternatives hold {total} "
                                   f"plies; a project file holds at most {MAX_TOTAL_PLIES}"))


def _ply_count(data: dict[str, Any]) -> int:
    lists = [data.get("plies")]
    alternatives = data.get("alternatives")
    if isinstance(alternatives, list):
        lists += [a.get("plies") for a in alternatives if isinstance(a, dict)]
    return sum(len(p) for p in lists if isinstance(p, list))


def _encodable(text: str) -> bool:
    try:
        text.encode("utf-8")
    except UnicodeEncodeError:
        return False
    return True


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
    _refuse_hostile(data)
    for key in data:
        if key not in TOP_KEYS:
            problems.append(Problem(key, "is not a known key of a project file"))
    if data.get("format") != FORMAT:
        problems.append(Problem("format", f'must be "{FORMAT}" (got {shown(data.get("format"))})'))
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
    materials = read_material_map(data.get("materials", {}), "materials", problems, lib)
    known = {**lib, **materials}
    if "plies" not in data:
        problems.append(Problem("plies", "is missing"))
    plies = read_plies(data.get("plies", []), "plies", known, problems)
    ref = data.get("reference_material")
    if ref is not None and (not isinstance(ref, str) or ref not in known):
        problems.append(Problem("reference_material", f"{shown(ref)} is not a known material"))
        ref = None
    beam_spec = None
    if "beam" in data:
        beam_spec = read_beam(data["beam"], "beam", problems, units)
    design = None
    if "design" in data:
        design = read_design(data["design"], "design", problems)
    info = _read_info(data.get("info", {}), problems)
    alternatives = []
    raw_alt = data.get("alternatives", [])
    if not isinstance(raw_alt, list):
        problems.append(Problem("alternatives", "must be a list"))
    elif len(raw_alt) > MAX_ALTERNATIVES:
        problems.append(Problem("alternatives", f"has {len(raw_alt)} alternatives; at most "
                                f"{MAX_ALTERNATIVES}"))
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
    problems.extend(_combination_kinds(beam_spec, design))
    problems.extend(extent_problems(plies, "plies", beam_spec, units))
    for i, alt_ in enumerate(alternatives):
        problems.extend(extent_problems(alt_.plies, f"alternatives[{i}].plies", beam_spec,
                                        units))
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


def extent_problems(plies: Sequence[Ply], path: str, beam: BeamSpec | None,
                    system: str = "SI") -> list[Problem]:
    """Named problems of the plies' "from" / "to" along the member (lengths in the
    messages in the display units of ``system``).
    """
    out: list[Problem] = []
    for i, ply in enumerate(plies):
        p = f"{path}[{i}]"
        if beam is None:
            out += [Problem(f"{p}.{k}", "needs a beam (positions along the member)")
                    for k, v in (("from", ply.start), ("to", ply.end)) if v is not None]
        else:
            out += validate_extent(ply, beam.layout.length, p, system)
    return out


def _read_info(raw_info: Any, problems: list[Problem]) -> dict[str, str]:
    """The "info" object (texts for the calculation sheet's title block)."""
    info: dict[str, str] = {}
    if not isinstance(raw_info, dict):
        problems.append(Problem("info", "must be an object"))
        return info
    for k, v in raw_info.items():
        if k not in INFO_KEYS:
            problems.append(Problem(f"info.{k}", "is not a known key; use one of "
                                    + ", ".join(INFO_KEYS)))
        elif not isinstance(v, str):
            problems.append(Problem(f"info.{k}", "must be text"))
        else:
            info[k] = v
    return info


def _combination_kinds(beam: BeamSpec | None, design: DesignSpec | None) -> list[Problem]:
    """On the EU basis every combination of the user's list must say its kind."""
    if beam is None or design is None or design.us or not isinstance(beam.combinations, tuple):
        return []
    return [Problem(f"beam.combinations[{i}].kind", "is missing: on the EU-LSD basis every "
                    "combination says what it is for (ULS, SLS-characteristic, SLS-frequent "
                    "or SLS-quasi-permanent)")
            for i, c in enumerate(beam.combinations) if c.kind is None]


def unique_names(names: Sequence[str], path: str, what: str, problems: list[Problem]
                 ) -> None:
    """One problem per name used twice (``path[i].name``)."""
    seen: set[str] = set()
    for i, name in enumerate(names):
        if name in seen:
            problems.append(Problem(f"{path}[{i}].name", f"{shown(name)} is the name of an "
                                    f"earlier {what}; every {what} needs its own name"))
        seen.add(name)


def name_problems(project: Project) -> list[Problem]:
    """Names used twice: plies (in the design and in each alternative), alternatives and
    combinations. The file reader accepts them (the desktop program can make them while
    editing, and must open what it saved); commands that pick a ply, an alternative or a
    combination by name refuse them, since the name would be ambiguous.
    """
    problems: list[Problem] = []
    unique_names([p.name for p in project.plies], "plies", "ply", problems)
    for i, alt in enumerate(project.alternatives):
        unique_names([p.name for p in alt.plies], f"alternatives[{i}].plies", "ply", problems)
    unique_names([a.name for a in project.alternatives], "alternatives", "alternative",
                 problems)
    combos = project.beam.combinations if project.beam is not None else None
    if isinstance(combos, tuple):
        unique_names([c.name for c in combos], "beam.combinations", "combination", problems)
    return problems


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


def parse_json(text: str) -> Any:
    """The parsed JSON of a project file's text (not yet read as a project)."""
    try:
        _json_depth_ok(text)
        return json.loads(text, object_pairs_hook=_object, parse_int=_int)
    except json.JSONDecodeError as exc:
        raise ProjectError(Problem("", f"not valid JSON: {exc.msg} at line {exc.lineno}, "
                                   f"column {exc.colno}")) from None
    except _JsonLimit as exc:
        raise ProjectError(Problem("", f"the file cannot be read: {exc}")) from None
    except (ValueError, RecursionError):
        raise ProjectError(Problem("", "not valid JSON: a value cannot be read")) from None


def loads(text: str) -> Project:
    """Parse a project from JSON text."""
    return from_dict(parse_json(text))


def load(path: str | os.PathLike[str]) -> Project:
    """Read a project file. Raises ProjectError (file problems included)."""
    return from_dict(load_data(path))


def load_data(path: str | os.PathLike[str]) -> Any:
    """The parsed JSON of a project file, before it is read as a project (for callers
    that change keys first, as a member schedule does). Raises ProjectError.

    Only a regular file is read: a FIFO, device or folder is refused at once (reading a
    FIFO would wait for ever).
    """
    try:
        info = os.stat(path)
        if not stat.S_ISREG(info.st_mode):
            kind = "a folder" if stat.S_ISDIR(info.st_mode) else "not a regular file"
            raise ProjectError(Problem("", f"cannot read {os.fspath(path)}: it is {kind}"))
        if info.st_size > MAX_FILE_BYTES:
            raise ProjectError(Problem("", f"cannot read {os.fspath(path)}: it is larger than "
                                       f"{MAX_FILE_BYTES // (1024 * 1024)} MB, more than a "
                                       "project file holds"))
        text = Path(path).read_text(encoding="utf-8")
    except OSError as exc:
        raise ProjectError(Problem("", f"cannot read {os.fspath(path)}: "
                                   f"{exc.strerror or exc}")) from None
    except UnicodeDecodeError:
        raise ProjectError(Problem("", f"cannot read {os.fspath(path)}: it is not UTF-8 "
                                   "text")) from None
    return parse_json(text)


def dumps(project: Project) -> str:
    """The project as JSON text."""
    return json.dumps(to_dict(project), indent=2, ensure_ascii=False) + "\n"


def save(project: Project, path: str | os.PathLike[str]) -> None:
    """Write a project atomically (temporary file in the same folder, then rename),
    through a symbolic link to its target, keeping the file's permission bits.

    Raises:
        ProjectError: text that cannot be written as UTF-8, naming its field (nothing is
            written); or a target that is a folder, FIFO or device.

    """
    data = to_dict(project)
    bad_text = _text_problems(data)
    if bad_text:
        raise ProjectError(bad_text)
    write_text(path, json.dumps(data, indent=2, ensure_ascii=False) + "\n", "file")
