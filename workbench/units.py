"""Quantities at the boundary: the one pint registry, and parse / format helpers.

Everything a person types (``7.5 kW``, ``1-1/4 in``, ``1 1/4"``, ``1450 rpm``) is read here and
turned into an SI float for the core. Nothing inside :mod:`workbench.core` uses pint.

The registry is built on first use (``registry()``), with pint's on-disk definition cache, so that
``shaftbench --help`` and the import of the core never pay for it. Common spellings (``mm``,
``kW``, ``rpm``, ``N*m``, ...) are answered from a table made from pint (:mod:`workbench.unit_table`)
and pint is imported only for the others; every refusal still holds (see that module).
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass
from functools import cache, lru_cache

from workbench.unit_table import si_factor


class QuantityError(ValueError):
    """A value a person typed that cannot be used; the message names the field and what it expects."""

    def __init__(self, field: str, message: str) -> None:
        super().__init__(f"{field}: {message}")
        self.field = field
        self.message = message


@cache
def registry():
    """The one shared pint UnitRegistry (built lazily, cached on disk where possible)."""
    import pint

    try:
        ureg = pint.UnitRegistry(cache_folder=":auto:")
    except Exception:  # an unwritable cache folder must not stop the program
        ureg = pint.UnitRegistry()
    ureg.formatter.default_format = "~P"
    return ureg


@dataclass(frozen=True)
class Kind:
    """A physical kind a field accepts: its SI unit, a pint dimensionality and the words for messages."""

    name: str
    si_unit: str
    dimensionality: str
    examples: str


POWER = Kind("power", "W", "[power]", "7.5 kW or 10 hp")
SPEED = Kind("speed", "rpm", "1/[time]", "1450 rpm")
LENGTH = Kind("length", "m", "[length]", "35 mm or 1-1/4 in")
TORQUE = Kind("torque", "N*m", "[energy]", "50 N*m or 400 lbf*in")
STRESS = Kind("stress", "Pa", "[pressure]", "350 MPa or 50 ksi")
DENSITY = Kind("density", "kg/m^3", "[mass]/[length]**3", "7850 kg/m^3")
TWIST_RATE = Kind("twist per length", "deg/m", "1/[length]", "0.25 deg/m")
MASS = Kind("mass", "kg", "[mass]", "8 kg or 18 lb")
FORCE = Kind("force", "N", "[force]", "1200 N or 270 lbf")

# Spellings the trade uses that pint would read as something else ("Nm" is a nano-metre).
_REWRITES = (
    (re.compile(r"(?<![A-Za-z])([kM]?)Nm\b"), r"\1N*m"),
    (re.compile(r"\b(lbf?|pound)[\s.\-·*]*(in|inch|ft|foot)\b", re.I), r"lbf*\2"),
    (re.compile(r"\b(in|ft)[\s.\-·*]*lbf?\b", re.I), r"lbf*\1"),
    (re.compile(r"·"), "*"),
    (re.compile(r"″|''|\""), " in"),
    (re.compile(r"\brpm\b", re.I), "rpm"),
    (re.compile(r"\bHP\b"), "hp"),
    (re.compile(r"(?<=\d)\s*MM\b"), " mm"),  # shouting units are still units; "MM" is not a mega-molar here
    (re.compile(r"(?<=\d)\s*IN\b"), " in"),
    (re.compile(r"\bKW\b"), "kW"),
    (re.compile(r"\bkw\b"), "kW"),
    # revolutions as nameplates write them: r/min, U/min (German "Umdrehungen"), rev/min, rev/s
    (re.compile(r"\b(?:r|U|revs?|revolutions?|turns?)\s*/\s*min\b"), "rpm"),
    (re.compile(r"\b(?:r|U|revs?|revolutions?|turns?)\s*/\s*(?:s|sec)\b"), "revolution/second"),
    (re.compile(r"\brps\b"), "revolution/second"),
)
# One search finds whatever any rewrite would change, so that most entries skip all of them
# ("rpm" already written so is left out: rewriting it to itself changes nothing).
_ANY_REWRITE = re.compile("|".join(
    r"\b(?!rpm\b)(?i:rpm)\b" if rule.pattern == r"\brpm\b" else f"(?{'i' if rule.flags & re.I else ''}:{rule.pattern})"
    for rule, _ in _REWRITES
))
_NUMBER = r"[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?"
_MIXED = re.compile(rf"^\s*(?P<whole>\d+)(?:\s+|-)(?P<num>\d+)\s*/\s*(?P<den>\d+)\s*(?P<unit>.*)$")
_FRACTION = re.compile(r"^\s*(?P<num>\d+)\s*/\s*(?P<den>\d+)\s*(?P<unit>.*)$")
_PLAIN = re.compile(rf"^\s*(?P<number>{_NUMBER})\s*(?P<unit>.*)$")


def split_number(field: str, text: str) -> tuple[float, str]:
    """Split ``text`` into a number and the unit text after it.

    Accepts decimals (``35``, ``1.25e-3``), fractions (``3/4``) and mixed numbers written the
    trade's ways (``1-1/4``, ``1 1/4``). Raises QuantityError naming ``field`` otherwise.
    """
    text = text.strip()
    if not text:
        raise QuantityError(field, "is empty; expected a number with a unit")
    if "," in text:
        text = _decimal_comma(field, text)
    text = _rewritten(text)
    if "/" in text:  # both fraction forms need one
        match = _MIXED.match(text)
        if match:
            den = int(match["den"])
            if den == 0:
                raise QuantityError(field, f"{text!r} divides by zero")
            return int(match["whole"]) + int(match["num"]) / den, match["unit"].strip()
        match = _FRACTION.match(text)
        if match:
            den = int(match["den"])
            if den == 0:
                raise QuantityError(field, f"{text!r} divides by zero")
            return int(match["num"]) / den, match["unit"].strip()
    match = _PLAIN.match(text)
    if match:
        return float(match["number"]), match["unit"].strip()
    lowered = text.lower()
    if lowered.lstrip("+-") in ("nan", "inf", "infinity"):
        raise QuantityError(field, f"{text!r} is not a finite number")
    raise QuantityError(field, f"{text!r} does not start with a number")


@lru_cache(maxsize=1024)  # pure in the text; the same entries are read on every evaluation of a job
def _rewritten(text: str) -> str:
    """``text`` with the trade's spellings rewritten for pint (see _REWRITES)."""
    if _ANY_REWRITE.search(text):
        for rule, replacement in _REWRITES:
            text = rule.sub(replacement, text)
    return text


_COMMA = re.compile(r"^(?P<whole>[+-]?\d+),(?P<part>\d+)(?P<rest>(?:\s|[^\d.,]).*)?$")


def _decimal_comma(field: str, text: str) -> str:
    """``7,5 kW`` -> ``7.5 kW`` (a decimal comma, said in the job's warnings); refused where a
    comma could be a thousands separator (exactly three digits after it: ``1,450``) or appears twice."""
    from workbench.readings import note

    match = _COMMA.match(text)
    if not match or len(match["part"]) == 3:
        raise QuantityError(
            field, f"{text!r}: a comma here could be a decimal point or a thousands separator; "
            "write the number without it (1450, or 7.5)")
    read = f"{match['whole']}.{match['part']}{match['rest'] or ''}"
    note(field, f"{text!r} read with a decimal comma as {read!r}")
    return read


def parse_quantity(
    field: str,
    text: str,
    kind: Kind,
    default_unit: str,
    *,
    low: float | None = None,
    high: float | None = None,
    allow_zero: bool = False,
) -> float:
    """Read a typed value of ``kind`` and return it in the kind's SI unit (a float).

    A bare number takes ``default_unit``. The value must be finite, positive (or zero when
    ``allow_zero``) and, in SI, within ``[low, high]`` when those are given; otherwise a
    QuantityError names the field and what it expects.
    """
    value, unit_text = split_number(field, str(text))
    if not math.isfinite(value):
        raise QuantityError(field, f"{text!r} is not a finite number")
    unit_text = unit_text or default_unit
    factor = si_factor(kind, unit_text)  # a common spelling, from the table made from pint
    si = value * factor if factor is not None else _pint_si(field, text, value, unit_text, kind)
    if not math.isfinite(si):
        raise QuantityError(field, f"{text!r} is not a finite number")
    if si < 0 or (si == 0 and not allow_zero):
        raise QuantityError(field, f"must be greater than zero (got {text!r})")
    if low is not None and si < low:
        raise QuantityError(field, f"{text!r} is too small; expected at least {format_si(low, kind)}")
    if high is not None and si > high:
        raise QuantityError(field, f"{text!r} is too large; expected at most {format_si(high, kind)}")
    return si


def _pint_si(field: str, text: str, value: float, unit_text: str, kind: Kind) -> float:
    """``value`` in ``unit_text`` read by pint, checked to be a ``kind``, in the kind's SI unit."""
    ureg = registry()
    try:
        units = ureg.parse_units(unit_text)
    except Exception:
        raise QuantityError(
            field, f"unknown unit {unit_text!r}; expected a {kind.name} such as {kind.examples}"
        ) from None
    quantity = ureg.Quantity(value, units)
    if not quantity.check(kind.dimensionality):
        raise QuantityError(
            field, f"{text!r} is not a {kind.name}; expected a {kind.name} such as {kind.examples}"
        )
    from workbench.field_rules import check_units

    check_units(field, text, kind, units)  # the refusals of each kind's trade (Hz, kWh, dBm, 1/m, ...)
    return _to_si(quantity, kind)


def _to_si(quantity, kind: Kind) -> float:
    """Convert to the kind's SI unit. A speed reaches here only as revolutions or an angle per time,
    or as per-minute (``1450 1/min``, the IEC nameplate's min^-1, read as rev/min): field_rules
    refuses plain frequencies (Hz)."""
    if kind is SPEED:
        ureg = registry()
        _, root = ureg.get_root_units(quantity.units)
        if "radian" in repr(root):  # angular units (rpm, rad/s)
            return float(quantity.to("rpm").magnitude)
        return float(quantity.to("1/minute").magnitude)
    return float(quantity.to(kind.si_unit).magnitude)


def parse_fraction(field: str, text: str, *, low: float, high: float) -> float:
    """Read a dimensionless number, ``0.95`` or ``95%``, within ``[low, high]``."""
    raw = str(text).strip()
    percent = raw.endswith("%")
    if percent:
        raw = raw[:-1]
    value = parse_number(field, raw)
    if percent:
        value /= 100.0
    if not low <= value <= high:
        raise QuantityError(field, f"{text!r} is out of range; expected {low:g} to {high:g}")
    return value


def parse_number(field: str, text: str) -> float:
    """Read a plain finite number (fractions allowed); no unit may follow."""
    value, unit_text = split_number(field, str(text))
    if unit_text:
        raise QuantityError(field, f"expected a plain number, not {text!r}")
    if not math.isfinite(value):
        raise QuantityError(field, f"{text!r} is not a finite number")
    return value


def format_si(value: float, kind: Kind) -> str:
    """A short human form of an SI value of ``kind`` (used in messages; no pint needed)."""
    if kind is LENGTH:
        return f"{value * 1000:g} mm"
    if kind is POWER:
        return f"{value / 1000:g} kW"
    return f"{value:g} {kind.si_unit}"
