"""The pipeline: project -> section -> beam actions (with creep) -> design checks.

:func:`run` is the one simple entry. Work that many evaluations share (the beam meshed
and each load case solved once, the material table) lives in an :class:`Evaluator`,
built once for a project's beam and loads and asked for the analysis of any ply set;
sweeps, sizing and the desktop program use it.
"""

from __future__ import annotations

import math
from collections.abc import Iterator, Mapping, Sequence
from contextlib import contextmanager
from dataclasses import dataclass

import numpy as np

from .actions.analysis import (
    BeamResult,
    PreparedBeam,
    Stepping,
    analyse_beams,
    analyse_stepped,
    creep_factor,
    creep_moduli,
)
from .actions.stages import is_staged, stage_solutions, stepped_stage_solutions
from .design.bolt_checks import PlateLayout
from .design.check import Check
from .design.common import other_basis_fields, unapplied_overrides, unused_bolt_fields
from .design.eu_lsd import eu_checks
from .design.material_notes import material_warnings
from .design.memo import with_partner
from .design.openings import opening_checks
from .design.segmented import SegmentResult, segment_results, segmented_checks
from .design.service_moduli import service_materials
from .design.staged import StagePart, StagesResult, stage_stiffness, staged_checks
from .design.us_asd import us_checks
from .design.vibration import vibration_checks
from .model.constants import GRAVITY
from .model.design import Bolt, DesignSpec
from .model.errors import MissingCheck, Problem, ProjectError
from .model.materials import Material
from .model.plies import Ply
from .model.project import Project
from .model.units import fmt
from .section.gamma import with_slip
from .section.segments import Segment, is_stepped, segment_sections, segments_of
from .section.transformed import Section, analyse, falls_apart, with_moduli

#: Most plies analysed at once, far more than any built-up member has. The checks of
#: side-by-side plies grow with the cube of their number (one run each, one desktop
#: core): 1,000 such plies took more than 300 s, 400 about 64 s, 200 about 3.4 s and 100
#: about 0.44 s for one analysis; ``span`` (a search over many analyses) about 25 s at
#: 100. So the bound is 100 until that growth is removed.
MAX_PLIES = 100
#: Plain sections an Evaluator remembers (those of its latest candidates).
PLAIN_SECTIONS_HELD = 64


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
        segments: where some ply stops short of the member's ends, every stretch of
            constant section with its section and actions (empty otherwise).
        stages: both stages of a member strengthened under load (None otherwise).
        layouts: the bolt layout of every plate whose bolts are checked, in ply order (a
            plate whose bolts cannot be valued has none).

    """

    project: Project
    section: Section
    beam: BeamResult | None
    design: DesignSpec
    checks: tuple[Check, ...]
    warnings: tuple[Problem, ...]
    segments: tuple[SegmentResult, ...] = ()
    stages: StagesResult | None = None
    layouts: tuple[PlateLayout, ...] = ()

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


def _default_bolt(design: DesignSpec, system: str) -> Problem:
    """The word that the plates' bolts are the program's default values (given in the
    file or not, they are the same values, so the word cannot say which).
    """
    b = design.bolt
    strength = (f"F_yb {fmt(b.Fyb, 'stress', system)}" if design.us
                else f"f_u {fmt(b.fu, 'stress', system)}")
    return Problem("design.bolt", f"the plates' bolts are the program's default, "
                   f"{fmt(b.diameter, 'length', system)} diameter, {strength}, {b.rows} rows "
                   "(design.bolt gives nothing else): give design.bolt for the bolts to be "
                   "used")


def run_checks(project: Project, section: Section, beam: BeamResult, design: DesignSpec,
               layouts: list[PlateLayout] | None = None, segment: bool = False
               ) -> tuple[tuple[Check, ...], list[Problem]]:
    """Every check of the project's design basis, with warnings (``layouts``, where given,
    receives the bolt layout of every plate the checks place; ``segment``: a segment's
    run, where of the bolt checks only the timbers' net-section shear is made).
    """
    if design.us:
        checks, warnings = us_checks(project, section, beam, design, layouts, segment)
    else:
        checks, warnings = eu_checks(project, section, beam, design, layouts, segment)
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
        # US-ASD: timber stiffness with E' = E C_M C_t C_i (NDS 2018 4.3.1)
        self.materials: Mapping[str, Material] = service_materials(
            project.all_materials(), self.design)
        self._prepared: PreparedBeam | None = None
        if project.beam is not None and not is_stepped(project.plies,
                                                       project.beam.layout.length):
            self._prepare()  # the beam's faults are named now, as it is prepared
        #: Plain transformed sections made lately, by the identities of their plies and
        #: the resolved reference material (the plies held, so that no identity is reused).
        self._plain: dict[tuple[tuple[int, ...], str], tuple[tuple[Ply, ...], Section]] = {}

    @property
    def beam(self) -> PreparedBeam | None:
        """The member of constant stiffness prepared once: its mesh, each load case solved
        and the arrangements planned (None without a beam). Made with the Evaluator where
        the project's plies run the whole length, else when first asked: a member whose
        plies stop short of its ends is prepared on its stepped stiffness instead, so it
        asks for this only for a candidate whose plies all run through.
        """
        return self._prepare()

    def _prepare(self) -> PreparedBeam | None:
        if self._prepared is None and self.project.beam is not None:
            with _guarded():
                self._prepared = PreparedBeam.of(self.project.beam, self.design)
        return self._prepared

    def section(self, plies: Sequence[Ply], reference: str | None = None,
                net: bool = False) -> Section:
        """The transformed section of ``plies``; stacked plies joined by mechanical
        fasteners with their slip (EN 1995-1-1 Annex B, ``section.gamma``). Plies that
        form no one section are refused, except in a net section at a hole (``net``),
        whose parts of a bored ply act as that ply.
        """
        plies = tuple(plies)
        plain = analyse(plies, self.materials, reference or self.project.reference_material)
        if not net and falls_apart(plain):
            raise ProjectError(Problem("plies", "no ply touches another and they stand at "
                                       "different heights, so they form no one section: "
                                       "place them side by side or stacked, touching (a "
                                       "flitch plate between its timbers)"))
        if len(self._plain) >= PLAIN_SECTIONS_HELD:
            self._plain.clear()
        self._plain[tuple(map(id, plies)), plain.reference_material] = (plies, plain)
        return with_slip(plain, self.design.connector, self.project.beam)

    def _plain_section(self, plies: Sequence[Ply], materials: Mapping[str, Material],
                       reference: str) -> Section:
        """``analyse(plies, materials, reference)``: the very section made for these ply
        objects where one was made lately (a segment holding every ply of the member has
        the member's own, so what is found once per section is found once for both).
        """
        plies = tuple(plies)
        held = self._plain.get((tuple(map(id, plies)), reference))
        if held is not None and materials is self.materials:
            return held[1]
        return analyse(plies, materials, reference)

    def analyse(self, plies: Sequence[Ply], reference: str | None = None) -> Analysis:
        """The full analysis of the project with these plies."""
        return self.analyse_many([plies], reference)[0]

    def analyse_sections(self, plies: Sequence[Ply], section: Section) -> Analysis:
        """The analysis of these plies whose section is already known."""
        return self._finish([tuple(plies)], [section])[0]

    def analyse_many(self, candidates: Sequence[Sequence[Ply]],
                     reference: str | None = None) -> list[Analysis]:
        """Analyses of many ply sets; the beam extremes of all of them in one pass."""
        for plies in candidates:
            if len(plies) > MAX_PLIES:
                raise ProjectError(Problem("plies", f"has {len(plies)} plies; Plystack "
                                           f"analyses at most {MAX_PLIES}"))
        with _guarded():
            sections = [self.section(p, reference) for p in candidates]
        return self._finish([tuple(p) for p in candidates], sections)

    def _finish(self, candidates: list[tuple[Ply, ...]],
                sections: list[Section]) -> list[Analysis]:
        with _guarded():
            out = self._finish_unguarded(candidates, sections)
        for a in out:
            _require_finite(a)
        return out

    def _finish_unguarded(self, candidates: list[tuple[Ply, ...]],
                          sections: list[Section]) -> list[Analysis]:
        beams: list[BeamResult | None]
        if self.project.beam is None:
            beams = [None] * len(sections)
        else:
            beams = list(self._beams(candidates, sections))
        out = []
        for plies, section, beam in zip(candidates, sections, beams, strict=True):
            project = self.project.with_plies(plies)
            warnings = list(section.warnings)
            warnings += self._density_warnings(plies)
            checks: tuple[Check, ...] = ()
            segments: tuple[SegmentResult, ...] = ()
            layouts: list[PlateLayout] = []
            if beam is not None and beam.stepped:
                segments = self._segments(plies, section, beam)
                checks, check_warnings = segmented_checks(project, section, beam, segments,
                                                          self.design, run_checks, layouts)
                warnings.extend(check_warnings)
            elif beam is not None:
                checks, check_warnings = run_checks(project, section, beam, self.design,
                                                    layouts)
                warnings.extend(check_warnings)
            stages = None
            if beam is not None and is_staged(plies, self.project.beam):
                checks, stage_warnings, stages = self._staged(plies, section, beam, checks,
                                                              segments)
                warnings.extend(stage_warnings)
            if beam is not None and (beam.spec.notches or beam.spec.holes):
                extra, open_warnings = self._openings(section, segments, beam, checks,
                                                      project.display_units)
                checks += tuple(extra)
                warnings.extend(open_warnings)
            warnings += material_warnings(section, beam, project.display_units)
            if layouts and self.design.bolt == Bolt():
                warnings.append(_default_bolt(self.design, project.display_units))
            if beam is not None:
                warnings += unapplied_overrides(self.design, plies, checks)
                warnings += other_basis_fields(self.design)
                if layouts:
                    warnings += unused_bolt_fields(self.design)
            # a reason given by several checks (each combination, each ply of a
            # material) is said once, in the order first given
            out.append(Analysis(project, section, beam, self.design, checks,
                                tuple(dict.fromkeys(warnings)), segments, stages,
                                tuple(layouts)))
        return out

    def _beams(self, candidates: list[tuple[Ply, ...]],
               sections: list[Section]) -> list[BeamResult]:
        """The beam of every candidate: prismatic ones in one batch, stepped ones (a ply
        stopping short of the ends) each on its own stepped stiffness.
        """
        assert self.project.beam is not None
        length = self.project.beam.layout.length
        flat = [k for k, p in enumerate(candidates) if not is_stepped(p, length)]
        out: dict[int, BeamResult] = {}
        if flat:
            prepared = self.beam
            assert prepared is not None
            out = dict(zip(flat, analyse_beams(prepared, [sections[k] for k in flat],
                                               self.design), strict=True))
        for k, plies in enumerate(candidates):
            if k not in out:
                out[k] = self._stepped_beam(plies, sections[k])
        return [out[k] for k in range(len(candidates))]

    def _stepped_beam(self, plies: tuple[Ply, ...], section: Section) -> BeamResult:
        spec = self.project.beam
        assert spec is not None
        segs = segments_of(plies, spec.layout.length, self.project.display_units)
        secs = self._segment_sections(plies, segs, section)
        creep = [with_moduli(s, creep_moduli(s, creep_factor(s, self.design))) for s in secs]
        stepping = Stepping(
            tuple((s.start, s.end) for s in segs), tuple(s.EI for s in secs),
            tuple(c.EI for c in creep),
            tuple(s.mass_per_length * GRAVITY if spec.self_weight else 0.0 for s in secs))
        prepared = PreparedBeam.of(spec, self.design, stepping)
        return analyse_stepped(prepared, section, self.design, stepping.bounds)

    def _openings(self, section: Section, segments: tuple[SegmentResult, ...],
                  beam: BeamResult, checks: tuple[Check, ...], system: str
                  ) -> tuple[list[Check], list[Problem]]:
        """Notch and hole checks, each with the section of its segment."""
        def section_at(x: float) -> Section:
            return next((s.section for s in segments if s.start <= x <= s.end), section)

        def section_of(plies: Sequence[Ply]) -> Section:
            return self.section(plies, section.reference_material, net=True)

        return opening_checks(section_at, beam, checks, self.design, system, section_of)

    def _staged(self, plies: tuple[Ply, ...], section: Section, beam: BeamResult,
                checks: tuple[Check, ...], segments: tuple[SegmentResult, ...] = ()
                ) -> tuple[tuple[Check, ...], list[Problem], StagesResult]:
        """The checks of a member strengthened under load (design.staged); on a stepped
        member each stage on its own stepped stiffness, the checks segment by segment.
        """
        spec = self.project.beam
        assert spec is not None
        existing = self.section([p for p in plies if p.stage == "existing"],
                                section.reference_material)
        g = GRAVITY if spec.self_weight else 0.0
        if beam.stepped:
            parts = self._stage_parts(plies, segments)
            stages = stepped_stage_solutions(spec, stage_stiffness(parts, segments, g))
            return staged_checks(checks, existing, section, beam, stages, self.design,
                                 self.project.display_units, parts)
        stages = stage_solutions(spec, existing.mass_per_length * g,
                                 (section.mass_per_length - existing.mass_per_length) * g)
        return staged_checks(checks, existing, section, beam, stages, self.design,
                             self.project.display_units)

    def _stage_parts(self, plies: tuple[Ply, ...], segments: tuple[SegmentResult, ...]
                     ) -> tuple[StagePart, ...]:
        """Each segment's existing plies (a named problem where a segment has none)."""
        out = []
        for s in segments:
            old = [plies[i] for i in s.plies if plies[i].stage == "existing"]
            if not old:
                raise ProjectError(Problem("plies", "staged loading: no existing ply runs "
                                           f"from x = {s.start:.6g} m to {s.end:.6g} m, so "
                                           "the member could not carry the before-loads "
                                           "there; every stretch needs an existing ply"))
            existing = self.section(old, s.section.reference_material)
            out.append(StagePart(s.start, s.end, existing, s.section))
        return tuple(out)

    def _segment_sections(self, plies: tuple[Ply, ...], segs: Sequence[Segment],
                          section: Section) -> tuple[Section, ...]:
        """Each segment's section, found once per member section (the stepped beam and
        the segment checks use the same ones).
        """
        return with_partner(section, ("segment_sections", plies, tuple(segs)), self.materials,
                            lambda: segment_sections(plies, segs, self.materials,
                                                     section.reference_material,
                                                     self._plain_section))

    def _segments(self, plies: tuple[Ply, ...], section: Section,
                  beam: BeamResult) -> tuple[SegmentResult, ...]:
        spec = self.project.beam
        assert spec is not None
        segs = segments_of(plies, spec.layout.length, self.project.display_units)
        secs = self._segment_sections(plies, segs, section)
        return segment_results(segs, secs, beam)

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


_CANNOT = "the analysis cannot be completed for these inputs: "


@contextmanager
def _guarded() -> Iterator[None]:
    """Numpy warnings silenced (the results are checked instead) and arithmetic faults
    turned into a named problem.
    """
    with np.errstate(all="ignore"):
        try:
            yield
        except np.linalg.LinAlgError:
            raise ProjectError(Problem("beam", _CANNOT + "the beam's equations cannot be "
                                       "solved (spans, overhangs or stiffness too far "
                                       "apart in size)")) from None
        except ZeroDivisionError:
            raise ProjectError(Problem("", _CANNOT + "a division by zero (a value at the "
                                       "edge of its range)")) from None
        except (OverflowError, FloatingPointError):
            raise ProjectError(Problem("", _CANNOT + "a number grows too large")) from None
        except ValueError as exc:
            if "math domain" not in str(exc):
                raise
            raise ProjectError(Problem("", _CANNOT + "an equation is used outside its "
                                       "range (a negative or zero value where the trade "
                                       "has none)")) from None


def _finite_fields(a: Analysis) -> Iterator[tuple[str, object]]:
    """(what, value) of every number a result reports."""
    s = a.section
    for name in ("EA", "EI", "neutral_axis_y", "I_transformed", "mass_per_length"):
        yield f"section {name}", getattr(s, name)
    for name in ("E", "n", "area", "I_na", "y_bottom", "y_top"):
        yield f"section {name}", getattr(s, name)
    if a.beam is not None:
        b = a.beam
        yield "self-weight", b.self_weight_line
        yield "long-term EI", b.creep_section.EI
        for case, sol in b.cases.items():
            yield f"reactions of case {case}", sol.reactions
            yield f"reaction moments of case {case}", sol.reaction_moments
        for c in b.combinations:
            for e in (c.extremes, c.total, c.long_term, c.short_term_rest):
                if e is None:
                    continue
                for name in ("M_max", "M_min", "V_max_abs", "deflection_max_abs"):
                    yield f"{name} of {c.name}", getattr(e, name)
            yield f"reactions of {c.name}", c.solution.reactions
    for k in a.checks:
        label = f"{k.id} check ({k.ply or 'member'}, {k.combination})"
        yield f"demand of the {label}", k.demand
        yield f"capacity of the {label}", k.capacity
        for sym, v in {**k.factors, **k.partial_factors}.items():
            yield f"factor {sym} of the {label}", v


#: The types of a capacity that :func:`_plainly_finite` reads as a plain number.
_PLAIN_NUMBER = (float, int)


def _plainly_finite(a: Analysis) -> bool:
    """True where every number :func:`_finite_fields` lists is finite and no capacity is
    negative (the same numbers, gathered without naming them; the names are made only
    where one fails).

    The numbers are added up: a sum is finite only where every term is (an infinity or
    NaN stays in it). A finite sum that overflows answers False, and the named path
    (which finds every number finite) decides, so the answer is never wrongly True.
    """
    s = a.section
    scalars = [s.EA, s.EI, s.neutral_axis_y, s.I_transformed, s.mass_per_length]
    arrays = [s.E, s.n, s.area, s.I_na, s.y_bottom, s.y_top]
    if a.beam is not None:
        b = a.beam
        scalars += [b.self_weight_line, b.creep_section.EI]
        for sol in b.cases.values():
            arrays += [sol.reactions, sol.reaction_moments]
        for c in b.combinations:
            for e in (c.extremes, c.total, c.long_term, c.short_term_rest):
                if e is not None:
                    scalars += [e.M_max, e.M_min, e.V_max_abs, e.deflection_max_abs]
            arrays.append(c.solution.reactions)
    checks = a.checks
    capacities = [k.capacity for k in checks]
    for capacity in capacities:
        if not (isinstance(capacity, _PLAIN_NUMBER) and capacity >= 0):
            return False  # negative, NaN or not a plain number: the named path decides
    scalars += capacities
    scalars += [k.demand for k in checks]
    for k in checks:
        scalars += k.factors.values()
        scalars += k.partial_factors.values()
    try:
        if not math.isfinite(sum(scalars)):
            return False
        every = np.concatenate([np.asarray(v, dtype=float).reshape(-1) for v in arrays])
    except (TypeError, ValueError, OverflowError):
        return False
    return bool(np.isfinite(every).all())


def _require_finite(a: Analysis) -> None:
    """A named problem where any reported number is NaN or infinite."""
    if _plainly_finite(a):
        return
    for what, value in _finite_fields(a):
        if isinstance(value, float | int):  # most of them: no array made for a number
            if math.isfinite(value) and not (what.startswith("capacity") and value < 0):
                continue
        arr = np.asarray(value, dtype=float)
        if not np.isfinite(arr).all():
            raise ProjectError(Problem("", _CANNOT + f"the {what} is not a finite number "
                                       "(check spans, loads, factors and materials)"))
        if what.startswith("capacity") and math.isfinite(float(arr)) and float(arr) < 0:
            raise ProjectError(Problem("", _CANNOT + f"the {what} is negative"))
