"""``check.evolve`` makes what ``dataclasses.replace`` makes (the standard library is the
reference): equal objects with the same fields, of the same type, the original untouched.
"""

from __future__ import annotations

from dataclasses import dataclass, fields, replace

import pytest

from plystack.core.design.check import Check, Fasteners, evolve
from plystack.core.model.errors import MissingCheck, Problem


def _check() -> Check:
    return Check(id="shear", ply="left", combination="D + L", demand=1.25e6, capacity=2.5e6,
                 quantity="stress", reference=("Fv", 1.2e6), factors={"C_D": 1.0},
                 sources={"Fv": "table"}, equation="f_v <= F'v", location="", x=0.5,
                 notes=("a",), fasteners=Fasteners(count=3))


def _same(a: object, b: object) -> None:
    assert type(a) is type(b)
    assert a == b
    for f in fields(a):  # type: ignore[arg-type]
        assert getattr(a, f.name) is getattr(b, f.name)


@pytest.mark.parametrize("changes", [{}, {"demand": 2.0, "x": None},
                                     {"segment": 2, "location": "segment 3"},
                                     {"id": "bending-net", "notes": ()}])
def test_check_as_replace(changes: dict[str, object]) -> None:
    c = _check()
    before = repr(c)
    _same(evolve(c, **changes), replace(c, **changes))
    assert repr(c) == before


def test_problem_and_its_subclass() -> None:
    for p in (Problem("plies[0]", "x"), MissingCheck("plies[1].material", "y")):
        _same(evolve(p, path="plies[4]"), replace(p, path="plies[4]"))


def test_unknown_field_refused() -> None:
    with pytest.raises(TypeError, match="no field 'demnd'"):
        evolve(_check(), demnd=1.0)


def test_object_with_more_than_its_fields_goes_the_plain_way() -> None:
    @dataclass(frozen=True)
    class Held:
        a: float
        b: float = 0.0

    h = Held(1.0, 2.0)
    object.__setattr__(h, "_cache", 5)  # something besides the fields
    out = evolve(h, b=3.0)
    assert out == Held(1.0, 3.0) and not hasattr(out, "_cache")
