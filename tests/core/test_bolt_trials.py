"""The quick paths of the bolt checks give the same floats as the plain statement of their
rule, written out here.

Sources (each a restatement of the rule in ``design.transfer``'s module text, computed
the plain way beside the quick one; regression guards, exact equality):
- the distributed load on a tributary: ``transfer.distributed_load`` (numpy's
  ``searchsorted`` over the mesh, the terms q (s1 - s0) + dq (s1^2 - s0^2) / 2 element by
  element);
- a station's transfers: every transfer whose zone holds the station, in order;
- the governing station: the first of the stations with the largest per-bolt force,
  ``max(..., key=per_bolt)`` over every station.
"""

from __future__ import annotations

import json
import math
from dataclasses import FrozenInstanceError, fields
from pathlib import Path

import pytest

from plystack.core.design import eu_lsd, us_asd
from plystack.core.design.bolt_checks import (
    PlateLayout,
    governing_station,
    plate_layout,
)
from plystack.core.design.bolt_layout import layout_of
from plystack.core.design.common import (
    STOCK_SPACINGS_SI,
    STOCK_SPACINGS_US,
    plate_share,
    side_by_side_joints,
)
from plystack.core.design.transfer import (
    StationDemand,
    _load_between,
    distributed_load,
    governing_demand,
    governing_within,
    placed_demands,
    placed_transfers,
    plate_extent,
    plate_loads,
    station_demands,
    transfers,
)
from plystack.core.design.zones import zone as _zone
from plystack.core.design.zones import zone_ascending as _zone_ascending
from plystack.core.io.project_file import from_dict
from plystack.core.pipeline import Analysis, run

DEMOS = Path(__file__).resolve().parents[2] / "assets" / "demo"


def _data(name: str) -> dict:
    data = json.loads((DEMOS / name).read_text(encoding="utf-8"))
    data.pop("alternatives", None)
    return data


def _us(**plate: str) -> dict:
    data = _data("porch-header.plystack.json")
    data["plies"][1].update(plate)
    return data


def _us_points() -> dict:
    data = _us()
    for k, at in enumerate(["1 ft", "2.5 ft", "6 ft", "7 ft", "9.5 ft", "11 ft"]):
        data["beam"]["loads"].append({"case": "L" if k % 2 else "D", "type": "point",
                                      "value": f"{200 + 50 * k} lbf", "at": at})
    return data


def _eu_points() -> dict:
    data = _data("stair-trimmer-eu.plystack.json")
    for k, at in enumerate(["0.4 m", "2.0 m", "2.9 m", "3.5 m"]):
        data["beam"]["loads"].append({"case": "L" if k % 2 else "D", "type": "point",
                                      "value": f"{1 + k} kN", "at": at})
    return data


def _us_heavy() -> dict:
    """A live load no stock spacing carries: the last spacing tried is kept."""
    data = _us()
    data["beam"]["loads"][1]["value"] = "400 psf"
    return data


PROJECTS = {
    "us demo": _us,
    "us no spacing passes": _us_heavy,
    "us plate stopping short": lambda: _us(**{"from": "1 ft", "to": "11 ft"}),
    "us point loads": _us_points,
    "eu demo": lambda: _data("stair-trimmer-eu.plystack.json"),
    "eu point loads": _eu_points,
}


def _plain_demands(a: Analysis, combo, layout, share, items) -> list[StationDemand]:
    """The rule stated plainly: each station's tributary, its distributed load and the
    transfers whose zone holds it."""
    assert a.beam is not None
    out = []
    for k, x in enumerate(layout.stations):
        lo, hi = layout.tributary(k)
        w = distributed_load(a.beam.model, combo.solution, lo, hi)
        out.append(StationDemand(k, x, lo, hi, w, layout.at_station(k),
                                 tuple(t for t in items if k in t.zone), share))
    return out


def _every_trial(a: Analysis):
    """(layout, combination, share) of every stock spacing of every plate."""
    assert a.beam is not None
    L = a.beam.model.layout.length
    stock = STOCK_SPACINGS_US if a.project.display_units == "US" else STOCK_SPACINGS_SI
    for jt in side_by_side_joints(a.section):
        extent = plate_extent(a.section, jt.steel, L)
        for s in stock:
            layout = layout_of(a.section, jt, a.design.bolt, extent, s, a.design.us)
            for combo in a.beam.combinations:
                yield layout, combo, plate_share(a.section, jt.steel)


@pytest.mark.parametrize("name", sorted(PROJECTS))
def test_quick_paths_equal_the_plain_rule_for_every_spacing(name):
    a = run(from_dict(PROJECTS[name]()))
    assert a.beam is not None
    seen = 0
    for layout, combo, share in _every_trial(a):
        loads = plate_loads(a.section, a.beam, combo, a.design, layout.plate, layout.extent)
        items = placed_transfers(loads, layout, share, a.section.depth)
        assert items == transfers(a.section, a.beam, combo, a.design, layout, share)
        assert [t.zone for t in items] == [_zone(layout, t.x, a.section.depth) for t in items]
        plain = _plain_demands(a, combo, layout, share, items)
        assert placed_demands(loads, layout, share, items) == plain
        assert station_demands(a.section, a.beam, combo, layout, share, items) == plain
        gov = governing_demand(loads, layout, share, items)
        assert gov == governing_station(plain) == max(plain, key=lambda d: d.per_bolt)
        # the trial's early stop: None exactly where the governing station is over
        assert governing_within(loads, layout, share, items, gov.per_bolt) == gov
        below = math.nextafter(gov.per_bolt, -math.inf)
        assert governing_within(loads, layout, share, items, below) is None
        seen += 1
    assert seen >= 8


@pytest.mark.parametrize("name", sorted(PROJECTS))
def test_load_between_equals_distributed_load_on_any_interval(name):
    """Intervals ending at nodes, between them, outside the member and empty."""
    a = run(from_dict(PROJECTS[name]()))
    assert a.beam is not None
    model = a.beam.model
    nodes = [float(x) for x in model.nodes]
    L = nodes[-1]
    cuts = sorted({*nodes, -0.1, L + 0.1, *(L * k / 37 for k in range(38)),
                   *((p + q) / 2 for p, q in zip(nodes, nodes[1:], strict=False))})
    for combo in a.beam.combinations:
        loads = plate_loads(a.section, a.beam, combo, a.design, 1, (0.0, L))
        for i, lo in enumerate(cuts):
            for hi in cuts[i:i + 9]:
                assert _load_between(loads, lo, hi) == distributed_load(
                    model, combo.solution, lo, hi)


@pytest.mark.parametrize("name", sorted(PROJECTS))
def test_the_chosen_layout_is_the_largest_passing_spacing(name):
    """plate_layout by its rule, stated plainly: the first stock spacing (largest first, at
    least 4 D) at which every strength combination's governing bolt force is at most the
    bolt's adjusted value; else the last tried."""
    from plystack.core.design.bolt_geometry import layout_factors

    a = run(from_dict(PROJECTS[name]()))
    assert a.beam is not None
    beam, s, design = a.beam, a.section, a.design
    system = a.project.display_units
    combos = beam.strength() or beam.combinations
    driver = us_asd if design.us else eu_lsd
    stock = STOCK_SPACINGS_US if system == "US" else STOCK_SPACINGS_SI
    for jt in side_by_side_joints(s):
        value = driver.bolt_value(s, design, jt, system, [])
        assert value is not None
        extent = plate_extent(s, jt.steel, beam.model.layout.length)
        share = plate_share(s, jt.steel)
        expected = None
        for spacing in [x for x in stock if x >= 4 * design.bolt.diameter]:
            expected = layout_of(s, jt, design.bolt, extent, spacing, design.us)
            geo = layout_factors(s, jt, expected, design, beam.model.layout.length)[0]
            if all(governing_station(_plain_demands(
                    a, c, expected, share, transfers(s, beam, c, design, expected, share)))
                   .per_bolt <= value.capacity(c, geo) for c in combos):
                break
        chosen = plate_layout(s, beam, design, jt, value, combos, system)
        assert chosen == expected
        assert PlateLayout(jt.steel, jt, chosen) in a.layouts


def test_a_carried_layout_is_frozen():
    a = run(from_dict(_us()))
    (placed,) = a.layouts
    for obj in (placed, placed.layout):
        for f in fields(obj):
            with pytest.raises(FrozenInstanceError):
                setattr(obj, f.name, getattr(obj, f.name))


@pytest.mark.parametrize("spacing", [0.05, 0.1524, 0.3, 0.6096, 2.0])
def test_zone_by_bisection_equals_the_plain_scan(spacing):
    """Stations within d of x (at least the nearest), bisected or scanned: loads at the
    stations, halfway between them, exactly d away, just inside and outside d, beyond the
    ends and on a plate with one station."""
    a = run(from_dict(_us()))
    (placed,) = a.layouts
    d = a.section.depth
    for start, end in ((0.0, 3.6576), (0.3048, 3.3528), (1.0, 1.2)):
        layout = layout_of(a.section, placed.joint, a.design.bolt, (start, end), spacing,
                           True)
        xs = layout.stations
        probes = [start - 0.5, end + 0.5, *xs, *((p + q) / 2 for p, q in zip(xs, xs[1:],
                                                                              strict=False))]
        for x in xs:
            for r in (d, d * (1 + 1e-9)):
                for y in (x - r, x + r):
                    probes += [y, math.nextafter(y, -math.inf), math.nextafter(y, math.inf)]
        for x in probes:
            assert _zone_ascending(xs, x, d) == _zone(layout, x, d), x


@pytest.mark.parametrize("demo", ["porch-header.plystack.json",
                                  "stair-trimmer-eu.plystack.json"])
def test_a_segments_bolt_checks_are_the_net_shear_of_the_full_ones(demo: str) -> None:
    """A segment's run keeps, of the bolts, only the timbers' net-section shear: the
    quick path equals the ``shear`` checks of the full bolt checks (regression guard)."""
    from plystack.core.design.bolt_checks import bolted_plate, net_shear_at_holes

    a = run(from_dict(_data(demo)))
    assert a.beam is not None
    driver = us_asd if a.design.us else eu_lsd
    system = a.project.display_units
    gross = list(a.checks)
    for jt in side_by_side_joints(a.section):
        value = driver.bolt_value(a.section, a.design, jt, system, [])
        assert value is not None
        full = bolted_plate(a.section, a.beam, a.design, jt, value, system, gross).checks
        quick = net_shear_at_holes(a.section, a.beam, a.design, jt, value, system, gross)
        assert quick and repr(quick) == repr([c for c in full if c.id == "shear"])
