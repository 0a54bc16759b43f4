"""Export and import: JSON and CSV round trips lose nothing; bad files change nothing."""

from __future__ import annotations

import io

import pytest
from store_helpers import JOB_INPUTS, result_for

from workbench.store import JobLog, LogError
from workbench.store.exchange import read_jobs, write_csv, write_json

TRICKY = {
    "asset": "=HYPERLINK(\"http://x\")",
    "location": "'=already quoted, \"commas\", and\nnew lines",
    "by": "@fitter",
    "note": "[bold]not markup[/] - 100% _ ünïcödé",
    "fitted": "-square 40mm",
}


def _fill(log: JobLog) -> None:
    log.save(dict(JOB_INPUTS["demo"]), result_for("demo"), **TRICKY)
    log.save(dict(JOB_INPUTS["mixer"]), result_for("mixer"), asset="M-3")
    gone = log.save(dict(JOB_INPUTS["overloaded"]), result_for("overloaded"), asset="P-9")
    log.delete(gone)


def _without_ids(rows: list[dict]) -> list[dict]:
    return [{k: v for k, v in row.items() if k != "id"} for row in rows]


@pytest.mark.parametrize("writer", [write_json, write_csv], ids=["json", "csv"])
def test_round_trip_loses_nothing(tmp_path, writer):
    with JobLog.open(tmp_path / "a.sqlite3") as source:
        _fill(source)
        exported = source.export_rows()
    out = io.StringIO()
    assert writer(iter(exported), out) == 3
    with JobLog.open(tmp_path / "b.sqlite3") as target:
        assert target.import_jobs(read_jobs(out.getvalue())) == 3
        again = target.export_rows()
        assert _without_ids(again) == _without_ids(exported)
        assert target.count() == 2 and target.count(deleted=True) == 1
        # importing the same file twice adds nothing
        assert target.import_jobs(read_jobs(out.getvalue())) == 0
        assert target.count(deleted=None) == 3


def test_csv_cells_a_spreadsheet_would_run_are_neutralised():
    row = {"id": 1, "inputs": {}, "result": {}, "deleted_at": None, **TRICKY}
    out = io.StringIO()
    write_csv([row], out)
    text = out.getvalue()
    assert "'=HYPERLINK" in text and "''=already" in text and "'@fitter" in text
    back = read_jobs(text)[0]
    assert {k: back[k] for k in TRICKY} == TRICKY


def test_a_bad_row_stops_the_import_and_adds_nothing(tmp_path):
    rows = [
        {"inputs": JOB_INPUTS["demo"], "result": result_for("demo"), "asset": "fine"},
        {"inputs": {"power": 7.5}, "result": result_for("demo")},
    ]
    with JobLog.open(tmp_path / "jobs.sqlite3") as log:
        with pytest.raises(LogError, match="job 2 of the import: inputs"):
            log.import_jobs(rows)
        assert log.count(deleted=None) == 0


def test_unreadable_exports_give_one_line_messages():
    with pytest.raises(LogError, match="not valid JSON"):
        read_jobs("[{\"inputs\": ")
    with pytest.raises(LogError, match="neither a JSON nor a CSV"):
        read_jobs("just some words\nmore words\n")
