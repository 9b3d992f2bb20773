"""What the checks derive once per immutable result and reuse: a section's side-by-side
joints, its unit shear stresses, its plate-less or ULS-moduli section, a combination's
shear beside each support.

Sections and combination results are immutable and compared by identity, so a value found
for one is valid for as long as it lives; the entries go with it (weak keys). Values kept
here are shared and must not be mutated.
"""

from __future__ import annotations

import weakref
from collections.abc import Callable, Hashable
from typing import TypeVar

T = TypeVar("T")

_MEMO: weakref.WeakKeyDictionary[object, dict[Hashable, object]] = weakref.WeakKeyDictionary()


def with_partner(owner: object, key: Hashable, partner: object, make: Callable[[], T]) -> T:
    """``make()``, found once per ``owner`` and ``key`` while ``partner`` (what the value
    also depends on) is the same object; it is held beside the value, so an object of
    the same identity is the same object.
    """
    memo = _MEMO.get(owner)
    if memo is None:
        memo = _MEMO[owner] = {}
    held = memo.get(key)
    if not (isinstance(held, tuple) and held[0] is partner):
        held = memo[key] = (partner, make())
    return held[1]  # type: ignore[no-any-return]


def of_list(owner: object, key: Hashable, items: list[object], make: Callable[[], T]) -> T:
    """``make()`` for a list as it stands (``items``: the same list object with the same
    length; check lists are only ever appended to), found once per ``owner``.
    """
    return with_partner(owner, (key, len(items)), items, make)


def once(owner: object, key: Hashable, make: Callable[[], T]) -> T:
    """``make()``, computed once per ``owner`` and ``key``."""
    return with_partner(owner, key, None, make)
