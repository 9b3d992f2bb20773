"""The quick paths of the checks at many transfer sites against the plain ones, exactly
(floats compared by ``repr``, so a last digit, a sign of zero or a NaN would show):

- ``splitting.splitting_checks`` with one memo for all the sites of a caller (the
  timbers, shares, heights in words, distances to the ends and the checks copied from
  the first of each resistance) makes the checks of its rule stated plainly here, site
  by site (regression guard: the rule as the module's text gives it);
- ``bolt_checks._words`` with the words of each zone written once says what it says of
  each transfer alone, and ``_transfer_check`` copying the first check of a zone makes
  the check made in full;
- ``zones.station_sums`` with numpy (the forces' arrays found there or once for all
  the spacings) adds what plain floats add, and what ``sum`` makes of each station's
  transfers in order;
- ``transfer._load_between`` with the whole elements' terms found once
  (``tributary.whole_terms``) adds what it adds term by term;
- a whole run with many point loads makes the same checks, layouts and warnings with
  all of these turned off.
"""

from __future__ import annotations

import math
import random
from pathlib import Path

import pytest

from plystack.core.design import bolt_checks, splitting, transfer, zones
from plystack.core.design.bolt_layout import BoltLayout
from plystack.core.design.check import Check
from plystack.core.design.common import Joint, side_by_side_joints
from plystack.core.design.splitting import SplitSite, splitting_checks
from plystack.core.design.transfer import PlateLoads, Transfer, _load_between, whole_terms
from plystack.core.io.project_file import load
from plystack.core.model.design import DesignSpec
from plystack.core.model.plies import Ply
from plystack.core.model.units import fmt
from plystack.core.pipeline import run
from plystack.core.section.transformed import Section

from .demo_variants import with_point_loads

DEMOS = Path(__file__).resolve().parents[2] / "assets" / "demo"
IN = 0.0254


def _plain_splitting(section: Section, joint: Joint, site: SplitSite,
                     design: DesignSpec, combination: str, k_mod: float | None,
                     shear_capacity: dict[str, float], length: float,
                     system: str) -> list[Check]:
    """The splitting checks of one site, the rule written out timber by timber."""
    out = []
    for j in joint.timbers:
        name = section.plies[j].name
        lo, hi = float(section.y_bottom[j]), float(section.y_top[j])
        if site.force < 0:
            edge, h_e, h = "bottom", max(site.heights) - lo, hi - lo
        else:
            edge, h_e, h = "top", hi - min(site.heights), hi - lo
        b = section.plies[j].width
        if not design.us:
            if k_mod is None or not 0 < h_e < h:
                continue
            r = splitting._eu_resistance(b, h_e, h, k_mod)
        else:
            Fv = shear_capacity.get(name)
            if Fv is None or h_e <= 0:
                continue
            d_e = min(h_e, h)  # NDS 2018 3.4.3.3: to the centre of the nearest bolt
            near_end = min(min(x, length - x) for x in site.stations) < 5 * h
            r = splitting._us_resistance(Fv, b, h, d_e, near_end, system)
        bolts_at = (f"{site.label}: bolts at y = " + ", ".join(
            fmt(y, "length", system) for y in sorted(set(site.heights))))
        out.append(Check(
            id="splitting", ply=name, combination=combination,
            demand=abs(site.force) * splitting._share(section, joint, j),
            capacity=r.capacity, quantity="force", reference=r.reference,
            factors=r.factors, partial_factors=r.partial, sources=r.sources,
            equation=r.equation, location=f"{bolts_at}; loaded edge {edge}", x=site.x,
            notes=r.notes))
    return out


def _side_by_side(n: int) -> tuple[Ply, ...]:
    """n plies side by side, timbers of two depths between plates."""
    out, x = [], 0.0
    for i in range(n):
        if i % 2 == 0:
            depth = 9.25 * IN if i % 4 == 0 else 7.25 * IN
            out.append(Ply(f"timber {i}", "DFL-No2", x, 0.0, 1.5 * IN, depth))
            x += 1.5 * IN
        else:
            out.append(Ply(f"plate {i}", "A36", x, 0.25 * IN, 0.375 * IN, 6.75 * IN))
            x += 0.375 * IN
    return tuple(out)


PROJECTS = {
    "us demo": lambda: load(DEMOS / "porch-header.plystack.json"),
    "eu demo": lambda: load(DEMOS / "stair-trimmer-eu.plystack.json"),
    "us side by side": lambda: load(DEMOS / "porch-header.plystack.json").with_plies(
        _side_by_side(7)),
}


@pytest.mark.parametrize("name", sorted(PROJECTS))
def test_splitting_sites_of_one_caller_are_the_plain_checks(name: str) -> None:
    a = run(PROJECTS[name]())
    assert a.beam is not None
    section, design = a.section, a.design
    system = "US" if design.us else "SI"
    L = a.beam.model.layout.length
    joints = side_by_side_joints(section)
    assert joints
    rng = random.Random(name)
    shared = splitting.Shared()
    made = 0
    for _ in range(400):
        joint = rng.choice(joints)
        top = float(section.y_top.max())
        heights = tuple(rng.choice([0.02, 0.05, 0.1, 0.12, 0.18, top * 0.5, top + 0.01,
                                    -0.01]) for _ in range(rng.randrange(1, 5)))
        stations = tuple(sorted(rng.uniform(-0.1, L + 0.1)
                                for _ in range(rng.randrange(1, 4))))
        force = rng.choice([-1.0, 1.0, 0.0, -0.0]) * rng.uniform(0.0, 4e4)
        site = SplitSite(rng.choice(["support 1", "point load at x = 1 m", "end"]),
                         rng.uniform(0.0, L), force, stations, heights)
        k_mod = rng.choice([None, 0.6, 0.8, 0.9])
        Fv = {section.plies[j].name: rng.choice([0.9e6, 1.2e6])
              for j in joint.timbers if rng.random() < 0.8}
        combination = rng.choice(["D", "D + L", "1.35 G"])
        got = splitting_checks(section, joint, site, design, combination, k_mod, Fv, L,
                               system, shared)
        plain = _plain_splitting(section, joint, site, design, combination, k_mod, Fv, L,
                                 system)
        assert repr(got) == repr(plain)
        assert got == plain
        made += len(got)
    assert made >= 200


def _transfers(rng: random.Random, layout: BoltLayout, n: int) -> list[Transfer]:
    xs = layout.stations
    out = []
    for _ in range(n):
        lo = rng.randrange(len(xs))
        zone = tuple(range(lo, min(len(xs), lo + rng.randrange(1, 4))))
        kind = rng.choice(["support", "point"])
        x = round(rng.uniform(0.0, 6.0), rng.choice([1, 3, 6]))
        label = f"support {rng.randrange(1, 4)}" if kind == "support" else f"p at {x}"
        out.append(Transfer(label, kind, x, rng.uniform(-5e4, 5e4), 0.4, zone,
                            sum(layout.at_station(k) for k in zone),
                            rng.choice([0.2, 0.235])))
    return out


def _layout(rng: random.Random) -> BoltLayout:
    xs = tuple(sorted({round(rng.uniform(0.0, 6.0), 4) for _ in range(12)}))
    station_rows = tuple(tuple(r for r in range(3) if rng.random() < 0.7) or (0,)
                         for _ in xs)
    return BoltLayout(1, xs, (0.05, 0.15, 0.25), station_rows, 0.3, (0.0, 6.0), True)


@pytest.mark.parametrize("system", ["US", "SI"])
def test_words_of_zones_written_once_are_the_words_of_each_transfer(system: str) -> None:
    rng = random.Random(system)
    for _ in range(20):
        layout = _layout(rng)
        named: dict[int, str] = {}
        zoned: bolt_checks._ZoneWords = {}
        for t in _transfers(rng, layout, 60):
            got = bolt_checks._words(t, layout, system, named, zoned)
            alone = bolt_checks._words(t, layout, system)
            assert repr(got) == repr(alone)
            assert got == alone
        assert len(zoned) < 60


@pytest.mark.parametrize("seed", range(4))
def test_station_sums_with_numpy_are_the_sums_of_plain_floats(
        seed: int, monkeypatch: pytest.MonkeyPatch) -> None:
    rng = random.Random(seed)
    for _ in range(150):
        n = rng.randrange(1, 25)
        station_rows = tuple(tuple(range(rng.randrange(0, 4))) for _ in range(n))
        m = rng.randrange(zones.MANY_SUMS, 80)
        lo = [rng.randrange(n) for _ in range(m)]
        hi = [k + rng.randrange(1, 4) for k in lo]
        hi = [min(h, n) for h in hi]
        values = [1e4, -2.5e3, 0.0, -0.0, 1e308, -1e308, math.inf, math.nan, 1 / 3]
        forces = tuple((rng.choice(["point", "support"]), "f", 0.0,
                        rng.choice(values) if rng.random() < 0.2 else rng.uniform(-5e4, 5e4))
                       for _ in range(m))
        share = rng.choice([0.31, 0.5, 2.0])
        quick = zones.station_sums(forces, lo, hi, station_rows, share)
        found_once = zones.station_sums(forces, lo, hi, station_rows, share,
                                        zones.force_arrays(forces))
        assert repr(found_once) == repr(quick)
        monkeypatch.setattr(zones, "MANY_SUMS", 10**9)
        plain = zones.station_sums(forces, lo, hi, station_rows, share)
        monkeypatch.undo()
        assert repr(quick) == repr(plain)
        # what ``sum`` makes of each station's transfers, in order (as placed transfers)
        ahead = [0]
        for rs in station_rows:
            ahead.append(ahead[-1] + len(rs))
        own = [abs(share * f[3]) / (ahead[b] - ahead[a]) if ahead[b] - ahead[a] else math.inf
               for f, a, b in zip(forces, lo, hi, strict=True)]
        signs = [1.0 if f[0] == "point" else -1.0 for f in forces]
        held = [[j for j in range(m) if lo[j] <= k < hi[j]] for k in range(n)]
        by_sum = ([float(sum(own[j] for j in js)) for js in held],
                  [float(sum(own[j] * signs[j] for j in js)) for js in held])
        assert repr(quick) == repr(by_sum)


@pytest.mark.parametrize("seed", range(4))
def test_load_between_with_whole_elements_is_the_sum_term_by_term(seed: int) -> None:
    rng = random.Random(seed)
    for _ in range(60):
        nodes = sorted(round(rng.uniform(0.0, 6.0), 2) for _ in range(rng.randrange(2, 40)))
        nodes = tuple([0.0, *nodes, 6.0])  # repeats: elements of no length
        q = tuple(rng.choice([rng.uniform(-4e3, 1e3), 0.0, -0.0, math.inf])
                  if rng.random() < 0.1 else rng.uniform(-4e3, 1e3) for _ in nodes[1:])
        dq = tuple(rng.uniform(-300.0, 300.0) for _ in nodes[1:])
        whole = whole_terms(nodes, q, dq)
        assert len(whole) == len(q)
        quick = PlateLoads((), nodes, q, dq, whole)
        plain = PlateLoads((), nodes, q, dq)
        cuts = [*nodes, -0.5, 6.5, *(rng.uniform(-0.5, 6.5) for _ in range(30))]
        for _ in range(120):
            a, b = rng.choice(cuts), rng.choice(cuts)
            assert repr(_load_between(quick, a, b)) == repr(_load_between(plain, a, b))
    assert whole_terms((0.0, 2.0, 1.0), (1.0, 1.0), (0.0, 0.0)) == ()  # not ascending


@pytest.mark.parametrize("demo, count", [("porch-header.plystack.json", 300),
                                         ("stair-trimmer-eu.plystack.json", 120)])
def test_many_point_loads_check_alike_without_the_site_quick_paths(
        demo: str, count: int, monkeypatch: pytest.MonkeyPatch) -> None:
    project = with_point_loads(demo, count, 120.0, 9, 0.37)
    quick = run(project)
    words_of, transfer_check = bolt_checks._words_of, bolt_checks._transfer_check
    split = bolt_checks.splitting_checks
    monkeypatch.setattr(zones, "MANY_SUMS", 10**9)
    monkeypatch.setattr(transfer, "whole_terms", lambda *args: ())
    monkeypatch.setattr(bolt_checks, "_words_of",
                        lambda t, layout, system, said, named, zoned=None: words_of(
                            t, layout, system, said, named, None))
    monkeypatch.setattr(bolt_checks, "_transfer_check",
                        lambda t, w, combo, value, f, steel, shared=None, first=None:
                        transfer_check(t, w, combo, value, f, steel, None, None))
    monkeypatch.setattr(bolt_checks, "splitting_checks",
                        lambda *args: split(*args[:9], None))
    plain = run(project)
    ids = [c.id for c in quick.checks]
    assert ids.count("splitting") >= count and ids.count("load-transfer") >= count
    assert repr(quick.checks) == repr(plain.checks)
    assert quick.checks == plain.checks
    assert quick.layouts == plain.layouts
    assert quick.warnings == plain.warnings
