"""The deflection roots of an element are sought only where its largest deflection can
be the largest of a search (``actions.extremes._needs_roots``: the bound sum |c_j| le^j of
its polynomial against the largest end deflection of the elements searched with it).
The extremes equal those found with every root sought, bit for bit (regression guard;
the reference is the same module with the pruning off), on a member with many point
loads (many elements per span), for the whole member and segment by segment.
"""

from __future__ import annotations

import numpy as np

from plystack.core.actions import beam as bm
from plystack.core.actions import extremes as ex
from plystack.core.model.member import BeamLayout, Load


def _solutions() -> tuple[bm.BeamModel, list[bm.CaseSolution]]:
    rng = np.random.default_rng(11)
    layout = BeamLayout(spans=(4.2, 3.1), overhang_right=0.9)
    L = layout.length
    loads = [Load(case="L", type="point", value=float(v), at=float(x))
             for v, x in zip(rng.uniform(-200, 2000, 150), rng.uniform(0, L, 150), strict=True)]
    loads.append(Load(case="D", type="line", value=700.0, value_end=1500.0, start=0.4, end=5.0))
    model = bm.BeamModel(layout, loads)
    sols = [model.solve([ld for ld in loads if ld.case == c]) for c in ("L", "D")]
    sols += [s.scaled(1.3) + t for s, t in zip(sols, sols[::-1], strict=True)]
    return model, sols


def test_pruned_extremes_equal_the_full_search() -> None:
    model, sols = _solutions()
    EIs = [2.0e6, 3.5e6, 1.0, 4.0e5]
    n = model.lengths.size
    assert n * len(sols) >= 64
    full = ex._reduce(model, ex._element_values(model, sols, EIs, 0, n), 0, n)
    assert repr(ex.extremes_many(model, sols, EIs)) == repr(full)
    ranges = [(0, n // 3), (n // 3, n // 2), (n // 2, n)]
    every = ex._element_values(model, sols, EIs, 0, n)
    expected = [full] + [ex._reduce(model, every.part(a, b), a, b) for a, b in ranges]
    assert repr(ex.extremes_within(model, sols, EIs, ranges)) == repr(expected)


def test_pruning_leaves_out_elements() -> None:
    """The bound does prune here (most elements cannot hold the largest deflection)."""
    model, sols = _solutions()
    n = model.lengths.size
    le = model.lengths
    stacked = ex._stacked(sols, 0, n)
    U = stacked[6]
    w_c = -ex.w_up_coefficients(U[:, 0:-2:2], U[:, 1:-2:2], U[:, 2::2], U[:, 3::2],
                                stacked[4], stacked[5], le) / 1.0
    need = ex._needs_roots(w_c, le, ex._groups(model, 0, n, [(0, n)]))
    assert 0 < need.sum() < need.size / 2
