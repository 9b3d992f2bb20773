"""The Evaluator prepares the member of constant stiffness only where a candidate asks
for it: a project whose plies stop short of the ends is analysed on its stepped stiffness
without it (the same analysis as with it prepared first), a candidate whose plies run
through prepares it then, and a fault of the beam is still named, as before.
"""

from __future__ import annotations

from dataclasses import replace
from pathlib import Path

import pytest

from plystack.core.io.project_file import load
from plystack.core.model.errors import ProjectError
from plystack.core.model.member import Load
from plystack.core.pipeline import Evaluator, run

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"


def _short(project):
    L = project.beam.layout.length
    plies = tuple(replace(p, start=0.15 * L, end=0.9 * L) if p.material == "A36" else p
                  for p in project.plies)
    return project.with_plies(plies)


def test_a_stepped_member_is_analysed_without_the_prismatic_beam() -> None:
    full = load(DEMO)
    short = _short(full)
    ev = Evaluator(short)
    assert ev._prepared is None
    lazy = ev.analyse(short.plies)
    assert ev._prepared is None
    eager = Evaluator(short)
    assert eager.beam is not None  # asked for: prepared now
    assert eager.analyse(short.plies).checks == lazy.checks
    assert [c.to_dict() for c in lazy.checks] == [c.to_dict() for c in run(short).checks]
    # a candidate whose plies all run through asks for it
    through = ev.analyse(full.plies)
    assert ev._prepared is not None
    assert [c.to_dict() for c in through.checks] == [c.to_dict() for c in run(full).checks]


def test_a_member_of_constant_stiffness_is_prepared_at_once() -> None:
    assert Evaluator(load(DEMO))._prepared is not None


def test_the_stepped_member_names_a_fault_of_its_beam() -> None:
    full = load(DEMO)
    assert full.beam is not None
    L = full.beam.layout.length
    many = tuple(Load(case="L", type="point", value=10.0, at=L * (k + 0.5) / 3000)
                 for k in range(3000))
    short = _short(replace(full, beam=replace(full.beam, loads=full.beam.loads + many)))
    with pytest.raises(ProjectError, match="beam.loads: need the member cut at"):
        run(short)
    with pytest.raises(ProjectError, match="beam.loads: need the member cut at"):
        Evaluator(replace(short, plies=full.plies))
