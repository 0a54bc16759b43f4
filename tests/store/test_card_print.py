"""The printable job card, printed to PDF by a real headless Chromium and read back with pdfminer.six.

Checked on A4 (595 x 842 pt, ISO 216) and Letter (612 x 792 pt, ANSI/ASME Y14.1): one page per job,
a section marked ``own_page`` on pages of its own, no character outside the page (nothing clipped),
no text below 9 pt, every caution whole on one page, and every typed text present in full.
The tests skip only when Chromium is absent AND ``SHAFTBENCH_CI`` is unset (CI installs it).
"""

from __future__ import annotations

import os
import shutil
import subprocess
from pathlib import Path

import pytest
from store_helpers import result_for

from workbench.report import card_page as cp

PAPER_POINTS = {"a4": (595.3, 841.9), "letter": (612.0, 792.0)}
"""Paper sizes in PostScript points (1/72 in): A4 210 x 297 mm (ISO 216), Letter 8.5 x 11 in."""
SIZE_TOLERANCE_PT = 1.0
MIN_TEXT_PT = 9.0

LONG_TAG = "CV-07/HEAD-DRIVE-" + "X" * 70  # one unbroken word, wider than its column
NOTE = ("Sheared at the keyseat after two years; [bold]not markup[/bold] <b>not html</b> & co.\n"
        "Bearing on the drive end replaced at the same time.")


def _chromium() -> str | None:
    for name in ("chromium", "chromium-browser", "google-chrome"):
        found = shutil.which(name)
        if found:
            return found
    return None


@pytest.fixture(scope="module")
def browser() -> str:
    found = _chromium()
    if found is None:
        if os.environ.get("SHAFTBENCH_CI"):
            pytest.fail("Chromium is needed for the print tests in CI (.ci/run installs it)")
        pytest.skip("Chromium is not installed (apt-get install chromium)")
    return found


def print_pdf(browser: str, page_html: str, folder: Path) -> Path:
    """Print ``page_html`` with headless Chromium; returns the PDF file."""
    source = folder / "card.html"
    source.write_text(page_html, encoding="utf-8")
    pdf = folder / "card.pdf"
    done = subprocess.run(
        [browser, "--headless", "--no-sandbox", "--disable-gpu", "--no-first-run",
         f"--user-data-dir={folder / 'profile'}", "--no-pdf-header-footer",
         f"--print-to-pdf={pdf}", source.as_uri()],
        capture_output=True, text=True, timeout=120,
    )
    assert pdf.exists() and pdf.stat().st_size > 0, done.stderr[-2000:]
    return pdf


def read_pdf(pdf: Path) -> list[dict]:
    """Each page's size, its characters (text, box, size) and its text."""
    from pdfminer.high_level import extract_pages
    from pdfminer.layout import LTChar, LTTextContainer

    pages = []
    for page in extract_pages(str(pdf)):
        chars: list[LTChar] = []

        def walk(item) -> None:
            if isinstance(item, LTChar):
                chars.append(item)
            elif hasattr(item, "__iter__"):
                for child in item:
                    walk(child)

        walk(page)
        text = "".join(el.get_text() for el in page if isinstance(el, LTTextContainer))
        pages.append({"width": page.width, "height": page.height, "chars": chars, "text": text})
    return pages


def _squash(text: str) -> str:
    """Text without white space, ligatures unfolded (the PDF's 'ﬁ' is 'fi'), for comparisons."""
    import unicodedata

    return "".join(unicodedata.normalize("NFKC", text).split())


def _jobs() -> list[cp.CardJob]:
    demo = result_for("demo")
    return [
        cp.CardJob(demo, asset=LONG_TAG, location="Crusher line 2, conveyor 7 head end", by="J. Fitter",
                   note=NOTE, fitted="square 40mm", job_id=7, created_at="2026-03-01T08:30:00+00:00",
                   extra={"outcome": "failed", "outcome_date": "2026-11-20", "fitted_on": "2026-03-02",
                          "updated_at": "2026-11-21T07:00:00+00:00"}),
        cp.CardJob(result_for("overloaded"), asset="Pump P-7", job_id=8, created_at="2026-04-01T10:00:00+00:00"),
    ]


def _assert_printed_well(pages: list[dict], paper: str) -> None:
    width, height = PAPER_POINTS[paper]
    for number, page in enumerate(pages, start=1):
        assert abs(page["width"] - width) <= SIZE_TOLERANCE_PT and abs(page["height"] - height) <= SIZE_TOLERANCE_PT
        assert page["chars"], f"page {number} is empty"
        for char in page["chars"]:
            if not char.get_text().strip():
                continue
            assert 0 <= char.x0 and char.x1 <= page["width"], f"page {number}: {char.get_text()!r} clipped"
            assert 0 <= char.y0 and char.y1 <= page["height"], f"page {number}: {char.get_text()!r} clipped"
            assert char.size >= MIN_TEXT_PT - 0.05, f"page {number}: {char.get_text()!r} at {char.size:.1f} pt"


@pytest.mark.parametrize("paper", ["a4", "letter"])
def test_two_jobs_print_on_one_page_each(browser, tmp_path, paper):
    from workbench.report.turning_sheet import sheet_shafts

    jobs = _jobs()
    pages = read_pdf(print_pdf(browser, cp.card_page(jobs, paper=paper), tmp_path))
    # the card, its steps page when a shaft has steps, then a turning sheet per shaft
    per_job = [1 + any(s.get("steps") for s in job.result["shafts"]) + len(sheet_shafts(job.result)) for job in jobs]
    assert len(pages) == sum(per_job)
    _assert_printed_well(pages, paper)
    first, second = (_squash(pages[sum(per_job[:i])]["text"]) for i in range(len(jobs)))
    # everything typed is there, whole, on its job's page (the long tag wrapped, not cut)
    for typed in (LONG_TAG, *NOTE.splitlines(), "J. Fitter", "Crusher line 2, conveyor 7 head end"):
        assert _squash(typed) in first
    assert "PumpP-7" in second and "job8" in second and "job7" in first
    # the cautions stay whole on each job's page
    for job, page_text in zip(jobs, (first, second)):
        for caution in job.result["cautions"]:
            assert _squash(caution) in page_text
        assert "Signatures" in page_text or "Fittedby" in page_text
    assert "failedagainon2026-11-20" in first


def test_a_section_on_its_own_page_follows_the_card(browser, tmp_path, monkeypatch):
    monkeypatch.setattr(cp, "CARD_SECTIONS", [s for s in cp.CARD_SECTIONS if not s[0].startswith(("turning-", "steps"))])
    marker = "TURNING-SHEET-PAGE-MARKER"
    cp.add_section(
        "turning", lambda job: cp.PageSection("turning", "Turning sheet", f"<p>{marker}</p>", own_page=True)
    )
    pages = read_pdf(print_pdf(browser, cp.card_page(_jobs()[:1], paper="letter"), tmp_path))
    assert len(pages) == 2
    _assert_printed_well(pages, "letter")
    assert marker not in pages[0]["text"] and marker in pages[1]["text"]
    assert "Safetycautions" in _squash(pages[0]["text"])


@pytest.mark.parametrize("paper", ["a4", "letter"])
def test_turning_sheets_print_one_page_per_shaft_after_the_card(browser, tmp_path, paper):
    from workbench.job import evaluate_inputs
    from workbench.demo import demo_inputs

    result = evaluate_inputs({**demo_inputs(), "bearing": "6208", "turning_sheets": "both"})
    pages = read_pdf(print_pdf(browser, cp.card_page([cp.CardJob(result, job_id=3)], paper=paper), tmp_path))
    assert len(pages) == 4  # the card, the steps page, then the candidate's and the existing shaft's sheets
    _assert_printed_well(pages, paper)
    card, steps, *sheets = (_squash(p["text"]) for p in pages)
    assert "Turningsheet" not in card and "Stepsoftheshafts" not in card
    # issue 8: the card shows each shaft's steps table, the governing step marked
    assert "Stepsoftheshafts" in steps and "◀" in steps and "shoulderatbearing1" in steps
    specs = {s["role"]: _squash(s["spec"]) for s in result["shafts"]}
    for sheet, role in zip(sheets, ("candidate", "existing")):  # the candidate's sheet first
        assert "Turningsheet" in sheet and f"{role}{specs[role]}" in sheet
        assert "40.002-40.018" in sheet  # 40 k6 journal, +18/+2 um (JIS B 0401 / ISO 286-2)
    assert "N9" in sheets[1] and "JS9" in sheets[1]  # the keyed shaft's keyseat
