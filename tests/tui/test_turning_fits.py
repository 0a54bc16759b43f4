"""Pilot and snapshot tests of the turning-sheet view (F10) and the fits calculator (F11).

Numbers shown come from the core (checked in tests/core/test_iso286.py against the printed
tables); here: the view shows the current job's sheet, cycles which shaft, and the calculator
answers, refuses bad input in one line, and never raises.
"""

from __future__ import annotations

import pytest
from textual.widgets import Input, Static

from workbench.tui.app import ShaftbenchApp
from workbench.tui.screens.fits import FitsScreen
from workbench.tui.screens.turning import TurningScreen

from .conftest import plain_text, settle


async def test_f10_shows_the_candidates_turning_sheet_and_cycles(make_app):
    app = make_app(demo=True)
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        await pilot.press("f10")
        await settle(pilot)
        assert isinstance(app.screen, TurningScreen)
        text = plain_text(app.screen.query_one("#turning-body", Static))
        assert "Turning sheet — candidate" in text and "40.002-40.018" in text  # 40 k6
        await pilot.press("ctrl+b")
        text = plain_text(app.screen.query_one("#turning-body", Static))
        assert "Turning sheet — existing" in text and "keyseat" in text and "N9" in text
        await pilot.press("ctrl+b")
        text = plain_text(app.screen.query_one("#turning-body", Static))
        assert "candidate" in text and "existing" in text
        await pilot.press("escape")
        assert not isinstance(app.screen, TurningScreen)


async def test_turning_view_takes_the_bearing_and_key_fit(make_app):
    app = make_app(demo=True)
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        await pilot.press("f10")
        await settle(pilot)
        app.screen.query_one("#turning-bearing", Input).value = "6208"
        app.screen.query_one("#turning-key_fit", Input).value = "tight"
        app.screen.query_one("#turning-bearing", Input).focus()
        await pilot.press("enter")
        await settle(pilot)
        await pilot.press("ctrl+b")
        text = plain_text(app.screen.query_one("#turning-body", Static))
        assert "bearing 6208" in text and "P9" in text and "18 mm" in text  # 6208 is 18 mm wide
        app.screen.query_one("#turning-bearing", Input).value = "9999x"
        await pilot.press("enter")
        await settle(pilot)
        text = plain_text(app.screen.query_one("#turning-body", Static))
        assert "✗" in text and "bearing" in text and "bearing 6208" in text  # the last good sheet stays


async def test_f10_without_a_result_says_so(make_app):
    app = make_app()
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        await pilot.press("f10")
        await settle(pilot)
        assert "no current result" in plain_text(app.screen.query_one("#turning-body", Static))


async def test_f11_fits_calculator_answers_and_refuses(make_app):
    app = make_app(demo=True)
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        await pilot.press("f11")
        await settle(pilot)
        assert isinstance(app.screen, FitsScreen)
        body = app.screen.query_one("#fits-body", Static)
        assert "35.002" in plain_text(body) and "35.018" in plain_text(body)  # 35 k6 +18/+2 um
        app.screen.query_one("#fit-class", Input).value = "H7/k6"
        app.screen.query_one("#fit-size", Input).value = "40mm"
        app.screen.query_one("#fit-measured", Input).value = "40.020mm"
        app.screen.query_one("#fit-size", Input).focus()
        await pilot.press("enter")
        text = plain_text(body)
        assert "transition fit" in text and "over the max" in text
        app.screen.query_one("#fit-class", Input).value = "q6"
        await pilot.press("enter")
        assert "✗ class:" in plain_text(body)
        await pilot.press("escape")
        assert not isinstance(app.screen, FitsScreen)


@pytest.mark.parametrize("size", [(80, 24), (120, 40)], ids=lambda s: f"{s[0]}x{s[1]}")
@pytest.mark.parametrize("key", ["f10", "f11"])
def test_turning_and_fits_snapshots(snap_compare, key, size, tmp_path):
    app = ShaftbenchApp(demo=True, log_path=str(tmp_path / "jobs.sqlite3"))

    async def run_before(pilot) -> None:
        await settle(pilot)
        await pilot.press(key)
        await settle(pilot)
        for field in app.screen.query(Input):
            field.cursor_blink = False
        await pilot.pause()

    assert snap_compare(app, terminal_size=size, run_before=run_before)
