"""Workbench timing: start-up to the demo's verdict on screen, keystroke to the frame that shows the
new verdict, and the first section view — each printed against its anchor.

    python bench/bench_tui.py [--runs 11] [--edits 40] [--section-runs 5]

Every figure is a median with its range (min-max), never a best-of. "On screen" means: the frame
Textual hands to the terminal, rendered to the terminal's bytes (headless Textual skips that step,
so both apps below do it themselves, the same way) and found to hold the text looked for.

1. Start-up (goal <= 1.5x): from just before the process is spawned to the first frame that shows
   the demo job's verdict (the verdict banner's words), for ``shaftbench --demo``; anchor: a bare
   Textual app with the same widgets (the same number of inputs, the rest plain text; its scroll
   container, like the sheet, does not take focus), timed to its FIRST frame. Both headless at
   120 x 40, run alternately. Includes interpreter start-up, imports, composing, the demo's
   evaluation and the rendering of the frame, with bytecode caches warm as after an install
   (PYTHONDONTWRITEBYTECODE is dropped for the timed processes; untimed runs go first). The
   widget counts at the first frame are printed.
2. Keystroke (goal <= 30 ms beyond the debounce, median; no full relayout): in one running
   workbench on the demo job, a key typed into the Power field (``7.5 kW`` <-> ``7.95 kW``,
   alternately, every edit a new result) until the frame that shows the new running torque in the
   verdict panel; printed as the time beyond the sheet's debounce, and the count of full layout
   passes of the screen (``Screen._refresh_layout`` without ``scroll``) between key and frame.
   Includes the key's handling, the debounce timer, the evaluation in its worker and the repaint.
3. First section view (goal <= 300 ms): a fresh ``shaftbench --demo`` process each run; one second
   after the verdict is on screen (a fitter's pause) F2 is pressed; time from the key to the frame
   that shows the drawings ("method:" under each section). Includes the solver's first solve of
   the session and whatever was not warmed in the background after the verdict.

``--demo-svg PATH`` instead writes a screenshot of the job sheet on the demo job (120 x 40) to
PATH, e.g. ``docs/jobsheet-demo.svg``.
"""

from __future__ import annotations

import argparse
import asyncio
import json
import os
import re
import statistics
import subprocess
import sys
import time

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
sys.path.insert(0, ROOT)

START_GOAL = 1.5
KEY_GOAL_MS = 30.0
SECTION_GOAL_MS = 300.0
FITTER_PAUSE_S = 1.0
_ANSI = re.compile(r"\x1b\[[0-9;?]*[ -/]*[@-~]|\x1b[()][0-9A-B]|\x1b[=>78]")


def spread(samples: list[float], scale: float = 1e3, digits: int = 0) -> str:
    """'median [min-max]' of samples, scaled (default s -> ms)."""
    s = sorted(samples)
    return f"{statistics.median(s) * scale:.{digits}f} [{s[0] * scale:.{digits}f}-{s[-1] * scale:.{digits}f}]"


def frame_text(app, renderable) -> str:
    """The terminal bytes of one frame (what a real terminal would be sent), escapes removed."""
    return _ANSI.sub("", renderable.render_segments(app.console))


def demo_banner() -> str:
    """The verdict banner's text of the demo job (what the start-up clock waits for)."""
    from workbench.demo import demo_inputs
    from workbench.job import evaluate_inputs
    from workbench.report import display

    result = evaluate_inputs(demo_inputs())
    shaft = result["shafts"][-1]
    return f"{display.verdict(result['verdict'])}  candidate {shaft['spec']}"


# --------------------------------------------------------------------------- child processes


def _child(kind: str, inputs: int, others: int) -> None:
    """Run one app headless; print JSON {t, widgets, inputs} when the awaited frame is out; exit."""
    from textual.widgets import Input

    if kind in ("real", "section"):
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
        looking_for = os.environ.get("BENCH_WAIT_FOR")  # made by the parent: the child imports nothing early
        shape: dict | None = None
        section_t0: float | None = None

        def _display(self, screen, renderable) -> None:
            if renderable is not None and not self._batch_count:
                text = frame_text(self, renderable)  # the cost of a real terminal's frame, for both
                now = time.time()
                if self.shape is None:
                    nodes = list(self.screen.walk_children())
                    self.shape = {"widgets": len(nodes), "inputs": sum(isinstance(n, Input) for n in nodes)}
                if kind == "bare" or (kind == "real" and self.looking_for in text):
                    self._report(now)
                elif kind == "section":
                    self._section_frame(text, now)
            super()._display(screen, renderable)

        def _section_frame(self, text: str, now: float) -> None:
            if self.section_t0 is None:
                if getattr(self.job_screen, "evaluation", None) is not None and self.screen is self.job_screen:
                    self.section_t0 = -1.0
                    self.set_timer(FITTER_PAUSE_S, self._press_f2)
            elif self.section_t0 > 0 and "method:" in text:
                self._report(time.perf_counter() - self.section_t0)

        def _press_f2(self) -> None:
            self.section_t0 = time.perf_counter()
            self.action_section()

        def _report(self, t: float) -> None:
            if getattr(self, "_reported", False):
                return
            self._reported = True
            print(json.dumps({"t": t, **(self.shape or {})}), flush=True)
            self.exit()

    app = Probe(demo=True, log_path=os.devnull) if kind != "bare" else Probe()
    app.run(headless=True, size=(120, 40))


def _spawn(kind: str, inputs: int = 0, others: int = 0) -> tuple[float, dict]:
    env = dict(os.environ, PYTHONPATH=ROOT + os.pathsep + os.environ.get("PYTHONPATH", ""))
    env.pop("PYTHONDONTWRITEBYTECODE", None)  # bytecode caches warm, as after an install
    if kind == "real":
        env["BENCH_WAIT_FOR"] = demo_banner()
    t0 = time.time()
    out = subprocess.run(
        [sys.executable, __file__, "--child", kind, str(inputs), str(others)],
        capture_output=True, text=True, env=env, check=True, timeout=60,
    )
    lines = [ln for ln in out.stdout.splitlines() if ln.startswith("{")]
    if not lines:
        raise SystemExit(f"{kind} child printed no figure: {out.stderr[-2000:]}")
    data = json.loads(lines[-1])
    return (data["t"] - t0 if kind != "section" else data["t"]), data


# --------------------------------------------------------------------------- keystrokes


async def _keystrokes(edits: int) -> tuple[list[float], list[int], list[float]]:
    """(time beyond the debounce [s], full layouts, evaluation [s]) per keystroke in Power."""
    from textual.screen import Screen

    from workbench.report import display
    from workbench.tui import engine
    from workbench.tui.app import ShaftbenchApp
    from workbench.tui.widgets.job_sheet import DEBOUNCE_S

    layouts = [0]
    original = Screen._refresh_layout

    def counting(self, size=None, scroll=False):
        if not scroll:
            layouts[0] += 1
        return original(self, size, scroll)

    class Probe(ShaftbenchApp):
        wanted: str | None = None
        seen_at: float | None = None

        def _display(self, screen, renderable) -> None:
            if renderable is not None and not self._batch_count:
                text = frame_text(self, renderable)
                if self.wanted and self.seen_at is None and self.wanted in text:
                    self.seen_at = time.perf_counter()
            super()._display(screen, renderable)

    beyond: list[float] = []
    passes: list[int] = []
    evals: list[float] = []
    app = Probe(demo=True, log_path=os.devnull)
    Screen._refresh_layout = counting
    try:
        async with app.run_test(size=(120, 40)) as pilot:
            for _ in range(3):
                await pilot.pause(0.3)
                await app.workers.wait_for_complete()
            power = app.job_screen.query_one("#power")
            power.focus()
            await pilot.press("home", "right", "right")  # after "7."
            await pilot.pause(0.3)
            base = dict(app.inputs())
            texts = {}
            for value in ("7.5 kW", "7.95 kW"):
                result = engine.evaluate({**base, "power": value}).result
                texts[value] = "running torque " + display.torque(result["drive"]["running_torque_Nm"], "metric")
            assert texts["7.5 kW"] != texts["7.95 kW"]
            for i in range(edits):
                key, value = ("9", "7.95 kW") if i % 2 == 0 else ("backspace", "7.5 kW")
                app.wanted, app.seen_at = texts[value].split("running torque ")[1], None
                await app.workers.wait_for_complete()
                layouts[0] = 0
                t0 = time.perf_counter()
                await pilot.press(key)
                while app.seen_at is None and time.perf_counter() - t0 < 2.0:
                    await asyncio.sleep(0.0005)
                if app.seen_at is None:
                    raise SystemExit(f"no frame showed {texts[value]!r} after pressing {key!r}")
                beyond.append(app.seen_at - t0 - DEBOUNCE_S)
                passes.append(layouts[0])
                evals.append(app.job_screen.evaluation.elapsed_s)
                assert power.value == value, (power.value, value)
                await pilot.pause(0.05)
    finally:
        Screen._refresh_layout = original
    return beyond, passes, evals


# --------------------------------------------------------------------------- screenshot


async def _demo_svg(path: str) -> None:
    """Save the job sheet on the settled demo job as an SVG screenshot."""
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
    parser.add_argument("--runs", type=int, default=11, help="start-up runs of each app, alternating")
    parser.add_argument("--edits", type=int, default=40, help="keystrokes timed")
    parser.add_argument("--section-runs", type=int, default=5, help="fresh processes timed for F2")
    parser.add_argument("--child", nargs=3, metavar=("KIND", "INPUTS", "OTHERS"))
    parser.add_argument("--demo-svg", metavar="PATH", help="write the demo job sheet as SVG and exit")
    args = parser.parse_args()
    if args.demo_svg:
        asyncio.run(_demo_svg(args.demo_svg))
        return 0
    if args.child:
        _child(args.child[0], int(args.child[1]), int(args.child[2]))
        return 0
    print(f"python {sys.version.split()[0]}, {os.cpu_count()} CPUs, headless 120 x 40, "
          f"load average {os.getloadavg()[0]:.1f} (figures read true only near 0)")

    _, shape = _spawn("real")  # learn the widget count, and warm the disk cache for both
    inputs, others = shape["inputs"], shape["widgets"] - shape["inputs"]
    _, bare_shape = _spawn("bare", inputs, others)
    others += shape["widgets"] - bare_shape["widgets"]  # footer keys etc.: match the total exactly
    _, bare_shape = _spawn("bare", inputs, others)
    real_s: list[float] = []
    bare_s: list[float] = []
    for run in range(args.runs):
        pair = (("real", real_s), ("bare", bare_s)) if run % 2 == 0 else (("bare", bare_s), ("real", real_s))
        for kind, samples in pair:
            samples.append(_spawn(kind, inputs, others)[0] if kind == "bare" else _spawn("real")[0])
    same = (shape["widgets"], inputs) == (bare_shape["widgets"], bare_shape["inputs"])
    print(
        f"widgets at the first frame: workbench {shape['widgets']} ({inputs} inputs), bare app "
        f"{bare_shape['widgets']} ({bare_shape['inputs']} inputs): "
        f"{'same count' if same else 'COUNTS DIFFER, ratio not comparable'}"
    )
    ratio = statistics.median(real_s) / statistics.median(bare_s)
    print(f"start -> demo verdict on screen, ms, median [min-max] of {args.runs} alternating runs:")
    print(f"  shaftbench --demo, to the verdict        {spread(real_s):>16s}   {ratio:5.2f}x anchor (goal <= {START_GOAL})")
    print(f"  anchor: bare app, to its first frame     {spread(bare_s):>16s}    1.00x anchor")

    beyond, passes, evals = asyncio.run(_keystrokes(args.edits))
    print(f"keystroke -> frame with the new verdict, beyond the debounce, ms, median [min-max] of {args.edits}:")
    print(f"  {spread(beyond, digits=1):>22s}   {statistics.median(beyond) * 1e3 / KEY_GOAL_MS:5.2f}x the "
          f"{KEY_GOAL_MS:.0f} ms goal; full layout passes per keystroke: median {statistics.median(passes):g} "
          f"[{min(passes)}-{max(passes)}]; evaluation in the worker {spread(evals, digits=2)} ms")

    section_s = [_spawn("section")[0] for _ in range(args.section_runs)]
    print(f"first section view (F2 {FITTER_PAUSE_S:g} s after the verdict, fresh process) -> drawings on screen, "
          f"ms, median [min-max] of {args.section_runs}:")
    print(f"  {spread(section_s):>22s}   {statistics.median(section_s) * 1e3 / SECTION_GOAL_MS:5.2f}x the "
          f"{SECTION_GOAL_MS:.0f} ms goal")
    print(f"load average at the end {os.getloadavg()[0]:.1f}")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
