"""Floor vibration checks (serviceability), made when the design has a "vibration" object.

EU basis: EN 1995-1-1 7.3.3 for residential floors (from memory): the fundamental
frequency f_1 > 8 Hz (7.3.3(1)), the deflection per unit point load w/F <= a (7.3) and
the unit impulse velocity response v <= b^(f_1 zeta - 1) (7.4), with f_1 from (7.5),
v from (7.6) and n_40 from (7.7). US basis: a joist-floor criterion of common practice
(core.codes.floor_vibration_us): a minimum frequency and a deflection limit under a
concentrated load.

The floor is the member repeated at its spacing s: (EI)_l = EI / s, with EI the
member's short-term (mean modulus) bending stiffness, and m = mu / s with mu the mass
per length of the permanent loads exactly as case D holds them: the member's own mass
(where the beam's self-weight is on) plus every D load, area (times its tributary
width) or line, that covers the whole member, divided by g. The point load of the
stiffness criteria acts on the member alone at midspan (F l^3 / 48 EI): no lateral
distribution to neighbouring joists, which is conservative.

A check that cannot be made by the method (a layout other than one simple span without
overhangs, D loads that are not uniform over the member, inputs missing) is left out
with a warning whose path is exactly "design.vibration" naming the missing check ids;
:func:`missing_vibration_ids` lists them for a verdict.
"""

from __future__ import annotations

from dataclasses import dataclass

from ..actions.analysis import BeamResult
from ..codes import en1995 as ec5
from ..codes import floor_vibration_us as usv
from ..model.constants import GRAVITY
from ..model.design import DesignSpec, VibrationSpec
from ..model.errors import MissingCheck, Problem
from ..model.project import Project
from ..model.units import fmt, sig
from ..section.transformed import Section
from .check import Check, CheckId

#: The path of every warning about a vibration check that is not made.
WARNING_PATH = "design.vibration"
EU_IDS: tuple[CheckId, ...] = ("vibration-frequency", "vibration-stiffness",
                               "vibration-velocity")
US_IDS: tuple[CheckId, ...] = ("vibration-frequency", "vibration-stiffness")
S_EN = "EN 1995-1-1 7.3.3"
S_COMMON = "common practice for wood joist floors (no code clause; from memory)"
NO_DISTRIBUTION = ("The point load acts on the member alone (F l^3 / 48 EI, simple span): "
                   "no lateral distribution to neighbouring joists, which is conservative.")


def expected_vibration_ids(design: DesignSpec) -> tuple[CheckId, ...]:
    """The vibration check ids a design asks for (none without a "vibration" object)."""
    if design.vibration is None:
        return ()
    return US_IDS if design.us else EU_IDS


def missing_vibration_ids(design: DesignSpec, checks: tuple[Check, ...] | list[Check]
                          ) -> tuple[CheckId, ...]:
    """The vibration checks the design asks for that are not among ``checks``."""
    present = {c.id for c in checks}
    return tuple(i for i in expected_vibration_ids(design) if i not in present)


@dataclass(frozen=True)
class FloorMass:
    """The permanent mass of the floor strip carried by the member.

    Attributes:
        per_length: mu, kg/m.
        per_area: m = mu / s, kg/m^2.
        parts: what mu includes, as text.

    """

    per_length: float
    per_area: float
    parts: tuple[str, ...]


def floor_mass(beam: BeamResult, spacing: float, system: str
               ) -> tuple[FloorMass | None, str]:
    """The permanent mass per length and per area, or None with the reason it cannot be
    found by this method (D loads that do not cover the member uniformly; no mass).
    """
    length = beam.spec.layout.length
    tol = 1e-9 * max(length, 1.0)
    mu = beam.self_weight_line / GRAVITY
    parts = [f"member's own mass {fmt(mu, 'mass_per_length', system)}"
             if beam.spec.self_weight else "member's own mass not counted (beam self-weight "
             "is off, as in case D)"]
    uneven = []
    for k, ld in enumerate(beam.spec.loads):
        if ld.case != "D":
            continue
        partial = ((ld.start is not None and ld.start > tol)
                   or (ld.end is not None and ld.end < length - tol))
        if ld.type == "point" or partial:
            uneven.append(f"beam.loads[{k}]")
            continue
        mu += ld.line_value / GRAVITY
        parts.append(f"D {ld.type} load beam.loads[{k}] "
                     f"{fmt(ld.line_value, 'line_load', system)} / g")
    if uneven:
        return None, ("the permanent (D) loads " + ", ".join(uneven) + " do not cover the "
                      "member uniformly, and the method needs a uniform floor mass")
    if mu <= 0:
        return None, "the floor has no permanent mass (no self-weight and no D load)"
    return FloorMass(mu, mu / spacing, tuple(parts)), ""


def vibration_checks(project: Project, section: Section, beam: BeamResult,
                     design: DesignSpec, warnings: list[Problem]) -> tuple[Check, ...]:
    """The floor vibration checks of the design's basis (none without "vibration")."""
    spec = design.vibration
    if spec is None:
        return ()
    ids = expected_vibration_ids(design)
    lay = beam.spec.layout
    if (lay.supports != "simple" or len(lay.spans) != 1 or lay.overhang_left > 0
            or lay.overhang_right > 0):
        warnings.append(MissingCheck(WARNING_PATH, f"{', '.join(ids)} cannot be made by this "
                                "method: the member is not a single simple span without "
                                "overhangs (the floor vibration formulas are for one simply "
                                "supported span); these checks are missing"))
        return ()
    system = project.display_units
    mass, reason = floor_mass(beam, spec.spacing, system)
    if mass is None:
        which = ("vibration-frequency cannot be made", "this check is") if design.us else (
            "vibration-frequency and vibration-velocity cannot be made", "these checks are")
        warnings.append(MissingCheck(WARNING_PATH, f"{which[0]}: {reason}; {which[1]} missing"))
    if design.us:
        return _us(spec, section.EI, lay.spans[0], mass, system)
    return _eu(spec, section.EI, lay.spans[0], mass, system, warnings)


def _inputs(spec: VibrationSpec, EI: float, span: float, mass: FloorMass | None,
            system: str) -> tuple[str, ...]:
    lines = [f"Span l = {fmt(span, 'span', system)}; member EI = {fmt(EI, 'EI', system)} "
             f"(mean moduli, short term); joist spacing s = {fmt(spec.spacing, 'length', system)}; "
             f"(EI)_l = EI / s = {fmt(EI / spec.spacing, 'EI_per_width', system)}."]
    if mass is not None:
        lines.append(f"Permanent mass mu = {fmt(mass.per_length, 'mass_per_length', system)} ("
                     + "; ".join(mass.parts) + f"); m = mu / s = {sig(mass.per_area)} kg/m^2.")
    return tuple(lines)


def _eu(spec: VibrationSpec, EI: float, span: float, mass: FloorMass | None, system: str,
        warnings: list[Problem]) -> tuple[Check, ...]:
    notes = _inputs(spec, EI, span, mass, system)
    x = span / 2
    out = []
    a = spec.a if spec.a is not None else ec5.A_DEFAULT
    a_src = ("the user's value (design.vibration.a_mm_per_kN)" if spec.a is not None else
             "default 1.5 mm/kN: within the recommended range of EN 1995-1-1 Figure 7.2, "
             "national-annex style value recalled from memory; national annexes set their own")
    f1 = None
    if mass is not None:
        EI_l = EI / spec.spacing
        f1 = ec5.f_1(span, EI_l, mass.per_area)
        out.append(Check(
            id="vibration-frequency", ply=None, combination="permanent mass (D)",
            demand=ec5.F_1_LIMIT, capacity=f1, quantity="frequency", reference=("f_1", f1),
            sources={"f_1": f"{S_EN}(3), Eq. (7.5) (from memory)",
                     "8 Hz": f"{S_EN}(1): at or below 8 Hz a special investigation is "
                     "needed (from memory)"},
            equation="f_1 = (pi / (2 l^2)) sqrt((EI)_l / m) > 8 Hz; ratio = 8 Hz / f_1",
            location="span 1", x=x,
            notes=(*notes, f"f_1 = (pi / (2 x {span:.4g}^2)) sqrt({EI_l:.5g} / "
                   f"{mass.per_area:.5g}) = {f1:.4g} Hz.")))
    wF = ec5.w_over_F(span, EI)
    out.append(Check(
        id="vibration-stiffness", ply=None, combination="F = 1 kN at midspan",
        demand=wF, capacity=a, quantity="compliance", reference=("a", a),
        sources={"a": a_src, "w/F": f"{S_EN}(2), Eq. (7.3) (from memory); l^3 / (48 EI) "
                 "beam formula"},
        equation="w / F = l^3 / (48 EI) <= a",
        location="span 1", x=x,
        notes=(*notes, NO_DISTRIBUTION, f"w under F = 1 kN: "
               f"{fmt(wF * ec5.F_POINT, 'deflection', system)}. The criterion applies where "
               "f_1 > 8 Hz.")))
    missing = [k for k in ("floor_width", "transverse_EI") if getattr(spec, k) is None]
    if missing:
        warnings.append(MissingCheck(WARNING_PATH, "vibration-velocity is not made: "
                                + " and ".join(missing) + " not given (the floor's width "
                                "across the joists and its stiffness across them per metre); "
                                "this check is missing"))
    if f1 is None or mass is None or spec.floor_width is None or spec.transverse_EI is None:
        return tuple(out)
    out.append(_velocity(spec, spec.floor_width, spec.transverse_EI, EI / spec.spacing,
                         span, f1, mass, notes))
    return tuple(out)


def _velocity(spec: VibrationSpec, width: float, EI_b: float, EI_l: float, span: float,
              f1: float, mass: FloorMass, notes: tuple[str, ...]) -> Check:
    b = spec.b if spec.b is not None else ec5.B_DEFAULT
    zeta = spec.damping
    n40 = ec5.n_40(f1, width, span, EI_l, EI_b)
    v = ec5.v_unit_impulse(n40, mass.per_area, width, span)
    v_lim = ec5.v_limit(b, f1, zeta)
    b_src = ("the user's value (design.vibration.b)" if spec.b is not None else
             "default 100: the value paired with a = 1.5 mm/kN in EN 1995-1-1 Figure 7.2, "
             "national-annex style value recalled from memory; national annexes set their own")
    n40_text = ("f_1 >= 40 Hz: no mode below 40 Hz, n_40 = 0" if n40 == 0 else
                f"n_40 = (((40 / {f1:.4g})^2 - 1) ({width:.4g} / {span:.4g})^4 {EI_l:.5g} / "
                f"{EI_b:.5g})^0.25 = {n40:.4g}")
    return Check(
        id="vibration-velocity", ply=None, combination="unit impulse (1 N s)",
        demand=v, capacity=v_lim, quantity="velocity_response",
        reference=("b^(f_1 zeta - 1)", v_lim),
        sources={"v": f"{S_EN}(5), Eq. (7.6) (from memory)",
                 "n_40": f"{S_EN}(5), Eq. (7.7) (from memory)",
                 "b^(f_1 zeta - 1)": f"{S_EN}(2), Eq. (7.4) (from memory)", "b": b_src,
                 "zeta": "EN 1995-1-1 7.3.1(5): 0.01 unless other values are proven "
                 "(from memory)" if zeta == ec5.ZETA_DEFAULT else "the user's value"},
        equation="v = 4 (0.4 + 0.6 n_40) / (m b l + 200) <= b^(f_1 zeta - 1)",
        location="span 1", x=span / 2,
        notes=(*notes, f"Floor width b = {width:.4g} m; (EI)_b = {EI_b:.5g} N m^2/m; "
               f"zeta = {zeta:g}; b = {b:g}.", n40_text + ".",
               f"v = 4 (0.4 + 0.6 x {n40:.4g}) / ({mass.per_area:.5g} x {width:.4g} x "
               f"{span:.4g} + 200) = {v:.4g} m/(N s^2); limit {b:g}^({f1:.4g} x {zeta:g} - 1)"
               f" = {v_lim:.4g} m/(N s^2).", "The criterion applies where f_1 > 8 Hz."))


def _us(spec: VibrationSpec, EI: float, span: float, mass: FloorMass | None,
        system: str) -> tuple[Check, ...]:
    notes = (*_inputs(spec, EI, span, mass, system),
             "Common practice for wood joist floors, not a code clause: the limits are the "
             "user's to change (design.vibration frequency_min_Hz, point_load, "
             "point_deflection_limit).")
    out = []
    x = span / 2
    if mass is not None:
        f_min = spec.frequency_min if spec.frequency_min is not None else \
            usv.FREQUENCY_MIN_DEFAULT
        fn = usv.f_n(span, EI, mass.per_length)
        out.append(Check(
            id="vibration-frequency", ply=None, combination="permanent mass (D)",
            demand=f_min, capacity=fn, quantity="frequency", reference=("f_n", fn),
            sources={"f_n": "simply supported beam frequency (handbook formula)",
                     "f_min": S_COMMON if spec.frequency_min is None else
                     "the user's value (design.vibration.frequency_min_Hz)"},
            equation=f"f_n = (pi / 2) sqrt(EI / (mu L^4)) >= f_min = {f_min:g} Hz; "
                     "ratio = f_min / f_n",
            location="span 1", x=x,
            notes=(*notes, f"f_n = (pi / 2) sqrt({EI:.5g} / ({mass.per_length:.5g} x "
                   f"{span:.4g}^4)) = {fn:.4g} Hz.")))
    P = spec.point_load if spec.point_load is not None else usv.POINT_LOAD_DEFAULT
    limit = (spec.point_deflection_limit if spec.point_deflection_limit is not None
             else usv.POINT_DEFLECTION_DEFAULT)
    w = usv.point_deflection(span, EI, P)
    out.append(Check(
        id="vibration-stiffness", ply=None,
        combination=f"P = {fmt(P, 'force', system)} at midspan",
        demand=w, capacity=limit, quantity="deflection", reference=("limit", limit),
        sources={"limit": S_COMMON if spec.point_deflection_limit is None else
                 "the user's value (design.vibration.point_deflection_limit)",
                 "P": S_COMMON if spec.point_load is None else
                 "the user's value (design.vibration.point_load)",
                 "w": "P L^3 / (48 EI) beam formula"},
        equation="w = P L^3 / (48 EI) <= limit",
        location="span 1", x=x, notes=(*notes, NO_DISTRIBUTION)))
    return tuple(out)
