"""The bolt checks of a plate shared by both bases: the layout, the force on every bolt at
its station (``bolts``, the most loaded bolt of each combination) and one ``load-transfer``
check for every support the plate does not bear on and every point load (see
``transfer``), with the ``splitting`` of the timbers there (see ``splitting``). Each basis
supplies the value of one bolt and its factors.

The layout each plate's checks choose travels with the analysis (:class:`PlateLayout`,
``pipeline.Analysis.layouts``), so the sheet, the plate drawings and the elevation show the
bolts that were checked without placing them again.
"""

from __future__ import annotations

from collections.abc import Callable, Mapping
from dataclasses import dataclass, replace

from ..actions.analysis import BeamResult, CombinationResult
from ..model.caution import CAUTION
from ..model.design import DesignSpec
from ..model.errors import Problem
from ..model.units import fmt
from ..section.transformed import Section
from .bolt_geometry import geometry_checks, layout_factors
from .bolt_layout import BoltLayout, layout_of
from .bolt_steel import screened
from .check import Check, Fasteners, capacity_from, evolve
from .common import STOCK_SPACINGS_SI, STOCK_SPACINGS_US, Joint, own_checks, plate_share
from .net_section import net_checks, net_shear_checks
from .splitting import Shared, SplitSite, splitting_checks
from .transfer import (
    PlateLoads,
    StationDemand,
    Transfer,
    governing_demand,
    governing_within,
    placed_transfers,
    plate_extent,
    plate_loads,
    trial_within,
)


@dataclass(frozen=True)
class BoltValue:
    """One bolt's value on a basis.

    Attributes:
        reference: symbol and value (N) of the unadjusted value (Z or F_v,Rk).
        factors: the multiplying factors under a combination.
        partial: the dividing factors.
        sources: where the value and each factor come from.
        notes: the yield modes and what they assume.
        capacity_symbol: Z' or F_v,Rd (for the equation text).

    """

    reference: tuple[str, float]
    factors: Callable[[CombinationResult], dict[str, float]]
    partial: Mapping[str, float]
    sources: Mapping[str, str]
    notes: tuple[str, ...]
    capacity_symbol: str

    def adjusted(self, combo: CombinationResult,
                 layout_factors: Mapping[str, float]) -> dict[str, float]:
        """The factors under a combination with those the layout sets (C_g, C_Delta)."""
        f = self.factors(combo)
        f.update({k: v for k, v in layout_factors.items() if k in f})
        return f

    def capacity(self, combo: CombinationResult,
                 layout_factors: Mapping[str, float] | None = None) -> float:
        """The adjusted value of one bolt under a combination, N."""
        return capacity_from(self.reference[1], self.adjusted(combo, layout_factors or {}),
                             self.partial)


@dataclass(frozen=True)
class PlateLayout:
    """The bolt layout one plate's checks use.

    Attributes:
        ply: index of the steel ply.
        joint: the plate with the timbers it is bolted to.
        layout: where its bolts go.

    """

    ply: int
    joint: Joint
    layout: BoltLayout


@dataclass(frozen=True)
class BoltedPlate:
    """The bolt checks of one plate with the layout they use.

    Attributes:
        checks: the ``bolts``, ``load-transfer`` and ``splitting`` checks, the geometry
            of the layout and the net section at its holes.
        layout: the plate's layout.

    """

    checks: tuple[Check, ...]
    layout: PlateLayout


def plate_layout(section: Section, beam: BeamResult, design: DesignSpec, joint: Joint,
                 value: BoltValue, combos: tuple[CombinationResult, ...],
                 system: str) -> BoltLayout:
    """The plate's bolts: the user's stations or spacing, else the largest stock spacing
    (at least 4 D) at which every bolt of every strength combination passes (the most
    loaded station and every transfer zone); the smallest such spacing where none does.
    """
    return _choose(section, beam, design, joint, value, combos, system).layout


#: Transfers (all combinations together) from which a spacing's trial is first decided on
#: plain numbers (``_fails``), so that only the spacing chosen makes its transfers.
QUICK_TRIALS = 32

#: What a trial found under one combination: its transfers and its most loaded station.
_Found = tuple[list[Transfer], StationDemand]


@dataclass(frozen=True)
class _Choice:
    """The layout :func:`plate_layout` chose with what its trial found, for the checks.

    Attributes:
        layout: the layout.
        factors: ``layout_factors`` of the layout (None where no spacing was tried).
        loads: the loads of each combination on the plate (empty where none was tried).
        found: for the index of a combination the trial reached, what it found.

    """

    layout: BoltLayout
    factors: tuple[dict[str, float], dict[str, str]] | None
    loads: tuple[PlateLoads, ...]
    found: dict[int, _Found]


def _choose(section: Section, beam: BeamResult, design: DesignSpec, joint: Joint,
            value: BoltValue, combos: tuple[CombinationResult, ...], system: str) -> _Choice:
    """:func:`plate_layout`, keeping what the trial of the chosen spacing computed (the
    loads of each combination are found once for all the spacings).
    """
    bolt = design.bolt
    L = beam.model.layout.length
    extent = plate_extent(section, joint.steel, L)
    if bolt.stations or bolt.spacing is not None:
        return _Choice(layout_of(section, joint, bolt, extent, bolt.spacing or L, design.us),
                       None, (), {})
    depth = section.depth
    stock = STOCK_SPACINGS_US if system == "US" else STOCK_SPACINGS_SI
    allowed = [s for s in stock if s >= 4 * bolt.diameter] or [stock[-1]]
    loads = tuple(plate_loads(section, beam, c, design, joint.steel, extent) for c in combos)
    many = sum(len(ld.forces) for ld in loads) >= QUICK_TRIALS  # else the trial is as quick
    for s in allowed:
        layout = layout_of(section, joint, bolt, extent, s, design.us)
        factors = layout_factors(section, joint, layout, design, L)
        if s != allowed[-1] and many and _fails(loads, layout, depth, value, combos,
                                                factors[0]):
            continue  # the trial below would stop at a combination over the capacity
        found: dict[int, _Found] = {}
        for k, c in enumerate(combos):
            items = placed_transfers(loads[k], layout, _alpha(loads[k]), depth)
            capacity = value.capacity(c, factors[0])
            gov = governing_within(loads[k], layout, _alpha(loads[k]), items, capacity)
            if gov is None:  # a station carries more than the capacity
                break
            found[k] = (items, gov)
            if not gov.per_bolt <= capacity:
                break
        else:
            break
    return _Choice(layout, factors, loads, found)  # the last one tried where none passes


def _alpha(loads: PlateLoads) -> float:
    """The plate's share of the distributed load of ``loads`` (``transfer.plate_shares``)."""
    assert loads.share is not None
    return loads.share


def _fails(loads: tuple[PlateLoads, ...], layout: BoltLayout, depth: float,
           value: BoltValue, combos: tuple[CombinationResult, ...],
           geometry: Mapping[str, float]) -> bool:
    """True where a combination's most loaded bolts of ``layout`` carry more than the
    capacity, as the trial in :func:`_choose` finds it (``trial_within``; False where it
    cannot tell, so that the trial itself decides).
    """
    for k, c in enumerate(combos):
        within = trial_within(loads[k], layout, _alpha(loads[k]), depth,
                              value.capacity(c, geometry))
        if within is None:
            return False
        if not within:
            return True
    return False


def layout_text(layout: BoltLayout, system: str) -> str:
    """The layout in words (the check's location)."""
    n, rows = len(layout.stations), len(layout.rows)
    stagger = ", staggered" if any(len(r) != rows for r in layout.station_rows) else ""
    gaps = layout.station_gaps
    if gaps and max(gaps) - min(gaps) > 1e-9 * max(gaps):
        return (f"bolt locations at the given stations, {fmt(min(gaps), 'length', system, 3)}"
                f" to {fmt(max(gaps), 'length', system, 3)} apart "
                f"({n} locations, {rows} per location{stagger})")
    return (f"one bolt location every {fmt(layout.spacing, 'length', system, 3)} "
            f"({n} locations, {rows} per location{stagger})")


def governing_station(demands: list[StationDemand]) -> StationDemand:
    """The station whose bolts carry the most."""
    return max(demands, key=lambda d: d.per_bolt)


def plate_bolt_checks(section: Section, beam: BeamResult, design: DesignSpec, joint: Joint,
                      value: BoltValue, system: str, gross: list[Check]) -> list[Check]:
    """The ``bolts`` and ``load-transfer`` checks of one plate, the geometry of its layout
    and the bending and the timbers' shear on the net section at its holes (from the
    ``gross`` bending and shear checks).
    """
    return list(bolted_plate(section, beam, design, joint, value, system, gross).checks)


def net_shear_at_holes(section: Section, beam: BeamResult, design: DesignSpec, joint: Joint,
                       value: BoltValue, system: str, gross: list[Check]) -> list[Check]:
    """Of :func:`bolted_plate`'s checks only the timbers' ``shear`` on the net section at
    the plate's holes, at the layout it chooses (what a segment's checks keep of the
    bolts; the other bolt checks are the whole member's).
    """
    combos = beam.strength() or beam.combinations
    layout = _choose(section, beam, design, joint, value, combos, system).layout
    return net_shear_checks(section, joint, layout, design, beam, gross, system)


def valued_plate_checks(section: Section, beam: BeamResult, design: DesignSpec, joint: Joint,
                        value: BoltValue, system: str, gross: list[Check],
                        layouts: list[PlateLayout] | None, segment: bool,
                        warnings: list[Problem] | None = None) -> list[Check]:
    """The bolt checks of a plate whose bolts could be valued, its layout appended to
    ``layouts``; for a segment's run (``segment``) only the timbers' net-section shear.
    The steel side of the bolts is screened (``bolt_steel``; a missing check in
    ``warnings`` where the screen does not pass).
    """
    if segment:
        return net_shear_at_holes(section, beam, design, joint, value, system, gross)
    made = bolted_plate(section, beam, design, joint, value, system, gross)
    if layouts is not None:
        layouts.append(made.layout)
    return screened(made.checks, section, joint, made.layout.layout, design, warnings)


def bolted_plate(section: Section, beam: BeamResult, design: DesignSpec, joint: Joint,
                 value: BoltValue, system: str, gross: list[Check]) -> BoltedPlate:
    """The checks of :func:`plate_bolt_checks` with the layout they use."""
    strength = beam.strength()
    combos = strength or beam.combinations
    choice = _choose(section, beam, design, joint, value, combos, system)
    layout = choice.layout
    share = plate_share(section, joint.steel)
    steel = section.plies[joint.steel].name
    fasteners = Fasteners(locations=len(layout.stations), rows=len(layout.rows),
                          count=layout.count, spacing=layout.spacing)
    L = beam.model.layout.length
    geo, geo_sources = (choice.factors if choice.factors is not None else
                        layout_factors(section, joint, layout, design, L))
    value = replace(value, sources={**value.sources, **{k: v for k, v in geo_sources.items()
                                                         if k in value.sources}})
    out: list[Check] = geometry_checks(section, joint, layout, design, L, system)
    out += net_checks(section, joint, layout, design, gross, beam)
    out += net_shear_checks(section, joint, layout, design, beam, gross, system)
    extent = layout.extent
    where = layout_text(layout, system)
    said: dict[tuple[str, str, float, tuple[int, ...]], _Words] = {}
    named: dict[int, str] = {}
    zoned: _ZoneWords = {}
    resisted = Shared()
    for k, combo in enumerate(strength):
        f = value.adjusted(combo, geo)
        found = choice.found.get(k)
        loads = (choice.loads[k] if choice.loads else
                 plate_loads(section, beam, combo, design, joint.steel, extent))
        alpha = _alpha(loads)
        if found is None:
            items = placed_transfers(loads, layout, alpha, section.depth)
            found = (items, governing_demand(loads, layout, alpha, items))
        items, gov = found
        source = ("the transfers of the zones it is in" if gov.from_transfers >= gov.net
                  else "the load on its tributary length with the transfers of its zones")
        out.append(Check(
            id="bolts", ply=steel, combination=combo.name, demand=gov.per_bolt,
            capacity=capacity_from(value.reference[1], f, value.partial), quantity="force",
            reference=value.reference, factors=f, partial_factors=dict(value.partial),
            sources=dict(value.sources),
            equation=("load per bolt at its station = max(|alpha w_trib / n + sum (+/-) "
                      "alpha F / n_zone|, sum alpha F / n_zone) <= "
                      f"{value.capacity_symbol}"),
            location=where, fasteners=fasteners, x=gov.x,
            notes=(*value.notes,
                   _share_note(share, alpha),
                   f"Most loaded bolts: station {gov.station + 1} of {len(layout.stations)} "
                   f"at x = {fmt(gov.x, 'span', system)}, {gov.bolts} bolts, governed by "
                   f"{source}.", CAUTION)))
        words = [_words_of(t, layout, system, said, named, zoned) for t in items]
        shared: dict[tuple[int, int], _Zoned] = {}
        first: dict[tuple[int, int], Check] = {}
        out += [_transfer_check(t, w, combo, value, f, steel, shared, first)
                for t, w in zip(items, words, strict=True)]
        shear = own_checks(section, gross).shear_capacity.get(combo.name, {})
        for t, w in zip(items, words, strict=True):
            out += splitting_checks(section, joint, _site(t, w), design,
                                    combo.name, f.get("k_mod"), shear, L, system, resisted)
    return BoltedPlate(tuple(out), PlateLayout(joint.steel, joint, layout))


def _share_note(share: float, alpha: float) -> str:
    """The note on the plate's share alpha a ``bolts`` check takes."""
    if alpha == share:
        return f"Plate's share of the load E_p I_p / EI = {share:.3f}."
    return (f"Plate's share of the load E_p I_p / EI = {share:.3f} at once, {alpha:.3f} on the "
            "final section (timber E_mean / (1 + psi2 k_def), EN 1995-1-1 2.3.2.2): the "
            "larger, taken.")


@dataclass(frozen=True)
class _Words:
    """What the checks of a transfer say of its place, the same under every combination.

    Attributes:
        where: "support at x = ..." or "point load at x = ..." (display units).
        location: the check's location.
        zone: the note on the transfer zone.
        stations: positions of the zone's stations, m.
        heights: heights of the zone's bolts, m.

    """

    where: str
    location: str
    zone: str
    stations: tuple[float, ...]
    heights: tuple[float, ...]


#: The words of a zone (by its stations, bolts and half-width): the end of its note, the
#: positions and the heights of its bolts.
_ZoneWords = dict[tuple[tuple[int, ...], int, float],
                  tuple[str, tuple[float, ...], tuple[float, ...]]]


def _words(t: Transfer, layout: BoltLayout, system: str,
           named: dict[int, str] | None = None, zoned: _ZoneWords | None = None) -> _Words:
    """The words of a transfer's place (``named``: the stations' positions in words, by
    index, filled as they are first written; ``zoned``: what a zone's words are, by its
    stations, bolts and half-width, filled as each is first written).
    """
    key = (t.zone, t.bolts, t.zone_half_width)
    made = None if zoned is None else zoned.get(key)
    if made is None:
        named = {} if named is None else named
        for k in t.zone:
            if k not in named:
                named[k] = fmt(layout.stations[k], "span", system)
        xs = ", ".join(named[k] for k in t.zone)
        made = (f"{fmt(t.zone_half_width, 'length', system)} either side; stations at "
                f"{xs}, {t.bolts} bolts.",
                tuple(layout.stations[k] for k in t.zone),
                tuple(layout.rows[r] for k in t.zone for r in layout.station_rows[k]))
        if zoned is not None:
            zoned[key] = made
    at = fmt(t.x, "span", system)
    where = f"support at x = {at}" if t.kind == "support" else f"point load at x = {at}"
    return _Words(where, t.label if t.kind == "support" else where,
                  f"Transfer zone of the {where}: {made[0]}", made[1], made[2])


def _words_of(t: Transfer, layout: BoltLayout, system: str,
              said: dict[tuple[str, str, float, tuple[int, ...]], _Words],
              named: dict[int, str], zoned: _ZoneWords | None = None) -> _Words:
    """:func:`_words`, made once for each transfer place of one layout (``said``)."""
    key = (t.kind, t.label, t.x, t.zone)
    if key not in said:
        said[key] = _words(t, layout, system, named, zoned)
    return said[key]


def _site(t: Transfer, w: _Words) -> SplitSite:
    force = -t.share * t.force if t.kind == "support" else t.share * t.force
    return SplitSite(w.location, t.x, force, w.stations, w.heights)


def split_site(t: Transfer, layout: BoltLayout, system: str) -> SplitSite:
    """The splitting site of a transfer: at a support the plate's share goes down into
    the timbers, under a point load the bolts push them up (see ``splitting``).
    """
    return _site(t, _words(t, layout, system))


@dataclass(frozen=True)
class _Zoned:
    """What the ``load-transfer`` checks of one combination share for a zone of a given
    number of bolts and stations (the checks' factor, source and fastener values are read,
    never changed, so they may be shared).
    """

    factors: dict[str, float]
    capacity: float
    partial: dict[str, float]
    sources: dict[str, str]
    equation: str
    fasteners: Fasteners


def _zoned(t: Transfer, value: BoltValue, f: dict[str, float],
           shared: dict[tuple[int, int], _Zoned] | None) -> _Zoned:
    key = (t.bolts, len(t.zone))
    found = None if shared is None else shared.get(key)
    if found is None:
        factors = {"n": float(t.bolts), **f}
        found = _Zoned(
            factors, capacity_from(value.reference[1], factors, value.partial),
            dict(value.partial),
            {**value.sources, "n": "bolts in the transfer zone: the stations within the "
             "member depth d of the support or load, at least the nearest (common "
             "practice)"},
            f"alpha F <= n {value.capacity_symbol}",
            Fasteners(locations=len(t.zone), count=t.bolts))
        if shared is not None:
            shared[key] = found
    return found


def _transfer_check(t: Transfer, w: _Words, combo: CombinationResult, value: BoltValue,
                    f: dict[str, float], steel: str,
                    shared: dict[tuple[int, int], _Zoned] | None = None,
                    first: dict[tuple[int, int], Check] | None = None) -> Check:
    """The ``load-transfer`` check of one transfer (``shared``: what the checks of one
    combination share, by the zone's bolts and stations; ``first``: the first check made
    of each of those, from which the next are copied with their own values).
    """
    z = _zoned(t, value, f, shared)
    notes = (w.zone,
             ("The plate does not bear on this support: its share of the reaction reaches "
              "the timbers through these bolts." if t.kind == "support" else
              "The load bears on the timbers: the plate's share enters through these "
              "bolts."), CAUTION)
    key = (t.bolts, len(t.zone))
    like = None if first is None else first.get(key)
    if like is not None and like.combination == combo.name and like.ply == steel:
        return evolve(like, demand=t.demand, location=w.location, x=t.x, notes=notes)
    made = Check(
        id="load-transfer", ply=steel, combination=combo.name, demand=t.demand,
        capacity=z.capacity, quantity="force",
        reference=value.reference, factors=z.factors, partial_factors=z.partial,
        sources=z.sources, equation=z.equation, location=w.location,
        x=t.x, fasteners=z.fasteners, notes=notes)
    if first is not None:
        first[key] = made
    return made
