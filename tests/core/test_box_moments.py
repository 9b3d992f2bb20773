"""A whole rectangle's moments in plain floats (``section.geometry.rectangle_moments``)
against the shoelace formulas of numpy's arrays over the same ring (``_shoelace``, the
path it stands in for): the same numbers bit for bit, signed zeros included, on random
plies (negative and large offsets, thin and wide) and on the demos' plies.
"""

from __future__ import annotations

from pathlib import Path

import numpy as np
import pytest

from plystack.core.io.project_file import load
from plystack.core.model.plies import Ply
from plystack.core.section.geometry import PolygonMoments, _shoelace, rectangle_moments

DEMOS = Path(__file__).resolve().parents[2] / "assets" / "demo"


def _plain(ply: Ply) -> PolygonMoments:
    x0, x1, y0, y1 = ply.x, ply.x + ply.width, ply.y, ply.top
    return _shoelace([np.array([[x1, y0], [x1, y1], [x0, y1], [x0, y0], [x1, y0]])])


def _bits(m: PolygonMoments) -> tuple[str, ...]:
    return tuple(float(v).hex() for v in (m.area, m.first_y, m.second_y, m.first_x))


@pytest.mark.parametrize("seed", range(4))
def test_box_moments_equal_the_arrays_bit_for_bit(seed: int) -> None:
    rng = np.random.default_rng(seed)
    for _ in range(2000):
        scale = 10.0 ** float(rng.integers(-3, 3))
        x, y = (float(v) * scale for v in rng.uniform(-2.0, 2.0, 2))
        w, h = (float(v) * scale for v in rng.uniform(1e-4, 1.0, 2))
        ply = Ply("p", "m", x, y, w, h)
        assert _bits(rectangle_moments(ply)) == _bits(_plain(ply))
    for x, y in ((0.0, 0.0), (-0.0, 0.0), (0.0, -0.0), (-0.1, -0.2)):
        ply = Ply("p", "m", x, y, 0.05, 0.2)
        assert _bits(rectangle_moments(ply)) == _bits(_plain(ply))


def test_the_demos_plies() -> None:
    for name in ("porch-header.plystack.json", "stair-trimmer-eu.plystack.json"):
        for ply in load(DEMOS / name).plies:
            assert _bits(rectangle_moments(ply)) == _bits(_plain(ply))
