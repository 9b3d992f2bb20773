"""The ``plystack`` command line. Exit status 2 with messages on stderr for bad input.

Nothing here imports Qt or matplotlib; the console script (app.launch) passes in the
function that opens the desktop program.
"""

from __future__ import annotations

import argparse
import json
import re
import sys
import warnings
from collections.abc import Callable, Iterator
from contextlib import contextmanager
from typing import TYPE_CHECKING, Any

from . import __version__
from .design.check import ratio_text
from .io.resources import DEFAULT_DEMO, DEMOS, DataFileError, demo_text
from .io.table import text_table
from .model.caution import CAUTION
from .model.errors import Problem, ProjectError
from .model.units import UnitError

if TYPE_CHECKING:
    from .model.project import Project


class _Parser(argparse.ArgumentParser):
    def error(self, message: str) -> None:  # type: ignore[override]
        """Usage and the message, values in double quotes as everywhere else (argparse
        quotes choices the Python way), exit status 2.
        """
        self.print_usage(sys.stderr)
        quoted = re.sub(r"(?<!\w)'([^']*)'(?!\w)", r'"\1"', message)
        print(f"plystack: {quoted}", file=sys.stderr)
        raise SystemExit(2)


def build_parser() -> argparse.ArgumentParser:
    """The argument parser with every subcommand."""
    p = _Parser(prog="plystack", description="Built-up timber and steel beam sections.")
    p.add_argument("--version", action="version", version=f"plystack {__version__}")
    sub = p.add_subparsers(dest="command", parser_class=_Parser)
    c = sub.add_parser("check", help="analyse a project file and print the results")
    c.add_argument("file")
    c.add_argument("--reference", metavar="MATERIAL_ID", help="reference material id")
    c.add_argument("--moment", help='bending moment, e.g. "12 kip*ft" (sagging positive)')
    c.add_argument("--shear", help='shear force, e.g. "3 kip"')
    c.add_argument("--json", action="store_true", help="print one JSON object in SI units")
    cmp_ = sub.add_parser("compare", help="all alternatives in the file, side by side")
    cmp_.add_argument("file")
    cmp_.add_argument("--json", action="store_true")
    sw = sub.add_parser("sweep", help="vary one dimension of one ply")
    sw.add_argument("file")
    sw.add_argument("--ply", required=True, help="name of the ply to vary")
    sw.add_argument("--dimension", required=True, choices=["width", "height"])
    sw.add_argument("--values", required=True, help='e.g. "1/4 in, 3/8 in, 1/2 in"')
    sw.add_argument("--json", action="store_true")
    sz = sub.add_parser("size", help="smallest stock option of one ply that passes")
    sz.add_argument("file")
    sz.add_argument("--ply", required=True)
    sz.add_argument("--dimension", default="width", choices=["width", "height"])
    sz.add_argument("--values", help="options to try (default: stock plate thicknesses for "
                    "width, the ply's height in 1/2 in or 10 mm steps for height)")
    sz.add_argument("--json", action="store_true")
    sp = sub.add_parser("span", help="longest span that passes every check")
    sp.add_argument("file")
    sp.add_argument("--tributary-widths", help='span table over tributary widths of the area '
                    'loads, e.g. "12 in, 16 in, 24 in"')
    sp.add_argument("--json", action="store_true")
    sh = sub.add_parser("sheet", help="write the PDF calculation sheet")
    sh.add_argument("file")
    sh.add_argument("-o", "--output", required=True, metavar="OUT.pdf")
    sh.add_argument("--alternative", metavar="NAME")
    sh.add_argument("--paper", choices=["letter", "a4"], default=None,
                    help="paper size (default: letter for US units, a4 for SI)")
    pl = sub.add_parser("plates", help="write a DXF drawing of every steel plate and a cut "
                        "list (CSV) into a folder")
    pl.add_argument("file")
    pl.add_argument("-o", "--output", required=True, metavar="DIR",
                    help="folder for <mark>.dxf and cut-list.csv (made where missing)")
    pl.add_argument("--alternative", metavar="NAME", help="the plates of this alternative")
    sc = sub.add_parser("schedule", help="check every member of a schedule (CSV) in one run")
    sc.add_argument("file", metavar="SCHEDULE.csv")
    sc.add_argument("-o", "--output", metavar="RESULTS.csv",
                    help="write the results here (default: standard output)")
    sc.add_argument("--json", action="store_true",
                    help="one object per member, keys as check --json plus the mark")
    sc.add_argument("--sheets", metavar="DIR", help="write each member's calculation sheet "
                    "and one combined PDF (schedule.pdf, summary first) into DIR")
    sc.add_argument("--jobs", type=_jobs, default=None, metavar="N",
                    help="processes to use (default: the number of CPUs; 1 runs in-process)")
    d = sub.add_parser("demo", help="copy a bundled demo project to a file you can edit")
    d.add_argument("output", metavar="OUT.plystack.json")
    d.add_argument("--name", choices=sorted(DEMOS), default=DEFAULT_DEMO,
                   help=f"which demo (default {DEFAULT_DEMO})")
    g = sub.add_parser("gui", help="open the desktop program")
    g.add_argument("file", nargs="?")
    g.add_argument("--screenshot", metavar="OUT.png", help="render the window to a PNG and exit")
    return p


def _jobs(text: str) -> int:
    try:
        value = int(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f'"{text}" is not a whole number') from None
    if value < 1:
        raise argparse.ArgumentTypeError(f"{value} must be 1 or more")
    return value


def _fail(messages: list[str]) -> int:
    for m in messages:
        print(m, file=sys.stderr)
    return 2


def _print_json(value: Any) -> None:
    """Print strict JSON: NaN or Infinity anywhere is a named problem, never printed."""
    from .io.output import dumps

    print(dumps(value))


def _load(path: str) -> Project:
    """Read a project for a command: names used twice are refused (they would be
    ambiguous for --ply, --alternative and the per-ply results).
    """
    from .io.project_file import load, name_problems

    project = load(path)
    problems = name_problems(project)
    if problems:
        raise ProjectError(problems)
    return project


def _empty_arguments(args: argparse.Namespace) -> list[str]:
    """Messages for every argument given as empty text."""
    out = []
    for key, value in vars(args).items():
        if isinstance(value, str) and not value.strip():
            positional = {"file": "FILE", "output": ("-o/--output"
                                                     if args.command in ("sheet", "plates")
                                                     else "OUT")}
            name = positional.get(key, f"--{key.replace('_', '-')}")
            out.append(f"plystack: {name}: is empty; give a value")
    return out


def cmd_check(args: argparse.Namespace) -> int:
    """``plystack check``."""
    from .io.output import check_json, check_text
    from .model import units
    from .pipeline import run

    project = _load(args.file)
    moment = units.parse(args.moment, "moment", "--moment") if args.moment is not None else None
    shear = units.parse(args.shear, "force", "--shear") if args.shear is not None else None
    if args.reference is not None and args.reference not in project.all_materials():
        used = ", ".join(dict.fromkeys(f'"{p.material}"' for p in project.plies)) or "none"
        raise ProjectError(Problem("--reference", f'"{args.reference}" is not a material id '
                                   f"of this project (its plies use {used})"))
    analysis = run(project, reference=args.reference)
    if args.json:
        _print_json(check_json(analysis, moment, shear))
    else:
        sys.stdout.write(check_text(analysis, moment, shear))
    return 0


def _values(text: str, field: str) -> list[float]:
    """Lengths separated by commas, each greater than zero."""
    from .model import units

    out = []
    for i, part in enumerate(text.split(",")):
        value = units.parse(part.strip(), "length", f"{field}[{i}]")
        if value <= 0:
            raise ProjectError(Problem(f"{field}[{i}]", f'"{part.strip()}" must be greater '
                                       "than zero"))
        out.append(value)
    return out


def cmd_compare(args: argparse.Namespace) -> int:
    """``plystack compare``: one object per alternative, keys as ``check --json``."""
    from .io.output import check_json
    from .model.units import fmt
    from .study.compare import alternative_analyses, alternatives_with_current, summarise

    project = _load(args.file)
    alts = alternatives_with_current(project)
    bar = _bar(args, len(alts), "alternative")
    try:
        results = []
        for alt, analysis in zip(alts, alternative_analyses(project, alts), strict=True):
            results.append((alt, analysis))
            if bar is not None:
                bar.update(1)
    finally:
        if bar is not None:
            bar.close()
    rows = [(alt, a, summarise(a)) for alt, a in results]
    if args.json:
        _print_json([{"name": alt.name, **check_json(a)} for alt, a, _ in rows])
        return 0
    u = project.display_units
    header = ["alternative", "EI", "mass/length", "governs", "ratio", "deflection", "verdict"]
    cells = [[alt.name, fmt(o.EI, "EI", u), fmt(o.mass_per_length, "mass_per_length", u),
              o.governing_id, ratio_text(o.governing_ratio),
              fmt(o.deflection_max_abs, "deflection", u, 3), o.verdict]
             for alt, _a, o in rows]
    for line in text_table(header, cells, frozenset({1, 2, 4, 5})):
        print(line)
    print(CAUTION)
    return 0


def cmd_sweep(args: argparse.Namespace) -> int:
    """``plystack sweep``."""
    from .model import units
    from .study.compare import sweep

    project = _load(args.file)
    values = _values(args.values, "--values")
    with _study_bar(args, len(values), "candidate") as report:
        rows = sweep(project, args.ply, args.dimension, values, report)
    if args.json:
        _print_json({"units": "SI", "ply": args.ply, "dimension": args.dimension,
                     "rows": [r.to_dict() for r in rows]})
        return 0
    u = project.display_units
    print(f"{args.ply}: {args.dimension}")
    cells, previous_ok = [], None
    for r in rows:
        mark = "<- pass/fail boundary" if previous_ok is not None and r.ok != previous_ok else ""
        previous_ok = r.ok
        cells.append([units.fmt(r.value, "length", u), r.governing_id,
                      ratio_text(r.governing_ratio),
                      units.fmt(r.deflection_max_abs, "deflection", u, 3),
                      units.fmt(r.mass_per_length, "mass_per_length", u), r.verdict, mark])
    header = ["value", "governs", "ratio", "deflection", "mass/length", "verdict", ""]
    for line in text_table(header, cells, frozenset({0, 2, 3, 4})):
        print(line)
    print(CAUTION)
    return 0


def cmd_size(args: argparse.Namespace) -> int:
    """``plystack size``: exit 1 when no option passes."""
    from .model import units
    from .study.compare import auto_size, incomplete_note, ply_index, width_options

    project = _load(args.file)
    if args.values is not None:
        options = _values(args.values, "--values")
    elif args.dimension == "width":
        options = width_options(project, args.ply)
    else:
        ply = project.plies[ply_index(project.plies, args.ply)]
        step = 0.0127 if project.display_units == "US" else 0.01
        top = max(p.top for p in project.plies) - min(p.y for p in project.plies)
        options = [step * k for k in range(2, int(top / step) + 2)] or [ply.height]
    with _study_bar(args, len(options), "option") as report:
        result = auto_size(project, args.ply, args.dimension, options, report)
    if args.json:
        _print_json({"units": "SI", **result.to_dict()})
    else:
        u = project.display_units
        if result.chosen is None:
            last = result.next_smaller
            print(f"{args.ply}: no option passes" + ("" if last is None else
                  f": the largest, {units.fmt(last.value, 'length', u)}, still has "
                  f"{last.governing_id} ratio {ratio_text(last.governing_ratio)}"))
        else:
            print(f"{args.ply}: {args.dimension} {units.fmt(result.chosen.value, 'length', u)} "
                  f"passes (governing {result.chosen.governing_id}, ratio "
                  f"{ratio_text(result.chosen.governing_ratio)}){incomplete_note(result.chosen.verdict)}")
            if result.next_smaller is not None:
                n = result.next_smaller
                print(f"  next smaller, {units.fmt(n.value, 'length', u)}, fails: "
                      f"{n.governing_id} ratio {ratio_text(n.governing_ratio)}")
        print(CAUTION)  # beside every verdict, a passing option or none
    return 0 if result.chosen is not None else 1


def cmd_span(args: argparse.Namespace) -> int:
    """``plystack span``."""
    from .model import units
    from .study.compare import incomplete_note, longest_span, span_table

    project = _load(args.file)
    with _study_bar(args, None, "span") as report:
        result = longest_span(project, progress=report)
        table = (span_table(project, _values(args.tributary_widths, "--tributary-widths"),
                            report)
                 if args.tributary_widths is not None else [])
    if args.json:
        _print_json({"units": "SI", **result.to_dict(), "table": table})
        return 0
    u = project.display_units
    print(f"Longest span that passes every check: {units.fmt(result.span, 'span', u)} "
          f"(to {units.fmt(result.tolerance, 'length', u, 3)}); governing "
          f"{result.governing_id}, ratio {ratio_text(result.governing_ratio)}"
          + incomplete_note(result.verdict))
    for row in table:
        width = units.fmt(float(row["tributary_width"]), "length", u)  # type: ignore[arg-type]
        span = units.fmt(float(row["span"]), "span", u)  # type: ignore[arg-type]
        print(f"  {row['alternative']:<20} tributary {width:>10}  span {span:>10}  "
              f"({row['governing_id']})")
    print(CAUTION)
    return 0


def cmd_sheet(args: argparse.Namespace) -> int:
    """``plystack sheet``: refuses (exit 2) a project that cannot be analysed."""
    from io import BytesIO

    from .io.atomic import write_bytes
    from .report.sheet import build_sheet

    project = _load(args.file)
    paper = args.paper or ("letter" if project.display_units == "US" else "a4")
    buffer = BytesIO()
    pages = build_sheet(project, buffer, paper, args.alternative)
    write_bytes(args.output, buffer.getvalue(), "-o/--output")
    print(f"wrote {args.output}: {pages} pages ({paper})")
    return 0


def cmd_plates(args: argparse.Namespace) -> int:
    """``plystack plates``: refuses (exit 2) a project without a steel plate or whose
    plates cannot be laid out; nothing is written then.
    """
    from .fabrication.export import export_plates
    from .fabrication.plates import plain

    plates, written = export_plates(_load(args.file), args.output, args.alternative,
                                    "-o/--output")
    for plate, path in zip(plates.plates, written, strict=False):
        print(f'wrote {path}: {plate.mark}, "{plain(plate.ply_name)}", {len(plate.holes)} '
              "holes")
    n = len(plates.plates)
    print(f"wrote {written[-1]}: {n} plate{'' if n == 1 else 's'}")
    if plates.verdict != "OK":
        print(f"{args.file}: {plates.verdict_note} (see plystack check)", file=sys.stderr)
    return 0


def cmd_schedule(args: argparse.Namespace) -> int:
    """``plystack schedule``: exit 0 when every member ran and is OK, 1 when any is NOT OK,
    INCOMPLETE or could not run, 2 when the schedule file cannot be read.
    """
    from .io.atomic import output_folder, write_text
    from .io.schedule_file import (
        MemberJob,
        ScheduleError,
        evaluate,
        prepare,
        read_schedule,
        result_json,
        results_csv,
    )
    from .study.schedule import MemberResult, default_jobs, exit_status, run_rows

    try:
        schedule = read_schedule(args.file)
    except ScheduleError as exc:
        return _fail([f"{args.file}: {m}" for m in exc.messages])
    sheets = output_folder(args.sheets, "--sheets", "the sheets") if args.sheets else None
    prepared = prepare(schedule, with_check=args.json, sheets=sheets)
    jobs = [j for j in prepared if isinstance(j, MemberJob)]
    worker = evaluate
    if sheets is not None:
        from .report.schedule_pdf import evaluate_with_sheet

        worker = evaluate_with_sheet
    bar = _progress(len(jobs)) if sys.stderr.isatty() and not args.json else None
    try:
        done = iter(run_rows(worker, jobs, args.jobs or default_jobs(),
                             bar.update if bar is not None else None))
    finally:
        if bar is not None:
            bar.close()
    results: list[MemberResult] = [next(done) if isinstance(j, MemberJob) else j
                                   for j in prepared]
    for r in results:
        for problem in r.problems:
            print(f"{args.file}: {problem}", file=sys.stderr)
    text = (json.dumps([result_json(r) for r in results], indent=1, allow_nan=False) + "\n"
            if args.json
            else results_csv(results))
    if args.output:
        write_text(args.output, text, "-o")
    else:
        sys.stdout.write(text)
    if sheets is not None:
        from .report.schedule_pdf import write_combined

        combined, pages = write_combined(results, sheets, schedule.path.name)
        print(f"wrote {combined}: {pages} pages", file=sys.stderr)
    return exit_status(results)


def _progress(total: int | None, unit: str = "member") -> Any:
    from tqdm import tqdm

    return tqdm(total=total, unit=unit, file=sys.stderr, leave=False)


def _bar(args: argparse.Namespace, total: int | None, unit: str) -> Any:
    """A progress bar on stderr, or None where stderr is not a terminal or the output
    is JSON.
    """
    if getattr(args, "json", False) or not sys.stderr.isatty():
        return None
    return _progress(total, unit)


@contextmanager
def _study_bar(args: argparse.Namespace, total: int | None, unit: str
               ) -> Iterator[Callable[[int, int | None], bool] | None]:
    """The progress callback of a study (core.study.compare) drawing a bar on stderr,
    or None where no bar is drawn (see :func:`_bar`); the bar is closed at the end.
    """
    bar = _bar(args, total, unit)
    if bar is None:
        yield None
        return

    def report(done: int, total_now: int | None) -> bool:
        bar.update(done - bar.n)
        return True

    try:
        yield report
    finally:
        bar.close()


def cmd_demo(args: argparse.Namespace) -> int:
    """Copy a bundled demo project to ``args.output`` (never over an existing file)."""
    from .io.atomic import write_text_new

    write_text_new(args.output, demo_text(args.name))
    print(f'wrote {args.output}: the demo project "{args.name}" (an invented scenario)')
    return 0


def main(argv: list[str] | None = None,
         gui: Callable[[str | None, str | None], int] | None = None) -> int:
    """The command line. ``gui`` opens the desktop program; it is given by the console
    script (app.launch), since core/ never imports the GUI stack.
    """
    argv = sys.argv[1:] if argv is None else argv
    parser = build_parser()
    if not argv:
        argv = ["gui"]
    args = parser.parse_args(argv)
    for stream in (sys.stdout, sys.stderr):  # text that cannot be encoded is escaped
        reconfigure = getattr(stream, "reconfigure", None)
        if reconfigure is not None:
            reconfigure(errors="backslashreplace")
    empty = _empty_arguments(args)
    if empty:
        return _fail(empty)
    commands = {"check": cmd_check, "compare": cmd_compare, "sweep": cmd_sweep,
                "size": cmd_size, "span": cmd_span, "sheet": cmd_sheet, "demo": cmd_demo,
                "schedule": cmd_schedule, "plates": cmd_plates}
    if args.command in commands:
        try:
            with warnings.catch_warnings():
                warnings.simplefilter("ignore", RuntimeWarning)
                return commands[args.command](args)
        except DataFileError as exc:  # a fault of the installation, not of the input
            return _fail([f"plystack: {p}" for p in exc.problems])
        except ProjectError as exc:  # the file read, or the command itself (``demo``)
            where = getattr(args, "file", None) or f"plystack {args.command}"
            return _fail([f"{where}: {p}" for p in exc.problems])
        except UnitError as exc:
            return _fail([str(exc)])
        except OSError as exc:  # an output file that cannot be written
            where = getattr(args, "output", None) or getattr(args, "file", None)
            return _fail([f"{where}: {exc.strerror or exc}"])
    if args.command == "gui":
        if gui is None:
            return _fail(["plystack: the desktop program starts from the `plystack` command "
                          "(app.launch), not from core.cli"])
        return int(gui(args.file, args.screenshot))
    parser.print_help()
    return 2


if __name__ == "__main__":
    raise SystemExit(main())
