"""The pattern plan's samples of every element (``patterns._samples``: all elements at
once by Horner's rule) against numpy's ``polyval`` of each element's own polynomials
(``extremes.element_polynomials``, element by element, scalar lengths): the same numbers bit
for bit, on spans whose squares numpy's array square rounds differently from a scalar's
``**`` (2.759, 4.536, 7.964 and 9.072 m) and on random spans.
"""

from __future__ import annotations

from dataclasses import replace
from pathlib import Path

import numpy as np
import pytest

from plystack.core.actions import patterns
from plystack.core.actions.beam import BeamModel
from plystack.core.actions.extremes import element_polynomials
from plystack.core.io.project_file import load

DEMOS = Path(__file__).resolve().parents[2] / "assets" / "demo"


def _one_at_a_time(model: BeamModel, sol) -> np.ndarray:  # type: ignore[no-untyped-def]
    out = []
    for e, poly in enumerate(element_polynomials(model, sol, 1.0)):
        x = patterns.SAMPLES * model.lengths[e]
        out.append(np.concatenate([np.polyval(poly["M"], x), np.polyval(poly["V"], x),
                                   np.polyval(poly["w"], x)]))
    return np.concatenate(out)


@pytest.mark.parametrize("demo", ["porch-header", "stair-trimmer-eu"])
def test_samples_equal_polyval_bit_for_bit(demo: str) -> None:
    beam = load(DEMOS / f"{demo}.plystack.json").beam
    assert beam is not None
    rng = np.random.default_rng(4)
    spans = [(2.759, 2.759, 4.536), (7.964, 9.072)]
    spans += [tuple(float(s) for s in rng.uniform(1.0, 12.0, 3).round(3)) for _ in range(8)]
    # the loads over the whole member only, so that elements are the spans themselves
    loads = [ld for ld in beam.loads if ld.type != "point" and ld.start is None
             and ld.end is None]
    assert loads
    for lengths in spans:
        layout = replace(beam.layout, spans=lengths, overhang_left=0.0, overhang_right=0.0)
        model = BeamModel(layout, loads)
        assert any(le in (2.759, 4.536, 7.964, 9.072) for le in model.lengths.tolist()) or (
            lengths not in spans[:2])
        for case in sorted({ld.case for ld in loads}):
            sol = model.solve([ld for ld in loads if ld.case == case], extra_line=55.5)
            assert patterns._samples(model, sol).tobytes() == _one_at_a_time(model, sol).tobytes()
