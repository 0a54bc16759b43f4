"""Asset history rules (workbench/core/asset_history.py). Day counts are Gregorian calendar
arithmetic worked by hand (e.g. 2024-01-01 to 2024-03-01 is 31 + 29 = 60 days, 2024 a leap year)."""

from __future__ import annotations

import pytest

from workbench.core.asset_history import AssetJob, build_history, tag_key, tag_of


@pytest.mark.parametrize("written, tag", [
    ("CV-07 head drive", "CV-07"), ("cv07", "cv07"), ("CV 07 head drive", "CV 07"),
    ("  P-101  ", "P-101"), ("Pump 3", "Pump 3"), ("conveyor head", "conveyor"), ("", ""),
])
def test_the_tag_is_the_first_word_or_letters_then_number(written, tag):
    assert tag_of(written) == tag


@pytest.mark.parametrize("a, b", [
    ("CV-07", "cv07"), ("CV-07 head drive", "cv 7"), ("cv_07", "CV.7"), ("P/101", "p-0101"),
])
def test_tags_people_write_differently_are_one_asset(a, b):
    assert tag_key(a) == tag_key(b)


@pytest.mark.parametrize("a, b", [("CV-07", "CV-08"), ("CV-07", "CV-70"), ("P-1", "PP-1"), ("CV-07", "CV-0 7x")])
def test_different_tags_stay_apart(a, b):
    assert tag_key(a) != tag_key(b)


def _job(n, saved, *, fitted_on="", outcome="", outcome_date="", verdict="pass", fitted="round 40mm"):
    return AssetJob(n, saved, fitted, verdict, fitted_on, outcome, outcome_date, "CV-07 head drive")


def test_lives_run_from_fitted_to_failed_dates_and_say_where_dates_came_from():
    history = build_history([
        _job(2, "2024-03-05T10:00:00+00:00", fitted_on="2024-03-01", outcome="failed", outcome_date="2024-06-01"),
        _job(1, "2024-01-01T08:00:00+00:00", outcome="failed", outcome_date="2024-03-01"),
        _job(3, "2024-06-02T08:00:00+00:00"),
    ], today="2024-07-02")
    first, second, third = history.lives
    assert [life.job.job_id for life in history.lives] == [1, 2, 3]  # time order
    assert (first.start, first.start_from, first.end, first.end_from, first.days) == (
        "2024-01-01", "save time", "2024-03-01", "failed date", 60.0)  # 31 + 29 (leap year)
    assert (second.start_from, second.days) == ("fitted date", 92.0)  # 2024-03-01 to 06-01: 31+30+31
    assert (third.end, third.end_from, third.days, third.running_days) == (None, "still in", None, 30.0)
    assert history.mtbr_days == pytest.approx((60 + 92) / 2)
    assert history.tag == "CV-07" and history.key == "cv7"


def test_without_an_outcome_a_life_ends_at_the_next_replacement():
    history = build_history([_job(1, "2024-01-01T00:00:00Z"), _job(2, "2024-01-11T00:00:00Z")],
                            today="2024-01-12")
    assert (history.lives[0].end_from, history.lives[0].days) == ("next replacement", 10.0)


def _lives(*days):
    """Jobs whose closed lives last ``days`` (each fitted the day the previous one failed)."""
    from datetime import date, timedelta

    jobs, start = [], date(2020, 1, 1)
    for n, d in enumerate(days, start=1):
        end = start + timedelta(days=d)
        jobs.append(_job(n, f"{start.isoformat()}T08:00:00Z", fitted_on=start.isoformat(), outcome="failed",
                         outcome_date=end.isoformat()))
        start = end
    return jobs


def test_the_short_interval_flag_rule():
    # median of the earlier lives is 400; the last is flagged below 200 days, not at 200
    assert any("under half the median" in f for f in build_history(_lives(400, 380, 420, 199)).flags)
    assert not any("under half the median" in f for f in build_history(_lives(400, 380, 420, 200)).flags)
    # it needs two earlier lives
    assert not build_history(_lives(400, 10)).flags


def test_a_marginal_shaft_fitted_that_failed_is_flagged():
    jobs = _lives(400, 380)
    jobs[1] = _job(2, jobs[1].saved_at, fitted_on=jobs[1].fitted_on, outcome="failed",
                   outcome_date=jobs[1].outcome_date, verdict="marginal", fitted="square 45mm 1018")
    flags = build_history(jobs).flags
    assert any("MARGINAL" in f and "square 45mm 1018" in f for f in flags)
    assert not any("MARGINAL" in f for f in build_history(_lives(400, 380)).flags)
