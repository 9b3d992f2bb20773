"""The quick paths of the bolt-spacing trials against the plain ones, exactly.

- ``zones.zone_bounds`` (every transfer zone at once) finds the stations
  ``zone_ascending`` finds, one transfer at a time;
- ``transfer.trial_within`` decides as ``governing_within`` of the transfers placed the
  plain way decides (a layout passes where its governing station is within the limit);
- a whole run with many point loads makes the same checks and layouts with the quick
  paths as with them turned off (``_fails`` never skipping a spacing, ``zones.zone_bounds``
  never answering).
"""

from __future__ import annotations

import random
from dataclasses import replace
from pathlib import Path

import pytest

from plystack.core.design import bolt_checks, zones
from plystack.core.design.bolt_layout import BoltLayout
from plystack.core.design.transfer import (
    PlateLoads,
    Transfer,
    governing_within,
    placed_transfers,
    trial_within,
)
from plystack.core.io.project_file import load
from plystack.core.model.member import Load
from plystack.core.pipeline import run

from .demo_variants import with_point_loads

DEMOS = Path(__file__).resolve().parents[2] / "assets" / "demo"


def _stations(rng: random.Random, n: int) -> tuple[float, ...]:
    """Ascending stations on a 0.1 m grid with repeats and a few off the grid."""
    xs = sorted(round(rng.randrange(0, 60) * 0.1, 10) + (rng.random() * 1e-3 if
                                                            rng.random() < 0.2 else 0.0)
                for _ in range(n))
    return tuple(xs)


def _positions(rng: random.Random, xs: tuple[float, ...], depth: float, n: int) -> list[float]:
    """Positions at stations, exactly a depth from them, between them and past the ends."""
    out = []
    for _ in range(n):
        s = rng.choice(xs)
        out.append(rng.choice([s, s + depth, s - depth, s + depth * (1 + 2e-9),
                               s + rng.uniform(-2, 2), -1.0, xs[-1] + 3.0,
                               s + 0.05]))
    return out


def _layout(rng: random.Random, xs: tuple[float, ...]) -> BoltLayout:
    rows = (0.05, 0.15, 0.25)
    station_rows = tuple(tuple(r for r in range(3) if rng.random() < 0.8) or (1,)
                         for _ in xs)
    return BoltLayout(plate=1, stations=xs, rows=rows, station_rows=station_rows,
                      spacing=0.1, extent=(min(0.0, xs[0]), max(6.0, xs[-1])), placed=True)


def _plain_transfers(loads: PlateLoads, layout: BoltLayout, share: float,
                     depth: float) -> list[Transfer]:
    """The transfers one at a time, as before the quick path (bisection per transfer)."""
    out = []
    for kind, label, x, force in loads.forces:
        zone = zones.zone_ascending(layout.stations, x, depth)
        out.append(Transfer(label, kind, x, force, share, zone,
                            sum(layout.at_station(k) for k in zone), depth))
    return out


def test_zone_bounds_are_the_zones_found_one_at_a_time() -> None:
    rng = random.Random(7)
    for _ in range(300):
        xs = _stations(rng, rng.randrange(1, 40))
        depth = rng.choice([0.1, 0.2, 0.235, 0.3])
        at = _positions(rng, xs, depth, rng.randrange(1, 60))
        bounds = zones.zone_bounds(xs, at, depth)
        assert bounds is not None
        for x, lo, hi in zip(at, *bounds, strict=True):
            assert tuple(range(lo, hi)) == zones.zone_ascending(xs, x, depth)


def test_zone_bounds_refuse_what_they_cannot_tell() -> None:
    assert zones.zone_bounds((), [1.0], 0.2) is None
    assert zones.zone_bounds((0.0, 1.0), [], 0.2) is None
    assert zones.zone_bounds((0.0, 1.0), [float("nan")], 0.2) is None


def _loads(rng: random.Random, xs: tuple[float, ...], depth: float, n: int) -> PlateLoads:
    forces = tuple((rng.choice(["point", "point", "support"]), f"f{j}", x,
                    rng.uniform(-2e4, 5e4))
                   for j, x in enumerate(sorted(_positions(rng, xs, depth, n))))
    nodes = (0.0, 1.7, 3.1, 4.4, 6.0)
    q = tuple(rng.uniform(-4e3, 0.0) for _ in nodes[:-1])
    dq = tuple(rng.uniform(-300.0, 300.0) for _ in nodes[:-1])
    return PlateLoads(forces, nodes, q, dq)


@pytest.mark.parametrize("seed", range(6))
def test_trial_decides_as_the_governing_station(seed: int) -> None:
    rng = random.Random(seed)
    for _ in range(120):
        xs = _stations(rng, rng.randrange(1, 30))
        depth = rng.choice([0.2, 0.3])
        layout = _layout(rng, xs)
        loads = _loads(rng, xs, depth, rng.randrange(0, 40))
        share = rng.uniform(0.1, 0.9)
        items = _plain_transfers(loads, layout, share, depth)
        assert placed_transfers(loads, layout, share, depth) == items
        top = governing_within(loads, layout, share, items, float("inf"))
        assert top is not None
        for limit in (top.per_bolt, top.per_bolt * (1 - 1e-15), top.per_bolt * 0.5,
                      top.per_bolt * 2, 0.0, float("inf")):
            gov = governing_within(loads, layout, share, items, limit)
            plain = gov is not None and gov.per_bolt <= limit
            assert trial_within(loads, layout, share, depth, limit) is plain


def test_trial_leaves_to_the_plain_path_what_it_cannot_tell() -> None:
    layout = BoltLayout(1, (0.5, 0.2), (0.1,), ((0,), (0,)), 0.3, (0.0, 1.0), False)
    loads = PlateLoads((("point", "p", 0.3, 100.0),), (0.0, 1.0), (0.0,), (0.0,))
    assert trial_within(loads, layout, 0.5, 0.2, 10.0) is None  # stations out of order
    ordered = replace(layout, stations=(0.2, 0.5))
    assert trial_within(loads, ordered, 0.5, 0.2, float("nan")) is None
    assert trial_within(loads, ordered, 0.5, 0.2, 10.0) is False
    assert trial_within(loads, ordered, 0.5, 0.2, 100.0) is True


@pytest.mark.parametrize("demo, count", [("porch-header.plystack.json", 60),
                                         ("stair-trimmer-eu.plystack.json", 40)])
def test_many_point_loads_check_alike_with_and_without_the_quick_paths(
        demo: str, count: int, monkeypatch: pytest.MonkeyPatch) -> None:
    project = with_point_loads(demo, count, 150.0, 7, 0.41)
    quick = run(project)
    monkeypatch.setattr(bolt_checks, "_fails", lambda *args: False)
    monkeypatch.setattr(zones, "zone_bounds", lambda *args: None)
    plain = run(project)
    assert len(quick.checks) > 3 * count
    assert quick.checks == plain.checks
    assert quick.layouts == plain.layouts
    assert quick.warnings == plain.warnings


@pytest.mark.parametrize("demo", ["porch-header.plystack.json", "stair-trimmer-eu.plystack.json"])
def test_checks_sharing_their_resistances_are_the_checks_made_alone(
        demo: str, monkeypatch: pytest.MonkeyPatch) -> None:
    """The ``load-transfer`` and ``splitting`` checks of many sites share what their zone
    and timber set alike; made one by one they are the same checks."""
    project = load(DEMOS / demo)
    beam = project.beam
    assert beam is not None
    L = beam.layout.length
    extra = tuple(Load(case="L", type="point", value=90.0 * (k % 5 + 1),
                       at=L * (k + 0.5) / 30) for k in range(30))
    project = replace(project, beam=replace(beam, loads=beam.loads + extra))
    # stations closer together near the left end: zones of several sizes
    stations = tuple(sorted({round(L * (0.02 + 0.96 * (k / 24) ** 1.6), 6)
                             for k in range(25)}))
    bolt = replace(project.design.bolt, stations=stations, stagger=True, rows=3)
    project = replace(project, design=replace(project.design, bolt=bolt))
    shared = run(project)
    alone_split = bolt_checks.splitting_checks
    alone_zone = bolt_checks._zoned
    monkeypatch.setattr(bolt_checks, "splitting_checks",
                        lambda *args: alone_split(*args[:9], None))
    monkeypatch.setattr(bolt_checks, "_zoned", lambda t, value, f, shared: alone_zone(
        t, value, f, None))
    alone = run(project)
    ids = [c.id for c in shared.checks]
    assert ids.count("splitting") >= 30 and ids.count("load-transfer") >= 30
    zones = {(c.fasteners.count, c.fasteners.locations) for c in shared.checks
             if c.id == "load-transfer" and c.fasteners is not None}
    assert len(zones) >= 3
    assert shared.checks == alone.checks
    assert [c.to_dict() for c in shared.checks] == [c.to_dict() for c in alone.checks]
