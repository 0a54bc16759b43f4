"""Never lose the sheet: new job, quit, undo, the draft kept after a crash, typed text as written."""

from __future__ import annotations

import json

import pytest

from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st
from textual.widgets import Input, Static

from workbench.tui.draft import draft_path, load_draft, save_draft
from workbench.tui.screens.confirm import ConfirmScreen

from .conftest import plain_text, settle


async def _type(pilot, field_id: str, text: str) -> None:
    field = pilot.app.screen.query_one(f"#{field_id}", Input)
    field.value = ""
    field.focus()
    await pilot.press(*text)


async def test_new_job_key_asks_before_an_unsaved_job_is_lost(make_app):
    app = make_app(demo=True)
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        sheet = app.job_screen.sheet
        await pilot.press("ctrl+n")  # the demo as started is not unsaved work: cleared at once
        await settle(pilot)
        assert not isinstance(app.screen, ConfirmScreen)
        assert app.inputs() == {}
        assert sheet.value("candidate_profile") == "round"  # the old candidate profile is gone too
        await _type(pilot, "power", "7.5")
        await settle(pilot)
        await pilot.press("ctrl+n")
        await settle(pilot)
        assert isinstance(app.screen, ConfirmScreen)
        await pilot.press("n")  # keep it
        await settle(pilot)
        assert sheet.value("power") == "7.5"
        await pilot.press("ctrl+n", "y")
        await settle(pilot)
        assert sheet.value("power") == ""


async def test_ctrl_q_asks_when_the_job_is_not_saved(make_app):
    app = make_app()
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        await _type(pilot, "power", "7.5")
        await settle(pilot)
        await pilot.press("ctrl+q")
        await settle(pilot)
        assert isinstance(app.screen, ConfirmScreen) and app.is_running
        await pilot.press("escape")
        await settle(pilot)
        assert app.is_running and app.job_screen.sheet.value("power") == "7.5"
        await pilot.press("ctrl+q", "y")
        await pilot.pause(0.2)
        assert not app.is_running


async def test_quit_with_an_empty_sheet_does_not_ask(make_app):
    app = make_app()
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        await pilot.press("ctrl+q")
        await pilot.pause(0.2)
        assert not app.is_running


async def test_undo_and_redo_put_back_the_last_changes(make_app):
    app = make_app()
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        sheet = app.job_screen.sheet
        await _type(pilot, "power", "7.5")
        await settle(pilot)
        await _type(pilot, "speed", "1450")
        await settle(pilot)
        await pilot.press("ctrl+z")
        await settle(pilot)
        assert (sheet.value("power"), sheet.value("speed")) == ("7.5", "")
        await pilot.press("ctrl+z")
        await settle(pilot)
        assert sheet.value("power") == ""
        await pilot.press("ctrl+y")
        await settle(pilot)
        assert (sheet.value("power"), sheet.value("speed")) == ("7.5", "")
        await pilot.press("ctrl+n", "y")  # a new job is a step too: undo brings the job back
        await settle(pilot)
        assert sheet.value("power") == ""
        await pilot.press("ctrl+z")
        await settle(pilot)
        assert sheet.value("power") == "7.5"


async def test_palette_lists_only_the_workbench_commands(make_app):
    from workbench.tui.commands import WorkbenchCommands

    app = make_app()
    assert app.COMMANDS == {next(iter(app.COMMANDS))}
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        provider = WorkbenchCommands(app.screen)
        titles = [title for title, _, _ in provider._available()]
        assert titles[0] == "Help and cautions"
        assert any("New job" in t for t in titles) and "Quit" in titles
        assert not any(word in " ".join(titles).lower() for word in ("screenshot", "maximize"))


async def test_markup_in_a_field_is_shown_as_typed(make_app):
    """Typing ``[/`` put the error line through the markup parser and ended the app."""
    app = make_app(demo=True)
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        await _type(pilot, "power", "[/")
        await _type(pilot, "candidate_size", "[/x] [b]40")
        await settle(pilot)
        assert app.is_running
        assert "[/" in plain_text(app.job_screen.query_one("#error-power", Static))
        assert "[/x] [b]40" in plain_text(app.job_screen.query_one("#spec-candidate", Static))


async def test_a_core_failure_is_said_on_its_field(make_app):
    """``40 double-d 20`` leaves no material; the core's ValueError used to end the app."""
    app = make_app(demo=True)
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        app.job_screen.sheet.row("shaft_keyseat").set_value("plain")
        await _type(pilot, "shaft_size", "40 double-d 20")
        await settle(pilot)
        assert app.is_running
        error = plain_text(app.job_screen.query_one("#error-shaft_size", Static))
        assert "shaft" in error and "double-d" in error and "half the diameter" in error
        assert app.job_screen.result is None


def test_an_unforeseen_core_error_is_put_on_the_field_it_comes_from(monkeypatch):
    """Any exception of the core (not only JobInputError) comes back as a field message: the field
    is found by giving each likely field its stand-in until the job computes."""
    import workbench.job as job
    from workbench.tui import engine

    real = job.evaluate_inputs

    def failing(inputs, **kwargs):
        if inputs.get("candidate") == "square 41mm":
            raise ValueError("a case the core never met")
        return real(inputs, **kwargs)

    monkeypatch.setattr(job, "evaluate_inputs", failing)
    evaluation = engine.evaluate({"power": "7.5 kW", "speed": "1450 rpm", "shaft": "round 40mm",
                                  "candidate": "square 41mm"})
    assert evaluation.result is None
    assert set(evaluation.errors) == {"candidate"}
    assert "a case the core never met" in evaluation.errors["candidate"]


async def test_save_failure_naming_a_markup_path_is_shown_as_written(make_app, tmp_path):
    (tmp_path / "[").mkdir()
    blocked = tmp_path / "[" / "x]"  # the path reads ".../[/x]/jobs.sqlite3"
    blocked.write_text("not a folder")
    app = make_app(demo=True, log_path=str(blocked / "jobs.sqlite3"))
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        await pilot.press("f6")
        await settle(pilot)
        app.screen.action_save()
        await settle(pilot)
        assert app.is_running
        status = plain_text(app.screen.query_one("#save-status", Static))
        assert "not saved" in status and "[/x]" in status


async def test_an_unexpected_failure_keeps_the_sheet_as_a_draft_offered_next_start(make_app, tmp_path):
    app = make_app()
    with pytest.raises(RuntimeError, match="a bug"):  # Pilot hands the app's failure on to the test
        async with app.run_test(size=(80, 24)) as pilot:
            await settle(pilot)
            await _type(pilot, "power", "7.5")
            await settle(pilot)
            app._handle_exception(RuntimeError("a bug"))  # what Textual calls for anything escaping
            await pilot.pause(0.2)
    path = draft_path(str(tmp_path / "jobs.sqlite3"))
    assert load_draft(path)["inputs"] == {"power": "7.5"}
    again = make_app()
    async with again.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        assert isinstance(again.screen, ConfirmScreen)
        await pilot.press("y")
        await settle(pilot)
        assert again.job_screen.sheet.value("power") == "7.5"
    assert not path.exists()  # taken back: not offered a second time


def test_a_foreign_draft_file_is_ignored(tmp_path):
    path = tmp_path / "jobs.sqlite3.draft.json"
    for text in ("", "[1, 2]", '{"inputs": 3}', "\x00\xff"):
        path.write_text(text, encoding="latin-1")
        assert load_draft(path) is None
    assert save_draft(path, {"power": "[/x]"}, {}, "test")
    assert json.loads(path.read_text(encoding="utf-8"))["inputs"] == {"power": "[/x]"}


FIELDS = ("power", "speed", "ratio", "pitch_diameter", "shaft_size", "candidate_size", "material",
          "twist_limit")
HOSTILE = st.one_of(
    st.text(max_size=40),
    st.sampled_from(["[/", "[/x]", "[b]", "[link=x]", "\x1b[31m", "\\", "\x00", "\t\r", "🔩"]),
    st.builds(lambda s, n: s * n, st.sampled_from(["[/", "a", "9", "\x1b"]), st.integers(2000, 5000)),
)


@settings(max_examples=6, deadline=None, suppress_health_check=list(HealthCheck))
@given(st.lists(st.tuples(st.sampled_from(FIELDS), HOSTILE), min_size=1, max_size=4))
def test_arbitrary_text_in_any_field_never_ends_the_app(tmp_path_factory, entries):
    """Markup, escapes, control characters and pastes of up to 10 kB: stored literally, app lives."""
    import asyncio

    from workbench.tui.app import ShaftbenchApp

    folder = tmp_path_factory.mktemp("hostile")

    async def run() -> None:
        app = ShaftbenchApp(demo=True, log_path=str(folder / "jobs.sqlite3"))
        async with app.run_test(size=(80, 24)) as pilot:
            await settle(pilot, rounds=1)
            typed: dict[str, str] = {}
            for key, text in entries:
                field = app.job_screen.query_one(f"#{key}", Input)
                field.focus()
                field.value = ""
                await pilot.pause()
                app.paste_text = text
                field.post_message(__import__("textual.events", fromlist=["Paste"]).Paste(text))
                typed[key] = text
                await pilot.pause()
            await settle(pilot, rounds=2)
            assert app.is_running
            for key, text in typed.items():
                field = app.job_screen.query_one(f"#{key}", Input)
                # a paste keeps its first line only (an Input is one line); stored as pasted
                first_line = text.splitlines()[0] if text.splitlines() else ""
                assert field.value == first_line or field.value == text

    asyncio.run(run())


async def test_inch_display_reads_bare_lengths_as_inches_and_keeps_the_unit(make_app, tmp_path):
    """After F5 (inch), a bare 1.5 is 1.5 in (38.1 mm, exact by definition of the inch) and goes
    into the job with its unit, so the saved job reads the same in either display."""
    app = make_app()
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        await _type(pilot, "power", "7.5")
        await _type(pilot, "speed", "1450")
        await _type(pilot, "shaft_size", "1.25")  # metric display: 1.25 mm, far too small
        await settle(pilot)
        error = plain_text(app.job_screen.query_one("#error-shaft_size", Static))
        assert "did you mean 1.25 in" in error
        await pilot.press("f5")  # the job does not change: the 1.25 typed in metric is written 1.25mm
        await settle(pilot)
        assert app.inputs()["shaft"] == "round 1.25mm"
        await _type(pilot, "shaft_size", "1.25")
        await settle(pilot)
        assert app.inputs()["shaft"] == "round 1.25in"
        await _type(pilot, "shaft_size", "1 1/2")
        await _type(pilot, "overhang", "2")
        app.job_screen.sheet.row("mount").set_value("vbelt")
        await _type(pilot, "pitch_diameter", "8")
        await settle(pilot)
        inputs = app.inputs()
        assert inputs["shaft"] == "round 1-1/2in" and inputs["overhang"] == "2in"
        assert inputs["pitch_diameter"] == "8in"
        shaft = app.job_screen.result["shafts"][0]
        assert abs(shaft["dimensions_m"]["size_m"] - 0.0381) < 1e-9
        assert "bare = in" in plain_text(app.job_screen.query_one("#hint-shaft_size", Static))
        await pilot.press("f5")  # back to metric: the job does not change, the units are written out
        await settle(pilot)
        assert app.inputs() == inputs
        assert app.job_screen.sheet.value("overhang") == "2in"
        await _type(pilot, "pitch_diameter", "200")  # metric again: bare = mm
        await settle(pilot)
        assert app.job_screen.result["mount"]["pitch_diameter_m"] == 0.2


async def test_stock_finder_names_the_governing_check_of_each_row(make_app):
    """A MARGINAL row says why (the CLI's `stock` does the same): the governing check per row."""
    from textual.widgets import DataTable

    from workbench.tui.screens.stock import StockScreen

    app = make_app(demo=True)
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        await pilot.press("f4")
        await settle(pilot)
        assert isinstance(app.screen, StockScreen)
        table = app.screen.query_one(DataTable)
        labels = [str(c.label) for c in table.columns.values()]
        assert "governed by" in labels
        column = labels.index("governed by")
        for index, row in enumerate(app.screen.rows):
            cell = str(table.get_row_at(index)[column])
            assert cell == row["governing"] and cell not in ("", "—")


async def test_material_pick_list_searches_and_takes_a_key(make_app):
    from workbench.tui.screens.materials import MaterialPicker

    app = make_app(demo=True)
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        app.job_screen.query_one("#candidate_material").focus()
        await pilot.press("ctrl+l")
        await settle(pilot)
        assert isinstance(app.screen, MaterialPicker)
        await pilot.press(*"en19")
        await settle(pilot)
        assert [row["key"] for row in app.screen.rows] == ["42crmo4-qt"]  # EN19 is read as it
        await pilot.press("enter")
        await settle(pilot)
        assert app.job_screen.sheet.value("candidate_material") == "42crmo4-qt"
        result = app.job_screen.result
        assert result["shafts"][1]["material"].startswith("42crmo4-qt-")  # the row for the bar size


async def test_the_focused_fields_hint_is_in_the_title_line_at_80_columns(make_app):
    app = make_app()
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        title = app.job_screen.query_one("#title-bar", Static)
        assert "Power: kW, hp · bare = kW" in plain_text(title)
        await pilot.press("enter", "enter")
        await settle(pilot)
        from workbench.tui.fields import FIELD_BY_KEY

        assert f"Ratio: {FIELD_BY_KEY['ratio'].hint}" in plain_text(title)
        ratio = app.job_screen.query_one("#ratio", Input)
        assert ratio.value == "" and ratio.placeholder.startswith("default")  # a default, not a value


async def test_the_footer_shows_only_whole_keys_at_80_columns(make_app):
    """At 80 columns the footer's last entry used to be cut ('^p pal e tte P')."""
    from textual.widgets._footer import FooterKey

    from workbench.tui.widgets.fitting_footer import FittingFooter, key_width

    app = make_app(demo=True)
    for width, must_show in ((80, "f7"), (120, "^n")):
        async with app.run_test(size=(width, 24)) as pilot:
            await settle(pilot, rounds=1)
            footer = app.job_screen.query_one(FittingFooter)
            keys = list(footer.query(FooterKey))
            assert sum(key_width(k, True) for k in keys) - 1 <= width
            assert must_show in [k.key_display for k in keys]
            assert "f8" in [k.key_display for k in keys]  # the key that pages the verdict panel
        app = make_app(demo=True)


async def test_verdict_word_why_and_stale_mark_are_on_screen_at_80x24(make_app):
    app = make_app(demo=True)
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        await _type(pilot, "power", "7.5 kV")
        await settle(pilot)
        panel = app.job_screen.panel
        screen_region = app.screen.region
        for wid in ("#verdict-banner", "#verdict-status", "#verdict-why"):
            widget = panel.query_one(wid)
            assert widget.region.y < screen_region.height - 1, wid  # starts above the footer
        assert "NOT CURRENT" in plain_text(panel.query_one("#verdict-banner", Static))
        assert "fix: power" in plain_text(panel.query_one("#verdict-status", Static))
        before = panel.scroll_y
        await pilot.press("f8")
        await pilot.pause(0.2)
        assert panel.scroll_y > before  # F8 pages on through the panel


async def test_below_a_usable_size_the_screen_says_so(make_app):
    app = make_app(demo=True)
    async with app.run_test(size=(40, 12)) as pilot:
        await settle(pilot, rounds=1)
        note = app.job_screen.query_one("#too-small", Static)
        assert note.display and "40×12" in plain_text(note)
        assert not app.job_screen.query_one("#job-body").display or app.job_screen.has_class("-too-small")


async def test_panel_says_the_material_size_note_and_the_ratios_the_cli_report_says(make_app):
    """The CLI report's 'candidate / existing: strength …x, stiffness …x, mass …x' and the material
    size-range note are in the workbench too (figures from the same result dict)."""
    app = make_app(demo=True)
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        result = app.job_screen.result
        why = plain_text(app.job_screen.panel.query_one("#verdict-why", Static))
        comparison = result["comparison"]
        assert f"strength {comparison['strength_ratio']:.2f}×" in why
        assert f"stiffness {comparison['stiffness_ratio']:.2f}×" in why
        assert f"mass {comparison['mass_ratio']:.2f}×" in why
        note = result["shafts"][1]["notes"][0]
        assert "tabled strengths hold for" in note
        assert "tabled strengths hold for" in " ".join(why.split())
