"""The stiffness solve of a small mesh in plain floats (``actions.float_solve``, taken by
``BeamModel.solve``) against the array path (``BeamModel.solve_arrays``): the same
numbers bit for bit, on the demos' meshes and on 1 to 5 spans with overhangs, point
loads, partial and varying line loads, every kind of support and stepped stiffness
(plies stopping short). Regression guard: the reference is the module's own array path.
"""

from __future__ import annotations

from pathlib import Path

import numpy as np
import pytest

from plystack.core.actions import float_solve
from plystack.core.actions.beam import BeamModel
from plystack.core.io.project_file import load
from plystack.core.model.member import BeamLayout, Load

DEMOS = Path(__file__).resolve().parents[2] / "assets" / "demo"


def _same(model: BeamModel, loads: list[Load], extra: float = 0.0) -> None:
    assert model._floats is not None
    quick, plain = model.solve(loads, extra), model.solve_arrays(loads, extra)
    assert (quick._e, quick._s, quick._w) == (plain._e, plain._s, plain._w)
    assert quick.data.tobytes() == plain.data.tobytes()


def _loads(rng: np.random.Generator, length: float, n_points: int) -> list[Load]:
    out = [Load("D", "line", float(rng.uniform(100, 5000))),
           Load("L", "area", float(rng.uniform(500, 3000)), tributary_width=1.7,
                start=float(rng.uniform(0, length / 3)),
                end=float(rng.uniform(length / 2, length))),
           Load("L", "line", float(rng.uniform(-800, 2000)), value_end=float(rng.uniform(0, 4e3)),
                start=float(rng.uniform(0, length / 2)), end=length)]
    out += [Load("D", "point", float(rng.uniform(-500, 9000)), at=float(rng.uniform(0, length)))
            for _ in range(n_points)]
    out.append(Load("L", "point", 1234.5, at=0.0))  # at the end of the member
    return out


LAYOUTS = [
    BeamLayout(spans=(3.6,)),
    BeamLayout(spans=(3.6576,), overhang_right=0.7),
    BeamLayout(spans=(4.1, 2.9), overhang_left=0.45),
    BeamLayout(spans=(3.0, 3.3, 2.7)),
    BeamLayout(spans=(2.4, 3.1, 2.2, 3.9)),
    BeamLayout(spans=(3.0, 3.0, 3.0, 3.0, 3.0), overhang_left=0.3, overhang_right=0.6),
    BeamLayout(spans=(2.5,), supports="cantilever"),
    BeamLayout(spans=(5.2,), supports="fixed-fixed"),
    BeamLayout(spans=(4.4,), supports="propped"),
]


@pytest.mark.parametrize("layout", LAYOUTS, ids=lambda lay: f"{lay.supports}-{len(lay.spans)}")
@pytest.mark.parametrize("seed", range(3))
def test_float_solve_equals_the_array_path(layout: BeamLayout, seed: int) -> None:
    rng = np.random.default_rng(seed)
    length = layout.length
    loads = _loads(rng, length, n_points=int(rng.integers(0, 6)))
    for steps in ((), ((0.0, length / 3, 2.1e6), (length / 3, length, 3.4e6)),
                  ((0.3, length - 0.3, 1.0e6), (0.0, 0.3, 2.5e5), (length - 0.3, length, 2.5e5))):
        model = BeamModel(layout, loads, steps)
        _same(model, loads)
        _same(model, [], 1.0)
        for case in ("D", "L"):
            _same(model, [ld for ld in loads if ld.case == case], float(rng.uniform(0, 900)))


@pytest.mark.parametrize("name", ["porch-header.plystack.json", "stair-trimmer-eu.plystack.json"])
def test_float_solve_on_the_demos(name: str) -> None:
    beam = load(DEMOS / name).beam
    assert beam is not None
    for spans in (1, 3, 5):
        layout = BeamLayout(spans=beam.layout.spans * spans)
        model = BeamModel(layout, beam.loads)
        for case in sorted({ld.case for ld in beam.loads}):
            _same(model, [ld for ld in beam.loads if ld.case == case])
        _same(model, [], 1.0)


def test_large_meshes_and_odd_numbers_take_the_array_path() -> None:
    layout = BeamLayout(spans=(3.0, 4.0))
    many = [Load("D", "point", 1000.0, at=0.1 * k) for k in range(1, 69)]
    assert BeamModel(layout, many)._floats is None
    assert not float_solve.plain_inputs([Load("D", "point", 1, at=1.0)], 0.0)  # an int
    assert not float_solve.plain_inputs([], float("inf"))


@pytest.mark.parametrize("n", [*range(0, 20), 31, 64, 100, 127, 128])
def test_numpy_sum_adds_as_numpy_does(n: int) -> None:
    rng = np.random.default_rng(n)
    rows = [rng.normal(0, 1, n) * 10.0 ** rng.integers(-9, 9, n) for _ in range(30)]
    rows += [np.zeros(n), -np.zeros(n), rng.choice([0.0, -0.0], n),
             rng.choice([0.0, -0.0, 1.5, -1.5], n)]
    for x in rows:  # compared by bits: -0.0 and 0.0 are told apart
        assert float_solve.numpy_sum(x.tolist()).hex() == float(x.sum()).hex()


@pytest.mark.parametrize("spans", [1, 3, 7, 12])
def test_a_case_that_carries_nothing_solves_alike(spans: int) -> None:
    """A case of no loads, or of loads of zero (a placeholder live load), on meshes of 8
    nodes and more: its reactions are zeros, and zeros of the same sign."""
    layout = BeamLayout(spans=(1.8,) * spans)
    points = [Load("D", "point", 900.0, at=1.8 * spans * (k + 0.5) / 7) for k in range(7)]
    model = BeamModel(layout, points)
    _same(model, [])
    _same(model, [Load("L", "line", 0.0)])
    _same(model, [Load("L", "point", 0.0, at=0.9)])
    _same(model, [Load("L", "line", 0.0), Load("L", "point", 0.0, at=1.1)], 0.0)
    assert model.solve([]).reactions.tobytes() == np.zeros(spans + 1).tobytes()
