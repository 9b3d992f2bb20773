"""The files of ``plystack plates``: ``<mark>.dxf`` for every steel plate and
``cut-list.csv``, each written atomically (``io.atomic``) into one folder.
"""

from __future__ import annotations

import os
from pathlib import Path

from ..io.atomic import write_bytes, write_text
from ..model.errors import Problem, ProjectError
from ..model.project import Project
from .cut_list import cut_list_csv
from .drawing import plate_dxf
from .plates import PlateSet, project_plates

#: Name of the cut list in the output folder.
CUT_LIST = "cut-list.csv"


def output_folder(directory: str | os.PathLike[str], field: str = "-o") -> Path:
    """The output folder, made where it does not exist; a named problem where it cannot be."""
    folder = Path(directory)
    if folder.exists() and not folder.is_dir():
        raise ProjectError(Problem(field, f"{os.fspath(directory)} is a file, not a folder; "
                                   "give a folder for the drawings"))
    try:
        folder.mkdir(parents=True, exist_ok=True)
    except OSError as exc:
        raise ProjectError(Problem(field, f"{os.fspath(directory)}: the folder cannot be "
                                   f"made ({exc.strerror or exc})")) from None
    return folder


def write_plates(plates: PlateSet, directory: str | os.PathLike[str],
                 field: str = "-o") -> list[Path]:
    """Write every plate's DXF file and the cut list; returns the paths written."""
    folder = output_folder(directory, field)
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
