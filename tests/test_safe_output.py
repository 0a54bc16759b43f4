"""Output files a person names: regular files replaced whole, devices and pipes written in place,
symlinks and devices never replaced, nothing left behind on a failure."""

from __future__ import annotations

import os
import stat
import threading
from pathlib import Path

import pytest

from workbench.safe_output import OutputError, open_output, write_output


def _leftovers(folder: Path) -> list[str]:
    return sorted(p.name for p in folder.iterdir() if p.name.endswith(".part"))


def test_a_new_file_is_written_whole(tmp_path):
    target = tmp_path / "cards" / "job.html"
    target.parent.mkdir()
    write_output(target, "<p>card</p>\n")
    assert target.read_text() == "<p>card</p>\n"
    assert _leftovers(target.parent) == []


def test_an_existing_file_is_replaced_and_keeps_its_permissions(tmp_path):
    target = tmp_path / "jobs.csv"
    target.write_text("old\n")
    os.chmod(target, 0o640)
    write_output(target, "new\n")
    assert target.read_text() == "new\n"
    assert stat.S_IMODE(target.stat().st_mode) == 0o640


def test_a_symlink_stays_a_symlink_and_its_target_gets_the_text(tmp_path):
    real = tmp_path / "real.json"
    real.write_text("old")
    link = tmp_path / "link.json"
    link.symlink_to(real)
    write_output(link, "new")
    assert link.is_symlink() and os.readlink(link) == str(real)
    assert real.read_text() == "new"
    assert _leftovers(tmp_path) == []


def test_a_symlink_to_a_device_writes_the_device(tmp_path):
    link = tmp_path / "sink"
    link.symlink_to(os.devnull)
    write_output(link, "gone")
    assert link.is_symlink()
    assert stat.S_ISCHR(os.stat(os.devnull).st_mode)


def test_dev_null_stays_a_device():
    write_output(os.devnull, "x" * 10_000)
    assert stat.S_ISCHR(os.stat(os.devnull).st_mode)


@pytest.mark.skipif(not Path("/dev/full").exists(), reason="no /dev/full on this system")
def test_dev_full_reports_a_full_disk_and_stays_a_device():
    with pytest.raises(OutputError, match="disk is full"):
        write_output("/dev/full", "x" * 100_000)
    assert stat.S_ISCHR(os.stat("/dev/full").st_mode)


def test_a_fifo_is_written_in_place(tmp_path):
    fifo = tmp_path / "pipe"
    os.mkfifo(fifo)
    got: list[bytes] = []
    reader = threading.Thread(target=lambda: got.append(fifo.read_bytes()))
    reader.start()
    write_output(fifo, "through the pipe")
    reader.join(5)
    assert got == [b"through the pipe"]
    assert stat.S_ISFIFO(os.stat(fifo).st_mode)
    assert _leftovers(tmp_path) == []


def test_a_folder_is_refused(tmp_path):
    with pytest.raises(OutputError, match="folder"):
        write_output(tmp_path, "x")


def test_a_missing_folder_is_one_message_and_nothing_is_left(tmp_path):
    with pytest.raises(OutputError, match="does not exist"):
        write_output(tmp_path / "no" / "such" / "file.csv", "x")


def test_a_failure_while_writing_leaves_the_old_file_and_no_part(tmp_path):
    target = tmp_path / "jobs.json"
    target.write_text("the old export")
    with pytest.raises(RuntimeError):
        with open_output(target) as out:
            out.write("half of the new")
            raise RuntimeError("the log stopped answering")
    assert target.read_text() == "the old export"
    assert _leftovers(tmp_path) == []


def test_a_failed_rename_leaves_the_old_file_and_no_part(tmp_path, monkeypatch):
    target = tmp_path / "jobs.json"
    target.write_text("the old export")

    def refuse(*_args: object) -> None:
        raise PermissionError(13, "Permission denied")

    monkeypatch.setattr(os, "replace", refuse)
    with pytest.raises(OutputError, match="permission denied"):
        write_output(target, "new")
    assert target.read_text() == "the old export"
    assert _leftovers(tmp_path) == []


def test_an_interrupt_leaves_no_part(tmp_path):
    target = tmp_path / "jobs.json"
    with pytest.raises(KeyboardInterrupt):
        with open_output(target) as out:
            out.write("x")
            raise KeyboardInterrupt
    assert not target.exists() and _leftovers(tmp_path) == []
