"""What a person types -> SI floats: the parse helpers of ``workbench.units``.

Conversion factors and their sources:
- 1 hp (mechanical, 550 ft*lbf/s) = 745.69987 W — NIST SP 811 (2008), Appendix B.8/B.9.
- 1 in = 0.0254 m exactly — NIST SP 811, Appendix B (international inch, 1959).
- 1 lbf = 4.4482216 N — NIST SP 811, Appendix B; so 1 lbf*in = 0.11298483 N*m.
- 1 rpm = 1 rev/min; 24 rev/s = 24 * 60 rpm = 1440 rpm exactly. A plain frequency (Hz) is refused
  for a shaft speed (workbench.field_rules: Hz on a nameplate is the supply frequency).
"""

from __future__ import annotations

import math

import pytest

from workbench.units import (
    LENGTH,
    POWER,
    SPEED,
    STRESS,
    TORQUE,
    TWIST_RATE,
    QuantityError,
    parse_fraction,
    parse_number,
    parse_quantity,
    split_number,
)

HP_W = 745.69987  # NIST SP 811, App. B (hp, 550 ft*lbf/s)
INCH_M = 0.0254  # NIST SP 811, App. B (exact)
LBF_IN_NM = 0.11298483  # NIST SP 811, App. B (lbf*in -> N*m)
REL = 1e-7  # relative tolerance: the NIST factors are given to 8 significant digits


@pytest.mark.parametrize(
    ("text", "expected_W"),
    [
        ("7.5 kW", 7500.0),
        ("7.5kW", 7500.0),
        ("7.5 kw", 7500.0),  # the trade's lower-case spelling
        ("7.5", 7500.0),  # bare number: kW
        ("750 W", 750.0),
        ("10 hp", 10 * HP_W),  # = 7456.9987 W
        ("10 HP", 10 * HP_W),
    ],
)
def test_power(text, expected_W):
    """Power to watts; 1 hp = 745.69987 W (NIST SP 811 App. B), rel. tolerance 1e-7."""
    assert parse_quantity("power", text, POWER, "kW") == pytest.approx(expected_W, rel=REL)


def test_ten_hp_is_7457_watts():
    """NIST SP 811 App. B: 10 hp = 7456.9987 W; check value to 1e-3 W."""
    assert abs(parse_quantity("power", "10 hp", POWER, "kW") - 7456.9987) < 1e-3


@pytest.mark.parametrize(
    ("text", "expected_rpm"),
    [
        ("1450 rpm", 1450.0),
        ("1450 RPM", 1450.0),
        ("1450", 1450.0),  # bare number: rpm
        ("24 rev/s", 1440.0),  # revolutions per second
        ("1450 r/min", 1450.0), ("1450 U/min", 1450.0), ("1450 1/min", 1450.0),  # nameplate spellings
        ("24 rps", 1440.0),
        ("2*pi rad/s", None),  # not a number first: must be refused, see below
    ],
)
def test_speed(text, expected_rpm):
    """Speed to rpm: 24 rev/s * 60 s/min = 1440 rpm (exact, tolerance 1e-9 rpm)."""
    if expected_rpm is None:
        with pytest.raises(QuantityError):
            parse_quantity("speed", text, SPEED, "rpm")
        return
    assert parse_quantity("speed", text, SPEED, "rpm") == pytest.approx(expected_rpm, abs=1e-9)


def test_speed_in_rad_per_s():
    """omega = 2 pi n / 60 (definition): 150 rad/s = 1432.3945 rpm, rel. tolerance 1e-9."""
    rpm = parse_quantity("speed", "150 rad/s", SPEED, "rpm")
    assert rpm == pytest.approx(150 * 60 / (2 * math.pi), rel=1e-9)


@pytest.mark.parametrize(
    ("text", "expected_m"),
    [
        ("35 mm", 0.035),
        ("35mm", 0.035),
        ("35", 0.035),  # bare number: mm
        ("0.5 m", 0.5),
        ("1.25 in", 1.25 * INCH_M),
        ("1-1/4 in", 1.25 * INCH_M),
        ("1-1/4in", 1.25 * INCH_M),
        ("1 1/4 in", 1.25 * INCH_M),
        ('1 1/4"', 1.25 * INCH_M),
        ("1 1/4''", 1.25 * INCH_M),
        ("3/4 in", 0.75 * INCH_M),
        ("2 inch", 2 * INCH_M),
    ],
)
def test_length(text, expected_m):
    """Length to metres; 1 in = 0.0254 m exactly (NIST SP 811 App. B), rel. tolerance 1e-12."""
    assert parse_quantity("size", text, LENGTH, "mm") == pytest.approx(expected_m, rel=1e-12)


def test_length_bare_number_takes_the_given_default_unit():
    """The default unit applies only to a bare number: '2' is 2 in when the default is inches."""
    assert parse_quantity("size", "2", LENGTH, "in") == pytest.approx(2 * INCH_M, rel=1e-12)
    assert parse_quantity("size", "2 mm", LENGTH, "in") == pytest.approx(0.002, rel=1e-12)


@pytest.mark.parametrize(
    ("text", "expected_Nm"),
    [
        ("50 Nm", 50.0),  # the trade's "Nm" is newton-metres, not nanometres
        ("50 N*m", 50.0),
        ("50 N·m", 50.0),
        ("50 N m", 50.0),
        ("50", 50.0),  # bare number: N*m
        ("1 kNm", 1000.0),
        ("400 lbf*in", 400 * LBF_IN_NM),
        ("400 lb-in", 400 * LBF_IN_NM),
        ("400 in-lb", 400 * LBF_IN_NM),
        ("30 lbf ft", 30 * 12 * LBF_IN_NM),
    ],
)
def test_torque(text, expected_Nm):
    """Torque to N*m; 1 lbf*in = 0.11298483 N*m (NIST SP 811 App. B), rel. tolerance 1e-7."""
    assert parse_quantity("torque", text, TORQUE, "N*m") == pytest.approx(expected_Nm, rel=REL)


def test_stress_and_twist_rate():
    """1 ksi = 6.8947573 MPa (NIST SP 811 App. B), rel. 1e-7; twist rate in deg/m as typed."""
    assert parse_quantity("material", "350 MPa", STRESS, "MPa") == 350e6
    assert parse_quantity("material", "50 ksi", STRESS, "MPa") == pytest.approx(50 * 6.8947573e6, rel=REL)
    assert parse_quantity("twist_limit", "0.25 deg/m", TWIST_RATE, "deg/m") == pytest.approx(0.25)
    assert parse_quantity("twist_limit", "0.25", TWIST_RATE, "deg/m") == pytest.approx(0.25)


@pytest.mark.parametrize(
    ("text", "kind", "unit", "fragment"),
    [
        ("35 mm", POWER, "kW", "is not a power"),  # wrong kind
        ("7.5 kW", LENGTH, "mm", "is not a length"),
        ("50 mph", SPEED, "rpm", "is not a speed"),
        ("1450 furlongs", SPEED, "rpm", "is not a speed"),
        ("7.5 zorks", POWER, "kW", "unknown unit"),
        ("nan", POWER, "kW", "not a finite number"),
        ("inf kW", POWER, "kW", "inf kW"),  # message quotes what was typed
        ("-inf", POWER, "kW", "not a finite number"),
        ("1e400", POWER, "kW", "not a finite number"),
        ("-7.5 kW", POWER, "kW", "greater than zero"),
        ("0", POWER, "kW", "greater than zero"),
        ("1/0 in", LENGTH, "mm", "divides by zero"),
        ("1-1/0 in", LENGTH, "mm", "divides by zero"),
        ("kW", POWER, "kW", "does not start with a number"),
        ("", POWER, "kW", "is empty"),
        ("   ", POWER, "kW", "is empty"),
    ],
)
def test_bad_quantities_name_the_field(text, kind, unit, fragment):
    with pytest.raises(QuantityError) as info:
        parse_quantity("the_field", text, kind, unit)
    message = str(info.value)
    assert info.value.field == "the_field"
    assert message.startswith("the_field: ")
    assert fragment in message
    assert "\n" not in message


def test_range_limits_are_in_SI():
    """low/high are compared in SI: 2 mm .. 500 mm given as metres."""
    assert parse_quantity("d", "2 mm", LENGTH, "mm", low=2e-3, high=0.5) == pytest.approx(2e-3)
    with pytest.raises(QuantityError, match="too small"):
        parse_quantity("d", "1.9 mm", LENGTH, "mm", low=2e-3, high=0.5)
    with pytest.raises(QuantityError, match="too large"):
        parse_quantity("d", "0.6 m", LENGTH, "mm", low=2e-3, high=0.5)


def test_zero_only_when_allowed():
    assert parse_quantity("overhang", "0 mm", LENGTH, "mm", allow_zero=True) == 0.0
    with pytest.raises(QuantityError, match="greater than zero"):
        parse_quantity("overhang", "0 mm", LENGTH, "mm")


@pytest.mark.parametrize(
    ("text", "number", "unit"),
    [
        ("35", 35.0, ""),
        ("1.25e-3 m", 1.25e-3, "m"),
        (".5in", 0.5, "in"),
        ("3/4", 0.75, ""),
        ("1-1/4 in", 1.25, "in"),
        ("1 1/4 in", 1.25, "in"),
        ("+7", 7.0, ""),
    ],
)
def test_split_number(text, number, unit):
    assert split_number("f", text) == (pytest.approx(number, rel=1e-12), unit)


@pytest.mark.parametrize(("text", "expected"), [("0.95", 0.95), ("95%", 0.95), ("95 %", 0.95), ("1", 1.0)])
def test_parse_fraction(text, expected):
    assert parse_fraction("efficiency", text, low=0.3, high=1.0) == pytest.approx(expected, rel=1e-12)


@pytest.mark.parametrize("text", ["105%", "0.2", "nan", "95 kW", "x"])
def test_parse_fraction_refuses(text):
    with pytest.raises(QuantityError) as info:
        parse_fraction("efficiency", text, low=0.3, high=1.0)
    assert info.value.field == "efficiency"


def test_parse_number_refuses_a_unit():
    assert parse_number("ratio", "3.2") == 3.2
    assert parse_number("ratio", "7/2") == 3.5
    with pytest.raises(QuantityError, match="plain number"):
        parse_number("ratio", "3.2 mm")


def test_pint_is_used_only_after_the_first_parse():
    """The registry is built lazily and is one shared object."""
    from workbench.units import registry

    assert registry() is registry()
