"""Timing figures for the calculation core and the command's start-up.

    python bench/bench_core.py [--repeat 300] [--runs 15]

Prints:
1. the median time of one full evaluation of the demo job (both shafts: section, static, fatigue,
   twist, comparison) through the job contract ``evaluate_inputs`` (strings in, result dict out)
   and through the core alone (``workbench.core.evaluate.evaluate`` on pre-parsed SI inputs);
   target <= 2 ms;
2. the whole-process wall time of ``shaftbench check --demo --json`` against a bare
   ``python -c "import pint"``, run alternately side by side, as a ratio of medians; target <= 1.5x.

Figures only; no pass/fail. Run on an idle machine; the ratio is the robust figure when it is not.
"""

from __future__ import annotations

import argparse
import os
import pathlib
import platform
import shutil
import statistics
import subprocess
import sys
import time


def _median_call_s(func, repeat: int) -> tuple[float, float]:
    """Median and minimum wall time [s] of one call of ``func`` over ``repeat`` calls (after warm-up)."""
    for _ in range(max(3, repeat // 20)):
        func()
    samples = []
    for _ in range(repeat):
        start = time.perf_counter()
        func()
        samples.append(time.perf_counter() - start)
    return statistics.median(samples), min(samples)


def bench_evaluation(repeat: int) -> None:
    from workbench.demo import demo_inputs
    from workbench.job import _drive, _mount, _settings, evaluate_inputs, parse_cases
    from workbench.core.evaluate import evaluate

    inputs = demo_inputs()
    # the same objects evaluate_inputs builds from the strings (job.py's parse steps), parsed once
    loads, mount, settings, cases = _drive(inputs), _mount(inputs), _settings(inputs), parse_cases(inputs)
    checks, comparison = evaluate(loads, mount, cases, settings)
    assert len(checks) == 2 and comparison is not None, "the demo job must have both shafts"

    med, low = _median_call_s(lambda: evaluate_inputs(inputs), repeat)
    print(f"evaluate_inputs(demo)            median {med * 1e3:8.3f} ms   min {low * 1e3:8.3f} ms   (target <= 2 ms)")
    med, low = _median_call_s(lambda: evaluate(loads, mount, cases, settings), repeat)
    print(f"core evaluate(pre-parsed demo)   median {med * 1e3:8.3f} ms   min {low * 1e3:8.3f} ms   (target <= 2 ms)")

    from workbench.core.rectangle import rectangle_coefficients

    def uncached() -> None:  # the square candidate's series coefficients recomputed every time
        rectangle_coefficients.cache_clear()
        evaluate(loads, mount, cases, settings)

    med, low = _median_call_s(uncached, repeat)
    print(f"  same, rectangle cache cleared  median {med * 1e3:8.3f} ms   min {low * 1e3:8.3f} ms")


def _command() -> list[str]:
    """The installed console script beside this interpreter, else ``python -m workbench``."""
    script = pathlib.Path(sys.executable).with_name("shaftbench")
    if script.exists():
        return [str(script)]
    found = shutil.which("shaftbench")
    return [found] if found else [sys.executable, "-m", "workbench"]


def _wall_s(argv: list[str], env: dict) -> float:
    start = time.perf_counter()
    proc = subprocess.run(argv, stdout=subprocess.DEVNULL, stderr=subprocess.PIPE, env=env)
    elapsed = time.perf_counter() - start
    if proc.returncode != 0:
        raise SystemExit(f"{' '.join(argv)} failed: {proc.stderr.decode(errors='replace').strip()}")
    return elapsed


def bench_process(runs: int) -> None:
    env = {**os.environ, "PYTHONDONTWRITEBYTECODE": "1"}
    ours = [*_command(), "check", "--demo", "--json"]
    bare = [sys.executable, "-c", "import pint"]
    _wall_s(ours, env), _wall_s(bare, env)  # warm the file cache and pint's definition cache
    ours_s, bare_s = [], []
    for i in range(runs):
        pair = ((ours, ours_s), (bare, bare_s)) if i % 2 == 0 else ((bare, bare_s), (ours, ours_s))
        for argv, samples in pair:
            samples.append(_wall_s(argv, env))
    m_ours, m_bare = statistics.median(ours_s), statistics.median(bare_s)
    print(f"shaftbench check --demo --json   median {m_ours * 1e3:8.1f} ms   min {min(ours_s) * 1e3:8.1f} ms   ({runs} runs)")
    print(f"python -c 'import pint'          median {m_bare * 1e3:8.1f} ms   min {min(bare_s) * 1e3:8.1f} ms   ({runs} runs)")
    print(f"ratio of medians                 {m_ours / m_bare:8.2f} x   (target <= 1.5x)")


def main(argv: list[str] | None = None) -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--repeat", type=int, default=300, help="timed calls per in-process figure")
    parser.add_argument("--runs", type=int, default=15, help="process runs of each command, alternating")
    args = parser.parse_args(argv)
    print(f"python {platform.python_version()} on {platform.machine()}, {os.cpu_count()} CPUs")
    bench_evaluation(args.repeat)
    bench_process(args.runs)


if __name__ == "__main__":
    main()
