"""Section templates: common built-up sections from nominal lumber sizes and stock plates.

Dressed sizes of US dimension lumber (common practice): nominal 2x4 ... 2x12 are 1.5 in
thick and 3.5, 5.5, 7.25, 9.25, 11.25 in deep; nominal 3x and 4x are 2.5 and 3.5 in
thick. Metric sawn sizes are common European stock (mm). Stock plate thicknesses: 1/4
... 3/4 in; 6 ... 20 mm (common practice).
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass

from ..model.constants import INCH, MM
from ..model.plies import Ply

IN = INCH

#: Nominal US lumber: name -> (thickness, depth), m.
LUMBER_US: dict[str, tuple[float, float]] = {
    "2x4": (1.5 * IN, 3.5 * IN), "2x6": (1.5 * IN, 5.5 * IN), "2x8": (1.5 * IN, 7.25 * IN),
    "2x10": (1.5 * IN, 9.25 * IN), "2x12": (1.5 * IN, 11.25 * IN),
    "3x10": (2.5 * IN, 9.25 * IN), "3x12": (2.5 * IN, 11.25 * IN),
}
#: Common European sawn sizes: name -> (thickness, depth), m.
LUMBER_SI: dict[str, tuple[float, float]] = {
    "45x145": (45 * MM, 145 * MM), "45x195": (45 * MM, 195 * MM),
    "45x220": (45 * MM, 220 * MM), "47x200": (47 * MM, 200 * MM),
    "47x225": (47 * MM, 225 * MM), "63x225": (63 * MM, 225 * MM),
    "75x225": (75 * MM, 225 * MM), "75x250": (75 * MM, 250 * MM),
}
#: Stock thicknesses of a timber ply (what ``size`` tries for a timber ply's width), m:
#: dressed nominal 2x, 3x, 4x (common practice); the European sawn thicknesses above.
TIMBER_THICKNESSES_US = (1.5 * IN, 2.5 * IN, 3.5 * IN)
TIMBER_THICKNESSES_SI = tuple(sorted({t for t, _d in LUMBER_SI.values()}))
PLATES_US = {"1/4 in": 0.25 * IN, "5/16 in": 0.3125 * IN, "3/8 in": 0.375 * IN,
             "1/2 in": 0.5 * IN, "5/8 in": 0.625 * IN, "3/4 in": 0.75 * IN}
PLATES_SI = {"6 mm": 6 * MM, "8 mm": 8 * MM, "10 mm": 10 * MM, "12 mm": 12 * MM,
             "15 mm": 15 * MM, "20 mm": 20 * MM}


@dataclass(frozen=True)
class TemplateChoice:
    """Inputs of a template: lumber (thickness, depth), plate thickness, materials,
    and how far the plate stops short of the timber's edges (flitch plates).
    """

    thickness: float
    depth: float
    plate: float
    timber: str = "DFL-No2"
    steel: str = "A36"
    inset: float = 0.25 * IN
    cover_width: float | None = None


def _flitch(c: TemplateChoice) -> tuple[Ply, ...]:
    t, d, p, s = c.thickness, c.depth, c.plate, c.inset
    return (Ply("left timber", c.timber, 0.0, 0.0, t, d),
            Ply("flitch plate", c.steel, t, s, p, d - 2 * s),
            Ply("right timber", c.timber, t + p, 0.0, t, d))


def _three_two(c: TemplateChoice) -> tuple[Ply, ...]:
    t, d, p, s = c.thickness, c.depth, c.plate, c.inset
    return (Ply("timber 1", c.timber, 0.0, 0.0, t, d),
            Ply("plate 1", c.steel, t, s, p, d - 2 * s),
            Ply("timber 2", c.timber, t + p, 0.0, t, d),
            Ply("plate 2", c.steel, 2 * t + p, s, p, d - 2 * s),
            Ply("timber 3", c.timber, 2 * t + 2 * p, 0.0, t, d))


def _one_face(c: TemplateChoice) -> tuple[Ply, ...]:
    t, d, p, s = c.thickness, c.depth, c.plate, c.inset
    return (Ply("joist", c.timber, 0.0, 0.0, t, d),
            Ply("side plate", c.steel, t, s, p, d - 2 * s))


def _both_faces(c: TemplateChoice) -> tuple[Ply, ...]:
    t, d, p, s = c.thickness, c.depth, c.plate, c.inset
    return (Ply("left plate", c.steel, 0.0, s, p, d - 2 * s),
            Ply("joist", c.timber, p, 0.0, t, d),
            Ply("right plate", c.steel, p + t, s, p, d - 2 * s))


def _bottom(c: TemplateChoice) -> tuple[Ply, ...]:
    t, d, p = c.thickness, c.depth, c.plate
    w = c.cover_width or t
    return (Ply("joist", c.timber, 0.0, 0.0, t, d),
            Ply("bottom plate", c.steel, (t - w) / 2, -p, w, p))


def _top_bottom(c: TemplateChoice) -> tuple[Ply, ...]:
    t, d, p = c.thickness, c.depth, c.plate
    w = c.cover_width or t
    return (Ply("joist", c.timber, 0.0, 0.0, t, d),
            Ply("bottom plate", c.steel, (t - w) / 2, -p, w, p),
            Ply("top plate", c.steel, (t - w) / 2, d, w, p))


TEMPLATES: dict[str, Callable[[TemplateChoice], tuple[Ply, ...]]] = {
    "Flitch: timber, plate, timber": _flitch,
    "Flitch: three timbers, two plates": _three_two,
    "Plate on one face": _one_face,
    "Plates on both faces": _both_faces,
    "Plate on the bottom edge": _bottom,
    "Plates on top and bottom edges": _top_bottom,
}


def build(name: str, choice: TemplateChoice) -> tuple[Ply, ...]:
    """The plies of template ``name``."""
    return TEMPLATES[name](choice)
