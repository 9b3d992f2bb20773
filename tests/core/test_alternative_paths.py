"""A problem of an alternative's plies is named where the file holds them
(``alternatives[k].plies...``) by every command that analyses it."""

from __future__ import annotations

import copy
import json
from pathlib import Path

import pytest

from plystack.core.cli import main
from plystack.core.model.errors import MissingCheck, Problem, ProjectError, named_under

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"


@pytest.fixture
def emptied(tmp_path):
    d = json.loads(DEMO.read_text())
    d = copy.deepcopy(d)
    assert d["alternatives"][1]["name"] == "1/4 in plate"
    d["alternatives"][1]["plies"] = []
    path = tmp_path / "alt.plystack.json"
    path.write_text(json.dumps(d))
    return path


@pytest.mark.parametrize("args", [
    ["compare"], ["compare", "--json"],
    ["sheet", "--alternative", "1/4 in plate", "-o", "OUT/x.pdf"],
    ["plates", "--alternative", "1/4 in plate", "-o", "OUT/plates"],
])
def test_an_empty_alternative_is_named_by_its_index(emptied, args, tmp_path, capsys):
    args = [a.replace("OUT", str(tmp_path)) for a in args]
    assert main([args[0], str(emptied), *args[1:]]) == 2
    cap = capsys.readouterr()
    assert cap.err == f"{emptied}: alternatives[1].plies: the section has no plies\n"
    assert not (tmp_path / "x.pdf").exists()


def test_named_under_renames_only_the_root_and_keeps_the_kind():
    with pytest.raises(ProjectError) as info:
        with named_under("alternatives[3]"):
            raise ProjectError([Problem("plies", "a"), Problem("plies[2].x", "b"),
                                MissingCheck("plies.k", "c"), Problem("beam.spans[0]", "d"),
                                Problem("pliesx", "e"), Problem("", "f")])
    got = info.value.problems
    assert [p.path for p in got] == ["alternatives[3].plies", "alternatives[3].plies[2].x",
                                     "alternatives[3].plies.k", "beam.spans[0]", "pliesx", ""]
    assert type(got[2]) is MissingCheck and [p.message for p in got] == list("abcdef")
