"""Fuzz of both demo projects: any field (leaf or container, at any depth) replaced by
any JSON type or an extreme number or quantity, then load + run + check_json. Only a
ProjectError with named problems may come out, never another exception, and the output
is strict JSON with no NaN or Infinity. Bounded to a few hundred examples.
"""

from __future__ import annotations

import copy
import json
import warnings
from pathlib import Path
from typing import Any

from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from plystack.core.io.output import check_json
from plystack.core.io.project_file import from_dict
from plystack.core.model.errors import ProjectError
from plystack.core.pipeline import run

DEMOS = sorted((Path(__file__).resolve().parents[2] / "assets" / "demo").glob("*.json"))
BASES = [json.loads(p.read_text()) for p in DEMOS]
PYTHON_CLASS_NAMES = ("Error", "Exception", "Traceback", "<class")


def _paths(value: Any, prefix: tuple[Any, ...] = ()) -> list[tuple[Any, ...]]:
    """Every place in a JSON value (objects by key, lists by index)."""
    out = [prefix] if prefix else []
    if isinstance(value, dict):
        for k, v in value.items():
            out += _paths(v, (*prefix, k))
    elif isinstance(value, list):
        for i, v in enumerate(value):
            out += _paths(v, (*prefix, i))
    return out


PATHS = [(i, p) for i, base in enumerate(BASES) for p in _paths(base)]

EXTREME_NUMBERS = [0, -1, 1, 1.9, -0.0, 1e-308, 5e-324, 1e308, -1e308, float("inf"),
                   float("-inf"), float("nan"), 2**63, -(2**63), 10**29, 10**30]
EXTREME_TEXT = ["", " ", "x", "\u00e9\u00e8", "0 in", "-1 in", "1e-300 in", "1e308 in",
                "-1e308 in", "999 m", "1000 m", "-1000 m", "1e-9 mm", "0 psi", "-45000 psi",
                "1e12 Pa", "1e13 Pa", "0 pcf", "1e5 kg/m^3", "1e8 N/m", "1e9 N", "1e7 Pa",
                "9**9**9 in", "1/0 in", "nan in", "inf in", "1 " + "x" * 300,
                "1" + "0" * 400 + " in", "area", "point", "D", "US-ASD", "EU-LSD", "simple",
                "cantilever", "DFL-No2", "A36", "steel", "timber"]
json_leaf = (st.none() | st.booleans() | st.sampled_from(EXTREME_NUMBERS)
             | st.integers() | st.floats() | st.sampled_from(EXTREME_TEXT) | st.text(max_size=8))
json_value = st.recursive(json_leaf, lambda inner: st.lists(inner, max_size=3)
                          | st.dictionaries(st.sampled_from(["a", "name", "value", "x", "D"]),
                                            inner, max_size=3), max_leaves=6)


def _set(data: Any, path: tuple[Any, ...], value: Any) -> None:
    target = data
    for step in path[:-1]:
        target = target[step]
    target[path[-1]] = value


def _strict(value: Any) -> str:
    return json.dumps(value, allow_nan=False)


@settings(max_examples=300, deadline=None, suppress_health_check=[HealthCheck.too_slow],
          derandomize=True)
@given(st.lists(st.tuples(st.sampled_from(PATHS), json_value), min_size=1, max_size=3))
def test_any_field_any_value_only_named_problems(mutations):
    demo = mutations[0][0][0]
    data = copy.deepcopy(BASES[demo])
    for (which, path), value in mutations:
        if which != demo:
            continue
        try:
            _set(data, path, value)
        except (KeyError, IndexError, TypeError):  # an earlier mutation removed the place
            continue
    with warnings.catch_warnings():
        warnings.simplefilter("error", RuntimeWarning)  # numpy warnings never escape
        try:
            project = from_dict(data)
            analysis = run(project)
            _strict(check_json(analysis, 1000.0, 1000.0))
        except ProjectError as exc:
            assert exc.problems
            for problem in exc.problems:
                text = str(problem)
                assert problem.message and len(text) < 400, text
                assert not any(word in text for word in PYTHON_CLASS_NAMES), text
