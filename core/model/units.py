"""Units at the edges: parse quantity strings to SI floats, format SI floats for display.

Inside ``core`` every quantity is a plain float in SI base units (m, N, Pa, N*m, kg/m,
kg/m^3). Strings with units appear only in files, on the command line and on screen.
Parsing uses pint, plus the trade's abbreviations (psf, plf, klf, ksf, pcf, kip, ksi)
and feet-inch forms such as ``14'-6"`` and ``9 1/4"``.
"""

from __future__ import annotations

import math
import re
from functools import lru_cache
from typing import Any

from .errors import Problem

#: Dimension names used by the parser, mapped to pint dimensionality strings.
DIMENSIONS: dict[str, str] = {
    "length": "[length]",
    "force": "[force]",
    "stress": "[pressure]",
    "modulus": "[pressure]",
    "line_load": "[force] / [length]",
    "area_load": "[pressure]",
    "density": "[mass] / [length] ** 3",
    "moment": "[force] * [length]",
    "mass_per_length": "[mass] / [length]",
    "EI_per_width": "[force] * [length] ** 2 / [length]",
}

#: Words used in messages for each dimension.
DIMENSION_WORDS: dict[str, str] = {
    "length": "a length",
    "force": "a force",
    "stress": "a stress",
    "modulus": "an elastic modulus",
    "line_load": "a line load (force per length)",
    "area_load": "an area load (force per area)",
    "density": "a density (mass per volume)",
    "moment": "a moment (force times length)",
    "mass_per_length": "a mass per length",
    "EI_per_width": "a bending stiffness per width (force times length squared per length)",
}

_EXTRA_DEFINITIONS = (
    "psf = force_pound / foot ** 2",
    "plf = force_pound / foot",
    "klf = kip / foot",
    "ksf = kip / foot ** 2",
    "pcf = pound / foot ** 3",
)


@lru_cache(maxsize=1)
def registry() -> Any:
    """Return the shared pint registry (built once, on first use)."""
    import pint

    ureg: Any = pint.UnitRegistry(cache_folder=":auto:")
    for line in _EXTRA_DEFINITIONS:
        try:
            ureg.define(line)
        except Exception:
            pass
    return ureg


class UnitError(ValueError):
    """A quantity string that cannot be read as the wanted dimension."""


_FEET_INCH = re.compile(
    r"^\s*(?P<ft>[-+]?\d+(?:\.\d+)?)\s*(?:'|ft|feet|foot)\s*-?\s*"
    r"(?P<inch>\d+(?:\.\d+)?(?:\s+\d+/\d+)?|\d+/\d+)?\s*(?:\"|in|inch|inches|'')?\s*$"
)
_MIXED_FRACTION = re.compile(r"(?<![\d./])(\d+(?:\.\d+)?)[\s-]+(\d+)\s*/\s*(\d+)(?![\d./])")
_FRACTION = re.compile(r"(?<![\d./])(\d+)\s*/\s*(\d+)(?![\d./])")
_NUMBER_ONLY = re.compile(r"^\s*[-+]?(\d+(\.\d*)?|\.\d+)([eE][-+]?\d+)?\s*$")


def _normalise(text: str) -> str:
    """Rewrite trade notations into something pint reads."""
    s = text.strip().replace("\u2032", "'").replace("\u2033", '"').replace("\u00d7", "*")
    s = s.replace("\u00b2", "**2").replace("\u00b3", "**3")
    m = _FEET_INCH.match(s)
    if m and ("'" in s or "ft" in s or "feet" in s or "foot" in s) and m.group("inch"):
        inch = _MIXED_FRACTION.sub(r"(\1+\2/\3)", m.group("inch"))
        inch = _FRACTION.sub(r"(\1/\2)", inch)
        sign = "-" if m.group("ft").startswith("-") else ""
        ft = m.group("ft").lstrip("+-")
        return f"{sign}(({ft}) * foot + ({inch}) * inch)"
    s = _MIXED_FRACTION.sub(r"(\1+\2/\3)", s)
    s = _FRACTION.sub(r"(\1/\2)", s)
    s = re.sub(r"(?<=[\d)])\s*''", " inch", s)
    s = re.sub(r"(?<=[\d)])\s*\"", " inch", s)
    s = re.sub(r"(?<=[\d)])\s*'", " foot", s)
    s = re.sub(r"\^", "**", s)
    s = re.sub(r"\blbs\b", "lbf", s)
    return s


@lru_cache(maxsize=4096)
def _parse_cached(text: str, dimension: str) -> float:
    if _NUMBER_ONLY.match(text):
        raise UnitError("has no unit")
    if not any(ch.isdigit() for ch in text):
        raise UnitError("has no number")
    ureg = registry()
    expr = _normalise(text)
    try:
        q = ureg.parse_expression(expr)
    except Exception as exc:  # pint raises many kinds of errors
        unknown = type(exc).__name__ == "UndefinedUnitError"
        raise UnitError("has a unit this program does not know" if unknown
                        else "cannot be read as a number with a unit") from None
    if not hasattr(q, "magnitude"):
        raise UnitError("has no unit")
    want = DIMENSIONS[dimension]
    if not q.check(want):
        raise UnitError(f"is not {DIMENSION_WORDS[dimension]}")
    value = float(q.to_base_units().magnitude)
    if not math.isfinite(value):
        raise UnitError("is not a finite number")
    return value


def parse(text: Any, dimension: str, field: str) -> float:
    """Parse a quantity string to an SI float.

    Args:
        text: the string, e.g. ``"9 1/4 in"`` or ``"1600000 psi"``.
        dimension: one of :data:`DIMENSIONS`.
        field: the path of the field, used in the error message.

    Raises:
        UnitError: with a message that names ``field`` and says what is wrong.

    """
    if isinstance(text, bool) or not isinstance(text, str):
        raise UnitError(
            f'{field}: {text!r} must be a string with a unit, e.g. "{_EXAMPLES[dimension]}"'
        )
    if not text.strip():
        raise UnitError(f"{field}: is empty; expected {DIMENSION_WORDS[dimension]}")
    try:
        return _parse_cached(text, dimension)
    except UnitError as exc:
        reason = str(exc)
        if reason == "has no unit":
            return _raise(f'{field}: "{text}" has no unit; expected {DIMENSION_WORDS[dimension]}')
        if reason == "has no number":
            return _raise(f'{field}: "{text}" has no number; expected {DIMENSION_WORDS[dimension]}')
        if reason.startswith("is not "):
            return _raise(f'{field}: "{text}" {reason}')
        return _raise(f'{field}: "{text}" is not {DIMENSION_WORDS[dimension]} ({reason})')


def _raise(message: str) -> float:
    raise UnitError(message)


def problem(exc: UnitError) -> Problem:
    """Turn a :class:`UnitError` into a :class:`Problem` (path, message)."""
    text = str(exc)
    path, _, message = text.partition(": ")
    return Problem(path, message)


_EXAMPLES: dict[str, str] = {
    "length": "9 1/4 in",
    "force": "800 lbf",
    "stress": "900 psi",
    "modulus": "1600000 psi",
    "line_load": "120 plf",
    "area_load": "40 psf",
    "density": "490 pcf",
    "moment": "12 kip*ft",
    "mass_per_length": "10 kg/m",
    "EI_per_width": "1200 kN*m^2/m",
}


# --- display -------------------------------------------------------------------------

#: Display units per system: dimension -> (unit label, factor from SI).
DISPLAY: dict[str, dict[str, tuple[str, float]]] = {
    "US": {
        "length": ("in", 1 / 0.0254),
        "span": ("ft", 1 / 0.3048),
        "force": ("lbf", 1 / 4.4482216152605),
        "stress": ("psi", 1 / 6894.757293168361),
        "modulus": ("psi", 1 / 6894.757293168361),
        "line_load": ("plf", 0.3048 / 4.4482216152605),
        "area_load": ("psf", 0.3048**2 / 4.4482216152605),
        "density": ("pcf", 0.3048**3 / 0.45359237),
        "moment": ("lbf*ft", 1 / (4.4482216152605 * 0.3048)),
        "mass_per_length": ("lb/ft", 0.3048 / 0.45359237),
        "area": ("in^2", 1 / 0.0254**2),
        "second_moment": ("in^4", 1 / 0.0254**4),
        "section_modulus": ("in^3", 1 / 0.0254**3),
        "EA": ("lbf", 1 / 4.4482216152605),
        "EI": ("lbf*in^2", 1 / (4.4482216152605 * 0.0254**2)),
        "shear_flow": ("lbf/in", 0.0254 / 4.4482216152605),
        "deflection": ("in", 1 / 0.0254),
        "ratio": ("", 1.0),
        "EI_per_width": ("lbf*in^2/ft", 0.3048 / (4.4482216152605 * 0.0254**2)),
        "frequency": ("Hz", 1.0),
        "compliance": ("in/kip", 4448.2216152605 / 0.0254),
        "velocity_response": ("m/(N*s^2)", 1.0),
    },
    "SI": {
        "length": ("mm", 1000.0),
        "span": ("m", 1.0),
        "force": ("kN", 1e-3),
        "stress": ("MPa", 1e-6),
        "modulus": ("MPa", 1e-6),
        "line_load": ("kN/m", 1e-3),
        "area_load": ("kPa", 1e-3),
        "density": ("kg/m^3", 1.0),
        "moment": ("kN*m", 1e-3),
        "mass_per_length": ("kg/m", 1.0),
        "area": ("mm^2", 1e6),
        "second_moment": ("mm^4", 1e12),
        "section_modulus": ("mm^3", 1e9),
        "EA": ("kN", 1e-3),
        "EI": ("kN*m^2", 1e-3),
        "shear_flow": ("N/mm", 1e-3),
        "deflection": ("mm", 1000.0),
        "ratio": ("", 1.0),
        "EI_per_width": ("kN*m^2/m", 1e-3),
        "frequency": ("Hz", 1.0),
        "compliance": ("mm/kN", 1e6),
        "velocity_response": ("m/(N*s^2)", 1.0),
    },
}


def to_display(value: float, kind: str, system: str) -> float:
    """Convert an SI float to the display unit of ``kind`` in ``system`` ("US" or "SI")."""
    return value * DISPLAY[system][kind][1]


def unit_label(kind: str, system: str) -> str:
    """Return the display unit label of ``kind`` in ``system``."""
    return DISPLAY[system][kind][0]


def fmt(value: float, kind: str, system: str, digits: int = 4) -> str:
    """Format an SI float in display units with ``digits`` significant figures and unit."""
    return f"{sig(to_display(value, kind, system), digits)} {unit_label(kind, system)}".rstrip()


def sig(value: float, digits: int = 4) -> str:
    """Format a number with ``digits`` significant figures, without exponent where sensible."""
    if not math.isfinite(value):
        return str(value)
    if value == 0:
        return "0"
    magnitude = math.floor(math.log10(abs(value)))
    if magnitude >= 12 or magnitude <= -5:
        return f"{value:.{digits - 1}e}"
    decimals = max(digits - 1 - magnitude, 0)
    return f"{value:.{decimals}f}"


def display_string(value: float, kind: str, system: str, digits: int = 6) -> str:
    """Return a parseable quantity string (used when writing files and filling entries)."""
    label = unit_label(kind, system)
    number = to_display(value, kind, system)
    text = f"{number:.{digits}g}"
    return f"{text} {label}"


#: Units used when writing files: the display units of the kinds a file holds.
FILE_UNITS: dict[str, dict[str, tuple[str, float]]] = {
    system: {kind: table[kind] for kind in ("length", "span", "force", "stress", "modulus",
                                            "line_load", "area_load", "density",
                                            "EI_per_width")}
    for system, table in DISPLAY.items()
}

_SI_TEXT = {"length": "m", "span": "m", "force": "N", "stress": "Pa", "modulus": "Pa",
            "line_load": "N/m", "area_load": "Pa", "density": "kg/m^3",
            "EI_per_width": "N*m^2/m"}


def exact_text(value: float, kind: str, system: str) -> str:
    """A quantity string in a file unit of ``system`` that parses back to exactly
    ``value`` (tries the usual unit, then the other length unit, then SI with all
    digits).
    """
    dimension = "length" if kind == "span" else kind
    candidates = [FILE_UNITS[system][kind]]
    if dimension == "length":
        other = "span" if kind == "length" else "length"
        candidates.append(FILE_UNITS[system][other])
    for unit, factor in candidates:
        number = value * factor
        for digits in (6, 9, 12, 15, 17):
            text = f"{number:.{digits}g} {unit}"
            try:
                if _parse_cached(text, dimension) == value:
                    return text
            except UnitError:
                break
    return f"{value!r} {_SI_TEXT[kind]}"
