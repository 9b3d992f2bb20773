"""EU limit states: timber per EN 1995-1-1:2004+A1:2008, steel per EN 1993-1-1:2005,
combinations per EN 1990 (recommended values, from memory; national annexes vary).

Design strengths f_d = k_mod k_h f_k / gamma_M (bending), k_mod k_cr f_v,k / gamma_M
(shear, the crack factor written as a factor on strength), k_c,90 f_c,90,k k_mod /
gamma_M (bearing); steel f_y / gamma_M0 (elastic, 6.2.1(5)) and f_y / (sqrt(3) gamma_M0)
(shear, 6.2.6). Final deflection (2.2.3): w_fin = w_inst,char + creep increment of the
quasi-permanent load, with timber moduli divided by (1 + k_def) for the latter.
"""

from __future__ import annotations

import math

from ..actions.analysis import BeamResult
from ..codes import en1993
from ..codes import en1995 as ec5
from ..codes.dowels import (
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
)
from ..model.combination import eu_duration as _eu_duration
from ..model.design import DesignSpec
from ..model.errors import MissingCheck, Problem
from ..model.project import Project
from ..model.units import fmt
from ..section.transformed import Section
from .bearing import eu_bearing
from .bolt_checks import BoltValue, PlateLayout, plate_layout, valued_plate_checks
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
    unserviced_cases,
    uplift_checks,
)
from .demands import eu_uls_section, ply_demands
from .eu_timber import bending_check as eu_bending
from .eu_timber import interaction_check as eu_interaction
from .net_section import hole_diameter
from .plates import eu_plate_chi, plate_bracing
from .transfer import support_shear_checks

S_KMOD = "EN 1995-1-1 Table 3.1 (from memory)"
S_GM = "EN 1995-1-1 Table 2.3 (from memory)"


def _shear_buckling(i: int, section: Section, fy: float, warnings: list[Problem]) -> bool:
    """EN 1993-1-1 6.2.6(6) (from memory): an unstiffened web with h_w / t > 72 eps / eta
    (eps = sqrt(235 MPa / f_y), eta = 1.0, conservative) must be checked for shear
    buckling to EN 1993-1-5, which Plystack does not do: True (the reason among
    ``warnings``, so the verdict is INCOMPLETE) for such an edgewise plate.
    """
    ply = section.plies[i]
    if ply.width >= ply.height:  # flat: its depth is its thickness, no web to buckle
        return False
    limit = 72 * math.sqrt(235e6 / fy) / 1.0
    if ply.height / ply.width <= limit:
        return False
    warnings.append(MissingCheck(
        f"plies[{i}].width", f'"{ply.name}" is a slender web, h_w / t = '
        f"{ply.height / ply.width:.1f} > 72 eps / eta = {limit:.1f} (EN 1993-1-1 6.2.6(6)): "
        "its shear resistance needs the shear buckling check of EN 1993-1-5, which "
        "Plystack does not make; use a thicker plate or check it by hand"))
    return True


def eu_checks(project: Project, section: Section, beam: BeamResult,
              design: DesignSpec, layouts: list[PlateLayout] | None = None,
              segment: bool = False) -> tuple[tuple[Check, ...], list[Problem]]:
    """Every EU-LSD check of the project (``layouts``, where given, receives the bolt
    layout of every plate whose bolts can be valued; ``segment``: a segment's run, where
    of the bolt checks only the timbers' net-section shear is made).
    """
    checks: list[Check] = []
    warnings: list[Problem] = []
    uls = list(beam.strength())
    if not uls:
        warnings.append(MissingCheck("beam.combinations", 'no ULS combination: use "EN1990" for '
                                "the EU basis; strength checks are skipped"))
    warnings += uncombined_cases(beam)
    sc = design.service_class
    tau_unit = unit_shear_stress(section)
    width = member_width(section)
    joints: list[Joint] | None = None  # found at the first steel ply
    for i, (ply, mat) in enumerate(zip(section.plies, section.materials, strict=True)):
        if section.area[i] <= 0 or not section.is_connected(i):
            continue
        if mat.kind == "timber":
            fm, fv = mat.value("fm_k"), mat.value("fv_k")
            if fm is None or fv is None:
                warnings.append(MissingCheck(f"plies[{i}].material", f'"{mat.id}" has no EN '
                                        "characteristic values (fm_k, fv_k); its timber checks "
                                        "are skipped on the EU basis"))
                continue
            gm = ec5.gamma_M(mat.product)
            g = {"gamma_M": gm}
            for combo in uls:
                km = ec5.k_mod(_eu_duration(combo.duration), sc)
                bend = eu_bending(i, section, beam, combo, design, width, warnings)
                if bend is not None:
                    checks.append(bend)
                inter = eu_interaction(i, section, beam, combo, design, warnings)
                if inter is not None:
                    checks.append(inter)
                fvf = {"k_mod": km, "k_cr": ec5.k_cr(mat.product)}
                sv = {"fv_k": mat.source_of("fv_k"), "k_mod": S_KMOD, "gamma_M": S_GM,
                      "k_cr": "EN 1995-1-1 6.1.7(2), b_ef = k_cr b (from memory)"}
                apply_overrides(fvf, sv, design, ply.name)
                checks.append(sh := Check(
                    id="shear",
                    ply=ply.name,
                    combination=combo.name,
                    demand=float(tau_unit[i]) * combo.extremes.V_max_abs,
                    capacity=capacity_from(fv, fvf, g),
                    quantity="stress",
                    reference=("fv_k", fv),
                    factors=fvf,
                    partial_factors=g,
                    sources=sv,
                    equation="tau_d <= k_mod k_cr f_v,k / gamma_M",
                    location="",
                    x=combo.extremes.x_V_max_abs))
                checks += support_shear_checks(section, beam, combo, design, i, sh,
                                               project.display_units)
        elif mat.kind == "steel":
            fy = mat.value("Fy")
            if fy is None:
                warnings.append(no_yield_strength(i, section))
                continue
            g0 = {"gamma_M0": ec5.GAMMA_M0}
            if joints is None:
                joints = side_by_side_joints(section)
            bracing = plate_bracing(section, i, design, joints)
            chi, lam = eu_plate_chi(fy, mat.E, ply.height, ply.width, bracing.L_b)
            buckles = _shear_buckling(i, section, fy, warnings)
            fb_f = {"chi_LT": chi}
            gb = {"gamma_M1": en1993.GAMMA_M1} if bracing.L_b is not None else g0
            for combo in uls:
                final = eu_uls_section(section, beam, combo, design)
                ds = ply_demands(section, beam, combo, i, design, eu_final=final)
                if not ds:
                    continue
                d = max(ds, key=lambda q: q.stress)
                checks.append(Check(
                    id="bending", ply=ply.name, combination=combo.name, demand=d.stress,
                    capacity=capacity_from(fy, fb_f, gb), quantity="stress",
                    reference=("f_y", fy), factors=fb_f, partial_factors=gb,
                    sources={"f_y": mat.source_of("Fy"),
                             "gamma_M0": "EN 1993-1-1 6.1 (from memory)",
                             "chi_LT": "EN 1993-1-1 6.3.2.2, curve d, C1 = 1.0, "
                             f"lambda_LT = {lam:.3f}; {bracing.note} (from memory)"},
                    equation="sigma_Ed <= chi_LT f_y / gamma_M (EN 1993-1-1 6.2.1(5), "
                    "6.3.2, elastic)",
                    location="" if bracing.L_b is None else
                    f"L_b = {fmt(bracing.L_b, 'span', project.display_units)}",
                    x=d.x, notes=(f"{bracing.note}; demand {d.state} (final: timber E_mean / "
                                  "(1 + psi2 k_def), EN 1995-1-1 2.3.2.2(2)).",)))
                fs = {"1/sqrt(3)": 1 / math.sqrt(3)}
                if buckles:
                    continue
                # the plate's share with the final moduli where it is larger (EN 1995-1-1
                # 2.3.2.2(2)), as for its bending
                tau_p = max(float(tau_unit[i]), float(unit_shear_stress(final)[i]))
                checks.append(Check(
                    id="shear",
                    ply=ply.name,
                    combination=combo.name,
                    demand=tau_p * combo.extremes.V_max_abs,
                    capacity=capacity_from(fy, fs, g0),
                    quantity="stress",
                    reference=("f_y", fy),
                    factors=fs,
                    partial_factors=g0,
                    sources={"f_y": mat.source_of("Fy"), "1/sqrt(3)": "EN 1993-1-1 6.2.6(5) (from "
                     "memory)", "gamma_M0": "EN 1993-1-1 6.1 (from memory)"},
                    equation="tau_Ed <= f_y / (sqrt(3) gamma_M0)",
                    location="",
                    x=combo.extremes.x_V_max_abs,
                    notes=("Peak shear stress, the larger of the instantaneous and final "
                           "(timber E_mean / (1 + psi2 k_def)) shares.",)))
        else:
            warnings.append(MissingCheck(f"plies[{i}].material", f'"{mat.id}" is neither '
                                         "timber nor steel: its stresses are reported but not "
                                         "checked"))
    checks += eu_bearing(section, beam, design, uls, warnings)
    if not segment:  # the member's: a segment keeps only stresses, and the one warning
        # of the deflections (of the combinations' list alone) is the member run's too
        checks += _deflections(section, beam, design, warnings)
    checks += _bolts(section, beam, design, uls, project.display_units, warnings, checks,
                     layouts, segment)
    checks += connector_checks(section, beam, design, project.display_units, warnings)
    if not segment:
        checks += uplift_checks(beam, project.display_units)
    warnings += pattern_notes(beam)
    return tuple(checks), warnings


def _deflections(section: Section, beam: BeamResult, design: DesignSpec,
                 warnings: list[Problem]) -> list[Check]:
    """w_inst of each characteristic combination and of its variable actions alone, and
    w_fin by EN 1995-1-1 2.2.3(5) with psi2 (the same number as the creep block of the
    JSON output and the sheet), all enveloped over the pattern arrangements.
    """
    live, total, fin = design.deflection_limits()
    EI = section.EI
    src = {"limit": "EN 1995-1-1 7.2 Table 7.2 range, the user's choice (national annexes "
           "vary)"}
    chars = [c for c in beam.combinations if c.combination.kind == "SLS-characteristic"]
    warnings += unserviced_cases(beam, chars)
    if isinstance(beam.spec.combinations, tuple) and not any(
            c.combination.kind == "SLS-quasi-permanent" for c in beam.combinations):
        warnings.append(Problem("beam.combinations", "no SLS-quasi-permanent combination in "
                                "the list: creep (w_fin) uses psi2 of design.psi, else of "
                                "EN 1990 Table A1.1"))
    out: list[Check] = []
    for combo in chars:
        out += deflection_checks("deflection-total", combo.name, combo.extremes, beam, EI, total,
                                 src, ("w_inst of the characteristic combination.",))
        if combo.variable_only is not None and any(
                f for c, f in combo.combination.factors.items() if c != "D"):
            out += deflection_checks("deflection-live", combo.name, combo.variable_only, beam,
                                     EI, live, src, ("w_inst of the variable actions alone.",))
        psi2 = ", ".join(f"{c} {v:g}" for c, v in combo.sustained_factors.items() if c != "D")
        out += deflection_checks(
            "deflection-long-term", combo.name, combo.total, beam, EI, fin,
            {**src, "k_def": "EN 1995-1-1 Table 3.2 (from memory)",
             "psi2": "EN 1990 Table A1.1 or design.psi (from memory)"},
            (f"w_fin = w_inst + creep of G and psi2 Q (EN 1995-1-1 2.2.3(5)); timber moduli / "
             f"(1 + k_def), 1 + k_def = {beam.creep_factor:g}; psi2: {psi2 or 'none'}.",))
    return out


def _bolts(section: Section, beam: BeamResult, design: DesignSpec, uls: list,  # type: ignore[type-arg]
           system: str, warnings: list[Problem], gross: list[Check],
           layouts: list[PlateLayout] | None = None, segment: bool = False) -> list[Check]:
    """The bolt checks of every plate; each plate's layout appended to ``layouts`` (without
    a ULS combination there are no checks, and the layout is placed over every
    combination, as the plate drawings have always had it). ``segment``: only the
    timbers' net-section shear, with the values' warnings.
    """
    if not uls:
        if layouts is not None:
            layouts += _layouts_without_checks(section, beam, design, system)
        return []
    out: list[Check] = []
    for jt in side_by_side_joints(section):
        value = bolt_value(section, design, jt, system, warnings)
        if value is not None:
            out += valued_plate_checks(section, beam, design, jt, value, system, gross,
                                       layouts, segment, warnings)
    return out


def _layouts_without_checks(section: Section, beam: BeamResult, design: DesignSpec,
                            system: str) -> list[PlateLayout]:
    """The layout of every plate whose bolts can be valued, where no bolt is checked (no
    ULS combination: the warnings are the combinations' own, so the bolts' are dropped).
    """
    scratch: list[Problem] = []
    out = []
    for jt in side_by_side_joints(section):
        value = bolt_value(section, design, jt, system, scratch)
        if value is not None:
            out.append(PlateLayout(jt.steel, jt, plate_layout(
                section, beam, design, jt, value, beam.combinations, system)))
    return out


def _plate_modes(thin: tuple[str, YieldModes], thick: tuple[str, YieldModes], value: float,
                 rule: str, system: str, thickness: str) -> str:
    """The note on a plate's yield modes, thin and thick, and the value taken."""
    def modes(name: str, found: YieldModes) -> str:
        return f"{name}: " + ", ".join(f"({m}) {fmt(v, 'force', system)}"
                                       for m, v in found.modes.items())
    return (f"{modes(*thin)}; {modes(*thick)}; F_v,Rk {fmt(value, 'force', system)} "
            f"({rule}), {thickness}.")


def bolt_value(section: Section, design: DesignSpec, jt: Joint, system: str,
                warnings: list[Problem], joints: list[Joint] | None = None
                ) -> BoltValue | None:
    """F_v,Rk of one bolt of a plate (EN 1995-1-1 8.2.3) with k_mod and gamma_M; None,
    with a named missing check, where a timber beside it has no rho_k. ``joints``: the
    section's side-by-side joints (found here when not given): a timber with plates on
    both faces is the central member of a steel-timber-steel joint (8.12, 8.13) for a
    plate on one face, and gives each central plate beside it half its thickness (the
    first term of (8.12) and (8.13), 0.5 f_h t2 d per plane; 8.1.3(1) multiple shear).
    """
    if joints is None:
        joints = side_by_side_joints(section)
    bolt = design.bolt
    d = bolt.diameter
    steel = section.plies[jt.steel]
    rhos = [section.materials[j].value("rho_k") for j in jt.timbers]
    if any(r is None for r in rhos):
        warnings.append(MissingCheck(f"plies[{jt.steel}].material", "a timber beside "
                                     f"{steel.name} has no characteristic density rho_k: its "
                                     "bolts are not checked (EN 1995-1-1 8.5.1 needs it)"))
        return None
    My = en_M_y(bolt.fu, d)
    rho = min(r for r in rhos if r is not None)
    fh = en_f_h_k(rho, d, 90.0)
    t1 = min(section.plies[j].width / (2 if plated_both_faces(joints, j) else 1)
             for j in jt.timbers)
    if not jt.steel_is_main and plated_both_faces(joints, jt.timbers[0]):
        t2 = section.plies[jt.timbers[0]].width
        value, rule = en_steel_outer(fh, t2, d, My, steel.width, hole_diameter(design))
        kind = f"steel plates on both faces of the timber, per plane, {rule}"
        Fv_Rk = value
        mode_text = _plate_modes(
            ("thin plates (8.12)", en_thin_steel_outer(fh, t2, d, My)),
            ("thick plates (8.13)", en_thick_steel_outer(fh, t2, d, My)), value, rule,
            system, "t2 = timber thickness (a plate on each face: the timber is the central "
            "member)")
    elif jt.steel_is_main:
        modes = en_steel_centre(fh, t1, d, My)
        kind = "steel plate as central member, (8.11)"
        Fv_Rk = modes.value * 2
        mode_text = (", ".join(f"mode ({m}) {fmt(v, 'force', system)} per plane"
                               for m, v in modes.modes.items())
                     + f"; governing ({modes.governing}).")
    else:
        # t1 is the timber member's thickness; the plate's thickness sets the rule
        value, rule = en_steel_single(fh, t1, d, My, steel.width, hole_diameter(design))
        kind = f"steel plate on one face, single shear, {rule}"
        Fv_Rk = value
        mode_text = _plate_modes(
            ("thin plate (8.9)", en_thin_steel_single(fh, t1, d, My)),
            ("thick plate (8.10)", en_thick_steel_single(fh, t1, d, My)), value, rule,
            system, "t1 = timber thickness")
    sc = design.service_class
    return BoltValue(
        reference=("F_v,Rk", Fv_Rk),
        factors=lambda combo: {"k_mod": ec5.k_mod(_eu_duration(combo.duration), sc)},
        partial={"gamma_M": ec5.GAMMA_M_CONNECTION},
        sources={"F_v,Rk": f"EN 1995-1-1 8.2.3 {kind}, f_h,90,k (8.32)-(8.33), M_y,Rk (8.30), "
                 "rope effect left out (from memory)", "k_mod": S_KMOD,
                 "gamma_M": "EN 1995-1-1 Table 2.3, connections (from memory)"},
        notes=(mode_text, "Spacing and distances per EN 1995-1-1 Table 8.4 at 90 degrees "
               "(a1 >= 4d, a2 >= 4d, a3,t >= max(7d, 80 mm), loaded edge a4,t >= 4d: the "
               "bolt-spacing, bolt-end and bolt-edge checks).", EDGE_END_REMINDERS[1]),
        capacity_symbol="F_v,Rd")
