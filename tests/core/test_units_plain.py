"""The plain reading of "number unit" texts (without pint's expression parser) gives the
very float pint's full reading gives, and leaves every other text to pint.

Source: pint itself (parse_expression and to_base_units on the same rewritten text),
compared exactly, sign of zero included.
"""

from __future__ import annotations

import math
import random

import pytest

from plystack.core.model import units as U

UNITS = ["psi", "ksi", "MPa", "GPa", "kPa", "Pa", "in", "inch", "inches", "ft", "feet",
         "m", "mm", "cm", "km", "kN", "N", "lbf", "kip", "pcf", "psf", "plf", "klf", "ksf",
         "kg/m^3", "kg/m**3", "lbf/ft", "N/m", "kN/m", "N/mm^2", "kg/m", "m^2", "kNm",
         "yd", "newton", "pascal", "degC", "degF", "K", "dimensionless", "nan", "inf"]


def _numbers(rng: random.Random, count: int) -> list[str]:
    out = ["0", "0.0", "1", "1.", ".5", "9.25", "1600000", "12e3", "5E-4"]
    for _ in range(count):
        k = rng.random()
        if k < 0.3:
            out.append(str(rng.randint(0, 10 ** rng.randint(0, 19))))
        elif k < 0.6:
            out.append(f"{rng.uniform(0, 10 ** rng.randint(0, 8)):.{rng.randint(0, 9)}f}")
        elif k < 0.8:
            out.append(f"{rng.uniform(0, 10):.3f}e{rng.randint(-30, 30)}")
        else:
            out.append(repr(rng.uniform(0, 1e6)))
    return out


def _pint(text: str, dimension: str) -> float | None:
    q = U.registry().parse_expression(U._normalise(text))
    if not hasattr(q, "magnitude") or not q.check(U.DIMENSIONS[dimension]):
        return None
    return float(q.to_base_units().magnitude)


@pytest.mark.parametrize("unit", UNITS)
def test_plain_reading_equals_pint(unit: str) -> None:
    rng = random.Random(unit)
    for number in _numbers(rng, 40):
        text = f"{number} {unit}"
        for dimension in U.DIMENSIONS:
            fast = U._plain_value(U._normalise(text), dimension)
            if fast is None:
                continue
            ref = _pint(text, dimension)
            assert ref is not None, (text, dimension)
            assert fast == ref and math.copysign(1, fast) == math.copysign(1, ref), (
                text, dimension)


@pytest.mark.parametrize("text", ["9 1/4 in", "12 ft 6 in", "5' 3\"", "-5 psi", "3 lb",
                                  "2 * 3 in", "1,600,000 psi", "4 degC", "7 nan"])
def test_other_texts_go_to_pint(text: str) -> None:
    for dimension in U.DIMENSIONS:
        assert U._plain_value(U._normalise(text), dimension) is None


def test_offset_and_wrong_dimension_are_refused_as_before() -> None:
    with pytest.raises(U.UnitError, match="is not a length"):
        U.parse("5 psi", "length", "x")
    assert U.parse("12 in", "length", "x") == _pint("12 in", "length")


@pytest.mark.parametrize("unit", sorted(U.KNOWN_UNITS))
def test_known_unit_factors_are_pints(unit: str) -> None:
    """Source: pint's own conversion of one unit (``_pint_factor``), for every dimension:
    the table gives the same factor, of the same type, exactly where pint gives one.
    """
    factor, dimensions = U.KNOWN_UNITS[unit]
    for dimension in U.DIMENSIONS:
        ref = U._pint_factor(unit, dimension)
        if dimension in dimensions:
            assert ref is not None, (unit, dimension)
            assert factor == ref and type(factor) is type(ref), (unit, dimension, ref)
        else:
            assert ref is None, (unit, dimension)
            assert U._unit_factor(unit, dimension) is None


def test_reading_known_units_builds_no_registry() -> None:
    """The demo projects and the material library read without pint: every quantity in
    them is a plain "number unit" of the table (checked in a fresh interpreter).
    """
    import subprocess
    import sys

    code = ("import sys; from plystack.core.io.resources import DEMOS, demo_text; "
            "from plystack.core.io.project_file import loads; "
            "[loads(demo_text(n)) for n in DEMOS]; "
            "print(sorted(m for m in sys.modules if m == 'pint' or m.startswith('pint.')))")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                         check=True)
    assert out.stdout.strip() == "[]"


def _fractions(rng: random.Random, count: int) -> list[str]:
    out = ["1/2", "1/4", "3/8", "9 1/4", "1 3/4", "8 3/4", "0 1/3", "5/0", "2 0/7", "1-1/2",
           "12345678901234567890/3", "7 12345678901234567890/9"]
    for _ in range(count):
        numerator, denominator = rng.randint(0, 10 ** rng.randint(1, 6)), rng.randint(1, 999)
        whole = rng.choice(["", f"{rng.randint(0, 10 ** rng.randint(0, 9))} "])
        out.append(f"{whole}{numerator}/{denominator}")
    return out


@pytest.mark.parametrize("unit", ["in", "ft", "mm", "m", "psi", "kN/m", "kg/m**3", "yd",
                                  "lbf", "lb", "degF", "kip"])
def test_fraction_reading_equals_pint(unit: str) -> None:
    """Source: pint's reading of the same rewritten text ("(9+(1/4)) in"), exactly."""
    rng = random.Random(f"fraction {unit}")
    for number in _fractions(rng, 60):
        text = f"{number} {unit}"
        expr = U._normalise(text)
        for dimension in U.DIMENSIONS:
            fast = U._fraction_value(expr, dimension)
            if fast is None:
                continue
            assert fast == _pint(text, dimension), (text, dimension)
            if abs(fast) <= U.MAX_MAGNITUDE[dimension]:
                assert U.parse(text, dimension, "x") == fast


def test_fraction_forms_read_without_pint() -> None:
    assert U._fraction_value(U._normalise("9 1/4 in"), "length") is not None
    assert U._fraction_value(U._normalise("3/8 in"), "length") is not None
    for text in ["9 1/4 psi", "1/0 in", "-1/2 in", "1.5 1/4 in", "1/2 in 3", "9 1/4 lb",
                 "(1/2) (in)", "14'-6 1/2\"", "1/2/3 in"]:
        assert U._fraction_value(U._normalise(text), "length") is None, text
