"""The pipeline: project -> section -> beam actions (with creep) -> design checks.

:func:`run` is the one simple entry. Work that many evaluations share (the beam meshed
and each load case solved once, the material table) lives in an :class:`Evaluator`,
built once for a project's beam and loads and asked for the analysis of any ply set;
sweeps, sizing and the desktop program use it.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass

from .actions.analysis import BeamResult, PreparedBeam, analyse_beams
from .design.check import Check
from .design.eu_lsd import eu_checks
from .design.material_notes import material_warnings
from .design.us_asd import us_checks
from .design.vibration import vibration_checks
from .model.design import DesignSpec
from .model.errors import MissingCheck, Problem
from .model.materials import Material
from .model.plies import Ply
from .model.project import Project
from .section.transformed import Section, analyse


@dataclass(frozen=True, eq=False)
class Analysis:
    """Everything computed for a project.

    Attributes:
        project: the project analysed (with the plies analysed).
        section: the transformed section.
        beam: the beam actions, or None when the project has no beam.
        design: the design choices used.
        checks: every design check (empty without a beam).
        warnings: named problems that did not stop the analysis.

    """

    project: Project
    section: Section
    beam: BeamResult | None
    design: DesignSpec
    checks: tuple[Check, ...]
    warnings: tuple[Problem, ...]

    @property
    def incomplete_reasons(self) -> tuple[Problem, ...]:
        """Checks the basis requires that could not be made, each naming its field."""
        reasons = tuple(w for w in self.warnings if isinstance(w, MissingCheck))
        if self.beam is None:
            reasons += (MissingCheck("beam", "is not given: no design checks are made"),)
        elif not self.checks:
            reasons += (MissingCheck("beam.loads", "no check could be made"),)
        return reasons

    @property
    def verdict(self) -> str:
        """"NOT OK" where a check fails, else "INCOMPLETE" where a required check could not
        be made, else "OK".
        """
        if any(not c.ok for c in self.checks):
            return "NOT OK"
        if self.incomplete_reasons:
            return "INCOMPLETE"
        return "OK"


def run_checks(project: Project, section: Section, beam: BeamResult,
               design: DesignSpec) -> tuple[tuple[Check, ...], list[Problem]]:
    """Every check of the project's design basis, with warnings."""
    if design.us:
        checks, warnings = us_checks(project, section, beam, design)
    else:
        checks, warnings = eu_checks(project, section, beam, design)
    checks += vibration_checks(project, section, beam, design, warnings)
    return checks, warnings


class Evaluator:
    """A project's beam prepared once, asked for the analysis of many ply sets.

    The mesh and each load case's solution depend only on the beam and its loads, so
    they are computed here once; each evaluation redoes the section, the scaling of the
    cases by its stiffness and self-weight, and the checks.
    """

    def __init__(self, project: Project):
        self.project = project
        self.design = project.design_or_default()
        self.materials: Mapping[str, Material] = project.all_materials()
        self.beam = (PreparedBeam.of(project.beam, self.design) if project.beam is not None
                     else None)

    def section(self, plies: Sequence[Ply], reference: str | None = None) -> Section:
        """The transformed section of ``plies``."""
        return analyse(tuple(plies), self.materials,
                       reference or self.project.reference_material)

    def analyse(self, plies: Sequence[Ply], reference: str | None = None) -> Analysis:
        """The full analysis of the project with these plies."""
        return self.analyse_many([plies], reference)[0]

    def analyse_sections(self, plies: Sequence[Ply], section: Section) -> Analysis:
        """The analysis of these plies whose section is already known."""
        return self._finish([tuple(plies)], [section])[0]

    def analyse_many(self, candidates: Sequence[Sequence[Ply]],
                     reference: str | None = None) -> list[Analysis]:
        """Analyses of many ply sets; the beam extremes of all of them in one pass."""
        sections = [self.section(p, reference) for p in candidates]
        return self._finish([tuple(p) for p in candidates], sections)

    def _finish(self, candidates: list[tuple[Ply, ...]],
                sections: list[Section]) -> list[Analysis]:
        beams: list[BeamResult | None]
        if self.beam is None:
            beams = [None] * len(sections)
        else:
            beams = list(analyse_beams(self.beam, sections, self.design))
        out = []
        for plies, section, beam in zip(candidates, sections, beams, strict=True):
            project = self.project.with_plies(plies)
            warnings = list(section.warnings)
            warnings += self._density_warnings(plies)
            checks: tuple[Check, ...] = ()
            if beam is not None:
                checks, check_warnings = run_checks(project, section, beam, self.design)
                warnings.extend(check_warnings)
            warnings += material_warnings(section, beam, project.display_units)
            out.append(Analysis(project, section, beam, self.design, checks, tuple(warnings)))
        return out

    def _density_warnings(self, plies: Sequence[Ply]) -> list[Problem]:
        spec = self.project.beam
        if spec is None or not spec.self_weight:
            return []
        return [Problem(f"materials.{mid}.density", "is not given: the self-weight of its "
                        "plies is left out")
                for mid in sorted({p.material for p in plies})
                if self.materials[mid].density <= 0]


def run(project: Project, reference: str | None = None) -> Analysis:
    """Analyse a project: section, beam and (where it has a beam) the design checks.

    Args:
        project: the project.
        reference: the material whose modulus the section is transformed to (default:
            the project's reference material, else the first ply's).

    """
    return Evaluator(project).analyse(project.plies, reference)
