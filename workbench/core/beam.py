"""Bending moment, slope and deflection of a stepped shaft on two simple supports.

The shaft is a beam from x = 0 (its left end) to its right end, made of segments of constant
flexural rigidity EI, resting on two bearings taken as simple supports (no moment, no
deflection), and loaded by point forces in one plane: between the bearings or overhung beyond
either of them.

Method (Shigley's Mechanical Engineering Design, 9th ed., Sec. 4-4 and 7-5: integrate the
curvature M/EI twice and fix the constants with the two support conditions; for a stepped shaft
"both M and I vary"). Between consecutive break points (segment ends, supports, loads) the
moment is linear and EI constant, so the curvature is linear and the double integration is done
in closed form on each interval: the result is exact for point loads, with no grid error, and
costs a few microseconds. For a uniform shaft it reproduces the beam-formula table (Shigley 9th
ed. Table A-9, cases 5, 6 and 10); tests/core/test_beam.py checks that.

Sign convention: a positive ``force_N`` acts in +y; deflection and slope are in the same +y
sense (a load between the bearings deflects its own point positively). ``moment_Nm`` is the
bending moment with sagging (bending the shaft towards +y between the supports) positive, so
that y'' = -M / EI.

Pure Python (no numpy): the few break points of a shaft make plain floats faster than arrays.

Public API::

    beam_response(segments, supports_m, loads) -> BeamResult
"""

from __future__ import annotations

import bisect
import functools
from dataclasses import dataclass, field

from workbench.core.records import built

_POINTS_PER_INTERVAL = 6
"""Sample points inside each interval for the drawn arrays (the cubic is exact between them)."""

_TOL_M = 1e-9


class BeamInputError(ValueError):
    """Segments, supports or loads that do not describe a beam (caller's mistake)."""


@dataclass(frozen=True)
class BeamResult:
    """Response of the shaft to its loads.

    x_m, deflection_m, slope_rad, moment_Nm: samples along the shaft (tuples of floats, every
    break point included), for drawing and for the largest values  [m], [m], [rad], [N m]
    reactions_N: force of each support on the shaft, bearings in order along the shaft  [N]
    deflection_at(x_m) / slope_at(x_m) / moment_at(x_m): exact values at any x on the shaft.
    """

    supports_m: tuple[float, float]  # in order along the shaft
    reactions_N: tuple[float, float]
    _knots: tuple[float, ...] = field(repr=False)
    _y: tuple[float, ...] = field(repr=False)
    _theta: tuple[float, ...] = field(repr=False)
    _kappa_left: tuple[float, ...] = field(repr=False)
    _kappa_right: tuple[float, ...] = field(repr=False)
    _moment: tuple[float, ...] = field(repr=False)

    @functools.cached_property
    def _samples(self) -> tuple[tuple[float, ...], ...]:
        knots, y, theta, moment = self._knots, self._y, self._theta, self._moment
        xs, ys, ts, ms = [], [], [], []
        for i in range(len(knots) - 1):
            h = knots[i + 1] - knots[i]
            ka, kb = self._kappa_left[i], self._kappa_right[i]
            dm = (moment[i + 1] - moment[i]) / h
            for j in range(_POINTS_PER_INTERVAL):
                s = h * j / _POINTS_PER_INTERVAL
                xs.append(knots[i] + s)
                ys.append(y[i] + theta[i] * s + ka * s * s / 2 + (kb - ka) * s**3 / (6 * h))
                ts.append(theta[i] + ka * s + (kb - ka) * s * s / (2 * h))
                ms.append(moment[i] + dm * s)
        xs.append(knots[-1])
        ys.append(y[-1])
        ts.append(theta[-1])
        ms.append(moment[-1])
        return tuple(xs), tuple(ys), tuple(ts), tuple(ms)

    @property
    def x_m(self) -> tuple[float, ...]:
        """Sample positions along the shaft, every break point included [m]."""
        return self._samples[0]

    @property
    def deflection_m(self) -> tuple[float, ...]:
        """Deflection at each of ``x_m`` [m]."""
        return self._samples[1]

    @property
    def slope_rad(self) -> tuple[float, ...]:
        """Slope at each of ``x_m`` [rad]."""
        return self._samples[2]

    @property
    def moment_Nm(self) -> tuple[float, ...]:
        """Bending moment at each of ``x_m`` [N m], sagging positive."""
        return self._samples[3]

    def _interval(self, x_m: float) -> tuple[int, float]:
        knots = self._knots
        if x_m < knots[0] - _TOL_M or x_m > knots[-1] + _TOL_M:
            raise ValueError(f"x = {x_m} m is outside the shaft (0 to {knots[-1]} m)")
        i = min(max(bisect.bisect_right(knots, x_m) - 1, 0), len(knots) - 2)
        return i, x_m - knots[i]

    def deflection_at(self, x_m: float) -> float:
        """Deflection at ``x_m`` [m] (exact cubic of its interval)."""
        i, s = self._interval(x_m)
        h = self._knots[i + 1] - self._knots[i]
        ka, kb = self._kappa_left[i], self._kappa_right[i]
        return self._y[i] + self._theta[i] * s + ka * s * s / 2 + (kb - ka) * s**3 / (6 * h)

    def slope_at(self, x_m: float) -> float:
        """Slope dy/dx at ``x_m`` [rad]."""
        i, s = self._interval(x_m)
        h = self._knots[i + 1] - self._knots[i]
        ka, kb = self._kappa_left[i], self._kappa_right[i]
        return self._theta[i] + ka * s + (kb - ka) * s * s / (2 * h)

    def moment_at(self, x_m: float) -> float:
        """Bending moment at ``x_m`` [N m], sagging positive."""
        i, s = self._interval(x_m)
        h = self._knots[i + 1] - self._knots[i]
        return self._moment[i] + (self._moment[i + 1] - self._moment[i]) * s / h


def _check_segments(segments) -> list[tuple[float, float, float]]:
    segs = [(float(a), float(b), float(ei)) for a, b, ei in segments]
    if not segs:
        raise BeamInputError("the shaft needs at least one segment")
    if abs(segs[0][0]) > _TOL_M:
        raise BeamInputError("the first segment must start at x = 0")
    previous_end = None
    for k, (a, b, ei) in enumerate(segs):
        if not b > a:
            raise BeamInputError(f"segment {k} ends before it starts ({a} to {b} m)")
        if not ei > 0:
            raise BeamInputError(f"segment {k} has EI = {ei}; it must be positive")
        if k and abs(a - previous_end) > _TOL_M:
            raise BeamInputError(f"segment {k} does not start where segment {k - 1} ends")
        previous_end = b
    return segs


@dataclass(frozen=True)
class _Layout:
    """Break points of one shaft and its bearings, shared by every load case on it."""

    knots: tuple[float, ...]
    ei: tuple[float, ...]  # EI of each interval between knots
    ia: int  # knot index of each bearing
    ib: int

    def index(self, x_m: float) -> int:
        """Index of the knot at ``x_m`` (which must be one of the knots)."""
        i = bisect.bisect_left(self.knots, x_m - _TOL_M)
        return min(i, len(self.knots) - 1)


def _layout(segments, supports_m, points_m) -> _Layout:
    """Check the shaft, its bearings and load points; build the break points."""
    segs = _check_segments(segments)
    length_m = segs[-1][1]
    a_m, b_m = sorted(float(s) for s in supports_m)
    if not b_m - a_m > _TOL_M:
        raise BeamInputError("the two bearings must be at different places")
    if a_m < -_TOL_M or b_m > length_m + _TOL_M:
        raise BeamInputError(f"a bearing lies off the shaft (0 to {length_m} m)")
    for x in points_m:
        if x < -_TOL_M or x > length_m + _TOL_M:
            raise BeamInputError(f"a load at x = {x} m lies off the shaft (0 to {length_m} m)")
    seg_ends = [s[1] for s in segs]
    knots = sorted({0.0, length_m, a_m, b_m, *points_m, *seg_ends})
    merged = [knots[0]]
    last = knots[0]
    for x in knots[1:]:
        if x - last > _TOL_M:
            merged.append(x)
            last = x
    merged[-1] = length_m
    last_seg = len(segs) - 1
    bisect_left = bisect.bisect_left
    ei = tuple(segs[min(bisect_left(seg_ends, 0.5 * (merged[i] + merged[i + 1])), last_seg)][2]
               for i in range(len(merged) - 1))
    knots_t = tuple(merged)
    last_knot = len(knots_t) - 1
    # _Layout.index of each bearing
    return built(_Layout, knots_t, ei, min(bisect_left(knots_t, a_m - _TOL_M), last_knot),
                 min(bisect_left(knots_t, b_m - _TOL_M), last_knot))


def _solve(lay: _Layout, force_at_knot: list[float]):
    """Reactions, moment, curvature, deflection and slope at the knots for forces at knots."""
    knots, ia, ib = lay.knots, lay.ia, lay.ib
    xa, xb = knots[ia], knots[ib]
    # statics: R_a + R_b + sum F = 0 ; moments about a: R_b (b - a) + sum F (x - a) = 0
    total_N = sum(force_at_knot)
    r_b = -sum([f * (x - xa) for x, f in zip(knots, force_at_knot)]) / (xb - xa)
    r_a = -total_N - r_b
    forces = list(force_at_knot)
    forces[ia] += r_a
    forces[ib] += r_b
    moment = [0.0]
    kappa_left, kappa_right = [], []
    y_p, th_p = [0.0], [0.0]
    shear_N = m = th = yp = 0.0
    x_left = knots[0]
    for f, x_right, ei in zip(forces, knots[1:], lay.ei):
        shear_N += f  # sum of the forces left of this interval
        h = x_right - x_left
        m_next = m - shear_N * h
        ka, kb = -m / ei, -m_next / ei
        kappa_left.append(ka)
        kappa_right.append(kb)
        yp = yp + th * h + h * h * (2 * ka + kb) / 6
        th = th + h * (ka + kb) / 2
        th_p.append(th)
        y_p.append(yp)
        moment.append(m_next)
        m = m_next
        x_left = x_right
    c2 = -(y_p[ib] - y_p[ia]) / (xb - xa)
    c1 = -y_p[ia] - c2 * xa
    y = [yp + c1 + c2 * x for yp, x in zip(y_p, knots)]
    theta = [t + c2 for t in th_p]
    return (r_a, r_b), moment, kappa_left, kappa_right, y, theta


def _deflection(lay: _Layout, force_at_knot: list[float]) -> list[float]:
    """The deflection at the knots alone: ``_solve(lay, force_at_knot)[4]``, the same operations in the
    same order, without keeping the moments, curvatures and slopes (the critical speed needs only this)."""
    knots, ia, ib = lay.knots, lay.ia, lay.ib
    xa, xb = knots[ia], knots[ib]
    total_N = sum(force_at_knot)
    r_b = -sum([f * (x - xa) for x, f in zip(knots, force_at_knot)]) / (xb - xa)
    r_a = -total_N - r_b
    forces = list(force_at_knot)
    forces[ia] += r_a
    forces[ib] += r_b
    y_p = [0.0]
    shear_N = m = th = yp = 0.0
    x_left = knots[0]
    for f, x_right, ei in zip(forces, knots[1:], lay.ei):
        shear_N += f
        h = x_right - x_left
        m_next = m - shear_N * h
        ka, kb = -m / ei, -m_next / ei
        yp = yp + th * h + h * h * (2 * ka + kb) / 6
        th = th + h * (ka + kb) / 2
        y_p.append(yp)
        m = m_next
        x_left = x_right
    c2 = -(y_p[ib] - y_p[ia]) / (xb - xa)
    c1 = -y_p[ia] - c2 * xa
    return [yp + c1 + c2 * x for yp, x in zip(y_p, knots)]


def _forces_at_knots(lay: _Layout, loads) -> list[float]:
    knots = lay.knots
    last = len(knots) - 1
    force_at_knot = [0.0] * len(knots)
    bisect_left = bisect.bisect_left
    for x, f in loads:
        force_at_knot[min(bisect_left(knots, x - _TOL_M), last)] += f  # _Layout.index
    return force_at_knot


def beam_response(segments, supports_m, loads) -> BeamResult:
    """Moment, slope and deflection of a stepped shaft on two simple supports.

    segments: sequence of (x_start_m, x_end_m, EI_Nm2), contiguous from x = 0  [m, m, N m^2]
    supports_m: (x_bearing_1, x_bearing_2), bearing centres on the shaft  [m]
    loads: sequence of (x_m, force_N) point loads in one plane, anywhere on the shaft  [m, N]

    Reactions from statics; M(x) = -sum of F_j (x - x_j) over the forces left of x (loads and
    reactions); curvature -M/EI integrated twice in closed form per interval; the two constants
    set by y = 0 at both bearings. Source: Shigley's Mechanical Engineering Design, 9th ed.,
    Sec. 4-4 (double integration of M/EI) and Sec. 7-5 (stepped shafts). Raises BeamInputError
    for segments that do not cover the shaft, supports off the shaft or loads off the shaft.
    """
    point_loads = [(float(x), float(f)) for x, f in loads]
    lay = _layout(segments, supports_m, [x for x, _f in point_loads])
    reactions, moment, kl, kr, y, theta = _solve(lay, _forces_at_knots(lay, point_loads))
    return built(BeamResult, (lay.knots[lay.ia], lay.knots[lay.ib]), reactions, lay.knots, tuple(y),
                 tuple(theta), tuple(kl), tuple(kr), tuple(moment))
