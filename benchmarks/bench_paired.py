"""``run`` of this checkout against an earlier commit, paired: the two run alternately in
fresh processes, round by round, so that a busy shared machine slows both alike, and
each figure is the fastest of many runs in a process (CPU time). Prints, for each
project, both times and their ratio (this checkout / the commit).

    python benchmarks/bench_paired.py REV [--rounds N] [--repeat R] [NAME ...]

REV is any git revision (``HEAD~3``, a commit, a branch). Both sides are read from a
copy of their files (``git archive`` for the commit), imported as ``plystack`` by path,
so an editable install does not matter. The projects: both demos (``us``, ``eu``),
their plates stopping short (``us_short``, ``eu_short``), three spans with pattern live
load (``us_3sp``, ``eu_3sp``), the same with their plates stopping short
(``us_3sp_short``, ``eu_3sp_short``), 300 and 1,000 point loads (``us_pts300``,
``us_pts1000``) and 100 plies side by side (``sbs100``); all by default. Not a test;
no assertions on time.
"""

from __future__ import annotations

import io
import json
import shutil
import subprocess
import sys
import tarfile
import tempfile
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
NAMES = ("us", "eu", "us_short", "eu_short", "us_3sp", "eu_3sp", "us_3sp_short",
         "eu_3sp_short", "us_pts300", "us_pts1000", "sbs100")

# The child: builds the projects with the API both sides share, times each.
CHILD = r'''
import json, sys, time
from dataclasses import replace
sys.path.insert(0, sys.argv[1])
from plystack.core import pipeline
from plystack.core.io.project_file import load
from plystack.core.model.member import Load
from plystack.core.model.plies import Ply
from plystack.core.pipeline import run

demo = sys.argv[1] + "/plystack/demo/"
US = load(demo + "porch-header.plystack.json")
EU = load(demo + "stair-trimmer-eu.plystack.json")
IN = 0.0254


def spans(p, n):
    b = p.beam
    return replace(p, beam=replace(b, layout=replace(b.layout, spans=(b.layout.spans[0],) * n)))


def points(p, n):
    b = p.beam
    L = b.layout.length
    extra = tuple(Load(case="L", type="point", value=100.0 * (k + 1), at=L * (k + 0.37) / n)
                  for k in range(n))
    return replace(p, beam=replace(b, loads=b.loads + extra))


def short(p):
    L = p.beam.layout.length
    return p.with_plies(tuple(replace(q, start=0.15 * L, end=0.9 * L)
                              if p.all_materials()[q.material].kind == "steel" else q
                              for q in p.plies))


def side_by_side(n):
    out, x = [], 0.0
    for i in range(n):
        if i % 2 == 0:
            out.append(Ply(f"timber {i}", "DFL-No2", x, 0.0, 1.5 * IN, 9.25 * IN))
            x += 1.5 * IN
        else:
            out.append(Ply(f"plate {i}", "A36", x, 0.25 * IN, 0.375 * IN, 8.75 * IN))
            x += 0.375 * IN
    return tuple(out)


make = {"us": lambda: US, "eu": lambda: EU, "us_short": lambda: short(US),
        "eu_short": lambda: short(EU), "us_3sp": lambda: spans(US, 3),
        "eu_3sp": lambda: spans(EU, 3), "us_3sp_short": lambda: short(spans(US, 3)),
        "eu_3sp_short": lambda: short(spans(EU, 3)), "us_pts300": lambda: points(US, 300),
        "us_pts1000": lambda: points(US, 1000),
        "sbs100": lambda: US.with_plies(side_by_side(100))}
pipeline.MAX_PLIES = max(pipeline.MAX_PLIES, 100)
repeat = int(sys.argv[2])
out = {}
for name in sys.argv[3:]:
    project = make[name]()
    run(project)
    run(project)
    best = float("inf")
    for _ in range(repeat if not name.startswith(("us_pts1000", "sbs")) else max(3, repeat // 3)):
        t = time.process_time()
        run(project)
        best = min(best, time.process_time() - t)
    out[name] = best
print(json.dumps(out))
'''


def _package(files: dict[str, bytes], into: Path) -> Path:
    """Lay ``files`` (paths of the checkout: core/..., app/..., assets/...) out as the
    installed package: ``plystack`` = assets/, ``plystack.core`` = core/, ``plystack.app``
    = app/.
    """
    for name, data in files.items():
        top, _, rest = name.partition("/")
        target = {"assets": into / "plystack", "core": into / "plystack" / "core",
                  "app": into / "plystack" / "app"}[top] / rest
        target.parent.mkdir(parents=True, exist_ok=True)
        target.write_bytes(data)
    return into


def _checkout_files() -> dict[str, bytes]:
    out = {}
    for top in ("core", "app", "assets"):
        for path in (ROOT / top).rglob("*"):
            if path.is_file() and "__pycache__" not in path.parts:
                out[str(path.relative_to(ROOT))] = path.read_bytes()
    return out


def _commit_files(rev: str) -> dict[str, bytes]:
    archive = subprocess.run(["git", "-C", str(ROOT), "archive", "--format=tar", rev,
                              "core", "app", "assets"], capture_output=True, check=True)
    out = {}
    with tarfile.open(fileobj=io.BytesIO(archive.stdout)) as tar:
        for member in tar.getmembers():
            if member.isfile():
                handle = tar.extractfile(member)
                assert handle is not None
                out[member.name] = handle.read()
    return out


def main() -> None:
    args = sys.argv[1:]
    if not args or args[0].startswith("-"):
        print(__doc__)
        raise SystemExit(2)
    rev = args.pop(0)
    rounds, repeat = 6, 15
    if "--rounds" in args:
        i = args.index("--rounds")
        rounds = int(args[i + 1])
        del args[i:i + 2]
    if "--repeat" in args:
        i = args.index("--repeat")
        repeat = int(args[i + 1])
        del args[i:i + 2]
    names = args or list(NAMES)
    unknown = [n for n in names if n not in NAMES]
    if unknown:
        raise SystemExit(f"unknown project {unknown[0]!r}: one of {', '.join(NAMES)}")
    work = Path(tempfile.mkdtemp(prefix="plystack-paired-"))
    try:
        sides = {"commit": _package(_commit_files(rev), work / "commit"),
                 "this": _package(_checkout_files(), work / "this")}
        best: dict[str, dict[str, float]] = {"commit": {}, "this": {}}
        for r in range(rounds):
            for side in (("commit", "this") if r % 2 == 0 else ("this", "commit")):
                done = subprocess.run([sys.executable, "-c", CHILD, str(sides[side]),
                                       str(repeat), *names], capture_output=True, text=True,
                                      cwd=work)
                if done.returncode:
                    raise SystemExit(f"{side}: {done.stderr.strip().splitlines()[-1]}")
                for name, t in json.loads(done.stdout.strip().splitlines()[-1]).items():
                    best[side][name] = min(best[side].get(name, float("inf")), t)
        print(f"run, fastest CPU time over {rounds} alternating rounds of {repeat} runs; "
              f"this checkout against {rev}")
        for name in names:
            a, b = best["commit"][name], best["this"][name]
            print(f"  {name:<12}{a * 1e3:10.2f} ms {b * 1e3:10.2f} ms   {b / a:6.3f} x")
    finally:
        shutil.rmtree(work, ignore_errors=True)


if __name__ == "__main__":
    main()
