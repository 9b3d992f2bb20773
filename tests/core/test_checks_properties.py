"""Properties every check set must have (common practice), on the demo and variants."""

from __future__ import annotations

import json
import math
from dataclasses import replace
from pathlib import Path

import pytest

from plystack.core.design.check import capacity_from
from plystack.core.io.project_file import from_dict, load
from plystack.core.pipeline import run

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"


def demo_dict():
    return json.loads(DEMO.read_text())


def results(a):
    return {(c.id, c.ply, c.combination, c.location): c.ratio for c in a.checks}


def test_reference_material_changes_no_check():
    p = load(DEMO)
    a = run(p)
    b = run(p, reference="A36")
    ra, rb = results(a), results(b)
    assert ra.keys() == rb.keys()
    for k in ra:
        assert ra[k] == pytest.approx(rb[k], rel=1e-9), k


def test_moving_loads_to_a_shorter_duration_case_lowers_timber_ratios():
    """All loads as snow (C_D 1.15), then as live load (C_D 1.0): the ratios rise."""
    def variant(case):
        d = demo_dict()
        d["beam"]["self_weight"] = False
        for ld in d["beam"]["loads"]:
            ld["case"] = case
        return run(from_dict(d))

    def timber_bending(a):
        return max(c.ratio for c in a.checks if c.id == "bending" and "2x10" in (c.ply or ""))

    snow, live = variant("S"), variant("L")
    assert timber_bending(live) > timber_bending(snow)
    assert timber_bending(live) / timber_bending(snow) == pytest.approx(1.15, rel=1e-6)


@pytest.mark.parametrize("basis", ["US-ASD", "EU-LSD"])
def test_every_check_is_complete(basis):
    d = demo_dict()
    d["design"]["basis"] = basis
    if basis == "EU-LSD":
        d["beam"]["combinations"] = "EN1990"
        for p in d["plies"]:
            p["material"] = "C24" if "2x10" in p["name"] else "S275"
    a = run(from_dict(d))
    assert a.checks
    ids = {c.id for c in a.checks}
    assert {"bending", "shear", "bearing", "deflection-live", "deflection-total",
            "deflection-long-term", "bolts"} <= ids
    for c in a.checks:
        dd = c.to_dict()
        for key in ("id", "ply", "combination", "demand", "capacity", "ratio", "ok",
                    "factors", "partial_factors", "reference"):
            assert key in dd
        assert math.isfinite(c.demand) and c.capacity > 0
        assert dd["ok"] == (c.ratio <= 1 + 1e-9)
        assert capacity_from(c.reference[1], c.factors, c.partial_factors) == pytest.approx(
            c.capacity, rel=1e-12)


def test_json_has_checks_and_governing():
    from plystack.core.io.output import check_json

    out = check_json(run(load(DEMO)))
    assert out["governing"]["ratio"] == max(c["ratio"] for c in out["checks"])
    assert "caution" in out and "licensed professional" in out["caution"]
    json.dumps(out)  # serialisable


def test_failing_design_says_not_ok():
    d = demo_dict()
    d["beam"]["spans"] = ["26 ft"]
    a = run(from_dict(d))
    assert any(not c.ok for c in a.checks)


def test_override_replaces_factor():
    d = demo_dict()
    d["design"]["overrides"] = {"left 2x10": {"C_F": 1.0}}
    a = run(from_dict(d))
    c = next(c for c in a.checks if c.id == "bending" and c.ply == "left 2x10")
    assert c.factors["C_F"] == 1.0 and c.sources["C_F"] == "user override"


def test_creep_factor_one_changes_nothing():
    """K_cr = 1: the long-term deflection equals the short-term one."""
    d = demo_dict()
    d["design"]["K_cr"] = 1.0
    a = run(from_dict(d))
    for c in a.beam.combinations:
        assert c.total.deflection_max_abs == pytest.approx(c.extremes.deflection_max_abs,
                                                           rel=1e-9)


def test_creep_moves_moment_to_steel():
    """Steel does not creep: under sustained load the plate's share rises and the
    timber's falls (common practice)."""
    a = run(load(DEMO))
    short = a.section.moment_shares()
    long = a.beam.creep_section.moment_shares()
    assert long[1] > short[1]
    assert long[0] < short[0] and long[2] < short[2]
    assert a.beam.creep_factor == 1.5
    wet = run(replace(load(DEMO), design=replace(load(DEMO).design, wet_service=True)))
    assert wet.beam.creep_factor == 2.0


def test_eu_demo_full_set_of_checks(capsys):
    from plystack.core.cli import main

    eu = DEMO.parent / "stair-trimmer-eu.plystack.json"
    assert main(["check", str(eu), "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    ids = {c["id"] for c in out["checks"]}
    assert {"bending", "shear", "bearing", "deflection-live", "deflection-total",
            "deflection-long-term", "bolts"} <= ids
    assert all("k_mod" in c["factors"] for c in out["checks"]
               if c["id"] in ("bending", "shear") and c["ply"] != "plate")
    assert out["warnings"] == []
