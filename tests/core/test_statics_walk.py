"""The beam's statics walk and nearest-node search, vectorised in actions.beam, against
the plain walk element by element written out here (V0[e] = V_end[e-1] + node force,
M0[e] = M_end[e-1] - node couple; common practice: shear and moment by statics from the
left end) and numpy's argmin of the distances: the same numbers bit for bit.
"""

from __future__ import annotations

import numpy as np
import pytest

from plystack.core.actions.beam import BeamModel, _statics
from plystack.core.model.member import BeamLayout


def _walk(force: np.ndarray, couple: np.ndarray, q: np.ndarray, dq: np.ndarray,
          le: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    V0, M0 = np.empty(le.size), np.empty(le.size)
    v_end = m_end = 0.0
    for e in range(le.size):
        V0[e] = v_end + force[e]
        M0[e] = m_end - couple[e]
        v_end = V0[e] + q[e] * le[e] + dq[e] * le[e] ** 2 / 2
        m_end = M0[e] + V0[e] * le[e] + q[e] * le[e] ** 2 / 2 + dq[e] * le[e] ** 3 / 6
    return V0, M0


@pytest.mark.parametrize("seed", range(6))
def test_statics_equals_the_walk_bit_for_bit(seed: int) -> None:
    rng = np.random.default_rng(seed)
    n = int(rng.integers(1, 400))
    le = rng.uniform(1e-3, 3.0, n)
    force, couple = rng.normal(0, 1e4, n + 1), rng.normal(0, 1e3, n + 1)
    couple[rng.random(n + 1) < 0.7] = 0.0
    q, dq = rng.normal(0, 5e3, n), rng.normal(0, 1e3, n)
    V0, M0 = _statics(force, couple, q, dq, le)
    V_ref, M_ref = _walk(force, couple, q, dq, le)
    assert V0.tobytes() == V_ref.tobytes()
    assert M0.tobytes() == M_ref.tobytes()


def test_nearest_nodes_equal_argmin() -> None:
    model = BeamModel(BeamLayout(spans=(3.0, 4.5), overhang_left=0.6), [])
    rng = np.random.default_rng(3)
    xs = np.concatenate([rng.uniform(-1.0, 9.0, 500), model.nodes,
                         (model.nodes[:-1] + model.nodes[1:]) / 2])  # exact ties too
    expected = [int(np.argmin(np.abs(model.nodes - x))) for x in xs]
    assert model.node_indices(xs).tolist() == expected
