"""A US-ASD flitch beam worked by hand, every factor written out with its source.

Two 2x10 Douglas Fir-Larch No.2 (1.5 x 9.25 in) with a full-depth 3/8 x 9.25 in A36
plate between them; simple span 12 ft; D = 100 plf, L = 400 plf (line loads), no
self-weight; dry service, normal temperature, compression edge braced.

Sources (all from memory): NDS Supplement 2018 Table 4A for DF-L No.2 (Fb 900 psi,
Fv 180 psi, Fc_perp 625 psi, E 1,600,000 psi) and the size factor C_F = 1.1 for a 2x10;
NDS 2018 Table 2.3.2 C_D = 1.0 (ten years, D + L) and 0.9 (D alone); A36 Fy 36 ksi with
the traditional allowable 0.6 Fy; E steel 29,000 ksi; beam formulas from the AISC
Manual's beam diagrams; IBC Table 1604.3 limits L/360 (live), L/240 (total); NDS 3.5.2
K_cr = 1.5.
"""

from __future__ import annotations

import pytest

from plystack.core.io.project_file import from_dict
from plystack.core.pipeline import run

E_W, E_S = 1.6e6, 29.0e6  # psi
b, h, t = 1.5, 9.25, 0.375  # in
L_in = 144.0
wD, wL = 100 / 12, 400 / 12  # lbf/in
PSI = 6894.757293168361
IN = 0.0254
LBF = 4.4482216152605

n = E_S / E_W  # 18.125
I_w = 2 * b * h**3 / 12  # 197.86 in^4
I_s = t * h**3 / 12  # 24.73 in^4
I_t = I_w + n * I_s  # 646.1 in^4 (transformed to DF-L)
c = h / 2
M = (wD + wL) * L_in**2 / 8  # 108,000 lbf in
V = (wD + wL) * L_in / 2  # 3000 lbf
f_b_wood = M * c / I_t  # 773 psi
F_b_adj = 900 * 1.0 * 1.1  # Fb C_D C_F (C_M = C_t = C_L = C_i = C_r = 1.0)
f_b_steel = n * M * c / I_t
F_b_steel = 0.6 * 36000
# with creep (NDS 2018 3.5.2, from memory): the sustained D acts on the section with the
# timber modulus / K_cr (1.5), L on the short-term section; the plate gains stress
n_c = E_S / (E_W / 1.5)
I_t_creep = I_w + n_c * I_s  # transformed to the crept timber
M_D = wD * L_in**2 / 8
f_b_steel_creep = n_c * M_D * c / I_t_creep + n * (M - M_D) * c / I_t
Q_w = b * c * c / 2  # one timber's first moment above the neutral axis
f_v_wood = V * Q_w / (I_t * b)
delta_live = 5 * wL * L_in**4 / (384 * E_W * I_t)
delta_total = 5 * (wD + wL) * L_in**4 / (384 * E_W * I_t)
EI_creep = E_W / 1.5 * I_w + E_S * I_s
delta_long = 5 * wD * L_in**4 / (384 * EI_creep) + delta_live
bearing = V / (2 * b * 3.0)  # two timbers bear on 3 in


def project():
    return from_dict({
        "format": "plystack", "version": 1, "title": "hand flitch", "display_units": "US",
        "plies": [
            {"name": "L", "material": "DFL-No2", "x": "0 in", "y": "0 in",
             "width": "1.5 in", "height": "9.25 in"},
            {"name": "P", "material": "A36", "x": "1.5 in", "y": "0 in",
             "width": "0.375 in", "height": "9.25 in"},
            {"name": "R", "material": "DFL-No2", "x": "1.875 in", "y": "0 in",
             "width": "1.5 in", "height": "9.25 in"}],
        "beam": {"spans": ["12 ft"], "supports": "simple", "self_weight": False,
                 "bearing_length": "3 in",
                 "loads": [{"case": "D", "type": "line", "value": "100 plf"},
                           {"case": "L", "type": "line", "value": "400 plf"}],
                 "combinations": "ASD"},
        "design": {"basis": "US-ASD", "steel_bears": True}})


def find(a, cid, ply, combo):
    return next(c for c in a.checks if c.id == cid and c.ply == ply and c.combination == combo)


def test_section():
    a = run(project())
    assert a.section.I_transformed / IN**4 == pytest.approx(I_t, rel=1e-9)


def test_timber_bending():
    c = find(run(project()), "bending", "L", "D + L")
    assert c.demand / PSI == pytest.approx(f_b_wood, rel=5e-3)
    assert c.capacity / PSI == pytest.approx(F_b_adj, rel=5e-3)
    assert c.factors["C_D"] == 1.0 and c.factors["C_F"] == 1.1
    assert c.factors["C_M"] == c.factors["C_t"] == c.factors["C_L"] == 1.0
    assert c.ratio == pytest.approx(f_b_wood / F_b_adj, rel=5e-3)


def test_dead_load_alone_uses_C_D_0_9():
    c = find(run(project()), "bending", "L", "D")
    assert c.factors["C_D"] == 0.9
    assert c.capacity / PSI == pytest.approx(900 * 0.9 * 1.1, rel=5e-3)


def test_steel_bending():
    c = find(run(project()), "bending", "P", "D + L")
    assert f_b_steel_creep > f_b_steel
    assert c.demand / PSI == pytest.approx(f_b_steel_creep, rel=1e-9)
    assert c.capacity / PSI == pytest.approx(F_b_steel, rel=5e-3)


def test_timber_shear():
    c = find(run(project()), "shear", "L", "D + L")
    assert c.demand / PSI == pytest.approx(f_v_wood, rel=5e-3)
    assert c.capacity / PSI == pytest.approx(180.0, rel=5e-3)


def test_deflections():
    a = run(project())
    live = next(c for c in a.checks if c.id == "deflection-live" and c.combination == "L")
    assert live.demand / IN == pytest.approx(delta_live, rel=5e-3)
    assert live.capacity / IN == pytest.approx(L_in / 360, rel=5e-3)
    total = next(c for c in a.checks if c.id == "deflection-total" and c.combination == "D + L")
    assert total.demand / IN == pytest.approx(delta_total, rel=5e-3)
    assert total.capacity / IN == pytest.approx(L_in / 240, rel=5e-3)
    long = next(c for c in a.checks
                if c.id == "deflection-long-term" and c.combination == "D + L")
    assert long.demand / IN == pytest.approx(delta_long, rel=5e-3)


def test_bearing():
    a = run(project())
    c = next(c for c in a.checks if c.id == "bearing")
    assert c.demand / PSI == pytest.approx(bearing, rel=5e-3)
    assert c.capacity / PSI == pytest.approx(625.0, rel=5e-3)


def test_bolts_use_hand_value():
    """Z = 872.4 lbf (mode IIIs, see test_nds_bolts); plate share = E_s I_s / EI."""
    a = run(project())
    c = find(a, "bolts", "P", "D + L")
    assert c.reference[1] / LBF == pytest.approx(872.4, rel=5e-4)
    share = E_S * I_s / (E_W * I_t)
    W = (wD + wL) * L_in
    n_loc = int(L_in // (c.location and float(c.location.split("every ")[1].split(" in")[0])))
    assert c.demand / LBF == pytest.approx(W * share / (n_loc * 2), rel=5e-3)
