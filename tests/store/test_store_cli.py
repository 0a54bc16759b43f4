"""``shaftbench log ...`` and ``check --save`` through argparse, as the main CLI wires them."""

from __future__ import annotations

import argparse
import io
import json

import pytest
from store_helpers import JOB_INPUTS, result_for

from workbench.cli_log import add_log_command, add_save_options, save_from_args
from workbench.store import JobLog

ODD = "[bold]P-1[/] [/]"


def run(argv: list[str]) -> int:
    """The whole command line (usage errors exit 2 through SystemExit, as from the shell)."""
    from workbench.cli import main

    try:
        return main(argv)
    except SystemExit as exit_:
        return int(exit_.code or 0)


@pytest.fixture
def filled(log_path):
    with JobLog.open(log_path) as log:
        ids = [
            log.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset=ODD, note="[red]keep[/red]"),
            log.save(dict(JOB_INPUTS["overloaded"]), result_for("overloaded"), asset="Pump P-7"),
        ]
    return ids


def test_check_save_options_store_the_job(log_path):
    parser = argparse.ArgumentParser()
    add_save_options(parser)
    args = parser.parse_args(["--save", "--asset", ODD, "--by", "me", "--log", str(log_path)])
    job_id = save_from_args(args, dict(JOB_INPUTS["demo"]), result_for("demo"))
    assert isinstance(job_id, int)
    with JobLog.open(log_path) as log:
        record = log.get(job_id)
    assert (record.asset, record.by, record.inputs) == (ODD, "me", JOB_INPUTS["demo"])
    assert save_from_args(parser.parse_args(["--log", str(log_path)]), {}, {}) is None


def test_list_shows_user_text_literally(filled, log_path, capsys, monkeypatch):
    monkeypatch.setenv("COLUMNS", "200")  # a wide terminal: no wrapping inside cells
    assert run(["log", "list", "--log", str(log_path)]) == 0
    out = capsys.readouterr().out
    assert ODD in out and "Pump P-7" in out and "2 of 2 jobs" in out
    assert out.index("Pump P-7") < out.index(ODD)  # newest first


def test_list_filters_and_json(filled, log_path, capsys):
    assert run(["log", "list", "--log", str(log_path), "--verdict", "fail", "--json"]) == 0
    rows = json.loads(capsys.readouterr().out)
    assert [r["id"] for r in rows] == [filled[1]] and "inputs" not in rows[0]
    assert run(["log", "list", "--log", str(log_path), "--text", "[bold]", "--json"]) == 0
    assert [r["asset"] for r in json.loads(capsys.readouterr().out)] == [ODD]


def test_show_reports_the_recheck(filled, log_path, capsys, monkeypatch):
    monkeypatch.setenv("COLUMNS", "200")
    assert run(["log", "show", str(filled[0]), "--log", str(log_path)]) == 0
    out = capsys.readouterr().out
    assert ODD in out and "[red]keep[/red]" in out and "same verdict and figures" in out
    assert run(["log", "show", str(filled[0]), "--json", "--log", str(log_path)]) == 0
    assert json.loads(capsys.readouterr().out)["inputs"] == JOB_INPUTS["demo"]


def test_csv_export_is_flat(filled, log_path, tmp_path):
    import csv

    out_file = tmp_path / "jobs.csv"
    assert run(["log", "export", "--format", "csv", "-o", str(out_file), "--log", str(log_path)]) == 0
    rows = list(csv.DictReader(out_file.open(newline="")))
    assert len(rows) == 2 and rows[0]["existing_spec"] and "inputs" not in rows[0]


@pytest.mark.parametrize("fmt", ["json"])
def test_export_then_import_into_a_new_log(filled, log_path, tmp_path, fmt, capsys):
    out_file = tmp_path / f"jobs.{fmt}"
    assert run(["log", "export", "--format", fmt, "-o", str(out_file), "--log", str(log_path)]) == 0
    other = tmp_path / "other.sqlite3"
    assert run(["log", "import", str(out_file), "--log", str(other)]) == 0
    assert "imported 2 jobs" in capsys.readouterr().out
    with JobLog.open(log_path) as a, JobLog.open(other) as b:
        strip = lambda rows: [{k: v for k, v in r.items() if k not in ("id", "origin")} for r in rows]  # noqa: E731
        assert strip(a.export_rows()) == strip(b.export_rows())
        # each imported job names where it came from: its bench and its id there
        assert [r["origin"] for r in b.export_rows()] == [f"{r['bench']} #{r['id']}" for r in a.export_rows()]


@pytest.mark.parametrize("fmt, marker", [("html", "<html"), ("svg", "<svg"), ("text", "Safety cautions")])
def test_card_formats(filled, log_path, tmp_path, fmt, marker):
    out_file = tmp_path / f"card.{fmt}"
    assert run(["log", "card", str(filled[0]), "--format", fmt, "-o", str(out_file), "--log", str(log_path)]) == 0
    text = out_file.read_text().replace("&#160;", " ")
    assert marker in text and "P-1" in text


def test_delete_restore_purge(filled, log_path, capsys):
    base = ["--log", str(log_path)]
    assert run(["log", "delete", str(filled[1]), *base]) == 0
    assert run(["log", "list", "--deleted", "--json", *base]) == 0
    capsys.readouterr()
    assert run(["log", "restore", str(filled[1]), *base]) == 0
    assert run(["log", "delete", str(filled[1]), *base]) == 0
    assert run(["log", "purge", "--yes", *base]) == 0
    assert "removed 1 job" in capsys.readouterr().out
    with JobLog.open(log_path) as log:
        assert [r.id for r in log.search(deleted=None)] == [filled[0]]


class _Terminal(io.StringIO):
    """Typed answers on what looks like a terminal."""

    def isatty(self) -> bool:
        return True


def _in_bin(log_path) -> int:
    with JobLog.open(log_path) as log:
        return log.count(deleted=True)


def test_purge_without_yes_and_without_a_terminal_refuses(filled, log_path, capsys, monkeypatch):
    monkeypatch.setattr("sys.stdin", io.StringIO("y\n"))  # piped input is not a confirmation
    assert run(["log", "delete", str(filled[1]), "--log", str(log_path)]) == 0
    capsys.readouterr()
    assert run(["log", "purge", "--log", str(log_path)]) == 2
    captured = capsys.readouterr()
    err = captured.err.strip()
    assert "--yes" in err and "\n" not in err and captured.out == ""
    assert _in_bin(log_path) == 1


@pytest.mark.parametrize("answer, code, removed", [
    ("y\n", 0, True), ("YES\n", 0, True), ("n\n", 1, False), ("\n", 1, False), ("", 1, False),
    ("yess\n", 1, False),
])
def test_purge_asks_on_a_terminal(filled, log_path, capsys, monkeypatch, answer, code, removed):
    assert run(["log", "delete", str(filled[1]), "--log", str(log_path)]) == 0
    capsys.readouterr()
    monkeypatch.setattr("sys.stdin", _Terminal(answer))
    assert run(["log", "purge", "--log", str(log_path)]) == code
    captured = capsys.readouterr()
    assert "Remove the 1 job in the bin for good?" in captured.err and "[y/N]" in captured.err
    assert ("removed 1 job" in captured.out) is removed
    assert ("nothing removed" in captured.out) is not removed
    assert _in_bin(log_path) == (0 if removed else 1)


def test_purge_of_an_empty_bin_does_not_ask(filled, log_path, capsys, monkeypatch):
    monkeypatch.setattr("sys.stdin", _Terminal("y\n"))
    assert run(["log", "purge", "--log", str(log_path)]) == 0
    captured = capsys.readouterr()
    assert "bin is empty" in captured.out and "[y/N]" not in captured.err
    with JobLog.open(log_path) as log:
        assert log.count() == 2


@pytest.mark.parametrize("argv, words", [
    (["log", "show", "999"], "no job 999"),
    (["log", "delete", "999"], "no job 999"),
    (["log", "list", "--since", "last week"], "since"),
    (["log", "list", "--limit", "0"], "--limit"),
    (["log", "import", "missing-file.json"], "no file"),
])
def test_bad_input_is_one_line_and_exit_2(filled, log_path, capsys, argv, words):
    assert run([*argv, "--log", str(log_path)]) == 2
    captured = capsys.readouterr()
    err = captured.err.strip()
    assert words in err and "\n" not in err and "Traceback" not in captured.err


def test_a_damaged_log_is_one_line_and_exit_2(tmp_path, capsys):
    bad = tmp_path / "jobs.sqlite3"
    bad.write_text("not a database at all, just words " * 10)
    assert run(["log", "list", "--log", str(bad)]) == 2
    err = capsys.readouterr().err.strip()
    assert "not a Shaftbench job log" in err and "\n" not in err


def test_list_of_a_log_not_made_yet_says_so(tmp_path, capsys):
    path = tmp_path / "none.sqlite3"
    assert run(["log", "list", "--log", str(path)]) == 0
    assert "no jobs saved yet" in capsys.readouterr().out
    assert not path.exists()
