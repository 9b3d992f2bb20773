"""The project file's "design" object: one field table shared by reader and writer."""

from __future__ import annotations

from dataclasses import replace
from typing import Any

from ..model import units
from ..model.design import (
    BASES,
    CONNECTOR_TYPES,
    STEEL_RULES,
    TEMPERATURES,
    Bolt,
    Connector,
    DesignSpec,
)
from ..model.errors import Problem
from ..model.member import CASES
from .fields import FieldSpec, read_fields, unknown_keys, write_fields
from .project_read import BOLT_DIAMETERS
from .vibration_file import read_vibration, write_vibration

#: Scalar keys of the design object.
DESIGN_FIELDS = (
    FieldSpec("basis", "choice", choices=BASES, always=True),
    FieldSpec("wet_service", "flag"),
    FieldSpec("temperature", "choice", choices=TEMPERATURES),
    FieldSpec("repetitive_member", "flag"),
    FieldSpec("incised", "flag"),
    FieldSpec("compression_edge_braced", "flag"),
    FieldSpec("K_cr", "number", lo=1.0, hi=5.0),
    FieldSpec("k_def", "number", lo=0.0, hi=5.0),
    FieldSpec("steel_rule", "choice", choices=STEEL_RULES),
    FieldSpec("service_class", "choice", choices=(1, 2, 3)),
    FieldSpec("steel_bears", "flag"),
    FieldSpec("unbraced_length", "positive", dimension="length", write_kind="span"),
    FieldSpec("en1990_expression", "choice", choices=("6.10", "6.10a/b")),
    FieldSpec("unbraced_length_bottom", "positive", dimension="length", write_kind="span"),
    FieldSpec("bottom_edge_braced", "flag"),
    FieldSpec("stability_width", "choice", choices=("ply", "member")),
    FieldSpec("plate_unbraced_length", "positive", dimension="length", write_kind="span"),
    FieldSpec("load_level", "choice", choices=("top", "centroid", "bottom")),
    FieldSpec("fabricated_wet", "flag"),
)
CONNECTOR_FIELDS = (
    FieldSpec("type", "choice", choices=CONNECTOR_TYPES, always=True),
    FieldSpec("allowable", "positive", dimension="force"),
    FieldSpec("rows", "count", lo=1, hi=20, always=True),
    FieldSpec("spacing", "positive", dimension="length"),
    FieldSpec("diameter", "positive", dimension="length"),
    FieldSpec("predrilled", "flag"),
    FieldSpec("spacing_max", "positive", dimension="length"),
)
#: Largest fastener diameter read, m (a dowel-type fastener; bolts are bounded at 30 mm by
#: EN 1995-1-1 8.5 and at 1 in by NDS 12.3).
CONNECTOR_DIAMETER_MAX = 0.030
BOLT_FIELDS = (
    FieldSpec("diameter", "positive", dimension="length", always=True),
    FieldSpec("Fyb", "positive", dimension="stress", always=True),
    FieldSpec("rows", "count", lo=1, hi=20, always=True),
    FieldSpec("fu", "positive", dimension="stress", always=True),
    FieldSpec("spacing", "positive", dimension="length"),
    FieldSpec("stagger", "flag"),
    FieldSpec("end_distance", "positive", dimension="length"),
)
#: Bolt keys holding lists of lengths (rows may also be a count), with their longest list.
BOLT_LISTS = {"rows": 20, "stations": 500}
#: Keys holding objects, read by their own functions below.
OBJECT_KEYS = ("deflection_limits", "psi", "overrides", "connector", "bolt", "vibration")
DESIGN_KEYS = frozenset({f.key for f in DESIGN_FIELDS} | set(OBJECT_KEYS))
LIMIT_KEYS = ("live", "total", "long_term")


def read_design(raw: Any, path: str, problems: list[Problem]) -> DesignSpec | None:
    """The "design" object (None, with named problems, where any part is wrong)."""
    if not isinstance(raw, dict):
        problems.append(Problem(path, "must be an object"))
        return None
    before = len(problems)
    unknown_keys(raw, sorted(DESIGN_KEYS), path, "the design", problems)
    kw = read_fields(raw, DESIGN_FIELDS, path, problems)
    kw.update(_read_limits(raw.get("deflection_limits", {}), f"{path}.deflection_limits",
                           problems))
    kw["psi"] = _read_psi(raw.get("psi", {}), f"{path}.psi", problems)
    kw["overrides"] = _read_overrides(raw.get("overrides", {}), f"{path}.overrides", problems)
    if "connector" in raw:
        kw["connector"] = _read_object(raw["connector"], Connector(), CONNECTOR_FIELDS,
                                       f"{path}.connector", "the connector", problems)
        connector_problems(kw["connector"], f"{path}.connector", problems)
    if "bolt" in raw:
        kw["bolt"] = _read_bolt(raw["bolt"], f"{path}.bolt", problems)
        _bolt_diameter_in_range(kw["bolt"].diameter, kw.get("basis", "US-ASD"),
                                f"{path}.bolt.diameter", problems)
    if "vibration" in raw:
        kw["vibration"] = read_vibration(raw["vibration"], f"{path}.vibration", problems)
    if len(problems) > before:
        return None
    return DesignSpec(**kw)


def connector_problems(conn: Connector, path: str, problems: list[Problem]) -> None:
    """Named problems where the connector's keys do not fit together: glue has no
    diameter, predrilling is a choice for nails only, a varying spacing needs its
    smallest value and at most 4 times it (EN 1995-1-1 Annex B effective spacing, from
    memory).
    """
    if conn.type == "glue":
        for key in ("diameter", "spacing_max"):
            if getattr(conn, key) is not None:
                problems.append(Problem(f"{path}.{key}", "does not apply to a glued "
                                        "interface (glue is taken as fully composite)"))
    if conn.predrilled and conn.type != "nail":
        problems.append(Problem(f"{path}.predrilled", f'applies to nails only, not to '
                                f'"{conn.type}"'))
    if conn.diameter is not None and conn.diameter > CONNECTOR_DIAMETER_MAX:
        problems.append(Problem(f"{path}.diameter", f"{conn.diameter * 1000:.4g} mm is "
                                "larger than a dowel-type fastener (at most 30 mm)"))
    if conn.spacing_max is not None:
        if conn.spacing is None:
            problems.append(Problem(f"{path}.spacing_max", 'needs "spacing", the smallest '
                                    "spacing"))
        elif not conn.spacing <= conn.spacing_max <= 4 * conn.spacing * (1 + 1e-12):
            problems.append(Problem(f"{path}.spacing_max", "must lie between the spacing "
                                    "and 4 times it (EN 1995-1-1 Annex B)"))


def bolt_diameter_problem(d: float, basis: str) -> str | None:
    """Why a bolt diameter is outside the range of the basis's dowel equations
    (BOLT_DIAMETERS), or None; the file reader and the desktop program's field say the
    same.
    """
    lo, hi = BOLT_DIAMETERS.get(basis, (0.0, float("inf")))
    if lo * (1 - 1e-9) <= d <= hi * (1 + 1e-9):
        return None
    words = ("1/4 in to 1 in (NDS 2018 12.3, Table 12.3.1B)" if basis == "US-ASD"
             else "6 mm to 30 mm (EN 1995-1-1 8.5.1.1 and 8.6)")
    size = f"{d / 0.0254:.4g} in" if basis == "US-ASD" else f"{d * 1000:.4g} mm"
    return f"{size} is outside the bolt diameters the equations hold for: {words}"


def _bolt_diameter_in_range(d: float, basis: str, path: str,
                            problems: list[Problem]) -> None:
    """A bolt diameter within the range of the basis's dowel equations (BOLT_DIAMETERS)."""
    problem = bolt_diameter_problem(d, basis)
    if problem is not None:
        problems.append(Problem(path, problem))


def _read_bolt(raw: Any, path: str, problems: list[Problem]) -> Bolt:
    """The "bolt" object: "rows" a count or a list of heights, "stations" a list."""
    if not isinstance(raw, dict):
        problems.append(Problem(path, "must be an object"))
        return Bolt()
    scalars = {k: v for k, v in raw.items()
               if not (k in BOLT_LISTS and (k == "stations" or isinstance(v, list)))}
    bolt: Bolt = _read_object(scalars, Bolt(), BOLT_FIELDS, path, "the bolt", problems)
    lists: dict[str, tuple[float, ...]] = {}
    for key, longest in BOLT_LISTS.items():
        if key in raw and key not in scalars:
            lists[key] = _read_lengths(raw[key], longest, f"{path}.{key}", problems)
    heights = lists.get("rows", ())
    return replace(bolt, row_heights=heights, rows=len(heights) or bolt.rows,
                   stations=tuple(sorted(lists.get("stations", ()))))


def _read_lengths(raw: Any, longest: int, path: str, problems: list[Problem]) -> tuple[float, ...]:
    """A non-empty list of distinct lengths (at most ``longest``)."""
    if not isinstance(raw, list) or not raw or len(raw) > longest:
        problems.append(Problem(path, f"must be a list of 1 to {longest} lengths such as "
                                '["2 in", "7 in"]'))
        return ()
    out = []
    for k, item in enumerate(raw):
        try:
            value = units.parse(item, "length", f"{path}[{k}]")
        except units.UnitError as exc:
            problems.append(units.problem(exc))
            continue
        if value < 0:
            problems.append(Problem(f"{path}[{k}]", "must not be negative"))
        out.append(value)
    if len(set(out)) != len(out):
        problems.append(Problem(path, "lists the same position twice"))
    return tuple(out)


def _write_bolt(bolt: Bolt, system: str, us: bool = True) -> dict[str, Any]:
    """The "bolt" object: ``fu`` on US-ASD (read there only by the steel side of the
    bolts) and ``Fyb`` on EU-LSD (not read) only where it is not the default, so that
    saving adds nothing the file did not say.
    """
    out = write_fields(bolt, Bolt(), BOLT_FIELDS, system)
    unread = "fu" if us else "Fyb"
    if getattr(bolt, unread) == getattr(Bolt(), unread):
        out.pop(unread, None)
    if bolt.row_heights:
        out["rows"] = [units.exact_text(y, "length", system) for y in bolt.row_heights]
    if bolt.stations:
        out["stations"] = [units.exact_text(x, "span", system) for x in bolt.stations]
    return out


def _read_object(raw: Any, default: Any, specs: tuple[FieldSpec, ...], path: str, what: str,
                 problems: list[Problem]) -> Any:
    if not isinstance(raw, dict):
        problems.append(Problem(path, "must be an object"))
        return default
    unknown_keys(raw, [s.key for s in specs], path, what, problems)
    return replace(default, **read_fields(raw, specs, path, problems))


def _read_limits(raw: Any, path: str, problems: list[Problem]) -> dict[str, float]:
    if not isinstance(raw, dict):
        problems.append(Problem(path, 'must be an object such as {"live": 360, "total": 240}'))
        return {}
    unknown_keys(raw, LIMIT_KEYS, path, "the deflection limits (live, total, long_term)",
                 problems)
    specs = [FieldSpec(k, "number", attr=f"{k}_limit", lo=1.0, hi=100000.0) for k in LIMIT_KEYS]
    return read_fields(raw, specs, path, problems)


def _read_psi(raw: Any, path: str,
              problems: list[Problem]) -> dict[str, tuple[float, float, float]]:
    if not isinstance(raw, dict):
        problems.append(Problem(path, "must map load cases to [psi0, psi1, psi2]"))
        return {}
    out = {}
    for case, v in raw.items():
        ok = (case in CASES and case != "D" and isinstance(v, list) and len(v) == 3
              and all(isinstance(x, int | float) and not isinstance(x, bool)
                      and 0 <= x <= 1 for x in v))
        if not ok:
            problems.append(Problem(f"{path}.{case}", "must be a variable load case with "
                                    "[psi0, psi1, psi2], each 0 to 1"))
        else:
            out[case] = (float(v[0]), float(v[1]), float(v[2]))
    return out


def _read_overrides(raw: Any, path: str, problems: list[Problem]) -> dict[str, dict[str, float]]:
    if not isinstance(raw, dict):
        problems.append(Problem(path, "must map ply names to factors"))
        return {}
    out: dict[str, dict[str, float]] = {}
    for ply, facs in raw.items():
        if not isinstance(facs, dict):
            problems.append(Problem(f"{path}.{ply}", "must map factor symbols to numbers"))
            continue
        specs = [FieldSpec(sym, "number", lo=0.0, hi=10.0) for sym in facs]
        out[ply] = read_fields(facs, specs, f"{path}.{ply}", problems)
    return out


def write_design(d: DesignSpec, system: str) -> dict[str, Any]:
    """The "design" object (only what differs from the defaults, plus the basis)."""
    out = write_fields(d, DesignSpec(basis=d.basis), DESIGN_FIELDS, system)
    limits = {k: getattr(d, f"{k}_limit") for k in LIMIT_KEYS
              if getattr(d, f"{k}_limit") is not None}
    if limits:
        out["deflection_limits"] = limits
    if d.psi:
        out["psi"] = {k: list(v) for k, v in d.psi.items()}
    if d.overrides:
        out["overrides"] = {k: dict(v) for k, v in d.overrides.items()}
    if d.connector != Connector():
        out["connector"] = write_fields(d.connector, Connector(), CONNECTOR_FIELDS, system)
    if d.bolt != Bolt():
        out["bolt"] = _write_bolt(d.bolt, system, d.us)
    if d.vibration is not None:
        out["vibration"] = write_vibration(d.vibration, system)
    return out
