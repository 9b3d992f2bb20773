"""US-ASD checks of a timber ply: bending with beam stability, shear, and bending with
axial force for plies that lie wholly above or below the neutral axis (NDS 2018, from
memory).

Bending: F'b = Fb C_D C_M C_t C_L C_F C_fu C_i C_r (sawn; glulam C_V in place of C_F, the
lesser of C_V and C_L, NDS 5.3.6), Fbx- of glulam where the compression-zone laminations
are in tension (NDS Supplement Table 5A). Beam stability NDS 3.3.3: R_B <= 50, F_bE =
1.20 E'min / R_B^2 with the effective length of Table 3.3.3, Fb* = Fb x every factor but
C_fu, C_V and C_L. The breadth is the ply's own width unless the user declares that the
plies act as one (``stability_width`` "member"). Flat use (width > height): C_F by the
wide face and C_fu (Supplement Table 4A).
"""

from __future__ import annotations

import math

from ..actions.analysis import BeamResult, CombinationResult
from ..codes import nds
from ..model.constants import INCH
from ..model.design import DesignSpec
from ..model.errors import MissingCheck, Problem
from ..model.materials import Material
from ..model.plies import Ply
from ..section.transformed import Section
from .check import Check, CheckId, capacity_from
from .common import apply_overrides, member_width
from .demands import PlyDemand, ply_demands
from .slip import carries_axial
from .stability import EdgeStability, edge_stabilities, edge_stability

S_TABLE = "NDS 2018 Table 2.3.2 (from memory)"
S_CM = "NDS Supplement Table 4A/5A wet service factors (from memory)"
S_CT = "NDS 2018 Table 2.3.3 (from memory)"
S_CI = "NDS 2018 Table 4.3.8 (from memory)"
S_CR = "NDS 2018 4.3.9 (user's declaration)"
S_CF = "NDS Supplement Table 4A size factors (from memory)"


def _size(ply: Ply, mat: Material, beam: BeamResult) -> tuple[str, float, float, str]:
    """(size symbol, value, C_fu, source) for bending."""
    flat = ply.width > ply.height
    if mat.product == "glulam":
        return "C_V", nds.C_V(beam.model.layout.length, ply.height, ply.width), 1.0, (
            "NDS 2018 5.3.6 (from memory)")
    face, thick = (ply.width, ply.height) if flat else (ply.height, ply.width)
    cf = nds.C_F(face, mat.product, mat.size_adjusted, thickness=thick)
    cfu = nds.C_fu(ply.width, ply.height) if flat and mat.product == "sawn" else 1.0
    if mat.product != "sawn":
        src = "NDS 2018 4.3.6.2 / typical LVL size factor (from memory)"
    elif mat.size_adjusted:
        src = "NDS 2018 4.3.6.2: C_F = (12/d)^(1/9) for d > 12 in, else 1.0 (from memory)"
    else:
        src = S_CF
    return "C_F", cf, cfu, src


def _flat_timber(ply: Ply, mat: Material) -> bool:
    """A sawn ply thicker than 4 in nominal (3.5 in dressed) used flatwise: a beam and
    stringer or post and timber on its wide face, whose flat-use factor (NDS Supplement
    Table 4D) depends on its grade.
    """
    return (mat.product == "sawn" and ply.width > ply.height
            and ply.height > 3.5 * INCH * (1 + 1e-9))


def _thickness(ply: Ply) -> float:
    """The ply's lesser dimension (its thickness as lumber), m."""
    return min(ply.width, ply.height)


def _cr_source(ply: Ply, mat: Material, design: DesignSpec) -> str:
    """Where C_r comes from, and why it is 1.0 where the user declares a repetitive
    system but the ply is not dimension lumber (NDS 2018 4.3.9).
    """
    if (design.repetitive_member and mat.product == "sawn"
            and nds.C_r(True, mat.product, _thickness(ply)) == 1.0):
        return ("NDS 2018 4.3.9: dimension lumber 2 in to 4 in thick only; this ply is "
                "thicker (a timber), so 1.0 (from memory)")
    return S_CR


def _emin_adj(mat: Material, design: DesignSpec) -> float | None:
    Emin = mat.value("Emin")
    if Emin is None:
        return None
    wet, temp = design.wet_service, design.temperature
    return (Emin * nds.C_M("Emin", mat.product, wet) * nds.C_t("Emin", temp, wet)
            * nds.C_i("Emin", design.incised))


def bending_check(i: int, section: Section, beam: BeamResult, combo: CombinationResult,
                  design: DesignSpec, member_width: float,
                  warnings: list[Problem]) -> Check | None:
    """The bending check of timber ply i under one combination (the worse of the
    sagging and hogging extremes, each with the stability of its compression edge).
    """
    if section.materials[i].value("Fb") is None:
        return None
    best: Check | None = None
    for d in ply_demands(section, beam, combo, i, design):
        c = _bending_for(i, section, beam, combo, design, member_width, d, warnings)
        if c is not None and (best is None or c.ratio > best.ratio):
            best = c
    return best


def _bending_for(i: int, section: Section, beam: BeamResult, combo: CombinationResult,
                 design: DesignSpec, member_width: float, d: PlyDemand,
                 warnings: list[Problem]) -> Check | None:
    ply, mat = section.plies[i], section.materials[i]
    wet, temp = design.wet_service, design.temperature
    ref_sym, Fb = "Fb", float(mat.value("Fb") or 0.0)
    notes = [f"Demand at the {'sagging' if d.sign > 0 else 'hogging'} extreme, "
             f"{d.state}."]
    if d.sign < 0 and mat.product == "glulam":
        neg = mat.value("Fb_neg")
        if neg is None:
            warnings.append(MissingCheck(f"materials.{mat.id}.Fb_neg", "is not given: the "
                                         "hogging moment of a glulam ply needs Fbx- (NDS "
                                         "Supplement Table 5A)"))
            return None
        ref_sym, Fb = "Fb_neg", neg
    sym, size, cfu, size_src = _size(ply, mat, beam)
    cf_for_cm = size if sym == "C_F" else 1.0
    f = {"C_D": nds.C_D(combo.duration), "C_M": nds.C_M("Fb", mat.product, wet, Fb * cf_for_cm),
         "C_t": nds.C_t("Fb", temp, wet), "C_i": nds.C_i("Fb", design.incised),
         "C_r": nds.C_r(design.repetitive_member, mat.product, _thickness(ply))}
    s = {ref_sym: mat.source_of(ref_sym), "C_D": S_TABLE, "C_M": S_CM, "C_t": S_CT,
         "C_i": S_CI, "C_r": _cr_source(ply, mat, design), sym: size_src}
    if _flat_timber(ply, mat):
        if "C_fu" not in design.overrides.get(ply.name, {}):
            warnings.append(MissingCheck(
                f'design.overrides["{ply.name}"].C_fu', "is not given: the sawn ply "
                f'"{ply.name}" is thicker than 4 in nominal and used flatwise, where the '
                "flat-use factor is that of NDS Supplement Table 4D for its grade (below 1 "
                "for some grades, from memory), not Table 4A's; its bending is not checked"))
            return None
        f["C_fu"], s["C_fu"] = 1.0, "NDS Supplement Table 4D flat use (the user's value)"
    elif cfu != 1.0:
        f["C_fu"] = cfu
        s["C_fu"] = "NDS Supplement Table 4A flat use (from memory)"
    found = None
    for edge in edge_stabilities(beam, design, "top" if d.sign > 0 else "bottom", d.x):
        stable = _stability(i, section, design, member_width, d, edge,
                            Fb * math.prod(f.values()) * (size if sym == "C_F" else 1.0),
                            warnings)
        if stable is None:
            return None
        if found is None or stable[0] < found[0]:  # the lower C_L of two sides
            found = stable
    assert found is not None
    c_l, s["C_L"], note, edge = found
    if note:
        notes.extend(note)
    if sym == "C_V":
        f["C_V" if size <= c_l else "C_L"] = min(size, c_l)
    else:
        f["C_L"] = c_l
        f[sym] = size
    apply_overrides(f, s, design, ply.name)
    return Check(
        id="bending", ply=ply.name, combination=combo.name, demand=d.stress,
        capacity=capacity_from(Fb, f), quantity="stress", reference=(ref_sym, Fb),
        factors=f, partial_factors={}, sources=s,
        equation="f_b = n M c / I_t <= F'b = Fb x factors",
        location=f"{edge.region}, {edge.edge} edge in compression", x=d.x,
        notes=tuple(notes))


def _stability(i: int, section: Section, design: DesignSpec, member_width: float,
               d: PlyDemand, edge: EdgeStability, fb_star: float, warnings: list[Problem]
               ) -> tuple[float, str, tuple[str, ...], EdgeStability] | None:
    """C_L of ply i at the demand ``d`` with the compression edge ``edge`` (NDS 2018
    3.3.3), its source, its notes and the edge; None where Emin is missing (warned).
    ``fb_star``: F*b, the reference value times every factor but C_L.
    """
    ply, mat = section.plies[i], section.materials[i]
    if not d.compression:
        return 1.0, "ply wholly in tension at this extreme: no lateral buckling", (), edge
    if edge.braced:
        return 1.0, f"NDS 2018 3.3.3: {edge.note}", (), edge
    emin = _emin_adj(mat, design)
    if emin is None:
        warnings.append(MissingCheck(f"materials.{mat.id}.Emin", "is not given: beam "
                                     "stability (NDS 3.3.3) of an unbraced edge needs it"))
        return None
    b = member_width if design.stability_width == "member" else ply.width
    lu = float(edge.unbraced or 0.0)
    le = nds.effective_length(lu, ply.height, edge.nds_case)
    rb = nds.R_B(le, ply.height, b)
    notes: list[str] = []
    if rb > 50:
        notes.append(f"R_B = {rb:.1f} exceeds 50 (NDS 2018 3.3.3.7): brace the "
                     f"{edge.edge} edge; no capacity is allowed.")
        c_l = 0.0
    else:
        c_l = nds.C_L(fb_star, emin, ply.height, b, lu, edge.nds_case)
    source = (f"NDS 2018 3.3.3, l_e per Table 3.3.3 ({edge.nds_case}), b = "
              f"{'member' if design.stability_width == 'member' else 'ply'} width; "
              f"{edge.note} (from memory)")
    notes.append(f"C_L: l_u = {lu:.4g} m, l_e = {le:.4g} m, R_B = {rb:.3g}, b = {b:.4g} m.")
    return c_l, source, tuple(notes), edge


def interaction_check(i: int, section: Section, beam: BeamResult, combo: CombinationResult,
                      design: DesignSpec, warnings: list[Problem],
                      demand: PlyDemand | None = None) -> Check | None:
    """NDS 2018 3.9.1 (bending and axial tension) or 3.9.2 (bending and axial
    compression) for a ply wholly above or below the neutral axis: its centroid stress is
    the axial stress f_t or f_c, the rest about its own centroid the bending stress f_b.
    ``demand``: the ply's stresses where the caller has them (a member
    strengthened under load), else those of the combination.
    """
    ply, mat = section.plies[i], section.materials[i]
    y_na = section.neutral_axis_y
    if not (section.y_bottom[i] >= y_na - 1e-12 or section.y_top[i] <= y_na + 1e-12
            or carries_axial(section, i)):
        return None
    wet, temp = design.wet_service, design.temperature
    if demand is not None:
        demands: tuple[PlyDemand, ...] = (demand,)
    else:
        demands = ply_demands(section, beam, combo, i, design)
    if not demands:
        return None
    d = max(demands, key=lambda x: x.stress)
    Fb = mat.value("Fb_neg") if d.sign < 0 and mat.product == "glulam" else mat.value("Fb")
    key = "Ft" if d.axial > 0 else "Fc"
    F_axial = mat.value(key)
    if Fb is None:
        return None
    if F_axial is None:
        kind = "tension" if key == "Ft" else "compression"
        warnings.append(MissingCheck(f"materials.{mat.id}.{key}", f'is not given: the ply '
                                     f'"{ply.name}" carries axial {kind} with its bending '
                                     "(NDS 2018 3.9) and cannot be checked"))
        return None
    sym, size, cfu, _ = _size(ply, mat, beam)
    common_f = {"C_D": nds.C_D(combo.duration), "C_t": nds.C_t("Fb", temp, wet),
                "C_i": nds.C_i("Fb", design.incised)}
    fb_no_cl = Fb * math.prod(common_f.values()) * nds.C_M("Fb", mat.product, wet, Fb * size) * (
        size * cfu * nds.C_r(design.repetitive_member, mat.product, _thickness(ply)))
    flat = ply.width > ply.height
    face = ply.width if flat else ply.height
    # C_L of the ply's compression edge, as its bending check takes it (the lower of two
    # sides over a support): F**b of 3.9.1 and F'b1 of 3.9.2 include it, F*b does not
    c_l = 1.0
    width = member_width(section)
    for edge in edge_stabilities(beam, design, "top" if d.sign > 0 else "bottom", d.x):
        stable = _stability(i, section, design, width, d, edge, fb_no_cl, warnings)
        if stable is None:
            return None
        c_l = min(c_l, stable[0])
    if key == "Ft":
        Ft = F_axial * nds.C_D(combo.duration) * nds.C_M("Ft", mat.product, wet) * nds.C_t(
            "Ft", temp, wet) * nds.C_i("Ft", design.incised) * (
            nds.C_F(face, mat.product, mat.size_adjusted) if mat.product == "sawn" else 1.0)
        ft, fb = d.axial, d.bending
        r1 = ft / Ft + fb / fb_no_cl
        r2 = max(fb - ft, 0.0) / (fb_no_cl * c_l)
        ratio = max(r1, r2)
        eq = "f_t / F't + f_b / F*b <= 1 and (f_b - f_t) / F**b <= 1 (NDS 2018 3.9.1)"
        cid: CheckId = "tension-bending"
        detail = (f"f_t = {ft:.4g} Pa, F't = {Ft:.4g} Pa, f_b = {fb:.4g} Pa, F*b = "
                  f"{fb_no_cl:.4g} Pa, F**b = F*b C_L = {fb_no_cl * c_l:.4g} Pa (C_L = "
                  f"{c_l:.4g}): {r1:.3f} and {r2:.3f}")
    else:
        fc, fb = -d.axial, d.bending
        Fc = F_axial * nds.C_D(combo.duration) * nds.C_M("Fc", mat.product, wet) * nds.C_t(
            "Fc", temp, wet) * nds.C_i("Fc", design.incised) * (
            nds.C_F_compression(face) if mat.product == "sawn" else 1.0)
        edge = edge_stability(beam, design, "top" if d.sign > 0 else "bottom", d.x)
        fce = math.inf
        if not edge.braced:
            emin = _emin_adj(mat, design)
            if emin is None:
                warnings.append(MissingCheck(f"materials.{mat.id}.Emin", "is not given: the "
                                             "compression ply's lateral buckling needs it"))
                return None
            least = min(ply.width, ply.height)
            le = float(edge.unbraced or 0.0)
            Fc *= nds.C_P(Fc, emin, le, least, mat.product)
            fce = nds.F_cE(emin, le, least)
        if fc >= fce:
            ratio = math.inf
        else:
            ratio = (fc / Fc) ** 2 + fb / (fb_no_cl * c_l * (1 - fc / fce))
        eq = "(f_c / F'c)^2 + f_b / (F'b (1 - f_c / F_cE)) <= 1 (NDS 2018 3.9.2)"
        cid = "compression-bending"
        detail = (f"f_c = {fc:.4g} Pa, F'c = {Fc:.4g} Pa, f_b = {fb:.4g} Pa, F'b = "
                  f"{fb_no_cl * c_l:.4g} Pa (C_L = {c_l:.4g}), F_cE = {fce:.4g} Pa")
    del sym
    return Check(
        id=cid, ply=ply.name, combination=combo.name, demand=ratio, capacity=1.0,
        quantity="ratio", reference=("interaction", 1.0), factors={}, partial_factors={},
        sources={"interaction": eq.split("(")[-1].rstrip(")") + " (from memory)"},
        equation=eq, location="ply wholly on one side of the neutral axis", x=d.x,
        notes=(detail + f"; {d.state}.",))
