"""A hole that takes a bored ply's whole depth leaves nothing of it at the hole: its
``bending-net`` and net ``shear`` checks there fail (capacity 0, the factor ``net`` = 0)
instead of being left out while the verdict says OK; a hole that misses every ply it
bores is refused by field (``beam.holes[k].y``).
"""

from __future__ import annotations

import json
from pathlib import Path

import pytest

from plystack.core.io.project_file import load
from plystack.core.model.errors import ProjectError
from plystack.core.pipeline import run

US = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"


def _with_hole(tmp_path: Path, y: str, diameter: str) -> Path:
    data = json.loads(US.read_text())
    data.pop("alternatives", None)
    data["beam"]["holes"] = [{"at": "6 ft", "y": y, "diameter": diameter}]
    out = tmp_path / "h.plystack.json"
    out.write_text(json.dumps(data))
    return out


@pytest.mark.parametrize("diameter", ["9.25 in", "12 in"])
def test_a_hole_as_deep_as_the_timbers_fails_them_at_the_hole(tmp_path: Path,
                                                              diameter: str) -> None:
    a = run(load(_with_hole(tmp_path, "4.625 in", diameter)))
    at_hole = [c for c in a.checks if c.location.endswith("hole 1")]
    assert {c.ply for c in at_hole} == {"left 2x10", "right 2x10"}
    assert {c.id for c in at_hole} == {"bending-net", "shear"}
    assert all(c.capacity == 0.0 and not c.ok and c.factors["net"] == 0.0 for c in at_hole)
    assert a.verdict == "NOT OK"


def test_a_smaller_hole_keeps_its_net_section_checks(tmp_path: Path) -> None:
    a = run(load(_with_hole(tmp_path, "4.625 in", "3 in")))
    at_hole = [c for c in a.checks if c.location.endswith("hole 1")]
    assert len(at_hole) == 2 * 2 * len(a.beam.strength())  # two timbers, two checks
    assert all(c.capacity > 0 and "net" not in c.factors for c in at_hole)


def test_a_hole_that_misses_the_plies_is_refused_by_field(tmp_path: Path) -> None:
    with pytest.raises(ProjectError) as err:
        run(load(_with_hole(tmp_path, "40 in", "1 in")))
    (problem,) = err.value.problems
    assert problem.path == "beam.holes[0].y" and "misses every ply" in problem.message
