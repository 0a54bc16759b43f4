"""Rolling bearings by ISO 15 designation: boundary dimensions and the bore's own tolerance.

A designation such as ``6207``, ``6208-2RS``, ``22210 E``, ``NU208`` or ``1207`` is read by the
usual basic-designation rule (ISO 15 dimension series + bore code: 00 = 10 mm, 01 = 12, 02 = 15,
03 = 17, 04...96 = 5 x code mm); its bore d, outside diameter D, width B and smallest corner
radius r_s min come from ``data/bearings.csv`` (per dimension series). The bore tolerance is ISO
492's Normal class from ``data/bearing_bore_iso492.csv``. SI floats (m).
"""

from __future__ import annotations

import functools
import re
from dataclasses import dataclass

# basic-designation prefix -> (bearing type words, ISO 15 dimension series)
_SERIES = (
    (re.compile(r"^(222)(\d\d)$"), "spherical roller bearing", "22"),
    (re.compile(r"^(223)(\d\d)$"), "spherical roller bearing", "23"),
    (re.compile(r"^(N|NU|NJ|NUP)(2)(\d\d)$"), "cylindrical roller bearing", "02"),
    (re.compile(r"^(N|NU|NJ|NUP)(3)(\d\d)$"), "cylindrical roller bearing", "03"),
    (re.compile(r"^(N|NU|NJ|NUP)(22)(\d\d)$"), "cylindrical roller bearing", "22"),
    (re.compile(r"^(60)(\d\d)$"), "deep-groove ball bearing", "10"),
    (re.compile(r"^(62)(\d\d)$"), "deep-groove ball bearing", "02"),
    (re.compile(r"^(63)(\d\d)$"), "deep-groove ball bearing", "03"),
    (re.compile(r"^(72)(\d\d)$"), "angular-contact ball bearing", "02"),
    (re.compile(r"^(73)(\d\d)$"), "angular-contact ball bearing", "03"),
    (re.compile(r"^(12)(\d\d)$"), "self-aligning ball bearing", "02"),
    (re.compile(r"^(13)(\d\d)$"), "self-aligning ball bearing", "03"),
    (re.compile(r"^(22)(\d\d)$"), "self-aligning ball bearing", "22"),
    (re.compile(r"^(23)(\d\d)$"), "self-aligning ball bearing", "23"),
)
_BORE_CODES = {"00": 10.0, "01": 12.0, "02": 15.0, "03": 17.0}


class BearingError(ValueError):
    """A designation that cannot be read or is not in the table; one line."""


@dataclass(frozen=True)
class Bearing:
    """One bearing's boundary dimensions [m] and its Normal-class bore limits (deviations) [m]."""

    designation: str
    kind: str
    dimension_series: str
    bore_m: float
    outside_m: float
    width_m: float
    corner_radius_m: float
    tapered_bore: bool
    bore_upper_deviation_m: float
    bore_lower_deviation_m: float
    source: str
    mark: str


@functools.cache
def _dimension_table() -> dict[tuple[str, float], tuple[float, float, float, str, str]]:
    from workbench.core.tables import _read_rows

    out = {}
    for _, row in _read_rows("bearings.csv", ("dimension_series", "bore_mm", "outside_mm", "width_mm", "corner_radius_min_mm")):
        out[(row["dimension_series"], float(row["bore_mm"]))] = (
            float(row["outside_mm"]), float(row["width_mm"]), float(row["corner_radius_min_mm"]), row["source"], row["mark"])
    return out


@functools.cache
def _bore_tolerances() -> tuple[tuple[float, float, float, float], ...]:
    from workbench.core.tables import _read_rows

    rows = _read_rows("bearing_bore_iso492.csv", ("bore_over_mm", "bore_to_mm", "bore_upper_um", "bore_lower_um"))
    return tuple((float(r["bore_over_mm"]), float(r["bore_to_mm"]), float(r["bore_upper_um"]), float(r["bore_lower_um"]))
                 for _, r in rows)


def bore_tolerance_m(bore_m: float) -> tuple[float, float]:
    """(upper, lower) mean-bore deviation of a radial bearing's inner ring, ISO 492 Normal class
    [m]; a size equal to a range limit belongs to the lower range."""
    d_mm = bore_m * 1000.0
    for low, high, upper, lower in _bore_tolerances():
        if low < d_mm <= high + 1e-9:
            return upper * 1e-6, lower * 1e-6
    raise BearingError(f"no ISO 492 Normal bore tolerance in the table for a {d_mm:g} mm bore")


def bore_of_code(code: str) -> float:
    """Bore [mm] of an ISO 15 bore code (00 -> 10, 01 -> 12, 02 -> 15, 03 -> 17, else 5 x code)."""
    return _BORE_CODES.get(code, 5.0 * int(code))


def bearing(designation: str) -> Bearing:
    """The bearing named by ``designation`` (suffixes after a dash or space ignored; a trailing K
    marks a tapered bore, for an adapter sleeve). Raises BearingError naming what it expects."""
    raw = str(designation).strip().upper()
    if not raw:
        raise BearingError("is empty; give a bearing designation such as 6207 or 22210")
    basic = re.split(r"[\s\-/]", raw, maxsplit=1)[0]
    tapered = False
    basic_core = re.sub(r"(E|EK|K|CC|CA|C|M|MB|ECP|EC)$", "", basic) if not re.fullmatch(r"\d+", basic) else basic
    if basic.endswith("K"):
        tapered = True
    for pattern, kind, series in _SERIES:
        match = pattern.match(basic_core)
        if match:
            code = match.groups()[-1]
            bore_mm = bore_of_code(code)
            row = _dimension_table().get((series, bore_mm))
            if row is None:
                raise BearingError(f"{designation!r}: dimension series {series} with a {bore_mm:g} mm bore is not in the bearing table")
            outside, width, radius, source, mark = row
            upper, lower = bore_tolerance_m(bore_mm / 1000.0)
            return Bearing(basic, kind, series, bore_mm / 1000.0, outside / 1000.0, width / 1000.0, radius / 1000.0,
                           tapered, upper, lower, source, mark)
    raise BearingError(f"{designation!r} is not a designation this table reads (e.g. 6207, 6308, 22210, NU208, 1207)")
