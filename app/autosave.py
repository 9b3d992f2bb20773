"""Autosaves keyed to the document they belong to, and locks that flag a file open in
another running Plystack.

Every file lives in one folder (the platform's application-data folder):

- ``<key>.<tag>.plystack.json``: the autosaved project (a normal project file);
- ``<key>.<tag>.meta.json``: what it belongs to: the document's full path (None while
  untitled), the process id and start time of the instance that wrote it, the time;
- ``<key>.<tag>.lock``: written while an instance has the document open (same fields).

``key`` is a hash of the document's full path (symbolic links resolved, so two names of
one file share it) or ``untitled``; ``tag`` is ``<pid>-<window serial>``, so two
instances, or two windows of one instance, never write the same files. An autosave is
offered only to a window opening the same document, and only when the instance that
wrote it is no longer running; a running instance's files are never offered nor deleted.
Autosaves written before this scheme (named after the file only) cannot be matched to a
document: they are offered only to untitled windows when named ``untitled*``, and
otherwise left alone.
"""

from __future__ import annotations

import hashlib
import itertools
import json
import os
import socket
import sys
import time
from dataclasses import dataclass
from pathlib import Path

_serial = itertools.count(1)
UNTITLED = "untitled"


def document_key(path: Path | None) -> str:
    """The key of a document: a hash of its full path (links resolved), or ``untitled``."""
    if path is None:
        return UNTITLED
    full = os.path.realpath(os.path.abspath(os.fspath(path)))
    return hashlib.sha256(full.encode("utf-8", "surrogatepass")).hexdigest()[:20]


def process_start(pid: int) -> str | None:
    """When process ``pid`` started (Linux: clock ticks after boot), None if unknown."""
    try:
        text = Path(f"/proc/{pid}/stat").read_text()
    except OSError:
        return None
    fields = text.rsplit(")", 1)[-1].split()
    return fields[19] if len(fields) > 19 else None


def _windows_alive(pid: int) -> bool:
    import ctypes

    kernel = ctypes.windll.kernel32  # type: ignore[attr-defined]
    handle = kernel.OpenProcess(0x1000, False, pid)  # PROCESS_QUERY_LIMITED_INFORMATION
    if not handle:
        return False
    code = ctypes.c_ulong()
    ok = kernel.GetExitCodeProcess(handle, ctypes.byref(code))
    kernel.CloseHandle(handle)
    return bool(ok) and code.value == 259  # STILL_ACTIVE


def instance_alive(meta: dict[str, object]) -> bool:
    """True when the instance that wrote ``meta`` may still run (unknown counts as
    running, so that its files are never taken from it).
    """
    pid = meta.get("pid")
    if not isinstance(pid, int) or pid <= 0:
        return False
    if meta.get("host") not in (None, socket.gethostname()):
        return True
    if pid == os.getpid():
        return meta.get("started") in (None, process_start(pid))
    if sys.platform.startswith("win"):
        return _windows_alive(pid)
    try:
        os.kill(pid, 0)
    except ProcessLookupError:
        return False
    except PermissionError:
        pass
    except OSError:
        return True
    started = meta.get("started")
    return started is None or process_start(pid) in (None, started)


@dataclass(frozen=True)
class Found:
    """An autosave left by an instance that no longer runs."""

    project_file: Path
    meta_file: Path | None
    document: str | None
    written: str


def _read_meta(path: Path) -> dict[str, object] | None:
    try:
        data = json.loads(path.read_text(encoding="utf-8"))
    except (OSError, ValueError):
        return None
    return data if isinstance(data, dict) else None


class AutosaveStore:
    """The autosave, meta and lock files of one window."""

    def __init__(self, folder: Path):
        self.folder = folder
        self.tag = f"{os.getpid()}-{next(_serial)}"
        self._locked: str | None = None

    def _meta(self, path: Path | None) -> dict[str, object]:
        return {"document": None if path is None else os.path.abspath(os.fspath(path)),
                "pid": os.getpid(), "started": process_start(os.getpid()),
                "host": socket.gethostname(),
                "time": time.strftime("%Y-%m-%d %H:%M:%S")}

    def files(self, path: Path | None) -> tuple[Path, Path, Path]:
        """The autosave, meta and lock file of this window for document ``path``."""
        stem = f"{document_key(path)}.{self.tag}"
        return (self.folder / f"{stem}.plystack.json", self.folder / f"{stem}.meta.json",
                self.folder / f"{stem}.lock")

    def _write(self, target: Path, text: str) -> None:
        self.folder.mkdir(parents=True, exist_ok=True)
        tmp = target.with_name(f".{target.name}.tmp")
        tmp.write_text(text, encoding="utf-8", errors="surrogateescape")
        os.replace(tmp, target)

    def write(self, path: Path | None, project_text: str) -> Path:
        """Autosave ``project_text`` for document ``path``; returns the project file."""
        project_file, meta_file, _ = self.files(path)
        self._write(project_file, project_text)
        self._write(meta_file, json.dumps(self._meta(path)))
        return project_file

    def clear(self, path: Path | None) -> None:
        """Remove this window's autosave of document ``path``."""
        project_file, meta_file, _ = self.files(path)
        for f in (project_file, meta_file):
            try:
                f.unlink(missing_ok=True)
            except OSError:
                pass

    def lock(self, path: Path | None) -> None:
        """Mark document ``path`` as open in this window (releases the previous one)."""
        self.unlock()
        if path is None:
            return
        _, _, lock_file = self.files(path)
        try:
            self._write(lock_file, json.dumps(self._meta(path)))
        except OSError:
            return
        self._locked = os.fspath(lock_file)

    def unlock(self) -> None:
        """Release this window's lock."""
        if self._locked is not None:
            try:
                os.unlink(self._locked)
            except OSError:
                pass
            self._locked = None

    def other_instances(self, path: Path | None) -> list[int]:
        """Process ids of other running windows that have document ``path`` open."""
        if path is None or not self.folder.is_dir():
            return []
        own = self.files(path)[2]
        pids = []
        for f in sorted(self.folder.glob(f"{document_key(path)}.*.lock")):
            meta = _read_meta(f)
            if f == own or meta is None:
                continue
            if instance_alive(meta):
                pids.append(int(meta["pid"]))  # type: ignore[call-overload]
            else:
                f.unlink(missing_ok=True)  # a stale lock of an instance that died
        return pids

    def left_behind(self, path: Path | None) -> list[Found]:
        """Autosaves of document ``path`` whose instance no longer runs."""
        if not self.folder.is_dir():
            return []
        key = document_key(path)
        found = []
        for f in sorted(self.folder.glob("*.json")):
            if f.name.endswith(".meta.json"):
                continue
            meta_file = f.with_name(f.name.removesuffix(".plystack.json") + ".meta.json")
            meta = _read_meta(meta_file) if meta_file.exists() else None
            if meta is None:
                if path is None and f.name.startswith(UNTITLED) and not meta_file.exists():
                    found.append(Found(f, None, None, "an earlier version of Plystack"))
                continue
            if not f.name.startswith(f"{key}.") or instance_alive(meta):
                continue
            if f.name.startswith(f"{key}.{self.tag}."):
                continue
            found.append(Found(f, meta_file, meta.get("document"),  # type: ignore[arg-type]
                               str(meta.get("time", "?"))))
        return found

    @staticmethod
    def discard(found: Found) -> None:
        """Delete an autosave left behind (the user declined it, or it was recovered)."""
        for f in (found.project_file, found.meta_file):
            if f is not None:
                try:
                    f.unlink(missing_ok=True)
                except OSError:
                    pass
