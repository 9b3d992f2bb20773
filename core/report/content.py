"""The flowables of the calculation sheet, section by section, in the reviewer's order."""

from __future__ import annotations

from typing import Any

from reportlab.lib import colors
from reportlab.lib.styles import ParagraphStyle
from reportlab.lib.units import mm
from reportlab.platypus import (
    CondPageBreak,
    KeepTogether,
    Paragraph,
    Spacer,
    Table,
    TableStyle,
)

from ..actions.beam import diagram
from ..design.check import Check, governing
from ..design.text import governing_per_group
from ..model.caution import ASSUMPTIONS, CAUTION
from ..model.project import Project
from ..model.units import fmt, sig, to_display, unit_label
from ..pipeline import Analysis, run
from ..study.compare import alternatives_with_current, summarise
from .drawings import line_plot, profile_drawing, section_drawing

FONT = "PlyStackSans"
BOLD = "PlyStackSans-Bold"
BODY = ParagraphStyle("body", fontName=FONT, fontSize=8.5, leading=11)
SMALL = ParagraphStyle("small", fontName=FONT, fontSize=7, leading=9)
EQ = ParagraphStyle("eq", fontName=FONT, fontSize=8.5, leading=12, leftIndent=6 * mm)
H1 = ParagraphStyle("h1", fontName=BOLD, fontSize=11.5, leading=15, spaceBefore=6,
                    spaceAfter=4)
H2 = ParagraphStyle("h2", fontName=BOLD, fontSize=9.5, leading=12, spaceBefore=5,
                    spaceAfter=2)
CAUTION_STYLE = ParagraphStyle("caution", parent=BODY, backColor=colors.Color(1, 0.96, 0.84),
                               borderColor=colors.Color(0.6, 0.45, 0.0), borderWidth=0.5,
                               borderPadding=4, spaceBefore=4, spaceAfter=6)


def _esc(text: str) -> str:
    return text.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;")


def _table(rows: list[list[Any]], widths: list[float] | None = None,
           header: bool = True, font_size: float = 7.2) -> Table:
    cells = [[Paragraph(_esc(str(c)), ParagraphStyle("c", fontName=FONT, fontSize=font_size,
                                                      leading=font_size + 1.6))
              if not isinstance(c, Paragraph) else c for c in row] for row in rows]
    t = Table(cells, colWidths=widths, repeatRows=1 if header else 0, hAlign="LEFT")
    style = [("GRID", (0, 0), (-1, -1), 0.3, colors.grey),
             ("FONTNAME", (0, 0), (-1, -1), FONT),
             ("VALIGN", (0, 0), (-1, -1), "TOP"),
             ("LEFTPADDING", (0, 0), (-1, -1), 2), ("RIGHTPADDING", (0, 0), (-1, -1), 2),
             ("TOPPADDING", (0, 0), (-1, -1), 1), ("BOTTOMPADDING", (0, 0), (-1, -1), 1)]
    if header:
        style.append(("BACKGROUND", (0, 0), (-1, 0), colors.Color(0.88, 0.88, 0.88)))
    t.setStyle(TableStyle(style))
    return t


def story(a: Analysis, original: Project, width: float) -> list[Any]:
    """All flowables of the sheet."""
    u = a.project.display_units
    out: list[Any] = []
    out += _basis(a, u)
    out += _section(a, u, width)
    out += _transformed(a, u)
    out += _beam(a, u, width)
    out += _profiles(a, u, width)
    out += _checks(a, u)
    out += _summary(a, original, u)
    return out


def _basis(a: Analysis, u: str) -> list[Any]:
    d = a.design
    if d.us:
        basis = ("US allowable stress design: timber per NDS 2018 (reference design values "
                 "from the NDS Supplement), steel per AISC 360-16, load combinations per "
                 "ASCE 7-16 2.4.1 (ASD).")
    else:
        basis = ("EU limit states: timber per EN 1995-1-1:2004+A1:2008 with EN 338 / EN 14080 "
                 "values, steel per EN 1993-1-1:2005, combinations per EN 1990 (recommended "
                 f"values; national annexes vary); service class {d.service_class}.")
    live, total, long_term = d.deflection_limits()
    system = "US customary (in, ft, lbf, psi)" if u == "US" else "SI (mm, m, kN, MPa)"
    wet = "yes" if d.wet_service else "no"
    braced = "yes" if d.compression_edge_braced else "no"
    out: list[Any] = [Paragraph("1  Design basis and assumptions", H1),
                      Paragraph(_esc(basis), BODY),
                      Paragraph(_esc(
                          f"Units: {system}. Deflection limits: live L/{live:g}, total "
                          f"L/{total:g}, long-term L/{long_term:g}. Wet service: {wet}; "
                          f"compression edge braced: {braced}."), BODY),
                      Paragraph("Assumptions:", BODY)]
    for text in ASSUMPTIONS:
        out.append(Paragraph("\u2022 " + _esc(text), BODY))
    if a.warnings:
        out.append(Paragraph("Warnings:", BODY))
        for w in a.warnings:
            out.append(Paragraph("\u2022 " + _esc(str(w)), BODY))
    out.append(Paragraph(_esc(CAUTION), CAUTION_STYLE))
    return out


def _section(a: Analysis, u: str, width: float) -> list[Any]:
    s = a.section
    drawing, scale = section_drawing(s, u, width=84 * mm, height=105 * mm)
    legend = [["No.", "Ply", "Material", "x", "y", "width", "height"]]
    for i, p in enumerate(s.plies):
        legend.append([str(i + 1), p.name, p.material, fmt(p.x, "length", u),
                       fmt(p.y, "length", u), fmt(p.width, "length", u),
                       fmt(p.height, "length", u)])
    ratio = 1 / (scale * 25.4 / 72 / 1000) if scale else 0  # real length / printed length
    out: list[Any] = [CondPageBreak(120 * mm), Paragraph("2  Section", H1),
                      Paragraph(_esc(f"Drawn to scale 1 : {sig(ratio, 3)} (on the printed "
                                     "page). Timber: light with grain lines; steel: solid "
                                     "dark; neutral axis: red dash-dot line. Plies are listed "
                                     "in stacking order; where plies overlap the later one "
                                     "wins."), SMALL),
                      Table([[drawing, _table(legend, font_size=6.8)]],
                            colWidths=[84 * mm, width - 84 * mm], hAlign="LEFT",
                            style=[("VALIGN", (0, 0), (-1, -1), "TOP"),
                                   ("FONTNAME", (0, 0), (-1, -1), FONT)])]
    mats = [["Material", "Name", "E", "Design values", "Source"]]
    seen = []
    for m in s.materials:
        if m.id in seen:
            continue
        seen.append(m.id)
        vals = ", ".join(f"{k} {v:g}" if k == "G" else f"{k} {fmt(v, 'stress', u)}"
                         for k, v in m.values.items() if k not in ("rho_k",))
        mats.append([m.id, m.name, fmt(m.E, "modulus", u), vals, m.source])
    out += [Paragraph("Materials", H2),
            _table(mats, [22 * mm, 34 * mm, 22 * mm, 52 * mm, width - 130 * mm])]
    return out


def _transformed(a: Analysis, u: str) -> list[Any]:
    s = a.section
    L, A = unit_label("length", u), unit_label("area", u)
    rows = [["Ply", "Material", "n", "b", "n b", "h", "n A", "y\u0304", "n A y\u0304",
             "n I own", "n A d\u00b2"]]
    y_na = s.neutral_axis_y
    terms_num, terms_den, terms_i = [], [], []
    kl = to_display(1.0, "length", u)
    ka = to_display(1.0, "area", u)
    k3 = to_display(1.0, "section_modulus", u)
    k4 = to_display(1.0, "second_moment", u)
    for r in s.ply_results():
        if r.area <= 0:
            rows.append([r.name, r.material, sig(r.modular_ratio, 4), "", "", "", "0",
                         "", "", "", ""])
            continue
        p = next(p for p in s.plies if p.name == r.name)
        nA = r.transformed_area
        ad2 = nA * (r.centroid_y - y_na) ** 2
        if ad2 < 1e-12 * max(r.modular_ratio * r.I_own, 1e-300):
            ad2 = 0.0  # centroid on the neutral axis: round-off only
        rows.append([r.name, r.material, sig(r.modular_ratio, 4),
                     sig(p.width * kl, 4), sig(r.transformed_width * kl, 4),
                     sig(p.height * kl, 4), sig(nA * ka, 4), sig(r.centroid_y * kl, 4),
                     sig(nA * r.centroid_y * k3, 4), sig(r.modular_ratio * r.I_own * k4, 4),
                     sig(ad2 * k4, 4)])
        terms_num.append(f"{sig(nA * ka, 4)} \u00d7 {sig(r.centroid_y * kl, 4)}")
        terms_den.append(sig(nA * ka, 4))
        terms_i.append(f"({sig(r.modular_ratio * r.I_own * k4, 4)} + "
                       f"{sig(ad2 * k4, 4)})")
    I4 = unit_label("second_moment", u)
    out: list[Any] = [
        CondPageBreak(70 * mm),
        Paragraph("3  Transformed section", H1),
        Paragraph(_esc(f"Reference material {s.reference_material}, E_ref = "
                       f"{fmt(s.E_ref, 'modulus', u)}; n = E / E_ref. Widths scaled by n about "
                       f"each ply's own centre line; heights unchanged. Lengths in {L}, areas in "
                       f"{A}, second moments in {I4}; d = y\u0304 - y_na."), SMALL),
        _table(rows, font_size=6.6),
        Spacer(1, 3 * mm),
        Paragraph(_esc("y_na = \u03a3(n A y\u0304) / \u03a3(n A) = (" + " + ".join(terms_num)
                       + ") / (" + " + ".join(terms_den) + ") = "
                       + fmt(y_na, "length", u, 5)), EQ),
        Paragraph(_esc("I_t = \u03a3 n (I_own + A d\u00b2) = " + " + ".join(terms_i) + " = "
                       + fmt(s.I_transformed, "second_moment", u, 5)), EQ),
        Paragraph(_esc(f"EI = E_ref \u00d7 I_t = {fmt(s.E_ref, 'modulus', u)} \u00d7 "
                       f"{fmt(s.I_transformed, 'second_moment', u, 5)} = "
                       f"{fmt(s.EI, 'EI', u, 5)}"), EQ),
        Paragraph(_esc(f"EA = {fmt(s.EA, 'EA', u, 5)}; mass per length "
                       f"{fmt(s.mass_per_length, 'mass_per_length', u)}."), EQ),
    ]
    shares = ", ".join(f"{p.name} {sh * 100:.1f} %" for p, sh in zip(s.plies, s.moment_shares(),
                                                                     strict=True))
    out.append(Paragraph(_esc(f"Share of moment E_i I_i,na / EI: {shares}."), SMALL))
    return out


def _beam(a: Analysis, u: str, width: float) -> list[Any]:
    beam = a.beam
    assert beam is not None
    lay = beam.spec.layout
    out: list[Any] = [CondPageBreak(60 * mm), Paragraph("4  Beam actions", H1)]
    spans = ", ".join(fmt(s, "span", u) for s in lay.spans)
    text = (f"Supports: {lay.supports}; spans {spans}; overhangs left "
            f"{fmt(lay.overhang_left, 'span', u)}, right {fmt(lay.overhang_right, 'span', u)}; "
            f"member length {fmt(lay.length, 'span', u)}. Positions from the left end. "
            "Loads positive downward; reactions positive upward; sagging moment positive.")
    if beam.spec.self_weight:
        text += f" Self-weight (case D): {fmt(beam.self_weight_line, 'line_load', u)}."
    out.append(Paragraph(_esc(text), BODY))
    rows = [["Case", "Type", "Value", "Tributary width", "From / at", "To"]]
    kinds = {"area": "area_load", "line": "line_load", "point": "force"}
    for ld in beam.spec.loads:
        rows.append([ld.case, ld.type, fmt(ld.value, kinds[ld.type], u),
                     fmt(ld.tributary_width, "length", u) if ld.tributary_width else "",
                     fmt(ld.at, "span", u) if ld.at is not None else (
                         fmt(ld.start, "span", u) if ld.start is not None else "left end"),
                     "" if ld.type == "point" else (fmt(ld.end, "span", u)
                                                    if ld.end is not None else "right end")])
    out += [Paragraph("Loads by case", H2), _table(rows)]
    rows = [["Combination", "Use", "Factors", "Duration", "M max", "M min", "|V| max",
             "Deflection"]]
    for c in beam.combinations:
        e = c.extremes
        rows.append([c.name, c.combination.limit_state,
                     ", ".join(f"{k} {v:g}" for k, v in c.combination.factors.items()),
                     c.duration, fmt(e.M_max, "moment", u), fmt(e.M_min, "moment", u),
                     fmt(e.V_max_abs, "force", u), fmt(e.deflection_max_abs, "deflection", u, 3)])
    out += [Paragraph("Combinations", H2), _table(rows)]
    rows = [["Support", "x", "Type", *beam.cases.keys()]]
    for k, (x, kind) in enumerate(zip(lay.support_positions(), lay.support_kinds(), strict=True)):
        rows.append([str(k + 1), fmt(x, "span", u), kind,
                     *[fmt(float(s.reactions[k]), "force", u) for s in beam.cases.values()]])
    out += [Paragraph("Reactions by case (upward positive)", H2), _table(rows)]
    gov = max(beam.combinations, key=lambda c: abs(c.M_governing))
    sls = [c for c in beam.combinations
           if c.combination.limit_state in ("ASD", "SLS-characteristic", "custom")]
    gov_sls = max(sls or list(beam.combinations),
                  key=lambda c: c.extremes.deflection_max_abs)
    d = diagram(beam.model, gov.solution, a.section.EI)
    d_sls = diagram(beam.model, gov_sls.solution, a.section.EI)
    kx = to_display(1.0, "span", u)
    marks = [x * kx for x in lay.support_positions()]
    xl = f"x from the left end ({unit_label('span', u)})"
    plots = [line_plot(d.x * kx, d.V * to_display(1.0, "force", u), xl,
                       f"V ({unit_label('force', u)})", width, marks=marks),
             line_plot(d.x * kx, d.M * to_display(1.0, "moment", u), xl,
                       f"M ({unit_label('moment', u)})", width, marks=marks)]
    out.append(KeepTogether([Paragraph(_esc(f"Shear and moment for {gov.name}"), H2),
                             *plots]))
    out.append(KeepTogether([
        Paragraph(_esc(f"Immediate deflection for {gov_sls.name}"), H2),
        line_plot(d_sls.x * kx, d_sls.deflection * to_display(1.0, "deflection", u), xl,
                  f"deflection ({unit_label('deflection', u)}, down +)", width,
                  marks=marks)]))
    rows = [["Combination", "Short-term part", "Long-term part (creep)", "Total"]]
    for c in beam.combinations:
        rows.append([c.name,
                     fmt(c.short_term_rest.deflection_max_abs if c.short_term_rest else 0.0,
                         "deflection", u, 3),
                     fmt(c.long_term.deflection_max_abs if c.long_term else 0.0,
                         "deflection", u, 3),
                     fmt(c.total.deflection_max_abs, "deflection", u, 3)])
    sym = "K_cr" if beam.basis == "US" else "1 + k_def"
    out.append(KeepTogether([
        Paragraph("Deflection with creep", H2),
        Paragraph(_esc(f"{sym} = {beam.creep_factor:g}: the sustained part (D plus "
                       f"{(beam.spec.sustained_live_fraction or 0) * 100:g} % of L) acts on "
                       "the section with timber moduli divided by "
                       f"{sym} (EI = {fmt(beam.creep_section.EI, 'EI', u, 4)}); steel does "
                       "not creep. Total = long-term part + short-term part."), SMALL),
        _table(rows)]))
    return out


def _profiles(a: Analysis, u: str, width: float) -> list[Any]:
    beam = a.beam
    assert beam is not None
    gov = max(beam.combinations, key=lambda c: abs(c.M_governing))
    top, bot = a.section.ply_extreme_stresses(gov.M_governing)
    micro = "\u00b5\u03b5"
    rows = [["Ply", "y bottom", "y top", f"strain bottom ({micro})", f"strain top ({micro})",
             "stress bottom", "stress top"]]
    for i, p in enumerate(a.section.plies):
        yb, yt = float(a.section.y_bottom[i]), float(a.section.y_top[i])
        rows.append([p.name, fmt(yb, "length", u), fmt(yt, "length", u),
                     sig(float(a.section.strain(gov.M_governing, yb)) * 1e6, 4),
                     sig(float(a.section.strain(gov.M_governing, yt)) * 1e6, 4),
                     fmt(float(bot[i]), "stress", u), fmt(float(top[i]), "stress", u)])
    return [CondPageBreak(90 * mm), Paragraph("5  Strain and stress", H1),
            Paragraph(_esc(f"At M = {fmt(gov.M_governing, 'moment', u)} ({gov.name}): "
                           "\u03b5(y) = -M (y - y_na) / EI, \u03c3_i = E_i \u03b5 (tension "
                           "positive). Strains are equal on both sides of an interface; stresses "
                           "differ by the ratio of the moduli."), SMALL),
            profile_drawing(a.section, gov.M_governing, u, width=width),
            _table(rows)]


def _check_paragraphs(c: Check, u: str) -> list[Any]:
    kind = c.quantity
    ref_sym, ref_val = c.reference
    ref_kind = "length" if kind == "deflection" else kind
    def term(k: str, v: float) -> str:
        return f"{v:.4g}" if k.replace(".", "", 1).isdigit() else f"{k} ({v:.4g})"

    factors = " \u00d7 ".join(term(k, v) for k, v in c.factors.items())
    partial = " \u00d7 ".join(term(k, v) for k, v in c.partial_factors.items())
    cap_eq = f"{ref_sym} {fmt(ref_val, ref_kind, u)}"
    if factors:
        cap_eq += f" \u00d7 {factors}"
    if partial:
        cap_eq += f" / ({partial})"
    where = f"{c.ply} " if c.ply else ""
    if c.location:
        where += f"({c.location}) "
    text = [Paragraph(_esc(f"{c.id} \u2014 {where}\u2014 {c.combination}"), H2),
            Paragraph(_esc(c.equation), EQ),
            Paragraph(_esc(f"capacity = {cap_eq} = {fmt(c.capacity, kind, u)}"), EQ),
            Paragraph(_esc(f"demand = {fmt(c.demand, kind, u)}; ratio = "
                           f"{fmt(c.demand, kind, u)} / {fmt(c.capacity, kind, u)} = "
                           f"{c.ratio:.3f} \u2192 {'OK' if c.ok else 'NOT OK'}"), EQ)]
    sources = "; ".join(f"{k}: {v}" for k, v in c.sources.items())
    if sources:
        text.append(Paragraph(_esc("Sources: " + sources), SMALL))
    for n in c.notes:
        if n != CAUTION:
            text.append(Paragraph(_esc("Note: " + n), SMALL))
    return [KeepTogether(text)]


def _checks(a: Analysis, u: str) -> list[Any]:
    out: list[Any] = [CondPageBreak(60 * mm), Paragraph("6  Design checks", H1),
                      Paragraph(_esc("Each check at its governing combination, written out; "
                                     "then every check of every combination."), SMALL)]
    for c in governing_per_group(a.checks):
        out += _check_paragraphs(c, u)
    rows = [["Check", "Ply / place", "Combination", "Demand", "Capacity", "Ratio", "Verdict"]]
    for c in a.checks:
        where = c.ply or c.location
        if c.id == "bearing":
            where = c.location
        rows.append([c.id, where, c.combination or "", fmt(c.demand, c.quantity, u),
                     fmt(c.capacity, c.quantity, u), f"{c.ratio:.3f}",
                     "OK" if c.ok else "NOT OK"])
    out += [Paragraph("All checks", H2), _table(rows, font_size=6.8),
            Paragraph(_esc(CAUTION), CAUTION_STYLE)]
    return out


def _summary(a: Analysis, original: Project, u: str) -> list[Any]:
    gov = governing(a.checks)
    assert gov is not None
    ok = all(c.ok for c in a.checks)
    verdict = "OK" if ok else "NOT OK"
    out: list[Any] = [CondPageBreak(50 * mm), Paragraph("7  Summary", H1),
                      Paragraph(_esc(f"Governing check: {gov.id} in {gov.ply or gov.location}"
                                     f" under {gov.combination}, ratio {gov.ratio:.3f}."), BODY),
                      Paragraph(f"<b>Verdict: {verdict}</b>",
                                ParagraphStyle("v", parent=BODY, fontSize=12, leading=16,
                                               textColor=colors.black if ok else colors.red))]
    alts = alternatives_with_current(original)
    if len(alts) > 1:
        rows = [["Alternative", "EI", "Mass per length", "Governs", "Ratio", "Deflection",
                 "Verdict"]]
        for alt in alts:
            o = summarise(run(original.with_plies(alt.plies)))
            rows.append([alt.name, fmt(o.EI, "EI", u), fmt(o.mass_per_length,
                                                          "mass_per_length", u),
                         o.governing_id, f"{o.governing_ratio:.3f}",
                         fmt(o.deflection_max_abs, "deflection", u, 3),
                         "OK" if o.ok else "NOT OK"])
        out += [Paragraph("Comparison of alternatives", H2), _table(rows)]
    out.append(Paragraph(_esc(CAUTION), CAUTION_STYLE))
    return out
