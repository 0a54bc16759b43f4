"""Job log timings: size per job, durable save, open + first page + count, and text filters.

    python bench/bench_log.py [--jobs 1000000] [--saves 200] [--keep FILE]
                              [--pg URL] [--pg-jobs 100000]

Fills a fresh SQLite log with generated jobs by the bulk insert path (results computed once per
distinct input set with the real ``evaluate_inputs``, each stored row built by ``values.job_row`` -
the compressed payload is made once per distinct result and reused - inserted in one transaction;
the text index and the counts are made at its end, in the same transaction), then times real
``save()`` calls (synchronous=FULL, one durable commit each, every trigger live) and the reads a
person waits for. With ``--pg URL`` (or $SHAFTBENCH_BENCH_PG) the same is done on a PostgreSQL log
at --pg-jobs jobs (its tables are dropped first: use a scratch database).
Prints medians with their range (min-max over the repetitions) and never asserts; targets (speed
issue): <= 1.2 KB a job on disk, save <= 20 ms, open + first page + total count <= 50 ms at 1M jobs,
any text filter + first page <= 100 ms. A filter's exact count is timed on a line of its own: the
review screen shows the page first and the count when it is ready. Words of one or two characters
(``p-``, ``7``, ``li``) are looked up through the trigrams they begin (workbench/store/text_search.py).
Each text-filter repetition starts with ``forget_counts()``, as if the filter had just been typed;
open is a new connection each time.
"""

from __future__ import annotations

import argparse
import os
import random
import shutil
import statistics
import tempfile
import time
from datetime import datetime, timedelta, timezone
from pathlib import Path

from workbench.job import JobInputError, evaluate_inputs
from workbench.store import JobLog, payload
from workbench.store.values import job_row

SITES = ["Brindlemoor Quarry", "Ashgrove Mill", "Harbour Pumping Station", "Kestrel Bakery", "North Yard"]
MACHINES = ["conveyor", "crusher", "fan", "mixer", "pump", "screen", "agitator", "hoist"]
SHAFTS = ["round {d}mm keyed", "round {d}mm", "square {d}mm", "hex {d}mm", "tube {d}mm/{i}mm"]
MATERIALS = ["1045-cd", "1045-hr", "1018-cd", "4140-qt425", "4140-ann", "1144-cd"]
MOUNTS = ["coupling", "sprocket", "vbelt", "gear", "timing-belt"]


def varied_inputs(rng: random.Random) -> dict[str, str]:
    d = rng.choice([20, 25, 30, 35, 40, 45, 50, 60])
    inputs = {
        "power": f"{rng.choice([0.75, 1.5, 2.2, 4, 5.5, 7.5, 11, 15, 22])} kW",
        "speed": f"{rng.choice([960, 1450, 1460, 2900])} rpm",
        "ratio": str(rng.choice([1, 2, 3.2, 5])),
        "mount": rng.choice(MOUNTS),
        "shaft": rng.choice(SHAFTS).format(d=d, i=d - 10),
        "material": rng.choice(MATERIALS),
    }
    if inputs["mount"] != "coupling":
        inputs["pitch_diameter"] = f"{rng.choice([100, 150, 200, 250])} mm"
        inputs["overhang"] = f"{rng.choice([40, 60, 80])} mm"
    return inputs


def computed_jobs(rng: random.Random, distinct: int) -> list[tuple[dict[str, str], dict]]:
    jobs = []
    while len(jobs) < distinct:
        inputs = varied_inputs(rng)
        try:
            jobs.append((inputs, evaluate_inputs(dict(inputs))))
        except JobInputError:
            continue
    return jobs


def generated_rows(jobs: list[tuple[dict[str, str], dict]], count: int, rng: random.Random):
    """``count`` stored rows (values.job_row tuples) with varied notes over the distinct jobs."""
    start = datetime(2023, 1, 1, tzinfo=timezone.utc)
    encoded = [payload.encode(inputs, result) for inputs, result in jobs]
    for i in range(count):
        inputs, result = jobs[i % len(jobs)]
        meta = {
            "asset": f"{rng.choice(MACHINES).upper()[:3]}-{rng.randint(1, 999):03d} {rng.choice(MACHINES)}",
            "location": f"{rng.choice(SITES)}, line {rng.randint(1, 9)}",
            "by": rng.choice(["A. Fitter", "B. Turner", "C. Wright"]),
            "note": rng.choice(["", "keyseat wear", "bearing seat fretted", "sheared at shoulder", "bent"]),
        }
        created = (start + timedelta(minutes=i)).isoformat(timespec="microseconds")
        yield job_row(inputs, result, meta, created_at=created, bench=f"bench-{i % 7}",
                      stored_payload=encoded[i % len(jobs)])


def fill(log: JobLog, jobs: list[tuple[dict[str, str], dict]], count: int, rng: random.Random) -> float:
    t0 = time.perf_counter()
    log.bulk_insert(generated_rows(jobs, count, rng))
    return time.perf_counter() - t0


def timed(action, repeat: int) -> list[float]:
    times = []
    for _ in range(repeat):
        t0 = time.perf_counter()
        action()
        times.append((time.perf_counter() - t0) * 1000)
    return times


def line(label: str, times_ms: list[float], target_ms: float | None) -> None:
    times_ms = sorted(times_ms)
    goal = f"target <= {target_ms:g} ms" if target_ms is not None else "shown after the page"
    print(f"{label:<64} median {statistics.median(times_ms):7.2f} ms  range {times_ms[0]:7.2f}-"
          f"{times_ms[-1]:<7.2f}  ({goal}, n={len(times_ms)})")


FILTERS = (("sheared kestrel", None), ("pump", None), ("zzzz", None), ("4140", None),
           ("crusher line 3", None), ("bent", "fail"), ("mill li", None), ("p-", None), ("7", None),
           ("li", None))


def measure(label: str, target: str, jobs, count: int, saves: int, rng: random.Random,
            size_of=None) -> None:
    """Fill the log at ``target`` with ``count`` jobs and print every figure for it."""
    print(f"--- {label}: {count:,} jobs")
    with JobLog.open(target) as log:
        seconds = fill(log, jobs, count, rng)
        print(f"filled {log.count():,} jobs in {seconds:.1f} s (bulk insert, one transaction)")
        if size_of is not None:
            size = size_of(log)
            print(f"on disk {size / 1e6:.0f} MB = {size / count:.0f} bytes a job (target <= 1200)")
        times = []
        for i in range(saves):
            inputs, result = jobs[i % len(jobs)]
            t = time.perf_counter()
            log.save(inputs, result, asset=f"BENCH-{i}", location="bench", by="bench")
            times.append((time.perf_counter() - t) * 1000)
        line("save() one job, durable commit", times, 20)

    def open_first_page() -> None:
        with JobLog.open(target) as fresh:
            fresh.search(limit=50)
            fresh.count()

    line("open log + first page (50) + total count", timed(open_first_page, 20), 50)

    with JobLog.open(target) as log:
        for text, verdict in FILTERS:
            found = log.count(text=text, verdict=verdict)

            def search(text: str = text, verdict: str | None = verdict) -> None:
                log.forget_counts()  # as if this filter was just typed: nothing remembered
                log.search(text=text, verdict=verdict, limit=50)

            def count(text: str = text, verdict: str | None = verdict) -> None:
                log.forget_counts()
                log.count(text=text, verdict=verdict)

            also = f" + verdict {verdict}" if verdict else ""
            line(f"text filter '{text}'{also} + first page ({found:,} found)", timed(search, 11), 100)
            line(f"   its exact count, timed on its own", timed(count, 5), None)

        def verdict_fail() -> None:
            log.forget_counts()
            log.count(verdict="fail")
            log.search(verdict="fail")

        line("verdict filter 'fail' + page + count", timed(verdict_fail, 11), 50)
        line("page at offset 25,000 (50 rows)", timed(lambda: log.search(limit=50, offset=25_000), 11), 50)


def sqlite_size(log) -> int:
    log.conn.execute("PRAGMA wal_checkpoint(TRUNCATE)")
    return log.path.stat().st_size


def pg_size(log) -> int:
    return int(log._read("SELECT pg_total_relation_size('jobs')")[0][0])


def main() -> None:
    parser = argparse.ArgumentParser(description=(__doc__ or "").splitlines()[0])
    parser.add_argument("--jobs", type=int, default=1_000_000)
    parser.add_argument("--saves", type=int, default=100)
    parser.add_argument("--keep", type=Path, help="build the SQLite log at this path and keep it")
    parser.add_argument("--pg", default=os.environ.get("SHAFTBENCH_BENCH_PG", ""),
                        help="PostgreSQL URL of a scratch database (its job tables are dropped)")
    parser.add_argument("--pg-jobs", type=int, default=100_000)
    args = parser.parse_args()
    rng = random.Random(7)
    t0 = time.perf_counter()
    jobs = computed_jobs(rng, 300)
    print(f"computed {len(jobs)} distinct results in {time.perf_counter() - t0:.2f} s; "
          f"{os.cpu_count()} CPUs")
    if args.jobs:
        folder = None if args.keep else Path(tempfile.mkdtemp(prefix="shaftbench-bench-"))
        path = args.keep or folder / "jobs.sqlite3"
        measure("SQLite", str(path), jobs, args.jobs, args.saves, rng, sqlite_size)
        if folder is not None:
            shutil.rmtree(folder)
    if args.pg:
        from workbench.store.pg_log import drop_log_tables

        drop_log_tables(args.pg)
        measure("PostgreSQL", args.pg, jobs, args.pg_jobs, args.saves, rng, pg_size)
        drop_log_tables(args.pg)


if __name__ == "__main__":
    main()
