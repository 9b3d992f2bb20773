"""Every figure of the speed table in one run, each as a ratio to a reference measured in
the same run (so a slower or busier machine moves both sides):

- ``run`` on the US and EU demos against a plain-float floor (the section and the beam
  actions of the US demo written out with Python floats, no checks: a lower bound);
- the sweep of a plate dimension against a plain loop over ``run``;
- the section step against sectionproperties (same plies, coarse mesh);
- growth tables for plies side by side (1-300), spans (1-20) and point loads (1-1,000),
  each with the fitted growth exponent (log-log slope over the upper half);
- the GUI drag step (median and p95 of 100 drag steps with real mouse events);
- launch to first paint, CLI start-up and the ``plystack sheet`` process against the
  bare imports.

CPU time (time.process_time) for in-process figures, medians of repeats; wall time for
the processes. Not a test: no assertions on time. ``--quick`` runs fewer repeats.
"""

from __future__ import annotations

import math
import os
import statistics
import subprocess
import sys
import tempfile
import time
from collections.abc import Callable
from dataclasses import replace
from pathlib import Path

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
sys.path.insert(0, str(Path(__file__).resolve().parent))

import bench_launch

from plystack.core import pipeline
from plystack.core.io.project_file import load
from plystack.core.model.constants import GRAVITY
from plystack.core.model.member import Load
from plystack.core.model.plies import Ply
from plystack.core.model.project import Project
from plystack.core.pipeline import run
from plystack.core.section.transformed import analyse
from plystack.core.study.compare import summarise, sweep, with_dimension

ROOT = Path(__file__).resolve().parents[1]
US_DEMO = ROOT / "assets" / "demo" / "porch-header.plystack.json"
EU_DEMO = ROOT / "assets" / "demo" / "stair-trimmer-eu.plystack.json"
IN = 0.0254
QUICK = "--quick" in sys.argv


def cpu(fn: Callable[[], object], repeat: int, warmup: int = 2) -> float:
    """Median CPU seconds of ``fn`` (after ``warmup`` calls)."""
    for _ in range(warmup):
        fn()
    times = []
    for _ in range(repeat):
        t = time.process_time()
        fn()
        times.append(time.process_time() - t)
    return statistics.median(times)


def line(name: str, value: str, ratio: str = "", goal: str = "") -> None:
    print(f"  {name:<46}{value:>14}  {ratio:<26}{goal}")


# --- the plain-float floor: section and beam actions of the US demo, no checks ---------

def floor_us_demo(project: Project) -> tuple[float, float, float]:
    """EI, M_max and the largest deflection of "D + L" on the US demo, plain floats.

    Unclipped rectangles (the demo's plies do not overlap): EI = sum E (b h^3 / 12 +
    A d^2). Simple span with uniform loads over the whole span and point loads:
    M from statics at the points where V = 0 and at the loads; deflection by
    superposition of the handbook formulas w x (L^3 - 2 L x^2 + x^3) / (24 EI) and, for
    a point load P at a (b = L - a), P b x (L^2 - b^2 - x^2) / (6 L EI) left of it, its
    mirror image right of it; the largest deflection where the slope is zero (bisection).
    """
    mats = project.all_materials()
    E = [mats[p.material].E for p in project.plies]
    A = [p.width * p.height for p in project.plies]
    yc = [p.y + p.height / 2 for p in project.plies]
    EA = sum(e * a for e, a in zip(E, A, strict=True))
    y_na = sum(e * a * y for e, a, y in zip(E, A, yc, strict=True)) / EA
    EI = sum(e * (p.width * p.height**3 / 12 + a * (y - y_na) ** 2)
             for e, a, y, p in zip(E, A, yc, project.plies, strict=True))
    beam = project.beam
    assert beam is not None
    L = beam.layout.spans[0]
    w = sum(mats[p.material].density * a for p, a in zip(project.plies, A, strict=True))
    w *= GRAVITY
    points = []
    for ld in beam.loads:
        if ld.type == "point":
            points.append((ld.value, float(ld.at or 0.0)))
        elif ld.type == "area":
            w += ld.value * float(ld.tributary_width or 0.0)
        else:
            w += ld.value
    R1 = w * L / 2 + sum(P * (L - a) / L for P, a in points)

    def moment(x: float) -> float:
        return R1 * x - w * x * x / 2 - sum(P * (x - a) for P, a in points if x > a)

    cuts = sorted({0.0, L, *(a for _, a in points)})
    m_max = max(moment(x) for x in cuts)
    for lo, hi in zip(cuts[:-1], cuts[1:], strict=True):
        v = R1 - sum(P for P, a in points if a <= lo)
        if w > 0 and lo < v / w < hi:
            m_max = max(m_max, moment(v / w))

    def deflection(x: float) -> float:
        out = w * x * (L**3 - 2 * L * x * x + x**3) / (24 * EI)
        for P, a in points:
            b = L - a
            if x <= a:
                out += P * b * x * (L * L - b * b - x * x) / (6 * L * EI)
            else:
                out += P * a * (L - x) * (2 * L * x - x * x - a * a) / (6 * L * EI)
        return out

    lo, hi = 0.0, L
    h = L * 1e-7
    for _ in range(60):  # the slope falls from positive to negative once on this span
        mid = (lo + hi) / 2
        if deflection(mid + h) - deflection(mid - h) > 0:
            lo = mid
        else:
            hi = mid
    return EI, m_max, deflection((lo + hi) / 2)


def core_figures(repeat: int) -> dict[str, float]:
    us, eu = load(US_DEMO), load(EU_DEMO)
    t_us = cpu(lambda: run(us), repeat)
    t_eu = cpu(lambda: run(eu), repeat)
    t_floor = cpu(lambda: floor_us_demo(us), repeat)
    a = run(us)
    assert a.beam is not None
    ours = next(c for c in a.beam.combinations if c.name == "D + L").extremes
    EI, m_max, defl = floor_us_demo(us)
    print("core")
    line("run, US demo", f"{t_us * 1e3:.2f} ms", f"{t_us / t_floor:.1f} x floor", "goal 1.5 ms")
    line("run, EU demo", f"{t_eu * 1e3:.2f} ms", f"{t_eu / t_floor:.1f} x floor", "goal 2.5 ms")
    line("plain-float floor (section + beam, no checks)", f"{t_floor * 1e3:.3f} ms")
    diff = max(abs(EI / a.section.EI - 1), abs(m_max / ours.M_max - 1),
               abs(defl / ours.deflection_max_abs - 1))
    line("floor vs run: EI, M_max, deflection rel. diff", f"{diff:.1e}")
    return {"run_us": t_us, "run_eu": t_eu, "floor": t_floor}


def sweep_figures(count: int) -> None:
    project = load(US_DEMO)
    values = [IN * (0.1 + 0.005 * i) for i in range(count)]
    t_sweep = cpu(lambda: sweep(project, "flitch plate", "width", values), 3)

    def plain() -> None:
        for v in values:
            summarise(run(project.with_plies(with_dimension(project.plies, "flitch plate",
                                                            "width", v))), v)

    t_plain = cpu(plain, 3)
    print("sweep (flitch plate width, US demo)")
    line(f"sweep of {count} candidates", f"{count / t_sweep:,.0f} /s",
         f"{t_plain / t_sweep:.2f} x a plain loop", "goal >= 5,000 /s, >= 10 x")
    line("plain loop over run", f"{count / t_plain:,.0f} /s")


def section_figures(repeat: int) -> None:
    from sectionproperties.analysis.section import Section as FESection
    from sectionproperties.pre.geometry import CompoundGeometry, Geometry
    from sectionproperties.pre.pre import Material as FEMaterial

    from plystack.core.section.geometry import clip_plies

    project = load(US_DEMO)
    mats = project.all_materials()

    def fe() -> float:
        fe_mats = {k: FEMaterial(k, m.E, 0.3, 1.0, 1.0, "k") for k, m in mats.items()
                   if any(p.material == k for p in project.plies)}
        geoms = [Geometry(g, material=fe_mats[p.material])
                 for p, g in zip(project.plies, clip_plies(project.plies), strict=True)]
        geom = CompoundGeometry(geoms)
        geom.create_mesh(mesh_sizes=[1.0])  # coarse: one triangle per corner region
        sec = FESection(geom)
        sec.calculate_geometric_properties()
        return float(sec.get_eic()[0])

    t_ours = cpu(lambda: analyse(project.plies, mats), repeat)
    t_fe = cpu(fe, max(3, repeat // 20))
    ei = analyse(project.plies, mats).EI
    print("section step (US demo plies)")
    line("transformed section", f"{t_ours * 1e3:.3f} ms",
         f"{t_fe / t_ours:.0f} x faster than FE", "")
    line("sectionproperties, coarse mesh", f"{t_fe * 1e3:.1f} ms",
         f"EI rel. diff {abs(fe() / ei - 1):.1e}")


def exponent(ns: list[int], ts: list[float]) -> float:
    """Least-squares slope of log t against log n over the upper half of the table."""
    k = len(ns) // 2
    xs = [math.log(n) for n in ns[k:]]
    ys = [math.log(max(t, 1e-9)) for t in ts[k:]]
    mx, my = statistics.fmean(xs), statistics.fmean(ys)
    return (sum((x - mx) * (y - my) for x, y in zip(xs, ys, strict=True))
            / sum((x - mx) ** 2 for x in xs))


def side_by_side(n: int) -> tuple[Ply, ...]:
    out, x = [], 0.0
    for i in range(n):
        if i % 2 == 0:
            out.append(Ply(f"timber {i}", "DFL-No2", x, 0.0, 1.5 * IN, 9.25 * IN))
            x += 1.5 * IN
        else:
            out.append(Ply(f"plate {i}", "A36", x, 0.25 * IN, 0.375 * IN, 8.75 * IN))
            x += 0.375 * IN
    return tuple(out)


def growth(name: str, ns: list[int], make: Callable[[int], Project], repeat: int,
           goals: dict[int, str]) -> None:
    ts = []
    for n in ns:
        project = make(n)
        ts.append(cpu(lambda p=project: run(p), repeat if n < 100 else max(3, repeat // 10)))
    print(f"growth: {name}")
    for n, t in zip(ns, ts, strict=True):
        line(f"{n}", f"{t * 1e3:.2f} ms", f"{t / ts[0]:.1f} x the first", goals.get(n, ""))
    line("fitted exponent (upper half)", f"{exponent(ns, ts):.2f}", "", "goal <= 1")


def growth_figures(repeat: int) -> None:
    base = load(US_DEMO)
    beam = base.beam
    assert beam is not None
    saved = pipeline.MAX_PLIES
    pipeline.MAX_PLIES = 300  # the benchmark looks past the limit files are held to
    try:
        growth("plies side by side", [1, 3, 10, 30, 100, 200, 300],
               lambda n: base.with_plies(side_by_side(n)), repeat,
               {100: "goal 20 ms", 300: "goal 60 ms"})
    finally:
        pipeline.MAX_PLIES = saved

    def spans(n: int) -> Project:
        layout = replace(beam.layout, spans=(beam.layout.spans[0],) * n)
        return replace(base, beam=replace(beam, layout=layout))

    growth("spans (continuous, pattern live load as the file says)", [1, 2, 5, 10, 20],
           spans, repeat, {})
    L = beam.layout.length

    def points(n: int) -> Project:
        extra = tuple(Load(case="L", type="point", value=100.0, at=L * (k + 0.5) / n)
                      for k in range(n))
        return replace(base, beam=replace(beam, loads=beam.loads + extra))

    growth("point loads", [1, 10, 30, 100, 300, 1000], points, repeat, {1000: "goal 20 ms"})


def gui_figures(steps: int, core_run: float) -> None:
    """The drag steps of ``bench_gui`` (real mouse events on the canvas, CPU time)."""
    import bench_gui
    from PySide6.QtCore import QStandardPaths

    QStandardPaths.setTestModeEnabled(True)
    print(f"GUI drag step ({steps} steps of a resize drag on the flitch plate's top edge)")
    for label, tab in (("view + results table (plots hidden)", None),
                       ("... with the strain and stress plot", 0),
                       ("... with the shear, moment, deflection plot", 1)):
        times = sorted(bench_gui.drag_steps(tab, steps)[0])
        med = statistics.median(times)
        p95 = times[min(len(times) - 1, int(0.95 * len(times)))]
        goal = "goal 12 ms" if tab is None else "goal 25 ms, p95 40"
        line(label, f"{med * 1e3:.1f} ms", f"p95 {p95 * 1e3:.1f} ms, "
             f"{med / core_run:.1f} x run", goal)


def _wall(args: list[str], repeat: int) -> float:
    times = []
    for _ in range(repeat):
        t = time.perf_counter()
        subprocess.run(args, check=True, capture_output=True, cwd=ROOT)
        times.append(time.perf_counter() - t)
    return statistics.median(times)


def process_figures(repeat: int) -> None:
    py = sys.executable
    base = _wall([py, "-c", "import numpy, shapely, pint"], repeat)
    check = _wall([py, "-m", "plystack.app.launch", "check", str(US_DEMO), "--json"], repeat)
    with tempfile.TemporaryDirectory() as tmp:
        out = str(Path(tmp) / "sheet.pdf")
        sheet = _wall([py, "-m", "plystack.app.launch", "sheet", str(US_DEMO), "-o", out],
                      repeat)
    bare = statistics.median(bench_launch._run(bench_launch.BARE)[0] for _ in range(repeat))
    first = statistics.median(bench_launch._run(bench_launch.LAUNCH, str(US_DEMO))[0]
                              for _ in range(repeat))
    print("processes (wall time)")
    line("import numpy, shapely, pint", f"{base * 1e3:.0f} ms")
    line("plystack check demo --json", f"{check * 1e3:.0f} ms", f"{check / base:.2f} x imports",
         "goal <= 1.4 x")
    line("plystack sheet demo -o sheet.pdf", f"{sheet * 1e3:.0f} ms",
         f"{sheet / base:.2f} x imports", "goal <= 1.0 s")
    line("launch to first paint", f"{first * 1e3:.0f} ms",
         f"{first / bare:.2f} x Qt + mpl imports", "")


def main() -> None:
    """All parts, or those named on the command line (core sweep section growth gui
    processes).
    """
    repeat = 20 if QUICK else 200
    parts = [a for a in sys.argv[1:] if not a.startswith("--")] or [
        "core", "sweep", "section", "growth", "gui", "processes"]
    print(f"Plystack speed table, {time.strftime('%Y-%m-%d %H:%M')}, Python "
          f"{sys.version.split()[0]}, {os.cpu_count()} cores\n")
    figures = core_figures(repeat)
    if "sweep" in parts:
        sweep_figures(200)
    if "section" in parts:
        section_figures(repeat)
    if "growth" in parts:
        growth_figures(5 if QUICK else 20)
    if "gui" in parts:
        gui_figures(100, figures["run_us"])
    if "processes" in parts:
        process_figures(3 if QUICK else 7)


if __name__ == "__main__":
    main()
