"""The beam and section part of ``run``, each quick path against its plain one in the
same run (so a busier machine moves both sides):

- ``BeamModel.solve`` (plain floats on a few elements) against ``solve_arrays``;
- the extremes of a section's batch (each distinct solution once) against the search
  over every solution asked;
- the Evaluator of a member with pattern loading (parts sampled once).

Also the CPU time of ``run``, of the Evaluator, of the beam part and of the section on
both demos, for the speed table. CPU time (time.process_time), medians of repeats,
alternating the two sides. Not a test: no assertions on time. ``--quick``: fewer repeats.
"""

from __future__ import annotations

import statistics
import sys
from collections.abc import Callable
from dataclasses import replace
from pathlib import Path

import bench_table

from plystack.core import pipeline
from plystack.core.actions import analysis as an
from plystack.core.actions import extremes as ex
from plystack.core.io.project_file import load
from plystack.core.model.project import Project

ROOT = Path(__file__).resolve().parents[1]
DEMOS = {"US demo": ROOT / "assets" / "demo" / "porch-header.plystack.json",
         "EU demo": ROOT / "assets" / "demo" / "stair-trimmer-eu.plystack.json"}
REPEAT = 60 if "--quick" in sys.argv else 300


def cpu(fn: Callable[[], object], repeat: int = REPEAT) -> float:
    """Median CPU seconds of ``fn`` (after five warm-up calls)."""
    return bench_table.cpu(fn, repeat, warmup=5)


def paired(quick: Callable[[], object], plain: Callable[[], object]) -> tuple[float, float]:
    """Median CPU seconds of both, measured in alternating blocks."""
    q, p = [], []
    for _ in range(6):
        q.append(cpu(quick, REPEAT // 6 + 1))
        p.append(cpu(plain, REPEAT // 6 + 1))
    return statistics.median(q), statistics.median(p)


def _line(what: str, quick: float, plain: float) -> None:
    print(f"  {what:44s} {quick * 1e6:9.1f} us  plain {plain * 1e6:9.1f} us"
          f"  ratio {quick / plain:5.2f}")


def _spans(project: Project, spans: int) -> Project:
    beam = project.beam
    assert beam is not None
    layout = replace(beam.layout, spans=beam.layout.spans * spans)
    return replace(project, beam=replace(beam, layout=layout, pattern_live_load=True))


def demo(name: str, path: Path) -> None:
    """Every figure of one demo."""
    project = load(path)
    ev = pipeline.Evaluator(project)
    assert ev.beam is not None and project.beam is not None
    prepared = ev.beam
    section = ev.section(project.plies)
    plies = [tuple(project.plies)]
    print(f"{name}:")
    print(f"  run {cpu(lambda: pipeline.run(project)) * 1e3:.3f} ms, Evaluator "
          f"{cpu(lambda: pipeline.Evaluator(project)) * 1e3:.3f} ms, beam part "
          f"{cpu(lambda: ev._beams(plies, [section])) * 1e3:.3f} ms, section "
          f"{cpu(lambda: ev.section(project.plies)) * 1e3:.3f} ms")
    model = prepared.model
    loads = [ld for ld in project.beam.loads if ld.case == "D"]
    _line("solve of case D (floats / arrays)",
          *paired(lambda: model.solve(loads), lambda: model.solve_arrays(loads)))
    batch = an._Batch()
    an._ask_section(prepared, section, ev.design, batch, defer=True)
    sols, EIs = batch.solutions, batch.stiffness
    n = model.lengths.size
    _line(f"extremes of {len(sols)} solutions (distinct / all)",
          *paired(lambda: ex.extremes_many(model, sols, EIs),
                  lambda: ex._reduce(model, ex._element_values(
                      model, sols, EIs, 0, n, [(0, n)]), 0, n)))
    three = _spans(project, 3)
    print(f"  Evaluator, 3 spans patterned {cpu(lambda: pipeline.Evaluator(three)) * 1e3:.3f}"
          " ms")


def main() -> None:
    for name, path in DEMOS.items():
        demo(name, path)


if __name__ == "__main__":
    main()
