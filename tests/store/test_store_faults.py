"""Faults: files that are not ours, damaged or newer logs, read-only places, kills and contention.

In every refusal the file must be left exactly as it was (same bytes, same modification time).
"""

from __future__ import annotations

import json
import os
import shutil
import signal
import sqlite3
import subprocess
import textwrap
import time
from pathlib import Path

import pytest
from store_helpers import JOB_INPUTS, PYTHON, result_for, subprocess_env

from workbench.store import JobLog, LogError


def _snapshot(path: Path) -> tuple[bytes, int]:
    return path.read_bytes(), path.stat().st_mtime_ns


def _make_log(path: Path, jobs: int = 3) -> None:
    with JobLog.open(path) as log:
        for i in range(jobs):
            log.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset=f"A-{i}")


def _refused_untouched(path: Path, match: str) -> str:
    before = _snapshot(path)
    time.sleep(0.01)
    with pytest.raises(LogError, match=match) as caught:
        JobLog.open(path)
    assert _snapshot(path) == before
    message = str(caught.value)
    assert "\n" not in message and str(path) in message
    return message


def test_a_file_that_is_not_sqlite_is_refused_untouched(tmp_path):
    path = tmp_path / "notes.txt"
    path.write_text("asset, torque\nCV-07, 150\n" * 20)
    _refused_untouched(path, "not a Shaftbench job log")


def test_a_short_non_sqlite_file_is_refused_untouched(tmp_path):
    path = tmp_path / "tiny.sqlite3"
    path.write_bytes(b"SQLite")
    _refused_untouched(path, "not a Shaftbench job log")


def test_a_truncated_log_is_refused_untouched(tmp_path):
    path = tmp_path / "jobs.sqlite3"
    _make_log(path, jobs=20)  # closing checkpoints the WAL into the file
    data = path.read_bytes()
    assert len(data) > 3 * 4096
    path.write_bytes(data[: len(data) // 2])
    _refused_untouched(path, "damaged")


def test_a_log_with_a_garbled_schema_page_is_refused_untouched(tmp_path):
    path = tmp_path / "jobs.sqlite3"
    _make_log(path)
    data = bytearray(path.read_bytes())
    data[100:1100] = os.urandom(1000)  # the b-tree header of page 1 (the schema table)
    path.write_bytes(bytes(data))
    _refused_untouched(path, "damaged|not a Shaftbench")


def test_a_log_from_a_newer_program_is_refused_untouched(tmp_path):
    path = tmp_path / "jobs.sqlite3"
    _make_log(path)
    conn = sqlite3.connect(path)
    conn.execute("PRAGMA user_version = 99")
    conn.commit()
    conn.close()
    message = _refused_untouched(path, "newer Shaftbench")
    assert "v99" in message


def test_another_programs_sqlite_file_is_refused_untouched(tmp_path):
    path = tmp_path / "inventory.db"
    conn = sqlite3.connect(path)
    conn.execute("CREATE TABLE parts (name TEXT)")
    conn.execute("INSERT INTO parts VALUES ('bearing 6205')")
    conn.commit()
    conn.close()
    _refused_untouched(path, "not a Shaftbench job log")


# --------------------------------------------------------------------------------------------
# read-only places. Root ignores permission bits, so as root the folder and file are made
# immutable (chattr +i), which binds root too.


def _make_read_only(paths: list[Path]) -> list[Path]:
    if os.geteuid() != 0:
        for path in paths:
            os.chmod(path, 0o555 if path.is_dir() else 0o444)
        return []
    if shutil.which("chattr") is None:
        pytest.skip("running as root without chattr: cannot make a read-only place")
    for path in paths:
        done = subprocess.run(["chattr", "+i", str(path)], capture_output=True, text=True)
        if done.returncode != 0:
            pytest.skip(f"chattr +i not supported here: {done.stderr.strip()}")
    return paths


def test_a_read_only_location_gives_a_clear_message_and_no_change(tmp_path):
    folder = tmp_path / "ro"
    folder.mkdir()
    existing = folder / "jobs.sqlite3"
    new = folder / "new.sqlite3"
    _make_log(existing)
    immutable = _make_read_only([existing, folder])
    try:
        before = _snapshot(existing)
        with JobLog.open(existing) as log:  # a read-only log can still be listed and exported
            assert log.read_only and log.count() == 3 and len(log.export_rows()) == 3
            with pytest.raises(LogError, match="read-only") as caught:
                log.save(dict(JOB_INPUTS["demo"]), result_for("demo"))
        assert str(existing) in str(caught.value)
        with pytest.raises(LogError, match="read-only") as caught:
            JobLog.open(new)
        assert str(new) in str(caught.value)
        assert _snapshot(existing) == before
        assert sorted(p.name for p in folder.iterdir()) == ["jobs.sqlite3"]
    finally:
        for path in reversed(immutable):
            subprocess.run(["chattr", "-i", str(path)], check=False)
        os.chmod(folder, 0o755)
        os.chmod(existing, 0o644)


# --------------------------------------------------------------------------------------------
# kill and contention

SAVER_CHILD = textwrap.dedent(
    """
    import json, sys, time
    from pathlib import Path
    from workbench.store import JobLog
    path, job_file, tag, count, go = sys.argv[1], sys.argv[2], sys.argv[3], int(sys.argv[4]), sys.argv[5]
    job = json.loads(Path(job_file).read_text())
    while go != "-" and not Path(go).exists():
        time.sleep(0.001)
    with JobLog.open(path) as log:
        for i in range(count):
            job_id = log.save(job["inputs"], job["result"], asset=f"{tag}-{i}")
            print(job_id, flush=True)
    """
)


def _job_file(tmp_path: Path) -> Path:
    job_file = tmp_path / "job.json"
    job_file.write_text(json.dumps({"inputs": JOB_INPUTS["demo"], "result": result_for("demo")}))
    return job_file


def test_sigkill_during_saves_loses_no_reported_save(tmp_path):
    path = tmp_path / "jobs.sqlite3"
    _make_log(path, jobs=0)
    child = subprocess.Popen(
        [PYTHON, "-c", SAVER_CHILD, str(path), str(_job_file(tmp_path)), "K", "100000", "-"],
        stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True, env=subprocess_env(),
    )
    reported: list[int] = []
    assert child.stdout is not None
    try:
        while len(reported) < 60:
            line = child.stdout.readline()
            assert line, child.stderr.read() if child.stderr else "child ended"
            reported.append(int(line))
    finally:
        child.send_signal(signal.SIGKILL)
        child.wait(timeout=30)
    assert child.returncode == -signal.SIGKILL
    with JobLog.open(path) as log:
        assert log.integrity_ok()
        stored = {r.id for r in log.search(limit=1_000_000)}
        assert set(reported) <= stored
        assert log.count() >= len(reported)


def test_two_processes_saving_at_once_lose_nothing(tmp_path):
    path = tmp_path / "jobs.sqlite3"
    _make_log(path, jobs=0)
    go = tmp_path / "go"
    per_child = 40
    children = [
        subprocess.Popen(
            [PYTHON, "-c", SAVER_CHILD, str(path), str(_job_file(tmp_path)), tag, str(per_child), str(go)],
            stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True, env=subprocess_env(),
        )
        for tag in ("P", "Q")
    ]
    time.sleep(0.5)  # both children are waiting at the barrier
    go.touch()
    outputs = [child.communicate(timeout=120) for child in children]
    for child, (out, err) in zip(children, outputs):
        assert child.returncode == 0, err
        assert "locked" not in err
        assert len(out.split()) == per_child
    with JobLog.open(path) as log:
        assert log.count() == 2 * per_child
        assert log.count(text="p-") == per_child and log.count(text="q-") == per_child
        assert log.integrity_ok()
