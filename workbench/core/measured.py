"""Measured parts against their limits: inside or outside by how much, ovality, taper, the
reference temperature, the measurement uncertainty, and the shaft range for a measured bore.

SI floats (m, K). Sources: ISO 1 (standard reference temperature 20 degC for lengths);
ISO 14253-1 (decision rules: conformance is proven only inside the specification zone reduced by
the expanded uncertainty U on each side; non-conformance only outside it enlarged by U);
linear thermal expansion dL = L alpha dT (carbon steel alpha ~ 11.5e-6 /K, Shigley 9th ed.
Table A-5; from memory for the exact figure).
"""

from __future__ import annotations

from dataclasses import dataclass

REFERENCE_TEMPERATURE_C = 20.0
STEEL_EXPANSION_PER_K = 11.5e-6


@dataclass(frozen=True)
class Assessment:
    """A measured size against limits [m].

    ``measured_m`` is the reading that decides (the one farthest outside, else nearest a limit),
    referred to 20 degC; ``outside_by_m`` 0 when within, positive over the max, negative under
    the min, taken against the acceptance zone (the limits narrowed by the uncertainty).
    ``decision`` per ISO 14253-1: ``conforms``, ``does not conform`` or ``not proven`` (inside the
    limits but within U of one).
    """

    measured_m: float
    readings_m: tuple[tuple[float, ...], ...]
    within: bool
    outside_by_m: float
    acceptance_max_m: float
    acceptance_min_m: float
    decision: str
    ovality_m: float | None
    taper_m: float | None
    temperature_correction_m: float


def referred_to_20c(reading_m: float, part_temperature_c: float | None,
                    expansion_per_K: float = STEEL_EXPANSION_PER_K) -> float:
    """The size a reading taken on a part at ``part_temperature_c`` would have at 20 degC [m]:
    L20 = L / (1 + alpha (t - 20)), the gauge itself taken at 20 degC (ISO 1; linear expansion).
    A 35 mm steel journal 30 K warm reads 35e-3 x 11.5e-6 x 30 = 12 um large."""
    if part_temperature_c is None:
        return reading_m
    return reading_m / (1.0 + expansion_per_K * (part_temperature_c - REFERENCE_TEMPERATURE_C))


def assess(max_m: float, min_m: float, readings_m, *, part_temperature_c: float | None = None,
           expansion_per_K: float = STEEL_EXPANSION_PER_K, uncertainty_m: float = 0.0) -> Assessment:
    """Measured diameters against the limits ``min_m``...``max_m`` [m].

    ``readings_m``: one float, or a list of sections, each a list of readings at different angles
    (e.g. 0 and 90 degrees). Ovality = the largest spread within one section (two-point
    out-of-roundness); taper = the spread of the section means (None with one section / reading).
    Uncertainty ``uncertainty_m`` (expanded U) narrows the acceptance zone on both sides
    (ISO 14253-1, conformance zone).
    """
    if isinstance(readings_m, (int, float)):
        sections = ((float(readings_m),),)
    else:
        sections = tuple(tuple(float(r) for r in (s if isinstance(s, (list, tuple)) else (s,))) for s in readings_m)
    if not sections or not all(sections):
        raise ValueError("no readings")
    corrected = tuple(tuple(referred_to_20c(r, part_temperature_c, expansion_per_K) for r in s) for s in sections)
    flat = [r for s in corrected for r in s]
    acc_max, acc_min = max_m - uncertainty_m, min_m + uncertainty_m

    def outside(r: float) -> float:
        if r > acc_max + 1e-12:
            return r - acc_max
        if r < acc_min - 1e-12:
            return r - acc_min
        return 0.0

    worst = max(flat, key=lambda r: (abs(outside(r)), -min(acc_max - r, r - acc_min)))
    by = outside(worst)
    within = by == 0.0 and acc_min <= acc_max
    if any(r > max_m + uncertainty_m + 1e-12 or r < min_m - uncertainty_m - 1e-12 for r in flat):
        decision = "does not conform"
    elif within and all(acc_min - 1e-12 <= r <= acc_max + 1e-12 for r in flat):
        decision = "conforms"
    else:
        decision = "not proven"
    ovality = max(max(s) - min(s) for s in corrected) if any(len(s) > 1 for s in corrected) else None
    means = [sum(s) / len(s) for s in corrected]
    taper = max(means) - min(means) if len(corrected) > 1 else None
    first = sections[0][0]
    return Assessment(worst, corrected, within, by, acc_max, acc_min, decision, ovality, taper,
                      referred_to_20c(first, part_temperature_c, expansion_per_K) - first)


def shaft_range_for_bore(bore_m: float, max_clearance_m: float, min_clearance_m: float) -> tuple[float, float]:
    """(shaft max, shaft min) [m] that give a clearance between ``min_clearance_m`` and
    ``max_clearance_m`` (negative = interference) against a bore measured at ``bore_m``:
    shaft max = bore - min clearance, shaft min = bore - max clearance (ISO 286-1 definitions
    of clearance, applied to the measured bore instead of its class)."""
    return bore_m - min_clearance_m, bore_m - max_clearance_m
