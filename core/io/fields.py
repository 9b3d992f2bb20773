"""One field spec per key of a file object, shared by the reader and the writer.

A :class:`FieldSpec` says where a key goes (the dataclass attribute), what kind of value
it holds and its limits; :func:`read_fields` turns a JSON object into constructor
arguments with one named problem per fault, and :func:`write_fields` writes the values
back in the project's display units. A new scalar key is one line in a table.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from typing import Any, Literal

from ..model import units
from ..model.errors import Problem, shown

Kind = Literal["flag", "choice", "count", "number", "quantity", "positive"]


@dataclass(frozen=True)
class FieldSpec:
    """One key of a file object.

    Attributes:
        key: the key in the file.
        attr: the dataclass attribute it fills (default: the key).
        kind: "flag" (true/false), "choice" (one of ``choices``), "count" (a whole
            number from ``lo`` to ``hi``), "number" (a plain number from ``lo`` to ``hi``),
            "quantity" (a string with units of ``dimension``), "positive" (such a
            quantity greater than zero).
        dimension: the units dimension of quantities (see core.model.units.DIMENSIONS).
        write_kind: the display kind used when writing (default: ``dimension``).
        choices: allowed values of a choice.
        lo: smallest allowed number.
        hi: largest allowed number.
        always: write the value even where it equals the default.

    """

    key: str
    kind: Kind
    attr: str = ""
    dimension: str = ""
    write_kind: str = ""
    choices: tuple[Any, ...] = ()
    lo: float | None = None
    hi: float | None = None
    always: bool = False

    @property
    def name(self) -> str:
        """The dataclass attribute."""
        return self.attr or self.key

    def read(self, raw: Any, path: str, problems: list[Problem]) -> tuple[bool, Any]:
        """(ok, value) of one raw JSON value; a named problem where it is not ok."""
        where = f"{path}.{self.key}"
        if self.kind == "flag":
            if isinstance(raw, bool):
                return True, raw
            problems.append(Problem(where, "must be true or false"))
        elif self.kind == "choice":
            if any(raw == c and type(raw) is type(c) for c in self.choices):
                return True, raw
            problems.append(Problem(where, f"{shown(raw)} must be one of "
                                    + ", ".join(str(c) for c in self.choices)))
        elif self.kind in ("count", "number"):
            return self._read_number(raw, where, problems)
        else:
            try:
                value = units.parse(raw, self.dimension, where)
            except units.UnitError as exc:
                problems.append(units.problem(exc))
                return False, None
            if self.kind == "positive" and not value > 0:
                problems.append(Problem(where, "must be greater than zero"))
                return False, None
            return True, value
        return False, None

    def _read_number(self, raw: Any, where: str, problems: list[Problem]) -> tuple[bool, Any]:
        whole = self.kind == "count"
        ok_type = isinstance(raw, int) if whole else isinstance(raw, int | float)
        if isinstance(raw, bool) or not ok_type:
            word = "a whole number (a count)" if whole else "a plain number"
            problems.append(Problem(where, f"{shown(raw)} must be {word}{self._range()}"))
            return False, None
        if whole and abs(raw) > 10**9:
            problems.append(Problem(where, f"{shown(raw)} must be a number{self._range()}"))
            return False, None
        value = int(raw) if whole else float(raw)
        finite = value == value and value not in (float("inf"), float("-inf"))
        if not finite or (self.lo is not None and value < self.lo) or (
                self.hi is not None and value > self.hi):
            problems.append(Problem(where, f"{shown(raw)} must be a number{self._range()}"))
            return False, None
        return True, value

    def _range(self) -> str:
        if self.lo is not None and self.hi is not None:
            return f" between {self.lo:g} and {self.hi:g}"
        if self.lo is not None:
            return f" of at least {self.lo:g}"
        return ""

    def write(self, value: Any, system: str) -> Any:
        """The file form of ``value``."""
        if self.kind in ("quantity", "positive"):
            return units.exact_text(value, self.write_kind or self.dimension, system)
        return value


def unknown_keys(raw: dict[str, Any], known: Sequence[str], path: str, what: str,
                 problems: list[Problem]) -> None:
    """A named problem for every key of ``raw`` that is not in ``known``."""
    for key in raw:
        if key not in known:
            problems.append(Problem(f"{path}.{key}", f"is not a known key of {what}"))


def read_fields(raw: dict[str, Any], specs: Sequence[FieldSpec], path: str,
                problems: list[Problem]) -> dict[str, Any]:
    """Constructor arguments for the keys of ``specs`` present in ``raw``."""
    out: dict[str, Any] = {}
    for spec in specs:
        if spec.key in raw:
            ok, value = spec.read(raw[spec.key], path, problems)
            if ok:
                out[spec.name] = value
    return out


def write_fields(obj: Any, default: Any, specs: Sequence[FieldSpec],
                 system: str) -> dict[str, Any]:
    """The file keys of ``obj`` that are set (not None) and differ from ``default``
    (or are written always).
    """
    out: dict[str, Any] = {}
    for spec in specs:
        value = getattr(obj, spec.name)
        if value is None:
            continue
        if spec.always or value != getattr(default, spec.name):
            out[spec.key] = spec.write(value, system)
    return out
