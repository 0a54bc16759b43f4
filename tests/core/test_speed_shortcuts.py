"""The shortcuts that keep one evaluation fast give exactly the figures of the long way.

- ``layout.max_moment_Nm`` finds the bearing reactions once per call: bit for bit the largest of
  ``moment_at_Nm`` (which finds them again at every point) over the same points, over random
  layouts and loads (hypothesis).
- ``critical_speed.first_critical_speed`` remembers its answer by geometry and masses (it does not
  depend on the load): lists or tuples give the same answer, a changed span or mass a new one, and
  a remembered answer is the one a fresh computation gives. Checked against the closed form for a
  uniform simply supported shaft, omega = (pi/l)^2 sqrt(EI/m) (Shigley 9th ed., Eq. 7-22), 0.5 %.
- ``iso286.limits`` remembers its table look-ups; a remembered zone equals a fresh one.
"""

from __future__ import annotations

import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from workbench.core import critical_speed, iso286
from workbench.core.layout import DrivenElement, Layout, SideLoads, max_moment_Nm, moment_at_Nm, place, point_loads


@settings(max_examples=150, deadline=None)
@given(
    overhang=st.floats(0.02, 0.3), span=st.floats(0.2, 1.2), pull=st.floats(0.0, 2e4), weight=st.floats(0.0, 500.0),
    driven_at=st.floats(0.05, 0.95), driven_N=st.floats(0.0, 5e3), lo=st.floats(0.0, 1.0), hi=st.floats(0.0, 1.0),
)
def test_max_moment_is_the_largest_moment_at_its_points(overhang, span, pull, weight, driven_at, driven_N, lo, hi):
    layout = Layout("overhung", overhang, bearing_span_m=span, driven=DrivenElement("between", driven_at * span, 0.0))
    placed = place(layout, 0.04)
    forces = point_loads(placed, SideLoads(pull, weight, driven_N))
    x_lo, x_hi = sorted((lo * placed.length_m, hi * placed.length_m))
    points = [x_lo, x_hi] + [x for x, _ in forces if x_lo < x < x_hi]
    points += [b for b in placed.bearing_x_m if b is not None and x_lo < b < x_hi]
    assert max_moment_Nm(placed, forces, x_lo, x_hi) == max(moment_at_Nm(placed, forces, x) for x in points)


def test_a_remembered_critical_speed_is_a_fresh_one_and_follows_the_geometry():
    d, span, rho, E = 0.04, 0.8, 7850.0, 207e9
    ei = E * math.pi * d**4 / 64
    mpl = rho * math.pi * d**2 / 4
    critical_speed._first_critical_speed.cache_clear()
    fresh = critical_speed.first_critical_speed([(0.0, span, ei, mpl)], (0.0, span), [(0.3, 5.0)])
    again = critical_speed.first_critical_speed(((0.0, span, ei, mpl),), [0.0, span], ((0.3, 5.0),))
    assert again == fresh
    assert critical_speed._first_critical_speed.cache_info().hits >= 1
    longer = critical_speed.first_critical_speed([(0.0, span + 0.1, ei, mpl)], (0.0, span + 0.1), [(0.3, 5.0)])
    heavier = critical_speed.first_critical_speed([(0.0, span, ei, mpl)], (0.0, span), [(0.3, 8.0)])
    assert longer.governing_rpm < fresh.governing_rpm and heavier.governing_rpm < fresh.governing_rpm
    bare = critical_speed.first_critical_speed([(0.0, span, ei, mpl)], (0.0, span), [])
    closed_rpm = (math.pi / span) ** 2 * math.sqrt(ei / mpl) * 60 / (2 * math.pi)  # Shigley 9th ed. Eq. 7-22
    assert bare.shaft_only_rpm == pytest.approx(closed_rpm, rel=5e-3)


def test_a_remembered_tolerance_zone_is_a_fresh_one():
    first = iso286.limits(0.040, "k6")
    iso286.limits.cache_clear()
    assert iso286.limits(0.040, "k6") == first
    # ISO 286-2: 40 mm k6 (over 30 up to 50) is +18 / +2 um
    assert (first.upper_deviation_m, first.lower_deviation_m) == pytest.approx((18e-6, 2e-6), abs=1e-12)
