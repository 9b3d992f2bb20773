"""Load combinations and load durations.

US: ASCE 7-16 section 2.4.1 basic ASD combinations (from memory), with NDS 2018
Table 2.3.2 load durations. EU: EN 1990:2002 6.4.3.2 (6.10) and 6.5.3 with the
psi factors of EN 1990 Annex A1 Table A1.1 (from memory; national annexes vary), and
EN 1995-1-1 2.3.1.2 load-duration classes.
"""

from __future__ import annotations

from collections.abc import Iterable, Mapping

from ..model.combination import EN1990_PSI, Combination


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
