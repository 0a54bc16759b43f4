"""Shaft as a beam on two bearings (workbench.core.beam) against the beam-formula table.

Sources: Shigley's Mechanical Engineering Design, 9th ed., Table A-9 (beam deflections and
slopes): case 5 (simple supports, centre load), case 6 (intermediate load), case 10 (overhanging
load). Closed forms are exact; the solver integrates in closed form too: rel 1e-9.
Stepped shaft: an independent moment-area hand calculation in the test (rel 1e-9), the same
shaft as Ugural, Mechanical Design of Machine Components, Example 9.6 (from memory; the result
3 W L^3 / (256 E I) is re-derived below, not taken from the code).
"""

from __future__ import annotations

import math

import pytest
from hypothesis import given, settings, strategies as st

from workbench.core.beam import BeamInputError, beam_response

E_PA = 207e9
EI = E_PA * math.pi * 0.035**4 / 64  # 35 mm steel shaft
F_N = 1500.0


def test_case_5_centre_load():
    """Table A-9 case 5: y_max = F l^3 / (48 EI), end slopes F l^2 / (16 EI), M_max = F l / 4."""
    span = 0.6
    beam = beam_response([(0.0, span, EI)], (0.0, span), [(span / 2, F_N)])
    assert beam.deflection_at(span / 2) == pytest.approx(F_N * span**3 / (48 * EI), rel=1e-9)
    assert beam.slope_at(0.0) == pytest.approx(F_N * span**2 / (16 * EI), rel=1e-9)
    assert beam.slope_at(span) == pytest.approx(-F_N * span**2 / (16 * EI), rel=1e-9)
    assert beam.moment_at(span / 2) == pytest.approx(F_N * span / 4, rel=1e-9)
    assert max(beam.moment_Nm) == pytest.approx(F_N * span / 4, rel=1e-9)
    assert beam.reactions_N == pytest.approx((-F_N / 2, -F_N / 2), rel=1e-12)


def test_case_6_intermediate_load():
    """Table A-9 case 6, load at a from the left, b = l - a:
    y_AB = F b x (l^2 - b^2 - x^2) / (6 EI l) (x <= a), theta_A = F b (l^2 - b^2) / (6 EI l),
    theta_B = -F a (l^2 - a^2) / (6 EI l)."""
    span, a = 0.8, 0.25
    b = span - a
    beam = beam_response([(0.0, span, EI)], (0.0, span), [(a, F_N)])
    for x in (0.05, 0.1, a):
        expected = F_N * b * x * (span**2 - b**2 - x**2) / (6 * EI * span)
        assert beam.deflection_at(x) == pytest.approx(expected, rel=1e-9)
    assert beam.slope_at(0.0) == pytest.approx(F_N * b * (span**2 - b**2) / (6 * EI * span), rel=1e-9)
    assert beam.slope_at(span) == pytest.approx(-F_N * a * (span**2 - a**2) / (6 * EI * span), rel=1e-9)
    # the largest deflection, between the load and B, at sqrt((l^2 - a^2)/3) from B:
    # y_max = F a (l^2 - a^2)^1.5 / (9 sqrt(3) EI l)
    y_max = F_N * a * (span**2 - a**2) ** 1.5 / (9 * math.sqrt(3) * EI * span)
    assert beam.deflection_at(span - math.sqrt((span**2 - a**2) / 3)) == pytest.approx(y_max, rel=1e-9)
    assert y_max * 0.99 < max(beam.deflection_m) <= y_max * (1 + 1e-12)  # sampled: within 1 %


def test_case_10_overhung_load():
    """Table A-9 case 10, load F at a beyond bearing B (span l):
    y_C = F a^2 (l + a) / (3 EI); theta_B = F a l / (3 EI); theta_A = -F a l / (6 EI);
    tip slope F a (2 l + 3 a) / (6 EI); between the bearings y = -F a x (l^2 - x^2) / (6 EI l)."""
    span, a = 0.5, 0.12
    beam = beam_response([(0.0, span + a, EI)], (0.0, span), [(span + a, F_N)])
    assert beam.deflection_at(span + a) == pytest.approx(F_N * a**2 * (span + a) / (3 * EI), rel=1e-9)
    assert beam.slope_at(span) == pytest.approx(F_N * a * span / (3 * EI), rel=1e-9)
    assert beam.slope_at(0.0) == pytest.approx(-F_N * a * span / (6 * EI), rel=1e-9)
    assert beam.slope_at(span + a) == pytest.approx(F_N * a * (2 * span + 3 * a) / (6 * EI), rel=1e-9)
    x = 0.2
    assert beam.deflection_at(x) == pytest.approx(-F_N * a * x * (span**2 - x**2) / (6 * EI * span), rel=1e-9)
    assert beam.moment_at(span) == pytest.approx(-F_N * a, rel=1e-9)  # hogging over the bearing
    assert beam.deflection_at(0.0) == pytest.approx(0.0, abs=1e-15)
    assert beam.deflection_at(span) == pytest.approx(0.0, abs=1e-15)


def test_case_10_mirrored_with_overhang_on_the_left():
    """The same case 10 with the element beyond the LEFT bearing (shaft from x = 0 at the load)."""
    span, a = 0.5, 0.12
    beam = beam_response([(0.0, span + a, EI)], (a, span + a), [(0.0, F_N)])
    assert beam.deflection_at(0.0) == pytest.approx(F_N * a**2 * (span + a) / (3 * EI), rel=1e-9)
    assert beam.slope_at(a) == pytest.approx(-F_N * a * span / (3 * EI), rel=1e-9)


def test_stepped_shaft_against_moment_area():
    """Moment-area hand calculation: span L, centre load W, EI in the outer quarters, 2 EI between.

    M/EI rises linearly to W L / (8 EI) at L/4 (triangle, area W L^2 / (64 EI), centroid L/6 from
    A), then M/(2EI) runs from W L / (16 EI) to W L / (8 EI) at L/2 (trapezoid, area
    3 W L^2 / (128 EI), centroid L/4 + 5 L / 36 from A). Tangent at C is level (symmetry), so
    theta_A = total area = 5 W L^2 / (128 EI) and y_C = first moment about A = 3 W L^3 / (256 EI)
    (Ugural, Mechanical Design of Machine Components, Ex. 9.6 gives the same, from memory).
    """
    L, W, ei = 1.0, 400.0, 200e9 * 0.3e-6
    segments = [(0.0, L / 4, ei), (L / 4, 3 * L / 4, 2 * ei), (3 * L / 4, L, ei)]
    beam = beam_response(segments, (0.0, L), [(L / 2, W)])
    triangle = W * L**2 / (64 * ei)
    trapezoid = 3 * W * L**2 / (128 * ei)
    assert beam.slope_at(0.0) == pytest.approx(triangle + trapezoid, rel=1e-9)
    assert beam.slope_at(0.0) == pytest.approx(5 * W * L**2 / (128 * ei), rel=1e-9)
    y_c = triangle * L / 6 + trapezoid * (L / 4 + 5 * L / 36)
    assert beam.deflection_at(L / 2) == pytest.approx(y_c, rel=1e-9)
    assert beam.deflection_at(L / 2) == pytest.approx(3 * W * L**3 / (256 * ei), rel=1e-9)


@settings(max_examples=30, deadline=None)
@given(xi=st.floats(0.0, 0.7), xj=st.floats(0.0, 0.7), step=st.floats(0.1, 0.6), ratio=st.floats(0.2, 5.0))
def test_maxwell_reciprocity_on_a_stepped_shaft(xi, xj, step, ratio):
    """Maxwell's reciprocal theorem (any linear elastic beam): the deflection at i from a unit
    load at j equals the deflection at j from a unit load at i. rel 1e-6 (break points closer than 1 nm merge), abs 1e-18 m."""
    segments = [(0.0, step, EI), (step, 0.7, EI * ratio)]
    supports = (0.1, 0.55)
    y_ij = beam_response(segments, supports, [(xj, 1.0)]).deflection_at(xi)
    y_ji = beam_response(segments, supports, [(xi, 1.0)]).deflection_at(xj)
    assert y_ij == pytest.approx(y_ji, rel=1e-6, abs=1e-18)


def test_superposition_and_sampled_arrays():
    """Two loads = sum of each alone (linearity); the arrays hold every break point."""
    segments = [(0.0, 0.2, EI), (0.2, 0.7, 1.8 * EI), (0.7, 0.8, EI)]
    both = beam_response(segments, (0.1, 0.65), [(0.3, 800.0), (0.8, -300.0)])
    one = beam_response(segments, (0.1, 0.65), [(0.3, 800.0)])
    two = beam_response(segments, (0.1, 0.65), [(0.8, -300.0)])
    for x in (0.0, 0.15, 0.4, 0.8):
        assert both.deflection_at(x) == pytest.approx(one.deflection_at(x) + two.deflection_at(x), rel=1e-9)
    assert len(both.x_m) == len(both.deflection_m) == len(both.slope_rad) == len(both.moment_Nm)
    for knot in (0.0, 0.1, 0.2, 0.3, 0.65, 0.7, 0.8):
        assert any(abs(x - knot) < 1e-12 for x in both.x_m)
    assert both.moment_Nm[0] == 0.0 and abs(both.moment_Nm[-1]) < 1e-9


@pytest.mark.parametrize("segments, supports, loads", [
    ([(0.1, 0.5, EI)], (0.1, 0.5), []),                       # does not start at 0
    ([(0.0, 0.3, EI), (0.35, 0.5, EI)], (0.0, 0.5), []),      # gap
    ([(0.0, 0.5, -EI)], (0.0, 0.5), []),                      # negative EI
    ([(0.0, 0.5, EI)], (0.0, 0.6), []),                       # bearing off the shaft
    ([(0.0, 0.5, EI)], (0.2, 0.2), []),                       # one place for both bearings
    ([(0.0, 0.5, EI)], (0.0, 0.5), [(0.7, 100.0)]),           # load off the shaft
])
def test_bad_layouts_are_refused(segments, supports, loads):
    with pytest.raises(BeamInputError):
        beam_response(segments, supports, loads)


def test_cheap_enough():
    """One evaluation of a stepped overhung shaft in well under a millisecond (budget 0.1 ms)."""
    import time

    segments = [(0.0, 0.05, EI), (0.05, 0.45, 2 * EI), (0.45, 0.5, EI), (0.5, 0.6, 0.8 * EI)]
    best = math.inf
    for _ in range(5):
        t0 = time.perf_counter()
        for _ in range(100):
            beam_response(segments, (0.025, 0.475), [(0.56, 1200.0)])
        best = min(best, (time.perf_counter() - t0) / 100)
    assert best < 1e-3
