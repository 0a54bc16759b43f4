"""Job log timings: durable save, open + first page, and text filter over a large log.

    python bench/bench_log.py [--jobs 100000] [--saves 200] [--keep FILE]

Fills a fresh log with generated jobs (results computed once per distinct input set with the real
``evaluate_inputs`` and reused, inserted in one import transaction), then times real ``save()``
calls and the reads a person waits for. Prints figures only; targets are in the brief:
save <= 20 ms a job, open + first page <= 50 ms, text filter over all jobs <= 50 ms.
Each text-filter repetition starts with ``forget_counts()``, as if the filter had just been typed.
"""

from __future__ import annotations

import argparse
import random
import statistics
import tempfile
import time
from datetime import datetime, timedelta, timezone
from pathlib import Path

from workbench.job import JobInputError, evaluate_inputs
from workbench.store import JobLog

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


def fill(log: JobLog, jobs: list[tuple[dict[str, str], dict]], count: int, rng: random.Random) -> float:
    start = datetime(2023, 1, 1, tzinfo=timezone.utc)
    rows = []
    for i in range(count):
        inputs, result = jobs[i % len(jobs)]
        rows.append({
            "inputs": inputs,
            "result": result,
            "created_at": (start + timedelta(minutes=15 * i)).isoformat(),
            "asset": f"{rng.choice(MACHINES).upper()[:3]}-{rng.randint(1, 999):03d} {rng.choice(MACHINES)}",
            "location": f"{rng.choice(SITES)}, line {rng.randint(1, 9)}",
            "by": rng.choice(["A. Fitter", "B. Turner", "C. Wright"]),
            "note": rng.choice(["", "keyseat wear", "bearing seat fretted", "sheared at shoulder", "bent"]),
        })
    t0 = time.perf_counter()
    log.import_jobs(rows)
    return time.perf_counter() - t0


def timed(action, repeat: int) -> list[float]:
    times = []
    for _ in range(repeat):
        t0 = time.perf_counter()
        action()
        times.append((time.perf_counter() - t0) * 1000)
    return times


def line(label: str, times_ms: list[float], target_ms: float) -> None:
    times_ms = sorted(times_ms)
    p95 = times_ms[min(len(times_ms) - 1, int(0.95 * len(times_ms)))]
    print(f"{label:<62} median {statistics.median(times_ms):7.2f} ms  best {times_ms[0]:7.2f}  "
          f"p95 {p95:7.2f}  (target <= {target_ms:g} ms, n={len(times_ms)})")


def main() -> None:
    parser = argparse.ArgumentParser(description=(__doc__ or "").splitlines()[0])
    parser.add_argument("--jobs", type=int, default=100_000)
    parser.add_argument("--saves", type=int, default=200)
    parser.add_argument("--keep", type=Path, help="build the log at this path and keep it")
    args = parser.parse_args()
    rng = random.Random(7)
    folder = None if args.keep else Path(tempfile.mkdtemp(prefix="shaftbench-bench-"))
    path = args.keep or folder / "jobs.sqlite3"

    t0 = time.perf_counter()
    jobs = computed_jobs(rng, 300)
    print(f"computed {len(jobs)} distinct results in {time.perf_counter() - t0:.2f} s")
    with JobLog.open(path) as log:
        seconds = fill(log, jobs, args.jobs, rng)
        print(f"filled {log.count():,} jobs in {seconds:.1f} s (one import transaction); "
              f"file {path.stat().st_size / 1e6:.0f} MB")

        saves = []
        for i in range(args.saves):
            inputs, result = jobs[i % len(jobs)]
            t = time.perf_counter()
            log.save(inputs, result, asset=f"BENCH-{i}", location="bench", by="bench")
            saves.append((time.perf_counter() - t) * 1000)
        line("save() one job, durable commit", saves, 20)

    def open_first_page() -> None:
        with JobLog.open(path) as fresh:
            fresh.search(limit=50)
            fresh.count()

    line("open log + first page (50) + total count", timed(open_first_page, 20), 50)

    with JobLog.open(path) as log:
        indexed = getattr(log, "text_index", False)
        forget = getattr(log, "forget_counts", lambda: None)  # older logs remember nothing
        print(f"text index (FTS5 trigram): {'yes' if indexed else 'no - LIKE over every row'}")
        for text, verdict in (("sheared kestrel", None), ("pump", None), ("zzzz", None), ("4140", None),
                              ("crusher line 3", None), ("bent", "fail"), ("mill li", None), ("p-", None)):
            found = log.count(text=text, verdict=verdict)

            def search(text: str = text, verdict: str | None = verdict) -> None:
                forget()  # as if this filter was just typed: nothing remembered
                log.count(text=text, verdict=verdict)
                log.search(text=text, verdict=verdict, limit=50)

            also = f" + verdict {verdict}" if verdict else ""
            line(f"text filter '{text}'{also} + count ({found:,} found)", timed(search, 20), 50)

        def verdict_fail() -> None:
            forget()
            log.count(verdict="fail")
            log.search(verdict="fail")

        line("verdict filter 'fail' + count", timed(verdict_fail, 20), 50)
        line("page at offset 25,000 (50 rows)", timed(lambda: log.search(limit=50, offset=25_000), 20), 50)
    if folder is not None:
        for leftover in folder.iterdir():
            leftover.unlink()
        folder.rmdir()


if __name__ == "__main__":
    main()
