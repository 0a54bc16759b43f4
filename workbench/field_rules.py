"""Per-field unit rules: each field accepts the units of its own trade, whatever pint could convert.

pint converts anything of the right dimension, so on dimension alone a torque field takes an energy
(``0.1 kWh`` is 360 kN*m), a power field a logarithmic level (``70 dBm``), a speed field any rate
(``50 Hz``, ``1450 percent/s``) and a twist limit a bare inverse length (``0.25 1/m``). These rules
run after pint has read the unit, for every spelling that is not in the common-spelling table
(``workbench.unit_table``), and that table holds only spellings these rules accept — so no fast
path can skip a refusal (tests/test_field_rules.py proves it with the table switched on and off).

The rules (ours, stated):

- torque: exactly one force unit times one length unit (N*m, kN*m, N*mm, lbf*in, lbf*ft, kgf*m);
  an energy (J, kWh, kcal, Btu, ...) is refused.
- power: a multiplicative power unit (W, kW, hp, ...); logarithmic levels (dBm, dBW) are refused.
- speed: revolutions or an angle per time (rpm, r/min, U/min, rev/s, rad/s). A plain frequency
  is refused (``50 Hz`` on a nameplate is the SUPPLY frequency, not the shaft speed), and so is any
  rate of a dimensionless count (percent/s). ``1/min`` (min^-1 on IEC nameplates) is read as
  rev/min and said so.
- twist per length: an angle per length (deg/m, rad/m, deg/ft); ``1/m`` is refused.
"""

from __future__ import annotations

import re

from workbench.duty import SHAFT_FLOOR, duty_service_factor
from workbench.readings import note
from workbench.units import QuantityError, parse_number

_ANGLE_UNITS = {"radian", "degree", "arcminute", "arcsecond", "turn", "revolution", "grade", "gradian"}
_ROTATION_UNITS = {"revolutions_per_minute", "revolutions_per_second", "radian", "degree", "turn", "revolution"}
_LOG_MARKERS = ("decibel", "bel", "neper", "octave", "decade")


def _names(units) -> dict[str, float]:
    return {str(name): float(power) for name, power in units._units.items()}


def _dimension(name: str):
    from workbench.units import registry

    return registry().Unit(name).dimensionality


def check_units(field: str, text: str, kind, units) -> None:
    """Refuse ``units`` (pint units of the right dimension) when the field's trade does not use
    them for ``kind``; raises QuantityError naming ``field``. Notes how a per-minute speed was read."""
    from workbench.units import POWER, SPEED, TORQUE, TWIST_RATE, QuantityError

    names = _names(units)
    if kind is TORQUE:
        force, length = _dimension("newton"), _dimension("meter")
        kinds = sorted(("force" if _dimension(n) == force else "length" if _dimension(n) == length else n, p)
                       for n, p in names.items())
        if kinds != [("force", 1.0), ("length", 1.0)]:
            raise QuantityError(field, f"{text!r} is an energy or an odd unit, not a torque; write force x length, "
                                       "e.g. 50 N*m, 400 lbf*in or 30 lbf*ft")
    elif kind is POWER:
        if any(marker in n for n in names for marker in _LOG_MARKERS) or not units._REGISTRY.Quantity(
                1, units)._is_multiplicative:
            raise QuantityError(field, f"{text!r} is a logarithmic level, not a power; write e.g. 7.5 kW or 10 hp")
    elif kind is SPEED:
        if names == {"minute": -1.0}:
            note(field, f"{text!r} (min^-1, as IEC nameplates write it) read as revolutions per minute")
            return
        rotation = [n for n in names if n in _ROTATION_UNITS]
        others_are_time = all(n in _ROTATION_UNITS or _dimension(n) == _dimension("second") for n in names)
        if len(rotation) != 1 or names[rotation[0]] != 1.0 or not others_are_time:
            if any("hertz" in n for n in names):
                raise QuantityError(field, f"{text!r} is not a shaft speed: Hz on a nameplate is the supply frequency; "
                                           "write revolutions, e.g. 1450 rpm, 1450 r/min or 24 rev/s")
            raise QuantityError(field, f"{text!r} is not a speed unit: a shaft speed is revolutions per time; "
                                       "write e.g. 1450 rpm, 1450 r/min or 24 rev/s")
    elif kind is TWIST_RATE:
        angle = [n for n in names if n in _ANGLE_UNITS]
        if len(angle) != 1 or names[angle[0]] != 1.0:
            raise QuantityError(field, f"{text!r} has no angle; write an angle per length, e.g. 0.25 deg/m or 0.08 deg/ft")


# --------------------------------------------------------------------------- drive entries

MAX_RATIO = 500.0
MIN_RATIO = 0.02
QUESTIONED_SPEED_RPM = 10_000.0  # above any induction motor's synchronous speed on 50/60 Hz (3600 rpm)
_RATIO_PAIR = None


def parse_ratio(field: str, text: str) -> float:
    """The drive ratio = motor speed / shaft speed [-] from what was typed (ours, stated):

    ``25`` or ``25:1`` is a 25:1 reduction (A:B = motor turns : shaft turns); ``1:1.4`` a speed-up
    (shaft 1.4x motor speed, fans). A slash (``1/25``, ``25/1``) is refused: a fitter may mean
    either direction. A plain number below 1 is read as a speed-up and said so in the warnings.
    """
    text = text.strip()
    if not text:
        return 1.0
    if "/" in text:
        raise QuantityError(field, f"{text!r} could mean a reduction or a speed-up; write motor:shaft turns, "
                                   "e.g. 25:1 (reduction, shaft slower) or 1:1.4 (speed-up)")
    pair = re.fullmatch(r"\s*([^:]+?)\s*:\s*([^:]+?)\s*", text)
    if pair:
        motor, shaft = parse_number(field, pair[1]), parse_number(field, pair[2])
        if not (motor > 0 and shaft > 0):
            raise QuantityError(field, f"{text!r}: both sides of motor:shaft must be greater than zero")
        ratio = motor / shaft
    else:
        if ":" in text:
            raise QuantityError(field, f"{text!r}: write one motor:shaft pair, e.g. 25:1")
        ratio = parse_number(field, text)
        if 0 < ratio < 1:
            note(field, f"{text!r} read as a speed-up: the shaft turns {1 / ratio:.3g}x motor speed "
                        f"(ratio = motor / shaft speed); write 1:{1 / ratio:.3g} to say so")
    if not MIN_RATIO <= ratio <= MAX_RATIO:
        raise QuantityError(field, f"{text!r} is out of range; expected motor:shaft from 1:{1 / MIN_RATIO:g} "
                                   f"to {MAX_RATIO:g}:1")
    return ratio


def question_speeds(motor_rpm: float | None, ratio: float) -> None:
    """Warn (not refuse) where the motor or the shaft would turn faster than any motor's speed."""
    if motor_rpm is None:
        return
    if motor_rpm > QUESTIONED_SPEED_RPM:
        note("speed", f"{motor_rpm:.0f} rpm is above {QUESTIONED_SPEED_RPM:,.0f} rpm, faster than mains motors run; "
                      "check the entry (a nameplate speed is in rpm)")
    shaft = motor_rpm / ratio
    if shaft > QUESTIONED_SPEED_RPM:
        note("ratio", f"gives a shaft speed of {shaft:,.0f} rpm, above {QUESTIONED_SPEED_RPM:,.0f} rpm; "
                      "check the ratio's direction (motor:shaft, 25:1 is a reduction)")


def service_factor_for_shaft(service_text: str, duty_text: str) -> float:
    """The service factor for the shaft's strength check: ``--service-factor`` if given (it
    overrides ``--duty``), else the duty's table factor, else 1.0 assumed (said in the warnings);
    never below 1.0 (the floor for a shaft; a lower value is raised and said so)."""
    if service_text:
        value = parse_number("service_factor", service_text)
        if not 0 < value <= 5.0:
            raise QuantityError("service_factor", f"{service_text!r} is out of range; expected 1 to 5")
        if duty_text:
            duty_service_factor("duty", duty_text)  # still refused when it cannot be read
            note("duty", "not used: --service-factor overrides it")
        if value < SHAFT_FLOOR:
            note("service_factor", f"{service_text} is below 1.0; the shaft is checked at 1.0 (the floor for a "
                                   "shaft's strength)")
            return SHAFT_FLOOR
        return value
    if duty_text:
        value, how = duty_service_factor("duty", duty_text)
        note("duty", how)
        return value
    note("service_factor", "none given, 1.0 assumed (uniform load, up to 10 h a day); give --duty or "
                           "--service-factor")
    return SHAFT_FLOOR
