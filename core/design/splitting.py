"""Splitting of a timber where a plate's bolts load it perpendicular to the grain (check
id ``splitting``).

Where the bolts of a transfer zone push a timber towards one of its edges (the loaded
edge), the timber may split along the grain at the bolts. The sites: a support the plate
does not bear on (the plate's share alpha R goes down into the timbers), a point load that
bears on the timbers (alpha P goes up into the plate, so the bolts push the timbers up) and
an end of the plate inside the member (the plate's share of the shear, alpha V, goes into
the timbers there). The force of a site is shared by the timbers of the joint in proportion
to E b (equal halves for a flitch of like timbers).

EU: EN 1995-1-1 8.1.4 (from memory): F_v,Ed <= F_90,Rd = k_mod F_90,Rk / gamma_M, F_90,Rk =
14 b w sqrt(h_e / (1 - h_e / h)) (N, mm; w = 1 for bolts), h_e the distance from the loaded
edge to the centre of the most distant bolt; F_v,Ed is taken as the whole force the timber
receives (the larger of the shears either side of the connection is never more:
conservative).

US: NDS 2018 3.4.3.3 (from memory): the shear the connection puts into the timber V <=
V'_r = (2/3) F'_v b d_e, times (d_e / d)^2 where the connection is less than 5 d from the
end of the member; for bolts and lag screws d_e = d less the distance from the unloaded
edge to the centre of the nearest bolt (= h_e here; the nearest edge is the rule of split
rings and shear plates). V: the whole force the timber receives at the site (the larger of
the shears either side of the connection is never more).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ..codes import en1995_fasteners as en
from ..model.design import DesignSpec
from ..model.units import fmt
from ..section.transformed import Section
from .check import Check, capacity_from, evolve
from .common import Joint
from .memo import once

#: EN 1995-1-1 Table 2.3, connections (from memory).
GAMMA_M_CONNECTION = 1.3


@dataclass(frozen=True)
class SplitSite:
    """Where a plate's bolts push the timbers across the grain.

    Attributes:
        label: the site (the check's location).
        x: its position along the member, m.
        force: the force the bolts put into the timbers there, N (upward positive).
        stations: positions of the bolt stations delivering it, m.
        heights: heights of those bolts, m.

    """

    label: str
    x: float
    force: float
    stations: tuple[float, ...]
    heights: tuple[float, ...]


def _share(section: Section, joint: Joint, j: int) -> float:
    """Timber j's share of the joint's timbers, in proportion to E b."""
    def weight(k: int) -> float:
        return float(section.E[k]) * section.plies[k].width
    return weight(j) / sum(weight(k) for k in joint.timbers)


def _shares(section: Section, joint: Joint) -> dict[int, float]:
    """:func:`_share` of every timber of the joint, found once per section and joint."""
    return once(section, ("splitting shares", joint),
                lambda: {j: _share(section, joint, j) for j in joint.timbers})


@dataclass(frozen=True)
class _Resistance:
    """What the ``splitting`` checks of one timber share wherever its bolts stand alike:
    the capacity with its factors, sources, equation and note (read, never changed, so
    they may be shared by the checks).
    """

    capacity: float
    reference: tuple[str, float]
    factors: dict[str, float]
    partial: dict[str, float]
    sources: dict[str, str]
    equation: str
    notes: tuple[str, ...]


def _eu_resistance(b: float, h_e: float, h: float, k_mod: float) -> _Resistance:
    """EN 1995-1-1 8.1.4 (from memory): k_mod F_90,Rk / gamma_M."""
    F90 = en.F90_Rk(b, h_e, h)
    f = {"k_mod": k_mod}
    g = {"gamma_M": GAMMA_M_CONNECTION}
    return _Resistance(
        capacity_from(F90, f, g), ("F_90,Rk", F90), f, g,
        {"F_90,Rk": "EN 1995-1-1 8.1.4 (8.4), w = 1 (from memory)",
         "k_mod": "EN 1995-1-1 Table 3.1 (from memory)",
         "gamma_M": "EN 1995-1-1 Table 2.3, connections (from memory)"},
        "F_v,Ed <= k_mod 14 b w sqrt(h_e / (1 - h_e / h)) / gamma_M",
        (f"b = {b * 1000:.4g} mm, h = {h * 1000:.4g} mm, h_e = "
         f"{h_e * 1000:.4g} mm (loaded edge to the most distant bolt); F_v,Ed "
         "= the whole force into this timber (conservative).",))


def _us_resistance(Fv: float, b: float, h: float, d_e: float, near_end: bool,
                   system: str) -> _Resistance:
    """NDS 2018 3.4.3.3 (from memory): (2/3) F'v b d_e, times (d_e / d)^2 near an end."""
    V_r = 2 / 3 * Fv * b * d_e
    f = {"(d_e/d)^2": (d_e / h) ** 2} if near_end else {}
    return _Resistance(
        capacity_from(V_r, f), ("(2/3) F'v b d_e", V_r), f, {},
        {"(2/3) F'v b d_e": "NDS 2018 3.4.3.3 (from memory): F'v the timber's "
         "adjusted shear value under the combination (its shear check), d_e = d "
         "less the distance from the unloaded edge to the centre of the nearest "
         "bolt",
         **({"(d_e/d)^2": "NDS 2018 3.4.3.3(a): connection less than 5d from "
             "the end of the member (from memory)"} if near_end else {})},
        "V <= (2/3) F'v b d_e (d_e / d)^2" if near_end else "V <= (2/3) F'v b d_e",
        (f"F'v = {fmt(Fv, 'stress', system)}, d = {fmt(h, 'length', system)}, "
         f"d_e = {fmt(d_e, 'length', system)}, b = {fmt(b, 'length', system)}; "
         "V = the whole force into this timber (conservative).",))


@dataclass(frozen=True)
class _Timber:
    """What the ``splitting`` checks read of one timber of a joint, the same at every site.

    Attributes:
        index: the ply's index.
        name: its name.
        bottom: height of its bottom edge, m.
        top: height of its top edge, m.
        width: its width b, m.

    """

    index: int
    name: str
    bottom: float
    top: float
    width: float


def _timbers(section: Section, joint: Joint) -> tuple[_Timber, ...]:
    """The joint's timbers as the checks read them, found once per section and joint."""
    return once(section, ("splitting timbers", joint), lambda: tuple(
        _Timber(j, section.plies[j].name, float(section.y_bottom[j]),
                float(section.y_top[j]), section.plies[j].width) for j in joint.timbers))


class Shared:
    """What the sites of one caller share, each found at its first use: the resistances
    by timber and what sets them, the words of the bolts' heights and each set of
    stations' distance to the nearer end of the member (read, never changed).
    """

    __slots__ = ("ends", "first", "heights", "joint", "resistances", "section", "shares",
                 "timbers")

    def __init__(self) -> None:
        """Nothing found yet."""
        self.resistances: dict[tuple[object, ...], _Resistance] = {}
        self.first: dict[tuple[object, ...], Check] = {}  # the first check of each
        self.heights: dict[tuple[tuple[float, ...], str], str] = {}
        self.ends: dict[tuple[tuple[float, ...], float], float] = {}
        self.section: Section | None = None  # the timbers (and shares) are this
        self.joint: Joint | None = None  # section's and joint's
        self.timbers: tuple[_Timber, ...] = ()
        self.shares: dict[int, float] | None = None

    def timbers_of(self, section: Section, joint: Joint) -> tuple[_Timber, ...]:
        """:func:`_timbers`, asked once while the section and joint stay the same."""
        if self.section is not section or self.joint != joint:
            self.section, self.joint = section, joint
            self.timbers, self.shares = _timbers(section, joint), None
        return self.timbers

    def shares_of(self, section: Section, joint: Joint) -> dict[int, float]:
        """:func:`_shares` of the section and joint of :meth:`timbers_of`."""
        if self.shares is None:
            self.shares = _shares(section, joint)
        return self.shares


def _heights_text(heights: tuple[float, ...], system: str, memo: Shared) -> str:
    """The bolts' heights in words, lowest first, each once."""
    key = (heights, system)
    text = memo.heights.get(key)
    if text is None:
        text = memo.heights[key] = ", ".join(fmt(y, "length", system)
                                             for y in sorted(set(heights)))
    return text


def _nearest_end(stations: tuple[float, ...], length: float, memo: Shared) -> float:
    """The distance from the stations to the nearer end of the member, m."""
    key = (stations, length)
    found = memo.ends.get(key)
    if found is None:
        found = memo.ends[key] = min(min(x, length - x) for x in stations)
    return found


def splitting_checks(section: Section, joint: Joint, site: SplitSite, design: DesignSpec,
                     combination: str, k_mod: float | None, shear_capacity: dict[str, float],
                     length: float, system: str, shared: Shared | None = None) -> list[Check]:
    """The ``splitting`` check of every timber of the joint at one site under one
    combination. EU: ``k_mod`` of the combination; US: ``shear_capacity`` (F'_v of each
    timber under the combination, by ply name; a timber without one is left out).
    ``shared``: what earlier sites of the same caller found (filled here).
    """
    memo = Shared() if shared is None else shared
    timbers = memo.timbers_of(section, joint)
    if not timbers:
        return []
    out = []
    resistances, first = memo.resistances, memo.first
    us = design.us
    heights = site.heights
    # the loaded edge and the most distant bolt from it, as ``_edge`` finds them
    down = site.force < 0
    edge = "bottom" if down else "top"
    far = max(heights) if down else min(heights)
    location: str | None = None  # the site's words and the timbers' shares, at first use
    shares: dict[int, float] = {}
    nearest_end: float | None = None  # from the bolts to the nearer end of the member
    for tb in timbers:
        lo, hi = tb.bottom, tb.top
        h_e, h = (far - lo, hi - lo) if down else (hi - far, hi - lo)
        b = tb.width
        if not us:
            if k_mod is None or not 0 < h_e < h:
                continue
            key: tuple[object, ...] = ("EU", b, h_e, h, k_mod)
            r = resistances.get(key)
            if r is None:
                r = resistances[key] = _eu_resistance(b, h_e, h, k_mod)
        else:
            Fv = shear_capacity.get(tb.name)
            if Fv is None or h_e <= 0:
                continue
            d_e = min(h_e, h)  # to the centre of the bolt nearest the unloaded edge
            if nearest_end is None:
                nearest_end = _nearest_end(site.stations, length, memo)
            near_end = nearest_end < 5 * h
            key = ("US", Fv, b, h, d_e, near_end, system)
            r = resistances.get(key)
            if r is None:
                r = resistances[key] = _us_resistance(Fv, b, h, d_e, near_end, system)
        if location is None:
            location = (f"{site.label}: bolts at y = {_heights_text(heights, system, memo)}"
                        f"; loaded edge {edge}")
            shares = memo.shares_of(section, joint)
        demand = abs(site.force) * shares[tb.index]
        like = first.get(key)
        if like is None:
            like = first[key] = Check(
                id="splitting", ply=tb.name, combination=combination, demand=demand,
                capacity=r.capacity, quantity="force", reference=r.reference,
                factors=r.factors, partial_factors=r.partial, sources=r.sources,
                equation=r.equation, location=location, x=site.x, notes=r.notes)
            out.append(like)
        else:  # the same resistance: the check made before with this site's own values
            out.append(evolve(like, ply=tb.name, combination=combination, demand=demand,
                              location=location, x=site.x))
    return out


def shear_capacities(gross: list[Check], combination: str) -> dict[str, float]:
    """F'_v of every timber under a combination: the capacity of its ordinary shear check
    (the one with no location).
    """
    return {c.ply: c.capacity for c in gross if c.id == "shear" and c.ply is not None
            and c.combination == combination and not c.location
            and math.isfinite(c.capacity)}
