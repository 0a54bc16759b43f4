"""First critical (whirling) speed of a shaft on two bearings, with its own mass and its elements'.

Two classic estimates bracket the first critical speed (Shigley's Mechanical Engineering Design,
9th ed., Sec. 7-6):

- **Rayleigh** (Eq. 7-23), an upper estimate: omega^2 = g sum(w_i y_i) / sum(w_i y_i^2) with the
  static deflections y_i under the weights w_i (Rayleigh's quotient with the static deflection
  curve as the trial shape; any trial shape gives omega at or above the true value).
- **Dunkerley** (Eq. 7-32), a lower estimate: 1/omega^2 = sum 1/omega_ii^2, omega_ii^2 =
  g / (w_i delta_ii), delta_ii the influence coefficient of station i on itself (Eq. 7-24).
  The shaft's own mass enters as one more term, 1/omega_s^2, omega_s the shaft's own first
  critical speed (the modification Shigley suggests in Example 7-5 (f)), here taken from
  Rayleigh's estimate for the shaft alone (for a uniform simply supported shaft that equals
  Eq. 7-22, omega = (pi/l)^2 sqrt(EI/m), within 0.1 %).

The governing value is the lower one (Dunkerley's, unless rounding says otherwise). The shaft's
distributed mass is lumped into short pieces (about 16 along the shaft) placed at their centres.
Weights are applied so that they all push in the sense of the first mode: a first pass under
gravity, then each weight turned to the sense of its own deflection (overhung masses deflect
opposite to those between the bearings; common practice for Rayleigh's method on overhung shafts).

Public API::

    first_critical_speed(segments, supports_m, masses) -> CriticalSpeed
"""

from __future__ import annotations

import functools
import math
from dataclasses import dataclass

from workbench.core.beam import BeamInputError, _deflection, _layout

G_M_S2 = 9.80665
"""Standard acceleration of gravity [m/s^2] (CGPM 1901; NIST SP 330). It cancels out of both
estimates (w = m g and y is proportional to g), so its value does not change the result."""

_SHAFT_LUMPS = 16
_RAD_S_TO_RPM = 60.0 / (2.0 * math.pi)


@dataclass(frozen=True)
class CriticalSpeed:
    """First critical speed estimates [rev/min] and how they were made.

    rayleigh_rpm: Rayleigh's upper estimate (Shigley 9th ed. Eq. 7-23)
    dunkerley_rpm: Dunkerley's lower estimate (Eq. 7-32, with the shaft's own term)
    governing_rpm: the lower of the two, the one a check compares the running speed with
    shaft_only_rpm: the bare shaft's own first critical speed (Rayleigh), None if massless
    method: one line naming the method; notes: anything the caller should show
    """

    rayleigh_rpm: float
    dunkerley_rpm: float
    governing_rpm: float
    shaft_only_rpm: float | None
    method: str
    notes: tuple[str, ...] = ()


def _shaft_lumps(segments) -> list[tuple[float, float]]:
    """The shaft's distributed mass as point masses (x_m, mass_kg), ~_SHAFT_LUMPS in all."""
    length_m = segments[-1][1]
    lumps = []
    for x0, x1, _ei, mpl in segments:
        if mpl <= 0:
            continue
        n = max(1, math.ceil(_SHAFT_LUMPS * (x1 - x0) / length_m))
        dx = (x1 - x0) / n
        lumps.extend((x0 + (k + 0.5) * dx, mpl * dx) for k in range(n))
    return lumps


def _rayleigh_omega2(lay, stations) -> float | None:
    """omega^2 [rad^2/s^2] by Rayleigh's quotient with the static deflection curve.

    stations: (knot index, mass_kg) pairs. None if no station deflects (all on the bearings).
    """
    signs = [1.0] * len(stations)
    for _pass in range(2):
        forces = [0.0] * len(lay.knots)
        for (k, m), sgn in zip(stations, signs):
            forces[k] += sgn * m * G_M_S2
        y = _deflection(lay, forces)
        ys = [y[k] for k, _m in stations]
        new_signs = [1.0 if v >= 0 else -1.0 for v in ys]
        if new_signs == signs:
            break
        signs = new_signs
    work = sum(m * G_M_S2 * abs(v) for (_k, m), v in zip(stations, ys))
    inertia = sum(m * v * v for (_k, m), v in zip(stations, ys))
    return work / inertia if inertia > 0 else None


def first_critical_speed(segments, supports_m, masses) -> CriticalSpeed:
    """First critical speed of a stepped shaft on two simple supports [rev/min].

    segments: sequence of (x_start_m, x_end_m, EI_Nm2, mass_per_length_kg_m), contiguous
              from x = 0, so the shaft's own mass counts  [m, m, N m^2, kg/m]
    supports_m: (x_bearing_1, x_bearing_2) bearing centres  [m]
    masses: sequence of (x_m, mass_kg) point masses (pulleys, gears, couplings)  [m, kg]

    Rayleigh (upper) and Dunkerley (lower) estimates after Shigley's Mechanical Engineering
    Design, 9th ed., Sec. 7-6, Eqs. 7-23 and 7-32 (influence coefficients Eq. 7-24), the shaft's
    own mass as lumped stations (Rayleigh) and as one Dunkerley term (Example 7-5 (f)). Raises
    BeamInputError for a layout beam_response refuses or when nothing has mass.
    """
    return _first_critical_speed(tuple(tuple(float(v) for v in s) for s in segments),
                                 tuple(float(x) for x in supports_m),
                                 tuple((float(x), float(m)) for x, m in masses))


@functools.lru_cache(maxsize=256)  # pure in its (hashable) inputs: geometry and masses, not the load
def _first_critical_speed(segments, supports_m, masses) -> CriticalSpeed:
    beam_segments = [(x0, x1, ei) for x0, x1, ei, _mpl in segments]
    lumps = _shaft_lumps(segments)
    points = [(float(x), float(m)) for x, m in masses if m > 0]
    if not lumps and not points:
        raise BeamInputError("neither the shaft nor any element has mass")
    lay = _layout(beam_segments, supports_m, [x for x, _m in lumps + points])
    lump_stations = [(lay.index(x), m) for x, m in lumps]
    point_stations = [(lay.index(x), m) for x, m in points]
    notes = []

    omega2_all = _rayleigh_omega2(lay, lump_stations + point_stations)
    shaft_omega2 = _rayleigh_omega2(lay, lump_stations) if lumps else None
    if omega2_all is None:
        raise BeamInputError("the masses sit on the bearings: no deflection, no critical speed")

    inv = 1.0 / shaft_omega2 if shaft_omega2 else 0.0
    for (k, m), (x, _m) in zip(point_stations, points):
        unit = [0.0] * len(lay.knots)
        unit[k] = 1.0
        delta = _deflection(lay, unit)[k]  # influence coefficient delta_ii [m/N]
        if delta > 0:
            inv += m * delta  # 1/omega_ii^2 = m_i delta_ii
        else:
            notes.append(f"a mass at x = {x:.3f} m sits on a bearing and adds nothing")
    rayleigh = math.sqrt(omega2_all) * _RAD_S_TO_RPM
    dunkerley = math.sqrt(1.0 / inv) * _RAD_S_TO_RPM
    return CriticalSpeed(
        rayleigh_rpm=rayleigh,
        dunkerley_rpm=dunkerley,
        governing_rpm=min(rayleigh, dunkerley),
        shaft_only_rpm=math.sqrt(shaft_omega2) * _RAD_S_TO_RPM if shaft_omega2 else None,
        method=("first critical speed: Rayleigh (upper) and Dunkerley (lower) estimates, "
                "Shigley 9th ed. Sec. 7-6 Eqs. 7-23, 7-32; shaft mass included"),
        notes=tuple(notes),
    )
