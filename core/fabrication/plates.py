"""Each steel plate of a project as it is cut and drilled: its size, where it runs along
the member and the centre of every bolt hole, measured from the plate's left end and its
bottom edge (SI, m).

The holes are the bolts of the layout the bolt checks use (``design.bolt_layout``: the
user's stations, spacing, rows, stagger and end distance, or the spacing the check
chose), so the plate drilled is the plate checked.

Hole diameter: the hole the net-section check takes out (``design.net_section``):
D + 1/16 in on the US basis, the standard hole of AISC 360-16 Table J3.3 for bolts under
1 in and the upper limit of NDS 2018 12.1.3.2 (from memory); d + 1 mm on the EU basis,
the normal clearance of EN 1090-2 Table 11 for M12 and M14 and within the limit of
EN 1995-1-1 10.4.3 for holes in steel plates, at most max(2 mm, 0.1 d) over the bolt
(from memory). Where the standard's normal hole is larger (AISC: D + 1/8 in from 1 in;
EN 1090-2: 2 mm from M16, 3 mm from M27, from memory), the plate keeps the checked hole,
a closer fit, and its notes say so: a larger hole would take more out of the net section
than was checked.
"""

from __future__ import annotations

from dataclasses import dataclass

from ..design import eu_lsd, us_asd
from ..design.bolt_layout import BoltLayout, layout_of
from ..design.common import Joint, side_by_side_joints
from ..design.net_section import hole_diameter
from ..design.transfer import plate_extent
from ..model.constants import INCH, MM
from ..model.design import DesignSpec
from ..model.errors import Problem, ProjectError, named_under
from ..model.project import Project
from ..model.units import fmt
from ..pipeline import Analysis, run

#: Density of steel where the material gives none, kg/m^3 (EN 1991-1-1 Table A.4,
#: 78.5 kN/m^3, from memory; common practice).
STEEL_DENSITY = 7850.0

#: Hole centres closer than this to a plate's edge than the hole's radius (m) still count
#: as inside (rounding of positions written in the file's units).
EDGE_TOLERANCE = 1e-9


@dataclass(frozen=True)
class FabricatedPlate:
    """One steel plate as it is cut and drilled (SI).

    Attributes:
        mark: the plate's mark, PL1, PL2, ... in ply order.
        ply_index: index of the ply in the section (0 first).
        ply_name: the user's name of the ply.
        material_id: the material's key.
        grade: the material's readable name.
        thickness: the ply's width in the section, m.
        depth: the ply's height in the section (the plate's width as cut), m.
        start: where the plate begins along the member, m from its left end.
        end: where it stops, m.
        holes: (x, y) of every hole centre, m from the plate's left end and bottom edge,
            station by station, rows upward.
        hole_diameter: m (see the module docstring).
        bolt_diameter: m.
        density: kg/m^3 (the material's, or STEEL_DENSITY where it gives none).
        bolted: True where the plate has timber against a face and so takes the bolts.
        notes: what a fabricator needs to know beyond the numbers.

    """

    mark: str
    ply_index: int
    ply_name: str
    material_id: str
    grade: str
    thickness: float
    depth: float
    start: float
    end: float
    holes: tuple[tuple[float, float], ...]
    hole_diameter: float
    bolt_diameter: float
    density: float
    bolted: bool
    notes: tuple[str, ...] = ()

    @property
    def length(self) -> float:
        """The plate's length along the member, m."""
        return self.end - self.start

    @property
    def mass(self) -> float:
        """Mass of the plate as ordered, kg: thickness x depth x length x density, holes
        not deducted (common practice for a cut list).
        """
        return self.thickness * self.depth * self.length * self.density


@dataclass(frozen=True)
class PlateSet:
    """The steel plates of a project (or of one of its alternatives).

    Attributes:
        title: the project's title.
        alternative: the alternative's name, or None for the project's own plies.
        member: the member's mark from the project's info ("" where none).
        system: display units, "US" or "SI".
        member_length: m.
        ply_count: plies in the section.
        plates: the steel plates in ply order.
        verdict: the verdict of the design checks ("OK", "NOT OK" or "INCOMPLETE").

    """

    title: str
    alternative: str | None
    member: str
    system: str
    member_length: float
    ply_count: int
    plates: tuple[FabricatedPlate, ...]
    verdict: str

    @property
    def verdict_note(self) -> str:
        """The verdict in words, with a warning where it is not OK."""
        if self.verdict == "OK":
            return "Design checks: OK."
        return (f"Design checks: {self.verdict}. Not for fabrication until every check of "
                "the member is OK.")


def plain(text: str) -> str:
    """User text made safe for one line of a drawing or a message: control characters
    become spaces, and "%%" (a DXF text code) is split.
    """
    return "".join(c if c.isprintable() else " " for c in text).replace("%%", "% %")


def select_alternative(project: Project, alternative: str | None) -> Project:
    """The project with the plies of the named alternative (the project itself for None)."""
    if alternative is None:
        return project
    return project.with_plies(project.alternative_named(alternative)[1].plies)


def clearance_note(design: DesignSpec) -> str:
    """The hole's clearance and its source, with the standard's normal hole where that is
    larger (see the module docstring).
    """
    d = design.bolt.diameter
    if design.us:
        text = ("Holes D + 1/16 in, as the net-section check takes out (AISC 360-16 Table "
                "J3.3 standard hole for bolts under 1 in; NDS 2018 12.1.3.2; from memory).")
        if d >= INCH * (1 - 1e-12):
            text += (" For bolts of 1 in and larger the standard hole is D + 1/8 in: this "
                     "plate keeps the closer fit that was checked.")
        return text
    text = ("Holes d + 1 mm, as the net-section check takes out (EN 1090-2 Table 11 normal "
            "clearance for M12 and M14; within EN 1995-1-1 10.4.3 for steel plates; from "
            "memory).")
    if d > 14 * MM * (1 + 1e-12):
        text += (" For M16 and larger the normal clearance is 2 mm (3 mm from M27): this "
                 "plate keeps the closer fit that was checked.")
    return text


def _layout(a: Analysis, joint: Joint) -> BoltLayout:
    """The layout the bolt checks used for this plate (``Analysis.layouts``); the user's
    stations or spacing where its bolts could not be valued.
    """
    placed = next((p.layout for p in a.layouts if p.ply == joint.steel), None)
    if placed is not None:
        return placed
    s, beam, design = a.section, a.beam, a.design
    assert beam is not None
    bolt, system = design.bolt, a.project.display_units
    if bolt.stations or bolt.spacing is not None:
        length = beam.model.layout.length
        return layout_of(s, joint, bolt, plate_extent(s, joint.steel, length),
                         bolt.spacing or length, design.us)
    warnings: list[Problem] = []
    driver = us_asd if design.us else eu_lsd
    driver.bolt_value(s, design, joint, system, warnings)  # the reasons, for the message
    name = plain(s.plies[joint.steel].name)
    raise ProjectError([*warnings, Problem(
        "design.bolt.spacing", f'the bolts of "{name}" cannot be checked, so no spacing '
        "was chosen for them; give the spacing or the stations to draw the plate")])


def _holes(layout: BoltLayout, start: float, bottom: float) -> tuple[tuple[float, float], ...]:
    return tuple((x - start, y - bottom) for x, y in layout.bolts)


def _outside(plate: FabricatedPlate, explicit_stations: bool, system: str) -> list[Problem]:
    """One named problem for each field whose holes do not lie wholly inside the plate
    (the first such hole shown, with the count).
    """
    r = plate.hole_diameter / 2
    found: dict[str, list[int]] = {}
    for k, (x, y) in enumerate(plate.holes):
        along = x - r < -EDGE_TOLERANCE or x + r > plate.length + EDGE_TOLERANCE
        across = y - r < -EDGE_TOLERANCE or y + r > plate.depth + EDGE_TOLERANCE
        if along or across:
            path = ("design.bolt.stations" if along and explicit_stations else
                    "design.bolt.rows" if across else "design.bolt")
            found.setdefault(path, []).append(k)
    out = []
    for path, holes in found.items():
        x, y = plate.holes[holes[0]]
        which = (f"hole {holes[0] + 1} of {plate.mark} does" if len(holes) == 1 else
                 f"{len(holes)} holes of {plate.mark} do")
        out.append(Problem(path, f'{which} not lie wholly inside the plate '
                           f'"{plain(plate.ply_name)}" (hole {holes[0] + 1} has its centre '
                           f"{fmt(x, 'length', system)} from the plate's left end and "
                           f"{fmt(y, 'length', system)} above its bottom edge; the plate is "
                           f"{fmt(plate.length, 'length', system)} long and "
                           f"{fmt(plate.depth, 'length', system)} deep)"))
    return out


def plates_of(a: Analysis, alternative: str | None = None) -> PlateSet:
    """The steel plates of an analysed project, in ply order.

    Raises:
        ProjectError: no beam, no steel plate, a plate cut by a ply that overlaps it, a
            bolt layout that cannot be made or a hole outside its plate.

    """
    project, s = a.project, a.section
    if a.beam is None:
        raise ProjectError(Problem("beam", "is not given: a plate's length and its bolts "
                                   "follow the member's span and loads"))
    length = a.beam.model.layout.length
    joints = {j.steel: j for j in side_by_side_joints(s)}
    design = a.design
    bolt = design.bolt
    d_hole = hole_diameter(design)
    note = clearance_note(design)
    plates: list[FabricatedPlate] = []
    problems: list[Problem] = []
    for i, (ply, material) in enumerate(zip(s.plies, s.materials, strict=True)):
        if material.kind != "steel":
            continue
        if not s.is_unclipped(i):
            problems.append(Problem(f"plies[{i}]", f'"{plain(ply.name)}" is cut by a later ply '
                                    "that overlaps it, so the plate analysed is not its "
                                    "rectangle; move the plies apart to draw it"))
            continue
        start, end = plate_extent(s, i, length)
        joint = joints.get(i)
        holes = () if joint is None else _holes(_layout(a, joint), start, ply.y)
        notes = (note,) if joint is not None else (
            "No bolt holes: no timber lies against a face of this plate, so it takes no "
            "through-bolts; its fastening to the plies it is stacked on is not drawn.",)
        plate = FabricatedPlate(
            mark=f"PL{len(plates) + 1}", ply_index=i, ply_name=ply.name,
            material_id=material.id, grade=material.name, thickness=ply.width,
            depth=ply.height, start=start, end=end, holes=holes, hole_diameter=d_hole,
            bolt_diameter=bolt.diameter,
            density=material.density if material.density > 0 else STEEL_DENSITY,
            bolted=joint is not None, notes=notes)
        problems += _outside(plate, bool(bolt.stations), project.display_units)
        plates.append(plate)
    if problems:
        raise ProjectError(problems)
    if not plates:
        raise ProjectError(Problem("plies", "hold no steel plate (no ply of a steel "
                                   "material): there is nothing to fabricate"))
    return PlateSet(title=project.title, alternative=alternative,
                    member=project.info.get("member", ""), system=project.display_units,
                    member_length=length, ply_count=len(s.plies), plates=tuple(plates),
                    verdict=a.verdict)


def project_plates(project: Project, alternative: str | None = None) -> PlateSet:
    """Analyse the project (or the named alternative) and return its steel plates."""
    chosen = select_alternative(project, alternative)
    where = (None if alternative is None
             else f"alternatives[{project.alternative_named(alternative)[0]}]")
    with named_under(where):
        return plates_of(run(chosen), alternative)

