"""The refined stiffness solve (``actions.refine``) against the exact solution of the same
finite-element model in rational arithmetic.

The reference takes the mesh's nodes, the point loads and the element loads as exact
fractions, assembles the Euler-Bernoulli element stiffness (12, 6l, 4l^2, 2l^2 over l^3;
common practice) and solves by exact elimination; the reactions are K u - f at the
supports. With nodes at every load and the consistent load vectors this model is exact
for the loads it carries, so the reference is the beam's own answer. Before the
refinement a point load 0.1 mm from another on a 3 m fixed-ended beam moved the end
moments by 1e-4 (relative) and 200 point loads on three spans moved reactions by 1e-8;
here every case agrees to 1e-12 of the largest reaction (u to 1e-12 of the largest
displacement). Points so close that the solve cannot settle are refused by name.
"""

from __future__ import annotations

from fractions import Fraction

import numpy as np
import pytest

from plystack.core.actions import refine
from plystack.core.actions.beam import BeamModel, CaseSolution
from plystack.core.model.errors import ProjectError
from plystack.core.model.member import BeamLayout, Load


def _exact(model: BeamModel, sol: CaseSolution, loads: list[Load]
           ) -> tuple[list[float], list[float], list[float]]:
    """Reactions, reaction moments and u of the mesh's model, solved in fractions."""
    nodes = [Fraction(float(x)) for x in model.nodes]
    n_dof = 2 * len(nodes)
    le = [b - a for a, b in zip(nodes, nodes[1:], strict=False)]
    flex = (None if model.flexibility is None
            else [Fraction(float(f)) for f in model.flexibility])
    band = [[Fraction(0)] * n_dof for _ in range(4)]
    for e, h in enumerate(le):
        entries = {(0, 0): 12 / h**3, (1, 0): 6 / h**2, (1, 1): 4 / h, (2, 0): -12 / h**3,
                   (2, 1): -6 / h**2, (2, 2): 12 / h**3, (3, 0): 6 / h**2, (3, 1): 2 / h,
                   (3, 2): -6 / h**2, (3, 3): 4 / h}
        for (a, b), v in entries.items():
            band[a - b][2 * e + b] += v if flex is None else v / flex[e]

    def K(i: int, j: int) -> Fraction:
        i, j = max(i, j), min(i, j)
        return band[i - j][j] if i - j <= 3 else Fraction(0)

    f = [Fraction(0)] * n_dof
    for ld in loads:
        if ld.type == "point":
            f[2 * model.node_index(float(ld.at or 0.0))] -= Fraction(float(ld.value))
    q = [Fraction(float(v)) for v in sol.q]
    dq = [Fraction(float(v)) for v in sol.dq]
    for e, h in enumerate(le):
        f[2 * e] += q[e] * h / 2 + dq[e] * 3 * h**2 / 20
        f[2 * e + 1] += q[e] * h**2 / 12 + dq[e] * h**3 / 30
        f[2 * e + 2] += q[e] * h / 2 + dq[e] * 7 * h**2 / 20
        f[2 * e + 3] += -q[e] * h**2 / 12 - dq[e] * h**3 / 20
    fixed = {int(x) for x in model.fixed}
    free = [i for i in range(n_dof) if i not in fixed]
    m = len(free)
    A = {(a, b): K(free[a], free[b]) for a in range(m) for b in range(max(0, a - 3),
                                                                       min(m, a + 4))}
    rhs = [f[i] for i in free]
    for k in range(m):  # banded elimination, exact
        for i in range(k + 1, min(m, k + 4)):
            factor = A[(i, k)] / A[(k, k)]
            if factor:
                for j in range(k, min(m, k + 4)):
                    A[(i, j)] = A.get((i, j), Fraction(0)) - factor * A[(k, j)]
                rhs[i] -= factor * rhs[k]
    x = [Fraction(0)] * m
    for k in range(m - 1, -1, -1):
        s = rhs[k] - sum((A[(k, j)] * x[j] for j in range(k + 1, min(m, k + 4))), Fraction(0))
        x[k] = s / A[(k, k)]
    u = [Fraction(0)] * n_dof
    for a, i in enumerate(free):
        u[i] = x[a]

    def residual(r: int) -> Fraction:
        return sum((K(r, c) * u[c] for c in range(max(0, r - 3), min(n_dof, r + 4))),
                   Fraction(0)) - f[r]

    kinds = model.layout.support_kinds()
    R = [float(residual(2 * n)) for n in model.support_nodes]
    M = [float(residual(2 * n + 1)) if k == "fixed" else 0.0
         for n, k in zip(model.support_nodes, kinds, strict=True)]
    return R, M, [float(v) for v in u]


def _agrees(model: BeamModel, loads: list[Load], tol: float = 1e-12) -> None:
    for sol in (model.solve(loads), model.solve_arrays(loads)):
        R, M, u = _exact(model, sol, loads)
        got = sol.reactions.tolist() + sol.reaction_moments.tolist()
        scale = max(abs(v) for v in R + M)
        assert max(abs(a - b) for a, b in zip(got, R + M, strict=True)) <= tol * scale
        top = max(abs(v) for v in u)
        assert max(abs(a - b) for a, b in zip(sol.u.tolist(), u, strict=True)) <= tol * top


@pytest.mark.parametrize("gap", [1e-1, 1e-2, 1e-3, 1e-4])
@pytest.mark.parametrize("supports", ["fixed-fixed", "propped", "cantilever"])
def test_two_close_point_loads(gap: float, supports: str) -> None:
    loads = [Load("D", "point", 10000.0, at=1.0), Load("D", "point", 10000.0, at=1.0 + gap),
             Load("D", "line", 500.0)]
    _agrees(BeamModel(BeamLayout(spans=(3.0,), supports=supports), loads), loads)


@pytest.mark.parametrize("gap", [1e-1, 1e-3, 1e-4])
def test_a_load_close_to_an_inner_support(gap: float) -> None:
    layout = BeamLayout(spans=(3.0, 4.0, 2.5), supports="simple", overhang_right=0.8)
    loads = [Load("D", "point", 8000.0, at=3.0 + gap), Load("L", "point", 5000.0, at=7.0 - gap),
             Load("D", "line", 700.0, value_end=200.0, start=0.5, end=9.0)]
    _agrees(BeamModel(layout, loads), loads)


@pytest.mark.parametrize("n", [10, 60])
@pytest.mark.parametrize("supports", ["fixed-fixed", "simple"])
def test_many_point_loads(n: int, supports: str) -> None:
    layout = (BeamLayout(spans=(6.0,), supports=supports) if supports != "simple"
              else BeamLayout(spans=(3.0, 4.0, 2.5), supports="simple"))
    L = layout.length
    loads = [Load("D", "point", 1000.0, at=L * (k + 0.37) / n) for k in range(n)]
    loads.append(Load("D", "line", 500.0))
    _agrees(BeamModel(layout, loads), loads, 1e-12)


def test_stepped_member_with_a_short_element() -> None:
    layout = BeamLayout(spans=(3.0,), supports="fixed-fixed")
    loads = [Load("D", "point", 4000.0, at=1.2), Load("D", "line", 900.0)]
    steps = ((0.0, 1.2001, 2e6), (1.2001, 3.0, 5e6))
    _agrees(BeamModel(layout, loads, steps), loads)


def test_points_too_close_are_refused_by_name() -> None:
    layout = BeamLayout(spans=(3.0, 4.0, 2.5), supports="simple")
    loads = [Load("D", "point", 10000.0, at=1.0), Load("D", "point", 10000.0, at=1.00001),
             Load("D", "line", 500.0)]
    with pytest.raises(ProjectError, match=r"beam\.loads: two points of the member .* stand "
                       r"0\.01 mm apart at x = 1 m, too close"):
        BeamModel(layout, loads).solve(loads)


def test_residuals_in_floats_are_the_arrays() -> None:
    """``residuals_floats`` against ``residuals``, bit for bit, stepped or not."""
    rng = np.random.default_rng(5)
    for flex in (None, rng.uniform(1e-7, 1e-5, 30)):
        le = rng.uniform(1e-4, 2.0, 30)
        u = rng.normal(size=62) * 10.0 ** rng.integers(-6, 3, size=62)
        f = rng.normal(size=62) * 1e3
        plain = refine.residuals(le, flex, u, f)
        quick = refine.residuals_floats(le.tolist(), None if flex is None else flex.tolist(),
                                        u.tolist(), f.tolist())
        assert np.array(quick).tobytes() == plain.tobytes()



def test_loads_near_the_largest_float_give_numbers_not_exceptions() -> None:
    """Infinities of both signs in a support's free body: NaN reactions (the pipeline's
    check of the results then names the problem), not an exception from ``math.fsum``."""
    layout = BeamLayout(spans=(3.0, 4.0), supports="simple")
    for v in (1e308, -1e308):
        loads = [Load("D", "point", v, at=1.2), Load("D", "point", -v, at=5.0)]
        for sol in (BeamModel(layout, loads).solve(loads),
                    BeamModel(layout, loads).solve_arrays(loads)):
            assert not np.isfinite(sol.reactions).all()


def test_a_slowly_settling_solve_is_answered() -> None:
    """Loads 12.6 micrometres apart on a 3 m span: the refinement shrinks by about a half
    a step and settles in some 30 steps (it was refused after 12)."""
    loads = [Load("D", "point", 1e4, at=1.0), Load("D", "point", 1e4, at=1.0 + 1.26e-5),
             Load("D", "line", 500.0)]
    _agrees(BeamModel(BeamLayout(spans=(3.0,), supports="simple"), loads), loads)


def test_two_supports_at_one_point_are_refused_by_name() -> None:
    """A span of 1e-7 m between two 3 m spans merges its supports onto one node, whose
    free bodies would overlap: refused, not answered with ends pulled down."""
    loads = [Load("D", "line", 500.0), Load("D", "point", 1e4, at=1.3)]
    with pytest.raises(ProjectError, match=r"beam: the analysis cannot be completed .* "
                       r"\(two supports stand at one point"):
        BeamModel(BeamLayout(spans=(3.0, 1e-7, 3.0), supports="simple"), loads)
