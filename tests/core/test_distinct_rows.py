"""The extremes of a batch are found once for each distinct (solution, EI) pair
(``actions.beam._distinct``): equal, bit for bit, to those found for every solution
asked (``_element_values`` and ``_reduce`` of the whole batch), on the batches the
pipeline asks for the demos, on several spans with pattern loading, point loads and a
plate stopping short, whole and segment by segment. Regression guard: the reference is
the module's own search over every row.
"""

from __future__ import annotations

from collections.abc import Iterator
from pathlib import Path

import numpy as np
import pytest

from plystack.core import pipeline
from plystack.core.actions import analysis as an
from plystack.core.actions import beam as bm
from plystack.core.actions import extremes as ex
from plystack.core.model.project import Project

from .demo_variants import span_variants

DEMOS = Path(__file__).resolve().parents[2] / "assets" / "demo"


def _projects() -> Iterator[tuple[str, Project]]:
    return span_variants((1, 2, 3, 5), varying_line=False)


def _batch(project: Project) -> tuple[bm.BeamModel, list[bm.CaseSolution], list[float]]:
    ev = pipeline.Evaluator(project)
    assert ev.beam is not None
    section = ev.section(project.plies)
    batch = an._Batch()
    an._ask_section(ev.beam, section, ev.design, batch, defer=True)
    return ev.beam.model, batch.solutions, batch.stiffness


@pytest.mark.parametrize("name_project", list(_projects()), ids=lambda np_: np_[0])
def test_distinct_rows_give_every_row_its_extremes(
        name_project: tuple[str, Project]) -> None:
    _, project = name_project
    model, sols, EIs = _batch(project)
    n = model.lengths.size
    _, _, back = ex._distinct(sols, EIs)
    assert back is not None  # the batch does ask for some numbers twice
    every = ex._element_values(model, sols, EIs, 0, n, [(0, n)])
    assert repr(ex.extremes_many(model, sols, EIs)) == repr(ex._reduce(model, every, 0, n))
    ranges = [(0, max(n // 2, 1)), (max(n // 2, 1), n)]
    every = ex._element_values(model, sols, EIs, 0, n, [(0, n), *ranges])
    expected = [ex._reduce(model, every, 0, n)] + [
        ex._reduce(model, every.part(a, b), a, b) for a, b in ranges]
    assert repr(ex.extremes_within(model, sols, EIs, ranges)) == repr(expected)


def test_distinct_tells_signed_zero_and_layouts_apart() -> None:
    model, sols, _ = _batch(next(iter(_projects()))[1])
    s = sols[0]
    distinct, stiffness, back = ex._distinct([s, s, s.scaled(1.0), s], [2.0, 2.0, 2.0, 3.0])
    assert back == [0, 0, 0, 1] and list(stiffness) == [2.0, 3.0]
    _, _, back = ex._distinct([s, s], np.array([0.0, -0.0]))
    assert back is None
    assert ex._distinct([s, s._with_deflection_loads()], [1.0, 1.0])[2] is None
