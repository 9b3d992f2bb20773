"""Notched ends and a bored hole, checked by hand.

Sources: NDS 2018 3.4.3.2 equation 3.4-3 (tension-face notch at the end: allowable
stress F'v (d_n / d)^2 on f_v = 3 V / (2 b d_n)) and 4.4.3 (notch depth at the end at
most d / 4), from memory; EN 1995-1-1 6.5.2 equation (6.62), k_v with k_n = 5 for solid
timber, from memory; net-section bending f = M c / I of the remaining rectangles, by
hand. The project is the invented porch-header demo, loads made uniform.
"""

from __future__ import annotations

import json
import math
from pathlib import Path

import pytest

from plystack.core.codes import en1995
from plystack.core.io.project_file import from_dict, to_dict
from plystack.core.model.constants import INCH, LBF
from plystack.core.pipeline import run

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"
FT = 12 * INCH
PLF = LBF / FT


def _demo() -> dict:
    d = json.loads(DEMO.read_text(encoding="utf-8"))
    d.pop("alternatives")
    d["plies"].pop(1)  # two 2x10s side by side, no plate
    d["plies"][1]["x"] = "1.5 in"
    d["beam"]["self_weight"] = False
    d["beam"]["loads"] = [{"case": "D", "type": "line", "value": "72 plf"},
                          {"case": "L", "type": "line", "value": "240 plf"}]
    return d


def test_tension_face_notch_at_the_end_nds_3_4_3():
    d = _demo()
    d["beam"]["notches"] = [{"at": "support 1", "face": "bottom", "depth": "1.5 in",
                             "length": "3 in"}]
    p = from_dict(d)
    assert from_dict(to_dict(p)) == p
    a = run(p)
    c = [k for k in a.checks if k.id == "shear-notch" and k.combination == "D + L"][0]
    V = 312 * PLF * 12 * FT / 2
    b, dd, dn = 3 * INCH, 9.25 * INCH, 7.75 * INCH
    assert c.demand == pytest.approx(3 * V / (2 * b * dn), rel=1e-9)
    fv = [k for k in a.checks if k.id == "shear" and k.combination == "D + L"][0].capacity
    assert c.capacity == pytest.approx(fv * (dn / dd) ** 2, rel=1e-9)


def test_notch_deeper_than_d_over_4_at_the_end_is_not_ok():
    d = _demo()
    d["beam"]["notches"] = [{"at": "support 2", "face": "bottom", "depth": "2.5 in",
                             "length": "3 in"}]
    a = run(from_dict(d))
    c = [k for k in a.checks if k.id == "shear-notch"]
    assert c and all(not k.ok for k in c)
    assert any("NDS 2018 4.4.3" in n for n in c[0].notes)


def test_notch_in_the_middle_third_is_not_ok():
    d = _demo()
    d["beam"]["notches"] = [{"at": "6 ft", "face": "top", "depth": "1 in",
                             "length": "2 in"}]
    c = [k for k in run(from_dict(d)).checks if k.id == "shear-notch"]
    assert c and all(not k.ok for k in c)


def test_en_6_5_2_k_v_by_hand():
    h, h_ef, x = 0.235, 0.195, 0.075
    a = h_ef / h
    h_mm = 235.0
    hand = 5 / (math.sqrt(h_mm) * (math.sqrt(a * (1 - a)) + 0.8 * x / h
                                   * math.sqrt(1 / a - a * a)))
    assert en1995.k_v("sawn", h, h_ef, x) == pytest.approx(min(1.0, hand), rel=1e-12)
    assert en1995.k_n("glulam") == 6.5 and en1995.k_n("lvl") == 4.5


def test_net_section_bending_at_a_hole_by_hand():
    d = _demo()
    d["beam"]["holes"] = [{"at": "3 ft", "y": "4.625 in", "diameter": "1.5 in"}]
    p = from_dict(d)
    assert from_dict(to_dict(p)) == p
    a = run(p)
    c = [k for k in a.checks if k.id == "bending-net" and k.combination == "D + L"]
    M = 312 * PLF * 3 * FT * (9 * FT) / 2
    b, dd, D = 1.5 * INCH, 9.25 * INCH, 1.5 * INCH
    I_net = 2 * (b * dd**3 / 12 - b * D**3 / 12)  # hole centred at mid-depth, both plies
    assert c[0].demand == pytest.approx(M * (dd / 2) / I_net, rel=1e-9)
    assert not any("holes" in w.path for w in a.warnings)


def test_hole_close_to_an_edge_is_named():
    d = _demo()
    d["beam"]["holes"] = [{"at": "3 ft", "y": "1.5 in", "diameter": "1 in"}]
    a = run(from_dict(d))
    assert any(w.path == "beam.holes[0]" and "common practice" in w.message
               for w in a.warnings)


def test_eu_notch_end_to_end_through_a_project_file(tmp_path):
    """EU basis, end to end: a project file written to disk, read and checked. Two C24
    timbers 45 x 220 mm side by side, 4 m simple span, 1 kN/m G and 2 kN/m Q, a 40 mm deep,
    100 mm long notch on the bottom face at support 1. By hand (EN 1995-1-1 6.5.2, (6.60)
    and (6.62), from memory): V = w L / 2 with w = 1.35 x 1 + 1.5 x 2 kN/m (EN 1990 (6.10));
    tau_d = 1.5 V / (b h_ef), b = 90 mm, h_ef = 180 mm; alpha = 180 / 220, x = 100 mm from
    the reaction at the member's end to the notch corner; k_v = min(1, k_n / (sqrt(h)
    (sqrt(alpha (1 - alpha)) + 0.8 (x / h) sqrt(1 / alpha - alpha^2)))), k_n = 5 (solid
    timber), h in mm; f_v,d = k_mod k_cr f_v,k / gamma_M = 0.8 x 0.67 x 4.0 MPa / 1.3
    (Table 3.1, 6.1.7(2), EN 338 C24, Table 2.3, all from memory)."""
    from plystack.core.io.project_file import load
    from tests.validation.test_splitting import _eu

    d = _eu([])
    d["plies"].pop(1)
    d["plies"][1]["x"] = "45 mm"
    d["design"].pop("bolt")
    d["beam"]["notches"] = [{"at": "support 1", "face": "bottom", "depth": "40 mm",
                             "length": "100 mm"}]
    path = tmp_path / "notched.plystack.json"
    path.write_text(json.dumps(d), encoding="utf-8")
    a = run(load(path))
    c = next(k for k in a.checks if k.id == "shear-notch"
             and k.combination == "ULS 1.35G + 1.5Q[L]")
    V = (1.35 * 1000 + 1.5 * 2000) * 4 / 2
    assert c.demand == pytest.approx(1.5 * V / (0.090 * 0.180), rel=1e-9)
    h, alpha, x = 220.0, 180 / 220, 100.0
    k_v = min(1.0, 5 / (math.sqrt(h) * (math.sqrt(alpha * (1 - alpha))
                                        + 0.8 * x / h * math.sqrt(1 / alpha - alpha**2))))
    assert c.factors["k_v"] == pytest.approx(k_v, rel=1e-12)
    assert c.capacity == pytest.approx(k_v * 0.8 * 0.67 * 4.0e6 / 1.3, rel=1e-9)
    assert c.ok
