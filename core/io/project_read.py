"""Reading the parts of a project file, collecting one named problem per fault."""

from __future__ import annotations

from collections.abc import Mapping
from typing import TYPE_CHECKING, Any

from ..model import units
from ..model.combination import EU_DURATIONS, US_DURATIONS, Combination
from ..model.design import BASES, STEEL_RULES, TEMPERATURES, Bolt, Connector, DesignSpec
from ..model.errors import Problem
from ..model.materials import Material, material_from_record
from ..model.member import CASES, BeamLayout, Load, validate_layout, validate_load
from ..model.plies import Ply, validate_ply

if TYPE_CHECKING:
    from ..model.member import BeamSpec

PLY_KEYS = ("name", "material", "x", "y", "width", "height")
BEAM_KEYS = frozenset({"spans", "supports", "overhang_left", "overhang_right", "bearing_length",
                       "self_weight", "loads", "combinations", "sustained_live_fraction"})
LOAD_KEYS = frozenset({"case", "type", "value", "tributary_width", "from", "to", "at",
                       "description"})
DESIGN_KEYS = frozenset({"basis", "wet_service", "temperature", "repetitive_member", "incised",
                         "compression_edge_braced", "unbraced_length", "deflection_limits",
                         "K_cr", "k_def", "steel_rule", "service_class", "psi", "overrides",
                         "connector", "bolt", "steel_bears"})


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
            hi: float | None = None) -> float | None:
    if isinstance(raw, bool) or not isinstance(raw, int | float):
        problems.append(Problem(path, f"{raw!r} must be a plain number"))
        return None
    v = float(raw)
    if v != v or (lo is not None and v < lo) or (hi is not None and v > hi):
        rng = f" between {lo:g} and {hi:g}" if lo is not None and hi is not None else (
            f" of at least {lo:g}" if lo is not None else "")
        problems.append(Problem(path, f"{raw!r} must be a number{rng}"))
        return None
    return v


def _flag(raw: Any, path: str, problems: list[Problem]) -> bool:
    if not isinstance(raw, bool):
        problems.append(Problem(path, "must be true or false"))
        return False
    return raw


def read_material_map(raw: Any, path: str, problems: list[Problem]) -> dict[str, Material]:
    """The project's own materials."""
    if not isinstance(raw, dict):
        problems.append(Problem(path, "must be an object of material records by id"))
        return {}
    out = {}
    for mid, rec in raw.items():
        m, probs = material_from_record(mid, rec, f"{path}.{mid}")
        problems.extend(probs)
        if m is not None:
            out[mid] = m
    return out


def read_plies(raw: Any, path: str, known: Mapping[str, Material],
               problems: list[Problem]) -> tuple[Ply, ...]:
    """The plies, in stacking order."""
    if not isinstance(raw, list):
        problems.append(Problem(path, "must be a list of plies"))
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
            if key not in PLY_KEYS:
                problems.append(Problem(f"{p}.{key}", "is not a known key of a ply"))
        for key in PLY_KEYS:
            if key not in rec:
                problems.append(Problem(f"{p}.{key}", "is missing"))
        name = rec.get("name", f"ply {i + 1}")
        if not isinstance(name, str):
            problems.append(Problem(f"{p}.name", "must be text"))
        mat = rec.get("material")
        if "material" in rec and (not isinstance(mat, str) or mat not in known):
            problems.append(Problem(f"{p}.material", f"{mat!r} is not a known material (not "
                                    "in the project's materials nor the library)"))
        dims = {k: _quantity(rec[k], "length", f"{p}.{k}", problems)
                for k in ("x", "y", "width", "height") if k in rec}
        if len(problems) > before:
            continue
        ply = Ply(str(name), str(mat), float(dims["x"] or 0.0), float(dims["y"] or 0.0),
                  float(dims["width"] or 0.0), float(dims["height"] or 0.0))
        probs = validate_ply(ply, p)
        problems.extend(probs)
        if not probs:
            out.append(ply)
    return tuple(out)


def read_beam(raw: Any, path: str, problems: list[Problem]) -> BeamSpec | None:
    """The "beam" object."""
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
    loads = _read_loads(raw.get("loads", []), f"{path}.loads", layout, problems)
    combos = (read_combinations(raw["combinations"], f"{path}.combinations", problems)
              if "combinations" in raw else None)
    frac = None
    if "sustained_live_fraction" in raw:
        frac = _number(raw["sustained_live_fraction"], f"{path}.sustained_live_fraction",
                       problems, 0.0, 1.0)
    if len(problems) > before:
        return None
    return BeamSpec(layout, loads, self_weight, bearing, combos, frac)


def _read_loads(raw: Any, path: str, layout: BeamLayout,
                problems: list[Problem]) -> tuple[Load, ...]:
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
            problems.append(Problem(f"{p}.case", f"{case!r} is not a load case; use one of "
                                    + ", ".join(CASES)))
        typ = rec.get("type")
        dims = {"area": "area_load", "line": "line_load", "point": "force"}
        if typ not in dims:
            problems.append(Problem(f"{p}.type", f"{typ!r} is not one of area, line, point"))
            continue
        if "value" not in rec:
            problems.append(Problem(f"{p}.value", "is missing"))
            continue
        value = _quantity(rec["value"], dims[typ], f"{p}.value", problems)
        trib = start = end = at = None
        if typ == "area":
            if "tributary_width" not in rec:
                problems.append(Problem(f"{p}.tributary_width", "is missing (an area load "
                                        "needs the width it is collected from)"))
            else:
                trib = _quantity(rec["tributary_width"], "length", f"{p}.tributary_width",
                                 problems)
        elif "tributary_width" in rec:
            problems.append(Problem(f"{p}.tributary_width", "only applies to area loads"))
        if typ == "point":
            for key in ("from", "to"):
                if key in rec:
                    problems.append(Problem(f"{p}.{key}", "does not apply to a point load; "
                                            'use "at"'))
            if "at" not in rec:
                problems.append(Problem(f"{p}.at", "is missing (where the point load acts)"))
            else:
                at = _quantity(rec["at"], "length", f"{p}.at", problems)
        else:
            if "at" in rec:
                problems.append(Problem(f"{p}.at", 'only applies to point loads; use "from" '
                                        'and "to"'))
            if "from" in rec:
                start = _quantity(rec["from"], "length", f"{p}.from", problems)
            if "to" in rec:
                end = _quantity(rec["to"], "length", f"{p}.to", problems)
        description = rec.get("description", "")
        if not isinstance(description, str):
            problems.append(Problem(f"{p}.description", "must be text"))
        if len(problems) > before or value is None:
            continue
        load = Load(str(case), str(typ), value, trib, start, end, at, description)
        if length > 0:
            probs = validate_load(load, length, p)
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
            if key not in ("name", "factors", "duration"):
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
            v = _number(f, f"{p}.factors.{case}", problems)
            if v is not None:
                fs[case] = v
        duration = rec.get("duration")
        if duration is not None and duration not in US_DURATIONS + EU_DURATIONS:
            problems.append(Problem(f"{p}.duration", f"{duration!r} is not a load duration; use "
                                    "one of " + ", ".join(US_DURATIONS + EU_DURATIONS)))
            duration = None
        out.append(Combination(name, fs, duration, "custom"))
    return tuple(out)


def read_design(raw: Any, path: str, problems: list[Problem]) -> DesignSpec | None:
    """The "design" object."""
    if not isinstance(raw, dict):
        problems.append(Problem(path, "must be an object"))
        return None
    before = len(problems)
    for key in raw:
        if key not in DESIGN_KEYS:
            problems.append(Problem(f"{path}.{key}", "is not a known key of the design"))
    basis = raw.get("basis", "US-ASD")
    if basis not in BASES:
        problems.append(Problem(f"{path}.basis", f"{basis!r} must be one of " + ", ".join(BASES)))
    kw: dict[str, Any] = {"basis": basis}
    for key in ("wet_service", "repetitive_member", "incised", "compression_edge_braced",
                "steel_bears"):
        if key in raw:
            kw[key] = _flag(raw[key], f"{path}.{key}", problems)
    if "temperature" in raw:
        if raw["temperature"] not in TEMPERATURES:
            problems.append(Problem(f"{path}.temperature", "must be one of "
                                    + ", ".join(TEMPERATURES)))
        else:
            kw["temperature"] = raw["temperature"]
    if "steel_rule" in raw:
        if raw["steel_rule"] not in STEEL_RULES:
            problems.append(Problem(f"{path}.steel_rule", "must be one of "
                                    + ", ".join(STEEL_RULES)))
        else:
            kw["steel_rule"] = raw["steel_rule"]
    if "service_class" in raw:
        if raw["service_class"] not in (1, 2, 3) or isinstance(raw["service_class"], bool):
            problems.append(Problem(f"{path}.service_class", "must be 1, 2 or 3"))
        else:
            kw["service_class"] = int(raw["service_class"])
    if "K_cr" in raw:
        kw["K_cr"] = _number(raw["K_cr"], f"{path}.K_cr", problems, 1.0, 5.0)
    if "k_def" in raw:
        kw["k_def"] = _number(raw["k_def"], f"{path}.k_def", problems, 0.0, 5.0)
    if "unbraced_length" in raw:
        kw["unbraced_length"] = _quantity(raw["unbraced_length"], "length",
                                          f"{path}.unbraced_length", problems)
    limits = raw.get("deflection_limits", {})
    if not isinstance(limits, dict):
        problems.append(Problem(f"{path}.deflection_limits", 'must be an object such as '
                                '{"live": 360, "total": 240}'))
    else:
        for key, value in limits.items():
            if key not in ("live", "total", "long_term"):
                problems.append(Problem(f"{path}.deflection_limits.{key}", "is not one of live, "
                                        "total, long_term"))
                continue
            kw[f"{key}_limit"] = _number(value, f"{path}.deflection_limits.{key}", problems,
                                         1.0, 100000.0)
    psi = raw.get("psi", {})
    if not isinstance(psi, dict):
        problems.append(Problem(f"{path}.psi", "must map load cases to [psi0, psi1, psi2]"))
    else:
        out_psi = {}
        for case, v in psi.items():
            ok = (case in CASES and case != "D" and isinstance(v, list) and len(v) == 3
                  and all(isinstance(x, int | float) and not isinstance(x, bool)
                          and 0 <= x <= 1 for x in v))
            if not ok:
                problems.append(Problem(f"{path}.psi.{case}", "must be a variable load case "
                                        "with [psi0, psi1, psi2], each 0 to 1"))
            else:
                out_psi[case] = (float(v[0]), float(v[1]), float(v[2]))
        kw["psi"] = out_psi
    overrides = raw.get("overrides", {})
    if not isinstance(overrides, dict):
        problems.append(Problem(f"{path}.overrides", "must map ply names to factors"))
    else:
        out_ov: dict[str, dict[str, float]] = {}
        for ply, facs in overrides.items():
            if not isinstance(facs, dict):
                problems.append(Problem(f"{path}.overrides.{ply}", "must map factor symbols "
                                        "to numbers"))
                continue
            out_ov[ply] = {}
            for sym, v in facs.items():
                num = _number(v, f"{path}.overrides.{ply}.{sym}", problems, 0.0, 10.0)
                if num is not None:
                    out_ov[ply][sym] = num
        kw["overrides"] = out_ov
    if "connector" in raw:
        c = raw["connector"]
        if not isinstance(c, dict):
            problems.append(Problem(f"{path}.connector", "must be an object"))
        else:
            for key in c:
                if key not in ("type", "allowable", "rows", "spacing"):
                    problems.append(Problem(f"{path}.connector.{key}", "is not a known key"))
            typ = c.get("type", "screw")
            if typ not in ("screw", "bolt", "nail"):
                problems.append(Problem(f"{path}.connector.type", "must be screw, bolt or nail"))
            allow = (_positive(c["allowable"], "force", f"{path}.connector.allowable", problems)
                     if "allowable" in c else None)
            spacing = (_positive(c["spacing"], "length", f"{path}.connector.spacing", problems)
                       if "spacing" in c else None)
            rows = _number(c.get("rows", 1), f"{path}.connector.rows", problems, 1, 20)
            if rows is not None:
                kw["connector"] = Connector(str(typ), allow, int(rows), spacing)
    if "bolt" in raw:
        b = raw["bolt"]
        if not isinstance(b, dict):
            problems.append(Problem(f"{path}.bolt", "must be an object"))
        else:
            for key in b:
                if key not in ("diameter", "Fyb", "rows", "fu", "spacing"):
                    problems.append(Problem(f"{path}.bolt.{key}", "is not a known key"))
            dia = _positive(b.get("diameter", "1/2 in"), "length", f"{path}.bolt.diameter",
                            problems)
            fyb = _quantity(b.get("Fyb", "45000 psi"), "stress", f"{path}.bolt.Fyb", problems)
            fu = _quantity(b.get("fu", "400 MPa"), "stress", f"{path}.bolt.fu", problems)
            rows = _number(b.get("rows", 2), f"{path}.bolt.rows", problems, 1, 20)
            bsp = (_positive(b["spacing"], "length", f"{path}.bolt.spacing", problems)
                   if "spacing" in b else None)
            if dia is not None and fyb is not None and rows is not None and fu is not None:
                kw["bolt"] = Bolt(dia, fyb, int(rows), fu, bsp)
    if len(problems) > before:
        return None
    return DesignSpec(**kw)
