"""The project: everything the user entered (plain frozen data; no file reading).

The material library is passed in by whoever builds the project (the file reader does);
the model never reads it from disk.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field, replace

from .design import DesignSpec
from .errors import Problem, ProjectError
from .materials import Material
from .member import BeamSpec
from .plies import Ply


@dataclass(frozen=True)
class Alternative:
    """A named variant of the section (its own plies; everything else shared)."""

    name: str
    plies: tuple[Ply, ...]


@dataclass(frozen=True)
class Project:
    """Everything the user entered. Frozen: edits return new projects (cheap undo)."""

    title: str = "Untitled"
    display_units: str = "US"
    materials: Mapping[str, Material] = field(default_factory=dict)
    plies: tuple[Ply, ...] = ()
    reference_material: str | None = None
    beam: BeamSpec | None = None
    design: DesignSpec | None = None
    info: Mapping[str, str] = field(default_factory=dict)
    alternatives: tuple[Alternative, ...] = ()
    current_alternative: str | None = None
    #: The material library the project was read against (not written to its file).
    library: Mapping[str, Material] = field(default_factory=dict, compare=False, repr=False)

    def all_materials(self) -> dict[str, Material]:
        """Library materials overlaid by the project's own (project wins)."""
        return {**self.library, **self.materials}

    def with_plies(self, plies: tuple[Ply, ...]) -> Project:
        """Return a copy with other plies."""
        return replace(self, plies=tuple(plies))

    def alternative_named(self, name: str) -> tuple[int, Alternative]:
        """The index and the alternative called ``name``; a named problem (the option
        ``--alternative``) where there is none.
        """
        for k, alt in enumerate(self.alternatives):
            if alt.name == name:
                return k, alt
        names = ", ".join(f'"{a.name}"' for a in self.alternatives) or "none"
        raise ProjectError(Problem("--alternative", f'"{name}" is not an alternative of this '
                                   f"project ({names})"))

    def design_or_default(self) -> DesignSpec:
        """The design choices, or the defaults of the US basis."""
        return self.design or DesignSpec()


