"""The steps part of a result in the CLI report and the job card (workbench.report.steps).

Display tests on ``tui/steps_fixture`` (the demo's real result plus the steps part of the
contract, invented figures there): what is shown, where, and that an old result without steps
still renders without a steps section.
"""

from __future__ import annotations

import io

from rich.console import Console
from tui.steps_fixture import real_result, stepped_result

from workbench.report.check_report import render_check
from workbench.report.jobcard import export_card, job_card
from workbench.report.steps import (governing_step_name, shaft_checks, step_columns, step_name,
                                    steps_rows)


def _text(renderable, width=100) -> str:
    console = Console(width=width, file=io.StringIO(), color_system=None, record=True)
    console.print(renderable)
    return console.export_text()


def test_step_names_and_rows():
    result = stepped_result()
    existing, candidate = result["shafts"]
    assert governing_step_name(existing) == "hub seat, keyed, 40 mm"
    rows = steps_rows(candidate)
    assert [row[0] for row in rows] == ["0", "1", "2", "3 ◀", "4", "5"]
    assert rows[3][2] == "at 300"  # a shoulder is one place along the shaft
    assert rows[3][4] == "0.800"  # its fillet radius [mm]
    assert rows[3][7] == "2.30/1.80" and rows[3][-1] == "1.95"
    assert len(rows[0]) == len(step_columns())
    assert step_columns("inch")[5] == "M lbf·in"
    # a step with no label is named from its kind, keyseat and diameter
    assert step_name({"kind": "seat", "keyed": True, "diameter_m": 0.035}) == "hub seat, keyed, 35.0 mm"
    assert step_name({"kind": "journal", "diameter_m": 1.25 * 0.0254}, "inch") == "journal, 1.25 in"
    assert step_name({"kind": "journal", "label": "bearing 1 journal", "diameter_m": 0.04}) == (
        "bearing 1 journal, 40.0 mm")


def test_whole_shaft_checks_and_not_checked():
    shaft = stepped_result()["shafts"][0]
    checks = dict(shaft_checks(shaft))
    assert checks["key shear / crushing"] == "6.10 / 2.40 · needs 45.0 mm of key"
    assert checks["first critical speed"] == "9100 rpm"
    assert checks["slope at the bearings"] == "0.00012 rad · 0.00035 rad (limit 0.0010 rad)"
    shaft.update(critical_speed_rpm=None, deflection_m=None, bearing_slopes_rad=[None, None])
    shaft["key"].update(shear_safety_factor=None, crush_safety_factor=None)
    assert dict(shaft_checks(shaft))["key shear / crushing"] == (
        "not checked (no hub length) · needs 45.0 mm of key")
    shaft.pop("key")
    checks = dict(shaft_checks(shaft))
    assert "key shear / crushing" not in checks
    assert checks["first critical speed"] == checks["slope at the bearings"] == "not checked (no span)"


def test_cli_report_shows_the_steps_table():
    text = _text(render_check(stepped_result()), width=100)
    assert "Steps" in text and "3 ◀" in text and "shoulder 50/40 mm" in text
    assert "first critical speed" in text
    text80 = _text(render_check(stepped_result()), width=80)
    assert "fatigue" in text80 and "3 ◀" in text80  # every column still there at 80 columns
    real = _text(render_check(real_result()), width=100)
    assert real.count("Steps") == 1 and "◀" in real  # one steps panel, from the demo as computed


def test_job_card_shows_the_steps_table():
    card = export_card(job_card(stepped_result()), "text")
    assert "Steps" in card and "hub seat, keyed, 40 mm" in card and "1 ◀" in card
    html = export_card(job_card(stepped_result()), "html")
    assert "shoulder 50/40 mm" in html


def test_a_result_without_steps_has_no_steps_section():
    result = stepped_result()
    for shaft in result["shafts"]:
        shaft.pop("steps")
    assert "◀" not in _text(render_check(result))
    card = export_card(job_card(result), "text")
    assert "Steps" not in card
