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


def once(owner: object, key: Hashable, make: Callable[[], T]) -> T:
    """``make()``, computed once per ``owner`` and ``key``."""
    memo = _MEMO.get(owner)
    if memo is None:
        memo = _MEMO[owner] = {}
    if key not in memo:
        memo[key] = make()
    return memo[key]  # type: ignore[return-value]
