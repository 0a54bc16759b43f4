"""Fault injection at chosen moments: a save and the closing checkpoint cut short, a full disk, a lock
held past the busy timeout, a read-only log. Deterministic, not random:

- the closing checkpoint is cut by a file-size limit (``RLIMIT_FSIZE``) set in the child to the
  main file's size: SQLite copies WAL pages back in page order, page 1 (whose header holds the new
  page count) first, and the first write that would grow the file fails - with SIGXFSZ at its
  default the child is killed right there, with it ignored (as Python does) the write fails with
  EFBIG and the child carries on and reports its save;
- a save is cut by SIGKILL sent from SQLite's statement trace hook in the child, at the statement
  chosen (BEGIN, the INSERT, COMMIT) or right after the save returned.

Afterwards every reported save must be read back, and every file the tool refused is byte-identical.
"""

from __future__ import annotations

import json
import os
import resource
import signal
import sqlite3
import subprocess
import sys
import textwrap
import time
from pathlib import Path

import pytest
from store_helpers import JOB_INPUTS, PYTHON, result_for, subprocess_env

from workbench.store import JobLog, LogError
from workbench.store.sqlite_files import read_header, shm_file, wal_file


GROWS = "worn " * 800
"""A note long enough that saving it must grow the main file (stored jobs are compressed and small,
so a plain job can fit in pages the file already has, and the checkpoint would then never be cut)."""


FILLER = "keyseat fretted, bearing seat worn " * 60
"""Each made job's note: it keeps the main file larger than the WAL of one GROWS save."""


def _make_log(path: Path, jobs: int) -> None:
    with JobLog.open(path) as log:
        for i in range(jobs):
            log.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset=f"A-{i}", note=FILLER)


def _files(path: Path) -> dict[str, bytes]:
    return {p.name: p.read_bytes() for p in (path, wal_file(path)) if p.exists()}


def _cli(path: Path, *argv: str, limit: int | None = None, xfsz_kills: bool = False) -> subprocess.CompletedProcess[str]:
    """``shaftbench ARGV`` in a child; ``limit``: the child's largest file size in bytes."""

    def prepare() -> None:
        if limit is not None:
            resource.setrlimit(resource.RLIMIT_FSIZE, (limit, resource.RLIM_INFINITY))

    code = "import signal, sys\n"
    if xfsz_kills:
        code += "signal.signal(signal.SIGXFSZ, signal.SIG_DFL)\n"
    code += "from workbench.cli import main\nsys.exit(main(sys.argv[1:]))\n"
    env = {**subprocess_env(), "SHAFTBENCH_LOG": str(path), "COLUMNS": "100"}
    return subprocess.run([PYTHON, "-c", code, *argv], capture_output=True, text=True, env=env,
                          preexec_fn=prepare, timeout=120)


def _listed_ids(path: Path) -> list[int]:
    done = _cli(path, "log", "list", "--json", "--limit", "100000")
    assert done.returncode == 0, done.stderr
    assert "Traceback" not in done.stderr
    return sorted(job["id"] for job in json.loads(done.stdout))


def _checkpoint_was_cut(path: Path) -> bool:
    header = read_header(path)
    return header is not None and header.short and wal_file(path).stat().st_size > 32


# --------------------------------------------------------------------------------------------
# the closing checkpoint


def test_a_kill_during_the_closing_checkpoint_loses_nothing(tmp_path):
    path = tmp_path / "jobs.sqlite3"
    _make_log(path, 40)
    done = _cli(path, "check", "--demo", "--save", "--note", GROWS, limit=path.stat().st_size, xfsz_kills=True)
    assert done.returncode == -signal.SIGXFSZ, done.stderr  # killed inside the checkpoint
    assert _checkpoint_was_cut(path), "the fault did not hit the checkpoint"
    # SQLite recovers the WAL: all 40 jobs and the one committed before the kill are there
    assert _listed_ids(path) == list(range(1, 42))
    with JobLog.open(path) as log:
        assert log.integrity_ok()
    header = read_header(path)
    assert header is not None and not header.short  # the next close finished the checkpoint


def test_a_save_reported_while_its_checkpoint_failed_is_read_back(tmp_path):
    path = tmp_path / "jobs.sqlite3"
    _make_log(path, 40)
    done = _cli(path, "check", "--demo", "--save", "--note", GROWS, limit=path.stat().st_size)
    assert done.returncode == 0, done.stderr
    assert "saved as job 41" in done.stdout
    assert _checkpoint_was_cut(path)
    assert 41 in _listed_ids(path)
    done = _cli(path, "log", "show", "41", "--json")
    assert done.returncode == 0 and json.loads(done.stdout)["id"] == 41


def test_a_truncated_log_without_a_wal_is_refused_byte_identical(tmp_path):
    path = tmp_path / "jobs.sqlite3"
    _make_log(path, 20)
    data = path.read_bytes()
    path.write_bytes(data[: len(data) // 2])
    before = _files(path)
    done = _cli(path, "log", "list")
    assert done.returncode == 2 and "damaged" in done.stderr and done.stderr.count("\n") == 1
    assert _files(path) == before
    assert not wal_file(path).exists() and not shm_file(path).exists()


def test_a_truncated_log_its_wal_cannot_cover_is_refused_byte_identical(tmp_path):
    path = tmp_path / "jobs.sqlite3"
    _make_log(path, 40)
    done = _cli(path, "check", "--demo", "--save", "--note", GROWS, limit=path.stat().st_size)  # leaves a WAL
    assert done.returncode == 0 and wal_file(path).exists()
    data = path.read_bytes()
    path.write_bytes(data[: 4096 * 8])  # cut far below what the WAL holds: pages are gone for good
    before = _files(path)
    done = _cli(path, "log", "list")
    assert done.returncode == 2 and "damaged" in done.stderr, done.stderr
    assert _files(path) == before


# --------------------------------------------------------------------------------------------
# a save cut at chosen statements

KILLED_SAVER = textwrap.dedent(
    """
    import json, os, signal, sys
    from pathlib import Path
    from workbench.store import JobLog
    path, job_file, moment = sys.argv[1], sys.argv[2], sys.argv[3]
    job = json.loads(Path(job_file).read_text())

    def trace(statement):
        if moment != "after" and statement.lstrip().upper().startswith(moment):
            os.kill(os.getpid(), signal.SIGKILL)

    log = JobLog.open(path)
    log.conn.set_trace_callback(trace)
    job_id = log.save(job["inputs"], job["result"], asset="cut")
    print(job_id, flush=True)
    if moment == "after":
        os.kill(os.getpid(), signal.SIGKILL)
    """
)


@pytest.mark.parametrize("moment, kept", [
    ("BEGIN", False), ("INSERT", False), ("COMMIT", False), ("after", True),
])
def test_a_save_killed_at_a_chosen_statement(tmp_path, moment, kept):
    path = tmp_path / "jobs.sqlite3"
    _make_log(path, 5)
    job_file = tmp_path / "job.json"
    job_file.write_text(json.dumps({"inputs": JOB_INPUTS["demo"], "result": result_for("demo")}))
    done = subprocess.run([PYTHON, "-c", KILLED_SAVER, str(path), str(job_file), moment],
                          capture_output=True, text=True, env=subprocess_env(), timeout=60)
    assert done.returncode == -signal.SIGKILL, done.stderr
    reported = [int(x) for x in done.stdout.split()]
    assert bool(reported) == kept
    with JobLog.open(path) as log:
        assert log.integrity_ok()
        ids = [r.id for r in log.search(limit=100)]
        assert (6 in ids) == kept and len(ids) == 5 + kept
        assert set(reported) <= set(ids)


# --------------------------------------------------------------------------------------------
# a full disk


def _small_disk(tmp_path: Path, size_kib: int) -> Path:
    mount = tmp_path / "small"
    mount.mkdir()
    if os.geteuid() != 0:
        pytest.skip("a small file system needs root (mount -t tmpfs)")
    done = subprocess.run(["mount", "-t", "tmpfs", "-o", f"size={size_kib}k", "tmpfs", str(mount)],
                          capture_output=True, text=True)
    if done.returncode != 0:
        pytest.skip(f"cannot mount a small file system here: {done.stderr.strip()}")
    return mount


@pytest.fixture
def small_disk(tmp_path):
    mounts: list[Path] = []

    def make(size_kib: int) -> Path:
        mount = _small_disk(tmp_path, size_kib)
        mounts.append(mount)
        return mount

    yield make
    for mount in mounts:
        subprocess.run(["umount", "-l", str(mount)], check=False)


def _fill_disk(folder: Path, keep_free: int) -> None:
    """Write a filler file until only about ``keep_free`` bytes are left."""
    stats = os.statvfs(folder)
    free = stats.f_bavail * stats.f_frsize
    with open(folder / "filler", "wb") as out:
        out.write(b"\0" * max(0, free - keep_free))
    # tmpfs counts whole pages; write more in small steps until the margin is reached
    with open(folder / "filler", "ab") as out:
        while os.statvfs(folder).f_bavail * os.statvfs(folder).f_frsize > keep_free:
            try:
                out.write(b"\0" * 4096)
                out.flush()
            except OSError:
                break


def test_saves_onto_a_filling_disk_are_kept_or_refused_clearly(small_disk):
    # (the log is made with 8 KiB pages: it needs about twice the room it needed with 4 KiB)
    folder = small_disk(2048)
    path = folder / "jobs.sqlite3"
    _make_log(path, 10)
    _fill_disk(folder, 80 * 1024)
    reported: list[int] = []
    refused = 0
    for _ in range(12):
        done = _cli(path, "check", "--demo", "--save")
        assert "Traceback" not in done.stderr
        if done.returncode == 0:
            reported.append(int(done.stdout.rsplit("saved as job", 1)[1].split()[0]))
        else:
            assert done.returncode == 2 and "disk holding the job log" in done.stderr and "full" in done.stderr
            assert done.stderr.count("\n") == 1
            refused += 1
    assert refused, "the disk never filled"
    (folder / "filler").unlink()
    listed = _listed_ids(path)
    assert set(reported) <= set(listed) and len(listed) == 10 + len(reported)


def test_a_full_disk_leaves_no_empty_side_files(small_disk):
    folder = small_disk(1024)
    path = folder / "jobs.sqlite3"
    _make_log(path, 3)
    assert not wal_file(path).exists()
    _fill_disk(folder, 0)
    before = _files(path)
    done = _cli(path, "check", "--demo", "--save")
    assert done.returncode == 2 and "full" in done.stderr and "Traceback" not in done.stderr
    assert _files(path) == before
    for side in (wal_file(path), shm_file(path)):
        assert not side.exists() or side.stat().st_size > 0


# --------------------------------------------------------------------------------------------
# a lock held past the busy timeout

LOCK_HOLDER = textwrap.dedent(
    """
    import sqlite3, sys, time
    conn = sqlite3.connect(sys.argv[1], isolation_level=None)
    conn.execute("BEGIN IMMEDIATE")
    print("held", flush=True)
    sys.stdin.readline()
    conn.execute("ROLLBACK")
    """
)


def test_a_lock_held_past_the_busy_timeout_is_one_message_and_loses_nothing(tmp_path, monkeypatch):
    import workbench.store.sqlite_log as log_module

    path = tmp_path / "jobs.sqlite3"
    _make_log(path, 3)
    holder = subprocess.Popen([PYTHON, "-c", LOCK_HOLDER, str(path)], stdin=subprocess.PIPE,
                              stdout=subprocess.PIPE, text=True)
    try:
        assert holder.stdout is not None and holder.stdout.readline().strip() == "held"
        monkeypatch.setattr(log_module, "BUSY_TIMEOUT_S", 0.3)
        started = time.monotonic()
        with JobLog.open(path) as log:
            with pytest.raises(LogError, match="busy") as caught:
                log.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset="late")
            assert "\n" not in str(caught.value)
            assert log.count() == 3  # reading still works under a writer's lock (WAL)
        assert time.monotonic() - started < 5
    finally:
        assert holder.stdin is not None
        holder.stdin.write("\n")
        holder.stdin.flush()
        holder.wait(timeout=30)
    with JobLog.open(path) as log:
        assert log.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset="now") == 4
        assert log.integrity_ok()


# --------------------------------------------------------------------------------------------
# a read-only log


def test_a_read_only_log_can_be_listed_and_exported(tmp_path, monkeypatch):
    path = tmp_path / "jobs.sqlite3"
    _make_log(path, 3)
    before = _files(path)
    real_access = os.access

    def no_writes(target, mode, *args, **kwargs):  # what a read-only mount or file answers
        if mode & os.W_OK and Path(target).resolve() in (path.resolve(), path.parent.resolve()):
            return False
        return real_access(target, mode, *args, **kwargs)

    monkeypatch.setattr(os, "access", no_writes)
    with JobLog.open(path, create=False) as log:
        assert log.count() == 3 and len(log.export_rows()) == 3
        with pytest.raises(LogError, match="read-only"):
            log.save(dict(JOB_INPUTS["demo"]), result_for("demo"))
    assert path.read_bytes() == before[path.name]  # SQLite may add an empty -wal beside it, no more
    assert not wal_file(path).exists() or wal_file(path).stat().st_size == 0


def test_a_log_on_a_read_only_mount_lists_and_exports(tmp_path, small_disk):
    folder = small_disk(2048)
    path = folder / "jobs.sqlite3"
    _make_log(path, 3)
    done = subprocess.run(["mount", "-o", "remount,ro", str(folder)], capture_output=True, text=True)
    if done.returncode != 0:
        pytest.skip(f"cannot remount read-only here: {done.stderr.strip()}")
    assert _listed_ids(path) == [1, 2, 3]
    done = _cli(path, "log", "export", "--format", "json")
    assert done.returncode == 0 and len(json.loads(done.stdout)) == 3
    done = _cli(path, "check", "--demo", "--save")
    assert done.returncode == 2 and "read-only" in done.stderr and done.stderr.count("\n") == 1
