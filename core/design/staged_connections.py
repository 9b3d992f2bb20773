"""The checks of a member strengthened under load beyond bending, shear and deflection
(see ``staged``): which are redone by stage and which may keep the finished member's
demand, and why.

Redone by stage (the finished member's value would understate an existing ply):
- combined bending and axial stress (``tension-bending``, ``compression-bending``, NDS 2018
  3.9.1 / 3.9.2, EN 1995-1-1 6.2.3 / 6.2.4 / 6.3.2): the ply's centroid (axial) stress and
  its bending stress about its own centroid are each the before-stage on the existing
  section plus the after-stage on the built-up one, each at its own largest magnitude along
  the member (or segment), and never less than the finished member's; every interaction
  formula grows with both, so taking each at its largest is an upper bound;
- bending on the net section at the bolt holes (``bending-net``): the holes are taken out of
  the existing section for the before-stage and out of the built-up section for the
  after-stage, the two fibre stresses added exactly along the member, at the station where
  that sum is largest;
- bearing at supports: the reaction of the two stages (each on its own stiffness), where it
  is larger than the finished member's.

Kept from the finished member, with the reason on the check: the bolts of a plate
(``bolts``, ``load-transfer``, ``splitting``) and the connectors to an added ply carry the
plate's or added ply's share of every load, while in fact they carry only its share of the
after-stage (the added ply takes nothing of the before-loads): an upper bound wherever the
before-stage acts in the same sense as the after-stage (moment, shear, load and reactions
of the same sign along the member). Where the two stages oppose somewhere, or a connector
joins two existing plies (whose before-stage shear flow is on the existing section), the
check is not an upper bound: a named missing check.
"""

from __future__ import annotations

import re
from collections.abc import Callable, Sequence
from dataclasses import replace

import numpy as np

from ..actions.analysis import BeamResult, CombinationResult
from ..actions.beam import CaseSolution, moment_at
from ..actions.stages import StageSolutions
from ..model.design import DesignSpec
from ..model.errors import MissingCheck, Problem
from ..section.transformed import Section
from .check import Check
from .common import side_by_side_joints
from .demands import PlyDemand
from .eu_timber import interaction_check as eu_interaction
from .net_section import hole_diameter, holes_removed, net_fibres
from .ply_ends import bolts_of
from .us_timber import interaction_check as us_interaction

#: Checks that keep the finished member's demand where the stages agree in sense.
UPPER_BOUND_IDS = frozenset({"bolts", "load-transfer", "splitting", "connectors"})

UPPER_BOUND_NOTE = ("Staged loading: checked for the finished member under every load, "
                    "an upper bound here: the added ply takes only its share of the "
                    "after-stage, and the before-stage acts in the same sense.")

Span = tuple[float, float] | None
MaxFibre = Callable[[CaseSolution, CaseSolution, float, float, np.ndarray, Span],
                    tuple[float, float]]


def _polys(sol: CaseSolution, e: int) -> tuple[np.ndarray, np.ndarray]:
    M = np.array([sol.dq[e] / 6, sol.q[e] / 2, sol.V0[e], sol.M0[e]], dtype=float)
    V = np.array([sol.dq[e] / 2, sol.q[e], sol.V0[e]], dtype=float)
    return M, V


def _roots(poly: np.ndarray, le: float) -> list[float]:
    p = np.trim_zeros(poly, "f")
    if p.size < 2:
        return []
    return [float(r.real) for r in np.roots(p) if abs(r.imag) < 1e-12 and 0 < r.real < le]


def stages_agree(stages: StageSolutions, combo: CombinationResult) -> bool:
    """True where the before- and after-stage moments, shears, loads and reactions of
    ``combo`` nowhere have opposite signs (exact: every element is tested between the
    sign changes of both stages).
    """
    f = combo.combination.factors
    s1, s2 = stages.stage("before", f), stages.stage("after", f)
    if np.any(s1.reactions * s2.reactions < 0):
        return False
    nodes = stages.model.nodes
    for e in range(nodes.size - 1):
        le = float(nodes[e + 1] - nodes[e])
        (M1, V1), (M2, V2) = _polys(s1, e), _polys(s2, e)
        q1 = np.array([s1.dq[e], s1.q[e]], dtype=float)
        q2 = np.array([s2.dq[e], s2.q[e]], dtype=float)
        for a, b in ((M1, M2), (V1, V2), (q1, q2)):
            cuts = sorted({0.0, le, *_roots(a, le), *_roots(b, le)})
            pts = cuts + [(x + y) / 2 for x, y in zip(cuts, cuts[1:], strict=False)]
            scale = max(float(np.max(np.abs(a))), float(np.max(np.abs(b))), 1e-300)
            for x in pts:
                va, vb = float(np.polyval(a, x)), float(np.polyval(b, x))
                if va * vb < -(1e-12 * scale) ** 2:
                    return False
    return True


def _index(section: Section, name: str) -> int | None:
    return next((i for i, p in enumerate(section.plies) if p.name == name), None)


def _own(section: Section, i: int) -> tuple[float, float]:
    """(axial, own-bending) stress of ply i per unit moment: -E_i (y_c - y_na) / EI and
    E_i c_own / EI, c_own the largest distance of its fibres from its centroid.
    """
    a = float(section.area[i])
    y_c = float(section.first_y[i]) / a
    E_i = float(section.E[i])
    c = max(float(section.y_top[i]) - y_c, y_c - float(section.y_bottom[i]))
    return (-E_i * (y_c - section.neutral_axis_y) / section.EI, E_i * c / section.EI)


def staged_interaction(c: Check, combo: CombinationResult, existing: Section, built: Section,
                       beam: BeamResult, design: DesignSpec, stages: StageSolutions,
                       span: Span, max_fibre: MaxFibre, warnings: list[Problem]) -> Check:
    """The interaction check of one ply redone with the stage stresses (module text)."""
    i2 = _index(built, c.ply or "")
    if i2 is None:
        return c
    i1 = _index(existing, c.ply or "")
    f = combo.combination.factors
    s1, s2 = stages.stage("before", f), stages.stage("after", f)
    a1, b1 = (0.0, 0.0) if i1 is None else _own(existing, i1)
    a2, b2 = _own(built, i2)
    nodes = stages.model.nodes
    axial, x = max_fibre(s1, s2, a1, a2, nodes, span)
    bending, _ = max_fibre(s1, s2, b1, b2, nodes, span)
    sign = 1 if _signed(s1, s2, a1, a2, stages, x) >= 0 else -1
    M = moment_at(stages.model, s1, x) + moment_at(stages.model, s2, x)
    demand = PlyDemand(1 if M >= 0 else -1, M, x, axial + bending, sign * axial, bending,
                       "staged (before-stage on the existing plies, after-stage built up)",
                       sign < 0 or bending > axial)
    check = (us_interaction if design.us else eu_interaction)(
        i2, built, beam, combo, design, warnings, demand)
    if check is None or check.demand <= c.demand:
        return replace(c, notes=(*c.notes, "Staged loading: redone with the stage stresses; "
                                 "the finished-member value governs here."))
    return replace(check, segment=c.segment, location=c.location,
                   notes=(*check.notes, "Staged loading: the axial and bending stresses are "
                          "each the before-stage on the existing plies plus the after-stage "
                          "on the built-up section, at its largest (an upper bound)."))


def _signed(s1: CaseSolution, s2: CaseSolution, k1: float, k2: float,
            stages: StageSolutions, x: float) -> float:
    model = stages.model
    return k1 * moment_at(model, s1, x) + k2 * moment_at(model, s2, x)


def staged_bearing(c: Check, beam: BeamResult, stages: StageSolutions) -> Check:
    """A support's bearing check with the reaction of the two stages where larger."""
    m = re.fullmatch(r"support (\d+)", c.location)
    if m is None:
        return c
    k = int(m.group(1)) - 1
    combos = {cb.name: cb for cb in beam.combinations}
    own = combos.get(c.combination or "")
    if own is None:
        return c
    R_own = float(own.reactions_max[k])
    if R_own <= 0:
        return c
    # US: one check for the combination of the largest force (C_D does not apply);
    # EU: one check per combination
    chosen = (list(beam.strength()) or [own]) if beam.basis == "US" else [own]
    R = max(float((stages.stage("before", cb.combination.factors)
                   + stages.stage("after", cb.combination.factors)).reactions[k])
            for cb in chosen)
    if R <= R_own:
        return replace(c, notes=(*c.notes, "Staged loading: the reaction of the two stages "
                                 "is not larger than the finished member's."))
    return replace(c, demand=c.demand * R / R_own,
                   notes=(*c.notes, f"Staged loading: the reaction of the two stages, "
                          f"{R:.6g} N (each stage on its own stiffness), governs."))


def staged_net(c: Check, combo: CombinationResult, existing: Section, built: Section,
               beam: BeamResult, design: DesignSpec, stages: StageSolutions, span: Span,
               max_fibre: MaxFibre, system: str) -> Check:
    """A ``bending-net`` check redone by stage (module text), never below its own."""
    i2 = _index(built, c.ply or "")
    if i2 is None:
        return c
    joint = next((jt for jt in side_by_side_joints(built)
                  if built.plies[jt.steel].name in c.location), None)
    if joint is None:
        return c
    got = bolts_of(built, beam, design, joint, system, beam.strength())
    if got is None:
        return c
    _value, layout = got
    d_hole = hole_diameter(design)
    i1 = _index(existing, c.ply or "")
    with_holes = tuple(range(len(built.plies)))  # a through-bolt crosses every ply
    old_holes = tuple(range(len(existing.plies)))
    f = combo.combination.factors
    s1, s2 = stages.stage("before", f), stages.stage("after", f)
    best = (c.demand, c.x)
    for k in range(len(layout.stations)):
        heights = tuple(layout.rows[r] for r in layout.station_rows[k])
        k2 = net_fibres(built, holes_removed(built, with_holes, heights, d_hole, k), i2)
        k1 = (0.0, 0.0) if i1 is None else net_fibres(
            existing, holes_removed(existing, old_holes, heights, d_hole, k), i1)
        for a, b in zip(k1, k2, strict=True):
            v, x = max_fibre(s1, s2, a, b, stages.model.nodes, span)
            if v > best[0]:
                best = (v, x)
    note = ("Staged loading: the holes taken out of the existing section for the "
            "before-stage and out of the built-up section for the after-stage, the fibre "
            "stresses added.")
    return replace(c, demand=best[0], x=best[1], notes=(*c.notes, note))


def upper_bound_notes(checks: Sequence[Check], beam: BeamResult, existing: Section,
                      stages: StageSolutions) -> tuple[list[Check], list[Problem]]:
    """The checks kept from the finished member with the reason they are an upper bound,
    and a named missing check where they are not (module text).
    """
    combos = {cb.name: cb for cb in beam.combinations}
    agree: dict[str, bool] = {}
    out: list[Check] = []
    gaps: list[Problem] = []
    names = {p.name for p in existing.plies}
    for c in checks:
        if c.id not in UPPER_BOUND_IDS:
            out.append(c)
            continue
        combo = combos.get(c.combination or "")
        if combo is not None and combo.name not in agree:
            agree[combo.name] = stages_agree(stages, combo)
        both_old = c.id == "connectors" and c.ply is not None and all(
            all(n.strip() in names for n in pair.split(" / ")) for pair in c.ply.split("; "))
        if both_old:
            gaps.append(MissingCheck("plies", f"staged loading: the connectors of {c.ply} "
                                     "join existing plies, whose before-stage shear flow is "
                                     "on the existing section; they are checked for the "
                                     "finished member only"))
        elif combo is not None and not agree[combo.name]:
            gaps.append(MissingCheck("plies", f"staged loading: under {combo.name} the "
                                     "before-stage acts against the after-stage somewhere, so "
                                     f"the {c.id} check of {c.ply} for every load on the "
                                     "finished member is not an upper bound of the stages"))
        else:
            c = replace(c, notes=(*c.notes, UPPER_BOUND_NOTE))
        out.append(c)
    unique: list[Problem] = []
    for g in gaps:
        if all((g.path, g.message) != (u.path, u.message) for u in unique):
            unique.append(g)
    return out, unique
