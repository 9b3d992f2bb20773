"""Alternatives side by side, sweeps of one ply dimension, auto-sizing and longest span.

Evaluating one candidate is the full section, beam and check pipeline. The beam's mesh
and stiffness do not depend on the section, and every load case is linear in the loads,
so :class:`Evaluator` solves each case once (self-weight as its own unit case) and only
redoes the section, scaling and checks per candidate.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass, replace

from core.analysis import Analysis, run
from core.beam import BeamModel, CaseSolution
from core.errors import Problem, ProjectError
from core.geometry import Ply
from core.project import Alternative, Project

IN = 0.0254


@dataclass(frozen=True)
class Outcome:
    """Summary of one candidate (SI)."""

    value: float
    governing_ratio: float
    governing_id: str
    deflection_max_abs: float
    mass_per_length: float
    ok: bool
    EI: float

    def to_dict(self) -> dict[str, object]:
        """The row of ``sweep --json``."""
        return {"value": self.value, "governing_ratio": self.governing_ratio,
                "governing_id": self.governing_id,
                "deflection_max_abs": self.deflection_max_abs,
                "mass_per_length": self.mass_per_length, "ok": self.ok}


def summarise(a: Analysis, value: float = math.nan) -> Outcome:
    """Governing ratio, check, deflection and mass of an analysis."""
    if not a.checks:
        raise ProjectError(Problem("beam", "the project needs a beam with loads to be checked"))
    gov = max(a.checks, key=lambda c: c.ratio)
    defl = max((c.total.deflection_max_abs for c in a.beam.combinations), default=0.0) if (
        a.beam) else 0.0
    return Outcome(value, gov.ratio, gov.id, defl, a.section.mass_per_length,
                   all(c.ok for c in a.checks), a.section.EI)


class Evaluator:
    """Runs the pipeline for many sections on one beam, reusing the beam's solutions."""

    def __init__(self, project: Project):
        self.project = project
        self._cache: dict[int, tuple[object, BeamModel, dict[str, CaseSolution],
                                     CaseSolution | None]] = {}

    def evaluate(self, plies: Sequence[Ply], value: float = math.nan) -> Outcome:
        """Summary for the project with these plies."""
        return summarise(self.analyse(plies), value)

    def evaluate_many(self, candidates: Sequence[Sequence[Ply]],
                      values: Sequence[float]) -> list[Outcome]:
        """Summaries of many candidates: sections one by one, then the extremes of every
        combination for all candidates in one vectorised pass, then the checks.
        """
        from core import analysis as pipeline
        from core.beam import extremes_many
        from core.section import analyse, with_moduli

        spec = self.project.beam
        if spec is None or len(candidates) < 2:
            return [self.evaluate(p, v) for p, v in zip(candidates, values, strict=True)]
        self.analyse(candidates[0])  # fills the beam cache for this spec
        _, model, base, unit_sw = self._cache[id(spec)]
        design = self.project.design_or_default()
        basis = "US" if design.us else "EU"
        mats = self.project.all_materials()
        ref = self.project.reference_material
        sections = [analyse(tuple(p), mats, ref) for p in candidates]
        combos = pipeline.combinations_for(spec, basis, design)
        frac = spec.sustained_live_fraction or 0.0
        per: list[dict[tuple[str, str], object]] = [{} for _ in candidates]
        sols: dict[tuple[str, str], list[object]] = {}
        eis = [s.EI for s in sections]
        for s in sections:
            sw = s.mass_per_length * pipeline.GRAVITY if spec.self_weight else 0.0
            _, cases = pipeline.beam_cases(spec, sw, (model, base, unit_sw))
            factor = pipeline.creep_factor_of(s, design)
            EI_c = with_moduli(s, pipeline.creep_moduli(s, factor)).EI
            for combo in combos:
                parts = pipeline.combination_parts(cases, combo, frac, s.EI, EI_c)
                if parts is None:
                    continue
                sols.setdefault(("combo", combo.name), []).append(parts[0])
                sols.setdefault(("total", combo.name), []).append(parts[4])
            for case in ("L", "Lr", "S", "W"):
                if case in cases:
                    sols.setdefault(("case", case), []).append(cases[case])
        for key, group in sols.items():
            if len(group) != len(sections):
                continue
            for k, e in enumerate(extremes_many(model, group, eis)):  # type: ignore[arg-type]
                per[k][key] = e
        out = []
        for k, (plies, v) in enumerate(zip(candidates, values, strict=True)):
            a = pipeline.run(self.project.with_plies(tuple(plies)),
                             prepared=(model, base, unit_sw),
                             precomputed=per[k],  # type: ignore[arg-type]
                             section=sections[k])
            out.append(summarise(a, v))
        return out

    def analyse(self, plies: Sequence[Ply]) -> Analysis:
        """The full analysis for the project with these plies (beam solutions reused)."""
        from core import analysis as pipeline

        project = self.project.with_plies(tuple(plies))
        spec = project.beam
        if spec is None:
            return run(project)
        key = id(spec)
        if key not in self._cache or self._cache[key][0] is not spec:
            model = BeamModel(spec.layout, spec.loads)
            cases = {c: model.solve([ld for ld in spec.loads if ld.case == c])
                     for c in sorted({ld.case for ld in spec.loads})}
            unit_sw = model.solve([], extra_line=1.0) if spec.self_weight else None
            self._cache[key] = (spec, model, cases, unit_sw)
        _, model, cases, unit_sw = self._cache[key]
        return pipeline.run(project, prepared=(model, cases, unit_sw))


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


def ply_index(plies: Sequence[Ply], name: str) -> int:
    """Index of the ply called ``name``."""
    for i, p in enumerate(plies):
        if p.name == name:
            return i
    names = ", ".join(f'"{p.name}"' for p in plies)
    raise ProjectError(Problem("--ply", f'"{name}" is not a ply of this project ({names})'))


def sweep(project: Project, name: str, dimension: str, values: Sequence[float]
          ) -> list[Outcome]:
    """Governing ratio, deflection and mass for each value of one ply dimension."""
    for v in values:
        if not v > 0:
            raise ProjectError(Problem("--values", f"{v} must be greater than zero"))
    candidates = [with_dimension(project.plies, name, dimension, v) for v in values]
    return Evaluator(project).evaluate_many(candidates, list(values))


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
                "governing_id": self.chosen.governing_id if self.chosen else None,
                "governing_ratio": self.chosen.governing_ratio if self.chosen else None,
                "next_smaller": nxt, "message": self.message}


def auto_size(project: Project, name: str, dimension: str, options: Sequence[float]
              ) -> SizeResult:
    """The smallest option (in ascending order) that passes every check."""
    ordered = sorted(set(options))
    ev = Evaluator(project)
    previous: Outcome | None = None
    for v in ordered:
        out = ev.evaluate(with_dimension(project.plies, name, dimension, v), v)
        if out.ok:
            return SizeResult(name, dimension, out, previous,
                              "smallest passing option" if previous else
                              "the smallest option in the list passes")
        previous = out
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

    def to_dict(self) -> dict[str, object]:
        """``span --json``."""
        return {"span": self.span, "governing_id": self.governing_id,
                "governing_ratio": self.governing_ratio, "tolerance": self.tolerance,
                "next_span": self.span + self.tolerance,
                "next_governing_id": self.next_fails.governing_id,
                "next_governing_ratio": self.next_fails.governing_ratio}


def longest_span(project: Project, tolerance: float | None = None) -> SpanResult:
    """Longest (first) span, a whole number of tolerance steps (1/8 in or 5 mm), that
    passes every check, with the next step failing.
    """
    tol = tolerance or (IN / 8 if project.display_units == "US" else 0.005)

    def outcome(n: int) -> Outcome:
        return summarise(run(scaled_spans(project, n * tol)), n * tol)

    lo = max(1, int(0.3 / tol))  # 0.3 m
    if not outcome(lo).ok:
        raise ProjectError(Problem("beam.spans", "even a 0.3 m span fails: the section or "
                                   "loads need changing"))
    hi = lo * 2
    while outcome(hi).ok:
        lo, hi = hi, hi * 2
        if hi * tol > 200:
            raise ProjectError(Problem("beam.spans", "passes beyond 200 m: check the loads"))
    while hi - lo > 1:
        mid = (lo + hi) // 2
        if outcome(mid).ok:
            lo = mid
        else:
            hi = mid
    best = outcome(lo)
    return SpanResult(lo * tol, best.governing_id, best.governing_ratio, tol, outcome(lo + 1))


def span_table(project: Project, widths: Sequence[float]) -> list[dict[str, object]]:
    """Longest span per alternative (current design first) and tributary width of the
    area loads.
    """
    rows = []
    for alt in alternatives_with_current(project):
        p = project.with_plies(alt.plies)
        for w in widths:
            spec = p.beam
            if spec is None:
                continue
            loads = tuple(replace(ld, tributary_width=w) if ld.type == "area" else ld
                          for ld in spec.loads)
            r = longest_span(replace(p, beam=replace(spec, loads=loads)))
            rows.append({"alternative": alt.name, "tributary_width": w, "span": r.span,
                         "governing_id": r.governing_id})
    return rows


def alternatives_with_current(project: Project) -> list[Alternative]:
    """The file's alternatives, with the current design first unless it is one of them."""
    alts = list(project.alternatives)
    if not any(a.plies == project.plies for a in alts):
        alts.insert(0, Alternative("current", project.plies))
    return alts
