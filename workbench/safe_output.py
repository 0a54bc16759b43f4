"""Writing an output file a person named (``log export -o``, ``log card -o``) without harming it.

The rule, by what the path names (symlinks followed, the link itself never replaced):

- a regular file, or nothing yet: the text goes to a temporary ``.NAME.XXXX.part`` file beside it,
  is flushed to disk, then renamed over the target in one step (``os.replace``), so a reader sees
  the old file or the whole new one, never half of it. An existing file keeps its permission bits;
  a new file gets the usual ``0666`` less the umask. A symlink to a regular file has its *target*
  replaced; the link stays a link.
- a device, a pipe (FIFO) or anything under ``/dev`` or ``/proc`` (``/dev/stdout``, ``/dev/null``):
  written straight, opened without creating or truncating anything, so the device stays a device.
- a folder, or a socket: refused with a message.

On every failure (the disk fills, the rename fails, Ctrl+C) the temporary file is removed and the
target is left as it was. Failures are raised as :class:`OutputError` with a one-line message.
"""

from __future__ import annotations

import errno
import os
import stat
import tempfile
from collections.abc import Iterator
from contextlib import contextmanager
from pathlib import Path
from typing import IO

_STRAIGHT_ROOTS = ("/dev/", "/proc/")


class OutputError(Exception):
    """An output file could not be written; ``str(err)`` is one line naming the file."""


def describe_os_error(err: OSError) -> str:
    """A short phrase for an OS error a person can act on (full disk, permission, ...)."""
    if err.errno == errno.ENOSPC:
        return "the disk is full"
    if err.errno == errno.EDQUOT:
        return "the disk quota is used up"
    if err.errno in (errno.EACCES, errno.EPERM):
        return "permission denied"
    if err.errno == errno.EROFS:
        return "the file system is read-only"
    if err.errno == errno.ENOENT:
        return "the folder does not exist"
    if err.errno == errno.EISDIR:
        return "it is a folder"
    if err.errno == errno.EPIPE:
        return "the reader closed the pipe"
    return err.strerror or str(err)


def _is_straight(path: Path) -> bool:
    """True if ``path`` must be written in place: a device, a pipe or a path under /dev or /proc."""
    text = os.path.abspath(path)
    if any(text.startswith(root) for root in _STRAIGHT_ROOTS):
        return True
    try:
        mode = os.stat(path).st_mode
    except FileNotFoundError:
        return False
    return stat.S_ISCHR(mode) or stat.S_ISBLK(mode) or stat.S_ISFIFO(mode)


def _umask_mode() -> int:
    mask = os.umask(0)
    os.umask(mask)
    return 0o666 & ~mask


@contextmanager
def open_output(path: str | os.PathLike[str], *, encoding: str = "utf-8", newline: str = "") -> Iterator[IO[str]]:
    """A text stream for ``path`` following the module's rule; committed when the block ends.

    >>> with open_output("jobs.csv") as out:    # doctest: +SKIP
    ...     out.write("id,asset\\n")
    """
    target = Path(path)
    if str(path) == "":
        raise OutputError("the output file name is empty")
    if _is_straight(target):
        yield from _straight(target, encoding, newline)
        return
    real = Path(os.path.realpath(target))
    try:
        existing = os.stat(real)
    except FileNotFoundError:
        existing = None
    except OSError as err:
        raise OutputError(f"cannot write {target}: {describe_os_error(err)}") from None
    if existing is not None:
        if stat.S_ISDIR(existing.st_mode):
            raise OutputError(f"cannot write {target}: it is a folder")
        if not stat.S_ISREG(existing.st_mode):
            raise OutputError(f"cannot write {target}: it is not a regular file, a device or a pipe")
    mode = stat.S_IMODE(existing.st_mode) if existing is not None else _umask_mode()
    try:
        fd, temp_name = tempfile.mkstemp(prefix=f".{real.name}.", suffix=".part", dir=real.parent)
    except OSError as err:
        raise OutputError(f"cannot write {target}: {describe_os_error(err)}") from None
    temp = Path(temp_name)
    try:
        with os.fdopen(fd, "w", encoding=encoding, newline=newline) as out:
            yield out
            out.flush()
            os.fsync(out.fileno())
        os.chmod(temp, mode)
        os.replace(temp, real)
    except OSError as err:
        _remove(temp)
        raise OutputError(f"cannot write {target}: {describe_os_error(err)}; it was left as it was") from None
    except BaseException:
        _remove(temp)
        raise


def _straight(target: Path, encoding: str, newline: str) -> Iterator[IO[str]]:
    """Write a device or pipe in place (no create, no truncate: O_APPEND keeps what a shell's
    ``>>`` redirection put before us when ``/dev/stdout`` is a file)."""
    try:
        fd = os.open(target, os.O_WRONLY | os.O_APPEND | getattr(os, "O_NOCTTY", 0))
    except OSError as err:
        raise OutputError(f"cannot write {target}: {describe_os_error(err)}") from None
    out = os.fdopen(fd, "w", encoding=encoding, newline=newline)
    try:
        yield out
        out.flush()
    except OSError as err:
        raise OutputError(f"cannot write {target}: {describe_os_error(err)}") from None
    finally:
        try:
            out.close()
        except OSError:
            pass  # the flush above already reported it


def _remove(temp: Path) -> None:
    try:
        temp.unlink()
    except FileNotFoundError:
        pass
    except OSError:
        pass  # nothing more can be done; the message names the target


def write_output(path: str | os.PathLike[str], text: str) -> None:
    """Write ``text`` to ``path`` following the module's rule (see :func:`open_output`)."""
    with open_output(path) as out:
        out.write(text)
