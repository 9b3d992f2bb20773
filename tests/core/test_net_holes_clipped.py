"""Bolt holes take out only the material a ply has: a hole running past a ply's edge is
cut at the edge and overlapping holes are taken out once. Before, a 2 in bolt in a 1 in
high plate took out more than the plate and left a negative second moment (a crash,
"min() arg is an empty sequence"). Hand calculation of the net moments of a rectangle less
its hole bands (exact: b (t - s), b (t^2 - s^2) / 2 about y = 0, and so on).
"""

from __future__ import annotations

import math
from dataclasses import replace
from pathlib import Path

from plystack.core.design.net_section import holes_removed
from plystack.core.io.project_file import load
from plystack.core.model.plies import Ply
from plystack.core.pipeline import run
from plystack.core.section.transformed import analyse

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"
IN = 0.0254


def _net_by_hand(b: float, lo: float, hi: float, bands: list[tuple[float, float]]):
    """Area, first and second moment about y = 0 of [lo, hi] x b less the bands."""
    def moments(s: float, t: float) -> tuple[float, float, float]:
        return b * (t - s), b * (t * t - s * s) / 2, b * (t ** 3 - s ** 3) / 3

    a0, a1, a2 = moments(lo, hi)
    for s, t in bands:
        m = moments(s, t)
        a0, a1, a2 = a0 - m[0], a1 - m[1], a2 - m[2]
    y_na = a1 / a0
    return y_na, a2 - a1 * y_na


def test_overlapping_holes_and_a_hole_past_the_edge_are_taken_once():
    mats = load(DEMO).all_materials()
    b, h = 1.5 * IN, 9.25 * IN
    s = analyse([Ply("t", "DFL-No2", 0.0, 0.0, b, h)], mats, "DFL-No2")
    d = 0.5625 * IN
    # rows 0.5 in apart overlap; a row 0.1 in below the top runs past the edge
    heights = (2.0 * IN, 2.5 * IN, h - 0.1 * IN)
    net = holes_removed(s, (0,), heights, d, 0)
    bands = [(2.0 * IN - d / 2, 2.5 * IN + d / 2), (h - 0.1 * IN - d / 2, h)]
    y_na, i_net = _net_by_hand(b, 0.0, h, bands)
    assert math.isclose(net.y_na, y_na, rel_tol=1e-12)
    assert math.isclose(net.I_t, i_net, rel_tol=1e-12)


def test_a_hole_wholly_inside_keeps_its_own_moments():
    mats = load(DEMO).all_materials()
    b, h = 1.5 * IN, 9.25 * IN
    s = analyse([Ply("t", "DFL-No2", 0.0, 0.0, b, h)], mats, "DFL-No2")
    d, y = 0.5625 * IN, 2.25 * IN
    net = holes_removed(s, (0,), (y,), d, 0)
    y_na, i_net = _net_by_hand(b, 0.0, h, [(y - d / 2, y + d / 2)])
    assert math.isclose(net.I_t, i_net, rel_tol=1e-12)


def test_a_bolt_larger_than_its_plate_fails_instead_of_crashing():
    p = load(DEMO)
    extra = Ply("small", "A36", 3.375 * IN, 0.0, 0.5 * IN, 1.0 * IN)
    q = replace(p.with_plies(p.plies + (extra,)),
                design=replace(p.design, bolt=replace(p.design.bolt, diameter=2.0 * IN)))
    a = run(q)
    assert a.verdict == "NOT OK"
    assert any(c.id == "bolt-edge" and c.ply == "small" and not c.ok for c in a.checks)
