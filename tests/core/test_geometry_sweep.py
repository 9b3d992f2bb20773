"""The sorted sweep of section.geometry.near_pairs against the plain loop over every pair
it replaces: the same pairs pass each exact test (overlap, touch within a tolerance,
horizontal contact, side-by-side faces) on random layouts snapped to a grid, so that
edges meet exactly and within rounding as often as they miss."""

from __future__ import annotations

import random

import pytest

from plystack.core.design.common import side_by_side_joints
from plystack.core.io.library import load_library
from plystack.core.model.plies import Ply
from plystack.core.section.geometry import near_pairs, rectangles_touch
from plystack.core.section.geometry import overlap as _overlap
from plystack.core.section.transformed import analyse


def _layout(seed: int, n: int, step: float) -> list[Ply]:
    rng = random.Random(seed)
    out = []
    for k in range(n):
        w, h = rng.randint(1, 4) * step, rng.randint(1, 6) * step
        x, y = rng.randint(0, 12) * step, rng.randint(0, 12) * step
        if rng.random() < 0.3:  # off the grid by a rounding-sized amount
            x += rng.choice([-1, 1]) * 1e-17
        out.append(Ply(f"p{k}", rng.choice(["DFL-No2", "A36"]), x, y, w, h))
    return out


def _brute(plies: list[Ply], test) -> set[tuple[int, int]]:  # type: ignore[no-untyped-def]
    return {(i, j) for i in range(len(plies)) for j in range(i + 1, len(plies))
            if test(plies[i], plies[j])}


@pytest.mark.parametrize("seed", range(12))
@pytest.mark.parametrize("step", [0.0254 / 8, 0.1, 3.0])
def test_sweep_keeps_every_pair_of_each_exact_test(seed: int, step: float) -> None:
    plies = _layout(seed, 40, step)
    for tol in (0.0, 1e-9 * step, 1e-7 * step, 0.5 * step):
        pairs = set(near_pairs(plies, tol))
        touch = _brute(plies, lambda a, b, t=tol: rectangles_touch(a, b, t))
        assert touch <= pairs
        assert _brute(plies, _overlap) <= pairs
        # nothing far apart is offered: each rectangle is grown by 2 tol plus rounding
        margin = 4 * tol + 1e-9 * (1 + 20 * step)
        assert pairs <= _brute(plies, lambda a, b, m=margin: rectangles_touch(a, b, m))


def test_single_and_no_ply() -> None:
    assert near_pairs([], 1.0) == []
    assert near_pairs([Ply("a", "A36", 0.0, 0.0, 1.0, 1.0)], 1.0) == []


def _joints_by_pair_loop(section):  # type: ignore[no-untyped-def]
    """The joints as the plain loop over every pair finds them (the former code)."""
    tol = section.depth * 1e-7
    out = []
    for i, (ply, mat) in enumerate(zip(section.plies, section.materials, strict=True)):
        if mat.kind != "steel" or section.area[i] <= 0:
            continue
        left = right = None
        for j, (other, om) in enumerate(zip(section.plies, section.materials, strict=True)):
            if om.kind != "timber" or section.area[j] <= 0:
                continue
            if min(ply.top, other.top) - max(ply.y, other.y) <= tol:
                continue
            if abs(other.x + other.width - ply.x) <= tol:
                left = j
            elif abs(ply.x + ply.width - other.x) <= tol:
                right = j
        timbers = tuple(j for j in (left, right) if j is not None)
        if timbers:
            out.append((i, timbers, len(timbers) == 2))
    return out


@pytest.mark.parametrize("seed", range(8))
def test_joints_and_interfaces_match_the_pair_loop(seed: int) -> None:
    rng = random.Random(seed)
    step = 0.0254 / 4
    plies, x = [], 0.0
    for k in range(30):  # side by side, some stacked on top, some shorter
        w = rng.randint(1, 6) * step
        kind = "A36" if rng.random() < 0.4 else "DFL-No2"
        y = rng.choice([0.0, step])
        h = rng.randint(8, 12) * step
        plies.append(Ply(f"p{k}", kind, x, y, w, h))
        if rng.random() < 0.3:
            plies.append(Ply(f"c{k}", "A36", x, y + h, w, step))
        x += w
    section = analyse(plies, load_library())
    found = [(j.steel, j.timbers, j.steel_is_main) for j in side_by_side_joints(section)]
    assert found == _joints_by_pair_loop(section)
    assert found  # the layout does have joints
    for face in section.interfaces:
        for i, j in face.pairs:
            assert abs(plies[i].top - plies[j].y) <= 1e-9 * step * 12
    tops = {(i, j) for i in range(len(plies)) for j in range(len(plies))
            if i != j and plies[i].top == plies[j].y
            and min(plies[i].x + plies[i].width, plies[j].x + plies[j].width)
            - max(plies[i].x, plies[j].x) > 1e-6}
    assert tops == {p for face in section.interfaces for p in face.pairs}
