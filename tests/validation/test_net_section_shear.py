"""Timber shear on the net section at a plate's bolt holes, worked by hand.

Sources: NDS 2018 3.1.2 (net section, from memory) and 3.4.2 (f_v = V Q / (I b), from
memory); EN 1995-1-1 5.1(2) (holes reduce the cross-section), 6.1.7(2) (k_cr = 0.67 for
solid timber), Table 3.1 (k_mod = 0.6, permanent, service class 1) and Table 2.3
(gamma_M = 1.3), EN 338 C24 f_v,k = 4.0 MPa, E_0,mean = 11,000 MPa, EN 1993-1-1 3.2.6
E = 210,000 MPa (all from memory); hole diameter D + 1/16 in (NDS 2018 12.1.3.2) or d + 1
mm (EN 1995-1-1 10.4.3), from memory; the transformed section of a flitch beam and
V Q / (I b) with the first moment of the net area about the net neutral axis (mechanics
of materials, common practice); statics of a simple beam for V.
"""

from __future__ import annotations

import copy

import pytest

from plystack.core.design.net_section import NetSection, net_shear
from plystack.core.io.project_file import from_dict
from plystack.core.pipeline import run
from plystack.core.report.derive import derive
from tests.validation.test_load_transfer import E_S, E_W, flitch

IN, PSI, MPA = 0.0254, 6894.757293168361, 1e6
WHERE = "net section at the bolt holes"


def _net(a, ply, combo):
    return next(c for c in a.checks if c.id == "shear" and c.ply == ply
                and c.combination == combo and c.location.startswith(WHERE))


def _own(a, ply, combo):
    return next(c for c in a.checks if c.id == "shear" and c.ply == ply
                and c.combination == combo and c.location == "")


def _I_net(n: float, rows: tuple[float, float], dh: float) -> float:
    """Two 1.5 x 9.25 in timbers and a 3/8 x 8.75 in plate centred on them (neutral axis
    y = 4.625 in), in DF-L / C24 units: I_t = sum b h^3 / 12 (n b for the plate), less
    for each hole the band it takes out of the three plies, w = 2 x 1.5 + n x 0.375 wide:
    w (dh^3 / 12 + dh (y - 4.625)^2). The rows are symmetric about mid-height, so the net
    neutral axis stays at 4.625 in."""
    I_gross = 2 * 1.5 * 9.25**3 / 12 + n * 0.375 * 8.75**3 / 12
    w = 2 * 1.5 + n * 0.375
    return I_gross - sum(w * (dh**3 / 12 + dh * (y - 4.625) ** 2) for y in rows)


def test_us_2x10_flitch_with_two_9_16_in_holes_by_hand():
    """1/2 in bolts: holes 9/16 in at y = 2.25 and 7.0 in (4 D from the plate's edges).
    At the net neutral axis, Q_net of one timber = 1.5 x 4.625^2 / 2 - 1.5 x 9/16 x
    (7.0 - 4.625) = 16.04296875 - 2.00390625 = 14.0390625 in^3, b_net = 1.5 in (the cut
    is clear of the holes); n = 1. D + L: |V| = R1 = 312 x 6 + 300 x 8 / 12 = 2072 lbf.
    f_v = V Q_net / (I_net b) against the timber's own F'v."""
    n, dh = E_S / E_W, 9 / 16
    I_net = _I_net(n, (2.25, 7.0), dh)
    Q = 1.5 * 4.625**2 / 2 - 1.5 * dh * (7.0 - 4.625)
    assert Q == 14.0390625
    a = run(from_dict(flitch()))
    for ply in ("L", "R"):
        c = _net(a, ply, "D + L")
        assert c.demand / PSI == pytest.approx(2072 * Q / (I_net * 1.5), rel=1e-9)
        own = _own(a, ply, "D + L")
        assert c.capacity == pytest.approx(own.capacity, rel=1e-12)
        assert c.factors == own.factors
        # the stations 12 in from either end tie; the first is named
        assert c.location.startswith(f"{WHERE}, station 1 of P at x = ")
        assert c.x == pytest.approx(12 * IN, rel=1e-12)
    assert not any(c.location.startswith(WHERE) and c.ply == "P" for c in a.checks)


def test_eu_2x10_flitch_with_two_9_16_in_holes_by_hand():
    """d = 13.2875 mm: hole d + 1 mm = 14.2875 mm = 9/16 in, rows 4 d from the plate's
    edges, y1 = 0.25 in + 4 d, y2 = 9.0 in - 4 d. C24 timbers, S275 plate:
    n = 210,000 / 11,000. Only 1 kN/m permanent: ULS 1.35G, |V| = 1.35 x 1 x 3.6576 / 2
    = 2.46888 kN. Q_net = 1.5 x 4.625^2 / 2 - 1.5 x 9/16 x (y2 - 4.625) in^3.
    f_v,d = 0.6 x 0.67 x 4.0 / 1.3 MPa (the timber's own shear check, k_cr included)."""
    d = flitch(design={"basis": "EU-LSD", "service_class": 1,
                       "bolt": {"diameter": "13.2875 mm", "rows": 2, "Fyb": "240 MPa",
                                "fu": "400 MPa"}},
               loads=[{"case": "D", "type": "line", "value": "1 kN/m"}])
    d["beam"]["combinations"] = "EN1990"
    for p in d["plies"]:
        p["material"] = "S275" if p["name"] == "P" else "C24"
    a = run(from_dict(d))
    assert a.section.E[1] / a.section.E[0] == pytest.approx(210000 / 11000, rel=1e-12)
    n, dh, four_d = 210000 / 11000, 9 / 16, 4 * 13.2875 / 25.4
    rows = (0.25 + four_d, 9.0 - four_d)
    I_net = _I_net(n, rows, dh)
    Q = 1.5 * 4.625**2 / 2 - 1.5 * dh * (rows[1] - 4.625)
    V = 1.35 * 1000 * 3.6576 / 2
    for ply in ("L", "R"):
        c = _net(a, ply, "ULS 1.35G")
        assert c.demand == pytest.approx(V * Q * IN**3 / (I_net * IN**4 * 1.5 * IN),
                                         rel=1e-9)
        assert c.capacity == pytest.approx(0.6 * 0.67 * 4.0 * MPA / 1.3, rel=1e-12)
        assert c.factors["k_cr"] == 0.67


def test_a_hole_at_the_neutral_axis_moves_the_cut_to_its_edge():
    """One 9/16 in hole centred at the neutral axis y = 4.625 in of the 1.5 x 9.25 in
    timber: no material at the axis, the cuts at the hole's edges govern (equal, the
    timber being symmetric about the axis), Q = 1.5 (4.625^2 - (9/32)^2) / 2 in^3;
    f_v per unit V = n Q / (I_t b)."""
    a = run(from_dict(flitch()))
    dh, I_t = 9 / 16 * IN, 150.0 * IN**4
    ns = net_shear(a.section, 0, NetSection(0, 4.625 * IN, I_t, (4.625 * IN,)), dh)
    Q = 1.5 * (4.625**2 - (9 / 32) ** 2) / 2 * IN**3
    assert abs(ns.y - 4.625 * IN) == pytest.approx(9 / 32 * IN, rel=1e-12)
    assert ns.Q == pytest.approx(Q, rel=1e-12)
    assert ns.unit == pytest.approx(Q / (I_t * 1.5 * IN), rel=1e-12)


def test_members_without_bolts_have_no_net_section_shear_and_keep_their_checks():
    """Timber alone (the plate taken out): no plate, no bolt holes; the gross shear
    check is f_v = 3 V / (2 b d) of the two 1.5 x 9.25 in timbers, V = 2072 lbf."""
    d = copy.deepcopy(flitch())
    d["plies"] = [p for p in d["plies"] if p["name"] != "P"]
    d["plies"][1]["x"] = "1.5 in"
    a = run(from_dict(d))
    assert not any(c.location.startswith(WHERE) for c in a.checks)
    own = _own(a, "L", "D + L")
    assert own.demand / PSI == pytest.approx(1.5 * 2072 / (3.0 * 9.25), rel=1e-9)


def test_the_sheet_writes_the_net_shear_out():
    a = run(from_dict(flitch()))
    c = _net(a, "L", "D + L")
    text = " ".join([*derive(a, c).where, derive(a, c).demand])
    assert "Q_net" in text and "I_t,net" in text and "|V| n Q / (I_t b)" in text
