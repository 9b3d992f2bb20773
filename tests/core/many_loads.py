"""A demo project with many point loads added (for the tests of the bolt checks' quick
paths): ``count`` loads of case L, ``step`` x (1 to ``kinds``) N, at ``(k + offset) / count``
of the member's length. Invented loads on the invented demos.
"""

from __future__ import annotations

from dataclasses import replace
from pathlib import Path

from plystack.core.io.project_file import load
from plystack.core.model.member import Load
from plystack.core.model.project import Project

DEMOS = Path(__file__).resolve().parents[2] / "assets" / "demo"


def with_point_loads(demo: str, count: int, step: float, kinds: int,
                     offset: float) -> Project:
    """The demo ``demo`` (a file name in assets/demo) with the point loads added."""
    project = load(DEMOS / demo)
    beam = project.beam
    assert beam is not None
    L = beam.layout.length
    extra = tuple(Load(case="L", type="point", value=step * (k % kinds + 1),
                       at=L * (k + offset) / count) for k in range(count))
    return replace(project, beam=replace(beam, loads=beam.loads + extra))
