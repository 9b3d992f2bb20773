"""The command line: JSON keys in SI, exit status 2 with messages on stderr."""

from __future__ import annotations

import json
import subprocess
import sys
from pathlib import Path

import pytest

from plystack.core.cli import main

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"


def test_check_json_keys(capsys):
    assert main(["check", str(DEMO), "--json", "--moment", "5 kip*ft", "--shear", "2 kip"]) == 0
    out = json.loads(capsys.readouterr().out)
    assert out["units"] == "SI"
    for key in ("EA", "EI", "neutral_axis_y", "I_transformed", "reference_material",
                "mass_per_length"):
        assert key in out["section"]
    for ply in out["plies"]:
        for key in ("name", "modular_ratio", "area", "transformed_area", "y_bottom", "y_top",
                    "stress_top", "stress_bottom"):
            assert key in ply
    assert isinstance(out["warnings"], list)
    assert out["section"]["reference_material"] == "DFL-No2"


def test_check_json_stress_matches_formula(capsys):
    """sigma = -E M (y - y_na) / EI at the plate's top fibre (transformed-section method)."""
    main(["check", str(DEMO), "--json", "--moment", "5 kip*ft"])
    out = json.loads(capsys.readouterr().out)
    M = 5000 * 4.4482216152605 * 0.3048
    plate = out["plies"][1]
    E = plate["modular_ratio"] * out["section"]["E_reference"]
    expect = -E * M * (plate["y_top"] - out["section"]["neutral_axis_y"]) / out["section"]["EI"]
    assert plate["stress_top"] == pytest.approx(expect, rel=1e-12)
    assert plate["stress_top"] < 0 < plate["stress_bottom"]


def test_readable_output(capsys):
    assert main(["check", str(DEMO), "--moment", "5 kip*ft"]) == 0
    text = capsys.readouterr().out
    assert "neutral axis" in text and "psi" in text and "Caution" in text


def test_reference_option(capsys):
    main(["check", str(DEMO), "--json", "--reference", "A36"])
    a = json.loads(capsys.readouterr().out)
    main(["check", str(DEMO), "--json"])
    b = json.loads(capsys.readouterr().out)
    assert a["section"]["EI"] == pytest.approx(b["section"]["EI"], rel=1e-12)
    assert a["section"]["reference_material"] == "A36"


def test_bad_file_exit_2(tmp_path, capsys):
    bad = tmp_path / "bad.plystack.json"
    data = json.loads(DEMO.read_text())
    data["plies"][2]["height"] = "12 apples"
    bad.write_text(json.dumps(data))
    assert main(["check", str(bad), "--json"]) == 2
    cap = capsys.readouterr()
    assert cap.out == ""
    assert 'plies[2].height: "12 apples" is not a length' in cap.err


@pytest.mark.parametrize("args", [["check", "nofile.json"], ["check"],
                                  ["check", str(DEMO), "--moment", "12"]])
def test_bad_arguments_exit_2(args, capsys):
    with pytest.raises(SystemExit) as info:
        code = main(args)
        raise SystemExit(code)
    assert info.value.code == 2
    assert capsys.readouterr().out == ""


@pytest.mark.parametrize("entry", ["core.cli", "app.launch"])
def test_cli_does_not_import_qt_or_matplotlib(entry):
    code = (f"import sys; from {entry} import main; main(['check', {str(DEMO)!r}, '--json']); "
            "bad = [m for m in sys.modules if m.startswith(('PySide6', 'matplotlib'))]; "
            "sys.stderr.write(repr(bad)); sys.exit(1 if bad else 0)")
    r = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True)
    assert r.returncode == 0, r.stderr

def test_core_never_imports_the_gui():
    """core/ never imports app/ (nor Qt): the console script passes the GUI in."""
    import re

    root = Path(__file__).resolve().parents[2] / "core"
    pattern = re.compile(r"^\s*(from|import)\s+(app|PySide6|matplotlib)\b", re.MULTILINE)
    for path in root.rglob("*.py"):
        assert not pattern.search(path.read_text()), path

