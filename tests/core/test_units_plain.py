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
