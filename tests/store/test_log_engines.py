"""The job log's operations and guarantees, run against both engines (SQLite file, PostgreSQL).

Each expectation is written from the contract (what was saved comes back; filters select by the
stated rule; the bin and import behave as documented), not from earlier output of the code.
"""

from __future__ import annotations

import uuid

import pytest

from store_helpers import JOB_INPUTS, result_for
from workbench.store import JobLog, LogError


def _save(log, name="demo", **meta):
    return log.save(JOB_INPUTS[name], result_for(name), **meta)


def test_save_get_round_trip_keeps_inputs_result_and_notes(log_target):
    with JobLog.open(log_target) as log:
        result = result_for("mixer")
        job_id = log.save(JOB_INPUTS["mixer"], result, asset="CV-07 head drive", location="Bay 3",
                          by="A. Fitter", note="[red]not markup[/] 100% _x_", fitted="tube 40mm/30mm",
                          bench="bench-a")
        record = log.get(job_id)
    assert record.inputs == JOB_INPUTS["mixer"]
    assert record.result == result  # the whole stored result, every figure
    assert (record.asset, record.location, record.by, record.note, record.fitted, record.bench) == (
        "CV-07 head drive", "Bay 3", "A. Fitter", "[red]not markup[/] 100% _x_", "tube 40mm/30mm", "bench-a")
    assert record.updated_at == record.created_at and record.deleted_at is None
    assert uuid.UUID(record.uid)


def test_a_resent_save_with_the_same_uid_adds_nothing(log_target):
    uid = uuid.uuid4()
    with JobLog.open(log_target) as log:
        first = log.save(JOB_INPUTS["demo"], result_for("demo"), uid=uid)
        again = log.save(JOB_INPUTS["demo"], result_for("demo"), uid=str(uid))
        assert first == again and log.count(deleted=None) == 1
        assert log.get(first).uid == str(uid)


def test_text_filter_words_any_case_as_plain_characters(log_target):
    with JobLog.open(log_target) as log:
        a = _save(log, asset="CV-07 Head Drive", note="Pump 100% seized")
        b = _save(log, "mixer", asset="MX-2", location="Straße 5", note="under_score")
        c = _save(log, "small-fan", asset="FN-1", note="bent")
        assert [r.id for r in log.search(text="head pump")] == [a]
        assert [r.id for r in log.search(text="100%")] == [a]  # % is a character, not a wildcard
        assert log.search(text="1_0") == []                     # _ is a character too
        assert [r.id for r in log.search(text="under_score")] == [b]
        assert [r.id for r in log.search(text="STRASSE")] == [b]  # casefold: ß = ss
        assert {r.id for r in log.search(text="cv")} == {a}      # a word shorter than a trigram
        assert {r.id for r in log.search(text="-")} == {a, b, c}
        assert log.count(text="head") == 1 and log.count(text="zzzz") == 0 and log.count() == 3


def test_verdict_date_filters_and_newest_first(log_target):
    with JobLog.open(log_target) as log:
        ids = [_save(log, name) for name in ("demo", "small-fan", "overloaded")]
        assert [r.id for r in log.search()] == ids[::-1]
        verdict = result_for("overloaded")["verdict"]
        assert ids[2] in [r.id for r in log.search(verdict=verdict)]
        assert all(r.verdict == verdict for r in log.search(verdict=verdict))
        assert log.search(until="2000-01-01") == [] and log.count(since="2000-01-01") == 3
        with pytest.raises(LogError, match="verdict"):
            log.search(verdict="great")
        assert [r.id for r in log.search(limit=1, offset=1)] == [ids[1]]


def test_edit_bin_restore_purge(log_target):
    with JobLog.open(log_target) as log:
        keep, drop = _save(log, asset="A-1"), _save(log, asset="B-2")
        edited = log.update(keep, note="failed again", fitted="round 45mm")
        assert (edited.note, edited.fitted) == ("failed again", "round 45mm")
        assert edited.updated_at >= edited.created_at
        assert [r.id for r in log.search(text="failed")] == [keep]
        log.delete(drop)
        assert log.count() == 1 and log.count(deleted=True) == 1 and log.count(deleted=None) == 2
        with pytest.raises(LogError, match="already in the bin"):
            log.delete(drop)
        log.restore(drop)
        assert log.count() == 2
        log.delete(drop)
        assert log.purge() == 1 and log.count(deleted=None) == 1
        with pytest.raises(LogError, match="no job"):
            log.get(drop)


def test_export_import_is_idempotent_and_names_where_jobs_came_from(log_target, tmp_path):
    source_path = tmp_path / "bench-a.sqlite3"
    with JobLog.open(source_path) as source:
        ids = [_save(source, n, asset=f"T-{n}", bench="bench-a") for n in ("demo", "mixer")]
        source.delete(ids[1])
        exported = source.export_rows()
    with JobLog.open(log_target) as log:
        assert log.import_jobs(exported) == 2
        assert log.import_jobs(exported) == 0  # twice adds nothing
        rows = {r["uid"]: r for r in log.export_rows()}
    for original in exported:
        copy = rows[original["uid"]]
        assert copy["created_at"] == original["created_at"]  # original times kept
        assert copy["bench"] == "bench-a" and copy["origin"] == f"bench-a #{original['id']}"
        assert copy["result"] == original["result"] and copy["deleted_at"] == original["deleted_at"]


def test_a_bad_import_row_adds_nothing(log_target):
    good = {"inputs": JOB_INPUTS["demo"], "result": result_for("demo"), "created_at": "2025-01-01T00:00:00Z"}
    with JobLog.open(log_target) as log:
        with pytest.raises(LogError, match="job 2 of the import"):
            log.import_jobs([good, {"inputs": {}, "result": "[]"}])
        assert log.count(deleted=None) == 0


def test_reopen_recomputes_and_compares_the_whole_stored_result(log_target):
    with JobLog.open(log_target) as log:
        same = _save(log)
        stored = result_for("demo")
        stored["verdict"] = "fail" if stored["verdict"] != "fail" else "pass"
        changed = log.save(JOB_INPUTS["demo"], stored)
        assert not log.reopen(same).changed
        reopened = log.reopen(changed)
        assert reopened.changed and any(d.key == "verdict" for d in reopened.differences)


def test_open_without_create_refuses_a_missing_log(log_target):
    with pytest.raises(LogError, match="no job log"):
        JobLog.open(log_target, create=False)
