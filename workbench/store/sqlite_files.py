"""The SQLite job log's files on disk: telling a damaged file from one SQLite can recover, opening a
log read-only, naming a full disk, and tidying the side files a failed open leaves.

A log in WAL mode is up to three files: ``jobs.sqlite3``, ``jobs.sqlite3-wal`` (committed changes
not yet copied back) and ``jobs.sqlite3-shm`` (an index of the WAL). When a process dies, or the disk
fills, while a checkpoint copies the WAL back, the main file can be shorter than its header says -
and yet every job is safe in the WAL: SQLite replays it on the next open. So a short main file is
judged only after SQLite has had the chance to recover it (a read-only probe: ``PRAGMA quick_check``
through the WAL, which changes neither file), and refused only if that fails or there is no WAL.
"""

from __future__ import annotations

import errno
import os
import sqlite3
import urllib.parse
from dataclasses import dataclass
from pathlib import Path

SQLITE_MAGIC = b"SQLite format 3\x00"
WAL_HEADER_BYTES = 32
"""A WAL file holds frames only past its 32-byte header (SQLite file format, section 4.1)."""
FULL_DISK_MARGIN_BYTES = 256 * 1024
"""Below this much free space an 'I/O error' from SQLite is taken to mean the disk is full."""


class FileProblem(Exception):
    """The file cannot be used as it is; ``str(err)`` is the one-line reason (the caller names it)."""


def wal_file(path: Path) -> Path:
    """The WAL side file of the log at ``path``."""
    return path.with_name(path.name + "-wal")


def shm_file(path: Path) -> Path:
    """The shared-memory side file of the log at ``path``."""
    return path.with_name(path.name + "-shm")


def has_wal_frames(path: Path) -> bool:
    """True if a WAL file beside ``path`` holds at least one frame (committed or not)."""
    try:
        return wal_file(path).stat().st_size > WAL_HEADER_BYTES
    except OSError:
        return False


@dataclass(frozen=True)
class Header:
    """What the first 100 bytes of an SQLite file say about its size."""

    size: int
    page_size: int
    page_count: int
    count_valid: bool
    """The header's page count is trusted only when its change counters agree (file format 1.3.7)."""

    @property
    def short(self) -> bool:
        """True if the file is shorter than whole pages or than its header's page count."""
        expected = self.page_size * self.page_count
        return bool(self.size % self.page_size or (self.count_valid and self.page_count and self.size < expected))


def read_header(path: Path) -> Header | None:
    """The header of an SQLite file, None for an empty file; FileProblem if it is not SQLite."""
    try:
        size = path.stat().st_size
        if size == 0:
            return None
        with open(path, "rb") as handle:
            head = handle.read(100)
    except PermissionError:
        raise FileProblem("permission denied") from None
    except IsADirectoryError:
        raise FileProblem("folder") from None
    if len(head) < 100 or not head.startswith(SQLITE_MAGIC):
        raise FileProblem("not sqlite")
    page_size = int.from_bytes(head[16:18], "big")
    page_size = 65536 if page_size == 1 else page_size
    if page_size < 512 or page_size & (page_size - 1):
        raise FileProblem("not sqlite")
    return Header(size, page_size, int.from_bytes(head[28:32], "big"), head[24:28] == head[92:96])


def read_only_uri(path: Path, *, immutable: bool = False) -> str:
    """An ``sqlite3.connect(..., uri=True)`` name that opens ``path`` without writing to it."""
    name = urllib.parse.quote(str(path.resolve()))
    return f"file:{name}?mode=ro" + ("&immutable=1" if immutable else "")


def recoverable(path: Path) -> bool:
    """True if SQLite, reading through the WAL, finds the log whole (``PRAGMA quick_check`` ok).

    Opens read-only: neither the main file nor the WAL changes. A ``-shm`` file this probe had to
    create is removed again when the answer is no (a file left refused stays as it was found).
    """
    shm = shm_file(path)
    shm_was_there = shm.exists()
    ok = False
    try:
        conn = sqlite3.connect(read_only_uri(path), uri=True, timeout=1.0)
        try:
            ok = conn.execute("PRAGMA quick_check").fetchone()[0] == "ok"
        finally:
            conn.close()
    except sqlite3.Error:
        ok = False
    if not ok and not shm_was_there:
        remove_if_empty_or_ours(shm, ours=True)
    return ok


def remove_if_empty_or_ours(side: Path, *, ours: bool = False) -> None:
    """Remove a side file that is empty (nothing can be in it) or that this process just made."""
    try:
        if ours or side.stat().st_size == 0:
            side.unlink()
    except OSError:
        pass


def tidy_empty_side_files(path: Path, existed: tuple[bool, bool]) -> None:
    """After a failed open: remove a ``-wal``/``-shm`` that did not exist before and is still empty
    (a full disk leaves them at 0 bytes; an empty one holds nothing any process could need)."""
    for side, was_there in zip((wal_file(path), shm_file(path)), existed):
        if not was_there:
            try:
                if side.stat().st_size == 0:
                    side.unlink()
            except OSError:
                pass


def side_files_exist(path: Path) -> tuple[bool, bool]:
    """Whether the ``-wal`` and ``-shm`` files exist now (to tidy after a failure)."""
    return wal_file(path).exists(), shm_file(path).exists()


def disk_is_full(folder: Path) -> bool:
    """True if the file system holding ``folder`` has less than FULL_DISK_MARGIN_BYTES free."""
    try:
        stats = os.statvfs(folder)
    except (OSError, AttributeError):
        return False
    return stats.f_bavail * stats.f_frsize < FULL_DISK_MARGIN_BYTES


def is_full_disk_error(err: BaseException, folder: Path) -> bool:
    """True if an SQLite or OS error means the disk (or the file size limit) is full."""
    if isinstance(err, OSError):
        return err.errno in (errno.ENOSPC, errno.EDQUOT, errno.EFBIG)
    text = str(err).lower()
    if "full" in text and ("disk" in text or "database" in text):
        return True
    if "disk i/o error" in text or "i/o error" in text:
        return disk_is_full(folder)
    return False


def writable(path: Path) -> bool:
    """True if this process may write the log file and create its side files beside it."""
    return os.access(path, os.R_OK | os.W_OK) and os.access(path.parent, os.W_OK | os.X_OK)


def connect_read_only(path: Path, timeout: float) -> sqlite3.Connection:
    """A read-only connection to the log at ``path`` (a file or folder we may not write).

    Tried in order: ``mode=ro`` (reads the WAL too; needs a ``-shm`` it may have to create), then,
    only when there is no WAL to miss, ``immutable=1`` (no locks, no side files at all).
    """
    try:
        conn = sqlite3.connect(read_only_uri(path), uri=True, timeout=timeout, isolation_level=None)
        conn.execute("SELECT count(*) FROM sqlite_master").fetchone()
        return conn
    except sqlite3.Error:
        if has_wal_frames(path):
            raise
    return sqlite3.connect(read_only_uri(path, immutable=True), uri=True, timeout=timeout, isolation_level=None)
