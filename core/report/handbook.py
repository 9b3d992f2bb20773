"""EI times the deflection at x of each load of a single simple span, by handbook formulas.

The beam diagrams and formulas of the AISC Steel Construction Manual (from memory), so
that a reviewer can recompute the deflection of every case from the loads:

uniform load w over the whole span: EI δ(x) = w x (L³ − 2 L x² + x³) / 24;
point load P at a (b = L − a): EI δ(x) = P b x (L² − b² − x²) / (6 L) for x <= a,
P a (L − x) (2 L x − x² − a²) / (6 L) for x > a.

Other layouts (overhangs, several spans, fixed ends, partial loads) are left to the
beam analysis; :func:`handbook_terms` then returns None.
"""

from __future__ import annotations

from dataclasses import dataclass

from ..actions.analysis import BeamResult
from ..model.constants import INCH, LBF
from .numbers import NBSP, TIMES, num, q

IN = 5


@dataclass(frozen=True)
class Term:
    """One load's EI δ(x) written out."""

    case: str
    text: str
    value: float  #: N m^3


def _lengths(u: str) -> tuple[str, float]:
    return ("in", 1 / INCH) if u == "US" else ("m", 1.0)


def _ql(value: float, u: str) -> str:
    """A line load in force per length of the lengths used (lbf/in or kN/m)."""
    if u == "US":
        return f"{num(value / LBF * INCH, IN)}{NBSP}lbf/in"
    return q(value, "line_load", u, IN)


def _len(value: float, u: str, power: int = 1) -> str:
    label, k = _lengths(u)
    sup = {1: "", 2: "\u00b2", 3: "\u00b3"}[power]
    return f"{num((value * k) ** power, IN + 1)}{NBSP}{label}{sup}"


def handbook_terms(beam: BeamResult, x: float, u: str) -> list[Term] | None:
    """Every load's EI δ at x with its formula, or None where the layout has none."""
    lay = beam.spec.layout
    if lay.supports != "simple" or len(lay.spans) != 1 or lay.overhang_left or \
            lay.overhang_right:
        return None
    L = lay.spans[0]
    out = []
    uniform = [(f"load {k} ({ld.case})", ld.case, ld.line_value)
               for k, ld in enumerate(beam.spec.loads, start=1) if ld.type != "point"
               and (ld.start in (None, 0.0)) and (ld.end is None or abs(ld.end - L) < 1e-9)]
    partial = [ld for ld in beam.spec.loads if ld.type != "point"
               and not (ld.start in (None, 0.0) and (ld.end is None or abs(ld.end - L) < 1e-9))]
    if partial:
        return None
    if beam.spec.self_weight and beam.self_weight_line:
        uniform.append(("self-weight (D)", "D", beam.self_weight_line))
    for name, case, w in uniform:
        value = w * x * (L**3 - 2 * L * x**2 + x**3) / 24
        text = (f"EI \u03b4, {name}: w x (L\u00b3 \u2212 2 L x\u00b2 + x\u00b3) / 24 = "
                f"{_ql(w, u)} {TIMES} {_len(x, u)} {TIMES} ({_len(L, u, 3)} \u2212 2 {TIMES} "
                f"{_len(L, u)} {TIMES} {_len(x, u, 2)} + {_len(x, u, 3)}) / 24 = "
                f"{q(value, 'EI_deflection', u, IN)}")
        out.append(Term(case, text, value))
    for k, ld in enumerate(beam.spec.loads, start=1):
        if ld.type != "point":
            continue
        P, a = ld.value, ld.at or 0.0
        b = L - a
        force = q(P, "force", u, IN)
        if x <= a:
            value = P * b * x * (L**2 - b**2 - x**2) / (6 * L)
            text = (f"EI \u03b4, load {k} ({ld.case}), x \u2264 a: P b x (L\u00b2 \u2212 b\u00b2 "
                    f"\u2212 x\u00b2) / (6 L) = {force} {TIMES} {_len(b, u)} {TIMES} {_len(x, u)} "
                    f"{TIMES} ({_len(L, u, 2)} \u2212 {_len(b, u, 2)} \u2212 {_len(x, u, 2)}) / "
                    f"(6 {TIMES} {_len(L, u)}) = {q(value, 'EI_deflection', u, IN)}")
        else:
            value = P * a * (L - x) * (2 * L * x - x**2 - a**2) / (6 * L)
            text = (f"EI \u03b4, load {k} ({ld.case}), x > a: P a (L \u2212 x) (2 L x \u2212 "
                    f"x\u00b2 \u2212 a\u00b2) / (6 L) = {force} {TIMES} {_len(a, u)} {TIMES} "
                    f"({_len(L, u)} \u2212 {_len(x, u)}) {TIMES} (2 {TIMES} {_len(L, u)} "
                    f"{TIMES} {_len(x, u)} \u2212 {_len(x, u, 2)} \u2212 {_len(a, u, 2)}) / "
                    f"(6 {TIMES} {_len(L, u)}) = {q(value, 'EI_deflection', u, IN)}")
        out.append(Term(ld.case, text, value))
    return out
