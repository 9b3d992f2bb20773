"""Changes to a project file's parsed JSON by dotted keys, as a member schedule gives them.

A key is the project file's own path in dotted form: ``beam.spans``, ``beam.supports``,
``beam.loads[1].value`` (lists counted from 0, as in every problem path),
``beam.loads[*].tributary_width`` (every entry of the list that has the key),
``plies[plate].height`` (the entry whose ``"name"`` is ``plate``). Values are the text of
the file: quantity strings stay strings; several values for a list (``beam.spans``) are
separated by ``;`` (a comma may be part of a quantity, "1,200 lbf"); a value that starts
with ``[`` or ``{`` is JSON. Nothing is validated here beyond finding the place: the
changed JSON is read by the project file's own reader, which names every bad value.
"""

from __future__ import annotations

import json
from dataclasses import dataclass
from typing import Any

LIST_SEPARATOR = ";"
#: Top-level keys whose values are always text (never read as numbers or JSON).
TEXT_KEYS = frozenset({"title", "info", "current_alternative", "reference_material"})


class OverrideError(ValueError):
    """A key that names no place in the project, or a value that cannot be read."""


@dataclass(frozen=True)
class Step:
    """One step of a dotted key: an object key, a list index, every entry, or a name."""

    kind: str  # "key", "index", "all" or "name"
    value: str | int = ""


def parse_key(text: str) -> tuple[Step, ...]:
    """The steps of a dotted key. Raises OverrideError for a key that cannot be read."""
    steps: list[Step] = []
    name = ""
    i = 0
    expect_key = True
    while i < len(text):
        ch = text[i]
        if ch == "[":
            close = text.find("]", i)
            if close < 0:
                raise OverrideError(f'"{text}": a "[" has no closing "]"')
            if name.strip():
                steps.append(Step("key", name.strip()))
            elif expect_key:
                raise OverrideError(f'"{text}": a list selector needs a key before it')
            name = ""
            steps.append(_selector(text, text[i + 1:close].strip()))
            i = close + 1
            expect_key = False
            continue
        if ch == ".":
            if name.strip():
                steps.append(Step("key", name.strip()))
            elif expect_key:
                raise OverrideError(f'"{text}": an empty key between dots')
            name = ""
            expect_key = True
        elif ch == "]":
            raise OverrideError(f'"{text}": a "]" has no opening "["')
        else:
            name += ch
        i += 1
    if name.strip():
        steps.append(Step("key", name.strip()))
    elif expect_key:
        raise OverrideError(f'"{text}": the key ends with a dot' if text.strip()
                            else "an empty column name")
    return tuple(steps)


def _selector(text: str, inside: str) -> Step:
    if not inside:
        raise OverrideError(f'"{text}": empty brackets; give a number (from 0), * or a name')
    if inside == "*":
        return Step("all")
    if inside.lstrip("-").isdigit():
        index = int(inside)
        if index < 0:
            raise OverrideError(f'"{text}": [{index}]: lists are counted from 0')
        return Step("index", index)
    return Step("name", inside)


def apply(data: dict[str, Any], key: str, text: str) -> list[str]:
    """Set the place(s) that ``key`` names in ``data`` (changed in place) to ``text``.

    Returns:
        the project paths changed, e.g. ``["plies[1].height"]``, in the form the project
        reader names its problems.

    Raises:
        OverrideError: the key names no place in this project, or the value is bad JSON.

    """
    steps = parse_key(key)
    if steps[0].kind != "key":
        raise OverrideError(f'"{key}" must start with a key of the project file')
    return _walk(data, steps, "", text, str(steps[0].value))


def _join(path: str, step: Step, value: str | int) -> str:
    if step.kind == "key":
        return f"{path}.{value}" if path else str(value)
    return f"{path}[{value}]"


def _walk(node: Any, steps: tuple[Step, ...], path: str, text: str, top: str) -> list[str]:
    step, rest = steps[0], steps[1:]
    if step.kind == "key":
        key = str(step.value)
        if not isinstance(node, dict):
            raise OverrideError(f"{path} is not an object, so it has no key \"{key}\"")
        here = _join(path, step, key)
        if not rest:
            node[key] = convert(node.get(key), text, top)
            return [here]
        if node.get(key) is None:
            if rest[0].kind != "key":
                raise OverrideError(f"{here} is not in the base project, so it has no entries")
            node[key] = {}
        return _walk(node[key], rest, here, text, top)
    if not isinstance(node, list):
        raise OverrideError(f"{path} is not a list")
    if step.kind == "all":
        return _walk_all(node, rest, path, text, top)
    index = _find(node, step, path)
    here = _join(path, step, index)
    if not rest:
        node[index] = convert(node[index], text, top)
        return [here]
    return _walk(node[index], rest, here, text, top)


def _walk_all(node: list[Any], rest: tuple[Step, ...], path: str, text: str,
              top: str) -> list[str]:
    if not rest:
        for i, item in enumerate(node):
            node[i] = convert(item, text, top)
        return [f"{path}[{i}]" for i in range(len(node))]
    wanted = rest[0]
    changed: list[str] = []
    for i, item in enumerate(node):
        if wanted.kind == "key" and not (isinstance(item, dict) and wanted.value in item):
            continue
        changed += _walk(item, rest, f"{path}[{i}]", text, top)
    if not changed:
        what = f'"{wanted.value}"' if wanted.kind == "key" else "entries"
        raise OverrideError(f"no entry of {path} has {what}")
    return changed


def _find(node: list[Any], step: Step, path: str) -> int:
    if step.kind == "index":
        index = int(step.value)
        if index >= len(node):
            last = f"[0] to [{len(node) - 1}]" if node else "none"
            raise OverrideError(f"{path} has {len(node)} entries ({last}); [{index}] is not "
                                "one of them")
        return index
    named = [i for i, item in enumerate(node)
             if isinstance(item, dict) and item.get("name") == step.value]
    if not named:
        names = ", ".join(f'"{item.get("name")}"' for item in node
                          if isinstance(item, dict) and "name" in item) or "none"
        raise OverrideError(f'{path} has no entry named "{step.value}" (names: {names})')
    if len(named) > 1:
        raise OverrideError(f'{path} has {len(named)} entries named "{step.value}"; use its '
                            f"number, e.g. {path}[{named[0]}]")
    return named[0]


def convert(existing: Any, text: str, top: str = "") -> Any:
    """The JSON value of a cell's ``text``, in the form the key already has in the file:
    a list for a list (``;`` between values), true/false for a flag, a number for a
    number, the text for text; a value starting with ``[`` or ``{`` is read as JSON.
    """
    text = text.strip()
    if top in TEXT_KEYS and not isinstance(existing, dict | list):
        return text
    if text.startswith(("[", "{")):
        try:
            return json.loads(text)
        except json.JSONDecodeError as exc:
            raise OverrideError(f'"{text}" starts like JSON but is not valid JSON: '
                                f"{exc.msg} at character {exc.pos + 1}") from None
    if isinstance(existing, list):
        return [part.strip() for part in text.split(LIST_SEPARATOR) if part.strip()]
    if isinstance(existing, bool):
        flag = {"true": True, "yes": True, "false": False, "no": False}.get(text.lower())
        return text if flag is None else flag
    if isinstance(existing, str):
        return text
    try:
        value = json.loads(text)
    except json.JSONDecodeError:
        return text
    return value if isinstance(value, int | float | bool) or value is None else text
