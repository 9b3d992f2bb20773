"""Checks of a member whose plies stop short of its ends, segment by segment.

The stress checks of the plies (bending, shear, combined bending and axial stress) are
made in every segment, with the segment's own section and the actions within the
segment, both ends included: at a ply's end the neighbouring segment, without that ply,
is checked under the moment and shear there, so the remaining plies act alone. Checks
of the whole member (deflection, bearing, uplift, bolts, connectors, vibration) are made
once, on the whole-member actions; their section is the one with every ply.

At every end of a ply inside the member, the force the ply carries just inside its end
must enter it through its fasteners near that end: for a bolted side-by-side steel plate
that is the ``load-transfer`` check of :mod:`.ply_ends`; any other ply end is a named
missing check.
"""

from __future__ import annotations

import re
from collections.abc import Sequence
from dataclasses import dataclass
from typing import Protocol

from ..actions.analysis import BeamResult, creep_moduli
from ..model.design import DesignSpec
from ..model.errors import Problem
from ..model.project import Project
from ..section.segments import Segment
from ..section.transformed import Section, with_moduli
from .bolt_checks import PlateLayout
from .check import Check, evolve
from .ply_ends import ply_end_checks

#: Checks made in every segment (the plies' stresses); the others are the member's.
SEGMENT_IDS = frozenset({"bending", "shear", "tension-bending", "compression-bending"})

class RunChecks(Protocol):
    """The checks of a section under its actions (``pipeline.run_checks``)."""

    def __call__(self, project: Project, section: Section, beam: BeamResult,
                 design: DesignSpec, layouts: list[PlateLayout] | None = None,
                 segment: bool = False) -> tuple[tuple[Check, ...], list[Problem]]:
        """Checks and warnings; the plates' bolt layouts appended to ``layouts``
        (``segment``: of the bolt checks only the timbers' net-section shear).
        """


@dataclass(frozen=True, eq=False)
class SegmentResult:
    """One segment of a stepped member.

    Attributes:
        index: its place along the member, 0 at the left.
        start: m from the left end.
        end: m.
        plies: indices of the member's plies acting in it.
        section: its transformed section.
        beam: the beam actions, every extreme sought within the segment.

    """

    index: int
    start: float
    end: float
    plies: tuple[int, ...]
    section: Section
    beam: BeamResult


def segment_results(segments: Sequence[Segment], sections: Sequence[Section],
                    beam: BeamResult) -> tuple[SegmentResult, ...]:
    """The segments with their sections and their share of the beam actions (whose
    stiffness and creep section are the segment's own).
    """
    out = []
    for k, (s, sec, b) in enumerate(zip(segments, sections, beam.segments, strict=True)):
        creep = with_moduli(sec, creep_moduli(sec, b.creep_factor))
        combos = tuple(evolve(c, EI=sec.EI, EI_creep=creep.EI) for c in b.combinations)
        own = evolve(b, EI=sec.EI, creep_section=creep, combinations=combos)
        out.append(SegmentResult(k, s.start, s.end, s.plies, sec, own))
    return tuple(out)


def _remap(problem: Problem, plies: tuple[int, ...]) -> Problem:
    """A segment's warning with its ply index turned into the member's."""
    m = re.match(r"plies\[(\d+)\]", problem.path)
    if m is None or int(m.group(1)) >= len(plies):
        return problem
    path = f"plies[{plies[int(m.group(1))]}]" + problem.path[m.end():]
    return evolve(problem, path=path)


def segmented_checks(project: Project, section: Section, beam: BeamResult,
                     segments: Sequence[SegmentResult], design: DesignSpec,
                     run_checks: RunChecks, layouts: list[PlateLayout] | None = None
                     ) -> tuple[tuple[Check, ...], list[Problem]]:
    """Every check of a stepped member (see the module text), each stress check with
    its segment and its x; warnings once each. ``layouts`` receives the bolt layouts of
    the member's checks (the bolts are checked once, on the whole member).
    """
    mine: list[PlateLayout] = []
    member, warnings = run_checks(project, section, beam, design, mine)
    if layouts is not None:
        layouts += mine
    ends, gaps = ply_end_checks(section, beam, segments, design, project.display_units,
                                member, {p.ply: p.layout for p in mine})
    warnings += gaps
    checks = [c for c in member if c.id not in SEGMENT_IDS] + ends
    seen = {(w.path, w.message) for w in warnings}
    for seg in segments:
        # of the bolts a segment keeps only the timbers' shear at the holes (the
        # others are the member's); its other checks are made in full for their warnings
        own, notes = run_checks(project, seg.section, seg.beam, design, segment=True)
        tol = 1e-9 * max(seg.end, 1.0)
        # a check placed outside the segment (the shear beside a support that this
        # segment does not reach) belongs to the segment that holds it
        checks += [evolve(c, segment=seg.index, location=c.location or
                           f"segment {seg.index + 1}") for c in own if c.id in SEGMENT_IDS
                   and (c.x is None or seg.start - tol <= c.x <= seg.end + tol)]
        for w in (_remap(w, seg.plies) for w in notes):
            if (w.path, w.message) not in seen:
                seen.add((w.path, w.message))
                warnings.append(w)
    return tuple(checks), warnings
