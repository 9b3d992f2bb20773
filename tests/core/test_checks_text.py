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


def test_ratio_text_spells_no_capacity_and_not_a_number_in_words():
    from plystack.core.design.check import ratio_text

    assert ratio_text(0.95) == "0.950"
    assert ratio_text(float("inf")) == "\u221e"  # demand over no capacity
    assert ratio_text(float("nan")) == "not a number"


def test_text_table_sizes_columns_to_their_texts():
    from plystack.core.io.table import text_table

    lines = text_table(["name", "EI"], [["a long alternative name here", "1"],
                                        ["b", "1126070182 lbf*in^2"]], frozenset({1}))
    assert lines == ["name" + " " * 26 + " " * 17 + "EI",  # 28 + 2 spaces, 19 wide
                     "a long alternative name here" + " " * 2 + " " * 18 + "1",
                     "b" + " " * 29 + "1126070182 lbf*in^2"]


def test_compare_keeps_long_names_whole(tmp_path, capsys):
    import json

    from plystack.core.cli import main

    data = json.loads((DEMO / "porch-header.plystack.json").read_text())
    data["alternatives"][1]["name"] = "1/4 in plate with a rather long name to show"
    path = tmp_path / "long.plystack.json"
    path.write_text(json.dumps(data))
    assert main(["compare", str(path)]) == 0
    out = capsys.readouterr().out.splitlines()
    assert any(t.startswith("1/4 in plate with a rather long name to show  ") for t in out)
    verdict_at = {t.rindex("NOT OK") if "NOT OK" in t else t.rindex("OK") for t in out[1:4]}
    assert len(verdict_at) == 1  # the verdicts in one column (the 1/2 in plate: NOT OK)
