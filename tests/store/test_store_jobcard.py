"""The job card: what it shows, in each export format, with user text kept literal."""

from __future__ import annotations

import html

import pytest

from store_helpers import result_for

from workbench.report.jobcard import export_card, job_card, literal, number


def _card(fmt: str, **meta: str) -> str:
    result = result_for("demo")
    return export_card(job_card(result, job_id=7, created_at="2025-03-01T08:30:00+00:00", **meta), fmt)


def test_text_card_holds_the_record(zone):
    zone("UTC")
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




@pytest.fixture
def zone(monkeypatch):
    """Set the local time zone for one test (TZ + time.tzset), restored afterwards."""
    import time

    def set_zone(tz: str) -> None:
        monkeypatch.setenv("TZ", tz)
        time.tzset()

    yield set_zone
    monkeypatch.undo()
    time.tzset()


def test_card_times_are_local_with_the_zone_named(zone):
    from workbench.report.jobcard import local_when

    # 2025-03-01 08:30 UTC is 09:30 in Berlin (CET, UTC+1, no summer time in March before the 30th)
    zone("Europe/Berlin")
    assert local_when("2025-03-01T08:30:00+00:00") == "2025-03-01 09:30 CET"
    # 2025-07-01 08:30 UTC is 04:30 in New York (EDT, UTC-4)
    zone("America/New_York")
    assert local_when("2025-07-01T08:30:00+00:00") == "2025-07-01 04:30 EDT"
    # India has one zone, UTC+05:30 all year; its short name is IST
    zone("Asia/Kolkata")
    assert local_when("2025-07-01T08:30:00Z") == "2025-07-01 14:00 IST"
    zone("UTC")
    assert local_when("2025-03-01T08:30:00+00:00") == "2025-03-01 08:30 UTC"
    assert local_when(None) == "-" and local_when("not a time") == "not a time"


def test_printable_page_escapes_what_people_type_and_names_the_zone(zone):
    from workbench.report.card_page import CardJob, card_page

    zone("Europe/Berlin")
    page = card_page([CardJob(result_for("demo"), asset="<script>x</script>", note="a & b", job_id=3,
                              created_at="2025-03-01T08:30:00+00:00")], paper="a4")
    assert "<script>x" not in page and "&lt;script&gt;x&lt;/script&gt;" in page and "a &amp; b" in page
    assert "2025-03-01 09:30 CET" in page and "size: A4;" in page
    assert page.count('class="card"') == 1


def test_sections_can_be_added_and_replaced(monkeypatch):
    from workbench.report import card_page as cp

    monkeypatch.setattr(cp, "CARD_SECTIONS", list(cp.CARD_SECTIONS))
    cp.add_section("steps", lambda job: cp.PageSection("steps", "Steps", "<p>one</p>"), before="verdict")
    cp.add_section("steps", lambda job: cp.PageSection("steps", "Steps", "<p>two</p>"), before="verdict")
    keys = [key for key, _ in cp.CARD_SECTIONS]
    assert keys.count("steps") == 1 and keys.index("steps") == keys.index("verdict") - 1
    sections = cp.card_sections(cp.CardJob(result_for("demo")))
    assert [s.body_html for s in sections if s.key == "steps"] == ["<p>two</p>"]
    cp.add_section("none", lambda job: None)
    assert "none" not in [s.key for s in cp.card_sections(cp.CardJob(result_for("demo")))]
