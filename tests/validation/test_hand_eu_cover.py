"""An EU-LSD cover-plated beam worked by hand, every factor written out with its source.

C24 timber 75 x 225 mm with an S275 plate 75 x 6 mm under it (connected by screws of
design value 2.0 kN each, one row); simple span 4.0 m; G = 1.0 kN/m, Q (imposed floor,
case L) = 2.0 kN/m; no self-weight; service class 1.

Sources (all from memory): EN 338:2016 C24 (f_m,k 24 MPa, f_v,k 4.0 MPa, E0,mean
11,000 MPa); EN 1995-1-1 Table 3.1 k_mod = 0.8 (medium-term, SC1), Table 2.3
gamma_M = 1.3, 3.2(3) k_h = 1.0 for h >= 150 mm, 6.1.7(2) k_cr = 0.67, Table 3.2
k_def = 0.6; EN 1993-1-1 f_y = 275 MPa, gamma_M0 = 1.0, E = 210,000 MPa; EN 1990
6.10 ULS 1.35 G + 1.5 Q, psi2 = 0.3 for category A; beam formulas wL^2/8, wL/2,
5wL^4/384EI from the AISC Manual's beam diagrams.
"""

from __future__ import annotations

import pytest

from plystack.core.io.project_file import from_dict
from plystack.core.pipeline import run

E_t, E_s = 11000.0, 210000.0  # MPa
b, h, tp = 75.0, 225.0, 6.0  # mm
L = 4000.0  # mm
G, Q = 1.0, 2.0  # N/mm
w_uls = 1.35 * G + 1.5 * Q  # 4.35 N/mm
MPa = 1e6


def transformed(E_timber):
    n = E_s / E_timber
    A_t, y_t = b * h, h / 2
    A_p, y_p = n * b * tp, -tp / 2
    y_na = (A_t * y_t + A_p * y_p) / (A_t + A_p)
    I_sum = b * h**3 / 12 + A_t * (y_t - y_na) ** 2 + n * b * tp**3 / 12 + A_p * (y_p - y_na) ** 2
    return n, y_na, I_sum, A_p * abs(y_p - y_na)


n, y_na, I_t, Q_plate = transformed(E_t)
M = w_uls * L**2 / 8  # N mm
V = w_uls * L / 2  # N
sigma_timber_top = M * (h - y_na) / I_t
f_md = 0.8 * 1.0 * 24.0 / 1.3
sigma_steel = n * M * (y_na + tp) / I_t
# final state at ULS, EN 1995-1-1 2.3.2.2(2): timber E_mean / (1 + psi2 k_def), psi2 of
# the leading action (category A, 0.3), k_def 0.6; the plate gains stress as the timber
# creeps, and the check takes the larger of the two states
n_fin, y_na_fin, I_fin, _ = transformed(E_t / (1 + 0.3 * 0.6))
sigma_steel_final = n_fin * M * (y_na_fin + tp) / I_fin
tau_timber = V * (b * (h - y_na) ** 2 / 2) / (I_t * b)
f_vd = 0.8 * 0.67 * 4.0 / 1.3
q_interface = V * Q_plate / I_t  # N/mm
w_char = 5 * (G + Q) * L**4 / (384 * E_t * I_t)
w_live = 5 * Q * L**4 / (384 * E_t * I_t)
_, _, I_creep, _ = transformed(E_t / 1.6)
w_qp = 5 * (G + 0.3 * Q) * L**4 / 384
w_fin = w_char + w_qp / (E_t / 1.6 * I_creep) - w_qp / (E_t * I_t)


def project():
    return from_dict({
        "format": "plystack", "version": 1, "title": "hand EU", "display_units": "SI",
        "plies": [
            {"name": "timber", "material": "C24", "x": "0 mm", "y": "0 mm",
             "width": "75 mm", "height": "225 mm"},
            {"name": "plate", "material": "S275", "x": "0 mm", "y": "-6 mm",
             "width": "75 mm", "height": "6 mm"}],
        "beam": {"spans": ["4 m"], "supports": "simple", "self_weight": False,
                 "loads": [{"case": "D", "type": "line", "value": "1 kN/m"},
                           {"case": "L", "type": "line", "value": "2 kN/m"}],
                 "combinations": "EN1990"},
        "design": {"basis": "EU-LSD", "service_class": 1,
                   "connector": {"type": "screw", "allowable": "2 kN", "rows": 1}}})


def find(a, cid, ply, prefix="ULS 1.35G + 1.5Q[L]"):
    return next(c for c in a.checks if c.id == cid and c.ply == ply
                and (c.combination or "").startswith(prefix))


def test_timber_bending():
    c = find(run(project()), "bending", "timber")
    assert c.demand / MPa == pytest.approx(sigma_timber_top, rel=5e-3)
    assert c.capacity / MPa == pytest.approx(f_md, rel=5e-3)
    assert c.factors["k_mod"] == 0.8 and c.factors["k_h"] == 1.0
    assert c.partial_factors["gamma_M"] == 1.3


def test_steel_bending():
    c = find(run(project()), "bending", "plate")
    assert sigma_steel_final > sigma_steel
    assert c.demand / MPa == pytest.approx(sigma_steel_final, rel=1e-9)
    assert c.capacity / MPa == pytest.approx(275.0, rel=5e-3)


def test_timber_shear():
    c = find(run(project()), "shear", "timber")
    assert c.demand / MPa == pytest.approx(tau_timber, rel=5e-3)
    assert c.capacity / MPa == pytest.approx(f_vd, rel=5e-3)


def test_connectors():
    """Largest stock spacing s with q s <= 2.0 kN: 2000 / 38.9 = 51 mm -> 50 mm."""
    c = next(c for c in run(project()).checks if c.id == "connectors")
    assert "every 50.0 mm" in c.location
    assert c.demand == pytest.approx(q_interface * 50.0, rel=5e-3)
    assert c.ratio == pytest.approx(q_interface * 50.0 / 2000.0, rel=5e-3)


def test_deflections():
    a = run(project())
    total = find(a, "deflection-total", None, "SLS char G + Q[L]")
    assert total.demand * 1000 == pytest.approx(w_char, rel=5e-3)
    assert total.capacity * 1000 == pytest.approx(L / 300, rel=5e-3)
    live = find(a, "deflection-live", None, "SLS char G + Q[L]")
    assert live.demand * 1000 == pytest.approx(w_live, rel=5e-3)
    fin = find(a, "deflection-long-term", None, "SLS char G + Q[L]")
    assert fin.demand * 1000 == pytest.approx(w_fin, rel=5e-3)
