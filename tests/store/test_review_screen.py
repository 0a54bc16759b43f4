"""The review screen, driven by Textual's Pilot in a tiny host app."""

from __future__ import annotations

import asyncio
import functools
import io
from pathlib import Path
from typing import Any

import pytest
from rich.text import Text
from store_helpers import JOB_INPUTS, result_for
from textual.app import App
from textual.widgets import DataTable, Input, Select, Static

from workbench.store import JobLog
from workbench.tui.screens.review import ConfirmScreen, ReviewScreen

SIZE = (160, 48)


def run_async(test):
    """Run an async test body on a fresh event loop (no asyncio plugin needed)."""

    @functools.wraps(test)
    def runner(*args: Any, **kwargs: Any) -> None:
        asyncio.run(test(*args, **kwargs))

    return runner


class Host(App[None]):
    """Pushes the review screen and keeps what it dismissed with."""

    def __init__(self, log_path: Path, **screen_options: Any) -> None:
        super().__init__()
        self.log_path = log_path
        self.screen_options = screen_options
        self.outcomes: list[Any] = []

    def on_mount(self) -> None:
        self.push_screen(ReviewScreen(self.log_path, **self.screen_options), self.outcomes.append)


def _fill(path: Path, count: int = 3, **overrides: str) -> list[int]:
    names = ("demo", "mixer", "overloaded")
    with JobLog.open(path) as log:
        return [
            log.save(dict(JOB_INPUTS[names[i % 3]]), result_for(names[i % 3]),
                     asset=overrides.get("asset", f"Asset {i}"), location=f"Bay {i}",
                     note=overrides.get("note", ""))
            for i in range(count)
        ]


async def _settle(pilot, screen: ReviewScreen, loads: int) -> None:
    for _ in range(200):
        await pilot.pause(0.02)
        if screen.loads >= loads and not screen.workers:
            return
    raise AssertionError("the review screen did not finish loading")


def _ids(screen: ReviewScreen) -> list[int]:
    table = screen.query_one(DataTable)
    return [int(table.get_row_at(i)[0].plain) for i in range(table.row_count)]


@run_async
async def test_lists_newest_first_and_filters_as_you_type(tmp_path):
    path = tmp_path / "jobs.sqlite3"
    ids = _fill(path, 5)
    with JobLog.open(path) as log:
        special = log.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset="Kiln fan", note="Noisy")
    app = Host(path)
    async with app.run_test(size=SIZE) as pilot:
        screen = app.screen
        assert isinstance(screen, ReviewScreen)
        await _settle(pilot, screen, 1)
        assert _ids(screen) == [special, *reversed(ids)]
        await pilot.press("k", "I", "l", "n")  # the filter has focus on open
        await _settle(pilot, screen, 2)
        assert _ids(screen) == [special]
        screen.query_one("#review-text", Input).value = "noisy"  # notes are searched too
        await _settle(pilot, screen, 3)
        assert _ids(screen) == [special]
        screen.query_one("#review-text", Input).value = ""
        screen.query_one("#review-verdict", Select).value = "fail"
        await _settle(pilot, screen, 5)
        assert _ids(screen) == [ids[2]]  # the overloaded job
        screen.query_one("#review-since", Input).value = "2999-01-01"
        await _settle(pilot, screen, 6)
        assert _ids(screen) == []
        assert "match the filter" in str(screen.query_one("#review-status", Static).render())


@run_async
async def test_markup_in_user_text_is_shown_literally(tmp_path):
    path = tmp_path / "jobs.sqlite3"
    _fill(path, 1, asset="[bold]P-1[/]", note="[red]x[/] [/]")
    app = Host(path)
    async with app.run_test(size=SIZE) as pilot:
        screen = app.screen
        await _settle(pilot, screen, 1)
        cell = screen.query_one(DataTable).get_row_at(0)[screen.columns.index("asset")]
        assert isinstance(cell, Text) and cell.plain == "[bold]P-1[/]" and not cell.spans
        detail = screen.query_one("#review-detail", Static)
        from rich.console import Console

        console = Console(width=120, record=True, file=io.StringIO())
        console.print(detail.content)  # what the detail pane was given to show
        shown = console.export_text()
        assert "[bold]P-1[/]" in shown and "[red]x[/] [/]" in shown


@run_async
async def test_reopen_and_duplicate_dismiss_with_the_inputs(tmp_path):
    path = tmp_path / "jobs.sqlite3"
    ids = _fill(path, 2)
    for key, action in (("o", "reopen"), ("c", "duplicate"), ("enter", "reopen")):
        app = Host(path)
        async with app.run_test(size=SIZE) as pilot:
            await _settle(pilot, app.screen, 1)
            await pilot.press("down")  # from the filter to the list
            await pilot.press("down")  # the older job
            await pilot.press(key)
            await pilot.pause()
        assert app.outcomes == [{"action": action, "job_id": ids[0], "inputs": JOB_INPUTS["demo"]}]


@run_async
async def test_escape_leaves_the_filter_then_closes_with_none(tmp_path):
    path = tmp_path / "jobs.sqlite3"
    _fill(path, 1)
    app = Host(path)
    async with app.run_test(size=SIZE) as pilot:
        await _settle(pilot, app.screen, 1)
        await pilot.press("d")  # typing a letter bound to an action only filters
        await _settle(pilot, app.screen, 2)
        assert isinstance(app.focused, Input) and app.focused.value == "d"
        await pilot.press("escape")
        assert isinstance(app.focused, DataTable)
        await pilot.press("escape")
        await pilot.pause()
    assert app.outcomes == [None]


@run_async
async def test_opens_ready_to_type_a_filter_and_escape_closes(tmp_path):
    """A fitter opening the log types straight away: letters filter, they never trigger actions."""
    path = tmp_path / "jobs.sqlite3"
    ids = _fill(path, 3)
    with JobLog.open(path) as log:
        special = log.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset="Kestrel pump")
    app = Host(path)
    async with app.run_test(size=SIZE) as pilot:
        screen = app.screen
        await _settle(pilot, screen, 1)
        assert isinstance(app.focused, Input)
        await pilot.press(*"kestrel")  # holds d-, r-, t- and c-like action letters: none may fire
        await _settle(pilot, screen, 2)
        assert _ids(screen) == [special]
        with JobLog.open(path) as log:
            assert log.count() == len(ids) + 1 and log.count(deleted=True) == 0
        screen.query_one("#review-text", Input).value = ""
        await _settle(pilot, screen, 3)
        await pilot.press("escape")  # an empty filter: Esc closes at once
        await pilot.pause()
    assert app.outcomes == [None]


@run_async
async def test_delete_asks_first_then_restore_from_the_bin(tmp_path):
    path = tmp_path / "jobs.sqlite3"
    ids = _fill(path, 2)
    app = Host(path)
    async with app.run_test(size=SIZE) as pilot:
        screen = app.screen
        await _settle(pilot, screen, 1)
        await pilot.press("down")  # from the filter to the list
        await pilot.press("d")
        await pilot.pause()
        assert isinstance(app.screen, ConfirmScreen)
        await pilot.press("n")  # no: nothing happens
        await pilot.pause()
        with JobLog.open(path) as log:
            assert log.count() == 2
        await pilot.press("d")
        await pilot.pause()
        await pilot.press("y")
        await _settle(pilot, screen, 2)
        assert _ids(screen) == [ids[0]]
        await pilot.press("b")  # the bin
        await _settle(pilot, screen, 3)
        assert _ids(screen) == [ids[1]]
        await pilot.press("r")
        await _settle(pilot, screen, 4)
        assert _ids(screen) == []
    with JobLog.open(path) as log:
        assert log.count() == 2 and log.count(deleted=True) == 0


@run_async
async def test_pages_never_hold_more_than_a_page(tmp_path):
    path = tmp_path / "jobs.sqlite3"
    ids = _fill(path, 25)
    app = Host(path, page_size=10)
    async with app.run_test(size=SIZE) as pilot:
        screen = app.screen
        await _settle(pilot, screen, 1)
        assert _ids(screen) == list(reversed(ids))[:10]
        await pilot.press("down")  # from the filter to the list
        await pilot.press("n")
        await _settle(pilot, screen, 2)
        await pilot.press("n")
        await _settle(pilot, screen, 3)
        assert _ids(screen) == list(reversed(ids))[20:]
        assert "21-25 of 25" in str(screen.query_one("#review-status", Static).render())
        await pilot.press("n")  # no page after the last
        await pilot.press("p")
        await _settle(pilot, screen, 4)
        assert _ids(screen) == list(reversed(ids))[10:20]


@pytest.mark.parametrize("suffix, marker", [(".html", "<html"), (".svg", "<svg"), (".txt", "Shaftbench job card")])
@run_async
async def test_card_export_writes_the_chosen_format(tmp_path, suffix, marker):
    path = tmp_path / "jobs.sqlite3"
    ids = _fill(path, 1, asset="CV-07 <head> & drive")
    app = Host(path, card_dir=tmp_path)
    async with app.run_test(size=SIZE) as pilot:
        await _settle(pilot, app.screen, 1)
        await pilot.press("down")  # from the filter to the list
        await pilot.press("x")
        await pilot.pause()
        field = app.screen.query_one("#card-path", Input)
        field.value = str(tmp_path / f"card{suffix}")
        await pilot.press("enter")
        for _ in range(100):
            await pilot.pause(0.02)
            if (tmp_path / f"card{suffix}").exists():
                break
    text = (tmp_path / f"card{suffix}").read_text().replace("&#160;", " ")  # SVG spaces
    assert marker in text and f"job {ids[0]}" in text
    assert "CV-07" in text


@run_async
async def test_a_missing_log_says_so_without_creating_it(tmp_path):
    path = tmp_path / "nothing-here.sqlite3"
    app = Host(path)
    async with app.run_test(size=SIZE) as pilot:
        await _settle(pilot, app.screen, 1)
        assert "no job log" in str(app.screen.query_one("#review-status", Static).render())
    assert not path.exists()



@pytest.mark.parametrize("size", [(80, 24), (120, 40)])
def test_the_log_chooses_its_columns_by_width(tmp_path, size):
    from workbench.tui.screens.review import choose_columns

    path = tmp_path / "jobs.sqlite3"
    _fill(path, 3)

    @run_async
    async def drive() -> None:
        app = Host(path)
        async with app.run_test(size=size) as pilot:
            screen = app.screen
            await _settle(pilot, screen, 1)
            table = screen.query_one(DataTable)
            # the verdict column is there and wide enough for the word
            assert {"id", "saved", "verdict", "asset"} <= set(screen.columns)
            verdict_column = next(c for c in table.columns.values() if c.key == "verdict")
            assert verdict_column.width >= len("MARGINAL")
            # every column fits on the screen: none is cut off at the right
            used = sum(c.width + 2 for c in table.columns.values())
            assert used <= table.size.width
            # in the list, the footer shows the keys a planner needs, whole
            await pilot.press("down")
            await pilot.pause(0.1)
            region = screen.query_one("Footer").region
            assert region.width == size[0]
            shown = [key for key in screen.query("FooterKey") if key.region.right <= size[0]]
            labels = " ".join(str(k.description) for k in shown)
            for needed in ("Close", "Reopen", "Card", "Recheck"):
                assert needed in labels, labels
            # every key the footer offers fits whole on the line
            offered = [key for key in screen.query("FooterKey") if key.display]
            assert all(key.region.right <= size[0] for key in offered), labels
            # the preview shows values, not bare labels
            from rich.console import Console

            console = Console(width=size[0], record=True, file=io.StringIO())
            detail = screen.query_one("#review-detail", Static)
            console.print(detail.content)
            preview = console.export_text()
            demo = result_for("overloaded")  # Asset 2, the newest of three, is the overloaded job
            assert "Asset 2" in preview and demo["verdict"].upper() in preview
            assert f"{demo['drive']['design_torque_Nm']:.3g}"[:3] in preview

    drive()
    # below the room for the extra columns only the four kept ones remain, and all fit
    assert [key for key, _ in choose_columns(50)] == ["id", "saved", "verdict", "asset"]
    assert sum(w + 2 for _, w in choose_columns(200)) == 200


@run_async
async def test_the_outcome_form_records_how_the_fitted_shaft_ended(tmp_path):
    from workbench.tui.screens.outcome import OutcomeScreen

    path = tmp_path / "jobs.sqlite3"
    ids = _fill(path, 2)
    app = Host(path)
    async with app.run_test(size=(80, 24)) as pilot:
        screen = app.screen
        await _settle(pilot, screen, 1)
        await pilot.press("down", "e")
        await pilot.pause(0.1)
        form = app.screen
        assert isinstance(form, OutcomeScreen) and form.record.id == ids[-1]
        form.query_one("#outcome-fitted", Input).value = "square 40mm"
        form.query_one("#outcome-fitted_on", Input).value = "2026-03-02"
        form.query_one("#outcome-outcome", Select).value = "failed"
        form.query_one("#outcome-outcome_date", Input).value = "2026-02-30"  # no such day
        await pilot.press("ctrl+s")
        for _ in range(100):
            await pilot.pause(0.02)
            if not form.workers:
                break
        status = str(form.query_one("#outcome-status", Static).render())
        assert app.screen is form and "outcome_date" in status and "not saved" in status
        with JobLog.open(path) as log:
            assert log.get(ids[-1]).outcome == "" and log.changes(ids[-1]) == []
        form.query_one("#outcome-outcome_date", Input).value = "2026-11-20"
        await pilot.press("ctrl+s")
        await _settle(pilot, screen, 2)
        assert app.screen is screen
    with JobLog.open(path) as log:
        job = log.get(ids[-1])
        assert (job.fitted, job.fitted_on, job.outcome, job.outcome_date) == (
            "square 40mm", "2026-03-02", "failed", "2026-11-20")
        assert {c["field"] for c in log.changes(ids[-1])} == {"fitted", "fitted_on", "outcome", "outcome_date"}


@run_async
async def test_the_page_shows_before_its_count_and_the_count_follows(tmp_path, monkeypatch):
    from workbench.store.sqlite_log import SqliteJobLog

    path = tmp_path / "jobs.sqlite3"
    ids = _fill(path, 3)
    release = __import__("threading").Event()
    slow_count = SqliteJobLog.count

    def count(self, *args: Any, **kwargs: Any) -> int:
        release.wait(5)  # as a count that reads many rows
        return slow_count(self, *args, **kwargs)

    monkeypatch.setattr(SqliteJobLog, "count", count)
    app = Host(path)
    async with app.run_test(size=SIZE) as pilot:
        screen = app.screen
        for _ in range(200):
            await pilot.pause(0.02)
            if screen.counting:
                break
        assert screen.counting and screen.loads == 0
        assert _ids(screen) == list(reversed(ids))  # the rows are there while the count is read
        assert "counting" in str(screen.query_one("#review-status", Static).render())
        release.set()
        await _settle(pilot, screen, 1)
        assert not screen.counting
        status = str(screen.query_one("#review-status", Static).render())
        assert "of 3" in status and "counting" not in status


def test_a_long_job_number_widens_the_id_column():
    from workbench.tui.screens.review import choose_columns

    narrow = dict(choose_columns(100))
    wide = dict(choose_columns(100, id_width=7))
    assert narrow["id"] == 5 and wide["id"] == 7
    assert sum(w + 2 for w in wide.values()) == 100  # the asset column gives the room


@run_async
async def test_seven_digit_job_numbers_are_shown_whole(tmp_path):
    path = tmp_path / "jobs.sqlite3"
    with JobLog.open(path) as log:
        job = log.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset="Pump P-1")
        log.conn.execute("UPDATE jobs SET id = 1000050 WHERE id = ?", (job,))  # as in a log of a million
    app = Host(path)
    async with app.run_test(size=(120, 40)) as pilot:
        screen = app.screen
        await _settle(pilot, screen, 1)
        assert _ids(screen) == [1000050]
        table = screen.query_one(DataTable)
        assert table.columns[table.coordinate_to_cell_key((0, 0)).column_key].width >= 7
