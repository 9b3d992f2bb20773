"""The bolt station, load-transfer and support-shear checks written out: which station,
its tributary length and load, the transfer zones, and the timbers' shear beside a
support the plate does not bear on.

Each value is recomputed here with the design modules' own functions (transfer zones,
station loads) on the layout the checks used (``Analysis.layouts``) and compared with the
check's demand.
"""

from __future__ import annotations

import math

import numpy as np

from ..actions.analysis import CombinationResult
from ..design.bolt_layout import BoltLayout
from ..design.check import Check
from ..design.common import Joint, plate_share, shear_point
from ..design.net_section import (
    crept_section,
    demand_state,
    hole_diameter,
    largest_loss,
    net_section,
    net_shear,
    states_of,
)
from ..design.transfer import (
    StationDemand,
    Transfer,
    bolt_share,
    share_basis,
    station_demands,
    support_shear,
    transfers,
    without_plates,
)
from ..pipeline import Analysis
from .numbers import NBSP, TIMES, num, q

IN = 5


def _combo(a: Analysis, c: Check) -> CombinationResult:
    assert a.beam is not None
    return next(cb for cb in a.beam.combinations if cb.name == c.combination)


def plate_setup(a: Analysis, c: Check, plate: str | None = None) -> tuple[Joint, BoltLayout,
                                                                          float]:
    """The joint, the layout and alpha of the distributed load of the plate a bolt check
    is about, under the check's combination (at once where it has none).
    """
    s, beam = a.section, a.beam
    assert beam is not None
    name = plate or c.ply
    placed = next((p for p in a.layouts if s.plies[p.ply].name == name), None)
    if placed is None:
        raise ValueError("the plate's bolt value cannot be made")
    if c.combination is None:
        return placed.joint, placed.layout, plate_share(s, placed.ply)
    share = bolt_share(s, beam, _combo(a, c), a.design, placed.ply)
    return placed.joint, placed.layout, share


def share_lines(a: Analysis, c: Check, plate: int) -> list[str]:
    """How the plate's share alpha of the check's combination is found: at once, and on
    the final section where that is larger (EU; ``transfer.bolt_share``).
    """
    beam = a.beam
    assert beam is not None
    combo = _combo(a, c)
    basis = share_basis(a.section, beam, combo, a.design, plate)
    lines = [f"\u03b1\u2080 = E_p I_p,na / EI = {num(basis.at_once, IN)} at once"]
    if basis.final is not None and basis.final > basis.at_once:
        lines.append(f"\u03b1_fin = {num(basis.final, IN)} on the final section of "
                     f"{combo.name} (timber E_mean / (1 + \u03c8\u2082 k_def), EN 1995-1-1 "
                     f"2.3.2.2); \u03b1 = max(\u03b1\u2080, \u03b1_fin) = "
                     f"{num(basis.alpha, IN)}")
    return lines


def layout_for(a: Analysis, jt: Joint) -> BoltLayout | None:
    """The bolt layout of one plate as its design checks placed it (None where the bolt's
    value cannot be made, so neither can the layout).
    """
    return next((p.layout for p in a.layouts if p.ply == jt.steel), None)


def plate_layouts(a: Analysis) -> list[tuple[Joint, BoltLayout]]:
    """Every bolted plate of the member with its layout, in ply order."""
    if a.beam is None:
        return []
    return [(p.joint, p.layout) for p in a.layouts]


def _items(a: Analysis, c: Check, layout: BoltLayout, share: float) -> list[Transfer]:
    assert a.beam is not None
    return transfers(a.section, a.beam, _combo(a, c), a.design, layout, share)


def _transfer_term(t: Transfer, u: str) -> str:
    return f"{num(t.share, IN)} {TIMES} {q(abs(t.force), 'force', u, IN)} / {t.bolts}"


def _zone_line(t: Transfer, layout: BoltLayout, u: str) -> str:
    xs = ", ".join(q(layout.stations[k], "span", u) for k in t.zone)
    what = "reaction" if t.kind == "support" else "point load"
    return (f"{t.label if t.kind == 'support' else 'Point load'} at x = {q(t.x, 'span', u)}: "
            f"F = {q(abs(t.force), 'force', u, IN)} ({what}); transfer zone: the stations "
            f"within d = {q(t.zone_half_width, 'length', u, IN)} of it (at least the nearest), "
            f"at {xs}: n_zone = {t.bolts} bolts")


def station_text(a: Analysis, c: Check, u: str) -> tuple[list[str], str]:
    """The most loaded station of a ``bolts`` check: its where-lines and its demand."""
    beam = a.beam
    assert beam is not None
    _jt, layout, share = plate_setup(a, c)
    items = _items(a, c, layout, share)
    ds = station_demands(a.section, beam, _combo(a, c), layout, share, items)
    gov: StationDemand = max(ds, key=lambda d: d.per_bolt)
    if not math.isclose(gov.per_bolt, c.demand, rel_tol=1e-9):
        raise ValueError("the sheet's station does not reproduce the check's demand")
    rows = ", ".join(q(y, "length", u) for y in layout.rows)
    where = [f"Layout: {len(layout.stations)} stations from x = {q(layout.stations[0], 'span', u)}"
             f" to {q(layout.stations[-1], 'span', u)}, nominal spacing "
             f"{q(layout.spacing, 'length', u)}"
             f"{'' if layout.placed else ' (the least gap of the given stations)'}; rows at "
             f"y = {rows}; {layout.count} bolts",
             f"Most loaded: station {gov.station + 1} at x = {q(gov.x, 'span', u)}, "
             f"n = {gov.bolts} bolts; tributary x = {q(gov.a, 'span', u)} to "
             f"{q(gov.b, 'span', u)}, distributed load on it w_trib = "
             f"{q(gov.load, 'force', u, IN)}"]
    where += [_zone_line(t, layout, u) for t in gov.transfers]
    where += share_lines(a, c, layout.plate)[1:]  # alpha at once: in the bolt's lines
    terms = [_transfer_term(t, u) for t in gov.transfers]
    if gov.transfers and gov.from_transfers >= gov.net:
        demand = (f"P = \u03a3 \u03b1 F / n_zone = {' + '.join(terms)} = "
                  f"{q(c.demand, 'force', u)}")
        return where, demand
    signed = "".join((" + " if t.kind == "point" else " \u2212 ") + term
                     for t, term in zip(gov.transfers, terms, strict=True))
    demand = (f"P = |\u03b1 w_trib / n \u00b1 \u03b1 F / n_zone| = {num(share, IN)} {TIMES} "
              f"{q(gov.load, 'force', u, IN)} / {gov.bolts}{signed} = {q(c.demand, 'force', u)}")
    return where, demand


def transfer_text(a: Analysis, c: Check, u: str) -> tuple[list[str], str]:
    """A ``load-transfer`` check: its zone and its demand alpha F."""
    _jt, layout, share = plate_setup(a, c)
    t = min((t for t in _items(a, c, layout, share)),
            key=lambda t: (abs(t.x - (c.x or 0.0)), abs(t.demand - c.demand)))
    if not math.isclose(t.demand, c.demand, rel_tol=1e-9):
        raise ValueError("the sheet's transfer does not reproduce the check's demand")
    where = [*share_lines(a, c, layout.plate), _zone_line(t, layout, u)]
    demand = (f"P_t = \u03b1 F = {num(t.share, IN)} {TIMES} {q(abs(t.force), 'force', u, IN)} = "
              f"{q(c.demand, 'force', u)}")
    return where, demand


def support_shear_text(a: Analysis, c: Check, u: str, sym: str) -> tuple[list[str], str]:
    """A timber's shear beside a support the plate does not bear on."""
    beam = a.beam
    assert beam is not None
    k = int(c.location.split()[-1]) - 1
    V = support_shear(beam, _combo(a, c), k)
    s = without_plates(a.section)
    i = next(j for j, p in enumerate(s.plies) if p.name == c.ply)
    y, tau1 = shear_point(s, i)
    b = float(s.profiles[i].width_inside(np.array([y]))[0])
    n = float(s.n[i])
    Q = tau1 * s.I_transformed * b / n
    value = V * n * Q / (s.I_transformed * b)
    if not math.isclose(value, c.demand, rel_tol=1e-7):
        raise ValueError("the sheet's support shear does not reproduce the check's demand")
    where = [f"|V| = {q(V, 'force', u, IN)}: the full shear beside {c.location} under "
             f"{c.combination} (the plate does not bear there, so the timbers carry it all)",
             f"Section without the plate: I_t = {q(s.I_transformed, 'second_moment', u, IN)}; "
             f"Q = {q(Q, 'first_moment', u, IN)} at y = {q(y, 'length', u, IN)}; b = "
             f"{q(b, 'length', u, IN)}; n = {num(n, IN)}"]
    return where, shear_demand_text(sym, V, n, Q, s.I_transformed, b, u,
                                    q(c.demand, "stress", u))


def shear_demand_text(sym: str, V: float, n: float, Q: float, I_t: float, b: float, u: str,
                      result_text: str) -> str:
    """The printed shear stress |V| n Q / (I_t b) with its numbers (SI forces in kN)."""
    kN = f" {TIMES} 1,000{NBSP}N/kN" if u == "SI" else ""
    return (f"{sym} = |V| n Q / (I_t b) = {q(V, 'force', u, IN)}{kN} {TIMES} {num(n, IN)} "
            f"{TIMES} {q(Q, 'first_moment', u, IN)} / ({q(I_t, 'second_moment', u, IN)} "
            f"{TIMES} {q(b, 'length', u, IN)}) = {result_text}")


def geometry_text(a: Analysis, c: Check, u: str) -> tuple[list[str], str]:
    """A geometry rule of a layout: required = multiple x D (or the outer rows' spread)."""
    D = a.design.bolt.diameter
    where = [c.sources.get("required", ""), f"at x = {q(c.x or 0.0, 'span', u)}"]
    if c.reference[0] == "limit":
        _jt, layout, _share = plate_setup(a, c)
        top, bottom = max(layout.rows), min(layout.rows)
        if not math.isclose(top - bottom, c.demand, rel_tol=1e-9, abs_tol=1e-12):
            raise ValueError("the sheet's spread does not reproduce the check's")
        demand = (f"spread = y_top row \u2212 y_bottom row = {q(top, 'length', u, IN)} \u2212 "
                  f"{q(bottom, 'length', u, IN)} = {q(c.demand, 'length', u)}")
        return where, demand
    multiple = c.demand / D
    demand = (f"required = k D = {num(multiple, IN)} {TIMES} {q(D, 'length', u, IN)} = "
              f"{q(c.demand, 'length', u)}")
    return where, demand


def net_text(a: Analysis, c: Check, u: str, sym: str) -> tuple[list[str], str]:
    """Bending on the net section: the gross demand times the loss of section modulus."""
    station, _, plate = c.location.partition(" of ")
    jt, layout, _share = plate_setup(a, c, plate)
    k = int(station.split()[-1]) - 1
    i = next(j for j, p in enumerate(a.section.plies) if p.name == c.ply)
    assert a.beam is not None
    crept = crept_section(a.section, a.beam, c.combination, a.design)
    gross = next(g for g in a.checks if g.id == "bending" and g.ply == c.ply
                 and g.combination == c.combination)
    states = states_of(demand_state(a.section, a.beam, gross, i, a.design), a.design.us)
    loss, net, creep = largest_loss(a.section, crept, jt, layout, i, hole_diameter(a.design),
                                    states)
    if net.station != k:
        raise ValueError("the sheet's net section is not at the check's station")
    if not math.isclose(gross.demand * loss, c.demand, rel_tol=1e-9):
        raise ValueError("the sheet's net section does not reproduce the check's demand")
    holes = ", ".join(q(y, "length", u) for y in net.holes)
    where = [f"Holes of {plate} at station {k + 1} (x = {q(layout.stations[k], 'span', u)}): "
             f"diameter {q(hole_diameter(a.design), 'length', u, IN)} at y = {holes}, through "
             "every ply at those heights (a through-bolt); taken at the largest moment "
             "(conservative)",
             f"Net section{' with creep (timber moduli crept)' if creep else ''}: I_t,net = "
             f"{q(net.I_t, 'second_moment', u, IN)}, neutral axis y = "
             f"{q(net.y_na, 'length', u, IN)}; (c\u2032 / I_t,net) / (c / I_t) = "
             f"{num(loss, IN)} for {c.ply}"
             + (", the larger of the section at once and with creep (the demand's sustained "
                "part creeps)" if len(states) == 2 else ""),
             f"Gross demand {q(gross.demand, 'stress', u, IN)}: the bending check of {c.ply} "
             f"under {c.combination}"]
    demand = (f"{sym}_net = {sym} (c\u2032 / I_t,net) / (c / I_t) = "
              f"{q(gross.demand, 'stress', u, IN + 2)} {TIMES} {num(loss, IN + 2)} = "
              f"{q(c.demand, 'stress', u)}")
    return where, demand


def net_shear_text(a: Analysis, c: Check, u: str, sym: str) -> tuple[list[str], str]:
    """A timber's shear on the net section at a plate's bolt holes, worked again."""
    assert a.beam is not None
    head, _, _x = c.location.rpartition(" at x = ")
    station, _, plate = head.removeprefix("net section at the bolt holes, ").partition(" of ")
    jt, layout, _share = plate_setup(a, c, plate)
    k = int(station.split()[-1]) - 1
    d_hole = hole_diameter(a.design)
    net = net_section(a.section, jt, layout, k, d_hole)
    i = next(j for j, p in enumerate(a.section.plies) if p.name == c.ply)
    ns = net_shear(a.section, i, net, d_hole)
    V = combination_of(a, c).extremes.V_max_abs
    if not math.isclose(ns.unit * V, c.demand, rel_tol=1e-9):
        raise ValueError("the sheet's net section does not reproduce the check's shear")
    where = [c.equation, *c.notes,
             f"Net section: I_t,net = {q(ns.I_t, 'second_moment', u, IN)}, neutral axis y = "
             f"{q(net.y_na, 'length', u, IN)}; Q_net = {q(ns.Q, 'first_moment', u, IN)} of "
             f"{c.ply} beyond the cut y = {q(ns.y, 'length', u, IN)}"]
    return where, shear_demand_text(sym, V, ns.n, ns.Q, ns.I_t, ns.b, u, q(c.demand, "stress",
                                                                           u))


def combination_of(a: Analysis, c: Check) -> CombinationResult:
    """The combination a check is made under."""
    assert a.beam is not None
    return next(cb for cb in a.beam.combinations if cb.name == c.combination)
