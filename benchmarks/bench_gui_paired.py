"""The GUI drag step of this checkout against an earlier commit, paired: the two sides
run alternately in fresh offscreen processes, round by round, so that a busy shared
machine slows both alike. Each process drags as ``bench_gui.py`` does (a resize drag on
the demo's plate, real mouse events, each step timed from the mouse move to the views
painted, CPU time) and reports the median and the 95th percentile of its steps; the
figures printed are the lowest of the rounds, with their ratio (this checkout / the
commit).

    python benchmarks/bench_gui_paired.py REV [--rounds N] [--steps S] [--plot none|stress|actions]

REV is any git revision. Both sides are laid out from a copy of their files as in
``bench_paired.py``. Not a test; no assertions on time.
"""

from __future__ import annotations

import json
import os
import shutil
import subprocess
import sys
import tempfile
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))

from bench_paired import _checkout_files, _commit_files, _package

ROOT = Path(__file__).resolve().parents[1]
PLOTS = {"none": None, "stress": 0, "actions": 1}

# The child: the drag of bench_gui.py on the side's own package, one window.
CHILD = r'''
import json, os, statistics, sys
os.environ["QT_QPA_PLATFORM"] = "offscreen"
sys.path.insert(0, sys.argv[1])
sys.path.insert(1, sys.argv[2])
from PySide6.QtCore import QStandardPaths
QStandardPaths.setTestModeEnabled(True)
from pathlib import Path
import bench_gui
bench_gui.DEMO = Path(sys.argv[1]) / "plystack" / "demo" / "porch-header.plystack.json"
tab = None if sys.argv[4] == "none" else int(sys.argv[4])
steps = int(sys.argv[3])
bench_gui.drag_steps(tab, 10)  # warm: imports, fonts, first layouts
step_t, run_t, *_ = bench_gui.drag_steps(tab, steps)
print(json.dumps({"median": statistics.median(step_t),
                  "p95": bench_gui._percentile(step_t, 0.95),
                  "run": statistics.median(run_t)}))
'''


def main() -> None:
    args = sys.argv[1:]
    if not args or args[0].startswith("-"):
        print(__doc__)
        raise SystemExit(2)
    rev = args.pop(0)
    opts = {"--rounds": "4", "--steps": "100", "--plot": "none"}
    for key in list(opts):
        if key in args:
            i = args.index(key)
            opts[key] = args[i + 1]
            del args[i:i + 2]
    if args:
        raise SystemExit(f"unknown argument {args[0]!r}")
    if opts["--plot"] not in PLOTS:
        raise SystemExit(f"--plot: one of {', '.join(PLOTS)}")
    plot = PLOTS[opts["--plot"]]
    work = Path(tempfile.mkdtemp(prefix="plystack-gui-paired-"))
    env = {**os.environ, "QT_QPA_PLATFORM": "offscreen", "MPLBACKEND": "Agg"}
    try:
        sides = {"commit": _package(_commit_files(rev), work / "commit"),
                 "this": _package(_checkout_files(), work / "this")}
        best: dict[str, dict[str, float]] = {"commit": {}, "this": {}}
        for r in range(int(opts["--rounds"])):
            for side in (("commit", "this") if r % 2 == 0 else ("this", "commit")):
                done = subprocess.run(
                    [sys.executable, "-c", CHILD, str(sides[side]), str(ROOT / "benchmarks"),
                     opts["--steps"], "none" if plot is None else str(plot)],
                    capture_output=True, text=True, cwd=work, env=env)
                if done.returncode:
                    raise SystemExit(f"{side}: {done.stderr.strip().splitlines()[-1]}")
                found = json.loads(done.stdout.strip().splitlines()[-1])
                for key, value in found.items():
                    best[side][key] = min(best[side].get(key, float("inf")), value)
        print(f"GUI drag step ({opts['--plot']} plot), lowest of {opts['--rounds']} "
              f"alternating rounds of {opts['--steps']} steps, CPU time; this checkout "
              f"against {rev}")
        for key in ("median", "p95", "run"):
            a, b = best["commit"][key], best["this"][key]
            label = "run beside" if key == "run" else key
            print(f"  {label:<12}{a * 1e3:10.2f} ms {b * 1e3:10.2f} ms   {b / a:6.3f} x")
    finally:
        shutil.rmtree(work, ignore_errors=True)


if __name__ == "__main__":
    main()
