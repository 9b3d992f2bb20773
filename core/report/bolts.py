"""The bolt check written out: the inputs of the yield equations, every yield mode with
its equation and value, the governing one, and the load per bolt at the most loaded
station (see ``connections``).

The modes are recomputed here with the same clause functions and inputs as the design
check (NDS 2018 12.3.1 or EN 1995-1-1 8.2.3) and compared with the check's own value.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ..codes.dowels import (
    Fe_perpendicular,
    Fe_steel,
    K_theta,
    R_d,
    YieldModes,
    en_f_h_k,
    en_M_y,
    en_steel_centre,
    en_steel_outer,
    en_steel_single,
    en_thick_steel_outer,
    en_thick_steel_single,
    en_thin_steel_outer,
    en_thin_steel_single,
    loose_holes,
    nds_double_shear,
    nds_single_shear,
)
from ..design.check import Check
from ..design.common import Joint, plate_share, plated_both_faces, side_by_side_joints
from ..design.net_section import hole_diameter
from ..model.constants import INCH
from ..pipeline import Analysis
from ..section.transformed import Section
from .connections import station_text
from .numbers import NBSP, TIMES, factor_text, num, q

IN = 5

NDS_DOUBLE = {
    "Im": "D l_m F_em / R_d",
    "Is": "2 D l_s F_es / R_d",
    "IIIs": "2 k\u2083 D l_s F_em / ((2 + R_e) R_d)",
    "IV": "2 D\u00b2 / R_d \u00d7 \u221a(2 F_em F_yb / (3 (1 + R_e)))",
}
NDS_SINGLE = {
    "Im": "D l_m F_em / R_d",
    "Is": "D l_s F_es / R_d",
    "II": "k\u2081 D l_s F_es / R_d",
    "IIIm": "k\u2082 D l_m F_em / ((1 + 2 R_e) R_d)",
    "IIIs": "k\u2083 D l_s F_em / ((2 + R_e) R_d)",
    "IV": "D\u00b2 / R_d \u00d7 \u221a(2 F_em F_yb / (3 (1 + R_e)))",
}
EN_CENTRE = {
    "f": "f_h,k t\u2081 d",
    "g": "f_h,k t\u2081 d (\u221a(2 + 4 M_y,Rk / (f_h,k d t\u2081\u00b2)) \u2212 1)",
    "h": "2.3 \u221a(M_y,Rk f_h,k d)",
}
EN_THIN = {"a": "0.4 f_h,k t\u2081 d", "b": "1.15 \u221a(2 M_y,Rk f_h,k d)"}
EN_THIN_OUTER = {"j": "0.5 f_h,k t\u2082 d", "k": "1.15 \u221a(2 M_y,Rk f_h,k d)"}
EN_THICK_OUTER = {"l": "0.5 f_h,k t\u2082 d", "m": "2.3 \u221a(M_y,Rk f_h,k d)"}
EN_THICK = {
    "c": "f_h,k t\u2081 d",
    "d": "f_h,k t\u2081 d (\u221a(2 + 4 M_y,Rk / (f_h,k d t\u2081\u00b2)) \u2212 1)",
    "e": "2.3 \u221a(M_y,Rk f_h,k d)",
}


@dataclass(frozen=True)
class BoltText:
    """The bolt check's lines: definitions, the yield-mode table and the demand."""

    where: tuple[str, ...]
    table: tuple[tuple[str, ...], ...]
    demand: str
    shared: int = 0


def _joint(section: Section, c: Check) -> Joint:
    return next(j for j in side_by_side_joints(section)
                if section.plies[j.steel].name == c.ply)


def _available_thickness(section: Section, j: int) -> float:
    """As the design check: half the timber where plates lie on both of its faces."""
    width = section.plies[j].width
    return width / 2 if plated_both_faces(side_by_side_joints(section), j) else width


def _mode_table(modes: YieldModes, equations: dict[str, str], u: str, per: str,
                rd: bool) -> tuple[tuple[str, ...], ...]:
    head = ("Mode", "Equation", *(("R_d",) if rd else ()), f"Value{per}", "")
    rows = [head]
    for m, v in modes.modes.items():
        extra = (factor_text(R_d(m, 90.0)),) if rd else ()
        rows.append((m, equations.get(m, ""), *extra, q(v, "force", u, IN),
                     "governs" if m == modes.governing else ""))
    return tuple(rows)


def _nds(a: Analysis, c: Check, jt: Joint, u: str) -> tuple[list[str], YieldModes, tuple]:  # type: ignore[type-arg]
    s, bolt = a.section, a.design.bolt
    steel, smat = s.plies[jt.steel], s.materials[jt.steel]
    timbers = [j for j in jt.timbers if s.materials[j].value("G") is not None]
    G = min(s.materials[j].value("G") or 0.5 for j in timbers)
    D = bolt.diameter
    Fe_w, Fe_s = Fe_perpendicular(G, D), Fe_steel(smat.value("Fu") or 0.0)
    thick = [_available_thickness(s, j) for j in timbers]
    where = [f"D = {q(D, 'length', u, IN)} (bolt diameter); load perpendicular to the "
             f"grain of the timbers, \u03b8 = 90\u00b0, K_\u03b8 = 1 + 0.25 \u03b8 / 90\u00b0 "
             f"= {factor_text(K_theta(90.0))}; F_yb = {q(bolt.Fyb, 'stress', u, IN)}",
             f"F_e,steel = 1.5 F_u = 1.5 {TIMES} {q(smat.value('Fu') or 0.0, 'stress', u, IN)} "
             f"= {q(Fe_s, 'stress', u, IN)} ({steel.name})",
             f"F_e\u22a5 = 6100 G^1.45 / \u221aD psi (D in in) = 6100 {TIMES} "
             f"{factor_text(G)}^1.45 / \u221a{num(D / INCH, IN)} = {q(Fe_w, 'stress', u, IN)} "
             "(timber, G the lowest of the timbers)"]
    if jt.steel_is_main:
        lm, Fem, ls, Fes = steel.width, Fe_s, min(thick), Fe_w
        modes = nds_double_shear(D, lm, Fem, ls, Fes, bolt.Fyb, 90.0)
        where.append(f"Double shear, wood-steel-wood: main member the plate, l_m = "
                     f"{q(lm, 'length', u, IN)}, F_em = {q(Fem, 'stress', u, IN)}; side members "
                     f"the timbers, l_s = {q(ls, 'length', u, IN)}, F_es = "
                     f"{q(Fes, 'stress', u, IN)}")
        eqs = NDS_DOUBLE
    else:
        lm, Fem, ls, Fes = thick[0], Fe_w, steel.width, Fe_s
        modes = nds_single_shear(D, lm, Fem, ls, Fes, bolt.Fyb, 90.0)
        where.append(f"Single shear, plate on one face: main member the timber, l_m = "
                     f"{q(lm, 'length', u, IN)}, F_em = {q(Fem, 'stress', u, IN)}; side member "
                     f"the plate, l_s = {q(ls, 'length', u, IN)}, F_es = "
                     f"{q(Fes, 'stress', u, IN)}")
        eqs = NDS_SINGLE
    Re = Fem / Fes
    k3 = -1 + math.sqrt(2 * (1 + Re) / Re + 2 * bolt.Fyb * (2 + Re) * D**2 / (3 * Fem * ls**2))
    consts = [f"R_e = F_em / F_es = {num(Re, IN)}",
              f"k\u2083 = \u22121 + \u221a(2 (1 + R_e) / R_e + 2 F_yb (2 + R_e) D\u00b2 / "
              f"(3 F_em l_s\u00b2)) = {num(k3, IN)}"]
    if not jt.steel_is_main:
        Rt = lm / ls
        k1 = (math.sqrt(Re + 2 * Re**2 * (1 + Rt + Rt**2) + Rt**2 * Re**3) - Re * (1 + Rt)) / (
            1 + Re)
        k2 = -1 + math.sqrt(2 * (1 + Re) + 2 * bolt.Fyb * (1 + 2 * Re) * D**2 / (3 * Fem * lm**2))
        consts += [f"R_t = l_m / l_s = {num(Rt, IN)}",
                   f"k\u2081 = (\u221a(R_e + 2 R_e\u00b2 (1 + R_t + R_t\u00b2) + R_t\u00b2 "
                   f"R_e\u00b3) \u2212 R_e (1 + R_t)) / (1 + R_e) = {num(k1, IN)}",
                   f"k\u2082 = \u22121 + \u221a(2 (1 + R_e) + 2 F_yb (1 + 2 R_e) D\u00b2 / "
                   f"(3 F_em l_m\u00b2)) = {num(k2, IN)}"]
    where.append("; ".join(consts) + "; R_d per NDS 2018 Table 12.3.1B: 4 K_\u03b8 (modes I), "
                 "3.6 K_\u03b8 (II), 3.2 K_\u03b8 (III, IV)")
    table = _mode_table(modes, eqs, u, "", True)
    return where, modes, table


def _en(a: Analysis, c: Check, jt: Joint, u: str) -> tuple[list[str], YieldModes, tuple]:  # type: ignore[type-arg]
    s, bolt = a.section, a.design.bolt
    d = bolt.diameter
    rho = min(s.materials[j].value("rho_k") or 0.0 for j in jt.timbers)
    fh = en_f_h_k(rho, d, 90.0)
    My = en_M_y(bolt.fu, d)
    dm = d * 1000.0
    f0 = 0.082 * (1 - 0.01 * dm) * rho
    k90 = 1.35 + 0.015 * dm
    where = [f"d = {q(d, 'length', u, IN)} (bolt diameter, in mm in the equations); "
             f"\u03c1_k = {num(rho, IN)}{NBSP}kg/m\u00b3 (lowest of the timbers); load at "
             "\u03b1 = 90\u00b0 to the grain",
             f"f_h,0,k = 0.082 (1 \u2212 0.01 d) \u03c1_k = 0.082 {TIMES} (1 \u2212 0.01 {TIMES} "
             f"{num(dm, IN)}) {TIMES} {num(rho, IN)} = {num(f0, IN)}{NBSP}MPa; k\u2089\u2080 = "
             f"1.35 + 0.015 d = {num(k90, IN)}; f_h,90,k = f_h,0,k / (k\u2089\u2080 "
             f"sin\u00b2\u03b1 + cos\u00b2\u03b1) = {q(fh, 'stress', u, IN)}",
             f"M_y,Rk = 0.3 f_u,k d^2.6 = 0.3 {TIMES} {num(bolt.fu / 1e6, IN)} {TIMES} "
             f"{num(dm, IN)}^2.6 = {num(My * 1000.0, IN)}{NBSP}N\u00b7mm"]
    joints = side_by_side_joints(s)

    def plated(j: int) -> bool:
        return plated_both_faces(joints, j)

    if not jt.steel_is_main and plated(jt.timbers[0]):
        t2 = s.plies[jt.timbers[0]].width
        t = s.plies[jt.steel].width
        thin = en_thin_steel_outer(fh, t2, d, My)
        thick = en_thick_steel_outer(fh, t2, d, My)
        value, rule = en_steel_outer(fh, t2, d, My, t, hole_diameter(a.design))
        where.append(f"Steel plates on both faces of the timber (steel-timber-steel, the "
                     f"timber the central member), per shear plane, rope effect left out; "
                     f"t\u2082 = {q(t2, 'length', u, IN)} (timber thickness), plate t = "
                     f"{q(t, 'length', u, IN)}, d = {q(d, 'length', u, IN)}: {rule}")
        return _thin_or_thick(a, where, (thin, EN_THIN_OUTER), (thick, EN_THICK_OUTER), t,
                              value, rule, u)
    if jt.steel_is_main:
        t1 = min(s.plies[j].width / (2 if plated(j) else 1) for j in jt.timbers)
        modes = en_steel_centre(fh, t1, d, My)
        half = (" (half of a timber with plates on both faces, 8.1.3(1))"
                if any(plated(j) for j in jt.timbers) else "")
        where.append(f"Steel plate as the central member of a double-shear joint, (8.11), "
                     f"per shear plane, rope effect left out; t\u2081 = "
                     f"{q(t1, 'length', u, IN)} (timber thickness{half})")
        eqs = EN_CENTRE
    else:
        # 8.2.3: t1 is the timber's thickness; the plate's thickness t sets the rule
        t1 = min(s.plies[j].width for j in jt.timbers)
        t = s.plies[jt.steel].width
        thin = en_thin_steel_single(fh, t1, d, My)
        thick = en_thick_steel_single(fh, t1, d, My)
        value, rule = en_steel_single(fh, t1, d, My, t, hole_diameter(a.design))
        where.append(f"Steel plate on one face, single shear, rope effect left out; t\u2081 = "
                     f"{q(t1, 'length', u, IN)} (timber thickness), plate t = "
                     f"{q(t, 'length', u, IN)}, d = {q(d, 'length', u, IN)}: {rule}")
        return _thin_or_thick(a, where, (thin, EN_THIN), (thick, EN_THICK), t, value, rule, u)
    table = _mode_table(modes, eqs, u, " per plane", False)
    return where, modes, table


def _thin_or_thick(a: Analysis, where: list[str], thin: tuple[YieldModes, dict[str, str]],
                   thick: tuple[YieldModes, dict[str, str]], t: float, value: float, rule: str,
                   u: str) -> tuple[list[str], YieldModes, tuple]:  # type: ignore[type-arg]
    """The thin and thick plate's modes of an EU steel-to-timber bolt, and the value
    between them where the plate's thickness lies between 0.5 d and d (8.2.3).
    """
    d = a.design.bolt.diameter
    if 0.5 * d < t < d and not loose_holes(d, hole_diameter(a.design)):
        w = (t - 0.5 * d) / (0.5 * d)
        where.append(f"F_v,Rk = thin + (t \u2212 0.5 d) / (0.5 d) {TIMES} (thick \u2212 thin) "
                     f"= {q(thin[0].value, 'force', u, IN)} + {num(w, IN)} {TIMES} "
                     f"({q(thick[0].value, 'force', u, IN)} \u2212 "
                     f"{q(thin[0].value, 'force', u, IN)}) = {q(value, 'force', u, IN)}")
    rows = (_mode_table(thin[0], thin[1], u, " per plane", False)
            + _mode_table(thick[0], thick[1], u, " per plane", False)[1:])
    return where, YieldModes({rule: value}), rows


def bolt_derivation(a: Analysis, c: Check, u: str) -> BoltText:
    """The bolt check of a plate written out."""
    s, beam = a.section, a.beam
    assert beam is not None and c.fasteners is not None
    jt = _joint(s, c)
    if a.design.us:
        where, modes, table = _nds(a, c, jt, u)
        planes = 1
        if not math.isclose(modes.value, c.reference[1], rel_tol=1e-12):
            raise ValueError("the sheet's yield modes do not reproduce the check's Z")
        where.append(f"Z = {q(modes.value, 'force', u, IN)}: the lowest mode, "
                     f"{modes.governing}")
    else:
        where, modes, table = _en(a, c, jt, u)
        planes = 2 if jt.steel_is_main else 1
        value = planes * modes.value
        if not math.isclose(value, c.reference[1], rel_tol=1e-12):
            raise ValueError("the sheet's yield modes do not reproduce the check's F_v,Rk")
        where.append(f"F_v,Rk = {planes} {TIMES} {q(modes.value, 'force', u, IN)} = "
                     f"{q(value, 'force', u, IN)} ({planes} shear plane"
                     f"{'s' if planes > 1 else ''}, governing mode ({modes.governing}))")
    combo = next(cb for cb in beam.combinations if cb.name == c.combination)
    reactions = [float(r) for r in combo.solution.reactions]
    W = sum(reactions)
    i = jt.steel
    share = plate_share(s, i)
    terms = " + ".join(q(r, "force", u, IN) for r in reactions)
    where += [f"\u03b1 = E_p I_p,na / EI = n_p I_p,na / I_t = {num(float(s.n[i]), IN)} {TIMES} "
              f"{q(float(s.I_na[i]), 'second_moment', u, IN)} / "
              f"{q(s.I_transformed, 'second_moment', u, IN)} = {num(share, IN)}: the share of "
              "the load the plate takes by its bending stiffness at once, passed between plate "
              "and timbers by the bolts (with creep, where worse, below)"]
    shared = len(where)
    station_where, demand = station_text(a, c, u)
    where += [f"W = total load on the member under {combo.name} = \u03a3R = {terms} = "
              f"{q(W, 'force', u, IN)} (the plate's share \u03b1 W reaches it bolt station "
              "by bolt station)", *station_where]
    return BoltText(tuple(where), table, demand, shared)
