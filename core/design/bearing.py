"""Bearing perpendicular to the grain: timber on the supports and under point loads.

Where the timber does not itself reach the face (a steel cover plate is the lowest or the
highest ply), the timber bears on the plate and the plate on the support or under the
load: the bearing area is then the timber's contact with the plate, taken over the
bearing length only (the plate is not counted on to spread the load along the member,
conservative). Where a bearing ply has no perpendicular-to-grain value the check cannot
be made and the verdict is INCOMPLETE (a MissingCheck naming the material's field).

Clauses (from memory): NDS 2018 3.10.2 f_c_perp = R / A_b <= F'c_perp = Fc_perp C_M C_t
C_i C_b, 3.10.4 C_b = (l_b + 0.375) / l_b for l_b < 6 in at least 3 in from the end;
EN 1995-1-1 6.1.5 sigma_c,90,d = F / A_ef <= k_c,90 f_c,90,d, A_ef = b l_ef, l_ef = l plus
up to 30 mm on each side, not beyond the end of the member (k_c,90 taken as 1.0,
conservative).
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

from ..actions.analysis import BeamResult, CombinationResult
from ..codes import en1995 as ec5
from ..codes import nds
from ..model.constants import INCH
from ..model.design import DesignSpec
from ..model.errors import MissingCheck, Problem
from ..model.member import Load
from ..section.geometry import TOUCH_TOLERANCE
from ..section.transformed import Section
from .check import Check, capacity_from
from .common import apply_overrides, steel_at_bottom

#: EN 1995-1-1 6.1.5(1): the contact length may be increased by 30 mm on each side.
EN_SPREAD = 0.030
#: NDS 2018 3.10.4: C_b applies to bearings at least 3 in from the member's end.
NDS_END_CLEAR = 3 * INCH

S_LEF = "EN 1995-1-1 6.1.5(1) (from memory)"


@dataclass(frozen=True)
class BearingSurface:
    """The timber plies that take a bearing on one face of the section.

    Attributes:
        plies: indices of the bearing timber plies.
        widths: contact width of each, m (its own width, or its overlap with the plate).
        plate: name of the steel ply the timber bears on, "" where it bears directly.
        face: "bottom" (supports) or "top" (point loads).

    """

    plies: tuple[int, ...]
    widths: tuple[float, ...]
    plate: str
    face: str

    @property
    def width(self) -> float:
        """Total contact width, m."""
        return sum(self.widths)

    def names(self, section: Section) -> str:
        """The bearing plies' names joined with " + "."""
        return " + ".join(section.plies[i].name for i in self.plies)


def _overlap(section: Section, i: int, j: int) -> float:
    a, b = section.plies[i], section.plies[j]
    return max(0.0, min(a.x + a.width, b.x + b.width) - max(a.x, b.x))


def bearing_surface(section: Section, face: str) -> BearingSurface | None:
    """The timber plies bearing on ``face``: those reaching it, else those resting on a
    steel ply that reaches it (a cover plate); None where no timber does either.
    """
    tol = section.depth * TOUCH_TOLERANCE
    live = [i for i in range(len(section.plies)) if section.area[i] > 0 and section.is_connected(i)]
    low, high = section.y_bottom, section.y_top
    edge_y, inner_y = (low, high) if face == "bottom" else (high, low)

    def edge(i: int) -> float:
        return float(edge_y[i])

    def inner(i: int) -> float:
        return float(inner_y[i])

    outer = min(edge(i) for i in live) if face == "bottom" else max(edge(i) for i in live)
    at_face = [i for i in live if abs(edge(i) - outer) <= tol]
    timber = [i for i in at_face if section.materials[i].kind == "timber"]
    if timber:
        return BearingSurface(tuple(timber), tuple(section.plies[i].width for i in timber), "",
                              face)
    for s in (i for i in at_face if section.materials[i].kind == "steel"):
        resting = [j for j in live if section.materials[j].kind == "timber"
                   and abs(edge(j) - inner(s)) <= tol and _overlap(section, j, s) > tol]
        if resting:
            return BearingSurface(tuple(resting),
                                  tuple(_overlap(section, j, s) for j in resting),
                                  section.plies[s].name, face)
    return None


def _values(section: Section, surface: BearingSurface, key: str,
            warnings: list[Problem]) -> tuple[int, float] | None:
    """The bearing ply with the lowest ``key`` value; None (and a MissingCheck) where a
    bearing ply has none.
    """
    found = []
    for i in surface.plies:
        mat = section.materials[i]
        v = mat.value(key)
        if v is None:
            warnings.append(MissingCheck(f"materials.{mat.id}.{key}", "is not given: the "
                                         f"bearing check of ply {section.plies[i].name} "
                                         f"({surface.face} face) cannot be made"))
            return None
        found.append((i, v))
    return min(found, key=lambda t: t[1])


def _surface_note(surface: BearingSurface) -> str:
    where = "supports" if surface.face == "bottom" else "load"
    if surface.plate:
        return (f"The timber bears on steel ply {surface.plate}, which bears on the {where}: "
                "bearing area = timber contact width with the plate times the bearing length "
                "(the plate is not counted on to spread the load, conservative).")
    return f"Bearing area: timber plies on the {surface.face} face times the bearing length."


def point_loads_with_bearing(beam: BeamResult) -> list[tuple[int, Load]]:
    """The point loads that give a bearing length, with their index in beam.loads."""
    return [(k, ld) for k, ld in enumerate(beam.spec.loads)
            if ld.type == "point" and ld.bearing_length is not None]


def _load_demand(combo: CombinationResult, load: Load) -> float:
    """The point load's design value in one combination (downward, N; 0 for uplift)."""
    return max(combo.combination.factors.get(load.case, 0.0) * load.value, 0.0)


@dataclass(frozen=True)
class BearingSite:
    """One place where the member bears: a support (bottom face) or a point load (top).

    Attributes:
        location: "support k" or "point load k" (k counts from 1, in beam.loads order).
        x: position along the member, m.
        length: bearing length, m.
        face: "bottom" or "top".
        support: support index, or None for a point load.
        load: the point load, or None for a support.

    """

    location: str
    x: float
    length: float
    face: str
    support: int | None = None
    load: Load | None = None

    def force(self, combo: CombinationResult) -> float:
        """The bearing force in one combination, N (downward; 0 for uplift)."""
        if self.load is not None:
            return _load_demand(combo, self.load)
        return max(float(combo.reactions_max[self.support or 0]), 0.0)


def bearing_sites(beam: BeamResult) -> list[BearingSite]:
    """Every support (when beam.bearing_length is given) and every point load with a
    bearing length.
    """
    out: list[BearingSite] = []
    lb = beam.spec.bearing_length
    if lb is not None:
        out += [BearingSite(f"support {k + 1}", xs, lb, "bottom", support=k)
                for k, xs in enumerate(beam.model.layout.support_positions())]
    for k, ld in point_loads_with_bearing(beam):
        at = float(ld.at or 0.0)
        out.append(BearingSite(f"point load {k + 1}", at,
                               float(ld.bearing_length or 0.0), "top", load=ld))
    return out


def _warn_steel_without_bearing(section: Section, surface: BearingSurface,
                                design: DesignSpec, warnings: list[Problem]) -> None:
    """Where a steel ply reaches the supports beside the bearing timber but is not declared
    as bearing (design.steel_bears), say that the timber takes the whole reaction.
    """
    if surface.face != "bottom" or surface.plate or design.steel_bears:
        return
    steel = steel_at_bottom(section)
    if steel:
        names = ", ".join(section.plies[i].name for i in steel)
        warnings.append(Problem("beam.bearing_length", f"steel ply {names} reaches the "
                                "supports but has no bearing data; the timber bearing check "
                                "assumes the timber carries the whole reaction"))


Bearer = tuple[BearingSurface, int, float]


def _bearers(section: Section, sites: list[BearingSite], key: str, design: DesignSpec,
             warnings: list[Problem]) -> dict[str, Bearer | None]:
    """For each face with a bearing site: its surface, the weakest bearing ply and its
    ``key`` value (None where no timber bears or a value is missing; warned once).
    """
    out: dict[str, Bearer | None] = {}
    for face in dict.fromkeys(site.face for site in sites):
        surface = bearing_surface(section, face)
        if surface is None:
            out[face] = None
            continue
        _warn_steel_without_bearing(section, surface, design, warnings)
        weakest = _values(section, surface, key, warnings)
        out[face] = None if weakest is None else (surface, *weakest)
    return out


def _borne(section: Section, sites: list[BearingSite], key: str, design: DesignSpec,
           warnings: list[Problem]) -> list[tuple[BearingSite, BearingSurface, int, float]]:
    """Each site that timber bears with a ``key`` value: (site, surface, weakest ply,
    its value); the sites whose face has no such timber are left out (warned once).
    """
    bearers = _bearers(section, sites, key, design, warnings)
    return [(site, *bearer) for site in sites
            if (bearer := bearers[site.face]) is not None]


def us_bearing(section: Section, beam: BeamResult, design: DesignSpec,
               warnings: list[Problem]) -> list[Check]:
    """NDS 2018 3.10 bearing at every support and under every point load with a bearing
    length, for the combination with the largest force (C_D does not apply to Fc_perp).
    """
    from .us_timber import S_CI, S_CM, S_CT

    combos = beam.strength() or beam.combinations
    sites = bearing_sites(beam)
    if not combos or not sites:
        return []
    L = beam.model.layout.length
    out = []
    for site, surface, i_min, fcp in _borne(section, sites, "Fc_perp", design, warnings):
        mat = section.materials[i_min]
        worst = max(combos, key=site.force)
        # "not nearer than 3 in to the end": the bearing's own edge, on either face (a
        # support on a short overhang bears near the member's end too)
        at_end = min(site.x, L - site.x) - site.length / 2 < NDS_END_CLEAR
        f = {"C_M": nds.C_M("Fc_perp", mat.product, design.wet_service),
             "C_t": nds.C_t("Fc_perp", design.temperature, design.wet_service),
             "C_i": nds.C_i("Fc_perp", design.incised), "C_b": nds.C_b(site.length, at_end)}
        s = {"Fc_perp": mat.source_of("Fc_perp"), "C_M": S_CM, "C_t": S_CT, "C_i": S_CI,
             "C_b": "NDS 2018 3.10.4 (from memory)"}
        apply_overrides(f, s, design, section.plies[i_min].name)
        out.append(Check(
            id="bearing", ply=surface.names(section), combination=worst.name,
            demand=site.force(worst) / (surface.width * site.length),
            capacity=capacity_from(fcp, f), quantity="stress", reference=("Fc_perp", fcp),
            factors=f, partial_factors={}, sources=s,
            equation="f_c_perp = R / (sum b x l_b) <= F'c_perp", location=site.location,
            x=site.x, notes=(_surface_note(surface),)))
    return out


def en_effective_length(site: BearingSite, length: float,
                        sites: Sequence[BearingSite] = ()) -> float:
    """EN 1995-1-1 6.1.5(1) (with A1, from memory): l_ef = l plus 30 mm on each side, but
    not more than a (to the member's end), l (the contact length itself) or l1 / 2 (half
    the clear distance to the next bearing on the same face, of ``sites``): a support at
    an end of the member spreads to one side only, one on a short overhang only as far as
    the end.
    """
    left = site.x - site.length / 2  # to the member's ends, on either face
    right = length - site.x - site.length / 2
    for other in sites:
        if other is site or other.face != site.face:
            continue
        gap = abs(other.x - site.x) - (other.length + site.length) / 2  # l1
        if other.x < site.x:
            left = min(left, gap / 2)
        elif other.x > site.x:
            right = min(right, gap / 2)
    cap = min(EN_SPREAD, site.length)
    return site.length + min(cap, max(left, 0.0)) + min(cap, max(right, 0.0))


def eu_bearing(section: Section, beam: BeamResult, design: DesignSpec,
               uls: Sequence[CombinationResult], warnings: list[Problem]) -> list[Check]:
    """EN 1995-1-1 6.1.5 bearing at every support and under every point load with a
    bearing length, for the governing ULS combination (k_mod of its duration class).
    """
    from ..model.combination import eu_duration
    from .eu_timber import S_GM, S_KMOD

    sites = bearing_sites(beam)
    if not uls or not sites:
        return []
    L = beam.model.layout.length
    out = []
    for site, surface, i_min, fc90 in _borne(section, sites, "fc90_k", design, warnings):
        mat = section.materials[i_min]
        l_ef = en_effective_length(site, L, sites)
        spread = l_ef - site.length
        best = None
        for combo in uls:
            f = {"k_mod": ec5.k_mod(eu_duration(combo.duration), design.service_class),
                 "k_c,90": 1.0}
            g = {"gamma_M": ec5.gamma_M(mat.product)}
            s = {"fc90_k": mat.source_of("fc90_k"), "k_mod": S_KMOD, "gamma_M": S_GM,
                 "k_c,90": "EN 1995-1-1 6.1.5, taken as 1.0 (conservative)"}
            apply_overrides(f, s, design, section.plies[i_min].name)
            c = Check(
                id="bearing", ply=surface.names(section), combination=combo.name,
                demand=site.force(combo) / (surface.width * l_ef),
                capacity=capacity_from(fc90, f, g), quantity="stress",
                reference=("fc90_k", fc90), factors=f, partial_factors=g, sources=s,
                equation="sigma_c,90,d = F / (b l_ef) <= k_c,90 k_mod f_c,90,k / gamma_M",
                location=site.location, x=site.x,
                notes=(f"Effective length l_ef = l + {spread * 1000:.4g} mm (up to 30 mm on "
                       f"each side within the member, {S_LEF}).", _surface_note(surface)))
            if best is None or c.ratio > best.ratio:
                best = c
        if best is not None:
            out.append(best)
    return out
