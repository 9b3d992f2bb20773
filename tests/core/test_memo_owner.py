"""``design.memo``: what a check derives from an immutable owner is found once per owner
and key (and partner), kept beside the owner by weak reference, never written into the
owner (frozen objects are never changed), and gone with the owner.
"""

from __future__ import annotations

import gc
from dataclasses import dataclass

from plystack.core.design import memo


@dataclass(frozen=True, eq=False)
class _Owner:
    value: float


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
    assert a.__dict__ == {"value": 1.0}  # nothing written into the frozen owner


def test_a_partner_of_another_identity_makes_it_again() -> None:
    a, p, q = _Owner(1.0), object(), object()
    assert memo.with_partner(a, "k", p, lambda: 1) == 1
    assert memo.with_partner(a, "k", p, lambda: 2) == 1
    assert memo.with_partner(a, "k", q, lambda: 3) == 3


def test_the_entries_go_with_the_owner() -> None:
    a = _Owner(1.0)
    memo.once(a, "k", lambda: 10)
    assert a in memo._MEMO
    del a
    gc.collect()
    assert not any(isinstance(k, _Owner) and k.value == 1.0 for k in memo._MEMO.keys())
