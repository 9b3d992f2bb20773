"""What the elevation of the member shows, computed without Qt: the bolts of every plate
with the geometry rules that fail on them, the stretch a notch takes, the segment at a
station, and the extent a dragged ply end gives.

The bolt layout of each plate is the one its checks used, carried by the analysis
(``Analysis.layouts``), so the bolts drawn are the bolts checked.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, replace

from plystack.core.design.bolt_layout import BoltLayout
from plystack.core.design.check import Check
from plystack.core.model.member import BeamLayout
from plystack.core.model.openings import Notch
from plystack.core.model.plies import Ply
from plystack.core.model.units import display_string
from plystack.core.pipeline import Analysis
from plystack.core.section.segments import Segment

#: The geometry rules of a bolt layout (check ids of core/design/bolt_geometry.py).
RULE_IDS = ("bolt-spacing", "bolt-edge", "bolt-end")
#: Two distances of a layout closer than this are the same distance, m.
SAME = 1e-9


@dataclass(frozen=True)
class PlateBolts:
    """The bolts of one plate as the checks placed them.

    Attributes:
        plate: index of the steel ply.
        name: its name.
        layout: the stations and rows.
        timber_top: the lowest top edge of the timbers beside it, m (the section's y).
        timber_bottom: the highest bottom edge of those timbers, m.
        marks: for a bolt (index into ``layout.bolts``), the failing rules that concern
            it, one line of text each.

    """

    plate: int
    name: str
    layout: BoltLayout
    timber_top: float
    timber_bottom: float
    marks: dict[int, tuple[str, ...]]

    @property
    def edge_top(self) -> float:
        """From the top row to the timber's top edge, m (as ``bolt-edge`` measures)."""
        return self.timber_top - max(self.layout.rows)

    @property
    def edge_bottom(self) -> float:
        """From the bottom row to the timber's bottom edge, m."""
        return min(self.layout.rows) - self.timber_bottom


def _close(a: float, b: float) -> bool:
    return abs(a - b) <= SAME


def _rule_text(check: Check, system: str) -> str:
    spread = check.equation.startswith("spread")
    need, have = (("limit", check.capacity), ("spread", check.demand)) if spread else (
        ("required", check.demand), ("provided", check.capacity))
    shown = [display_string(v, "length", system, 4) for v in (need[1], have[1])]
    return (f"{check.id}, {check.location}: {need[0]} {shown[0]}, {have[0]} {shown[1]} "
            "(NOT OK)")


def concerned_bolts(check: Check, layout: BoltLayout, length: float, edge_top: float,
                    edge_bottom: float) -> set[int]:
    """The bolts (indices into ``layout.bolts``) a geometry rule's distance is measured
    at: the governing station of an end distance, the row nearest the timber edge, the
    two bolts of the smallest gap, or the outer rows of a spread.
    """
    bolts = layout.bolts
    xs, rows = layout.stations, layout.rows
    if check.id == "bolt-end":
        ends = {k for k, x in enumerate(xs) if _close(min(x, length - x), check.capacity)}
        return {b for b, (x, _y) in enumerate(bolts) if any(x == xs[k] for k in ends)}
    if check.id == "bolt-edge":
        heights = set()
        if _close(edge_top, check.capacity):
            heights.add(max(rows))
        if _close(edge_bottom, check.capacity):
            heights.add(min(rows))
        return {b for b, (_x, y) in enumerate(bolts) if y in heights}
    if check.equation.startswith("spread"):
        outer = {min(rows), max(rows)}
        return {b for b, (_x, y) in enumerate(bolts) if y in outer}
    out: set[int] = set()
    if "across" in check.location:  # a gap between heights at one station
        for k, x in enumerate(xs):
            ys = sorted(rows[r] for r in layout.station_rows[k])
            for lo, hi in zip(ys, ys[1:], strict=False):
                if _close(hi - lo, check.capacity):
                    out |= {b for b, p in enumerate(bolts) if p in ((x, lo), (x, hi))}
        return out
    for k in range(len(xs) - 1):  # a gap between stations
        if _close(xs[k + 1] - xs[k], check.capacity):
            out |= {b for b, (x, _y) in enumerate(bolts) if x in (xs[k], xs[k + 1])}
    return out


def plate_bolts(analysis: Analysis | None) -> tuple[PlateBolts, ...]:
    """The bolts of every flitch or side plate whose bolts the analysis checked."""
    if analysis is None or analysis.beam is None:
        return ()
    a = analysis
    length = a.beam.model.layout.length
    system = a.project.display_units
    out = []
    for placed in a.layouts:
        joint, layout = placed.joint, placed.layout
        name = a.section.plies[joint.steel].name
        own = [c for c in a.checks if c.ply == name and c.id in ("bolts", *RULE_IDS)]
        if not own:  # no bolt checks for this plate (no strength combination, say)
            continue
        top = min(float(a.section.y_top[j]) for j in joint.timbers)
        bottom = max(float(a.section.y_bottom[j]) for j in joint.timbers)
        pb = PlateBolts(joint.steel, name, layout, top, bottom, {})
        marks: dict[int, list[str]] = {}
        for c in own:
            if c.id in RULE_IDS and not c.ok:
                for b in concerned_bolts(c, layout, length, pb.edge_top, pb.edge_bottom):
                    marks.setdefault(b, []).append(_rule_text(c, system))
        out.append(replace(pb, marks={b: tuple(t) for b, t in marks.items()}))
    return tuple(out)


def notch_span(notch: Notch, layout: BeamLayout) -> tuple[float, float]:
    """Where a notch runs along the member, m: from the member's end for a notch at an
    end support (its length into the span), else centred on its position; clipped to
    the member.
    """
    length = layout.length
    tol = 1e-9 * max(length, 1.0)
    if notch.support is not None and notch.x <= tol:
        a, b = 0.0, notch.length
    elif notch.support is not None and notch.x >= length - tol:
        a, b = length - notch.length, length
    else:
        a, b = notch.x - notch.length / 2, notch.x + notch.length / 2
    return max(a, 0.0), min(b, length)


def segment_at(segments: Sequence[Segment], x: float) -> Segment | None:
    """The segment holding ``x`` (at a cut, the one to its right; at the right end, the
    last).
    """
    for s in segments:
        if s.start <= x < s.end:
            return s
    if segments and x >= segments[-1].start:
        return segments[-1]
    return segments[0] if segments else None


def dragged_extent(ply: Ply, length: float, which: str, value: float,
                   step: float) -> Ply:
    """The ply with its ``which`` end ("start" or "end") at ``value`` (m): kept within the
    member and at least one ``step`` long; an end within one step of the member's end is
    the member's end (None: "whole member").
    """
    a, b = ply.extent(length)
    v = min(max(value, 0.0), length)
    within = step * (1 - 1e-9)  # a value on the snap grid one step away is not within
    if which == "start":
        v = min(v, b - step)
        return replace(ply, start=None if v < within else v)
    v = max(v, a + step)
    return replace(ply, end=None if length - v < within else v)
