"""EU-LSD checks of a timber ply: bending with lateral torsional stability, and bending
with axial force for plies wholly above or below the neutral axis (EN 1995-1-1, from
memory).

Bending (6.1.6, 6.3.3): sigma_m,d <= k_crit f_m,d, f_m,d = k_mod k_h f_m,k / gamma_M;
sigma_m,crit = 0.78 b^2 E_0,05 / (h l_ef) with l_ef of Table 6.1 plus 2h where the load
acts on the compression edge (less 0.5h on the tension edge), lambda_rel,m =
sqrt(f_m,k / sigma_m,crit), k_crit by (6.34). The breadth is the ply's own width unless
the user declares that the plies act as one.
Interaction: 6.2.3 sigma_t,0,d / f_t,0,d + sigma_m,d / f_m,d <= 1; 6.2.4
(sigma_c,0,d / f_c,0,d)^2 + sigma_m,d / f_m,d <= 1, or with buckling of an unbraced
compression ply 6.3.2(3) sigma_c,0,d / (k_c f_c,0,d) + sigma_m,d / f_m,d <= 1.
"""

from __future__ import annotations

from ..actions.analysis import BeamResult, CombinationResult
from ..codes import en1995 as ec5
from ..model.combination import eu_duration
from ..model.design import DesignSpec
from ..model.errors import MissingCheck, Problem
from ..section.transformed import Section
from .check import Check, CheckId, capacity_from
from .common import apply_overrides, member_width
from .demands import PlyDemand, eu_uls_section, ply_demands
from .slip import carries_axial
from .stability import EdgeStability, edge_stabilities, edge_stability

S_KMOD = "EN 1995-1-1 Table 3.1 (from memory)"
S_GM = "EN 1995-1-1 Table 2.3 (from memory)"


def bending_check(i: int, section: Section, beam: BeamResult, combo: CombinationResult,
                  design: DesignSpec, member_width: float,
                  warnings: list[Problem]) -> Check | None:
    """The bending check of timber ply i under one ULS combination (the worse of the
    sagging and hogging extremes, instantaneous and final states).
    """
    final = eu_uls_section(section, beam, combo, design)
    best: Check | None = None
    for d in ply_demands(section, beam, combo, i, design, eu_final=final):
        c = _bending_for(i, section, beam, combo, design, member_width, d, warnings)
        if c is not None and (best is None or c.ratio > best.ratio):
            best = c
    return best


def _k_crit(i: int, section: Section, beam: BeamResult, design: DesignSpec,
            member_width: float, d: PlyDemand, warnings: list[Problem]
            ) -> tuple[float, str, str] | None:
    """k_crit of ply i at the demand ``d``, its source and the check's location: at a
    support between two spans or overhangs the lower of the two sides (EN 1995-1-1
    6.3.3); None where E_0,05 is missing (warned).
    """
    found = None
    for edge in edge_stabilities(beam, design, "top" if d.sign > 0 else "bottom", d.x):
        got = _k_crit_in(i, section, design, member_width, d, edge, warnings)
        if got is None:
            return None
        if found is None or got[0] < found[0]:
            found = got
    return found


def _k_crit_in(i: int, section: Section, design: DesignSpec, member_width: float,
               d: PlyDemand, edge: EdgeStability, warnings: list[Problem]
               ) -> tuple[float, str, str] | None:
    ply, mat = section.plies[i], section.materials[i]
    where = f"{edge.region}, {edge.edge} edge in compression"
    if not d.compression:
        return 1.0, "ply wholly in tension at this extreme: no lateral buckling", where
    if edge.braced:
        return 1.0, f"EN 1995-1-1 6.3.3: {edge.note}", where
    E005 = mat.value("E0_05")
    fm = float(mat.value("fm_k") or 0.0)
    if E005 is None:
        warnings.append(MissingCheck(f"materials.{mat.id}.E0_05", "is not given: lateral "
                                     "torsional stability (EN 1995-1-1 6.3.3) of an unbraced "
                                     "edge needs E_0,05"))
        return None
    b = member_width if design.stability_width == "member" else ply.width
    lef = ec5.l_ef(float(edge.unbraced or 0.0), edge.en_case, ply.height, edge.load_on)
    if lef <= 0:  # a length under half the depth, loaded on its tension edge
        return 1.0, (f"EN 1995-1-1 6.3.3: l_ef per Table 6.1 ({edge.en_case}, load on the "
                     f"{edge.load_on}) = {lef:.4g} m, not above zero: no lateral torsional "
                     f"buckling; {edge.note} (from memory)"), where
    crit = ec5.sigma_m_crit(b, ply.height, E005, lef)
    lam = ec5.lambda_rel_m(fm, crit)
    k = ec5.k_crit(lam)
    src = (f"EN 1995-1-1 6.3.3, l_ef per Table 6.1 ({edge.en_case}, load on the "
           f"{edge.load_on}) = {lef:.4g} m, b = {b:.4g} m, sigma_m,crit = {crit:.4g} Pa, "
           f"lambda_rel,m = {lam:.3f}; {edge.note} (from memory)")
    return k, src, where


S_KH = "EN 1995-1-1 3.2(3) / 3.3(3) (from memory)"


def _k_h(i: int, section: Section, warnings: list[Problem]) -> tuple[float, str] | None:
    """The depth factor of ply i in bending and its source; None (with the reason among
    ``warnings``) for LVL deeper than 300 mm without its size effect exponent.
    """
    ply, mat = section.plies[i], section.materials[i]
    if mat.product != "lvl":
        return ec5.k_h(ply.height, mat.product), S_KH
    s = mat.value("s")
    k = ec5.k_h_lvl(ply.height, s)
    if k is None:
        warnings.append(MissingCheck(
            f"materials.{mat.id}.s", f'is not given: the LVL ply "{ply.name}" is deeper '
            "than 300 mm, where its bending strength falls by (300/h)^s (EN 1995-1-1 "
            "3.4(3)); give the product's declared size effect exponent s"))
        return None
    if s is None:
        return k, ("EN 1995-1-1 3.4(3): 1.0 without the product's declared s, no "
                   "increase taken (from memory)")
    return k, f"EN 1995-1-1 3.4(3): min((300/h)^s, 1.2), s = {s:g} (from memory)"


def _tension_size(i: int, section: Section, beam: BeamResult,
                  warnings: list[Problem]) -> float | None:
    """The size factor on f_t,0,k of ply i: k_h by its larger dimension (3.2(3),
    3.3(3)), for LVL k_l by its length (3.4(4)); None (reason among ``warnings``)
    for LVL longer than 3 m without its size effect exponent.
    """
    ply, mat = section.plies[i], section.materials[i]
    if mat.product != "lvl":
        return ec5.k_h(max(ply.width, ply.height), mat.product)
    length = beam.model.layout.length
    start = ply.start if ply.start is not None else 0.0
    end = ply.end if ply.end is not None else length
    k = ec5.k_l_lvl(end - start, mat.value("s"))
    if k is None:
        warnings.append(MissingCheck(
            f"materials.{mat.id}.s", f'is not given: the LVL ply "{ply.name}" is longer '
            "than 3 m and carries tension, whose strength falls by (3000/l)^(s/2) (EN "
            "1995-1-1 3.4(4)); give the product's declared size effect exponent s"))
    return k


def _bending_for(i: int, section: Section, beam: BeamResult, combo: CombinationResult,
                 design: DesignSpec, member_width: float, d: PlyDemand,
                 warnings: list[Problem]) -> Check | None:
    ply, mat = section.plies[i], section.materials[i]
    fm = float(mat.value("fm_k") or 0.0)
    crit = _k_crit(i, section, beam, design, member_width, d, warnings)
    if crit is None:
        return None
    k, k_src, where = crit
    depth = _k_h(i, section, warnings)
    if depth is None:
        return None
    km = ec5.k_mod(eu_duration(combo.duration), design.service_class)
    f = {"k_mod": km, "k_h": depth[0], "k_crit": k}
    s = {"fm_k": mat.source_of("fm_k"), "k_mod": S_KMOD, "gamma_M": S_GM,
         "k_h": depth[1], "k_crit": k_src}
    g = {"gamma_M": ec5.gamma_M(mat.product)}
    apply_overrides(f, s, design, ply.name)
    return Check(
        id="bending", ply=ply.name, combination=combo.name, demand=d.stress,
        capacity=capacity_from(fm, f, g), quantity="stress", reference=("fm_k", fm),
        factors=f, partial_factors=g, sources=s,
        equation="sigma_m,d <= k_crit k_mod k_h f_m,k / gamma_M", location=where, x=d.x,
        notes=(f"Demand at the {'sagging' if d.sign > 0 else 'hogging'} extreme, {d.state} "
               "(final: timber E_mean / (1 + psi2 k_def), EN 1995-1-1 2.3.2.2(2)).",))


def interaction_check(i: int, section: Section, beam: BeamResult, combo: CombinationResult,
                      design: DesignSpec, warnings: list[Problem],
                      demand: PlyDemand | None = None) -> Check | None:
    """EN 1995-1-1 6.2.3 / 6.2.4 (6.3.2 where the compression ply is unbraced) for a ply
    wholly above or below the neutral axis.
    ``demand``: the ply's stresses where the caller has them (a member
    strengthened under load), else those of the combination.
    """
    ply, mat = section.plies[i], section.materials[i]
    y_na = section.neutral_axis_y
    if not (section.y_bottom[i] >= y_na - 1e-12 or section.y_top[i] <= y_na + 1e-12
            or carries_axial(section, i)):
        return None
    if demand is not None:
        demands: tuple[PlyDemand, ...] = (demand,)
    else:
        final = eu_uls_section(section, beam, combo, design)
        demands = ply_demands(section, beam, combo, i, design, eu_final=final)
    if not demands:
        return None
    d = max(demands, key=lambda x: x.stress)
    key = "ft0_k" if d.axial > 0 else "fc0_k"
    fa = mat.value(key)
    fm = float(mat.value("fm_k") or 0.0)
    if fa is None:
        warnings.append(MissingCheck(f"materials.{mat.id}.{key}", f'is not given: the ply '
                                     f'"{ply.name}" carries axial force with its bending '
                                     "(EN 1995-1-1 6.2.3 / 6.2.4) and cannot be checked"))
        return None
    km = ec5.k_mod(eu_duration(combo.duration), design.service_class)
    gm = ec5.gamma_M(mat.product)
    depth = _k_h(i, section, warnings)
    if depth is None:
        return None
    fmd = km * depth[0] * fm / gm
    sm = d.bending
    if key == "ft0_k":
        k_t = _tension_size(i, section, beam, warnings)
        if k_t is None:
            return None
        ftd = km * k_t * fa / gm
        ratio = d.axial / ftd + sm / fmd
        eq = "sigma_t,0,d / f_t,0,d + sigma_m,d / f_m,d <= 1 (EN 1995-1-1 6.2.3)"
        cid: CheckId = "tension-bending"
        detail = f"sigma_t = {d.axial:.4g} Pa, f_t,0,d = {ftd:.4g} Pa"
    else:
        sc = -d.axial
        fcd = km * fa / gm
        edge = edge_stability(beam, design, "top" if d.sign > 0 else "bottom", d.x)
        kc = 1.0
        E005 = mat.value("E0_05")
        if not edge.braced:
            if E005 is None:
                warnings.append(MissingCheck(f"materials.{mat.id}.E0_05", "is not given: "
                                             "buckling of the compression ply needs it"))
                return None
            lam = ec5.lambda_rel_c(float(edge.unbraced or 0.0), min(ply.width, ply.height),
                                   fa, E005)
            kc = ec5.k_c(lam, mat.product)
        if kc < 1.0:
            ratio = sc / (kc * fcd) + sm / fmd
            eq = "sigma_c,0,d / (k_c f_c,0,d) + sigma_m,d / f_m,d <= 1 (EN 1995-1-1 6.3.2)"
        else:
            ratio = (sc / fcd) ** 2 + sm / fmd
            eq = "(sigma_c,0,d / f_c,0,d)^2 + sigma_m,d / f_m,d <= 1 (EN 1995-1-1 6.2.4)"
        cid = "compression-bending"
        detail = f"sigma_c = {sc:.4g} Pa, f_c,0,d = {fcd:.4g} Pa, k_c = {kc:.4g}"
        crit = _k_crit(i, section, beam, design, member_width(section), d, warnings)
        if crit is None:
            return None
        if crit[0] < 1.0:  # lateral torsional buckling with the compression, (6.35)
            lt = (sm / (crit[0] * fmd)) ** 2 + sc / (kc * fcd)
            detail += f", k_crit = {crit[0]:.4g}: (6.35) {lt:.3f}"
            if lt > ratio:
                ratio = lt
                eq = ("(sigma_m,d / (k_crit f_m,d))^2 + sigma_c,d / (k_c f_c,0,d) <= 1 "
                      "(EN 1995-1-1 6.3.3, expression 6.35)")
    return Check(
        id=cid, ply=ply.name, combination=combo.name, demand=ratio, capacity=1.0,
        quantity="ratio", reference=("interaction", 1.0), factors={}, partial_factors={},
        sources={"interaction": eq.split("(")[-1].rstrip(")") + " (from memory)"},
        equation=eq, location="ply wholly on one side of the neutral axis", x=d.x,
        notes=(f"{detail}, sigma_m,d = {sm:.4g} Pa, f_m,d = {fmd:.4g} Pa; {d.state}.",))
