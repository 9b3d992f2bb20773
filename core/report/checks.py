"""Section 6 of the sheet: every check of every combination written out (demand,
capacity, ratio, verdict), the governing one of each kind first with its notes, then
the table of all checks, with the caution.
"""

from __future__ import annotations

from typing import Any

from reportlab.lib.units import mm
from reportlab.platypus import KeepTogether

from ..design.check import Check
from ..design.text import governing_per_group
from ..model.caution import CAUTION
from ..pipeline import Analysis
from .derive import Derivation, clause_of, derive, result
from .layout import CAUTION_STYLE, EQ, H1, H2, H3, SMALL, WHERE, para, table
from .numbers import q, words
from .sources import without_memory_note


def label(a: Analysis, c: Check) -> str:
    """The check's label on the sheet, C1, C2, ... in the order of ``check --json``."""
    return f"C{a.checks.index(c) + 1}"


def place(c: Check) -> str:
    """The ply or place a check is about."""
    if c.id in ("bearing", "load-transfer", "splitting"):
        return f"{c.location}: {c.ply}"
    if c.id in ("bolts", "connectors"):
        return c.ply or ""
    if c.id in ("bolt-spacing", "bolt-edge", "bolt-end"):
        return f"{c.ply}: {c.location}"
    return c.ply or c.location


def _group_key(c: Check) -> tuple[str, str | None, str]:
    return (c.id, c.ply, c.location if c.id.startswith(("deflection", "bearing", "load-transfer",
                                                        "splitting")) else "")


#: Notes the derivation already writes out (yield modes, plate share, bolt layout).
DERIVED_NOTES = ("Yield modes:", "mode (", "Plate's share", "Shear flow q =")


def check_block(a: Analysis, c: Check, first: Check | None, width: float,
                title: str = "") -> list[Any]:
    """One check written out. ``first`` is the check of its group written out in full
    (None for that check itself); the others refer to it for shared lines and notes.
    """
    u = a.project.display_units
    head = f"{label(a, c)}  {c.id} \u2014 {place(c)} \u2014 {c.combination or 'layout'}"
    clause = clause_of(a, c)
    out: list[Any] = [para(title, H2)] if title else []
    out.append(para(head + (f"   ({clause})" if clause else ""), H3))
    try:
        d: Derivation | None = derive(a, c)
    except (ValueError, StopIteration) as exc:
        d = None
        out.append(para(f"Demand: {result(c, u)} (not written out: {exc})", EQ))
    rest: list[Any] = []
    if d is not None:
        where = list(d.where)
        if first is not None and d.shared:
            where = [f"Yield modes, Z, \u03b1 and bolt locations as in {label(a, first)}.",
                     *where[d.shared:]]
        out += [para("\u00b7 " + w, WHERE) for w in where]
        if d.table and first is None:
            rest.append(table([list(r) for r in d.table], width - 6 * mm, font_size=6.8))
        rest += [para("Demand: " + d.demand, EQ), para("Capacity: " + d.capacity, EQ),
                 para(d.ratio, EQ)]
    if first is None:
        if c.location and c.id == "connectors":
            rest.append(para("Layout: " + c.location, SMALL))
        for n in c.notes:
            if n != CAUTION and not n.startswith(DERIVED_NOTES):
                rest.append(para("Note: " + without_memory_note(words(n)), SMALL))
    if d is not None and d.table and first is None:
        return [KeepTogether(out), KeepTogether(rest)]
    return [KeepTogether(out + rest)]


def checks_section(a: Analysis, width: float, before_table: list[Any] | None = None
                   ) -> list[Any]:
    """Section 6; ``before_table`` goes between the checks written out and the table of
    all checks.
    """
    u = a.project.display_units
    out: list[Any] = [para("6  Design checks", H1),
                      para("Every check of every combination, written out. Each kind of check "
                           "starts with its governing combination. Labels C1, C2, ... follow "
                           "the order of the program's JSON output. Inputs are printed to one "
                           "more significant figure than results; M, V and R come from "
                           "section 4, n, I_t and EI from section 3.", SMALL)]
    for gov in governing_per_group(a.checks):
        group = [c for c in a.checks if _group_key(c) == _group_key(gov) and c is not gov]
        title = (f"{gov.id} \u2014 {place(gov)}: governing ratio {gov.ratio:.3f} under "
                 f"{gov.combination or 'the layout'}")
        out += check_block(a, gov, None, width, title)
        for c in group:
            out += check_block(a, c, gov, width)
    rows = [["Label", "Check", "Ply / place", "Combination", "Demand", "Capacity", "Ratio",
             "Verdict"]]
    for c in a.checks:
        rows.append([label(a, c), c.id, place(c), c.combination or "",
                     q(c.demand, c.quantity, u), q(c.capacity, c.quantity, u),
                     f"{c.ratio:.3f}", "OK" if c.ok else "NOT OK"])
    out += before_table or []
    out += [para("All checks", H2), table(rows, width, font_size=6.8, align_right=(4, 5, 6)),
            para(CAUTION, CAUTION_STYLE)]
    return out
