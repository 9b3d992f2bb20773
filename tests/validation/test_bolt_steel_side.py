"""The steel side of a plate's bolts (core.design.bolt_steel), by hand.

US (AISC 360-16, from memory): J3.6 F_nv = 0.450 F_u (Table J3.2, threads not
excluded), R_n = F_nv A_b per plane; J3.10(a)(1) R_n = 1.2 l_c t F_u <= 2.4 d t F_u;
Omega = 2.00. EU (EN 1993-1-8 Table 3.4, from memory): F_v,Rd = alpha_v f_ub A_s /
gamma_M2 with alpha_v 0.5 and A_s = 0.72 A (conservative for M8 and larger),
F_b,Rd = k1 alpha_b f_u d t / gamma_M2, gamma_M2 = 1.25, d0 = d + max(2 mm, 0.1 d).
"""

from __future__ import annotations

import math
from pathlib import Path

import pytest

from plystack.core.codes import steel_bolts as sb
from plystack.core.io.project_file import from_dict, load
from plystack.core.pipeline import run
from tests.validation.test_load_transfer import flitch

IN, LBF, KSI = 0.0254, 4.4482216152605, 6894757.293168361
EU_DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo" / "stair-trimmer-eu.plystack.json"


def test_aisc_values_by_hand():
    """1/2 in bolt, F_u 58 ksi; 3/8 in A36 plate (F_u 58 ksi), l_c 1 in."""
    d, t, Fu = 0.5 * IN, 0.375 * IN, 58 * KSI
    assert sb.aisc_shear(d, Fu) / LBF == pytest.approx(0.45 * 58000 * math.pi * 0.25 / 4 / 2,
                                                       rel=1e-12)
    assert sb.aisc_bearing(d, t, Fu, 1.0 * IN) / LBF == pytest.approx(
        min(1.2 * 1.0, 2.4 * 0.5) * 0.375 * 58000 / 2, rel=1e-12)
    assert sb.aisc_bearing(d, t, Fu, 0.5 * IN) / LBF == pytest.approx(
        1.2 * 0.5 * 0.375 * 58000 / 2, rel=1e-12)


def test_en_values_by_hand():
    """M12 grade 4.6 (f_ub 400 MPa), 10 mm S275 plate (f_u 430 MPa), d0 14 mm, e 48 mm,
    p 104 mm: alpha_b = min(48 / 42, 104 / 42 - 1/4, 400 / 430, 1) = 400 / 430, k1 = 2.5.
    """
    assert sb.en_shear(0.012, 400e6) == pytest.approx(
        0.5 * 400 * 0.72 * math.pi * 144 / 4 / 1.25, rel=1e-12)
    assert sb.en_bearing(0.012, 0.014, 0.010, 430e6, 400e6, 0.048, 0.104) == pytest.approx(
        2.5 * (400 / 430) * 430e6 * 0.012 * 0.010 / 1.25, rel=1e-12)
    # an end bolt at 1.5 d0: alpha_b = 0.5, k1 = 2.8 x 1.5 - 1.7 = 2.5
    assert sb.en_bearing(0.012, 0.014, 0.010, 430e6, 400e6, 0.021, 0.104) == pytest.approx(
        2.5 * 0.5 * 430e6 * 0.012 * 0.010 / 1.25, rel=1e-12)


def _note(check):
    return next(n for n in check.notes if n.startswith("Steel side of the bolts"))


def test_us_flitch_screen_passes_with_its_numbers():
    """Central 3/8 in plate (double shear), 1/2 in bolts (F_u 400 MPa): 2 x shear."""
    a = run(from_dict(flitch()))
    bolts = [c for c in a.checks if c.id == "bolts"]
    shear = 0.45 * 400e6 * math.pi * (0.5 * IN) ** 2 / 4 / 2
    assert bolts and all(f"2 x {shear / LBF:.0f} lbf" in _note(c) for c in bolts)
    assert not [p for p in a.incomplete_reasons if p.path == "design.bolt"]


def test_a_bolt_too_weak_on_its_steel_side_is_a_named_missing_check():
    p = flitch(design={"bolt": {"diameter": "1/2 in", "rows": 2, "fu": "2 ksi"}})
    a = run(from_dict(p))
    gaps = [g for g in a.incomplete_reasons if g.path == "design.bolt"]
    assert len(gaps) == 1 and "steel side" in gaps[0].message
    assert a.verdict in ("INCOMPLETE", "NOT OK")
    assert not any(n.startswith("Steel side") for c in a.checks for n in c.notes)


def test_eu_demo_screen_by_hand():
    a = run(load(EU_DEMO))
    b = next(c for c in a.checks if c.id == "bolts")
    assert "2 x 13.03 kN" in _note(b) and "F_b,Rd = 96.00 kN" in _note(b)

