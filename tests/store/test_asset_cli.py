"""``shaftbench log asset TAG``, ``log assets``, ``log seed-demo`` and ``log import`` from a bench's
SQLite log, on both engines. Expected figures are the demo history's dates worked by hand."""

from __future__ import annotations

import json

from store_helpers import JOB_INPUTS, result_for

from workbench.demo_history import demo_history_rows
from workbench.store import JobLog


def run(argv: list[str]) -> int:
    from workbench.cli import main

    try:
        return main(argv)
    except SystemExit as exit_:
        return int(exit_.code or 0)


def test_seed_demo_then_asset_history_as_json(log_target, capsys):
    assert run(["log", "seed-demo", "--log", log_target]) == 0
    assert run(["log", "seed-demo", "--log", log_target]) == 0  # again adds nothing
    assert "added 0 demo jobs" in capsys.readouterr().out
    assert run(["log", "asset", "cv 7", "--json", "--log", log_target]) == 0
    history = json.loads(capsys.readouterr().out)
    assert history["tag"] == "CV-07" and len(history["replacements"]) == 4
    # 2023-02-11 -> 2024-03-15: 323 days to the end of 2023 (365 - 42) + 75 in 2024 (31+29+15) = 398
    # 2024-03-16 -> 2025-03-01: 350; 2025-03-03 -> 2025-06-20: 109
    assert [r["days"] for r in history["replacements"][:3]] == [398, 350, 109]
    assert history["replacements"][3]["end_from"] == "still in"
    assert history["mtbr_days"] == (398 + 350 + 109) / 3
    assert any("MARGINAL" in flag for flag in history["flags"])


def test_assets_lists_the_most_replaced_first_and_the_text_view_prints(log_target, capsys):
    with JobLog.open(log_target) as log:
        log.import_jobs(demo_history_rows())
        log.save(JOB_INPUTS["small-fan"], result_for("small-fan"), asset="FN-2 roof fan")
    assert run(["log", "assets", "--json", "--log", log_target]) == 0
    found = json.loads(capsys.readouterr().out)
    assert [(a["tag"], a["shafts"]) for a in found] == [("CV-07", 4), ("FN-2", 1)]
    assert run(["log", "asset", "CV-07 head drive", "--log", log_target]) == 0
    out = capsys.readouterr().out
    assert "MTBR 286 days" in out and "█" in out and "FLAG" in out
    assert run(["log", "asset", "XX-9", "--log", log_target]) == 2
    assert len(capsys.readouterr().err.strip().splitlines()) == 1


def test_printable_asset_report(log_target, tmp_path, capsys):
    with JobLog.open(log_target) as log:
        log.import_jobs(demo_history_rows())
    page = tmp_path / "cv07.html"
    assert run(["log", "asset", "CV-07", "-o", str(page), "--log", log_target]) == 0
    text = page.read_text(encoding="utf-8")
    assert text.startswith("<!DOCTYPE html>") and "Asset history: CV-07" in text and "square 45mm 1018" in text


def test_import_a_bench_sqlite_log_names_the_bench_and_is_idempotent(log_target, tmp_path, capsys):
    bench_file = tmp_path / "stores-counter.sqlite3"
    with JobLog.open(bench_file) as bench:
        ids = [bench.save(JOB_INPUTS[n], result_for(n), asset=f"T-{n}", bench="") for n in ("demo", "mixer")]
    before = bench_file.read_bytes()
    assert run(["log", "import", str(bench_file), "--log", log_target]) == 0
    assert "imported 2 jobs" in capsys.readouterr().out
    assert run(["log", "import", str(bench_file), "--log", log_target]) == 0
    assert "imported 0 jobs" in capsys.readouterr().out
    assert bench_file.read_bytes() == before  # the source is read from a copy, never changed
    with JobLog.open(log_target) as log:
        rows = sorted(log.export_rows(), key=lambda r: r["origin"])
    # no bench was recorded in the file: the file's name names it
    assert [(r["bench"], r["origin"]) for r in rows] == [("stores-counter", f"stores-counter #{i}") for i in ids]
