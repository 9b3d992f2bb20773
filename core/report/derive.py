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

import itertools
import math
from dataclasses import dataclass

import numpy as np

from ..actions.analysis import BeamResult, CombinationResult
from ..actions.beam import CaseSolution
from ..actions.extremes import element_polynomials
from ..actions.patterns import region_parts
from ..design.bearing import bearing_sites, bearing_surface, en_effective_length
from ..design.check import Check, ratio_text
from ..design.common import shear_point, side_by_side_joints
from ..design.demands import PlyDemand, eu_psi2, eu_uls_section, governing_action, ply_demands
from ..pipeline import Analysis
from ..section.gamma import PartialSection
from ..section.transformed import Section
from . import slip_text
from .bolts import bolt_derivation
from .connections import (
    geometry_text,
    net_shear_text,
    net_text,
    shear_demand_text,
    support_shear_text,
    transfer_text,
)
from .handbook import handbook_terms
from .numbers import NBSP, TIMES, exact, factor, factor_text, num, num_value, q, q_den

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
    ("US", "load-transfer"): "NDS 2018 12.3.1 and Table 11.3.1; transfer zone (common practice)",
    ("US", "bending-net"): "NDS 2018 3.1.2; AISC 360-16 B4.3 and F13.1 for steel",
    ("US", "splitting"): "NDS 2018 3.4.3.3 (shear at connections)",
    ("EU", "bending"): "EN 1995-1-1 6.1.6; EN 1993-1-1 6.2.1(5) for steel",
    ("EU", "shear"): "EN 1995-1-1 6.1.7; EN 1993-1-1 6.2.6 for steel",
    ("EU", "bearing"): "EN 1995-1-1 6.1.5",
    ("EU", "deflection-live"): "EN 1995-1-1 7.2",
    ("EU", "deflection-total"): "EN 1995-1-1 7.2",
    ("EU", "deflection-long-term"): "EN 1995-1-1 2.2.3 and 7.2",
    ("EU", "bolts"): "EN 1995-1-1 8.2.3",
    ("EU", "connectors"): "shear flow V Q / I_t; the user's connector value",
    ("EU", "load-transfer"): "EN 1995-1-1 8.2.3; transfer zone (common practice)",
    ("EU", "bending-net"): "EN 1995-1-1 5.1(2); EN 1993-1-1 6.2.5(4) for steel",
    ("EU", "splitting"): "EN 1995-1-1 8.1.4",
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
    if c.id in ("bending", "shear", "bending-net") and c.ply:
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
    if (c.segment is not None or a.stages is not None) and c.id != "bolts":
        # a segment's or a staged check: its equation, notes and demand (the worked
        # derivation of the whole-member section does not apply)
        where = [c.equation, *c.notes] + ([] if c.segment is None else [
            f"Made in segment {c.segment + 1} with that segment's section, at x = "
            f"{q(c.x or 0.0, 'length', u, IN)}."])
        return Derivation(tuple(where), f"demand = {result(c, u)}", capacity_line(a, c, u),
                          ratio_line(c, u))
    if c.location.startswith(("hole ", "net section at hole ")):
        # a beam hole's net section: its equation, the hole and the net numbers in notes
        where, demand = [c.equation, *c.notes], f"demand = {result(c, u)}"
    elif c.id == "bending":
        where, demand = _bending(a, c, u)
    elif c.id == "shear" and c.location.startswith("support"):
        where, demand = support_shear_text(a, c, u, _symbols(a, c)[0])
    elif c.id == "shear" and c.location.startswith("net section at the bolt holes"):
        where, demand = net_shear_text(a, c, u, _symbols(a, c)[0])
    elif c.id == "shear":
        where, demand = _shear(a, c, u)
    elif c.id == "load-transfer" and c.location.startswith("end of"):
        # a plate's end inside the member: the bolt group's statics are in the notes
        n = c.factors["n"]
        where = [c.equation, *c.notes]
        demand = (f"P_t = n f_max = {num(n, IN)} {TIMES} {q(c.demand / n, 'force', u, IN)} "
                  f"= {result(c, u)}")
    elif c.id == "splitting":
        where, demand = _splitting(a, c, u)
    elif c.id == "load-transfer":
        where, demand = transfer_text(a, c, u)
    elif c.id in ("bolt-spacing", "bolt-edge", "bolt-end"):
        where, demand = geometry_text(a, c, u)
    elif c.id == "bending-net":
        where, demand = net_text(a, c, u, _symbols(a, c)[0])
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
                          bolt.table, bolt.shared)
    return Derivation(tuple(where), demand, capacity_line(a, c, u), ratio_line(c, u))


def _splitting(a: Analysis, c: Check, u: str) -> tuple[list[str], str]:
    """A ``splitting`` check: the force of the site and this timber's share of it (E b
    among the timbers of the joint, as ``design.splitting`` shares it).
    """
    s = a.section
    j = next(k for k, p in enumerate(s.plies) if p.name == c.ply)
    joint = next(jt for jt in side_by_side_joints(s) if j in jt.timbers)
    weights = {k: float(s.E[k]) * s.plies[k].width for k in joint.timbers}
    share = weights[j] / sum(weights.values())
    sym = "V" if a.design.us else "F_v,Ed"
    where = [c.equation, *c.notes,
             f"Share of this timber: E b / Σ E b = {num(share, IN)}"]
    demand = (f"{sym} = F s = {q(c.demand / share, 'force', u, IN)} {TIMES} {num(share, IN)} "
              f"= {result(c, u)}")
    return where, demand


def _kind(c: Check) -> str:
    return "deflection" if c.quantity == "deflection" else c.quantity


def result(c: Check, u: str) -> str:
    """The check's demand as printed."""
    return q(c.demand, _kind(c), u)


def ratio_line(c: Check, u: str) -> str:
    """Demand / capacity = ratio, and the verdict: the two printed with the fewest
    significant figures (four or more) whose quotient gives the printed ratio to within
    half its last digit, so that a reader dividing them finds it.
    """
    kind = _kind(c)
    verdict = "\u2264 1 \u2192 OK" if c.ok else "> 1 \u2192 NOT OK"
    ratio = ratio_text(c.ratio)
    digits = 4
    if math.isfinite(c.ratio):
        f = factor(kind, u)
        for digits in range(4, 8):
            cap = num_value(c.capacity * f, digits)
            if cap and abs(num_value(abs(c.demand) * f, digits) / cap - float(ratio)) <= 5e-4:
                break
    return (f"ratio = {q(abs(c.demand), kind, u, digits)} / {q(c.capacity, kind, u, digits)} "
            f"= {ratio} {verdict}")


def _symbols(a: Analysis, c: Check) -> tuple[str, str]:
    if c.id.startswith("deflection"):
        return "\u03b4", "\u03b4_allow"
    if c.id == "bolts":
        return "P", ("Z\u2032" if a.design.us else "F_v,Rd")
    if c.id == "load-transfer":
        return "P_t", ("n Z\u2032" if a.design.us else "n F_v,Rd")
    if c.id in ("bolt-spacing", "bolt-edge", "bolt-end"):
        return ("spread", "limit") if c.reference[0] == "limit" else ("required", "provided")
    if c.id == "connectors":
        return "F", "F_allow"
    i = ply_index(a.section, c.ply.split(" + ")[0] if c.ply else None)
    kind = "steel" if a.section.materials[i].kind == "steel" else "timber"
    cid = "bending" if c.id == "bending-net" else c.id
    return SYMBOLS.get((basis_of(a), cid, kind), ("demand", "capacity"))


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


def _fibre(sec: Section, i: int) -> float:
    """The extreme fibre of ply i farther from the section's neutral axis."""
    top, bot = float(sec.y_top[i]), float(sec.y_bottom[i])
    y_na = sec.neutral_axis_y
    return top if abs(top - y_na) >= abs(y_na - bot) else bot


def _governing_demand(a: Analysis, c: Check, combo: CombinationResult) -> tuple[PlyDemand,
                                                                               Section | None]:
    """The extreme and state the check's demand comes from, and the EU final section."""
    beam = a.beam
    assert beam is not None
    i = ply_index(a.section, c.ply)
    final = None if a.design.us else eu_uls_section(a.section, beam, combo, a.design)
    ds = ply_demands(a.section, beam, combo, i, a.design, eu_final=final)
    return min(ds, key=lambda d: (abs(d.stress - c.demand), abs(d.x - (c.x or 0.0)))), final


def _bending(a: Analysis, c: Check, u: str) -> tuple[list[str], str]:
    s, beam = a.section, a.beam
    assert beam is not None
    i = ply_index(s, c.ply)
    combo = combination(beam, c.combination)
    d, final = _governing_demand(a, c, combo)
    extreme = "sagging" if d.sign > 0 else "hogging"
    sym = _symbols(a, c)[0]
    where = [f"M = {q(d.M, 'moment', u, IN)} at x = {q(d.x, 'span', u)} under {combo.name}, "
             f"the {extreme} extreme (section 4); state {d.state}"]
    if d.state == "with creep" and final is None:
        return _bending_creep_us(a, c, u, combo, d, where)
    sec = final if d.state == "with creep" and final is not None else s
    if isinstance(sec, PartialSection):
        lines, demand, value = slip_text.bending(sec, i, abs(d.M), u, sym, sec is not s,
                                                 _moment_factor(u), result(c, u))
        _check_close(value, c, "bending")
        return where + lines, demand
    sub = ",fin" if sec is not s else ""
    low = "_fin" if sec is not s else ""
    fibre = _fibre(sec, i)
    y_na = sec.neutral_axis_y
    dist = abs(fibre - y_na)
    n = float(sec.n[i])
    value = n * abs(d.M) * dist / sec.I_transformed
    _check_close(value, c, "bending")
    if sec is not s:
        psi2, k_def = _psi2_kdef(a, combo)
        assert a.beam is not None
        where.append(f"final state: timber moduli E_fin = E_mean / (1 + \u03c8\u2082 k_def) "
                     f"= E_mean / (1 + {factor_text(psi2)} {TIMES} {factor_text(k_def)}) "
                     "(EN 1995-1-1 2.3.2.2(2); \u03c8\u2082 of the action causing the "
                     f"largest stress in relation to the strength, here "
                     f"{governing_action(a.beam, combo, a.design)}: its factor times its "
                     "largest |M| over k_mod of its duration; 1.0 where it is permanent)")
    where += [f"c{low} = |y \u2212 y_na{sub}| = |{q(fibre, 'length', u, IN)} \u2212 "
              f"{q(y_na, 'length', u, IN)}| = {q(dist, 'length', u, IN)} (extreme fibre of "
              f"{c.ply})",
              f"n{low} = E{low} / E_ref = {q(float(sec.E[i]), 'modulus', u, IN + 1)} / "
              f"{exact(s.E_ref, 'modulus', u)} = {num(n, IN)}; I_t{sub} = "
              f"{q(sec.I_transformed, 'second_moment', u, IN)}"
              + (" (section 3)" if sec is s else "")]
    demand = (f"{sym} = n{low} |M| c{low} / I_t{sub} = {num(n, IN)} {TIMES} "
              f"{q(abs(d.M), 'moment', u, IN)} {TIMES} {_moment_factor(u)} {TIMES} "
              f"{q(dist, 'length', u, IN)} / {q_den(sec.I_transformed, 'second_moment', u, IN)}"
              f" = {result(c, u)}")
    return where, demand


def _psi2_kdef(a: Analysis, combo: CombinationResult) -> tuple[float, float]:
    """psi2 and k_def as :func:`eu_uls_section` takes them (:func:`eu_psi2`)."""
    beam = a.beam
    assert beam is not None
    return eu_psi2(beam, combo, a.design), beam.creep_factor - 1.0


def _bending_creep_us(a: Analysis, c: Check, u: str, combo: CombinationResult, d: PlyDemand,
                      where: list[str]) -> tuple[list[str], str]:
    """The US stress with creep, n_c M_sus c_c / I_t,c + n (M - M_sus) c / I_t, at the
    fibre that governs.
    """
    s, beam = a.section, a.beam
    assert beam is not None
    cs = beam.creep_section
    i = ply_index(s, c.ply)
    m_sus = combo.M_sustained_at_max if d.sign > 0 else combo.M_sustained_at_min
    M, Ms = abs(d.M), d.sign * m_sus
    n, nc = float(s.n[i]), float(cs.n[i])
    I0, Ic = slip_text.stress_I(s), slip_text.stress_I(cs)
    z0, zc = slip_text.zero_line(s, i), slip_text.zero_line(cs, i)
    options = []
    for y in (float(s.y_top[i]), float(s.y_bottom[i])):
        o = 1.0 if y >= z0 else -1.0
        cc, c0 = o * (y - zc), o * (y - z0)
        options.append((abs(nc * Ms * cc / Ic + n * (M - Ms) * c0 / I0), y, cc, c0))
    value, y, cc, c0 = max(options)
    _check_close(value, c, "bending")
    sus = ", ".join(f"{factor_text(f)} {k}" for k, f in combo.sustained_factors.items() if f)

    def L(v: float) -> str:
        return q(v, "length", u, IN)

    where += [f"M_sus = {q(Ms, 'moment', u, IN)}: the sustained part ({sus}) of the moment "
              "there",
              f"creep section: timber moduli / K_cr, K_cr = {factor_text(beam.creep_factor)}; "
              f"y_na,c = {L(zc)}, I_t,c = "
              f"{q(Ic, 'second_moment', u, IN)}, n_c = E_c / E_ref = {num(nc, IN)}",
              f"fibre y = {L(y)} of {c.ply} (the edge with the larger stress): c_c = "
              f"{L(cc)} from y_na,c; c = {L(c0)} from y_na = {L(z0)}; n = "
              f"{num(n, IN)}; I_t = {q(I0, 'second_moment', u, IN)} (section 3)"]
    if isinstance(s, PartialSection):
        where.append("slip of the fasteners (EN 1995-1-1 Annex B, K_u = 2/3 K_ser, the "
                     "creep section's slip moduli / (1 + k_def of the joint)): y_na is the "
                     "ply's zero-stress height y_c \u2212 \u03b3 (y_c \u2212 y_na) and I_t = "
                     "(EI)_ef / E_ref")
    mf = _moment_factor(u)
    demand = (f"{_symbols(a, c)[0]} = n_c M_sus c_c / I_t,c + n (M \u2212 M_sus) c / I_t = "
              f"{num(nc, IN)} {TIMES} {q(Ms, 'moment', u, IN)} {TIMES} {mf} {TIMES} {L(cc)} / "
              f"{q_den(Ic, 'second_moment', u, IN)} + {num(n, IN)} {TIMES} "
              f"({q(M, 'moment', u, IN)} \u2212 {q(Ms, 'moment', u, IN)}) {TIMES} {mf} "
              f"{TIMES} {L(c0)} / {q_den(I0, 'second_moment', u, IN)} = {result(c, u)}")
    return where, demand


def _shear_section(a: Analysis, c: Check, combo: CombinationResult
                   ) -> tuple[Section, str]:
    """The section whose share of the shear the check took (a steel plate takes the
    larger of the instantaneous and the crept or final one) and how to say it.
    """
    s, beam = a.section, a.beam
    assert beam is not None
    i = ply_index(s, c.ply)
    V = combo.extremes.V_max_abs
    crept = (eu_uls_section(s, beam, combo, a.design) if not a.design.us
             else beam.creep_section)
    for sec, label in ((s, ""), (crept, (
            "the final moduli, timber E_mean / (1 + \u03c8\u2082 k_def) (EN 1995-1-1 "
            "2.3.2.2(2)), give the plate more of the shear" if not a.design.us else
            "the creep moduli, timber E / K_cr, give the plate more of the shear; taken on "
            "the whole of it (conservative)"))):
        if math.isclose(V * shear_point(sec, i)[1], abs(c.demand), rel_tol=1e-7,
                        abs_tol=1e-12):
            return sec, label
    return s, ""


def _shear(a: Analysis, c: Check, u: str) -> tuple[list[str], str]:
    s, beam = a.section, a.beam
    assert beam is not None
    i = ply_index(s, c.ply)
    combo = combination(beam, c.combination)
    s, label = _shear_section(a, c, combo)
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
                 f" I_t = {q(s.I_transformed, 'second_moment', u, IN)}"
                 + (f" ({label})" if label else ""))
    sym = _symbols(a, c)[0]
    return where, shear_demand_text(sym, V, n, Q, s.I_transformed, b, u, result(c, u))


def _bearing(a: Analysis, c: Check, u: str) -> tuple[list[str], str]:
    s, beam = a.section, a.beam
    assert beam is not None
    combo = combination(beam, c.combination)
    site = next(t for t in bearing_sites(beam) if t.location == c.location)
    surface = bearing_surface(s, site.face)
    assert surface is not None
    R = site.force(combo)
    widths = surface.widths
    lb = site.length
    widths_text = " + ".join(exact(w, "length", u) for w in widths)
    if len(widths) > 1:
        widths_text = f"({widths_text})"
    sym = _symbols(a, c)[0]
    if site.load is None:
        where = [f"R = {q(R, 'force', u, IN)}: reaction at {site.location} under {combo.name} "
                 "(the combination with the largest reaction there"
                 + (f", the largest of {combo.patterns_tried} load arrangements"
                    if combo.patterns_tried > 1 else "") + "; section 4)"]
    else:
        factor = combo.combination.factors.get(site.load.case, 0.0)
        where = [f"R = {factor:g} {TIMES} {q(site.load.value, 'force', u, IN)} = "
                 f"{q(R, 'force', u, IN)}: {site.location} (case {site.load.case}, at "
                 f"{exact(site.x, 'span', u)}) under {combo.name}"]
    contact = f", in contact with steel ply {surface.plate}" if surface.plate else ""
    where.append(f"\u03a3b = {widths_text} (timber plies that bear: {c.ply}{contact})")
    if a.design.us:
        value = R / (sum(widths) * lb)
        demand = (f"{sym} = R / (\u03a3b l_b) = {q(R, 'force', u, IN)} / ({widths_text} "
                  f"{TIMES} {exact(lb, 'length', u)}) = {result(c, u)}")
        where.append(f"l_b = {exact(lb, 'length', u)} (bearing length)")
    else:
        l_ef = en_effective_length(site, beam.model.layout.length, bearing_sites(beam))
        add = q(l_ef - lb, "length", u, IN)
        kN = f" {TIMES} 1,000{NBSP}N/kN" if u == "SI" else ""
        value = R / (sum(widths) * l_ef)
        where.append(f"l_ef = l + {add} = {exact(lb, 'length', u)} + {add} = "
                     f"{q(l_ef, 'length', u, IN)} (EN 1995-1-1 6.1.5(1): up to 30 mm beyond "
                     "each side of the bearing, not more than l, the room to the member's end "
                     "or half the clear distance to the next bearing on that face)")
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


def arrangements(beam: BeamResult, x: float, factors: dict[str, float]
                 ) -> list[tuple[dict[str, float], str]]:
    """EI delta of each case at x for every arrangement of the patterned cases' regions
    (every region loaded first), with a description of the arrangement.
    """
    per_case = {k: deflection_at(beam, s, x) for k, s in beam.cases.items()}
    out = [(per_case, "")]
    if not beam.patterned_cases:
        return out
    parts = region_parts(beam.model, beam.spec, beam.patterned_cases)
    units = [(k, parts.names[r], deflection_at(beam, sol, x))
             for k in beam.patterned_cases if factors.get(k)
             for r, sol in enumerate(parts.parts[k]) if sol is not None]
    if not units or len(units) > 12:
        return out
    for mask in itertools.product((True, False), repeat=len(units)):
        vals = dict(per_case)
        for k in dict.fromkeys(unit[0] for unit in units):
            vals[k] = sum(v for (kk, _, v), m in zip(units, mask, strict=True)
                          if m and kk == k)
        loaded = ", ".join(f"{k} {r}" for (k, r, _), m in zip(units, mask, strict=True) if m)
        out.append((vals, loaded or "none"))
    return out


def _arrangement_text(beam: BeamResult, x: float, factors: dict[str, float],
                      vals: dict[str, float], loaded: str, u: str) -> str:
    """The arrangement's EI delta of each patterned case, region by region."""
    parts = region_parts(beam.model, beam.spec, beam.patterned_cases)
    out = []
    for k in beam.patterned_cases:
        if not factors.get(k):
            continue
        regs = [(parts.names[r], deflection_at(beam, sol, x))
                for r, sol in enumerate(parts.parts[k]) if sol is not None]
        out.append(f"{k} on " + ", ".join(f"{r} {q(v, 'EI_deflection', u, IN)}"
                                          for r, v in regs)
                   + f"; in the governing arrangement {k} = "
                   f"{q(vals[k], 'EI_deflection', u, IN)}")
    return (f"Pattern loading (section 4), governing arrangement: {loaded} loaded. EI "
            "\u03b4 of each region's part at x: " + "; ".join(out))


def _deflection(a: Analysis, c: Check, u: str) -> tuple[list[str], str]:
    beam = a.beam
    assert beam is not None
    x = c.x or 0.0
    if c.id == "deflection-live" and c.combination in beam.cases:
        factors: dict[str, float] = {c.combination or "": 1.0}
    elif c.id == "deflection-live":
        factors = {k: f for k, f in combination(beam, c.combination).combination.factors.items()
                   if k != "D"}
    else:
        factors = dict(combination(beam, c.combination).combination.factors)
    options = arrangements(beam, x, factors)
    per_case = options[0][0]
    best = None
    for vals, loaded in options:
        got = _deflection_demand(a, c, u, factors, vals)
        if best is None or abs(abs(got[0]) - abs(c.demand)) < abs(abs(best[2][0])
                                                                  - abs(c.demand)):
            best = (vals, loaded, got)
    assert best is not None
    vals, loaded, (value, extra, demand) = best
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
    if vals is not per_case:
        where.append(_arrangement_text(beam, x, factors, vals, loaded, u))
    where.append(f"EI = {q(a.section.EI, 'EI', u, IN)} (section 3)")
    where += extra
    _check_close(value, c, "deflection")
    return where, demand


def _deflection_demand(a: Analysis, c: Check, u: str, factors: dict[str, float],
                       per_case: dict[str, float]) -> tuple[float, list[str], str]:
    """(value, definitions, demand line) of a deflection with these EI delta per case."""
    beam = a.beam
    assert beam is not None
    EI, EI_c = a.section.EI, beam.creep_section.EI
    mm = f" {TIMES} 1,000{NBSP}mm/m" if u == "SI" else ""
    EI_t, EIc_t = q_den(EI, "EI", u, IN), q_den(EI_c, "EI", u, IN)
    if c.id != "deflection-long-term":
        terms = [(f, per_case[k]) for k, f in factors.items() if k in per_case and f != 0]
        value = sum(f * v for f, v in terms) / EI
        return value, [], (f"\u03b4 = \u03a3 \u03b3 (EI \u03b4) / EI = "
                           f"{_wrap(f'{_sum_text(terms, u)} / {EI_t}', mm)} = {result(c, u)}")
    combo = combination(beam, c.combination)
    sus = [(f, per_case[k]) for k, f in combo.sustained_factors.items()
           if f and k in per_case]
    rest = [(f - combo.sustained_factors.get(k, 0.0), per_case[k])
            for k, f in combo.combination.factors.items()
            if k in per_case and f - combo.sustained_factors.get(k, 0.0) != 0]
    value = sum(f * v for f, v in sus) / EI_c + sum(f * v for f, v in rest) / EI
    part = ", ".join(f"{factor_text(f)} {k}" for k, f in combo.sustained_factors.items())
    if a.design.us:
        where = [f"EI_cr = {q(EI_c, 'EI', u, IN)}: timber moduli / K_cr, K_cr = "
                 f"{factor_text(beam.creep_factor)} (sustained part: {part})"]
        demand, ec, sub = "\u03b4", "EI_cr", "\u03b3_sus"
    else:
        where = [f"EI_fin = {q(EI_c, 'EI', u, IN)}: timber moduli / (1 + k_def), 1 + k_def = "
                 f"{factor_text(beam.creep_factor)} (the quasi-permanent part G + \u03c8\u2082 "
                 f"Q creeps: {part}; EN 1995-1-1 2.2.3(5))"]
        demand, ec, sub = "\u03b4_fin", "EI_fin", "\u03b3_qp"
    demand += f" = \u03a3 {sub} (EI \u03b4) / {ec}"
    text = f"{_sum_text(sus, u)} / {EIc_t}" if sus else "0"
    if rest:
        demand += " + \u03a3 \u03b3_rest (EI \u03b4) / EI"
        text += f" + {_sum_text(rest, u)} / {EI_t}"
    demand += f" = {_wrap(text, mm)} = {result(c, u)}"
    return value, where, demand


def _connectors(a: Analysis, c: Check, u: str) -> tuple[list[str], str]:
    s, beam = a.section, a.beam
    assert beam is not None and c.fasteners is not None
    if isinstance(s, PartialSection):
        combo = combination(beam, c.combination)
        joint = next(j for j in s.joints
                     if (c.ply or "").startswith(s.plies[j.flange].name + " /"))
        where, demand, value = slip_text.connector(s, joint, combo.extremes.V_max_abs,
                                                   combo.name, u, result(c, u))
        _check_close(value, c, "connector")
        return where, demand
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

