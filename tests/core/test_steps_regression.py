"""Regression: with no layout options, a uniform round shaft gives the figures of the single-section
check exactly (recorded before step-by-step checking by tests/data/make_uniform_baseline.py)."""

import json
from pathlib import Path

import pytest

from workbench.job import evaluate_inputs

BASELINE = json.loads((Path(__file__).parents[1] / "data" / "uniform_round_baseline.json").read_text(encoding="utf-8"))


@pytest.mark.parametrize("case", BASELINE, ids=[str(i) for i in range(len(BASELINE))])
def test_uniform_round_without_layout_gives_the_recorded_figures(case):
    result = evaluate_inputs(case["inputs"])
    assert result["mount"]["side_load_N"] == case["mount"]["side_load_N"]
    assert result["mount"]["bending_moment_Nm"] == case["mount"]["bending_moment_Nm"]
    assert len(result["shafts"]) == len(case["shafts"])
    alone = len(result["shafts"]) == 1
    for shaft, recorded in zip(result["shafts"], case["shafts"]):
        if shaft["role"] == "candidate" and not alone:
            # a larger round candidate is no longer uniform: it is turned to the existing journals and seat
            assert shaft["governing_step"] is not None
            continue
        for key, value in recorded.items():
            assert shaft[key] == value, (key, case["inputs"])
