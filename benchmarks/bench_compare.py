"""Candidates per second: the sweep's evaluator (beam solved once, reused) against a
plain loop over the public API (core.analysis.run per candidate), measured side by side
in one run; and the time of a 200-candidate sweep and a longest-span search.
Not a test."""

from __future__ import annotations

import time
from pathlib import Path

from plystack.core.io.project_file import load
from plystack.core.pipeline import run
from plystack.core.study.compare import longest_span, summarise, sweep, with_dimension

DEMO = Path(__file__).resolve().parents[1] / "assets" / "demo" / "porch-header.plystack.json"
IN = 0.0254


def main() -> None:
    project = load(DEMO)
    values = [IN * (0.1 + 0.005 * i) for i in range(200)]
    sweep(project, "flitch plate", "width", values[:5])  # warm up
    t = time.perf_counter()
    sweep(project, "flitch plate", "width", values)
    fast = time.perf_counter() - t
    t = time.perf_counter()
    for v in values:
        summarise(run(project.with_plies(with_dimension(project.plies, "flitch plate",
                                                        "width", v))), v)
    plain = time.perf_counter() - t
    t = time.perf_counter()
    longest_span(project)
    span = time.perf_counter() - t
    print(f"sweep of 200 candidates      : {fast * 1000:8.1f} ms  ({200 / fast:7.0f} per s)")
    print(f"plain loop over the API      : {plain * 1000:8.1f} ms  ({200 / plain:7.0f} per s)")
    print(f"ratio (plain / sweep)        : {plain / fast:8.2f}")
    print(f"longest-span search          : {span * 1000:8.1f} ms")


if __name__ == "__main__":
    main()
