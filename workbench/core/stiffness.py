"""The whole shaft's stiffness from its steps: deflection at the elements, slope at the bearings,
first critical speed; and the key of the hub seat. A thin adapter from steps and layout to the
pure formulas of :mod:`workbench.core.beam`, :mod:`workbench.core.critical_speed`,
:mod:`workbench.core.bearing_limits` and :mod:`workbench.core.key_strength`.

How each enters the verdict (README, "How the checks decide"):
- key: its shear and crushing safety factors like the other safety factors (below the required
  factor fails, within 10 % above it is marginal);
- bearing slope over the bearing type's limit: at least marginal; over twice the limit: fail;
- running speed at or above 75 % of the first critical speed: at least marginal; at or above
  90 %: fail (margins: common practice);
- a check that cannot be made (no bearing span, no hub length for the key) gives null and a note.
"""

from __future__ import annotations

import functools
import math
from dataclasses import dataclass

from workbench.core.beam import BeamInputError, beam_response
from workbench.core.bearing_limits import slope_limit_rad
from workbench.core.critical_speed import first_critical_speed
from workbench.core.geometry import ShaftGeometry
from workbench.core.key_strength import hub_material, key_check
from workbench.core.keyseat_factors import stated_depth_m
from workbench.core.records import built

DEFAULT_BEARING_TYPE = "deep-groove-ball"  # the commonest bearing; its Table 7-2 limit is the lower end, 0.001 rad
SLOPE_FAIL_RATIO = 2.0  # slope over twice its limit fails (our rule, stated)
CRITICAL_MARGINAL = 0.75  # running at >= 75 % of the first critical speed is marginal (common practice)
CRITICAL_FAIL = 0.90  # ... at >= 90 % fails (common practice)
KEY_END = "round"  # DIN 6885-1 form A, the common parallel key: effective length l - b


def bending_inertia_m4(g: ShaftGeometry) -> float:
    """Second moment of area for bending stiffness [m^4], the weakest axis of the profile:
    round pi d^4/64, tube pi (D^4 - d^4)/64, square a^4/12, flat b t^3/12, hex 5 sqrt3 s^4/144
    (regular polygon: the same about every axis). Shigley 9th ed., Table A-18. Keyseats, flats,
    radii and chamfers are not deducted (they are short or small beside the span)."""
    if g.profile == "round":
        return math.pi * g.size_m**4 / 64.0
    if g.profile == "tube":
        return math.pi * (g.size_m**4 - g.second_m**4) / 64.0
    if g.profile == "square":
        return g.size_m**4 / 12.0
    if g.profile == "flat":
        b, t = max(g.size_m, g.second_m), min(g.size_m, g.second_m)
        return b * t**3 / 12.0
    if g.profile == "hex":
        return 5.0 * math.sqrt(3.0) * g.size_m**4 / 144.0
    raise ValueError(f"unknown profile {g.profile!r}")


def area_m2(g: ShaftGeometry) -> float:
    """Gross area of the profile [m^2] for its mass per length (exact geometry)."""
    if g.profile == "round":
        return math.pi * g.size_m**2 / 4.0
    if g.profile == "tube":
        return math.pi * (g.size_m**2 - g.second_m**2) / 4.0
    if g.profile == "square":
        return g.size_m**2
    if g.profile == "flat":
        return g.size_m * g.second_m
    return math.sqrt(3.0) / 2.0 * g.size_m**2


def beam_segments(steps, E_Pa: float, density_kg_m3: float) -> list[tuple[float, float, float, float]]:
    """(x_start, x_end, EI, mass per length) of the steps with length, contiguous from x = 0."""
    out = []
    end = 0.0
    for step in sorted((s for s in steps if s.x_end_m > s.x_start_m), key=lambda s: s.x_start_m):
        x0 = max(step.x_start_m, end)
        x1 = step.x_end_m
        if x1 <= x0 + 1e-12:
            continue
        if x0 > end + 1e-12 and out:  # a gap: the previous step runs on
            out[-1] = (out[-1][0], x0, out[-1][2], out[-1][3])
        g = step.geometry
        out.append((x0, x1, E_Pa * bending_inertia_m4(g), density_kg_m3 * area_m2(g)))
        end = x1
    return out


@dataclass(frozen=True)
class StiffnessFigures:
    """Deflection, slopes and critical speed of a shaft on its bearings (None where not computed)."""

    deflection_m: float  # largest |deflection| at an element's load line [m]
    deflections: tuple[tuple[float, float], ...]  # (x_m, deflection_m) at each element
    bearing_slopes_rad: tuple[float, float]  # |slope| at bearing 1 and bearing 2 [rad]
    bearing_type: str
    slope_limit_rad: float
    critical_speed_rpm: float | None
    rayleigh_rpm: float | None
    dunkerley_rpm: float | None
    methods: dict
    notes: tuple[str, ...] = ()


def stiffness_figures(steps, placed, forces, masses, E_Pa: float, density_kg_m3: float,
                      bearing_type: str | None) -> StiffnessFigures | None:
    """Beam response and critical speed of the stepped shaft; None when the span is not known.

    forces: (x_m, force_N) side loads in one plane (design level); masses: (x_m, mass_kg) of the
    elements. Deflection and slope by double integration over the steps (Shigley 9th ed. Sec. 4-4,
    7-5; :mod:`workbench.core.beam`); critical speed by Rayleigh and Dunkerley (Sec. 7-6).
    """
    b1, b2 = placed.bearing_x_m
    if b2 is None:
        return None
    segments = tuple(beam_segments(steps, E_Pa, density_kg_m3))
    supports = (b1, b2)
    beam = beam_response([s[:3] for s in segments], supports, forces)
    # the shaft's own weight, added in the worse sense: the element loads' direction to gravity is
    # not known, so |load response| + |weight response| (conservative)
    own = _own_weight_beam(segments, supports)
    deflections = []
    for x, _ in forces:
        y_load = beam.deflection_at(x)
        deflections.append((x, math.copysign(abs(y_load) + abs(own.deflection_at(x)), y_load or 1.0)))
    deflections = tuple(deflections)
    slopes = (abs(beam.slope_at(b1)) + abs(own.slope_at(b1)), abs(beam.slope_at(b2)) + abs(own.slope_at(b2)))
    kind = bearing_type or DEFAULT_BEARING_TYPE
    limit = slope_limit_rad(kind)
    notes = []
    if bearing_type is None:
        notes.append(f"--bearing-type: none given, the slope limit of a {kind} bearing is taken "
                     f"({limit:g} rad)")
    rayleigh = dunkerley = governing = None
    try:
        critical = _critical(segments, supports, tuple((x, m) for x, m in masses if m > 0))
        rayleigh, dunkerley, governing = critical.rayleigh_rpm, critical.dunkerley_rpm, critical.governing_rpm
        notes.extend(critical.notes)
    except BeamInputError as err:
        notes.append(f"critical speed not computed: {err}")
    return built(
        StiffnessFigures,
        max((abs(y) for _, y in deflections), default=0.0),
        deflections,
        slopes,
        kind,
        limit,
        governing,
        rayleigh,
        dunkerley,
        dict(_METHODS),
        tuple(notes),
    )


OWN_WEIGHT_PIECES = 16
"""Point loads per beam segment that stand for the shaft's own weight (midpoint rule: the end
slope of a uniform simply supported shaft is within 0.1 % of wL^3/(24EI), Shigley 9th ed. Table
A-9 case 7; tests/core/test_audit_fixes.py)."""
GRAVITY_M_S2 = 9.80665
_METHODS = {
    "deflection": "double integration of M/EI over the steps, simple supports at the bearing centres "
                  "(Shigley 9th ed. Sec. 4-4, 7-5); the shaft's own weight lumped in "
                  f"{OWN_WEIGHT_PIECES} pieces per segment, added in the worse sense",
    "slope_limit": "Shigley 9th ed. Table 7-2 (lower end of the range)",
    "critical_speed": "Rayleigh (upper) and Dunkerley (lower), the lower decides (Shigley 9th ed. Sec. 7-6)",
}


@functools.lru_cache(maxsize=256)
def _own_weight_beam(segments, supports):
    """Beam response to the shaft's own weight alone [m, rad]: each segment's weight (mass per
    length x g) as OWN_WEIGHT_PIECES equal point loads at the centres of equal pieces. It depends
    on the geometry only, so it is found once per shaft."""

    loads = []
    for x0, x1, _ei, mass_per_m in segments:
        piece = (x1 - x0) / OWN_WEIGHT_PIECES
        weight = mass_per_m * GRAVITY_M_S2 * piece
        loads.extend((x0 + (k + 0.5) * piece, weight) for k in range(OWN_WEIGHT_PIECES))
    return beam_response([seg[:3] for seg in segments], supports, loads)


@functools.lru_cache(maxsize=256)
def _critical(segments, supports, masses):
    """First critical speed of one geometry (it does not depend on the loads or the speed, so a
    workbench edit of the drive finds it again instead of solving it anew)."""

    return first_critical_speed(segments, supports, masses)


@dataclass(frozen=True)
class KeyFigures:
    """The hub-seat key: safety factors (None without a hub length) and the length it needs [m]."""

    shear_safety_factor: float | None
    crush_safety_factor: float | None
    required_length_m: float
    key_length_m: float | None
    hub_material: str
    method: str
    notes: tuple[str, ...] = ()


def key_figures(torque_Nm: float, seat: ShaftGeometry, key_row, hub_length_m: float | None,
                key_yield_Pa: float, shaft_yield_Pa: float, hub_material_name: str | None,
                required_sf: float) -> KeyFigures | None:
    """Shear and crushing of the seat's parallel key over the hub length (DIN 6892 method C style,
    Shigley 9th ed. Sec. 7-7; :func:`workbench.core.key_strength.key_check`). ``key_row`` is the
    standard key (width, height, shaft depth) for the seat; None when the table has none."""

    if key_row is None and not seat.key_width_m:
        return None
    width = seat.key_width_m or key_row.width_m
    depth = stated_depth_m(seat.size_m, width, seat.key_depth_m, key_row.shaft_depth_m if key_row else 0.0,
                           seat.key_standard)
    height = key_row.height_m if key_row is not None and abs(key_row.width_m - width) < 1e-9 else 2.0 * depth
    if height <= depth:
        height = 2.0 * depth
    hub = hub_material(hub_material_name)
    notes = []
    length = hub_length_m
    if length is None or length <= width:
        # the required length does not depend on the length given; any valid length finds it
        probe = key_check(torque_Nm, seat.size_m, width, height, depth, 2.0 * width, KEY_END, key_yield_Pa,
                          shaft_yield_Pa, hub.yield_Pa, required_sf)
        if length is None:
            notes.append("no hub length: key safety factors not computed")
            return KeyFigures(None, None, probe.required_length_m, None, hub.name, probe.method, tuple(notes))
        # a round-ended key's bearing length l - b is nil or negative: it carries no torque, so
        # both factors are 0 and the shaft fails (rule stated in the README)
        notes.append(f"hub too short: the key needs at least {probe.required_length_m * 1e3:.0f} mm "
                     f"(hub length {length * 1e3:.0f} mm is not longer than the {width * 1e3:.0f} mm key width, "
                     f"so a round-ended key has no bearing length)")
        return KeyFigures(0.0, 0.0, probe.required_length_m, length, hub.name, probe.method, tuple(notes))
    check = key_check(torque_Nm, seat.size_m, width, height, depth, length, KEY_END, key_yield_Pa,
                      shaft_yield_Pa, hub.yield_Pa, required_sf)
    return KeyFigures(check.shear_safety_factor, check.crush_safety_factor, check.required_length_m, length,
                      hub.name, check.method, check.notes)


_ORDER = {"pass": 0, "marginal": 1, "fail": 2}


def layout_verdict(verdict: str, governing: str, why: str, required_sf: float, marginal_band: float,
                   key: KeyFigures | None, stiffness: StiffnessFigures | None,
                   speed_rpm: float | None) -> tuple[str, str, str]:
    """The verdict after the key, slope and critical-speed checks (rules in the module docstring).

    The strength verdict stands unless one of these is worse; the worst one then gives the why.
    """
    found = []
    if key is not None:
        pairs = [(name, n) for name, n in (("key shear", key.shear_safety_factor),
                                            ("key crushing", key.crush_safety_factor)) if n is not None]
        for name, n in sorted(pairs, key=lambda pair: pair[1])[:1]:  # the weaker check speaks
            if n < required_sf:
                found.append(("fail", "key", f"{name} over the hub length: n = {n:.2f} is below the required "
                                             f"{required_sf:g} (the key needs {key.required_length_m * 1000:.0f} mm)"))
            elif n < required_sf * (1.0 + marginal_band):
                found.append(("marginal", "key", f"{name}: n = {n:.2f} is within 10 % of the required {required_sf:g}"))
    if stiffness is not None:
        for i, slope in enumerate(stiffness.bearing_slopes_rad, start=1):
            ratio = slope / stiffness.slope_limit_rad
            if ratio > 1.0:
                level = "fail" if ratio > SLOPE_FAIL_RATIO else "marginal"
                found.append((level, "slope", f"slope at bearing {i} {slope:.2g} rad exceeds the "
                                              f"{stiffness.slope_limit_rad:g} rad limit of a {stiffness.bearing_type} bearing"))
        crit = stiffness.critical_speed_rpm
        if crit and speed_rpm:
            ratio = speed_rpm / crit
            if ratio >= CRITICAL_MARGINAL:
                level = "fail" if ratio >= CRITICAL_FAIL else "marginal"
                found.append((level, "critical speed", f"running at {speed_rpm:.0f} rpm, {ratio:.0%} of the first "
                                                       f"critical speed {crit:.0f} rpm"))
    if not found:
        return verdict, governing, why
    worst = max(found, key=lambda item: _ORDER[item[0]])
    if _ORDER[worst[0]] > _ORDER[verdict]:
        return worst
    return verdict, governing, why
