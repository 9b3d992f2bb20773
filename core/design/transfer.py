"""Load transfer between a plate and its timbers, bolt station by bolt station.

Common practice for flitch and side plates: the plate carries the share
alpha = E_p I_p,na / EI of the shear at every section (its bending stiffness share), so its
shear is V_p(x) = alpha V(x) and the bolts of a station deliver the change of V_p over the
station's tributary length (halfway to the neighbouring stations, or to the plate's end).
At a plate end the plate's own shear is zero unless it bears on a support there.

Concentrated transfers: where a plate does not bear on a support, its share alpha R of that
reaction reaches the timbers through the bolts of the transfer zone; where a point load
bears on the timbers (every point load is taken to bear on the timbers only), its share
alpha P enters the plate through the bolts of the zone. The transfer zone of a support or
load at x is every station within the member depth d of x (the load spreads at about 45
degrees through the depth, common practice), and at least the nearest station. Each bolt of a
station carries alpha times the distributed load on the station's tributary over the
station's bolts, plus the share per bolt of every transfer whose zone holds the station
(the resultant, signed), and never less than the sum of those transfer shares.
"""

from __future__ import annotations

import math
from bisect import bisect_left, bisect_right
from collections.abc import Iterator
from dataclasses import dataclass, field

import numpy as np

from ..actions.analysis import BeamResult, CombinationResult
from ..actions.beam import BeamModel, CaseSolution
from ..model.design import DesignSpec
from ..model.units import fmt
from ..section.transformed import Section, own_second_moment, with_moduli
from .bolt_layout import BoltLayout
from .check import Check, evolve
from .common import joints_of_timber, plate_share, side_by_side_joints, unit_shear_stress
from .demands import eu_uls_section
from .memo import once, with_partner
from .tributary import load_between, tributaries, whole_terms
from .zones import (
    ForceArrays,
    ascending,
    force_arrays,
    station_sums,
    zone,
    zone_ascending,
    zone_runs,
)


def plate_extent(section: Section, i: int, length: float) -> tuple[float, float]:
    """Start and end of ply i along the member, m (its ``from``/``to``; the whole member
    by default).
    """
    ply = section.plies[i]
    return (0.0, length) if ply.covers_whole(length) else ply.extent(length)


def plate_bears(design: DesignSpec, section: Section, i: int, x_support: float,
                length: float) -> bool:
    """Whether steel ply i bears on the support at ``x_support``: the user's
    ``design.steel_bears`` (the plate on its own seats), for a plate that reaches the support.
    """
    start, end = plate_extent(section, i, length)
    tol = 1e-9 * max(length, 1.0)
    return design.steel_bears and start - tol <= x_support <= end + tol


def shear_left_of(model: BeamModel, sol: CaseSolution, x: float) -> float:
    """V just left of ``x``: the sum of the upward forces strictly left of x, N."""
    nodes = model.nodes
    if x <= float(nodes[0]):
        return 0.0
    # np.searchsorted(nodes, x, "left") - 1, clipped to the elements; plain floats (the
    # same double arithmetic as numpy's scalars)
    e = min(max(bisect_left(nodes, x) - 1, 0), model.lengths.size - 1)
    s = min(x, float(nodes[-1])) - float(nodes[e])
    return float(sol.V0[e]) + float(sol.q[e]) * s + float(sol.dq[e]) * s**2 / 2


@dataclass(frozen=True)
class Transfer:
    """A reaction or point load whose plate share passes through the bolts of a zone.

    Attributes:
        label: "support k" or "point load at x = ..." (SI text, m).
        kind: "support" or "point".
        x: its position, m.
        force: the reaction or load, N (upward reactions, downward loads positive).
        share: alpha, the plate's share.
        zone: indices of the stations in the transfer zone.
        bolts: bolts in the zone.
        zone_half_width: the zone reaches this far either side of x, m.

    """

    label: str
    kind: str
    x: float
    force: float
    share: float
    zone: tuple[int, ...]
    bolts: int
    zone_half_width: float

    @property
    def demand(self) -> float:
        """The plate's share of the force, N."""
        return abs(self.share * self.force)

    @property
    def per_bolt(self) -> float:
        """The share per bolt of the zone, N."""
        return self.demand / self.bolts if self.bolts else math.inf


@dataclass(frozen=True)
class StationDemand:
    """The force on the bolts of one station under one combination.

    Attributes:
        station: index of the station.
        x: its position, m.
        a: start of its tributary, m.
        b: end of its tributary, m.
        load: the distributed load on the tributary, N (downward positive; the plate
            takes alpha of it through these bolts).
        bolts: bolts at the station.
        transfers: the concentrated transfers whose zone holds the station.
        share: alpha.

    """

    station: int
    x: float
    a: float
    b: float
    load: float
    bolts: int
    transfers: tuple[Transfer, ...]
    share: float

    @property
    def net(self) -> float:
        """Per bolt, the resultant: alpha w_trib / n plus each transfer's share per bolt
        (point loads push the plate down, reactions up), N.
        """
        signed = sum(t.per_bolt * (1.0 if t.kind == "point" else -1.0) for t in self.transfers)
        return abs(self.share * self.load / self.bolts + signed)

    @property
    def from_transfers(self) -> float:
        """Per bolt from the transfers of the zones it is in, N."""
        return sum(t.per_bolt for t in self.transfers)

    @property
    def per_bolt(self) -> float:
        """The larger of the two (a bolt of a transfer zone carries at least its share of
        the transfer), N.
        """
        return max(self.net, self.from_transfers)


def point_loads(beam: BeamResult, combo: CombinationResult) -> list[tuple[float, float]]:
    """(x, P) of every point load of the combination with its factor (downward positive),
    loads at the same position added.
    """
    out: dict[float, float] = {}
    for ld in beam.spec.loads:
        if ld.type != "point" or ld.at is None:
            continue
        f = combo.combination.factors.get(ld.case, 0.0)
        if f:
            out[ld.at] = out.get(ld.at, 0.0) + f * ld.value
    return sorted(out.items())


@dataclass(frozen=True)
class PlateLoads:
    """What one combination puts on one plate, whatever its layout: found once and used for
    every spacing tried and for the checks of the one chosen.

    Attributes:
        forces: (kind, label, x, force) of every concentrated transfer on the plate's
            length, in the order of :func:`transfers` (supports, then point loads).
        nodes: the mesh nodes, m, ascending.
        q: the solution's distributed load at the start of each element, N/m (upward
            positive).
        dq: its change along each element, N/m^2.
        arrays: the forces as arrays for many (``zones.force_arrays``), or None.
        whole: the term of each element a tributary covers whole, as
            ``tributary.load_between`` adds it (0.0 for an element of no length); empty
            where the nodes do not ascend (then every term is found where it is used).
        share: alpha, the plate's share of these loads (:func:`bolt_share`; None: the
            caller's).

    """

    forces: tuple[tuple[str, str, float, float], ...]
    nodes: tuple[float, ...]
    q: tuple[float, ...]
    dq: tuple[float, ...]
    whole: tuple[float, ...] = field(default=(), compare=False, repr=False)
    arrays: ForceArrays | None = field(default=None, compare=False, repr=False)
    share: float | None = None

    def positions(self) -> list[float] | np.ndarray:
        """The transfers' positions, m (as an array where :attr:`arrays` holds them)."""
        return self.arrays.at if self.arrays is not None else [f[2] for f in self.forces]


def plate_loads(section: Section, beam: BeamResult, combo: CombinationResult,
                design: DesignSpec, plate: int, extent: tuple[float, float]) -> PlateLoads:
    """The loads of one combination on steel ply ``plate`` running over ``extent``: every
    support it does not bear on (reaction: the largest over the arrangements), every point
    load on its length, and the distributed load.
    """
    L = beam.model.layout.length
    start, end = extent
    items = [("support", f"support {k + 1}", xs, float(combo.reactions_max[k]))
             for k, xs in enumerate(beam.model.layout.support_positions())
             if start - 1e-9 <= xs <= end + 1e-9
             and not plate_bears(design, section, plate, xs, L)]
    items += [("point", f"point load at x = {x:.6g} m", x, P) for x, P in
              point_loads(beam, combo) if start - 1e-9 <= x <= end + 1e-9]
    sol = combo.solution
    nodes, q, dq = (tuple(beam.model.nodes.tolist()), tuple(sol.q.tolist()),
                    tuple(sol.dq.tolist()))
    forces = tuple(items)
    return PlateLoads(forces, nodes, q, dq, whole_terms(nodes, q, dq), force_arrays(forces),
                      bolt_share(section, beam, combo, design, plate))


@dataclass(frozen=True)
class ShareBasis:
    """What the plate's share alpha of a combination's loads is made of (see
    :func:`bolt_share`).

    Attributes:
        at_once: E_p I_p,na / EI on the short-term section.
        final: the same on the combination's final section (EU: timber E_mean / (1 +
            psi2 k_def)); None on the US basis.

    """

    at_once: float
    final: float | None

    @property
    def alpha(self) -> float:
        """The share taken: the larger of the two (at once on the US basis)."""
        return self.at_once if self.final is None else max(self.at_once, self.final)


def share_basis(section: Section, beam: BeamResult, combo: CombinationResult,
                design: DesignSpec, plate: int) -> ShareBasis:
    """:class:`ShareBasis` of steel ply ``plate`` under one combination."""
    final = None if design.us else plate_share(eu_uls_section(section, beam, combo, design),
                                               plate)
    return ShareBasis(plate_share(section, plate), final)


def bolt_share(section: Section, beam: BeamResult, combo: CombinationResult,
               design: DesignSpec, plate: int) -> float:
    """The plate's share alpha of a combination's loads that its bolts pass on.

    EU: the larger of alpha at once and alpha on the combination's final section (timber
    E_mean / (1 + psi2 k_def); EN 1995-1-1 2.3.2.2(1)-(2), from memory: at ULS the
    distribution of forces in a member of parts with different creep takes the final
    moduli), as the plate's own stresses take it. US: alpha at once, E_p I_p,na / EI with
    the short-term moduli (common practice; NDS 2018 has no rule for the redistribution
    by creep in a connection).
    """
    return share_basis(section, beam, combo, design, plate).alpha


def placed_transfers(loads: PlateLoads, layout: BoltLayout, share: float,
                     depth: float) -> list[Transfer]:
    """The concentrated transfers of ``loads`` through the bolts of ``layout``, each with
    its zone (the stations within the member depth ``depth``, at least the nearest).
    """
    xs = layout.stations
    ordered = ascending(xs)
    bounds = zone_runs(xs, loads.positions(), depth) if ordered else None
    if bounds is not None:
        ahead = [0]  # bolts at the stations before each index: a zone's bolts by difference
        for rs in layout.station_rows:
            ahead.append(ahead[-1] + len(rs))
        return [Transfer(label, kind, x, force, share, tuple(range(lo, hi)),
                         ahead[hi] - ahead[lo], depth)
                for (kind, label, x, force), lo, hi in zip(loads.forces, *bounds,
                                                           strict=True)]
    out = []
    for kind, label, x, force in loads.forces:
        found = zone_ascending(xs, x, depth) if ordered else zone(layout, x, depth)
        out.append(Transfer(label, kind, x, force, share, found,
                            sum(layout.at_station(k) for k in found), depth))
    return out


def trial_within(loads: PlateLoads, layout: BoltLayout, share: float, depth: float,
                 limit: float) -> bool | None:
    """Whether every station of ``layout`` carries at most ``limit`` per bolt under
    ``loads``: what :func:`governing_within` of :func:`placed_transfers` decides (None
    from it, or a governing station over the limit, is False), with the same arithmetic
    on plain numbers and no transfer made. None where it cannot tell that way (stations
    out of order, a value that is not a number): then ask :func:`governing_within`.
    """
    xs = layout.stations
    forces = loads.forces
    if limit != limit or not xs or not ascending(xs):
        return None
    if forces:
        bounds = zone_runs(xs, loads.positions(), depth)
        if bounds is None:
            return None
        own, signed = station_sums(forces, *bounds, layout.station_rows, share, loads.arrays)
    else:
        own, signed = [0.0] * len(xs), [0.0] * len(xs)
    for _k, _w, per in _per_bolt_along(loads, layout, share, own, signed):
        if per != per:
            return None
        if per > limit:
            return False
    return True


def _per_bolt_along(loads: PlateLoads, layout: BoltLayout, share: float, own: list[float],
                    signed: list[float]) -> Iterator[tuple[int, float, float]]:
    """``(k, w, per bolt)`` of every station in order: ``w`` the distributed load on its
    tributary, per bolt the larger of |alpha w / n + the signed shares of the transfers
    it holds| and the sum of their shares (``own``, ``signed``: for each station, the
    sums of the shares per bolt of the transfers whose zone holds it, and signed, added
    in the transfers' order from zero: the floats ``sum`` makes of them).
    """
    rows = layout.station_rows
    for k, (a, b) in enumerate(tributaries(layout)):
        w = _load_between(loads, a, b)
        net = abs(share * w / len(rows[k]) + signed[k])
        yield k, w, max(net, own[k])


def transfers(section: Section, beam: BeamResult, combo: CombinationResult,
              design: DesignSpec, layout: BoltLayout, share: float) -> list[Transfer]:
    """The concentrated transfers of one plate under one combination: every support the
    plate does not bear on (reaction: the largest over the arrangements) and every point
    load on the plate's length.
    """
    loads = plate_loads(section, beam, combo, design, layout.plate, layout.extent)
    return placed_transfers(loads, layout, share, section.depth)


def shear_right_of(model: BeamModel, sol: CaseSolution, x: float) -> float:
    """V just right of ``x``: the sum of the upward forces left of x and at x, N."""
    nodes = model.nodes
    if x >= float(nodes[-1]):
        return 0.0
    e = min(max(bisect_right(nodes, x) - 1, 0), model.lengths.size - 1)
    s = max(x, float(nodes[0])) - float(nodes[e])
    return float(sol.V0[e]) + float(sol.q[e]) * s + float(sol.dq[e]) * s**2 / 2


def distributed_load(model: BeamModel, sol: CaseSolution, a: float, b: float) -> float:
    """The distributed load between a and b, N (downward positive; the solution's q is
    upward positive, q + dq s along each element).
    """
    total = 0.0
    nodes = model.nodes
    # only the elements that can overlap (a, b): the same terms, in the same order
    first = int(np.searchsorted(nodes[1:], a, side="right"))
    last = int(np.searchsorted(nodes[:-1], b, side="left"))
    for e in range(first, max(first, last)):
        x0 = float(nodes[e])
        s0 = max(a, x0) - x0
        s1 = min(b, float(nodes[e + 1])) - x0
        if s1 > s0:
            total -= float(sol.q[e]) * (s1 - s0) + float(sol.dq[e]) * (s1**2 - s0**2) / 2
    return total


def _load_between(loads: PlateLoads, a: float, b: float) -> float:
    """:func:`distributed_load` on the loads' element values: the same terms in the same
    order, so the same float (``tributary.load_between``).
    """
    return load_between(loads.nodes, loads.q, loads.dq, loads.whole, a, b)


def _zones_of(layout: BoltLayout, items: list[Transfer]) -> list[list[int]]:
    """For every station, the indices (into ``items``, in order) of the transfers whose
    zone holds it.
    """
    held: list[list[int]] = [[] for _ in layout.stations]
    for j, t in enumerate(items):
        for k in t.zone:
            held[k].append(j)
    return held


def placed_demands(loads: PlateLoads, layout: BoltLayout, share: float,
                   items: list[Transfer]) -> list[StationDemand]:
    """The bolt force of every station of ``layout`` under ``loads`` (see
    :func:`station_demands`).
    """
    held = _zones_of(layout, items)
    return [StationDemand(k, x, a, b, _load_between(loads, a, b), layout.at_station(k),
                          tuple(items[j] for j in held[k]), share)
            for k, (x, (a, b)) in enumerate(zip(layout.stations, tributaries(layout),
                                                strict=True))]


def governing_demand(loads: PlateLoads, layout: BoltLayout, share: float,
                     items: list[Transfer]) -> StationDemand:
    """The station whose bolts carry the most (the first of equals), as
    ``max(placed_demands(...), key=StationDemand.per_bolt)`` finds it, with the same
    arithmetic on plain numbers and only the governing station made.
    """
    found = governing_within(loads, layout, share, items, math.inf)
    assert found is not None  # nothing exceeds infinity (a NaN never compares greater)
    return found


def governing_within(loads: PlateLoads, layout: BoltLayout, share: float,
                     items: list[Transfer], limit: float) -> StationDemand | None:
    """:func:`governing_demand`, or None as soon as the most loaded station so far carries
    more than ``limit`` per bolt (then the governing one does too: the layout fails).
    """
    n = len(layout.stations)
    own = [0.0] * n  # as in trial_within: the sums each station holds, in order
    signed = [0.0] * n
    for t in items:
        p = t.per_bolt
        q = p * (1.0 if t.kind == "point" else -1.0)
        for k in t.zone:
            own[k] += p
            signed[k] += q
    best_k, best, best_w = -1, 0.0, 0.0
    for k, w, per in _per_bolt_along(loads, layout, share, own, signed):
        if best_k < 0 or per > best:
            best_k, best, best_w = k, per, w
            if best > limit:
                return None
    a, b = layout.tributary(best_k)
    return StationDemand(best_k, layout.stations[best_k], a, b, best_w,
                         layout.at_station(best_k),
                         tuple(t for t in items if best_k in t.zone), share)


def station_demands(section: Section, beam: BeamResult, combo: CombinationResult,
                    layout: BoltLayout, share: float,
                    items: list[Transfer]) -> list[StationDemand]:
    """The bolt force of every station of a plate under one combination (every region
    loaded: the load on a tributary is largest with the loads on it).
    """
    sol = combo.solution
    loads = PlateLoads((), tuple(beam.model.nodes.tolist()), tuple(sol.q.tolist()),
                       tuple(sol.dq.tolist()))
    del section
    return placed_demands(loads, layout, share, items)


def without_plates(section: Section) -> Section:
    """The section with the moduli of its side-by-side plates set to zero: the timbers
    alone, as they carry the shear beside a support the plates do not bear on.
    """
    def make() -> Section:
        plates = {jt.steel for jt in side_by_side_joints(section)}
        E = np.array([0.0 if i in plates else float(e) for i, e in enumerate(section.E)])
        return with_moduli(section, E)
    return once(section, "without_plates", make)


def support_shear(beam: BeamResult, combo: CombinationResult, k: int) -> float:
    """The largest |V| beside support k (either side; at a member end the largest
    reaction over the arrangements), N.
    """
    def make() -> float:
        model, sol = beam.model, combo.solution
        xs = model.layout.support_positions()[k]
        V = max(abs(shear_left_of(model, sol, xs)), abs(shear_right_of(model, sol, xs)))
        L = model.layout.length
        if xs <= 1e-9 * L or xs >= L * (1 - 1e-9):
            V = max(V, abs(float(combo.reactions_max[k])))
        return V
    return with_partner(combo, ("support_shear", k), beam.model, make)


def support_shear_checks(section: Section, beam: BeamResult, combo: CombinationResult,
                         design: DesignSpec, i: int, shear: Check,
                         system: str) -> list[Check]:
    """Timber ply i's shear beside every support a side-by-side plate does not bear on:
    the full shear on the timbers alone (the plate's share reaches them through the bolts
    there). ``shear`` is the ply's ordinary shear check of the combination, whose capacity
    and factors apply.
    """
    joints = joints_of_timber(section).get(i, ())
    if not joints:
        return []
    L = beam.model.layout.length
    alone = None
    out = []
    for k, xs in enumerate(beam.model.layout.support_positions()):
        if all(plate_bears(design, section, jt.steel, xs, L) for jt in joints):
            continue
        if alone is None:
            alone = unit_shear_stress(without_plates(section))
        V = support_shear(beam, combo, k)
        out.append(evolve(
            shear, demand=float(alone[i]) * V, location=f"support {k + 1}", x=xs,
            equation=shear.equation + " (timbers alone, full shear beside the support)",
            notes=(f"A plate does not bear on support {k + 1}: the timbers carry the full "
                   f"shear beside it, |V| = {fmt(V, 'force', system)}, on the section "
                   "without the plate (its share reaches them through the bolts there).",)))
    return out


@dataclass(frozen=True)
class PlateActions:
    """The stress resultants a plate carries at a cut, from the section's moment and shear
    (the transformed-section method: the plate's strain is the section's).

    Attributes:
        x: the cut, m.
        F: axial force, N (tension positive), sigma at the plate's centroid x A_plate,
            sigma = -E_p M (y_c - y_na) / EI.
        V: the plate's share of the shear, alpha V, N.
        M_own: the plate's own moment about its centroid, E_p I_p,own M / EI, N m.
        y_c: height of the plate's centroid, m.

    """

    x: float
    F: float
    V: float
    M_own: float
    y_c: float


def plate_actions(section: Section, i: int, x: float, M: float, V: float) -> PlateActions:
    """Ply i's stress resultants at a cut where the section carries M and V."""
    E_p, EI = float(section.E[i]), section.EI
    A = float(section.area[i])
    y_c = float(section.first_y[i]) / A
    I_own = own_second_moment(section, i)
    F = -E_p * M * (y_c - section.neutral_axis_y) / EI * A
    alpha = E_p * float(section.I_na[i]) / EI
    return PlateActions(x, F, alpha * V, E_p * I_own * M / EI, y_c)


@dataclass(frozen=True)
class GroupForce:
    """The elastic bolt-group analysis of the bolts that develop a plate's actions (common
    practice, the elastic method for eccentric bolt groups: each bolt takes the direct
    share F / n, V / n and the moment about the group's centroid in proportion to its
    distance r, M_g r / J, J = sum r^2).

    Attributes:
        actions: the plate's actions at the cut.
        bolts: bolts in the group.
        x_g: centroid of the group along the member, m.
        y_g: its height, m.
        M_g: moment about the group's centroid, N m: |M_own| + |F| |y_c - y_g| +
            |V| |x - x_g| (the parts added by magnitude, conservative).
        J: sum of r^2 of the bolts about the centroid, m^2.
        f_max: force on the most loaded bolt, N (components added by magnitude,
            conservative); infinite where J = 0 and M_g > 0 (one bolt cannot resist a
            moment).

    """

    actions: PlateActions
    bolts: int
    x_g: float
    y_g: float
    M_g: float
    J: float
    f_max: float

    @property
    def resultant(self) -> float:
        """sqrt(F^2 + V^2), the plate's force at the cut without the moment, N."""
        return math.hypot(self.actions.F, self.actions.V)


def group_force(bolts: tuple[tuple[float, float], ...], act: PlateActions) -> GroupForce:
    """The force on the most loaded bolt of ``bolts`` ((x, y), m) developing ``act``."""
    n = len(bolts)
    x_g = sum(b[0] for b in bolts) / n
    y_g = sum(b[1] for b in bolts) / n
    M_g = abs(act.M_own) + abs(act.F) * abs(act.y_c - y_g) + abs(act.V) * abs(act.x - x_g)
    J = sum((x - x_g) ** 2 + (y - y_g) ** 2 for x, y in bolts)
    if J <= 0.0:
        f_max = math.hypot(act.F, act.V) / n if M_g == 0.0 else math.inf
    else:
        f_max = max(math.hypot(abs(act.F) / n + M_g * abs(y - y_g) / J,
                               abs(act.V) / n + M_g * abs(x - x_g) / J) for x, y in bolts)
    return GroupForce(act, n, x_g, y_g, M_g, J, f_max)


def end_zone(layout: BoltLayout, x_end: float, depth: float) -> tuple[int, ...]:
    """The stations that develop a plate's force at its end ``x_end``: those within the
    member depth d of the end (the transfer-zone rule of the module text), at least the
    nearest.
    """
    return zone(layout, x_end, depth)
