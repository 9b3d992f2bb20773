"""The member in one line, in the notation of framing and steel drawings.

US: ``2-2x10 DF-L No.2 w/ 3/8 x 8 3/4 x 12′-0″ A36 PL, 1/2 in dia bolts @ 16 in o.c.,
2 rows`` (count of identical timbers, nominal size where the dressed size is a stock size
else the actual size, grade; plate thickness x depth x length and grade; bolt diameter
and spacing). SI: ``2 x 45x220 C24 + PL 10x200x3600 S275, M12 bolts at 400 mm, 2 rows``.
The notation (a count before the size, "w/", "PL", "dia", "@", "o.c.", "M12") is common
practice on drawings; species abbreviations are those of the grading rules (DF-L,
Hem-Fir HF, SPF) and "SYP" for Southern Pine (common practice).
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass

from ..design.bolt_layout import BoltLayout
from ..model.constants import INCH, MM
from ..model.materials import Material
from ..model.plies import Ply
from ..pipeline import Analysis
from ..section.templates import LUMBER_US
from .connections import plate_layouts
from .numbers import feet_inches

#: Species as written on drawings (common practice), longest name first.
SPECIES = (("Douglas Fir-Larch", "DF-L"), ("Southern Pine", "SYP"), ("Spruce-Pine-Fir", "SPF"),
           ("Hem-Fir", "HF"))
#: Grades as written on drawings (common practice).
GRADES = (("Select Structural", "SS"),)
#: Prefixes and suffixes of library names that a drawing leaves out.
DROPPED = ("EN 338 ", "EN 14080 ", "EN 10025-2 ", "ASTM ", " steel plate", " sheet and strip")
#: Dressed sizes match a nominal size within this, m (well under any sawing tolerance).
SIZE_TOLERANCE = 1e-6


@dataclass(frozen=True)
class PlyGroup:
    """Identical plies counted together: the first of them and how many there are."""

    ply: Ply
    material: Material
    count: int


def inch_text(value: float) -> str:
    """A length in inches without its unit, to 1/16 in where it lies on that grid
    (``3/8``, ``8 3/4``, ``1 1/2``), else to three decimals (``0.3``).
    """
    sixteenths = value / INCH * 16
    whole = round(sixteenths)
    if abs(sixteenths - whole) > 1e-6:
        return f"{value / INCH:.3f}".rstrip("0").rstrip(".")
    inches, frac = divmod(whole, 16)
    if not frac:
        return str(inches)
    g = math.gcd(frac, 16)
    part = f"{frac // g}/{16 // g}"
    return f"{inches} {part}" if inches else part


def mm_text(value: float) -> str:
    """A length in millimetres without its unit (``45``, ``12.5``)."""
    return f"{value / MM:.1f}".rstrip("0").rstrip(".")


def grade_text(material: Material) -> str:
    """A material's species and grade (or strength class) as drawings write it."""
    name = material.name or material.id
    for text in DROPPED:
        name = name.replace(text, "")
    name = name.split(",")[0].strip()
    for long, short in (*SPECIES, *GRADES):
        name = name.replace(long, short)
    return name or material.id


def nominal_size(ply: Ply) -> str | None:
    """The nominal US size of a timber ply whose dressed size is a stock size, laid on edge
    or flat ("2x10", "2x10 flat"), else None (sizes: core.section.templates).
    """
    for name, (t, d) in LUMBER_US.items():
        if abs(ply.width - t) <= SIZE_TOLERANCE and abs(ply.height - d) <= SIZE_TOLERANCE:
            return name
        if abs(ply.width - d) <= SIZE_TOLERANCE and abs(ply.height - t) <= SIZE_TOLERANCE:
            return f"{name} flat"
    return None


def groups(plies: Sequence[Ply], materials: Sequence[Material],
           length: float) -> list[PlyGroup]:
    """Plies of the same material, size, extent and stage counted together, in the
    order of their first appearance.
    """
    out: list[PlyGroup] = []
    keys: list[tuple[object, ...]] = []
    for ply, mat in zip(plies, materials, strict=True):
        key = (mat.id, round(ply.width, 9), round(ply.height, 9),
               tuple(round(v, 9) for v in ply.extent(length)), ply.stage)
        if key in keys:
            k = keys.index(key)
            out[k] = PlyGroup(out[k].ply, out[k].material, out[k].count + 1)
        else:
            keys.append(key)
            out.append(PlyGroup(ply, mat, 1))
    return out


def _timber(g: PlyGroup, system: str) -> str:
    p = g.ply
    if system == "US":
        size = nominal_size(p) or f"{inch_text(p.width)} x {inch_text(p.height)}"
        return f"{g.count}-{size}" if g.count > 1 else size
    size = f"{mm_text(p.width)}x{mm_text(p.height)}"
    return f"{g.count} x {size}" if g.count > 1 else size


def _plate(g: PlyGroup, length: float, system: str) -> str:
    p = g.ply
    thick, depth = min(p.width, p.height), max(p.width, p.height)
    a, b = p.extent(length)
    grade = grade_text(g.material)
    if system == "US":
        text = f"{inch_text(thick)} x {inch_text(depth)} x {feet_inches(b - a)} {grade} PL"
        return f"{g.count}-{text}" if g.count > 1 else text
    text = f"PL {mm_text(thick)}x{mm_text(depth)}x{mm_text(b - a)} {grade}"
    return f"{g.count} x {text}" if g.count > 1 else text


def bolt_text(diameter: float, layouts: Sequence[BoltLayout], system: str) -> str:
    """The bolts in drawing notation: diameter, spacing of the stations, rows, stagger."""
    if not layouts:
        return ""
    spacings: list[str] = []
    for lay in layouts:
        s = (f"{inch_text(lay.spacing)} in" if system == "US" else f"{mm_text(lay.spacing)} mm")
        if s not in spacings:
            spacings.append(s)
    rows = max(len(lay.rows) for lay in layouts)
    staggered = any(len(r) != len(lay.rows) for lay in layouts for r in lay.station_rows)
    tail = (f", {rows} rows" if rows > 1 else "") + (" staggered" if staggered else "")
    regular = all(evenly_spaced(lay) for lay in layouts)
    if system == "US":
        where = f"@ {' / '.join(spacings)} o.c." if regular else "as detailed"
        return f"{inch_text(diameter)} in dia bolts {where}{tail}"
    dm = diameter / MM
    name = f"M{round(dm)}" if abs(dm - round(dm)) < 1e-6 else f"\u2300{mm_text(diameter)} mm"
    where = f"at {' / '.join(spacings)}" if regular else "as detailed"
    return f"{name} bolts {where}{tail}"


def evenly_spaced(layout: BoltLayout) -> bool:
    """True where the stations are equally spaced (to 1e-9 of the plate's length), so
    that one spacing describes them.
    """
    xs = layout.stations
    gaps = [b - a for a, b in zip(xs, xs[1:], strict=False)]
    size = max(layout.extent[1] - layout.extent[0], 1.0)
    return not gaps or max(gaps) - min(gaps) <= 1e-9 * size


def describe(plies: Sequence[Ply], materials: Sequence[Material], length: float,
             system: str, bolt_diameter: float = 0.0,
             layouts: Sequence[BoltLayout] = ()) -> str:
    """The member in one line (see the module docstring).

    Args:
        plies: the member's plies.
        materials: each ply's material.
        length: the member's length, m (plates are given their own length).
        system: "US" or "SI", the project's display units.
        bolt_diameter: m, where the plates are bolted.
        layouts: the bolt layouts of the plates (empty: no bolts are written).

    """
    timber, steel = [], []
    for g in groups(plies, materials, length):
        if g.material.kind == "steel":
            steel.append(_plate(g, length, system))
        elif g.material.kind == "timber":
            timber.append(f"{_timber(g, system)} {grade_text(g.material)}")
        else:
            steel.append(f"{_timber(g, system)} {grade_text(g.material)}")
    join = " w/ " if system == "US" else " + "
    text = " + ".join(timber)
    if steel:
        text = (text + join if text else "") + " + ".join(steel)
    bolts = bolt_text(bolt_diameter, layouts, system)
    return f"{text}, {bolts}" if bolts else text


def member_description(a: Analysis) -> str:
    """The analysed member in one line, its bolts as the design checks place them."""
    s = a.section
    spec = a.project.beam
    length = spec.layout.length if spec is not None else 0.0
    layouts = [lay for _jt, lay in plate_layouts(a)]
    return describe(s.plies, s.materials, length, a.project.display_units,
                    a.design.bolt.diameter, layouts)
