"""US allowable stress design: timber per NDS 2018, steel plates per AISC 360-16.

Adjusted design values (NDS Table 4.3.1, from memory):
F'b = Fb C_D C_M C_t C_L C_F C_i C_r (glulam: C_V in place of C_F, the lesser of C_L
and C_V); F'v = Fv C_D C_M C_t C_i; F'c_perp = Fc_perp C_M C_t C_i C_b;
E'min = Emin C_M C_t C_i. Bolts: Z' = Z C_D C_M C_t C_g C_Delta (NDS Table 11.3.1).
"""

from __future__ import annotations

import math
from collections.abc import Sequence

import numpy as np

from ..actions.analysis import BeamResult
from ..codes import aisc, nds
from ..codes.dowels import Fe_perpendicular, Fe_steel, nds_double_shear, nds_single_shear
from ..codes.nds_fasteners import C_M_bolts
from ..model.constants import INCH
from ..model.design import DesignSpec
from ..model.errors import MissingCheck, Problem
from ..model.project import Project
from ..model.units import fmt
from ..section.transformed import Section
from .bearing import us_bearing
from .bolt_checks import BoltValue, PlateLayout, valued_plate_checks
from .check import Check, capacity_from
from .common import (
    EDGE_END_REMINDERS,
    Joint,
    apply_overrides,
    connector_checks,
    deflection_checks,
    member_width,
    no_yield_strength,
    pattern_notes,
    plated_both_faces,
    side_by_side_joints,
    uncombined_cases,
    unit_shear_stress,
    uplift_checks,
)
from .demands import PlyDemand, ply_demands
from .plates import PlateBracing, plate_bracing, us_plate_allowable
from .transfer import support_shear_checks
from .us_timber import S_CI, S_CM, S_CT, S_TABLE, bending_check, interaction_check


def us_checks(project: Project, section: Section, beam: BeamResult,
              design: DesignSpec, layouts: list[PlateLayout] | None = None,
              segment: bool = False) -> tuple[tuple[Check, ...], list[Problem]]:
    """Every US-ASD check of the project (``layouts``, where given, receives the bolt
    layout of every plate whose bolts are checked; ``segment``: a segment's run, where of
    the bolt checks only the timbers' net-section shear is made).
    """
    checks: list[Check] = []
    warnings: list[Problem] = []
    wet, temp = design.wet_service, design.temperature
    combos = beam.strength()
    tau_unit = unit_shear_stress(section)
    if not combos:
        warnings.append(MissingCheck("beam.combinations", 'no ASD combination: use "ASD" (or your '
                                "own list) with the US basis; timber strength checks are "
                                "skipped"))
    warnings += uncombined_cases(beam)
    width = member_width(section)
    joints: list[Joint] | None = None  # found at the first steel ply
    for i, (ply, mat) in enumerate(zip(section.plies, section.materials, strict=True)):
        if section.area[i] <= 0 or not section.is_connected(i):
            continue
        if mat.kind == "timber":
            Fb, Fv = mat.value("Fb"), mat.value("Fv")
            if Fb is None or Fv is None:
                warnings.append(MissingCheck(f"plies[{i}].material", f'"{mat.id}" has no NDS '
                                        "reference values (Fb, Fv); its timber checks are "
                                        "skipped on the US basis"))
                continue
            for combo in combos:
                bend = bending_check(i, section, beam, combo, design, width, warnings)
                if bend is not None:
                    checks.append(bend)
                inter = interaction_check(i, section, beam, combo, design, warnings)
                if inter is not None:
                    checks.append(inter)
                fv = {"C_D": nds.C_D(combo.duration), "C_M": nds.C_M("Fv", mat.product, wet),
                      "C_t": nds.C_t("Fv", temp, wet), "C_i": nds.C_i("Fv", design.incised)}
                sv = {"Fv": mat.source_of("Fv"), "C_D": S_TABLE, "C_M": S_CM, "C_t": S_CT,
                      "C_i": S_CI}
                apply_overrides(fv, sv, design, ply.name)
                checks.append(sh := Check(
                    id="shear",
                    ply=ply.name,
                    combination=combo.name,
                    demand=float(tau_unit[i]) * combo.extremes.V_max_abs,
                    capacity=capacity_from(Fv, fv),
                    quantity="stress",
                    reference=("Fv", Fv),
                    factors=fv,
                    partial_factors={},
                    sources=sv,
                    equation="f_v = V n Q / (I_t b) <= F'v = Fv x factors",
                    location="",
                    x=combo.extremes.x_V_max_abs,
                    notes=("Shear taken at the largest |V|, loads within d of supports included "
                     "(conservative; NDS 3.4.3.1 permits leaving them out).",)))
                checks += support_shear_checks(section, beam, combo, design, i, sh,
                                               project.display_units)
        elif mat.kind == "steel":
            if mat.value("Fy") is None:
                warnings.append(no_yield_strength(i, section))
            if joints is None:
                joints = side_by_side_joints(section)
            checks.extend(_steel_checks(i, section, beam, design, tau_unit, joints,
                                        project.display_units))
        else:
            warnings.append(MissingCheck(f"plies[{i}].material", f'"{mat.id}" is neither '
                                         "timber nor steel: its stresses are reported but not "
                                         "checked"))
    checks.extend(us_bearing(section, beam, design, warnings))
    if not segment:  # the member's (a segment keeps only stresses; these warn of nothing)
        checks.extend(_deflections(beam, section, design))
    checks.extend(_bolts(section, beam, design, project.display_units, warnings, checks,
                         layouts, segment))
    checks.extend(connector_checks(section, beam, design, project.display_units, warnings))
    if not segment:
        checks += uplift_checks(beam, project.display_units)
    warnings += pattern_notes(beam)
    return tuple(checks), warnings


def _steel_checks(i: int, section: Section, beam: BeamResult, design: DesignSpec,
                  tau_unit: np.ndarray, joints: list[Joint], system: str) -> list[Check]:
    ply, mat = section.plies[i], section.materials[i]
    Fy = mat.value("Fy")
    if Fy is None:
        return []
    out = []
    bracing = plate_bracing(section, i, design, joints)
    allow, governs = us_plate_allowable(Fy, mat.E, ply.height, ply.width, bracing.L_b)
    lb_text = "braced" if bracing.L_b is None else f"L_b = {fmt(bracing.L_b, 'span', system)}"
    if design.steel_rule == "AISC-F11":
        ratio = allow * aisc.OMEGA_B / Fy
        f: dict[str, float] = {"Z/S": 1.5} if bracing.L_b is None or ratio >= 1.5 else {
            "M_n/M_y": ratio}
        g = {"Omega_b": aisc.OMEGA_B}
        src = {"Fy": mat.source_of("Fy"), next(iter(f)): f"AISC 360-16 {governs}, rectangular "
               f"bar, C_b = 1.0; {bracing.note} (from memory)",
               "Omega_b": "AISC 360-16 F1 (from memory)"}
        eq = "f_b = n M c / I_t <= (M_n / S) / Omega_b (AISC 360-16 F11)"
    else:
        cap = min(0.6, allow / Fy)
        f, g = {"F_b/F_y": cap}, {}
        src = {"Fy": mat.source_of("Fy"), "F_b/F_y": "traditional allowable 0.6 Fy for plates "
               "(common practice)" + ("" if cap >= 0.6 else f", limited by lateral torsional "
                                      f"buckling, AISC 360-16 {governs}") + f"; {bracing.note}"}
        eq = "f_b = n M c / I_t <= min(0.6 Fy, (M_n / S) / Omega_b)"
    h, t = max(ply.height, ply.width), min(ply.height, ply.width)
    kv_limit = 1.10 * math.sqrt(5.34 * mat.E / Fy)
    cv1 = 1.0 if h / t <= kv_limit else kv_limit / (h / t)
    fv = {"0.6": 0.6, "C_v1": cv1}
    gv = {"Omega_v": 1.67}
    sv = {"Fy": mat.source_of("Fy"), "0.6": "AISC 360-16 G2.1 (from memory)",
          "C_v1": "AISC 360-16 G2.1(b), k_v = 5.34 (from memory)",
          "Omega_v": "AISC 360-16 G1 (from memory)"}
    # the plate's share of the shear grows as the timber creeps: the larger of the two
    # sections' shares, on the whole shear (conservative: the sustained part is less)
    tau_i, tau_c = float(tau_unit[i]), float(unit_shear_stress(beam.creep_section)[i])
    tau_plate, tau_state = (tau_i, "instantaneous") if tau_i >= tau_c else (
        tau_c, "with the timber's creep moduli on the whole shear (conservative)")
    for combo in beam.strength():
        ds = ply_demands(section, beam, combo, i, design)
        if not ds:
            continue
        if design.steel_rule == "AISC-F11":
            both = _plate_interaction(i, section, design, ds, allow, bracing, combo.name,
                                      system)
            if both is not None:
                out.append(both)
        d = max(ds, key=lambda q: q.stress)
        demand, x = d.stress, d.x
        out.append(Check(
            id="bending",
            ply=ply.name,
            combination=combo.name,
            demand=demand,
            capacity=capacity_from(Fy, f, g),
            quantity="stress",
            reference=("Fy", Fy),
            factors=f,
            partial_factors=g,
            sources=src,
            equation=eq,
            location="",
            x=x,
            notes=(f"Plate {lb_text}: {bracing.note}; demand {d.state}.",)))
        out.append(Check(
            id="shear",
            ply=ply.name,
            combination=combo.name,
            demand=tau_plate * combo.extremes.V_max_abs,
            capacity=capacity_from(Fy, fv, gv),
            quantity="stress",
            reference=("Fy", Fy),
            factors=fv,
            partial_factors=gv,
            sources=sv,
            equation="f_v (peak) <= 0.6 Fy C_v1 / Omega_v",
            location="",
            x=combo.extremes.x_V_max_abs,
            notes=("Peak shear stress compared with the average-stress rule "
                   f"(conservative); {tau_state}.",)))
    return out


def _plate_interaction(i: int, section: Section, design: DesignSpec,
                       ds: Sequence[PlyDemand], F_cb: float, bracing: PlateBracing,
                       combination: str, system: str) -> Check | None:
    """AISC 360-16 H2-1 (from memory) for a plate whose centroid is off the neutral
    axis, so that it carries axial force with its own bending (a cover plate, a flitch
    plate set high or low): |f_ra| / F_ca + f_rb / F_cb <= 1.0, with F_cb the plate's
    F11 allowable bending stress (M_n / S) / Omega_b and F_ca = F_y / Omega_t (tension,
    D2(a)) or F_cr / Omega_c (compression, E3, about the plate's thickness, r = t /
    sqrt(12)): a plate on one face or lying flat buckles between its fasteners (L_c the
    plate's unbraced length, or for a flat plate the spacing of the fasteners along it),
    one between two timbers is braced by them. None where the plate carries no axial
    force (its centroid on the neutral axis): its bending check is then the whole story.
    """
    ply, mat = section.plies[i], section.materials[i]
    Fy = float(mat.value("Fy") or 0.0)
    best: tuple[float, PlyDemand, float, str] | None = None
    for d in ds:
        if abs(d.axial) <= 1e-9 * max(d.stress, 1.0):
            continue
        if d.axial > 0:
            F_ca, how = Fy / aisc.OMEGA_T, "F_ca = F_y / Omega_t (D2(a))"
        else:
            t = min(ply.width, ply.height)
            L_c, why = bracing.L_b, "the plate's unbraced length"
            if ply.width >= ply.height:  # flat: between the fasteners along it
                given = design.connector.spacing or design.bolt.spacing
                L_c = given or 24 * INCH
                why = ("the spacing of its fasteners" if given else "no fastener spacing "
                       "given: the largest stock spacing")
            F_cr, eq = aisc.compression_Fcr(Fy, mat.E, L_c, t / math.sqrt(12.0))
            F_ca = F_cr / aisc.OMEGA_C
            how = (f"F_ca = F_cr / Omega_c, F_cr = {fmt(F_cr, 'stress', system)} by {eq}"
                   + ("" if L_c is None else
                      f", L_c = {fmt(L_c, 'length', system)} ({why}), r = t / sqrt(12)"))
        ratio = abs(d.axial) / F_ca + d.bending / F_cb
        if best is None or ratio > best[0]:
            best = (ratio, d, F_ca, how)
    if best is None:
        return None
    ratio, d, F_ca, how = best
    kind = "tension" if d.axial > 0 else "compression"
    eq = "|f_ra| / F_ca + f_rb / F_cb <= 1.0 (AISC 360-16 H2-1)"
    return Check(
        id="tension-bending" if d.axial > 0 else "compression-bending", ply=ply.name,
        combination=combination, demand=ratio, capacity=1.0, quantity="ratio",
        reference=("interaction", 1.0), factors={}, partial_factors={},
        sources={"interaction": "AISC 360-16 H2-1 (from memory)",
                 "F_ca": ("AISC 360-16 D2(a), Omega_t = 1.67" if d.axial > 0 else
                          "AISC 360-16 E3, Omega_c = 1.67") + " (from memory)",
                 "F_cb": "AISC 360-16 F11, Omega_b = 1.67 (from memory)"},
        equation=eq, location="plate off the neutral axis", x=d.x,
        notes=(f"Axial {kind} f_ra = {fmt(abs(d.axial), 'stress', system)} with its own "
               f"bending f_rb = {fmt(d.bending, 'stress', system)}; {how} = "
               f"{fmt(F_ca, 'stress', system)}, F_cb = {fmt(F_cb, 'stress', system)}; "
               f"{bracing.note}; {d.state}.",))


def _deflections(beam: BeamResult, section: Section, design: DesignSpec) -> list[Check]:
    live, total, long_term = design.deflection_limits()
    src = {"limit": "IBC 2018 Table 1604.3 (from memory) or the user's choice"}
    out: list[Check] = []
    EI = section.EI
    for case in ("L", "Lr", "S", "W"):
        if case in beam.cases:
            out += deflection_checks("deflection-live", case, beam.extremes_of(case), beam,
                                     EI, live,
                                     src, ("Immediate deflection under the variable case "
                                           "alone.",))
    for combo in beam.serviceability():
        out += deflection_checks("deflection-total", combo.name, combo.extremes, beam, EI,
                                 total, src, ("Immediate deflection of the whole combination.",))
        out += deflection_checks(
            "deflection-long-term", combo.name, combo.total, beam, EI, long_term,
            {**src, "K_cr": "NDS 2018 3.5.2 (from memory)"},
            (f"K_cr = {beam.creep_factor:g}: sustained part on the section with timber moduli "
             "divided by K_cr, plus the short-term part.",))
    return out


def _bolts(section: Section, beam: BeamResult, design: DesignSpec, system: str,
           warnings: list[Problem], gross: list[Check],
           layouts: list[PlateLayout] | None = None, segment: bool = False) -> list[Check]:
    """The bolt checks of every plate; each plate's layout appended to ``layouts``
    (``segment``: only the timbers' net-section shear, with the values' warnings).
    """
    out: list[Check] = []
    joints = side_by_side_joints(section)
    for jt in joints:
        value = bolt_value(section, design, jt, system, warnings, joints)
        if value is not None:
            out += valued_plate_checks(section, beam, design, jt, value, system, gross,
                                       layouts, segment, warnings)
    return out


def bolt_value(section: Section, design: DesignSpec, jt: Joint, system: str,
               warnings: list[Problem], joints: list[Joint] | None = None) -> BoltValue | None:
    """Z of one bolt of a plate (NDS 2018 12.3.1) with its factors; None, with a named
    missing check, where the steel has no Fu or the timbers no G. ``joints``: the
    section's side-by-side joints (found here when not given).
    """
    if joints is None:
        joints = side_by_side_joints(section)
    bolt = design.bolt
    D = bolt.diameter
    steel = section.plies[jt.steel]
    Fu = section.materials[jt.steel].value("Fu")
    timbers = [j for j in jt.timbers if section.materials[j].value("G") is not None]
    if Fu is None or len(timbers) < len(jt.timbers):
        what = (f'steel "{section.materials[jt.steel].id}" has no Fu' if Fu is None else
                "a timber beside it has no specific gravity G")
        warnings.append(MissingCheck(f"plies[{jt.steel}].material", f"{what}: the bolts of "
                                     f"{steel.name} are not checked (NDS 2018 12.3.1 needs "
                                     "both)"))
        return None
    G = min(section.materials[j].value("G") or 0.5 for j in timbers)
    Fe_w = Fe_perpendicular(G, D)
    Fe_s = Fe_steel(Fu)
    thick = [_available_thickness(section, j, joints) for j in timbers]
    if jt.steel_is_main:
        modes = nds_double_shear(D, steel.width, Fe_s, min(thick), Fe_w, bolt.Fyb, 90.0)
        kind = "double shear, wood-steel-wood"
    else:
        modes = nds_single_shear(D, thick[0], Fe_w, steel.width, Fe_s, bolt.Fyb, 90.0)
        kind = "single shear, steel on one face"
    wood = section.materials[timbers[0]]
    base = {"C_M": C_M_bolts(design.wet_service, design.fabricated_wet, bolt.row_count == 1),
            "C_t": 1.0 if design.temperature == "normal" else (
                (0.7 if design.wet_service else 0.8) if design.temperature == "up-to-125F"
                else (0.5 if design.wet_service else 0.7)),
            "C_g": 1.0, "C_Delta": 1.0}
    mode_text = ", ".join(f"{m} {fmt(v, 'force', system)}" for m, v in modes.modes.items())
    src = {"Z": f"NDS 2018 12.3.1 yield limit equations, {kind}; G = {G:g} "
           f"({wood.source_of('G')}); Fyb from the user; Fe steel = 1.5 Fu (from memory)",
           "C_D": S_TABLE, "C_M": "NDS 2018 Table 11.3.3 (from memory): 0.7 wet in service, 0.4 "
           "fabricated wet and used dry (not for a single row), else 1.0",
           "C_t": "NDS 2018 Table 11.3.4 (from memory)",
           "C_g": "group action taken as 1.0 (bolts staggered, few per row)",
           "C_Delta": "full edge, end and spacing distances assumed (see notes)"}
    return BoltValue(
        reference=("Z", modes.value),
        factors=lambda combo: {"C_D": nds.C_D(combo.duration), **base},
        partial={}, sources=src,
        notes=(f"Yield modes: {mode_text}; governing mode {modes.governing}.",
               *EDGE_END_REMINDERS),
        capacity_symbol="Z'")


def _available_thickness(section: Section, j: int, joints: list[Joint]) -> float:
    """A timber's thickness available to one plate: half where plates are on both of its
    faces (NDS 12.3.7 multiple shear, each plane taking half the member, from memory).
    ``joints``: the section's side-by-side joints.
    """
    width = section.plies[j].width
    return width / 2 if plated_both_faces(joints, j) else width
