"""Parts shared by both design bases: demands from the section and beam, deflection
checks, joint layout of side-by-side plies, and stock fastener spacings.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

from ..actions.analysis import BeamResult, CombinationResult
from ..actions.beam import CaseSolution
from ..actions.extremes import Extremes, extremes
from ..model.constants import INCH
from ..model.design import MECHANICAL_CONNECTORS, DesignSpec
from ..model.errors import MissingCheck, Problem
from ..model.plies import Ply
from ..model.units import fmt
from ..section.gamma import PartialSection
from ..section.geometry import TOUCH_TOLERANCE, near_pairs
from ..section.transformed import Section
from .check import Check, CheckId, Fasteners
from .memo import of_list, once
from .slip import connector_check, slip_connector_checks

#: Stock spacings tried for fasteners, largest first, at most 24 in / 600 mm (common
#: practice: the 16 in and 24 in framing modules and their fractions; metric equivalents).
STOCK_SPACINGS_US = tuple(x * INCH for x in (24, 16, 12, 8, 6, 4, 3, 2))
STOCK_SPACINGS_SI = tuple(x / 1000 for x in (600, 400, 300, 200, 150, 100, 75, 50))


def bending_demand(section: Section, combo: CombinationResult, i: int) -> tuple[float, float]:
    """Largest |stress| at ply i's extreme fibres under the combination's extreme
    moments, and where it occurs. Returns (Pa, x).
    """
    ext = combo.extremes
    best = (0.0, ext.x_M_max)
    for m, x in ((ext.M_max, ext.x_M_max), (ext.M_min, ext.x_M_min)):
        top, bot = section.ply_extreme_stresses(m)
        s = max(abs(float(top[i])), abs(float(bot[i])))
        if s > best[0]:
            best = (s, x)
    return best


def no_yield_strength(i: int, section: Section) -> MissingCheck:
    """The reason a steel ply without a yield strength is not checked (its bending and
    shear need F_y).
    """
    mat = section.materials[i]
    return MissingCheck(f"materials.{mat.id}.Fy", f'is not given: the steel ply '
                        f'"{section.plies[i].name}" is not checked in bending or shear')


def unit_shear_stress(section: Section) -> np.ndarray:
    """Largest shear stress in each ply for V = 1 N (Pa per N; read-only, found once per
    section).
    """
    return once(section, "unit_shear_stress", lambda: _unit_shear_stress(section))


def shear_cuts(section: Section) -> np.ndarray:
    """The heights at which a ply's largest shear stress is sought, sorted and each once:
    every ply edge, just inside every ply edge, the neutral axis and 41 heights evenly
    over the depth (the checks and the sheet's derivations use the same cuts).
    """
    lo = float(section.y_bottom.min())
    hi = float(section.y_top.max())
    # a cut exactly at an interface is shared by the plies on both sides of it, which
    # splits the part of the plies wholly beyond the cut between them; the cuts one unit
    # in the last place inside each ply's edges give each ply its own value there (the
    # largest of a ply below the neutral axis with a ply wholly below it is at its top
    # edge, of one above the neutral axis with a ply wholly above it at its bottom edge)
    inside = [np.nextafter(section.y_top, -np.inf), np.nextafter(section.y_bottom, np.inf)]
    ys = np.sort(np.concatenate([np.linspace(lo, hi, 41), section.y_bottom, section.y_top,
                                 *inside, [section.neutral_axis_y]]))
    return ys[np.concatenate(([True], ys[1:] != ys[:-1]))]  # np.unique's, without numpy.ma


def _unit_shear(section: Section) -> tuple[np.ndarray, np.ndarray]:
    """The cuts of :func:`shear_cuts` and |tau| of every ply at each for V = 1 N (0
    outside the ply), found once per section (read-only).
    """
    def make() -> tuple[np.ndarray, np.ndarray]:
        ys = shear_cuts(section)
        tau = np.abs(section.shear_stress(1.0, ys))
        tau = np.where(np.isfinite(tau), tau, 0.0)
        tau.setflags(write=False)
        return ys, tau

    return once(section, "unit_shear", make)


def _unit_shear_stress(section: Section) -> np.ndarray:
    """The largest |tau| of each ply for V = 1 N over :func:`shear_cuts`."""
    out = np.asarray(_unit_shear(section)[1].max(axis=1))  # no NaN is left
    out.setflags(write=False)
    return out


def shear_point(section: Section, i: int) -> tuple[float, float]:
    """Height of the largest shear stress in ply i and its value per newton of V (the
    cuts and the value of :func:`unit_shear_stress`).
    """
    ys, tau = _unit_shear(section)
    k = int(np.argmax(tau[i]))
    return float(ys[k]), float(tau[i, k])


def region_span(name: str, x0: float, x1: float) -> float:
    """The length a deflection limit is applied to: the span, or twice an overhang or
    cantilever (common practice).
    """
    length = x1 - x0
    return 2 * length if ("overhang" in name or name == "cantilever") else length


def deflection_checks(check_id: CheckId, label: str, solution: CaseSolution | Extremes,
                      beam: BeamResult, EI: float, limit: float, sources: dict[str, str],
                      notes: tuple[str, ...] = ()) -> list[Check]:
    """One check per span and overhang: |deflection| against region length / limit.
    ``solution`` may be its already computed extremes.
    """
    ext = solution if isinstance(solution, Extremes) else extremes(beam.model, solution, EI)
    regions = {n: (a, b) for n, a, b in beam.model.layout.regions()}
    out = []
    for name, w, x in ext.deflection_by_region:
        a, b = regions[name]
        span = region_span(name, a, b)
        out.append(Check(
            id=check_id, ply=None, combination=label, demand=abs(w), capacity=span / limit,
            quantity="deflection", reference=("L", span),
            partial_factors={"limit": limit}, sources={**sources, "L": "span length; twice "
                                                       "the length for an overhang "
                                                       "(common practice)"},
            equation=f"delta <= L / {limit:g}", location=name, x=x,
            notes=notes + ((f"Upward: {name} lifts (its largest deflection, downward "
                            "positive, is negative); its size is checked.",) if w < 0
                           else ())))
    return out


@dataclass(frozen=True)
class Joint:
    """A steel ply bolted to timber plies beside it (a flitch or side-plate joint).

    Attributes:
        steel: index of the steel ply.
        timbers: indices of the timber plies touching its vertical faces.
        steel_is_main: True where timber lies on both sides (wood-steel-wood, double
            shear); False where the steel is on one face (single shear).

    """

    steel: int
    timbers: tuple[int, ...]
    steel_is_main: bool


def side_by_side_joints(section: Section) -> list[Joint]:
    """Find steel plies with timber plies against their vertical faces (found once per
    section; each call returns a new list).
    """
    return list(once(section, "joints", lambda: tuple(_joints(section))))


def joints_of_timber(section: Section) -> dict[int, tuple[Joint, ...]]:
    """The side-by-side joints each timber ply belongs to, by ply index (found once per
    section; not to be mutated).
    """
    def make() -> dict[int, tuple[Joint, ...]]:
        out: dict[int, list[Joint]] = {}
        for jt in side_by_side_joints(section):
            for j in jt.timbers:
                out.setdefault(j, []).append(jt)
        return {j: tuple(js) for j, js in out.items()}
    return once(section, "joints_of_timber", make)


def _joints(section: Section) -> list[Joint]:
    joints = []
    size = section.depth
    tol = size * TOUCH_TOLERANCE
    plies, mats = section.plies, section.materials
    near: dict[int, list[int]] = {}
    for a, b in near_pairs(plies, tol):  # ascending, so the last match wins as before
        near.setdefault(a, []).append(b)
        near.setdefault(b, []).append(a)
    for i, (ply, mat) in enumerate(zip(plies, mats, strict=True)):
        if mat.kind != "steel" or section.area[i] <= 0:
            continue
        left = right = None
        for j in sorted(near.get(i, ())):
            other, om = plies[j], mats[j]
            if om.kind != "timber" or section.area[j] <= 0:
                continue
            overlap = min(ply.top, other.top) - max(ply.y, other.y)
            if overlap <= tol:
                continue
            if abs(other.x + other.width - ply.x) <= tol:
                left = j
            elif abs(ply.x + ply.width - other.x) <= tol:
                right = j
        timbers = tuple(j for j in (left, right) if j is not None)
        if timbers:
            joints.append(Joint(i, timbers, len(timbers) == 2))
    return joints


@dataclass(frozen=True, eq=False)
class OwnChecks:
    """The ordinary checks of the plies, looked up instead of searched for.

    Attributes:
        shear: the first ``shear`` check without a location or segment of each
            (ply, combination).
        bending: the ``bending`` checks of each ply, in their order.
        shear_capacity: per combination, F'v of each ply: the capacity of its last finite
            ``shear`` check without a location.

    """

    shear: dict[tuple[str, str], Check]
    bending: dict[str, list[Check]]
    shear_capacity: dict[str, dict[str, float]]


def own_checks(section: Section, gross: list[Check]) -> OwnChecks:
    """The :class:`OwnChecks` of ``gross``, the checks of ``section`` (found once for the
    list as it stands).
    """
    def make() -> OwnChecks:
        shear: dict[tuple[str, str], Check] = {}
        bending: dict[str, list[Check]] = {}
        capacity: dict[str, dict[str, float]] = {}
        for c in gross:
            if c.id == "bending" and c.ply is not None:
                bending.setdefault(c.ply, []).append(c)
            elif (c.id == "shear" and c.ply is not None and c.combination is not None
                  and not c.location):
                if c.segment is None:
                    shear.setdefault((c.ply, c.combination), c)
                if math.isfinite(c.capacity):
                    capacity.setdefault(c.combination, {})[c.ply] = c.capacity
        return OwnChecks(shear, bending, capacity)
    return of_list(section, "own_checks", gross, make)  # type: ignore[arg-type]


def plated_both_faces(joints: Sequence[Joint], j: int) -> bool:
    """Whether timber j has a steel plate on each of its faces (it is in two joints of
    ``joints``): each plate then has half of it (NDS 2018 12.3.7; EN 1995-1-1 8.1.3(1)),
    or, for plates on one face, it is the central member of a steel-timber-steel joint.
    """
    return sum(1 for jt in joints if j in jt.timbers) >= 2


def member_width(section: Section) -> float:
    """The section's overall width, from its leftmost to its rightmost ply edge, m."""
    return max(p.x + p.width for p in section.plies) - min(p.x for p in section.plies)


def plate_share(section: Section, i: int) -> float:
    """Share of the load carried by ply i in proportion to its bending stiffness about the
    common neutral axis, E_i I_i,na / EI (common practice for flitch beams).
    """
    return float(section.E[i] * section.I_na[i] / section.EI)


def steel_at_bottom(section: Section) -> list[int]:
    """Steel plies that reach the bottom of the section (and so the supports)."""
    bottom = float(section.y_bottom.min())
    tol = section.depth * TOUCH_TOLERANCE
    return [i for i, m in enumerate(section.materials)
            if m.kind == "steel" and abs(float(section.y_bottom[i]) - bottom) <= tol]


def pick_spacing(required_per_length: float, per_location: float, user: float | None,
                 stock: tuple[float, ...], minimum: float) -> float:
    """The user's spacing, or the largest stock spacing (not below ``minimum``) at which
    ``per_location`` capacity carries ``required_per_length`` (N/m); the smallest
    allowed stock spacing where none does.
    """
    if user is not None:
        return user
    allowed = [s for s in stock if s >= minimum] or [stock[-1]]
    for s in allowed:
        if per_location / s >= required_per_length:
            return s
    return allowed[-1]


EDGE_END_REMINDERS = (
    "Bolts: edge distance at least 4D from the loaded (top) edge and 1.5D from the "
    "unloaded edge; end distance at least 4D (7D for full value in parallel-to-grain "
    "loading); spacing between rows at least 2.5D; holes 1/32 to 1/16 in oversize "
    "(NDS 12.5.1, from memory). Stagger bolts so that no two share a growth-ring line.",
    "Point loads must reach the plate through bolts near where they act.",
)


def apply_overrides(factors: dict[str, float], sources: dict[str, str], design: DesignSpec,
                    ply: str) -> None:
    """Replace derived factors by the user's per-ply values (design.overrides)."""
    for sym, v in design.overrides.get(ply, {}).items():
        if sym in factors:
            factors[sym] = v
            sources[sym] = "user override"


def uncombined_cases(beam: BeamResult) -> list[Problem]:
    """A named missing check for every load case on the member (self-weight is D) that no
    strength combination takes: the strength checks would leave that load out, so the
    verdict cannot be OK (a user's own list of combinations can omit a case).
    """
    strength = beam.strength()
    if not strength:
        return []  # said already: there is no strength combination at all
    return _cases_not_taken(beam, strength, "strength combination", "strength checks")


def unserviced_cases(beam: BeamResult, combos: Sequence[CombinationResult]) -> list[Problem]:
    """:func:`uncombined_cases` for the combinations the deflection checks use
    (``combos``; EN 1995-1-1 7.2: the characteristic ones): a missing check where there
    is none (a user's list of ULS combinations only) or where one of the loads is in
    none of them.
    """
    if not combos:
        return [MissingCheck("beam.combinations", "has no SLS-characteristic combination: "
                             "the deflection checks (EN 1995-1-1 7.2, EN 1990 6.5.3) are "
                             "not made")]
    return _cases_not_taken(beam, combos, "SLS-characteristic combination",
                            "deflection checks")


def _cases_not_taken(beam: BeamResult, combos: Sequence[CombinationResult], kind: str,
                     checks: str) -> list[Problem]:
    taken = {case for c in combos for case in c.combination.cases()}
    spec = beam.spec
    out: list[Problem] = []
    if spec.self_weight and "D" not in taken:
        out.append(MissingCheck("beam.combinations", f"no {kind} takes case D, which holds "
                                f"the self-weight; the {checks} leave it out"))
    for i, load in enumerate(spec.loads):
        if load.case not in taken and not (load.case == "D" and spec.self_weight):
            out.append(MissingCheck("beam.combinations", f"no {kind} takes case {load.case} "
                                    f"of beam.loads[{i}]; the {checks} leave that load out"))
    return out


def unapplied_overrides(design: DesignSpec, plies: Sequence[Ply], checks: Sequence[Check]
                        ) -> list[Problem]:
    """The user's overrides (design.overrides) that no check took, each named: a ply that
    is not among ``plies``, or a factor symbol that no check of the ply has (a misspelt
    symbol, or a factor of the other basis). What the user asked for must never go
    unapplied without a word.
    """
    if not design.overrides:
        return []
    names = {p.name for p in plies}
    applied = {(c.ply, sym) for c in checks for sym, src in c.sources.items()
               if src == "user override"}
    out: list[Problem] = []
    for ply, factors in design.overrides.items():
        path = f"design.overrides.{ply}"
        if ply not in names:
            out.append(Problem(path, f'no ply is named "{ply}"; its overrides are not '
                               "applied"))
            continue
        for sym in factors:
            if (ply, sym) not in applied:
                out.append(Problem(f"{path}.{sym}", f'no check of "{ply}" has the factor '
                                   f"{sym} on the {design.basis} basis; not applied"))
    return out


#: Design fields that only one basis reads, with what they are on it: a value set on the
#: other basis is said as not used.
BASIS_FIELDS = {
    "US-ASD": {"K_cr": "the NDS 2018 3.5.2 creep factor",
               "steel_rule": "the steel plates' allowable bending stress rule",
               "wet_service": "the NDS wet service factors C_M",
               "temperature": "the NDS temperature factors C_t",
               "repetitive_member": "the NDS repetitive member factor C_r",
               "incised": "the NDS incising factor C_i",
               "fabricated_wet": "the NDS 11.3.3 wet service factor of the bolts"},
    "EU-LSD": {"k_def": "the EN 1995-1-1 Table 3.2 creep factor",
               "service_class": "the EN 1995-1-1 2.3.1.3 service class",
               "en1990_expression": "the EN 1990 6.4.3.2(3) expression"},
}


def other_basis_fields(design: DesignSpec) -> list[Problem]:
    """Design fields set away from their defaults that only the other basis reads (a
    value the user gave that changes nothing must be said).
    """
    default = DesignSpec(basis=design.basis)
    out = []
    for basis, fields in BASIS_FIELDS.items():
        if basis == design.basis:
            continue
        for name, what in fields.items():
            if getattr(design, name) != getattr(default, name):
                out.append(Problem(f"design.{name}", f"is {what}, read only on the {basis} "
                                   f"basis; not used on the {design.basis} basis"))
    return out


def unused_bolt_fields(design: DesignSpec) -> list[Problem]:
    """A bolt spacing or end distance given beside the stations, which place the bolts
    themselves: said, since neither is used.
    """
    bolt = design.bolt
    if not bolt.stations:
        return []
    return [Problem(f"design.bolt.{key}", "is not used: the stations give the bolts' "
                    "positions")
            for key, value in (("spacing", bolt.spacing), ("end_distance", bolt.end_distance))
            if value is not None]


def connector_checks(section: Section, beam: BeamResult, design: DesignSpec, system: str,
                     warnings: list[Problem]) -> list[Check]:
    """Connectors of stacked plies, on either basis: the shear flow V Q / I_t at each
    horizontal interface under the largest strength-combination shear, against the
    user's connector value (allowable for US, design value for EU) at the largest stock
    spacing that works (or the user's spacing).
    """
    if not section.interfaces:
        return []
    if isinstance(section, PartialSection):
        return slip_connector_checks(section, beam, design, system, warnings)
    conn = design.connector
    if conn.type == "glue":
        warnings.append(glue_line(section, beam, system))
        return []
    if conn.type in MECHANICAL_CONNECTORS and not any(
            isinstance(w, MissingCheck) and w.path.startswith("design.connector")
            for w in warnings):
        # fully composite overstates the stiffness of plies joined by fasteners that slip
        warnings.append(MissingCheck(
            "design.connector.diameter", f"not given: the slip of the {conn.type}s joining "
            "the stacked plies (EN 1995-1-1 Annex B) is not analysed, and the section taken "
            "as fully composite overstates their stiffness; give the connector's diameter "
            "and spacing"))
    combos = list(beam.strength()) or list(beam.combinations)
    V = max(c.extremes.V_max_abs for c in combos)
    worst = max(combos, key=lambda c: c.extremes.V_max_abs)
    stock = STOCK_SPACINGS_US if system == "US" else STOCK_SPACINGS_SI
    out = []
    for itf, q in section.interface_shear_flows(V):
        if conn.allowable is None:
            warnings.append(MissingCheck("design.connector.allowable", "not given: the interface "
                                    f"at y = {fmt(itf.y, 'length', system)} carries a shear "
                                    f"flow of {fmt(float(q), 'shear_flow', system)} at the "
                                    "largest shear; give the connector's allowable load to get "
                                    "a spacing"))
            continue
        per_loc = conn.allowable * conn.rows
        s = pick_spacing(float(q), per_loc, conn.spacing, stock, 0.0)
        demand = float(q) * s / conn.rows
        names = "; ".join(f"{section.plies[a].name} / {section.plies[b].name}"
                          for a, b in itf.pairs)
        out.append(connector_check(
            names, worst.name, demand, conn.allowable,
            sources={"allowable per connector": "the user's connector value (already adjusted)"},
            equation="load per connector = q s / rows = (V Q / I_t) s / rows <= allowable",
            location=f"one {conn.type} every {fmt(s, 'length', system, 3)} ({conn.rows} per row) "
            "along the region of highest shear",
            fasteners=Fasteners(rows=conn.rows, spacing=s),
            x=itf.y,
            notes=(f"Shear flow q = {float(q):.1f} N/m at |V| = {V:.1f} N; Q = {itf.Q:.4e} m^3.",
                   FULL_COMPOSITE_NOTE)))
    return out


#: Said on the connector check of fasteners whose slip is not analysed.
FULL_COMPOSITE_NOTE = ("Full composite action is assumed (no slip): give the connector's "
                       "diameter and spacing to take the slip of the fasteners into account "
                       "(EN 1995-1-1 Annex B).")


def glue_line(section: Section, beam: BeamResult, system: str) -> Problem:
    """A glued interface is fully composite; its glue line is not checked here."""
    combos = list(beam.strength()) or list(beam.combinations)
    V = max(c.extremes.V_max_abs for c in combos)
    flows = ", ".join(f"{fmt(float(q) / itf.length, 'stress', system)} at y = "
                      f"{fmt(itf.y, 'length', system)}"
                      for itf, q in section.interface_shear_flows(V))
    return MissingCheck("design.connector.type", '"glue": the glued interfaces are taken as '
                        f"fully composite; their glue-line shear stress q / b ({flows}) "
                        "is not checked here (it depends on the adhesive and its bond)")


def uplift_checks(beam: BeamResult, system: str) -> list[Check]:
    """A support whose smallest reaction over the strength combinations and pattern
    arrangements is negative must be held down: demand = the uplift force, capacity =
    ``beam.hold_down`` where the user gives one, else 0 (NOT OK until a hold-down is
    designed). Sign: reactions upward positive (the project's convention).
    """
    out = []
    capacity = beam.spec.hold_down or 0.0
    for rb in beam.reaction_envelope:
        if rb.strength_min >= 0:
            continue
        uplift = -rb.strength_min
        where = f"support {rb.support}"
        out.append(Check(
            id="uplift", ply=None, combination=rb.strength_combination_min, demand=uplift,
            capacity=capacity, quantity="force", reference=("hold-down", capacity),
            sources={"hold-down": "beam.hold_down, the user's value" if beam.spec.hold_down
                     else "none given"},
            equation="uplift = -R_min <= hold-down capacity",
            location=where, x=rb.x,
            notes=(f"{where} (x = {fmt(rb.x, 'length', system)}) lifts by "
                   f"{fmt(uplift, 'force', system)} under {rb.strength_combination_min}"
                   + ("" if beam.spec.hold_down else "; no hold-down is given "
                      "(beam.hold_down), so the support must be anchored") + ".",)))
    return out


def pattern_notes(beam: BeamResult) -> list[Problem]:
    """Say how the variable actions were placed (ASCE 7-16 4.3.3, 7.5; EN 1991-1-1 6.2.1)."""
    regions = beam.model.layout.regions()
    if len(regions) < 2:
        return []
    if not beam.spec.pattern_live_load:
        return [Problem("beam.pattern_live_load", "is false: the variable cases load every "
                        "span and overhang at once; pattern (skip) loading is not checked")]
    return []
