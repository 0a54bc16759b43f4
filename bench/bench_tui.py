"""Workbench timing: start-up to the first interactive frame, and the cost of one recompute.

Start-up is measured from just before the process is spawned to the moment Textual reports the
first frame displayed (``events.Ready``), headless, for the workbench on the demo job and for a
bare Textual app with the same number of widgets mounted at that frame (the same number of
inputs, the rest plain text; its scroll container, like the sheet, does not take focus), run
alternately so machine noise hits both. Two figures are printed: the ratio of the medians (target
<= 1.3) and the ratio of the best runs (mean of the fastest third of each), which machine noise
shifts least. The widget counts at the first frame are checked equal and printed.

``--demo-svg PATH`` instead writes a screenshot of the job sheet on the demo job (120 x 40) to
PATH, e.g. ``docs/jobsheet-demo.svg``.

The recompute is what one keystroke costs after the debounce: read the sheet, evaluate the job
through the contract, and update the sheet marks and the verdict panel (median of many edits).

    python bench/bench_tui.py [--runs 15] [--edits 200]
"""

from __future__ import annotations

import argparse
import asyncio
import json
import os
import statistics
import subprocess
import sys
import time

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))


def _child(kind: str, inputs: int, others: int) -> None:
    """Run one app headless, print JSON {ready_t, widgets, inputs} at the first frame, exit."""
    from textual import events
    from textual.widgets import Input

    if kind == "real":
        from workbench.tui.app import ShaftbenchApp as Base

    else:
        from textual.app import App
        from textual.containers import VerticalScroll
        from textual.widgets import Footer, Static

        class Sheet(VerticalScroll, can_focus=False):  # as the workbench's sheet: focus starts on a field
            pass

        class Base(App):
            def compose(self):
                with Sheet():
                    for i in range(inputs):
                        yield Input(placeholder=f"field {i}", compact=True)
                    for i in range(max(0, others - 3)):
                        yield Static(f"text {i}")
                yield Footer()

    class Probe(Base):  # type: ignore[misc, valid-type]
        def on_ready(self, event: events.Ready) -> None:
            t = time.time()
            nodes = list(self.screen.walk_children())
            n_inputs = sum(isinstance(n, Input) for n in nodes)
            print(json.dumps({"ready_t": t, "widgets": len(nodes), "inputs": n_inputs}), flush=True)
            self.exit()

    app = Probe(demo=True) if kind == "real" else Probe()
    app.run(headless=True, size=(120, 40))


def _spawn(kind: str, inputs: int = 0, others: int = 0) -> tuple[float, dict]:
    env = dict(os.environ, PYTHONPATH=ROOT + os.pathsep + os.environ.get("PYTHONPATH", ""))
    t0 = time.time()
    out = subprocess.run(
        [sys.executable, __file__, "--child", kind, str(inputs), str(others)],
        capture_output=True,
        text=True,
        env=env,
        check=True,
        timeout=60,
    )
    line = [ln for ln in out.stdout.splitlines() if ln.startswith("{")][-1]
    data = json.loads(line)
    return data["ready_t"] - t0, data


async def _recompute_times(edits: int) -> tuple[list[float], list[float]]:
    sys.path.insert(0, ROOT)
    from workbench.tui import engine
    from workbench.tui.app import ShaftbenchApp

    app = ShaftbenchApp(demo=True)
    full: list[float] = []
    contract: list[float] = []
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause(0.3)
        await app.workers.wait_for_complete()
        screen = app.job_screen
        speed = screen.query_one("#speed")
        engine.evaluate(screen.sheet.inputs())  # warm: imports and caches
        for i in range(edits):
            speed.value = f"{1400 + i % 97} rpm"
            t0 = time.perf_counter()
            inputs = screen.sheet.inputs()
            evaluation = engine.evaluate(inputs)
            t1 = time.perf_counter()
            screen.apply_evaluation(evaluation)
            t2 = time.perf_counter()
            contract.append(t1 - t0)
            full.append(t2 - t0)
        await pilot.pause()
    return full, contract


async def _demo_svg(path: str) -> None:
    """Save the job sheet on the settled demo job as an SVG screenshot."""
    sys.path.insert(0, ROOT)
    from textual.widgets import Input

    from workbench.tui.app import ShaftbenchApp

    app = ShaftbenchApp(demo=True, log_path=os.devnull)
    async with app.run_test(size=(120, 40)) as pilot:
        for _ in range(3):
            await pilot.pause(0.2)
            await app.workers.wait_for_complete()
        for field in app.screen.query(Input):
            field.cursor_blink = False
        await pilot.pause()
        svg = app.export_screenshot(title="Shaftbench — demo job")
    with open(path, "w", encoding="utf-8") as fh:
        fh.write(svg)
    print(f"wrote {path}")


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--runs", type=int, default=15)
    parser.add_argument("--edits", type=int, default=200)
    parser.add_argument("--child", nargs=3, metavar=("KIND", "INPUTS", "OTHERS"))
    parser.add_argument("--demo-svg", metavar="PATH", help="write the demo job sheet as SVG and exit")
    args = parser.parse_args()
    if args.demo_svg:
        asyncio.run(_demo_svg(args.demo_svg))
        return 0
    if args.child:
        _child(args.child[0], int(args.child[1]), int(args.child[2]))
        return 0

    _, shape = _spawn("real")  # learn the widget count, and warm the disk cache for both
    inputs, others = shape["inputs"], shape["widgets"] - shape["inputs"]
    _, bare_shape = _spawn("bare", inputs, others)
    others += shape["widgets"] - bare_shape["widgets"]  # footer keys etc.: match the total exactly
    _, bare_shape = _spawn("bare", inputs, others)
    real_s: list[float] = []
    bare_s: list[float] = []
    for _ in range(args.runs):
        real_s.append(_spawn("real")[0])
        bare_s.append(_spawn("bare", inputs, others)[0])
    real_med, bare_med = statistics.median(real_s), statistics.median(bare_s)
    best = max(1, args.runs // 3)
    real_best = statistics.fmean(sorted(real_s)[:best])
    bare_best = statistics.fmean(sorted(bare_s)[:best])
    same = (shape["widgets"], inputs) == (bare_shape["widgets"], bare_shape["inputs"])
    print(
        f"widgets mounted at the first frame: workbench {shape['widgets']} ({inputs} inputs), "
        f"bare app {bare_shape['widgets']} ({bare_shape['inputs']} inputs): "
        f"{'same count' if same else 'COUNTS DIFFER, ratios not comparable'}; both start with "
        "focus on the first input (neither scroll container takes focus)"
    )
    print("runs (ms), alternating: " + ", ".join(
        f"{r * 1000:.0f}/{b * 1000:.0f}" for r, b in zip(real_s, bare_s)) + "  (workbench/bare)")
    print(
        f"start -> first frame, median of {args.runs}: workbench {real_med * 1000:.0f} ms, "
        f"bare {bare_med * 1000:.0f} ms, ratio {real_med / bare_med:.2f}x (target <= 1.30)"
    )
    print(
        f"start -> first frame, best {best} of {args.runs}: workbench {real_best * 1000:.0f} ms, "
        f"bare {bare_best * 1000:.0f} ms, ratio {real_best / bare_best:.2f}x"
    )
    full, contract = asyncio.run(_recompute_times(args.edits))
    print(
        f"recompute per edit, median of {args.edits}: {statistics.median(full) * 1000:.2f} ms "
        f"(contract {statistics.median(contract) * 1000:.2f} ms + sheet/panel update; target <= 5 ms)"
    )
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
