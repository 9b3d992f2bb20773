"""The checks table of ``plystack check``: columns as wide as their texts, a long place
wrapped onto the next lines of its column and never cut (a cut place made two timbers'
splitting checks look the same and ran into the combination)."""

from __future__ import annotations

from pathlib import Path

import pytest

from plystack.core.design.text import PLACE_WIDTH, checks_text, governing_per_group
from plystack.core.io.project_file import load
from plystack.core.pipeline import run

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo"


@pytest.mark.parametrize("name", ["porch-header", "stair-trimmer-eu"])
def test_every_place_is_whole_and_the_columns_line_up(name):
    a = run(load(DEMO / f"{name}.plystack.json"))
    lines = checks_text(a.checks, a.project.display_units, a.verdict)
    header = lines[2]
    start = header.index("ply / place")
    stop = header.index("combination")
    ratio_end = header.index("ratio") + len("ratio")
    rows = governing_per_group(a.checks)
    # the table's rows: a row starts with its check id; continuation lines with spaces
    body = lines[3:lines.index("", 3)]
    starts = [i for i, t in enumerate(body) if t[2:3] != " "]
    assert len(starts) == len(rows)
    for k, (c, i) in enumerate(zip(rows, starts, strict=True)):
        end = starts[k + 1] if k + 1 < len(starts) else len(body)
        block = [t for t in body[i:end] if t[6:7] == " " or t[2:3] != " "]  # no layout note
        place = " ".join(t[start:stop].strip() for t in block).strip()
        expected = c.ply or c.location
        if c.id == "splitting":
            expected = f"{c.ply}, {c.location}"
        elif c.ply and c.location and c.id in ("bearing", "load-transfer"):
            expected = f"{c.location}: {c.ply}"
        assert place == expected
        assert all(len(t[start:stop].rstrip()) <= PLACE_WIDTH for t in block)
        assert block[0][ratio_end - 5:ratio_end] == f"{c.ratio:.3f}"
    splits = [t for t in body if "splitting" in t]
    assert len(set(splits)) == len(splits)  # the two timbers' rows differ
