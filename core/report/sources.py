"""Section 8 of the sheet: every standard, table and library value the checks use, in one
place, with the one reminder that the values are recalled and must be verified.
"""

from __future__ import annotations

import re
from typing import Any

from reportlab.lib.units import mm
from reportlab.platypus import CondPageBreak

from .. import __version__
from ..design.service_moduli import S_E_PRIME
from ..pipeline import Analysis
from .derive import symbol_text
from .layout import BODY, H1, H2, SMALL, para, table
from .numbers import words

VERIFY = ("Values recalled from the named edition: verify against the published table "
          "before relying on them.")
_MEMORY = re.compile(r"\s*[,;]?\s*\(?\bfrom memory\b\)?", re.IGNORECASE)


def without_memory_note(text: str) -> str:
    """A source without its "from memory" note (said once, in the sources section)."""
    out = _MEMORY.sub("", text).strip()
    return re.sub(r"\(\s*\)", "", out).strip().rstrip(",;")


def standards(a: Analysis) -> list[str]:
    """The standards the design basis uses."""
    if a.design.us:
        return ["NDS 2018 (National Design Specification for Wood Construction) and its "
                "Supplement: timber design values, adjustment factors, bolts (chapter 12).",
                "AISC 360-16: steel plates in bending (F11) and shear (G2.1).",
                "ASCE 7-16 2.4.1: ASD load combinations.",
                "IBC 2018 Table 1604.3: deflection limits (or the user's limits)."]
    return ["EN 1995-1-1:2004+A1:2008: timber, k_mod, k_def, \u03b3_M, bolts (8.2.3).",
            "EN 338:2016 and EN 14080:2013: strength classes of sawn timber and glulam.",
            "EN 1993-1-1:2005: steel plates (6.2).",
            "EN 1990:2002 with Annex A1: combinations and \u03c8 factors (recommended values; "
            "the national annex governs)."]


def sources_section(a: Analysis, width: float) -> list[Any]:
    """The sources of every value on the sheet."""
    by_source: dict[str, list[str]] = {}
    for c in a.checks:
        for sym, src in c.sources.items():
            text = without_memory_note(words(src))
            names = by_source.setdefault(text, [])
            label = symbol_text(sym)
            if label not in names:
                names.append(label)
    if any(m.E_reference is not None for m in a.section.materials):
        by_source.setdefault(without_memory_note(S_E_PRIME), []).append("E'")
    rows = [["Value", "Source"]]
    rows += [[", ".join(names), src] for src, names in sorted(by_source.items(),
                                                              key=lambda t: t[1][0])]
    mats = [["Material", "Name", "Source of its values (listed in section 2)"]]
    seen: list[str] = []
    for m in a.section.materials:
        if m.id in seen:
            continue
        seen.append(m.id)
        mats.append([m.id, m.name, without_memory_note(words(m.source))])
    return [CondPageBreak(90 * mm), para("9  Sources", H1),
            para(VERIFY, BODY),
            para("Standards", H2), *[para("\u2022 " + s, BODY) for s in standards(a)],
            para("Factors and reference values used by the checks", H2),
            table(rows, width),
            para("Material library values (Plystack's material library; each record names "
                 "its source)", H2),
            table(mats, width),
            para(f"Computed by Plystack {__version__}: transformed section by exact polygon "
                 "moments; beam actions by the direct stiffness method, exact for uniform and "
                 "point loads; sheet typeset with reportlab.", SMALL)]
