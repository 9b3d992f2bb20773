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


def _regions_at(beam: BeamResult, x: float) -> list[tuple[str, float, float]]:
    """The spans and overhangs x lies in: two at a support between them (the moment over
    it compresses the edge on both sides), else one.
    """
    regions = beam.model.layout.regions()
    return [r for r in regions if r[1] - 1e-9 <= x <= r[2] + 1e-9] or [regions[0]]


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


def edge_stabilities(beam: BeamResult, design: DesignSpec, edge: str, x: float
                     ) -> tuple[EdgeStability, ...]:
    """The stability input of the ``edge`` in compression at ``x`` in each span or
    overhang x lies in: at a support between two (the hogging moment over it compresses
    the bottom edge on both sides) one for each, and the check takes the lower factor
    (C_L, k_crit) of the two, as neither side braces the other.
    """
    return tuple(_edge_in(beam, design, edge, region) for region in _regions_at(beam, x))


def edge_stability(beam: BeamResult, design: DesignSpec, edge: str, x: float) -> EdgeStability:
    """Of :func:`edge_stabilities`, the one with the longest unbraced length (the
    buckling length of a ply in compression; the first where they are alike).
    """
    found = edge_stabilities(beam, design, edge, x)
    return max(found, key=lambda e: -1.0 if e.unbraced is None else e.unbraced)


def _edge_in(beam: BeamResult, design: DesignSpec, edge: str,
             region: tuple[str, float, float]) -> EdgeStability:
    """The stability input of the ``edge`` in compression in one span or overhang."""
    layout = beam.model.layout
    name, a, b = region
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
