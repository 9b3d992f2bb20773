"""The sheet's quick paths write the same PDF content as the plain ones: streams not
ASCII85-encoded (reportlab's default encodes them), the alternatives' comparison
analysed on one Evaluator (the plain path runs each alternative on its own), and a text
line drawn again written from the operators remembered (the plain path sets every line).

Regression reference: the sheet built the plain way in the same test. Both builds use
``rl_config.invariant`` (no dates or random ids); every object of the two files is
compared decoded: the same dictionaries (less /Filter and /Length) and the same
decoded stream bytes.
"""

from __future__ import annotations

import contextlib
import io
import json
from pathlib import Path
from typing import Any

import pytest
from pypdf import PdfReader
from pypdf.generic import IndirectObject, StreamObject
from reportlab import rl_config

from plystack.core.io.project_file import load
from plystack.core.pipeline import run
from plystack.core.report import content, layout, sheet

DEMOS = Path(__file__).resolve().parents[2] / "assets" / "demo"


def _each_run_alone(original: Any, alts: Any, done: Any = None) -> list[Any]:
    """Each alternative run on its own, as the sheet did before."""
    del done
    return [run(original.with_plies(alt.plies)) for alt in alts]


class _NothingRemembered(dict):  # type: ignore[type-arg]
    """A memo that never holds anything: every line is set again."""

    def __setitem__(self, key: Any, value: Any) -> None:
        pass


def _plain(value: Any) -> Any:
    if isinstance(value, IndirectObject):
        return ("ref", value.idnum)
    if isinstance(value, dict):
        return {str(k): _plain(v) for k, v in value.items() if k not in ("/Filter", "/Length")}
    if isinstance(value, list):
        return [_plain(v) for v in value]
    return repr(value)


def _objects(data: bytes) -> tuple[list[Any], set[str]]:
    """Every object of the file decoded, and the stream filters met."""
    reader = PdfReader(io.BytesIO(data))
    objects: list[Any] = []
    filters: set[str] = set()
    number = 1
    while True:
        try:
            obj = reader.get_object(number)
        except Exception:  # past the last object
            break
        if obj is None:
            break
        entry: list[Any] = [json.dumps(_plain(obj), sort_keys=True)]
        if isinstance(obj, StreamObject):
            entry.append(obj.get_data())
            found = obj.get("/Filter")
            filters.update(str(f) for f in (found if isinstance(found, list) else [found])
                           if f is not None)
        objects.append(entry)
        number += 1
    return objects, filters


def _build(project: Any, paper: str, alternative: str | None) -> bytes:
    buffer = io.BytesIO()
    sheet.build_sheet(project, buffer, paper, alternative)
    return buffer.getvalue()


@pytest.mark.parametrize(("demo", "paper", "alternative"), [
    ("porch-header", "letter", None),
    ("porch-header", "a4", "1/4 in plate"),
    ("stair-trimmer-eu", "a4", None),
])
def test_quick_sheet_has_the_plain_sheets_content(monkeypatch, demo, paper, alternative):
    project = load(DEMOS / f"{demo}.plystack.json")
    if alternative is not None and not any(a.name == alternative
                                           for a in project.alternatives):
        pytest.skip(f"{demo} has no alternative {alternative!r}")
    monkeypatch.setattr(rl_config, "invariant", 1)
    quick, quick_filters = _objects(_build(project, paper, alternative))
    with monkeypatch.context() as plain_path:
        plain_path.setattr(sheet, "_streams_without_base85", contextlib.nullcontext)
        plain_path.setattr(content, "alternative_analyses", _each_run_alone)
        plain_path.setattr(layout, "_TEXT_CODES", _NothingRemembered())
        plain, plain_filters = _objects(_build(project, paper, alternative))
    assert "/ASCII85Decode" in plain_filters
    assert "/ASCII85Decode" not in quick_filters
    assert len(quick) == len(plain) > 20
    for k, (mine, theirs) in enumerate(zip(quick, plain, strict=True)):
        assert mine == theirs, f"object {k + 1}"


def test_base85_setting_restored(monkeypatch):
    monkeypatch.setattr(rl_config, "useA85", 1)
    _build(load(DEMOS / "stair-trimmer-eu.plystack.json"), "a4", None)
    assert rl_config.useA85 == 1
