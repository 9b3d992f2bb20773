"""Design checks on two bases: US allowable stress design (NDS 2018, AISC 360-16) and
EU limit states (EN 1995-1-1, EN 1993-1-1). One module per basis; shared parts in
``common``. Every check carries demand, capacity, ratio, verdict, and every factor with
its source, so that capacity = reference x prod(factors) / prod(partial_factors).
"""

from __future__ import annotations

import math
from collections.abc import Mapping
from dataclasses import dataclass, field
from typing import TYPE_CHECKING, Any

from core.errors import Problem

if TYPE_CHECKING:
    from core.analysis import BeamResult
    from core.design import DesignSpec
    from core.project import Project
    from core.section import Section


@dataclass(frozen=True)
class Check:
    """One design check.

    Attributes:
        id: kind of check: "bending", "shear", "bearing", "deflection-live",
            "deflection-total", "deflection-long-term", "bolts", "connectors".
        ply: the ply (or plies) checked, None for the whole member.
        combination: the load combination (or case) name.
        demand: SI (Pa for stresses, m for deflections, N for fastener loads).
        capacity: same unit as demand.
        ratio: demand / capacity.
        ok: ratio <= 1.
        quantity: "stress", "deflection", "force" or "shear_flow" (for display units).
        reference: symbol and SI value of the reference design value.
        factors: factors that multiply the reference value.
        partial_factors: factors that divide it.
        sources: where each factor and the reference value come from.
        equation: the check written out in symbols.
        location: where along the member (text) and x, m.
        notes: reminders and assumptions specific to this check.

    """

    id: str
    ply: str | None
    combination: str | None
    demand: float
    capacity: float
    quantity: str
    reference: tuple[str, float]
    factors: Mapping[str, float] = field(default_factory=dict)
    partial_factors: Mapping[str, float] = field(default_factory=dict)
    sources: Mapping[str, str] = field(default_factory=dict)
    equation: str = ""
    location: str = ""
    x: float | None = None
    notes: tuple[str, ...] = ()

    @property
    def ratio(self) -> float:
        """Demand over capacity."""
        if self.capacity <= 0:
            return math.inf
        return abs(self.demand) / self.capacity

    @property
    def ok(self) -> bool:
        """True where the ratio is at most 1 (within 1e-9)."""
        return self.ratio <= 1.0 + 1e-9

    def to_dict(self) -> dict[str, Any]:
        """The check as a JSON object (SI)."""
        ratio = self.ratio
        return {
            "id": self.id, "ply": self.ply, "combination": self.combination,
            "demand": self.demand, "capacity": self.capacity,
            "ratio": ratio if math.isfinite(ratio) else None, "ok": self.ok,
            "quantity": self.quantity,
            "reference": {"symbol": self.reference[0], "value": self.reference[1]},
            "factors": dict(self.factors), "partial_factors": dict(self.partial_factors),
            "sources": dict(self.sources), "equation": self.equation,
            "location": self.location, "x": self.x, "notes": list(self.notes),
        }


def capacity_from(reference: float, factors: Mapping[str, float],
                  partial: Mapping[str, float] | None = None) -> float:
    """Reference x prod(factors) / prod(partial factors)."""
    value = reference
    for f in factors.values():
        value *= f
    for g in (partial or {}).values():
        value /= g
    return value


def run_checks(project: Project, section: Section, beam: BeamResult,
               design: DesignSpec) -> tuple[tuple[Check, ...], list[Problem]]:
    """Every check of the project's design basis, with warnings."""
    if design.us:
        from core.checks.us_asd import us_checks

        return us_checks(project, section, beam, design)
    from core.checks.eu_lsd import eu_checks

    return eu_checks(project, section, beam, design)


def governing(checks: tuple[Check, ...] | list[Check]) -> Check | None:
    """The check with the highest ratio."""
    return max(checks, key=lambda c: c.ratio) if checks else None
