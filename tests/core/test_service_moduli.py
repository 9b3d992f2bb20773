"""US-ASD stiffness with the adjusted modulus E' = E C_M C_t C_i (NDS 2018 4.3.1,
Table 4.3.1; from memory), checked against hand calculations of the bundled US demo's
flitch beam: two 2x10 (1.5 x 9.25 in) No.2 Douglas Fir-Larch beside a 3/8 x 8.75 in
A36 plate whose centre is at the timbers' mid-height, so EI is the plain sum of
E_i b_i h_i^3 / 12 (no parallel-axis terms), simply supported, loads as in the demo.

Factors on E, from memory: C_M 0.9 for sawn lumber wet in service (NDS Supplement
Table 4A), 0.833 for glulam (Table 5A); C_t 0.9 above 100 F (NDS 2018 Table 2.3.3);
C_i 0.95 incised (Table 4.3.8). Steel keeps its E. EN 1995-1-1 puts no factor on
E_mean (its service class acts through k_def), so an EU basis keeps the moduli.
"""

from __future__ import annotations

import math
from dataclasses import replace
from pathlib import Path

import pytest

from plystack.core.design.service_moduli import modulus_factors, service_materials
from plystack.core.io.project_file import load
from plystack.core.model.project import Project
from plystack.core.pipeline import run
from plystack.core.report.content import modulus_cell

DEMOS = Path(__file__).resolve().parents[2] / "assets" / "demo"


def _us(**design: object) -> Project:
    p = load(DEMOS / "porch-header.plystack.json")
    return replace(p, design=replace(p.design_or_default(), **design))


def _hand_EI(p: Project, k: float) -> float:
    """sum E_i b_i h_i^3 / 12 with the timbers' E times k (the plies share a centre)."""
    mats = p.all_materials()
    total = 0.0
    for ply in p.plies:
        m = mats[ply.material]
        e = m.E * k if m.kind == "timber" else m.E
        total += e * ply.width * ply.height ** 3 / 12
    return total


@pytest.mark.parametrize(("design", "k"), [
    ({}, 1.0),
    ({"wet_service": True}, 0.9),
    ({"temperature": "up-to-125F"}, 0.9),
    ({"incised": True}, 0.95),
    ({"wet_service": True, "temperature": "up-to-150F", "incised": True}, 0.9 * 0.9 * 0.95),
])
def test_the_section_and_deflection_use_E_prime(design: dict[str, object], k: float) -> None:
    p = _us(**design)
    a = run(p)
    EI = _hand_EI(p, k)
    assert a.section.EI == pytest.approx(EI, rel=1e-12)
    # the plies share a centre: the plate's centre 0.25 in + 8.75/2 in = 9.25/2 in
    plies = p.plies
    assert plies[1].y + plies[1].height / 2 == pytest.approx(plies[0].height / 2, rel=1e-12)
    beam = p.beam
    assert beam is not None
    L = beam.layout.spans[0]
    w = sum(ld.value * (ld.tributary_width or 1.0) for ld in beam.loads
            if ld.case == "L" and ld.type == "area")
    live = next(c for c in a.checks if c.id == "deflection-live")
    assert live.demand == pytest.approx(5 * w * L ** 4 / (384 * EI), rel=1e-12)
    # the plate's stress under the same moment grows as the timber softens:
    # f = M (h/2) E_s / EI (beam theory)
    M = 1000.0
    plate = 1
    E_s = p.all_materials()["A36"].E
    f = a.section.stress(M, plate, plies[plate].y + plies[plate].height)
    assert abs(f) == pytest.approx(M * plies[plate].height / 2 * E_s / EI, rel=1e-12)


def test_a_wet_beam_may_fail_where_the_dry_one_passes() -> None:
    """The live deflection grows by 1/0.9 wet, on the demo's own numbers."""
    dry = next(c for c in run(_us()).checks if c.id == "deflection-live")
    wet = next(c for c in run(_us(wet_service=True)).checks if c.id == "deflection-live")
    assert wet.demand / dry.demand == pytest.approx(
        _hand_EI(_us(), 1.0) / _hand_EI(_us(), 0.9), rel=1e-12)
    assert wet.demand > dry.demand


def test_factors_by_product_and_basis() -> None:
    mats = _us().all_materials()
    wet = _us(wet_service=True).design_or_default()
    assert modulus_factors(mats["DFL-No2"], wet) == {"C_M": 0.9, "C_t": 1.0, "C_i": 1.0}
    assert modulus_factors(mats["GLU-24F-V4-DF"], wet)["C_M"] == 0.833
    assert modulus_factors(mats["A36"], wet) == {}
    dry = _us().design_or_default()
    assert service_materials(mats, dry) is mats  # nothing adjusted: the same mapping
    adjusted = service_materials(mats, wet)
    assert adjusted["DFL-No2"].E == mats["DFL-No2"].E * 0.9
    assert adjusted["DFL-No2"].E_reference == mats["DFL-No2"].E
    assert adjusted["A36"] is mats["A36"]


def test_an_eu_basis_keeps_the_mean_moduli() -> None:
    p = load(DEMOS / "stair-trimmer-eu.plystack.json")
    wet = replace(p, design=replace(p.design_or_default(), service_class=3))
    dry = replace(p, design=replace(p.design_or_default(), service_class=1))
    mats = wet.all_materials()
    assert service_materials(mats, wet.design_or_default()) is mats
    assert run(wet).section.EI == run(dry).section.EI


def test_the_sheet_shows_how_E_prime_is_made() -> None:
    a = run(_us(wet_service=True, incised=True))
    m = next(m for m in a.section.materials if m.id == "DFL-No2")
    assert m.E_reference is not None
    assert math.isclose(m.E, m.E_reference * 0.9 * 0.95, rel_tol=1e-15)
    text = modulus_cell(m, "US")
    assert text.startswith("E' = E C")
    assert "\u00d7 0.9 \u00d7 1 \u00d7 0.95" in text
    assert "NDS 2018 4.3.1" in text
