"""Beam actions of a project for one section: every load case and combination, with creep.

Self-weight (g = 9.80665 m/s^2, standard gravity) joins case D. Creep: the sustained part
of each combination (its D, plus ``sustained_live_fraction`` of its L) acts on the
section with timber moduli divided by the creep factor (NDS 2018 3.5.2 K_cr, or
1 + k_def per EN 1995-1-1 2.3.2.2, from memory); steel does not creep, so the section is
re-transformed and the steel takes a larger share of that moment. The rest acts on the
short-term section. Total deflection = long-term part + short-term part.

The beam's mesh and stiffness do not depend on the section and every case is linear in
its loads, so :class:`PreparedBeam` solves each case once (self-weight as a unit case);
:func:`analyse_beams` then scales and combines them for any number of sections and
reduces every solution to its extremes in one batched pass.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass

import numpy as np

from ..codes import en1995, nds
from ..model.combination import Combination, duration_of
from ..model.constants import GRAVITY
from ..model.design import DesignSpec
from ..model.errors import Problem, ProjectError
from ..model.member import BeamSpec
from ..section.transformed import Section, with_moduli
from .beam import BeamModel, CaseSolution, Extremes, combine, extremes_many
from .combinations import asd_combinations, en1990_combinations


@dataclass(frozen=True, eq=False)
class CombinationResult:
    """Actions of one combination (SI; deflection positive downward).

    Attributes:
        combination: the combination.
        duration: its load-duration class.
        solution: the combination on the short-term section.
        extremes: extremes of ``solution`` (short-term EI).
        sustained_factors: factors of its sustained part, per case.
        sustained: the sustained part, or None.
        rest: the part that is not sustained, or None.
        total: extremes of the total with creep (sustained part on the creep section).
        total_solution: the solution whose deflection is that total.
        long_term: extremes of the sustained part on the creep section, or None.
        short_term_rest: extremes of the rest on the short-term section, or None.
        M_governing: the moment of largest magnitude, N m.
        model: the beam mesh.
        EI: short-term stiffness, N m^2.
        EI_creep: stiffness of the creep section, N m^2.

    """

    combination: Combination
    duration: str
    solution: CaseSolution
    extremes: Extremes
    sustained_factors: Mapping[str, float]
    sustained: CaseSolution | None
    rest: CaseSolution | None
    total: Extremes
    total_solution: CaseSolution
    long_term: Extremes | None
    short_term_rest: Extremes | None
    M_governing: float
    model: BeamModel
    EI: float
    EI_creep: float

    @property
    def name(self) -> str:
        """The combination's name."""
        return self.combination.name

    @property
    def M_sustained(self) -> float:
        """Sustained moment of largest magnitude, N m."""
        e = self.long_term
        if e is None:
            return 0.0
        return e.M_max if abs(e.M_max) >= abs(e.M_min) else e.M_min


@dataclass(frozen=True, eq=False)
class BeamResult:
    """Beam actions for every case and combination.

    Attributes:
        spec: the beam as entered.
        model: the mesh.
        cases: solution of every load case alone (EI = 1 scaling as in CaseSolution).
        case_extremes: extremes of every case alone (short-term EI).
        combinations: every combination that carries a load.
        creep_factor: K_cr or 1 + k_def.
        creep_section: the section with crept timber moduli.
        self_weight_line: self-weight, N/m.
        basis: "US" or "EU".
        EI: short-term stiffness, N m^2.

    """

    spec: BeamSpec
    model: BeamModel
    cases: Mapping[str, CaseSolution]
    case_extremes: Mapping[str, Extremes]
    combinations: tuple[CombinationResult, ...]
    creep_factor: float
    creep_section: Section
    self_weight_line: float
    basis: str
    EI: float

    def extremes_of(self, case: str) -> Extremes:
        """Extremes of one load case alone (short-term EI)."""
        return self.case_extremes[case]


@dataclass(frozen=True, eq=False)
class PreparedBeam:
    """A beam solved once for every section: mesh, each case without self-weight, and
    the solution of a unit self-weight (1 N/m) where the member's weight counts.
    """

    spec: BeamSpec
    model: BeamModel
    cases: Mapping[str, CaseSolution]
    unit_self_weight: CaseSolution | None

    @staticmethod
    def of(spec: BeamSpec) -> PreparedBeam:
        """Mesh the beam and solve each of its load cases."""
        model = BeamModel(spec.layout, spec.loads)
        cases = {c: model.solve([ld for ld in spec.loads if ld.case == c])
                 for c in sorted({ld.case for ld in spec.loads})}
        unit = model.solve([], extra_line=1.0) if spec.self_weight else None
        return PreparedBeam(spec, model, cases, unit)

    def cases_with_self_weight(self, self_weight: float) -> dict[str, CaseSolution]:
        """Every case's solution, the self-weight (N/m) added to case D."""
        cases = dict(self.cases)
        if self.unit_self_weight is not None:
            own = self.unit_self_weight.scaled(self_weight)
            cases["D"] = cases["D"] + own if "D" in cases else own
        return cases


def combinations_for(spec: BeamSpec, basis: str, design: DesignSpec) -> tuple[Combination, ...]:
    """The combinations of a beam: the named set or the user's list."""
    present = {ld.case for ld in spec.loads}
    if spec.self_weight:
        present.add("D")
    chosen = spec.combinations
    if chosen is None:
        chosen = "ASD" if basis == "US" else "EN1990"
    if isinstance(chosen, str):
        if chosen == "EN1990":
            return en1990_combinations(present, design.psi)
        return asd_combinations(present)
    return chosen


def creep_factor(section: Section, design: DesignSpec) -> float:
    """The creep factor of the section's timber: NDS 2018 3.5.2 K_cr or
    1 + k_def of EN 1995-1-1 Table 3.2 (from memory), unless the user gives one.
    """
    if design.us:
        return design.K_cr if design.K_cr is not None else nds.K_cr(design.wet_service)
    # k_def of Table 3.2 is the same for solid timber, glulam and LVL
    k_def = design.k_def if design.k_def is not None else en1995.k_def(design.service_class)
    return 1.0 + k_def


def creep_moduli(section: Section, factor: float) -> np.ndarray:
    """Per-ply moduli under sustained load: timber divided by the creep factor."""
    return np.array([m.E / factor if m.kind == "timber" else m.E for m in section.materials])


@dataclass(frozen=True)
class _Parts:
    """A combination split into its sustained part and the rest."""

    solution: CaseSolution
    sustained_factors: dict[str, float]
    sustained: CaseSolution | None
    rest: CaseSolution | None
    total_solution: CaseSolution


def _combination_parts(cases: Mapping[str, CaseSolution], combo: Combination, frac: float,
                       EI: float, EI_c: float) -> _Parts | None:
    """A combination's solution, its sustained factors and part, the rest, and the
    solution whose deflection is the total with creep (sustained part scaled by
    EI / EI_creep). None when the beam carries none of its cases.
    """
    sol = combine(cases, combo.factors)
    if sol is None:
        return None
    sus_f = {c: f * (1.0 if c == "D" else frac) for c, f in combo.factors.items()
             if c in ("D", "L") and c in cases}
    sus = combine(cases, sus_f)
    rest = combine(cases, {c: f - sus_f.get(c, 0.0) for c, f in combo.factors.items()})
    if sus is not None:
        total_sol = sus.scaled(EI / EI_c) if rest is None else sus.scaled(EI / EI_c) + rest
    else:
        total_sol = sol
    return _Parts(sol, sus_f, sus, rest, total_sol)


def analyse_beam(prepared: PreparedBeam, section: Section, design: DesignSpec) -> BeamResult:
    """Solve every case and combination of the beam for one section."""
    return analyse_beams(prepared, [section], design)[0]


def analyse_beams(prepared: PreparedBeam, sections: Sequence[Section],
                  design: DesignSpec) -> list[BeamResult]:
    """Solve every case and combination of the beam for each section; the extremes of
    every solution of every section come from one batched pass.
    """
    spec = prepared.spec
    basis = "US" if design.us else "EU"
    combos = combinations_for(spec, basis, design)
    frac = spec.sustained_live_fraction or 0.0
    solutions: list[CaseSolution] = []
    stiffness: list[float] = []

    def ask(sol: CaseSolution, EI: float) -> int:
        solutions.append(sol)
        stiffness.append(EI)
        return len(solutions) - 1

    plans = []
    for section in sections:
        sw = section.mass_per_length * GRAVITY if spec.self_weight else 0.0
        cases = prepared.cases_with_self_weight(sw)
        factor = creep_factor(section, design)
        creep_section = with_moduli(section, creep_moduli(section, factor))
        EI, EI_c = section.EI, creep_section.EI
        case_idx = {c: ask(s, EI) for c, s in cases.items()}
        combo_plans = []
        for combo in combos:
            parts = _combination_parts(cases, combo, frac, EI, EI_c)
            if parts is None:
                continue
            idx = (ask(parts.solution, EI), ask(parts.total_solution, EI),
                   None if parts.sustained is None else ask(parts.sustained, EI_c),
                   None if parts.rest is None else ask(parts.rest, EI))
            combo_plans.append((combo, parts, idx))
        if not combo_plans:
            raise ProjectError(Problem("beam.combinations", "no combination has a load case "
                                       "that the beam carries"))
        plans.append((sw, cases, factor, creep_section, case_idx, combo_plans))
    ext = extremes_many(prepared.model, solutions, stiffness)
    out = []
    for section, (sw, cases, factor, creep_section, case_idx, combo_plans) in zip(
            sections, plans, strict=True):
        results = []
        for combo, parts, (i_sol, i_tot, i_sus, i_rest) in combo_plans:
            e = ext[i_sol]
            results.append(CombinationResult(
                combination=combo, duration=duration_of(combo, basis), solution=parts.solution,
                extremes=e, sustained_factors=parts.sustained_factors,
                sustained=parts.sustained, rest=parts.rest, total=ext[i_tot],
                total_solution=parts.total_solution,
                long_term=None if i_sus is None else ext[i_sus],
                short_term_rest=None if i_rest is None else ext[i_rest],
                M_governing=e.M_max if abs(e.M_max) >= abs(e.M_min) else e.M_min,
                model=prepared.model, EI=section.EI, EI_creep=creep_section.EI))
        out.append(BeamResult(
            spec=spec, model=prepared.model, cases=cases,
            case_extremes={c: ext[i] for c, i in case_idx.items()},
            combinations=tuple(results), creep_factor=factor, creep_section=creep_section,
            self_weight_line=sw, basis=basis, EI=section.EI))
    return out
