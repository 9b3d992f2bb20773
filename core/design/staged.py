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
covered by the latter).
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, replace

import numpy as np

from ..actions.analysis import BeamResult, CombinationResult, creep_moduli
from ..actions.beam import CaseSolution, extremes
from ..actions.stages import StageSolutions
from ..model.errors import Problem
from ..section.transformed import Section, with_moduli
from .check import Check
from .common import unit_shear_stress

STAGED_NOTE = ("Staged loading: the before-loads and the existing plies' self-weight act "
               "on the existing plies alone, the rest on the built-up section; the two "
               "stages add.")


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


def _max_fibre(sol1: CaseSolution, sol2: CaseSolution, k1: float, k2: float,
               nodes: np.ndarray) -> tuple[float, float]:
    """Largest |k1 M1(x) + k2 M2(x)| along the member, and where (exact per element)."""
    best = (0.0, float(nodes[0]))
    for e in range(nodes.size - 1):
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
             stages: StageSolutions) -> Check:
    i2 = _index(built, c.ply or "")
    if i2 is None:
        return c
    i1 = _index(existing, c.ply or "")
    s1, s2 = _stage_pair(stages, combo.combination.factors)
    top2, bot2 = built.ply_extreme_stresses(1.0)
    top1, bot1 = existing.ply_extreme_stresses(1.0)
    k1 = (0.0, 0.0) if i1 is None else (float(top1[i1]), float(bot1[i1]))
    worst = max(_max_fibre(s1, s2, a, b, stages.model.nodes)
                for a, b in zip(k1, (float(top2[i2]), float(bot2[i2])), strict=True))
    return _replaced(c, *worst)


def _shear(c: Check, combo: CombinationResult, existing: Section, built: Section,
           stages: StageSolutions) -> Check:
    i2 = _index(built, c.ply or "")
    if i2 is None:
        return c
    i1 = _index(existing, c.ply or "")
    s1, s2 = _stage_pair(stages, combo.combination.factors)
    e1 = extremes(stages.model, s1, 1.0)
    e2 = extremes(stages.model, s2, 1.0)
    t1 = 0.0 if i1 is None else float(unit_shear_stress(existing)[i1])
    t2 = float(unit_shear_stress(built)[i2])
    demand = e1.V_max_abs * t1 + e2.V_max_abs * t2
    return _replaced(c, demand, e1.x_V_max_abs if e1.V_max_abs * t1 > e2.V_max_abs * t2
                     else e2.x_V_max_abs)


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


def _deflection(c: Check, beam: BeamResult, EI: tuple[float, float],
                EI_c: tuple[float, float], stages: StageSolutions) -> Check:
    combo = next((k for k in beam.combinations if k.name == c.combination), None)
    if c.id == "deflection-live" or combo is None:
        f: Mapping[str, float] = {c.combination or "": 1.0}
        sus = None
    else:
        f = combo.combination.factors
        sus = combo.sustained_factors if c.id == "deflection-long-term" else None
    sol = _deflection_solution(stages, f, sus, EI, EI_c)
    ext = extremes(stages.model, sol, EI[1])
    w, x = next(((abs(w), x) for name, w, x in ext.deflection_by_region
                 if name == c.location), (c.demand, c.x))
    return _replaced(c, w, x)


def staged_checks(checks: tuple[Check, ...], existing: Section, built: Section,
                  beam: BeamResult, stages: StageSolutions
                  ) -> tuple[tuple[Check, ...], list[Problem], StagesResult]:
    """The checks with staged demands, warnings, and both stages for the output."""
    combos = {c.name: c for c in beam.combinations}
    crept = with_moduli(existing, creep_moduli(existing, beam.creep_factor))
    EI = (existing.EI, built.EI)
    EI_c = (crept.EI, beam.creep_section.EI)
    out = []
    for c in checks:
        combo = combos.get(c.combination or "")
        if c.id == "bending" and combo is not None:
            out.append(_bending(c, combo, existing, built, stages))
        elif c.id == "shear" and combo is not None:
            out.append(_shear(c, combo, existing, built, stages))
        elif c.id.startswith("deflection"):
            out.append(_deflection(c, beam, EI, EI_c, stages))
        else:
            out.append(c)
    warnings = [Problem("plies", "staged loading: the combined bending and axial "
                        "checks, bearing, bolts and connectors are made for the finished "
                        "member under every load (not by stage)")]
    return tuple(out), warnings, _result(existing, built, beam, stages)


def _actions(which: str, sec: Section, combo: CombinationResult,
             stages: StageSolutions) -> StageActions:
    sol = stages.stage(which, combo.combination.factors)
    e = extremes(stages.model, sol, sec.EI)
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
