"""The design file's "vibration" object: read (one named problem per fault) and write.

Keys: "spacing" (joist spacing, required), "floor_width", "damping" (plain number, 0.01
by default), "transverse_EI" (bending stiffness across the joists per metre, e.g.
"1200 kN*m^2/m" or "4e8 lbf*in^2/ft"); EN 1995-1-1 7.3.3 limits "a_mm_per_kN" and "b"
(plain numbers); US common-practice limits "frequency_min_Hz" (plain number),
"point_load" (a force) and "point_deflection_limit" (a length).
"""

from __future__ import annotations

from typing import Any

from ..model import units
from ..model.design import VibrationSpec
from ..model.errors import Problem, shown
from ..model.units import exact_text

VIBRATION_KEYS = ("spacing", "floor_width", "damping", "transverse_EI", "a_mm_per_kN", "b",
                  "frequency_min_Hz", "point_load", "point_deflection_limit")
#: Quantity keys: file key -> (field, dimension, file kind for writing).
_QUANTITIES = {"spacing": ("spacing", "length", "length"),
               "floor_width": ("floor_width", "length", "span"),
               "transverse_EI": ("transverse_EI", "EI_per_width", "EI_per_width"),
               "point_load": ("point_load", "force", "force"),
               "point_deflection_limit": ("point_deflection_limit", "length", "length")}
#: Plain-number keys: file key -> (field, lowest, highest, factor from file to SI).
_NUMBERS = {"damping": ("damping", 0.0, 0.2, 1.0),
            "a_mm_per_kN": ("a", 0.0, 100.0, 1e-6),
            "b": ("b", 1.0, 1000.0, 1.0),
            "frequency_min_Hz": ("frequency_min", 0.0, 100.0, 1.0)}


def read_vibration(raw: Any, path: str, problems: list[Problem]) -> VibrationSpec | None:
    """The "vibration" object of the design, or None (with problems) where it is bad."""
    if not isinstance(raw, dict):
        problems.append(Problem(path, 'must be an object such as {"spacing": "16 in", '
                                '"floor_width": "12 ft", "damping": 0.01, '
                                '"transverse_EI": "4e8 lbf*in^2/ft"}'))
        return None
    before = len(problems)
    for key in raw:
        if key not in VIBRATION_KEYS:
            problems.append(Problem(f"{path}.{key}", "is not a known key of the vibration "
                                    "object; use " + ", ".join(VIBRATION_KEYS)))
    if "spacing" not in raw:
        problems.append(Problem(f"{path}.spacing", "is missing (the joist spacing)"))
    kw: dict[str, float] = {}
    for key, (name, dimension, _kind) in _QUANTITIES.items():
        if key not in raw:
            continue
        try:
            value = units.parse(raw[key], dimension, f"{path}.{key}")
        except units.UnitError as exc:
            problems.append(units.problem(exc))
            continue
        if value <= 0:
            problems.append(Problem(f"{path}.{key}", "must be greater than zero"))
            continue
        kw[name] = value
    for key, (name, lo, hi, factor) in _NUMBERS.items():
        if key not in raw:
            continue
        v = raw[key]
        if isinstance(v, bool) or not isinstance(v, int | float) or not lo < v <= hi:
            problems.append(Problem(f"{path}.{key}", f"{shown(v)} must be a plain number greater "
                                    f"than {lo:g} and at most {hi:g}"))
            continue
        kw[name] = float(v) * factor
    if len(problems) > before:
        return None
    return VibrationSpec(**kw)


def write_vibration(v: VibrationSpec, system: str) -> dict[str, Any]:
    """The "vibration" object (only the keys given)."""
    out: dict[str, Any] = {}
    for key, (name, _dimension, kind) in _QUANTITIES.items():
        value = getattr(v, name)
        if value is not None:
            out[key] = exact_text(value, kind, system)
    for key, (name, _lo, _hi, factor) in _NUMBERS.items():
        value = getattr(v, name)
        if value is not None:
            out[key] = _plain(value, factor)
    return out


def _plain(value: float, factor: float) -> float:
    """The shortest plain number that reads back (times ``factor``) to exactly ``value``."""
    for digits in (6, 9, 12, 15, 17):
        number = float(f"{value / factor:.{digits}g}")
        if number * factor == value:
            return number
    return value / factor
