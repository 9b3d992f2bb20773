"""Start-up cost of `plystack check` on the demo against importing numpy, shapely and
pint alone. Prints the ratio from one run (target: at most 1.6). Not a test."""

from __future__ import annotations

import statistics
import subprocess
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "assets" / "demo" / "porch-header.plystack.json"


def _time(args: list[str], repeat: int = 7) -> float:
    times = []
    for _ in range(repeat):
        t = time.perf_counter()
        subprocess.run(args, check=True, capture_output=True, cwd=ROOT)
        times.append(time.perf_counter() - t)
    return statistics.median(times)


def main() -> None:
    base = _time([sys.executable, "-c", "import numpy, shapely, pint"])
    check = _time([sys.executable, "-m", "app.launch", "check", str(DEMO), "--json"])
    print(f"import numpy, shapely, pint : {base * 1000:8.1f} ms (median of 7)")
    print(f"plystack check demo --json  : {check * 1000:8.1f} ms (median of 7)")
    print(f"ratio                       : {check / base:8.2f}  (target <= 1.6)")


if __name__ == "__main__":
    main()
