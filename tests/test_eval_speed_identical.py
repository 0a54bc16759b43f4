"""The evaluation gives the same whole result, to the bit, as the recording made before it was sped up.

The recording (tests/data/eval_baseline.json.gz, made by tests/data/make_eval_baseline.py before the
look-ups and section figures were remembered between calls) is the check value; tolerance: none, the
JSON text must be equal. Each job is evaluated twice, in an order that mixes shapes and sizes, so that
the second call is served from whatever the first one left remembered: a remembered figure that is
stale or belongs to another section would change a result and fail here.
"""

from __future__ import annotations

import gzip
import json
import sys
from pathlib import Path

import pytest

from workbench.job import JobInputError, evaluate_inputs

DATA = Path(__file__).parent / "data"
RECORDED = json.loads(gzip.decompress((DATA / "eval_baseline.json.gz").read_bytes()))


def _result(job: dict[str, str]) -> dict:
    try:
        return {"inputs": job, "result": evaluate_inputs(job)}
    except JobInputError as err:
        return {"inputs": job, "refused": [err.field, err.message]}


def _text(row: dict) -> str:
    return json.dumps(row, sort_keys=True, separators=(",", ":"))


def test_recording_covers_varied_jobs():
    shapes = {row["inputs"]["candidate"].split()[0] for row in RECORDED}
    assert len(RECORDED) >= 50 and {"round", "tube", "square", "hex", "flat"} <= shapes
    assert any("in" in row["inputs"]["shaft"] for row in RECORDED)
    assert sum("result" in row for row in RECORDED) >= 50


def test_jobs_of_the_recording_script_are_the_recorded_ones():
    sys.path.insert(0, str(DATA))
    try:
        from make_eval_baseline import jobs
    finally:
        sys.path.remove(str(DATA))
    assert [row["inputs"] for row in RECORDED] == jobs()


@pytest.mark.parametrize("rounds", [2])
def test_every_result_equals_the_recording_twice_over(rounds):
    order = list(range(len(RECORDED)))
    for n in range(rounds):
        for i in (order if n % 2 == 0 else order[::-1]):
            row = RECORDED[i]
            assert _text(_result(row["inputs"])) == _text(row), f"job {i} differs: {row['inputs']}"


def _remembering_functions():
    """Every look-up that remembers answers between evaluations (functools caches)."""
    from workbench.core import checks, fatigue, fit_advice, fits, iso286, keyseat_factors, sections, step_checks
    from workbench.core import stiffness, tables, turning

    return [sections._remembered_section, fatigue._marin, checks._features_of, keyseat_factors.read_keyseat,
            step_checks._step_features, step_checks._keyseat_scale, turning._zone_fields, fit_advice.journal_class,
            fit_advice.seat_class, fits.fit, iso286.limits, stiffness._critical, tables._sorted_stock]


def test_remembered_answers_equal_fresh_ones():
    """Independent of the recording: each job computed with every cache emptied first equals the same
    job computed after all the others have filled the caches (in the reverse order)."""
    jobs = [row["inputs"] for row in RECORDED]
    fresh = []
    for job in jobs:
        for func in _remembering_functions():
            func.cache_clear()
        fresh.append(_text(_result(job)))
    warm = [_text(_result(job)) for job in reversed(jobs)][::-1]
    assert all(func.cache_info().currsize > 0 for func in _remembering_functions())  # each one is used
    for i, (a, b) in enumerate(zip(fresh, warm)):
        assert a == b, f"job {i} differs once the caches are warm: {jobs[i]}"

