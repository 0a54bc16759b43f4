"""Area and bending properties of a polygonal section (outer ring counter-clockwise, holes clockwise).

Pure Python (no numpy): used where a bar section has no closed form (flats, rounded corners).
"""

from __future__ import annotations

import math
from dataclasses import dataclass


@dataclass(frozen=True)
class PolygonProperties:
    """area_m2 [m^2]; centroid_m (x, y) [m]; principal second moments I1, I2 [m^4];
    rotating_section_modulus_m3: the smallest Z over every orientation of the bending axis [m^3]."""

    area_m2: float
    centroid_m: tuple[float, float]
    principal_m4: tuple[float, float]
    rotating_section_modulus_m3: float


def _ring_sums(ring) -> tuple[float, float, float, float, float, float]:
    """Signed sums over one ring: A, Sx, Sy, Ixx, Iyy, Ixy about the origin (Green's theorem).

    Source: the standard polygon moment formulas (e.g. Pilkey, Formulas for Stress, Strain and
    Structural Matrices, 2nd ed., Sec. 2.3; from memory); Ixx = integral y^2 dA, Ixy = integral x y dA.
    """
    a = sx = sy = ixx = iyy = ixy = 0.0
    pts = list(ring)
    if pts[0] != pts[-1]:
        pts.append(pts[0])
    for (x0, y0), (x1, y1) in zip(pts, pts[1:]):
        cross = x0 * y1 - x1 * y0
        a += cross
        sx += (x0 + x1) * cross
        sy += (y0 + y1) * cross
        ixx += (y0 * y0 + y0 * y1 + y1 * y1) * cross
        iyy += (x0 * x0 + x0 * x1 + x1 * x1) * cross
        ixy += (x0 * y1 + 2 * x0 * y0 + 2 * x1 * y1 + x1 * y0) * cross
    return a / 2.0, sx / 6.0, sy / 6.0, ixx / 12.0, iyy / 12.0, ixy / 24.0


def polygon_properties(outer, holes=()) -> PolygonProperties:
    """Section properties of a polygon with holes.

    A rotating shaft under a side load fixed in space bends about every axis in turn. In principal
    axes (1, 2) a unit moment at angle t gives sigma = cos t * y2 / I1 - sin t * y1 / I2 at a point;
    its largest value over t is sqrt((y2/I1)^2 + (y1/I2)^2) (Shigley's MED 9th ed., Sec. 3-10,
    superposition of bending about both axes), largest at a vertex, so
    Z_rot = 1 / max over vertices sqrt((y2/I1)^2 + (y1/I2)^2).
    """
    totals = [0.0] * 6
    for ring in (outer, *holes):
        for i, value in enumerate(_ring_sums(ring)):
            totals[i] += value
    area, sx, sy, ixx, iyy, ixy = totals
    cx, cy = sx / area, sy / area
    ixx_c = ixx - area * cy * cy
    iyy_c = iyy - area * cx * cx
    ixy_c = ixy - area * cx * cy
    mean = (ixx_c + iyy_c) / 2.0
    radius = math.hypot((ixx_c - iyy_c) / 2.0, ixy_c)
    i1, i2 = mean + radius, mean - radius
    angle = 0.5 * math.atan2(-2.0 * ixy_c, ixx_c - iyy_c)  # axis 1 direction from x
    cos_a, sin_a = math.cos(angle), math.sin(angle)
    worst = 0.0
    for ring in (outer, *holes):
        for x, y in ring:
            u = (x - cx) * cos_a + (y - cy) * sin_a  # along axis 1
            v = -(x - cx) * sin_a + (y - cy) * cos_a  # along axis 2
            worst = max(worst, math.hypot(v / i1, u / i2))
    return PolygonProperties(area, (cx, cy), (i1, i2), 1.0 / worst)
