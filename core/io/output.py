"""Machine-readable (SI) and readable (display units) output of an analysis."""

from __future__ import annotations

import json
from dataclasses import fields
from typing import Any

import numpy as np

from .. import __version__
from ..actions.analysis import BeamResult
from ..actions.extremes import Extremes
from ..design.segmented import SegmentResult
from ..design.staged import StageActions, StagesResult
from ..model.caution import ASSUMPTIONS, CAUTION, FIRE_NOTE
from ..model.errors import Problem, ProjectError
from ..model.units import fmt, sig
from ..pipeline import Analysis
from ..section.gamma import PartialSection, assumptions
from ..section.transformed import PlyResult, Section
from .table import text_table


def _f(x: Any) -> Any:
    if isinstance(x, float | np.floating):
        v = float(x)
        return v if np.isfinite(v) else None
    return x


def dumps(value: Any) -> str:
    """Strict JSON text of an output object (``allow_nan=False``: NaN or Infinity is an
    error here, never invalid JSON on the screen).

    Raises:
        ProjectError: a number in ``value`` is not finite.

    """
    try:
        return json.dumps(value, indent=1, allow_nan=False)
    except ValueError:
        raise ProjectError(Problem("", "the results hold a number that is not finite; "
                                   "nothing is printed")) from None


def section_dict(section: Section) -> dict[str, Any]:
    """Section properties (SI); with the slip of mechanical connectors (EN 1995-1-1 Annex
    B) also "EI_effective" and "gamma" (per ply, K_ser) and their ultimate values (K_u).
    """
    out = _section_dict(section)
    if isinstance(section, PartialSection):
        out["EI_effective"] = section.EI
        out["gamma"] = [float(g) for g in section.gamma]
        out["EI_effective_ultimate"] = section.EI_uls
        out["gamma_ultimate"] = [float(g) for g in section.gamma_uls]
        out["slip_length"] = section.length
    return out


def _section_dict(section: Section) -> dict[str, Any]:
    return {
        "EA": section.EA,
        "EI": section.EI,
        "neutral_axis_y": section.neutral_axis_y,
        "I_transformed": section.I_transformed,
        "A_transformed": section.A_transformed,
        "reference_material": section.reference_material,
        "E_reference": section.E_ref,
        "mass_per_length": section.mass_per_length,
        "depth": section.depth,
        "interfaces": [
            {"y": itf.y, "plies": [[section.plies[i].name, section.plies[j].name]
                                   for i, j in itf.pairs],
             "length": float(itf.length), "Q": float(itf.Q)}
            for itf in section.interfaces],
    }


def plies_list(section: Section, moment: float | None) -> list[dict[str, Any]]:
    """Per-ply table (SI), with extreme-fibre stresses at ``moment`` where given."""
    rows = []
    top = bot = None
    if moment is not None:
        top, bot = section.ply_extreme_stresses(moment)
    for i, r in enumerate(section.ply_results()):
        row = {f.name: _f(getattr(r, f.name)) for f in fields(PlyResult)}
        if top is not None and bot is not None:
            row["stress_top"] = float(top[i])
            row["stress_bottom"] = float(bot[i])
        rows.append(row)
    return rows


def _ext(e: Extremes | None) -> dict[str, Any] | None:
    return None if e is None else _extremes_dict(e)


def _extremes_dict(e: Extremes) -> dict[str, Any]:
    return {"M_max": e.M_max, "x_M_max": e.x_M_max, "M_min": e.M_min, "x_M_min": e.x_M_min,
            "V_max_abs": e.V_max_abs, "x_V_max_abs": e.x_V_max_abs,
            "deflection_max_abs": e.deflection_max_abs,
            "x_deflection_max": e.x_deflection_max,
            "deflection_by_region": [{"region": n, "deflection": w, "x": x}
                                     for n, w, x in e.deflection_by_region]}


def beam_dict(beam: BeamResult, section: Section) -> dict[str, Any]:
    """Beam actions (SI): reactions by support and case, combinations, creep."""
    lay = beam.spec.layout
    reactions = []
    for k, (x, kind) in enumerate(zip(lay.support_positions(), lay.support_kinds(),
                                      strict=True)):
        rec: dict[str, Any] = {"support": k + 1, "x": x, "type": kind}
        for case, sol in beam.cases.items():
            rec[case] = float(sol.reactions[k])
        if kind == "fixed":
            rec["moments"] = {case: float(sol.reaction_moments[k])
                              for case, sol in beam.cases.items()}
        reactions.append(rec)
    combos = []
    for c in beam.combinations:
        top, bot = section.ply_extreme_stresses(c.M_governing)
        ctop, cbot = beam.creep_section.ply_extreme_stresses(c.M_sustained)
        e = c.extremes
        combos.append({
            "name": c.name,
            "factors": dict(c.combination.factors),
            "duration": c.duration,
            "limit_state": c.combination.limit_state,
            "kind": c.combination.kind_on(beam.basis),
            **_extremes_dict(e),
            "reactions": [float(r) for r in c.reactions_max],
            "reactions_min": [float(r) for r in c.reactions_min],
            "governing_patterns": {k: list(v) for k, v in c.governing_patterns.items()},
            "patterns_tried": c.patterns_tried,
            "M_governing": c.M_governing,
            "plies": [{"name": p.name, "stress_top": float(top[i]),
                       "stress_bottom": float(bot[i])} for i, p in enumerate(section.plies)],
            "creep": {
                "sustained_factors": c.sustained_factors,
                "deflection_short_term": (c.short_term_rest.deflection_max_abs
                                          if c.short_term_rest else 0.0),
                "deflection_long_term": (c.long_term.deflection_max_abs
                                         if c.long_term else 0.0),
                "deflection_total": c.total.deflection_max_abs,
                "x_deflection_total": c.total.x_deflection_max,
                "M_sustained": c.M_sustained,
                "plies_sustained": [
                    {"name": p.name, "stress_top": float(ctop[i]),
                     "stress_bottom": float(cbot[i])} for i, p in enumerate(section.plies)],
            },
        })
    return {
        "length": lay.length,
        "spans": list(lay.spans),
        "supports": lay.supports,
        "support_positions": list(lay.support_positions()),
        "self_weight": beam.self_weight_line,
        "reactions": reactions,
        "cases": {c: _ext(e) for c, e in beam.case_extremes.items()},
        "combinations": combos,
        "pattern_live_load": beam.spec.pattern_live_load,
        "patterned_cases": list(beam.patterned_cases),
        "regions": list(beam.regions),
        "reaction_envelope": [{"support": rb.support, "x": rb.x, "max": rb.max, "min": rb.min,
                               "combination_max": rb.combination_max,
                               "combination_min": rb.combination_min}
                              for rb in beam.reaction_envelope],
        "creep": {
            "factor": beam.creep_factor,
            "symbol": "K_cr" if beam.basis == "US" else "1 + k_def",
            "EI_long_term": beam.creep_section.EI,
            "neutral_axis_y_long_term": beam.creep_section.neutral_axis_y,
            "moment_share_short_term": {p.name: float(s) for p, s in
                                        zip(section.plies, section.moment_shares(),
                                            strict=True)},
            "moment_share_long_term": {p.name: float(s) for p, s in
                                       zip(section.plies, beam.creep_section.moment_shares(),
                                           strict=True)},
        },
    }


def segment_dict(seg: SegmentResult) -> dict[str, Any]:
    """One segment of a stepped member: where it runs, its section and its plies."""
    return {"index": seg.index, "from": seg.start, "to": seg.end,
            "section": section_dict(seg.section), "plies": plies_list(seg.section, None)}


def stages_dict(st: StagesResult) -> dict[str, Any]:
    """Both stages of a member strengthened under load: each stage's plies, EI, and per
    combination its extreme moments, largest deflection and ply stresses (SI).
    """
    def one(sec: Section, rows: tuple[StageActions, ...]) -> dict[str, Any]:
        return {"plies": [p.name for p in sec.plies], "EI": sec.EI, "combinations": [
            {"combination": r.combination, "M_max": r.M_max, "M_min": r.M_min,
             "deflection_max": r.deflection_max,
             "ply_stresses": [{"name": n, "stress_top": t, "stress_bottom": b}
                              for n, t, b in r.ply_stresses]} for r in rows]}
    return {"shored": False, "before": one(st.existing, st.before),
            "after": one(st.built_up, st.after)}


def check_json(a: Analysis, moment: float | None = None, shear: float | None = None
               ) -> dict[str, Any]:
    """The object printed by ``plystack check --json`` (SI base units)."""
    out: dict[str, Any] = {"units": "SI", "program": f"Plystack {__version__}",
                           "title": a.project.title}
    out["section"] = section_dict(a.section)
    out["plies"] = plies_list(a.section, moment)
    if moment is not None:
        out["moment"] = moment
    if shear is not None:
        out["shear"] = {
            "V": shear,
            "interfaces": [{"y": itf.y, "shear_flow": float(q)}
                           for itf, q in a.section.interface_shear_flows(shear)],
            "plies": _shear_by_ply(a.section, shear),
        }
    if a.beam is not None:
        out["beam"] = beam_dict(a.beam, a.section)
    if a.segments:
        out["segments"] = [segment_dict(seg) for seg in a.segments]
    if a.stages is not None:
        out["stages"] = stages_dict(a.stages)
    if a.checks:
        out["checks"] = [c.to_dict() for c in a.checks]
        gov = max(a.checks, key=lambda c: c.ratio)
        out["governing"] = {"id": gov.id, "ply": gov.ply, "combination": gov.combination,
                            "ratio": _f(gov.ratio), "ok": all(c.ok for c in a.checks)}
        out["caution"] = CAUTION
    out["verdict"] = a.verdict
    out["ok"] = a.verdict == "OK"
    out["incomplete_reasons"] = [{"field": p.path, "message": p.message, "text": str(p)}
                                 for p in a.incomplete_reasons]
    out["assumptions"] = list(assumptions(a.section, ASSUMPTIONS))
    out["fire_note"] = FIRE_NOTE
    out["warnings"] = [str(w) for w in a.warnings]
    return out


def _shear_by_ply(section: Section, shear: float) -> list[dict[str, Any]]:
    ys = shear_stations(section)
    tau = section.shear_stress(shear, ys)
    out = []
    for i, p in enumerate(section.plies):
        row = tau[i]
        ok = np.isfinite(row)
        if not ok.any():
            out.append({"name": p.name, "tau_max": 0.0, "y": None})
            continue
        k = int(np.nanargmax(np.abs(np.where(ok, row, 0.0))))
        out.append({"name": p.name, "tau_max": float(abs(row[k])), "y": float(ys[k])})
    return out


def shear_stations(section: Section, n: int = 200) -> np.ndarray:
    """Heights for shear profiles: a fine grid plus every ply edge, just inside every ply
    edge (a cut at an interface is shared by the plies on both sides; see
    design/common.shear_cuts) and the neutral axis.
    """
    lo = float(section.y_bottom.min())
    hi = float(section.y_top.max())
    ys = np.concatenate([np.linspace(lo, hi, n), section.y_bottom, section.y_top,
                         np.nextafter(section.y_top, -np.inf),
                         np.nextafter(section.y_bottom, np.inf), [section.neutral_axis_y]])
    return np.unique(ys)


def check_text(a: Analysis, moment: float | None = None, shear: float | None = None) -> str:
    """Readable summary in the project's display units."""
    s = a.section
    u = a.project.display_units
    lines = [f"Plystack {__version__}: {a.project.title}", ""]
    lines.append("Section (transformed to " + s.reference_material + ")")
    lines.append(f"  neutral axis y     {fmt(s.neutral_axis_y, 'length', u)}")
    lines.append(f"  I transformed      {fmt(s.I_transformed, 'second_moment', u)}")
    lines.append(f"  EA                 {fmt(s.EA, 'EA', u)}")
    lines.append(f"  EI                 {fmt(s.EI, 'EI', u)}")
    lines.append(f"  mass per length    {fmt(s.mass_per_length, 'mass_per_length', u)}")
    lines.append("")
    head = f"  {'ply':<18}{'material':<14}{'n':>8}{'area':>14}{'y bottom':>12}{'y top':>12}" \
           f"{'M share':>9}"
    if moment is not None:
        head += f"{'stress top':>14}{'stress bot':>14}"
    lines.append(head)
    top = bot = None
    if moment is not None:
        top, bot = s.ply_extreme_stresses(moment)
    for i, r in enumerate(s.ply_results()):
        row = (f"  {r.name[:17]:<18}{r.material[:13]:<14}{sig(r.modular_ratio, 4):>8}"
               f"{fmt(r.area, 'area', u, 4):>14}{fmt(r.y_bottom, 'length', u, 4):>12}"
               f"{fmt(r.y_top, 'length', u, 4):>12}{r.moment_share * 100:>8.1f}%")
        if top is not None and bot is not None:
            row += f"{fmt(float(top[i]), 'stress', u):>14}{fmt(float(bot[i]), 'stress', u):>14}"
        lines.append(row)
    if moment is not None:
        lines.append(f"  stresses at M = {fmt(moment, 'moment', u)} (tension positive)")
    if shear is not None:
        lines.append("")
        lines.append(f"Shear V = {fmt(shear, 'force', u)}")
        for itf, q in s.interface_shear_flows(shear):
            lines.append(f"  interface at y = {fmt(itf.y, 'length', u)}: shear flow "
                         f"{fmt(q, 'shear_flow', u)}")
        for shear_row in _shear_by_ply(s, shear):
            lines.append(f"  {shear_row['name']:<18} max shear stress "
                         f"{fmt(shear_row['tau_max'], 'stress', u)}")
    if a.beam is not None:
        lines.extend(beam_text(a.beam, u))
    if a.stages is not None:
        lines.extend(stages_text(a.stages, u))
    if a.checks or a.beam is not None:
        from ..design.text import checks_text

        lines.extend(checks_text(a.checks, u, a.verdict,
                                 tuple(str(p) for p in a.incomplete_reasons)))
    if a.warnings:
        lines.append("")
        lines.append("Warnings")
        lines.extend(f"  {w}" for w in a.warnings)
    lines.append("")
    lines.append("Assumptions: " + " ".join(assumptions(a.section, ASSUMPTIONS)))
    lines.append("")
    lines.append(FIRE_NOTE)
    return "\n".join(lines) + "\n"


def stages_text(st: StagesResult, u: str) -> list[str]:
    """Both stages of a member strengthened under load, as the checks add them: the
    combinations table above is of the built-up section under every load, these are the
    two stages the checks use.
    """
    existing = ", ".join(p.name for p in st.existing.plies)
    lines = ["", "Stages (strengthened under load: the checks add the two; the combinations "
             "above are of the built-up section under every load)",
             f"  before: {existing}, EI {fmt(st.existing.EI, 'EI', u)}; after: the built-up "
             f"section, EI {fmt(st.built_up.EI, 'EI', u)}"]
    header = ["combination", "defl. before", "defl. after", "sum"]
    after = {r.combination: r for r in st.after}
    cells = [[r.combination, fmt(r.deflection_max, "deflection", u, 3),
              fmt(after[r.combination].deflection_max, "deflection", u, 3),
              fmt(r.deflection_max + after[r.combination].deflection_max, "deflection", u, 3)]
             for r in st.before if r.combination in after]
    lines += ["    " + t for t in text_table(header, cells, frozenset(range(1, 4)))]
    lines.append("  (each stage's largest deflection; the sum bounds the member's, which the "
                 "deflection checks find along it)")
    return lines


def beam_text(beam: BeamResult, u: str) -> list[str]:
    """Readable beam actions."""
    lay = beam.spec.layout
    lines = ["", f"Beam: {lay.supports}, spans "
             + ", ".join(fmt(s, 'span', u) for s in lay.spans)
             + f", length {fmt(lay.length, 'span', u)}"]
    if beam.self_weight_line:
        lines.append(f"  self-weight (case D) {fmt(beam.self_weight_line, 'line_load', u)}")
    lines.append("  Reactions (upward positive)")
    for k, x in enumerate(lay.support_positions()):
        parts = ", ".join(f"{c} {fmt(float(sol.reactions[k]), 'force', u)}"
                          for c, sol in beam.cases.items())
        lines.append(f"    support {k + 1} at {fmt(x, 'span', u)}: {parts}")
    lines.append("  Combinations")
    header = ["name", "kind", "M max", "M min", "|V| max", "defl.", "defl. total"]
    cells = [[c.name, c.combination.kind_on(beam.basis), fmt(c.extremes.M_max, "moment", u),
              fmt(c.extremes.M_min, "moment", u), fmt(c.extremes.V_max_abs, "force", u),
              fmt(c.extremes.deflection_max_abs, "deflection", u, 3),
              fmt(c.total.deflection_max_abs, "deflection", u, 3)]
             for c in beam.combinations]
    lines += ["    " + t for t in text_table(header, cells, frozenset(range(2, 7)))]
    if beam.patterned_cases:
        lines.append(f"  Pattern loading: {', '.join(beam.patterned_cases)} placed on each of "
                     f"{', '.join(beam.regions)} or not; the envelope is shown")
    for rb in beam.reaction_envelope:
        lines.append(f"  support {rb.support}: reaction from {fmt(rb.min, 'force', u)} "
                     f"({rb.combination_min}) to {fmt(rb.max, 'force', u)} "
                     f"({rb.combination_max})")
    sym = "K_cr" if beam.basis == "US" else "1 + k_def"
    lines.append(f"  Creep: {sym} = {beam.creep_factor:g}; long-term EI "
                 f"{fmt(beam.creep_section.EI, 'EI', u)}; total = long-term + short-term")
    return lines
