"""Timing figures for the calculation core and the command's start-up, each against its anchor.

    python bench/bench_core.py [--repeat 500] [--runs 15]

Every figure is a median with its range (min-max) over the samples, never a best-of.

1. In-process, one evaluation through the job contract ``evaluate_inputs`` (strings in, result
   dict out: unit parsing, both shafts' section, static, fatigue, twist, the comparison, the dict):
   - the demo job;
   - a job that is not the demo with a new motor speed on every call (what a keystroke in the
     speed field costs): each call parses, places, checks every step, solves the beam under load
     and builds the dict afresh; what depends on the geometry alone - the shaft's own-weight beam
     and the critical speed - is remembered from the call before, as the workbench does;
   - the same job with a new motor speed AND a new bearing span on every call (a span never used
     before, so nothing remembered can serve it: the own-weight beam and the critical speed are
     solved afresh as well; only ISO 286 table look-ups repeat);
   - the demo with every unit spelling read by pint (the table of common spellings switched off),
     to show what the table saves;
   - the core alone (``workbench.core.evaluate.evaluate`` on pre-parsed SI inputs, the uniform bars
     without the demo's layout: the part that is not step by step).
   The demo repeated is what the workbench does on a keystroke: the critical speed (which depends
   on the geometry and masses, not the load) and the ISO 286 look-ups are remembered between calls.
   Anchor: 0.5 ms, the goal now that shafts are checked step by step (0.25 ms before).
2. Whole process, wall time from spawn to exit, run alternately side by side in one loop so machine
   noise hits each the same: ``shaftbench check --demo --json``, ``shaftbench check <a non-demo job,
   a new speed each run> --json``, the anchor ``python -c "import pint; pint.UnitRegistry()"`` and
   ``python -c pass`` (the interpreter alone). Ratios are of medians; goal <= 0.4x the anchor.
   The processes include interpreter start-up, imports, argument parsing, the evaluation and the
   JSON written to a pipe (discarded); bytecode caches are warm, as after an install
   (PYTHONDONTWRITEBYTECODE is dropped for these processes and one untimed run of each goes first).

Figures only; no pass/fail.
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

EVAL_ANCHOR_MS = 0.5
PROCESS_GOAL = 0.4

NON_DEMO = {
    "power": "11 kW", "speed": "970 rpm", "ratio": "2.5", "efficiency": "0.95", "service_factor": "1.25",
    "mount": "sprocket", "pitch_diameter": "180 mm", "overhang": "45 mm",
    "shaft": "round 45mm keyed", "candidate": "hex 55mm", "material": "4140-qt540",
    "bearing_span": "400 mm", "hub_length": "70 mm", "element_mass": "4 kg",
}


def spread(samples: list[float], scale: float = 1e3, digits: int = 3) -> str:
    """'median [min-max]' of samples, scaled (default s -> ms)."""
    s = sorted(samples)
    return f"{statistics.median(s) * scale:.{digits}f} [{s[0] * scale:.{digits}f}-{s[-1] * scale:.{digits}f}]"


def _samples(func, repeat: int) -> list[float]:
    """Wall times [s] of ``repeat`` calls of ``func(i)`` after a warm-up."""
    warm = max(5, repeat // 20)
    for i in range(warm):
        func(i)
    out = []
    for i in range(warm, warm + repeat):  # numbers the warm-up did not use
        start = time.perf_counter()
        func(i)
        out.append(time.perf_counter() - start)
    return out


def bench_evaluation(repeat: int) -> None:
    from workbench import unit_table
    from workbench.core.evaluate import evaluate
    from workbench.demo import demo_inputs
    from workbench.job import _drive, _mount, _settings, evaluate_inputs, parse_cases

    demo = demo_inputs()
    loads, mount, settings, cases = _drive(demo), _mount(demo), _settings(demo), parse_cases(demo)
    checks, comparison = evaluate(loads, mount, cases, settings)  # the uniform bars, without the layout
    assert len(checks) == 2 and comparison is not None, "the demo job must have both shafts"

    def new_speed(i: int) -> None:
        evaluate_inputs({**NON_DEMO, "speed": f"{900 + i % 500} rpm"})

    def new_geometry(i: int) -> None:  # a span to 0.01 mm, never the same twice in a run
        evaluate_inputs({**NON_DEMO, "speed": f"{900 + i % 500} rpm", "bearing_span": f"{380 + i / 100:.2f} mm"})

    def pint_only(i: int) -> None:
        with unit_table.pint_only():
            evaluate_inputs(demo)

    rows = [
        ("evaluate_inputs(demo)", _samples(lambda i: evaluate_inputs(demo), repeat)),
        ("evaluate_inputs(non-demo, new speed each call)", _samples(new_speed, repeat)),
        ("evaluate_inputs(non-demo, new speed and span each call)", _samples(new_geometry, repeat)),
        ("evaluate_inputs(demo), every unit through pint", _samples(pint_only, repeat)),
        ("core evaluate(pre-parsed demo, no layout)", _samples(lambda i: evaluate(loads, mount, cases, settings), repeat)),
    ]
    print(f"one evaluation in-process, ms: median [min-max] of {repeat}; anchor {EVAL_ANCHOR_MS} ms")
    for label, samples in rows:
        ratio = statistics.median(samples) * 1e3 / EVAL_ANCHOR_MS
        print(f"  {label:55s} {spread(samples):>24s}   {ratio:5.2f}x anchor")


def _command() -> list[str]:
    """The installed console script beside this interpreter, else ``python -m workbench``."""
    script = pathlib.Path(sys.executable).with_name("shaftbench")
    if script.exists():
        return [str(script)]
    found = shutil.which("shaftbench")
    return [found] if found else [sys.executable, "-m", "workbench"]


def _wall_s(argv: list[str], env: dict) -> float:
    start = time.perf_counter()
    proc = subprocess.run(argv, stdout=subprocess.PIPE, stderr=subprocess.PIPE, env=env)
    elapsed = time.perf_counter() - start
    if proc.returncode != 0:
        raise SystemExit(f"{' '.join(argv)} failed: {proc.stderr.decode(errors='replace').strip()}")
    return elapsed


def _non_demo_argv(run: int) -> list[str]:
    argv = [*_command(), "check", "--json"]
    for key, value in {**NON_DEMO, "speed": f"{900 + 7 * run} rpm", "bearing_span": f"{380 + run} mm"}.items():
        argv += [f"--{key.replace('_', '-')}", value]
    return argv


def bench_process(runs: int) -> None:
    # bytecode caches warm, as after an install (pip compiles them): the environment may forbid writing them
    env = {k: v for k, v in os.environ.items() if k != "PYTHONDONTWRITEBYTECODE"}
    commands = {
        "shaftbench check --demo --json": lambda run: [*_command(), "check", "--demo", "--json"],
        "shaftbench check <non-demo job> --json": _non_demo_argv,
        'anchor: python -c "import pint; pint.UnitRegistry()"':
            lambda run: [sys.executable, "-c", "import pint; pint.UnitRegistry()"],
        "python -c pass": lambda run: [sys.executable, "-c", "pass"],
    }
    for make in commands.values():  # warm the file cache, bytecode and pint's definition cache
        _wall_s(make(0), env)
    samples: dict[str, list[float]] = {label: [] for label in commands}
    order = list(commands)
    for run in range(runs):  # alternate: each round runs every command once, order rotated
        for label in order[run % len(order):] + order[: run % len(order)]:
            samples[label].append(_wall_s(commands[label](run), env))
    anchor = statistics.median(samples[order[2]])
    print(f"whole process, ms: median [min-max] of {runs} alternating runs; ratio = median / anchor median "
          f"(goal <= {PROCESS_GOAL}x)")
    for label in order:
        ratio = statistics.median(samples[label]) / anchor
        print(f"  {label:52s} {spread(samples[label], digits=1):>22s}   {ratio:5.2f}x anchor")


def main(argv: list[str] | None = None) -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--repeat", type=int, default=500, help="timed calls per in-process figure")
    parser.add_argument("--runs", type=int, default=15, help="process runs of each command, alternating")
    args = parser.parse_args(argv)
    print(f"python {platform.python_version()} on {platform.machine()}, {os.cpu_count()} CPUs, "
          f"load average {os.getloadavg()[0]:.1f} (figures read true only near 0)")
    bench_evaluation(args.repeat)
    bench_process(args.runs)
    print(f"load average at the end {os.getloadavg()[0]:.1f}")


if __name__ == "__main__":
    main()
