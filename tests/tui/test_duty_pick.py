"""The workbench's duty pick-list: every entry is a duty the job reads, and picking one sets the
service factor from the AGMA table (data/service_factors.csv, as reproduced in a gear-reducer
maker's manual; values checked in tests/core against that source)."""

from __future__ import annotations

from workbench.duty import duty_service_factor
from workbench.tui.fields import CHOICE_DEFAULTS, DUTIES

from .conftest import settle


def test_every_entry_is_a_duty_the_job_reads():
    assert DUTIES[0] == CHOICE_DEFAULTS["duty"] == "not given"
    for entry in DUTIES[1:]:
        factor, reading = duty_service_factor("duty", entry)
        assert factor >= 1.0 and entry in reading


async def test_picking_a_duty_sets_the_service_factor(make_app):
    app = make_app(demo=True)
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        sheet = app.job_screen.sheet
        sheet._rows["service_factor"].set_value("")  # the demo types 1.5; the duty decides now
        sheet._rows["duty"].set_value("heavy 24h")
        await settle(pilot)
        result = app.job_screen.result
        assert result["inputs"]["duty"] == "heavy 24h"
        expected, _ = duty_service_factor("duty", "heavy 24h")
        assert result["drive"]["service_factor"] == expected
        sheet._rows["duty"].set_value("not given")
        await settle(pilot)
        assert "duty" not in app.job_screen.result["inputs"]
