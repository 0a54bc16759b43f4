"""SVG snapshots of each screen at 80×24 and 120×40 on the demo job (no clock, no randomness).

Update after a deliberate change of looks with ``pytest tests/tui --snapshot-update`` and look at
the report before committing.
"""

from __future__ import annotations

import pytest
from textual.widgets import Input

from workbench.tui.app import ShaftbenchApp

from .conftest import settle

SIZES = [(80, 24), (120, 40)]

# screen name -> keys pressed on the settled demo job
SCREENS = {
    "job": [],
    "job_invalid": None,  # special: types a bad power
    "help": ["f1"],
    "section": ["f2"],
    "substitute": ["f3"],
    "stock": ["f4", "s"],
    "save": ["f6"],
    "materials": ["ctrl+l"],  # the material pick-list
    "confirm": None,  # special: an edit, then Ctrl+Q asks before the unsaved job is lost
    "layout": ["pagedown"] * 4,  # the sheet's layout part (bearings, hub, steps)
    "profile": None,  # special: the profile view of a result with steps (tests/tui/steps_fixture)
}


def _steady(app) -> None:
    for field in app.screen.query(Input):
        field.cursor_blink = False


@pytest.mark.parametrize("size", SIZES, ids=lambda s: f"{s[0]}x{s[1]}")
@pytest.mark.parametrize("screen", list(SCREENS))
def test_screen_snapshot(snap_compare, screen, size, tmp_path):
    app = ShaftbenchApp(demo=True, log_path=str(tmp_path / "jobs.sqlite3"))

    async def run_before(pilot) -> None:
        await settle(pilot)
        if screen == "job_invalid":
            power = app.screen.query_one("#power", Input)
            power.value = "7.5 kV"
        elif screen == "confirm":
            app.screen.query_one("#power", Input).value = "7.6 kW"
            await settle(pilot)
            await pilot.press("ctrl+q")
        elif screen == "profile":
            from workbench.tui.screens.profile import ProfileScreen

            from .steps_fixture import stepped_result

            app.push_screen(ProfileScreen(stepped_result()))
        else:
            for key in SCREENS[screen]:
                await pilot.press(key)
                await settle(pilot)
        await settle(pilot)
        _steady(app)
        await pilot.pause()

    assert snap_compare(app, terminal_size=size, run_before=run_before)


@pytest.mark.parametrize("look", ["nocolor", "light"])
def test_look_snapshot(snap_compare, look, tmp_path, monkeypatch):
    """The job sheet at 80x24 with NO_COLOR (marks carried by symbols and text styles) and in the
    light theme, with one invalid field so the error marks are in the picture too."""
    if look == "nocolor":
        monkeypatch.setenv("NO_COLOR", "1")
    app = ShaftbenchApp(demo=True, log_path=str(tmp_path / "jobs.sqlite3"))
    assert app.no_color is (look == "nocolor")

    async def run_before(pilot) -> None:
        if look == "light":
            app.theme = "textual-light"
        await settle(pilot)
        app.screen.query_one("#overhang", Input).value = "far"
        await settle(pilot)
        _steady(app)
        await pilot.pause()

    assert snap_compare(app, terminal_size=(80, 24), run_before=run_before)
