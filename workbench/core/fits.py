"""Fits: a hole and a shaft class at one nominal size -> clearances and the kind of fit.

ISO 286-1 definitions: maximum clearance = largest hole - smallest shaft; minimum clearance =
smallest hole - largest shaft (a negative clearance is an interference). A fit is a clearance
fit when the minimum clearance is >= 0, an interference fit when the maximum clearance is <= 0,
else a transition fit. SI floats (m).
"""

from __future__ import annotations

import functools
from dataclasses import dataclass

from workbench.core.iso286 import ToleranceError, Zone, limits

KINDS = ("clearance", "transition", "interference")


@dataclass(frozen=True)
class Fit:
    """A hole/shaft pair at one size [m]; clearances negative = interference."""

    hole: Zone
    shaft: Zone
    max_clearance_m: float
    min_clearance_m: float
    kind: str


def fit_kind(max_clearance_m: float, min_clearance_m: float) -> str:
    """``clearance`` (min clearance >= 0), ``interference`` (max clearance <= 0) or ``transition``
    (ISO 286-1, definitions of clearance, transition and interference fits)."""
    if min_clearance_m >= -1e-12:
        return "clearance"
    if max_clearance_m <= 1e-12:
        return "interference"
    return "transition"


def clearances(hole_upper_m: float, hole_lower_m: float, shaft_upper_m: float, shaft_lower_m: float) -> tuple[float, float, str]:
    """(max clearance, min clearance, kind) from the deviations of a bore and a shaft at one
    nominal size [m] -- also for a bore that is not an ISO class (a bearing bore): max = ES - ei,
    min = EI - es (deviations, so no round-off from the size itself)."""
    max_c = round(hole_upper_m - shaft_lower_m, 12)
    min_c = round(hole_lower_m - shaft_upper_m, 12)
    return max_c, min_c, fit_kind(max_c, min_c)


def parse_fit(text: str) -> tuple[str, str]:
    """Split ``H7/k6`` into (hole class, shaft class); raises ToleranceError."""
    hole, sep, shaft = str(text).partition("/")
    if not sep or not hole.strip() or not shaft.strip():
        raise ToleranceError(f"{str(text).strip()!r} is not a fit; write HOLE/SHAFT, e.g. H7/k6")
    return hole.strip(), shaft.strip()


@functools.lru_cache(maxsize=1024)  # pure table look-ups; Fit is frozen
def fit(size_m: float, text: str) -> Fit:
    """The fit ``text`` (``H7/k6``) at nominal size ``size_m`` [m]. The first class must be a hole
    (upper-case letter) and the second a shaft (lower-case), as ISO writes a fit."""
    hole_text, shaft_text = parse_fit(text)
    hole = limits(size_m, hole_text)
    shaft = limits(size_m, shaft_text)
    if not hole.is_hole:
        raise ToleranceError(f"{hole.name} is a shaft class; a fit is written HOLE/SHAFT (upper-case hole), e.g. H7/k6")
    if shaft.is_hole:
        raise ToleranceError(f"{shaft.name} is a hole class; a fit is written HOLE/SHAFT (lower-case shaft), e.g. H7/k6")
    max_c, min_c, kind = clearances(hole.upper_deviation_m, hole.lower_deviation_m,
                                    shaft.upper_deviation_m, shaft.lower_deviation_m)
    return Fit(hole, shaft, max_c, min_c, kind)
