"""The bolt layout each plate's checks use travels with the analysis (``Analysis.layouts``).

Sources:
- Station and row positions: hand calculations of the placing rules stated in
  ``design.bolt_layout`` (stations at the chosen spacing centred on the plate, as many as
  max(2, floor(length / spacing)); rows given as a count centred on the height the plate
  shares with its timbers, 4 D from either edge, NDS 2018 Table 12.5.1C and EN 1995-1-1
  Table 8.4 a4,t = 4 d at 90 degrees, from memory; on the US basis at most 5 in between the
  outer rows, NDS 2018 12.5.1.3, from memory), written out in each test.
- The chosen spacing: ``bolt_checks.plate_layout`` asked again on its own (the largest stock
  spacing at which every bolt passes), a second computation of the same rule that guards
  against the carried layout drifting from it (regression guard).
- 1 in = 0.0254 m and 1 ft = 12 in exactly (the international inch).
"""

from __future__ import annotations

import json
from pathlib import Path

import pytest

from plystack.core.design import eu_lsd, us_asd
from plystack.core.design.bolt_checks import plate_layout
from plystack.core.design.common import side_by_side_joints
from plystack.core.fabrication.plates import plates_of
from plystack.core.io.project_file import from_dict, load
from plystack.core.model.errors import Problem, ProjectError
from plystack.core.pipeline import Analysis, run
from plystack.core.report.connections import plate_layouts

DEMOS = Path(__file__).resolve().parents[2] / "assets" / "demo"
US_DEMO = DEMOS / "porch-header.plystack.json"
EU_DEMO = DEMOS / "stair-trimmer-eu.plystack.json"
IN = 0.0254
MM = 0.001


def _data(demo: Path) -> dict:
    data = json.loads(demo.read_text(encoding="utf-8"))
    data.pop("alternatives", None)
    return data


def _independent(a: Analysis) -> list[tuple[int, object]]:
    """Every plate's layout chosen again by ``plate_layout`` from the analysis' section and
    beam (the bolt value from the basis' own function)."""
    assert a.beam is not None
    driver = us_asd if a.design.us else eu_lsd
    out = []
    for jt in side_by_side_joints(a.section):
        value = driver.bolt_value(a.section, a.design, jt, a.project.display_units, [])
        if value is not None:
            combos = a.beam.strength() or a.beam.combinations
            out.append((jt.steel, plate_layout(a.section, a.beam, a.design, jt, value, combos,
                                               a.project.display_units)))
    return out


def _assert_positions(got: tuple[float, ...], expected: list[float]) -> None:
    assert len(got) == len(expected)
    for g, e in zip(got, expected, strict=True):
        assert g == pytest.approx(e, rel=0, abs=1e-12)


def test_us_demo_carries_the_layout_its_checks_chose():
    """Porch header, 12 ft = 144 in, spacing chosen 24 in (its ``bolts`` check says so):
    max(2, floor(144 / 24)) = 6 stations, the first at (144 - 5 x 24) / 2 = 12 in, then
    36, 60, 84, 108, 132 in. Rows: shared height 1/4 in to 9 in, centre 4 5/8 in, room
    8 3/4 - 8 x 1/2 = 4 3/4 in (under 5 in), rows at 2 1/4 and 7 in.
    """
    a = run(load(US_DEMO))
    (placed,) = a.layouts
    assert placed.ply == 1 and placed.joint.steel == 1 and placed.joint.timbers == (0, 2)
    assert [(placed.ply, placed.layout)] == _independent(a)
    lay = placed.layout
    _assert_positions(lay.stations, [x * IN for x in (12, 36, 60, 84, 108, 132)])
    _assert_positions(lay.rows, [2.25 * IN, 7.0 * IN])
    assert lay.spacing == pytest.approx(24 * IN, rel=1e-15)
    bolts = next(c for c in a.checks if c.id == "bolts")
    assert bolts.fasteners is not None
    assert (bolts.fasteners.locations, bolts.fasteners.count) == (6, lay.count) == (6, 12)
    assert bolts.fasteners.spacing == lay.spacing
    assert plate_layouts(a) == [(placed.joint, lay)]


def test_plate_stopping_short_carries_its_own_stations():
    """The flitch plate from 1 ft to 11 ft: 120 in long, spacing 24 in, so
    max(2, floor(120 / 24)) = 5 stations, the first 12 + (120 - 4 x 24) / 2 = 24 in from the
    member's left end, then 48, 72, 96, 120 in. The stepped member's bolts are checked once
    on the whole member, and its layout is that one.
    """
    data = _data(US_DEMO)
    data["plies"][1].update({"from": "1 ft", "to": "11 ft"})
    a = run(from_dict(data))
    assert a.segments
    (placed,) = a.layouts
    assert [(placed.ply, placed.layout)] == _independent(a)
    lay = placed.layout
    assert lay.extent == pytest.approx((12 * IN, 132 * IN), rel=0, abs=1e-12)
    _assert_positions(lay.stations, [x * IN for x in (24, 48, 72, 96, 120)])
    bolts = next(c for c in a.checks if c.id == "bolts")
    assert bolts.fasteners is not None and bolts.fasteners.locations == 5


def test_eu_demo_carries_the_layout():
    """Stair trimmer, 3.6 m, spacing chosen 600 mm: 6 stations from (3600 - 5 x 600) / 2 =
    300 mm to 3300 mm. Rows: plate 10 to 210 mm between 0 to 220 mm joists, centre 110 mm,
    room 200 - 8 x 12 = 104 mm (no limit on the EU basis): rows at 58 and 162 mm.
    """
    a = run(load(EU_DEMO))
    (placed,) = a.layouts
    assert [(placed.ply, placed.layout)] == _independent(a)
    _assert_positions(placed.layout.stations, [x * MM for x in range(300, 3301, 600)])
    _assert_positions(placed.layout.rows, [58 * MM, 162 * MM])


def test_two_side_plates_each_carry_their_own_layout_in_ply_order():
    """A timber between two side plates, the right one from 2 ft: two entries, ply 0 then
    ply 2, each equal to its own choice."""
    data = _data(US_DEMO)
    data["plies"] = [
        {"name": "left plate", "material": "A36", "x": "0 in", "y": "1/4 in",
         "width": "1/4 in", "height": "8 3/4 in"},
        {"name": "timber", "material": "DFL-No2", "x": "1/4 in", "y": "0 in",
         "width": "3.5 in", "height": "9 1/4 in"},
        {"name": "right plate", "material": "A36", "x": "3 3/4 in", "y": "1/4 in",
         "width": "1/4 in", "height": "8 3/4 in", "from": "2 ft"}]
    a = run(from_dict(data))
    assert [p.ply for p in a.layouts] == [0, 2]
    assert [(p.ply, p.layout) for p in a.layouts] == _independent(a)
    assert a.layouts[1].layout.extent[0] == pytest.approx(24 * IN, rel=0, abs=1e-12)


def test_staged_member_carries_the_built_members_layout():
    """Strengthened under its dead load: the bolts are those of the finished member."""
    data = _data(US_DEMO)
    data["plies"][1]["stage"] = "added"
    data["beam"]["loads"][0]["stage"] = "before"
    a = run(from_dict(data))
    assert a.stages is not None
    assert [(p.ply, p.layout) for p in a.layouts] == _independent(a)


def _without_fu(data: dict) -> dict:
    data["materials"] = {"plain-steel": {"kind": "steel", "E": "29000 ksi", "Fy": "36 ksi",
                                         "density": "490 pcf"}}
    data["plies"][1]["material"] = "plain-steel"
    return data


def test_a_plate_whose_bolts_cannot_be_valued_has_no_layout():
    """Steel without Fu: no bolt value (NDS 2018 12.3.1 needs it), so no layout; the sheet
    has no plate to detail and the drawing names the spacing field."""
    a = run(from_dict(_without_fu(_data(US_DEMO))))
    assert a.layouts == ()
    assert plate_layouts(a) == []
    with pytest.raises(ProjectError) as err:
        plates_of(a)
    problems = err.value.problems
    assert problems[-1] == Problem(
        "design.bolt.spacing", 'the bolts of "flitch plate" cannot be checked, so no spacing '
        "was chosen for them; give the spacing or the stations to draw the plate")
    assert problems[0].path == "plies[1].material"


def test_a_given_spacing_is_drawn_where_the_bolts_cannot_be_valued():
    """With the spacing given, the plate is drilled at it: 144 / 16 = 9 stations, centred
    at (144 - 8 x 16) / 2 = 8 in, then every 16 in to 136 in."""
    data = _without_fu(_data(US_DEMO))
    data["design"]["bolt"]["spacing"] = "16 in"
    a = run(from_dict(data))
    assert a.layouts == ()
    (plate,) = plates_of(a).plates
    xs = sorted({round(x / IN, 9) for x, _y in plate.holes})
    assert xs == [8.0 + 16 * k for k in range(9)]


def test_eu_layout_without_a_uls_combination_is_still_placed():
    """No ULS combination: no bolt is checked, yet the plate is drawn at the layout placed
    by the same rule over the combinations given (here the largest stock spacing, 600 mm,
    passes)."""
    data = _data(EU_DEMO)
    data["beam"]["combinations"] = [{"name": "SLS", "kind": "SLS-characteristic",
                                     "factors": {"D": 1, "L": 1}}]
    a = run(from_dict(data))
    assert not any(c.id == "bolts" for c in a.checks)
    (placed,) = a.layouts
    assert [(placed.ply, placed.layout)] == _independent(a)
    assert placed.layout.spacing == pytest.approx(0.6, rel=1e-15)
    assert len(plates_of(a).plates[0].holes) == 12


def test_plate_end_checks_use_the_layout_the_bolt_checks_chose():
    """The load-transfer and splitting checks at the ends of a plate stopping short take
    the member's chosen layout; choosing it again (``placed`` not given) gives the same
    checks (regression guard of the reuse).
    """
    from plystack.core.design.ply_ends import ply_end_checks

    data = _data(US_DEMO)
    data["plies"][1].update({"from": "1 ft", "to": "11 ft"})
    a = run(from_dict(data))
    assert a.beam is not None
    system = a.project.display_units
    placed = {p.ply: p.layout for p in a.layouts}
    reused = ply_end_checks(a.section, a.beam, a.segments, a.design, system, a.checks, placed)
    again = ply_end_checks(a.section, a.beam, a.segments, a.design, system, a.checks)
    assert reused[0] and repr(reused) == repr(again)
    assert {c.id for c in reused[0]} >= {"load-transfer"}
