"""Bending on the net section at a plate's bolt holes (check id ``bending-net``).

Timber: NDS 2018 3.1.2 (net section at holes, from memory) or EN 1995-1-1 5.1(2) (the
reduction of the cross-section by holes); the holes of one station are taken out of the
plies the bolts pass through (every ply at the holes' heights: a through-bolt), with the
hole diameter D + 1/16 in (US, NDS 2018 12.1.3.2, from memory) or d + 1 mm (EU,
EN 1995-1-1 10.4.3, from memory).
Steel plate: AISC 360-16 B4.3 (net area) and F13.1 (from memory): where
F_u A_fn < Y_t F_y A_fg for the plate's tension half, the capacity is multiplied by
F_u A_fn / (Y_t F_y A_fg), Y_t = 1.0 for F_y / F_u <= 0.8; EN 1993-1-1 6.2.5(4) likewise
(0.9 A_f,net f_u / gamma_M2 >= A_f f_y / gamma_M0, from memory).

Demand: the ply's gross bending demand (its ``bending`` check of the combination) times
the loss of section modulus at the station where the holes reduce it most,
(c' / I_t,net) / (c / I_t): the holes are taken at the point of the largest moment
(conservative where no station is there).

Shear on the net section at the holes (check id ``shear``, located "net section at the
bolt holes"), NDS 2018 3.1.2 / EN 1995-1-1 5.1(2) (from memory): in each timber of the
joint, f_v = |V| n_i Q_i,net / (I_t,net b_i), with I_t,net the transformed net section
of the station (above) and Q_i,net the first moment about its neutral axis of the part of
the timber's net area beyond the cut (its holes taken out), at the net neutral axis and at
each hole's edge, the largest governing; b_i the timber's width (a cut at a hole's edge
passes through the whole width). V is the combination's largest |V| (conservative: at
least the shear at any bolt station, the stations nearest the supports included), the
station the one whose holes give the largest stress; the capacity that of the timber's
own shear check (F'v, or f_v,d with k_cr).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..actions.analysis import BeamResult
from ..model.constants import INCH
from ..model.design import DesignSpec
from ..model.units import fmt
from ..section.transformed import Section
from .bolt_layout import BoltLayout
from .check import Check, evolve
from .common import Joint, own_checks
from .demands import eu_uls_section, ply_demands
from .memo import once, with_partner


def hole_diameter(design: DesignSpec) -> float:
    """Bolt hole diameter, m (see the module docstring)."""
    d = design.bolt.diameter
    return d + (INCH / 16 if design.us else 0.001)


@dataclass(frozen=True)
class NetSection:
    """The section at one station with its holes taken out.

    Attributes:
        station: the station's index.
        y_na: neutral axis of the net section, m.
        I_t: transformed second moment of the net section (reference modulus), m^4.
        holes: heights of the holes, m.

    """

    station: int
    y_na: float
    I_t: float
    holes: tuple[float, ...]


def net_section(section: Section, joint: Joint, layout: BoltLayout, k: int,
                d_hole: float) -> NetSection:
    """Exact moments of the transformed section less a d_hole high rectangle, as wide as
    each ply the bolt passes through, at every hole of station k: a through-bolt crosses
    every ply at its height, not only the plate's and its joint's timbers (plies side by
    side, such as a doubled joist with a plate on each face, lose their holes too).
    """
    heights = tuple(layout.rows[r] for r in layout.station_rows[k])
    plies = tuple(range(len(section.plies)))
    found = once(section, ("holes_removed", plies, heights, d_hole),
                 lambda: holes_removed(section, plies, heights, d_hole, k))
    return found if found.station == k else evolve(found, station=k)


def holes_removed(section: Section, plies: tuple[int, ...], heights: tuple[float, ...],
                  d_hole: float, station: int) -> NetSection:
    """The section less a d_hole high rectangle as wide as each of ``plies`` at every
    height in ``heights`` (exact moments).
    """
    n = section.E / section.E_ref
    S0 = float(np.sum(n * section.area))
    S1 = float(np.sum(n * section.first_y))
    S2 = float(np.sum(n * section.second_y))
    for i in plies:
        ply = section.plies[i]
        b = ply.width
        for y, h in _taken(ply.y, ply.top, heights, d_hole):
            A = b * h
            S0 -= float(n[i]) * A
            S1 -= float(n[i]) * A * y
            S2 -= float(n[i]) * (A * y * y + b * h**3 / 12)
    y_na = S1 / S0
    return NetSection(station, y_na, S2 - S1 * y_na, heights)


def _taken(lo: float, hi: float, heights: tuple[float, ...], d_hole: float
           ) -> list[tuple[float, float]]:
    """The (centre, height) of what the holes take out of a ply from ``lo`` to ``hi``: a
    hole wholly inside it as it is; one that runs past an edge only within the ply, and
    holes that overlap once (the band of :func:`_bands`), so that no hole takes out
    material the ply does not have.
    """
    bands = _bands(lo, hi, heights, d_hole)
    whole = {(y - d_hole / 2, y + d_hole / 2): y for y in heights}
    out = []
    for a, b in bands:
        y = whole.get((a, b))
        out.append((y, d_hole) if y is not None else ((a + b) / 2, b - a))
    return out


def net_fibres(section: Section, net: NetSection, i: int) -> tuple[float, float]:
    """Stress at ply i's top and bottom fibres per unit moment on the net section, Pa per
    N m: -E_i (y - y_na,net) / (E_ref I_t,net).
    """
    E_i, k = float(section.E[i]), section.E_ref * net.I_t
    return (-E_i * (float(section.y_top[i]) - net.y_na) / k,
            -E_i * (float(section.y_bottom[i]) - net.y_na) / k)


def modulus_loss(section: Section, i: int, net: NetSection) -> float:
    """(c' / I_t,net) / (c / I_t) of ply i: how much its extreme stress grows."""
    top, bot = float(section.y_top[i]), float(section.y_bottom[i])
    y0 = section.neutral_axis_y
    c = max(abs(top - y0), abs(bot - y0))
    c_net = max(abs(top - net.y_na), abs(bot - net.y_na))
    return (c_net / net.I_t) / (c / section.I_transformed)


def f13_factor(section: Section, joint: Joint, net: NetSection, d_hole: float,
               us: bool) -> float:
    """AISC 360-16 F13.1 (US) or EN 1993-1-1 6.2.5(4) (EU) for the plate's tension half
    (the larger loss of the two halves): 1.0 where the rupture rule does not govern, 0.0
    where the holes take the whole half (no net area is left).
    """
    mat = section.materials[joint.steel]
    Fy, Fu = mat.value("Fy"), mat.value("Fu")
    if Fy is None or Fu is None:
        return 1.0
    ply = section.plies[joint.steel]
    mid = ply.y + ply.height / 2
    worst = 1.0
    for lo, hi in ((ply.y, mid), (mid, ply.top)):
        A_fg = ply.width * (hi - lo)
        holes = sum(1 for y in net.holes if lo <= y < hi)
        A_fn = A_fg - holes * ply.width * d_hole
        if us:
            Yt = 1.0 if Fy / Fu <= 0.8 else 1.1
            need, have = Yt * Fy * A_fg, Fu * A_fn
        else:
            need, have = Fy * A_fg / 1.0, 0.9 * Fu * A_fn / 1.25
        if have < need:  # holes wider than the half leave nothing: 0, the check fails
            worst = min(worst, max(have, 0.0) / need)
    return worst


def crept_section(section: Section, beam: BeamResult, combination: str | None,
                  design: DesignSpec) -> Section:
    """The section with crept timber moduli that a combination's demands with creep use
    (US: timber moduli / K_cr; EU: the combination's final section).
    """
    if design.us or combination is None:
        return beam.creep_section
    combo = next(c for c in beam.combinations if c.name == combination)
    return eu_uls_section(section, beam, combo, design)


def demand_state(section: Section, beam: BeamResult, c: Check, i: int,
                 design: DesignSpec) -> str | None:
    """The state of a gross ``bending`` demand of ply i: "instantaneous" or "with creep"
    (``demands.ply_demands``, the demand it was made from); None where none matches.
    """
    combo = next((cb for cb in beam.combinations if cb.name == c.combination), None)
    if combo is None:
        return None
    final = None if design.us else eu_uls_section(section, beam, combo, design)
    return next((d.state for d in ply_demands(section, beam, combo, i, design, eu_final=final)
                 if d.stress == c.demand and d.x == c.x), None)


def states_of(state: str | None, us: bool) -> tuple[bool, ...]:
    """The sections a net demand's loss is sought on (False at once, True with creep):
    an instantaneous demand at once; one with creep on the EU basis on the final section
    (the whole combination acts there); on the US basis both (its sustained part acts
    with creep, the rest at once: the larger loss bounds the sum), as for a demand of no
    known state.
    """
    if state == "instantaneous":
        return (False,)
    if state == "with creep" and not us:
        return (True,)
    return (False, True)


def largest_loss(section: Section, crept: Section, joint: Joint, layout: BoltLayout, i: int,
                 d_hole: float, states: tuple[bool, ...] = (False, True)
                 ) -> tuple[float, NetSection, bool]:
    """The largest loss of section modulus of ply i at the holes of any station, on the
    section at once and (or) with creep (``states``, :func:`states_of`): (loss, the net
    section, True where with creep; at once where the two are equal).
    """
    best: tuple[float, NetSection, bool] | None = None
    for sec, creep in ((section, False), (crept, True)):
        if creep not in states:
            continue
        loss, net = _station_loss(sec, joint, layout, i, d_hole)
        if best is None or loss > best[0]:
            best = (loss, net, creep)
    assert best is not None
    return best


def _station_loss(section: Section, joint: Joint, layout: BoltLayout, i: int, d_hole: float
                  ) -> tuple[float, NetSection]:
    """The largest loss of ply i over the stations of ``layout`` and its net section (the
    first station of the largest), found once per section, layout and ply.
    """
    def make() -> tuple[float, NetSection]:
        best: tuple[float, NetSection] | None = None
        for net in _nets(section, joint, layout, d_hole):
            loss = modulus_loss(section, i, net)
            if best is None or loss > best[0]:
                best = (loss, net)
        assert best is not None
        return best
    return with_partner(section, ("station_loss", i, d_hole, joint), layout, make)


def _nets(section: Section, joint: Joint, layout: BoltLayout, d_hole: float
          ) -> tuple[NetSection, ...]:
    """:func:`net_section` of every station of ``layout``, found once per section."""
    return with_partner(section, ("nets", d_hole, joint), layout, lambda: tuple(
        net_section(section, joint, layout, k, d_hole) for k in range(len(layout.stations))))


def net_checks(section: Section, joint: Joint, layout: BoltLayout, design: DesignSpec,
               gross: list[Check], beam: BeamResult) -> list[Check]:
    """A ``bending-net`` check for the plate and each of its timbers under every
    combination of their ``bending`` checks: the gross demand times the largest loss of
    section modulus at the holes (:func:`largest_loss`).
    """
    d_hole = hole_diameter(design)
    out = []
    for i in (*joint.timbers, joint.steel):
        name = section.plies[i].name
        for c in own_checks(section, gross).bending.get(name, ()):
            crept = crept_section(section, beam, c.combination, design)
            states = states_of(demand_state(section, beam, c, i, design), design.us)
            loss, net, creep = largest_loss(section, crept, joint, layout, i, d_hole, states)
            extra: dict[str, float] = {}
            if i == joint.steel:
                extra = {"F13.1": f13_factor(section, joint, net, d_hole, design.us)}
            factors = {**c.factors, **extra}
            capacity = c.capacity * extra.get("F13.1", 1.0)
            state = " with creep (timber moduli crept)" if creep else ""
            out.append(evolve(
                c, id="bending-net", demand=c.demand * loss, capacity=capacity,
                factors=factors, sources={**c.sources, **(
                    {"F13.1": "AISC 360-16 F13.1 (from memory)" if design.us else
                     "EN 1993-1-1 6.2.5(4) (from memory)"} if extra else {})},
                equation="f_net = f_gross (c' / I_t,net) / (c / I_t) <= capacity",
                location=f"station {net.station + 1} of {section.plies[joint.steel].name}",
                notes=(f"Net section{state} at the holes of station {net.station + 1} "
                       f"(hole diameter {d_hole * 1000:.4g} mm): I_t,net = {net.I_t:.6g} m^4, "
                       f"neutral axis y = {net.y_na:.6g} m; section modulus loss "
                       f"{loss:.5g}{_of_states(states)}; holes taken at the largest moment "
                       "(conservative).",)))
    return out


def _of_states(states: tuple[bool, ...]) -> str:
    if len(states) == 2:
        return ", the larger at once and with creep (the demand's sustained part creeps)"
    return " with creep (the demand's state)" if states[0] else ""


@dataclass(frozen=True)
class NetShear:
    """The largest shear stress of one timber on the net section of one station.

    Attributes:
        station: the station's index.
        y: height of the governing cut, m.
        Q: the timber's own first moment of its net area beyond the cut about the net
            neutral axis, m^3 (magnitude).
        b: the timber's width at the cut, m.
        n: E_i / E_ref of the timber.
        I_t: transformed second moment of the net section, m^4.

    """

    station: int
    y: float
    Q: float
    b: float
    n: float
    I_t: float

    @property
    def unit(self) -> float:
        """Shear stress per newton of V, Pa per N: n Q / (I_t b)."""
        return self.n * self.Q / (self.I_t * self.b)


def _solid(lo: float, hi: float, bands: list[tuple[float, float]]) -> list[tuple[float, float]]:
    """The parts of [lo, hi] outside the (sorted, disjoint) hole bands."""
    out, y = [], lo
    for a, b in bands:
        if b <= y or a >= hi:
            continue
        if a > y:
            out.append((y, a))
        y = max(y, b)
    if y < hi:
        out.append((y, hi))
    return out


def _bands(lo: float, hi: float, heights: tuple[float, ...],
           d_hole: float) -> list[tuple[float, float]]:
    """The hole bands inside [lo, hi], sorted, overlapping ones merged."""
    out: list[tuple[float, float]] = []
    for y in sorted(heights):
        a, b = max(lo, y - d_hole / 2), min(hi, y + d_hole / 2)
        if b <= a:
            continue
        if out and a <= out[-1][1]:
            out[-1] = (out[-1][0], max(out[-1][1], b))
        else:
            out.append((a, b))
    return out


def net_shear(section: Section, i: int, net: NetSection, d_hole: float) -> NetShear:
    """Timber i's largest shear stress per unit V on the net section ``net`` (a
    rectangle with its holes taken out; see the module docstring). Cuts above the net
    neutral axis take the part above, cuts below it the part below; at the neutral axis
    both are taken and the larger kept.
    """
    ply = section.plies[i]
    lo, hi, b, y0 = ply.y, ply.top, ply.width, net.y_na
    bands = _bands(lo, hi, net.holes, d_hole)

    def first_moment(a: float, c: float) -> float:
        return sum(b * (t - s) * ((s + t) / 2 - y0) for s, t in _solid(a, c, bands))

    cuts: list[tuple[float, float]] = []
    if lo < y0 < hi and not any(a < y0 < c for a, c in bands):
        cuts += [(y0, first_moment(y0, hi)), (y0, -first_moment(lo, y0))]
    for a, c in bands:
        for y in (a, c):
            if lo < y < hi:
                cuts.append((y, first_moment(y, hi) if y >= y0 else -first_moment(lo, y)))
    y, Q = max(cuts, key=lambda t: abs(t[1])) if cuts else (y0, 0.0)
    return NetShear(net.station, y, abs(Q), b, float(section.E[i]) / section.E_ref, net.I_t)


def net_shear_checks(section: Section, joint: Joint, layout: BoltLayout, design: DesignSpec,
                     beam: BeamResult, gross: list[Check], system: str) -> list[Check]:
    """A ``shear`` check of each timber of the joint on the net section at its bolt holes
    under every combination of its own shear check (see the module docstring).
    """
    d_hole = hole_diameter(design)
    nets = [net_section(section, joint, layout, k, d_hole) for k in range(len(layout.stations))]
    supports = beam.model.layout.support_positions()
    plate = section.plies[joint.steel].name

    def to_support(k: int) -> float:
        return min(abs(layout.stations[k] - s) for s in supports)

    def shear_of(i: int, net: NetSection) -> NetShear:
        found = once(section, ("net_shear", i, net.holes, net.y_na, net.I_t, d_hole),
                     lambda: net_shear(section, i, net, d_hole))
        return found if found.station == net.station else evolve(found, station=net.station)

    own_shear = own_checks(section, gross).shear
    out = []
    for i in joint.timbers:
        name = section.plies[i].name
        found = [shear_of(i, net) for net in nets]
        if not found:
            continue
        top = max(f.unit for f in found)
        gov = min((f for f in found if f.unit >= top * (1 - 1e-12)),
                  key=lambda f: to_support(f.station))
        x = layout.stations[gov.station]
        where = fmt(x, "span", system)
        holes = ", ".join(fmt(y, "length", system) for y in nets[gov.station].holes)
        for combo in beam.strength():
            own = own_shear.get((name, combo.name))
            if own is None:
                continue
            V = combo.extremes.V_max_abs
            out.append(evolve(
                own, demand=gov.unit * V, x=x,
                location=f"net section at the bolt holes, station {gov.station + 1} of "
                         f"{plate} at x = {where}",
                equation="f_v = |V| n Q_net / (I_t,net b) <= the ply's shear capacity",
                sources={**own.sources, "net section": (
                    "NDS 2018 3.1.2 (from memory)" if design.us
                    else "EN 1995-1-1 5.1(2) (from memory)")},
                notes=(f"Holes of {plate} at station {gov.station + 1} (x = {where}): "
                       f"diameter {fmt(d_hole, 'length', system)} at y = {holes}, taken out "
                       f"of every ply at those heights (a through-bolt); the cut at y = "
                       f"{fmt(gov.y, 'length', system)} governs (net neutral axis and each "
                       "hole's edge tried).",
                       f"|V| = {fmt(V, 'force', system)}: the combination's largest shear "
                       "(conservative: at least the shear at any bolt station).")))
    return out
