"""Splitting of the timbers where a plate's bolts push them across the grain, by hand.

Sources (outside the project):
- EN 1995-1-1 8.1.4 (8.4): F_90,Rk = 14 b w sqrt(h_e / (1 - h_e / h)) N (b, h_e, h in mm,
  w = 1 for bolts), F_90,Rd = k_mod F_90,Rk / gamma_M, gamma_M = 1.3 for connections
  (Table 2.3), k_mod = 0.8 medium-term in service class 1 (Table 3.1) (all from memory);
- NDS 2018 3.4.3.3 (from memory): V'_r = (2/3) F'_v b d_e (d_e / d)^2 for a connection less
  than 5 d from the end, for bolts d_e = d less the distance from the unloaded edge to the
  centre of the nearest bolt (the nearest edge is the rule of split rings and shear
  plates); DF-L No.2 F_v = 180 psi (NDS Supplement 2018 Table 4A, from
  memory), C_D = 1.0 for D + L;
- statics of a simple span (reactions) and the plate's share alpha = E_p I_p,na / EI
  (common practice), as in test_load_transfer.py.
"""

from __future__ import annotations

import math

import pytest

from plystack.core.io.project_file import from_dict
from plystack.core.pipeline import run
from tests.validation.test_load_transfer import ALPHA, LBF, flitch


def test_us_splitting_at_a_support_the_plate_does_not_bear_on_by_hand():
    """R1 = 312 x 6 + 300 x 8 / 12 = 2072 lbf (D + L); the plate's share alpha R1 goes down
    into the two timbers through the end station (12 in from the end, rows at 2.25 and
    7.0 in), half each. Loaded edge: the bottom; d_e = 7.0 in (to the top bolt's centre);
    12 in < 5 d = 46.25 in from the end, so (d_e / d)^2 applies."""
    R1 = 312 * 6 + 300 * 8 / 12
    a = run(from_dict(flitch()))
    chk = [c for c in a.checks if c.id == "splitting" and c.combination == "D + L"
           and c.location.startswith("support 1")]
    assert sorted(c.ply for c in chk) == ["L", "R"]
    d_e, d = 7.0, 9.25
    cap = 2 / 3 * 180 * 1.5 * d_e * (d_e / d) ** 2
    for c in chk:
        assert c.demand / LBF == pytest.approx(ALPHA * R1 / 2, rel=1e-9)
        assert c.capacity / LBF == pytest.approx(cap, rel=1e-9)
        assert "loaded edge bottom" in c.location


def test_us_splitting_under_a_point_load_pushes_towards_the_top():
    """The 300 lbf post at 4 ft bears on the timbers: alpha P goes up into the plate, the
    bolts push the timbers up: loaded edge the top, d_e = 9.25 - 2.25 = 7.0 in;
    the stations (36 and 60 in) are 5 d = 46.25 in or more from the end only for 60 in, so
    the nearer one (36 in) sets the reduced value."""
    a = run(from_dict(flitch()))
    c = next(c for c in a.checks if c.id == "splitting" and c.combination == "D + L"
             and c.location.startswith("point load") and c.ply == "L")
    assert c.demand / LBF == pytest.approx(ALPHA * 300 / 2, rel=1e-9)
    cap = 2 / 3 * 180 * 1.5 * 7.0 * (7.0 / 9.25) ** 2
    assert c.capacity / LBF == pytest.approx(cap, rel=1e-9)
    assert "loaded edge top" in c.location


def _eu(stations):
    return {
        "format": "plystack", "version": 1, "title": "EU flitch", "display_units": "SI",
        "plies": [
            {"name": "L", "material": "C24", "x": "0 mm", "y": "0 mm", "width": "45 mm",
             "height": "220 mm"},
            {"name": "P", "material": "S275", "x": "45 mm", "y": "10 mm", "width": "10 mm",
             "height": "200 mm"},
            {"name": "R", "material": "C24", "x": "55 mm", "y": "0 mm", "width": "45 mm",
             "height": "220 mm"}],
        "beam": {"spans": ["4 m"], "supports": "simple", "self_weight": False,
                 "bearing_length": "100 mm",
                 "loads": [{"case": "D", "type": "line", "value": "1 kN/m"},
                           {"case": "L", "type": "line", "value": "2 kN/m"}],
                 "combinations": "EN1990"},
        "design": {"basis": "EU-LSD", "service_class": 1,
                   "bolt": {"diameter": "12 mm", "rows": ["60 mm", "160 mm"],
                            "stations": stations}}}


def test_eu_splitting_at_a_support_by_hand():
    """R = w L / 2 with w = 1.35 x 1 + 1.5 x 2 kN/m (EN 1990 (6.10)); alpha by the
    transformed section (plate centred on the timbers: one neutral axis at 110 mm,
    alpha = E_p I_p / (E_t I_t + E_p I_p), C24 E0,mean 11,000 MPa, S275 210,000 MPa, from
    memory) on the final section, the larger (EN 1995-1-1 2.3.2.2: timber E_mean / (1 +
    psi2 k_def), Q governs: psi2 0.3, k_def 0.6 in service class 1). Zone: stations
    within d = 220 mm of the support, 0.1 and 0.2 m. Loaded edge
    the bottom, h_e = 160 mm (the top row), h = 220 mm, b = 45 mm; half the force each."""
    a = run(from_dict(_eu(["0.1 m", "0.2 m", "2 m", "3.8 m", "3.9 m"])))
    w = 1.35 * 1000 + 1.5 * 2000
    R = w * 4 / 2
    EI_t = 11000e6 / (1 + 0.3 * 0.6) * 2 * 0.045 * 0.220**3 / 12
    EI_p = 210000e6 * 0.010 * 0.200**3 / 12
    alpha = EI_p / (EI_t + EI_p)
    F90 = 14 * 45 * math.sqrt(160 / (1 - 160 / 220))
    c = next(c for c in a.checks if c.id == "splitting" and c.ply == "L"
             and c.combination == "ULS 1.35G + 1.5Q[L]" and c.location.startswith("support 1"))
    assert c.demand == pytest.approx(alpha * R / 2, rel=1e-9)
    assert c.reference[1] == pytest.approx(F90, rel=1e-12)
    assert c.factors["k_mod"] == 0.8
    assert c.capacity == pytest.approx(0.8 * F90 / 1.3, rel=1e-12)
