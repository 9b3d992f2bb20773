"""What the command line loads at start-up: each command imports only the libraries it
uses (checked in a fresh interpreter, the way the console script runs), and setting the
sheet leaves Python's cycle collector as it found it.

Source: the interpreter's own ``sys.modules`` after the command; no timing is asserted
(speed is measured in benchmarks/).
"""

from __future__ import annotations

import gc
import io
import json
import subprocess
import sys
from pathlib import Path

import pytest

from plystack.core.io.project_file import load
from plystack.core.report.sheet import build_sheet

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"
NEVER = ("PySide6", "matplotlib", "ezdxf", "tqdm", "sympy", "pint", "pypdf")


def _loaded(args: list[str]) -> list[str]:
    """The libraries of NEVER, and reportlab, loaded after the command ``args``."""
    watched = (*NEVER, "reportlab")
    code = ("import json, sys; from plystack.app.launch import main; "
            f"code = main({args!r}); "
            f"top = {{m.split('.')[0] for m in sys.modules}}; "
            f"print(json.dumps(sorted(top & set({watched!r})))); sys.exit(code)")
    r = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True)
    assert r.returncode == 0, r.stderr
    return list(json.loads(r.stdout.strip().splitlines()[-1]))


def test_check_loads_no_report_plot_drawing_or_unit_library():
    """``plystack check`` of a file whose quantities are plain "number unit" texts (and
    fractions of inches) reads them without pint, and writes no PDF or drawing."""
    assert _loaded(["check", str(DEMO), "--json"]) == []


def test_sheet_loads_reportlab_only(tmp_path):
    assert _loaded(["sheet", str(DEMO), "-o", str(tmp_path / "s.pdf")]) == ["reportlab"]


@pytest.mark.parametrize("enabled", [True, False])
def test_sheet_leaves_the_cycle_collector_as_it_was(enabled):
    project = load(DEMO)
    was = gc.isenabled()
    try:
        gc.enable() if enabled else gc.disable()
        build_sheet(project, io.BytesIO())
        assert gc.isenabled() is enabled
    finally:
        gc.enable() if was else gc.disable()


def test_check_reads_no_distribution_metadata():
    """The version is written in ``plystack.core`` itself, so no command parses the
    installed distribution's metadata (importlib.metadata and the email parser it uses)."""
    code = ("import sys; from plystack.app.launch import main; "
            f"code = main(['check', {str(DEMO)!r}, '--json']); "
            "print(sorted(m for m in ('importlib.metadata', 'email') if m in sys.modules)); "
            "sys.exit(code)")
    r = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True)
    assert r.returncode == 0, r.stderr
    assert r.stdout.strip().splitlines()[-1] == "[]"


def test_the_installed_version_is_the_one_written_in_the_package():
    from importlib.metadata import version

    from plystack.core import __version__
    assert version("plystack") == __version__
