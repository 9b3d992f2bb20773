"""The flowables of the calculation sheet, section by section, in the reviewer's order:
basis, section, transformed section, beam actions (loads derived), strain and stress,
design checks (each written out), summary, sources.
"""

from __future__ import annotations

from typing import Any

from reportlab.lib import colors
from reportlab.lib.styles import ParagraphStyle
from reportlab.lib.units import mm
from reportlab.platypus import CondPageBreak, KeepTogether, Spacer, Table

from ..design.check import governing
from ..io.project_file import dumps
from ..model.caution import ASSUMPTIONS, CAUTION, FIRE_NOTE
from ..model.materials import NUMBER_KEYS, Material
from ..model.project import Project
from ..pipeline import Analysis
from ..section.gamma import assumptions
from ..study.compare import alternative_analyses, alternatives_with_current, summarise
from .checks import checks_section, place
from .derive import symbol_text
from .description import member_description
from .drawings import profile_drawing, section_drawing
from .fonts import undrawn
from .layout import BODY, CAUTION_STYLE, EQ, FONT, H1, H2, SMALL, para, table
from .loads import beam_section
from .member import elevation_block, segments_block, staged_block, transfer_block
from .numbers import exact, factor, num, plain, q, unit, words
from .plate_detail import plate_details
from .sources import sources_section

IN = 5


def story(a: Analysis, original: Project, width: float) -> list[Any]:
    """All flowables of the sheet."""
    u = a.project.display_units
    out: list[Any] = []
    out += _basis(a, u)
    out += _section(a, u, width)
    out += _transformed(a, u, width)
    out += segments_block(a, width)
    out += beam_section(a, u, width)
    out += staged_block(a, width)
    out += _profiles(a, u, width)
    out += checks_section(a, width, transfer_block(a, width))
    out += _summary(a, original, u, width)
    out += plate_details(a, width)
    out += sources_section(a, width)
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
    temperature = {"normal": "normal", "up-to-125F": "up to 125\u00b0F",
                   "up-to-150F": "up to 150\u00b0F"}.get(d.temperature, d.temperature)
    out: list[Any] = [para("1  Design basis and assumptions", H1)]
    description = a.project.info.get("description", "")
    if description:
        out.append(para("Member: " + description, BODY))
    out.append(para("Member as built up: " + member_description(a), BODY))
    out += [para(basis, BODY),
            para(f"Units: {system}. Deflection limits: live L/{live:g}, total L/{total:g}, "
                 f"long-term L/{long_term:g}. Wet service: {'yes' if d.wet_service else 'no'}; "
                 f"temperature: {temperature}; compression edge braced: "
                 f"{'yes' if d.compression_edge_braced else 'no'}.", BODY),
            para("Assumptions:", BODY)]
    out += [para("\u2022 " + text, BODY) for text in assumptions(a.section, ASSUMPTIONS)]
    missing = undrawn(dumps(a.project))
    if missing:
        codes = ", ".join(f"U+{ord(c):04X}" for c in missing[:12])
        more = f" and {len(missing) - 12} more" if len(missing) > 12 else ""
        out.append(para("\u2022 The sheet's font cannot draw some characters of the "
                        f"project's text ({codes}{more}): each is written as [U+...], its "
                        "Unicode code point; the project file holds the text as typed.", BODY))
    if a.warnings:
        out.append(para("Warnings:", BODY))
        out += [para("\u2022 " + words(str(w)), BODY) for w in a.warnings]
    out.append(para(CAUTION, CAUTION_STYLE))
    return out


def _section(a: Analysis, u: str, width: float) -> list[Any]:
    s = a.section
    drawing, scale = section_drawing(s, u, width=78 * mm, height=92 * mm)
    legend = [["No.", "Ply", "Material", "x", "y", "width", "height"]]
    for i, p in enumerate(s.plies):
        legend.append([str(i + 1), p.name, p.material, exact(p.x, "length", u),
                       exact(p.y, "length", u), exact(p.width, "length", u),
                       exact(p.height, "length", u)])
    ratio = 1 / (scale * 25.4 / 72 / 1000) if scale else 0  # real length / printed length
    right = width - 80 * mm
    out: list[Any] = [CondPageBreak(110 * mm), para("2  Section", H1),
                      para(f"Drawn to scale 1 : {num(ratio, 3)} (on the printed page). "
                           "Timber: light with grain lines; steel: solid dark; neutral axis: "
                           "red dash-dot line. Plies are listed in stacking order; where plies "
                           "overlap the later one wins.", SMALL),
                      Table([[drawing, table(legend, right, font_size=6.8)]],
                            colWidths=[80 * mm, right], hAlign="LEFT",
                            style=[("VALIGN", (0, 0), (-1, -1), "TOP"),
                                   ("FONTNAME", (0, 0), (-1, -1), FONT)])]
    mats = [["Material", "Name", "Kind", "E", "Design values (sources: section 9)"]]
    seen: list[str] = []
    for m in s.materials:
        if m.id in seen:
            continue
        seen.append(m.id)
        vals = ", ".join(f"{k} {plain(v)}" if k in NUMBER_KEYS else
                         (f"\u03c1_k {exact(v, 'density', u)}" if k == "rho_k" else
                          f"{symbol_text(k)} {exact(v, 'stress', u)}")
                         for k, v in m.values.items())
        if m.density > 0:
            vals += f"; density {exact(m.density, 'density', u)}"
        mats.append([m.id, m.name, m.kind, modulus_cell(m, u), vals])
    out += [para("Materials", H2), table(mats, width)]
    out += elevation_block(a, width)
    return out


def modulus_cell(m: Material, u: str) -> str:
    """E of a material, or where the design basis adjusts it (US-ASD, NDS 2018 4.3.1)
    E' = E times its factors, each shown.
    """
    if m.E_reference is None:
        return exact(m.E, "modulus", u)
    return (f"E' = E {' '.join(symbol_text(k) for k in m.E_factors)} = "
            f"{exact(m.E_reference, 'modulus', u)} \u00d7 "
            + " \u00d7 ".join(plain(v) for v in m.E_factors.values())
            + f" = {exact(m.E, 'modulus', u)} (NDS 2018 4.3.1)")


def _transformed(a: Analysis, u: str, width: float) -> list[Any]:
    s = a.section
    rows = [["Ply", "Material", "n", "b", "n b", "h", "n A", "y\u0304", "n A y\u0304",
             "n I_own", "n A d\u00b2"]]
    y_na = s.neutral_axis_y
    terms_num, terms_den, terms_i = [], [], []
    kl, ka = factor("length", u), factor("area", u)
    k3, k4 = factor("section_modulus", u), factor("second_moment", u)
    for r in s.ply_results():
        if r.area <= 0:
            rows.append([r.name, r.material, num(r.modular_ratio, IN), "", "", "", "0",
                         "", "", "", ""])
            continue
        p = next(p for p in s.plies if p.name == r.name)
        nA = r.transformed_area
        ad2 = nA * (r.centroid_y - y_na) ** 2
        if ad2 < 1e-12 * max(r.modular_ratio * r.I_own, 1e-300):
            ad2 = 0.0  # centroid on the neutral axis: round-off only
        nI = r.modular_ratio * r.I_own
        rows.append([r.name, r.material, num(r.modular_ratio, IN), plain(p.width * kl),
                     num(r.transformed_width * kl, IN), plain(p.height * kl),
                     num(nA * ka, IN), num(r.centroid_y * kl, IN),
                     num(nA * r.centroid_y * k3, IN), num(nI * k4, IN), num(ad2 * k4, IN)])
        terms_num.append(num(nA * r.centroid_y * k3, IN))
        terms_den.append(num(nA * ka, IN))
        terms_i.append(f"({num(nI * k4, IN)} + {num(ad2 * k4, IN)})")
    L, A = unit("length", u), unit("area", u)
    I4, S3 = unit("second_moment", u), unit("section_modulus", u)
    return [
        CondPageBreak(70 * mm), para("3  Transformed section", H1),
        para(f"Reference material {s.reference_material}, E_ref = "
             f"{exact(s.E_ref, 'modulus', u)}; n = E / E_ref. Widths scaled by n about each "
             f"ply's own centre line; heights unchanged. Lengths in {L}, areas in {A}, first "
             f"moments in {S3}, second moments in {I4}; d = y\u0304 \u2212 y_na.", SMALL),
        table(rows, width, font_size=6.6, align_right=tuple(range(2, 11))),
        Spacer(1, 2 * mm),
        para("y_na = \u03a3(n A y\u0304) / \u03a3(n A) = (" + " + ".join(terms_num) + ") / ("
             + " + ".join(terms_den) + ") = " + q(y_na, "length", u, 5), EQ),
        para("I_t = \u03a3 n (I_own + A d\u00b2) = " + " + ".join(terms_i) + " = "
             + q(s.I_transformed, "second_moment", u, 5), EQ),
        para(f"EI = E_ref \u00d7 I_t = {exact(s.E_ref, 'modulus', u)} \u00d7 "
             f"{q(s.I_transformed, 'second_moment', u, 5)} = {q(s.EI, 'EI', u, 5)}", EQ),
        para(f"EA = {q(s.EA, 'EA', u, 5)}; mass per length "
             f"{q(s.mass_per_length, 'mass_per_length', u)}.", EQ),
        para("Share of moment E_i I_i,na / EI: " + ", ".join(
            f"{p.name} {sh * 100:.1f}\u00a0%" for p, sh in zip(s.plies, s.moment_shares(),
                                                             strict=True)) + ".", SMALL)]


def _profiles(a: Analysis, u: str, width: float) -> list[Any]:
    beam = a.beam
    assert beam is not None
    gov = max(beam.combinations, key=lambda c: abs(c.M_governing))
    M = gov.M_governing
    top, bot = a.section.ply_extreme_stresses(M)
    micro = "\u00b5\u03b5"
    rows = [["Ply", "y bottom", "y top", f"strain bottom ({micro})", f"strain top ({micro})",
             "stress bottom", "stress top"]]
    for i, p in enumerate(a.section.plies):
        yb, yt = float(a.section.y_bottom[i]), float(a.section.y_top[i])
        rows.append([p.name, exact(yb, "length", u), exact(yt, "length", u),
                     num(float(a.section.strain(M, yb)) * 1e6, 4),
                     num(float(a.section.strain(M, yt)) * 1e6, 4),
                     q(float(bot[i]), "stress", u), q(float(top[i]), "stress", u)])
    return [CondPageBreak(95 * mm), para("5  Strain and stress", H1),
            para(f"At M = {q(M, 'moment', u)} ({gov.name}): \u03b5(y) = \u2212M (y \u2212 "
                 "y_na) / EI, \u03c3_i = E_i \u03b5 (tension positive). Strains are equal on "
                 "both sides of an interface; stresses differ by the ratio of the moduli.",
                 SMALL),
            *([para("Staged loading: this profile is the built-up section under the whole "
                    "moment; the stresses of the stages, which the bending checks use where "
                    "they govern, are in the staged loading table of section 4.", SMALL)]
              if a.stages is not None else []),
            profile_drawing(a.section, M, u, width=width), Spacer(1, 2 * mm),
            table(rows, width, align_right=(1, 2, 3, 4, 5, 6))]


def _summary(a: Analysis, original: Project, u: str, width: float) -> list[Any]:
    gov = governing(a.checks)
    verdict = a.verdict
    ok = verdict == "OK"
    out: list[Any] = [para("7  Summary", H1)]
    if gov is not None:
        out.append(para(f"Governing check: {gov.id} in {place(gov)} under "
                        f"{gov.combination or 'the layout'}, "
                        f"ratio {gov.ratio:.3f}.", BODY))
    out.append(para(f"Verdict: {verdict}",
                    ParagraphStyle("v", parent=BODY, fontName="PlyStackSans-Bold",
                                   fontSize=12, leading=16,
                                   textColor=colors.black if ok else colors.red)))
    reasons = a.incomplete_reasons
    if reasons:
        out.append(para("Checks the basis requires that could not be made"
                        + (" (the verdict cannot be OK until they are):" if verdict !=
                           "NOT OK" else ":"), BODY))
        out += [para(f"\u2022 {r}", SMALL) for r in reasons]
    alts = alternatives_with_current(original)
    if len(alts) > 1:
        rows = [["Alternative", "EI", "Mass per length", "Governs", "Ratio", "Deflection",
                 "Verdict"]]
        for alt, run_alt in zip(alts, alternative_analyses(original, alts, a), strict=True):
            o = summarise(run_alt)
            rows.append([alt.name, q(o.EI, "EI", u), q(o.mass_per_length, "mass_per_length", u),
                         o.governing_id, f"{o.governing_ratio:.3f}",
                         q(o.deflection_max_abs, "deflection", u, 3),
                         run_alt.verdict])
        out += [para("Comparison of alternatives", H2),
                table(rows, width, align_right=(1, 2, 4, 5))]
    out += [para("Fire", H2), para(FIRE_NOTE, SMALL), para(CAUTION, CAUTION_STYLE)]
    return [KeepTogether(out)]



