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

from .errors import Problem, shown

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
    r"(?P<inch>\d+(?:\.\d+)?(?:[\s-]+\d+/\d+)?|\d+/\d+)?\s*(?:\"|in|inch|inches|'')?\s*$"
)
_MIXED_FRACTION = re.compile(r"(?<![\d./])(\d+(?:\.\d+)?)[\s-]+(\d+)\s*/\s*(\d+)(?![\d./])")
_FRACTION = re.compile(r"(?<![\d./])(\d+)\s*/\s*(\d+)(?![\d./])")
_POUND = re.compile(r"\b(?:lb|lbs|pound|pounds)\b")
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


#: Longest quantity text read, in characters (a bound on the work pint is given).
MAX_TEXT = 200
#: Most digits in one run of digits (a float holds 17 significant digits).
MAX_DIGITS = 20
#: Deepest nesting of parentheses (the feet-inch forms need 3).
MAX_PARENTHESES = 8

#: Largest magnitude accepted per dimension, SI. Generous physical bounds, far beyond any
#: member Plystack designs, that keep every intermediate of the analysis finite:
#: lengths 1 km; stresses and moduli 1 TPa (steel 200 GPa); forces 1 GN (about 225,000
#: kip); line loads 100 MN/m; area loads 10 MPa (about 209,000 psf); densities
#: 100,000 kg/m^3 (osmium 22,590); moments 10 GN m; mass per length 10,000 t/m.
MAX_MAGNITUDE: dict[str, float] = {
    "length": 1e3,
    "force": 1e9,
    "stress": 1e12,
    "modulus": 1e12,
    "line_load": 1e8,
    "area_load": 1e7,
    "density": 1e5,
    "moment": 1e10,
    "mass_per_length": 1e7,
    "EI_per_width": 1e12,
}
_LIMIT_WORDS: dict[str, str] = {
    "length": "1 km", "force": "1 GN", "stress": "1 TPa", "modulus": "1 TPa",
    "line_load": "100 MN/m", "area_load": "10 MPa", "density": "100000 kg/m^3",
    "moment": "10 GN*m", "mass_per_length": "10000000 kg/m",
    "EI_per_width": "1 TN*m^2/m",
}

_DIGIT_RUN = re.compile(r"\d{" + str(MAX_DIGITS + 1) + ",}")
#: A power is allowed only on a unit name, as a whole number from -9 to 9 (m**3, ft^2).
_UNIT_POWER = re.compile(r"(?<=[A-Za-z_])\s*\*\*\s*[-+]?\d(?![\d.*])")


def _bounded(text: str) -> None:
    """Refuse text that could make pint work for long, before pint sees it."""
    if len(text) > MAX_TEXT:
        raise UnitError(f"is longer than {MAX_TEXT} characters")
    if _DIGIT_RUN.search(text):
        raise UnitError(f"has a number of more than {MAX_DIGITS} digits")


_NUMBER_TOKEN = re.compile(r"[0-9._]*[0-9][0-9._]*")  # a run with a digit in it
_WELL_FORMED_NUMBER = re.compile(r"\d+(\.\d*)?|\.\d+")
#: Two numbers side by side (read as their product), unless the second begins a fraction
#: (a mixed number such as 9 1/4) or the first ends a feet-and-inches text.
_SIDE_BY_SIDE = re.compile(r"\d\.?\s+\.?\d+(?!\d*\s*/)")
#: A number written after a unit ("5 m 2", "6\" 1/2"), a number right before a
#: parenthesis ("2 (3) ft") and a fraction followed by another number ("2 1/2 1/2 in"):
#: each would be read as a product.
_AFTER_UNIT = re.compile(r"[A-Za-z\"'\u2032\u2033)]\s+[\d.(]")
_BEFORE_PARENTHESIS = re.compile(r"[\d.]\s*\(")
_FRACTION_THEN_NUMBER = re.compile(r"\d\s*/\s*\d+\s+[\d.]")
_FRACTION_CHAIN = re.compile(r"\d\s*/\s*\d+\s*/")
#: Unicode fractions, as the mixed numbers the parser reads ("9\u00bd in" is 9 1/2 in).
_VULGAR = {"\u00bd": "1/2", "\u2153": "1/3", "\u2154": "2/3", "\u00bc": "1/4",
           "\u00be": "3/4", "\u2155": "1/5", "\u2156": "2/5", "\u2157": "3/5",
           "\u2158": "4/5", "\u2159": "1/6", "\u215a": "5/6", "\u215b": "1/8",
           "\u215c": "3/8", "\u215d": "5/8", "\u215e": "7/8"}
_VULGAR_RE = re.compile("(\\d?)\\s*([" + "".join(_VULGAR) + "])")


class _Refused(UnitError):
    """A notation refused in words that the message gives as they are."""


def vulgar_fractions(text: str) -> str:
    """``text`` with Unicode fractions and the fraction slash written as ``a/b`` (a
    whole number before one becomes a mixed number): they were dropped before.
    """
    if text.isascii():
        return text
    text = text.replace("\u2044", "/")

    def spelt(m: re.Match[str]) -> str:
        whole = m.group(1)
        return f"{whole} {_VULGAR[m.group(2)]}" if whole else _VULGAR[m.group(2)]

    return _VULGAR_RE.sub(spelt, text)


def _well_formed(text: str) -> None:
    """Refuse number notations that would be read as some other value without a word: a
    decimal comma or thousands separator ("3,6 m" would be 36 m), a number with two
    points or an underscore ("12.5.1 ft", "1_000 in"), two numbers side by side ("2 3
    ft" would be 6 ft, "5 m 2" 10 m, "2 (3) ft" 6 ft), a fraction of a fraction ("1/2/2
    ft") and a unit before its number ("ft 12").
    """
    if "," in text:
        raise _Refused("has a comma: write a decimal point and no thousands separator "
                        "(3.6 m, 1000 lbf)")
    for token in _NUMBER_TOKEN.findall(text):
        if not _WELL_FORMED_NUMBER.fullmatch(token):
            raise _Refused(f'has a malformed number "{token}"')
    first = text.lstrip()[:1]
    if first and not (first.isdigit() or first in "+-.("):
        raise _Refused("must begin with its number, e.g. 12 ft")
    side_by_side = (_SIDE_BY_SIDE.search(text) or _BEFORE_PARENTHESIS.search(text)
                    or _FRACTION_THEN_NUMBER.search(text)
                    or (not _FEET_INCH.match(text) and _AFTER_UNIT.search(text)))
    if side_by_side:
        raise _Refused("has two numbers side by side; give one number and its unit (a "
                        "mixed fraction such as 9 1/4 in is one number)")
    if _FRACTION_CHAIN.search(text):
        raise _Refused("has a fraction of a fraction")


def _bounded_expression(expr: str) -> None:
    """Refuse powers of numbers, chained powers and deep parentheses in the rewritten text."""
    if "**" in _UNIT_POWER.sub("", expr):
        raise UnitError("raises a number to a power; only a unit name takes a power, as a "
                        "whole number such as m^3")
    depth = deepest = 0
    for ch in expr:
        depth += (ch == "(") - (ch == ")")
        deepest = max(deepest, depth)
    if deepest > MAX_PARENTHESES:
        raise UnitError(f"has parentheses nested more than {MAX_PARENTHESES} deep")


def _reason(exc: Exception) -> str:
    name = type(exc).__name__
    if "Undefined" in name:
        return "has a unit name that is not known"
    if isinstance(exc, ZeroDivisionError):
        return "divides by zero"
    return "cannot be read as a quantity"


#: A plain number and one unit (a name, or name/name, each with an optional whole power),
#: as most quantities of a file are written ("1600000 psi", "9.25 in", "500 kg/m**3").
_PLAIN = re.compile(r"^(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?\s+"
                    r"([A-Za-z_]+(?:\*\*\d)?(?:/[A-Za-z_]+(?:\*\*\d)?)?)$")


_PRESSURE = ("stress", "modulus", "area_load")

#: The factors pint converts the units most files use to SI base units with, as pint
#: 0.25 computes them (``ft`` is 0.30479999999999996, not 0.3048), and the dimensions of
#: :data:`DIMENSIONS` each unit is of. Reading such a unit needs no pint registry, which
#: takes a good part of a command's start-up to build; tests/core/test_units_plain.py
#: compares every entry with pint's own reading, bit for bit and type for type.
KNOWN_UNITS: dict[str, tuple[int | float, tuple[str, ...]]] = {
    "in": (0.0254, ("length",)),
    "inch": (0.0254, ("length",)),
    "inches": (0.0254, ("length",)),
    "ft": (0.30479999999999996, ("length",)),
    "feet": (0.30479999999999996, ("length",)),
    "foot": (0.30479999999999996, ("length",)),
    "mm": (0.001, ("length",)),
    "cm": (0.01, ("length",)),
    "m": (1, ("length",)),
    "lbf": (4.4482216152605005, ("force",)),
    "kip": (4448.221615260501, ("force",)),
    "N": (1.0, ("force",)),
    "kN": (1000.0, ("force",)),
    "psi": (6894.7572931683635, _PRESSURE),
    "ksi": (6894757.293168363, _PRESSURE),
    "psf": (47.88025898033586, _PRESSURE),
    "ksf": (47880.25898033586, _PRESSURE),
    "Pa": (1.0, _PRESSURE),
    "kPa": (1000.0, _PRESSURE),
    "MPa": (1000000.0, _PRESSURE),
    "GPa": (1000000000.0, _PRESSURE),
    "N/mm**2": (1000000.0, _PRESSURE),
    "plf": (14.59390293720637, ("line_load",)),
    "klf": (14593.902937206369, ("line_load",)),
    "lbf/ft": (14.59390293720637, ("line_load",)),
    "N/m": (1.0, ("line_load",)),
    "kN/m": (1000.0, ("line_load",)),
    "pcf": (16.01846337396015, ("density",)),
    "kg/m**3": (1.0, ("density",)),
    "kg/m": (1.0, ("mass_per_length",)),
}


def _unit_factor(unit: str, dimension: str) -> int | float | None:
    """The factor pint converts ``unit`` to SI base units with, where the unit is of ``dimension``
    and plainly proportional (no offset); None otherwise (the full reading decides).

    pint reads "x unit" as the number x times one unit and converts it by multiplying
    the magnitude by this factor, so ``x * factor`` is the number pint gives. The units
    of :data:`KNOWN_UNITS` are answered from that table, the others by pint.
    """
    known = KNOWN_UNITS.get(unit)
    if known is not None and dimension in known[1]:
        return known[0]
    return _pint_factor(unit, dimension)


@lru_cache(maxsize=256)
def _pint_factor(unit: str, dimension: str) -> int | float | None:
    """:func:`_unit_factor` as pint's registry gives it."""
    ureg = registry()
    try:
        one = ureg.parse_expression(f"1 {unit}")
        if not hasattr(one, "magnitude") or not one.check(DIMENSIONS[dimension]):
            return None
        factor = one.to_base_units().magnitude
        two = ureg.parse_expression(f"2 {unit}").to_base_units().magnitude
        zero = ureg.parse_expression(f"0 {unit}").to_base_units().magnitude
    except Exception:  # pint raises many kinds of errors: the full reading says which
        return None
    if not isinstance(factor, int | float) or two != 2 * factor or zero != 0:
        return None
    return factor


def _plain_value(expr: str, dimension: str) -> float | None:
    """The value of a plain "number unit" text without pint's parser (see
    :data:`_PLAIN`), or None where the text is not of that form.
    """
    m = _PLAIN.match(expr)
    if m is None or _POUND.search(expr):
        return None
    factor = _unit_factor(m.group(3), dimension)
    if factor is None:
        return None
    text = m.group(1) + (m.group(2) or "")
    try:  # as pint's tokenizer reads a number: whole numbers as int
        number: int | float = int(text)
    except ValueError:
        number = float(text)
    return float(number * factor)


#: A fraction of whole numbers and one unit, as :func:`_normalise` writes the trade's
#: "1/2 in" and "9 1/4 in": ``(1/2) in`` and ``(9+(1/4)) in``.
_PLAIN_FRACTION = re.compile(r"^\((?:(\d+)\+\()?(\d+)/(\d+)\)(?(1)\))\s+"
                             r"([A-Za-z_]+(?:\*\*\d)?(?:/[A-Za-z_]+(?:\*\*\d)?)?)$")


def _fraction_value(expr: str, dimension: str) -> float | None:
    """The value of a fraction and one unit (see :data:`_PLAIN_FRACTION`) without pint's
    parser, or None where the text is not of that form.

    pint evaluates such text with Python's operators on the numbers as its tokenizer
    reads them (whole numbers as int): ``whole + numerator / denominator``, then times
    one unit, so the magnitude is that number and the value ``magnitude * factor``, as
    for :func:`_plain_value`.
    """
    m = _PLAIN_FRACTION.match(expr)
    if m is None or _POUND.search(expr) or int(m.group(3)) == 0:
        return None
    factor = _unit_factor(m.group(4), dimension)
    if factor is None:
        return None
    number = int(m.group(2)) / int(m.group(3))
    if m.group(1) is not None:
        number = int(m.group(1)) + number
    return float(number * factor)


@lru_cache(maxsize=4096)
def _parse_cached(text: str, dimension: str) -> float:
    _bounded(text)
    text = vulgar_fractions(text)
    if _NUMBER_ONLY.match(text):
        raise UnitError("has no unit")
    if not any(ch.isdigit() for ch in text):
        raise UnitError("has no number")
    _well_formed(text)
    expr = _normalise(text)
    _bounded_expression(expr)
    plain = _plain_value(expr, dimension)
    if plain is None:
        plain = _fraction_value(expr, dimension)
    if plain is not None:
        return _checked(plain, dimension)
    ureg = registry()
    try:
        q = ureg.parse_expression(expr)
        if not hasattr(q, "magnitude"):
            raise UnitError("has no unit")
        want = DIMENSIONS[dimension]
        if not q.check(want) and "[force]" in want and _POUND.search(expr):
            # the trade writes "lb" for pound-force where a force is meant (common practice)
            q = ureg.parse_expression(_POUND.sub("lbf", expr))
        if not q.check(want):
            raise UnitError(f"is not {DIMENSION_WORDS[dimension]}")
        value = float(q.to_base_units().magnitude)
    except UnitError:
        raise
    except OverflowError:
        raise UnitError("is too large a number") from None
    except Exception as exc:  # pint raises many kinds of errors
        raise UnitError(_reason(exc)) from None
    return _checked(value, dimension)


def _checked(value: float, dimension: str) -> float:
    """The value, where it is finite and within :data:`MAX_MAGNITUDE`."""
    if not math.isfinite(value):
        raise UnitError("is not a finite number")
    if abs(value) > MAX_MAGNITUDE[dimension]:
        raise UnitError(f"is out of range: {DIMENSION_WORDS[dimension]} must be at most "
                        f"{_LIMIT_WORDS[dimension]} in size")
    return value


def _shown(text: str) -> str:
    """The text as quoted in a message: at most 40 characters."""
    return text if len(text) <= 40 else text[:37] + "..."


def parse(text: Any, dimension: str, field: str) -> float:
    """Parse a quantity string to an SI float.

    The text is bounded before pint reads it (at most :data:`MAX_TEXT` characters, runs
    of at most :data:`MAX_DIGITS` digits, powers only on unit names, at most
    :data:`MAX_PARENTHESES` nested parentheses) and the value must be finite and at
    most :data:`MAX_MAGNITUDE` of its dimension in size, so no text can hang or overflow.

    Args:
        text: the string, e.g. ``"9 1/4 in"`` or ``"1600000 psi"``.
        dimension: one of :data:`DIMENSIONS`.
        field: the path of the field, used in the error message.

    Raises:
        UnitError: with a message that names ``field`` and says what is wrong.

    """
    if isinstance(text, bool) or not isinstance(text, str):
        raise UnitError(
            f'{field}: {shown(text)} must be a string with a unit, e.g. '
            f'"{_EXAMPLES[dimension]}"'
        )
    if not text.strip():
        raise UnitError(f"{field}: is empty; expected {DIMENSION_WORDS[dimension]}")
    try:
        return _parse_cached(text, dimension)
    except UnitError as exc:
        reason = str(exc)
        quoted = _shown(text)
        if reason == "has no unit":
            return _raise(f'{field}: "{quoted}" has no unit; expected {DIMENSION_WORDS[dimension]}')
        if reason == "has no number":
            return _raise(f'{field}: "{quoted}" has no number; expected '
                          f"{DIMENSION_WORDS[dimension]}")
        if isinstance(exc, _Refused) or reason.startswith((
                "is not ", "is longer", "has a number", "raises", "has paren",
                "is too large", "is out of range")):
            return _raise(f'{field}: "{quoted}" {reason}')
        return _raise(f'{field}: "{quoted}" is not {DIMENSION_WORDS[dimension]} ({reason})')


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


#: Texts :func:`fmt` has made, by its arguments (a run formats the same heights, widths
#: and forces many times over; cleared when it grows past ``_FMT_HELD``).
_FMT_MADE: dict[tuple[float, str, str, int], str] = {}
_FMT_HELD = 4096


def fmt(value: float, kind: str, system: str, digits: int = 4) -> str:
    """Format an SI float in display units with ``digits`` significant figures and unit."""
    key = (value, kind, system, digits)
    text = _FMT_MADE.get(key)
    if text is None:
        unit, factor = DISPLAY[system][kind]
        text = f"{sig(value * factor, digits)} {unit}".rstrip()
        if len(_FMT_MADE) >= _FMT_HELD:
            _FMT_MADE.clear()
        _FMT_MADE[key] = text
    return text


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
    """The shortest quantity string that parses back to exactly ``value``.

    Tries the file unit of ``kind`` in ``system``, then the other length unit, the other
    system's unit and the SI base unit. In each unit it finds the fewest significant
    digits that read back to the identical float (and a fraction with a denominator up
    to 64, such as ``"9 1/3 in"``, where that is shorter). The first unit that needs at
    most :data:`READABLE_DIGITS` digits is used; otherwise the shortest text found.
    Numbers are written without exponent where sensible.
    """
    dimension = "length" if kind == "span" else kind
    other_system = "SI" if system == "US" else "US"
    units: list[tuple[str, float]] = [FILE_UNITS[system][kind]]
    if dimension == "length":
        units.append(FILE_UNITS[system]["span" if kind == "length" else "length"])
    units += [FILE_UNITS[other_system][kind], (_SI_TEXT[kind], 1.0)]
    best: tuple[int, str] | None = None
    for unit, _factor in units:
        found = _shortest_in(value, unit, dimension)
        if found is not None and found[0] <= READABLE_DIGITS:
            return found[1]
        if found is not None and (best is None or found[0] < best[0]):
            best = found
    return best[1] if best is not None else f"{value!r} {_SI_TEXT[kind]}"


#: A unit whose exact text needs at most this many significant digits is used at once.
READABLE_DIGITS = 6


def _reads_back(text: str, dimension: str, value: float) -> bool:
    try:
        return _parse_cached(text, dimension) == value
    except UnitError:
        return False


def _shortest_in(value: float, unit: str, dimension: str) -> tuple[int, str] | None:
    """(significant digits, text) of the shortest exact text of ``value`` in ``unit``.

    The value of each candidate is predicted as number x (the value of 1 unit), which is
    how pint converts; only a predicted match is parsed to confirm it.
    """
    try:
        per_unit = _parse_cached(f"1 {unit}", dimension)
    except UnitError:
        return None
    number = value / per_unit
    if not math.isfinite(number):
        return None
    for digits in range(1, 18):
        text = _plain(f"{number:.{digits}g}")
        if float(text) * per_unit != value or not _reads_back(f"{text} {unit}", dimension,
                                                                value):
            continue
        if digits > 4:
            fraction = _fraction_text(number, unit, dimension, value)
            if fraction is not None and fraction[0] < digits:
                return fraction
        return digits, f"{text} {unit}"
    if per_unit == 1.0 and _reads_back(f"{value!r} {unit}", dimension, value):
        return 17, f"{value!r} {unit}"
    return None


def _fraction_text(number: float, unit: str, dimension: str, value: float
                   ) -> tuple[int, str] | None:
    """A mixed fraction with a denominator up to 64 that reads back to ``value``."""
    from fractions import Fraction

    f = Fraction(number).limit_denominator(64)
    if f.denominator == 1 or abs(float(f) - number) > 1e-9 * max(abs(number), 1.0):
        return None
    whole, rest = divmod(abs(f.numerator), f.denominator)
    sign = "-" if f < 0 else ""
    body = f"{whole} {rest}/{f.denominator}" if whole else f"{rest}/{f.denominator}"
    text = f"{sign}{body} {unit}"
    if not _reads_back(text, dimension, value):
        return None
    return len(str(whole)) + len(str(rest)) + len(str(f.denominator)), text


def _plain(number: str) -> str:
    """``"2.9e+07"`` as ``"29000000"``, ``"1.5e-05"`` as ``"0.000015"`` (exponents
    between -6 and 15 written out; others kept).
    """
    if "e" not in number:
        return number
    from decimal import Decimal

    exponent = int(number.split("e")[1])
    if not -6 <= exponent <= 15:
        return number
    return format(Decimal(number), "f")
