"""Load combinations and load durations.

US: ASCE 7-16 section 2.4.1 basic ASD combinations (from memory), with NDS 2018
Table 2.3.2 load durations. EU: EN 1990:2002 6.4.3.2 (6.10) and 6.5.3 with the
psi factors of EN 1990 Annex A1 Table A1.1 (from memory; national annexes vary), and
EN 1995-1-1 2.3.1.2 load-duration classes.
"""

from __future__ import annotations

from collections.abc import Iterable, Mapping
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


@dataclass(frozen=True)
class Combination:
    """A load combination.

    Attributes:
        name: e.g. "D + L".
        factors: load factor per case.
        duration: load-duration class (None: from the shortest case in it).
        limit_state: "ASD" (US: strength and deflection), "ULS", "SLS-characteristic" or
            "SLS-quasi-permanent" (EU).

    """

    name: str
    factors: Mapping[str, float] = field(default_factory=dict)
    duration: str | None = None
    limit_state: str = "ASD"

    def cases(self) -> tuple[str, ...]:
        """Cases with a nonzero factor."""
        return tuple(c for c, f in self.factors.items() if f != 0)


def duration_of(combo: Combination, basis: str) -> str:
    """Load duration of a combination: its own, else that of its shortest case."""
    if combo.duration:
        return combo.duration
    order = US_DURATIONS if basis == "US" else EU_DURATIONS
    table = US_CASE_DURATION if basis == "US" else EU_CASE_DURATION
    durations = [table[c] for c in combo.cases() if c in table] or ["permanent"]
    return max(durations, key=order.index)


def _name(factors: Mapping[str, float]) -> str:
    parts = []
    for case, f in factors.items():
        if f == 0:
            continue
        parts.append(case if f == 1 else f"{f:g}{case}")
    return " + ".join(parts)


def asd_combinations(present: Iterable[str]) -> tuple[Combination, ...]:
    """ASCE 7-16 2.4.1 basic ASD combinations for the cases present (D always)."""
    have = set(present) | {"D"}
    raw: list[dict[str, float]] = [{"D": 1.0}]
    if "L" in have:
        raw.append({"D": 1.0, "L": 1.0})
    roof: list[str] = [c for c in ("Lr", "S") if c in have]
    for r in roof:
        raw.append({"D": 1.0, r: 1.0})
    if "L" in have:
        for r in roof:
            raw.append({"D": 1.0, "L": 0.75, r: 0.75})
    if "W" in have:
        raw.append({"D": 1.0, "W": 0.6})
        if "L" in have or roof:
            roof_or_none: list[str | None] = list(roof) or [None]
            for roof_case in roof_or_none:
                f = {"D": 1.0, "L": 0.75 if "L" in have else 0.0, "W": 0.45}
                if roof_case:
                    f[roof_case] = 0.75
                raw.append({k: v for k, v in f.items() if v})
        raw.append({"D": 0.6, "W": 0.6})
    seen: set[str] = set()
    out = []
    for f in raw:
        name = _name(f)
        if name not in seen:
            seen.add(name)
            out.append(Combination(name, f, None, "ASD"))
    return tuple(out)


def en1990_combinations(present: Iterable[str],
                        psi: Mapping[str, tuple[float, float, float]] | None = None,
                        gamma_G: float = 1.35, gamma_Q: float = 1.5) -> tuple[Combination, ...]:
    """EN 1990 ULS (6.10) and SLS (characteristic 6.14b, quasi-permanent 6.16b) sets.

    D is the permanent action G; every other case is a variable action Q, taken in turn
    as the leading one with the others at psi0.
    """
    psi = {**EN1990_PSI, **(psi or {})}
    variables = [c for c in ("L", "S", "Lr", "W") if c in set(present)]
    out = [Combination(f"ULS {gamma_G:g}G", {"D": gamma_G}, None, "ULS")]
    for lead in variables:
        f = {"D": gamma_G, lead: gamma_Q}
        for other in variables:
            if other != lead and psi[other][0] > 0:
                f[other] = round(gamma_Q * psi[other][0], 6)
        out.append(Combination("ULS " + _name_eu(f), f, None, "ULS"))
    out.append(Combination("SLS char G", {"D": 1.0}, None, "SLS-characteristic"))
    for lead in variables:
        f = {"D": 1.0, lead: 1.0}
        for other in variables:
            if other != lead and psi[other][0] > 0:
                f[other] = psi[other][0]
        out.append(Combination("SLS char " + _name_eu(f), f, None, "SLS-characteristic"))
    f = {"D": 1.0}
    for c in variables:
        if psi[c][2] > 0:
            f[c] = psi[c][2]
    out.append(Combination("SLS q-p " + _name_eu(f), f, "permanent", "SLS-quasi-permanent"))
    return tuple(out)


def _name_eu(factors: Mapping[str, float]) -> str:
    parts = []
    for case, f in factors.items():
        label = "G" if case == "D" else f"Q[{case}]"
        parts.append(label if f == 1 else f"{f:g}{label}")
    return " + ".join(parts)
