"""Floor vibration worked by hand: EN 1995-1-1 7.3.3 for a C24 joist floor and for the
same joist with a steel side plate, and the US common-practice joist criterion.

Invented floor (not a real project): C24 joists 45 x 220 mm at 400 mm centres, simple
span 4.0 m, floor 4.5 m wide across the joists, permanent area load 0.5 kPa, the joists'
own weight (mean density 420 kg/m^3), a deck of stiffness (EI)_b = 2.7 kN m^2/m across
the joists, damping ratio 0.01.

Sources (all from memory): EN 338:2016 C24 E0,mean = 11,000 MPa, mean density
420 kg/m^3; EN 1995-1-1 7.3.3 Eq. (7.3) w/F <= a, (7.4) v <= b^(f1 zeta - 1), (7.5)
f1 = (pi / 2 l^2) sqrt((EI)_l / m), (7.6) v = 4 (0.4 + 0.6 n40) / (m b l + 200), (7.7)
n40 = {((40/f1)^2 - 1)(b/l)^4 (EI)_l/(EI)_b}^0.25, the 8 Hz limit of 7.3.3(1);
EN 1993-1-1 E = 210,000 MPa, steel density 7850 kg/m^3; the midspan point-load
deflection P l^3 / 48 EI and the simply supported beam frequency
(pi/2) sqrt(EI / (mu L^4)) from handbook beam formulas; the US criterion's default
limits (15 Hz, 0.04 in under 225 lbf) are common practice, not a code clause. Each
expected value is the formula evaluated here by hand, independently of Plystack's own
clause functions.
"""

from __future__ import annotations

import math

import pytest

from plystack.core.io.project_file import from_dict
from plystack.core.pipeline import run

G = 9.80665
E_T, E_S = 11000e6, 210000e6  # Pa
RHO_T, RHO_S = 420.0, 7850.0  # kg/m^3
B_J, H_J = 0.045, 0.220  # m
T_P, H_P = 0.008, 0.200  # m (plate 8 x 200 mm on the joist's face, centred on its depth)
L, S, WIDTH = 4.0, 0.4, 4.5  # m
Q_D = 500.0  # Pa
EI_B = 2700.0  # N m^2/m
ZETA = 0.01
A_DEFAULT, B_DEFAULT = 1.5e-6, 100.0  # stated defaults (m/N; b)


def project(plated: bool, basis: str = "EU-LSD", vibration: dict | None = None) -> dict:
    plies = [{"name": "joist", "material": "C24", "x": "0 mm", "y": "0 mm",
              "width": "45 mm", "height": "220 mm"}]
    if plated:
        plies.append({"name": "plate", "material": "S275", "x": "45 mm", "y": "10 mm",
                      "width": "8 mm", "height": "200 mm"})
    return {
        "format": "plystack", "version": 1, "title": "invented joist floor",
        "display_units": "SI", "plies": plies,
        "beam": {"spans": ["4 m"], "supports": "simple", "self_weight": True,
                 "loads": [{"case": "D", "type": "area", "value": "0.5 kPa",
                            "tributary_width": "400 mm"},
                           {"case": "L", "type": "area", "value": "1.5 kPa",
                            "tributary_width": "400 mm"}]},
        "design": {"basis": basis, "vibration": vibration or {
            "floor_width": "4.5 m", "spacing": "400 mm", "damping": 0.01,
            "transverse_EI": "2.7 kN*m^2/m"}},
    }


def hand(plated: bool) -> dict[str, float]:
    """EN 1995-1-1 7.3.3 by hand."""
    EI = E_T * B_J * H_J**3 / 12  # plate centred on the joist's depth: same axis
    mu = RHO_T * B_J * H_J + Q_D * S / G
    if plated:
        EI += E_S * T_P * H_P**3 / 12
        mu += RHO_S * T_P * H_P
    m = mu / S
    EI_l = EI / S
    f1 = math.pi / (2 * L**2) * math.sqrt(EI_l / m)
    n40 = (((40 / f1) ** 2 - 1) * (WIDTH / L) ** 4 * EI_l / EI_B) ** 0.25
    v = 4 * (0.4 + 0.6 * n40) / (m * WIDTH * L + 200)
    return {"EI": EI, "mu": mu, "m": m, "f1": f1, "wF": L**3 / (48 * EI), "n40": n40,
            "v": v, "v_lim": B_DEFAULT ** (f1 * ZETA - 1)}


def by_id(a, check_id):
    found = [c for c in a.checks if c.id == check_id]
    assert len(found) == 1, check_id
    return found[0]


@pytest.mark.parametrize("plated", [False, True], ids=["C24 joist", "plated joist"])
def test_en1995_7_3_3_by_hand(plated):
    a = run(from_dict(project(plated)))
    h = hand(plated)
    assert a.section.EI == pytest.approx(h["EI"], rel=1e-9)
    f = by_id(a, "vibration-frequency")
    assert f.capacity == pytest.approx(h["f1"], rel=1e-9)
    assert f.demand == 8.0
    assert f.ratio == pytest.approx(8.0 / h["f1"], rel=1e-9)
    assert f.limit_state == "serviceability"
    w = by_id(a, "vibration-stiffness")
    assert w.demand == pytest.approx(h["wF"], rel=1e-9)
    assert w.capacity == pytest.approx(A_DEFAULT, rel=1e-12)
    v = by_id(a, "vibration-velocity")
    assert v.demand == pytest.approx(h["v"], rel=1e-9)
    assert v.capacity == pytest.approx(h["v_lim"], rel=1e-9)
    assert any(f"{h['n40']:.4g}" in n for n in v.notes)
    assert not [p for p in a.warnings if p.path == "design.vibration"]


def test_hand_values_are_what_a_practitioner_expects():
    """The numbers of the hand calculation itself (guards the test's own arithmetic):
    f1 about 13 Hz for the bare joist, higher with the plate; w/F about 3 mm/kN for the
    bare joist alone, so it fails a = 1.5 mm/kN without lateral distribution, and the
    plate brings it under.
    """
    bare, plated = hand(False), hand(True)
    assert 12.5 < bare["f1"] < 13.5
    assert plated["f1"] > bare["f1"] * 1.3
    assert bare["wF"] * 1e6 == pytest.approx(3.04, abs=0.01)
    assert plated["wF"] < bare["wF"] / 3


def test_user_limits_replace_the_defaults():
    vib = {"floor_width": "4.5 m", "spacing": "400 mm", "damping": 0.02,
           "transverse_EI": "2.7 kN*m^2/m", "a_mm_per_kN": 4.0, "b": 80}
    a = run(from_dict(project(False, vibration=vib)))
    h = hand(False)
    assert by_id(a, "vibration-stiffness").capacity == pytest.approx(4.0e-6, rel=1e-12)
    assert by_id(a, "vibration-velocity").capacity == pytest.approx(
        80.0 ** (h["f1"] * 0.02 - 1), rel=1e-9)


def test_us_common_practice_criterion_by_hand():
    """Simply supported joist: f_n = (pi/2) sqrt(EI / (mu L^4)) >= 15 Hz and
    P L^3 / 48 EI <= 0.04 in under P = 225 lbf (the defaults), then the user's limits.
    """
    a = run(from_dict(project(True, basis="US-ASD")))
    h = hand(True)
    f = by_id(a, "vibration-frequency")
    fn = math.pi / 2 * math.sqrt(h["EI"] / (h["mu"] * L**4))
    assert f.capacity == pytest.approx(fn, rel=1e-9)
    assert f.demand == 15.0
    w = by_id(a, "vibration-stiffness")
    P = 225 * 4.4482216152605
    assert w.demand == pytest.approx(P * L**3 / (48 * h["EI"]), rel=1e-9)
    assert w.capacity == pytest.approx(0.04 * 0.0254, rel=1e-12)
    assert not [c for c in a.checks if c.id == "vibration-velocity"]
    vib = {"spacing": "400 mm", "frequency_min_Hz": 14, "point_load": "1 kN",
           "point_deflection_limit": "2 mm"}
    a = run(from_dict(project(True, basis="US-ASD", vibration=vib)))
    assert by_id(a, "vibration-frequency").demand == 14.0
    w = by_id(a, "vibration-stiffness")
    assert w.demand == pytest.approx(1000 * L**3 / (48 * h["EI"]), rel=1e-9)
    assert w.capacity == pytest.approx(0.002, rel=1e-12)
