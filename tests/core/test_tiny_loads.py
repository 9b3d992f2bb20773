"""Adding a tiny wind or snow load never lowers a governing ratio (hypothesis, both
bases). A property of any correct combination rule: each accompanying action is taken
only where it is unfavourable (EN 1990 6.4.3.2), and the ASD set keeps D + L (ASCE 7-16
2.4.1); from memory.
"""

from __future__ import annotations

import copy
import json

from hypothesis import given, settings
from hypothesis import strategies as st

from plystack.core.io.project_file import from_dict
from plystack.core.io.resources import demo_text
from plystack.core.pipeline import run

DEMOS = {"US": json.loads(demo_text("porch-header")),
         "EU": json.loads(demo_text("stair-trimmer-eu"))}


def governing(d):
    a = run(from_dict(d))
    return {c.id: max(x.ratio for x in a.checks if x.id == c.id) for c in a.checks}


@settings(max_examples=12, deadline=None)
@given(basis=st.sampled_from(["US", "EU"]), case=st.sampled_from(["W", "S"]),
       sign=st.sampled_from([1.0, -1.0]), span_scale=st.floats(0.6, 1.4),
       load_scale=st.floats(0.5, 2.0))
def test_tiny_extra_load_never_lowers_a_ratio(basis, case, sign, span_scale, load_scale):
    d = copy.deepcopy(DEMOS[basis])
    d["beam"]["spans"] = [f"{float(s.split()[0]) * span_scale} {s.split()[1]}"
                          for s in d["beam"]["spans"]] if all(
        len(s.split()) == 2 for s in d["beam"]["spans"]) else d["beam"]["spans"]
    for ld in d["beam"]["loads"]:
        if ld["type"] != "point":
            num, u = ld["value"].split(" ", 1)
            ld["value"] = f"{float(num) * load_scale} {u}"
    before = governing(d)
    tiny = "0.001 plf" if basis == "US" else "0.00001 kN/m"
    d["beam"]["loads"].append({"case": case, "type": "line",
                               "value": ("-" if sign < 0 else "") + tiny})
    after = governing(d)
    for cid, r in before.items():
        assert after.get(cid, 0.0) >= r * (1 - 1e-6), (cid, r, after.get(cid))
