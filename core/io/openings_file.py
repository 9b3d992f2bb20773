"""The beam's "notches" and "holes" in a project file: read (with named problems) and
written back.

"notches": [{"at": "support 1" | "support 2" | "<position>", "face": "bottom" | "top",
"depth": "...", "length": "...", "plies": [names]}]; "holes": [{"at": "<position>",
"y": "<height of the centre>", "diameter": "...", "plies": [names]}].
"""

from __future__ import annotations

import re
from typing import Any

from ..model import units
from ..model.errors import Problem
from ..model.member import BeamLayout
from ..model.openings import Hole, Notch, validate_opening
from ..model.units import exact_text

NOTCH_KEYS = ("at", "face", "depth", "length", "plies")
HOLE_KEYS = ("at", "y", "diameter", "plies")
#: Most notches or holes in one beam.
MAX_OPENINGS = 100


def _length(raw: Any, path: str, problems: list[Problem]) -> float | None:
    try:
        return units.parse(raw, "length", path)
    except units.UnitError as exc:
        problems.append(units.problem(exc))
        return None


def _names(raw: Any, path: str, problems: list[Problem]) -> tuple[str, ...]:
    if raw is None:
        return ()
    if not isinstance(raw, list) or not all(isinstance(n, str) for n in raw):
        problems.append(Problem(path, "must be a list of ply names"))
        return ()
    return tuple(raw)


def _records(raw: Any, path: str, keys: tuple[str, ...], required: tuple[str, ...],
             problems: list[Problem]) -> list[tuple[str, dict[str, Any]]]:
    if not isinstance(raw, list):
        problems.append(Problem(path, "must be a list"))
        return []
    if len(raw) > MAX_OPENINGS:
        problems.append(Problem(path, f"has {len(raw)} items; at most {MAX_OPENINGS}"))
        return []
    out = []
    for i, rec in enumerate(raw):
        p = f"{path}[{i}]"
        if not isinstance(rec, dict):
            problems.append(Problem(p, "must be an object with " + ", ".join(required)))
            continue
        bad = [Problem(f"{p}.{k}", "is not a known key") for k in rec if k not in keys]
        bad += [Problem(f"{p}.{k}", "is missing") for k in required if k not in rec]
        problems.extend(bad)
        if not bad:
            out.append((p, rec))
    return out


def _at(raw: Any, path: str, layout: BeamLayout,
        problems: list[Problem]) -> tuple[float | None, int | None]:
    """A position, or "support N" (its x and number)."""
    if isinstance(raw, str) and (m := re.fullmatch(r"\s*support\s+(\d{1,3})\s*", raw)):
        k = int(m.group(1))
        xs = layout.support_positions()
        if not 1 <= k <= len(xs):
            problems.append(Problem(path, f'"{raw}" is not a support of this beam (1 to '
                                    f"{len(xs)})"))
            return None, None
        return xs[k - 1], k
    return _length(raw, path, problems), None


def read_notches(raw: Any, path: str, layout: BeamLayout,
                 problems: list[Problem], system: str = "SI") -> tuple[Notch, ...]:
    """The beam's notches."""
    out = []
    for p, rec in _records(raw, path, NOTCH_KEYS, ("at", "face", "depth", "length"),
                           problems):
        before = len(problems)
        x, support = _at(rec["at"], f"{p}.at", layout, problems)
        face = rec["face"] if isinstance(rec["face"], str) else str(rec["face"])
        depth = _length(rec["depth"], f"{p}.depth", problems)
        length = _length(rec["length"], f"{p}.length", problems)
        plies = _names(rec.get("plies"), f"{p}.plies", problems)
        if len(problems) > before or x is None or depth is None or length is None:
            continue
        notch = Notch(x, face, depth, length, support, plies)
        probs = validate_opening(notch, layout.length, p, system)
        problems.extend(probs)
        if not probs:
            out.append(notch)
    return tuple(out)


def read_holes(raw: Any, path: str, layout: BeamLayout,
               problems: list[Problem], system: str = "SI") -> tuple[Hole, ...]:
    """The beam's holes."""
    out = []
    for p, rec in _records(raw, path, HOLE_KEYS, ("at", "y", "diameter"), problems):
        before = len(problems)
        x = _length(rec["at"], f"{p}.at", problems)
        y = _length(rec["y"], f"{p}.y", problems)
        d = _length(rec["diameter"], f"{p}.diameter", problems)
        plies = _names(rec.get("plies"), f"{p}.plies", problems)
        if len(problems) > before or x is None or y is None or d is None:
            continue
        hole = Hole(x, y, d, plies)
        probs = validate_opening(hole, layout.length, p, system)
        problems.extend(probs)
        if not probs:
            out.append(hole)
    return tuple(out)


def write_notches(notches: tuple[Notch, ...], system: str) -> list[dict[str, Any]]:
    """Notches as file records."""
    out = []
    for n in notches:
        rec: dict[str, Any] = {
            "at": f"support {n.support}" if n.support is not None
            else exact_text(n.x, "span", system),
            "face": n.face, "depth": exact_text(n.depth, "length", system),
            "length": exact_text(n.length, "length", system)}
        if n.plies:
            rec["plies"] = list(n.plies)
        out.append(rec)
    return out


def write_holes(holes: tuple[Hole, ...], system: str) -> list[dict[str, Any]]:
    """Holes as file records."""
    out = []
    for h in holes:
        rec: dict[str, Any] = {"at": exact_text(h.x, "span", system),
                               "y": exact_text(h.y, "length", system),
                               "diameter": exact_text(h.diameter, "length", system)}
        if h.plies:
            rec["plies"] = list(h.plies)
        out.append(rec)
    return out
