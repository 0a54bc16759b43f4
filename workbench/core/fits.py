"""Fits: a hole and a shaft class at one nominal size -> clearances and the kind of fit.

ISO 286-1 definitions: maximum clearance = largest hole - smallest shaft; minimum clearance =
smallest hole - largest shaft (a negative clearance is an interference). A fit is a clearance
fit when the minimum clearance is >= 0, an interference fit when the maximum clearance is <= 0,
else a transition fit. SI floats (m).
"""

from __future__ import annotations

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


def fit_of_zones(hole_max_m: float, hole_min_m: float, shaft_max_m: float, shaft_min_m: float) -> tuple[float, float, str]:
    """(max clearance, min clearance, kind) of a bore between two limits and a shaft between two
    limits [m] -- also for a bore that is not an ISO class (a bearing bore, a measured hub)."""
    max_c = hole_max_m - shaft_min_m
    min_c = hole_min_m - shaft_max_m
    return max_c, min_c, fit_kind(max_c, min_c)


def parse_fit(text: str) -> tuple[str, str]:
    """Split ``H7/k6`` into (hole class, shaft class); raises ToleranceError."""
    hole, sep, shaft = str(text).partition("/")
    if not sep or not hole.strip() or not shaft.strip():
        raise ToleranceError(f"{str(text).strip()!r} is not a fit; write HOLE/SHAFT, e.g. H7/k6")
    return hole.strip(), shaft.strip()


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
    max_c = round(hole.upper_deviation_m - shaft.lower_deviation_m, 12)  # deviations: no size round-off
    min_c = round(hole.lower_deviation_m - shaft.upper_deviation_m, 12)
    kind = fit_kind(max_c, min_c)
    return Fit(hole, shaft, max_c, min_c, kind)
