"""File-system faults: saving through a symbolic link, over a hard link, into a read-only
folder, onto a full disk, and reading or writing a FIFO or device. A save either writes
the whole file or leaves the old one as it was (and no temporary file behind).

Hard links: a save writes a new file and renames it over the name it was given, so that
name gets the new text and every other hard link keeps the old text (it is a separate
file from then on). That is the price of atomicity; a save in place could leave a torn
file on a crash.
"""

from __future__ import annotations

import errno
import os
import stat
import subprocess
import sys
import time
from dataclasses import replace
from pathlib import Path

import pytest

from plystack.core.cli import main
from plystack.core.io.atomic import write_bytes
from plystack.core.io.project_file import load, save
from plystack.core.model.errors import ProjectError

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"
FAST = 5.0


def _project(title: str = "fault test (invented)"):
    return replace(load(DEMO), title=title)


def _leftovers(folder: Path) -> list[str]:
    return sorted(p.name for p in folder.iterdir() if p.name.endswith(".tmp"))


def test_save_through_symlink_writes_the_target_and_keeps_link_and_mode(tmp_path):
    target = tmp_path / "real.plystack.json"
    save(_project("old"), target)
    os.chmod(target, 0o640)
    link = tmp_path / "link.plystack.json"
    link.symlink_to(target)
    save(_project("new"), link)
    assert link.is_symlink() and os.readlink(link) == str(target)
    assert load(target).title == "new"
    assert stat.S_IMODE(target.stat().st_mode) == 0o640
    assert _leftovers(tmp_path) == []


def test_save_through_dangling_symlink_creates_the_target(tmp_path):
    target = tmp_path / "sub" / "new.plystack.json"
    target.parent.mkdir()
    link = tmp_path / "link.plystack.json"
    link.symlink_to(target)
    save(_project("created"), link)
    assert link.is_symlink()
    assert load(target).title == "created"


def test_new_file_gets_the_umask_mode(tmp_path):
    old = os.umask(0o027)
    try:
        save(_project(), tmp_path / "a.plystack.json")
    finally:
        os.umask(old)
    assert stat.S_IMODE((tmp_path / "a.plystack.json").stat().st_mode) == 0o640


def test_hard_link_keeps_the_old_text(tmp_path):
    path = tmp_path / "a.plystack.json"
    save(_project("old"), path)
    other = tmp_path / "b.plystack.json"
    os.link(path, other)
    save(_project("new"), path)
    assert load(path).title == "new"
    assert load(other).title == "old"
    assert other.stat().st_nlink == 1 and path.stat().st_nlink == 1


def test_fifo_is_refused_at_once_for_reading_and_writing(tmp_path):
    fifo = tmp_path / "pipe.plystack.json"
    os.mkfifo(fifo)
    # in a child process, so that a regression hangs the child, not the test run
    code = ("import sys\nfrom plystack.core.cli import main\n"
            f"sys.exit(main(['check', {str(fifo)!r}]))")
    start = time.monotonic()
    r = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                       timeout=60)
    assert time.monotonic() - start < 30
    assert r.returncode == 2
    assert "it is not a regular file" in r.stderr
    with pytest.raises(ProjectError, match="not a regular file"):
        save(_project(), fifo)
    assert stat.S_ISFIFO(fifo.lstat().st_mode)
    link = tmp_path / "link.json"
    link.symlink_to(fifo)
    with pytest.raises(ProjectError, match="not a regular file"):
        save(_project(), link)
    assert _leftovers(tmp_path) == []


def test_sheet_output_refuses_fifo_and_follows_symlink(tmp_path, capsys):
    fifo = tmp_path / "out.pdf"
    os.mkfifo(fifo)
    assert main(["sheet", str(DEMO), "-o", str(fifo)]) == 2
    assert "not a regular file" in capsys.readouterr().err
    assert stat.S_ISFIFO(fifo.lstat().st_mode)
    real = tmp_path / "real.pdf"
    real.write_bytes(b"old")
    os.chmod(real, 0o604)
    link = tmp_path / "link.pdf"
    link.symlink_to(real)
    assert main(["sheet", str(DEMO), "-o", str(link)]) == 0
    assert link.is_symlink()
    assert real.read_bytes().startswith(b"%PDF")
    assert stat.S_IMODE(real.stat().st_mode) == 0o604


@pytest.mark.skipif(not os.path.exists("/dev/null"), reason="no /dev/null on this system")
def test_device_is_refused():
    with pytest.raises(ProjectError, match="not a regular file"):
        save(_project(), "/dev/null")
    assert stat.S_ISCHR(os.stat("/dev/null").st_mode)
    with pytest.raises(ProjectError, match="not a regular file"):
        load("/dev/null")


def test_folder_is_refused(tmp_path):
    with pytest.raises(ProjectError, match="is a folder"):
        save(_project(), tmp_path)
    with pytest.raises(ProjectError, match="it is a folder"):
        load(tmp_path)


def _mount_tmpfs(folder: Path, options: str) -> bool:
    if os.geteuid() != 0:
        return False
    r = subprocess.run(["mount", "-t", "tmpfs", "-o", options, "tmpfs", str(folder)],
                       capture_output=True)
    return r.returncode == 0


def _umount(folder: Path) -> None:
    subprocess.run(["umount", str(folder)], capture_output=True)


def test_read_only_folder_keeps_the_old_file(tmp_path):
    folder = tmp_path / "ro"
    folder.mkdir()
    mounted = _mount_tmpfs(folder, "size=1m")
    try:
        path = folder / "a.plystack.json"
        save(_project("old"), path)
        if mounted:  # root ignores permission bits: a read-only file system instead
            r = subprocess.run(["mount", "-o", "remount,ro", str(folder)], capture_output=True)
            if r.returncode != 0:
                pytest.skip("cannot remount the test file system read-only")
        elif os.geteuid() == 0:
            pytest.skip("running as root without permission to mount: root ignores a "
                        "folder's permission bits")
        else:
            os.chmod(folder, 0o555)
        before = path.read_bytes()
        with pytest.raises(ProjectError) as info:
            save(_project("new"), path)
        text = str(info.value.problems[0])  # named by field, the reason in words
        assert text.startswith("file: "), text
        assert text.endswith(("is read-only; give another file name or allow writing it",
                              *(os.strerror(e).lower() for e in
                                (errno.EACCES, errno.EROFS, errno.EPERM)))), text
        assert path.read_bytes() == before
        assert _leftovers(folder) == []
    finally:
        if mounted:
            _umount(folder)
        else:
            os.chmod(folder, 0o755)


def test_full_disk_keeps_the_old_file(tmp_path):
    folder = tmp_path / "small"
    folder.mkdir()
    if not _mount_tmpfs(folder, "size=64k"):
        pytest.skip("cannot mount a small tmpfs here (needs root and mount rights); the "
                    "full-disk case is then covered by the failed-rename test only")
    try:
        path = folder / "a.plystack.json"
        save(_project("old"), path)
        before = path.read_bytes()
        filler = folder / "filler"
        with pytest.raises(OSError):  # fill the file system to the last block
            with open(filler, "wb") as fh:
                while True:
                    fh.write(b"\0" * 4096)
                    fh.flush()
        big = _project("new " + "x" * 20_000)
        with pytest.raises(ProjectError) as info:
            save(big, path)
        assert str(info.value.problems[0]).endswith(os.strerror(errno.ENOSPC).lower())
        assert path.read_bytes() == before
        assert _leftovers(folder) == []
        filler.unlink()
        save(big, path)
        assert load(path).title.startswith("new ")
    finally:
        _umount(folder)


def test_write_bytes_refuses_empty_name():
    with pytest.raises(ProjectError, match="is empty"):
        write_bytes("", b"x", "-o/--output")


@pytest.mark.skipif(not hasattr(os, "geteuid") or os.geteuid() != 0,
                    reason="only root can give a file to another user")
def test_save_as_root_keeps_the_owner(tmp_path):
    path = tmp_path / "a.plystack.json"
    save(_project("old"), path)
    os.chown(path, 65534, 65534)
    save(_project("new"), path)
    info = path.stat()
    assert (info.st_uid, info.st_gid) == (65534, 65534)
    assert load(path).title == "new"


def test_missing_folder_is_named_by_the_field(tmp_path, capsys):
    target = tmp_path / "no such folder" / "x.pdf"
    with pytest.raises(ProjectError) as info:
        write_bytes(target, b"x", "-o/--output")
    assert str(info.value.problems[0]) == (
        f"-o/--output: {target}: the folder {target.parent} does not exist; create it or "
        "give another file name")
    demo = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"
    assert main(["sheet", str(demo), "-o", str(target)]) == 2
    err = capsys.readouterr().err
    assert "-o/--output:" in err and "does not exist" in err and "Errno" not in err
    assert not target.parent.exists()


def test_a_file_in_place_of_the_folder_is_named(tmp_path):
    (tmp_path / "plain").write_text("x")
    with pytest.raises(ProjectError, match="the folder .*plain is not a folder"):
        write_bytes(tmp_path / "plain" / "x.pdf", b"x", "-o")


def test_read_only_file_is_refused_not_replaced(tmp_path, monkeypatch):
    path = tmp_path / "kept.pdf"
    path.write_bytes(b"old")
    real = os.access
    # root may write any file: the refusal is tested through what the system answers
    monkeypatch.setattr(os, "access", lambda p, mode, **kw: False if Path(p) == path and
                        mode == os.W_OK else real(p, mode, **kw))
    with pytest.raises(ProjectError) as info:
        write_bytes(path, b"new", "-o/--output")
    assert str(info.value.problems[0]) == (f"-o/--output: {path} is read-only; give another "
                                           "file name or allow writing it")
    assert path.read_bytes() == b"old"
    assert _leftovers(tmp_path) == []


def test_read_only_file_is_refused_for_anyone(tmp_path):
    """Root may write any file; a file without write permission bits is still refused,
    as the README says."""
    path = tmp_path / "kept.pdf"
    path.write_bytes(b"old")
    os.chmod(path, 0o444)
    with pytest.raises(ProjectError, match="is read-only"):
        write_bytes(path, b"new", "-o")
    assert path.read_bytes() == b"old"


def test_sheets_folder_that_is_a_file_is_named(tmp_path, capsys):
    schedule = Path(__file__).resolve().parents[2] / "assets" / "demo" / "renovation-schedule.csv"
    plain = tmp_path / "plain.pdf"
    plain.write_text("x")
    assert main(["schedule", str(schedule), "--sheets", str(plain)]) == 2
    err = capsys.readouterr().err
    assert f"--sheets: {plain} is a file, not a folder; give a folder for the sheets" in err
