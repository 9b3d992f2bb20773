"""Plies that touch nothing form no section: where no ply of some area touches another,
the analysis is refused by field (``plies``) instead of computing a composite section
that the warnings say does not exist; a single loose ply among connected ones is still
left out with its warning (its modulus zero), and the rest analysed.
"""

from __future__ import annotations

from dataclasses import replace
from pathlib import Path

import pytest

from plystack.core.io.project_file import load
from plystack.core.model.errors import ProjectError
from plystack.core.pipeline import run

US = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"
IN = 0.0254


def test_plies_that_touch_nothing_are_refused() -> None:
    p = load(US)
    plies = list(p.plies)
    plies[1] = replace(plies[1], x=31.5 * IN, y=8.0625 * IN)  # the plate taken far away
    with pytest.raises(ProjectError) as err:
        run(p.with_plies(tuple(plies)))
    (problem,) = err.value.problems
    assert problem.path == "plies" and "no ply touches another" in problem.message


def test_one_loose_ply_is_left_out_and_the_rest_analysed() -> None:
    p = load(US)
    # a thin strip: its weight leaves the demo's checks as they were (splitting at 0.99)
    far = replace(p.plies[1], name="spare strip", x=31.5 * IN, width=IN / 64)
    a = run(p.with_plies((*p.plies, far)))
    assert float(a.section.E[-1]) == 0.0
    assert any(w.path == f"plies[{len(p.plies)}]" and "touches no other ply" in w.message
               for w in a.warnings)
    assert a.verdict == "INCOMPLETE"
    whole = run(p)
    assert a.section.EI == pytest.approx(whole.section.EI, rel=1e-12)


def test_loose_plies_whose_centroids_share_a_height_are_analysed_as_they_bend() -> None:
    # the two joists of the demo with the plate's gap between them: apart, but bending
    # about one height alike, so the section's EI is the sum of their own b h^3 / 12 E
    p = load(US)
    joists = tuple(q for q in p.plies if "2x10" in q.name)
    a = run(p.with_plies(joists))
    own = sum(float(a.section.E[i]) * q.width * q.height ** 3 / 12
              for i, q in enumerate(a.section.plies))
    assert a.section.EI == pytest.approx(own, rel=1e-12)
