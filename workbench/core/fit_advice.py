"""Recommended fits for the turned shaft: bearing journals, hub seats, keyseats, finishes.

Every recommendation here is common practice (P) unless a standard is named: the bearing-seat
classes follow the general guidance rolling-bearing makers and handbooks publish (inner ring
rotating relative to the load: ball bearings js5 to ~18 mm, k5/k6 to ~100 mm, m5/m6 to ~200 mm,
heavier loads and roller bearings one step tighter; stationary inner ring g6/h6; adapter-sleeve
and set-screw / eccentric-collar insert units h7-h9). The fit on a bearing is computed against
the bearing bore's own tolerance (ISO 492 Normal class), not a hole class. Keyseat widths:
DIN 6885-1 (free H9/D10, normal N9/JS9, tight P9/P9, shaft/hub) and ANSI B17.1 for inch keys.
SI floats (m).
"""

from __future__ import annotations

import functools
from dataclasses import dataclass

from workbench.core.fits import clearances
from workbench.core.iso286 import limits

MOUNTINGS = ("pressed", "adapter-sleeve", "insert")
"""pressed: cylindrical bore pressed on; adapter-sleeve: tapered bore on a sleeve; insert:
set-screw or eccentric-collar insert unit (pillow blocks)."""
ROTATING_RINGS = ("inner", "outer")
"""Which ring turns relative to the load direction: ``inner`` (shaft turns, belt pull fixed: the
usual motor drive) or ``outer`` (fixed axle, e.g. an idler wheel)."""
LOADS = ("light", "normal", "heavy")
"""As a share of the bearing's dynamic rating C: light P <= 0.06 C, normal 0.06-0.12 C, heavy
> 0.12 C (bearing makers' general guidance; common practice)."""
KEY_FITS = ("free", "normal", "tight")
ELEMENTS = ("coupling", "sprocket", "timing-belt", "gear", "vbelt", "flat-belt")

_JOURNAL_LADDER = ("h5", "js5", "k5", "k6", "m6", "n6", "p6")
_DIN_KEY_WIDTH = {"free": ("H9", "D10"), "normal": ("N9", "JS9"), "tight": ("P9", "P9")}
_SEAT_FOR_ELEMENT = {"coupling": "k6", "gear": "k6", "sprocket": "j6", "timing-belt": "j6", "vbelt": "j6", "flat-belt": "j6"}
_SEAT_TIGHTER = {"j6": "k6", "k6": "m6", "m6": "n6"}
_ROLLER_WORDS = ("roller",)
SOURCE_JOURNAL = "common practice after rolling-bearing makers' general guidance (P)"
SOURCE_SEAT = "common practice for keyed hubs, hub bored H7 (P)"


@dataclass(frozen=True)
class Recommendation:
    """A recommended tolerance class with the reason and its basis."""

    cls: str
    reason: str
    source: str


@functools.lru_cache(maxsize=512)  # pure: a job asks the same few again on every keystroke
def journal_class(diameter_m: float, *, mounting: str = "pressed", rotating: str = "inner",
                  load: str = "normal", roller: bool = False) -> Recommendation:
    """Shaft class for a bearing journal (common practice, see the module docstring)."""
    d_mm = diameter_m * 1000.0
    if mounting == "adapter-sleeve":
        return Recommendation("h9", "adapter-sleeve mounting: h9 with cylindricity IT5/2 (h10 for transmission shafting)",
                              SOURCE_JOURNAL)
    if mounting == "insert":
        cls = {"light": "h9", "normal": "h8", "heavy": "h7"}[load]
        return Recommendation(cls, f"set-screw / eccentric-collar insert unit, {load} load: h7-h9 shafting", SOURCE_JOURNAL)
    if rotating == "outer":
        cls = "h6" if load == "heavy" else "g6"
        return Recommendation(cls, "inner ring stationary to the load: a sliding fit so the ring can creep", SOURCE_JOURNAL)
    index = 1 if d_mm <= 18 else 3 if d_mm <= 100 else 4 if d_mm <= 200 else 5
    index += {"light": -1, "normal": 0, "heavy": 1}[load]
    if roller and d_mm > 40:
        index += 1
    index = max(0, min(index, len(_JOURNAL_LADDER) - 1))
    kind = "roller" if roller else "ball"
    return Recommendation(_JOURNAL_LADDER[index],
                          f"{kind} bearing, inner ring rotating, {load} load, {d_mm:g} mm", SOURCE_JOURNAL)


@functools.lru_cache(maxsize=128)  # pure
def seat_class(element: str, load: str = "normal") -> Recommendation:
    """Shaft class for a keyed hub seat (hub bored H7), by element; a heavy load one step tighter."""
    cls = _SEAT_FOR_ELEMENT.get(element, "k6")
    if load == "heavy":
        cls = _SEAT_TIGHTER.get(cls, cls)
    words = {"vbelt": "V-belt pulley", "flat-belt": "flat-belt pulley", "timing-belt": "timing pulley"}.get(element, element)
    return Recommendation(cls, f"keyed {words} hub bored H7, {load} load", SOURCE_SEAT)


def finish_Ra_um(cls: str, step: str) -> float:
    """A surface roughness Ra [um] to turn or grind to (common practice): bearing journals by
    grade (IT5 0.4, IT6 0.8, IT7-IT9 1.6); seats 1.6; the body as turned 3.2."""
    if step == "body":
        return 3.2
    grade = int("".join(c for c in cls if c.isdigit()) or 7)
    if step == "journal":
        return 0.4 if grade <= 5 else 0.8 if grade == 6 else 1.6
    return 1.6


def bearing_fit(bore_m: float, bore_upper_m: float, bore_lower_m: float, shaft_cls: str) -> dict:
    """The fit of a shaft class on a bearing bore with its own limits (ISO 492): clearances [m]
    (negative = interference) and the kind."""
    shaft = limits(bore_m, shaft_cls)
    max_c, min_c, kind = clearances(bore_upper_m, bore_lower_m, shaft.upper_deviation_m, shaft.lower_deviation_m)
    return {"bore_max_m": bore_m + bore_upper_m, "bore_min_m": bore_m + bore_lower_m,
            "max_clearance_m": max_c, "min_clearance_m": min_c, "kind": kind,
            "basis": "bearing bore ISO 492 Normal class"}


# --------------------------------------------------------------------------- keyseats


@functools.cache
def _din_depth_rows():
    from workbench.core.tables import _read_rows

    return tuple((float(r["shaft_over_mm"]), float(r["shaft_to_mm"]), float(r["shaft_depth_tolerance_mm"]),
                  float(r["hub_depth_tolerance_mm"]))
                 for _, r in _read_rows("keyseat_depth_din6885.csv", ("shaft_over_mm", "shaft_to_mm", "shaft_depth_tolerance_mm", "hub_depth_tolerance_mm")))


@functools.cache
def _ansi_rows():
    from workbench.core.tables import _read_rows

    return tuple((float(r["key_width_over_in"]), float(r["key_width_to_in"]), float(r["keyseat_width_plus_in"]),
                  float(r["keyseat_depth_plus_in"]))
                 for _, r in _read_rows("keyseat_ansi_b17_1.csv", ("key_width_over_in", "key_width_to_in", "keyseat_width_plus_in", "keyseat_depth_plus_in")))


def din_depth_tolerance_m(shaft_diameter_m: float) -> float:
    """Tolerance (+) on the shaft keyseat depth t1 per DIN 6885-1 [m] (0.1 / 0.2 / 0.3 mm)."""
    d_mm = shaft_diameter_m * 1000.0
    for low, high, shaft_tol, _ in _din_depth_rows():
        if low < d_mm <= high + 1e-9:
            return shaft_tol / 1000.0
    return _din_depth_rows()[-1][2] / 1000.0 if d_mm > 1 else _din_depth_rows()[0][2] / 1000.0


def ansi_tolerances_m(key_width_m: float) -> tuple[float, float]:
    """(keyseat width plus, keyseat depth plus) [m] for an inch key of width ``key_width_m``
    (ANSI B17.1; from memory)."""
    w_in = key_width_m / 0.0254
    for low, high, width_plus, depth_plus in _ansi_rows():
        if low < w_in <= high + 1e-9:
            return width_plus * 0.0254, depth_plus * 0.0254
    last = _ansi_rows()[-1]
    return last[2] * 0.0254, last[3] * 0.0254


def keyseat(shaft_diameter_m: float, key_width_m: float, shaft_depth_m: float, standard: str,
            key_fit: str = "normal", length_m: float | None = None) -> dict:
    """The keyseat to cut: width with its class and limits, the micrometer reading across the
    keyseat (d - t1) with its tolerance, the hub's width class, the length [m].

    DIN 6885-1: shaft width H9 / N9 / P9 (free / normal / tight), hub D10 / JS9 / P9; depth t1
    +0.1/+0.2/+0.3 mm, so the reading d - t1 may be that much less (and never more). ANSI B17.1:
    width + tolerance / -0, depth +0.010 in; t1 is given at the side wall, so the reading across
    the keyseat is S = d - Y - t1 with the chordal height Y = (d - sqrt(d^2 - b^2)) / 2.
    """
    reading_depth = shaft_depth_m
    if standard == "ansi":
        # B17.1 states t1 at the side wall; the reading across the seat is S = d - Y - t1, Y the
        # chordal height of the seat's width (ANSI B17.1)
        from workbench.core.keyseat_factors import side_wall_to_centre_depth_m

        reading_depth = side_wall_to_centre_depth_m(shaft_diameter_m, key_width_m, shaft_depth_m)
        width_plus, depth_plus = ansi_tolerances_m(key_width_m)
        width_class, hub_class = "B17.1", "B17.1"
        width_max, width_min = key_width_m + width_plus, key_width_m
        hub_max, hub_min = width_max, width_min
        depth_tol = depth_plus
        source = "ANSI B17.1 (keyseat tolerances from memory)"
    else:
        shaft_cls, hub_cls = _DIN_KEY_WIDTH[key_fit]
        zone = limits(key_width_m, shaft_cls)
        hub = limits(key_width_m, hub_cls)
        width_class, hub_class = shaft_cls, hub_cls
        width_max, width_min, hub_max, hub_min = zone.max_m, zone.min_m, hub.max_m, hub.min_m
        depth_tol = din_depth_tolerance_m(shaft_diameter_m)
        source = "DIN 6885-1 (widths by ISO 286; depth tolerance from memory)"
    return {
        "standard": "ANSI B17.1" if standard == "ansi" else "DIN 6885-1",
        "key_fit": key_fit,
        "key_width_m": key_width_m,
        "width_class": width_class,
        "width_max_m": round(width_max, 12),
        "width_min_m": round(width_min, 12),
        "hub_width_class": hub_class,
        "hub_width_max_m": round(hub_max, 12),
        "hub_width_min_m": round(hub_min, 12),
        "shaft_depth_m": shaft_depth_m,
        "depth_m": round(shaft_diameter_m - reading_depth, 12),
        "depth_tolerance_m": depth_tol,
        "depth_note": (f"micrometer reading across the keyseat, {'d - Y - t1 (t1 at the side wall)' if standard == 'ansi' else 'd - t1'}"
                       ": may read up to the tolerance less, never more"),
        "reading_rule": "d - Y - t1" if standard == "ansi" else "d - t1",
        "length_m": length_m,
        "source": source,
    }
