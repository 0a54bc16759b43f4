"""The job log: saving, finding, the bin, reopening, file modes and durability settings."""

from __future__ import annotations

import os
import stat
from datetime import datetime, timedelta, timezone

import pytest
from store_helpers import JOB_INPUTS, result_for

from workbench.store import JobLog, LogError, compare_results, default_log_path
from workbench.store import schema


def _save(log: JobLog, name: str = "demo", **meta: str) -> int:
    return log.save(dict(JOB_INPUTS[name]), result_for(name), **meta)


def test_save_and_get_keep_inputs_exactly_as_typed(log_path, demo_meta):
    inputs = dict(JOB_INPUTS["demo"])
    inputs["power"] = "  7.5  kW "  # spacing as typed is kept
    with JobLog.open(log_path) as log:
        result = result_for("demo")
        job_id = log.save(inputs, result, **demo_meta, fitted="square 40mm")
        record = log.get(job_id)
    assert record.inputs == inputs
    assert record.result == result
    assert (record.asset, record.location, record.by, record.note) == (
        demo_meta["asset"], demo_meta["location"], demo_meta["by"], demo_meta["note"],
    )
    assert record.fitted == "square 40mm"
    assert record.verdict == result["verdict"]
    assert "1045-cd" in record.material
    assert record.program_version == result["program"]["version"]
    assert record.deleted_at is None
    created = datetime.fromisoformat(record.created_at)
    assert created.utcoffset() == timedelta(0)
    assert abs(datetime.now(timezone.utc) - created) < timedelta(minutes=1)
    with pytest.raises(Exception):
        record.asset = "changed"  # type: ignore[misc]  # frozen


def test_markup_like_text_is_stored_literally(log_path):
    odd = "[bold]CV-07[/] [red]x[/red] [/] [link=file:///etc]y[/link]"
    with JobLog.open(log_path) as log:
        job_id = _save(log, asset=odd, note=odd, location="[/]")
        record = log.get(job_id)
        assert record.asset == odd and record.note == odd and record.location == "[/]"
        assert [r.id for r in log.search(text="[bold]")] == [job_id]


def test_search_is_newest_first_and_matches_every_text_field(log_path):
    with JobLog.open(log_path) as log:
        a = _save(log, "demo", asset="Pump P-101", location="Boiler house")
        b = _save(log, "small-fan", asset="Fan F-2", note="Bearing noise at the NDE")
        c = _save(log, "mixer", asset="Mixer M-3", location="Batch plant")
        assert [r.id for r in log.search()] == [c, b, a]
        assert [r.id for r in log.search(text="pump")] == [a]           # asset, any case
        assert [r.id for r in log.search(text="BOILER")] == [a]         # location
        assert [r.id for r in log.search(text="nde")] == [b]            # notes
        assert [r.id for r in log.search(text="4140-qt425")] == [c]     # material key
        assert [r.id for r in log.search(text="1045")] == [b, a]        # material of two jobs
        assert [r.id for r in log.search(text="plant mixer")] == [c]    # every word must match
        assert log.search(text="plant pump") == []
        assert log.count(text="1045") == 2


def test_like_wildcards_and_sql_in_text_are_plain_characters(log_path):
    nasty = "x'); DROP TABLE jobs; --"
    with JobLog.open(log_path) as log:
        plain = _save(log, asset="A-1")
        percent = _save(log, asset="100% load", note=nasty)
        assert [r.id for r in log.search(text="%")] == [percent]
        assert log.search(text="_") == []
        assert [r.id for r in log.search(text="drop table")] == [percent]
        assert log.get(percent).note == nasty
        assert log.count() == 2 and log.get(plain).asset == "A-1"


def test_verdict_and_date_filters(log_path):
    with JobLog.open(log_path) as log:
        passing = _save(log, "demo")
        failing = _save(log, "overloaded")
        assert result_for("overloaded")["verdict"] == "fail"  # the premise of this test
        assert [r.id for r in log.search(verdict="fail")] == [failing]
        assert [r.id for r in log.search(verdict=["pass", "fail"])] == [failing, passing]
        today = datetime.now(timezone.utc).date()
        assert log.count(since=today, until=today) == 2
        assert log.count(since=today + timedelta(days=1)) == 0
        assert log.count(until=(today - timedelta(days=1)).isoformat()) == 0
        with pytest.raises(LogError, match="since"):
            log.search(since="yesterday")
        with pytest.raises(LogError, match="verdict"):
            log.search(verdict="ok")


def test_paging_covers_every_job_once(log_path):
    with JobLog.open(log_path) as log:
        ids = [_save(log, "small-fan", asset=f"F-{i}") for i in range(23)]
        pages = [log.search(limit=10, offset=offset) for offset in (0, 10, 20)]
        assert [len(p) for p in pages] == [10, 10, 3]
        assert [r.id for page in pages for r in page] == list(reversed(ids))
        assert log.count() == 23


def test_bin_delete_restore_purge(log_path):
    with JobLog.open(log_path) as log:
        keep = _save(log, asset="keep")
        gone = _save(log, asset="gone")
        log.delete(gone)
        assert [r.id for r in log.search()] == [keep]
        assert [r.id for r in log.search(deleted=True)] == [gone]
        assert {r.id for r in log.search(deleted=None)} == {keep, gone}
        assert log.get(gone).deleted_at is not None
        with pytest.raises(LogError, match="already in the bin"):
            log.delete(gone)
        log.restore(gone)
        assert log.get(gone).deleted_at is None
        with pytest.raises(LogError, match="not in the bin"):
            log.restore(gone)
        log.delete(gone)
        assert log.purge() == 1
        with pytest.raises(LogError, match="no job"):
            log.get(gone)
        assert [r.id for r in log.search(deleted=None)] == [keep]
        with pytest.raises(LogError, match="no job 999"):
            log.delete(999)


def test_update_changes_notes_and_search(log_path):
    with JobLog.open(log_path) as log:
        job_id = _save(log, asset="retired zq9")
        before = log.get(job_id)
        after = log.update(job_id, asset="New Tag", fitted="square 40mm")
        assert (after.asset, after.fitted, after.inputs, after.result) == (
            "New Tag", "square 40mm", before.inputs, before.result)
        assert after.updated_at > before.updated_at
        assert [r.id for r in log.search(text="new tag")] == [job_id]
        assert log.search(text="zq9") == []
        with pytest.raises(LogError, match="cannot change"):
            log.update(job_id, verdict="pass")


def test_bad_inputs_are_refused_with_a_message(log_path):
    with JobLog.open(log_path) as log:
        with pytest.raises(LogError, match="inputs"):
            log.save({"power": 7.5}, result_for("demo"))  # type: ignore[dict-item]
        with pytest.raises(LogError, match="result"):
            log.save(dict(JOB_INPUTS["demo"]), {"x": object()})
        with pytest.raises(LogError, match="asset"):
            log.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset=12)  # type: ignore[arg-type]
        assert log.count() == 0


def test_file_and_folder_are_private_and_durable_settings_apply(log_path):
    with JobLog.open(log_path) as log:
        _save(log)
        assert log.conn.execute("PRAGMA journal_mode").fetchone()[0] == "wal"
        assert log.conn.execute("PRAGMA synchronous").fetchone()[0] == 2  # FULL
        assert log.conn.execute("PRAGMA busy_timeout").fetchone()[0] >= 5000
        assert log.conn.execute("PRAGMA user_version").fetchone()[0] == schema.LATEST_VERSION
        assert log.conn.execute("PRAGMA application_id").fetchone()[0] == schema.APPLICATION_ID
        wal = log_path.with_name(log_path.name + "-wal")
        assert stat.S_IMODE(os.stat(wal).st_mode) == 0o600
    assert stat.S_IMODE(os.stat(log_path).st_mode) == 0o600
    assert stat.S_IMODE(os.stat(log_path.parent).st_mode) == 0o700


def test_default_path_from_environment(monkeypatch, tmp_path):
    monkeypatch.setenv("SHAFTBENCH_LOG", str(tmp_path / "here.sqlite3"))
    assert default_log_path() == tmp_path / "here.sqlite3"
    monkeypatch.delenv("SHAFTBENCH_LOG")
    path = default_log_path()
    assert path.name == "jobs.sqlite3" and "shaftbench" in str(path).lower()


def test_open_without_create_does_not_make_a_file(log_path):
    with pytest.raises(LogError, match="no job log"):
        JobLog.open(log_path, create=False)
    assert not log_path.exists()


def test_reopen_with_unchanged_program_reports_no_difference(log_path):
    with JobLog.open(log_path) as log:
        job_id = _save(log, "mixer")
        reopened = log.reopen(job_id)
    assert reopened.new_result is not None
    assert reopened.differences == () and not reopened.changed
    assert reopened.record.id == job_id


def test_reopen_lists_each_figure_that_changed(log_path):
    # A result stored by an "older program": two figures and the verdict differ from today's.
    stored = result_for("demo")
    stored["verdict"] = "marginal"
    candidate = next(s for s in stored["shafts"] if s["role"] == "candidate")
    candidate["fatigue_safety_factor"] *= 1.05
    stored["drive"]["design_torque_Nm"] *= 0.98
    with JobLog.open(log_path) as log:
        job_id = log.save(dict(JOB_INPUTS["demo"]), stored)
        reopened = log.reopen(job_id)
    keys = {d.key: d for d in reopened.differences}
    assert set(keys) == {"verdict", "candidate.fatigue_safety_factor", "drive.design_torque_Nm"}
    assert keys["verdict"].stored == "marginal" and keys["verdict"].now == result_for("demo")["verdict"]
    assert keys["candidate.fatigue_safety_factor"].stored == candidate["fatigue_safety_factor"]
    assert "stored" in str(keys["drive.design_torque_Nm"]) and "now" in str(keys["drive.design_torque_Nm"])
    assert reopened.changed


def test_compare_results_uses_a_relative_tolerance():
    today = result_for("demo")
    nudged = result_for("demo")
    existing = next(s for s in nudged["shafts"] if s["role"] == "existing")
    existing["von_mises_stress_Pa"] *= 1 + 1e-5      # below 0.1 %: the same
    assert compare_results(nudged, today) == ()
    existing["von_mises_stress_Pa"] *= 1 + 5e-3      # above 0.1 %: reported
    assert [d.key for d in compare_results(nudged, today)] == ["existing.von_mises_stress_Pa"]
    del nudged["shafts"][1]                           # a shaft missing on one side is reported
    assert "candidate.spec" in [d.key for d in compare_results(nudged, today)]


def test_reopen_reports_inputs_that_today_rejects(log_path):
    inputs = dict(JOB_INPUTS["demo"], material="unobtainium-9")
    with JobLog.open(log_path) as log:
        job_id = log.save(inputs, result_for("demo"))
        reopened = log.reopen(job_id)
    assert reopened.new_result is None and reopened.changed
    assert "material" in reopened.error
