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
            from workbench.readings import note

            note(field, f"{text!r} (min^-1, as IEC nameplates write it) read as revolutions per minute")
            return
        rotation = [n for n in names if n in _ROTATION_UNITS]
        others_are_time = all(n in _ROTATION_UNITS or _dimension(n) == _dimension("second") for n in names)
        if len(rotation) != 1 or names[rotation[0]] != 1.0 or not others_are_time:
            raise QuantityError(field, f"{text!r} is not a shaft speed: Hz on a nameplate is the supply frequency; "
                                       "write revolutions, e.g. 1450 rpm, 1450 r/min or 24 rev/s")
    elif kind is TWIST_RATE:
        angle = [n for n in names if n in _ANGLE_UNITS]
        if len(angle) != 1 or names[angle[0]] != 1.0:
            raise QuantityError(field, f"{text!r} has no angle; write an angle per length, e.g. 0.25 deg/m or 0.08 deg/ft")
