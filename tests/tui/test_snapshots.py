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
        else:
            for key in SCREENS[screen]:
                await pilot.press(key)
                await settle(pilot)
        await settle(pilot)
        _steady(app)
        await pilot.pause()

    assert snap_compare(app, terminal_size=size, run_before=run_before)
