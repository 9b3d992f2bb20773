"""The pipeline: project -> section -> beam actions (with creep) -> design checks.

Self-weight (g = 9.80665 m/s^2, standard gravity) joins case D. Creep: the sustained part
of each combination (its D, plus ``sustained_live_fraction`` of its L) acts on the
section with timber moduli divided by the creep factor (NDS 2018 3.5.2 K_cr, or
1 + k_def per EN 1995-1-1 2.3.2.2, from memory); steel does not creep, so the section is
re-transformed and the steel takes a larger share of that moment. The rest acts on the
short-term section. Total deflection = long-term part + short-term part.
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import cached_property
from typing import Any

import numpy as np

from core.beam import BeamModel, CaseSolution, Extremes, combine, extremes
from core.combinations import (
    Combination,
    asd_combinations,
    duration_of,
    en1990_combinations,
)
from core.design import DesignSpec
from core.errors import Problem, ProjectError
from core.project import BeamSpec, Project
from core.section import Section, analyse, with_moduli

GRAVITY = 9.80665


@dataclass(frozen=True, eq=False)
class CombinationResult:
    """Actions of one combination (SI; deflection positive downward).

    The creep parts (long-term, short-term rest) are computed when first asked for.
    """

    combination: Combination
    duration: str
    solution: CaseSolution
    extremes: Extremes
    sustained_factors: dict[str, float]
    sustained: CaseSolution | None
    rest: CaseSolution | None
    total: Extremes
    total_solution: CaseSolution
    M_governing: float
    model: BeamModel
    EI: float
    EI_creep: float

    @property
    def name(self) -> str:
        """The combination's name."""
        return self.combination.name

    @cached_property
    def long_term(self) -> Extremes | None:
        """Sustained part on the creep section."""
        return None if self.sustained is None else extremes(self.model, self.sustained,
                                                            self.EI_creep)

    @cached_property
    def short_term_rest(self) -> Extremes | None:
        """The rest (not sustained) on the short-term section."""
        return None if self.rest is None else extremes(self.model, self.rest, self.EI)

    @property
    def M_sustained(self) -> float:
        """Sustained moment of largest magnitude, N m."""
        e = self.long_term
        if e is None:
            return 0.0
        return e.M_max if abs(e.M_max) >= abs(e.M_min) else e.M_min


@dataclass(frozen=True, eq=False)
class BeamResult:
    """Beam actions for every case and combination."""

    spec: BeamSpec
    model: BeamModel
    cases: dict[str, CaseSolution]
    combinations: tuple[CombinationResult, ...]
    creep_factor: float
    creep_section: Section
    self_weight_line: float
    basis: str
    EI: float

    @cached_property
    def case_extremes(self) -> dict[str, Extremes]:
        """Extremes of every load case alone (short-term EI)."""
        return {c: self.extremes_of(c) for c in self.cases}

    def extremes_of(self, case: str) -> Extremes:
        """Extremes of one load case alone (short-term EI), computed once."""
        cache: dict[str, Extremes] = self.__dict__.setdefault("_case_cache", {})
        if case not in cache:
            cache[case] = extremes(self.model, self.cases[case], self.EI)
        return cache[case]


@dataclass(frozen=True, eq=False)
class Analysis:
    """Everything computed for a project."""

    project: Project
    section: Section
    beam: BeamResult | None
    design: DesignSpec
    checks: tuple[Any, ...]
    warnings: tuple[Problem, ...]


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


def creep_moduli(section: Section, factor: float) -> np.ndarray:
    """Per-ply moduli under sustained load: timber divided by the creep factor."""
    return np.array([m.E / factor if m.kind == "timber" else m.E for m in section.materials])


#: A beam solved once for reuse: model, per-case solutions without self-weight, and the
#: solution for a unit self-weight (N/m) or None.
Prepared = tuple[BeamModel, dict[str, CaseSolution], CaseSolution | None]


def combination_parts(cases: dict[str, CaseSolution], combo: Combination, frac: float,
                      EI: float, EI_c: float) -> tuple[CaseSolution, dict[str, float],
                                                       CaseSolution | None,
                                                       CaseSolution | None,
                                                       CaseSolution] | None:
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
    return sol, sus_f, sus, rest, total_sol


def beam_cases(spec: BeamSpec, sw: float, prepared: Prepared | None
               ) -> tuple[BeamModel, dict[str, CaseSolution]]:
    """The mesh and the solution of every load case, self-weight (N/m) in case D."""
    present = sorted({ld.case for ld in spec.loads} | ({"D"} if spec.self_weight else set()))
    if prepared is None:
        model = BeamModel(spec.layout, spec.loads)
        return model, {case: model.solve([ld for ld in spec.loads if ld.case == case],
                                         extra_line=sw if case == "D" else 0.0)
                       for case in present}
    model, base, unit_sw = prepared
    cases = dict(base)
    if spec.self_weight and unit_sw is not None:
        own = unit_sw.scaled(sw)
        cases["D"] = cases["D"] + own if "D" in cases else own
    return model, cases


#: Extremes already computed for a candidate: ("combo" | "total" | "case", name).
Precomputed = dict[tuple[str, str], Extremes]


def analyse_beam(project: Project, section: Section, design: DesignSpec,
                 prepared: Prepared | None = None,
                 precomputed: Precomputed | None = None) -> BeamResult:
    """Solve every case and combination of the project's beam (reusing ``prepared``
    solutions and ``precomputed`` extremes where given).
    """
    spec = project.beam
    if spec is None:
        raise ProjectError(Problem("beam", "the project has no beam"))
    basis = "US" if design.us else "EU"
    sw = section.mass_per_length * GRAVITY if spec.self_weight else 0.0
    model, cases = beam_cases(spec, sw, prepared)
    EI = section.EI
    factor = creep_factor_of(section, design)
    creep_section = with_moduli(section, creep_moduli(section, factor))
    EI_c = creep_section.EI
    frac = spec.sustained_live_fraction or 0.0
    pre = precomputed or {}
    results = []
    for combo in combinations_for(spec, basis, design):
        parts = combination_parts(cases, combo, frac, EI, EI_c)
        if parts is None:
            continue
        sol, sus_f, sus, rest, total_sol = parts
        ext = pre.get(("combo", combo.name)) or extremes(model, sol, EI)
        total = pre.get(("total", combo.name)) or extremes(model, total_sol, EI)
        m_gov = ext.M_max if abs(ext.M_max) >= abs(ext.M_min) else ext.M_min
        results.append(CombinationResult(combo, duration_of(combo, basis), sol, ext, sus_f,
                                         sus, rest, total, total_sol, m_gov, model, EI, EI_c))
    if not results:
        raise ProjectError(Problem("beam.combinations", "no combination has a load case that "
                                   "the beam carries"))
    result = BeamResult(spec, model, cases, tuple(results), factor, creep_section, sw, basis,
                        EI)
    cache = {name: e for (kind, name), e in pre.items() if kind == "case"}
    if cache:
        result.__dict__["_case_cache"] = cache
    return result


def creep_factor_of(section: Section, design: DesignSpec) -> float:
    """The creep factor for the section's (first) timber product."""
    products = [m.product for m in section.materials if m.kind == "timber"]
    return design.creep_factor(products[0] if products else "sawn")


def run(project: Project, reference: str | None = None, prepared: Prepared | None = None,
        precomputed: Precomputed | None = None, section: Section | None = None) -> Analysis:
    """Analyse a project: section, beam and (where it has a beam) the design checks.

    ``prepared`` reuses a beam already solved for these spans and loads, ``precomputed``
    extremes found for many candidates at once, ``section`` a section already analysed
    (see core.compare.Evaluator).
    """
    mats = project.all_materials()
    if section is None:
        section = analyse(project.plies, mats, reference or project.reference_material)
    design = project.design_or_default()
    beam = (analyse_beam(project, section, design, prepared, precomputed)
            if project.beam is not None else None)
    warnings = list(section.warnings)
    if project.beam is not None and project.beam.self_weight:
        for mid in sorted({p.material for p in project.plies}):
            if mats[mid].density <= 0:
                warnings.append(Problem(f"materials.{mid}.density", "is not given: the "
                                        "self-weight of its plies is left out"))
    checks: tuple[Any, ...] = ()
    if beam is not None:
        from core.checks import run_checks

        checks, check_warnings = run_checks(project, section, beam, design)
        warnings.extend(check_warnings)
    return Analysis(project, section, beam, design, checks, tuple(warnings))
