"""Random-kill soak of the job log: saves cut short at random moments, every reported save checked.

    python bench/soak_log.py [--rounds 40] [--seconds 60] [--seed 1]

Each round runs one child process against the same log and ends it one of two ways, picked at random:

- kill: a child saving in a loop (each save reported on stdout once it returned) is SIGKILLed after a
  random delay - anywhere in a save, between saves, or in an automatic checkpoint;
- checkpoint cut: ``shaftbench check --demo --save`` with a file-size limit (RLIMIT_FSIZE) at or just
  above the log file's size, so the checkpoint on close stops part way when it first grows the file;
  with SIGXFSZ at its default the child dies there, with it ignored it reports its save and exits.

After each round the log is opened the way every command opens it. The soak prints the saves
reported and kept, the checkpoint interruptions hit (main file shorter than its header says, WAL
frames beside it - the state older versions refused as damaged) and how many of them SQLite
recovered. It exits with 1 if any reported save is missing or the log was ever refused.
Bounded: at most ``--rounds`` rounds and about ``--seconds`` seconds.
"""

from __future__ import annotations

import argparse
import json
import os
import random
import resource
import signal
import subprocess
import sys
import tempfile
import textwrap
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

SAVE_LOOP = textwrap.dedent(
    """
    import sys
    from workbench.demo import demo_inputs
    from workbench.job import evaluate_inputs
    from workbench.store import JobLog
    inputs = demo_inputs()
    result = evaluate_inputs(inputs)
    with JobLog.open(sys.argv[1]) as log:
        print("ready", flush=True)
        n = 0
        while True:
            print(log.save(inputs, result, asset=f"soak-{n}"), flush=True)
            n += 1
    """
)
CLI = "import signal, sys\n{xfsz}from workbench.cli import main\nsys.exit(main(sys.argv[1:]))\n"


def _env(log: Path) -> dict[str, str]:
    env = dict(os.environ)
    env["PYTHONPATH"] = os.pathsep.join(p for p in (str(ROOT), env.get("PYTHONPATH", "")) if p)
    env["SHAFTBENCH_LOG"] = str(log)
    return env


def _checkpoint_cut(log: Path) -> bool:
    from workbench.store.sqlite_files import has_wal_frames, read_header

    header = read_header(log)
    return header is not None and header.short and has_wal_frames(log)


def _kill_round(log: Path, rng: random.Random) -> list[int]:
    child = subprocess.Popen([sys.executable, "-c", SAVE_LOOP, str(log)], stdout=subprocess.PIPE,
                             stderr=subprocess.DEVNULL, text=True, env=_env(log))
    assert child.stdout is not None
    child.stdout.readline()  # "ready": the log is open
    time.sleep(rng.uniform(0.0, 0.25))
    child.send_signal(signal.SIGKILL)
    out, _ = child.communicate(timeout=60)
    return [int(x) for x in out.split() if x.isdigit()]


def _checkpoint_round(log: Path, rng: random.Random) -> list[int]:
    limit = log.stat().st_size + rng.choice((0, 0, 4096))
    xfsz = "signal.signal(signal.SIGXFSZ, signal.SIG_DFL)\n" if rng.random() < 0.5 else ""

    def prepare() -> None:
        resource.setrlimit(resource.RLIMIT_FSIZE, (limit, resource.RLIM_INFINITY))

    # a long note makes the save grow the main file (stored jobs are compressed and small)
    done = subprocess.run([sys.executable, "-c", CLI.format(xfsz=xfsz), "check", "--demo", "--save",
                           "--note", "worn " * 800],
                          capture_output=True, text=True, env=_env(log), preexec_fn=prepare, timeout=120)
    marker = "saved as job "
    return [int(done.stdout.split(marker, 1)[1].split()[0])] if marker in done.stdout else []


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--rounds", type=int, default=40, help="at most this many rounds (default 40)")
    parser.add_argument("--seconds", type=float, default=60.0, help="stop after about this long (default 60)")
    parser.add_argument("--seed", type=int, default=1, help="random seed (default 1)")
    args = parser.parse_args(argv)
    rng = random.Random(args.seed)

    from workbench.demo import demo_inputs
    from workbench.job import evaluate_inputs
    from workbench.store import JobLog, LogError

    folder = Path(tempfile.mkdtemp(prefix="soak-log-"))
    log = folder / "jobs.sqlite3"
    inputs = demo_inputs()
    result = evaluate_inputs(inputs)
    with JobLog.open(log) as first:  # a log big enough that a save's WAL fits under the size limit
        for n in range(40):
            first.save(inputs, result, asset=f"seed-{n}", note="keyseat fretted, bearing seat worn " * 60)

    reported: set[int] = set()
    rounds = hits = recovered = refused = 0
    started = time.monotonic()
    while rounds < args.rounds and time.monotonic() - started < args.seconds:
        rounds += 1
        mode = "checkpoint" if rng.random() < 0.5 else "kill"
        ids = _checkpoint_round(log, rng) if mode == "checkpoint" else _kill_round(log, rng)
        reported.update(ids)
        cut = _checkpoint_cut(log)
        hits += cut
        try:
            with JobLog.open(log) as check:
                stored = {r.id for r in check.search(limit=10_000_000)}
        except LogError as err:
            refused += 1
            print(f"round {rounds} ({mode}): the log was refused: {err}")
            continue
        missing = reported - stored
        if missing:
            print(f"round {rounds} ({mode}): reported saves missing: {sorted(missing)}")
        elif cut:
            recovered += 1
    with JobLog.open(log) as check:
        stored = {r.id for r in check.search(limit=10_000_000)}
        sound = check.integrity_ok()
    kept = len(reported & stored)
    seconds = time.monotonic() - started
    print(f"rounds                          {rounds} in {seconds:.1f} s (seed {args.seed})")
    print(f"saves reported                  {len(reported)}")
    print(f"saves kept                      {kept}")
    print(f"checkpoint interruptions hit    {hits}")
    print(f"  recovered with every job      {recovered}")
    print(f"log refused                     {refused}")
    print(f"integrity check                 {'ok' if sound else 'FAILED'}")
    print(json.dumps({"rounds": rounds, "reported": len(reported), "kept": kept, "checkpoint_cuts": hits,
                      "recovered": recovered, "refused": refused, "integrity_ok": sound}))
    ok = kept == len(reported) and refused == 0 and sound
    return 0 if ok else 1


if __name__ == "__main__":
    raise SystemExit(main())
