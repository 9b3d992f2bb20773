"""Property: every project the file reader accepts is written so that it reads back to
the identical project (every float bit for bit), with short quantity text.
"""

from __future__ import annotations

import json

from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from plystack.core.io.project_file import dumps, loads
from plystack.core.model import units
from plystack.core.model.combination import EU_DURATIONS, KINDS, US_DURATIONS, Combination
from plystack.core.model.design import STEEL_RULES, TEMPERATURES, Bolt, Connector, DesignSpec
from plystack.core.model.materials import PRODUCTS, STRESS_KEYS, Material
from plystack.core.model.member import CASES, BeamLayout, BeamSpec, Load
from plystack.core.model.plies import Ply
from plystack.core.model.project import Alternative, Project


def _floats(lo: float, hi: float) -> st.SearchStrategy[float]:
    return st.floats(min_value=lo, max_value=hi, allow_nan=False, allow_infinity=False)


positive_length = _floats(1e-9, 1000.0).filter(lambda v: v > 0)
position = _floats(-1000.0, 1000.0)
words = st.text(max_size=12)


@st.composite
def materials(draw: st.DrawFn) -> dict[str, Material]:
    out = {}
    for mid in draw(st.lists(st.sampled_from(["m1", "m2", "oak"]), unique=True, max_size=2)):
        kind = draw(st.sampled_from(["timber", "steel", "other"]))
        values = {k: draw(_floats(1.0, 1e12)) for k in
                  draw(st.lists(st.sampled_from(STRESS_KEYS), unique=True, max_size=4))}
        if draw(st.booleans()):
            values["G"] = draw(_floats(0.01, 1.99))
        if draw(st.booleans()):
            values["rho_k"] = draw(_floats(1.0, 1e5))
        out[mid] = Material(mid, draw(words), kind, draw(_floats(1e3, 1e12)),
                            draw(_floats(0.0, 1e5)), draw(words), values,
                            draw(st.sampled_from(PRODUCTS)), draw(st.booleans()),
                            draw(st.dictionaries(st.sampled_from(["Fb", "E"]), words,
                                                 max_size=2)),
                            draw(words), draw(words))
    return out


@st.composite
def plies(draw: st.DrawFn, material_ids: list[str]) -> tuple[Ply, ...]:
    n = draw(st.integers(1, 4))
    # every ply has a name (the reader refuses a blank one)
    names = draw(st.lists(words.filter(str.strip), min_size=n, max_size=n, unique=True))
    return tuple(Ply(name, draw(st.sampled_from(material_ids)), draw(position),
                     draw(position), draw(positive_length), draw(positive_length))
                 for name in names)


@st.composite
def beams(draw: st.DrawFn) -> BeamSpec:
    supports = draw(st.sampled_from(["simple", "cantilever", "fixed-fixed", "propped"]))
    count = draw(st.integers(1, 3)) if supports == "simple" else 1
    spans = tuple(draw(_floats(0.01, 300.0)) for _ in range(count))
    left = right = 0.0
    if supports == "simple":
        left = draw(st.sampled_from([0.0]) | _floats(0.0, 50.0))
        right = draw(st.sampled_from([0.0]) | _floats(0.0, 50.0))
    layout = BeamLayout(spans, supports, left, right)
    length = layout.length
    loads = []
    for _ in range(draw(st.integers(0, 3))):
        case = draw(st.sampled_from(CASES))
        typ = draw(st.sampled_from(["area", "line", "point"]))
        if typ == "point":
            loads.append(Load(case, typ, draw(_floats(-1e9, 1e9)),
                              at=draw(_floats(0.0, length))))
            continue
        start, end = None, None
        if draw(st.booleans()):
            a, b = sorted((draw(_floats(0.0, length)), draw(_floats(0.0, length))))
            if b > a:
                start, end = a, b
        trib = draw(positive_length) if typ == "area" else None
        value = draw(_floats(-1e7, 1e7)) if typ == "area" else draw(_floats(-1e8, 1e8))
        loads.append(Load(case, typ, value, trib, start, end))
    combos: str | tuple[Combination, ...] | None = draw(st.sampled_from([None, "ASD",
                                                                         "EN1990"]))
    if draw(st.booleans()):
        combos = tuple(
            Combination(name, draw(st.dictionaries(st.sampled_from(CASES), _floats(0, 10),
                                                   min_size=1)),
                        draw(st.none() | st.sampled_from(US_DURATIONS + EU_DURATIONS)),
                        draw(st.sampled_from(KINDS)), custom=True)
            for name in draw(st.lists(words.filter(bool), min_size=1, max_size=3,
                                      unique=True)))
    # a bearing at most half the shortest span (the cantilever's span): the reader's rule
    most = min(spans) if supports == "cantilever" else min(spans) / 2
    bearing = draw(st.none() | _floats(most * 1e-3, most))
    return BeamSpec(layout, tuple(loads), draw(st.booleans()), bearing, combos,
                    draw(st.none() | _floats(0.0, 1.0)))


@st.composite
def designs(draw: st.DrawFn, ply_names: list[str]) -> DesignSpec:
    basis = draw(st.sampled_from(["US-ASD", "EU-LSD"]))
    lo, hi = (0.00635, 0.0254) if basis == "US-ASD" else (0.006, 0.030)
    bolt = Bolt(draw(_floats(lo, hi)), draw(_floats(1.0, 1e12)), draw(st.integers(1, 20)),
                draw(_floats(1.0, 1e12)), draw(st.none() | positive_length))
    connector = Connector(draw(st.sampled_from(["screw", "bolt", "nail"])),
                          draw(st.none() | _floats(1e-3, 1e9)), draw(st.integers(1, 20)),
                          draw(st.none() | positive_length))
    psi = draw(st.dictionaries(st.sampled_from(["L", "Lr", "S", "W"]),
                               st.tuples(_floats(0, 1), _floats(0, 1), _floats(0, 1))))
    overrides = draw(st.dictionaries(st.sampled_from(ply_names),
                                     st.dictionaries(st.sampled_from(["C_D", "C_F", "k_mod"]),
                                                     _floats(0, 10), max_size=2),
                                     max_size=2))
    return DesignSpec(
        basis, draw(st.booleans()), draw(st.sampled_from(TEMPERATURES)), draw(st.booleans()),
        draw(st.booleans()), draw(st.booleans()), draw(st.none() | positive_length),
        draw(st.none() | _floats(1, 1e5)), draw(st.none() | _floats(1, 1e5)),
        draw(st.none() | _floats(1, 1e5)), draw(st.none() | _floats(1, 5)),
        draw(st.none() | _floats(0, 5)), draw(st.sampled_from(STEEL_RULES)),
        draw(st.sampled_from([1, 2, 3])), psi, overrides, connector, bolt, draw(st.booleans()))


@st.composite
def projects(draw: st.DrawFn) -> Project:
    own = draw(materials())
    ids = [*own, "DFL-No2", "A36"]
    current = draw(plies(ids))
    alternatives = tuple(Alternative(name, draw(plies(ids)))
                         for name in draw(st.lists(words, unique=True, max_size=2)))
    return Project(
        title=draw(st.text(max_size=30)), display_units=draw(st.sampled_from(["US", "SI"])),
        materials=own, plies=current,
        reference_material=draw(st.none() | st.sampled_from(ids)),
        beam=draw(st.none() | beams()),
        design=draw(st.none() | designs([p.name for p in current])),
        info=draw(st.dictionaries(st.sampled_from(["member", "date", "revision"]), words)),
        alternatives=alternatives,
        current_alternative=draw(st.none() | words))


@settings(max_examples=100, deadline=None, suppress_health_check=[HealthCheck.too_slow],
          derandomize=True)
@given(projects())
def test_load_of_save_is_the_same_project(project):
    text = dumps(project)
    assert loads(text) == project
    assert loads(dumps(loads(text))) == project


def _quantities(data):
    """The quantity texts of plies, spans and loads."""
    for ply in data["plies"]:
        yield from (ply[k] for k in ("x", "y", "width", "height"))
    beam = data.get("beam", {})
    yield from beam.get("spans", [])
    for load in beam.get("loads", []):
        yield from (load[k] for k in ("value", "tributary_width", "from", "to", "at")
                    if k in load)


@settings(max_examples=30, deadline=None, suppress_health_check=[HealthCheck.too_slow],
          derandomize=True)
@given(projects())
def test_quantity_text_is_short(project):
    """At most 17 significant digits (a float's round trip needs no more)."""
    for text in _quantities(json.loads(dumps(project))):
        number = text.split()[0].lstrip("-").replace(".", "").lstrip("0")
        mantissa = number.split("e")[0]
        assert len(mantissa.rstrip("0")) <= 17, text


def test_shortest_text_examples():
    parse = units.parse
    assert units.exact_text(parse("12 ft", "length", "f"), "span", "US") == "12 ft"
    assert units.exact_text(parse("12 ft", "length", "f"), "length", "US") == "12 ft"
    assert units.exact_text(parse("9 1/4 in", "length", "f"), "length", "US") == "9.25 in"
    assert units.exact_text(parse("1/3 in", "length", "f"), "length", "US") == "1/3 in"
    assert units.exact_text(parse("9 1/3 in", "length", "f"), "length", "US") == "9 1/3 in"
    assert units.exact_text(parse("29000 ksi", "modulus", "f"), "modulus", "US") == (
        "29000000 psi")
    assert units.exact_text(400e6, "stress", "US") == "400 MPa"
    assert units.exact_text(parse("235 mm", "length", "f"), "length", "SI") == "235 mm"
    assert units.exact_text(0.235, "length", "SI") == "0.235 m"  # 235 mm reads 1 ulp off
    assert units.exact_text(1e-5, "length", "SI") == "0.01 mm"
    # 12 * 0.3048 is not the float "12 ft" reads as; its own shortest text is 17 digits
    text = units.exact_text(12 * 0.3048, "span", "US")
    assert parse(text, "length", "f") == 12 * 0.3048
    assert text == "12.000000000000004 ft"
