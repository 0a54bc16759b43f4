"""Layout statics against the beam-formula table (Shigley 9th ed., Table A-9: simple supports,
case 5 load between supports and case 10 overhung load), exact to rounding."""

import pytest

from workbench.core.layout import (
    DrivenElement, Layout, LayoutError, SideLoads, max_moment_Nm, moment_at_Nm, place, point_loads,
    reactions_N, torque_fraction,
)


def test_overhung_without_span_gives_F_times_overhang_at_the_bearing():
    placed = place(Layout("overhung", 0.06), 0.035)
    forces = point_loads(placed, SideLoads(1000.0, 0.0, 0.0))
    assert moment_at_Nm(placed, forces, placed.bearing_x_m[0]) == pytest.approx(60.0, rel=1e-12)
    # held beyond bearing 1 (conservative) when the span is not known
    assert moment_at_Nm(placed, forces, placed.bearing_x_m[0] + 0.3) == pytest.approx(60.0, rel=1e-12)


def test_overhung_with_span_reactions_and_moment():
    # Table A-9 case 10: R1 = F (a + l) / l, R2 = -F a / l, M at the support = F a, zero at the far support
    a, span, force = 0.08, 0.4, 2000.0
    placed = place(Layout("overhung", a, bearing_span_m=span, hub_length_m=0.06), 0.04)
    forces = point_loads(placed, SideLoads(force, 0.0, 0.0))
    r1, r2 = reactions_N(placed, forces)
    assert r1 == pytest.approx(force * (a + span) / span)
    assert r2 == pytest.approx(-force * a / span)
    b1, b2 = placed.bearing_x_m
    assert moment_at_Nm(placed, forces, b1) == pytest.approx(force * a)
    assert moment_at_Nm(placed, forces, b2) == pytest.approx(0.0, abs=1e-9)
    assert moment_at_Nm(placed, forces, (b1 + b2) / 2) == pytest.approx(force * a / 2)
    # the hub seat's inboard end: F * hub / 2
    assert max_moment_Nm(placed, forces, *placed.seat_m) == pytest.approx(force * 0.03)


def test_between_load_moment_is_F_a_b_over_l():
    # Table A-9 case 5: M_max = F a b / l under the load
    span, b, force = 0.5, 0.2, 3000.0
    placed = place(Layout("between", 0.0, load_from_bearing_m=b, bearing_span_m=span), 0.04)
    forces = point_loads(placed, SideLoads(force, 0.0, 0.0))
    assert moment_at_Nm(placed, forces, placed.load_x_m) == pytest.approx(force * b * (span - b) / span)


def test_weight_adds_to_the_pull():
    placed = place(Layout("overhung", 0.05, element_mass_kg=10.0), 0.03)
    forces = point_loads(placed, SideLoads(500.0, 10.0 * 9.80665, 0.0))
    assert moment_at_Nm(placed, forces, placed.bearing_x_m[0]) == pytest.approx((500.0 + 98.0665) * 0.05)


def test_torque_stops_at_the_driven_element():
    placed = place(Layout("overhung", 0.05, bearing_span_m=0.6, driven=DrivenElement("between", 0.3, 20.0)), 0.04)
    b1, b2 = placed.bearing_x_m
    assert torque_fraction(placed, b1, b1) == 1.0
    assert torque_fraction(placed, b2, b2) == 0.0


@pytest.mark.parametrize("layout, field", [
    (Layout("overhung", 0.05, bearing_span_m=0.4, hub_length_m=0.12), "hub_length"),
    (Layout("overhung", 0.3, bearing_span_m=0.2, hub_length_m=0.5), "hub_length"),
    (Layout("between", 0.0, load_from_bearing_m=0.5, bearing_span_m=0.4), "load_from_bearing"),
    (Layout("between", 0.0), "element_position"),
    (Layout("overhung", 0.05, driven=DrivenElement("between", 0.1)), "bearing_span"),
    (Layout("overhung", 0.05, bearing_span_m=0.4, driven=DrivenElement("between", 0.5)), "driven_from_bearing"),
])
def test_impossible_layouts_name_the_input(layout, field):
    with pytest.raises(LayoutError) as err:
        place(layout, 0.04)
    assert err.value.field == field
