"""Where every bolt of a plate goes: the stations along the member and the rows across its
depth, from the user's ``design.bolt`` keys or placed by the tool.

Rows given as a count are centred on the height the plate shares with its timbers, kept
4 D from either edge of that height (both edges can be loaded edges: along the span the bolts push
the timber up, at a support where the plate does not bear they push it down; NDS 2018
Table 12.5.1C and EN 1995-1-1 Table 8.4 a4,t = 4 d at 90 degrees, from memory), and on the
US basis spread at most 5 in between the outer rows (shrinkage across the grain in one
steel plate, NDS 2018 12.5.1.3, from memory; common practice).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ..model.constants import INCH
from ..model.design import Bolt
from ..model.errors import Problem, ProjectError
from ..model.units import fmt
from ..section.transformed import Section
from .common import Joint

#: Largest spread between the outer rows of bolts in one steel plate on the US basis
#: (NDS 2018 12.5.1.3, from memory: 5 in; common practice).
US_ROW_SPREAD = 5 * INCH



def gaps(values: tuple[float, ...] | list[float]) -> list[float]:
    """The gaps between neighbouring ``values`` (ascending), m."""
    return [b - a for a, b in zip(values, values[1:], strict=False)]

@dataclass(frozen=True)
class BoltLayout:
    """Every bolt of one plate.

    Attributes:
        plate: index of the steel ply.
        stations: positions of the bolt locations along the member, m, ascending.
        rows: heights of the rows (the section's y), m, ascending.
        station_rows: for each station, the indices of the rows that hold a bolt there.
        spacing: the nominal spacing of the stations, m (the smallest gap of explicit
            stations; the plate's length where there is one station).
        extent: (start, end) of the plate along the member, m.
        placed: True where the tool placed the stations (no explicit stations).

    """

    plate: int
    stations: tuple[float, ...]
    rows: tuple[float, ...]
    station_rows: tuple[tuple[int, ...], ...]
    spacing: float
    extent: tuple[float, float]
    placed: bool

    @property
    def bolts(self) -> tuple[tuple[float, float], ...]:
        """(x, y) of every bolt, station by station."""
        return tuple((x, self.rows[r]) for x, rs in zip(self.stations, self.station_rows,
                                                         strict=True) for r in rs)

    @property
    def station_gaps(self) -> list[float]:
        """The gaps between neighbouring stations, m (empty with one station)."""
        return gaps(self.stations)

    @property
    def count(self) -> int:
        """Number of bolts."""
        return sum(len(rs) for rs in self.station_rows)

    def at_station(self, k: int) -> int:
        """Bolts at station k."""
        return len(self.station_rows[k])

    def tributary(self, k: int) -> tuple[float, float]:
        """The part of the plate station k collects from: halfway to its neighbours, or to
        the plate's ends.
        """
        xs = self.stations
        a = self.extent[0] if k == 0 else (xs[k - 1] + xs[k]) / 2
        b = self.extent[1] if k == len(xs) - 1 else (xs[k] + xs[k + 1]) / 2
        return a, b


def shared_height(section: Section, joint: Joint) -> tuple[float, float]:
    """Bottom and top of the height the plate shares with all of its timbers, m."""
    lo = max(float(section.y_bottom[i]) for i in (joint.steel, *joint.timbers))
    hi = min(float(section.y_top[i]) for i in (joint.steel, *joint.timbers))
    return lo, hi


def default_rows(count: int, diameter: float, lo: float, hi: float,
                 spread_limit: float | None) -> tuple[float, ...]:
    """``count`` rows centred between ``lo`` and ``hi``, 4 D from either edge, the outer
    rows at most ``spread_limit`` apart (see the module docstring).
    """
    centre = (lo + hi) / 2
    if count == 1:
        return (centre,)
    room = max(0.0, hi - lo - 8 * diameter)
    spread = room if spread_limit is None else min(room, spread_limit)
    return tuple(centre - spread / 2 + k * spread / (count - 1) for k in range(count))


def placed_stations(start: float, end: float, spacing: float,
                    end_distance: float | None) -> tuple[float, ...]:
    """Stations at ``spacing`` centred on the plate: as many as fit between the end
    distances where one is given, else max(2, floor(length / spacing)) (the number of
    bolt locations used before layouts were given).
    """
    length = end - start
    if end_distance is not None:
        n = max(1, math.floor((length - 2 * end_distance) / spacing + 1e-9) + 1)
    else:
        n = max(2, math.floor(length / spacing + 1e-9))
    if (n - 1) * spacing >= length:
        spacing = length / n
    first = start + (length - (n - 1) * spacing) / 2
    return tuple(first + k * spacing for k in range(n))


def layout_of(section: Section, joint: Joint, bolt: Bolt, extent: tuple[float, float],
              spacing: float, us: bool) -> BoltLayout:
    """The layout of one plate's bolts (``spacing`` is used where no stations are given)."""
    lo, hi = shared_height(section, joint)
    _within(bolt.row_heights, lo, hi, "design.bolt.rows", "the height the plate "
            f'"{section.plies[joint.steel].name}" shares with its timbers', us, "length")
    rows = tuple(sorted(bolt.row_heights)) or default_rows(
        bolt.rows, bolt.diameter, lo, hi, US_ROW_SPREAD if us else None)
    if bolt.stations:
        stations = bolt.stations
        _within(stations, extent[0], extent[1], "design.bolt.stations",
                f'the length of the plate "{section.plies[joint.steel].name}"', us, "span")
        gaps = [b - a for a, b in zip(stations, stations[1:], strict=False)]
        nominal = min(gaps) if gaps else extent[1] - extent[0]
    else:
        length = extent[1] - extent[0]
        if bolt.spacing is not None and bolt.end_distance is None and bolt.spacing >= length:
            system = "US" if us else "SI"
            given = fmt(bolt.spacing, "span", system)
            raise ProjectError(Problem("design.bolt.spacing", f"{given} does not fit two "
                                       "bolt locations on the plate "
                                       f'"{section.plies[joint.steel].name}" '
                                       f"({fmt(length, 'span', system)} long): give a shorter "
                                       "spacing or the stations"))
        stations = placed_stations(extent[0], extent[1], spacing, bolt.end_distance)
        nominal = stations[1] - stations[0] if len(stations) > 1 else extent[1] - extent[0]
    every = tuple(range(len(rows)))
    if bolt.stagger and len(rows) > 1:
        per = tuple(tuple(r for r in every if (r + k) % 2 == 0) for k in range(len(stations)))
    else:
        per = tuple(every for _ in stations)
    return BoltLayout(joint.steel, tuple(stations), rows, per, nominal, extent,
                      not bolt.stations)


def _within(values: tuple[float, ...], lo: float, hi: float, field: str, what: str,
            us: bool, kind: str) -> None:
    """A named problem where a bolt row or station the file gives lies outside ``lo`` to
    ``hi`` (a bolt must pass through the plate and its timbers).
    """
    system = "US" if us else "SI"
    tol = 1e-9 * max(abs(lo), abs(hi), 1.0)
    outside = [v for v in values if not lo - tol <= v <= hi + tol]
    if outside:
        raise ProjectError(Problem(field, f"{fmt(outside[0], kind, system)} is outside "
                                   f"{what} ({fmt(lo, kind, system)} to "
                                   f"{fmt(hi, kind, system)})"))
