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
    """Actions of one combination (SI; deflection positive downward)."""

    combination: Combination
    duration: str
    solution: CaseSolution
    extremes: Extremes
    sustained_factors: dict[str, float]
    long_term: Extremes | None
    short_term_rest: Extremes | None
    total: Extremes
    total_solution: CaseSolution
    M_governing: float
    M_sustained: float

    @property
    def name(self) -> str:
        """The combination's name."""
        return self.combination.name


@dataclass(frozen=True, eq=False)
class BeamResult:
    """Beam actions for every case and combination."""

    spec: BeamSpec
    model: BeamModel
    cases: dict[str, CaseSolution]
    case_extremes: dict[str, Extremes]
    combinations: tuple[CombinationResult, ...]
    creep_factor: float
    creep_section: Section
    self_weight_line: float
    basis: str


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
    if isinstance(spec.combinations, str):
        if spec.combinations == "EN1990":
            return en1990_combinations(present, design.psi)
        return asd_combinations(present)
    return spec.combinations


def creep_moduli(section: Section, factor: float) -> np.ndarray:
    """Per-ply moduli under sustained load: timber divided by the creep factor."""
    return np.array([m.E / factor if m.kind == "timber" else m.E for m in section.materials])


def analyse_beam(project: Project, section: Section, design: DesignSpec) -> BeamResult:
    """Solve every case and combination of the project's beam."""
    spec = project.beam
    if spec is None:
        raise ProjectError(Problem("beam", "the project has no beam"))
    basis = "US" if design.us else "EU"
    model = BeamModel(spec.layout, spec.loads)
    sw = section.mass_per_length * GRAVITY if spec.self_weight else 0.0
    cases: dict[str, CaseSolution] = {}
    present = sorted({ld.case for ld in spec.loads} | ({"D"} if spec.self_weight else set()))
    for case in present:
        cases[case] = model.solve([ld for ld in spec.loads if ld.case == case],
                                  extra_line=sw if case == "D" else 0.0)
    EI = section.EI
    case_ext = {c: extremes(model, s, EI) for c, s in cases.items()}
    products = [m.product for m in section.materials if m.kind == "timber"]
    factor = design.creep_factor(products[0] if products else "sawn")
    creep_section = with_moduli(section, creep_moduli(section, factor))
    EI_c = creep_section.EI
    frac = spec.sustained_live_fraction or 0.0
    results = []
    for combo in combinations_for(spec, basis, design):
        sol = combine(cases, combo.factors)
        if sol is None:
            continue
        ext = extremes(model, sol, EI)
        sus_f = {c: f * (1.0 if c == "D" else frac) for c, f in combo.factors.items()
                 if c in ("D", "L") and c in cases}
        sus = combine(cases, sus_f)
        rest_f = {c: f - sus_f.get(c, 0.0) for c, f in combo.factors.items()}
        rest = combine(cases, rest_f)
        long_ext = extremes(model, sus, EI_c) if sus is not None else None
        rest_ext = extremes(model, rest, EI) if rest is not None else None
        if sus is not None:
            total_sol = sus.scaled(EI / EI_c) if rest is None else sus.scaled(EI / EI_c) + rest
        else:
            total_sol = sol
        total = extremes(model, total_sol, EI)
        m_gov = ext.M_max if abs(ext.M_max) >= abs(ext.M_min) else ext.M_min
        m_sus = 0.0
        if long_ext is not None:
            m_sus = long_ext.M_max if abs(long_ext.M_max) >= abs(long_ext.M_min) else (
                long_ext.M_min)
        results.append(CombinationResult(combo, duration_of(combo, basis), sol, ext, sus_f,
                                         long_ext, rest_ext, total, total_sol, m_gov,
                                         m_sus))
    if not results:
        raise ProjectError(Problem("beam.combinations", "no combination has a load case that "
                                   "the beam carries"))
    return BeamResult(spec, model, cases, case_ext, tuple(results), factor, creep_section, sw,
                      basis)


def run(project: Project, reference: str | None = None, with_checks: bool = True) -> Analysis:
    """Analyse a project: section, beam and (where it has a beam) the design checks."""
    mats = project.all_materials()
    section = analyse(project.plies, mats, reference or project.reference_material)
    design = project.design_or_default()
    beam = analyse_beam(project, section, design) if project.beam is not None else None
    warnings = list(section.warnings)
    checks: tuple[Any, ...] = ()
    if beam is not None and with_checks:
        from core.checks import run_checks

        checks, check_warnings = run_checks(project, section, beam, design)
        warnings.extend(check_warnings)
    return Analysis(project, section, beam, design, checks, tuple(warnings))
