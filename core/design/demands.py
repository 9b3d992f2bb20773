"""Ply stresses of a combination for the strength checks: both extreme moments, and the
state with creep where the standard asks for it.

US (NDS 2018 3.5.2, from memory, and common practice for members of different creep):
the sustained part acts on the section with timber moduli divided by K_cr, the rest on
the short-term section. EU (EN 1995-1-1 2.3.2.2(2), from memory): at ULS the timber moduli
are E_mean / (1 + psi2 k_def), psi2 of the action causing the largest stress in relation
to the strength, 1.0 where that action is permanent (see :func:`governing_action`). Both
the instantaneous and the final state must hold; each ply's demand is the larger (the
timber usually governs at once, the steel after creep).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..actions.analysis import BeamResult, CombinationResult
from ..codes import en1995 as ec5
from ..model.combination import EN1990_PSI, EU_CASE_DURATION, eu_duration
from ..model.design import DesignSpec
from ..section.transformed import Section, with_moduli
from .memo import once, with_partner


@dataclass(frozen=True)
class PlyDemand:
    """The stress demand of one ply under one extreme moment.

    Attributes:
        sign: +1 for the sagging extreme (top edge in compression), -1 for hogging.
        M: the moment, N m.
        x: where it acts, m.
        stress: the largest |stress| at the ply's extreme fibres, Pa.
        axial: the stress at the ply's centroid (tension positive), Pa.
        bending: the largest |stress| about the ply's own centroid, Pa.
        state: "instantaneous" or "with creep".
        compression: True where some of the ply is in compression.

    """

    sign: int
    M: float
    x: float
    stress: float
    axial: float
    bending: float
    state: str
    compression: bool


def _ply_state(section: Section, i: int, M: float, sustained: float | None,
               creep: Section | None) -> tuple[float, float, float, bool]:
    """(|extreme stress|, centroid stress, |own bending stress|, any compression)."""
    def stresses(sec: Section, m: float) -> np.ndarray:
        top, bot = sec.ply_extreme_stresses(m)
        mid = sec.centroid_stress(m, i)
        return np.array([float(top[i]), float(bot[i]), mid])

    if creep is None:
        s = stresses(section, M)
    elif sustained is None:
        s = stresses(creep, M)
    else:
        s = stresses(creep, sustained) + stresses(section, M - sustained)
    ext = float(max(abs(s[0]), abs(s[1])))
    own = float(max(abs(s[0] - s[2]), abs(s[1] - s[2])))
    return ext, float(s[2]), own, bool(min(s[0], s[1]) < 0)


def governing_action(beam: BeamResult, combo: CombinationResult, design: DesignSpec) -> str:
    """The case of a ULS combination that causes the largest stress in relation to the
    strength (EN 1995-1-1 2.3.2.2(2)): each case's design moment, its factor times its
    largest |M| alone over the member, divided by k_mod of its own duration class (Table
    3.1; the strength the stress is related to); the first of equal ones, D before the
    variable cases.
    """
    def weight(case: str, factor: float) -> float:
        ext = beam.extremes_of(case)
        moment = factor * max(abs(ext.M_max), abs(ext.M_min))
        return moment / ec5.k_mod(eu_duration(EU_CASE_DURATION.get(case, "permanent")),
                                  design.service_class)

    acting = sorted(((c, f) for c, f in combo.combination.factors.items()
                     if f > 0 and c in beam.case_extremes), key=lambda cf: cf[0] != "D")
    if not acting:
        return "D"
    return max(acting, key=lambda cf: weight(*cf))[0]


def eu_psi2(beam: BeamResult, combo: CombinationResult, design: DesignSpec) -> float:
    """psi2 of the final moduli of a ULS combination (EN 1995-1-1 2.3.2.2(2)): that of
    :func:`governing_action`, 1.0 where it is permanent (D); found once per combination
    and design.
    """
    def make() -> float:
        case = governing_action(beam, combo, design)
        return 1.0 if case == "D" else {**EN1990_PSI, **design.psi}[case][2]
    return with_partner(combo, "eu_psi2", design, make)


def eu_uls_section(section: Section, beam: BeamResult, combo: CombinationResult,
                   design: DesignSpec) -> Section:
    """The section with timber moduli E_mean / (1 + psi2 k_def) for a ULS combination
    (:func:`eu_psi2`).
    """
    psi2 = eu_psi2(beam, combo, design)
    k_def = beam.creep_factor - 1.0

    def make() -> Section:
        moduli = np.array([e / (1 + psi2 * k_def) if m.kind == "timber" else e
                           for m, e in zip(section.materials, section.E, strict=True)])
        return with_moduli(section, moduli)
    return once(section, ("eu_uls_section", psi2, k_def), make)


def ply_demands(section: Section, beam: BeamResult, combo: CombinationResult, i: int,
                design: DesignSpec, eu_final: Section | None = None
                ) -> tuple[PlyDemand, ...]:
    """The demands of ply i at the sagging and hogging extremes of the combination (only
    those that are nonzero), each the worse of the instantaneous and the final state;
    found once per section, combination, ply and final section (the checks of a ply and
    its net section at the holes ask for them again).
    """
    key = ("ply_demands", i, None if eu_final is None else id(eu_final),
           id(beam.creep_section))
    return with_partner(combo, key, section,
                        lambda: tuple(_ply_demands(section, beam, combo, i, eu_final)))


def _ply_demands(section: Section, beam: BeamResult, combo: CombinationResult, i: int,
                 eu_final: Section | None) -> list[PlyDemand]:
    e = combo.extremes
    out = []
    for sign, M, x, M_sus in ((1, e.M_max, e.x_M_max, combo.M_sustained_at_max),
                              (-1, e.M_min, e.x_M_min, combo.M_sustained_at_min)):
        if sign * M <= 0:
            continue
        inst = _ply_state(section, i, M, None, None)
        if eu_final is not None:
            fin = _ply_state(section, i, M, None, eu_final)
        elif beam.basis == "US" and M_sus:
            fin = _ply_state(section, i, M, M_sus, beam.creep_section)
        else:
            fin = inst
        use, state = (fin, "with creep") if fin[0] > inst[0] * (1 + 1e-12) else (
            inst, "instantaneous")
        out.append(PlyDemand(sign, M, x, use[0], use[1], use[2], state, use[3]))
    return out
