"""Bolt layouts, the force on every bolt at its station, load transfer into a plate and
the timbers' shear beside a support the plate does not bear on, worked by hand.

Sources: statics of a simple beam (reactions, shear); the plate's share
alpha = E_s I_s / (E_w I_w + E_s I_s) of a flitch beam whose plies share one neutral axis
(common practice); the bolt's Z = 872.4 lbf (NDS 2018 12.3.1, mode IIIs, worked in
test_nds_bolts.py); NDS Supplement 2018 Table 4A DF-L No.2 E 1,600,000 psi, Fv 180 psi
and A36 E 29,000 ksi (from memory); f_v = 3 V / (2 b d) for a rectangle (NDS 2018 3.4.2,
from memory). The transfer zone (stations within the member depth of the support or
load) is the tool's stated common-practice rule.
"""

from __future__ import annotations

import copy
import json
from pathlib import Path

import pytest

from plystack.core.design.bolt_layout import default_rows, placed_stations
from plystack.core.io.project_file import from_dict, load, to_dict
from plystack.core.pipeline import run
from tests.validation.test_bolt_geometry import _C_g_by_hand

IN, PSI, LBF, FT = 0.0254, 6894.757293168361, 4.4482216152605, 0.3048
DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo"
Z = 872.4  # lbf, see test_nds_bolts.py
E_W, E_S = 1.6e6, 29.0e6

# the porch section: two 1.5 x 9.25 in timbers, a 3/8 x 8.75 in plate centred on them
I_w = 2 * 1.5 * 9.25**3 / 12
I_s = 0.375 * 8.75**3 / 12
ALPHA = E_S * I_s / (E_W * I_w + E_S * I_s)


def flitch(design=None, loads=None, span="12 ft"):
    """The porch section without self-weight (loads are given by hand)."""
    return {
        "format": "plystack", "version": 1, "title": "hand flitch", "display_units": "US",
        "plies": [
            {"name": "L", "material": "DFL-No2", "x": "0 in", "y": "0 in",
             "width": "1.5 in", "height": "9.25 in"},
            {"name": "P", "material": "A36", "x": "1.5 in", "y": "0.25 in",
             "width": "0.375 in", "height": "8.75 in"},
            {"name": "R", "material": "DFL-No2", "x": "1.875 in", "y": "0 in",
             "width": "1.5 in", "height": "9.25 in"}],
        "beam": {"spans": [span], "supports": "simple", "self_weight": False,
                 "bearing_length": "3 in",
                 "loads": loads if loads is not None else [
                     {"case": "D", "type": "line", "value": "72 plf"},
                     {"case": "L", "type": "line", "value": "240 plf"},
                     {"case": "D", "type": "point", "value": "300 lbf", "at": "4 ft"}],
                 "combinations": "ASD"},
        "design": {"basis": "US-ASD", "bolt": {"diameter": "1/2 in", "rows": 2},
                   **(design or {})}}


def porch_C_g():
    """NDS 2018 11.3.6 for the two bolts at a station (rows at 2.25 and 7.0 in, 4.75 in
    apart): A_m = 0.375 x 24 in, A_s = 2 x 1.5 x 24 in (thickness x station spacing),
    gamma = 270,000 x 0.5^1.5 lbf/in (see test_bolt_geometry)."""
    return _C_g_by_hand(2, E_S * 0.375 * 24, E_W * 3.0 * 24, 4.75, 270000 * 0.5**1.5)


def checks(project, cid, combo="D + L"):
    return [c for c in run(project).checks if c.id == cid and c.combination == combo]


def test_plate_share_by_hand():
    a = run(from_dict(flitch()))
    assert a.section.E[1] * a.section.I_na[1] / a.section.EI == pytest.approx(ALPHA, rel=1e-12)


def test_end_reaction_goes_through_the_end_bolt_pair():
    """R1 = w L / 2 + P b / L = 312 x 6 + 300 x 8 / 12 = 2072 lbf under D + L; the plate
    does not bear (steel_bears false): alpha R1 through the two bolts of the end station
    (24 in spacing: stations 12 in from the ends, the only one within d = 9.25 in)."""
    R1 = 312 * 6 + 300 * 8 / 12
    support1 = next(c for c in checks(from_dict(flitch()), "load-transfer")
                    if c.location == "support 1")
    assert support1.demand / LBF == pytest.approx(ALPHA * R1, rel=1e-9)
    assert support1.factors["n"] == 2
    assert support1.factors["C_g"] == pytest.approx(porch_C_g(), rel=1e-9)
    assert support1.capacity / LBF == pytest.approx(2 * Z * porch_C_g(), rel=5e-5)
    bolts = checks(from_dict(flitch()), "bolts")[0]
    assert bolts.demand / LBF == pytest.approx(ALPHA * R1 / 2, rel=1e-9)
    assert bolts.x / IN == pytest.approx(12.0, rel=1e-12)


def test_point_load_transfer_zone_and_demand():
    """The 300 lbf post at 4 ft (D, factor 1.0 in D + L): stations at 36 and 60 in are both
    12 in away (none within 9.25 in), so both nearest stations form the zone: 4 bolts."""
    c = next(c for c in checks(from_dict(flitch()), "load-transfer")
             if c.location.startswith("point load"))
    assert c.demand / LBF == pytest.approx(ALPHA * 300, rel=1e-9)
    assert c.factors["n"] == 4
    assert c.capacity / LBF == pytest.approx(4 * Z * porch_C_g(), rel=5e-5)


def test_no_transfer_at_supports_where_the_plate_bears():
    p = from_dict(flitch({"steel_bears": True}))
    ids = [c.location for c in checks(p, "load-transfer")]
    assert ids == ["point load at x = 4.000 ft"]
    assert not [c for c in checks(p, "shear") if c.location.startswith("support")]


def test_bolt_force_at_each_station_by_hand():
    """Plate bearing on its seats, 400 plf (D + L), explicit stations at 1, 3, 7 and 11 ft
    on a 12 ft span: tributaries 0-2, 2-5, 5-9, 9-12 ft; the bolts of a station carry
    alpha w trib / 2. The most loaded is the station at 7 ft (4 ft of load)."""
    p = flitch({"steel_bears": True, "bolt": {"diameter": "1/2 in", "rows": 2,
                                              "stations": ["1 ft", "3 ft", "7 ft", "11 ft"]}},
               loads=[{"case": "D", "type": "line", "value": "100 plf"},
                      {"case": "L", "type": "line", "value": "300 plf"}])
    c = checks(from_dict(p), "bolts")[0]
    assert c.demand / LBF == pytest.approx(ALPHA * 400 * 4 / 2, rel=1e-9)
    assert c.x / FT == pytest.approx(7.0, rel=1e-12)
    assert c.fasteners.count == 8 and c.fasteners.locations == 4


def test_staggered_rows_halve_the_bolts_of_a_station():
    """Stagger: rows alternate between stations, one bolt per station of two rows."""
    p = flitch({"steel_bears": True, "bolt": {"diameter": "1/2 in", "rows": 2,
                                              "stations": ["1 ft", "3 ft", "7 ft", "11 ft"],
                                              "stagger": True}},
               loads=[{"case": "D", "type": "line", "value": "100 plf"},
                      {"case": "L", "type": "line", "value": "300 plf"}])
    c = checks(from_dict(p), "bolts")[0]
    assert c.demand / LBF == pytest.approx(ALPHA * 400 * 4 / 1, rel=1e-9)
    assert c.fasteners.count == 4


def test_timber_shear_beside_a_support_the_plate_does_not_bear_on():
    """The timbers alone carry R1 = 2072 lbf: f_v = 3 R / (2 (2 x 1.5) 9.25)."""
    R1 = 312 * 6 + 300 * 8 / 12
    c = next(c for c in checks(from_dict(flitch()), "shear")
             if c.ply == "L" and c.location == "support 1")
    assert c.demand / PSI == pytest.approx(3 * R1 / (2 * 3.0 * 9.25), rel=1e-9)
    assert c.capacity / PSI == pytest.approx(180.0, rel=1e-9)


def test_porch_demo_numbers_of_the_issue():
    """The porch demo as the issue checked it by hand: 0.657 x 2,177 = 1,430 lbf through
    the end bolt pair, 715 lbf per bolt, ratio about 0.82; the timbers at the support
    3 x 2,177 / (2 x 3 x 9.25) = 118 psi, ratio 0.65 (three figures, as stated there)."""
    a = run(load(DEMO / "porch-header.plystack.json"))
    t = next(c for c in a.checks if c.id == "load-transfer" and c.location == "support 1"
             and c.combination == "D + L")
    assert t.demand / LBF == pytest.approx(1430, rel=2e-3)
    assert t.ratio == pytest.approx(0.82, abs=5e-3)
    b = next(c for c in a.checks if c.id == "bolts" and c.combination == "D + L")
    assert b.demand / LBF == pytest.approx(715, rel=2e-3)
    s = next(c for c in a.checks if c.id == "shear" and c.location == "support 1"
             and c.combination == "D + L" and c.ply == "left 2x10")
    assert s.demand / PSI == pytest.approx(118, rel=5e-3)
    assert s.ratio == pytest.approx(0.65, abs=5e-3)


def test_missing_specific_gravity_makes_the_bolt_check_missing():
    d = flitch()
    d["materials"] = {"wood-x": {"kind": "timber", "E": "1600000 psi", "Fb": "900 psi",
                                 "Fv": "180 psi", "density": "500 kg/m^3",
                                 "source": "invented for a test"}}
    for ply in (d["plies"][0], d["plies"][2]):
        ply["material"] = "wood-x"
    a = run(from_dict(d))
    assert not [c for c in a.checks if c.id in ("bolts", "load-transfer")]
    assert any(w.path == "plies[1].material" and "specific gravity" in w.message
               for w in a.warnings)
    assert a.verdict == "INCOMPLETE"


def test_placed_stations_and_rows():
    """Centred stations: 144 in at 24 in gives 6 stations from 12 in; with a 4 in end
    distance floor((144 - 8) / 24) + 1 = 6 stations, centred (first at 12 in too); 60 in
    with 2 in end distance: floor(56 / 16) + 1 = 4 stations, first at (60 - 48) / 2."""
    assert placed_stations(0.0, 144.0, 24.0, None) == pytest.approx(
        [12, 36, 60, 84, 108, 132], rel=1e-12)
    assert placed_stations(0.0, 144.0, 24.0, 4.0)[0] == pytest.approx(12.0, rel=1e-12)
    assert placed_stations(0.0, 60.0, 16.0, 2.0) == pytest.approx([6, 22, 38, 54], rel=1e-12)
    # 2 rows in 0.25..9.0 in, 4 D = 2 in from the edges (room 4.75 in, under the 5 in
    # limit), centred on 4.625 in
    assert default_rows(2, 0.5, 0.25, 9.0, 5.0) == pytest.approx([2.25, 7.0], rel=1e-12)
    # a deeper plate: the 5 in spread governs
    assert default_rows(2, 0.5, 0.0, 12.0, 5.0) == pytest.approx([3.5, 8.5], rel=1e-12)
    assert default_rows(3, 0.5, 0.25, 9.0, None) == pytest.approx([2.25, 4.625, 7.0],
                                                                  rel=1e-12)


def test_layout_keys_round_trip_and_bad_values_are_named():
    d = flitch({"bolt": {"diameter": "1/2 in", "rows": ["2 in", "7 in"],
                         "stations": ["1 ft", "3 ft"], "stagger": True,
                         "end_distance": "3 in"}})
    p = from_dict(d)
    assert p.design.bolt.row_heights == pytest.approx((2 * IN, 7 * IN), rel=1e-12)
    assert p.design.bolt.rows == 2 and p.design.bolt.stagger
    assert from_dict(to_dict(p)) == p
    bad = copy.deepcopy(d)
    bad["design"]["bolt"]["rows"] = ["2 in", "oops"]
    bad["design"]["bolt"]["stations"] = "1 ft"
    with pytest.raises(Exception) as err:
        from_dict(bad)
    text = str(err.value)
    assert "design.bolt.rows[1]" in text and "design.bolt.stations" in text
    assert "Error" not in text.replace("ProjectError", "")
    json.dumps(to_dict(p))


@pytest.mark.parametrize(("combination", "psi2"), [("ULS 1.35G + 1.5Q[L]", 0.3),
                                                   ("ULS 1.35G", 1.0)])
def test_eu_transfer_uses_the_design_value_of_the_zone(combination, psi2):
    """EU demo: the support's transfer alpha R against n k_mod F_v,Rk / gamma_M; alpha on
    the final section, the larger (EN 1995-1-1 2.3.2.2: timber E_mean / (1 + psi2 k_def),
    psi2 of the imposed load where it governs, 1 for G alone; k_def 0.6 in service class
    1), by hand from the rectangles of the plies."""
    a = run(load(DEMO / "stair-trimmer-eu.plystack.json"))
    c = next(c for c in a.checks if c.id == "load-transfer" and c.location == "support 1"
             and c.combination == combination)
    assert a.design.service_class == 1
    E = [m.E / (1 + psi2 * 0.6) if m.kind == "timber" else m.E for m in a.section.materials]
    rects = [(p.width * p.height, p.y + p.height / 2, p.width * p.height**3 / 12)
             for p in a.section.plies]
    y_na = (sum(e * A * y for e, (A, y, _) in zip(E, rects, strict=True))
            / sum(e * A for e, (A, _, _) in zip(E, rects, strict=True)))
    EI_i = [e * (own + A * (y - y_na) ** 2) for e, (A, y, own) in zip(E, rects, strict=True)]
    jt_share = EI_i[1] / sum(EI_i)
    assert jt_share > a.section.E[1] * a.section.I_na[1] / a.section.EI  # at once
    k = a.beam.model.layout.support_positions().index(0.0)
    combo = next(cb for cb in a.beam.combinations if cb.name == c.combination)
    assert c.demand == pytest.approx(jt_share * float(combo.reactions_max[k]), rel=1e-9)
    assert c.capacity == pytest.approx(c.factors["n"] * c.factors["k_mod"] * c.reference[1]
                                       / 1.3, rel=1e-12)


def test_bending_on_the_net_section_at_the_holes_by_hand():
    """Holes 1/2 + 1/16 = 9/16 in (NDS 2018 12.1.3.2, from memory) at y = 2.25 and 7.0 in
    through both timbers and the plate (rows of the porch layout). Transformed to DF-L
    (n = 29,000 / 1,600 for the plate): gross A_t, first and second moments about y = 0,
    less the holes; the timber's stress grows by (c' / I_net) / (c / I_t)."""
    n = E_S / E_W
    dh = 9 / 16
    A = 2 * 1.5 * 9.25 + n * 0.375 * 8.75
    S1 = 2 * 1.5 * 9.25 * 4.625 + n * 0.375 * 8.75 * 4.625
    S2 = (2 * (1.5 * 9.25**3 / 12 + 1.5 * 9.25 * 4.625**2)
          + n * (0.375 * 8.75**3 / 12 + 0.375 * 8.75 * 4.625**2))
    I_gross = S2 - S1**2 / A
    width = 2 * 1.5 + n * 0.375  # transformed width the holes take out
    for y in (2.25, 7.0):
        A -= width * dh
        S1 -= width * dh * y
        S2 -= width * (dh * y * y + dh**3 / 12)
    y_na = S1 / A
    I_net = S2 - S1 * y_na
    loss = (max(9.25 - y_na, y_na) / I_net) / (4.625 / I_gross)
    a = run(from_dict(flitch()))
    gross = next(c for c in a.checks if c.id == "bending" and c.ply == "L"
                 and c.combination == "D + L")
    net = next(c for c in a.checks if c.id == "bending-net" and c.ply == "L"
               and c.combination == "D + L")
    assert a.section.I_transformed / IN**4 == pytest.approx(I_gross, rel=1e-12)
    assert net.demand == pytest.approx(gross.demand * loss, rel=1e-9)
    assert net.capacity == pytest.approx(gross.capacity, rel=1e-12)
    plate = next(c for c in a.checks if c.id == "bending-net" and c.ply == "P"
                 and c.combination == "D + L")
    # A36: F_u A_fn = 58 x (4.375 - 0.5625) x 0.375 > F_y A_fg = 36 x 4.375 x 0.375: F13.1 1.0
    assert plate.factors["F13.1"] == 1.0
