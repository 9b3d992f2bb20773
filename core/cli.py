"""The ``plystack`` command line. Exit status 2 with messages on stderr for bad input.

The ``check`` path imports neither Qt nor matplotlib.
"""

from __future__ import annotations

import argparse
import json
import sys
from pathlib import Path

from core.errors import ProjectError

DEMO = Path(__file__).resolve().parent.parent / "assets" / "demo" / "porch-header.plystack.json"


class _Parser(argparse.ArgumentParser):
    def error(self, message: str) -> None:  # type: ignore[override]
        self.print_usage(sys.stderr)
        print(f"plystack: {message}", file=sys.stderr)
        raise SystemExit(2)


def build_parser() -> argparse.ArgumentParser:
    """The argument parser with every subcommand."""
    p = _Parser(prog="plystack", description="Built-up timber and steel beam sections.")
    sub = p.add_subparsers(dest="command", parser_class=_Parser)
    c = sub.add_parser("check", help="analyse a project file and print the results")
    c.add_argument("file")
    c.add_argument("--reference", metavar="MATERIAL_ID", help="reference material id")
    c.add_argument("--moment", help='bending moment, e.g. "12 kip*ft" (sagging positive)')
    c.add_argument("--shear", help='shear force, e.g. "3 kip"')
    c.add_argument("--json", action="store_true", help="print one JSON object in SI units")
    g = sub.add_parser("gui", help="open the desktop program")
    g.add_argument("file", nargs="?")
    g.add_argument("--screenshot", metavar="OUT.png", help="render the window to a PNG and exit")
    return p


def _fail(messages: list[str]) -> int:
    for m in messages:
        print(m, file=sys.stderr)
    return 2


def cmd_check(args: argparse.Namespace) -> int:
    """``plystack check``."""
    from core import units
    from core.analysis import run
    from core.output import check_json, check_text
    from core.project import load

    try:
        project = load(args.file)
        moment = units.parse(args.moment, "moment", "--moment") if args.moment else None
        shear = units.parse(args.shear, "force", "--shear") if args.shear else None
        analysis = run(project, reference=args.reference)
    except ProjectError as exc:
        return _fail([f"{args.file}: {p}" for p in exc.problems])
    except units.UnitError as exc:
        return _fail([str(exc)])
    if args.json:
        print(json.dumps(check_json(analysis, moment, shear), indent=1))
    else:
        sys.stdout.write(check_text(analysis, moment, shear))
    return 0


def main(argv: list[str] | None = None) -> int:
    """Entry point of the console script."""
    argv = sys.argv[1:] if argv is None else argv
    parser = build_parser()
    if not argv:
        argv = ["gui"]
    args = parser.parse_args(argv)
    if args.command == "check":
        return cmd_check(args)
    if args.command == "gui":
        from app.main import run_gui

        return int(run_gui(args.file or str(DEMO), args.screenshot))
    parser.print_help()
    return 2


if __name__ == "__main__":
    raise SystemExit(main())
