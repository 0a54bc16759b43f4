"""The shaft profile view (F9), its drawing, the sheet's layout part and the governing-step row.

Display tests: they check that the steps part of a result is drawn and named where it belongs
(columns, marks, rows), not engineering values. The result comes from ``steps_fixture`` (the demo
job's real result with the steps part of the contract; invented figures in that part).
"""

from __future__ import annotations

from textual.widgets import Input, Static

from workbench.core.bearing_limits import DEFAULT_BEARING_TYPE, bearing_types
from workbench.tui.fields import BEARING_TYPES, CHOICE_DEFAULTS, FIELD_BY_KEY
from workbench.tui.screens.profile import ProfileScreen
from workbench.tui.widgets.shaft_profile import bearing_positions, draw_profiles
from workbench.tui.widgets.verdict_panel import verdict_rows

from .conftest import plain_text, settle
from .steps_fixture import real_result, stepped_result

SIZES = ((78, 22), (118, 38), (60, 20))


def _lines(width, height, result=None):
    return draw_profiles(result or stepped_result(), width, height).plain.split("\n")


def test_drawing_fits_the_cells_it_is_given():
    for width, height in SIZES:
        lines = _lines(width, height)
        assert len(lines) <= height, (width, height, len(lines))
        assert max(len(line) for line in lines) <= width, (width, height)
    # below 20 rows two shafts and the diagram keep their smallest size (the view scrolls)
    assert len(_lines(60, 14)) == 20


def _profile_block(lines, role):
    """The rows of one shaft's drawing: from its title to the underline of its governing step."""
    start = next(i for i, line in enumerate(lines) if line.startswith(f"{role}:"))
    end = next(i for i in range(start + 1, len(lines)) if "━" in lines[i] and not lines[i].strip("━ "))
    return lines[start:end + 1]


def test_governing_step_is_underlined_under_its_own_columns_and_named():
    width = 84  # 0.42 m over 84 columns: 5 mm a column
    result = stepped_result()
    lines = _lines(width, 30, result)
    block = _profile_block(lines, "as found")
    underline = block[-1]
    seat = result["shafts"][0]["steps"][1]  # the governing step of the as-found shaft: 340-420 mm
    first, last = underline.index("━"), underline.rindex("━")
    assert first == int(seat["x_start_m"] / 0.42 * width)
    assert last == width - 1
    assert "governing ━ hub seat, keyed, 40 mm" in block[0]
    candidate = _profile_block(lines, "candidate")
    assert "shoulder 50/40 mm" in candidate[0]
    assert candidate[-1].count("━") == 1  # a shoulder is one place along the shaft


def test_keyseat_notch_bearings_and_load_line():
    width = 84
    result = stepped_result()
    lines = _lines(width, 30, result)
    block = _profile_block(lines, "as found")
    top = next(line for line in block[1:] if line.strip())  # the shaft's top edge
    notch = [c for c, ch in enumerate(top) if ch in "▂▆"]
    assert notch and min(notch) >= int(0.34 / 0.42 * width)  # only over the keyed hub seat
    letters = block[-2]
    for x in bearing_positions(result, result["shafts"]):
        assert letters[int(x / 0.42 * width)] == "▲"
    assert lines[0].index("↓") == int(0.38 / 0.42 * width)  # the layout's load line


def test_moment_diagram_peaks_over_the_bearing_next_to_the_overhung_load():
    width = 84
    lines = _lines(width, 30)
    head = next(i for i, line in enumerate(lines) if line.startswith("bending moment"))
    assert "max" in lines[head] and "320 mm" in lines[head] and "torque" in lines[head]
    bars = [line for line in lines[head + 1:] if line and set(line) <= set(" ▁▂▃▄▅▆▇█")]
    eighths = " ▁▂▃▄▅▆▇█"
    heights = [sum(eighths.index(bar[c]) for bar in bars) for c in range(width)]
    tallest = max(range(width), key=heights.__getitem__)
    assert abs(tallest - int(0.32 / 0.42 * width)) <= 1  # M = F a over the bearing (Table A-9 case 10)
    assert all(ch == " " for ch in lines[head + 1][int(0.39 / 0.42 * width):])  # no moment beyond the load


def test_the_demo_as_computed_today_is_drawn():
    """Not a fixture: the demo's real result (its layout, steps and moment diagram)."""
    from workbench.report.steps import governing_step_name

    result = real_result()
    width = 90
    lines = _lines(width, 30, result)
    assert max(len(line) for line in lines) <= width and len(lines) <= 30
    length = max(s["x_end_m"] for shaft in result["shafts"] for s in shaft["steps"])
    for shaft in result["shafts"]:
        role = "as found" if shaft["role"] == "existing" else "candidate"
        block = _profile_block(lines, role)
        assert governing_step_name(shaft)[:20] in block[0]
        for x in result["layout"]["bearing_x_m"]:
            assert block[-2][min(width - 1, int(x / length * width))] == "▲"
    assert lines[0].index("↓") == int(result["layout"]["load_x_m"] / length * width)
    # the candidate's body is larger than its journals: the drawn edge steps between them
    candidate = next(s for s in result["shafts"] if s["role"] == "candidate")
    body = next(s for s in candidate["steps"] if s["kind"] == "body")
    journal = next(s for s in candidate["steps"] if s["kind"] == "journal")
    if body["diameter_m"] > journal["diameter_m"]:
        block = _profile_block(lines, "candidate")
        mid = lambda step: int((step["x_start_m"] + step["x_end_m"]) / 2 / length * width)  # noqa: E731
        assert [row[mid(body)] for row in block[1:-2]] != [row[mid(journal)] for row in block[1:-2]]


def test_results_without_steps_say_so():
    assert "No result yet" in draw_profiles(None, 78, 22).plain
    result = stepped_result()
    for shaft in result["shafts"]:
        shaft.pop("steps")
    assert "no steps" in draw_profiles(result, 78, 22).plain


def test_verdict_panel_names_the_governing_step():
    result = stepped_result()
    rows = dict(verdict_rows(result, "metric"))
    assert rows["governing step"] == ["hub seat, keyed, 40 mm", "shoulder 50/40 mm"]
    real = dict(verdict_rows(real_result(), "metric"))["governing step"]
    assert all(name != "—" and "mm" in name for name in real)  # label + turned diameter
    for shaft in result["shafts"]:
        shaft.pop("steps")
    assert "governing step" not in dict(verdict_rows(result, "metric"))


def test_hub_materials_on_the_sheet_follow_the_table():
    from workbench.core.key_strength import DEFAULT_HUB_MATERIAL, hub_materials
    from workbench.tui.fields import HUB_MATERIALS

    assert sorted(HUB_MATERIALS) == sorted(hub_materials())
    assert HUB_MATERIALS[0] == DEFAULT_HUB_MATERIAL


def test_bearing_types_on_the_sheet_follow_the_table():
    assert sorted(BEARING_TYPES) == sorted(bearing_types())  # the sheet lists the default first
    assert BEARING_TYPES[0] == DEFAULT_BEARING_TYPE == CHOICE_DEFAULTS["bearing_type"]
    contract_keys = ("bearing_span", "bearing_type", "element_position", "load_from_bearing", "hub_length",
                     "element_mass", "journal", "seat", "fillet", "candidate_journal", "candidate_seat",
                     "candidate_fillet", "driven_position", "driven_from_bearing", "driven_mass",
                     "driven_load", "as_bar", "hub_material")
    assert all(key in FIELD_BY_KEY for key in contract_keys)


async def test_layout_part_defaults_cost_no_keys_and_reach_the_inputs(make_app):
    app = make_app()
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        sheet = app.job_screen.sheet
        assert sheet.inputs() == {}  # every layout default is left out: the contract fills it
        for key in ("load_from_bearing", "driven_from_bearing", "driven_mass", "driven_load"):
            assert not sheet.row(key).display  # overhung, no driven element: nothing to ask
        for _ in range(4):
            await pilot.press("pagedown")
        assert app.focused.id == "bearing_span"
        await pilot.press(*"300", "tab", "t", "tab", "b")  # span, tapered roller, between
        assert sheet.row("load_from_bearing").display
        await pilot.press("tab", *"120")
        assert app.focused.id == "load_from_bearing"
        inputs = sheet.inputs()
        assert inputs["bearing_span"] == "300"
        assert inputs["bearing_type"] == "tapered-roller"
        assert inputs["element_position"] == "between"
        assert inputs["load_from_bearing"] == "120"
        await pilot.press("shift+tab", "o")  # back to overhung: the distance is not sent
        assert not sheet.row("load_from_bearing").display
        assert "load_from_bearing" not in sheet.inputs()
        sheet.row("candidate_fillet").set_value("1.2")
        assert sheet.inputs()["candidate_fillet"] == "1.2"
        sheet.row("driven_position").set_value("far-end")
        await pilot.pause()
        assert sheet.row("driven_mass").display
        sheet.row("driven_mass").set_value("40")
        assert sheet.inputs()["driven_position"] == "far-end" and sheet.inputs()["driven_mass"] == "40"


async def test_f9_opens_the_profile_and_esc_closes_it(make_app):
    app = make_app(demo=True)
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(pilot)
        await pilot.press("f9")
        await settle(pilot, 1)
        assert isinstance(app.screen, ProfileScreen)
        assert app.screen.result is app.job_screen.result
        await pilot.press("escape")
        assert not isinstance(app.screen, ProfileScreen)


async def test_profile_screen_draws_and_lists_the_steps(make_app):
    app = make_app(demo=True)
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        app.push_screen(ProfileScreen(stepped_result()))
        await settle(pilot, 1)
        drawing = plain_text(app.screen.query_one("#profile-drawing", Static))
        assert "governing ━ shoulder 50/40 mm" in drawing and "bending moment" in drawing
        tables = plain_text(app.screen.query_one("#profile-tables", Static))
        assert "3 ◀" in tables and "hub seat, keyed, 40 mm" in tables
        assert "key shear / crushing" in tables
        await pilot.press("f5")  # inch display redraws the view
        await settle(pilot, 1)
        assert "lbf·in" in plain_text(app.screen.query_one("#profile-tables", Static))
        assert app.screen.query(Input) is not None
