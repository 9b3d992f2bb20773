"""Ply extents along the member ("from" / "to"): reading, writing, named problems and
the segments they make. Facts of the project's own file format (no outside source).
"""

from __future__ import annotations

import json
from pathlib import Path

import pytest

from plystack.core.io.project_file import from_dict, to_dict
from plystack.core.model.errors import ProjectError
from plystack.core.model.plies import Ply
from plystack.core.section.segments import is_stepped, segments_of

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"


def _demo() -> dict:
    d = json.loads(DEMO.read_text(encoding="utf-8"))
    d.pop("alternatives")
    return d


def _problems(d: dict) -> list[str]:
    with pytest.raises(ProjectError) as info:
        from_dict(d)
    return [str(p) for p in info.value.problems]


def test_extent_reads_and_writes_back():
    d = _demo()
    d["plies"][1]["from"] = "18 in"
    d["plies"][1]["to"] = "10 ft"
    p = from_dict(d)
    plate = p.plies[1]
    assert plate.start == pytest.approx(18 * 0.0254, rel=1e-15)
    assert plate.end == pytest.approx(120 * 0.0254, rel=1e-15)
    assert p.plies[0].start is None and p.plies[0].end is None
    back = to_dict(p)
    assert "from" in back["plies"][1] and "to" in back["plies"][1]
    assert "from" not in back["plies"][0]
    assert from_dict(back) == p


@pytest.mark.parametrize(("start", "end", "path", "words"), [
    ("5 ft", "4 ft", "plies[1].to", "must be greater than from"),
    ("-1 ft", None, "plies[1].from", "outside the member"),
    (None, "13 ft", "plies[1].to", "outside the member"),
    ("three feet", None, "plies[1].from", ""),
])
def test_bad_extent_names_the_field(start, end, path, words):
    d = _demo()
    if start is not None:
        d["plies"][1]["from"] = start
    if end is not None:
        d["plies"][1]["to"] = end
    problems = _problems(d)
    assert any(p.startswith(path) and words in p for p in problems), problems
    assert not any("Error" in p or "float" in p for p in problems)


def test_extent_without_a_beam_is_a_named_problem():
    d = _demo()
    d.pop("beam")
    d["plies"][1]["from"] = "1 ft"
    assert any(p.startswith("plies[1].from") and "needs a beam" in p for p in _problems(d))


def test_segments_cut_at_every_ply_end():
    plies = (Ply("a", "m", 0, 0, 1, 1), Ply("b", "m", 1, 0, 1, 1, start=1.0, end=3.0),
             Ply("c", "m", 2, 0, 1, 1, end=2.0))
    segs = segments_of(plies, 4.0)
    assert [(s.start, s.end, s.plies) for s in segs] == [
        (0.0, 1.0, (0, 2)), (1.0, 2.0, (0, 1, 2)), (2.0, 3.0, (0, 1)), (3.0, 4.0, (0,))]
    assert is_stepped(plies, 4.0)
    assert not is_stepped(plies[:1], 4.0)


def test_a_stretch_without_plies_is_a_named_problem():
    plies = (Ply("a", "m", 0, 0, 1, 1, end=1.0), Ply("b", "m", 0, 0, 1, 1, start=2.0))
    with pytest.raises(ProjectError) as info:
        segments_of(plies, 4.0)
    assert "no ply runs from 1.000 m to 2.000 m" in str(info.value.problems[0])
    with pytest.raises(ProjectError) as info:  # in the project's display units
        segments_of(plies, 4.0, "US")
    assert "no ply runs from 3.281 ft to 6.562 ft" in str(info.value.problems[0])
