"""EU final deflection of a solid C24 joist, by hand from EN 1995-1-1 2.2.3(5) (from
memory): u_fin = u_inst,G (1 + k_def) + u_inst,Q (1 + psi2 k_def), with k_def = 0.6 in
service class 1 (Table 3.2) and psi2 = 0.3 for domestic floors (EN 1990 Table A1.1);
u_inst = 5 w L^4 / (384 E I) on a simple span (AISC Manual beam diagrams, from memory);
E0,mean of C24 = 11,000 MPa (EN 338, from memory).
"""

from __future__ import annotations

import pytest

from plystack.core.io.output import check_json
from plystack.core.io.project_file import from_dict
from plystack.core.pipeline import run

L, b, h = 4.0, 0.045, 0.220
G, Q = 400.0, 900.0  # N/m
E = 11.0e9
I_joist = b * h**3 / 12
u_G = 5 * G * L**4 / (384 * E * I_joist)
u_Q = 5 * Q * L**4 / (384 * E * I_joist)
u_fin = u_G * (1 + 0.6) + u_Q * (1 + 0.3 * 0.6)


def project():
    return from_dict({
        "format": "plystack", "version": 1, "title": "C24 joist", "display_units": "SI",
        "plies": [{"name": "joist", "material": "C24", "x": "0 mm", "y": "0 mm",
                   "width": "45 mm", "height": "220 mm"}],
        "beam": {"spans": ["4 m"], "supports": "simple", "self_weight": False,
                 "loads": [{"case": "D", "type": "line", "value": "0.4 kN/m"},
                           {"case": "L", "type": "line", "value": "0.9 kN/m"}]},
        "design": {"basis": "EU-LSD", "service_class": 1}})


def test_final_deflection_equals_the_hand_value_in_check_json_and_creep_block():
    a = run(project())
    fin = next(c for c in a.checks if c.id == "deflection-long-term"
               and c.combination == "SLS char G + Q[L]")
    assert fin.demand == pytest.approx(u_fin, rel=1e-9)
    combo = next(c for c in check_json(a)["beam"]["combinations"]
                 if c["name"] == "SLS char G + Q[L]")
    assert combo["kind"] == "SLS-characteristic"
    assert combo["creep"]["deflection_total"] == pytest.approx(u_fin, rel=1e-9)
    assert combo["creep"]["sustained_factors"] == {"D": 1.0, "L": 0.3}
    inst = next(c for c in a.checks if c.id == "deflection-total"
                and c.combination == "SLS char G + Q[L]")
    assert inst.demand == pytest.approx(u_G + u_Q, rel=1e-9)
    live = next(c for c in a.checks if c.id == "deflection-live"
                and c.combination == "SLS char G + Q[L]")
    assert live.demand == pytest.approx(u_Q, rel=1e-9)


def test_deflection_never_from_a_factored_combination():
    a = run(project())
    for c in a.checks:
        if c.id.startswith("deflection"):
            assert not c.combination.startswith("ULS"), c.combination
    strength = [c for c in a.checks if c.id in ("bending", "shear", "bearing")]
    assert strength and all(c.combination.startswith("ULS") for c in strength)
