"""The samples of each patterned part are made once, with the parts
(``patterns.region_parts``), and read by every plan of the member, whose distinct
arrangements are gathered as tuples in numpy's order of unique rows: the plans (units
and arrangements, in order) equal those of the plan as first written (kept here whole:
samples made afresh for each plan, ``numpy.unique`` of the sample columns), on 2 to 5
spans of both demos with overhangs and point loads. Regression guard.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import replace
from pathlib import Path

import numpy as np
import pytest

from plystack.core.actions import patterns
from plystack.core.actions.analysis import PreparedBeam
from plystack.core.actions.beam import BeamModel
from plystack.core.io.project_file import load
from plystack.core.model.member import Load

DEMOS = Path(__file__).resolve().parents[2] / "assets" / "demo"


def _plan_plain(model: BeamModel, parts: patterns.RegionParts,
                factors: Mapping[str, float]) -> patterns.Plan:
    units = tuple(patterns.Unit(c, r, f) for c, f in factors.items()
                  if f and c in parts.parts
                  for r, sol in enumerate(parts.parts[c]) if sol is not None)
    if not units:
        return patterns.Plan((), ((),))
    values = np.stack([u.factor * patterns._samples(model, parts.part(u)) for u in units])
    masks: dict[tuple[bool, ...], None] = {tuple([True] * len(units)): None}
    scale = np.abs(values).max(axis=0, initial=0.0)
    significant = np.abs(values) > 1e-9 * np.where(scale > 0, scale, 1.0)
    for sign in (1.0, -1.0):
        chosen = (sign * values > 0) & significant
        for col in np.unique(chosen.T, axis=0):
            masks.setdefault(tuple(bool(b) for b in col), None)
    return patterns.Plan(units, tuple(masks))


@pytest.mark.parametrize("name", ["porch-header.plystack.json", "stair-trimmer-eu.plystack.json"])
@pytest.mark.parametrize("spans", [2, 3, 5])
@pytest.mark.parametrize("overhang", [0.0, 0.8])
def test_plans_with_held_samples_equal_fresh_ones(name: str, spans: int,
                                                  overhang: float) -> None:
    project = load(DEMOS / name)
    beam = project.beam
    assert beam is not None
    layout = replace(beam.layout, spans=beam.layout.spans * spans, overhang_right=overhang)
    loads = (*beam.loads, Load("L", "point", 2500.0, at=layout.length * 0.61))
    spec = replace(beam, layout=layout, loads=loads, pattern_live_load=True)
    design = project.design_or_default()
    prepared = PreparedBeam.of(spec, design)
    parts = prepared.parts
    assert parts is not None and parts.samples and parts.model is prepared.model
    fresh = patterns.RegionParts(parts.names, parts.parts)
    factor_sets = [dict(p.combination.factors) for p in prepared.planned]
    factor_sets += [{c: 1.0} for c in parts.parts]
    for factors in factor_sets:
        held = patterns.plan(prepared.model, parts, factors)
        made = patterns.plan(prepared.model, fresh, factors)
        plain = _plan_plain(prepared.model, fresh, factors)
        assert held.units == made.units == plain.units
        assert held.masks == made.masks == plain.masks
    for case, per in parts.samples.items():
        for sol, sampled in zip(parts.parts[case], per, strict=True):
            if sol is not None:
                assert sampled is not None
                assert sampled.tobytes() == patterns._samples(prepared.model, sol).tobytes()


def test_samples_of_another_model_are_not_read() -> None:
    project = load(DEMOS / "porch-header.plystack.json")
    beam = project.beam
    assert beam is not None
    spec = replace(beam, layout=replace(beam.layout, spans=beam.layout.spans * 2),
                   pattern_live_load=True)
    one = PreparedBeam.of(spec, project.design_or_default())
    other = PreparedBeam.of(spec, project.design_or_default())
    assert one.parts is not None
    unit = patterns.Unit("L", 0, 1.0)
    got = one.parts.sampled(other.model, unit)
    assert got is not one.parts.samples["L"][0]
    assert np.array_equal(got, one.parts.samples["L"][0])


@pytest.mark.parametrize("seed", range(5))
def test_distinct_columns_in_the_order_of_numpy_unique(seed: int) -> None:
    rng = np.random.default_rng(seed)
    chosen = rng.random((int(rng.integers(1, 9)), 300)) < rng.uniform(0.1, 0.9)
    expected = [tuple(bool(b) for b in col) for col in np.unique(chosen.T, axis=0)]
    assert sorted(set(map(tuple, chosen.T.tolist()))) == expected
