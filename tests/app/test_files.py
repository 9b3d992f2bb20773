"""Files from the window: autosave lifecycle and recovery, locks, Save As, changes on disk.

Autosaves are keyed to the document's full path; a crashed instance is simulated with
the process id of a process that has ended, a running one with a sleeping child process.
"""

from __future__ import annotations

import json
import os
import stat
import subprocess
import sys
from pathlib import Path

import pytest
from PySide6.QtWidgets import QMessageBox

from plystack.app.autosave import AutosaveStore, document_key
from plystack.app.main import offer_recovery
from plystack.core.io.project_file import dumps, load, save

IN = 0.0254
DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"
B = QMessageBox.StandardButton


def ended_pid() -> int:
    out = subprocess.run([sys.executable, "-c", "import os; print(os.getpid())"],
                         capture_output=True, text=True, check=True)
    return int(out.stdout)


def edit_width(window, text="1/2 in", index=1):
    window.canvas.select(index)
    edit = window.ply_panel.fields["width"]
    edit.setText(text)
    edit.editingFinished.emit()


class Box:
    """Answers the recovery question and records what was asked."""

    class StandardButton:
        Yes, No = 1, 0

    def __init__(self, answer):
        self.answer, self.asked = answer, []

    def question(self, parent, title, text):
        self.asked.append(text)
        return self.answer


def left_behind(folder: Path, document: Path | None, project_text: str, pid: int) -> Path:
    """An autosave as a crashed instance with process id ``pid`` leaves it."""
    stem = f"{document_key(document)}.{pid}-1"
    (folder / f"{stem}.plystack.json").write_text(project_text, encoding="utf-8")
    meta = {"document": None if document is None else str(document), "pid": pid,
            "started": None, "host": None, "time": "2026-01-01 10:00:00"}
    (folder / f"{stem}.meta.json").write_text(json.dumps(meta), encoding="utf-8")
    return folder / f"{stem}.plystack.json"


@pytest.fixture
def opened(window, tmp_path):
    """The window on a saved copy of the demo, autosaves in a throwaway folder."""
    path = tmp_path / "job" / "header.plystack.json"
    path.parent.mkdir()
    save(load(DEMO), path)
    window.autosaves = AutosaveStore(tmp_path / "autosave")
    assert window.open_path(path)
    return window, path


def test_autosave_lifecycle_edit_save_discard(opened):
    window, path = opened
    folder = window.autosaves.folder
    edit_width(window)
    auto = window.autosave()
    assert auto is not None and auto.exists() and auto.parent == folder
    assert auto.name.startswith(document_key(path) + ".")
    assert load(auto) == window.document.project
    meta = json.loads(auto.with_name(auto.name.replace(".plystack.json", ".meta.json"))
                      .read_text())
    assert meta["document"] == str(path) and meta["pid"] == os.getpid()
    assert window.save()
    assert not auto.exists() and not list(folder.glob("*.plystack.json"))
    edit_width(window, "5/8 in")
    auto = window.autosave()
    assert auto.exists()
    window.ask = lambda *a, **k: B.Discard
    assert window.maybe_save()
    assert not auto.exists()


def test_save_as_removes_the_old_documents_autosave(opened, tmp_path):
    window, path = opened
    edit_width(window)
    old = window.autosave()
    window.ask_save_path = lambda start: str(tmp_path / "job" / "copy")
    assert window.save_as()
    assert not old.exists()
    assert (tmp_path / "job" / "copy.plystack.json").is_file()
    assert window.document.path == tmp_path / "job" / "copy.plystack.json"
    assert not list(window.autosaves.folder.glob("*.plystack.json"))


def test_a_stale_autosave_of_another_file_is_not_offered(opened, tmp_path):
    window, path = opened
    other = tmp_path / "jobB" / "header.plystack.json"  # same file name, other folder
    other_project = window.document.project.with_plies(window.document.project.plies[:1])
    stale = left_behind(window.autosaves.folder, other, dumps(other_project), ended_pid())
    box = Box(Box.StandardButton.Yes)
    before = window.document.project
    offer_recovery(window, window.autosaves.folder, box)
    assert box.asked == [] and window.document.project == before
    assert stale.exists()  # belongs to another document: left alone


def test_a_crashed_sessions_autosave_of_this_file_is_offered_and_recovered(opened):
    window, path = opened
    edited = window.document.project.with_plies(window.document.project.plies[:2])
    found = left_behind(window.autosaves.folder, path, dumps(edited), ended_pid())
    box = Box(Box.StandardButton.Yes)
    offer_recovery(window, window.autosaves.folder, box)
    assert len(box.asked) == 1 and str(path) in box.asked[0]
    assert window.document.project == edited and window.document.modified
    assert window.document.path == path
    assert not found.exists()  # this window's own autosave holds the work now
    window.document.undo_stack.undo()
    assert window.document.project == load(path)


def test_declined_recovery_deletes_only_that_autosave(opened):
    window, path = opened
    found = left_behind(window.autosaves.folder, path, dumps(window.document.project),
                        ended_pid())
    offer_recovery(window, window.autosaves.folder, Box(Box.StandardButton.No))
    assert not found.exists()
    assert not window.document.modified


def test_a_running_instances_autosave_is_neither_offered_nor_deleted(opened):
    window, path = opened
    child = subprocess.Popen([sys.executable, "-c", "import time; time.sleep(60)"])
    try:
        theirs = left_behind(window.autosaves.folder, path, dumps(window.document.project),
                             child.pid)
        box = Box(Box.StandardButton.No)
        offer_recovery(window, window.autosaves.folder, box)
        assert box.asked == [] and theirs.exists()
        lock = window.autosaves.folder / f"{document_key(path)}.{child.pid}-1.lock"
        lock.write_text(json.dumps({"document": str(path), "pid": child.pid}))
        assert window.autosaves.other_instances(path) == [child.pid]
        window.open_path(path)  # opening it again flags the other instance
        assert window.file_flag.isVisibleTo(window)
        assert str(child.pid) in window.file_flag.text()
    finally:
        child.kill()
        child.wait()
    assert window.autosaves.other_instances(path) == []  # its lock was stale: removed
    assert not lock.exists()


def test_a_demo_opened_without_a_file_is_untitled_and_never_receives_a_files_autosave(
        window, tmp_path):
    assert window.document.path is None  # the fixture opens the demo as the GUI does
    window.autosaves = AutosaveStore(tmp_path)
    left_behind(tmp_path, DEMO, dumps(window.document.project.with_plies(())), ended_pid())
    box = Box(Box.StandardButton.Yes)
    offer_recovery(window, tmp_path, box)
    assert box.asked == [] and window.document.project.plies


def test_saving_over_a_file_changed_on_disk_asks_first(opened):
    window, path = opened
    edit_width(window)
    other = load(path).with_plies(load(path).plies[:1])
    save(other, path)  # another program (or Plystack) saved the file meanwhile
    asked = []
    window.ask = lambda title, text, *a: asked.append(title) or B.Cancel
    assert not window.save()
    assert asked == ["File changed on disk"]
    assert load(path) == other and window.document.modified
    window.ask = lambda *a: B.Save
    assert window.save()
    assert load(path) == window.document.project
    asked.clear()
    window.ask = lambda title, text, *a: asked.append(title) or B.Cancel
    edit_width(window, "5/8 in")
    assert window.save() and asked == []  # unchanged on disk since our save: no question


def test_save_as_adds_the_suffix_starts_in_the_last_folder_with_normal_permissions(
        window, tmp_path):
    window.autosaves = AutosaveStore(tmp_path / "autosave")
    window.settings.setValue("last_dir", str(tmp_path))
    starts = []

    def choose(start):
        starts.append(start)
        return str(tmp_path / "sub" / "my-header")

    (tmp_path / "sub").mkdir()
    window.ask_save_path = choose
    old = os.umask(0o022)
    try:
        assert window.save_as()
    finally:
        os.umask(old)
    target = tmp_path / "sub" / "my-header.plystack.json"
    assert starts[0].startswith(str(tmp_path) + os.sep) and starts[0].endswith(".plystack.json")
    assert target.is_file() and not (tmp_path / "sub" / "my-header").exists()
    assert stat.S_IMODE(target.stat().st_mode) == 0o644
    assert window.settings.value("last_dir") == str(tmp_path / "sub")
    assert load(target) == window.document.project
    window.ask_save_path = lambda start: starts.append(start) or ""
    window.save_as()
    assert starts[-1].startswith(str(tmp_path / "sub"))
    assert starts[-1].endswith("my-header.plystack.json")


def test_save_load_round_trip_keeps_every_quantity_exactly(window, tmp_path):
    window.autosaves = AutosaveStore(tmp_path / "autosave")
    edit_width(window, "3/8 in")
    edit_width(window, "9 1/4 in", index=0)
    target = tmp_path / "round.plystack.json"
    assert window._save_to(target)
    again = load(target)
    assert again == window.document.project
    data = json.loads(target.read_text())
    texts = [v for ply in data["plies"] for k, v in ply.items() if k not in ("name", "material")]
    assert all(len(t) <= 12 for t in texts), texts  # short text, no float noise
    assert data["plies"][0]["width"] == "9.25 in"


def test_a_save_that_fails_keeps_the_work_and_names_the_reason(window, tmp_path):
    window.autosaves = AutosaveStore(tmp_path / "autosave")
    edit_width(window)
    warned = []
    window.warn = lambda title, text: warned.append((title, text))
    folder = tmp_path / "a-folder.plystack.json"
    folder.mkdir()
    assert not window._save_to(folder)
    assert warned and warned[0][0] == "Save failed" and "folder" in warned[0][1]
    assert window.document.modified


def test_dialogs_start_in_the_open_projects_folder(window, tmp_path):
    """Save As on a project opened from one folder starts there, not in the last folder
    another project was saved to."""
    window.autosaves = AutosaveStore(tmp_path / "autosave")
    here, elsewhere = tmp_path / "job-b", tmp_path / "job-a"
    here.mkdir()
    elsewhere.mkdir()
    path = here / "stair.plystack.json"
    save(window.document.project, path)
    window.open_path(path)
    window.settings.setValue("last_dir", str(elsewhere))
    starts = []
    window.ask_save_path = lambda start: starts.append(start) or ""
    window.save_as()
    assert starts and Path(starts[0]).parent == here
