"""NDS 2018 12.3.1 yield limit equations for a 1/2 in bolt in a wood-steel-wood joint,
worked by hand (from memory of NDS Tables 12.3.1A/B and 12.3.3 footnotes):

D = 0.5 in, timber side members 1.5 in thick, G = 0.50, loaded perpendicular to grain:
Fe_perp = 6100 G^1.45 / sqrt(D) = 6100 x 0.366021 / 0.707107 = 3157.6 psi.
Steel main member 3/8 in, A36 Fu = 58 ksi: Fem = 1.5 Fu = 87,000 psi. Fyb = 45,000 psi.
Re = 87000 / 3157.6 = 27.552; K_theta = 1.25, Rd = 5.0 (Im, Is), 4.0 (IIIs, IV).
Im = 0.5 x 0.375 x 87000 / 5 = 3262.5 lbf
Is = 2 x 0.5 x 1.5 x 3157.6 / 5 = 947.3 lbf
k3 = -1 + sqrt(2 (1 + Re) / Re + 2 Fyb (2 + Re) D^2 / (3 Fem ls^2)) = 0.79020
IIIs = 2 k3 D ls Fem / ((2 + Re) Rd) = 872.4 lbf   (governs)
IV = 2 D^2 / Rd sqrt(2 Fem Fyb / (3 (1 + Re))) = 1195.2 lbf
"""

from __future__ import annotations

import pytest
from hypothesis import given
from hypothesis import strategies as st

from plystack.core.codes.dowels import (
    Fe_perpendicular,
    Fe_steel,
    en_f_h_k,
    en_M_y,
    nds_double_shear,
    nds_single_shear,
)

IN, PSI, LBF = 0.0254, 6894.757293168361, 4.4482216152605


def _modes(D_in=0.5, plate_in=0.375, side_in=1.5, G=0.5, Fu_psi=58000.0, Fyb_psi=45000.0):
    D = D_in * IN
    return nds_double_shear(D, plate_in * IN, Fe_steel(Fu_psi * PSI), side_in * IN,
                            Fe_perpendicular(G, D), Fyb_psi * PSI, 90.0)


def test_dowel_bearing_strength():
    assert Fe_perpendicular(0.5, 0.5 * IN) / PSI == pytest.approx(3157.6, rel=1e-4)


@pytest.mark.parametrize("mode,lbf", [("Im", 3262.5), ("Is", 947.3), ("IIIs", 872.4),
                                      ("IV", 1195.2)])
def test_hand_worked_modes(mode, lbf):
    modes = _modes()
    assert modes.modes[mode] / LBF == pytest.approx(lbf, rel=5e-4)


def test_governing_mode():
    m = _modes()
    assert m.governing == "IIIs"
    assert m.value / LBF == pytest.approx(872.4, rel=5e-4)


@given(t1=st.floats(0.1, 1.0), dt=st.floats(0.01, 1.0), G=st.floats(0.35, 0.6),
       D=st.sampled_from([0.375, 0.5, 0.625, 0.75, 1.0]))
def test_thicker_plate_never_lowers_the_value(t1, dt, G, D):
    assert _modes(D, t1 + dt, 1.5, G).value >= _modes(D, t1, 1.5, G).value * (1 - 1e-12)


@given(D1=st.floats(0.25, 0.9), dD=st.floats(0.01, 0.1), G=st.floats(0.35, 0.6),
       plate=st.floats(0.25, 0.75), side=st.floats(1.5, 3.5))
def test_larger_bolt_never_lowers_modes_I_and_III(D1, dD, G, plate, side):
    a = _modes(D1, plate, side, G)
    b = _modes(D1 + dD, plate, side, G)
    for mode in ("Im", "Is", "IIIs"):
        assert b.modes[mode] >= a.modes[mode] * (1 - 1e-12)


def test_single_shear_symmetry_of_modes_I():
    """Mode Im uses the main member, Is the side member (NDS Table 12.3.1A)."""
    D = 0.5 * IN
    m = nds_single_shear(D, 3.5 * IN, 3000 * PSI, 0.25 * IN, 87000 * PSI, 45000 * PSI, 90.0)
    assert m.modes["Im"] == pytest.approx(D * 3.5 * IN * 3000 * PSI / 5.0)
    assert m.modes["Is"] == pytest.approx(D * 0.25 * IN * 87000 * PSI / 5.0)


def test_en_embedment_and_yield_moment():
    """EN 1995-1-1 (8.32), (8.33), (8.30) by hand for d = 12 mm, rho_k = 350 kg/m3:
    f_h,0,k = 0.082 x 0.88 x 350 = 25.256 N/mm2; k90 = 1.35 + 0.18 = 1.53;
    f_h,90,k = 16.507 N/mm2; M_y,Rk = 0.3 x 400 x 12^2.6 = 76,745 N mm."""
    assert en_f_h_k(350.0, 0.012, 0.0) / 1e6 == pytest.approx(25.256, rel=1e-4)
    assert en_f_h_k(350.0, 0.012, 90.0) / 1e6 == pytest.approx(16.507, rel=1e-3)
    assert en_M_y(400e6, 0.012) * 1000 == pytest.approx(76745, rel=1e-3)
