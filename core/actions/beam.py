"""Beam actions: supports, loads, and an exact direct-stiffness solution of a prismatic beam.

The member is a straight Euler-Bernoulli beam of constant EI. Positions x run from the
left end of the member (the tip of a left overhang, where there is one). Loads are
positive downward (gravity). Results: upward reactions positive; sagging moment
positive; shear V(x) = sum of upward forces left of x; deflection positive downward.

Every load either acts at a node (point loads) or is uniform or linearly varying over
whole elements (line and area loads, with nodes at their ends), so the stiffness solution
with consistent load vectors is exact at the nodes, and shear, moment (by statics inside
each element) and deflection (Hermite shape functions plus the particular solution of
the clamped element, q x^2 (L - x)^2 / 24 for the uniform part and
dq (x^5 / 120 - L^2 x^3 / 40 + L^3 x^2 / 60) for the linear part q(x) = q + dq x, divided
by EI) are exact everywhere.

A member whose plies stop short of its ends has a stepped stiffness: the model is then
built with the EI of each segment (nodes at every step, each element at its own EI) and
its solutions are true deflections (solve with the segment EIs, read with EI = 1); the
particular solution of each element is divided by that element's EI (``wq``, ``wdq``).
Statically indeterminate members redistribute their moments by the stepped stiffness.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass
from typing import Any

import numpy as np

from ..model.errors import Problem, ProjectError
from ..model.member import MERGE_TOLERANCE, BeamLayout, Load, validate_layout
from .banded import BEAM_HALF_BANDWIDTH, cholesky_band, solve_with_factor
from .float_solve import FLOAT_SOLVE_ELEMENTS, FloatMesh, plain_inputs, solve_floats


class CaseSolution:
    """Exact solution of one load (or load set) for EI = 1.

    Per element e from ``nodes[e]`` to ``nodes[e+1]``, with x local and the load
    q(x) = q + dq x upward positive: V(x) = V0 + q x + dq x^2 / 2,
    M(x) = M0 + V0 x + q x^2 / 2 + dq x^3 / 6, deflection (downward positive) =
    -(Hermite(v1, t1, v2, t2) + particular solution) / EI (see the module docstring).

    The numbers are kept in one array (``data``: V0, M0, q, dq, then wq and wdq where
    present, u, reactions, reaction moments), so that scaling and adding solutions, and
    stacking many of them, are one operation each; every field is a read-only view.
    Solutions are never changed in place.
    """

    __slots__ = ("__weakref__", "_e", "_s", "_w", "data")

    data: np.ndarray
    _e: int
    _s: int
    _w: bool

    def __init__(self, V0: np.ndarray, M0: np.ndarray, q: np.ndarray, u: np.ndarray,
                 reactions: np.ndarray, reaction_moments: np.ndarray, dq: np.ndarray,
                 wq: np.ndarray | None = None, wdq: np.ndarray | None = None):
        w = wq is not None or wdq is not None
        parts = [V0, M0, q, dq]
        if w:
            parts += [q if wq is None else wq, dq if wdq is None else wdq]
        parts += [u, reactions, reaction_moments]
        data = np.concatenate([np.asarray(a, dtype=float).reshape(-1) for a in parts])
        self._set(data, len(V0), len(reactions), w)

    def _set(self, data: np.ndarray, e: int, s: int, w: bool) -> None:
        data.setflags(write=False)
        self.data, self._e, self._s, self._w = data, e, s, w

    @classmethod
    def _of(cls, data: np.ndarray, e: int, s: int, w: bool) -> CaseSolution:
        out = cls.__new__(cls)
        out._set(data, e, s, w)
        return out

    @property
    def V0(self) -> np.ndarray:
        """Shear at the start of each element, N."""
        return self.data[: self._e]

    @property
    def M0(self) -> np.ndarray:
        """Moment at the start of each element, N m."""
        return self.data[self._e : 2 * self._e]

    @property
    def q(self) -> np.ndarray:
        """Upward line load at the start of each element, N/m."""
        return self.data[2 * self._e : 3 * self._e]

    @property
    def dq(self) -> np.ndarray:
        """Slope of the upward line load along each element, N/m^2."""
        return self.data[3 * self._e : 4 * self._e]

    @property
    def wq(self) -> np.ndarray | None:
        """The line load q divided by each element's EI on a stepped member, else None."""
        return self.data[4 * self._e : 5 * self._e] if self._w else None

    @property
    def wdq(self) -> np.ndarray | None:
        """The slope dq divided by each element's EI on a stepped member, else None."""
        return self.data[5 * self._e : 6 * self._e] if self._w else None

    def _offset(self) -> int:
        return (6 if self._w else 4) * self._e

    @property
    def u(self) -> np.ndarray:
        """Nodal deflections and rotations (v, theta per node, upward), for EI = 1."""
        k = self._offset()
        return self.data[k : k + 2 * self._e + 2]

    @property
    def reactions(self) -> np.ndarray:
        """Upward reaction of every support, N."""
        k = self._offset() + 2 * self._e + 2
        return self.data[k : k + self._s]

    @property
    def reaction_moments(self) -> np.ndarray:
        """Moment reaction of every support (zero where pinned), N m."""
        k = self._offset() + 2 * self._e + 2 + self._s
        return self.data[k : k + self._s]

    def __repr__(self) -> str:
        return (f"CaseSolution(V0={self.V0!r}, M0={self.M0!r}, q={self.q!r}, u={self.u!r}, "
                f"reactions={self.reactions!r}, reaction_moments={self.reaction_moments!r}, "
                f"dq={self.dq!r}, wq={self.wq!r}, wdq={self.wdq!r})")

    def deflection_loads(self) -> tuple[np.ndarray, np.ndarray]:
        """The loads of each element's particular deflection: q and dq divided by the
        element's EI on a stepped member, q and dq themselves otherwise.
        """
        if self._w:
            return self.data[4 * self._e : 5 * self._e], self.data[5 * self._e : 6 * self._e]
        return self.q, self.dq

    def _with_deflection_loads(self) -> CaseSolution:
        """The same solution with wq and wdq kept (equal to q and dq where absent)."""
        if self._w:
            return self
        e, d = self._e, self.data
        return CaseSolution._of(np.concatenate([d[: 4 * e], d[2 * e : 4 * e], d[4 * e :]]),
                                e, self._s, True)

    def scaled(self, factor: float) -> CaseSolution:
        """Return this solution times ``factor`` (the beam is linear); itself for 1 (the
        same numbers: x * 1.0 is x).
        """
        if factor == 1.0:
            return self
        return CaseSolution._of(self.data * factor, self._e, self._s, self._w)

    def __add__(self, other: CaseSolution) -> CaseSolution:
        a, b = self, other
        if a._w != b._w:  # one stepped: the other's deflection loads are its q and dq
            a, b = a._with_deflection_loads(), b._with_deflection_loads()
        return CaseSolution._of(a.data + b.data, a._e, a._s, a._w)


#: Most nodes a member's mesh may have: its stiffness matrix is held whole (n^2 numbers
#: for n degrees of freedom, 200 MB at this many nodes), so the limit keeps a file with
#: thousands of point loads from exhausting a normal computer's memory.
MAX_NODES = 2_500


class BeamModel:
    """Mesh and stiffness of a member for a given layout and set of load positions.

    Build once per layout and set of loads; solve any load for EI = 1 and scale. With
    ``steps`` ((from, to, EI) of each segment, m and N m^2) the stiffness is stepped: a
    node at every step, each element at its segment's EI, and solutions in true units.
    """

    def __init__(self, layout: BeamLayout, loads: tuple[Load, ...] | list[Load],
                 steps: Sequence[tuple[float, float, float]] = ()):
        problems = validate_layout(layout)
        if problems:
            raise ProjectError(problems)
        self.layout = layout
        L = layout.length
        pts = {0.0, L, *layout.support_positions()}
        for ld in loads:
            if ld.type == "point" and ld.at is not None:
                pts.add(min(max(ld.at, 0.0), L))
            else:
                pts.add(0.0 if ld.start is None else min(max(ld.start, 0.0), L))
                pts.add(L if ld.end is None else min(max(ld.end, 0.0), L))
        for a, b, _ in steps:
            pts.update((min(max(a, 0.0), L), min(max(b, 0.0), L)))
        nodes = np.array(sorted(pts))
        keep = np.concatenate([[True], np.diff(nodes) > MERGE_TOLERANCE * max(L, 1.0)])
        self.nodes = nodes[keep]
        self.nodes[-1] = L
        if self.nodes.size > MAX_NODES:  # the stiffness matrix is held whole (K @ u)
            raise ProjectError(Problem(
                "beam.loads", f"need the member cut at {self.nodes.size:,} points (every "
                "point load, every end of a partial load, every support and ply end); "
                f"Plystack analyses at most {MAX_NODES:,}: combine loads that stand close "
                "together, for example into a line load"))
        self.lengths = np.diff(self.nodes)
        #: 1 / EI of every element on a stepped member (None: EI = 1 throughout).
        self.flexibility = _element_flexibility(self.nodes, steps) if steps else None
        n_dof = 2 * self.nodes.size
        K = np.zeros((n_dof, n_dof))
        for e, le in enumerate(self.lengths):
            k_e = _element_stiffness(le)
            if self.flexibility is not None:
                k_e = k_e / self.flexibility[e]
            K[2 * e : 2 * e + 4, 2 * e : 2 * e + 4] += k_e
        self.K = K
        fixed = []
        self.support_nodes = []
        for xs, kind in zip(layout.support_positions(), layout.support_kinds(), strict=True):
            node = int(np.argmin(np.abs(self.nodes - xs)))
            self.support_nodes.append(node)
            fixed.append(2 * node)
            if kind == "fixed":
                fixed.append(2 * node + 1)
        self.fixed = np.array(sorted(fixed))
        is_free = np.ones(n_dof, dtype=bool)
        is_free[self.fixed] = False
        self.free = np.flatnonzero(is_free)  # ascending, as setdiff1d (without numpy.ma)
        # symmetric diagonal scaling: short elements next to long ones make K badly scaled
        free = self.free
        self._scale = 1.0 / np.sqrt(K[free, free])
        # the band of the scaled free-dof matrix, diagonal by diagonal (entry (j + k, j)
        # is K[free[j + k], free[j]] * (scale[j + k] * scale[j])), factored once
        self._w = min(BEAM_HALF_BANDWIDTH, max(free.size - 1, 0))
        diagonals = [(K[free[k:], free[: free.size - k]]
                      * (self._scale[k:] * self._scale[: free.size - k])).tolist()
                     for k in range(self._w + 1)]
        self._factor: list[list[float]] | None
        try:
            self._factor = cholesky_band(diagonals, free.size, self._w)
        except np.linalg.LinAlgError:
            self._factor = None  # rounding defeats the banded factor: LU in solve
        #: The mesh as lists for the solve in floats (a few elements, banded factor).
        self._floats = (FloatMesh.of(self.nodes, self.lengths, free, self._scale,
                                     self.support_nodes, layout.support_kinds(),
                                     self.flexibility, L)
                        if self._factor is not None
                        and self.lengths.size <= FLOAT_SOLVE_ELEMENTS else None)
        regions = layout.regions()
        mids = (self.nodes[:-1] + self.nodes[1:]) / 2
        #: The named region (span, overhang) of every element.
        self.element_regions = tuple(
            next((n for n, a, b in regions if a <= m <= b), "member") for m in mids)

    def _restore_equilibrium(self, reactions: np.ndarray, moments: np.ndarray,
                             point: np.ndarray, q_el: np.ndarray, dq_el: np.ndarray) -> None:
        """Make the reactions satisfy overall equilibrium exactly (in place).

        The stiffness solution meets equilibrium only to round-off, which grows with very
        short elements; two reaction components (the outermost vertical reactions, or
        the force and moment of a single fixed support) are re-solved by statics.
        """
        xs = self.nodes
        le = self.lengths
        x0 = xs[:-1]
        # resultant and first moment of q + dq s over each element (s local)
        force = q_el * le + dq_el * le**2 / 2
        moment = q_el * le * (x0 + le / 2) + dq_el * (x0 * le**2 / 2 + le**3 / 3)
        down = float(point.sum() - force.sum())
        arm = float((point * xs).sum() - moment.sum())
        pos = np.array([xs[n] for n in self.support_nodes])
        if len(self.support_nodes) >= 2:
            i, j = 0, len(self.support_nodes) - 1
            rest_f = reactions.sum() - reactions[i] - reactions[j]
            rest_m = (reactions * pos).sum() - reactions[i] * pos[i] - reactions[j] * pos[j]
            rest_m += moments.sum()
            a = np.array([[1.0, 1.0], [pos[i], pos[j]]])
            b = np.array([down - rest_f, arm - rest_m])
            reactions[i], reactions[j] = np.linalg.solve(a, b)
        else:
            reactions[0] = down
            moments[0] = arm - reactions[0] * pos[0]

    def scaled_free_stiffness(self) -> np.ndarray:
        """The stiffness of the free degrees of freedom, scaled symmetrically to a unit
        diagonal (dense; the solve itself keeps only its band).
        """
        kff = self.K[np.ix_(self.free, self.free)]
        return np.asarray(kff * np.outer(self._scale, self._scale))

    def _linear_solve(self, b: np.ndarray) -> np.ndarray:
        """Solve the scaled free-dof system: banded Cholesky, or, where rounding makes a
        pivot of that factorisation non-positive (an element a millionth of its
        neighbour's length), the dense LU solve with pivoting, which raises on a singular
        system (a mechanism).
        """
        if self._factor is not None:
            return solve_with_factor(self._factor, b, self._w)
        return np.asarray(np.linalg.solve(self.scaled_free_stiffness(), b))

    def node_index(self, x: float) -> int:
        """Index of the node nearest to ``x``."""
        return int(np.argmin(np.abs(self.nodes - x)))

    def node_indices(self, xs: np.ndarray) -> np.ndarray:
        """Index of the node nearest to each of ``xs``: :meth:`node_index` of each (the
        lower of two equally near nodes), found by bisection of the sorted nodes.
        """
        nodes = self.nodes
        if nodes.size == 1:
            return np.zeros(xs.shape, dtype=int)
        right = np.clip(np.searchsorted(nodes, xs), 1, nodes.size - 1)
        left = right - 1
        return np.where(np.abs(nodes[left] - xs) <= np.abs(nodes[right] - xs), left, right)

    def solve(self, loads: list[Load] | tuple[Load, ...], extra_line: float = 0.0) -> CaseSolution:
        """Solve for the given loads (downward positive) with EI = 1.

        On a mesh of a few elements the same arithmetic is done in plain floats
        (``float_solve``: the same numbers, quicker than numpy on rows this short).

        Args:
            loads: loads of one case (or any set).
            extra_line: a uniform downward line load over the whole member, N/m
                (self-weight).

        """
        if self._floats is not None and self._factor is not None and plain_inputs(
                loads, extra_line):
            data = solve_floats(self._floats, self.K, self._factor, self._w, loads,
                                extra_line)
            return CaseSolution._of(data, self.lengths.size, len(self.support_nodes),
                                    self.flexibility is not None)
        return self.solve_arrays(loads, extra_line)

    def solve_arrays(self, loads: list[Load] | tuple[Load, ...],
                     extra_line: float = 0.0) -> CaseSolution:
        """:meth:`solve` with numpy's arrays, on any mesh."""
        n_el = self.lengths.size
        q_el = np.full(n_el, -float(extra_line))  # upward positive, at each element's start
        dq_el = np.zeros(n_el)  # slope of the upward load along each element
        F = np.zeros(2 * self.nodes.size)
        x0 = self.nodes[:-1]
        L = self.layout.length
        points = [ld for ld in loads if ld.type == "point"]
        if points:  # in load order, as one subtraction each
            at = np.array([float(ld.at or 0.0) for ld in points])
            np.subtract.at(F, 2 * self.node_indices(at), np.array([ld.value for ld in points]))
        for ld in loads:
            if ld.type == "point":
                continue
            a = 0.0 if ld.start is None else ld.start
            b = L if ld.end is None else ld.end
            # share of each element the load covers: 1 inside, a fraction where a load
            # end was merged into a node (keeps the resultant exact)
            x1 = self.nodes[1:]
            cover = np.clip(np.minimum(b, x1) - np.maximum(a, x0), 0.0, None) / self.lengths
            cover = np.where((a <= x0) & (b >= x1), 1.0, cover)
            inside = cover > 0
            slope = (ld.line_value_end - ld.line_value) / (b - a)
            q_el[inside] -= (ld.line_value + (x0[inside] - a) * slope) * cover[inside]
            dq_el[inside] -= slope * cover[inside]
        le = self.lengths
        Fe = np.zeros_like(F)
        # consistent nodal loads of q + dq s: uniform part and linear part (Hermite shapes)
        # (each index once per line, so slices add the same numbers as np.add.at)
        Fe[0 : 2 * n_el : 2] += q_el * le / 2 + dq_el * 3 * le**2 / 20
        Fe[1 : 2 * n_el : 2] += q_el * le**2 / 12 + dq_el * le**3 / 30
        Fe[2 : 2 * n_el + 2 : 2] += q_el * le / 2 + dq_el * 7 * le**2 / 20
        Fe[3 : 2 * n_el + 2 : 2] += -q_el * le**2 / 12 - dq_el * le**3 / 20
        total = F + Fe
        u = np.zeros_like(F)
        rhs = total[self.free]
        u[self.free] = self._scale * self._linear_solve(rhs * self._scale)
        R = self.K @ u - total
        reactions = np.array([R[2 * n] for n in self.support_nodes])
        kinds = self.layout.support_kinds()
        reaction_moments = np.array([
            R[2 * n + 1] if k == "fixed" else 0.0
            for n, k in zip(self.support_nodes, kinds, strict=True)
        ])
        point = -F[0::2]  # downward point loads at nodes
        self._restore_equilibrium(reactions, reaction_moments, point, q_el, dq_el)
        # shear and moment by statics, walking from the left end
        node_force = point.copy() * -1.0
        node_couple = np.zeros(self.nodes.size)
        for k, n in enumerate(self.support_nodes):
            node_force[n] += reactions[k]
            node_couple[n] += reaction_moments[k]
        V0, M0 = _statics(node_force, node_couple, q_el, dq_el, le)
        if self.flexibility is None:
            return CaseSolution(V0, M0, q_el, u, reactions, reaction_moments, dq_el)
        return CaseSolution(V0, M0, q_el, u, reactions, reaction_moments, dq_el,
                            q_el * self.flexibility, dq_el * self.flexibility)




def _statics(node_force: np.ndarray, node_couple: np.ndarray, q_el: np.ndarray,
             dq_el: np.ndarray, le: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Shear and moment at the start of every element by statics, walking from the left
    end: V0[e] = V_end[e-1] + node force, V_end = V0 + q le + dq le^2 / 2; M0[e] =
    M_end[e-1] - node couple, M_end = M0 + V0 le + q le^2 / 2 + dq le^3 / 6.

    Each walk is one running sum (numpy's cumulative sum adds in order) of its terms in
    the order the walk adds them, so every partial sum is the walk's own; the powers are
    taken as the walk took them (``float_power``: a scalar's ``**``).
    """
    n = le.size
    l2, l3 = np.float_power(le, 2), np.float_power(le, 3)
    terms = np.zeros(1 + 3 * n)
    terms[1::3] = node_force[:n]
    terms[2::3] = q_el * le
    terms[3::3] = dq_el * l2 / 2
    V0 = np.cumsum(terms)[1::3]
    terms = np.zeros(1 + 4 * n)
    terms[1::4] = -node_couple[:n]
    terms[2::4] = V0 * le
    terms[3::4] = q_el * l2 / 2
    terms[4::4] = dq_el * l3 / 6
    M0 = np.cumsum(terms)[1::4]
    return V0, M0


def _element_flexibility(nodes: np.ndarray,
                         steps: Sequence[tuple[float, float, float]]) -> np.ndarray:
    """1 / EI of each element: the step holding the element's midpoint."""
    mids = (nodes[:-1] + nodes[1:]) / 2
    out = np.empty(mids.size)
    for e, m in enumerate(mids):
        k = next((j for j, (a, b, _) in enumerate(steps) if a <= m <= b), None)
        if k is None:  # outside every step: the nearest one
            k = int(np.argmin([min(abs(m - a), abs(m - b)) for a, b, _ in steps]))
        out[e] = 1.0 / steps[k][2]
    return out


def _element_stiffness(le: float) -> np.ndarray:
    """Euler-Bernoulli beam element stiffness for EI = 1, dofs (v1, t1, v2, t2)."""
    l2 = le * le
    return np.array([
        [12, 6 * le, -12, 6 * le],
        [6 * le, 4 * l2, -6 * le, 2 * l2],
        [-12, -6 * le, 12, -6 * le],
        [6 * le, 2 * l2, -6 * le, 4 * l2],
    ]) / (l2 * le)


@dataclass(frozen=True)
class Extremes:
    """Extreme actions of one solution (SI). Deflection positive downward."""

    M_max: float
    x_M_max: float
    M_min: float
    x_M_min: float
    V_max_abs: float
    x_V_max_abs: float
    deflection_max_abs: float
    x_deflection_max: float
    deflection_by_region: tuple[tuple[str, float, float], ...]


def element_polynomials(model: BeamModel, sol: CaseSolution,
                        EI: float) -> list[dict[str, np.ndarray]]:
    """Per element, polynomial coefficients (numpy order, highest first, local x) of
    V, M and downward deflection.
    """
    out = []
    for e, le in enumerate(model.lengths):
        v1, t1, v2, t2 = sol.u[2 * e : 2 * e + 4]
        q, dq = sol.q[e], sol.dq[e]
        wq, wdq = (a[e] for a in sol.deflection_loads())
        out.append({
            "V": np.array([dq / 2, q, sol.V0[e]]),
            "M": np.array([dq / 6, q / 2, sol.V0[e], sol.M0[e]]),
            "w": -w_up_coefficients(v1, t1, v2, t2, wq, wdq, le) / EI,
        })
    return out


def w_up_coefficients(v1: Any, t1: Any, v2: Any, t2: Any, q: Any, dq: Any,
                       le: Any, scalar_powers: bool = False) -> np.ndarray:
    """Upward deflection times EI in local x, coefficients highest power (x^5) first,
    on the last axis: Hermite cubic plus the clamped particular solutions
    q x^2 (L - x)^2 / 24 and dq (x^5 / 120 - L^2 x^3 / 40 + L^3 x^2 / 60).
    ``scalar_powers``: le^2 and le^3 of arrays taken as a scalar's ``**`` takes them
    (``float_power``; numpy squares arrays by multiplying, which can differ in the last
    bit), for the same numbers as element-by-element evaluation.
    """
    l2, l3 = ((np.float_power(le, 2), np.float_power(le, 3)) if scalar_powers
              else (le**2, le**3))
    a2 = (3 * (v2 - v1) / le - 2 * t1 - t2) / le
    a3 = (2 * (v1 - v2) / le + t1 + t2) / l2
    p = q / 24
    columns = (dq / 120, p + 0 * dq, a3 - 2 * le * p - dq * l2 / 40,
               a2 + le * le * p + dq * l3 / 60, t1 + 0 * q, v1 + 0 * q)
    out = np.empty((*np.broadcast_shapes(*(np.shape(c) for c in columns)), 6))
    for j, c in enumerate(columns):  # the columns side by side, as numpy's stack puts them
        out[..., j] = c
    return out


def _real_roots_batched(coeffs: np.ndarray, le: np.ndarray) -> np.ndarray:
    """Real roots inside (0, le) of per-row polynomials (n, d + 1), highest power first.

    Returns (n, d) local positions, NaN where there is no root. Each row is scaled to
    t = x / le and normalised, so negligible leading terms are treated as zero; rows are
    grouped by their true degree and solved by the eigenvalues of companion matrices.
    """
    n, d1 = coeffs.shape
    d = d1 - 1
    out = np.full((n, d), np.nan)
    scaled = coeffs * le[:, None] ** np.arange(d, -1, -1)
    big = np.abs(scaled).max(axis=1)
    ok = np.isfinite(big) & (big > 0)
    scaled = np.where(ok[:, None], scaled / np.where(ok, big, 1.0)[:, None], 0.0)
    scaled = np.where(np.abs(scaled) < 1e-12, 0.0, scaled)
    nonzero = scaled != 0
    lead = np.where(nonzero.any(axis=1), np.argmax(nonzero, axis=1), d1)
    degree = d - lead
    for deg in sorted({g for g in degree[ok].tolist() if g >= 1}):  # the degrees present
        k = np.flatnonzero(ok & (degree == deg))
        c = scaled[k, d - deg:]
        if deg == 1:
            roots = (-c[:, 1] / c[:, 0])[:, None].astype(complex)
        else:
            comp = np.zeros((k.size, deg, deg))
            comp[:, 0, :] = -c[:, 1:] / c[:, :1]
            comp[:, np.arange(1, deg), np.arange(deg - 1)] = 1.0
            roots = np.linalg.eigvals(comp)
        real = (np.abs(roots.imag) < 1e-9) & (roots.real > 0) & (roots.real < 1)
        out[k, :deg] = np.where(real, roots.real, np.nan)
    return np.asarray(out * le[:, None])


def extremes(model: BeamModel, sol: CaseSolution, EI: float) -> Extremes:
    """True extrema of M, |V| and deflection, found from each element's polynomials."""
    return extremes_many(model, [sol], [EI])[0]


def extremes_many(model: BeamModel, sols: Sequence[CaseSolution],
                  EIs: Sequence[float] | np.ndarray,
                  elements: tuple[int, int] | None = None) -> list[Extremes]:
    """Extremes of many solutions on one mesh at once (vectorised over solutions and
    elements): moment at element ends and where V = 0, |V| at element ends, deflection
    at element ends and at the real roots of its derivative inside each element.
    ``elements`` (first, last + 1) limits the search to those elements (a segment).
    """
    e0, e1 = (0, model.lengths.size) if elements is None else elements
    distinct, stiffness, back = _distinct(sols, EIs)
    ext = _reduce(model, _element_values(model, distinct, stiffness, e0, e1, [(e0, e1)]),
                  e0, e1)
    return ext if back is None else [ext[i] for i in back]


def extremes_within(model: BeamModel, sols: Sequence[CaseSolution],
                    EIs: Sequence[float] | np.ndarray,
                    ranges: Sequence[tuple[int, int]]) -> list[list[Extremes]]:
    """:func:`extremes_many` of the whole member and of each range of elements (first,
    last + 1), from one pass over the elements (each element's candidates are its own).
    """
    n = model.lengths.size
    distinct, stiffness, back = _distinct(sols, EIs)
    values = _element_values(model, distinct, stiffness, 0, n, [(0, n), *ranges])
    out = [_reduce(model, values, 0, n)] + [_reduce(model, values.part(a, b), a, b)
                                            for a, b in ranges]
    return out if back is None else [[ext[i] for i in back] for ext in out]


def _distinct(sols: Sequence[CaseSolution], EIs: Sequence[float] | np.ndarray
              ) -> tuple[Sequence[CaseSolution], Sequence[float] | np.ndarray, list[int] | None]:
    """The distinct (solution, EI) pairs of a batch, by their numbers (a batch asks for
    the same numbers several times: a combination of one case, a total without creep),
    and the distinct pair each asked one is (None where all are distinct). Every
    solution's extremes are found from its own numbers alone, so the same numbers have
    the same extremes.
    """
    stiffness = np.asarray(EIs, dtype=float).reshape(-1).tolist()
    seen: dict[tuple[bytes, int, int, bool, str], int] = {}
    back = [seen.setdefault((s.data.tobytes(), s._e, s._s, s._w, ei.hex()), len(seen))
            for s, ei in zip(sols, stiffness, strict=True)]
    if len(seen) == len(back):
        return sols, EIs, None
    first = [back.index(j) for j in range(len(seen))]
    return [sols[i] for i in first], [stiffness[i] for i in first], back


@dataclass(frozen=True, eq=False)
class _ElementValues:
    """Every solution's candidate extremes in each element (shape (solutions, elements,
    stations)): moments at ``xm`` (valid where ``ok``), |V| at ``xv`` (-1: not a
    candidate), deflections ``w`` at ``xw`` (local positions; ``x0`` the elements' starts).
    """

    x0: np.ndarray
    xm: np.ndarray
    ok: np.ndarray
    m: np.ndarray
    xv: np.ndarray
    v: np.ndarray
    w: np.ndarray
    xw: np.ndarray

    def part(self, a: int, b: int) -> _ElementValues:
        """The values of elements a to b - 1 (of those held)."""
        return _ElementValues(self.x0[a:b], *(arr[:, a:b] for arr in (
            self.xm, self.ok, self.m, self.xv, self.v, self.w, self.xw)))


def _groups(model: BeamModel, e0: int, e1: int,
            ranges: Sequence[tuple[int, int]]) -> np.ndarray:
    """A label for every element of e0 to e1: the same for the elements that share every
    search made over them (each range of elements, and each region within it), so that
    the smallest set of elements any search of an element covers is its label's.
    """
    names = {n_: r for r, (n_, _, _) in enumerate(model.layout.regions())}
    keys = []
    for e in range(e0, e1):
        inside = tuple(k for k, (a, b) in enumerate(ranges) if a <= e < b)
        keys.append((inside, names.get(model.element_regions[e], -1)))
    labels: dict[tuple[tuple[int, ...], int], int] = {}
    return np.array([labels.setdefault(k, len(labels)) for k in keys], dtype=int)


def _needs_roots(w_c: np.ndarray, le: np.ndarray, groups: np.ndarray) -> np.ndarray:
    """Where an element's deflection can be largest inside it: (solutions, elements).

    |w(x)| on the element is at most the sum of |c_j| le^j (its coefficients); where that
    bound (with a margin far above rounding) is below the largest |w| at the element ends
    of its group (the elements every search of this one covers), no point inside it can
    be the largest of any search, and its roots need not be found. Elsewhere (and where
    the numbers are not finite) they are.
    """
    k, n = w_c.shape[0], w_c.shape[1]
    powers = le[:, None] ** np.arange(5, -1, -1)
    bound = (np.abs(w_c) * powers).sum(axis=-1) * (1 + 1e-6)
    ends = np.zeros((k, n, 2))
    x = np.stack([np.zeros(n), le], axis=-1)
    for j in range(6):
        ends = ends * x + w_c[..., j : j + 1]
    end_max = np.abs(ends).max(axis=-1)
    top = np.zeros((k, n))
    for g in range(int(groups.max()) + 1 if groups.size else 0):  # labels 0, 1, ...
        members = groups == g
        top[:, members] = end_max[:, members].max(axis=1, keepdims=True)
    return np.asarray(~(bound < top))


def _element_values(model: BeamModel, sols: Sequence[CaseSolution],
                    EIs: Sequence[float] | np.ndarray, e0: int, e1: int,
                    searches: Sequence[tuple[int, int]] | None = None) -> _ElementValues:
    """Every element's candidates; ``searches``: the ranges of elements whose extremes
    will be sought (each with its regions), which lets the deflection roots be left out
    where no search can find its largest deflection (None: every root is sought).
    """
    le = model.lengths[e0:e1]
    x0 = model.nodes[e0:e1]
    k, n = len(sols), le.size
    V0, M0, q, dq, wq, wdq, U = _stacked(sols, e0, e1)
    EI = np.asarray(EIs, dtype=float).reshape(k, 1)
    le_k = np.tile(le, k)
    v1, t1, v2, t2 = U[:, 0:-2:2], U[:, 1:-2:2], U[:, 2::2], U[:, 3::2]
    w_c = -w_up_coefficients(v1, t1, v2, t2, wq, wdq, le) / EI[..., None]
    dw = w_c[..., :5] * np.array([5.0, 4.0, 3.0, 2.0, 1.0])
    # the roots of V = V0 + q x + dq x^2 / 2 (moment) and of the deflection's derivative
    # inside each element, in one search (V's rows led by zeros: the same degree)
    need = (None if searches is None or k * n < 64  # else only where the largest
            else _needs_roots(w_c, le, _groups(model, e0, e1, searches)).reshape(k * n))
    v_rows = np.concatenate([np.zeros((k * n, 2)),
                             np.stack([dq / 2, q, V0], axis=-1).reshape(k * n, 3)], axis=1)
    w_rows = dw.reshape(k * n, 5)
    found = _real_roots_batched(
        np.concatenate([v_rows, w_rows if need is None else w_rows[need]]),
        np.concatenate([le_k, le_k if need is None else le_k[need]]))
    v_roots = found[: k * n, :2].reshape(k, n, 2)
    if need is None:
        roots = found[k * n :].reshape(k, n, 4)
    else:  # deflection roots only where the largest deflection of a search can be inside
        flat = np.full((k * n, 4), np.nan)
        flat[need] = found[k * n :]
        roots = flat.reshape(k, n, 4)
    # moment: element ends and where V = 0 inside the element (roots are finite or NaN,
    # so NaN -> 0 is numpy's nan_to_num of them)
    no_root = np.isnan(v_roots)
    xm = _ends_and(le, np.where(no_root, 0.0, v_roots))
    ok = np.ones((k, n, 4), dtype=bool)
    ok[..., 2:] = ~no_root
    m = (M0[..., None] + V0[..., None] * xm + q[..., None] * xm**2 / 2
         + dq[..., None] * xm**3 / 6)
    # |V|: element ends and where dV/dx = q + dq x = 0
    with np.errstate(divide="ignore", invalid="ignore"):
        xv_in = np.where(dq != 0, -q / dq, np.nan)
    inside = (xv_in > 0) & (xv_in < le)
    xv_loc = _ends_and(le, np.where(inside, xv_in, 0.0)[..., None])
    v_all = V0[..., None] + q[..., None] * xv_loc + dq[..., None] * xv_loc**2 / 2
    candidate = np.ones((k, n, 3), dtype=bool)
    candidate[..., 2] = inside
    v = np.where(candidate, np.abs(v_all), -1.0)
    no_root = np.isnan(roots)
    xw_safe = _ends_and(le, np.where(no_root, 0.0, roots))
    w = np.zeros_like(xw_safe)
    for j in range(6):
        w = w * xw_safe + w_c[..., j : j + 1]
    w[..., 2:] = np.where(no_root, 0.0, w[..., 2:])
    return _ElementValues(x0, xm, ok, m, xv_loc, v, w, xw_safe)


def _ends_and(le: np.ndarray, inner: np.ndarray) -> np.ndarray:
    """Local stations (solutions, elements, 2 + inner): 0, the element's length, then
    ``inner``.
    """
    out = np.empty((*inner.shape[:-1], inner.shape[-1] + 2))
    out[..., 0] = 0.0
    out[..., 1] = le
    out[..., 2:] = inner
    return out


def _reduce(model: BeamModel, values: _ElementValues, e0: int, e1: int) -> list[Extremes]:
    """The extremes of every solution over the elements ``values`` holds (e0 to e1)."""
    x0, xm, m, xv_loc = values.x0, values.xm, values.m, values.xv
    k = m.shape[0]
    i_max = np.argmax(np.where(values.ok, m, -np.inf).reshape(k, -1), axis=1)
    i_min = np.argmin(np.where(values.ok, m, np.inf).reshape(k, -1), axis=1)
    v = values.v.reshape(k, -1)
    i_v = np.argmax(v, axis=1)
    w = values.w
    aw = np.abs(w)
    i_w = np.argmax(aw.reshape(k, -1), axis=1)
    pos_w = x0[None, :, None] + values.xw
    by_region = _by_region(model, e0, e1, aw, w, pos_w)
    out = []
    xm_flat = (x0[None, :, None] + xm).reshape(k, -1)
    xv_flat = (x0[None, :, None] + xv_loc).reshape(k, -1)
    m_hi = np.take_along_axis(m.reshape(k, -1), i_max[:, None], axis=1)[:, 0].tolist()
    m_lo = np.take_along_axis(m.reshape(k, -1), i_min[:, None], axis=1)[:, 0].tolist()
    rows = np.arange(k)  # each solution's value at its own index, all at once
    x_hi, x_lo = xm_flat[rows, i_max].tolist(), xm_flat[rows, i_min].tolist()
    v_top, x_v = v[rows, i_v].tolist(), xv_flat[rows, i_v].tolist()
    w_top = aw.reshape(k, -1)[rows, i_w].tolist()
    x_w = pos_w.reshape(k, -1)[rows, i_w].tolist()
    for c in range(k):
        m_max, m_min = m_hi[c], m_lo[c]
        scale = max(abs(m_max), abs(m_min), 1e-300)
        if abs(m_max) < 1e-9 * scale:
            m_max = 0.0
        if abs(m_min) < 1e-9 * scale:
            m_min = 0.0
        out.append(Extremes(
            M_max=m_max, x_M_max=x_hi[c], M_min=m_min, x_M_min=x_lo[c],
            V_max_abs=v_top[c], x_V_max_abs=x_v[c],
            deflection_max_abs=w_top[c], x_deflection_max=x_w[c],
            deflection_by_region=by_region[c]))
    return out


def _stacked(sols: Sequence[CaseSolution], e0: int, e1: int) -> tuple[np.ndarray, ...]:
    """V0, M0, q, dq, wq, wdq (elements e0 to e1) and u (their nodes) of every solution,
    one row each: one stack of the solutions' numbers where they share a layout.
    """
    first = sols[0]
    e, w = first._e, first._w
    if all(s._e == e and s._s == first._s and s._w == w for s in sols):
        D = np.stack([s.data for s in sols])
        k = (6 if w else 4) * e

        def cut(a: int, b: int) -> np.ndarray:
            return np.ascontiguousarray(D[:, a:b])
        V0, M0, q, dq = (cut(j * e + e0, j * e + e1) for j in range(4))
        wq, wdq = (cut(4 * e + e0, 4 * e + e1), cut(5 * e + e0, 5 * e + e1)) if w else (q, dq)
        return V0, M0, q, dq, wq, wdq, cut(k + 2 * e0, k + 2 * e1 + 2)
    return (np.stack([s.V0[e0:e1] for s in sols]), np.stack([s.M0[e0:e1] for s in sols]),
            np.stack([s.q[e0:e1] for s in sols]), np.stack([s.dq[e0:e1] for s in sols]),
            np.stack([s.deflection_loads()[0][e0:e1] for s in sols]),
            np.stack([s.deflection_loads()[1][e0:e1] for s in sols]),
            np.stack([s.u[2 * e0 : 2 * e1 + 2] for s in sols]))


def _by_region(model: BeamModel, e0: int, e1: int, aw: np.ndarray, w: np.ndarray,
               pos_w: np.ndarray) -> list[tuple[tuple[str, float, float], ...]]:
    """Per solution, (region, deflection, x) where |deflection| is largest in each region
    (span, overhang) holding elements ``e0`` to ``e1``: the first of the largest in the
    order of the elements and their stations, as one search over the region would find.

    ``aw``, ``w`` and ``pos_w`` have shape (solutions, elements, stations). The elements
    of a region are gathered once; each region's search covers only its own elements, so
    the work grows with the elements, not with elements times regions.
    """
    k = aw.shape[0]
    names = [n_ for n_, _, _ in model.layout.regions()]
    members: dict[int, list[int]] = {}
    for e, region in enumerate(model.element_regions[e0:e1]):
        if region in names:
            members.setdefault(names.index(region), []).append(e)
    rows: list[list[tuple[str, float, float]]] = [[] for _ in range(k)]
    every = np.arange(k)
    for r in sorted(members):
        els = np.array(members[r], dtype=int)
        a_r = aw[:, els].reshape(k, -1)
        j = np.argmax(a_r, axis=1)
        w_r = w[:, els].reshape(k, -1)[every, j].tolist()
        x_r = pos_w[:, els].reshape(k, -1)[every, j].tolist()
        for c in range(k):
            rows[c].append((names[r], w_r[c], x_r[c]))
    return [tuple(row) for row in rows]


@dataclass(frozen=True, eq=False)
class Diagram:
    """Shear, moment and downward deflection sampled along the member (SI).

    Stations include every node from both sides (shear jumps at point loads) and the
    element extrema of moment and deflection.
    """

    x: np.ndarray
    V: np.ndarray
    M: np.ndarray
    deflection: np.ndarray


def diagram(model: BeamModel, sol: CaseSolution, EI: float, per_element: int = 24) -> Diagram:
    """Sample V, M and deflection along the member (load-aware stations)."""
    polys = element_polynomials(model, sol, EI)
    xs, vs, ms, ws = [], [], [], []
    for e, le in enumerate(model.lengths):
        P = polys[e]
        local = list(np.linspace(0.0, le, per_element + 1))
        local.extend(_roots_inside(np.polyder(P["M"]), le))
        local.extend(_roots_inside(np.polyder(P["w"]), le))
        loc = np.array(sorted(local))
        xs.append(model.nodes[e] + loc)
        vs.append(np.polyval(P["V"], loc))
        ms.append(np.polyval(P["M"], loc))
        ws.append(np.polyval(P["w"], loc))
    return Diagram(np.concatenate(xs), np.concatenate(vs), np.concatenate(ms), np.concatenate(ws))


def _roots_inside(poly: np.ndarray, le: float) -> list[float]:
    """Real roots of a polynomial in local x strictly inside (0, le).

    Coefficients are compared on the element's scale (c_k le^k) so that negligible
    leading terms do not produce spurious huge roots.
    """
    poly = np.asarray(poly, dtype=float)
    n = poly.size - 1
    scaled = poly * le ** np.arange(n, -1, -1)
    big = np.abs(scaled).max() if scaled.size else 0.0
    if not np.isfinite(big) or big == 0.0:
        return []
    scaled = np.where(np.abs(scaled) < 1e-12 * big, 0.0, scaled / big)
    scaled = np.trim_zeros(scaled, "f")
    if scaled.size < 2:
        return []
    out = []
    for r in np.roots(scaled):
        if abs(r.imag) < 1e-9 and 0 < r.real < 1:
            out.append(float(r.real) * le)
    return out


def moment_at(model: BeamModel, sol: CaseSolution, x: float) -> float:
    """The bending moment of ``sol`` at ``x`` (m from the left end), N m."""
    e = min(max(int(np.searchsorted(model.nodes, x, side="right")) - 1, 0),
            model.lengths.size - 1)
    s = x - float(model.nodes[e])
    d, n = sol.data, sol._e  # V0, M0, q, dq side by side (see CaseSolution)
    return float(d[n + e] + d[e] * s + d[2 * n + e] * s**2 / 2 + d[3 * n + e] * s**3 / 6)


def combine(solutions: Mapping[str, CaseSolution],
            factors: Mapping[str, float]) -> CaseSolution | None:
    """Linear combination of case solutions; None when no case is present."""
    out: CaseSolution | None = None
    for case, f in factors.items():
        if case in solutions and f != 0:
            s = solutions[case].scaled(f)
            out = s if out is None else out + s
    return out
