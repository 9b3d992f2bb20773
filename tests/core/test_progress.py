"""Progress of long studies: the callback hears every batch, a False answer stops the
study with what it had found, and the command line draws a bar on stderr only where
stderr is a terminal and the output is not JSON.

Source: the outcomes with a callback are compared with the same study without one
(and the stopped ones with the start of the full study), exactly.
"""

from __future__ import annotations

import io
import json
import sys
from pathlib import Path

import pytest

from plystack.core.cli import main
from plystack.core.io.project_file import load
from plystack.core.study import compare
from plystack.core.study.compare import Stopped, auto_size, longest_span, sweep

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"
IN = 0.0254
VALUES = [IN * (0.1 + 0.02 * i) for i in range(40)]


def test_sweep_reports_every_batch_and_equals_the_sweep_without_it() -> None:
    project = load(DEMO)
    calls: list[tuple[int, int | None]] = []
    rows = sweep(project, "flitch plate", "width", VALUES,
                 lambda done, total: calls.append((done, total)) is None)
    assert rows == sweep(project, "flitch plate", "width", VALUES)
    batch = compare.SWEEP_BATCH
    assert calls == [(min(k + batch, len(VALUES)), len(VALUES))
                     for k in range(0, len(VALUES), batch)]


def test_sweep_stops_when_asked_with_the_candidates_done() -> None:
    project = load(DEMO)
    calls: list[int] = []

    def stop_at_first(done: int, total: int | None) -> bool:
        calls.append(done)
        return False

    with pytest.raises(Stopped) as caught:
        sweep(project, "flitch plate", "width", VALUES, stop_at_first)
    assert calls == [compare.SWEEP_BATCH]
    full = sweep(project, "flitch plate", "width", VALUES)
    assert list(caught.value.outcomes) == full[: compare.SWEEP_BATCH]


def test_a_stop_after_the_last_batch_keeps_the_answer() -> None:
    project = load(DEMO)
    few = VALUES[:3]
    assert sweep(project, "flitch plate", "width", few, lambda d, t: False) == sweep(
        project, "flitch plate", "width", few)


def test_auto_size_reports_each_failing_option_and_stops_when_asked() -> None:
    project = load(DEMO)
    options = [IN * x for x in (0.01, 0.02, 0.03, 0.25, 0.375, 0.5)]
    calls: list[tuple[int, int | None]] = []
    result = auto_size(project, "flitch plate", "width", options,
                       lambda done, total: calls.append((done, total)) is None)
    assert result == auto_size(project, "flitch plate", "width", options)
    assert result.chosen is not None
    tried = sorted(options).index(result.chosen.value) + 1
    assert calls == [(k, len(options)) for k in range(1, tried)]
    with pytest.raises(Stopped) as caught:
        auto_size(project, "flitch plate", "width", options, lambda d, t: False)
    assert len(caught.value.outcomes) == 1 and not caught.value.outcomes[0].ok


def test_longest_span_reports_without_a_total_and_stops_when_asked() -> None:
    project = load(DEMO)
    calls: list[tuple[int, int | None]] = []
    result = longest_span(project, progress=lambda d, t: calls.append((d, t)) is None)
    assert result == longest_span(project)
    assert calls and all(t is None for _, t in calls)
    assert [d for d, _ in calls] == list(range(1, len(calls) + 1))
    with pytest.raises(Stopped) as caught:
        longest_span(project, progress=lambda d, t: d < 3)
    assert len(caught.value.outcomes) == 3


class _Terminal(io.StringIO):
    """A stderr that says it is a terminal."""

    def isatty(self) -> bool:
        return True


SWEEP_ARGS = ["sweep", str(DEMO), "--ply", "flitch plate", "--dimension", "width",
              "--values", ", ".join(f"{0.1 + 0.02 * i:.2f} in" for i in range(20))]


@pytest.mark.parametrize("command", [
    SWEEP_ARGS,
    ["size", str(DEMO), "--ply", "flitch plate"],
    ["compare", str(DEMO)],
])
def test_bar_on_a_terminal_and_none_with_json(command: list[str], monkeypatch,
                                              capsys) -> None:
    terminal = _Terminal()
    monkeypatch.setattr(sys, "stderr", terminal)
    main(command)
    drawn = terminal.getvalue()
    capsys.readouterr()
    assert "it/s" in drawn or "/s]" in drawn  # a tqdm bar's rate
    terminal = _Terminal()
    monkeypatch.setattr(sys, "stderr", terminal)
    main([*command, "--json"])
    json.loads(capsys.readouterr().out)
    assert terminal.getvalue() == ""


def test_no_bar_where_stderr_is_not_a_terminal(capsys) -> None:
    assert main(SWEEP_ARGS) == 0
    assert capsys.readouterr().err == ""
