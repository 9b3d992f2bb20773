"""Readable checks table (display units)."""

from __future__ import annotations

import textwrap

from ..model.caution import CAUTION
from ..model.units import fmt
from .check import Check, governing, ratio_text

QUANTITY_KIND = {"stress": "stress", "deflection": "deflection", "force": "force",
                 "shear_flow": "shear_flow", "ratio": "ratio", "frequency": "frequency",
                 "compliance": "compliance", "velocity_response": "velocity_response",
                 "length": "length"}


def governing_per_group(checks: tuple[Check, ...] | list[Check]) -> list[Check]:
    """For each (id, ply, location), the check with the highest ratio, highest first."""
    best: dict[tuple[str, str | None, str], Check] = {}
    for c in checks:
        by_place = c.id.startswith(("deflection", "bearing", "load-transfer", "splitting"))
        key = (c.id, c.ply, c.location if by_place else "")
        if key not in best or c.ratio > best[key].ratio:
            best[key] = c
    return sorted(best.values(), key=lambda c: -c.ratio)


#: Widest "ply / place" and "combination" columns of the checks table; a longer text
#: wraps onto the next lines of its column, never cut.
PLACE_WIDTH = 48
COMBINATION_WIDTH = 30


def _where(c: Check) -> str:
    """The check's ply and place; a splitting check names its timber first (its place
    is long and wraps).
    """
    where = c.ply or c.location
    if c.ply and c.location and c.id == "splitting":
        where = f"{c.ply}, {c.location}"
    elif c.ply and c.location and c.id in ("bearing", "load-transfer"):
        where = f"{c.location}: {c.ply}"
    return where


def _wrapped(text: str, width: int) -> list[str]:
    """``text`` in lines of at most ``width`` characters, broken at spaces where it can be
    (a word longer than the column is broken inside); the whole text is kept.
    """
    return textwrap.wrap(text, width, break_on_hyphens=False) or [""]


def checks_text(checks: tuple[Check, ...], system: str, verdict: str | None = None,
                incomplete: tuple[str, ...] = ()) -> list[str]:
    """Lines of the checks table, the governing check first, the verdict (OK, NOT OK or
    INCOMPLETE with its reasons) and the caution. The columns are as wide as their
    texts (up to :data:`PLACE_WIDTH` and :data:`COMBINATION_WIDTH`; longer ones wrap).
    """
    rows = governing_per_group(checks)
    places = [_where(c) for c in rows]
    w_id = max([len("check")] + [len(c.id) for c in rows]) + 2
    w_place = min(max([len("ply / place")] + [len(t) for t in places]), PLACE_WIDTH) + 2
    w_combo = min(max([len("combination")] + [len(c.combination or "") for c in rows]),
                  COMBINATION_WIDTH) + 2
    lines = ["", "Checks (governing combination of each; all combinations in --json)"]
    lines.append(f"  {'check':<{w_id}}{'ply / place':<{w_place}}{'combination':<{w_combo}}"
                 f"{'demand':>18}{'capacity':>18}{'ratio':>8}  verdict")
    for c, where in zip(rows, places, strict=True):
        kind = QUANTITY_KIND[c.quantity]
        place = _wrapped(where, w_place - 2)
        combo = _wrapped(c.combination or "", w_combo - 2)
        lines.append(f"  {c.id:<{w_id}}{place[0]:<{w_place}}{combo[0]:<{w_combo}}"
                     f"{fmt(c.demand, kind, system):>18}{fmt(c.capacity, kind, system):>18}"
                     f"{ratio_text(c.ratio):>8}  {'OK' if c.ok else 'NOT OK'}")
        for k in range(1, max(len(place), len(combo))):
            more = (f"  {'':<{w_id}}{place[k] if k < len(place) else '':<{w_place}}"
                    f"{combo[k] if k < len(combo) else ''}")
            lines.append(more.rstrip())
        if c.id in ("bolts", "connectors"):
            lines.append(f"      {c.location}")
    gov = governing(checks)
    if verdict is None:
        verdict = "OK" if all(c.ok for c in checks) else "NOT OK"
    if gov is not None:
        lines.append("")
        lines.append(f"Governing: {gov.id} in {gov.ply or gov.location} under "
                     f"{gov.combination or 'the layout'},"
                     f" ratio {ratio_text(gov.ratio)}. Verdict: {verdict}")
    else:
        lines.append(f"Verdict: {verdict}")
    if incomplete:
        lines.append("Incomplete, these required checks could not be made:")
        lines.extend(f"  {r}" for r in incomplete)
    lines.append(CAUTION)
    return lines
