"""The residual of a beam solution, element by element, and the refinement of a solve.

The assembled stiffness holds each element's entries 12/l^3, 6/l^2, 4/l, 2/l rounded
once. An element much shorter than the member is nearly rigid, and its entries, each
rounded, no longer cancel exactly for a rigid motion: multiplied by displacements far
larger than the element's own deformation they leave forces of the order of the
rounding times 12 v / l^3, which the solve takes for real ones. A point load a tenth of a
millimetre from another on a 3 m fixed-ended beam moved its end moments by about 1e-4
(relative) that way, and loads 2 micrometres apart changed the reactions altogether.

Here the element's end forces are found from its deformation (the chord rotation
d = (v1 - v2) / l against the end rotations), so that a rigid motion gives exactly zero
and the rounding left is of the order of eps theta / l:

    M1 = 2 (3 d + 2 t1 + t2) / l,  M2 = 2 (3 d + t1 + 2 t2) / l,  V = (M1 + M2) / l

(EI = 1; divided by the element's 1 / EI on a stepped member). These are the rows of the
Euler-Bernoulli element stiffness, regrouped (common practice). The residual f - K u of
every degree of freedom adds the load and the forces of the element either side with
Knuth's error-free sum. The solve is then refined: the correction K~^-1 r (K~ the
assembled matrix, factored once) is added until it no longer changes the solution
(iterative refinement; Wilkinson 1963, Higham, Accuracy and Stability of Numerical
Algorithms, 2002, ch. 12; from memory). The vertical reactions are then found by the
statics of each support's free body between the longest elements beside it (the short
elements inside are never read), the reaction moments as the residuals of the fixed
supports' rotations. Where the correction does not die away (points so close that even the
assembled matrix is no guide), the solve is refused by name rather than answered
wrongly.
"""

from __future__ import annotations

import math
from collections.abc import Callable
from typing import TypeVar

import numpy as np

_U = TypeVar("_U", np.ndarray, list[float])

#: Most refinement steps (a step costs one solve with the factor; the steps stop as soon
#: as they no longer halve, so this many are taken only while they keep shrinking).
MAX_STEPS = 100
#: A correction this small against the largest displacement (2^-52) ends the refinement.
SETTLED = 2.0**-52
#: A solve whose last correction is still above this (relative) is refused.
REFUSED_ABOVE = 1e-10


def element_forces(le: np.ndarray, flexibility: np.ndarray | None, u: np.ndarray
                   ) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """(V, M1, M2) of every element from its deformation (see the module's text)."""
    v1, t1, v2, t2 = u[0:-2:2], u[1:-2:2], u[2::2], u[3::2]
    d = (v1 - v2) / le
    m1 = 2 * (3 * d + 2 * t1 + t2) / le
    m2 = 2 * (3 * d + t1 + 2 * t2) / le
    V = (m1 + m2) / le
    if flexibility is not None:
        V, m1, m2 = V / flexibility, m1 / flexibility, m2 / flexibility
    return V, m1, m2


def residuals(le: np.ndarray, flexibility: np.ndarray | None, u: np.ndarray,
              f: np.ndarray) -> np.ndarray:
    """The residual f - K u on every degree of freedom: the load less the forces of the elements
    either side, added with their rounding errors carried (Knuth's sum).
    """
    V, m1, m2 = element_forces(le, flexibility, u)
    n = f.size
    start = np.zeros(n)  # the forces of the element starting at each node
    start[0 : n - 2 : 2] = V
    start[1 : n - 2 : 2] = m1
    end = np.zeros(n)  # and of the element ending there
    end[2::2] = -V
    end[3::2] = m2
    s, e1 = _two_sum(f, -start)
    s, e2 = _two_sum(s, -end)
    return np.asarray(s + (e1 + e2))


def _two_sum(a: np.ndarray, b: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """The sum s = fl(a + b) and its error e, a + b = s + e exactly (Knuth)."""
    s = a + b
    z = s - a
    return s, (a - (s - z)) + (b - z)


def residuals_floats(le: list[float], flexibility: list[float] | None, u: list[float],
                     f: list[float]) -> list[float]:
    """:func:`residuals` in floats: the same operations, element by element."""
    n = len(f)
    start = [0.0] * n
    end = [0.0] * n
    for e, h in enumerate(le):
        V, m1, m2 = _element(h, None if flexibility is None else flexibility[e], u, e)
        start[2 * e], start[2 * e + 1] = V, m1
        end[2 * e + 2], end[2 * e + 3] = -V, m2
    out = []
    for a, b, c in zip(f, start, end, strict=True):
        b = -b
        s = a + b
        z = s - a
        e1 = (a - (s - z)) + (b - z)
        a, b = s, -c
        s = a + b
        z = s - a
        e2 = (a - (s - z)) + (b - z)
        out.append(s + (e1 + e2))
    return out


class Unsettled(Exception):
    """The refinement of a solve did not settle (the relative size of its last step)."""

    def __init__(self, step: float):
        super().__init__(step)
        self.step = step


def _settled(step: float, last: float, top: float) -> bool | None:
    """True where a refinement has settled (its step at most ``SETTLED`` of the largest
    |u|, or the next step, shrinking as this one did, would be), False where it no longer
    settles (the step not half the last: the residual's rounding, or growing), None
    while it goes on.
    """
    if step <= SETTLED * top or (last < math.inf and step * (step / last) <= SETTLED * top):
        return True
    return False if step > last / 2 else None


def _checked(u: _U, settled: bool | None, step: float, top: float) -> _U:
    """``u``, or :class:`Unsettled` where the refinement did not settle and its last step
    is above ``REFUSED_ABOVE`` of the largest |u|.
    """
    if not settled and step > REFUSED_ABOVE * top:
        raise Unsettled(step / top if top > 0 else step)
    return u


def refined(u: np.ndarray, free: np.ndarray, scale: np.ndarray,
            residual: Callable[[np.ndarray], np.ndarray],
            solve: Callable[[np.ndarray], np.ndarray]) -> np.ndarray:
    """``u`` refined in place: ``u[free] += scale * solve(scale * r[free])`` until the
    step is at most ``SETTLED`` of the largest |u| (or zero), or no longer half the one
    before (it has reached the rounding of the residual), or the next step, shrinking as
    this one did, would be at most that; :class:`Unsettled` where the last step is still
    above ``REFUSED_ABOVE`` of it. A residual that is not
    finite (loads near the largest float) ends the refinement: the check of the
    results names it.
    """
    if not free.size:
        return u
    step, top, settled = math.inf, 0.0, None
    for _ in range(MAX_STEPS):
        r = residual(u)[free]
        if not np.isfinite(r).all():
            return u
        du = scale * solve(r * scale)
        u[free] += du
        top, last = float(np.abs(u).max()), step
        step = float(np.abs(du).max())
        settled = _settled(step, last, top)
        if settled is not None:
            break
    return _checked(u, settled, step, top)


def refined_floats(u: list[float], free: list[int], scale: list[float],
                   residual: Callable[[list[float]], list[float]],
                   solve: Callable[[list[float]], list[float]]) -> list[float]:
    """:func:`refined` in floats (the same steps and the same tests)."""
    if not free:
        return u
    step, top, settled = math.inf, 0.0, None
    for _ in range(MAX_STEPS):
        whole = residual(u)
        r = [whole[i] for i in free]
        if not all(x - x == 0.0 for x in r):  # NaN or infinite
            return u
        du = [s * x for s, x in zip(scale, solve([x * s for x, s in zip(r, scale,
                                                                          strict=True)]),
                                    strict=True)]
        for i, x in zip(free, du, strict=True):
            u[i] += x
        top, last = max(abs(x) for x in u), step
        step = max(abs(x) for x in du)
        settled = _settled(step, last, top)
        if settled is not None:
            break
    return _checked(u, settled, step, top)


def support_windows(lengths: list[float], support_nodes: list[int]
                    ) -> list[tuple[int, int, int, int]]:
    """For every support, the free body its vertical reaction is found from: (the
    element entering it from the left, the element leaving it on the right, its first and
    last node), -1 where no element bounds it. The bounding elements are the longest
    between the support and its neighbours (or the member's ends), whose shears the
    deformation gives most accurately (the error of V grows as eps theta / l^2).
    """
    n_el = len(lengths)
    out = []
    for k, s in enumerate(support_nodes):
        lo = support_nodes[k - 1] if k > 0 else 0
        hi = support_nodes[k + 1] if k + 1 < len(support_nodes) else n_el
        left = max(range(lo, s), key=lambda e: lengths[e], default=-1)
        right = max(range(s, hi), key=lambda e: lengths[e], default=-1)
        out.append((left, right, left + 1 if left >= 0 else 0,
                    right if right >= 0 else n_el))
    return out


def window_reactions(windows: list[tuple[int, int, int, int]], le: list[float],
                     flexibility: list[float] | None, u: list[float],
                     f: list[float]) -> list[float]:
    """The vertical reaction of every support by the statics of its free body (see
    :func:`support_windows`): the shear leaving it on the right, less the shear entering
    on the left, less the nodal loads inside, summed once by ``math.fsum`` (the nodes
    inside are free and in equilibrium; the short elements between are never read).
    """
    out = []
    for left, right, first, last in windows:
        terms = [-f[2 * i] for i in range(first, last + 1)]
        for e, sign in ((right, 1.0), (left, -1.0)):
            if e >= 0:
                terms.append(sign * _element(le[e], None if flexibility is None
                                             else flexibility[e], u, e)[0])
        try:
            out.append(0.0 + math.fsum(terms))
        except (ValueError, OverflowError):  # infinities of both signs, or past the floats
            out.append(0.0 + sum(terms))  # NaN or infinite: the results' check names it
    return out


def _element(h: float, g: float | None, u: list[float], e: int
             ) -> tuple[float, float, float]:
    """(V, M1, M2) of element e, of length h and 1 / EI g (None: EI = 1), from its
    deformation: :func:`element_forces` in floats, the same operations.
    """
    v1, t1, v2, t2 = u[2 * e], u[2 * e + 1], u[2 * e + 2], u[2 * e + 3]
    d = (v1 - v2) / h
    m1 = 2 * (3 * d + 2 * t1 + t2) / h
    m2 = 2 * (3 * d + t1 + 2 * t2) / h
    V = (m1 + m2) / h
    if g is not None:
        V, m1, m2 = V / g, m1 / g, m2 / g
    return V, m1, m2
