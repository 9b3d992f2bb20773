"""The transfer of force into a ply at an end of it inside the member (check id
``load-transfer``, the id of the transfers at supports and point loads).

Model (the transformed-section method with common-practice statics of the bolt group):
just inside its end a side-by-side steel plate carries its full share of the section's
actions, so its stress resultants there, the axial force F = sigma_c A_p (sigma_c the
stress at its centroid from the moment), its share of the shear alpha V (alpha = E_p I_p,na /
EI) and its own moment E_p I_p,own M / EI, must be developed by the bolts between the plate's
end and the end of the transfer zone (the stations within the member depth d of the end,
at least the nearest; the rule of :mod:`.transfer`). The bolts share them by the elastic
method: F / n and alpha V / n each, with the moment about the group's centroid in
proportion to each bolt's distance from it, components added by magnitude (conservative).
The actions are taken at the plate's end and at the far end of the zone (d from the end,
or the farthest bolt of the zone where that is farther), on the segment's
section at once and with creep (US: timber moduli / K_cr under the whole moment, NDS 2018
3.5.2 from memory; EU: E_mean / (1 + psi2 k_def), EN 1995-1-1 2.3.2.2(2) from memory), the
worst of the four; on a patterned combination the envelope's largest |M| and |V| over the
member are used (conservative). Demand: n f_max, which is sqrt(F^2 + (alpha V)^2) where the
group takes no moment; capacity: n times the adjusted value of one bolt loaded
perpendicular to the grain (the lower value of a bolt: conservative for the axial part),
with the group action of the row along the grain where F is not zero (US: C_g of NDS 2018
11.3.6; EU: n_ef of EN 1995-1-1 8.5.1.1(4), both from memory). A timber ply, a plate that is
not bolted between or beside timbers, or one whose bolts cannot be valued, is a named
missing check.
"""

from __future__ import annotations

import math
from collections.abc import Mapping, Sequence
from dataclasses import dataclass
from typing import Protocol

from ..actions.analysis import BeamResult, CombinationResult
from ..actions.beam import moment_at
from ..codes import en1995 as ec5
from ..codes import en1995_fasteners as en
from ..codes import nds_fasteners as nf
from ..model.caution import CAUTION
from ..model.combination import eu_duration
from ..model.design import DesignSpec
from ..model.errors import MissingCheck, Problem
from ..model.units import fmt
from ..section.transformed import Section
from .bolt_checks import BoltValue, plate_layout
from .bolt_geometry import layout_factors
from .bolt_layout import BoltLayout
from .check import Check, Fasteners, capacity_from
from .common import Joint, own_checks, side_by_side_joints
from .demands import eu_uls_section
from .eu_lsd import bolt_value as eu_bolt_value
from .splitting import SplitSite, splitting_checks
from .transfer import (
    GroupForce,
    end_zone,
    group_force,
    plate_actions,
    plate_extent,
    shear_left_of,
    shear_right_of,
)
from .us_asd import bolt_value as us_bolt_value


class SegmentLike(Protocol):
    """What is read of a segment (see ``segmented.SegmentResult``)."""

    @property
    def start(self) -> float:
        """Distance from the left end, m."""

    @property
    def end(self) -> float:
        """Distance from the left end, m."""

    @property
    def plies(self) -> tuple[int, ...]:
        """The member's plies acting in it."""

    @property
    def section(self) -> Section:
        """Its transformed section."""

    @property
    def beam(self) -> BeamResult:
        """The beam actions with its stiffness."""


@dataclass(frozen=True)
class PlyEnd:
    """An end of a ply inside the member.

    Attributes:
        ply: index of the ply (the member's).
        key: "from" or "to" (the ply's field).
        x: where it ends, m.
        inward: +1 where the ply runs to the right of its end ("from"), -1 otherwise.

    """

    ply: int
    key: str
    x: float
    inward: int


def ply_ends(section: Section, length: float) -> list[PlyEnd]:
    """Every end of a ply inside the member (beyond the node tolerance of its ends)."""
    out = []
    tol = 1e-9 * max(length, 1.0)
    for i, ply in enumerate(section.plies):
        start, end = ply.extent(length)
        for key, x, inward in (("from", start, 1), ("to", end, -1)):
            if tol < x < length - tol:
                out.append(PlyEnd(i, key, x, inward))
    return out


def _gap(section: Section, e: PlyEnd, why: str) -> MissingCheck:
    ply = section.plies[e.ply]
    return MissingCheck(
        f"plies[{e.ply}].{e.key}", f"{ply.name} ends at x = {fmt(e.x, 'span', 'SI')} inside "
        "the member: the force it carries just inside that end must enter it through the "
        f"fasteners near the end, and that transfer is not checked: {why}")


def ply_end_checks(section: Section, beam: BeamResult, segments: Sequence[SegmentLike],
                   design: DesignSpec, system: str, gross: Sequence[Check] = (),
                   placed: Mapping[int, BoltLayout] | None = None
                   ) -> tuple[list[Check], list[Problem]]:
    """The ``load-transfer`` check of every bolted plate end inside the member under every
    strength combination with the ``splitting`` of its timbers there (``gross``: the
    member's checks, whose shear checks give F'_v on the US basis), and a named missing
    check for every other ply end. ``placed``: the layouts the member's bolt checks chose,
    by plate (on the strength combinations, as here), used instead of choosing them again.
    """
    L = beam.model.layout.length
    ends = ply_ends(section, L)
    if not ends:
        return [], []
    joints = {jt.steel: jt for jt in side_by_side_joints(section)}
    checks: list[Check] = []
    gaps: list[Problem] = []
    combos = beam.strength()
    values: dict[int, tuple[BoltValue, BoltLayout] | None] = {}
    for e in ends:
        jt = joints.get(e.ply)
        if jt is None:
            kind = section.materials[e.ply].kind
            gaps.append(_gap(section, e, "only a steel plate bolted between or beside timbers "
                             f"is checked at its ends, and this ply is {kind} without such "
                             "bolts"))
            continue
        if e.ply not in values:
            values[e.ply] = bolts_of(section, beam, design, jt, system, combos,
                                     (placed or {}).get(e.ply) if combos else None)
        got = values[e.ply]
        if got is None:
            gaps.append(_gap(section, e, "its bolts cannot be valued (see the bolt check's "
                             "missing values)"))
            continue
        if not combos:
            gaps.append(_gap(section, e, "there is no strength combination"))
            continue
        seg = _segment_inside(segments, e, section, beam)
        value, layout = got
        made = [_end_check(section, beam, seg, design, jt, e, value, layout, c, system)
                for c in combos]
        if any(m is None for m in made):
            gaps.append(_gap(section, e, "a single bolt in the transfer zone cannot develop "
                             "the plate's moment; give more rows or stations near the end"))
        checks += [m for m in made if m is not None]
        for c in combos:
            checks += _end_splitting(section, beam, seg, design, jt, e, layout, c, system,
                                     list(gross))
    return checks, gaps


def bolts_of(section: Section, beam: BeamResult, design: DesignSpec, jt: Joint, system: str,
              combos: tuple[CombinationResult, ...], layout: BoltLayout | None = None
              ) -> tuple[BoltValue, BoltLayout] | None:
    """The plate's bolt value and layout, as its ``bolts`` check has them (the warnings of
    a missing value are that check's); ``layout``, where given, is the one that check
    chose.
    """
    scratch: list[Problem] = []
    value = (us_bolt_value(section, design, jt, system, scratch) if design.us
             else eu_bolt_value(section, design, jt, system, scratch))
    if value is None:
        return None
    if layout is not None:
        return value, layout
    return value, plate_layout(section, beam, design, jt, value, combos, system)


@dataclass(frozen=True)
class _Whole:
    """The whole member as one segment (where no segment is given)."""

    start: float
    end: float
    plies: tuple[int, ...]
    section: Section
    beam: BeamResult


def _segment_inside(segments: Sequence[SegmentLike], e: PlyEnd, section: Section,
                    beam: BeamResult) -> SegmentLike:
    """The segment on the ply's side of its end (the member's section with every ply
    where the segments do not hold it).
    """
    for s in segments:
        if e.ply in s.plies and (s.start <= e.x < s.end if e.inward > 0
                                 else s.start < e.x <= s.end):
            return s
    return _Whole(0.0, beam.model.layout.length, tuple(range(len(section.plies))), section,
                  beam)


def _cut_actions(beam: BeamResult, combo: CombinationResult, x: float,
                 inward: int) -> tuple[float, float]:
    """(M, V) on the plate's side of x; the envelope's largest magnitudes over the member
    where the combination is patterned (conservative).
    """
    if combo.patterns_tried > 1:
        ext = combo.extremes
        return max(abs(ext.M_max), abs(ext.M_min)), ext.V_max_abs
    model, sol = beam.model, combo.solution
    V = shear_right_of(model, sol, x) if inward > 0 else shear_left_of(model, sol, x)
    return moment_at(model, sol, x), V


def _states(seg: SegmentLike, combo: CombinationResult, design: DesignSpec) -> list[Section]:
    if design.us:
        return [seg.section, seg.beam.creep_section]
    return [seg.section, eu_uls_section(seg.section, seg.beam, combo, design)]


def _row_factor(section: Section, jt: Joint, layout: BoltLayout, zone: tuple[int, ...],
                design: DesignSpec) -> tuple[str, float, str]:
    """Group action of the row along the grain in the zone: (symbol, value, source)."""
    n_row = max((sum(1 for k in zone if r in layout.station_rows[k])
                 for r in range(len(layout.rows))), default=1)
    xs = sorted(layout.stations[k] for k in zone)
    s = min((b - a for a, b in zip(xs, xs[1:], strict=False)), default=layout.spacing)
    d = design.bolt.diameter
    if not design.us:
        nef = en.n_ef(n_row, s, d)
        return ("n_ef/n", nef / n_row, f"EN 1995-1-1 8.5.1.1(4) (from memory): a row of "
                f"{n_row} bolts along the grain at a1 = {s * 1000:.4g} mm, n_ef = "
                f"min(n, n^0.9 (a1 / 13d)^0.25) = {nef:.4g} (the axial force is along the "
                "grain)")
    plate = section.plies[jt.steel]
    EA_p = float(section.E[jt.steel]) * plate.width * plate.height
    EA_w = sum(float(section.E[j]) * section.plies[j].width * section.plies[j].height
               for j in jt.timbers)
    main, side = (EA_p, EA_w) if jt.steel_is_main else (EA_w, EA_p)
    cg = nf.C_g(n_row, main, side, s, nf.gamma_bolt_steel(d))
    return ("C_g", cg, f"NDS 2018 11.3.6 (from memory): the lesser of the row across the "
            f"depth at a station and the row of {n_row} bolts along the grain in the zone "
            f"(s = {s / 0.0254:.4g} in, A_m and A_s the gross areas of the plies; the axial "
            "force is along the grain)")


def _end_check(section: Section, beam: BeamResult, seg: SegmentLike, design: DesignSpec,
               jt: Joint, e: PlyEnd, value: BoltValue, layout: BoltLayout,
               combo: CombinationResult, system: str) -> Check | None:
    """The check of one plate end under one combination; None where one bolt would have
    to resist a moment.
    """
    L = beam.model.layout.length
    start, end = plate_extent(section, jt.steel, L)
    zone = end_zone(layout, e.x, section.depth)
    bolts = tuple((layout.stations[k], layout.rows[r]) for k in zone
                  for r in layout.station_rows[k])
    reach = max([section.depth, *(abs(layout.stations[k] - e.x) for k in zone)])
    x_far = min(max(e.x + e.inward * reach, start), end)
    local = seg.plies.index(e.ply)
    worst: GroupForce | None = None
    for x in (e.x, x_far):
        M, V = _cut_actions(beam, combo, x, e.inward)
        for sec in _states(seg, combo, design):
            g = group_force(bolts, plate_actions(sec, local, x, M, V))
            if worst is None or g.f_max > worst.f_max:
                worst = g
    assert worst is not None
    if not math.isfinite(worst.f_max):
        return None
    geo = layout_factors(section, jt, layout, design, L)[0]
    f = value.adjusted(combo, geo)
    sources = dict(value.sources)
    if worst.actions.F != 0.0 and len(zone) > 1:
        sym, v, src = _row_factor(section, jt, layout, zone, design)
        if sym == "C_g":
            f["C_g"] = min(f["C_g"], v)
        else:
            f[sym] = v
        sources[sym] = src
    n = len(bolts)
    factors = {"n": float(n), **f}
    plate = section.plies[jt.steel].name
    a = worst.actions
    xs = ", ".join(fmt(layout.stations[k], "span", system) for k in zone)
    sources["n"] = ("bolts between the plate's end and the end of its transfer zone: the "
                    "stations within the member depth d of the end, at least the nearest "
                    "(common practice)")
    return Check(
        id="load-transfer", ply=plate, combination=combo.name, demand=n * worst.f_max,
        capacity=capacity_from(value.reference[1], factors, value.partial), quantity="force",
        reference=value.reference, factors=factors, partial_factors=dict(value.partial),
        sources=sources,
        equation=(f"n f_max <= n {value.capacity_symbol}, f_max = |(F / n + M_g dy / J, "
                  "alpha V / n + M_g dx / J)| (elastic bolt group; n f_max = "
                  "sqrt(F^2 + (alpha V)^2) without moment)"),
        location=f"end of {plate} at x = {fmt(e.x, 'span', system)}", x=e.x,
        fasteners=Fasteners(locations=len(zone), count=n),
        notes=(f"The plate ends at x = {fmt(e.x, 'span', system)}: just inside the end it "
               "carries its share of the section's actions, which the bolts between its end "
               f"and the end of the transfer zone ({fmt(section.depth, 'length', system)}) "
               f"must develop; stations at {xs}, {n} bolts.",
               f"Governing cut x = {fmt(a.x, 'span', system)}: F = "
               f"{fmt(a.F, 'force', system)}, alpha V = {fmt(a.V, 'force', system)}, own "
               f"moment {fmt(a.M_own, 'moment', system)}; about the group's centroid M_g = "
               f"{fmt(worst.M_g, 'moment', system)}, J = {worst.J:.6g} m^2; most loaded "
               f"bolt {fmt(worst.f_max, 'force', system)}.",
               "Actions at the plate's end and at the end of the zone, at once and with "
               "creep, the worst; one bolt's value perpendicular to the grain "
               "(conservative for the part along the grain).", CAUTION))


def _end_splitting(section: Section, beam: BeamResult, seg: SegmentLike, design: DesignSpec,
                   jt: Joint, e: PlyEnd, layout: BoltLayout, combo: CombinationResult,
                   system: str, gross: list[Check]) -> list[Check]:
    """The ``splitting`` of the timbers at a plate's end: the plate's share of the shear
    goes into them through the end zone's bolts (force on the timber -inward alpha V: down
    for gravity loads at either end), the largest over the two cuts and both states.
    """
    L = beam.model.layout.length
    start, end = plate_extent(section, jt.steel, L)
    zone = end_zone(layout, e.x, section.depth)
    reach = max([section.depth, *(abs(layout.stations[k] - e.x) for k in zone)])
    x_far = min(max(e.x + e.inward * reach, start), end)
    local = seg.plies.index(e.ply)
    force = 0.0
    for x in (e.x, x_far):
        M, V = _cut_actions(beam, combo, x, e.inward)
        for sec in _states(seg, combo, design):
            f = -e.inward * plate_actions(sec, local, x, M, V).V
            if abs(f) > abs(force):
                force = f
    if force == 0.0:
        return []
    plate = section.plies[jt.steel].name
    site = SplitSite(f"end of {plate} at x = {fmt(e.x, 'span', system)}", e.x, force,
                     tuple(layout.stations[k] for k in zone),
                     tuple(layout.rows[r] for k in zone for r in layout.station_rows[k]))
    k_mod = None
    if not design.us:
        k_mod = ec5.k_mod(eu_duration(combo.duration), design.service_class)
    return splitting_checks(section, jt, site, design, combo.name, k_mod,
                            own_checks(section, gross).shear_capacity.get(combo.name, {}), L,
                            system)
