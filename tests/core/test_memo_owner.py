"""``design.memo`` keeps what it finds in the owner's own ``__dict__`` (as
``functools.cached_property`` does): found once per owner and key, invisible to the
dataclass's fields, repr and comparison, and never carried to a copy made by
``check.evolve`` or ``dataclasses.replace``; an owner without a ``__dict__`` is held by
weak reference instead.
"""

from __future__ import annotations

import gc
from dataclasses import dataclass, fields, replace

from plystack.core.design import memo
from plystack.core.design.check import evolve


@dataclass(frozen=True, eq=False)
class _Owner:
    value: float


class _Slotted:
    __slots__ = ("__weakref__", "value")

    def __init__(self, value: float) -> None:
        self.value = value


def test_found_once_per_owner_and_key() -> None:
    made: list[float] = []
    a, b = _Owner(1.0), _Owner(1.0)

    def make(o: _Owner) -> float:
        made.append(o.value)
        return o.value * 2

    assert memo.once(a, "k", lambda: make(a)) == 2.0
    assert memo.once(a, "k", lambda: make(a)) == 2.0
    assert memo.once(b, "k", lambda: make(b)) == 2.0
    assert memo.once(a, "other", lambda: make(a)) == 2.0
    assert made == [1.0, 1.0, 1.0]
    assert memo.MEMO in a.__dict__
    assert [f.name for f in fields(a)] == ["value"]
    assert repr(a) == "_Owner(value=1.0)"


def test_a_partner_of_another_identity_makes_it_again() -> None:
    a, p, q = _Owner(1.0), object(), object()
    assert memo.with_partner(a, "k", p, lambda: 1) == 1
    assert memo.with_partner(a, "k", p, lambda: 2) == 1
    assert memo.with_partner(a, "k", q, lambda: 3) == 3


def test_copies_start_without_what_the_original_found() -> None:
    a = _Owner(1.0)
    memo.once(a, "k", lambda: "found for a")
    for copy in (evolve(a, value=5.0), replace(a, value=5.0), evolve(a)):
        assert memo.MEMO not in copy.__dict__
        assert memo.once(copy, "k", lambda: "found for the copy") == "found for the copy"
        assert copy.value in (1.0, 5.0)
    assert memo.once(a, "k", lambda: "again") == "found for a"


def test_an_owner_without_a_dict_is_held_by_weak_reference() -> None:
    s = _Slotted(1.0)
    assert memo.once(s, "k", lambda: 10) == 10
    assert memo.once(s, "k", lambda: 20) == 10
    assert s in memo._MEMO
    del s
    gc.collect()
    assert not any(isinstance(k, _Slotted) for k in memo._MEMO.keys())
