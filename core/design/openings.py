"""Checks of notches and holes in the timber plies.

Notches (check id ``shear-notch``), one per notch and strength combination. The notched
plies (default every timber ply) take the whole shear there (conservative: no share is
given to the other plies); b is the sum of their widths, d the smallest of their depths,
d_n = d - notch depth. V: the largest reaction of the support (a notch at a support) or
|V| either side of the position, under the combination with every region loaded.
US (NDS 2018 3.4.3.2, from memory): tension-face notch f_v = 3 V / (2 b d_n) <= F'v
(d_n / d)^2 (equation 3.4-3); compression-face notch f_v = 3 V / (2 b d_e) <= F'v with
d_e = d - (d - d_n) e / d_n (e <= d_n, else d_n), e taken as the notch length (the
largest it can be). A bottom notch is on the tension face, a top one on the compression
face, except over an interior support (hogging). Limits NDS 2018 4.4.3: at the ends
at most d / 4, elsewhere at most d / 6 and never in the middle third of a span; a notch
outside them is NOT OK (capacity 0) with its message. EU (EN 1995-1-1 6.5.2, from
memory): tau_d = 1.5 V / (b h_ef) <= k_v f_v,d with k_v of (6.62) for a notch on the
side of the support (x taken as the notch length, i = 0), k_v = 1 on the opposite side.
F'v and f_v,d are those of the ply's own shear check (every factor included).

Holes (check id ``bending-net``, and ``shear`` at the net section): the bored plies
lose a band as high as the hole over their whole width; the net section is analysed
again and the ply's fibre stress under M(x), and its shear stress under |V(x)|, are
compared with the capacities of the ply's own bending and shear checks.
"""

from __future__ import annotations

from collections.abc import Callable, Sequence
from dataclasses import replace

import numpy as np

from ..actions.analysis import BeamResult, CombinationResult
from ..actions.beam import CaseSolution, moment_at
from ..codes import en1995, nds
from ..model.constants import INCH
from ..model.design import DesignSpec
from ..model.errors import MissingCheck, Problem, ProjectError
from ..model.openings import Hole, Notch
from ..model.plies import Ply
from ..model.units import fmt
from ..section.transformed import Section
from .check import Check, CheckId
from .common import unit_shear_stress

NOTCH_SOURCE_US = "NDS 2018 3.4.3.2 and 4.4.3 (from memory)"
NOTCH_SOURCE_EU = "EN 1995-1-1 6.5.2 (from memory)"
#: Common practice for bored holes (no clause of NDS 2018 or EN 1995-1-1 gives one):
#: diameter at most d / 3, at least 2 in (50 mm) clear of either edge.
HOLE_RULE = ("common practice: a hole at most d / 3 across and at least 2 in (50 mm) "
             "clear of the top and bottom edges")

SectionOf = Callable[[Sequence[Ply]], Section]


def shear_at(beam: BeamResult, sol: CaseSolution, x: float) -> float:
    """The largest |V| just left and just right of x, N."""
    nodes = beam.model.nodes
    out = 0.0
    for e in {int(np.clip(np.searchsorted(nodes, x, side=s) - 1, 0, nodes.size - 2))
              for s in ("left", "right")}:
        t = x - float(nodes[e])
        out = max(out, abs(float(sol.V0[e] + sol.q[e] * t + sol.dq[e] * t * t / 2)))
    return out


def _chosen(section: Section, names: tuple[str, ...]) -> list[int]:
    return [i for i, (p, m) in enumerate(zip(section.plies, section.materials, strict=True))
            if (p.name in names if names else m.kind == "timber")]


def _beside(section_at: Callable[[float], Section], x: float, beam: BeamResult
            ) -> list[Section]:
    """The sections just left and right of ``x`` (a ply that starts or ends at x is
    there: its extent is closed).
    """
    length = beam.model.layout.length
    step = 1e-9 * max(length, 1.0)
    return [section_at(min(max(x + d, 0.0), length)) for d in (-step, 0.0, step)]


def _named(sections: list[Section], names: tuple[str, ...], path: str, x: float, system: str,
           timber: bool) -> None:
    """Refuse a name of ``names`` that is no ply of the member at ``x`` (a misspelt name
    or a ply that does not run there would leave the opening out unseen), and with
    ``timber`` one that is not timber (notches are checked in timber).
    """
    at = {p.name: m.kind for section in sections
          for p, m in zip(section.plies, section.materials, strict=True)}
    for name in names:
        if name not in at:
            listed = ", ".join(f'"{n}"' for n in at)
            raise ProjectError(Problem(path, f'"{name}" is not a ply of the member at x = '
                                       f"{fmt(x, 'span', system)} ({listed})"))
        if timber and at[name] != "timber":
            raise ProjectError(Problem(path, f'"{name}" is not timber; a notch is checked in '
                                       "timber plies (name them, or none for every timber "
                                       "ply)"))


def _own(checks: Sequence[Check], cid: str, ply: str, combo: str) -> Check | None:
    return next((c for c in checks if c.id == cid and c.ply == ply
                 and c.combination == combo), None)


def _at_end(beam: BeamResult, notch: Notch) -> bool:
    lay = beam.model.layout
    n = len(lay.support_positions())
    if notch.support is None:
        return False
    return ((notch.support == 1 and lay.overhang_left == 0)
            or (notch.support == n and lay.overhang_right == 0)
            or lay.supports == "cantilever")


def _limit_message(beam: BeamResult, notch: Notch, d: float) -> str | None:
    """Why a notch is outside NDS 2018 4.4.3, or None."""
    at_end = _at_end(beam, notch)
    limit = nds.notch_depth_limit(at_end, d)
    if notch.depth > limit * (1 + 1e-12):
        return (f"the notch is {notch.depth / d:.3g} d deep; NDS 2018 4.4.3 allows at most "
                f"d / {4 if at_end else 6} {'at the end' if at_end else 'away from the ends'}")
    if notch.support is None:
        for name, a, b in beam.model.layout.regions():
            third = (b - a) / 3
            lo, hi = notch.x - notch.length / 2, notch.x + notch.length / 2
            if "span" in name and lo < b - third and hi > a + third:
                return f"the notch lies in the middle third of {name} (NDS 2018 4.4.3)"
    return None


def _notch_check(notch: Notch, k: int, combo: CombinationResult, beam: BeamResult,
                 section: Section, checks: Sequence[Check], design: DesignSpec,
                 system: str, warnings: list[Problem]) -> Check | None:
    idx = _chosen(section, notch.plies)
    if not idx:
        return None
    own = [_own(checks, "shear", section.plies[i].name, combo.name) for i in idx]
    if any(c is None for c in own):
        missing = next(section.plies[i].name for i, c in zip(idx, own, strict=True)
                       if c is None)
        warnings.append(MissingCheck(f"beam.notches[{k}]", f'"{missing}" has no shear check '
                                     f"under {combo.name} to reduce at the notch; the notch "
                                     "check cannot be made"))
        return None
    cap_v = min(c.capacity for c in own if c is not None)
    b = sum(section.plies[i].width for i in idx)
    d = min(section.plies[i].height for i in idx)
    d_n = d - notch.depth
    if notch.support is not None:
        V = abs(float(combo.reactions_max[notch.support - 1]))
    else:
        V = shear_at(beam, combo.solution, notch.x)
    interior = notch.support is not None and not _at_end(beam, notch)
    tension = (notch.face == "bottom") != interior
    where = (f"support {notch.support}" if notch.support is not None
             else f"x = {fmt(notch.x, 'length', system)}")
    names = " + ".join(section.plies[i].name for i in idx)
    notes = [f"Notch {k + 1}: {notch.face} face, {fmt(notch.depth, 'length', system)} deep, "
             f"{fmt(notch.length, 'length', system)} long, at {where}; the notched plies "
             "take the whole shear there (conservative)."]
    if d_n <= 0:
        return Check(id="shear-notch", ply=names, combination=combo.name, demand=V,
                     capacity=0.0, quantity="force", reference=("V", V),
                     equation="d_n = d - notch depth > 0", location=f"notch {k + 1}",
                     x=notch.x, notes=(*notes, "The notch is as deep as the plies: NOT OK."))
    if design.us:
        f: dict[str, float]
        if tension:
            f = {"(d_n/d)^2": nds.notch_tension_factor(d_n, d)}
            demand, eq = 1.5 * V / (b * d_n), "f_v = 3 V / (2 b d_n) <= F'v (d_n / d)^2"
        else:
            d_e = nds.d_e_compression_notch(d, d_n, notch.length)
            f, eq = {}, "f_v = 3 V / (2 b d_e) <= F'v, d_e = d - (d - d_n) e / d_n"
            demand = 1.5 * V / (b * d_e)
            notes.append(f"d_e = {fmt(d_e, 'length', system)} (e = the notch length).")
        src = {"F'v": "the notched ply's shear check", **{s: NOTCH_SOURCE_US for s in f}}
        why = _limit_message(beam, notch, d)
        if why is not None:
            notes.append(f"Outside the limits: {why}. NOT OK.")
    else:
        mat = section.materials[idx[0]]
        kv = (en1995.k_v(mat.product, d, d_n, notch.length) if notch.face == "bottom"
              and not interior else 1.0)
        f, why = {"k_v": kv}, None
        demand, eq = 1.5 * V / (b * d_n), "tau_d = 1.5 V / (b h_ef) <= k_v f_v,d"
        src = {"f_v,d": "the notched ply's shear check", "k_v": NOTCH_SOURCE_EU
               + f", k_n = {en1995.k_n(mat.product):g}"}
    capacity = 0.0 if why is not None else cap_v * float(np.prod(list(f.values())))
    return Check(id="shear-notch", ply=names, combination=combo.name, demand=demand,
                 capacity=capacity, quantity="stress",
                 reference=("F'v" if design.us else "f_v,d", cap_v), factors=f,
                 sources=src, equation=eq, location=f"notch {k + 1} at {where}", x=notch.x,
                 notes=tuple(notes))


def _net_plies(plies: Sequence[Ply], hole: Hole, bored: set[str]) -> list[Ply]:
    """The plies with a band as high as the hole taken out of the bored ones."""
    out = []
    lo, hi = hole.y - hole.diameter / 2, hole.y + hole.diameter / 2
    for p in plies:
        if p.name not in bored or hi <= p.y or lo >= p.top:
            out.append(p)
            continue
        if lo > p.y:
            out.append(replace(p, height=lo - p.y))
        if hi < p.top:
            out.append(replace(p, name=p.name + " (above hole)", y=hi, height=p.top - hi))
    return out


def _hole_checks(hole: Hole, k: int, beam: BeamResult, section: Section,
                 checks: Sequence[Check], section_of: SectionOf, system: str,
                 warnings: list[Problem]) -> list[Check]:
    idx = _chosen(section, hole.plies)
    lo, hi = hole.y - hole.diameter / 2, hole.y + hole.diameter / 2
    if not hole.plies:  # every timber ply: a plate at the hole's height is said, not bored
        crossed = [f'"{p.name}"' for p, m in zip(section.plies, section.materials, strict=True)
                   if m.kind != "timber" and p.y < hi and p.top > lo]
        if crossed:
            warnings.append(Problem(f"beam.holes[{k}].plies", "are not given: the hole bores "
                                    f"the timber plies only, and {', '.join(crossed)} at its "
                                    "height is taken as not bored; name every ply it passes "
                                    "through"))
    if idx and all(hi <= section.plies[i].y or lo >= section.plies[i].top for i in idx):
        raise ProjectError(Problem(f"beam.holes[{k}].y", f"the hole, from y = "
                                   f"{fmt(lo, 'length', system)} to {fmt(hi, 'length', system)},"
                                   " misses every ply it bores: place it within them"))
    bored = {section.plies[i].name for i in idx}
    net = section_of(_net_plies(section.plies, hole, bored))
    tau = unit_shear_stress(net)
    top, bot = net.ply_extreme_stresses(1.0)
    g_top, g_bot = section.ply_extreme_stresses(1.0)  # where a hole leaves no net section
    g_tau = unit_shear_stress(section)
    edge = 2 * INCH if system == "US" else 0.05
    for i in idx:
        p = section.plies[i]
        clear = min(hole.y - hole.diameter / 2 - p.y, p.top - hole.y - hole.diameter / 2)
        if hole.diameter > p.height / 3 or clear < edge:
            warnings.append(Problem(f"beam.holes[{k}]", f"the hole in {p.name} is "
                                    f"{fmt(hole.diameter, 'length', system)} across and "
                                    f"{fmt(clear, 'length', system)} clear of the nearer "
                                    f"edge; {HOLE_RULE}"))
    out = []
    for combo in beam.strength():
        M = moment_at(beam.model, combo.solution, hole.x)
        V = shear_at(beam, combo.solution, hole.x)
        for i in idx:
            name = section.plies[i].name
            parts = [j for j, q in enumerate(net.plies) if q.name.startswith(name)
                     and q.name in (name, name + " (above hole)")]
            own_b = _own(checks, "bending", name, combo.name)
            own_v = _own(checks, "shear", name, combo.name)
            if own_b is None or own_v is None:
                continue
            if not parts:  # the hole takes the ply's whole depth: nothing is left there
                whole = (f"Hole {k + 1}: {fmt(hole.diameter, 'length', system)} across, "
                         f"centre at y = {fmt(hole.y, 'length', system)}, takes the whole "
                         f"depth of {name}: nothing of the ply is left at the hole to carry "
                         "the moment or the shear.")
                # the demands on the gross section at the hole, against nothing
                made: tuple[tuple[Check, CheckId, str, float], ...] = (
                    (own_b, "bending-net", f"hole {k + 1}",
                     max(abs(float(g_top[i])), abs(float(g_bot[i]))) * abs(M)),
                    (own_v, own_v.id, f"net section at hole {k + 1}", float(g_tau[i]) * V))
                for own, cid, where, demand in made:
                    out.append(replace(own, id=cid, demand=demand, capacity=0.0, x=hole.x,
                                       location=where, equation=own.equation + " on the gross "
                                       "section at the hole; no net section is left",
                                       segment=None, factors={**own.factors, "net": 0.0},
                                       sources={**own.sources, "net": "no net section: the "
                                                "hole is as deep as the ply"},
                                       notes=(whole,)))
                continue
            sigma = max(max(abs(float(top[j])), abs(float(bot[j]))) for j in parts) * abs(M)
            note = (f"Hole {k + 1}: {fmt(hole.diameter, 'length', system)} across, centre "
                    f"at y = {fmt(hole.y, 'length', system)}; the band it cuts is taken "
                    "out over the ply's width (net section).")
            out.append(replace(own_b, id="bending-net", demand=sigma, x=hole.x,
                               location=f"hole {k + 1}", segment=None,
                               equation="f_b = n M c / I_net <= the ply's bending capacity",
                               notes=(note,)))
            out.append(replace(own_v, demand=float(max(tau[j] for j in parts)) * V, x=hole.x,
                               location=f"net section at hole {k + 1}", segment=None,
                               equation="f_v = V n Q / (I_net b) <= the ply's shear capacity",
                               notes=(note,)))
    return out


def opening_checks(section_at: Callable[[float], Section], beam: BeamResult,
                   checks: Sequence[Check], design: DesignSpec, system: str,
                   section_of: SectionOf) -> tuple[list[Check], list[Problem]]:
    """The notch and hole checks of the beam (see the module text)."""
    out: list[Check] = []
    warnings: list[Problem] = []
    if not design.us and beam.spec.notches:
        warnings.append(Problem("beam.notches", "EN 1995-1-1 sets no depth limits for "
                                "notches; the NDS 2018 4.4.3 limits are not applied on the "
                                "EU basis"))
    for k, notch in enumerate(beam.spec.notches):
        sec = section_at(notch.x)
        _named(_beside(section_at, notch.x, beam), notch.plies, f"beam.notches[{k}].plies",
               notch.x, system, True)
        for combo in beam.strength():
            c = _notch_check(notch, k, combo, beam, sec, checks, design, system, warnings)
            if c is not None:
                out.append(c)
    for k, hole in enumerate(beam.spec.holes):
        _named(_beside(section_at, hole.x, beam), hole.plies, f"beam.holes[{k}].plies",
               hole.x, system, False)
        out += _hole_checks(hole, k, beam, section_at(hole.x), checks, section_of, system,
                            warnings)
    return out, warnings
