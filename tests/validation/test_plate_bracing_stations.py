"""A steel plate on one face of a joist, braced at its bolts: with explicit bolt stations
the unbraced length L_b is the largest gap between them (an invented test member: a
1/4 x 9 in A36 plate on a 2x10, stations 24, 36 and 24 in apart).

AISC 360-16 F11 by hand (from memory): L_b d / t^2 = 36 x 9 / 0.25^2 = 5184 > 1.9 E / F_y
= 1530.6, so F_cr = 1.9 E / (L_b d / t^2) = 1.9 x 29,000,000 / 5184 psi (F11-3, F11-4,
C_b = 1), allowable F_cr / 1.67.
"""

from __future__ import annotations

import pytest

from plystack.core.io.project_file import from_dict
from plystack.core.pipeline import run

PSI = 6894.757293168361


def _project(stations):
    return from_dict({
        "format": "plystack", "version": 1, "title": "face plate", "display_units": "US",
        "plies": [{"name": "joist", "material": "DFL-No2", "x": "0 in", "y": "0 in",
                   "width": "1.5 in", "height": "9.25 in"},
                  {"name": "plate", "material": "A36", "x": "1.5 in", "y": "0.125 in",
                   "width": "0.25 in", "height": "9 in"}],
        "beam": {"spans": ["10 ft"], "supports": "simple", "self_weight": False,
                 "loads": [{"case": "D", "type": "line", "value": "50 plf"}],
                 "combinations": "ASD"},
        "design": {"basis": "US-ASD", "steel_bears": True,
                   "bolt": {"diameter": "0.5 in", "rows": 2,
                            "stations": [f"{x} in" for x in stations]}}})


def test_face_plate_unbraced_between_its_given_stations_by_hand():
    a = run(_project([6, 30, 66, 90, 114]))
    c = next(c for c in a.checks if c.id == "bending" and c.ply == "plate")
    assert c.capacity / PSI == pytest.approx(1.9 * 29e6 / (36 * 9 / 0.25**2) / 1.67,
                                             rel=1e-12)
