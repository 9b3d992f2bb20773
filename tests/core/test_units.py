"""Unit parsing. Conversion factors are exact by definition (NIST SP 811: 1 in = 0.0254 m,
1 ft = 0.3048 m, 1 lbf = 4.4482216152605 N)."""

from __future__ import annotations

import pytest

from plystack.core.model import units

IN, FT, LBF = 0.0254, 0.3048, 4.4482216152605


@pytest.mark.parametrize("text,dim,value", [
    ("1.5 in", "length", 1.5 * IN),
    ("9 1/4 in", "length", 9.25 * IN),
    ("3/8 in", "length", 0.375 * IN),
    ('9 1/4"', "length", 9.25 * IN),
    ("14'-6\"", "length", 14.5 * FT),
    ("14' 6\"", "length", 14.5 * FT),
    ("12'", "length", 12 * FT),
    ("235 mm", "length", 0.235),
    ("235mm", "length", 0.235),
    ("1600000 psi", "modulus", 1.6e6 * LBF / IN**2),
    ("11 GPa", "modulus", 11e9),
    ("29000 ksi", "modulus", 29e6 * LBF / IN**2),
    ("490 lb/ft^3", "density", 490 * 0.45359237 / FT**3),
    ("490 pcf", "density", 490 * 0.45359237 / FT**3),
    ("40 psf", "area_load", 40 * LBF / FT**2),
    ("2 ksf", "area_load", 2000 * LBF / FT**2),
    ("120 plf", "line_load", 120 * LBF / FT),
    ("1.2 klf", "line_load", 1200 * LBF / FT),
    ("120 lbf/ft", "line_load", 120 * LBF / FT),
    ("3 kip", "force", 3000 * LBF),
    ("12 kip*ft", "moment", 12000 * LBF * FT),
    ("5 kN*m", "moment", 5000.0),
])
def test_parse(text, dim, value):
    assert units.parse(text, dim, "f") == pytest.approx(value, rel=1e-12)


@pytest.mark.parametrize("text,word", [
    ("12", "has no unit"), ("12 apples", "is not a length"), ("", "is empty"),
    ("3 psi", "is not a length"), ("in", "has no number"),
])
def test_bad_lengths_name_the_field(text, word):
    with pytest.raises(units.UnitError) as info:
        units.parse(text, "length", "plies[2].height")
    assert str(info.value).startswith("plies[2].height:")
    assert word in str(info.value)


def test_not_a_string():
    with pytest.raises(units.UnitError, match="must be a string"):
        units.parse(12, "length", "x")


@pytest.mark.parametrize("value", [0.0381, 0.235, 1.8288, 1e-5, 123.456789, 0.1 + 0.2])
@pytest.mark.parametrize("system", ["US", "SI"])
def test_exact_text_round_trips(value, system):
    text = units.exact_text(value, "length", system)
    assert units.parse(text, "length", "x") == value


def _plain_fmt(value, kind, system, digits=4):
    """The formula of units.fmt, written out (the reference for its remembered texts)."""
    text = units.sig(units.to_display(value, kind, system), digits)
    return f"{text} {units.unit_label(kind, system)}".rstrip()


@pytest.mark.parametrize("system", ["US", "SI"])
def test_remembered_texts_are_the_formulas(system):
    import numpy as np
    values = [0.0, -0.0, 1.0, -2.5e-7, 0.0381, 1234.5678, 9.99995e11, float("inf"),
              float("-inf"), float("nan"), np.float64(0.23495), 3]
    for _ in range(2):  # made, then remembered
        for kind in units.DISPLAY[system]:
            for v in values:
                for digits in (3, 4, 6):
                    assert units.fmt(v, kind, system, digits) == _plain_fmt(v, kind, system,
                                                                             digits)


def test_remembered_texts_are_bounded(monkeypatch):
    monkeypatch.setattr(units, "_FMT_HELD", 8)
    units._FMT_MADE.clear()
    for k in range(50):
        assert units.fmt(k * 0.001, "length", "SI") == _plain_fmt(k * 0.001, "length", "SI")
        assert len(units._FMT_MADE) <= 8
