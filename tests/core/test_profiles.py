"""Profile polygons: closed, oriented rings whose areas match the closed-form areas of the shapes.

Reference areas are plane geometry (shoelace formula for polygons; circle, circular segment,
regular hexagon A = (sqrt(3)/2) s^2). Tolerances are stated per test.
"""

from __future__ import annotations

import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from workbench.core.geometry import ShaftGeometry
from workbench.core import profiles as P


def _regular_polygon_area(radius_m: float, n: int) -> float:
    """Area of a regular n-gon inscribed in a circle of radius_m: (n/2) r^2 sin(2 pi/n)."""
    return 0.5 * n * radius_m**2 * math.sin(2 * math.pi / n)


def test_rings_are_closed_and_oriented():
    poly = P.profile_polygon(ShaftGeometry("tube", 0.06, 0.05))
    assert poly.outer[0] == poly.outer[-1]
    assert P.ring_area_m2(poly.outer) > 0  # counter-clockwise
    assert len(poly.holes) == 1
    assert poly.holes[0][0] == poly.holes[0][-1]
    assert P.ring_area_m2(poly.holes[0]) < 0  # clockwise


def test_round_area_is_the_inscribed_polygon():
    # regular-polygon area, exact to rounding (1e-12 relative)
    d = 0.035
    poly = P.profile_polygon(ShaftGeometry("round", d))
    n = P.SEGMENTS_PER_CIRCLE
    assert poly.area_m2 == pytest.approx(_regular_polygon_area(d / 2, n), rel=1e-12)
    # and within 0.2 % of the circle pi d^2/4 at the default 128 segments
    assert poly.area_m2 == pytest.approx(math.pi * d * d / 4, rel=2e-3)


def test_tube_area():
    # pi (D^2 - d^2)/4 within 0.2 % (chord error of the 128-gons)
    poly = P.profile_polygon(ShaftGeometry("tube", 0.06, 0.05))
    assert poly.area_m2 == pytest.approx(math.pi * (0.06**2 - 0.05**2) / 4, rel=2e-3)


def test_hexagon_area_and_size():
    # A = (sqrt(3)/2) s^2 exactly; flats at y = +/- s/2
    s = 0.027
    poly = P.profile_polygon(ShaftGeometry("hex", s))
    assert poly.area_m2 == pytest.approx(math.sqrt(3) / 2 * s * s, rel=1e-12)
    x0, y0, x1, y1 = poly.bounds_m()
    assert (y1 - y0) == pytest.approx(s, rel=1e-12)
    assert (x1 - x0) == pytest.approx(2 * s / math.sqrt(3), rel=1e-12)


def test_chamfered_square_area():
    # w^2 - 2 c^2 (four corner triangles of legs c), exact
    poly = P.profile_polygon(ShaftGeometry("square", 0.03, chamfer_m=0.002))
    assert poly.area_m2 == pytest.approx(0.03**2 - 2 * 0.002**2, rel=1e-12)
    assert len(poly.outer) == 9


@settings(max_examples=40, deadline=None)
@given(width=st.floats(0.005, 0.2), ratio=st.floats(0.1, 1.0), radius_frac=st.floats(0.0, 1.0))
def test_rounded_rectangle_area(width, ratio, radius_frac):
    # w h - 4 r^2 + 4 (quarter-disc fan of m chords, (m/2) r^2 sin(pi/2m)), exact to rounding
    height = width * ratio
    r = radius_frac * min(width, height) / 2 * 0.999
    poly = P.rectangle_polygon(width, height, corner_radius_m=r)
    m = P.FILLET_SEGMENTS
    expected = width * height - 4 * r * r + 4 * (m / 2) * r * r * math.sin(math.pi / (2 * m))
    assert poly.area_m2 == pytest.approx(expected, rel=1e-9)
    assert P.ring_area_m2(poly.outer) > 0


@pytest.mark.parametrize("flats", [1, 2])
def test_flatted_round_area(flats):
    # circle less `flats` circular segments of height f: R^2 acos((R-f)/R) - (R-f) sqrt(2Rf - f^2);
    # 4096 segments bring the chord error below 1e-5
    d, f = 0.04, 0.004
    r = d / 2
    segment = r * r * math.acos((r - f) / r) - (r - f) * math.sqrt(2 * r * f - f * f)
    geometry = ShaftGeometry("round", d, flats=flats, flat_depth_m=f)
    poly = P.profile_polygon(geometry, segments_per_circle=4096)
    assert poly.area_m2 == pytest.approx(math.pi * r * r - flats * segment, rel=1e-5)
    ys = [p[1] for p in poly.outer]
    assert max(ys) == pytest.approx(r - f, rel=1e-12)
    if flats == 2:
        assert min(ys) == pytest.approx(-(r - f), rel=1e-12)


def test_sharp_keyseat_area_and_dimensions():
    # circle less the keyseat: the rectangle b x (y_top - y_bottom) plus the circular cap above it,
    # cap = R^2 asin(b/2R) - (b/2) sqrt(R^2 - b^2/4); 4096 segments, 1e-5 relative
    d, b, t1 = 0.035, 0.010, 0.005
    r = d / 2
    ring = P.keyed_round_ring(d, b, t1, 0.0, segments_per_circle=4096)
    poly = P.SectionPolygon(P._closed(ring))
    y_top = math.sqrt(r * r - b * b / 4)
    cap = r * r * math.asin(b / (2 * r)) - (b / 2) * y_top
    keyseat = b * (y_top - (r - t1)) + cap
    assert poly.area_m2 == pytest.approx(math.pi * r * r - keyseat, rel=1e-5)
    bottom = [p for p in poly.outer if abs(p[1] - (r - t1)) < 1e-12]
    assert {round(p[0], 12) for p in bottom} == {round(b / 2, 12), round(-b / 2, 12)}


def test_explicit_keyseat_radius_used():
    # a fillet of radius r at each bottom corner removes less area than a sharp corner:
    # sharp - filleted = 2 r^2 (1 - pi/4) for ideal arcs; with 8 chords per quarter the
    # fan area (m/2) r^2 sin(pi/2m) replaces pi r^2 / 4 (exact to rounding)
    d, b, t1, rad = 0.035, 0.010, 0.005, 0.0007
    sharp = P.SectionPolygon(P._closed(P.keyed_round_ring(d, b, t1, 0.0)))
    round_ = P.SectionPolygon(P._closed(P.keyed_round_ring(d, b, t1, rad)))
    m = P.FILLET_SEGMENTS
    fan = (m / 2) * rad * rad * math.sin(math.pi / (2 * m))
    assert round_.area_m2 - sharp.area_m2 == pytest.approx(2 * (rad * rad - fan), rel=1e-6)


def test_keyseat_from_the_key_table():
    # DIN 6885-1: shafts over 30 up to 38 mm take a 10 x 8 key with shaft depth t1 = 5.0 mm
    pytest.importorskip("workbench.core.tables")
    from workbench.core.tables import key_for_diameter

    if key_for_diameter(0.035, "iso") is None:
        pytest.skip("key table not available yet")
    width, depth, radius = P.keyseat_dimensions_m(ShaftGeometry("round", 0.035, keyed=True))
    assert width == pytest.approx(0.010, rel=1e-9)
    assert depth == pytest.approx(0.005, rel=1e-9)
    # default radius: DIN 6885-1 keyseat bottom radius r1 min for b = 10 mm, 0.25 mm (from memory;
    # data/keyseat_radii.csv) — not 0.02 d = 0.7 mm, which is larger than the standard allows
    assert radius == pytest.approx(0.00025, rel=1e-12)


def test_explicit_keyseat_dimensions_win():
    g = ShaftGeometry("round", 0.035, keyed=True, key_width_m=0.008, key_depth_m=0.004, key_radius_m=0.0003)
    assert P.keyseat_dimensions_m(g) == (0.008, 0.004, 0.0003)


def test_verification_shapes():
    # ellipse 512-gon within 1e-4 of pi a b; triangle (sqrt(3)/4) a^2 exactly, centroid at origin
    e = P.ellipse_polygon(0.02, 0.01, segments=512)
    assert e.area_m2 == pytest.approx(math.pi * 0.02 * 0.01, rel=1e-4)
    t = P.equilateral_triangle_polygon(0.03)
    assert t.area_m2 == pytest.approx(math.sqrt(3) / 4 * 0.03**2, rel=1e-12)
    cx = sum(p[0] for p in t.outer[:-1]) / 3
    cy = sum(p[1] for p in t.outer[:-1]) / 3
    assert abs(cx) < 1e-15 and abs(cy) < 1e-15


@pytest.mark.parametrize(
    "geometry",
    [
        ShaftGeometry("tube", 0.05, 0.06),
        ShaftGeometry("flat", 0.05),
        ShaftGeometry("round", 0.03, flats=3, flat_depth_m=0.002),
        ShaftGeometry("square", 0.03, corner_radius_m=0.001, chamfer_m=0.001),
        ShaftGeometry("round", 0.03, keyed=True, key_width_m=0.008, key_depth_m=0.016),
        ShaftGeometry("tube", 0.03, 0.026, keyed=True, key_width_m=0.008, key_depth_m=0.004),
        ShaftGeometry("oval", 0.03),
    ],
)
def test_impossible_profiles_are_refused(geometry):
    with pytest.raises(ValueError):
        P.profile_polygon(geometry)


def test_a_keyed_square_keeps_its_keyseat_for_the_turned_seat_not_its_own_section():
    """``keyed`` on a square, hex or flat bar is cut in the turned hub seat: the bar's own
    section (its polygon) is the plain profile."""
    keyed = P.profile_polygon(ShaftGeometry("hex", 0.03, keyed=True))
    plain = P.profile_polygon(ShaftGeometry("hex", 0.03))
    assert keyed.outer == plain.outer
