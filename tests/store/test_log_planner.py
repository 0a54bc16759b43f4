"""The log in the planner's office: search finds what people type, outcomes are recorded with the
time of each change, one bad row blocks nothing, and imports or dates at the edges end in one line."""

from __future__ import annotations

import json
import sqlite3
import subprocess

from pathlib import Path

import pytest
from store_helpers import JOB_INPUTS, PYTHON, result_for, subprocess_env

from workbench.store import JobLog, LogError


def cli(log: Path, *argv: str) -> subprocess.CompletedProcess[str]:
    env = {**subprocess_env(), "SHAFTBENCH_LOG": str(log), "COLUMNS": "120"}
    return subprocess.run([PYTHON, "-m", "workbench", *argv], capture_output=True, text=True, env=env, timeout=120)


def ok(done: subprocess.CompletedProcess[str]) -> subprocess.CompletedProcess[str]:
    assert done.returncode == 0, done.stderr
    assert "Traceback" not in done.stderr
    return done


def one_line_error(done: subprocess.CompletedProcess[str], words: str) -> None:
    assert done.returncode == 2, done.stdout + done.stderr
    assert "Traceback" not in done.stderr and done.stderr.count("\n") == 1, done.stderr
    assert words in done.stderr, done.stderr


# --------------------------------------------------------------------------------------------
# search


def test_the_readme_sequence_finds_the_job(tmp_path):
    log = tmp_path / "jobs.sqlite3"
    # README.md, "Scripting": check --demo --save --asset "CV-07" ... then log list --text conveyor
    ok(cli(log, "check", "--demo", "--save", "--asset", "CV-07", "--location", "crusher line 2",
           "--by", "J. Fitter"))
    found = json.loads(ok(cli(log, "log", "list", "--text", "conveyor", "--json")).stdout)
    assert [job["asset"] for job in found] == ["CV-07"]


@pytest.fixture
def planner_log(tmp_path) -> Path:
    path = tmp_path / "jobs.sqlite3"
    with JobLog.open(path) as log:
        log.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset="CV-07", by="Jo Bloggs",
                 fitted="square 40mm from stores")
        log.save(dict(JOB_INPUTS["overloaded"]), result_for("overloaded"), asset="P-7", by="Sam Ortiz")
        log.save(dict(JOB_INPUTS["mixer"]), result_for("mixer"), asset="M-3")
    return path


@pytest.mark.parametrize("typed, assets", [
    ("square", ["CV-07"]),                      # the candidate's spec (demo: square 40mm)
    ("round 25mm", ["P-7"]),                    # the shaft as found, as typed
    ("hex", ["M-3"]),                           # a profile word
    ("tube 40mm/30mm", ["M-3"]),
    ("bloggs", ["CV-07"]), ("sam", ["P-7"]),   # who checked it
    ("stores", ["CV-07"]),                      # what was fitted
    ("fail", ["P-7"]), ("PASS", ["M-3", "CV-07"]),  # verdict words (the overloaded job fails)
    ("vbelt", ["P-7", "CV-07"]),               # the mounted element
    ("4140", ["M-3"]),                          # the material, as before
])
def test_search_finds_what_people_type(planner_log, typed, assets):
    with JobLog.open(planner_log) as log:
        assert [r.asset for r in log.search(text=typed)] == assets
        assert log.count(text=typed) == len(assets)


def test_the_outcome_is_searchable_once_recorded(planner_log):
    with JobLog.open(planner_log) as log:
        assert log.count(text="failed again") == 0
        log.update(1, outcome="failed", outcome_date="2026-11-20", fitted_on="2026-03-02")
        assert [r.asset for r in log.search(text="failed again")] == ["CV-07"]
        log.update(1, outcome="still-running", outcome_date="")
        assert log.count(text="failed") == 0 and log.count(text="still running") == 1


# --------------------------------------------------------------------------------------------
# recording the outcome


def test_log_edit_records_the_outcome_with_the_time_of_each_change(planner_log):
    done = ok(cli(planner_log, "log", "edit", "1", "--fitted", "square 40mm", "--fitted-on", "2026-03-02",
                  "--outcome", "failed", "2026-11-20", "--add-note", "sheared at the hub"))
    assert "job 1 updated" in done.stdout and "failed again on 2026-11-20" in done.stdout
    with JobLog.open(planner_log) as log:
        job = log.get(1)
        assert (job.fitted, job.fitted_on, job.outcome, job.outcome_date) == (
            "square 40mm", "2026-03-02", "failed", "2026-11-20")
        assert job.note == "sheared at the hub"
        history = log.changes(1)
        assert {c["field"] for c in history} == {"fitted", "fitted_on", "outcome", "outcome_date", "note"}
        assert all(c["changed_at"] == job.updated_at for c in history)
        assert next(c for c in history if c["field"] == "fitted")["old"] == "square 40mm from stores"
    shown = ok(cli(planner_log, "log", "show", "1")).stdout
    assert "Changes since it was saved" in shown and "failed again on 2026-11-20" in shown
    exported = json.loads(ok(cli(planner_log, "log", "export", "--format", "json")).stdout)
    assert exported[0]["outcome"] == "failed" and exported[0]["outcome_date"] == "2026-11-20"
    # the outcome goes through export and import unchanged
    other = planner_log.with_name("other.sqlite3")
    export_file = planner_log.with_name("jobs.json")
    export_file.write_text(json.dumps(exported))
    ok(cli(other, "log", "import", str(export_file)))
    with JobLog.open(other) as log:
        assert log.get(1).outcome_date == "2026-11-20"


@pytest.mark.parametrize("argv, words", [
    (["--outcome", "failed"], "failed needs the date"),
    (["--outcome", "broken"], "--outcome"),
    (["--outcome", "removed", "2026-01-01", "extra"], "--outcome"),
    (["--fitted-on", "2026-13-01"], "fitted_on"),
    (["--fitted-on", "2026-12-01", "--outcome", "failed", "2026-01-01"], "before the shaft was fitted"),
    ([], "nothing to change"),
])
def test_log_edit_refuses_bad_values_in_one_line_and_changes_nothing(planner_log, argv, words):
    with JobLog.open(planner_log) as log:
        before = log.get(1)
    one_line_error(cli(planner_log, "log", "edit", "1", *argv), words)
    with JobLog.open(planner_log) as log:
        assert log.get(1) == before and log.changes(1) == []


def test_saving_a_reopened_job_again_updates_it_in_place(planner_log):
    with JobLog.open(planner_log) as log:
        before = log.get(2)
        inputs = dict(before.inputs, shaft="round 35mm keyed")
        from workbench.job import evaluate_inputs

        after = log.replace_result(2, inputs, evaluate_inputs(inputs), note="rechecked with the 35 mm bar")
        assert after.id == 2 and after.created_at == before.created_at and log.count() == 3
        assert after.inputs["shaft"] == "round 35mm keyed" and after.note == "rechecked with the 35 mm bar"
        fields = [c["field"] for c in log.changes(2)]
        assert fields[0] == "result" and "note" in fields
        assert log.count(text="round 35mm") == 1 and log.count(text="round 25mm") == 0


# --------------------------------------------------------------------------------------------
# one bad stored row


def _spoil(path: Path, job_id: int, column: str, text: str) -> None:
    """Store one job's inputs or result as ``text``: the payload (format 0, the uncompressed JSON
    ``[inputs, result]``) is rewritten with that part replaced by the text as given."""
    from workbench.store import payload

    conn = sqlite3.connect(path)
    (blob,) = conn.execute("SELECT payload FROM jobs WHERE id = ?", (job_id,)).fetchone()
    inputs, result = payload.decode(blob)
    parts = {"inputs_json": json.dumps(inputs), "result_json": json.dumps(result), column: text}
    spoiled = bytes([payload.FORMAT_PLAIN]) + f"[{parts['inputs_json']},{parts['result_json']}]".encode()
    conn.execute("UPDATE jobs SET payload = ? WHERE id = ?", (spoiled, job_id))
    conn.commit()
    conn.close()


@pytest.mark.parametrize("column, text", [("result_json", "{not json"), ("inputs_json", "null"),
                                          ("result_json", "[1, 2]")])
def test_one_bad_row_does_not_block_the_rest(planner_log, column, text):
    _spoil(planner_log, 2, column, text)
    done = ok(cli(planner_log, "log", "list", "--json"))
    assert sorted(job["id"] for job in json.loads(done.stdout)) == [1, 3]
    assert "job 2 cannot be read" in done.stderr and "skipped" in done.stderr
    done = ok(cli(planner_log, "log", "list"))
    assert "2 of" in done.stdout or "2 jobs" in done.stdout or "CV-07" in done.stdout
    done = ok(cli(planner_log, "log", "export", "--format", "json"))
    assert [job["id"] for job in json.loads(done.stdout)] == [1, 3] and "job 2" in done.stderr
    ok(cli(planner_log, "log", "export", "--format", "csv"))
    one_line_error(cli(planner_log, "log", "show", "2"), "job 2 cannot be read")
    ok(cli(planner_log, "log", "show", "1"))


# --------------------------------------------------------------------------------------------
# dates at the calendar's edges and pathological imports


@pytest.mark.parametrize("argv, count", [
    (["--until", "9999-12-31"], 3),
    (["--since", "0001-01-01"], 3),
    (["--since", "0001-01-01T00:00:00+01:00"], 3),
    (["--until", "0001-01-01T00:00:00+01:00"], 0),
    (["--since", "9999-12-31T23:59:59-05:00"], 0),
    (["--until", "9999-12-31T23:59:59-05:00"], 3),
    (["--since", "9999-12-31"], 0),
])
def test_dates_at_the_calendar_edges(planner_log, argv, count):
    done = ok(cli(planner_log, "log", "list", "--json", *argv))
    assert len(json.loads(done.stdout)) == count


def _import(tmp_path: Path, text: str) -> subprocess.CompletedProcess[str]:
    source = tmp_path / "import.json"
    source.write_text(text)
    return cli(tmp_path / "target.sqlite3", "log", "import", str(source))


def _job(**changes) -> dict:
    return {"inputs": JOB_INPUTS["demo"], "result": result_for("demo"), **changes}


def test_an_import_nested_100000_deep_is_one_line(tmp_path):
    one_line_error(_import(tmp_path, "[" * 100_000 + "]" * 100_000), "nested too deeply")


def test_an_import_with_a_5000_digit_integer_is_one_line(tmp_path):
    one_line_error(_import(tmp_path, '[{"inputs": {}, "result": {"x": ' + "9" * 5000 + "}}]"), "cannot be read")


@pytest.mark.parametrize("created_at", ["9999-12-31T23:59:59-01:00", "0001-01-01T00:00:00+01:00", "not a time",
                                        "2026-02-30T00:00:00Z"])
def test_an_import_with_an_impossible_created_at_is_one_line(tmp_path, created_at):
    one_line_error(_import(tmp_path, json.dumps([_job(created_at=created_at)])), "created_at")
    assert not (tmp_path / "target.sqlite3").exists() or JobLog.open(tmp_path / "target.sqlite3").count() == 0


def test_nan_imported_is_exported_as_null(tmp_path):
    result = result_for("demo")
    result["shafts"][0]["static_safety_factor"] = float("nan")
    result["shafts"][1]["fatigue_safety_factor"] = float("inf")
    ok(_import(tmp_path, json.dumps([{"inputs": JOB_INPUTS["demo"], "result": result}])))  # Python writes NaN
    text = ok(cli(tmp_path / "target.sqlite3", "log", "export", "--format", "json")).stdout
    assert "NaN" not in text and "Infinity" not in text

    def refuse(name: str) -> None:
        raise AssertionError(f"non-strict JSON constant {name}")

    job = json.loads(text, parse_constant=refuse)[0]
    assert job["result"]["shafts"][0]["static_safety_factor"] is None
    shown = ok(cli(tmp_path / "target.sqlite3", "log", "show", "1", "--json")).stdout
    json.loads(shown, parse_constant=refuse)
    # importing the export again adds nothing: the stored result is the strict one
    again = tmp_path / "again.json"
    again.write_text(text)
    assert "imported 0 jobs" in ok(cli(tmp_path / "target.sqlite3", "log", "import", str(again))).stdout


def test_the_soak_shows_an_interrupted_checkpoint_recovered():
    root = Path(__file__).resolve().parents[2]
    done = subprocess.run([PYTHON, str(root / "bench" / "soak_log.py"), "--rounds", "6", "--seconds", "60",
                           "--seed", "3"], capture_output=True, text=True, env=subprocess_env(), timeout=300)
    assert done.returncode == 0, done.stdout + done.stderr
    figures = json.loads(done.stdout.strip().splitlines()[-1])
    assert figures["kept"] == figures["reported"] > 0
    assert figures["recovered"] >= 1 and figures["refused"] == 0 and figures["integrity_ok"]

