"""Reading the parts of a project file, collecting one named problem per fault."""

from __future__ import annotations

import math
from collections.abc import Mapping
from typing import TYPE_CHECKING, Any

from ..model import units
from ..model.combination import EU_DURATIONS, KINDS, US_DURATIONS, Combination
from ..model.errors import Problem, shown
from ..model.materials import Material, existing_from_record, material_from_record
from ..model.member import (
    CASES,
    LOAD_STAGES,
    BeamLayout,
    Load,
    bearing_problem,
    validate_layout,
    validate_load,
)
from ..model.plies import PLY_STAGES, Ply, validate_ply
from ..pipeline import MAX_PLIES
from .openings_file import read_holes, read_notches

if TYPE_CHECKING:
    from ..model.member import BeamSpec

PLY_KEYS = ("name", "material", "x", "y", "width", "height")
#: Keys a ply may have besides PLY_KEYS: its extent along the member.
PLY_OPTIONAL_KEYS = ("from", "to", "stage")
BEAM_KEYS = frozenset({"spans", "supports", "overhang_left", "overhang_right", "bearing_length",
                       "self_weight", "loads", "combinations", "sustained_live_fraction",
                       "pattern_live_load", "hold_down", "shored", "notches", "holes"})
LOAD_KEYS = frozenset({"case", "type", "value", "tributary_width", "from", "to", "at",
                       "value_end", "description", "bearing_length", "stage"})


#: Where the trade has a range for a bolt diameter: the NDS 2018 12.3 yield limit
#: equations with the Table 12.3.1B reduction terms hold for bolts 1/4 in <= D <= 1 in;
#: EN 1995-1-1 8.5.1.1 gives the embedment strength (8.32) for bolts up to 30 mm, and
#: 8.6(3) asks dowels for more than 6 mm (both from memory). Per basis, (min, max) in m.
BOLT_DIAMETERS = {"US-ASD": (0.25 * 0.0254, 1.0 * 0.0254), "EU-LSD": (0.006, 0.030)}
#: Load factors of a combination: from 0 to 10 (ASCE 7-16 2.4 and EN 1990 Table A1.2
#: use at most 1.6; the bound only keeps the analysis finite).
FACTOR_RANGE = (0.0, 10.0)


def _quantity(raw: Any, dimension: str, path: str, problems: list[Problem]) -> float | None:
    try:
        return units.parse(raw, dimension, path)
    except units.UnitError as exc:
        problems.append(units.problem(exc))
        return None


def _positive(raw: Any, dimension: str, path: str, problems: list[Problem]) -> float | None:
    """A quantity that must be greater than zero (None, with a problem, otherwise)."""
    v = _quantity(raw, dimension, path, problems)
    if v is not None and v <= 0:
        problems.append(Problem(path, "must be greater than zero"))
        return None
    return v


def _number(raw: Any, path: str, problems: list[Problem], lo: float | None = None,
            hi: float | None = None, whole: bool = False) -> float | None:
    """A finite plain number within [lo, hi]; ``whole``: a whole number (a count)."""
    if isinstance(raw, bool) or not isinstance(raw, int | float):
        problems.append(Problem(path, f"{shown(raw)} must be a plain number"))
        return None
    try:
        v = float(raw)
    except OverflowError:
        v = math.inf
    if not math.isfinite(v) or (lo is not None and v < lo) or (hi is not None and v > hi):
        rng = f" between {lo:g} and {hi:g}" if lo is not None and hi is not None else (
            f" of at least {lo:g}" if lo is not None else " (finite)")
        word = "a whole number" if whole else "a number"
        problems.append(Problem(path, f"{shown(raw)} must be {word}{rng}"))
        return None
    if whole and not v.is_integer():
        problems.append(Problem(path, f"{shown(raw)} must be a whole number (a count)"))
        return None
    return v


def _choice(raw: Any, allowed: tuple[str, ...], path: str, problems: list[Problem]) -> str:
    """One of ``allowed`` (the first, with a problem, otherwise)."""
    if isinstance(raw, str) and raw in allowed:
        return raw
    problems.append(Problem(path, f"{shown(raw)} is not one of " + ", ".join(allowed)))
    return allowed[0]


def _flag(raw: Any, path: str, problems: list[Problem]) -> bool:
    if not isinstance(raw, bool):
        problems.append(Problem(path, "must be true or false"))
        return False
    return raw


def read_material_map(raw: Any, path: str, problems: list[Problem],
                      library: Mapping[str, Material] | None = None) -> dict[str, Material]:
    """The project's own materials; existing-timber records resolved against the library
    and the project's ordinary records.
    """
    if not isinstance(raw, dict):
        problems.append(Problem(path, "must be an object of material records by id"))
        return {}
    out = {}
    for mid, rec in raw.items():
        if isinstance(rec, dict) and "existing" in rec:
            continue
        m, probs = material_from_record(mid, rec, f"{path}.{mid}")
        problems.extend(probs)
        if m is not None:
            out[mid] = m
    known = {**(library or {}), **out}
    resolved = {}
    for mid, rec in raw.items():
        if isinstance(rec, dict) and "existing" in rec:
            m, probs = existing_from_record(mid, rec, known, f"{path}.{mid}")
            problems.extend(probs)
            if m is not None:
                resolved[mid] = m
    return {mid: out.get(mid) or resolved[mid] for mid in raw if mid in out or mid in resolved}


def read_plies(raw: Any, path: str, known: Mapping[str, Material],
               problems: list[Problem]) -> tuple[Ply, ...]:
    """The plies, in stacking order."""
    if not isinstance(raw, list):
        problems.append(Problem(path, "must be a list of plies"))
        return ()
    if len(raw) > MAX_PLIES:
        problems.append(Problem(path, f"has {len(raw)} plies; Plystack analyses at most "
                                f"{MAX_PLIES}"))
        return ()
    out = []
    for i, rec in enumerate(raw):
        p = f"{path}[{i}]"
        if not isinstance(rec, dict):
            problems.append(Problem(p, "must be an object with name, material, x, y, width, "
                                    "height"))
            continue
        before = len(problems)
        for key in rec:
            if key not in PLY_KEYS and key not in PLY_OPTIONAL_KEYS:
                problems.append(Problem(f"{p}.{key}", "is not a known key of a ply"))
        for key in PLY_KEYS:
            if key not in rec:
                problems.append(Problem(f"{p}.{key}", "is missing"))
        name = rec.get("name", f"ply {i + 1}")
        if not isinstance(name, str):
            problems.append(Problem(f"{p}.name", "must be text"))
        elif not name.strip():
            problems.append(Problem(f"{p}.name", "is empty; every ply needs a name (the "
                                    "checks, overrides and --ply name it)"))
        mat = rec.get("material")
        if "material" in rec and (not isinstance(mat, str) or mat not in known):
            problems.append(Problem(f"{p}.material", f"{shown(mat)} is not a known material "
                                    "(not in the project's materials nor the library)"))
        dims = {k: _quantity(rec[k], "length", f"{p}.{k}", problems)
                for k in ("x", "y", "width", "height") if k in rec}
        ends = {k: _quantity(rec[k], "length", f"{p}.{k}", problems)
                for k in ("from", "to") if k in rec}
        stage = _choice(rec.get("stage", "existing"), PLY_STAGES, f"{p}.stage", problems)
        if len(problems) > before:
            continue
        ply = Ply(str(name), str(mat), float(dims["x"] or 0.0), float(dims["y"] or 0.0),
                  float(dims["width"] or 0.0), float(dims["height"] or 0.0),
                  start=ends.get("from"), end=ends.get("to"), stage=stage)
        probs = validate_ply(ply, p)
        problems.extend(probs)
        if not probs:
            out.append(ply)
    return tuple(out)


def read_beam(raw: Any, path: str, problems: list[Problem], system: str = "SI"
              ) -> BeamSpec | None:
    """The "beam" object (``system``: the display units its messages give lengths in)."""
    from ..model.member import BeamSpec

    if not isinstance(raw, dict):
        problems.append(Problem(path, "must be an object"))
        return None
    before = len(problems)
    for key in raw:
        if key not in BEAM_KEYS:
            problems.append(Problem(f"{path}.{key}", "is not a known key of the beam"))
    spans_raw = raw.get("spans")
    spans: list[float] = []
    if not isinstance(spans_raw, list) or not spans_raw:
        problems.append(Problem(f"{path}.spans", "must be a list of one or more spans"))
    else:
        for i, s in enumerate(spans_raw):
            v = _quantity(s, "length", f"{path}.spans[{i}]", problems)
            if v is not None:
                if v <= 0:
                    problems.append(Problem(f"{path}.spans[{i}]", "must be greater than zero"))
                spans.append(v)
    supports = raw.get("supports", "simple")
    if not isinstance(supports, str):
        problems.append(Problem(f"{path}.supports", "must be text"))
        supports = "simple"
    over = {}
    for side in ("overhang_left", "overhang_right"):
        over[side] = 0.0
        if side in raw:
            v = _quantity(raw[side], "length", f"{path}.{side}", problems)
            over[side] = v if v is not None else 0.0
    bearing = None
    if "bearing_length" in raw:
        bearing = _positive(raw["bearing_length"], "length", f"{path}.bearing_length", problems)
    self_weight = _flag(raw.get("self_weight", True), f"{path}.self_weight", problems)
    layout = BeamLayout(tuple(spans), supports, over["overhang_left"], over["overhang_right"])
    if len(problems) == before:
        problems.extend(validate_layout(layout, path))
        why = None if bearing is None else bearing_problem(bearing, layout, system)
        if why is not None:
            problems.append(Problem(f"{path}.bearing_length", why))
    loads = _read_loads(raw.get("loads", []), f"{path}.loads", layout, problems, system)
    combos = (read_combinations(raw["combinations"], f"{path}.combinations", problems)
              if "combinations" in raw else None)
    frac = None
    if "sustained_live_fraction" in raw:
        frac = _number(raw["sustained_live_fraction"], f"{path}.sustained_live_fraction",
                       problems, 0.0, 1.0)
    pattern = _flag(raw.get("pattern_live_load", True), f"{path}.pattern_live_load", problems)
    shored = _flag(raw.get("shored", False), f"{path}.shored", problems)
    hold_down = None
    if "hold_down" in raw:
        hold_down = _positive(raw["hold_down"], "force", f"{path}.hold_down", problems)
    notches = read_notches(raw.get("notches", []), f"{path}.notches", layout, problems,
                           system)
    holes = read_holes(raw.get("holes", []), f"{path}.holes", layout, problems, system)
    if len(problems) > before:
        return None
    return BeamSpec(layout, loads, self_weight, bearing, combos, frac, pattern, hold_down,
                    shored, notches, holes)


def _load_positions(rec: dict[str, Any], typ: str, dim: str, p: str,
                    problems: list[Problem]) -> tuple[float | None, ...]:
    """from, to, at, value_end and bearing_length of one load record (None where absent)."""
    start = end = at = value_end = lb = None
    if typ == "point":
        for key in ("from", "to"):
            if key in rec:
                problems.append(Problem(f"{p}.{key}", "does not apply to a point load; "
                                        'use "at"'))
        if "at" not in rec:
            problems.append(Problem(f"{p}.at", "is missing (where the point load acts)"))
        else:
            at = _quantity(rec["at"], "length", f"{p}.at", problems)
        if "bearing_length" in rec:
            lb = _positive(rec["bearing_length"], "length", f"{p}.bearing_length", problems)
    else:
        if "at" in rec:
            problems.append(Problem(f"{p}.at", 'only applies to point loads; use "from" '
                                    'and "to"'))
        if "bearing_length" in rec:
            problems.append(Problem(f"{p}.bearing_length", "only applies to point loads "
                                    "(the supports' bearing length is beam.bearing_length)"))
        if "value_end" in rec:
            value_end = _quantity(rec["value_end"], dim, f"{p}.value_end", problems)
        if "from" in rec:
            start = _quantity(rec["from"], "length", f"{p}.from", problems)
        if "to" in rec:
            end = _quantity(rec["to"], "length", f"{p}.to", problems)
    return start, end, at, value_end, lb


def _read_loads(raw: Any, path: str, layout: BeamLayout,
                problems: list[Problem], system: str) -> tuple[Load, ...]:
    if not isinstance(raw, list):
        problems.append(Problem(path, "must be a list of loads"))
        return ()
    out = []
    length = layout.length
    for i, rec in enumerate(raw):
        p = f"{path}[{i}]"
        if not isinstance(rec, dict):
            problems.append(Problem(p, "must be an object with case, type and value"))
            continue
        before = len(problems)
        for key in rec:
            if key not in LOAD_KEYS:
                problems.append(Problem(f"{p}.{key}", "is not a known key of a load"))
        case = rec.get("case")
        if case not in CASES:
            problems.append(Problem(f"{p}.case", f"{shown(case)} is not a load case; use one of "
                                    + ", ".join(CASES)))
        typ = rec.get("type")
        dims = {"area": "area_load", "line": "line_load", "point": "force"}
        if not isinstance(typ, str) or typ not in dims:
            problems.append(Problem(f"{p}.type", f"{shown(typ)} is not one of area, line, "
                                    "point"))
            continue
        if "value" not in rec:
            problems.append(Problem(f"{p}.value", "is missing"))
            continue
        value = _quantity(rec["value"], dims[typ], f"{p}.value", problems)
        trib = None
        if typ == "area":
            if "tributary_width" not in rec:
                problems.append(Problem(f"{p}.tributary_width", "is missing (an area load "
                                        "needs the width it is collected from)"))
            else:
                trib = _positive(rec["tributary_width"], "length", f"{p}.tributary_width",
                                 problems)
        elif "tributary_width" in rec:
            problems.append(Problem(f"{p}.tributary_width", "only applies to area loads"))
        start, end, at, value_end, lb = _load_positions(rec, typ, dims[typ], p, problems)
        stage = _choice(rec.get("stage", "after"), LOAD_STAGES, f"{p}.stage", problems)
        description = rec.get("description", "")
        if not isinstance(description, str):
            problems.append(Problem(f"{p}.description", "must be text"))
        if len(problems) > before or value is None:
            continue
        if typ == "point" and "value_end" in rec:
            problems.append(Problem(f"{p}.value_end", "only applies to area and line loads"))
            continue
        load = Load(str(case), str(typ), value, trib, start, end, at, value_end, description,
                    lb, stage)
        if length > 0:
            probs = validate_load(load, length, p, system)
            problems.extend(probs)
            if probs:
                continue
        out.append(load)
    return tuple(out)


def read_combinations(raw: Any, path: str,
                      problems: list[Problem]) -> str | tuple[Combination, ...]:
    """"ASD", "EN1990" or a list of {"name", "factors", "duration"}."""
    if isinstance(raw, str):
        if raw not in ("ASD", "EN1990"):
            problems.append(Problem(path, f'"{raw}" is not a known set; use "ASD", "EN1990" '
                                    "or a list of combinations"))
            return "ASD"
        return raw
    if not isinstance(raw, list) or not raw:
        problems.append(Problem(path, 'must be "ASD", "EN1990" or a list of combinations'))
        return "ASD"
    out = []
    for i, rec in enumerate(raw):
        p = f"{path}[{i}]"
        if not isinstance(rec, dict):
            problems.append(Problem(p, 'must be an object with "name" and "factors"'))
            continue
        for key in rec:
            if key not in ("name", "factors", "duration", "kind"):
                problems.append(Problem(f"{p}.{key}", "is not a known key of a combination"))
        name = rec.get("name")
        if not isinstance(name, str) or not name:
            problems.append(Problem(f"{p}.name", "must be non-empty text"))
            continue
        factors = rec.get("factors")
        if not isinstance(factors, dict) or not factors:
            problems.append(Problem(f"{p}.factors", 'must be an object such as {"D": 1, "L": 1}'))
            continue
        fs: dict[str, float] = {}
        for case, f in factors.items():
            if case not in CASES:
                problems.append(Problem(f"{p}.factors.{case}", "is not a load case; use one of "
                                        + ", ".join(CASES)))
                continue
            v = _number(f, f"{p}.factors.{case}", problems, *FACTOR_RANGE)
            if v is not None:
                fs[case] = v
        duration = rec.get("duration")
        if duration is not None and duration not in US_DURATIONS + EU_DURATIONS:
            problems.append(Problem(f"{p}.duration", f"{shown(duration)} is not a load duration; "
                                    "use "
                                    "one of " + ", ".join(US_DURATIONS + EU_DURATIONS)))
            duration = None
        kind = rec.get("kind")
        if kind is not None and kind not in KINDS:
            problems.append(Problem(f"{p}.kind", f"{shown(kind)} is not a kind of combination; use "
                                    "one of " + ", ".join(KINDS)))
            kind = None
        out.append(Combination(name, fs, duration, kind, custom=True))
    return tuple(out)
