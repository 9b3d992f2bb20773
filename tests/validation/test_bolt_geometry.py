"""Bolt geometry rules, group action and service factors against the published rules,
worked by hand.

Sources (all from memory): NDS 2018 Table 12.5.1A (end distance, perpendicular to grain:
4D for C_Delta = 1.0, 2D minimum), Table 12.5.1B with AISC 360-16 J3.3 (spacing in a row
perpendicular to grain: the steel plate's 3D), Table 12.5.1C (loaded edge 4D), Table
12.5.1D (spacing between rows perpendicular to grain: 2.5D for l/D <= 2), 12.5.1.3 (outer
rows of one steel plate at most 5 in apart), 11.3.6 (C_g, gamma = 270,000 D^1.5 lbf/in
for wood to steel), Table 11.3.3 (C_M 0.4 fabricated wet and used dry); EN 1995-1-1
Table 8.4 (a1 = (4 + |cos a|) d, a2 = 4d, a3,t = max(7d, 80 mm), a4,t = max((2 + 2 sin a)
d, 3d)) and 8.5.1.1(4) (n_ef).
"""

from __future__ import annotations

import math
from dataclasses import replace

import pytest

from plystack.core.codes import en1995_fasteners as en
from plystack.core.codes import nds_fasteners as nf
from plystack.core.io.project_file import from_dict
from plystack.core.pipeline import run

IN = 0.0254
LBF = 4.4482216152605


def us_flitch(D_in, stations_in, rows_in, span_ft=4.0):
    """Two 1.5 x 11.25 in timbers and a 3/8 x 11.25 in plate; explicit layout."""
    return from_dict({
        "format": "plystack", "version": 1, "title": "geometry", "display_units": "US",
        "plies": [
            {"name": "L", "material": "DFL-No2", "x": "0 in", "y": "0 in",
             "width": "1.5 in", "height": "11.25 in"},
            {"name": "P", "material": "A36", "x": "1.5 in", "y": "0 in",
             "width": "0.375 in", "height": "11.25 in"},
            {"name": "R", "material": "DFL-No2", "x": "1.875 in", "y": "0 in",
             "width": "1.5 in", "height": "11.25 in"}],
        "beam": {"spans": [f"{span_ft} ft"], "supports": "simple", "self_weight": False,
                 "loads": [{"case": "D", "type": "line", "value": "10 plf"}],
                 "combinations": "ASD"},
        "design": {"basis": "US-ASD", "steel_bears": True,
                   "bolt": {"diameter": f"{D_in} in",
                            "stations": [f"{x!r} in" for x in stations_in],
                            "rows": [f"{y!r} in" for y in rows_in]}}})


def geometry(project, cid, name_start):
    return next(c for c in run(project).checks
                if c.id == cid and c.location.startswith(name_start))


EPS = 1e-6


@pytest.mark.parametrize("D", [0.5, 0.625, 0.75])
def test_nds_end_distance_minimum_2D_and_C_Delta(D):
    L = 48.0
    for e, ok in ((2 * D * (1 + EPS), True), (2 * D * (1 - EPS), False)):
        c = geometry(us_flitch(D, [e, L / 2, L - 6 * D], [5.0, 7.0]), "bolt-end", "end")
        assert c.ok is ok and c.demand / IN == pytest.approx(2 * D, rel=1e-12)
    # 3D end distance: C_Delta = 3D / 4D = 0.75 on every bolts check
    p = us_flitch(D, [3 * D, L / 2, L - 6 * D], [5.0, 7.0])
    b = next(c for c in run(p).checks if c.id == "bolts")
    assert b.factors["C_Delta"] == pytest.approx(0.75, rel=1e-9)


@pytest.mark.parametrize("D", [0.5, 0.625, 0.75])
def test_nds_loaded_edge_4D(D):
    for off, ok in ((1 + EPS, True), (1 - EPS, False)):
        y0 = 4 * D * off
        c = geometry(us_flitch(D, [6.0, 24.0, 42.0], [y0, 11.25 - 4 * D]), "bolt-edge", "edge")
        assert c.ok is ok and c.demand / IN == pytest.approx(4 * D, rel=1e-12)


@pytest.mark.parametrize("D", [0.5, 0.625, 0.75])
def test_nds_spacing_in_a_row_3D_and_between_rows_by_the_wood_side_members(D):
    """Table 12.5.1D's footnote counts the bolt's length in wood only: the steel plate is
    the main member, so l/D = l_s / D with l_s = 1.5 + 1.5 = 3 in, the total in the two
    wood side members (not the plate's 0.375 in): D = 1/2 in, l/D = 6: 5D = 2.5 in;
    D = 5/8 in, l/D = 4.8: (5 x 3 + 10 x 0.625) / 8 = 2.65625 in; D = 3/4 in, l/D = 4:
    (15 + 7.5) / 8 = 2.8125 in.
    """
    need = {0.5: 2.5, 0.625: 2.65625, 0.75: 2.8125}[D]
    for f, ok in ((1 + EPS, True), (1 - EPS, False)):
        c = geometry(us_flitch(D, [6.0, 24.0, 42.0], [5.0, 5.0 + 3 * D * f]), "bolt-spacing",
                     "spacing in a row")
        assert c.ok is ok and c.demand / IN == pytest.approx(3 * D, rel=1e-12)
        c = geometry(us_flitch(D, [6.0, 6.0 + need * f, 42.0], [5.0, 7.0]), "bolt-spacing",
                     "spacing between rows")
        assert c.ok is ok and c.demand / IN == pytest.approx(need, rel=1e-12)


def test_nds_spacing_between_rows_of_a_steel_side_plate_counts_the_wood_main_member():
    """Steel side plates on a 1.5 in joist (invented test member): l/D = l_m / D =
    1.5 / 0.625 = 2.4 (the plates' steel does not count): (5 x 1.5 + 10 x 0.625) / 8 =
    1.71875 in, where the steel's l/D = 0.8 would have allowed 2.5D = 1.5625 in.
    """
    for f, ok in ((1 + EPS, True), (1 - EPS, False)):
        p = us_flitch(0.625, [6.0, 6.0 + 1.71875 * f, 42.0], [5.0, 7.0])
        plies = p.plies
        side = (replace(plies[0], x=0.0), replace(plies[1], x=1.5 * IN))
        c = geometry(p.with_plies(side), "bolt-spacing", "spacing between rows")
        assert c.ok is ok and c.demand / IN == pytest.approx(1.71875, rel=1e-12)


def test_nds_outer_rows_at_most_5_in_apart():
    for spread, ok in ((5.0 * (1 - EPS), True), (5.0 * (1 + EPS), False)):
        c = geometry(us_flitch(0.5, [6.0, 24.0, 42.0], [3.0, 3.0 + spread]), "bolt-spacing",
                     "spread")
        assert c.ok is ok and c.capacity / IN == pytest.approx(5.0, rel=1e-12)


def test_nds_row_spacing_for_longer_bolts_by_hand():
    """Table 12.5.1D: l/D = 4: (5 l + 10 D) / 8 = (20 + 10) D / 8 = 3.75 D; l/D = 6: 5D."""
    assert nf.row_spacing_perpendicular(1.0, 4.0).full == pytest.approx(3.75, rel=1e-12)
    assert nf.row_spacing_perpendicular(1.0, 6.0).full == pytest.approx(5.0, rel=1e-12)
    assert nf.row_spacing_perpendicular(1.0, 2.0).full == pytest.approx(2.5, rel=1e-12)


def eu_flitch(d_mm, stations_mm, rows_mm):
    return from_dict({
        "format": "plystack", "version": 1, "title": "geometry", "display_units": "SI",
        "plies": [
            {"name": "L", "material": "C24", "x": "0 mm", "y": "0 mm",
             "width": "45 mm", "height": "240 mm"},
            {"name": "P", "material": "S275", "x": "45 mm", "y": "0 mm",
             "width": "10 mm", "height": "240 mm"},
            {"name": "R", "material": "C24", "x": "55 mm", "y": "0 mm",
             "width": "45 mm", "height": "240 mm"}],
        "beam": {"spans": ["1.5 m"], "supports": "simple", "self_weight": False,
                 "loads": [{"case": "D", "type": "line", "value": "0.5 kN/m"}],
                 "combinations": "EN1990"},
        "design": {"basis": "EU-LSD", "steel_bears": True,
                   "bolt": {"diameter": f"{d_mm} mm",
                            "stations": [f"{x!r} mm" for x in stations_mm],
                            "rows": [f"{y!r} mm" for y in rows_mm]}}})


@pytest.mark.parametrize("d", [12.0, 16.0])
def test_en_table_8_4(d):
    a3 = max(7 * d, 80.0)  # a3,t = max(7d, 80 mm); a3,c at 90 degrees = 7d
    for f, ok in ((1 + EPS, True), (1 - EPS, False)):
        c = geometry(eu_flitch(d, [a3 * f, 750.0, 1500.0 - 150.0], [60.0, 180.0]),
                     "bolt-end", "end")
        assert c.ok is ok and c.demand * 1000 == pytest.approx(a3, rel=1e-12)
        c = geometry(eu_flitch(d, [150.0, 750.0, 1350.0], [4 * d * f, 160.0]), "bolt-edge",
                     "edge")
        assert c.ok is ok and c.demand * 1000 == pytest.approx(4 * d, rel=1e-12)
        c = geometry(eu_flitch(d, [150.0, 750.0, 1350.0], [100.0, 100.0 + 4 * d * f]),
                     "bolt-spacing", "spacing across")
        assert c.ok is ok and c.demand * 1000 == pytest.approx(4 * d, rel=1e-12)
        c = geometry(eu_flitch(d, [150.0, 150.0 + 4 * d * f, 1350.0], [60.0, 180.0]),
                     "bolt-spacing", "spacing along")
        assert c.ok is ok and c.demand * 1000 == pytest.approx(4 * d, rel=1e-12)


def _C_g_by_hand(n, EA_m, EA_s, s, gamma):
    """NDS 2018 11.3.6 written out again (from memory)."""
    R = EA_s / EA_m if EA_s < EA_m else EA_m / EA_s
    u = 1.0 + gamma * (s / 2.0) * (1.0 / EA_m + 1.0 / EA_s)
    m = u - (u**2 - 1.0) ** 0.5
    num = m * (1.0 - m ** (2 * n))
    den = n * ((1.0 + R * m**n) * (1.0 + m) - 1.0 + m ** (2 * n))
    return num / den * (1.0 + R) / (1.0 - m)


@pytest.mark.parametrize("n", [4, 8])
def test_C_g_by_hand(n):
    """1 in bolts at 4 in in a row: steel main member 1/2 x 4 in (E 29,000 ksi), two
    timber side members 1.5 x 4 in each (E 1,600 ksi); gamma = 270,000 x 1^1.5 lbf/in.
    E_m A_m = 58e6 lbf, E_s A_s = 19.2e6 lbf, R_EA = 0.33103."""
    EA_m, EA_s, s, gamma = 29e6 * 0.5 * 4, 1.6e6 * 3 * 4, 4.0, 270000.0
    assert EA_s / EA_m == pytest.approx(0.331034, rel=1e-5)
    expected = _C_g_by_hand(n, EA_m, EA_s, s, gamma)
    got = nf.C_g(n, EA_m * LBF, EA_s * LBF, s * IN, nf.gamma_bolt_steel(1.0 * IN))
    assert got == pytest.approx(expected, rel=1e-12)
    # the group loses capacity as the row grows, never gains (11.3.6)
    assert got < 1.0
    assert nf.C_g(1, EA_m, EA_s, s, gamma) == 1.0


def test_C_g_of_8_is_below_that_of_4():
    EA_m, EA_s = 29e6 * 0.5 * 4 * LBF, 1.6e6 * 3 * 4 * LBF
    g = nf.gamma_bolt_steel(IN)
    assert nf.C_g(8, EA_m, EA_s, 4 * IN, g) < nf.C_g(4, EA_m, EA_s, 4 * IN, g)


def test_C_M_table_11_3_3():
    assert nf.C_M_bolts(True, False, False) == 0.7
    assert nf.C_M_bolts(False, True, False) == 0.4
    assert nf.C_M_bolts(False, True, True) == 1.0
    assert nf.C_M_bolts(False, False, False) == 1.0
    p = us_flitch(0.5, [6.0, 24.0, 42.0], [3.0, 7.0])
    p = replace(p, design=replace(p.design, fabricated_wet=True))
    b = next(c for c in run(p).checks if c.id == "bolts")
    assert b.factors["C_M"] == 0.4


def test_n_ef_by_hand():
    """n = 4, a1 = 7d: n_ef = min(4, 4^0.9 (7 / 13)^0.25) = 3.482 x 0.8566 = 2.983;
    perpendicular to the grain n_ef = n."""
    hand = 4**0.9 * (7 / 13) ** 0.25
    assert hand == pytest.approx(2.9829, rel=1e-4)
    assert en.n_ef(4, 7 * 0.012, 0.012) == pytest.approx(hand, rel=1e-12)
    assert en.n_ef(4, 7 * 0.012, 0.012, alpha=90.0) == 4.0
    assert en.n_ef(4, 23 * 0.012, 0.012) == 4.0  # a1 >= 13 d n^0.4 = 22.6 d: n_ef = n
    assert math.isclose(en.a1(0.012, 0.0), 0.060, rel_tol=1e-12)


def test_given_stations_at_unequal_gaps_are_described_as_such():
    """Stations at 6, 10 and 42 in are 4 and 32 in apart: not "one location every 4 in"."""
    b = next(c for c in run(us_flitch(0.5, [6.0, 10.0, 42.0], [3.0, 7.0])).checks
             if c.id == "bolts")
    assert b.location.startswith("bolt locations at the given stations, 4.00 in to 32.0 in "
                                 "apart (3 locations, 2 per location")
