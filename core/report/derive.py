"""Each check written out as a reviewer recomputes it: the symbolic equation, the same
equation with the numbers in display units, the result, the capacity, the ratio.

The demand's inputs come from the analysis (section and beam results), not from the
check alone: the ply stress n M c / I_t needs M, c, n and I_t. Every derivation is
re-evaluated here in SI and compared with the check's own demand, so a sheet never
prints an equation that does not give the number it prints.

Inputs of an equation are printed to one more significant figure than its result, so
that the printed numbers reproduce the printed result to its last digit.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from ..actions.analysis import BeamResult, CombinationResult
from ..actions.beam import CaseSolution, element_polynomials
from ..design.check import Check
from ..pipeline import Analysis
from ..section.transformed import Section
from .bolts import bolt_derivation
from .handbook import handbook_terms
from .numbers import NBSP, TIMES, exact, factor_text, num, q, q_den

IN = 5  #: significant figures of an equation's inputs (results get 4)

#: Symbols of a check's demand and capacity per (basis, check id, material kind).
SYMBOLS = {
    ("US", "bending", "timber"): ("f_b", "F\u2032_b"),
    ("US", "bending", "steel"): ("f_b", "F_b"),
    ("US", "shear", "timber"): ("f_v", "F\u2032_v"),
    ("US", "shear", "steel"): ("f_v", "F_v"),
    ("US", "bearing", "timber"): ("f_c\u22a5", "F\u2032_c\u22a5"),
    ("EU", "bending", "timber"): ("\u03c3_m,d", "f_m,d"),
    ("EU", "bending", "steel"): ("\u03c3_Ed", "f_y,d"),
    ("EU", "shear", "timber"): ("\u03c4_d", "f_v,d"),
    ("EU", "shear", "steel"): ("\u03c4_Ed", "f_v,y,d"),
    ("EU", "bearing", "timber"): ("\u03c3_c,90,d", "f_c,90,d"),
}

#: The clause each check line cites (the sources section names the tables).
CLAUSES = {
    ("US", "bending"): "NDS 2018 3.3 and Table 4.3.1; AISC 360-16 F11 for steel",
    ("US", "shear"): "NDS 2018 3.4; AISC 360-16 G2.1 for steel",
    ("US", "bearing"): "NDS 2018 3.10",
    ("US", "deflection-live"): "NDS 2018 3.5; IBC 2018 Table 1604.3",
    ("US", "deflection-total"): "NDS 2018 3.5; IBC 2018 Table 1604.3",
    ("US", "deflection-long-term"): "NDS 2018 3.5.2",
    ("US", "bolts"): "NDS 2018 12.3.1 and Table 11.3.1",
    ("US", "connectors"): "shear flow V Q / I_t; the user's connector value",
    ("EU", "bending"): "EN 1995-1-1 6.1.6; EN 1993-1-1 6.2.1(5) for steel",
    ("EU", "shear"): "EN 1995-1-1 6.1.7; EN 1993-1-1 6.2.6 for steel",
    ("EU", "bearing"): "EN 1995-1-1 6.1.5",
    ("EU", "deflection-live"): "EN 1995-1-1 7.2",
    ("EU", "deflection-total"): "EN 1995-1-1 7.2",
    ("EU", "deflection-long-term"): "EN 1995-1-1 2.2.3 and 7.2",
    ("EU", "bolts"): "EN 1995-1-1 8.2.3",
    ("EU", "connectors"): "shear flow V Q / I_t; the user's connector value",
}


@dataclass(frozen=True)
class Derivation:
    """A check written out.

    Attributes:
        where: definitions and intermediate values, in order.
        demand: "symbol = equation = numbers = result".
        capacity: "symbol = equation = numbers = result".
        ratio: "demand / capacity = ratio".
        table: rows of a table the derivation needs (the bolts' yield modes), header first.
        shared: how many leading ``where`` lines every combination of the check shares.

    """

    where: tuple[str, ...]
    demand: str
    capacity: str
    ratio: str
    table: tuple[tuple[str, ...], ...] = ()
    shared: int = 0


#: ASCII symbols of the checks as the sheet writes them.
SYMBOL_TEXT = {"Omega_v": "\u03a9_v", "Omega_b": "\u03a9_b", "gamma_M": "\u03b3_M",
               "gamma_M0": "\u03b3_M0", "C_Delta": "C_\u0394", "Fc_perp": "F_c\u22a5",
               "1/sqrt(3)": "1/\u221a3", "Fb": "F_b", "Fv": "F_v", "Fy": "F_y",
               "fm_k": "f_m,k", "fv_k": "f_v,k", "fc90_k": "f_c,90,k", "F_b/F_y": "F_b/F_y",
               "limit": "limit", "Ft": "F_t", "Fc": "F_c", "Emin": "E_min", "Fu": "F_u",
               "ft0_k": "f_t,0,k", "fc0_k": "f_c,0,k", "E0_05": "E_0,05", "Fbx_pos": "F_bx+",
               "Fbx_neg": "F_bx\u2212"}


def symbol_text(key: str) -> str:
    """A check's symbol as printed."""
    return SYMBOL_TEXT.get(key, key)


def basis_of(a: Analysis) -> str:
    """"US" or "EU"."""
    return "US" if a.design.us else "EU"


def clause_of(a: Analysis, c: Check) -> str:
    """The clause a check line cites."""
    text = CLAUSES.get((basis_of(a), c.id), "")
    if c.id in ("bending", "shear") and c.ply:
        timber, _, steel = text.partition("; ")
        steel_ply = a.section.materials[ply_index(a.section, c.ply)].kind == "steel"
        return steel.removesuffix(" for steel") if steel_ply else timber
    return text


def combination(beam: BeamResult, name: str | None) -> CombinationResult:
    """The combination of that name."""
    return next(c for c in beam.combinations if c.name == name)


def ply_index(section: Section, name: str | None) -> int:
    """Index of the ply of that name."""
    return next(i for i, p in enumerate(section.plies) if p.name == name)


def derive(a: Analysis, c: Check) -> Derivation:
    """The derivation of one check of the analysis."""
    u = a.project.display_units
    if c.id == "bending":
        where, demand = _bending(a, c, u)
    elif c.id == "shear":
        where, demand = _shear(a, c, u)
    elif c.id == "bearing":
        where, demand = _bearing(a, c, u)
    elif c.id.startswith("deflection"):
        where, demand = _deflection(a, c, u)
    elif c.id == "connectors":
        where, demand = _connectors(a, c, u)
    elif c.id != "bolts":
        # interaction, uplift and vibration checks: their equation and worked numbers
        where = [c.equation, *c.notes]
        demand = f"demand = {result(c, u)}"
    else:
        bolt = bolt_derivation(a, c, u)
        return Derivation(bolt.where, bolt.demand, capacity_line(a, c, u), ratio_line(c, u),
                          bolt.table, len(bolt.where) - 1)
    return Derivation(tuple(where), demand, capacity_line(a, c, u), ratio_line(c, u))


def _kind(c: Check) -> str:
    return "deflection" if c.quantity == "deflection" else c.quantity


def result(c: Check, u: str) -> str:
    """The check's demand as printed."""
    return q(c.demand, _kind(c), u)


def ratio_line(c: Check, u: str) -> str:
    """Demand / capacity = ratio, and the verdict."""
    kind = _kind(c)
    verdict = "\u2264 1 \u2192 OK" if c.ok else "> 1 \u2192 NOT OK"
    ratio = f"{c.ratio:.3f}" if math.isfinite(c.ratio) else "\u221e"
    return (f"ratio = {q(abs(c.demand), kind, u)} / {q(c.capacity, kind, u)} = {ratio} "
            f"{verdict}")


def _symbols(a: Analysis, c: Check) -> tuple[str, str]:
    if c.id.startswith("deflection"):
        return "\u03b4", "\u03b4_allow"
    if c.id == "bolts":
        return "P", ("Z\u2032" if a.design.us else "F_v,Rd")
    if c.id == "connectors":
        return "F", "F_allow"
    i = ply_index(a.section, c.ply.split(" + ")[0] if c.ply else None)
    kind = "steel" if a.section.materials[i].kind == "steel" else "timber"
    return SYMBOLS.get((basis_of(a), c.id, kind), ("demand", "capacity"))


def capacity_line(a: Analysis, c: Check, u: str) -> str:
    """Reference value x factors / partial factors, in symbols and in numbers."""
    kind = "length" if c.quantity == "deflection" else _kind(c)
    ref_sym, ref_val = c.reference

    sym_parts = [symbol_text(ref_sym), *[symbol_text(k) for k in c.factors]]
    num_parts = [exact(ref_val, kind, u), *[factor_text(v) for v in c.factors.values()]]
    symbolic = f" {TIMES} ".join(sym_parts)
    numbers = f" {TIMES} ".join(num_parts)
    if c.partial_factors:
        part_s = f" {TIMES} ".join(symbol_text(k) for k in c.partial_factors)
        part_n = f" {TIMES} ".join(factor_text(v) for v in c.partial_factors.values())
        if len(c.partial_factors) > 1:
            part_s, part_n = f"({part_s})", f"({part_n})"
        symbolic += f" / {part_s}"
        numbers += f" / {part_n}"
    cap_sym = _symbols(a, c)[1]
    return f"{cap_sym} = {symbolic} = {numbers} = {q(c.capacity, _kind(c), u)}"


def _check_close(value: float, c: Check, what: str) -> None:
    """The derivation must reproduce the check's own demand (SI, to round-off)."""
    if not math.isclose(abs(value), abs(c.demand), rel_tol=1e-7, abs_tol=1e-12):
        raise ValueError(f"the sheet's {what} derivation gives {value!r}, the check "
                         f"{c.demand!r}")


def _moment_factor(u: str) -> str:
    """Unit conversion of a moment into force x length of the section's lengths."""
    return f"12{NBSP}in/ft" if u == "US" else f"10\u2076{NBSP}N\u00b7mm/kN\u00b7m"


def _bending(a: Analysis, c: Check, u: str) -> tuple[list[str], str]:
    s, beam = a.section, a.beam
    assert beam is not None
    i = ply_index(s, c.ply)
    combo = combination(beam, c.combination)
    e = combo.extremes
    y_na = s.neutral_axis_y
    top, bot = float(s.y_top[i]), float(s.y_bottom[i])
    fibre = top if abs(top - y_na) >= abs(y_na - bot) else bot
    dist = abs(fibre - y_na)
    n = float(s.n[i])
    M, x = max(((e.M_max, e.x_M_max), (e.M_min, e.x_M_min)), key=lambda t: abs(t[0]))
    value = n * abs(M) * dist / s.I_transformed
    _check_close(value, c, "bending")
    sym = _symbols(a, c)[0]
    where = [f"M = {q(M, 'moment', u, IN)} at x = {q(x, 'span', u)} under {combo.name} "
             "(section 4)",
             f"c = |y \u2212 y_na| = |{q(fibre, 'length', u, IN)} \u2212 "
             f"{q(y_na, 'length', u, IN)}| = {q(dist, 'length', u, IN)} (extreme fibre of "
             f"{c.ply})",
             f"n = E / E_ref = {exact(s.E[i], 'modulus', u)} / {exact(s.E_ref, 'modulus', u)}"
             f" = {num(n, IN)}; I_t = {q(s.I_transformed, 'second_moment', u, IN)} (section 3)"]
    demand = (f"{sym} = n |M| c / I_t = {num(n, IN)} {TIMES} {q(abs(M), 'moment', u, IN)} "
              f"{TIMES} {_moment_factor(u)} {TIMES} {q(dist, 'length', u, IN)} / "
              f"{q_den(s.I_transformed, 'second_moment', u, IN)} = {result(c, u)}")
    return where, demand


def shear_point(s: Section, i: int) -> tuple[float, float]:
    """Height of the largest shear stress in ply i and its value per newton of V (the
    same stations as the design checks use).
    """
    lo, hi = float(s.y_bottom.min()), float(s.y_top.max())
    ys = np.unique(np.concatenate([np.linspace(lo, hi, 41), s.y_bottom, s.y_top,
                                   [s.neutral_axis_y]]))
    tau = np.abs(s.shear_stress(1.0, ys))[i]
    tau = np.where(np.isfinite(tau), tau, 0.0)
    k = int(np.argmax(tau))
    return float(ys[k]), float(tau[k])


def _shear(a: Analysis, c: Check, u: str) -> tuple[list[str], str]:
    s, beam = a.section, a.beam
    assert beam is not None
    i = ply_index(s, c.ply)
    combo = combination(beam, c.combination)
    V, x = combo.extremes.V_max_abs, combo.extremes.x_V_max_abs
    y, tau1 = shear_point(s, i)
    b = float(s.profiles[i].width_inside(np.array([y]))[0])
    n = float(s.n[i])
    Q = tau1 * s.I_transformed * b / n
    value = V * n * Q / (s.I_transformed * b)
    _check_close(value, c, "shear")
    y_na = s.neutral_axis_y
    top, bot = float(s.y_top[i]), float(s.y_bottom[i])
    h_part = top - y if y >= y_na else y - bot
    arm = abs((top + y) / 2 - y_na) if y >= y_na else abs((y + bot) / 2 - y_na)
    where = [f"|V| = {q(V, 'force', u, IN)} at x = {q(x, 'span', u)} under {combo.name} "
             "(section 4)"]
    if s.is_unclipped(i) and math.isclose(b * h_part * arm, Q, rel_tol=1e-9):
        side = "above" if y >= y_na else "below"
        where.append(f"Q = b h\u2032 d\u2032 = {q(b, 'length', u, IN)} {TIMES} "
                     f"{q(h_part, 'length', u, IN)} {TIMES} {q(arm, 'length', u, IN)} = "
                     f"{q(Q, 'first_moment', u, IN)} (the part of {c.ply} {side} the cut at "
                     f"y = {q(y, 'length', u, IN)}; d\u2032 its centroid's distance from the "
                     "neutral axis)")
    else:
        where.append(f"Q = {q(Q, 'first_moment', u, IN)}: the ply's own first moment at the "
                     f"cut y = {q(y, 'length', u, IN)} plus its share (n b / \u03a3 n b) of "
                     "the plies wholly beyond the cut")
    where.append(f"b = {q(b, 'length', u, IN)} (width of {c.ply} at the cut); n = {num(n, IN)};"
                 f" I_t = {q(s.I_transformed, 'second_moment', u, IN)}")
    kN = f" {TIMES} 1,000{NBSP}N/kN" if u == "SI" else ""
    sym = _symbols(a, c)[0]
    demand = (f"{sym} = |V| n Q / (I_t b) = {q(V, 'force', u, IN)}{kN} {TIMES} {num(n, IN)} "
              f"{TIMES} {q(Q, 'first_moment', u, IN)} / "
              f"({q(s.I_transformed, 'second_moment', u, IN)} {TIMES} "
              f"{q(b, 'length', u, IN)}) = {result(c, u)}")
    return where, demand


def _bearing(a: Analysis, c: Check, u: str) -> tuple[list[str], str]:
    s, beam = a.section, a.beam
    assert beam is not None
    combo = combination(beam, c.combination)
    positions = beam.model.layout.support_positions()
    k = min(range(len(positions)), key=lambda j: abs(positions[j] - (c.x or 0.0)))
    R = float(combo.solution.reactions[k])
    names = (c.ply or "").split(" + ")
    widths = [s.plies[ply_index(s, nm)].width for nm in names]
    lb = beam.spec.bearing_length or 0.0
    widths_text = " + ".join(exact(w, "length", u) for w in widths)
    if len(widths) > 1:
        widths_text = f"({widths_text})"
    sym = _symbols(a, c)[0]
    where = [f"R = {q(R, 'force', u, IN)}: reaction at support {k + 1} under {combo.name} "
             "(the combination with the largest reaction there; section 4)",
             f"\u03a3b = {widths_text} (timber plies that bear: {c.ply})"]
    if a.design.us:
        value = max(R, 0.0) / (sum(widths) * lb)
        demand = (f"{sym} = R / (\u03a3b l_b) = {q(R, 'force', u, IN)} / ({widths_text} "
                  f"{TIMES} {exact(lb, 'length', u)}) = {result(c, u)}")
        where.append(f"l_b = {exact(lb, 'length', u)} (bearing length)")
    else:
        at_end = abs(positions[k]) < 1e-9 or abs(positions[k] - beam.model.layout.length) < 1e-9
        extra = 0.03 if at_end else 0.06
        value = max(R, 0.0) / (sum(widths) * (lb + extra))
        add = f"30{NBSP}mm" if at_end else f"2 {TIMES} 30{NBSP}mm"
        if u != "SI":
            add = q(extra, "length", u, IN)
        kN = f" {TIMES} 1,000{NBSP}N/kN" if u == "SI" else ""
        where.append(f"l_ef = l + {add} = {exact(lb, 'length', u)} + {add} = "
                     f"{q(lb + extra, 'length', u, IN)} (EN 1995-1-1 6.1.5(1): 30 mm beyond "
                     "each side of the bearing that has room)")
        demand = (f"{sym} = F / (\u03a3b l_ef) = {q(R, 'force', u, IN)}{kN} / ({widths_text} "
                  f"{TIMES} ({exact(lb, 'length', u)} + {add})) = {result(c, u)}")
    _check_close(value, c, "bearing")
    return where, demand


def deflection_at(beam: BeamResult, sol: CaseSolution, x: float) -> float:
    """EI times the downward deflection of a solution at x (N m^3)."""
    nodes = beam.model.nodes
    e = int(np.clip(np.searchsorted(nodes, x, side="right") - 1, 0, len(nodes) - 2))
    poly = element_polynomials(beam.model, sol, 1.0)[e]["w"]
    return float(np.polyval(poly, x - nodes[e]))


def _sum_text(terms: list[tuple[float, float]], u: str) -> str:
    parts = [f"{factor_text(f)} {TIMES} {q(v, 'EI_deflection', u, IN)}" for f, v in terms]
    return "(" + " + ".join(parts) + ")" if len(parts) > 1 else parts[0]


def _wrap(text: str, unit_factor: str) -> str:
    """An expression times a unit factor (in parentheses where there is one)."""
    return f"({text}){unit_factor}" if unit_factor else text


def _deflection(a: Analysis, c: Check, u: str) -> tuple[list[str], str]:
    beam = a.beam
    assert beam is not None
    x = c.x or 0.0
    EI, EI_c = a.section.EI, beam.creep_section.EI
    per_case = {k: deflection_at(beam, s, x) for k, s in beam.cases.items()}
    mm = f" {TIMES} 1,000{NBSP}mm/m" if u == "SI" else ""
    EI_t, EIc_t = q_den(EI, "EI", u, IN), q_den(EI_c, "EI", u, IN)
    if c.id == "deflection-live" and c.combination in beam.cases:
        factors: dict[str, float] = {c.combination or "": 1.0}
    elif c.id == "deflection-live":
        factors = {k: f for k, f in combination(beam, c.combination).combination.factors.items()
                   if k != "D"}
    else:
        factors = dict(combination(beam, c.combination).combination.factors)
    terms = [(f, per_case[k]) for k, f in factors.items() if k in per_case and f != 0]
    lines = ", ".join(f"{k} {q(v, 'EI_deflection', u, IN)}" for k, v in per_case.items())
    hand = handbook_terms(beam, x, u)
    where = []
    if hand is not None and all(
            math.isclose(sum(t.value for t in hand if t.case == k), v, rel_tol=1e-6,
                         abs_tol=1e-9 * max(abs(w) for w in per_case.values()))
            for k, v in per_case.items()):
        where += [t.text for t in hand]
        where.append(f"EI \u03b4 of each case at x = {q(x, 'span', u)} ({c.location}), the "
                     f"sum of its loads (equal to the beam analysis): {lines}")
    else:
        where.append(f"EI \u03b4 of each load case at x = {q(x, 'span', u)} ({c.location}; "
                     f"the beam analysis, section 4): {lines}")
    where.append(f"EI = {q(EI, 'EI', u, IN)} (section 3)")
    if c.id != "deflection-long-term":
        value = sum(f * v for f, v in terms) / EI
        demand = (f"\u03b4 = \u03a3 \u03b3 (EI \u03b4) / EI = "
                  f"{_wrap(f'{_sum_text(terms, u)} / {EI_t}', mm)} = {result(c, u)}")
    elif a.design.us:
        combo = combination(beam, c.combination)
        sus = [(f, per_case[k]) for k, f in combo.sustained_factors.items() if f]
        rest = [(f - combo.sustained_factors.get(k, 0.0), per_case[k])
                for k, f in combo.combination.factors.items()
                if k in per_case and f - combo.sustained_factors.get(k, 0.0) != 0]
        value = sum(f * v for f, v in sus) / EI_c + sum(f * v for f, v in rest) / EI
        where.append(f"EI_cr = {q(EI_c, 'EI', u, IN)}: timber moduli / K_cr, K_cr = "
                     f"{factor_text(beam.creep_factor)} (sustained part: "
                     + ", ".join(f"{factor_text(f)} {k}" for k, f in
                                 combo.sustained_factors.items()) + ")")
        demand = "\u03b4 = \u03a3 \u03b3_sus (EI \u03b4) / EI_cr"
        text = f"{_sum_text(sus, u)} / {EIc_t}" if sus else "0"
        if rest:
            demand += " + \u03a3 \u03b3_rest (EI \u03b4) / EI"
            text += f" + {_sum_text(rest, u)} / {EI_t}"
        demand += f" = {_wrap(text, mm)} = {result(c, u)}"
    else:
        qps = [cb for cb in beam.combinations
               if cb.combination.limit_state == "SLS-quasi-permanent"]
        value = sum(f * v for f, v in terms) / EI
        text = f"{_sum_text(terms, u)} / {EI_t}"
        demand = "\u03b4_fin = \u03a3 \u03b3 (EI \u03b4) / EI"
        if qps:
            qp = [(f, per_case[k]) for k, f in qps[0].combination.factors.items()
                  if k in per_case and f]
            value += sum(f * v for f, v in qp) * (1 / EI_c - 1 / EI)
            where.append(f"EI_fin = {q(EI_c, 'EI', u, IN)}: timber moduli / (1 + k_def), "
                         f"1 + k_def = {factor_text(beam.creep_factor)}; creep of the "
                         f"quasi-permanent load {qps[0].name}")
            demand += " + \u03a3 \u03c8\u2082 (EI \u03b4) (1 / EI_fin \u2212 1 / EI)"
            text += f" + {_sum_text(qp, u)} {TIMES} (1 / {EIc_t} \u2212 1 / {EI_t})"
        demand += f" = {_wrap(text, mm)} = {result(c, u)}"
    _check_close(value, c, "deflection")
    return where, demand


def _connectors(a: Analysis, c: Check, u: str) -> tuple[list[str], str]:
    s, beam = a.section, a.beam
    assert beam is not None and c.fasteners is not None
    itf = min(s.interfaces, key=lambda t: abs(t.y - (c.x or 0.0)))
    combo = combination(beam, c.combination)
    V = combo.extremes.V_max_abs
    spacing = c.fasteners.spacing or 0.0
    rows = c.fasteners.rows or 1
    value = V * itf.Q / s.I_transformed * spacing / rows
    _check_close(value, c, "connector")
    where = [f"|V| = {q(V, 'force', u, IN)} (largest shear, {combo.name}); Q = "
             f"{q(itf.Q, 'first_moment', u, IN)} of the plies the interface at y = "
             f"{q(itf.y, 'length', u, IN)} holds on; I_t = "
             f"{q(s.I_transformed, 'second_moment', u, IN)}",
             f"s = {q(spacing, 'length', u, IN)} along the member, {rows} per row"]
    demand = (f"F = |V| Q s / (I_t rows) = {q(V, 'force', u, IN)} {TIMES} "
              f"{q(itf.Q, 'first_moment', u, IN)} {TIMES} {q(spacing, 'length', u, IN)} / "
              f"({q(s.I_transformed, 'second_moment', u, IN)} {TIMES} {rows}) = "
              f"{result(c, u)}")
    return where, demand

