"""The sustained and rest parts of a patterned combination are built only where the
result reads them (the arrangement governing the total deflection, and those governing
the moments): the beam result equals the one with every part of every arrangement built
and reduced in one batch, bit for bit (regression guard; the reference is the eager
path of the same module, which builds them all).
"""

from __future__ import annotations

from dataclasses import replace
from pathlib import Path

import pytest

from plystack.core.actions import analysis
from plystack.core.actions.extremes import extremes_many
from plystack.core.io.project_file import load
from plystack.core.model.project import Project
from plystack.core.pipeline import Evaluator

from .demo_variants import span_variants

DEMOS = Path(__file__).resolve().parents[2] / "assets" / "demo"


def _patterned(demo: str, spans: int) -> tuple[Project, Evaluator]:
    """The demo continuous over ``spans`` equal spans, live load patterned."""
    project = load(DEMOS / demo)
    beam = project.beam
    assert beam is not None
    layout = replace(beam.layout, spans=(beam.layout.spans[0],) * spans)
    project = replace(project, beam=replace(beam, layout=layout, pattern_live_load=True))
    return project, Evaluator(project)


@pytest.mark.parametrize(("demo", "spans"), [("porch-header.plystack.json", 4),
                                             ("stair-trimmer-eu.plystack.json", 3)])
def test_deferred_parts_equal_the_eager_batch(demo: str, spans: int) -> None:
    project, ev = _patterned(demo, spans)
    section = ev.section(project.plies)
    prepared = ev.beam
    assert prepared.parts is not None
    assert any(len(p.plan.masks) > 1 for p in prepared.planned)
    deferred = analysis.analyse_beams(prepared, [section], ev.design)[0]
    batch = analysis._Batch()
    job = analysis._ask_section(prepared, section, ev.design, batch)
    ext = extremes_many(prepared.model, batch.solutions, batch.stiffness)
    eager = analysis._finish_section(prepared, section, job, ext, batch.solutions)
    assert len(batch.solutions) > sum(1 for _ in deferred.combinations)
    _same(deferred, eager)


def _same(deferred: analysis.BeamResult, eager: analysis.BeamResult) -> None:
    """Every field the result reads of each combination, floats and arrays exact."""
    for a, b in zip(deferred.combinations, eager.combinations, strict=True):
        for name in ("extremes", "total", "long_term", "short_term_rest", "variable_only",
                     "M_sustained_at_max", "M_sustained_at_min", "governing_patterns",
                     "patterns_tried"):
            assert repr(getattr(a, name)) == repr(getattr(b, name)), name  # floats exact
        for name in ("reactions_max", "reactions_min"):
            assert getattr(a, name).tobytes() == getattr(b, name).tobytes(), name
        for name in ("solution", "total_solution", "sustained", "rest"):
            sa, sb = getattr(a, name), getattr(b, name)
            assert (sa is None) == (sb is None), name
            if sa is not None:
                assert sa.data.tobytes() == sb.data.tobytes(), name
    assert repr(deferred.case_extremes) == repr(eager.case_extremes)


def test_a_stepped_member_builds_the_parts_each_segment_reads(
        monkeypatch: pytest.MonkeyPatch) -> None:
    """A plate stopping short on three spans, live load patterned: the whole member and
    each segment have their own governing arrangements; with the parts built only where
    one of them reads them, every segment's result equals the eager one's."""
    stepped = 0
    ask = analysis._ask_section

    def eager_ask(*args: object, defer: bool = False) -> analysis._Job:
        return ask(*args)  # type: ignore[arg-type]

    for name, project in span_variants([3], False):
        if not name.endswith("short"):
            continue
        beam = project.beam
        assert beam is not None
        project = replace(project, beam=replace(beam, pattern_live_load=True))
        ev = Evaluator(project)
        section = ev.section(project.plies)
        deferred = ev._stepped_beam(project.plies, section)
        with monkeypatch.context() as m:
            m.setattr(analysis, "_ask_section", eager_ask)
            eager = ev._stepped_beam(project.plies, section)
        assert len(deferred.segments) == len(eager.segments) >= 3
        _same(deferred, eager)
        for a, b in zip(deferred.segments, eager.segments, strict=True):
            assert a.bounds == b.bounds
            _same(a, b)
        stepped += 1
    assert stepped == 2


@pytest.mark.parametrize(("demo", "spans"), [("porch-header.plystack.json", 8),
                                             ("stair-trimmer-eu.plystack.json", 5)])
def test_all_arrangements_at_once_equal_one_at_a_time(demo: str, spans: int) -> None:
    """``_build_all`` (every arrangement in one pass) against ``_build`` of each
    arrangement, bit for bit, for every combination's factors and each case alone."""
    project, ev = _patterned(demo, spans)
    prepared = ev.beam
    assert prepared is not None
    cases = prepared.cases_with_self_weight(123.4)
    asked = [(p.plan, dict(p.combination.factors)) for p in prepared.planned]
    asked += [(pl, {c: 1.0}) for c, pl in prepared.case_plans.items()]
    many = 0
    for plan, g in asked:
        together = analysis._build_all(prepared, cases, plan, g)
        alone = [analysis._build(prepared, cases, plan, m, g) for m in plan.masks]
        many += len(plan.masks) >= 3
        assert [s.data.tobytes() for s in together] == [s.data.tobytes() for s in alone]
    assert many
