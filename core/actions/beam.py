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

import numpy as np

from ..model.errors import Problem, ProjectError
from ..model.member import MERGE_TOLERANCE, BeamLayout, Load, validate_layout
from .banded import BEAM_HALF_BANDWIDTH, cholesky_band, solve_with_factor
from .float_solve import FLOAT_SOLVE_ELEMENTS, FloatMesh, plain_inputs, solve_floats
from .refine import Unsettled, refined, residuals, support_windows, window_reactions
from .stiffness import scaled_diagonals, stiffness_band


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


#: Most nodes a member's mesh may have: the stiffness is held as its band, but where
#: rounding defeats the banded factor the solve falls back on the whole matrix (n^2
#: numbers for n degrees of freedom, 200 MB at this many nodes), so the limit keeps a file
#: with thousands of point loads from exhausting a normal computer's memory.
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
        if self.nodes.size > MAX_NODES:  # see MAX_NODES
            raise ProjectError(Problem(
                "beam.loads", f"need the member cut at {self.nodes.size:,} points (every "
                "point load, every end of a partial load, every support and ply end); "
                f"Plystack analyses at most {MAX_NODES:,}: combine loads that stand close "
                "together, for example into a line load"))
        self.lengths = np.diff(self.nodes)
        #: 1 / EI of every element on a stepped member (None: EI = 1 throughout).
        self.flexibility = _element_flexibility(self.nodes, steps) if steps else None
        n_dof = 2 * self.nodes.size
        #: The stiffness's lower band: ``band[d, i]`` is the entry (i + d, i), d = 0..3.
        self.band = stiffness_band(self.lengths, self.flexibility, n_dof)
        self._dense: np.ndarray | None = None
        self._scaled_dense: np.ndarray | None = None
        band = self.band
        fixed = []
        self.support_nodes = []
        for xs, kind in zip(layout.support_positions(), layout.support_kinds(), strict=True):
            node = int(np.argmin(np.abs(self.nodes - xs)))
            self.support_nodes.append(node)
            fixed.append(2 * node)
            if kind == "fixed":
                fixed.append(2 * node + 1)
        if len(set(self.support_nodes)) < len(self.support_nodes):
            raise ProjectError(Problem(
                "beam", "the analysis cannot be completed for these inputs: the beam's "
                "equations cannot be solved (two supports stand at one point of the member, "
                f"a span of at most {MERGE_TOLERANCE * max(L, 1.0) * 1000:.2g} mm: give every "
                "span a length)"))
        self.fixed = np.array(sorted(fixed))
        #: The element lengths and 1 / EI as lists (the reactions' statics read a few).
        self._lists = (self.lengths.tolist(), None if self.flexibility is None
                       else self.flexibility.tolist())
        #: The free body of each support's vertical reaction (``refine.support_windows``).
        self.windows = support_windows(self._lists[0], self.support_nodes)
        is_free = np.ones(n_dof, dtype=bool)
        is_free[self.fixed] = False
        self.free = np.flatnonzero(is_free)  # ascending, as setdiff1d (without numpy.ma)
        # symmetric diagonal scaling: short elements next to long ones make K badly scaled
        free = self.free
        self._scale = 1.0 / np.sqrt(band[0, free])
        # the band of the scaled free-dof matrix, diagonal by diagonal (entry (j + k, j)
        # is K[free[j + k], free[j]] * (scale[j + k] * scale[j])), factored once
        self._w = min(BEAM_HALF_BANDWIDTH, max(free.size - 1, 0))
        diagonals = scaled_diagonals(band, free, self._scale, self._w)
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

    @property
    def K(self) -> np.ndarray:
        """The whole stiffness matrix, dense (made at first use from :attr:`band`)."""
        if self._dense is None:
            n = self.band.shape[1]
            K = np.zeros((n, n))
            for d in range(BEAM_HALF_BANDWIDTH + 1):
                i = np.arange(n - d)
                K[i + d, i] = self.band[d, : n - d]
                K[i, i + d] = self.band[d, : n - d]
            self._dense = K
        return self._dense

    def scaled_free_stiffness(self) -> np.ndarray:
        """The stiffness of the free degrees of freedom, scaled symmetrically to a unit
        diagonal (dense, made once; the solve itself keeps only its band).
        """
        if self._scaled_dense is None:
            kff = self.K[np.ix_(self.free, self.free)]
            self._scaled_dense = np.asarray(kff * np.outer(self._scale, self._scale))
        return self._scaled_dense

    def _linear_solve(self, b: np.ndarray) -> np.ndarray:
        """Solve the scaled free-dof system: banded Cholesky, or, where rounding makes a
        pivot of that factorisation non-positive (an element a millionth of its
        neighbour's length), the dense LU solve with pivoting, which raises on a singular
        system (a mechanism).
        """
        if self._factor is not None:
            return solve_with_factor(self._factor, b, self._w)
        return np.asarray(np.linalg.solve(self.scaled_free_stiffness(), b))

    def _unsettled(self, exc: Unsettled) -> Exception:
        """The named refusal of a solve whose refinement did not settle: two points
        standing very close (an element under 1e-3 of the longest), else the equations
        themselves cannot be solved (``LinAlgError``, named by the pipeline).
        """
        e = int(np.argmin(self.lengths))
        if not self.lengths[e] < 1e-3 * float(self.lengths.max()):
            return np.linalg.LinAlgError("the stiffness solve did not settle")
        return ProjectError(Problem(
            "beam.loads", f"two points of the member (loads, supports, ply ends) stand "
            f"{self.lengths[e] * 1000:.3g} mm apart at x = {self.nodes[e]:.6g} m, too close "
            "for the stiffness solve to settle (its last correction was "
            f"{exc.step:.1e} of the deflections); move them together or further apart"))

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
            try:
                data = solve_floats(self._floats, self.windows, self._factor, self._w, loads,
                                    extra_line)
            except Unsettled as exc:
                raise self._unsettled(exc) from None
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
        le, flex = self.lengths, self.flexibility
        try:
            refined(u, self.free, self._scale, lambda v: residuals(le, flex, v, total),
                    self._linear_solve)
        except Unsettled as exc:
            raise self._unsettled(exc) from None
        le_list, flex_list = self._lists
        reactions = np.array(window_reactions(self.windows, le_list, flex_list, u.tolist(),
                                              total.tolist()))
        kinds = self.layout.support_kinds()
        R = residuals(le, flex, u, total) if "fixed" in kinds else None  # f - K u
        reaction_moments = np.array([  # K u - f on the fixed supports' rotations
            0.0 - R[2 * n + 1] if R is not None and k == "fixed" else 0.0
            for n, k in zip(self.support_nodes, kinds, strict=True)])
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
