"""The force a plate that stops short of the supports carries just inside its end, and
the bolts that must develop it (check ``load-transfer`` at the plate's end), by hand.

Sources (outside the project):
- statics of a simple beam under uniform load: M(x) = w x (L - x) / 2, V(x) = w (L / 2 - x)
  (any structural handbook, e.g. the beam diagrams of the AISC Steel Construction Manual,
  from memory); a simple span is statically determinate, so the stepped stiffness does not
  change M or V;
- the transformed-section method (common practice): the plate's stress at its centroid
  sigma_c = -E_p M (y_c - y_na) / EI, axial force F = sigma_c A_p, share of the shear
  alpha V, alpha = E_p I_p,na / EI, own moment E_p I_p,own M / EI;
- the elastic method for eccentric bolt groups (common practice, as in the AISC Steel
  Construction Manual Part 7, from memory): bolt force = direct share + M_g r / J;
- NDS Supplement 2018 Table 4A DF-L No.2 E = 1,600,000 psi and A36 E = 29,000 ksi; K_cr =
  1.5 for seasoned lumber in dry service (NDS 2018 3.5.2); NDS 2018 11.3.6 C_g (all from
  memory);
- EN 1995-1-1 8.5.1.1(4) n_ef = min(n, n^0.9 (a1 / 13 d)^0.25) (from memory).
"""

from __future__ import annotations

import copy
import math

import pytest

from plystack.core.io.project_file import from_dict
from plystack.core.pipeline import run
from tests.validation.test_bolt_geometry import _C_g_by_hand
from tests.validation.test_load_transfer import E_S, E_W, flitch

IN, LBF, FT = 0.0254, 4.4482216152605, 0.3048
MPA = 1e6


def _short_plate(stations=("15 in", "21 in", "72 in", "123 in", "129 in")):
    """The porch section (two 1.5 x 9.25 in DF-L, 3/8 x 8.75 in A36 centred) on a 12 ft
    span, 312 plf (72 D + 240 L), the plate from 1 ft to 11 ft, explicit stations."""
    d = flitch({"bolt": {"diameter": "1/2 in", "rows": 2, "stations": list(stations)}},
               loads=[{"case": "D", "type": "line", "value": "72 plf"},
                      {"case": "L", "type": "line", "value": "240 plf"}])
    d["plies"][1]["from"] = "1 ft"
    d["plies"][1]["to"] = "11 ft"
    return d


def _end_checks(a, combo):
    return [c for c in a.checks if c.id == "load-transfer" and c.combination == combo
            and c.location.startswith("end of")]


def _centred_group_demand(w, alpha, x_cut, x_bolts, dy):
    """4 f_max of two stations of two bolts (rows +/- dy about the plate's centroid, which is
    on the neutral axis, so F = 0 and the own moment is alpha M): M_g = alpha M + alpha V
    |x_cut - x_g|, J = sum (dx^2 + dy^2), f_max = |(M_g dy / J, alpha V / 4 + M_g dx / J)|.
    Lengths in in, forces in lbf, w in lbf/in."""
    L = 144.0
    M = w * x_cut * (L - x_cut) / 2
    V = w * (L / 2 - x_cut)
    x_g = sum(x_bolts) / 2
    dx = abs(x_bolts[0] - x_g)
    J = 4 * (dx**2 + dy**2)
    M_g = alpha * abs(M) + alpha * abs(V) * abs(x_cut - x_g)
    f = math.hypot(M_g * dy / J, alpha * abs(V) / 4 + M_g * dx / J)
    return 4 * f


def test_plate_stopping_one_foot_short_of_each_end_by_hand():
    """Plate end at 12 in; zone: the stations within d = 9.25 in, 15 and 21 in (2 bolts
    each, rows at 2.25 and 7.0 in: dy = 2.375 in about y_g = 4.625 in). Cuts at the end
    (12 in) and d or the farthest bolt beyond it (21.25 in); sections at once (alpha) and
    with creep (timber E / 1.5). The worst of the four is the demand."""
    I_w = 2 * 1.5 * 9.25**3 / 12
    I_s = 0.375 * 8.75**3 / 12
    w = 312 / 12  # lbf/in, D + L
    want = 0.0
    for EW in (E_W, E_W / 1.5):
        alpha = E_S * I_s / (EW * I_w + E_S * I_s)
        for x_cut in (12.0, 12.0 + 9.25):
            want = max(want, _centred_group_demand(w, alpha, x_cut, (15.0, 21.0), 2.375))
    a = run(from_dict(_short_plate()))
    ends = _end_checks(a, "D + L")
    assert [c.location.split(" at x = ")[0] for c in ends] == ["end of P", "end of P"]
    assert [c.x / FT for c in ends] == pytest.approx([1.0, 11.0], rel=1e-12)
    for c in ends:  # symmetric: both ends alike
        assert c.demand / LBF == pytest.approx(want, rel=1e-9)
        assert c.factors["n"] == 4
        bolts = next(b for b in a.checks if b.id == "bolts" and b.combination == "D + L")
        # capacity: n x the adjusted value of one bolt (the bolts check's, worked in
        # test_load_transfer.py); F = 0 so no factor of the row along the grain
        assert c.capacity == pytest.approx(4 * bolts.capacity, rel=1e-12)
    # the ply ends are checked now: no missing check names them
    assert not [r for r in a.incomplete_reasons if r.path.startswith("plies[1].")]


def test_one_station_of_two_bolts_carries_the_moment_by_hand():
    """Stations at 24 in spacing centred on the plate (the stock layout would put one at
    18 in); here one station at 18 in of the zone: dx = 0, J = 2 dy^2, M_g = alpha M +
    alpha V |x_cut - 18 in|, f_max = |(M_g dy / J, alpha V / 2)|, demand 2 f_max."""
    I_w = 2 * 1.5 * 9.25**3 / 12
    I_s = 0.375 * 8.75**3 / 12
    w, L, dy = 312 / 12, 144.0, 2.375
    want = 0.0
    for EW in (E_W, E_W / 1.5):
        alpha = E_S * I_s / (EW * I_w + E_S * I_s)
        for x_cut in (12.0, 21.25):
            M, V = w * x_cut * (L - x_cut) / 2, w * (L / 2 - x_cut)
            M_g = alpha * M + alpha * abs(V) * abs(x_cut - 18.0)
            f = math.hypot(M_g * dy / (2 * dy**2), alpha * abs(V) / 2)
            want = max(want, 2 * f)
    a = run(from_dict(_short_plate(("18 in", "72 in", "126 in"))))
    c = _end_checks(a, "D + L")[0]
    assert c.demand / LBF == pytest.approx(want, rel=1e-9)
    assert c.factors["n"] == 2
    assert not c.ok  # a single pair of bolts cannot develop the plate's moment share


def test_one_bolt_at_the_end_is_a_named_missing_check():
    """One row, one station in the zone: a single bolt cannot resist the plate's moment,
    so that end is not checked (INCOMPLETE or NOT OK, never OK)."""
    d = _short_plate(("18 in", "72 in", "126 in"))
    d["design"]["bolt"]["rows"] = 1
    a = run(from_dict(d))
    reasons = [r for r in a.incomplete_reasons if r.path in ("plies[1].from", "plies[1].to")]
    assert len(reasons) == 2
    assert "single bolt" in reasons[0].message
    assert a.verdict != "OK"


def test_a_timber_ply_ending_inside_stays_a_missing_check():
    """A timber ply that stops short has no bolted transfer to check: named missing."""
    d = flitch(loads=[{"case": "D", "type": "line", "value": "72 plf"}])
    d["plies"][0]["to"] = "10 ft"
    a = run(from_dict(d))
    r = [r for r in a.incomplete_reasons if r.path == "plies[0].to"]
    assert r and "timber" in r[0].message
    assert a.verdict != "OK"


def _eccentric_eu():
    """EU: two 45 x 220 mm C24 timbers and a 10 x 100 mm S275 plate between them at the
    bottom (y = 10 to 110 mm), the plate from 0.5 m to 3.5 m of a 4 m span, G 1 kN/m,
    Q 2 kN/m; bolts 12 mm in one row at y = 60 mm at 0.6, 0.7 and 0.8 m (and to the right)."""
    return {
        "format": "plystack", "version": 1, "title": "eccentric plate", "display_units": "SI",
        "plies": [
            {"name": "L", "material": "C24", "x": "0 mm", "y": "0 mm", "width": "45 mm",
             "height": "220 mm"},
            {"name": "P", "material": "S275", "x": "45 mm", "y": "10 mm", "width": "10 mm",
             "height": "100 mm", "from": "0.5 m", "to": "3.5 m"},
            {"name": "R", "material": "C24", "x": "55 mm", "y": "0 mm", "width": "45 mm",
             "height": "220 mm"}],
        "beam": {"spans": ["4 m"], "supports": "simple", "self_weight": False,
                 "bearing_length": "100 mm",
                 "loads": [{"case": "D", "type": "line", "value": "1 kN/m"},
                           {"case": "L", "type": "line", "value": "2 kN/m"}],
                 "combinations": "EN1990"},
        "design": {"basis": "EU-LSD", "service_class": 1,
                   "bolt": {"diameter": "12 mm", "rows": ["60 mm"],
                            "stations": ["0.6 m", "0.7 m", "0.8 m", "2 m", "3.2 m", "3.3 m",
                                         "3.4 m"]}}}


def test_eccentric_plate_axial_force_and_n_ef_eu_by_hand():
    """Transformed to C24 (E0,mean 11,000 MPa, EN 338; S275 E 210,000 MPa, EN 1993-1-1
    3.2.6, from memory): the plate's centroid at 60 mm is below the neutral axis, so the
    plate carries tension F = -E_p M (y_c - y_na) A_p / EI. Zone of the end at 0.5 m: the
    stations within d = 220 mm, 0.6 and 0.7 m (0.8 m is 300 mm away): two bolts in one row
    at y = 60 mm = y_c, dy = 0, dx = 50 mm. n_ef of the row along the grain (a1 = 100 mm,
    d = 12 mm): min(2, 2^0.9 (100 / 156)^0.25)."""
    a = run(from_dict(_eccentric_eu()))
    ends = [c for c in a.checks if c.id == "load-transfer" and c.location.startswith("end of")]
    assert ends
    c = next(c for c in ends if c.combination == "ULS 1.35G + 1.5Q[L]" and c.x < 1.0)
    w = 1.35 * 1000 + 1.5 * 2000  # N/m, EN 1990 (6.10) with gamma_G 1.35, gamma_Q 1.5
    L = 4.0
    E_t, E_p = 11000 * MPA, 210000 * MPA
    A_t, A_p = 2 * 0.045 * 0.220, 0.010 * 0.100
    k_def = 0.6  # service class 1, solid timber (EN 1995-1-1 Table 3.2, from memory)
    psi2 = 0.3  # domestic imposed load, the leading action (EN 1990 Table A1.1, from memory)
    want = 0.0
    for Et in (E_t, E_t / (1 + psi2 * k_def)):
        y_na = (Et * A_t * 0.110 + E_p * A_p * 0.060) / (Et * A_t + E_p * A_p)
        EI = (Et * (2 * 0.045 * 0.220**3 / 12 + A_t * (0.110 - y_na) ** 2)
              + E_p * (0.010 * 0.100**3 / 12 + A_p * (0.060 - y_na) ** 2))
        I_pna = 0.010 * 0.100**3 / 12 + A_p * (0.060 - y_na) ** 2
        for x in (0.5, 0.5 + 0.220):
            M, V = w * x * (L - x) / 2, w * (L / 2 - x)
            F = -E_p * M * (0.060 - y_na) * A_p / EI
            Vp = E_p * I_pna / EI * V
            M_own = E_p * (0.010 * 0.100**3 / 12) * M / EI
            M_g = abs(M_own) + abs(Vp) * abs(x - 0.65)
            J = 2 * 0.05**2
            f = math.hypot(abs(F) / 2, abs(Vp) / 2 + M_g * 0.05 / J)
            want = max(want, 2 * f)
    assert c.demand == pytest.approx(want, rel=1e-9)
    n_ef = min(2.0, 2**0.9 * (0.100 / (13 * 0.012)) ** 0.25)
    assert c.factors["n_ef/n"] == pytest.approx(n_ef / 2, rel=1e-12)
    assert c.capacity == pytest.approx(2 * n_ef / 2 * c.factors["k_mod"] * c.reference[1]
                                       / 1.3, rel=1e-12)


def test_us_row_along_the_grain_takes_the_lesser_C_g():
    """An off-centre plate on the US basis carries an axial force: C_g is the lesser of the
    row across the depth and the row along the grain in the zone (NDS 2018 11.3.6, gross
    areas: plate 0.375 x 4 in, timbers 2 x 1.5 x 9.25 in, s = 6 in)."""
    d = copy.deepcopy(_short_plate())
    d["plies"][1]["y"] = "0.25 in"
    d["plies"][1]["height"] = "4 in"
    d["design"]["bolt"]["rows"] = ["1.25 in", "3.25 in"]
    a = run(from_dict(d))
    c = _end_checks(a, "D + L")[0]
    along = _C_g_by_hand(2, E_S * 0.375 * 4, E_W * 2 * 1.5 * 9.25, 6.0, 270000 * 0.5**1.5)
    bolts = next(b for b in a.checks if b.id == "bolts" and b.combination == "D + L")
    assert c.factors["C_g"] == pytest.approx(min(along, bolts.factors["C_g"]), rel=1e-12)


def test_splitting_at_the_plate_end_by_hand():
    """At the plate's end the plate's share of the shear, alpha V, goes down into the two
    timbers (half each) through the end zone's bolts: loaded edge the bottom. The largest
    alpha V: at the end (V = w (72 - 12) in = 1560 lbf) with creep (timber E / 1.5, the
    larger alpha). NDS 2018 3.4.3.3 (from memory): d_e = 7.0 in (to the top bolt's
    centre), the stations at 15 and 21 in are within 5 d of the end: V'_r = (2/3) 180 psi
    x 1.5 in x d_e (d_e / d)^2."""
    I_w = 2 * 1.5 * 9.25**3 / 12
    I_s = 0.375 * 8.75**3 / 12
    alpha = E_S * I_s / (E_W / 1.5 * I_w + E_S * I_s)
    V = 312 / 12 * (72 - 12)
    a = run(from_dict(_short_plate()))
    c = next(c for c in a.checks if c.id == "splitting" and c.combination == "D + L"
             and c.location.startswith("end of P") and c.ply == "L")
    assert c.demand / LBF == pytest.approx(alpha * V / 2, rel=1e-9)
    assert c.capacity / LBF == pytest.approx(2 / 3 * 180 * 1.5 * 7.0 * (7.0 / 9.25) ** 2,
                                             rel=1e-9)
    assert "loaded edge bottom" in c.location
