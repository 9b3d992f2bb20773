"""Numbers and units as the sheet prints them.

Thousands separators, a fixed number of significant figures (engineering notation
x 10^3k only above 10^8 or below 10^-4), typographic units (in², lbf·ft, kN·m, °F) and a
no-break space between a number and its unit so that no line or table cell wraps a unit
away from its number. Quantities are SI floats; the display units are those of
:data:`plystack.core.model.units.DISPLAY`, plus the few the derivations need.
"""

from __future__ import annotations

import math

from ..model.constants import INCH, LBF
from ..model.units import DISPLAY

NBSP = "\u00a0"
TIMES = "\u00d7"
MINUS = "\u2212"
SUPERSCRIPT = str.maketrans("0123456789-", "\u2070\u00b9\u00b2\u00b3\u2074\u2075\u2076\u2077"
                            "\u2078\u2079\u207b")

#: Unit labels of DISPLAY written with the trade's typography.
UNIT_TEXT = {
    "in^2": "in\u00b2", "in^3": "in\u00b3", "in^4": "in\u2074", "lbf*ft": "lbf\u00b7ft",
    "lbf*in^2": "lbf\u00b7in\u00b2", "kN*m": "kN\u00b7m", "kN*m^2": "kN\u00b7m\u00b2",
    "mm^2": "mm\u00b2", "mm^3": "mm\u00b3", "mm^4": "mm\u2074", "kg/m^3": "kg/m\u00b3",
}

#: Kinds the derivations need beyond DISPLAY: (label, factor from SI) per system.
EXTRA: dict[str, dict[str, tuple[str, float]]] = {
    "US": {"EI_deflection": ("lbf\u00b7in\u00b3", 1 / (LBF * INCH**3)),
           "first_moment": ("in\u00b3", 1 / INCH**3)},
    "SI": {"EI_deflection": ("kN\u00b7m\u00b3", 1e-3), "first_moment": ("mm\u00b3", 1e9)},
}


def unit(kind: str, system: str) -> str:
    """The printed unit of ``kind`` in ``system`` ("US" or "SI")."""
    if kind in EXTRA[system]:
        return EXTRA[system][kind][0]
    label = DISPLAY[system][kind][0]
    return UNIT_TEXT.get(label, label)


def factor(kind: str, system: str) -> float:
    """The factor from SI to the printed unit of ``kind``."""
    if kind in EXTRA[system]:
        return EXTRA[system][kind][1]
    return DISPLAY[system][kind][1]


def num(value: float, digits: int = 4) -> str:
    """``value`` to ``digits`` significant figures with thousands separators.

    From 10^6 up, and below 10^-4, the mantissa takes x 10^3k (computed values; inputs
    as given are written by :func:`plain`).
    """
    if not math.isfinite(value):
        return "\u221e" if value > 0 else str(value)
    if value == 0:
        return "0"
    magnitude = math.floor(math.log10(abs(value)))
    if magnitude >= 6 or magnitude <= -5:
        exp = 3 * math.floor(magnitude / 3)
        mantissa = num(value / 10.0**exp, digits)
        return f"{mantissa}{NBSP}{TIMES}{NBSP}10{str(exp).translate(SUPERSCRIPT)}"
    decimals = max(digits - 1 - magnitude, 0)
    text = f"{abs(value):,.{decimals}f}"
    return (MINUS if value < 0 else "") + text


def num_value(value: float, digits: int = 4) -> float:
    """The number :func:`num` prints for ``value``, as a float (what a reader works on)."""
    if not math.isfinite(value) or value == 0:
        return value
    magnitude = math.floor(math.log10(abs(value)))
    if magnitude >= 6 or magnitude <= -5:
        exp = 3 * math.floor(magnitude / 3)
        return num_value(value / 10.0**exp, digits) * 10.0**exp
    decimals = max(digits - 1 - magnitude, 0)
    return math.copysign(float(f"{abs(value):.{decimals}f}"), value)


def factor_text(value: float) -> str:
    """A dimensionless factor as given (up to six significant figures, no padding)."""
    text = f"{value:.6g}"
    return text.replace("-", MINUS)


def q(value: float, kind: str, system: str, digits: int = 4) -> str:
    """An SI value in its printed unit: number, no-break space, unit."""
    return f"{num(value * factor(kind, system), digits)}{NBSP}{unit(kind, system)}"


def q_den(value: float, kind: str, system: str, digits: int = 4) -> str:
    """As :func:`q`, in parentheses where the number carries an exponent (so that it can
    stand after a division sign).
    """
    text = q(value, kind, system, digits)
    return f"({text})" if TIMES in text else text


def feet_inches(value: float) -> str:
    """A length in feet and inches to the nearest 1/16 in, e.g. 6′-0″ or 4′-6 1/2″."""
    sixteenths = round(abs(value) / INCH * 16)
    feet, rest = divmod(sixteenths, 12 * 16)
    inches, frac = divmod(rest, 16)
    text = f"{feet}\u2032-{inches}"
    if frac:
        g = math.gcd(frac, 16)
        text += f"{NBSP}{frac // g}/{16 // g}"
    return (MINUS if value < 0 else "") + text + "\u2033"


def width_text(value: float, system: str) -> str:
    """A tributary width as a reviewer reads it: feet-inches (US) or metres (SI)."""
    if system == "US":
        return feet_inches(value)
    return q(value, "span", system, 4)


def words(text: str) -> str:
    """Technical text with its ASCII shorthands made typographic (units, <=, x)."""
    for raw, nice in (("lbf*in^2", UNIT_TEXT["lbf*in^2"]), ("kN*m^2", UNIT_TEXT["kN*m^2"]),
                      ("lbf*ft", UNIT_TEXT["lbf*ft"]), ("kN*m", UNIT_TEXT["kN*m"]),
                      ("in^2", "in\u00b2"), ("in^3", "in\u00b3"), ("in^4", "in\u2074"),
                      ("mm^2", "mm\u00b2"), ("mm^3", "mm\u00b3"), ("mm^4", "mm\u2074"),
                      ("m^3", "m\u00b3"), ("<=", "\u2264"), (">=", "\u2265"),
                      ("125F", "125\u00b0F"), ("150F", "150\u00b0F")):
        text = text.replace(raw, nice)
    return text


def plain(value: float) -> str:
    """An input value as given: up to six significant figures, trailing zeros dropped,
    thousands separators (1,600,000; 0.375; 2.5).
    """
    if not math.isfinite(value) or value == 0:
        return num(value)
    magnitude = math.floor(math.log10(abs(value)))
    if magnitude >= 8 or magnitude <= -5:
        return num(value, 6)
    decimals = max(5 - magnitude, 0)
    text = f"{abs(value):,.{decimals}f}"
    if "." in text:
        text = text.rstrip("0").rstrip(".")
    return (MINUS if value < 0 else "") + text


def exact(value: float, kind: str, system: str) -> str:
    """An input quantity as given (see :func:`plain`), with its unit."""
    return f"{plain(value * factor(kind, system))}{NBSP}{unit(kind, system)}"
