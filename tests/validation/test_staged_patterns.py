"""A member strengthened under load with pattern live load on two spans (an invented test
member): the two stages are solved with L on both spans at once, while the worst
arrangement loads one span (two equal continuous spans under a uniform load: the largest
sagging moment 0.0957 w L^2 with one span loaded against 0.0703 w L^2 with both, from
memory; ASCE 7-16 4.3.3). The staged checks do not envelope the arrangements, so the
verdict is INCOMPLETE with a named missing check, never OK.
"""

from __future__ import annotations

from plystack.core.io.project_file import from_dict
from plystack.core.pipeline import run
from tests.validation.test_net_section_through_bolts import doubled_joist_plies


def _project(spans, pattern=True, staged=True):
    return from_dict({
        "format": "plystack", "version": 1, "title": "staged patterns", "display_units": "US",
        "plies": doubled_joist_plies("added" if staged else "existing"),
        "beam": {"spans": spans, "supports": "simple", "self_weight": False,
                 "pattern_live_load": pattern,
                 "loads": [{"case": "D", "type": "line", "value": "20 plf", "stage": "before"},
                           {"case": "D", "type": "line", "value": "7 plf"},
                           {"case": "L", "type": "line", "value": "53 plf"}],
                 "combinations": "ASD"},
        "design": {"basis": "US-ASD", "steel_bears": True}})


def _gaps(a):
    return [p for p in a.incomplete_reasons if p.path == "beam.pattern_live_load"]


def test_staged_two_spans_with_pattern_live_load_is_incomplete_by_name():
    a = run(_project(["12 ft", "12 ft"]))
    gaps = _gaps(a)
    assert len(gaps) == 1 and "D + L" in gaps[0].message and "pattern" in gaps[0].message
    assert a.verdict == "INCOMPLETE"


def test_no_refusal_without_patterns_stages_or_a_second_region():
    assert not _gaps(run(_project(["12 ft", "12 ft"], pattern=False)))
    assert not _gaps(run(_project(["12 ft", "12 ft"], staged=False)))
    assert not _gaps(run(_project(["12 ft"])))
