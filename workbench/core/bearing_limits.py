"""Largest shaft slope a bearing (or a spur-gear mesh) tolerates, by type.

Values from Shigley's Mechanical Engineering Design, 9th ed., Table 7-2 ("typical maximum
ranges for slopes"), read from ``data/bearing_slopes.csv``; the check uses the LOWER end of
each published range, the conservative side when the bearing maker's figure is not at hand.
Spherical roller bearings are not in Table 7-2; their row is marked "from memory" (makers'
catalogues). Names are CLI-friendly: ``deep-groove-ball``, ``cylindrical-roller``…

Public API::

    slope_limit_rad(bearing_type) -> float     bearing_types() -> list[str]
    bearing_slope_row(bearing_type) -> BearingSlope   DEFAULT_BEARING_TYPE = "deep-groove-ball"
"""

from __future__ import annotations

import functools
from dataclasses import dataclass

from workbench.core.tables import _number, _read_rows

DEFAULT_BEARING_TYPE = "deep-groove-ball"
"""The usual bearing of a motor-driven shaft (pillow blocks and flange units are ball bearings)."""


@dataclass(frozen=True)
class BearingSlope:
    """One row of the slope table: key, description, published range [rad], source, mark."""

    key: str
    kind: str  # "bearing", or "gear" for the spur-gear mesh row
    name: str
    slope_min_rad: float
    slope_max_rad: float
    source: str
    mark: str


@functools.cache
def _rows() -> dict[str, BearingSlope]:
    filename = "bearing_slopes.csv"
    out = {}
    for line, row in _read_rows(filename, ("key", "kind", "name", "slope_min_rad", "slope_max_rad")):
        out[row["key"]] = BearingSlope(
            key=row["key"], kind=row["kind"], name=row["name"],
            slope_min_rad=_number(filename, line, row, "slope_min_rad"),
            slope_max_rad=_number(filename, line, row, "slope_max_rad"),
            source=row["source"], mark=row["mark"])
    return out


def bearing_types() -> list[str]:
    """The bearing type names, in table order (the spur-gear mesh row is not a bearing: it is
    left out here, though ``slope_limit_rad("uncrowned-spur-gear")`` gives its limit)."""
    return [key for key, row in _rows().items() if row.kind == "bearing"]


def bearing_slope_row(bearing_type: str) -> BearingSlope:
    """The table row for ``bearing_type``; ValueError listing the names if unknown."""
    key = (bearing_type or "").strip().lower().replace("_", "-").replace(" ", "-")
    rows = _rows()
    if key not in rows:
        raise ValueError(f"bearing type {bearing_type!r} is not known; use one of {', '.join(bearing_types())}")
    return rows[key]


def slope_limit_rad(bearing_type: str) -> float:
    """Largest slope at a bearing of this type [rad]: lower end of Shigley 9th ed. Table 7-2.

    E.g. deep-groove-ball 0.001 rad (range 0.001-0.003), cylindrical-roller 0.0008,
    tapered-roller 0.0005, self-aligning-ball 0.026. ValueError listing the names if unknown.
    """
    return bearing_slope_row(bearing_type).slope_min_rad
