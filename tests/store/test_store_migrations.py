"""Schema versions: v1, v2 and v3 logs are migrated forward keeping every row, with a backup beside
them; a log of ours whose version number was lost is recognised by its tables."""

from __future__ import annotations

import json
import sqlite3

import pytest

from store_helpers import JOB_INPUTS, result_for

from workbench.store import JobLog, migrations, schema
from workbench.store.migrations import migrate, user_version


def _v1_log(path, jobs: int) -> list[tuple]:
    """A log exactly as version 1 wrote it, with ``jobs`` rows; returns the rows."""
    conn = sqlite3.connect(path, isolation_level=None)
    assert migrate(conn, target=1) == 1
    rows = []
    for i in range(jobs):
        name = ("demo", "mixer", "overloaded")[i % 3]
        result = result_for(name)
        rows.append((
            f"2024-0{1 + i % 9}-1{i % 10}T08:00:00.000000+00:00", "2024-10-01T00:00:00.000000+00:00", "0.0.9",
            f"Tag [{i}]", f"Site {i}", "fitter", f"note {i}", result["verdict"], "1045-cd",
            json.dumps(JOB_INPUTS[name]), json.dumps(result),
        ))
    conn.executemany(
        "INSERT INTO jobs (created_at, updated_at, program_version, asset, location, by, note, verdict,"
        " material, inputs_json, result_json) VALUES (?,?,?,?,?,?,?,?,?,?,?)", rows)
    conn.close()
    return rows


def test_a_v1_log_is_migrated_keeping_every_row(tmp_path):
    path = tmp_path / "jobs.sqlite3"
    rows = _v1_log(path, jobs=25)
    with JobLog.open(path) as log:
        assert user_version(log.conn) == schema.LATEST_VERSION == 6
        records = sorted(log.search(limit=100), key=lambda r: r.id)
        assert len(records) == 25
        for record, row in zip(records, rows):
            assert (record.created_at, record.updated_at, record.program_version, record.asset,
                    record.location, record.by, record.note, record.verdict) == row[:8]
            assert record.inputs == json.loads(row[9]) and record.result == json.loads(row[10])
            assert record.fitted == "" and record.deleted_at is None
        # the new search column was filled for the old rows (case-folded)
        assert [r.asset for r in log.search(text="tag [7]")] == ["Tag [7]"]
        # since v4 who checked the job is searched too, and the specs and verdict words
        assert log.count(text="SITE") == 25 and log.count(text="fitter") == 25
        assert log.count(text="hex 27mm") == sum(1 for r in rows if "hex 27mm" in r[9])
        assert [r.asset for r in log.search(text="site 13")] == ["Tag [13]"]  # through the v3 index
        assert log.integrity_ok()
    backup = tmp_path / "jobs.sqlite3.v1.bak"
    conn = sqlite3.connect(backup)
    assert conn.execute("PRAGMA user_version").fetchone()[0] == 1
    assert conn.execute("SELECT count(*) FROM jobs").fetchone()[0] == 25
    conn.close()


def test_a_new_log_goes_straight_to_the_latest_version_and_stays_there(tmp_path):
    path = tmp_path / "jobs.sqlite3"
    with JobLog.open(path) as log:
        log.save(dict(JOB_INPUTS["demo"]), result_for("demo"))
    with JobLog.open(path) as log:
        assert user_version(log.conn) == schema.LATEST_VERSION
        columns = [r[1] for r in log.conn.execute("PRAGMA table_info(jobs)")]
        assert {"fitted", "deleted_at", "search_text"} <= set(columns)
        assert log.count() == 1
    assert not (tmp_path / "jobs.sqlite3.v1.bak").exists()


def _v2_log(path, jobs: int) -> list[tuple]:
    """A log exactly as version 2 wrote it (search_text filled, some jobs in the bin)."""
    conn = sqlite3.connect(path, isolation_level=None)
    assert migrate(conn, target=2) == 2
    rows = []
    for i in range(jobs):
        name = ("demo", "mixer", "overloaded")[i % 3]
        result = result_for(name)
        asset, location, note, material = f"Pump [{i}]", f"Bay {i}", f'say "{i}" NEAR *', "4140-qt425"
        rows.append((
            f"2024-0{1 + i % 9}-1{i % 10}T08:00:00.000000+00:00", "2024-10-01T00:00:00.000000+00:00", "0.1.0",
            asset, location, "fitter", note, result["verdict"], material, f"fit {i}",
            "2024-11-01T00:00:00.000000+00:00" if i % 5 == 0 else None,
            json.dumps(JOB_INPUTS[name]), json.dumps(result),
            schema.search_text(asset, location, note, material),
        ))
    conn.executemany(
        "INSERT INTO jobs (created_at, updated_at, program_version, asset, location, by, note, verdict,"
        " material, fitted, deleted_at, inputs_json, result_json, search_text)"
        " VALUES (?,?,?,?,?,?,?,?,?,?,?,?,?,?)", rows)
    conn.close()
    return rows


def test_a_v2_log_is_migrated_keeping_every_row_and_its_bin(tmp_path):
    path = tmp_path / "jobs.sqlite3"
    rows = _v2_log(path, jobs=30)
    with JobLog.open(path) as log:
        assert user_version(log.conn) == schema.LATEST_VERSION
        records = sorted(log.search(limit=100, deleted=None), key=lambda r: r.id)
        assert len(records) == 30
        for record, row in zip(records, rows):
            assert (record.created_at, record.updated_at, record.program_version, record.asset,
                    record.location, record.by, record.note, record.verdict, record.material,
                    record.fitted, record.deleted_at) == row[:11]
            assert record.inputs == json.loads(row[11]) and record.result == json.loads(row[12])
        assert log.count() == 24 and log.count(deleted=True) == 6
        # the index was filled from the old rows: substring, any case, bin kept apart
        assert log.text_index is migrations.text_index_supported()
        assert [r.asset for r in log.search(text="ump [17]")] == ["Pump [17]"]
        assert log.count(text="PUMP") == 24 and log.count(text="pump", deleted=None) == 30
        assert log.count(text='"1" near') == 1 and log.count(text="*", deleted=True) == 6
        assert log.integrity_ok()
    backup = tmp_path / "jobs.sqlite3.v2.bak"
    conn = sqlite3.connect(backup)
    assert conn.execute("PRAGMA user_version").fetchone()[0] == 2
    assert conn.execute("SELECT count(*) FROM jobs").fetchone()[0] == 30
    assert conn.execute("SELECT count(*) FROM sqlite_master WHERE name = 'jobs_text'").fetchone()[0] == 0
    conn.close()


def test_the_v3_index_holds_one_entry_per_job(tmp_path):
    if not migrations.text_index_supported():
        pytest.skip(f"SQLite {sqlite3.sqlite_version} has no FTS5 trigram tokenizer")
    path = tmp_path / "jobs.sqlite3"
    _v2_log(path, jobs=12)
    with JobLog.open(path) as log:
        names = {r[0] for r in log.conn.execute("SELECT name FROM sqlite_master")}
        assert {schema.TEXT_INDEX, *schema.TEXT_TRIGGERS} <= names
        indexed = log.conn.execute(
            f"SELECT count(*) FROM {schema.TEXT_INDEX} WHERE {schema.TEXT_INDEX} MATCH '\"bay\"'"
        ).fetchone()[0]
        assert indexed == 12


def _v3_log(path, jobs: int) -> None:
    """A log as version 3 left it (a v2 log migrated one step, the way version 3 did it)."""
    _v2_log(path, jobs)
    conn = sqlite3.connect(path, isolation_level=None)
    assert migrate(conn, target=3) == 3
    conn.close()


def test_a_v3_log_gains_outcomes_and_wider_search_keeping_every_row(tmp_path):
    path = tmp_path / "jobs.sqlite3"
    _v3_log(path, jobs=12)
    with JobLog.open(path) as log:
        assert user_version(log.conn) == schema.LATEST_VERSION
        records = log.search(limit=100, deleted=None)
        assert len(records) == 12
        assert all(r.outcome == "" and r.fitted_on == "" and r.outcome_date == "" for r in records)
        # the new search text covers who checked it and what was fitted (v3 did not)
        assert log.count(text="fitter", deleted=None) == 12
        demo_spec = JOB_INPUTS["demo"]["candidate"]
        assert log.count(text=demo_spec, deleted=None) == 4  # jobs 0, 3, 6, 9 are the demo job
        assert log.changes(records[0].id) == []
        assert log.integrity_ok()
    assert (tmp_path / "jobs.sqlite3.v3.bak").exists()


@pytest.mark.parametrize("version", [1, 2, 3, 6])
def test_a_log_of_ours_with_its_version_number_lost_is_recognised(tmp_path, version):
    path = tmp_path / "jobs.sqlite3"
    if version == 6:
        with JobLog.open(path) as log:
            for _ in range(5):
                log.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset="kept")
    elif version == 1:
        _v1_log(path, jobs=5)
    else:
        (_v2_log if version == 2 else _v3_log)(path, jobs=5)
    conn = sqlite3.connect(path, isolation_level=None)
    conn.execute("PRAGMA user_version = 0")  # what another tool can leave behind
    conn.close()
    with JobLog.open(path) as log:
        assert user_version(log.conn) == schema.LATEST_VERSION
        assert log.count(deleted=None) == 5
        assert log.integrity_ok()


def test_a_v5_log_gets_asset_keys(tmp_path):
    from workbench.store import payload

    path = tmp_path / "jobs.sqlite3"
    conn = sqlite3.connect(path, isolation_level=None)
    migrate(conn, target=5)
    assert user_version(conn) == 5
    blob = payload.encode(JOB_INPUTS["demo"], result_for("demo"))
    for n, asset in enumerate(["CV-07 head drive", "cv 7", "Fan F-2", ""]):
        conn.execute("INSERT INTO jobs (uid, created_at, asset, payload, note) VALUES (?, ?, ?, ?, ?)",
                     (bytes([n]) * 16, f"2025-01-0{n + 1}T00:00:00.000000+00:00", asset, blob, f"n{n}"))
    conn.close()
    with JobLog.open(path) as log:
        assert user_version(log.conn) == schema.LATEST_VERSION
        keys = dict(log.conn.execute("SELECT note, asset_key FROM jobs").fetchall())
        assert keys == {"n0": "cv7", "n1": "cv7", "n2": "fan", "n3": ""}
        assert log.count(deleted=None) == 4
    assert (tmp_path / "jobs.sqlite3.v5.bak").exists()
