"""Start-up stays light: opening the workbench module pulls in no numpy, scipy, pint or core."""

from __future__ import annotations

import json
import subprocess
import sys

HEAVY = ("numpy", "scipy", "pint", "workbench.job", "workbench.core", "sqlite3")


def test_importing_the_app_leaves_heavy_modules_unloaded():
    code = (
        "import json, sys; import workbench.tui.app; "
        f"print(json.dumps([m for m in {HEAVY!r} if m in sys.modules]))"
    )
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True)
    assert json.loads(out.stdout) == []


async def test_sheet_fields_sit_straight_in_one_grid_per_part(make_app):
    """Styles are reused only between siblings: every label, control and hint of a part of the
    sheet must share that part's grid as parent (a container per row made start-up ~1.2x slower)."""
    from workbench.tui.fields import SECTIONS

    app = make_app()
    async with app.run_test(size=(120, 40)):
        sheet = app.job_screen.sheet
        for section in SECTIONS:
            parents = set()
            for spec in section.fields:
                parents.update(id(w.parent) for w in sheet.row(spec.key).widgets())
            assert parents == {id(sheet.query_one(f"#fields-{section.id}"))}, section.id


async def test_error_line_is_as_tall_as_its_text_at_the_grid_width(make_app):
    """The error spans the three columns: measured at the first column's width it would leave
    blank lines under it."""
    from textual.widgets import Input

    from .conftest import settle

    app = make_app(demo=True)
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        app.job_screen.query_one("#power", Input).value = "7.5 kV"
        await settle(pilot)
        error = app.job_screen.query_one("#error-power")
        speed = app.job_screen.query_one("#label-speed")
        assert 1 <= error.region.height <= 3
        assert speed.region.y == error.region.y + error.region.height
