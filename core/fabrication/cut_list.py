"""The cut list: one CSV row per plate, in the project's display units (inches and pounds
for a US-unit project, millimetres and kilograms for SI), each header naming its unit.

Hole positions are x;y pairs (from the plate's left end and bottom edge) separated by
spaces. Numbers are written to 10 significant digits. A text cell that a spreadsheet
would read as a formula (starting with =, +, -, @) gets a leading apostrophe (common
practice for CSV written for spreadsheets).
"""

from __future__ import annotations

import csv
import io

from ..study.schedule import MASS_UNITS
from .drawing import UNIT_LABEL, to_drawing
from .plates import FabricatedPlate, PlateSet


def columns(system: str) -> list[str]:
    """The header of the cut list."""
    u, m = UNIT_LABEL[system], MASS_UNITS[system][0]
    return ["mark", "ply", "grade", f"thickness ({u})", f"width ({u})", f"length ({u})",
            "hole count", f"hole diameter ({u})", f"hole positions x;y ({u})", f"mass ({m})"]


def number(value: float) -> str:
    """A number to 10 significant digits, without exponent for the sizes of plates."""
    text = f"{value:.10g}"
    return "0" if text == "-0" else text


def cell(text: str) -> str:
    """User text safe for a spreadsheet (see the module docstring)."""
    return "'" + text if text[:1] in ("=", "+", "-", "@") else text


def row(plate: FabricatedPlate, system: str) -> list[str]:
    """One plate's cells, in the order of ``columns``."""
    def length(value: float) -> str:
        return number(to_drawing(value, system))

    positions = " ".join(f"{length(x)};{length(y)}" for x, y in plate.holes)
    return [plate.mark, cell(plate.ply_name), cell(plate.grade), length(plate.thickness),
            length(plate.depth), length(plate.length), str(len(plate.holes)),
            length(plate.hole_diameter) if plate.holes else "", positions,
            number(plate.mass * MASS_UNITS[system][1])]


def cut_list_csv(plates: PlateSet) -> str:
    """The cut list as CSV text."""
    buffer = io.StringIO()
    writer = csv.writer(buffer, lineterminator="\n")
    writer.writerow(columns(plates.system))
    for plate in plates.plates:
        writer.writerow(row(plate, plates.system))
    return buffer.getvalue()
