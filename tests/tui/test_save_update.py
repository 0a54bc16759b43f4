"""Saving a job that is already in the log asks whether it updates that job or makes a new one;
it never duplicates silently. The log screen's outcome form records how a fitted shaft ended."""

from __future__ import annotations

from textual.widgets import Input, RadioSet, Static

from workbench.store.log import JobLog
from workbench.tui.screens.save import SaveScreen

from .conftest import plain_text, settle


async def _save_new(pilot, asset: str) -> None:
    await pilot.press("f6")
    assert isinstance(pilot.app.screen, SaveScreen)
    pilot.app.screen.query_one("#save-asset", Input).value = asset
    await pilot.press("ctrl+s")
    await settle(pilot)


async def test_saving_again_asks_update_or_new_and_never_duplicates(make_app, tmp_path):
    app = make_app(demo=True)
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        await _save_new(pilot, "CV-07")  # a fresh sheet saves straight away: no question
        assert app.screen is app.job_screen and app.logged_job_id == 1
        # the same sheet saved again: the dialog asks, and saving without an answer saves nothing
        await pilot.press("f6")
        screen = app.screen
        assert isinstance(screen, SaveScreen) and screen.job_id == 1
        assert screen.query_one("#save-as", RadioSet).pressed_button is None
        await pilot.press("ctrl+s")
        await settle(pilot)
        assert app.screen is screen and "Choose first" in plain_text(screen.query_one("#save-status", Static))
        with JobLog.open(tmp_path / "jobs.sqlite3") as log:
            assert log.count() == 1
        # pick "an update of job 1" (the first choice) and save
        await pilot.press("enter")  # the focused radio set presses its highlighted (first) button
        await pilot.pause()
        assert screen.choice() == "update"
        screen.query_one("#save-note", Input).value = "rechecked after the key was changed"
        await pilot.press("ctrl+s")
        await settle(pilot)
        assert app.screen is app.job_screen
        with JobLog.open(tmp_path / "jobs.sqlite3") as log:
            assert log.count() == 1
            assert log.get(1).note == "rechecked after the key was changed"
            assert [c["field"] for c in log.changes(1)][0] == "result"
        # and once more, this time as a new job
        await pilot.press("f6")
        screen = app.screen
        await pilot.press("down", "enter")
        await pilot.pause()
        assert screen.choice() == "new"
        await pilot.press("ctrl+s")
        await settle(pilot)
        with JobLog.open(tmp_path / "jobs.sqlite3") as log:
            assert log.count() == 2
        assert app.logged_job_id == 2


async def test_a_reopened_job_is_the_one_the_dialog_offers_to_update(make_app, tmp_path):
    with JobLog.open(tmp_path / "jobs.sqlite3") as log:
        from workbench.demo import demo_inputs
        from workbench.job import evaluate_inputs

        for asset in ("A-1", "A-2"):
            log.save(demo_inputs(), evaluate_inputs(demo_inputs()), asset=asset)
    app = make_app()
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        app._reviewed({"action": "reopen", "job_id": 1, "inputs": demo_inputs()})
        await settle(pilot)
        assert app.logged_job_id == 1 and app.meta["asset"] == "A-1"
        await pilot.press("f6")
        assert isinstance(app.screen, SaveScreen) and app.screen.job_id == 1
        await pilot.press("escape")
        app._reviewed({"action": "duplicate", "job_id": 2, "inputs": demo_inputs()})
        await settle(pilot)
        assert app.logged_job_id is None  # a copy is a new job: no question
