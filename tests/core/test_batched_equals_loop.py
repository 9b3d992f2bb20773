"""Analyses of many ply sets at once (the Evaluator's batch) equal a plain loop over
``run``, candidate by candidate, on both demos and on a member whose plate stops short
of the supports.

Source: ``run`` itself, one project at a time (the reference the batch must reproduce);
the tolerance is 1e-12 relative, and every number compared is the ``check --json``
object's.
"""

from __future__ import annotations

import json
import math
from pathlib import Path

import pytest

from plystack.core.io.output import check_json
from plystack.core.io.project_file import from_dict, load
from plystack.core.pipeline import Evaluator, run
from plystack.core.study.compare import summarise, sweep, with_dimension

DEMOS = Path(__file__).resolve().parents[2] / "assets" / "demo"
IN = 0.0254


def _stepped() -> dict:
    d = json.loads((DEMOS / "porch-header.plystack.json").read_text(encoding="utf-8"))
    d.pop("alternatives")
    d["plies"][1]["from"] = "1 ft"
    d["plies"][1]["to"] = "10 ft"
    return d


def _projects():
    yield "US demo", load(DEMOS / "porch-header.plystack.json"), "flitch plate"
    eu = load(DEMOS / "stair-trimmer-eu.plystack.json")
    steel = next(p.name for p in eu.plies if eu.all_materials()[p.material].kind == "steel")
    yield "EU demo", eu, steel
    yield "stepped plate", from_dict(_stepped()), "flitch plate"


def _same(a: object, b: object, where: str) -> None:
    if isinstance(a, float) and isinstance(b, float):
        assert math.isclose(a, b, rel_tol=1e-12, abs_tol=1e-300) or a == b, where
    elif isinstance(a, dict) and isinstance(b, dict):
        assert a.keys() == b.keys(), where
        for k in a:
            _same(a[k], b[k], f"{where}.{k}")
    elif isinstance(a, list | tuple) and isinstance(b, list | tuple):
        assert len(a) == len(b), where
        for i, (x, y) in enumerate(zip(a, b, strict=True)):
            _same(x, y, f"{where}[{i}]")
    else:
        assert a == b, where


@pytest.mark.parametrize(("label", "project", "ply"), list(_projects()),
                         ids=[t[0] for t in _projects()])
def test_analyse_many_equals_a_loop_over_run(label, project, ply) -> None:
    width = project.plies[[p.name for p in project.plies].index(ply)].width
    values = [width * f for f in (0.5, 0.75, 1.0, 1.5, 2.0)]
    candidates = [with_dimension(project.plies, ply, "width", v) for v in values]
    batch = Evaluator(project).analyse_many(candidates)
    for v, plies, a in zip(values, candidates, batch, strict=True):
        alone = run(project.with_plies(plies))
        _same(check_json(a), check_json(alone), f"{label} at {v}")
        assert summarise(a, v) == summarise(alone, v)
    rows = sweep(project, ply, "width", values)
    assert rows == [summarise(run(project.with_plies(c)), v)
                    for c, v in zip(candidates, values, strict=True)]
