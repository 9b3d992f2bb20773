"""A segment's run of the checks (``run_checks(..., segment=True)``) makes only what a
stepped member keeps of it, with the same result as running every check in every
segment and keeping the stress checks and new warnings (the rule of
``design.segmented``: the reference here is that plain way, every segment run made in
full). Compared as text of every check and warning, so any drift in a number, a word or
the order fails.
"""

from __future__ import annotations

import json
from pathlib import Path
from typing import Any

import pytest

from plystack.core import pipeline
from plystack.core.io.project_file import from_dict
from plystack.core.pipeline import run

DEMOS = Path(__file__).resolve().parents[2] / "assets" / "demo"


def _data(name: str) -> dict[str, Any]:
    data = json.loads((DEMOS / name).read_text(encoding="utf-8"))
    data.pop("alternatives", None)
    return data


def _short_plate(data: dict[str, Any], start: str, end: str) -> dict[str, Any]:
    for ply in data["plies"]:
        if ply["material"].startswith(("A", "S")):  # the steel plate (A36, S275)
            ply["from"], ply["to"] = start, end
    return data


def _us_short() -> dict[str, Any]:
    return _short_plate(_data("porch-header.plystack.json"), "1.5 ft", "9 ft")


def _eu_short() -> dict[str, Any]:
    return _short_plate(_data("stair-trimmer-eu.plystack.json"), "0.3 m", "3.2 m")


def _eu_short_own_list() -> dict[str, Any]:
    """The combinations as the user's list, with no SLS-quasi-permanent one (the
    deflections then warn: the member's run says it, the segments' would repeat it)."""
    data = _eu_short()
    data["beam"]["combinations"] = [
        {"name": "ULS", "factors": {"D": 1.35, "L": 1.5}, "kind": "ULS",
         "duration": "medium-term"},
        {"name": "SLS", "factors": {"D": 1, "L": 1}, "kind": "SLS-characteristic"}]
    return data


def _us_two_spans_short() -> dict[str, Any]:
    data = _us_short()
    data["beam"]["spans"] = ["6 ft", "6 ft"]
    data["beam"]["supports"] = "continuous"
    return data


CASES = {"us plate short": _us_short, "eu plate short": _eu_short,
         "eu own combinations": _eu_short_own_list, "us two spans": _us_two_spans_short}


def _text(a: pipeline.Analysis) -> list[str]:
    return [repr(c) for c in a.checks] + [repr(w) for w in a.warnings]


@pytest.mark.parametrize("case", sorted(CASES))
def test_segment_runs_equal_full_runs(case: str, monkeypatch: pytest.MonkeyPatch) -> None:
    project = from_dict(CASES[case]())
    quick = run(project)
    assert quick.segments, "the case must be a stepped member"
    plain_run_checks = pipeline.run_checks

    def in_full(*args: Any, segment: bool = False, **kwargs: Any) -> Any:
        del segment  # every segment run made in full
        return plain_run_checks(*args, **kwargs)

    monkeypatch.setattr(pipeline, "run_checks", in_full)
    full = run(project)
    assert _text(quick) == _text(full)


def test_the_own_list_case_warns_of_the_quasi_permanent_combination() -> None:
    a = run(from_dict(_eu_short_own_list()))
    assert any("SLS-quasi-permanent" in w.message for w in a.warnings)
    assert any(c.id.startswith("deflection") for c in a.checks)


def test_a_segment_holding_every_ply_has_the_members_own_section() -> None:
    """Shared, not remade (what is found once per section is then found once for both),
    and the same numbers as the section analysed afresh from its plies."""
    from plystack.core.section.transformed import analyse

    project = from_dict(_us_short())
    a = run(project)
    full = [s for s in a.segments if len(s.plies) == len(a.section.plies)]
    assert len(full) == 1 and full[0].section is a.section
    for s in a.segments:
        fresh = analyse(tuple(project.plies[i] for i in s.plies), project.all_materials(),
                        a.section.reference_material)
        assert repr(fresh) == repr(s.section)
        assert (fresh.EI, fresh.EA, fresh.neutral_axis_y, fresh.I_transformed) == (
            s.section.EI, s.section.EA, s.section.neutral_axis_y, s.section.I_transformed)
        for name in ("E", "n", "area", "first_y", "second_y", "I_na", "y_bottom", "y_top"):
            assert getattr(fresh, name).tobytes() == getattr(s.section, name).tobytes()
