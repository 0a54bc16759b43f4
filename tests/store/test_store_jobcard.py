"""The job card: what it shows, in each export format, with user text kept literal."""

from __future__ import annotations

import html

from store_helpers import result_for

from workbench.report.jobcard import export_card, job_card, literal, number


def _card(fmt: str, **meta: str) -> str:
    result = result_for("demo")
    return export_card(job_card(result, job_id=7, created_at="2025-03-01T08:30:00+00:00", **meta), fmt)


def test_text_card_holds_the_record():
    result = result_for("demo")
    text = _card("text", asset="CV-07", location="Crusher line 2", by="J. Fitter", note="sheared", fitted="square 40mm")
    for expected in ("CV-07", "Crusher line 2", "J. Fitter", "sheared", "square 40mm", "2025-03-01 08:30 UTC",
                     "job 7", "Fitted by", "Checked by", "Date"):
        assert expected in text
    assert result["verdict"].upper() in text
    for caution in result["cautions"]:
        assert caution.split()[0] in text
    for shaft in result["shafts"]:
        assert shaft["spec"] in text
        assert shaft["why"][:30] in " ".join(text.split())
    # key figures, shown in display units (N·m, MPa)
    assert number(result["drive"]["design_torque_Nm"], 1, "N·m") in text
    candidate = next(s for s in result["shafts"] if s["role"] == "candidate")
    assert number(candidate["von_mises_stress_Pa"], 1e6, "MPa") in text


def test_markup_and_control_characters_are_shown_literally():
    odd = "[bold]P-1[/] [link=x]y[/link]"
    text = _card("text", asset=odd, note="bell\x07 escape\x1b[2J end")
    assert odd in text
    assert "\x1b" not in text and "\x07" not in text and "escape?[2J end" in text
    page = html.unescape(_card("html", asset=odd))
    assert odd in page


def test_number_formatting():
    assert number(226.04362, 1, "N·m") == "226 N·m"
    assert number(17987980.0, 1e6, "MPa") == "18.0 MPa"
    assert number(2.3244, 1) == "2.32"
    assert number(None) == "-" and number("x") == "-" and number(True) == "-"
    assert number(float("inf")) == "no limit"
    assert literal("[b]x[/b]").plain == "[b]x[/b]"


def test_card_survives_a_result_missing_sections():
    text = export_card(job_card({"verdict": "pass"}, asset="bare"), "text")
    assert "bare" in text and "PASS" in text and "no shaft in this job" in text and "none listed" in text
