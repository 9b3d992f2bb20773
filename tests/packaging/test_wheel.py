"""The wheel: one import name, every data file inside, and the data read from a zip.

Facts of the project's packaging (no outside source).
"""

from __future__ import annotations

import os
import subprocess
import sys
import zipfile
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[2]


@pytest.fixture(scope="module")
def wheel(tmp_path_factory) -> Path:
    out = tmp_path_factory.mktemp("wheel")
    subprocess.run([sys.executable, "-m", "pip", "wheel", "-q", "--no-deps", "-w", str(out),
                    str(ROOT)], check=True, capture_output=True)
    (whl,) = out.glob("plystack-*.whl")
    return whl


def test_wheel_holds_one_package_and_every_data_file(wheel):
    names = zipfile.ZipFile(wheel).namelist()
    tops = {n.split("/")[0] for n in names if not n.split("/")[0].endswith(".dist-info")}
    assert tops == {"plystack"}
    for needed in ("plystack/materials.json", "plystack/fonts/DejaVuSans.ttf",
                   "plystack/fonts/DejaVuSans-Bold.ttf",
                   "plystack/demo/porch-header.plystack.json",
                   "plystack/demo/stair-trimmer-eu.plystack.json",
                   "plystack/demo/renovation-schedule.csv",
                   "plystack/icons/plystack.png", "plystack/icons/plystack.svg",
                   "plystack/plystack.desktop", "plystack/core/py.typed",
                   "plystack/app/main_window.py", "plystack/core/pipeline.py"):
        assert needed in names, needed


def test_data_is_read_from_a_zip(wheel, tmp_path):
    """Importing straight from the wheel (a zip archive) still finds every data file."""
    code = (
        # an editable install of the checkout would otherwise win over the zip
        "import sys\n"
        "sys.meta_path[:] = [f for f in sys.meta_path if 'editable' not in repr(f).lower()]\n"
        "sys.path_hooks[:] = [h for h in sys.path_hooks if 'editable' not in repr(h).lower()]\n"
        "sys.path[:] = [p for p in sys.path if '__editable__' not in p]\n"
        "sys.path_importer_cache.clear()\n"
        "import plystack.core as c\n"
        f"assert c.__file__.startswith({str(wheel)!r}), c.__file__\n"
        "from plystack.core.io.library import load_library\n"
        "from plystack.core.io.project_file import loads\n"
        "from plystack.core.io.resources import demo_text, read_bytes\n"
        "from plystack.core.pipeline import run\n"
        "from plystack.core.report.sheet import build_sheet\n"
        "import io\n"
        "assert len(load_library()) > 10\n"
        "a = run(loads(demo_text()))\n"
        "assert a.checks\n"
        "assert read_bytes('icons/plystack.png', 'icon')[:4] == b'\\x89PNG'\n"
        "buf = io.BytesIO(); build_sheet(loads(demo_text('stair-trimmer-eu')), buf, 'a4')\n"
        "assert buf.getvalue()[:4] == b'%PDF'\n"
        "print('ok')\n"
    )
    env = {**os.environ, "PYTHONPATH": str(wheel)}
    res = subprocess.run([sys.executable, "-c", code], cwd=tmp_path, env=env,
                         capture_output=True, text=True)
    assert res.returncode == 0, res.stderr
    assert res.stdout.strip() == "ok"
