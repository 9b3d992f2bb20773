"""The quick finiteness test of an analysis (``pipeline._plainly_finite``, a sum of every
reported number) against the named path it stands in for (``_finite_fields``, each number
tested by itself): True only where every number is finite and no capacity is negative,
on the demos and variants, and False wherever one number is made infinite, NaN or (a
capacity) negative, also where the other numbers would overflow a sum.
"""

from __future__ import annotations

import json
import math
from dataclasses import replace
from pathlib import Path

import numpy as np
import pytest

from plystack.core import pipeline
from plystack.core.io.project_file import from_dict

DEMOS = Path(__file__).resolve().parents[2] / "assets" / "demo"


def _analyses() -> list[pipeline.Analysis]:
    out = []
    for name, short in (("porch-header.plystack.json", ("1 ft", "11 ft")),
                        ("stair-trimmer-eu.plystack.json", ("0.3 m", "3.3 m"))):
        data = json.loads((DEMOS / name).read_text(encoding="utf-8"))
        out.append(pipeline.run(from_dict(data)))
        data["plies"][1].update({"from": short[0], "to": short[1]})
        out.append(pipeline.run(from_dict(data)))
        data["beam"]["spans"] = data["beam"]["spans"] * 3
        out.append(pipeline.run(from_dict(data)))
    return out


def _every_finite(a: pipeline.Analysis) -> bool:
    for what, value in pipeline._finite_fields(a):
        arr = np.asarray(value, dtype=float)
        if not np.isfinite(arr).all():
            return False
        if what.startswith("capacity") and float(arr) < 0:
            return False
    return True


def test_finite_analyses_are_plainly_finite() -> None:
    for a in _analyses():
        assert _every_finite(a)
        assert pipeline._plainly_finite(a)


@pytest.mark.parametrize("bad", [math.inf, -math.inf, math.nan])
def test_one_number_not_finite_is_found(bad: float) -> None:
    for a in _analyses()[:2]:
        for k in range(0, len(a.checks), 7):
            check = a.checks[k]
            changes = [{"demand": bad}, {"capacity": bad}]
            if check.factors:
                name = next(iter(check.factors))
                changes.append({"factors": {**check.factors, name: bad}})
            for change in changes:
                broken = replace(a, checks=(*a.checks[:k], replace(check, **change),
                                            *a.checks[k + 1:]))
                assert not _every_finite(broken)
                assert not pipeline._plainly_finite(broken)
        section = replace(a.section, EI=bad)
        assert not pipeline._plainly_finite(replace(a, section=section))


def test_negative_capacity_and_overflowing_sums() -> None:
    a = _analyses()[0]
    check = a.checks[0]
    negative = replace(a, checks=(replace(check, capacity=-1.0), *a.checks[1:]))
    assert not pipeline._plainly_finite(negative)
    # every number finite, their sum not: False, and the named path passes it
    huge = replace(a, checks=(replace(check, demand=1.7e308),
                              replace(a.checks[1], demand=1.7e308), *a.checks[2:]))
    assert _every_finite(huge)
    assert not pipeline._plainly_finite(huge)
    pipeline._require_finite(huge)
