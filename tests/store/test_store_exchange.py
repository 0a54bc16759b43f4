"""Export and import: the JSON round trip loses nothing; the flat CSV holds one job a row with the
figures in plain columns; bad files change nothing."""

from __future__ import annotations

import csv
import io
import json
import math
import re

import pytest
from store_helpers import JOB_INPUTS, result_for

from workbench.store import JobLog, LogError
from workbench.store.exchange import CSV_FIELDS, FLAT_CSV_COLUMNS, read_jobs, write_csv, write_json

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


def _without_ids(rows: list[dict], also: tuple[str, ...] = ()) -> list[dict]:
    return [{k: v for k, v in row.items() if k not in ("id", "origin", *also)} for row in rows]


@pytest.mark.parametrize("writer", [write_json, "old-csv"], ids=["json", "old-csv"])
def test_round_trip_loses_nothing(tmp_path, writer):
    # older CSV files carry no uid and no bench: those are made here (a content id, no bench name)
    also = ("uid", "bench") if writer == "old-csv" else ()
    if writer == "old-csv":
        writer = _old_csv
    with JobLog.open(tmp_path / "a.sqlite3") as source:
        _fill(source)
        exported = source.export_rows()
    out = io.StringIO()
    assert writer(iter(exported), out) == 3
    with JobLog.open(tmp_path / "b.sqlite3") as target:
        assert target.import_jobs(read_jobs(out.getvalue())) == 3
        again = target.export_rows()
        assert _without_ids(again, also) == _without_ids(exported, also)
        assert target.count() == 2 and target.count(deleted=True) == 1
        # importing the same file twice adds nothing
        assert target.import_jobs(read_jobs(out.getvalue())) == 0
        assert target.count(deleted=None) == 3


def _old_csv(rows, out) -> int:
    """The CSV export of earlier versions (inputs and result as JSON cells), written as they did."""
    writer = csv.DictWriter(out, fieldnames=CSV_FIELDS, lineterminator="\n")
    writer.writeheader()
    count = 0
    for row in rows:
        cells = {name: row.get(name) for name in CSV_FIELDS}
        for name in ("program_version", "asset", "location", "by", "note", "material", "fitted"):
            value = cells[name] or ""
            cells[name] = "'" + value if re.match(r"^'*[=+\-@\t\r]", value) else value
        cells["deleted_at"] = cells["deleted_at"] or ""
        cells["inputs"] = json.dumps(row["inputs"], ensure_ascii=False, sort_keys=True)
        cells["result"] = json.dumps(row["result"], ensure_ascii=False, sort_keys=True)
        writer.writerow(cells)
        count += 1
    return count


def _flat(rows: list[dict]) -> list[dict[str, str]]:
    out = io.StringIO()
    assert write_csv(iter(rows), out) == len(rows)
    return list(csv.DictReader(io.StringIO(out.getvalue(), newline="")))


def test_flat_csv_is_one_job_a_row_with_the_figures_in_columns(tmp_path):
    with JobLog.open(tmp_path / "a.sqlite3") as log:
        _fill(log)
        exported = log.export_rows()
    table = _flat(exported)
    assert len(table) == 3 and list(table[0]) == list(FLAT_CSV_COLUMNS)
    for row, job in zip(table, exported):
        result = job["result"]
        assert "{" not in "".join(row.values()).replace("{}", "")  # no JSON blobs
        # every figure is the stored result's, in the unit its heading names (6 significant figures)
        assert math.isclose(float(row["power_kW"]), result["drive"]["power_W"] / 1000, rel_tol=1e-5)
        assert math.isclose(float(row["motor_speed_rpm"]), result["drive"]["motor_speed_rpm"], rel_tol=1e-5)
        assert math.isclose(float(row["design_torque_Nm"]), result["drive"]["design_torque_Nm"], rel_tol=1e-5)
        assert row["verdict"] == result["verdict"]
        for shaft in result["shafts"]:
            role = shaft["role"]
            assert row[f"{role}_spec"] == shaft["spec"]
            assert row[f"{role}_material"] == shaft["material_name"]
            assert row[f"{role}_verdict"] == shaft["verdict"]
            assert row[f"{role}_governing_check"] == shaft["governing"]
            for column, key in (("static_sf", "static_safety_factor"), ("fatigue_sf", "fatigue_safety_factor")):
                assert math.isclose(float(row[f"{role}_{column}"]), shaft[key], rel_tol=1e-5)
            assert math.isclose(float(row[f"{role}_von_mises_MPa"]), shaft["von_mises_stress_Pa"] / 1e6, rel_tol=1e-5)
    mixer = table[1]
    assert mixer["asset"] == "M-3" and mixer["candidate_spec"] and mixer["strength_ratio"]
    overloaded = table[2]
    assert overloaded["candidate_spec"] == "" and overloaded["in_bin_since_utc"]


def test_flat_csv_cells_a_spreadsheet_would_run_are_neutralised(tmp_path):
    with JobLog.open(tmp_path / "a.sqlite3") as log:
        _fill(log)
        exported = log.export_rows()
    row = _flat(exported)[0]
    assert row["asset"] == "'=HYPERLINK(\"http://x\")" and row["location"].startswith("''=already")
    assert row["checked_by"] == "'@fitter" and row["fitted"] == "'-square 40mm"
    assert row["note"] == TRICKY["note"]


def test_flat_csv_leaves_missing_and_nan_figures_empty():
    rows = _flat([{"id": 1, "inputs": {}, "result": {"drive": {"power_W": float("nan")}, "shafts": [
        {"role": "existing", "static_safety_factor": float("inf")}]}}])
    assert rows[0]["power_kW"] == "" and rows[0]["existing_static_sf"] == "inf" and rows[0]["verdict"] == ""


def test_flat_csv_is_not_read_back_and_says_what_to_use(tmp_path):
    text = io.StringIO()
    write_csv(iter([{"id": 1, "inputs": {}, "result": {}}]), text)
    with pytest.raises(LogError, match="--format json"):
        read_jobs(text.getvalue())


def test_old_csv_cells_a_spreadsheet_would_run_are_restored():
    row = {"id": 1, "inputs": {}, "result": {}, "deleted_at": None, **TRICKY}
    out = io.StringIO()
    _old_csv([row], out)
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
