"""Checks of a member strengthened under load (staged loading, see actions.stages).

Each ply's stress is the before-stage moment on the existing section plus the
after-stage moment on the built-up section (an added ply carries nothing of the first
stage); the largest |stress| at the ply's fibres is found exactly along every element
(the sum is a cubic in x: ends and the roots of its slope). Shear: |V_before|max times
the ply's unit shear stress on the existing section plus |V_after|max times the one on
the built-up section (an upper bound, exact where both peak at the same support).
Deflections: the before-stage on the existing EI plus the after-stage on the built-up
EI, with creep per stage for the long-term check (sustained part on the crept section).
The demand of each bending, shear and deflection check made for the finished member is
replaced by the larger of the staged value and its own (pattern arrangements stay
covered by the latter); combined stresses, net sections, bearing and the connections are
handled as ``staged_connections`` states.

A stepped member (plies stopping short of its ends) is checked segment by segment: each
stress check of a segment adds the before-stage on that segment's existing plies and the
after-stage on the segment's section, within the segment; each stage is solved on its own
stepped stiffness (``actions.stages``), so deflections add in true units.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass, replace

import numpy as np

from ..actions.analysis import BeamResult, CombinationResult, creep_moduli
from ..actions.beam import CaseSolution
from ..actions.extremes import extremes
from ..actions.stages import StageSolutions, StageStiffness
from ..model.design import DesignSpec
from ..model.errors import MissingCheck, Problem
from ..section.transformed import Section, with_moduli
from .check import Check
from .common import unit_shear_stress
from .segmented import SegmentResult
from .staged_connections import (
    staged_bearing,
    staged_interaction,
    staged_net,
    upper_bound_notes,
)

STAGED_NOTE = ("Staged loading: the before-loads and the existing plies' self-weight act "
               "on the existing plies alone, the rest on the built-up section; the two "
               "stages add.")


@dataclass(frozen=True)
class StagePart:
    """One segment of a stepped member strengthened under load.

    Attributes:
        start: m from the left end.
        end: m.
        existing: the section of the segment's existing plies.
        built_up: the segment's section (every ply acting there).

    """

    start: float
    end: float
    existing: Section
    built_up: Section


def stage_stiffness(parts: Sequence[StagePart], segments: Sequence[SegmentResult],
                    gravity: float) -> StageStiffness:
    """The stepped stiffness and self-weight of both stages (``gravity`` 0 where the
    self-weight is not counted); the crept EI with each segment's creep factor.
    """
    crept = [with_moduli(p.existing, creep_moduli(p.existing, s.beam.creep_factor))
             for p, s in zip(parts, segments, strict=True)]
    return StageStiffness(
        tuple((p.start, p.end) for p in parts), tuple(p.existing.EI for p in parts),
        tuple(p.built_up.EI for p in parts), tuple(c.EI for c in crept),
        tuple(s.beam.creep_section.EI for s in segments),
        tuple(p.existing.mass_per_length * gravity for p in parts),
        tuple((p.built_up.mass_per_length - p.existing.mass_per_length) * gravity
              for p in parts))


@dataclass(frozen=True)
class StageActions:
    """One stage of one combination (SI): extreme moments and the largest deflection on
    the stage's own section, and each ply's fibre stresses under the moment of largest
    magnitude (name, top, bottom).
    """

    combination: str
    M_max: float
    M_min: float
    deflection_max: float
    ply_stresses: tuple[tuple[str, float, float], ...]


@dataclass(frozen=True, eq=False)
class StagesResult:
    """Both stages of a member strengthened under load.

    Attributes:
        existing: the section of the existing plies.
        built_up: the section of every ply.
        before: per strength or serviceability combination, the before-stage.
        after: the same for the after-stage.

    """

    existing: Section
    built_up: Section
    before: tuple[StageActions, ...]
    after: tuple[StageActions, ...]


def _elements(nodes: np.ndarray, span: tuple[float, float] | None) -> range | list[int]:
    """The elements of the mesh within ``span`` (all of them where None)."""
    if span is None:
        return range(nodes.size - 1)
    tol = 1e-9 * max(float(nodes[-1]), 1.0)
    return [e for e in range(nodes.size - 1)
            if nodes[e] >= span[0] - tol and nodes[e + 1] <= span[1] + tol]


def _max_fibre(sol1: CaseSolution, sol2: CaseSolution, k1: float, k2: float,
               nodes: np.ndarray, span: tuple[float, float] | None = None
               ) -> tuple[float, float]:
    """Largest |k1 M1(x) + k2 M2(x)| along the member (or within ``span``), and where
    (exact per element).
    """
    best = (0.0, float(nodes[0]) if span is None else span[0])
    for e in _elements(nodes, span):
        le = float(nodes[e + 1] - nodes[e])
        poly = sum(k * np.array([s.dq[e] / 6, s.q[e] / 2, s.V0[e], s.M0[e]])
                   for k, s in ((k1, sol1), (k2, sol2)))
        xs = [0.0, le]
        d = np.polyder(np.asarray(poly, dtype=float))
        if np.any(np.abs(d) > 0):
            xs += [float(r.real) for r in np.roots(np.trim_zeros(d, "f"))
                   if abs(r.imag) < 1e-12 and 0 < r.real < le]
        for x in xs:
            v = abs(float(np.polyval(poly, x)))
            if v > best[0]:
                best = (v, float(nodes[e]) + x)
    return best


def _index(section: Section, name: str) -> int | None:
    return next((i for i, p in enumerate(section.plies) if p.name == name), None)


def _stage_pair(stages: StageSolutions, f: Mapping[str, float]
                ) -> tuple[CaseSolution, CaseSolution]:
    return stages.stage("before", f), stages.stage("after", f)


def _bending(c: Check, combo: CombinationResult, existing: Section, built: Section,
             stages: StageSolutions, span: tuple[float, float] | None = None) -> Check:
    i2 = _index(built, c.ply or "")
    if i2 is None:
        return c
    i1 = _index(existing, c.ply or "")
    s1, s2 = _stage_pair(stages, combo.combination.factors)
    top2, bot2 = built.ply_extreme_stresses(1.0)
    top1, bot1 = existing.ply_extreme_stresses(1.0)
    k1 = (0.0, 0.0) if i1 is None else (float(top1[i1]), float(bot1[i1]))
    worst = max(_max_fibre(s1, s2, a, b, stages.model.nodes, span)
                for a, b in zip(k1, (float(top2[i2]), float(bot2[i2])), strict=True))
    return _replaced(c, *worst)


def _V_max(stages: StageSolutions, sol: CaseSolution,
           span: tuple[float, float] | None) -> tuple[float, float]:
    """Largest |V| of ``sol`` along the member (or within ``span``) and where: V is
    quadratic per element, so its ends and the root of its slope.
    """
    if span is None:
        ext = extremes(stages.model, sol, 1.0)
        return ext.V_max_abs, ext.x_V_max_abs
    nodes = stages.model.nodes
    best = (0.0, span[0])
    for e in _elements(nodes, span):
        le = float(nodes[e + 1] - nodes[e])
        xs = [0.0, le]
        if sol.dq[e] != 0 and 0 < -sol.q[e] / sol.dq[e] < le:
            xs.append(float(-sol.q[e] / sol.dq[e]))
        for x in xs:
            v = abs(float(sol.V0[e] + sol.q[e] * x + sol.dq[e] * x * x / 2))
            if v > best[0]:
                best = (v, float(nodes[e]) + x)
    return best


def _shear(c: Check, combo: CombinationResult, existing: Section, built: Section,
           stages: StageSolutions, span: tuple[float, float] | None = None) -> Check:
    i2 = _index(built, c.ply or "")
    if i2 is None:
        return c
    i1 = _index(existing, c.ply or "")
    s1, s2 = _stage_pair(stages, combo.combination.factors)
    V1, x1 = _V_max(stages, s1, span)
    V2, x2 = _V_max(stages, s2, span)
    t1 = 0.0 if i1 is None else float(unit_shear_stress(existing)[i1])
    t2 = float(unit_shear_stress(built)[i2])
    demand = V1 * t1 + V2 * t2
    return _replaced(c, demand, x1 if V1 * t1 > V2 * t2 else x2)


def _replaced(c: Check, demand: float, x: float | None) -> Check:
    if demand <= c.demand:
        return replace(c, notes=(*c.notes, STAGED_NOTE + " The finished-member value "
                                 "governs here."))
    return replace(c, demand=demand, x=x, notes=(*c.notes, STAGED_NOTE))


def _deflection_solution(stages: StageSolutions, f: Mapping[str, float],
                         sus: Mapping[str, float] | None, EI: tuple[float, float],
                         EI_c: tuple[float, float]) -> CaseSolution:
    """Both stages as one solution read with the built-up EI: the before-stage scaled by
    EI_built / EI_existing; with ``sus`` the sustained part of each stage on its creep
    section (scaled by EI / EI_creep of that stage).
    """
    out = None
    for k, which in enumerate(("before", "after")):
        g = dict(f) if sus is None else {
            c: sus.get(c, 0.0) * EI[k] / EI_c[k] + v - sus.get(c, 0.0) for c, v in f.items()}
        s = stages.stage(which, g).scaled(EI[1] / EI[k])
        out = s if out is None else out + s
    assert out is not None
    return out


def _stepped_deflection_solution(stages: StageSolutions, f: Mapping[str, float],
                                 sus: Mapping[str, float] | None) -> CaseSolution:
    """Both stages of a stepped member in true units: each stage on its own stepped EI;
    with ``sus`` the sustained part of each on its crept stepped EI.
    """
    out = None
    for which in ("before", "after"):
        if sus is None:
            s = stages.stage(which, f)
        else:
            rest = {c: v - sus.get(c, 0.0) for c, v in f.items()}
            s = (stages.stage(which, {c: sus.get(c, 0.0) for c in f}, crept=True)
                 + stages.stage(which, rest))
        out = s if out is None else out + s
    assert out is not None
    return out


def _deflection(c: Check, beam: BeamResult, EI: tuple[float, float],
                EI_c: tuple[float, float], stages: StageSolutions) -> Check:
    combo = next((k for k in beam.combinations if k.name == c.combination), None)
    if c.id == "deflection-live" or combo is None:
        f: Mapping[str, float] = {c.combination or "": 1.0}
        sus = None
    else:
        f = combo.combination.factors
        sus = combo.sustained_factors if c.id == "deflection-long-term" else None
    if stages.stepped:
        sol = _stepped_deflection_solution(stages, f, sus)
        ext = extremes(stages.model, sol, 1.0)
    else:
        sol = _deflection_solution(stages, f, sus, EI, EI_c)
        ext = extremes(stages.model, sol, EI[1])
    w, x = next(((abs(w), x) for name, w, x in ext.deflection_by_region
                 if name == c.location), (c.demand, c.x))
    return _replaced(c, w, x)


def staged_checks(checks: tuple[Check, ...], existing: Section, built: Section,
                  beam: BeamResult, stages: StageSolutions, design: DesignSpec, system: str,
                  parts: Sequence[StagePart] = ()
                  ) -> tuple[tuple[Check, ...], list[Problem], StagesResult]:
    """The checks with staged demands, warnings, and both stages for the output;
    ``parts``: the segments of a stepped member (a check made in a segment takes that
    segment's sections, within it).
    """
    combos = {c.name: c for c in beam.combinations}
    warnings: list[Problem] = []
    crept = with_moduli(existing, creep_moduli(existing, beam.creep_factor))
    EI = (existing.EI, built.EI)
    EI_c = (crept.EI, beam.creep_section.EI)
    out = []
    for c in checks:
        combo = combos.get(c.combination or "")
        old, new, span = existing, built, None
        if c.segment is not None and parts:
            part = parts[c.segment]
            old, new, span = part.existing, part.built_up, (part.start, part.end)
        if c.id == "bending" and combo is not None:
            out.append(_bending(c, combo, old, new, stages, span))
        elif c.id == "shear" and combo is not None:
            out.append(_shear(c, combo, old, new, stages, span))
        elif c.id.startswith("deflection"):
            out.append(_deflection(c, beam, EI, EI_c, stages))
        elif c.id in ("tension-bending", "compression-bending") and combo is not None:
            out.append(staged_interaction(c, combo, old, new, beam, design, stages, span,
                                          _max_fibre, warnings))
        elif c.id == "bending-net" and combo is not None:
            out.append(staged_net(c, combo, old, new, beam, design, stages, span, _max_fibre,
                                  system))
        elif c.id == "bearing":
            out.append(staged_bearing(c, beam, stages))
        else:
            out.append(c)
    out, gaps = upper_bound_notes(out, beam, existing, stages)
    return (tuple(out), warnings + gaps + _unpatterned(checks, combos, beam.patterned_cases),
            _result(existing, built, beam, stages))


#: The checks whose demands the stages replace (or bound) above.
STAGED_IDS = ("bending", "shear", "tension-bending", "compression-bending", "bending-net")


def _unpatterned(checks: Sequence[Check], combos: Mapping[str, CombinationResult],
                 patterned: Sequence[str]) -> list[Problem]:
    """A named missing check for each combination with a patterned case whose staged
    checks were made: the stages are solved with every variable case on every span and
    overhang at once, and the pattern arrangements (ASCE 7-16 4.3.3; EN 1991-1-1 6.2.1)
    are enveloped for the finished member only, which does not bound the stages (the
    before-stage acts on the existing section alone). ``beam.pattern_live_load`` false
    takes the loads as given.
    """
    out: list[Problem] = []
    said: set[str] = set()
    for c in checks:
        combo = combos.get(c.combination or "")
        if combo is None or combo.name in said or not (
                c.id in STAGED_IDS or c.id.startswith("deflection")):
            continue
        cases = [k for k in patterned if combo.combination.factors.get(k, 0.0)]
        if cases:
            said.add(combo.name)
            out.append(MissingCheck("beam.pattern_live_load", (
                f"staged loading under {combo.name}: the stresses and deflections of the "
                f"two stages take {', '.join(cases)} on every span and overhang at once; "
                "the pattern arrangements are enveloped for the finished member only, "
                "which does not bound the stages (not made)")))
    return out


def _actions(which: str, sec: Section, combo: CombinationResult,
             stages: StageSolutions) -> StageActions:
    sol = stages.stage(which, combo.combination.factors)
    e = extremes(stages.model, sol, 1.0 if stages.stepped else sec.EI)
    m = e.M_max if abs(e.M_max) >= abs(e.M_min) else e.M_min
    top, bot = sec.ply_extreme_stresses(m)
    return StageActions(combo.name, e.M_max, e.M_min, e.deflection_max_abs,
                        tuple((p.name, float(t), float(b))
                              for p, t, b in zip(sec.plies, top, bot, strict=True)))


def _result(existing: Section, built: Section, beam: BeamResult,
            stages: StageSolutions) -> StagesResult:
    return StagesResult(existing, built,
                        tuple(_actions("before", existing, c, stages) for c in beam.combinations),
                        tuple(_actions("after", built, c, stages) for c in beam.combinations))
