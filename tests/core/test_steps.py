"""Steps of the shaft as found and of the candidate: defaults, turning limits, refusals."""

import math

import pytest

from workbench.core.geometry import ShaftGeometry
from workbench.core.layout import Layout, LayoutError, place
from workbench.core.steps import (
    DEFAULT_FILLET_PER_D, StepPlan, build_steps, can_turn, circumscribed_m, clean_up_allowance_m,
)

PLACED = place(Layout("overhung", 0.06, bearing_span_m=0.4, hub_length_m=0.07), 0.035)


def kinds(steps):
    return [s.kind for s in steps]


def test_uniform_round_has_no_shoulders():
    steps, _ = build_steps(StepPlan(ShaftGeometry("round", 0.035, keyed=True), keyed_seat=True), PLACED)
    assert "shoulder" not in kinds(steps)
    assert {s.diameter_m for s in steps} == {0.035}
    assert [s.keyed for s in steps if s.kind == "seat"] == [True]


def test_square_candidate_keeps_the_journals_and_gets_shoulders_with_the_default_fillet():
    plan = StepPlan(ShaftGeometry("square", 0.045), journal_m=0.035, seat_m=0.035, keyed_seat=True)
    steps, _ = build_steps(plan, PLACED)
    shoulders = [s for s in steps if s.kind == "shoulder"]
    assert shoulders, kinds(steps)
    for s in shoulders:
        assert s.diameter_m == 0.035
        assert s.fillet_m == pytest.approx(DEFAULT_FILLET_PER_D * 0.035)
        assert s.larger_m == pytest.approx(0.045 * math.sqrt(2))  # circumscribed, the conservative D
        assert not s.larger_round
    body = [s for s in steps if s.kind == "body"]
    assert all(s.diameter_m == 0.045 for s in body)  # the body's inscribed size


def test_journal_the_bar_cannot_give_is_refused_naming_the_option():
    plan = StepPlan(ShaftGeometry("square", 0.035), journal_m=0.035, seat_m=0.035,
                    journal_field="candidate_journal", seat_field="candidate_seat")
    with pytest.raises(LayoutError) as err:
        build_steps(plan, PLACED)
    assert err.value.field == "candidate_journal"
    assert "--as-bar" in err.value.message


def test_turning_rule_is_upper_limit_plus_clean_up():
    # 35 mm journal: needs 35 + 0.05 + 1.0 = 36.05 mm inscribed
    assert clean_up_allowance_m(0.035) == pytest.approx(0.001)
    assert not can_turn(ShaftGeometry("square", 0.036), 0.035)
    assert can_turn(ShaftGeometry("square", 0.0361), 0.035)
    assert can_turn(ShaftGeometry("hex", 0.040), 0.035)
    assert not can_turn(ShaftGeometry("flat", 0.060, 0.030), 0.035)  # a flat gives its thickness


def test_fillet_larger_than_the_journal_is_refused():
    plan = StepPlan(ShaftGeometry("round", 0.05), journal_m=0.035, seat_m=0.035, fillet_m=0.02)
    with pytest.raises(LayoutError) as err:
        build_steps(plan, PLACED)
    assert err.value.field == "fillet"


def test_as_bar_is_one_body_step_without_keyseat():
    steps, notes = build_steps(StepPlan(ShaftGeometry("square", 0.035), keyed_seat=True, as_bar=True), PLACED)
    assert kinds(steps) == ["body"] and not steps[0].keyed and notes


def test_circumscribed_sizes():
    assert circumscribed_m(ShaftGeometry("square", 0.04)) == pytest.approx(0.04 * math.sqrt(2))
    assert circumscribed_m(ShaftGeometry("hex", 0.03)) == pytest.approx(0.03 / math.cos(math.pi / 6))
    assert circumscribed_m(ShaftGeometry("flat", 0.05, 0.02)) == pytest.approx(math.hypot(0.05, 0.02))


def test_steps_cover_the_shaft_in_order():
    plan = StepPlan(ShaftGeometry("square", 0.045), journal_m=0.035, seat_m=0.035, keyed_seat=True)
    steps, _ = build_steps(plan, PLACED)
    xs = [(s.x_start_m, s.x_end_m) for s in steps]
    assert xs[0][0] == 0.0
    for (a0, a1), (b0, b1) in zip(xs, xs[1:]):
        assert a1 == pytest.approx(b0)
