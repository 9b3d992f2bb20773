"""The files of ``plystack plates``: ``<mark>.dxf`` for every steel plate and
``cut-list.csv``, each written atomically (``io.atomic``) into one folder.
"""

from __future__ import annotations

import os
from pathlib import Path

from ..io.atomic import output_folder, write_bytes, write_text
from ..model.project import Project
from .cut_list import cut_list_csv
from .drawing import plate_dxf
from .plates import PlateSet, project_plates

#: Name of the cut list in the output folder.
CUT_LIST = "cut-list.csv"


def write_plates(plates: PlateSet, directory: str | os.PathLike[str],
                 field: str = "-o") -> list[Path]:
    """Write every plate's DXF file and the cut list; returns the paths written."""
    folder = output_folder(directory, field, "the drawings")
    written = []
    for plate in plates.plates:
        path = folder / f"{plate.mark}.dxf"
        write_bytes(path, plate_dxf(plate, plates), field)
        written.append(path)
    path = folder / CUT_LIST
    write_text(path, cut_list_csv(plates), field)
    written.append(path)
    return written


def export_plates(project: Project, directory: str | os.PathLike[str],
                  alternative: str | None = None, field: str = "-o") -> tuple[PlateSet,
                                                                             list[Path]]:
    """Analyse the project (or the alternative), then write its plate files into
    ``directory``. Nothing is written where the plates cannot be made.
    """
    plates = project_plates(project, alternative)
    return plates, write_plates(plates, directory, field)
