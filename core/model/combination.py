"""A load combination and the load-duration classes (plain frozen data).

US: NDS 2018 Table 2.3.2 load durations (from memory). EU: EN 1995-1-1 2.3.1.2
load-duration classes and EN 1990 Annex A1 Table A1.1 psi factors (from memory).
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field

US_DURATIONS = ("permanent", "ten-years", "two-months", "seven-days", "ten-minutes", "impact")
EU_DURATIONS = ("permanent", "long-term", "medium-term", "short-term", "instantaneous")

#: NDS 2018 Table 2.3.2 (from memory): the duration each case implies.
US_CASE_DURATION = {"D": "permanent", "L": "ten-years", "S": "two-months",
                    "Lr": "seven-days", "W": "ten-minutes"}
#: EN 1995-1-1 Table 2.2 and common national practice (from memory).
EU_CASE_DURATION = {"D": "permanent", "L": "medium-term", "S": "short-term",
                    "Lr": "short-term", "W": "instantaneous"}

#: EN 1990 Table A1.1 (from memory): psi0, psi1, psi2 per case (L: category A
#: domestic floors; S: sites below 1000 m; W: wind; Lr: category H roofs).
EN1990_PSI: dict[str, tuple[float, float, float]] = {
    "L": (0.7, 0.5, 0.3), "S": (0.5, 0.2, 0.0), "W": (0.6, 0.2, 0.0), "Lr": (0.0, 0.0, 0.0),
}


#: What a combination is for. ASD (US allowable stress design) serves strength and
#: deflection; ULS strength; the SLS kinds deflection (EN 1990 6.5.3).
KINDS = ("ASD", "ULS", "SLS-characteristic", "SLS-frequent", "SLS-quasi-permanent")
STRENGTH_KINDS = frozenset({"ASD", "ULS"})
SERVICEABILITY_KINDS = frozenset({"ASD", "SLS-characteristic", "SLS-frequent",
                                  "SLS-quasi-permanent"})


@dataclass(frozen=True)
class Combination:
    """A load combination.

    Attributes:
        name: e.g. "D + L".
        factors: load factor per case.
        duration: load-duration class (None: from the shortest case in it).
        kind: one of KINDS; None for a combination of the user's list that gives none
            (ASD on the US basis; refused on the EU basis).
        custom: True for a combination of the user's own list.

    """

    name: str
    factors: Mapping[str, float] = field(default_factory=dict)
    duration: str | None = None
    kind: str | None = "ASD"
    custom: bool = False

    def cases(self) -> tuple[str, ...]:
        """Cases with a nonzero factor."""
        return tuple(c for c, f in self.factors.items() if f != 0)

    @property
    def limit_state(self) -> str:
        """"custom" for the user's own combinations, else the kind (the JSON key)."""
        return "custom" if self.custom else (self.kind or "ASD")

    def kind_on(self, basis: str) -> str:
        """The kind, with the US default (ASD) for a combination that gives none."""
        if self.kind is None:
            return "ASD" if basis == "US" else "ULS"
        return self.kind

    def for_strength(self, basis: str) -> bool:
        """True where strength checks use this combination: ASD on the US basis (allowable
        stress design), ULS on the EU basis (limit states).
        """
        return self.kind_on(basis) == ("ASD" if basis == "US" else "ULS")

    def for_serviceability(self, basis: str) -> bool:
        """True where deflection checks, diagrams and studies use this combination: ASD
        on the US basis, the SLS kinds on the EU basis.
        """
        kind = self.kind_on(basis)
        return kind == "ASD" if basis == "US" else kind.startswith("SLS")


def eu_duration(duration: str) -> str:
    """An EU load-duration class for any duration name."""
    return {"ten-years": "long-term", "two-months": "medium-term", "seven-days": "short-term",
            "ten-minutes": "instantaneous", "impact": "instantaneous"}.get(duration, duration)


def duration_of(combo: Combination, basis: str) -> str:
    """Load duration of a combination: its own, else that of its shortest case."""
    if combo.duration:
        return combo.duration
    order = US_DURATIONS if basis == "US" else EU_DURATIONS
    table = US_CASE_DURATION if basis == "US" else EU_CASE_DURATION
    durations = [table[c] for c in combo.cases() if c in table] or ["permanent"]
    return max(durations, key=order.index)
