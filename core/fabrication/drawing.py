"""One plate's drawing as a DXF file (R2010): its outline and bolt holes true size in the
project's display units (inches for a US-unit project, millimetres for SI; the header's
$INSUNITS and $MEASUREMENT say which), the plate's left end and bottom edge at the
origin, with a few dimensions and a title.

Layers: OUTLINE (the plate's edges), HOLES (one circle of the hole diameter per bolt),
DIMENSIONS (overall length and depth, the stations from the left end, the rows from the
bottom edge) and TEXT (the title).
"""

from __future__ import annotations

import io
import textwrap
from collections.abc import Sequence
from fractions import Fraction

from ezdxf.document import Drawing
from ezdxf.enums import TextEntityAlignment
from ezdxf.filemanagement import new
from ezdxf.layouts.layout import Modelspace

from ..model.caution import CAUTION
from ..model.constants import INCH, MM
from .plates import FabricatedPlate, PlateSet, plain

#: DXF $INSUNITS codes and $MEASUREMENT values per display system (DXF reference:
#: 1 inches, 4 millimetres; $MEASUREMENT 0 imperial, 1 metric).
INSUNITS = {"US": 1, "SI": 4}
MEASUREMENT = {"US": 0, "SI": 1}

#: Metres per drawing unit.
DRAWING_UNIT = {"US": INCH, "SI": MM}
UNIT_LABEL = {"US": "in", "SI": "mm"}

#: Layers and their colours (DXF colour index: 7 black or white, 1 red, 5 blue).
LAYERS = {"OUTLINE": 7, "HOLES": 1, "DIMENSIONS": 5, "TEXT": 7}

#: Longest line of a note in the title, characters.
NOTE_WIDTH = 100

#: The dimension style of the drawings.
DIMSTYLE = "PLATE"


def to_drawing(value: float, system: str) -> float:
    """A length in m in drawing units (in or mm)."""
    return value / DRAWING_UNIT[system]


def number_text(value: float, system: str) -> str:
    """A drawing-unit number as a fabricator reads it: inches as a fraction to 1/64 where
    the value is one, else to 4 decimals; millimetres to 2 decimals, trailing zeros off.
    """
    if system == "US":
        sixty_fourths = round(value * 64)
        if abs(value * 64 - sixty_fourths) < 1e-6:
            f = Fraction(sixty_fourths, 64)
            whole, part = divmod(f, 1)
            if part == 0:
                return str(int(whole))
            return f"{part.numerator}/{part.denominator}" if whole == 0 else (
                f"{int(whole)} {part.numerator}/{part.denominator}")
        return f"{value:.4f}".rstrip("0").rstrip(".")
    return f"{value:.2f}".rstrip("0").rstrip(".")


def length_text(value: float, system: str) -> str:
    """A length in m as drawing-unit text with its unit, e.g. "8 3/4 in", "200 mm"."""
    return f"{number_text(to_drawing(value, system), system)} {UNIT_LABEL[system]}"


def title_lines(plate: FabricatedPlate, plates: PlateSet) -> list[str]:
    """The title: mark and ply, grade, thickness and size, holes, place, project."""
    u = plates.system
    lines = [
        f'{plate.mark}: steel plate "{plain(plate.ply_name)}" (ply {plate.ply_index + 1} '
        f"of {plates.ply_count})",
        f"Grade: {plain(plate.grade)} ({plain(plate.material_id)})",
        f"Thickness {length_text(plate.thickness, u)}; size {length_text(plate.depth, u)} "
        f"deep x {length_text(plate.length, u)} long",
    ]
    if plate.holes:
        clearance = plate.hole_diameter - plate.bolt_diameter
        lines.append(f"Holes: {len(plate.holes)} x diameter {length_text(plate.hole_diameter, u)}"
                     f" (bolt {length_text(plate.bolt_diameter, u)} + "
                     f"{length_text(clearance, u)})")
    else:
        lines.append("Holes: none")
    lines.append(f"Along the member: from {length_text(plate.start, u)} to "
                 f"{length_text(plate.end, u)} of {length_text(plates.member_length, u)}")
    project = plain(plates.title)
    if plates.member:
        project += f"; member {plain(plates.member)}"
    if plates.alternative is not None:
        project += f'; alternative "{plain(plates.alternative)}"'
    lines.append(f"Project: {project}")
    lines.append(plates.verdict_note)
    lines.append(f"True size in {'inches' if u == 'US' else 'millimetres'}; hole centres "
                 "from the plate's left end and bottom edge.")
    for note in (*plate.notes, CAUTION):
        lines += textwrap.wrap(plain(note), NOTE_WIDTH)
    return lines


def text_height(plate: FabricatedPlate, system: str) -> float:
    """Text height in drawing units, in proportion to the plate (1/16 of the larger of its
    depth and an eighth of its length), so that the drawing reads at any plot scale.
    """
    return max(to_drawing(plate.depth, system), to_drawing(plate.length, system) / 8) / 16


def _new_document(system: str, h: float) -> Drawing:
    doc = new("R2010", units=INSUNITS[system])
    doc.header["$INSUNITS"] = INSUNITS[system]
    doc.header["$MEASUREMENT"] = MEASUREMENT[system]
    for name, colour in LAYERS.items():
        doc.layers.add(name, color=colour)
    doc.dimstyles.new(DIMSTYLE, dxfattribs={
        "dimtxt": h * 0.7, "dimasz": h * 0.5, "dimexo": h * 0.3, "dimexe": h * 0.3,
        "dimgap": h * 0.2, "dimtad": 1, "dimtih": 0, "dimtoh": 0, "dimlunit": 2,
        "dimdec": 4 if system == "US" else 1, "dimzin": 8, "dimdsep": ord(".")})
    return doc


def _chain(msp: Modelspace, points: Sequence[tuple[float, float]], base: tuple[float, float],
           angle: float) -> None:
    """Dimensions between neighbouring points (measured along ``angle``) on one line."""
    for p1, p2 in zip(points, points[1:], strict=False):
        measured = p2[0] - p1[0] if angle == 0 else p2[1] - p1[1]
        if abs(measured) > 1e-9:
            msp.add_linear_dim(base=base, p1=p1, p2=p2, angle=angle, dimstyle=DIMSTYLE,
                               dxfattribs={"layer": "DIMENSIONS"}).render()


def plate_document(plate: FabricatedPlate, plates: PlateSet) -> Drawing:
    """The plate's drawing (see the module docstring)."""
    u = plates.system
    L, d = to_drawing(plate.length, u), to_drawing(plate.depth, u)
    h = text_height(plate, u)
    doc = _new_document(u, h)
    msp = doc.modelspace()
    msp.add_lwpolyline([(0.0, 0.0), (L, 0.0), (L, d), (0.0, d)], close=True,
                       dxfattribs={"layer": "OUTLINE"})
    r = to_drawing(plate.hole_diameter, u) / 2
    holes = [(to_drawing(x, u), to_drawing(y, u)) for x, y in plate.holes]
    for centre in holes:
        msp.add_circle(centre, r, dxfattribs={"layer": "HOLES"})
    _chain(msp, [(0.0, 0.0), (L, 0.0)], (0.0, -2.5 * h), 0)
    _chain(msp, [(0.0, 0.0), (0.0, d)], (-2.5 * h, 0.0), 90)
    if holes:
        xs = sorted({x for x, _ in holes})
        ys = sorted({y for _, y in holes})
        _chain(msp, [(0.0, d), *[(x, d) for x in xs], (L, d)], (0.0, d + 2.0 * h), 0)
        _chain(msp, [(L, 0.0), *[(L, y) for y in ys], (L, d)], (L + 2.0 * h, 0.0), 90)
    y = -5.0 * h
    for k, line in enumerate(title_lines(plate, plates)):
        size = h if k == 0 else 0.6 * h
        msp.add_text(line, height=size, dxfattribs={"layer": "TEXT"}).set_placement(
            (0.0, y), align=TextEntityAlignment.TOP_LEFT)
        y -= 1.6 * size
    return doc


def plate_dxf(plate: FabricatedPlate, plates: PlateSet) -> bytes:
    """The plate's drawing as the bytes of a DXF file (UTF-8 text)."""
    stream = io.StringIO()
    plate_document(plate, plates).write(stream)
    return stream.getvalue().encode("utf-8")
