"""Load combinations.

US: ASCE 7-16 section 2.4.1 basic ASD combinations (from memory), with NDS 2018
Table 2.3.2 load durations. EU: EN 1990:2002 6.4.3.2 (6.10, or 6.10a and 6.10b) and
6.5.3 with the psi factors of EN 1990 Annex A1 Table A1.1 (from memory; national annexes
vary), and EN 1995-1-1 2.3.1.2 load-duration classes.
"""

from __future__ import annotations

from collections.abc import Iterable, Mapping, Sequence

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


def _subsets(items: Sequence[str]) -> list[tuple[str, ...]]:
    """Every subset of ``items`` (in order), the empty one first."""
    out: list[tuple[str, ...]] = [()]
    for item in items:
        out += [sub + (item,) for sub in out]
    return out


_Key = tuple[str, tuple[tuple[str, float], ...]]


def _add(out: list[Combination], seen: set[_Key], prefix: str, factors: dict[str, float],
         kind: str, duration: str | None = None) -> None:
    key = (kind, tuple(sorted((c, round(f, 12)) for c, f in factors.items() if f)))
    if key in seen:
        return
    seen.add(key)
    out.append(Combination(f"{prefix} " + _name_eu(factors), factors, duration, kind))


def en1990_combinations(present: Iterable[str],
                        psi: Mapping[str, tuple[float, float, float]] | None = None,
                        expression: str = "6.10", gamma_G_sup: float = 1.35,
                        gamma_G_inf: float = 1.0, gamma_Q: float = 1.5,
                        xi: float = 0.85) -> tuple[Combination, ...]:
    """EN 1990 ULS and SLS sets (from memory of EN 1990 6.4.3.2, 6.5.3, A1.3.1 and
    Table A1.2(B)).

    D is the permanent action G, every other case a variable action Q. Each variable
    action leads in turn, and each accompanying one is either present at psi0 or absent
    (where it is favourable), so the set always holds the leading action alone. G takes
    gamma_G,sup = 1.35 where unfavourable and gamma_G,inf = 1.0 where favourable (uplift).
    ``expression`` "6.10" uses equation (6.10); "6.10a/b" the pair (6.10a) with every
    variable action at psi0 and (6.10b) with xi gamma_G,sup. SLS: characteristic (6.14b),
    frequent (6.15b) and quasi-permanent (6.16b).
    """
    psi = {**EN1990_PSI, **(psi or {})}
    variables = [c for c in ("L", "S", "Lr", "W") if c in set(present)]
    out: list[Combination] = []
    seen: set[_Key] = set()
    uls_g = [gamma_G_sup, gamma_G_inf]
    if expression == "6.10a/b":
        for g in (gamma_G_sup, gamma_G_inf):
            for sub in _subsets(variables):
                f = {"D": g, **{c: round(gamma_Q * psi[c][0], 12) for c in sub}}
                _add(out, seen, "ULS 6.10a", f, "ULS")
        uls_g = [xi * gamma_G_sup, gamma_G_inf]
    prefix = "ULS 6.10b" if expression == "6.10a/b" else "ULS"
    for g in uls_g:
        _add(out, seen, prefix, {"D": g}, "ULS")
        for lead in variables:
            others = [c for c in variables if c != lead and psi[c][0] > 0]
            for sub in _subsets(others):
                f = {"D": g, lead: gamma_Q, **{c: round(gamma_Q * psi[c][0], 12) for c in sub}}
                _add(out, seen, prefix, f, "ULS")
    _add(out, seen, "SLS char", {"D": 1.0}, "SLS-characteristic")
    for lead in variables:
        others = [c for c in variables if c != lead and psi[c][0] > 0]
        for sub in _subsets(others):
            _add(out, seen, "SLS char", {"D": 1.0, lead: 1.0, **{c: psi[c][0] for c in sub}},
                 "SLS-characteristic")
    for lead in variables:
        if psi[lead][1] <= 0:
            continue
        others = [c for c in variables if c != lead and psi[c][2] > 0]
        for sub in _subsets(others):
            _add(out, seen, "SLS freq", {"D": 1.0, lead: psi[lead][1],
                                         **{c: psi[c][2] for c in sub}}, "SLS-frequent")
    f = {"D": 1.0, **{c: psi[c][2] for c in variables if psi[c][2] > 0}}
    _add(out, seen, "SLS q-p", f, "SLS-quasi-permanent", "permanent")
    return tuple(out)


def _name_eu(factors: Mapping[str, float]) -> str:
    parts = []
    for case, f in factors.items():
        label = "G" if case == "D" else f"Q[{case}]"
        parts.append(label if f == 1 else f"{f:g}{label}")
    return " + ".join(parts)
