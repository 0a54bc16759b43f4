"""Bar profiles as polygons, for the numerical torsion solver and the stress map.

A profile is an outer ring, counter-clockwise, plus holes, clockwise. Every ring is a tuple of
(x, y) points in metres and is *closed*: its last point repeats its first. The section's centre
(the bar axis) is the origin; a keyseat or a single flat is cut on the +y side; a hexagon has flats
at top and bottom (y = +/- across flats / 2).

Curves are replaced by chords: ``segments_per_circle`` for the round surface, ``fillet_segments``
for each quarter-circle corner fillet. A 128-gon holds 0.16 % less area than its circle
(area ratio n sin(2 pi/n) / (2 pi)), which is below the solver's own error target.

Pure Python (math only): importing this module costs nothing.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from workbench.core.geometry import ShaftGeometry

Point = tuple[float, float]
Ring = tuple[Point, ...]

SEGMENTS_PER_CIRCLE = 128
FILLET_SEGMENTS = 8
# Keyseat bottom-corner radius when none is given and the key table has none: r/d = 0.02, the
# first-iteration assumption for an end-mill keyseat in Shigley's Mechanical Engineering Design,
# 9th ed., Table 7-1 (common practice for a design estimate), never more than a quarter key width.
DEFAULT_KEYSEAT_RADIUS_RATIO = 0.02


@dataclass(frozen=True)
class SectionPolygon:
    """A bar profile: ``outer`` ring counter-clockwise, ``holes`` clockwise, closed rings [m]."""

    outer: Ring
    holes: tuple[Ring, ...] = ()

    @property
    def area_m2(self) -> float:
        """Net area of the polygon (outer less holes), by the shoelace formula [m^2]."""
        return ring_area_m2(self.outer) - sum(abs(ring_area_m2(h)) for h in self.holes)

    def bounds_m(self) -> tuple[float, float, float, float]:
        """(x_min, y_min, x_max, y_max) of the outer ring [m]."""
        xs = [p[0] for p in self.outer]
        ys = [p[1] for p in self.outer]
        return min(xs), min(ys), max(xs), max(ys)


def ring_area_m2(ring: Ring) -> float:
    """Signed area of a ring by the shoelace formula [m^2]: > 0 counter-clockwise."""
    total = 0.0
    n = len(ring)
    for i in range(n):
        x0, y0 = ring[i]
        x1, y1 = ring[(i + 1) % n]
        total += x0 * y1 - x1 * y0
    return 0.5 * total


def _closed(points: list[Point], clockwise: bool = False) -> Ring:
    """Drop repeated points, orient, and close the ring (last point = first)."""
    clean: list[Point] = []
    for p in points:
        if not clean or math.dist(p, clean[-1]) > 1e-12:
            clean.append((float(p[0]), float(p[1])))
    while len(clean) > 1 and math.dist(clean[0], clean[-1]) <= 1e-12:
        clean.pop()
    if len(clean) < 3:
        raise ValueError("a profile ring needs at least three distinct points")
    if (ring_area_m2(tuple(clean)) < 0) != clockwise:
        clean.reverse()
    return tuple(clean) + (clean[0],)


def _arc(cx: float, cy: float, r: float, start: float, end: float, segments: int) -> list[Point]:
    """Points on an arc from angle ``start`` to ``end`` [rad], both ends included."""
    segments = max(1, segments)
    return [
        (cx + r * math.cos(start + (end - start) * k / segments),
         cy + r * math.sin(start + (end - start) * k / segments))
        for k in range(segments + 1)
    ]


def _arc_segments(span_rad: float, segments_per_circle: int) -> int:
    return max(2, math.ceil(abs(span_rad) / (2.0 * math.pi) * segments_per_circle))


# --------------------------------------------------------------------------- shapes


def circle_ring(diameter_m: float, segments: int = SEGMENTS_PER_CIRCLE) -> list[Point]:
    """Regular ``segments``-gon inscribed in a circle of ``diameter_m`` [m], counter-clockwise."""
    if diameter_m <= 0:
        raise ValueError("diameter must be positive")
    pts = _arc(0.0, 0.0, diameter_m / 2.0, 0.0, 2.0 * math.pi, segments)
    return pts[:-1]


def round_polygon(diameter_m: float, segments_per_circle: int = SEGMENTS_PER_CIRCLE) -> SectionPolygon:
    """Solid round of ``diameter_m`` [m]."""
    return SectionPolygon(_closed(circle_ring(diameter_m, segments_per_circle)))


def tube_polygon(outside_m: float, inside_m: float,
                 segments_per_circle: int = SEGMENTS_PER_CIRCLE) -> SectionPolygon:
    """Concentric tube, outside and inside diameters [m]; the bore is a clockwise hole."""
    if not 0 < inside_m < outside_m:
        raise ValueError("a tube needs 0 < inside diameter < outside diameter")
    outer = _closed(circle_ring(outside_m, segments_per_circle))
    hole = _closed(circle_ring(inside_m, segments_per_circle), clockwise=True)
    return SectionPolygon(outer, (hole,))


def keyed_round_ring(diameter_m: float, key_width_m: float, key_depth_m: float,
                     key_radius_m: float = 0.0,
                     segments_per_circle: int = SEGMENTS_PER_CIRCLE,
                     fillet_segments: int = FILLET_SEGMENTS) -> list[Point]:
    """Outer ring of a round with one parallel-key keyseat on +y [m].

    The keyseat is ``key_width_m`` wide with flat bottom at depth ``key_depth_m`` below the round
    surface on its centre line (DIN 6885-1 "t1"); its two bottom corners are rounded with
    ``key_radius_m`` (0 = sharp). The walls meet the round surface in sharp edges.
    """
    r_m = diameter_m / 2.0
    half_b = key_width_m / 2.0
    if not (0 < key_width_m < diameter_m and 0 < key_depth_m < r_m):
        raise ValueError("keyseat must be narrower than the shaft and shallower than its radius")
    if not 0 <= key_radius_m <= min(half_b, key_depth_m) * 0.999:
        raise ValueError("keyseat corner radius must be less than half the key width and the depth")
    y_top = math.sqrt(r_m * r_m - half_b * half_b)
    y_bottom = r_m - key_depth_m
    if y_bottom >= y_top:
        raise ValueError("keyseat too shallow: its bottom does not reach below the round's edge")
    theta_right = math.atan2(y_top, half_b)
    theta_left = math.pi - theta_right
    span = 2.0 * math.pi - (theta_left - theta_right)
    pts = _arc(0.0, 0.0, r_m, theta_left, theta_left + span, _arc_segments(span, segments_per_circle))
    # down the right wall, round the corners, up the left wall
    rad = key_radius_m
    if rad > 0:
        pts += _arc(half_b - rad, y_bottom + rad, rad, 0.0, -math.pi / 2, fillet_segments)
        pts += _arc(-half_b + rad, y_bottom + rad, rad, -math.pi / 2, -math.pi, fillet_segments)
    else:
        pts += [(half_b, y_bottom), (-half_b, y_bottom)]
    return pts


def flatted_round_ring(diameter_m: float, flats: int, flat_depth_m: float,
                       segments_per_circle: int = SEGMENTS_PER_CIRCLE) -> list[Point]:
    """Outer ring of a round with one flat on +y (D profile) or two opposite flats (double-D) [m].

    ``flat_depth_m`` is the depth of each flat below the round surface.
    """
    r_m = diameter_m / 2.0
    if flats not in (1, 2):
        raise ValueError("a flatted round has 1 or 2 flats")
    if not 0 < flat_depth_m < (r_m if flats == 2 else diameter_m):
        raise ValueError("flat depth must be positive and leave material")
    y_flat = r_m - flat_depth_m
    half_chord = math.sqrt(r_m * r_m - y_flat * y_flat)
    alpha = math.atan2(y_flat, half_chord)  # angle of the flat's right end
    if flats == 1:
        span = 2.0 * math.pi - (math.pi - 2.0 * alpha)
        return _arc(0.0, 0.0, r_m, math.pi - alpha, math.pi - alpha + span,
                    _arc_segments(span, segments_per_circle))
    span = 2.0 * alpha
    right = _arc(0.0, 0.0, r_m, -alpha, alpha, _arc_segments(span, segments_per_circle))
    left = _arc(0.0, 0.0, r_m, math.pi - alpha, math.pi + alpha, _arc_segments(span, segments_per_circle))
    return right + left


def rectangle_ring(width_m: float, height_m: float, corner_radius_m: float = 0.0,
                   chamfer_m: float = 0.0, fillet_segments: int = FILLET_SEGMENTS) -> list[Point]:
    """Rectangle ``width_m`` (x) by ``height_m`` (y), centred, corners sharp, rounded or chamfered [m]."""
    if width_m <= 0 or height_m <= 0:
        raise ValueError("rectangle sides must be positive")
    if corner_radius_m and chamfer_m:
        raise ValueError("give a corner radius or a chamfer, not both")
    half_w, half_h = width_m / 2.0, height_m / 2.0
    limit = min(half_w, half_h)
    if not (0 <= corner_radius_m <= limit and 0 <= chamfer_m <= limit):
        raise ValueError("corner radius or chamfer larger than half the short side")
    pts: list[Point] = []
    corners = ((half_w, -half_h, -math.pi / 2), (half_w, half_h, 0.0),
               (-half_w, half_h, math.pi / 2), (-half_w, -half_h, math.pi))
    for cx, cy, start in corners:
        sx, sy = math.copysign(1.0, cx), math.copysign(1.0, cy)
        if corner_radius_m > 0:
            pts += _arc(cx - sx * corner_radius_m, cy - sy * corner_radius_m, corner_radius_m,
                        start, start + math.pi / 2, fillet_segments)
        elif chamfer_m > 0:
            # walking counter-clockwise, the corner's first leg lies on the vertical or horizontal side
            on_horizontal = (cx - sx * chamfer_m, cy)
            on_vertical = (cx, cy - sy * chamfer_m)
            arrive_horizontal = sx * sy < 0  # bottom-right and top-left corners
            first, second = ((on_horizontal, on_vertical) if arrive_horizontal
                             else (on_vertical, on_horizontal))
            pts += [first, second]
        else:
            pts.append((cx, cy))
    return pts


def hexagon_ring(across_flats_m: float) -> list[Point]:
    """Regular hexagon of size ``across_flats_m`` [m], corners on the x axis, flats at y = +/- s/2."""
    if across_flats_m <= 0:
        raise ValueError("hexagon size must be positive")
    r_corner = across_flats_m / math.sqrt(3.0)
    return [(r_corner * math.cos(k * math.pi / 3), r_corner * math.sin(k * math.pi / 3)) for k in range(6)]


# --------------------------------------------------------------------------- verification shapes


def ellipse_polygon(semi_axis_x_m: float, semi_axis_y_m: float,
                    segments: int = 2 * SEGMENTS_PER_CIRCLE) -> SectionPolygon:
    """Ellipse with semi-axes along x and y [m] (for verifying the solver only)."""
    if semi_axis_x_m <= 0 or semi_axis_y_m <= 0:
        raise ValueError("semi-axes must be positive")
    pts = [(semi_axis_x_m * math.cos(2 * math.pi * k / segments),
            semi_axis_y_m * math.sin(2 * math.pi * k / segments)) for k in range(segments)]
    return SectionPolygon(_closed(pts))


def equilateral_triangle_polygon(side_m: float) -> SectionPolygon:
    """Equilateral triangle of ``side_m`` [m], centroid at the origin, one side at the bottom."""
    if side_m <= 0:
        raise ValueError("side must be positive")
    height = side_m * math.sqrt(3.0) / 2.0
    pts = [(-side_m / 2, -height / 3), (side_m / 2, -height / 3), (0.0, 2 * height / 3)]
    return SectionPolygon(_closed(pts))


def rectangle_polygon(width_m: float, height_m: float, corner_radius_m: float = 0.0,
                      chamfer_m: float = 0.0) -> SectionPolygon:
    """Rectangle ``width_m`` by ``height_m`` [m] with optional corner radius or chamfer."""
    return SectionPolygon(_closed(rectangle_ring(width_m, height_m, corner_radius_m, chamfer_m)))


# --------------------------------------------------------------------------- from the shared geometry


def keyseat_dimensions_m(geometry: ShaftGeometry) -> tuple[float, float, float]:
    """(width, depth at the centreline, bottom radius) of the keyseat of a keyed round or tube [m].

    Explicit ``key_width_m``/``key_depth_m`` win; otherwise the key table of ``key_standard`` gives
    width and shaft depth (ANSI B17.1's side-wall depth turned into the centreline depth). A zero
    ``key_radius_m`` becomes the standard's smallest bottom radius for the width (DIN 6885-1 r1 /
    ANSI B17.1 fillet). See workbench.core.keyseat_factors.read_keyseat, which also refuses seats
    that cannot be checked (KeyseatRefused, a ValueError).
    """
    from workbench.core.keyseat_factors import read_keyseat

    reading = read_keyseat(geometry)
    return reading.width_m, reading.depth_m, reading.radius_m


def profile_polygon(geometry: ShaftGeometry,
                    segments_per_circle: int = SEGMENTS_PER_CIRCLE) -> SectionPolygon:
    """The polygon of a measured bar section (see the module docstring for conventions)."""
    g = geometry
    if g.size_m <= 0:
        raise ValueError("size must be positive")
    # a keyed square, hex or flat bar carries its keyseat in the turned seat, not in the bar's own section
    if g.flats and g.profile != "round":
        raise ValueError("flats are only modelled on a round")
    if g.profile in ("round", "tube"):
        if g.keyed and g.flats:
            raise ValueError("a keyseat and flats on the same round are not modelled")
        if g.keyed:
            width, depth, radius = keyseat_dimensions_m(g)
            outer = keyed_round_ring(g.size_m, width, depth, radius, segments_per_circle)
        elif g.flats:
            outer = flatted_round_ring(g.size_m, g.flats, g.flat_depth_m, segments_per_circle)
        else:
            outer = circle_ring(g.size_m, segments_per_circle)
        holes: tuple[Ring, ...] = ()
        if g.profile == "tube":
            if not 0 < g.second_m < g.size_m:
                raise ValueError("a tube needs 0 < inside diameter < outside diameter")
            if g.keyed:
                _, depth, _ = keyseat_dimensions_m(g)
                if g.size_m / 2 - depth <= g.second_m / 2:
                    raise ValueError("the keyseat cuts through the tube wall")
            holes = (_closed(circle_ring(g.second_m, segments_per_circle), clockwise=True),)
        return SectionPolygon(_closed(outer), holes)
    if g.profile == "square":
        return SectionPolygon(_closed(rectangle_ring(g.size_m, g.size_m, g.corner_radius_m, g.chamfer_m)))
    if g.profile == "flat":
        if g.second_m <= 0:
            raise ValueError("a flat needs its thickness")
        return SectionPolygon(_closed(rectangle_ring(g.size_m, g.second_m, g.corner_radius_m, g.chamfer_m)))
    if g.profile == "hex":
        return SectionPolygon(_closed(hexagon_ring(g.size_m)))
    raise ValueError(f"unknown profile {g.profile!r}")
