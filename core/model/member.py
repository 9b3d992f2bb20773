"""The member along its length: spans, supports and loads (plain frozen data, SI units).

Positions are measured from the member's left end; loads are positive downward.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from .combination import Combination
from .errors import Problem
from .openings import Hole, Notch
from .units import fmt

CASES = ("D", "L", "Lr", "S", "W")
SUPPORTS = ("simple", "continuous", "cantilever", "fixed-fixed", "propped")
#: Supports that may have several spans and overhangs (pinned supports throughout).
PINNED = ("simple", "continuous")
LOAD_TYPES = ("area", "line", "point")
#: When a load is put on: before the member is strengthened, or after.
LOAD_STAGES = ("before", "after")
#: Positions closer than this fraction of the member length share one node.
MERGE_TOLERANCE = 1e-7


@dataclass(frozen=True)
class Load:
    """One load of one case. SI units; positive downward.

    Attributes:
        case: "D", "L", "Lr", "S" or "W" (ASCE 7 symbols).
        type: "area" (value x tributary width), "line" or "point".
        value: Pa for area, N/m for line, N for point loads.
        tributary_width: m, area loads only.
        start: m from the member's left end; None for the whole member.
        end: m; None for the whole member.
        at: m, point loads only.
        value_end: intensity at ``end`` for a load varying linearly from ``value`` at
            ``start`` (None: uniform).
        description: what the load is (free text for the calculation sheet), may be empty.
        bearing_length: m, point loads only: the length along the member over which the
            load bears on the top face (None: no bearing check under this load).
        stage: "before" (on the member before it is strengthened) or "after".

    """

    case: str
    type: str
    value: float
    tributary_width: float | None = None
    start: float | None = None
    end: float | None = None
    at: float | None = None
    value_end: float | None = None
    description: str = ""
    bearing_length: float | None = None
    stage: str = "after"

    @property
    def line_value(self) -> float:
        """Line load intensity at the start, N/m (area loads times their tributary width)."""
        if self.type == "area":
            return self.value * (self.tributary_width or 0.0)
        return self.value

    @property
    def line_value_end(self) -> float:
        """Line load intensity at the end, N/m (the start's for a uniform load)."""
        if self.value_end is None:
            return self.line_value
        if self.type == "area":
            return self.value_end * (self.tributary_width or 0.0)
        return self.value_end

    def intensity_at(self, x: float, length: float) -> float:
        """Line load intensity at ``x`` (m from the member's left end), N/m."""
        a = 0.0 if self.start is None else self.start
        b = length if self.end is None else self.end
        if b <= a:
            return self.line_value
        t = (x - a) / (b - a)
        return self.line_value + t * (self.line_value_end - self.line_value)


@dataclass(frozen=True)
class BeamLayout:
    """Spans and supports of the member.

    Attributes:
        spans: span lengths left to right, m.
        supports: "simple" (several spans: continuous over pinned supports), "continuous"
            (the same member, as engineers call it),
            "cantilever" (fixed left, free right), "fixed-fixed", "propped"
            (fixed left, pinned right).
        overhang_left: m, simple/continuous only.
        overhang_right: m, simple/continuous only.

    """

    spans: tuple[float, ...]
    supports: str = "simple"
    overhang_left: float = 0.0
    overhang_right: float = 0.0

    @property
    def length(self) -> float:
        """Total member length, m."""
        return self.overhang_left + sum(self.spans) + self.overhang_right

    def support_positions(self) -> tuple[float, ...]:
        """X of every support, m."""
        if self.supports == "cantilever":
            return (0.0,)
        xs = [self.overhang_left]
        for s in self.spans:
            xs.append(xs[-1] + s)
        return tuple(xs)

    def support_kinds(self) -> tuple[str, ...]:
        """'pin' or 'fixed' for each support."""
        n = len(self.support_positions())
        if self.supports == "cantilever":
            return ("fixed",)
        if self.supports == "fixed-fixed":
            return ("fixed", "fixed")
        if self.supports == "propped":
            return ("fixed", "pin")
        return ("pin",) * n

    def regions(self) -> list[tuple[str, float, float]]:
        """Named parts of the member: overhangs and spans, (name, x0, x1)."""
        out = []
        if self.supports == "cantilever":
            return [("cantilever", 0.0, self.spans[0])]
        x = 0.0
        if self.overhang_left > 0:
            out.append(("overhang left", 0.0, self.overhang_left))
        x = self.overhang_left
        for i, s in enumerate(self.spans):
            out.append((f"span {i + 1}", x, x + s))
            x += s
        if self.overhang_right > 0:
            out.append(("overhang right", x, x + self.overhang_right))
        return out


def validate_layout(layout: BeamLayout, path: str = "beam") -> list[Problem]:
    """Named problems of spans, supports and overhangs."""
    problems = []
    if not layout.spans:
        problems.append(Problem(f"{path}.spans", "needs at least one span"))
    for i, s in enumerate(layout.spans):
        if not np.isfinite(s) or s <= 0:
            problems.append(Problem(f"{path}.spans[{i}]", "must be greater than zero"))
    if layout.supports not in SUPPORTS:
        problems.append(Problem(f"{path}.supports", f'"{layout.supports}" is not one of '
                                + ", ".join(SUPPORTS)))
    elif layout.supports not in PINNED and len(layout.spans) != 1:
        problems.append(Problem(f"{path}.supports", f'"{layout.supports}" needs exactly one '
                                f"span, not {len(layout.spans)}; several spans are "
                                'continuous over pinned supports ("simple")'))
    for side in ("overhang_left", "overhang_right"):
        v = getattr(layout, side)
        if not np.isfinite(v) or v < 0:
            problems.append(Problem(f"{path}.{side}", "must be zero or more"))
        elif v > 0 and layout.supports not in PINNED:
            problems.append(Problem(f"{path}.{side}", "overhangs are only for simple or "
                                    "continuous spans"))
    return problems


def bearing_problem(bearing: float, layout: BeamLayout, system: str = "SI") -> str | None:
    """Why a support's bearing length cannot be (None where it can): at most half the
    shortest span, so that the two bearings of a span do not overlap (a cantilever's one
    support: at most its span).
    """
    if not layout.spans:
        return None
    limit = min(layout.spans) if layout.supports == "cantilever" else min(layout.spans) / 2
    if bearing > limit * (1 + 1e-12):
        return (f"{fmt(bearing, 'length', system)} is longer than "
                + ("the cantilever" if layout.supports == "cantilever"
                   else "half the shortest span")
                + f" ({fmt(limit, 'length', system)}): the bearings would overlap the member")
    L = layout.length
    for k, x in enumerate(layout.support_positions()):
        a = min(x, L - x)  # the overhang beyond this support (0: at the member's end)
        if 1e-9 * max(L, 1.0) < a < bearing / 2 * (1 - 1e-12):
            return (f"{fmt(bearing, 'length', system)} centred on support {k + 1} would run "
                    f"past the member's end: its overhang is {fmt(a, 'length', system)}, "
                    f"less than half the bearing ({fmt(bearing / 2, 'length', system)}); "
                    "lengthen the overhang, shorten the bearing, or put the support at the "
                    "end (a support at an end bears within the member)")
    return None


def validate_load(load: Load, length: float, path: str, system: str = "SI") -> list[Problem]:
    """Named problems of one load on a member of ``length`` (positions in the messages in
    the display units of ``system``).
    """
    problems = []
    member = f"0 to {fmt(length, 'span', system)}"
    tol = 1e-9 * max(length, 1.0)
    if load.case not in CASES:
        problems.append(Problem(f"{path}.case", f'"{load.case}" is not a load case; use one '
                                "of " + ", ".join(CASES)))
    if load.type not in LOAD_TYPES:
        problems.append(Problem(f"{path}.type", f'"{load.type}" is not one of '
                                + ", ".join(LOAD_TYPES)))
        return problems
    if not np.isfinite(load.value):
        problems.append(Problem(f"{path}.value", "is not a finite number"))
    if load.value_end is not None and (load.type == "point" or not np.isfinite(load.value_end)):
        problems.append(Problem(f"{path}.value_end", "only applies to area and line loads"
                                if load.type == "point" else "is not a finite number"))
    if load.type == "point":
        if load.at is None:
            problems.append(Problem(f"{path}.at", "is missing (where the point load acts)"))
        elif not -tol <= load.at <= length + tol:
            problems.append(Problem(f"{path}.at", f"is outside the member ({member})"))
        lb = load.bearing_length
        if lb is not None and not (np.isfinite(lb) and lb > 0):
            problems.append(Problem(f"{path}.bearing_length", "must be greater than zero"))
        elif lb is not None and load.at is not None and -tol <= load.at <= length + tol and (
                min(load.at, length - load.at) < lb / 2 - tol):
            problems.append(Problem(f"{path}.bearing_length", f"{fmt(lb, 'length', system)} "
                                    f"centred at x = {fmt(load.at, 'span', system)} would run "
                                    "past the member's end: move the load in by half the "
                                    "bearing or shorten the bearing"))
    else:
        if load.bearing_length is not None:
            problems.append(Problem(f"{path}.bearing_length", "only applies to point loads"))
        if load.type == "area" and (load.tributary_width is None or load.tributary_width <= 0):
            problems.append(Problem(f"{path}.tributary_width", "must be greater than zero"))
        start = 0.0 if load.start is None else load.start
        end = length if load.end is None else load.end
        if not -tol <= start <= length + tol:
            problems.append(Problem(f"{path}.from", f"is outside the member ({member})"))
        if not -tol <= end <= length + tol:
            problems.append(Problem(f"{path}.to", f"is outside the member ({member})"))
        if end <= start:
            problems.append(Problem(f"{path}.to", "must be greater than from"))
    return problems


@dataclass(frozen=True)
class BeamSpec:
    """The beam: layout, loads and the choices that go with them.

    Attributes:
        layout: spans and supports.
        loads: the loads, by case.
        self_weight: add the member's weight as case D.
        bearing_length: m, for the bearing check (None: not checked).
        combinations: "ASD", "EN1990", an explicit tuple, or None for the design
            basis's own set (ASD for US-ASD, EN1990 for EU-LSD).
        sustained_live_fraction: part of L that is sustained (creep), 0 to 1.
        pattern_live_load: load each span and overhang with the variable cases or not
            and envelope (ASCE 7-16 4.3.3, 7.5; EN 1991-1-1 6.2.1).
        hold_down: N, the uplift a support's hold-down resists (None: none).
        shored: True where the member is jacked while the added plies are put on, so the
            before-loads are taken off and everything acts on the built-up section.
        notches: notches in the timber plies.
        holes: holes bored through plies.

    """

    layout: BeamLayout
    loads: tuple[Load, ...] = ()
    self_weight: bool = True
    bearing_length: float | None = None
    combinations: str | tuple[Combination, ...] | None = None
    sustained_live_fraction: float | None = None
    pattern_live_load: bool = True
    hold_down: float | None = None
    shored: bool = False
    notches: tuple[Notch, ...] = ()
    holes: tuple[Hole, ...] = ()
