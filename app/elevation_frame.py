"""Where everything of the member's elevation sits in its view, in pixels (y down): x
along the member fills the width, the member's depth has its own vertical scale, and the
loads, supports, bolt dimensions, ply bars and the station's label each take a band.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from plystack.core.model.project import Project


@dataclass(frozen=True)
class Frame:
    """Where everything sits in the view, pixels (y down).

    Attributes:
        left: x of the member's left end.
        width: pixels the member's length takes.
        length: the member's length, m.
        cases: the load cases with line loads, one band each from ``bands_top``.
        band_height: height of a load band.
        bands_top: top of the first band.
        arrows_top: top of the point loads' row (their labels), above the member.
        member_top: the member's top edge.
        member_height: pixels its depth takes.
        y_top: the member's highest fibre, m (the section's y).
        y_bottom: its lowest fibre, m.
        dims_top: top of the bolt dimensions (one row per plate).
        dims_rows: rows of bolt dimensions.
        lanes_top: top of the first ply bar.
        lane_height: height of each ply's lane.
        lanes: number of plies.
        view_width: width of the view, pixels.

    """

    left: float
    width: float
    length: float
    cases: tuple[str, ...]
    band_height: float
    bands_top: float
    arrows_top: float
    member_top: float
    member_height: float
    y_top: float
    y_bottom: float
    dims_top: float
    dims_rows: int
    lanes_top: float
    lane_height: float
    lanes: int
    view_width: float

    #: Heights of the fixed bands, pixels.
    ARROWS = 28.0
    SUPPORTS = 14.0
    DIM_ROW = 24.0

    @classmethod
    def of(cls, project: Project, width: float, height: float) -> Frame | None:
        """The frame of a project's member in a view of width x height pixels (None
        without a beam or plies, or with sizes that are not finite).
        """
        beam = project.beam
        if beam is None or not project.plies:
            return None
        length = beam.layout.length
        y_top = max(p.top for p in project.plies)
        y_bottom = min(p.y for p in project.plies)
        if not all(math.isfinite(v) for v in (length, y_top, y_bottom)) or length <= 0 or (
                y_top <= y_bottom):
            return None
        cases = tuple(c for c in ("D", "L", "Lr", "S", "W")
                      if any(ld.case == c and ld.type != "point" for ld in beam.loads))
        points = any(ld.type == "point" for ld in beam.loads)
        plates = sum(1 for p in project.plies
                     if project.all_materials().get(p.material) is not None
                     and project.all_materials()[p.material].kind == "steel")
        lane = 17.0 if len(project.plies) <= 8 else 13.0
        band = 15.0
        top = 6.0
        arrows = cls.ARROWS if points else 8.0
        fixed = (top + band * len(cases) + arrows + cls.SUPPORTS + cls.DIM_ROW * plates
                 + lane * len(project.plies) + 24.0)
        member_h = min(max(height - fixed, 36.0), 130.0)
        left = 30.0
        member_top = top + band * len(cases) + arrows
        dims_top = member_top + member_h + cls.SUPPORTS
        return cls(left, max(width - 2 * left, 40.0), length, cases, band, top,
                   top + band * len(cases), member_top, member_h, y_top, y_bottom, dims_top,
                   plates, dims_top + cls.DIM_ROW * plates + 4.0, lane, len(project.plies),
                   width)

    @property
    def bottom(self) -> float:
        """The lowest pixel used (the station's label sits in the last row)."""
        return self.station_row + 16.0

    @property
    def station_row(self) -> float:
        """Top of the row of the station's label, below the ply bars."""
        return self.lanes_top + self.lane_height * self.lanes + 2.0

    @property
    def member_bottom(self) -> float:
        """The member's bottom edge, pixels."""
        return self.member_top + self.member_height

    def x_px(self, x: float) -> float:
        """Pixel column of a position along the member (m)."""
        return self.left + x / self.length * self.width

    def x_m(self, px: float) -> float:
        """Position along the member (m) of a pixel column."""
        return (px - self.left) / self.width * self.length

    def y_px(self, y: float) -> float:
        """Pixel row of a height in the section (m)."""
        return self.member_top + (self.y_top - y) / (self.y_top - self.y_bottom) * (
            self.member_height)

    def lane(self, i: int) -> tuple[float, float]:
        """Top and bottom of ply i's lane (the bar leaves 2 px free above and below)."""
        top = self.lanes_top + i * self.lane_height
        return top + 2.0, top + self.lane_height - 2.0
