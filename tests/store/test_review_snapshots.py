"""SVG snapshots of the job log screen, its outcome form and the save question at 80x24 and 120x40
(jobs imported with fixed times: no clock). Update after a deliberate change of looks with
``pytest tests/store/test_review_snapshots.py --snapshot-update`` and look at the report first."""

from __future__ import annotations

import pytest
from store_helpers import JOB_INPUTS, result_for
from textual.app import App
from textual.widgets import Input

from workbench.store import JobLog
from workbench.tui.screens.review import ReviewScreen

SIZES = [(80, 24), (120, 40)]


def _log(path) -> None:
    names = ("demo", "mixer", "overloaded", "small-fan")
    with JobLog.open(path) as log:
        log.import_jobs(
            {"inputs": JOB_INPUTS[name], "result": result_for(name), "asset": f"CV-0{i} head drive",
             "location": f"crusher line {i}", "by": "J. Fitter", "note": "worn at the bearing seats",
             "created_at": f"2026-0{i + 1}-1{i}T08:30:00Z", "uid": f"00000000-0000-4000-8000-00000000000{i}"}
            for i, name in enumerate(names)
        )


class Host(App[None]):
    def __init__(self, path, screen_factory) -> None:
        super().__init__()
        self.path = path
        self.screen_factory = screen_factory

    def on_mount(self) -> None:
        self.push_screen(ReviewScreen(self.path))


async def _settled(pilot) -> None:
    for _ in range(100):
        await pilot.pause(0.02)
        screen = pilot.app.screen
        if not screen.workers and getattr(screen, "loads", 1) >= 1:
            break
    await pilot.pause(0.1)
    for field in pilot.app.screen.query(Input):
        field.cursor_blink = False


@pytest.mark.parametrize("size", SIZES, ids=lambda s: f"{s[0]}x{s[1]}")
@pytest.mark.parametrize("view", ["log", "outcome"])
def test_log_screen_snapshot(snap_compare, tmp_path, view, size):
    path = tmp_path / "jobs.sqlite3"
    _log(path)
    app = Host(path, None)

    async def run_before(pilot) -> None:
        await _settled(pilot)
        await pilot.press("down")
        if view == "outcome":
            await pilot.press("e")
        await _settled(pilot)

    assert snap_compare(app, terminal_size=size, run_before=run_before)


class SaveHost(App[None]):
    """Only the save prompt of a sheet that is job 1 of the log (the sheet behind it is not pinned here)."""

    from workbench.tui.app import ShaftbenchApp as _App

    CSS_PATH = _App.CSS_PATH  # the workbench's own styles

    def __init__(self, path) -> None:
        super().__init__()
        self.path = path

    def on_mount(self) -> None:
        from workbench.tui.screens.save import SaveScreen

        meta = {"asset": "CV-00 head drive", "location": "crusher line 0", "by": "J. Fitter",
                "note": "worn at the bearing seats"}
        self.push_screen(SaveScreen(dict(JOB_INPUTS["demo"]), result_for("demo"), meta, str(self.path), job_id=1))


@pytest.mark.parametrize("size", SIZES, ids=lambda s: f"{s[0]}x{s[1]}")
def test_save_question_snapshot(snap_compare, tmp_path, size):
    path = tmp_path / "jobs.sqlite3"
    _log(path)
    app = SaveHost(path)

    async def run_before(pilot) -> None:
        await _settled(pilot)

    assert snap_compare(app, terminal_size=size, run_before=run_before)
