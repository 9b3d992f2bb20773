"""Design checks on two bases: US allowable stress design (NDS 2018, AISC 360-16) and
EU limit states (EN 1995-1-1, EN 1993-1-1). One module per basis; shared parts in
``common``. Every check carries demand, capacity, ratio, verdict, and every factor with
its source, so that capacity = reference x prod(factors) / prod(partial_factors).
"""

from __future__ import annotations

import math
from collections.abc import Mapping
from dataclasses import dataclass, field, replace
from typing import Any, Literal, TypeVar

T = TypeVar("T")

#: Every kind of check (the ``id`` of a check in JSON output).
CheckId = Literal["bending", "shear", "bearing", "deflection-live", "deflection-total",
                  "deflection-long-term", "bolts", "connectors", "uplift", "tension-bending",
                  "compression-bending", "vibration-frequency", "vibration-stiffness",
                  "vibration-velocity", "load-transfer", "bolt-spacing", "bolt-edge",
                  "bolt-end", "bending-net", "splitting", "shear-notch"]
#: What a check's demand and capacity measure (selects the display unit).
Quantity = Literal["stress", "deflection", "force", "shear_flow", "ratio", "frequency",
                   "compliance", "velocity_response", "length"]
#: The limit state a check belongs to.
LimitState = Literal["strength", "serviceability"]
SERVICEABILITY_IDS = frozenset({"deflection-live", "deflection-total", "deflection-long-term",
                                "vibration-frequency", "vibration-stiffness",
                                "vibration-velocity"})


@dataclass(frozen=True)
class Fasteners:
    """The fasteners a connection check asks for.

    Attributes:
        count: fasteners needed (bolts along the member, or per metre of interface for
            connectors), None where not a count.
        spacing: spacing along the member, m.
        locations: bolt locations along the member (a location may hold several rows).
        rows: rows of fasteners at each location.

    """

    count: int | None = None
    spacing: float | None = None
    locations: int | None = None
    rows: int | None = None


@dataclass(frozen=True, kw_only=True)
class Check:
    """One design check.

    Attributes:
        id: kind of check: "bending", "shear", "bearing", "deflection-live",
            "deflection-total", "deflection-long-term", "bolts", "connectors",
            "vibration-frequency", "vibration-stiffness", "vibration-velocity".
        ply: the ply (or plies) checked, None for the whole member.
        combination: the load combination (or case) name.
        demand: SI (Pa for stresses, m for deflections, N for fastener loads; for a
            frequency check the required frequency, Hz, against the capacity the
            member's frequency, so that the ratio is f_required / f_1).
        capacity: same unit as demand.
        ratio: demand / capacity.
        ok: ratio <= 1.
        quantity: "stress", "deflection", "force", "shear_flow", "frequency" (Hz),
            "compliance" (m/N) or "velocity_response" (m/(N s^2)), for display units.
        reference: symbol and SI value of the reference design value.
        factors: factors that multiply the reference value.
        partial_factors: factors that divide it.
        sources: where each factor and the reference value come from.
        equation: the check written out in symbols.
        location: where along the member (text) and x, m.
        notes: reminders and assumptions specific to this check.
        fasteners: the fasteners a connection check asks for (bolts, connectors).
        segment: on a member whose plies stop short of its ends, the segment (index into
            the analysis's segments) the check was made in; None otherwise.

    """

    id: CheckId
    ply: str | None
    combination: str | None
    demand: float
    capacity: float
    quantity: Quantity
    reference: tuple[str, float]
    factors: Mapping[str, float] = field(default_factory=dict)
    partial_factors: Mapping[str, float] = field(default_factory=dict)
    sources: Mapping[str, str] = field(default_factory=dict)
    equation: str = ""
    location: str = ""
    x: float | None = None
    notes: tuple[str, ...] = ()
    fasteners: Fasteners | None = None
    segment: int | None = None

    @property
    def limit_state(self) -> LimitState:
        """Strength or serviceability."""
        return "serviceability" if self.id in SERVICEABILITY_IDS else "strength"

    @property
    def ratio(self) -> float:
        """Demand over capacity."""
        if self.capacity <= 0:
            return math.inf
        return abs(self.demand) / self.capacity

    @property
    def ok(self) -> bool:
        """True where the ratio is at most 1 (within 1e-9)."""
        return bool(self.ratio <= 1.0 + 1e-9)

    def to_dict(self) -> dict[str, Any]:
        """The check as a JSON object (SI); "segment" only on a stepped member."""
        out = self._dict()
        if self.segment is not None:
            out["segment"] = self.segment
        return out

    def _dict(self) -> dict[str, Any]:
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
            "limit_state": self.limit_state,
            "fasteners": None if self.fasteners is None else {
                "count": self.fasteners.count, "spacing": self.fasteners.spacing,
                "locations": self.fasteners.locations, "rows": self.fasteners.rows},
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


def ratio_text(ratio: float) -> str:
    """A ratio as the tables write it: three decimals; "\u221e" where there is no
    capacity left (demand over zero); "not a number" where neither side is (0 / 0).
    """
    if math.isfinite(ratio):
        return f"{ratio:.3f}"
    return "\u221e" if ratio > 0 else "not a number"


def governing(checks: tuple[Check, ...] | list[Check]) -> Check | None:
    """The check with the highest ratio."""
    return max(checks, key=lambda c: c.ratio) if checks else None


def evolve(obj: T, **changes: Any) -> T:
    """``dataclasses.replace`` for the design layer's frozen dataclasses (none has a
    ``__post_init__``, an init-less field or slots): a copy of ``obj`` with ``changes``,
    made without running ``__init__`` again, so several times quicker; the same fields,
    equal to what ``replace`` makes (tests/core/test_evolve.py). A name that is not a
    field is refused, as ``replace`` refuses it; an object holding more than its fields
    is copied by ``replace`` itself.
    """
    fields = obj.__dataclass_fields__  # type: ignore[attr-defined]
    for name in changes:
        if name not in fields:
            raise TypeError(f"{type(obj).__name__} has no field {name!r}")
    held = obj.__dict__
    if len(held) != len(fields):  # something besides the fields (a cache): the plain way
        return replace(obj, **changes)  # type: ignore[type-var]
    new = object.__new__(type(obj))
    state = new.__dict__
    state.update(held)
    state.update(changes)
    return new
