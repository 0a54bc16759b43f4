"""Pilot tests: each screen's main flow and every invalid-input path of the workbench.

These drive the real job contract (``workbench.job``); numbers are not re-checked here (the core's
verification tests own them) — these tests check that what is typed reaches the contract and what
comes back is shown, marked or refused in the right place.
"""

from __future__ import annotations

from textual.widgets import DataTable, Input, Static

from workbench.store.log import JobLog
from workbench.tui.commands import WorkbenchCommands
from workbench.tui.screens.help import HelpScreen
from workbench.tui.screens.save import SaveScreen
from workbench.tui.screens.section import SectionScreen
from workbench.tui.screens.stock import StockScreen
from workbench.tui.screens.substitute import SubstituteScreen

from .conftest import plain_text, settle


_text = plain_text


async def _type(pilot, field_id: str, text: str) -> None:
    """Replace a sheet field's text by typing (select all is not a key we rely on)."""
    field = pilot.app.screen.query_one(f"#{field_id}", Input)
    field.value = ""
    field.focus()
    await pilot.press(*text)


async def test_live_recompute_follows_typing(make_app):
    app = make_app()
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        assert app.focused.id == "power"
        assert app.job_screen.result is None
        await pilot.press(*"7.5", "tab", *"1460")
        await _type(pilot, "shaft_size", "40")
        await settle(pilot)
        first = app.job_screen.result
        assert first is not None and first["shafts"][0]["spec"] == "round 40mm"
        await _type(pilot, "speed", "730")
        await settle(pilot)
        second = app.job_screen.result
        # halving the speed at the same power doubles the running torque (T = P / ω)
        assert second["drive"]["running_torque_Nm"] == 2 * first["drive"]["running_torque_Nm"]
        assert "up to date" in _text(app.job_screen.query_one("#title-bar", Static))


async def test_invalid_field_is_marked_in_place_and_last_result_dimmed(make_app):
    app = make_app(demo=True)
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        good = app.job_screen.result
        assert good is not None
        await _type(pilot, "power", "abc")
        await settle(pilot)
        sheet, panel = app.job_screen.sheet, app.job_screen.panel
        assert sheet.row("power").invalid
        assert "power" in _text(sheet.query_one("#error-power", Static))
        assert not sheet.row("speed").invalid
        assert panel.has_class("-stale") and panel.result is good
        assert "fix: power" in _text(panel.query_one("#verdict-status", Static))
        assert app.job_screen.result is None  # a stale result is never "the" result
        await _type(pilot, "power", "7.5 kW")
        await settle(pilot)
        assert not sheet.row("power").invalid
        assert not panel.has_class("-stale")
        assert app.job_screen.result == good


async def test_every_invalid_field_is_marked_at_once(make_app):
    app = make_app(demo=True)
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        await _type(pilot, "efficiency", "lots")
        await _type(pilot, "overhang", "far")
        await _type(pilot, "candidate_material", "cheese")
        await _type(pilot, "shaft_size", "40 parsecs")
        await settle(pilot)
        sheet = app.job_screen.sheet
        invalid = sheet.invalid_keys()
        # "shaft" errors land on the size field of the shaft block
        assert invalid == {"efficiency", "overhang", "candidate_material", "shaft_size"}
        assert "✗ 4 fields to fix" in _text(app.job_screen.query_one("#title-bar", Static))


async def test_empty_sheet_and_missing_shaft_are_explained(make_app):
    app = make_app()
    async with app.run_test(size=(80, 24)) as pilot:
        await pilot.press(*"7.5", "tab", *"1460")
        await settle(pilot)
        sheet, panel = app.job_screen.sheet, app.job_screen.panel
        # an empty field is "still needed", not an error of the fitter's: no red mark on it
        assert not sheet.row("shaft_size").invalid
        assert "still needed: shaft" in _text(panel.query_one("#verdict-status", Static))
        assert "needs shaft" in _text(app.job_screen.query_one("#title-bar", Static))
        assert app.job_screen.has_class("-narrow")


async def test_units_toggle_changes_display_not_inputs(make_app):
    app = make_app(demo=True)
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        table = app.job_screen.query_one("#verdict-table", Static)
        before = app.inputs()
        assert "N·m" in _text(table)
        await pilot.press("f5")
        assert app.system == "inch"
        assert "lbf·in" in _text(table) and "kpsi" in _text(table)
        assert app.inputs() == before
        await pilot.press("f5")
        assert "N·m" in _text(table)


async def test_stock_finder_takes_a_size_as_candidate(make_app):
    app = make_app(demo=True)
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        await pilot.press("f4")
        assert isinstance(app.screen, StockScreen)
        await pilot.press("h")  # hexagon
        await settle(pilot)
        stock = app.screen
        assert stock.rows and all(r["spec"].startswith("hex") for r in stock.rows)
        start = app.screen.query_one(DataTable).cursor_row
        assert stock.rows[start]["verdict"] == "pass"
        # smaller hexes cannot be turned to the 40 mm journals or do not pass once turned
        assert all(r["verdict"] != "pass" for r in stock.rows[:start])
        await pilot.press("down", "enter")
        await settle(pilot)
        taken = stock.rows[start + 1]
        result = app.job_screen.result
        assert result["inputs"]["candidate"] == taken["spec"]
        assert result["shafts"][1]["spec"] == taken["spec"]


async def test_stock_finder_unknown_material_is_refused(make_app):
    app = make_app(demo=True)
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        await pilot.press("f4")
        await settle(pilot)
        field = app.screen.query_one("#stock-materials", Input)
        field.value = "unobtainium"
        await settle(pilot)
        assert app.screen.rows == []
        assert _text(app.screen.query_one("#stock-status", Static)).startswith("✗")
        await pilot.press("tab", "tab", "enter")  # nothing to take: the screen stays
        assert isinstance(app.screen, StockScreen)
        await pilot.press("escape")
        assert app.job_screen.result["inputs"]["candidate"] == "square 45mm"


async def test_substitution_view_lists_profiles_and_refuses_without_shaft(make_app):
    app = make_app(demo=True)
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        await pilot.press("f3")
        await settle(pilot)
        assert isinstance(app.screen, SubstituteScreen)
        body = _text(app.screen.query_one("#substitute-body", Static))
        for word in ("square", "flat", "hex", "tube", "equal strength", "Fit facts"):
            assert word in body
        await pilot.press("escape")
        await _type(app.job_screen and pilot, "shaft_size", "")
        await pilot.press("f3")
        await settle(pilot)
        assert "✗" in _text(app.screen.query_one("#substitute-body", Static))


async def test_section_view_draws_or_says_why_not(make_app):
    app = make_app(demo=True)
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        await pilot.press("f2")
        await settle(pilot)
        assert isinstance(app.screen, SectionScreen)
        assert [m["role"] for m in app.screen.maps] == ["shaft", "candidate"]
        for smap in app.screen.maps:
            if smap["error"]:
                assert "not available" in smap["error"] or ":" in smap["error"]
            else:
                assert any(any(row) for row in smap["inside"])
        await pilot.press("escape")
        assert app.screen is app.job_screen


async def test_help_shows_keys_methods_and_cautions(make_app):
    app = make_app(demo=True)
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        await pilot.press("f1")
        assert isinstance(app.screen, HelpScreen)
        text = _text(app.screen.query_one("#help-result", Static))
        for caution in app.job_screen.result["cautions"]:
            assert caution in text
        assert "fatigue" in text
        keys = _text(app.screen.query_one("#help-keys", Static))
        assert "F4" in keys and "stock finder" in keys
        for key in ("Ctrl+N", "Ctrl+Z", "Ctrl+L", "F8"):  # the workbench's own keys are all listed
            assert key in keys
        lines = [line for line in keys.splitlines() if line.strip()]
        # a long line wraps under its own text, never back to the left edge (80 columns too)
        assert all(line.startswith(("  ", "Keys", "Typing", "What")) for line in lines)


async def test_save_asks_for_asset_then_writes_the_log(make_app, tmp_path):
    app = make_app(demo=True)
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        await pilot.press("f6")
        assert isinstance(app.screen, SaveScreen)
        asset = app.screen.query_one("#save-asset", Input)
        asset.value = ""
        await pilot.press("ctrl+s")
        assert "Asset is needed" in _text(app.screen.query_one("#save-status", Static))
        await pilot.press(*"P-12", "enter", "enter", "enter", "enter")
        await settle(pilot)
        assert app.screen is app.job_screen
    with JobLog.open(tmp_path / "jobs.sqlite3") as log:
        record = log.get(1)
    assert record.asset == "P-12" and record.inputs["candidate"] == "square 45mm"


async def test_save_refused_without_a_current_result(make_app):
    app = make_app()
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        await pilot.press("f6")
        assert app.screen is app.job_screen


async def test_review_choice_reopens_or_duplicates(make_app):
    app = make_app()
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        await pilot.press("f7")  # the job log view (or a "not available" note) must not crash
        await pilot.pause()
        if app.screen is not app.job_screen:
            await pilot.press("escape")
            await pilot.pause()
        inputs = {"power": "10 hp", "speed": "1750", "shaft": "round 1-1/4in keyed"}
        app._reviewed({"action": "duplicate", "job_id": 3, "inputs": inputs})
        await settle(pilot)
        assert app.inputs() == inputs
        assert app.job_screen.sheet.value("shaft_size") == "1-1/4in"
        assert app.job_screen.result is not None


async def test_reopening_says_whether_todays_result_matches_the_stored_one(make_app, tmp_path):
    """A reopened job is recomputed; a changed result is said plainly, with stored and today's figures."""
    from workbench.demo import demo_inputs
    from workbench.job import evaluate_inputs

    inputs = demo_inputs()
    result = evaluate_inputs(inputs)
    altered = {**result, "verdict": "fail"}  # as if an older method had judged it otherwise
    with JobLog.open(tmp_path / "jobs.sqlite3") as log:
        same_id = log.save(inputs, result, asset="CV-07")
        changed_id = log.save(inputs, altered, asset="CV-08")
    app = make_app()
    seen: list[str] = []
    async with app.run_test(size=(120, 40)) as pilot:
        app.notify = lambda message, **kwargs: seen.append(str(message))  # type: ignore[method-assign]
        await settle(pilot)
        app._reviewed({"action": "reopen", "job_id": same_id, "inputs": inputs})
        await settle(pilot)
        assert "matches the stored one" in seen[-1]
        assert app.meta["asset"] == "CV-07"
        app._reviewed({"action": "reopen", "job_id": changed_id, "inputs": inputs})
        await settle(pilot)
        assert "DIFFERS" in seen[-1] and "verdict" in seen[-1]
        assert "fail" in seen[-1] and "pass" in seen[-1]  # both the stored and today's verdict are shown


async def test_palette_offers_only_what_makes_sense(make_app):
    app = make_app()
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        provider = WorkbenchCommands(app.screen)
        titles = [title for title, _, _ in provider._available()]
        assert "Stock finder" in titles and "Save job to log" not in titles
        app.action_load_demo()
        await settle(pilot)
        titles = [title for title, _, _ in provider._available()]
        assert "Save job to log" in titles


async def test_enter_moves_on_and_pagedown_jumps_parts(make_app):
    app = make_app()
    async with app.run_test(size=(80, 24)) as pilot:
        await pilot.press("enter")
        assert app.focused.id == "speed"
        await pilot.press("pagedown")
        assert app.focused.id == "mount"
        await pilot.press("pagedown", "pagedown")
        assert app.focused.id == "candidate_profile"
        await pilot.press("pageup")
        assert app.focused.id == "shaft_profile"
        await pilot.press("s", "enter")  # Enter on a pick-list keeps the pick and moves on, too
        assert app.focused.id == "shaft_size"
        await pilot.press("shift+tab")
        assert app.focused.id == "shaft_profile"
        await pilot.press("t")  # tube: the bore field appears in the tab order
        await pilot.press("tab", "tab")
        assert app.focused.id == "shaft_second"


async def test_size_field_takes_solver_profiles(make_app):
    app = make_app(demo=True)
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        sheet = app.job_screen.sheet
        tip = _text(sheet.query_one("#spec-candidate", Static))
        assert "radius 3 or chamfer 2" in tip  # the square's shape words are offered
        await _type(pilot, "candidate_size", "45 radius 3")
        await settle(pilot)
        result = app.job_screen.result
        assert result["inputs"]["candidate"] == "square 45mm radius 3mm"
        line = _text(sheet.query_one("#spec-candidate", Static))
        assert "→ square 45mm radius 3mm" in line and "or chamfer" not in line  # tip gone once used
        # rounded corners have no closed form: the solver's method is named
        assert "finite elements" in str(result["shafts"][1]["methods"])
        app.job_screen.sheet.set_shaft("shaft", "round 40mm double-d 3mm")
        await settle(pilot)
        assert sheet.value("shaft_profile") == "round"
        assert sheet.value("shaft_size") == "40 double-d 3mm"
        assert app.job_screen.result["inputs"]["shaft"] == "round 40mm double-d 3mm"
