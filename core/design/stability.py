"""Lateral stability inputs of a bending check: which edge is in compression, whether it
is braced, its unbraced length and the load case that sets the effective length.

Edges: a sagging moment puts the top edge in compression, a hogging moment (over an
interior support, on an overhang or a cantilever) the bottom edge. ``compression_edge_
braced`` is the user's declaration for the top edge (floors and roofs brace it through
their sheathing, common practice); the bottom edge is braced only where the user says
so (``bottom_edge_braced``). ``unbraced_length`` applies to both edges unless
``unbraced_length_bottom`` is given; without one, the length of the span or overhang
where the moment occurs is taken (the whole region unbraced: conservative). Loads are
taken to act on the top edge (gravity loads on floors and roofs).
"""

from __future__ import annotations

from dataclasses import dataclass

from ..actions.analysis import BeamResult
from ..model.design import DesignSpec
from ..model.member import Load


@dataclass(frozen=True)
class EdgeStability:
    """Stability input for one compression edge.

    Attributes:
        edge: "top" or "bottom".
        braced: True where the edge is braced continuously (C_L = k_crit = 1).
        unbraced: l_u, m (None where braced).
        region: the span or overhang where the moment occurs.
        nds_case: NDS 2018 Table 3.3.3 case.
        en_case: EN 1995-1-1 Table 6.1 case.
        load_on: "compression edge" or "tension edge" (EN 1995-1-1 6.3.3(3)).
        note: how the input was chosen (for the sheet).

    """

    edge: str
    braced: bool
    unbraced: float | None
    region: str
    nds_case: str
    en_case: str
    load_on: str
    note: str


def _region_at(beam: BeamResult, x: float) -> tuple[str, float, float]:
    regions = beam.model.layout.regions()
    for name, a, b in regions:
        if a - 1e-9 <= x <= b + 1e-9:
            return name, a, b
    return regions[0]


def _load_kind(loads: tuple[Load, ...], a: float, b: float, length: float) -> str:
    """"uniform", "point at centre", "point at end" or "mixed" for the loads on [a, b]."""
    points = [ld for ld in loads if ld.type == "point" and a - 1e-9 <= (ld.at or 0) <= b + 1e-9]
    spread = [ld for ld in loads if ld.type != "point"
              and (ld.start or 0.0) < b and (length if ld.end is None else ld.end) > a]
    if spread and not points:
        full = all((ld.start or 0.0) <= a + 1e-9 and (length if ld.end is None else ld.end)
                   >= b - 1e-9 and ld.value_end is None for ld in spread)
        return "uniform" if full else "mixed"
    if points and not spread and len({round(ld.at or 0.0, 9) for ld in points}) == 1:
        at = points[0].at or 0.0
        if abs(at - (a + b) / 2) <= 1e-6 * (b - a):
            return "point at centre"
        return "point at end" if min(abs(at - a), abs(at - b)) <= 1e-6 * (b - a) else "mixed"
    return "mixed"


def edge_stability(beam: BeamResult, design: DesignSpec, edge: str, x: float) -> EdgeStability:
    """The stability input of the ``edge`` in compression at ``x``."""
    layout = beam.model.layout
    name, a, b = _region_at(beam, x)
    cantilever = layout.supports == "cantilever" or name.startswith("overhang")
    kind = _load_kind(beam.spec.loads, a, b, layout.length)
    single = cantilever or (len(layout.spans) == 1 and layout.supports in ("simple",
                                                                           "continuous"))
    if cantilever:
        nds_case = {"uniform": "cantilever, uniform load",
                    "point at end": "cantilever, point load at free end"}.get(kind,
                                                                               "any other case")
        en_case = {"uniform": "cantilever, uniform load",
                   "point at end": "cantilever, point load at free end"}.get(kind,
                                                                              "constant moment")
    elif single and edge == "top":
        nds_case = {"uniform": "single span, uniform load",
                    "point at centre": "single span, point load at centre"}.get(
            kind, "any other case")
        en_case = {"uniform": "simply supported, uniform load",
                   "point at centre": "simply supported, point load at centre"}.get(
            kind, "constant moment")
    else:
        nds_case, en_case = "any other case", "constant moment"
    top = "compression edge" if edge == "top" else "tension edge"
    bottom = "tension edge" if edge == "top" else "compression edge"
    load_on = {"top": top, "bottom": bottom}.get(design.load_level, "centroid")
    if edge == "top":
        braced = design.compression_edge_braced
        length = design.unbraced_length
        why = "top edge braced (the user's declaration)" if braced else ""
    else:
        braced = design.bottom_edge_braced
        length = design.unbraced_length_bottom or design.unbraced_length
        why = "bottom edge braced (the user's declaration)" if braced else ""
    if braced:
        return EdgeStability(edge, True, None, name, nds_case, en_case, load_on, why)
    if length is None:
        length = b - a
        why = (f"{edge} edge unbraced over the whole {name} ({length:.3f} m, no unbraced "
               "length given)")
    else:
        why = f"{edge} edge unbraced over {length:.3f} m (the user's unbraced length)"
    return EdgeStability(edge, False, length, name, nds_case, en_case, load_on, why)
