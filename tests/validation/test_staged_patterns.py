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


def _project(spans, pattern=True, staged=True):
    joist = {"material": "DFL-No2", "y": "0 in", "width": "1.5 in", "height": "9.25 in"}
    plate = {"material": "A36", "y": "0.125 in", "width": "0.25 in", "height": "9 in",
             "stage": "added" if staged else "existing"}
    return from_dict({
        "format": "plystack", "version": 1, "title": "staged patterns", "display_units": "US",
        "plies": [{**plate, "name": "plate A", "x": "0 in"},
                  {**joist, "name": "joist A", "x": "0.25 in"},
                  {**joist, "name": "joist B", "x": "1.75 in"},
                  {**plate, "name": "plate B", "x": "3.25 in"}],
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
