"""Rows per second of a 1,000-row member schedule built from the demo schedule's
variations (both demo projects as bases; spans, tributary widths, point loads, plate
heights and alternatives varied), with one process and with two, measured side by side
in one run (wall time and CPU time: on a shared machine the wall time says more about the
other load than about the schedule); and the time of the whole command.
Not a test."""

from __future__ import annotations

import csv
import io
import os
import resource
import shutil
import tempfile
import time
from pathlib import Path

from plystack.core.cli import main as cli
from plystack.core.io.schedule_file import MemberJob, evaluate, prepare, read_schedule
from plystack.core.study.schedule import default_jobs, run_rows

DEMO = Path(__file__).resolve().parents[1] / "assets" / "demo"
ROWS = 1000


def _schedule(folder: Path) -> Path:
    """1,000 rows: the demo schedule's members, each with a varied span and load."""
    demo = list(csv.DictReader(line for line in (DEMO / "renovation-schedule.csv").open(
        encoding="utf-8") if not line.startswith("#")))
    for base in ("porch-header.plystack.json", "stair-trimmer-eu.plystack.json"):
        shutil.copy(DEMO / base, folder / base)
    out = io.StringIO()
    writer = csv.DictWriter(out, fieldnames=list(demo[0]), lineterminator="\n")
    writer.writeheader()
    for k in range(ROWS):
        row = dict(demo[k % len(demo)])
        row["mark"] = f"{row['mark']}.{k}"
        step = k // len(demo) % 9 - 4  # -4 .. +4
        if row["base"].startswith("porch"):
            row["beam.spans"] = f"{12 + step * 0.5:g} ft"
            row["beam.loads[*].tributary_width"] = f"{6 + step * 0.25:g} ft"
        else:
            row["beam.spans"] = f"{3.6 + step * 0.1:.2f} m"
            row["beam.loads[2].value"] = f"{2.4 + step * 0.2:.2f} kN"
        writer.writerow(row)
    path = folder / "schedule-1000.csv"
    path.write_text(out.getvalue(), encoding="utf-8")
    return path


def _cpu() -> float:
    """CPU time of this process and of its finished worker processes, s."""
    me = resource.getrusage(resource.RUSAGE_SELF)
    children = resource.getrusage(resource.RUSAGE_CHILDREN)
    return me.ru_utime + me.ru_stime + children.ru_utime + children.ru_stime


def main() -> None:
    load = os.getloadavg()[0]
    with tempfile.TemporaryDirectory() as tmp:
        path = _schedule(Path(tmp))
        jobs = [j for j in prepare(read_schedule(path)) if isinstance(j, MemberJob)]
        run_rows(evaluate, jobs[:20], 1)  # warm up
        times = {}
        cpu = {}
        for processes in (1, 2):
            t = time.perf_counter()
            c = _cpu()
            results = run_rows(evaluate, jobs, processes)
            times[processes] = time.perf_counter() - t
            cpu[processes] = _cpu() - c
            assert len(results) == ROWS
        t = time.perf_counter()
        cli(["schedule", str(path), "-o", str(Path(tmp) / "results.csv"),
             "--jobs", str(default_jobs())])
        whole = time.perf_counter() - t
    print(f"load average before the run      : {load:7.2f} on {os.cpu_count()} CPUs")
    for processes, seconds in times.items():
        print(f"{ROWS} rows, jobs={processes}         : {seconds:7.2f} s  "
              f"({ROWS / seconds:6.0f} rows per s; {cpu[processes]:6.2f} CPU s)")
    print(f"ratio jobs=2 / jobs=1 (speed-up) : {times[1] / times[2]:7.2f}")
    print(f"whole command, jobs={default_jobs()}       : {whole:7.2f} s")


if __name__ == "__main__":
    main()
