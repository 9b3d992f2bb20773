"""The member along its length on the sheet: its elevation, the segments where plies
stop short, the two stages of a member strengthened under load, and the load transfer
at supports and point loads.
"""

from __future__ import annotations

import math
from typing import Any

from reportlab.lib.units import mm
from reportlab.platypus import CondPageBreak, KeepTogether

from ..design.bolt_layout import BoltLayout
from ..design.check import Check, governing, ratio_text
from ..design.transfer import Transfer, bolt_share, transfers
from ..pipeline import Analysis
from .checks import label
from .connections import plate_layouts
from .elevation import elevation_drawing, position_text
from .layout import H2, H3, SMALL, para, table
from .numbers import num, q


def elevation_block(a: Analysis, width: float) -> list[Any]:
    """The member's elevation with its note."""
    if a.beam is None or a.project.beam is None:
        return []
    layouts = [lay for _jt, lay in plate_layouts(a)]
    drawing = elevation_drawing(a, width, layouts)
    return [CondPageBreak(drawing.height + 20 * mm), para("Member elevation", H2),
            para("Loads by case above the member (arrows down: loads act downward); the "
                 "member with its notches and holes, steel plates dashed where hidden by the "
                 "timbers, bolts as dots, notches N1, N2, ... and holes H1, H2, ... as in the "
                 "project's lists; supports R1, R2, ... with the spans; below, every "
                 "ply's extent along the member with its from and to (bolt stations as "
                 "circles on the plates). Lengths along the member to scale; the depth, the "
                 "notches, holes and bolt rows at the depth's own scale.", SMALL),
            drawing]


def _ply_names(a: Analysis, plies: tuple[int, ...]) -> str:
    return ", ".join(a.section.plies[i].name for i in plies)


def segments_block(a: Analysis, width: float) -> list[Any]:
    """The segments of a member whose plies stop short: where each runs, the plies in
    it, its EI and neutral axis, and the check that governs in it.
    """
    if not a.segments:
        return []
    rows = segment_rows(a)
    return [CondPageBreak(40 * mm), para("Segments along the member", H2),
            para("Where a ply stops short of the member's ends, the member is cut at every "
                 "ply end; between two cuts the section is constant (section 3 gives the "
                 "method; each segment is transformed to the same reference material). The "
                 "stress checks are made in every segment with its own section, both ends "
                 "included; deflection, bearing and the bolts use the whole member. The "
                 "governing check is the highest ratio of the checks made in the segment.",
                 SMALL),
            table(rows, width, align_right=(4, 5, 7))]


def segment_rows(a: Analysis) -> list[list[str]]:
    """The segments table as printed, header first."""
    u = a.project.display_units
    rows = [["Segment", "From", "To", "Plies present", "EI", "y_na", "Governing check",
             "Ratio"]]
    for seg in a.segments:
        own = [c for c in a.checks if c.segment == seg.index]
        gov = governing(own)
        rows.append([str(seg.index + 1), position_text(seg.start, u),
                     position_text(seg.end, u), _ply_names(a, seg.plies),
                     q(seg.section.EI, "EI", u, 5),
                     q(seg.section.neutral_axis_y, "length", u, 5),
                     "" if gov is None else f"{label(a, gov)} {gov.id}, {gov.ply or ''} "
                     f"({gov.combination or 'layout'})",
                     "" if gov is None else ratio_text(gov.ratio)])
    return rows


def staged_combinations(a: Analysis) -> list[str]:
    """The combinations that govern the staged checks (bending and deflection), in the
    order of the analysis's combinations.
    """
    names = set()
    for cid in ("bending", "deflection-total", "deflection-long-term"):
        gov = governing([c for c in a.checks if c.id == cid])
        if gov is not None and gov.combination:
            names.add(gov.combination)
    assert a.stages is not None
    return [s.combination for s in a.stages.before if s.combination in names]


STAGED_RULE = ("Staged loading: the loads put on before the plies marked \u201cadded\u201d "
               "(and the existing plies' self-weight) act on the existing plies alone; the "
               "loads put on afterwards (and the added plies' self-weight) act on the built-up "
               "section; the two stages add. A shored member, jacked while the plies are "
               "added, takes every load on the built-up section.")


def staged_block(a: Analysis, width: float) -> list[Any]:
    """Both stages of a member strengthened under load, per governing combination."""
    spec = a.project.beam
    if spec is None:
        return []
    u = a.project.display_units
    if a.stages is None:
        if spec.shored and any(p.stage == "added" for p in a.project.plies):
            return [para("Staged loading", H2),
                    para(STAGED_RULE + " This member is shored: every load acts on the "
                         "built-up section.", SMALL)]
        return []
    st = a.stages
    out: list[Any] = [CondPageBreak(60 * mm), para("Staged loading", H2),
                      para(STAGED_RULE + f" Existing section EI = {q(st.existing.EI, 'EI', u, 5)}"
                           f"; built-up section EI = {q(st.built_up.EI, 'EI', u, 5)}. "
                           "Stresses are at each stage's moment of largest magnitude; the sum "
                           "adds the two columns (where the stages peak at different places it "
                           "bounds the checks' values from above, which take the largest sum "
                           "along the member).", SMALL)]
    for k, name in enumerate(staged_combinations(a)):
        part = [para(f"Stages under {name}", H3),
                table(staged_rows(a, name), width, align_right=(1, 2, 3))]
        # the rule stays on the page of the first table
        out = [*out[:1], KeepTogether(out[1:] + part)] if k == 0 else out + part
    return out


def staged_rows(a: Analysis, name: str) -> list[list[str]]:
    """The stages of one combination as printed, header first."""
    st = a.stages
    assert st is not None
    u = a.project.display_units
    b = next(s for s in st.before if s.combination == name)
    f = next(s for s in st.after if s.combination == name)
    before = {n: (t, bt) for n, t, bt in b.ply_stresses}
    values = [("largest sagging moment", b.M_max, f.M_max, "moment"),
              ("largest hogging moment", b.M_min, f.M_min, "moment"),
              ("largest immediate deflection", b.deflection_max, f.deflection_max,
               "deflection")]
    for n, t, bt in f.ply_stresses:
        t1, b1 = before.get(n, (0.0, 0.0))
        values += [(f"{n}: top fibre stress", t1, t, "stress"),
                   (f"{n}: bottom fibre stress", b1, bt, "stress")]
    rows = [["Quantity", "Before (existing plies)", "After (built-up section)", "Sum"]]
    rows += [[what, q(x, kind, u, 5), q(y, kind, u, 5), q(x + y, kind, u, 5)]
             for what, x, y, kind in values]
    return rows


def transfer_block(a: Analysis, width: float) -> list[Any]:
    """The load-transfer checks in one table a reviewer recomputes by hand."""
    if a.beam is None or not any(c.id == "load-transfer" for c in a.checks):
        return []
    sym = transfer_symbol(a)
    return [CondPageBreak(50 * mm), para("Load transfer at supports and point loads", H2),
            para("For every support the plate does not bear on and every point load on the "
                 "plate's length: the plate's share \u03b1 = E_p I_p,na / EI of the reaction "
                 "or load (its bending stiffness share, section 3) passes between plate and "
                 "timbers through the bolts of the transfer zone, the stations within the "
                 "member depth d either side (at least the nearest; common practice). "
                 f"Capacity: n bolts in the zone times the adjusted value of one bolt {sym} "
                 "(its factors as in the bolts check). Ratio = \u03b1 F / (n "
                 f"{sym}). Stations are numbered from the left, bolts per station in "
                 "parentheses.", SMALL),
            table(transfer_rows(a), width, font_size=6.3,
                  align_right=(4, 5, 6, 9, 10, 11, 12))]


def transfer_symbol(a: Analysis) -> str:
    """The adjusted value of one bolt: Z' (NDS) or F_v,Rd (EN 1995-1-1)."""
    return "Z\u2032" if a.design.us else "F_v,Rd"


def transfer_rows(a: Analysis) -> list[list[str]]:
    """The load-transfer table as printed, header first."""
    assert a.beam is not None
    checks = [c for c in a.checks if c.id == "load-transfer"]
    u = a.project.display_units
    sym = transfer_symbol(a)
    lays = {a.section.plies[jt.steel].name: (jt, lay) for jt, lay in plate_layouts(a)}
    rows = [["Label", "Plate", "Combination", "At", "F", "\u03b1", "\u03b1 F",
             "Transfer zone", "Bolts in the zone", "n", f"{sym} per bolt", f"n {sym}",
             "Ratio"]]
    for c in checks:
        jt, lay = lays[c.ply or ""]
        share = bolt_share(a.section, a.beam, next(
            cb for cb in a.beam.combinations if cb.name == c.combination), a.design,
            jt.steel)
        try:
            t = _transfer_of(a, c, lay, share)
        except ValueError as exc:
            rows.append([label(a, c), c.ply or "", c.combination or "", c.location, "",
                         num(share, 5), q(c.demand, "force", u), f"not written out: {exc}",
                         "", "", "", q(c.capacity, "force", u), f"{c.ratio:.3f}"])
            continue
        L = a.beam.model.layout.length
        lo, hi = max(t.x - t.zone_half_width, lay.extent[0], 0.0), min(
            t.x + t.zone_half_width, lay.extent[1], L)
        stations = "; ".join(f"{k + 1} at {position_text(lay.stations[k], u)} "
                             f"({lay.at_station(k)})" for k in t.zone)
        per = c.capacity / t.bolts
        what = "R" if t.kind == "support" else "P"
        rows.append([label(a, c), c.ply or "", c.combination or "",
                     f"{t.label if t.kind == 'support' else 'point load'} at "
                     f"{position_text(t.x, u)}",
                     f"{what}\u00a0=\u00a0{q(abs(t.force), 'force', u, 5)}", num(t.share, 5),
                     q(c.demand, "force", u), f"{position_text(lo, u)} to "
                     f"{position_text(hi, u)}", stations, str(t.bolts),
                     q(per, "force", u, 5), q(c.capacity, "force", u), f"{c.ratio:.3f}"])
    return rows


def _transfer_of(a: Analysis, c: Check, lay: BoltLayout, share: float) -> Transfer:
    """The transfer a load-transfer check is about (the design module's own)."""
    assert a.beam is not None
    combo = next(cb for cb in a.beam.combinations if cb.name == c.combination)
    items = transfers(a.section, a.beam, combo, a.design, lay, share)
    t = min(items, key=lambda t: (abs(t.x - (c.x or 0.0)), abs(t.demand - c.demand)))
    if not math.isclose(t.demand, c.demand, rel_tol=1e-9):
        raise ValueError("the sheet's transfer does not reproduce the check's demand")
    return t
