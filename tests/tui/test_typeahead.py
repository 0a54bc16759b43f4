"""Typing ahead: every key goes to the field that has focus once the keys before it are handled.

The keys are handed to the app all at once (one burst, as a fast typist or a paste of keystrokes
does), not one by one with a pause between them as ``pilot.press`` does.
"""

from __future__ import annotations

import unicodedata

from textual import events

from workbench.store.log import JobLog

from .conftest import settle

NAMED = {"⏎": "enter", "⇥": "tab", "⇤": "shift+tab"}


def burst(app, text: str) -> None:
    """Hand every key of ``text`` to the app in one go (⏎ Enter, ⇥ Tab, ⇤ Shift+Tab)."""
    for char in text:
        if char in NAMED:
            key, character = NAMED[char], ("\r" if char == "⏎" else "\t" if char == "⇥" else None)
        elif char.isalnum():
            key, character = char, char
        else:
            key = unicodedata.name(char).lower().replace(" ", "_").replace("-", "_")
            key, character = {"full_stop": "full_stop", "space": "space"}.get(key, key), char
        event = events.Key(key, character)
        event.set_sender(app)
        app._driver.send_message(event)


async def test_sheet_typed_ahead_at_full_speed_fills_every_field(make_app):
    app = make_app()
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        sheet = app.job_screen.sheet
        burst(app, "7.5⏎1450⏎5⏎0.95⏎1.25⏎h⏎2.5⏎⏎v⏎200⏎60⏎⏎40⏎k⏎g⏎1045-cd⏎s⏎36⏎")
        await settle(pilot)
        expected = {
            "power": "7.5", "speed": "1450", "ratio": "5", "efficiency": "0.95",
            "service_factor": "1.25", "duty": "heavy 1/2h", "peak_factor": "2.5", "torque": "", "mount": "vbelt",
            "pitch_diameter": "200", "overhang": "60", "shaft_profile": "round",
            "shaft_size": "40", "shaft_keyseat": "keyed", "shaft_finish": "ground",
            "material": "1045-cd", "candidate_profile": "square", "candidate_size": "36",
        }
        got = {key: sheet.value(key) for key in expected}
        assert got == expected
        assert app.focused.id == "candidate_keyseat" or app.focused.id == "candidate_finish"


async def test_tab_and_shift_tab_typed_ahead_keep_their_order(make_app):
    app = make_app()
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        burst(app, "7.5⇥1450⇥3⇤⇤0⏎")
        await settle(pilot)
        sheet = app.job_screen.sheet
        assert (sheet.value("power"), sheet.value("speed"), sheet.value("ratio")) == ("7.50", "1450", "3")
        assert app.focused.id == "speed"


async def test_save_dialog_typed_ahead_keeps_each_field_apart(make_app, tmp_path):
    app = make_app(demo=True)
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        app.meta = {}
        await pilot.press("f6")
        await settle(pilot)
        burst(app, "CV-07⏎Line 3 west⏎Ann⏎new bar fitted⏎")
        await settle(pilot)
    with JobLog.open(str(tmp_path / "jobs.sqlite3")) as log:
        (record,) = log.search(limit=5)
    assert (record.asset, record.location, record.by, record.note) == (
        "CV-07", "Line 3 west", "Ann", "new bar fitted")


def _backspaces(app, count: int) -> None:
    for _ in range(count):
        event = events.Key("backspace", None)
        event.set_sender(app)
        app._driver.send_message(event)


async def test_backspace_and_cursor_keys_typed_ahead_keep_their_place(make_app):
    """Backspace is a binding of the field: it used to run after the letters typed behind it."""
    app = make_app()
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        burst(app, "7.55")
        _backspaces(app, 2)
        burst(app, "5 kW⏎1450⏎")
        await settle(pilot)
        sheet = app.job_screen.sheet
        assert (sheet.value("power"), sheet.value("speed")) == ("7.5 kW", "1450")


async def test_log_filter_typed_ahead_with_fast_backspaces(make_app, tmp_path):
    from workbench.tui.screens.review import ReviewScreen

    app = make_app(demo=True)
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        await pilot.press("f7")
        await settle(pilot)
        assert isinstance(app.screen, ReviewScreen)
        burst(app, "conveyor")
        _backspaces(app, 4)
        burst(app, "ab cd")
        await settle(pilot)
        assert app.screen.query_one("#review-text").value == "convab cd"
        assert isinstance(app.screen, ReviewScreen)  # no letter ran a key of the log (b, c, d…)


async def test_keys_typed_right_after_f6_land_in_the_save_dialog(make_app, tmp_path):
    app = make_app(demo=True)
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        app.meta = {}
        app.job_screen.query_one("#power").focus()
        burst(app, "")
        event = events.Key("f6", None)
        event.set_sender(app)
        app._driver.send_message(event)
        burst(app, "CV-09⏎Bay 2⏎")
        await settle(pilot)
        screen = app.screen
        assert screen.query_one("#save-asset").value == "CV-09"
        assert screen.query_one("#save-location").value == "Bay 2"
        assert app.job_screen.sheet.value("power") == "7.5 kW"  # nothing leaked into the sheet


async def test_pagedown_typed_ahead_moves_before_the_next_keys(make_app):
    app = make_app()
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        burst(app, "7.5⏎1450⏎3⏎")
        event = events.Key("pagedown", None)
        event.set_sender(app)
        app._driver.send_message(event)
        burst(app, "v⇥200⇥60")
        await settle(pilot)
        sheet = app.job_screen.sheet
        assert (sheet.value("ratio"), sheet.value("efficiency")) == ("3", "")
        assert (sheet.value("mount"), sheet.value("pitch_diameter"), sheet.value("overhang")) == (
            "vbelt", "200", "60")
