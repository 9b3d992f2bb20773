"""The stiffness solve of a small mesh in plain Python floats.

On a mesh of a few elements each numpy operation of ``BeamModel.solve`` works on arrays
of a few numbers, and the call itself costs more than the arithmetic. This module does
the same arithmetic element by element on floats: every operation of the array path, in
the same order, on the same operands (the powers of the element lengths are the array
path's own, taken once per mesh by numpy; sums add as numpy's pairwise sum adds), so the
numbers are the same bit for bit (tests/core/test_float_solve.py compares the two).

What numpy does best stays numpy: the 2 x 2 solve of the reactions' equilibrium. The
refinement and the reactions are ``refine``'s in floats, as the array path's.
"""

from __future__ import annotations

import math
from bisect import bisect_left
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

from ..model.member import Load
from .banded import solve_list
from .refine import refined_floats, residuals_floats, window_reactions

#: Most elements a mesh may have for the solve in floats (past this the arrays' own
#: arithmetic is quick enough, and the sums' order below is only written for short rows).
FLOAT_SOLVE_ELEMENTS = 48


def numpy_sum(values: Sequence[float]) -> float:
    """``numpy.sum`` of a short row (fewer than 129 numbers): numpy's pairwise sum, which
    adds from zero one by one below 8 numbers, and in eight running sums from 8 on,
    their total then added to zero (so a row of signed zeros sums to +0.0 either way).
    """
    n = len(values)
    if n < 8:
        total = 0.0
        for v in values:
            total += v
        return total
    if n > 128:
        raise ValueError("numpy_sum: at most 128 numbers")
    r = list(values[:8])
    whole = n - n % 8
    for i in range(8, whole, 8):
        r = [r[j] + values[i + j] for j in range(8)]
    total = ((r[0] + r[1]) + (r[2] + r[3])) + ((r[4] + r[5]) + (r[6] + r[7]))
    for i in range(whole, n):
        total += values[i]
    return 0.0 + total


@dataclass(frozen=True)
class FloatMesh:
    """What the solve in floats reads of a mesh, as lists (the array path's numbers).

    ``le2``, ``le3``: ``lengths**2`` and ``lengths**3`` as numpy takes them (the load
    vectors and equilibrium); ``fp2``, ``fp3``: ``float_power`` of the lengths (statics).
    """

    nodes: list[float]
    le: list[float]
    le2: list[float]
    le3: list[float]
    fp2: list[float]
    fp3: list[float]
    free: list[int]
    scale: list[float]
    support_nodes: list[int]
    fixed_support: list[bool]
    flexibility: list[float] | None
    length: float

    @staticmethod
    def of(nodes: np.ndarray, lengths: np.ndarray, free: np.ndarray, scale: np.ndarray,
           support_nodes: Sequence[int], kinds: Sequence[str],
           flexibility: np.ndarray | None, length: float) -> FloatMesh:
        """The lists of a mesh, the powers taken exactly as the array path takes them."""
        return FloatMesh(
            nodes.tolist(), lengths.tolist(), (lengths**2).tolist(), (lengths**3).tolist(),
            np.float_power(lengths, 2).tolist(), np.float_power(lengths, 3).tolist(),
            free.tolist(), scale.tolist(), [int(n) for n in support_nodes],
            [k == "fixed" for k in kinds],
            None if flexibility is None else flexibility.tolist(), float(length))

    def nearest_node(self, x: float) -> int:
        """``BeamModel.node_indices`` of one finite x (bisection, the lower of a tie)."""
        nodes = self.nodes
        right = min(max(bisect_left(nodes, x), 1), len(nodes) - 1)
        left = right - 1
        return left if abs(nodes[left] - x) <= abs(nodes[right] - x) else right


def plain_inputs(loads: Sequence[Load], extra_line: float) -> bool:
    """True where every number the solve reads of the loads is a finite float (the
    solve in floats is written for those; anything else takes the array path).
    """
    if not math.isfinite(extra_line):
        return False
    for ld in loads:
        if ld.type == "point":
            nums: tuple[object, ...] = (ld.value, ld.at or 0.0)
        else:
            nums = (ld.line_value, ld.line_value_end,
                    0.0 if ld.start is None else ld.start, 0.0 if ld.end is None else ld.end)
        for v in nums:
            if type(v) is not float or not math.isfinite(v):
                return False
    return True


def load_vectors(mesh: FloatMesh, loads: Sequence[Load], extra_line: float
                 ) -> tuple[list[float], list[float], list[float], list[float]]:
    """The element loads q, dq (upward), the nodal point loads F and the consistent
    nodal loads Fe of ``BeamModel.solve``.
    """
    nodes, le, le2, le3 = mesh.nodes, mesh.le, mesh.le2, mesh.le3
    n_el = len(le)
    q_el = [-float(extra_line)] * n_el
    dq_el = [0.0] * n_el
    F = [0.0] * (2 * n_el + 2)
    for ld in loads:  # in load order, one subtraction each (numpy's subtract.at)
        if ld.type == "point":
            F[2 * mesh.nearest_node(float(ld.at or 0.0))] -= ld.value
    L = mesh.length
    for ld in loads:
        if ld.type == "point":
            continue
        a = 0.0 if ld.start is None else ld.start
        b = L if ld.end is None else ld.end
        cover = []
        for e in range(n_el):
            x0, x1 = nodes[e], nodes[e + 1]
            if a <= x0 and b >= x1:
                cover.append(1.0)
            else:  # where not positive the array path's share is never read
                d = min(b, x1) - max(a, x0)
                cover.append(d / le[e] if d > 0.0 else 0.0)
        slope = (ld.line_value_end - ld.line_value) / (b - a)
        for e in range(n_el):
            c = cover[e]
            if c > 0:
                q_el[e] -= (ld.line_value + (nodes[e] - a) * slope) * c
                dq_el[e] -= slope * c
    Fe = [0.0] * (2 * n_el + 2)
    for e in range(n_el):
        Fe[2 * e] += q_el[e] * le[e] / 2 + dq_el[e] * 3 * le2[e] / 20
    for e in range(n_el):
        Fe[2 * e + 1] += q_el[e] * le2[e] / 12 + dq_el[e] * le3[e] / 30
    for e in range(n_el):
        Fe[2 * e + 2] += q_el[e] * le[e] / 2 + dq_el[e] * 7 * le2[e] / 20
    for e in range(n_el):
        Fe[2 * e + 3] += -q_el[e] * le2[e] / 12 - dq_el[e] * le3[e] / 20
    return q_el, dq_el, F, Fe


def solve_floats(mesh: FloatMesh, windows: list[tuple[int, int, int, int]],
                 factor: list[list[float]], w: int, loads: Sequence[Load],
                 extra_line: float) -> np.ndarray:
    """``BeamModel.solve`` in floats: the numbers of its ``CaseSolution.data``."""
    q_el, dq_el, F, Fe = load_vectors(mesh, loads, extra_line)
    total = [f + g for f, g in zip(F, Fe, strict=True)]
    scale = mesh.scale
    solved = solve_list(factor, [total[i] * s for i, s in zip(mesh.free, scale, strict=True)],
                        w)
    u = [0.0] * len(total)
    for i, s, x in zip(mesh.free, scale, solved, strict=True):
        u[i] = s * x
    le, flex = mesh.le, mesh.flexibility
    refined_floats(u, mesh.free, scale, lambda v: residuals_floats(le, flex, v, total),
                   lambda b: solve_list(factor, b, w))
    reactions = window_reactions(windows, le, flex, u, total)
    R = residuals_floats(le, flex, u, total) if any(mesh.fixed_support) else None
    moments = [0.0 - R[2 * n + 1] if R is not None and fixed else 0.0  # K u - f
               for n, fixed in zip(mesh.support_nodes, mesh.fixed_support, strict=True)]
    point = [-F[i] for i in range(0, len(F), 2)]
    _restore_equilibrium(mesh, reactions, moments, point, q_el, dq_el)
    node_force = [p * -1.0 for p in point]
    node_couple = [0.0] * len(point)
    for k, n in enumerate(mesh.support_nodes):
        node_force[n] += reactions[k]
        node_couple[n] += moments[k]
    V0, M0 = _statics(mesh, node_force, node_couple, q_el, dq_el)
    parts = V0 + M0 + q_el + dq_el
    if mesh.flexibility is not None:
        parts += [q * f for q, f in zip(q_el, mesh.flexibility, strict=True)]
        parts += [d * f for d, f in zip(dq_el, mesh.flexibility, strict=True)]
    return np.array(parts + u + reactions + moments, dtype=float)


def _restore_equilibrium(mesh: FloatMesh, reactions: list[float], moments: list[float],
                         point: list[float], q_el: list[float], dq_el: list[float]) -> None:
    """``BeamModel._restore_equilibrium`` in floats (in place)."""
    xs, le, le2, le3 = mesh.nodes, mesh.le, mesh.le2, mesh.le3
    n_el = len(le)
    force = [q_el[e] * le[e] + dq_el[e] * le2[e] / 2 for e in range(n_el)]
    moment = [q_el[e] * le[e] * (xs[e] + le[e] / 2)
              + dq_el[e] * (xs[e] * le2[e] / 2 + le3[e] / 3) for e in range(n_el)]
    down = numpy_sum(point) - numpy_sum(force)
    arm = numpy_sum([p * x for p, x in zip(point, xs, strict=True)]) - numpy_sum(moment)
    pos = [xs[n] for n in mesh.support_nodes]
    if len(pos) >= 2:
        i, j = 0, len(pos) - 1
        rest_f = numpy_sum(reactions) - reactions[i] - reactions[j]
        rest_m = (numpy_sum([r * p for r, p in zip(reactions, pos, strict=True)])
                  - reactions[i] * pos[i] - reactions[j] * pos[j])
        rest_m += numpy_sum(moments)
        a = np.array([[1.0, 1.0], [pos[i], pos[j]]])
        b = np.array([down - rest_f, arm - rest_m])
        reactions[i], reactions[j] = np.linalg.solve(a, b).tolist()
    else:
        reactions[0] = down
        moments[0] = arm - reactions[0] * pos[0]


def _statics(mesh: FloatMesh, node_force: list[float], node_couple: list[float],
             q_el: list[float], dq_el: list[float]) -> tuple[list[float], list[float]]:
    """``beam._statics`` in floats: the same two running sums, term by term."""
    le, fp2, fp3 = mesh.le, mesh.fp2, mesh.fp3
    V0, M0 = [], []
    s = 0.0
    for e in range(len(le)):
        s += node_force[e]
        V0.append(s)
        s += q_el[e] * le[e]
        s += dq_el[e] * fp2[e] / 2
    s = 0.0
    for e in range(len(le)):
        s += -node_couple[e]
        M0.append(s)
        s += V0[e] * le[e]
        s += q_el[e] * fp2[e] / 2
        s += dq_el[e] * fp3[e] / 6
    return V0, M0
