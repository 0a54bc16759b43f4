"""Warnings name the CLI option on the command line and the field label in the workbench (issue 11,
item 10: messages never name an internal field, and each side speaks its own words)."""

from __future__ import annotations

from hypothesis import given, strategies as st

from workbench.field_names import LABELS, OPTIONS, warning_for_workbench
from workbench.job import evaluate_inputs


def test_every_option_in_a_warning_becomes_its_label():
    line = "Service factor: none given, 1.0 assumed; give --duty or --service-factor"
    assert warning_for_workbench(line) == "Service factor: none given, 1.0 assumed; give Duty or Service factor"
    assert warning_for_workbench("--overhang: read as mm") == "Overhang: read as mm"
    assert warning_for_workbench("--hub-length: none given") == "Hub length: none given"


def test_a_line_without_options_and_negative_numbers_stay_as_they_are():
    for line in ("ratio below 1 read as a speed-up", "clearance -0.011 mm", "a--b stays"):
        assert warning_for_workbench(line) == line


@given(st.sampled_from(sorted(OPTIONS)))
def test_no_option_survives_for_any_known_field(key):
    assert OPTIONS[key] not in warning_for_workbench(f"check {OPTIONS[key]} please").split()
    assert LABELS[key] in warning_for_workbench(f"check {OPTIONS[key]} please")


def test_a_real_job_warnings_in_the_workbench_name_no_option():
    result = evaluate_inputs({"torque": "100 N*m", "shaft": "round 40mm keyed"})
    assert any("--" in w for w in result["warnings"])  # the CLI words name options
    assert all("--" not in warning_for_workbench(w) for w in result["warnings"])
