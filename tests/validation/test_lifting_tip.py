"""A deflection check of a region that lifts says so (the project's sign: downward
positive; an overhang's tip rises while only the span is loaded)."""

from __future__ import annotations

from plystack.core.io.project_file import from_dict
from plystack.core.pipeline import run
from tests.validation.test_load_transfer import flitch


def test_a_lifting_overhang_tip_says_it_lifts():
    """A 12 ft span with a 4 ft overhang, the span loaded and the overhang bare: the tip
    rises (downward deflection negative, by the slope at the support times the overhang,
    common practice); its deflection checks say so, the span's do not.
    """
    p = flitch(loads=[{"case": "L", "type": "line", "value": "240 plf", "from": "0 ft",
                        "to": "12 ft"}])
    p["beam"]["spans"] = ["12 ft"]
    p["beam"]["overhang_right"] = "4 ft"
    a = run(from_dict(p))
    tips = [c for c in a.checks if c.id == "deflection-live" and "overhang" in c.location]
    spans = [c for c in a.checks if c.id == "deflection-live" and "span" in c.location]
    assert tips and all(any(n.startswith("Upward") for n in c.notes) for c in tips)
    assert spans and not any(n.startswith("Upward") for c in spans for n in c.notes)
