"""The workbench answers at once: the demo's verdict is in the first frame, a keystroke that changes
no size repaints without a full relayout, and an edit that does change a size still lays out."""

from __future__ import annotations

import json
import subprocess
import sys
import textwrap

from textual.screen import Screen
from textual.widgets import Input

from workbench.tui.widgets.steady import SteadyInput

from .conftest import plain_text, settle


def _frames(app_class):
    """A subclass of ``app_class`` that keeps the plain text of every frame it hands out."""

    class Recording(app_class):
        frames: list[str] = []

        def _display(self, screen, renderable) -> None:
            if renderable is not None and not self._batch_count:
                import re

                text = renderable.render_segments(self.console)
                self.frames.append(re.sub(r"\x1b\[[0-9;?]*[ -/]*[@-~]", "", text))
            super()._display(screen, renderable)

    Recording.frames = []
    return Recording


async def test_the_first_frame_already_shows_the_demo_verdict(tmp_path):
    from workbench.tui.app import ShaftbenchApp

    from workbench.demo import demo_inputs
    from workbench.job import evaluate_inputs
    from workbench.report import display

    result = evaluate_inputs(demo_inputs())  # what the banner must say: the contract's verdict
    banner = f"{display.verdict(result['verdict'])}  candidate {result['shafts'][-1]['spec']}"
    app = _frames(ShaftbenchApp)(demo=True, log_path=str(tmp_path / "jobs.sqlite3"))
    async with app.run_test(size=(120, 40)) as pilot:
        await pilot.pause()
        assert app.frames, "no frame was drawn"
        assert banner in app.frames[0]
        assert "running torque" in app.frames[0]
        await settle(pilot)
        assert banner in plain_text(app.job_screen.query_one("#verdict-banner"))


def test_the_demo_verdict_needs_no_pint():
    """Start the workbench on the demo in a fresh interpreter until its verdict is drawn."""
    code = textwrap.dedent(
        """
        import json, os, sys
        from workbench.tui.app import ShaftbenchApp

        class Probe(ShaftbenchApp):
            def _display(self, screen, renderable):
                if renderable is not None and self.job_screen.result is not None:
                    self.exit(sorted(m for m in ("pint", "numpy", "scipy") if m in sys.modules))
                super()._display(screen, renderable)

        app = Probe(demo=True, log_path=os.devnull)
        print(json.dumps(app.run(headless=True, size=(120, 40))))
        """
    )
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, timeout=120)
    assert out.returncode == 0, out.stderr
    assert "pint" not in json.loads(out.stdout.strip().splitlines()[-1])


class _LayoutCount:
    """Counts the screen's full layout passes (not the scroll-only reflows)."""

    def __init__(self, monkeypatch) -> None:
        self.count = 0
        original = Screen._refresh_layout

        def counting(screen, size=None, scroll=False):
            if not scroll:
                self.count += 1
            return original(screen, size, scroll)

        monkeypatch.setattr(Screen, "_refresh_layout", counting)


async def test_a_keystroke_that_changes_no_size_makes_no_full_layout(make_app, monkeypatch):
    app = make_app(demo=True)
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        layouts = _LayoutCount(monkeypatch)
        power = app.job_screen.query_one("#power", Input)
        power.focus()
        await pilot.press("home", "right", "right", "9")  # 7.5 kW -> 7.95 kW
        await settle(pilot)
        assert power.value == "7.95 kW"
        result = app.job_screen.result
        assert result is not None and result["drive"]["power_W"] == 7950.0
        table = plain_text(app.job_screen.query_one("#verdict-table"))
        assert "160 N·m" in table  # running = 0.96 x 7950 W / (2 pi x 1460/60 / 3.2 rad/s) = 159.7 N*m, shown to 3 digits
        assert layouts.count == 0


async def test_an_edit_that_changes_a_size_still_lays_out(make_app, monkeypatch):
    """The panel's "why" loses the candidate's lines and an error line appears: both laid out."""
    app = make_app(demo=True)
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        why = app.job_screen.query_one("#verdict-why")
        lines_before = why.size.height
        layouts = _LayoutCount(monkeypatch)
        app.job_screen.sheet.set_candidate("", "")  # one shaft: one "why" line fewer
        app.job_screen.sheet.row("candidate_size").set_value("")
        await settle(pilot)
        assert app.job_screen.result is not None and len(app.job_screen.result["shafts"]) == 1
        assert layouts.count >= 1
        assert why.size.height < lines_before  # the candidate's "why" (one or more lines) is gone
        measured = why.get_content_height(why.container_size, app.size, why.size.width)
        assert why.size.height == measured
        power = app.job_screen.query_one("#power", Input)
        power.value = "7.5 kV"
        await settle(pilot)
        error = app.job_screen.query_one("#error-power")
        speed = app.job_screen.query_one("#label-speed")
        assert error.display and error.region.height >= 1
        assert speed.region.y == error.region.y + error.region.height


async def test_a_long_entry_still_scrolls_inside_its_field(make_app):
    """The quiet virtual size keeps the Input's own horizontal scrolling: the cursor stays in view."""
    app = make_app()
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        field = app.job_screen.query_one("#shaft_size", Input)
        assert isinstance(field, SteadyInput)
        field.focus()
        text = "40mm keyed ground sharp-shoulder"  # longer than the 20-cell field
        await pilot.press(*text)
        await pilot.pause()
        assert field.value == text
        assert field.virtual_size.width >= len(text)
        assert field.scroll_offset.x > 0
        await pilot.press("home")
        await pilot.pause()
        assert field.scroll_offset.x == 0
