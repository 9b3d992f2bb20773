"""Section 4 of the sheet: the loads derived (area loads to line loads, self-weight
from the plies), the combinations with their factors and kind, reactions by case and
per combination, and the diagrams.
"""

from __future__ import annotations

from typing import Any

from reportlab.lib.units import mm
from reportlab.platypus import CondPageBreak, KeepTogether

from ..actions.analysis import BeamResult
from ..actions.extremes import diagram
from ..model.constants import GRAVITY
from ..model.member import Load
from ..pipeline import Analysis
from .drawings import line_plot
from .layout import EQ, H1, H2, SMALL, para, table
from .numbers import NBSP, TIMES, exact, factor, factor_text, num, q, unit, width_text

IN = 5
KINDS = {"area": "area_load", "line": "line_load", "point": "force"}
CASE_WORDS = {"D": "dead", "L": "live", "Lr": "roof live", "S": "snow", "W": "wind"}


def factors_text(factors: dict[str, float] | Any) -> str:
    """Load factors as a sum, e.g. 1.0 D + 0.75 L."""
    return " + ".join(f"{factor_text(f)}{NBSP}{c}" for c, f in factors.items() if f)


def _where(ld: Load, u: str) -> str:
    if ld.type == "point":
        return f"at x = {q(ld.at or 0.0, 'span', u)}"
    if ld.start is None and ld.end is None:
        return "whole member"
    start = q(ld.start or 0.0, "span", u)
    end = "the right end" if ld.end is None else q(ld.end, "span", u)
    return f"x = {start} to {end}"


def loads_block(a: Analysis, u: str, width: float) -> list[Any]:
    """The loads as entered, each area load turned into a line load, and self-weight."""
    beam = a.beam
    assert beam is not None
    rows = [["No.", "Case", "Description", "Type", "Value", "Tributary width", "Line load",
             "Where"]]
    lines = []
    for k, ld in enumerate(beam.spec.loads, start=1):
        trib = width_text(ld.tributary_width, u) if ld.tributary_width else ""
        line = q(ld.line_value, "line_load", u) if ld.type != "point" else ""
        value = exact(ld.value, KINDS[ld.type], u)
        if ld.value_end is not None and ld.type != "point":  # a varying load: both ends
            value += f" \u2192 {exact(ld.value_end, KINDS[ld.type], u)}"
            line += f" \u2192 {q(ld.line_value_end, 'line_load', u)}"
        rows.append([str(k), ld.case, ld.description or CASE_WORDS.get(ld.case, ""), ld.type,
                     value, trib, line, _where(ld, u)])
        if ld.type == "area" and ld.tributary_width:
            span_w = exact(ld.tributary_width, "span", u)
            shown = f"{trib} ({span_w})" if u == "US" else span_w
            lines.append(para(
                f"Load {k} ({ld.case}): w = q s = {exact(ld.value, 'area_load', u)} {TIMES} "
                f"{shown} = {q(ld.line_value, 'line_load', u, IN)}", EQ))
            if ld.value_end is not None:
                lines.append(para(
                    f"Load {k} ({ld.case}) at its end: w = q s = "
                    f"{exact(ld.value_end, 'area_load', u)} {TIMES} {shown} = "
                    f"{q(ld.line_value_end, 'line_load', u, IN)}", EQ))
    out: list[Any] = [para("Loads", H2), table(rows, width)]
    if lines:
        out.append(para("Area loads to line loads (q the area load, s the tributary width "
                        "it is collected from):", SMALL))
        out += lines
    out += _self_weight(a, beam, u)
    return out


def _self_weight(a: Analysis, beam: BeamResult, u: str) -> list[Any]:
    if not beam.spec.self_weight:
        return [para("Self-weight: not included (the project leaves it out).", SMALL)]
    s = a.section
    terms = []
    for i, mat in enumerate(s.materials):
        if s.area[i] > 0 and mat.density > 0:
            terms.append((mat.density, float(s.area[i])))
    dens = "density"
    if u == "US":
        body = " + ".join(f"{exact(rho, dens, u)} {TIMES} {q(area, 'area', u, IN)}"
                          for rho, area in terms)
        text = (f"w_sw = \u03a3 \u03c1 A g = ({body}) / 144{NBSP}in\u00b2/ft\u00b2 = "
                f"{q(beam.self_weight_line, 'line_load', u, IN)} (pounds mass per foot weigh "
                "as many pounds force per foot under standard gravity)")
    else:
        body = " + ".join(f"{exact(rho, dens, u)} {TIMES} {q(area, 'area', u, IN)}"
                          for rho, area in terms)
        text = (f"w_sw = \u03a3 \u03c1 A g = ({body}) {TIMES} 10\u207b\u2076{NBSP}m\u00b2/mm\u00b2 "
                f"{TIMES} {factor_text(GRAVITY)}{NBSP}m/s\u00b2 / 1,000{NBSP}N/kN = "
                f"{q(beam.self_weight_line, 'line_load', u, IN)}")
    names = ", ".join(f"{p.name} ({m.id})" for p, m in zip(s.plies, s.materials, strict=True)
                      if m.density > 0)
    return [para(f"Self-weight of the member (case D, whole length), from the plies' areas "
                 f"after clipping and their densities: {names}.", SMALL), para(text, EQ)]


def combinations_block(beam: BeamResult, u: str, width: float) -> list[Any]:
    """Each combination with its factors, kind and duration, and its extreme actions;
    for a patterned member, the arrangements tried and the one governing each extreme.
    """
    rows = [["Combination", "Kind", "Factors", "Duration", "M max", "M min", "|V| max",
             "Deflection"]]
    for c in beam.combinations:
        e = c.extremes
        rows.append([c.name, c.kind, factors_text(c.combination.factors),
                     c.duration, q(e.M_max, "moment", u), q(e.M_min, "moment", u),
                     q(e.V_max_abs, "force", u), q(e.deflection_max_abs, "deflection", u, 3)])
    out: list[Any] = [
        para("Combinations", H2),
        para("Kind: ASD (US allowable stress: strength and deflection), ULS (EU strength), "
             "SLS-characteristic, SLS-frequent and SLS-quasi-permanent (EU serviceability). "
             "Duration: the load-duration class that sets C_D or k_mod. Deflection: "
             "immediate, short-term stiffness.", SMALL),
        table(rows, width, align_right=(4, 5, 6, 7))]
    if beam.patterned_cases:
        out += _patterns_block(beam, u, width)
    return out


def _pattern_cell(value: str, regions: tuple[str, ...]) -> str:
    return f"{value}, {' + '.join(regions) if regions else 'no variable region'}"


def _patterns_block(beam: BeamResult, u: str, width: float) -> list[Any]:
    """The arrangements tried and the governing one beside each extreme."""
    rows = [["Combination", "Arrangements tried", "M max, regions loaded",
             "M min, regions loaded", "Deflection, regions loaded"]]
    for c in beam.combinations:
        g, e = c.governing_patterns, c.extremes
        rows.append([c.name, str(c.patterns_tried),
                     _pattern_cell(q(e.M_max, "moment", u), g.get("M_max", ())),
                     _pattern_cell(q(e.M_min, "moment", u), g.get("M_min", ())),
                     _pattern_cell(q(e.deflection_max_abs, "deflection", u, 3),
                                   g.get("deflection_max_abs", ()))])
    cases = ", ".join(beam.patterned_cases)
    return [KeepTogether([
        para("Pattern loading", H2),
        para(f"The variable cases {cases} are placed region by region ({', '.join(beam.regions)})"
             "; each extreme is the envelope over the arrangements tried, and the regions "
             "loaded in the arrangement that governs it stand beside it. Permanent loads "
             "stay on every region.", SMALL),
        table(rows, width, align_right=(1,))])]


def reactions_block(beam: BeamResult, u: str, width: float) -> list[Any]:
    """Reactions of each case and of each combination (those bearing uses)."""
    lay = beam.spec.layout
    kinds = lay.support_kinds()
    rows = [["Support", "x", "Type", *[f"R, case {c}" for c in beam.cases]]]
    for k, x in enumerate(lay.support_positions()):
        rows.append([str(k + 1), q(x, "span", u), kinds[k],
                     *[q(float(s.reactions[k]), "force", u, IN) for s in beam.cases.values()]])
    out: list[Any] = [para("Reactions by case (upward positive)", H2),
                      table(rows, width, align_right=tuple(range(3, 3 + len(beam.cases))))]
    rows = [["Combination", *[f"R{k + 1}" for k in range(len(lay.support_positions()))],
             "\u03a3R = W"]]
    lines = []
    for c in beam.combinations:
        r = [float(v) for v in c.solution.reactions]
        rows.append([c.name, *[q(v, "force", u) for v in r], q(sum(r), "force", u)])
        parts = []
        for k, value in enumerate(r):
            sums = " + ".join(f"{factor_text(f)} {TIMES} "
                              f"{q(float(beam.cases[case].reactions[k]), 'force', u, IN)}"
                              for case, f in c.combination.factors.items()
                              if f and case in beam.cases)
            parts.append(f"R{k + 1} = {sums} = {q(value, 'force', u, IN)}")
        lines.append(para(f"{c.name}: " + "; ".join(parts), EQ))
    out.append(KeepTogether([
        para("Reactions per combination, every region loaded (R = \u03a3 \u03b3 R_case; "
             "bearing uses the largest at each support, the bolts use W = \u03a3R)", H2),
        table(rows, width, align_right=tuple(range(1, len(rows[0])))), *lines]))
    if beam.patterned_cases:
        env = [["Combination", *[f"R{k + 1} max / min" for k in
                                 range(len(lay.support_positions()))]]]
        for c in beam.combinations:
            env.append([c.name, *[f"{q(float(hi), 'force', u)} / {q(float(lo), 'force', u)}"
                                  for hi, lo in zip(c.reactions_max, c.reactions_min,
                                                    strict=True)]])
        out.append(KeepTogether([
            para("Reactions over the arrangements tried (largest / smallest; negative: "
                 "uplift). Bearing uses the largest.", H2),
            table(env, width, align_right=tuple(range(1, len(env[0]))))]))
    return out


def beam_section(a: Analysis, u: str, width: float) -> list[Any]:
    """Section 4: layout, loads, combinations, reactions, diagrams, creep."""
    beam = a.beam
    assert beam is not None
    lay = beam.spec.layout
    spans = ", ".join(q(s, "span", u) for s in lay.spans)
    text = (f"Supports: {lay.supports}; span{'s' if len(lay.spans) > 1 else ''} {spans}; "
            f"overhangs left {q(lay.overhang_left, 'span', u)}, right "
            f"{q(lay.overhang_right, 'span', u)}; member length {q(lay.length, 'span', u)}. "
            "Positions from the left end. Loads positive downward; reactions positive "
            "upward; sagging moment positive.")
    out: list[Any] = [CondPageBreak(120 * mm), para("4  Beam actions", H1), para(text)]
    out += loads_block(a, u, width)
    out += combinations_block(beam, u, width)
    out += reactions_block(beam, u, width)
    out += _diagrams(a, beam, u, width)
    out += _creep(beam, u, width)
    return out


def _diagrams(a: Analysis, beam: BeamResult, u: str, width: float) -> list[Any]:
    lay = beam.spec.layout
    gov = max(beam.combinations, key=lambda c: abs(c.M_governing))
    sls = [c for c in beam.combinations
           if c.combination.limit_state in ("ASD", "SLS-characteristic", "custom")]
    gov_sls = max(sls or list(beam.combinations), key=lambda c: c.extremes.deflection_max_abs)
    d = diagram(beam.model, gov.solution, beam.solution_EI)
    d_sls = diagram(beam.model, gov_sls.solution, beam.solution_EI)
    kx = factor("span", u)
    marks = [x * kx for x in lay.support_positions()]
    xl = f"x from the left end ({unit('span', u)})"
    kf, km, kd = factor("force", u), factor("moment", u), factor("deflection", u)
    plots = [line_plot(d.x * kx, d.V * kf, xl, f"V ({unit('force', u)})", width, marks=marks,
                       legend=f"shear V, {gov.name}"),
             line_plot(d.x * kx, d.M * km, xl, f"M ({unit('moment', u)})", width, marks=marks,
                       legend=f"moment M, {gov.name}")]
    return [CondPageBreak(95 * mm),
            KeepTogether([para(f"Shear and moment for {gov.name} (the largest moment)", H2),
                          *plots]),
            KeepTogether([para(f"Immediate deflection for {gov_sls.name}", H2),
                          line_plot(d_sls.x * kx, d_sls.deflection * kd, xl,
                                    f"deflection ({unit('deflection', u)}, down +)", width,
                                    marks=marks,
                                    legend=f"deflection, {gov_sls.name}, short-term EI")])]


def _creep(beam: BeamResult, u: str, width: float) -> list[Any]:
    rows = [["Combination", "Short-term part", "Long-term part (creep)", "Total"]]
    for c in beam.combinations:
        rows.append([c.name,
                     q(c.short_term_rest.deflection_max_abs if c.short_term_rest else 0.0,
                       "deflection", u, 3),
                     q(c.long_term.deflection_max_abs if c.long_term else 0.0,
                       "deflection", u, 3),
                     q(c.total.deflection_max_abs, "deflection", u, 3)])
    sym = "K_cr" if beam.basis == "US" else "1 + k_def"
    frac = (beam.spec.sustained_live_fraction or 0) * 100
    part = (f"D plus {num(frac, 3) if frac else '0'} % of L" if beam.basis == "US" else
            "G + \u03c8\u2082 Q, the quasi-permanent part, EN 1995-1-1 2.2.3(5)")
    return [KeepTogether([
        para("Deflection with creep", H2),
        para(f"{sym} = {factor_text(beam.creep_factor)}: the sustained part ({part}"
             ") acts on the section with timber moduli "
             f"divided by {sym} ({'EI_cr' if beam.basis == 'US' else 'EI_fin'} = "
             f"{q(beam.creep_section.EI, 'EI', u, IN)}); steel does "
             "not creep. Total = long-term part + short-term part.", SMALL),
        table(rows, width, align_right=(1, 2, 3))])]
