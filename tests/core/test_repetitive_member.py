"""NDS 2018 4.3.9 (from memory): the repetitive member factor C_r = 1.15 applies to
dimension lumber, 2 in to 4 in thick, in a repetitive system; not to timbers 5 in and
thicker (NDS Supplement Table 4D), even where the user declares the system repetitive.
Checked on the bundled US demo's bending checks, the beam otherwise unchanged.
"""

from __future__ import annotations

from dataclasses import replace
from pathlib import Path

import pytest

from plystack.core.codes import nds
from plystack.core.io.project_file import load
from plystack.core.model.constants import INCH
from plystack.core.model.project import Project
from plystack.core.pipeline import run

DEMOS = Path(__file__).resolve().parents[2] / "assets" / "demo"


def _bending(p: Project) -> list:
    return [c for c in run(p).checks if c.id == "bending"]


def _project(material: str, width: float, height: float, repetitive: bool) -> Project:
    p = load(DEMOS / "porch-header.plystack.json")
    ply = replace(p.plies[0], material=material, width=width, height=height)
    return replace(p.with_plies((ply,)),
                   design=replace(p.design_or_default(), repetitive_member=repetitive))


@pytest.mark.parametrize(("material", "width", "height", "expected"), [
    ("DFL-No2", 1.5 * INCH, 9.25 * INCH, 1.15),       # a 2x10: dimension lumber
    ("DFL-No2", 3.5 * INCH, 9.25 * INCH, 1.15),       # a 4x10: still dimension lumber
    ("DFL-BS-No1", 5.5 * INCH, 11.5 * INCH, 1.0),     # a 6x12 timber: Table 4D
])
def test_C_r_by_thickness(material: str, width: float, height: float,
                          expected: float) -> None:
    on = _bending(_project(material, width, height, True))
    off = _bending(_project(material, width, height, False))
    assert on and off
    for a, b in zip(on, off, strict=True):
        assert a.factors["C_r"] == expected
        assert b.factors["C_r"] == 1.0
        assert a.capacity == pytest.approx(b.capacity * expected, rel=1e-12)
    if expected == 1.0:
        assert "dimension lumber 2 in to 4 in thick only" in on[0].sources["C_r"]


def test_the_factor_alone() -> None:
    assert nds.C_r(True, "sawn", 1.5 * INCH) == 1.15
    assert nds.C_r(True, "sawn", 4.0 * INCH) == 1.15
    assert nds.C_r(True, "sawn", 5.5 * INCH) == 1.0
    assert nds.C_r(True, "glulam", 1.5 * INCH) == 1.0
    assert nds.C_r(False, "sawn", 1.5 * INCH) == 1.0
