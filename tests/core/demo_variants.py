"""Variants of the invented demo projects for the tests that compare a quick path with
the plain one: many point loads added, or more spans, a flitch plate stopping short and
extra loads. Invented loads on the invented demos.
"""

from __future__ import annotations

import json
from collections.abc import Iterator, Sequence
from dataclasses import replace
from pathlib import Path

from plystack.core.io.project_file import from_dict, load
from plystack.core.model.member import Load
from plystack.core.model.project import Project

DEMOS = Path(__file__).resolve().parents[2] / "assets" / "demo"


def with_point_loads(demo: str, count: int, step: float, kinds: int,
                     offset: float) -> Project:
    """The demo ``demo`` (a file name in assets/demo) with ``count`` point loads of case L
    added, ``step`` x (1 to ``kinds``) N, at ``(k + offset) / count`` of the length."""
    project = load(DEMOS / demo)
    beam = project.beam
    assert beam is not None
    L = beam.layout.length
    extra = tuple(Load(case="L", type="point", value=step * (k % kinds + 1),
                       at=L * (k + offset) / count) for k in range(count))
    return replace(project, beam=replace(beam, loads=beam.loads + extra))


def span_variants(spans: Sequence[int], varying_line: bool
                  ) -> Iterator[tuple[str, Project]]:
    """Both demos on 1 or more equal spans, each plain, with the flitch plate stopping
    short, and with a point load of 900 N (and, with ``varying_line``, a line load rising
    from 300 to 1,200 N/m up to it)."""
    for name, short, at in (("porch-header.plystack.json", ("1 ft", "11 ft"), "5 ft"),
                            ("stair-trimmer-eu.plystack.json", ("0.3 m", "3.3 m"), "2 m")):
        base = json.loads((DEMOS / name).read_text(encoding="utf-8"))
        for n in spans:
            for variant in ("plain", "short", "points"):
                data = json.loads(json.dumps(base))
                data["beam"]["spans"] = data["beam"]["spans"] * n
                if variant == "short":
                    data["plies"][1].update({"from": short[0], "to": short[1]})
                if variant == "points":
                    data["beam"]["loads"].append({"case": "L", "type": "point",
                                                  "value": "900 N", "at": at})
                    if varying_line:
                        data["beam"]["loads"].append(
                            {"case": "D", "type": "line", "value": "300 N/m",
                             "value_end": "1200 N/m", "from": "0 m", "to": at})
                yield f"{name}-{n}-{variant}", from_dict(data)
