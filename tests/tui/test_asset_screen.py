"""The asset history view: reached with F12 from the job log, drawn from the demo's invented
history; Pilot checks and SVG snapshots at 80x24 and 120x40 (the day fixed, so the chart is too)."""

from __future__ import annotations

import asyncio
import io

import pytest
from rich.console import Console
from textual.app import App
from textual.widgets import DataTable

from workbench.demo_history import demo_history_rows
from workbench.store import JobLog
from workbench.tui.screens.asset import AssetScreen
from workbench.tui.screens.review import ReviewScreen

TODAY = "2026-12-01"


@pytest.fixture
def seeded(tmp_path):
    path = tmp_path / "jobs.sqlite3"
    with JobLog.open(path) as log:
        log.import_jobs(demo_history_rows())
    return path


class AssetHost(App[None]):
    def __init__(self, path, tag: str) -> None:
        super().__init__()
        self.path, self.tag = path, tag

    def on_mount(self) -> None:
        self.push_screen(AssetScreen(str(self.path), self.tag, today=TODAY))


async def _wait_content(pilot, screen) -> str:
    for _ in range(200):
        await pilot.pause(0.02)
        if not screen.workers:
            break
    await pilot.pause(0.05)
    out = io.StringIO()
    Console(file=out, width=120, color_system=None).print(screen.shown)
    return out.getvalue()


def test_the_view_shows_the_chart_mtbr_and_flags(seeded):
    async def body() -> None:
        app = AssetHost(seeded, "cv7")
        async with app.run_test(size=(120, 40)) as pilot:
            text = await _wait_content(pilot, app.screen)
            assert "MTBR 286 days" in text and "█" in text and "░" in text and "MARGINAL" in text
            await pilot.press("a")  # the site's assets
            text = await _wait_content(pilot, app.screen)
            assert "CV-07" in text and "assets by shafts fitted" in text
            await pilot.press("escape")
            assert not isinstance(app.screen, AssetScreen)

    asyncio.run(body())


def test_f12_on_the_job_log_opens_the_highlighted_jobs_asset(seeded):
    class Host(App[None]):
        def on_mount(self) -> None:
            self.push_screen(ReviewScreen(seeded))

    async def body() -> None:
        app = Host()
        async with app.run_test(size=(120, 40)) as pilot:
            for _ in range(100):
                await pilot.pause(0.02)
                if app.screen.query_one(DataTable).row_count:
                    break
            await pilot.press("down", "f12")
            assert isinstance(app.screen, AssetScreen) and app.screen.tag == "CV-07 head drive"
            text = await _wait_content(pilot, app.screen)
            assert "CV-07: 4 shaft(s) fitted" in text

    asyncio.run(body())


@pytest.mark.parametrize("size", [(80, 24), (120, 40)], ids=lambda s: f"{s[0]}x{s[1]}")
def test_asset_snapshot(snap_compare, seeded, size):
    app = AssetHost(seeded, "CV-07")

    async def run_before(pilot) -> None:
        await _wait_content(pilot, app.screen)

    assert snap_compare(app, terminal_size=size, run_before=run_before)
