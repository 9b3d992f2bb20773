"""Writing files so that a failed write never destroys what was there.

The text goes to a temporary file in the target's folder, is flushed to disk, and is
renamed over the target. A symbolic link is followed, so its target is replaced and
the link stays; an existing file keeps its permission bits (and its owner where the
user may give it, as root may); a new file gets the mode the user's umask gives; a FIFO,
device or folder is refused rather than replaced. Other hard links of the file keep the
old text: the name saved to is given a new file. A file the user may not write (read-only)
is refused rather than replaced, as writing it in place would be; so is a folder that
does not exist or cannot be written into. Each refusal names the field.
"""

from __future__ import annotations

import os
import stat
import tempfile
from pathlib import Path

from ..model.errors import Problem, ProjectError


def _current_umask() -> int:
    mask = os.umask(0)
    os.umask(mask)
    return mask


def _target(path: str | os.PathLike[str], field: str) -> Path:
    raw = os.fspath(path)
    if not raw:
        raise ProjectError(Problem(field, "is empty: give a file name"))
    target = Path(raw)
    if target.is_symlink():
        target = Path(os.path.realpath(target))
    if target.exists() and not target.is_file():
        kind = "a folder" if target.is_dir() else "not a regular file (a FIFO or device)"
        raise ProjectError(Problem(field, f"{raw} is {kind}; give the name of a file"))
    folder = target.parent if str(target.parent) else Path(".")
    if not folder.is_dir():
        what = "is not a folder" if folder.exists() else "does not exist"
        raise ProjectError(Problem(field, f"{raw}: the folder {folder} {what}; create it or "
                                   "give another file name"))
    if target.exists() and (not os.access(target, os.W_OK)
                            or not target.stat().st_mode & 0o222):  # root too is refused
        raise ProjectError(Problem(field, f"{raw} is read-only; give another file name or "
                                   "allow writing it"))
    return target


def _refused(field: str, raw: str, exc: OSError) -> ProjectError:
    """An operating-system fault of a write, named by field and in words."""
    reason = exc.strerror or str(exc) or "the system refused it"
    return ProjectError(Problem(field, f"cannot write {raw}: {reason.lower()}"))


def output_folder(directory: str | os.PathLike[str], field: str, what: str = "the files"
                  ) -> Path:
    """The output folder, made where it does not exist; a named problem where it cannot be
    (``what``: what goes into it, for the message).
    """
    folder = Path(directory)
    raw = os.fspath(directory)
    if not raw:
        raise ProjectError(Problem(field, "is empty: give a folder name"))
    if folder.exists() and not folder.is_dir():
        raise ProjectError(Problem(field, f"{raw} is a file, not a folder; give a folder "
                                   f"for {what}"))
    try:
        folder.mkdir(parents=True, exist_ok=True)
    except OSError as exc:
        reason = (exc.strerror or "the system refused it").lower()
        raise ProjectError(Problem(field, f"{raw}: the folder cannot be made ({reason})")
                           ) from None
    return folder


def write_bytes(path: str | os.PathLike[str], data: bytes, field: str = "output") -> None:
    """Write ``data`` to ``path`` atomically (see the module's description)."""
    target = _target(path, field)
    folder = target.parent if str(target.parent) else Path(".")
    owner: tuple[int, int] | None = None
    try:
        info = target.stat()
        mode = stat.S_IMODE(info.st_mode)
        owner = (info.st_uid, info.st_gid)
    except FileNotFoundError:
        mode = 0o666 & ~_current_umask()
    try:
        fd, tmp = tempfile.mkstemp(prefix=f".{target.name}.", suffix=".tmp", dir=str(folder))
    except OSError as exc:  # a folder the user may not write into, a full disk
        raise _refused(field, os.fspath(path), exc) from None
    try:
        with os.fdopen(fd, "wb") as fh:
            fh.write(data)
            fh.flush()
            os.fsync(fh.fileno())
        os.chmod(tmp, mode)
        _keep_owner(tmp, owner)
        os.replace(tmp, target)
        _sync_folder(folder)
    except BaseException as exc:
        try:
            os.unlink(tmp)
        except OSError:
            pass
        if isinstance(exc, OSError):
            raise _refused(field, os.fspath(path), exc) from None
        raise


def _sync_folder(folder: Path) -> None:
    """Flush the rename to disk where the system allows opening a folder (POSIX)."""
    try:
        fd = os.open(folder, os.O_RDONLY)
    except OSError:
        return
    try:
        os.fsync(fd)
    except OSError:
        pass
    finally:
        os.close(fd)


def _keep_owner(tmp: str, owner: tuple[int, int] | None) -> None:
    """Give the new file the old one's owner and group where they differ and the user may
    (a save by root keeps the user's ownership; others cannot give files away).
    """
    if owner is None or not hasattr(os, "chown"):
        return
    info = os.stat(tmp)
    if (info.st_uid, info.st_gid) == owner:
        return
    try:
        os.chown(tmp, *owner)
    except OSError:
        pass


def write_text(path: str | os.PathLike[str], text: str, field: str = "output") -> None:
    """Write UTF-8 ``text`` atomically; text that cannot be encoded is a named problem."""
    try:
        data = text.encode("utf-8")
    except UnicodeEncodeError as exc:
        raise ProjectError(Problem(field, "holds a character that cannot be written as UTF-8 "
                                   f"(position {exc.start}); remove it")) from None
    write_bytes(path, data, field)


def write_text_new(path: str | os.PathLike[str], text: str, field: str = "output") -> None:
    """Write ``text`` to a file that must not exist yet."""
    if os.path.lexists(os.fspath(path)):
        raise ProjectError(Problem(field, f"{os.fspath(path)} exists already; give a new "
                                   "file name"))
    write_text(path, text, field)
