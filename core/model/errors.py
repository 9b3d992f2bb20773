"""Named problems: every user-facing error says which field and what is wrong."""

from __future__ import annotations

import json
import math
from collections.abc import Iterator
from contextlib import contextmanager
from dataclasses import dataclass, replace
from typing import Any


def shown(raw: Any) -> str:
    """A value of the input as quoted in a message: spelt as in the file (JSON: ``null``,
    ``true``, ``"text"``), short whatever its type or size.
    """
    if isinstance(raw, dict):
        return "an object"
    if isinstance(raw, list | tuple):
        return "a list"
    if isinstance(raw, int) and not isinstance(raw, bool) and raw.bit_length() > 64:
        return "a very large number"
    if isinstance(raw, float) and not math.isfinite(raw):
        return "NaN" if raw != raw else ("Infinity" if raw > 0 else "-Infinity")
    try:
        text = json.dumps(raw, ensure_ascii=False)
    except (TypeError, ValueError):
        text = f'"{raw}"'
    return text if len(text) <= 40 else text[:37] + "..."


@dataclass(frozen=True)
class Problem:
    """One problem with the input.

    Attributes:
        path: where it is, e.g. ``plies[2].height`` (empty for the whole project).
        message: what is wrong, in plain words.

    """

    path: str
    message: str

    def __str__(self) -> str:
        return f"{self.path}: {self.message}" if self.path else self.message


@dataclass(frozen=True)
class MissingCheck(Problem):
    """A check that the design basis requires but that could not be made (the verdict is
    then INCOMPLETE, never OK); ``path`` names the field that would make it possible.
    """


class ProjectError(ValueError):
    """Input that cannot be analysed; carries one :class:`Problem` per fault."""

    def __init__(self, problems: list[Problem] | Problem | str):
        if isinstance(problems, str):
            problems = [Problem("", problems)]
        elif isinstance(problems, Problem):
            problems = [problems]
        self.problems: list[Problem] = list(problems)
        super().__init__("\n".join(str(p) for p in self.problems))


@contextmanager
def named_under(prefix: str | None, root: str = "plies") -> Iterator[None]:
    """Name the problems raised inside under ``prefix``: a problem of ``root`` (``plies``,
    ``plies[2].x``) becomes one of ``prefix.root`` (``alternatives[1].plies[2].x``), so
    that the message points at the field of the file that holds them (``None``: as
    they are).
    """
    try:
        yield
    except ProjectError as exc:
        if prefix is None:
            raise
        raise ProjectError([
            replace(p, path=f"{prefix}.{p.path}")
            if p.path == root or p.path.startswith((f"{root}[", f"{root}.")) else p
            for p in exc.problems]) from None
