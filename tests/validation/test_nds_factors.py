"""NDS 2018 adjustment factors against values written out by hand (from memory of NDS
2018 Tables 2.3.2, 4.3.8 and the NDS Supplement Table 4A size factors, and 3.3.3 for the
beam stability factor)."""

from __future__ import annotations

import pytest
from hypothesis import given
from hypothesis import strategies as st

from plystack.core.codes import en1995, nds

IN, PSI = 0.0254, 6894.757293168361


@pytest.mark.parametrize("duration,value", [("permanent", 0.9), ("ten-years", 1.0),
                                            ("two-months", 1.15), ("seven-days", 1.25),
                                            ("ten-minutes", 1.6), ("impact", 2.0)])
def test_load_duration_factor(duration, value):
    assert nds.C_D(duration) == value


@pytest.mark.parametrize("depth_in,value", [(3.5, 1.5), (5.5, 1.3), (7.25, 1.2), (9.25, 1.1),
                                            (11.25, 1.0), (13.25, 0.9)])
def test_size_factor_dimension_lumber(depth_in, value):
    assert nds.C_F(depth_in * IN, "sawn", False) == value


def test_wet_service_bending_only_above_1150_psi():
    assert nds.C_M("Fb", "sawn", True, 900 * 1.1 * PSI) == 1.0
    assert nds.C_M("Fb", "sawn", True, 1500 * 1.1 * PSI) == 0.85
    assert nds.C_M("Fv", "sawn", True) == 0.97
    assert nds.C_M("Fc_perp", "sawn", True) == 0.67


def test_beam_stability_factor_by_hand():
    """Fb* = 1000 psi, E'min = 580,000 psi, d = 9.25 in, b = 3.375 in, l_u = 144 in:
    l_u/d = 15.6 >= 7 so l_e = 1.63 x 144 + 3 x 9.25 = 262.47 in; R_B^2 = 262.47 x 9.25
    / 3.375^2 = 213.15; F_bE = 1.20 x 580,000 / 213.15 = 3265.3 psi; a = 3.2653;
    C_L = (1 + a)/1.9 - sqrt(((1 + a)/1.9)^2 - a/0.95) = 2.24489 - 1.26586 = 0.97903."""
    c = nds.C_L(1000 * PSI, 580000 * PSI, 9.25 * IN, 3.375 * IN, 144 * IN)
    assert c == pytest.approx(0.97903, rel=5e-4)


@given(lu=st.floats(12, 400), extra=st.floats(1, 200))
def test_beam_stability_factor_falls_with_length(lu, extra):
    a = nds.C_L(1200 * PSI, 580000 * PSI, 9.25 * IN, 1.5 * IN, lu * IN)
    b = nds.C_L(1200 * PSI, 580000 * PSI, 9.25 * IN, 1.5 * IN, (lu + extra) * IN)
    assert 0 < b <= a <= 1.0


@pytest.mark.parametrize("duration,sc,value", [("permanent", 1, 0.6), ("medium-term", 1, 0.8),
                                               ("short-term", 2, 0.9),
                                               ("instantaneous", 1, 1.1),
                                               ("medium-term", 3, 0.65)])
def test_k_mod(duration, sc, value):
    """EN 1995-1-1 Table 3.1, solid timber (from memory)."""
    assert en1995.k_mod(duration, sc) == value


def test_k_h():
    """EN 1995-1-1 3.2(3): (150/h)^0.2 <= 1.3 for solid timber; 1.0 from 150 mm."""
    assert en1995.k_h(0.100, "sawn") == pytest.approx((150 / 100) ** 0.2)
    assert en1995.k_h(0.020, "sawn") == 1.3
    assert en1995.k_h(0.220, "sawn") == 1.0
    assert en1995.k_h(0.300, "glulam") == pytest.approx(2 ** 0.1)
