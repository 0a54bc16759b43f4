"""The CLI as a hostile user drives it from a shell: closed pipes, full disks, device and symlink
targets, numbers past what SQLite holds, empty log names, huge values. Each ends in exit 0 or one
line and exit 2 - never a traceback, never "Exception ignored"."""

from __future__ import annotations

import os
import stat
import subprocess
import sys
from pathlib import Path

import pytest

BAD_SIGNS = ("Traceback", "Exception ignored", "Error:")


def shell(command: str, log: Path | None, **env: str) -> subprocess.CompletedProcess[str]:
    """Run ``command`` in sh with ``shaftbench`` meaning this interpreter's ``-m workbench``."""
    environment = {**os.environ, **env}
    if log is not None:
        environment["SHAFTBENCH_LOG"] = str(log)
    environment["SB"] = f"{sys.executable} -m workbench"
    return subprocess.run(["sh", "-c", command], capture_output=True, text=True, env=environment, timeout=120)


def clean(done: subprocess.CompletedProcess[str]) -> None:
    for sign in BAD_SIGNS:
        assert sign not in done.stderr, done.stderr


@pytest.fixture(scope="module")
def saved_log(tmp_path_factory) -> Path:
    log = tmp_path_factory.mktemp("hostile") / "jobs.sqlite3"
    for n in range(3):
        done = shell(f"$SB check --demo --save --asset 'CV-0{n}'", log)
        assert done.returncode == 0, done.stderr
    return log


def test_check_json_into_a_pipe_closed_at_once(tmp_path):
    done = shell("$SB check --demo --json | head -c 0", None)
    clean(done)


def test_export_into_a_closed_pipe_is_quiet(saved_log):
    done = shell("$SB log export --format json | head -c 1 >/dev/null", saved_log)
    clean(done)


@pytest.mark.skipif(not Path("/dev/full").exists(), reason="no /dev/full on this system")
def test_export_to_a_full_disk_is_one_line(saved_log):
    done = shell("$SB log export > /dev/full", saved_log)
    clean(done)
    assert done.returncode == 2
    lines = done.stderr.strip().splitlines()
    assert len(lines) == 1 and "full" in lines[0]


@pytest.mark.skipif(not Path("/dev/full").exists(), reason="no /dev/full on this system")
def test_export_o_dev_full_keeps_the_device(saved_log):
    done = shell("$SB log export -o /dev/full", saved_log)
    clean(done)
    assert done.returncode == 2 and "disk is full" in done.stderr
    assert stat.S_ISCHR(os.stat("/dev/full").st_mode)


def test_export_o_dev_stdout_reaches_the_pipe(saved_log):
    done = shell("$SB log export --format json -o /dev/stdout | cat", saved_log)
    clean(done)
    assert done.returncode == 0 and '"CV-02"' in done.stdout


def test_card_o_through_a_symlink_keeps_the_link(saved_log, tmp_path):
    real = tmp_path / "card.txt"
    real.write_text("old card")
    link = tmp_path / "latest.txt"
    link.symlink_to(real)
    done = shell(f"$SB log card 1 -o '{link}'", saved_log)
    clean(done)
    assert done.returncode == 0
    assert link.is_symlink() and "job 1" in real.read_text()
    assert not [p for p in tmp_path.iterdir() if p.name.endswith(".part")]


@pytest.mark.parametrize("command, words", [
    ("log show 9223372036854775808", "log show --help"),
    ("log show 99999999999999999999999999999999999999999", "job number"),
    ("log delete -1", "job number"),
    ("log list --limit 0", "--limit"),
    ("log show 1 --no-such-option", "shaftbench log show --help"),
    ("log list --log ''", "--log"),
    ("log list --since 'not a date'", "since"),
])
def test_bad_numbers_and_options_are_one_line(saved_log, command, words):
    done = shell(f"$SB {command}", saved_log)
    clean(done)
    assert done.returncode == 2
    lines = done.stderr.strip().splitlines()
    assert len(lines) == 1 and words in lines[0]


def test_a_huge_limit_means_every_job(saved_log):
    done = shell("$SB log list --limit 9223372036854775808000", saved_log)
    clean(done)
    assert done.returncode == 0 and "3 of 3 jobs" in done.stdout


def test_an_empty_shaftbench_log_is_refused(tmp_path):
    done = shell("$SB log list", None, SHAFTBENCH_LOG="")
    clean(done)
    assert done.returncode == 2 and "SHAFTBENCH_LOG" in done.stderr
    done = shell("$SB check --demo --save", None, SHAFTBENCH_LOG="")
    assert done.returncode == 2 and "SHAFTBENCH_LOG" in done.stderr


def test_a_pasted_100_kb_value_is_not_echoed_whole(tmp_path):
    huge = "9" * 100_000
    done = shell(f"$SB check --demo --power {huge}", tmp_path / "jobs.sqlite3")
    clean(done)
    assert done.returncode == 2
    assert len(done.stderr) < 1000 and done.stderr.count("\n") == 1
