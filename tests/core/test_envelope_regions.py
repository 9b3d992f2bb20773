"""The worst deflection of every region over many arrangements (``analysis.envelope``)
against the plain search it replaced: for each region, ``max`` over the arrangements by
|deflection|, the first of equals. The same (name, deflection, x) bit for bit, with ties,
signed zeros, and values that are not numbers (then the plain search itself decides).
"""

from __future__ import annotations

import math
import random

import pytest

from plystack.core.actions.analysis import envelope
from plystack.core.actions.extremes import Extremes


def _plain(ext: list[Extremes]) -> tuple[tuple[str, float, float], ...]:
    out = []
    for r, (name, _, _) in enumerate(ext[0].deflection_by_region):
        best = max(ext, key=lambda e: abs(e.deflection_by_region[r][1]))
        out.append((name, best.deflection_by_region[r][1], best.deflection_by_region[r][2]))
    return tuple(out)


def _extremes(by_region: tuple[tuple[str, float, float], ...]) -> Extremes:
    return Extremes(M_max=1.0, x_M_max=0.0, M_min=-1.0, x_M_min=0.0, V_max_abs=1.0,
                    x_V_max_abs=0.0, deflection_max_abs=1.0, x_deflection_max=0.0,
                    deflection_by_region=by_region)


def _bits(rows: tuple[tuple[str, float, float], ...]) -> list[tuple[str, str, str]]:
    return [(n, repr(w), repr(x)) for n, w, x in rows]


@pytest.mark.parametrize("seed", range(40))
def test_the_worst_of_each_region_is_the_plain_searchs(seed: int) -> None:
    rng = random.Random(seed)
    regions = [f"span {r + 1}" for r in range(rng.randint(1, 12))]
    # few distinct magnitudes, so that equal |w| of either sign (ties) are common
    magnitudes = [0.0, -0.0, 1e-3, 2e-3, 2.5e-3, rng.uniform(0, 5e-3)]
    ext = []
    for k in range(rng.randint(2, 60)):
        ext.append(_extremes(tuple(
            (name, rng.choice(magnitudes) * rng.choice((1.0, -1.0)), k + r / 10)
            for r, name in enumerate(regions))))
    got, _ = envelope(ext)
    assert _bits(got.deflection_by_region) == _bits(_plain(ext))


@pytest.mark.parametrize("bad", [math.nan, math.inf, -math.inf])
def test_a_value_that_is_not_a_number_gets_the_plain_searchs_answer(bad: float) -> None:
    ext = [_extremes((("span 1", 1e-3, 0.5), ("span 2", -2e-3, 3.5))),
           _extremes((("span 1", bad, 0.7), ("span 2", 2e-3, 3.7))),
           _extremes((("span 1", 4e-3, 0.9), ("span 2", 1e-3, 3.9)))]
    got, _ = envelope(ext)
    assert _bits(got.deflection_by_region) == _bits(_plain(ext))


def test_the_first_of_equal_magnitudes_governs() -> None:
    ext = [_extremes((("span 1", -2e-3, 0.1),)), _extremes((("span 1", 2e-3, 0.2),)),
           _extremes((("span 1", 1e-3, 0.3),))]
    got, _ = envelope(ext)
    assert got.deflection_by_region == (("span 1", -2e-3, 0.1),)
