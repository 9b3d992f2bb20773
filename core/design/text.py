"""Readable checks table (display units)."""

from __future__ import annotations

from ..model.caution import CAUTION
from ..model.units import fmt
from .check import Check, governing

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


def checks_text(checks: tuple[Check, ...], system: str, verdict: str | None = None,
                incomplete: tuple[str, ...] = ()) -> list[str]:
    """Lines of the checks table, the governing check first, the verdict (OK, NOT OK or
    INCOMPLETE with its reasons) and the caution.
    """
    lines = ["", "Checks (governing combination of each; all combinations in --json)"]
    lines.append(f"  {'check':<22}{'ply / place':<26}{'combination':<26}{'demand':>18}"
                 f"{'capacity':>18}{'ratio':>8}  verdict")
    for c in governing_per_group(checks):
        kind = QUANTITY_KIND[c.quantity]
        where = c.ply or c.location
        if c.ply and c.location and c.id in ("bearing", "load-transfer", "splitting"):
            where = f"{c.location}: {c.ply}"
        lines.append(f"  {c.id:<22}{where[:25]:<26}{(c.combination or '')[:25]:<26}"
                     f"{fmt(c.demand, kind, system):>18}{fmt(c.capacity, kind, system):>18}"
                     f"{c.ratio:>8.3f}  {'OK' if c.ok else 'NOT OK'}")
        if c.id in ("bolts", "connectors"):
            lines.append(f"      {c.location}")
    gov = governing(checks)
    if verdict is None:
        verdict = "OK" if all(c.ok for c in checks) else "NOT OK"
    if gov is not None:
        lines.append("")
        lines.append(f"Governing: {gov.id} in {gov.ply or gov.location} under "
                     f"{gov.combination or 'the layout'},"
                     f" ratio {gov.ratio:.3f}. Verdict: {verdict}")
    else:
        lines.append(f"Verdict: {verdict}")
    if incomplete:
        lines.append("Incomplete, these required checks could not be made:")
        lines.extend(f"  {r}" for r in incomplete)
    lines.append(CAUTION)
    return lines
