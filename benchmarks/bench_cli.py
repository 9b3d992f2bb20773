"""Start-up cost of `plystack check` on the demo against importing numpy, shapely and
pint alone (goal: at most 1.4 x), and of the whole `plystack sheet` process (goal: at
most 1.0 s). Not a test; prints numbers. ``--paired PYTHON``: the sheet process of this
checkout and of another environment's python (an earlier commit installed there) run
alternately in the same sitting, with their ratio.

Each figure is the median of fresh processes, as wall time and as CPU time (user +
system of the child: on a shared machine the wall time also holds the waits for the
other processes, the CPU time much less). Two cases:

- bytecode present, as an installed wheel runs (the project's modules compiled once);
- recompiled: PYTHONDONTWRITEBYTECODE=1 and no ``__pycache__`` under core/ and app/,
  as a checkout runs where the environment sets that variable (every process compiles
  Plystack's modules again; numpy, shapely and pint come compiled either way).
"""

from __future__ import annotations

import os
import shutil
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "assets" / "demo" / "porch-header.plystack.json"


def _clean_bytecode() -> None:
    """Remove the compiled modules of the checkout (regenerated on the next import)."""
    for folder in ("core", "app", "assets"):
        for cache in (ROOT / folder).rglob("__pycache__"):
            shutil.rmtree(cache, ignore_errors=True)


def _time(args: list[str], recompiled: bool, repeat: int) -> tuple[float, float]:
    """Median (wall, CPU) seconds of ``args`` run ``repeat`` times."""
    env = dict(os.environ)
    env.pop("PYTHONDONTWRITEBYTECODE", None)
    if recompiled:
        env["PYTHONDONTWRITEBYTECODE"] = "1"
    walls, cpus = [], []
    for _ in range(repeat):
        if recompiled:
            _clean_bytecode()
        t = time.perf_counter()
        child = subprocess.Popen(args, cwd=ROOT, env=env, stdout=subprocess.DEVNULL,
                                 stderr=subprocess.DEVNULL)
        _, status, usage = os.wait4(child.pid, 0)
        walls.append(time.perf_counter() - t)
        cpus.append(usage.ru_utime + usage.ru_stime)
        if status != 0:
            raise SystemExit(f"{' '.join(args)} failed")
    return statistics.median(walls), statistics.median(cpus)


def paired(other: str, repeat: int = 21) -> None:
    """The sheet process of this checkout and of ``other`` (another environment's python,
    e.g. one installed from an earlier commit) run alternately, bytecode present: the
    medians of both and their ratio, measured in the same sitting.
    """
    with tempfile.TemporaryDirectory() as tmp:
        def command(py: str) -> list[str]:
            return [py, "-m", "plystack.app.launch", "sheet", str(DEMO), "-o",
                    str(Path(tmp) / "s.pdf")]

        runs: dict[str, list[tuple[float, float]]] = {"this": [], "other": []}
        for py in (sys.executable, other):
            _time(command(py), False, 1)  # bytecode written, caches settled
        for _ in range(repeat):
            runs["this"].append(_time(command(sys.executable), False, 1))
            runs["other"].append(_time(command(other), False, 1))
    medians = {name: (statistics.median(w for w, _ in r), statistics.median(c for _, c in r))
               for name, r in runs.items()}
    for name, py in (("this", sys.executable), ("other", other)):
        wall, cpu = medians[name]
        print(f"  sheet, {name:5s} ({py}): wall {wall * 1000:6.0f} ms   CPU {cpu * 1000:6.0f} ms")
    print(f"  this / other: wall {medians['this'][0] / medians['other'][0]:4.2f} x, "
          f"CPU {medians['this'][1] / medians['other'][1]:4.2f} x (median of {repeat} "
          f"alternate runs; load average {os.getloadavg()[0]:.1f})")


def main(repeat: int = 7) -> None:
    py = sys.executable
    with tempfile.TemporaryDirectory() as tmp:
        commands = {
            "import numpy, shapely, pint": [py, "-c", "import numpy, shapely, pint"],
            "plystack check demo --json": [py, "-m", "plystack.app.launch", "check",
                                           str(DEMO), "--json"],
            "plystack sheet demo -o sheet.pdf": [py, "-m", "plystack.app.launch", "sheet",
                                                 str(DEMO), "-o", str(Path(tmp) / "s.pdf")],
        }
        for recompiled in (False, True):
            _time(commands["plystack check demo --json"], recompiled, 1)  # caches settled
            print("recompiled (PYTHONDONTWRITEBYTECODE=1, no __pycache__)" if recompiled
                  else "bytecode present (as an installed wheel)")
            figures = {name: _time(args, recompiled, repeat) for name, args in
                       commands.items()}
            base_wall, base_cpu = figures["import numpy, shapely, pint"]
            for name, (wall, cpu) in figures.items():
                print(f"  {name:34s} wall {wall * 1000:7.0f} ms ({wall / base_wall:4.2f} x)"
                      f"   CPU {cpu * 1000:7.0f} ms ({cpu / base_cpu:4.2f} x)")
    print(f"(median of {repeat}; goals: check <= 1.4 x the imports, sheet <= 1000 ms; "
          f"load average {os.getloadavg()[0]:.1f} on {os.cpu_count()} cores)")


if __name__ == "__main__":
    if len(sys.argv) == 3 and sys.argv[1] == "--paired":
        paired(sys.argv[2])
    else:
        main()
