"""Alternatives side by side, sweeps of one ply dimension, auto-sizing and longest span.

Evaluating one candidate is the full section, beam and check pipeline. The beam's mesh
and stiffness do not depend on the section, and every load case is linear in the loads,
so the pipeline's Evaluator solves each case once (self-weight as its own unit case)
and only redoes the section, scaling and checks per candidate.

Long studies report their progress to an optional callback, ``progress(done, total)``
(``total`` None where the count is not known in advance, as in the longest-span search);
a callback that returns False asks the study to stop, which it does after the candidate
(or batch of candidates) in hand by raising :class:`Stopped` with what it had found.
"""

from __future__ import annotations

import math
from collections.abc import Callable, Iterator, Sequence
from dataclasses import dataclass, replace

from ..model.constants import INCH
from ..model.errors import Problem, ProjectError, named_under
from ..model.plies import Ply
from ..model.project import Alternative, Project
from ..pipeline import Analysis, Evaluator, run

IN = INCH

#: A progress report: (candidates done, candidates in all or None); False asks to stop.
Progress = Callable[[int, int | None], bool | None]

#: Candidates evaluated together between two progress reports of a sweep (their beam
#: extremes in one batched pass, as for a whole sweep).
SWEEP_BATCH = 16


@dataclass(frozen=True)
class Outcome:
    """Summary of one candidate (SI).

    Attributes:
        ok: every check made passes (a study's pass / fail).
        verdict: the analysis's verdict, "OK", "NOT OK" or "INCOMPLETE" (every check
            made passes but one the basis requires could not be made): what a study
            shows, never OK where a check is missing.

    """

    value: float
    governing_ratio: float
    governing_id: str
    deflection_max_abs: float
    mass_per_length: float
    ok: bool
    EI: float
    verdict: str = "OK"

    def to_dict(self) -> dict[str, object]:
        """The row of ``sweep --json``."""
        return {"value": self.value, "governing_ratio": self.governing_ratio,
                "governing_id": self.governing_id,
                "deflection_max_abs": self.deflection_max_abs,
                "mass_per_length": self.mass_per_length, "ok": self.ok,
                "verdict": self.verdict}


def summarise(a: Analysis, value: float = math.nan) -> Outcome:
    """Governing ratio, check, deflection and mass of an analysis."""
    if not a.checks:
        raise ProjectError(Problem("beam", "the project needs a beam with loads to be checked"))
    gov = max(a.checks, key=lambda c: c.ratio)
    defl = max((c.total.deflection_max_abs for c in a.beam.serviceability()),
               default=0.0) if a.beam else 0.0
    return Outcome(value, gov.ratio, gov.id, defl, a.section.mass_per_length,
                   all(c.ok for c in a.checks), a.section.EI, a.verdict)


class Stopped(Exception):
    """A study stopped at the request of its progress callback.

    Attributes:
        outcomes: the candidates evaluated before the stop, in order.

    """

    def __init__(self, outcomes: Sequence[Outcome] = ()):
        super().__init__("stopped on request")
        self.outcomes = tuple(outcomes)


def _report(progress: Progress | None, done: int, total: int | None,
            outcomes: Sequence[Outcome], more: bool = True) -> None:
    """Tell ``progress``; raise :class:`Stopped` where it asks to stop and work is left
    (``more``).
    """
    if progress is not None and progress(done, total) is False and more:
        raise Stopped(outcomes)


class Candidates:
    """Summaries of many ply sets of one project, the beam prepared once
    (:class:`~plystack.core.pipeline.Evaluator`) and the beam extremes of all candidates
    found in one batched pass.
    """

    def __init__(self, project: Project):
        self.evaluator = Evaluator(project)

    def evaluate(self, plies: Sequence[Ply], value: float = math.nan) -> Outcome:
        """Summary for the project with these plies."""
        return summarise(self.evaluator.analyse(plies), value)

    def evaluate_many(self, candidates: Sequence[Sequence[Ply]],
                      values: Sequence[float]) -> list[Outcome]:
        """Summaries of many candidates, in order."""
        analyses = self.evaluator.analyse_many(candidates)
        return [summarise(a, v) for a, v in zip(analyses, values, strict=True)]


def with_dimension(plies: Sequence[Ply], name: str, dimension: str, value: float
                   ) -> tuple[Ply, ...]:
    """Set one ply's width or height; plies that touched it on the growing side move so
    that they still touch (those to the right for width, above for height).
    """
    index = ply_index(plies, name)
    p = plies[index]
    tol = 1e-9
    out = list(plies)
    if dimension == "width":
        delta = value - p.width
        edge = p.x + p.width
        for i, q in enumerate(plies):
            if i != index and q.x >= edge - tol:
                out[i] = replace(q, x=q.x + delta)
        out[index] = replace(p, width=value)
    elif dimension == "height":
        delta = value - p.height
        edge = p.y + p.height
        for i, q in enumerate(plies):
            if i != index and q.y >= edge - tol:
                out[i] = replace(q, y=q.y + delta)
        out[index] = replace(p, height=value)
    else:
        raise ProjectError(Problem("--dimension", f'"{dimension}" must be width or height'))
    return tuple(out)


def width_options(project: Project, name: str) -> list[float]:
    """The stock widths ``size`` tries for a ply, in the project's units: plate
    thicknesses for steel (and any ply not of timber), dressed or sawn timber thicknesses
    for sawn timber (section/templates); glulam and LVL need the user's list.
    """
    from ..section.templates import (
        PLATES_SI,
        PLATES_US,
        TIMBER_THICKNESSES_SI,
        TIMBER_THICKNESSES_US,
    )

    ply = project.plies[ply_index(project.plies, name)]
    material = project.all_materials().get(ply.material)
    us = project.display_units == "US"
    if material is not None and material.kind == "timber":
        if material.product != "sawn":  # glulam and LVL: stock widths are the maker's
            raise ProjectError(Problem("--values", f'is needed for "{name}" ({material.id}, '
                                       f"{material.product}): its stock widths are the "
                                       "maker's; give the widths to try"))
        return list(TIMBER_THICKNESSES_US if us else TIMBER_THICKNESSES_SI)
    return list((PLATES_US if us else PLATES_SI).values())


def ply_index(plies: Sequence[Ply], name: str) -> int:
    """Index of the ply called ``name``."""
    for i, p in enumerate(plies):
        if p.name == name:
            return i
    names = ", ".join(f'"{p.name}"' for p in plies)
    raise ProjectError(Problem("--ply", f'"{name}" is not a ply of this project ({names})'))


def sweep(project: Project, name: str, dimension: str, values: Sequence[float],
          progress: Progress | None = None) -> list[Outcome]:
    """Governing ratio, deflection and mass for each value of one ply dimension.

    With ``progress``, the candidates go in batches of :data:`SWEEP_BATCH`, each batch
    reported when done (the outcomes are the same as in one batch: every candidate's
    numbers are its own).
    """
    for v in values:
        if not v > 0:
            raise ProjectError(Problem("--values", f"{v} must be greater than zero"))
    candidates = [with_dimension(project.plies, name, dimension, v) for v in values]
    ev = Candidates(project)
    if progress is None:
        return ev.evaluate_many(candidates, list(values))
    out: list[Outcome] = []
    for start in range(0, len(candidates), SWEEP_BATCH):
        stop = start + SWEEP_BATCH
        out += ev.evaluate_many(candidates[start:stop], list(values[start:stop]))
        _report(progress, len(out), len(candidates), out, len(out) < len(candidates))
    return out


@dataclass(frozen=True)
class SizeResult:
    """Auto-size answer: the first passing option and the one before it."""

    ply: str
    dimension: str
    chosen: Outcome | None
    next_smaller: Outcome | None
    message: str

    def to_dict(self) -> dict[str, object]:
        """``size --json``."""
        nxt = None
        if self.next_smaller is not None:
            nxt = {**self.next_smaller.to_dict(),
                   "why": f"{self.next_smaller.governing_id} ratio "
                          f"{self.next_smaller.governing_ratio:.3f} > 1"}
        return {"ply": self.ply, "dimension": self.dimension,
                "value": self.chosen.value if self.chosen else None,
                "ok": bool(self.chosen and self.chosen.ok),
                "verdict": self.chosen.verdict if self.chosen else None,
                "governing_id": self.chosen.governing_id if self.chosen else None,
                "governing_ratio": self.chosen.governing_ratio if self.chosen else None,
                "next_smaller": nxt, "message": self.message}


def auto_size(project: Project, name: str, dimension: str, options: Sequence[float],
              progress: Progress | None = None) -> SizeResult:
    """The smallest option (in ascending order) that passes every check; ``progress``
    hears after each option tried (of all the options: the search may end sooner).
    """
    ordered = sorted(set(options))
    ev = Candidates(project)
    previous: Outcome | None = None
    tried: list[Outcome] = []
    for v in ordered:
        out = ev.evaluate(with_dimension(project.plies, name, dimension, v), v)
        tried.append(out)
        if out.ok:
            return SizeResult(name, dimension, out, previous,
                              ("smallest passing option" if previous else
                               "the smallest option in the list passes")
                              + incomplete_note(out.verdict))
        previous = out
        _report(progress, len(tried), len(ordered), tried, len(tried) < len(ordered))
    return SizeResult(name, dimension, None, previous,
                      f"no option passes: the largest, {ordered[-1]:.6g} m, still has "
                      f"{previous.governing_id if previous else '?'} ratio "
                      f"{previous.governing_ratio if previous else math.nan:.3f}")


def scaled_spans(project: Project, span: float) -> Project:
    """The project with its (first) span set to ``span``: several spans scale together,
    overhangs and load positions scale with them.
    """
    spec = project.beam
    if spec is None:
        raise ProjectError(Problem("beam", "the project has no beam"))
    lay = spec.layout
    k = span / lay.spans[0]

    def pos(x: float | None) -> float | None:
        return None if x is None else x * k

    loads = tuple(replace(ld, start=pos(ld.start), end=pos(ld.end), at=pos(ld.at))
                  for ld in spec.loads)
    layout = replace(lay, spans=tuple(s * k for s in lay.spans),
                     overhang_left=lay.overhang_left * k, overhang_right=lay.overhang_right * k)
    return replace(project, beam=replace(spec, layout=layout, loads=loads))


@dataclass(frozen=True)
class SpanResult:
    """Longest span that passes, and the check that governs there."""

    span: float
    governing_id: str
    governing_ratio: float
    tolerance: float
    next_fails: Outcome
    verdict: str = "OK"

    def to_dict(self) -> dict[str, object]:
        """``span --json``."""
        return {"span": self.span, "governing_id": self.governing_id,
                "governing_ratio": self.governing_ratio, "tolerance": self.tolerance,
                "verdict": self.verdict,
                "next_span": self.span + self.tolerance,
                "next_governing_id": self.next_fails.governing_id,
                "next_governing_ratio": self.next_fails.governing_ratio}


def longest_span(project: Project, tolerance: float | None = None,
                 progress: Progress | None = None) -> SpanResult:
    """Longest (first) span, a whole number of tolerance steps (1/8 in or 5 mm), that
    passes every check, with the next step failing. ``progress`` hears after each span
    tried (the number of tries is not known in advance: total None).
    """
    tol = tolerance or (IN / 8 if project.display_units == "US" else 0.005)
    tried: list[Outcome] = []

    def outcome(n: int) -> Outcome:
        out = summarise(run(scaled_spans(project, n * tol)), n * tol)
        tried.append(out)
        _report(progress, len(tried), None, tried)
        return out

    least = max(1, int(0.3 / tol))  # 0.3 m
    if project.beam is None:
        raise ProjectError(Problem("beam", "the project has no beam"))
    # from the file's own span: a very short member may fail where the file's passes
    # (its bolts and bearings no longer fit), so the search starts where the design is
    given = max(least, round(project.beam.layout.spans[0] / tol))
    if outcome(given).ok:
        lo, hi = given, given * 2
        while outcome(hi).ok:
            lo, hi = hi, hi * 2
            if hi * tol > 200:
                raise ProjectError(Problem("beam.spans", "passes beyond 200 m: check the "
                                           "loads"))
    else:
        hi, lo = given, given // 2
        while True:
            if lo <= least:
                lo = least
                if lo >= hi or not outcome(lo).ok:
                    raise ProjectError(Problem("beam.spans", f"no span from 0.3 m to the "
                                               f"file's {given * tol:.4g} m passes: the "
                                               "section or loads need changing"))
                break
            if outcome(lo).ok:
                break
            hi, lo = lo, lo // 2
    while hi - lo > 1:
        mid = (lo + hi) // 2
        if outcome(mid).ok:
            lo = mid
        else:
            hi = mid
    best = outcome(lo)
    return SpanResult(lo * tol, best.governing_id, best.governing_ratio, tol, outcome(lo + 1),
                      best.verdict)


def span_table(project: Project, widths: Sequence[float],
               progress: Progress | None = None) -> list[dict[str, object]]:
    """Longest span per alternative (current design first) and tributary width of the
    area loads; ``progress`` hears the spans tried over all the searches.
    """
    rows = []
    counted = [0, 0]  # spans tried in the searches finished, and in the one running

    def running(done: int, total: int | None) -> bool | None:
        counted[1] = done
        return progress(counted[0] + done, total) if progress is not None else None

    for alt in alternatives_with_current(project):
        p = project.with_plies(alt.plies)
        for w in widths:
            spec = p.beam
            if spec is None:
                continue
            loads = tuple(replace(ld, tributary_width=w) if ld.type == "area" else ld
                          for ld in spec.loads)
            r = longest_span(replace(p, beam=replace(spec, loads=loads)), progress=running)
            counted[0] += counted[1]
            rows.append({"alternative": alt.name, "tributary_width": w, "span": r.span,
                         "governing_id": r.governing_id})
    return rows


def incomplete_note(verdict: str) -> str:
    """What a study says beside a passing candidate of this verdict: that it is
    INCOMPLETE, where it is (nothing for the others).
    """
    if verdict != "INCOMPLETE":
        return ""
    return ("; its verdict is INCOMPLETE: every check made passes, but a check the design "
            "basis requires could not be made (plystack check names it)")


def alternative_analyses(project: Project, alternatives: Sequence[Alternative],
                         done: Analysis | None = None) -> Iterator[Analysis]:
    """The analysis of each alternative, in order, on one Evaluator (the beam prepared
    and its cases solved once): the same numbers as ``run(project.with_plies(alt.plies))``
    each. ``done``: an analysis already made of one of them, given back for it.
    """
    evaluator = Evaluator(project)
    for alt in alternatives:
        if done is not None and done.project == project.with_plies(alt.plies):
            yield done
        elif alt in project.alternatives:  # its problems named where the file holds them
            with named_under(f"alternatives[{project.alternatives.index(alt)}]"):
                made = evaluator.analyse(alt.plies)
            yield made
        else:
            yield evaluator.analyse(alt.plies)


def alternatives_with_current(project: Project) -> list[Alternative]:
    """The file's alternatives, with the current design first unless it is one of them."""
    alts = list(project.alternatives)
    if not any(a.plies == project.plies for a in alts):
        alts.insert(0, Alternative("current", project.plies))
    return alts
