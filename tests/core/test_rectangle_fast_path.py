"""A whole rectangle's moments and width profile, found without building its polygon,
against the shoelace formulas and width profile of shapely's own box: the same numbers
bit for bit (so sections of unclipped plies are unchanged by the shortcut).
"""

from __future__ import annotations

import numpy as np
import shapely

from plystack.core.model.plies import Ply
from plystack.core.section.geometry import (
    polygon_moments,
    rectangle_moments,
    rectangle_profile,
    width_profile,
)


def test_rectangles_equal_their_boxes_bit_for_bit() -> None:
    rng = np.random.default_rng(5)
    for _ in range(3000):
        x, y = (float(v) for v in rng.uniform(-0.3, 0.3, 2))
        w, h = (float(v) for v in rng.uniform(1e-3, 0.4, 2))
        ply = Ply("p", "m", x, y, w, h)
        box = shapely.box(ply.x, ply.y, ply.x + ply.width, ply.top)
        assert rectangle_moments(ply) == polygon_moments(box)
        mine, theirs = rectangle_profile(ply), width_profile(box)
        for a, b in ((mine.y, theirs.y), (mine.b_start, theirs.b_start),
                     (mine.b_end, theirs.b_end)):
            assert a.tobytes() == b.tobytes()
