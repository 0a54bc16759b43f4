"""The keyseat at the checked section: its size as read, what is refused, and the factors used.

The handbook's keyseat factors (Shigley's Mechanical Engineering Design, 9th ed., Table 7-1:
end-mill keyseat Kt 2.14, Kts 3.0) hold for the STANDARD keyseat (DIN 6885-1 / ANSI B17.1) in a
SOLID round. Two cases lie outside them and are handled by the rule below (ours, stated):

Ligament rule for a keyed tube (ligament = wall left under the keyseat bottom, at the centreline):
  - ligament <= 0: refused, the keyseat reaches the bore;
  - ligament < 0.25 x keyseat depth: refused, too thin to hold a key (and beyond a 2-D check);
  - 0.25 x depth <= ligament < 1 x depth (thin): the handbook factors are scaled by the numerical
    solver's ratio Kts(this keyed tube) / Kts(solid round of the same outside diameter with its
    standard keyseat), never below the handbook's;
  - ligament >= 1 x depth (sound): the standard keyseat is checked with the handbook factors.
Non-standard keyseat (``keyseat WxD``, or a key size not standard for the diameter): the handbook
factors are scaled by the solver's ratio Kts(actual seat) / Kts(standard seat of the diameter),
never below 1. A seat deeper than 0.25 d or wider than 0.45 d (beyond the deepest/widest standard
seat: DIN 6885-1 4x4 in a 10 mm shaft has t1/d = 0.25, 5x5 in 12 mm b/d = 0.42) is refused.
The bending factor Kt is scaled by the same ratio (our assumption; the solver is torsional only).
"""

from __future__ import annotations

import csv
import math
from dataclasses import dataclass
from functools import cache, lru_cache

from workbench.core.geometry import ShaftGeometry

DEEPEST_SEAT_PER_D = 0.25
WIDEST_SEAT_PER_D = 0.45
SOUND_LIGAMENT_PER_DEPTH = 1.0
THINNEST_LIGAMENT_PER_DEPTH = 0.25


class KeyseatRefused(ValueError):
    """A keyseat that cannot be checked (cuts through, too deep, no standard key): one line."""


@dataclass(frozen=True)
class KeyseatReading:
    """The keyseat as checked [m]: width, depth at the centreline, bottom radius; the standard seat
    of the diameter (None outside the key table); the wall left under it (tubes, else None); the
    case of the rule ("standard", "non-standard", "sound", "thin")."""

    width_m: float
    depth_m: float
    radius_m: float
    standard: tuple[float, float] | None
    ligament_m: float | None
    case: str


@cache
def _radii() -> tuple[tuple[str, float, float, float], ...]:
    from workbench.core.tables import data_dir

    with (data_dir() / "keyseat_radii.csv").open(newline="", encoding="utf-8") as fh:
        return tuple((r["standard"], float(r["key_width_over_mm"]) / 1e3, float(r["key_width_to_mm"]) / 1e3,
                      float(r["radius_min_mm"]) / 1e3) for r in csv.DictReader(fh))


def default_keyseat_radius_m(width_m: float, standard: str) -> float:
    """Keyseat bottom radius [m] when none is given: the smallest radius the key standard allows for
    the key width (DIN 6885-1 r1 min; ANSI B17.1 suggested fillet; data/keyseat_radii.csv, from
    memory), never more than a quarter of the width. The smaller radius gives the higher (safe) Kts."""
    rows = [r for r in _radii() if r[0] == standard]
    for _, over, to, radius in rows:
        if over < width_m <= to + 1e-12:
            return min(radius, width_m / 4.0)
    return min(rows[-1][3] if width_m > rows[-1][2] else rows[0][3], width_m / 4.0)


def side_wall_to_centre_depth_m(diameter_m: float, width_m: float, side_depth_m: float) -> float:
    """Keyseat depth at the centreline [m] from the depth at its side wall (ANSI B17.1 measures the
    shaft keyseat depth at the side wall): + the chordal height r - sqrt(r^2 - (b/2)^2) (geometry)."""
    r = diameter_m / 2.0
    return side_depth_m + r - math.sqrt(max(r * r - width_m * width_m / 4.0, 0.0))


def centre_to_side_wall_depth_m(diameter_m: float, width_m: float, centre_depth_m: float) -> float:
    """Keyseat depth at its side wall [m] from the depth at the centreline: the inverse of
    :func:`side_wall_to_centre_depth_m` (ANSI B17.1 gives the depth at the side wall)."""
    r = diameter_m / 2.0
    return centre_depth_m - (r - math.sqrt(max(r * r - width_m * width_m / 4.0, 0.0)))


def stated_depth_m(diameter_m: float, width_m: float, geometry_depth_m: float, table_depth_m: float,
                    standard: str) -> float:
    """The shaft keyseat depth t1 [m] as its standard states it, one rule for every spelling:
    ANSI B17.1 at the side wall, DIN 6885-1 as listed. ``geometry_depth_m`` is a typed seat's
    centreline depth (0 when the seat comes from the key table, whose ``table_depth_m`` is already
    stated the standard's way)."""
    if not geometry_depth_m:
        return table_depth_m
    if standard == "ansi":
        return centre_to_side_wall_depth_m(diameter_m, width_m, geometry_depth_m)
    return geometry_depth_m


def standard_seat_m(diameter_m: float, standard: str) -> tuple[float, float] | None:
    """(width, centreline depth) [m] of the standard keyseat for the diameter, or None off the table."""
    from workbench.core.tables import key_for_diameter

    row = key_for_diameter(diameter_m, standard)
    if row is None:
        return None
    depth = row.shaft_depth_m
    if standard == "ansi":
        depth = side_wall_to_centre_depth_m(diameter_m, row.width_m, depth)
    return row.width_m, depth


def _nearest_standard(diameter_m: float, standard: str) -> tuple[float, float]:
    """The standard seat of the nearest listed diameter, scaled in proportion to this diameter."""
    from workbench.core.tables import key_sizes

    rows = key_sizes(standard)
    row, ref_d = (rows[0], rows[0].shaft_over_m) if diameter_m <= rows[0].shaft_over_m else (rows[-1], rows[-1].shaft_to_m)
    scale = diameter_m / ref_d
    seat = standard_seat_m(ref_d * (1 - 1e-6) if row is rows[-1] else row.shaft_to_m, standard)
    return seat[0] * scale, seat[1] * scale


@lru_cache(maxsize=512)  # pure in the frozen geometry; a refusal is raised anew each time
def read_keyseat(geometry: ShaftGeometry) -> KeyseatReading:
    """The keyseat of a keyed round or tube as it will be checked; raises KeyseatRefused."""
    g = geometry
    d = g.size_m
    std = standard_seat_m(d, g.key_standard)
    if g.key_width_m > 0 and g.key_depth_m > 0:
        width, depth = g.key_width_m, g.key_depth_m
    elif std is None:
        name = "DIN 6885-1" if g.key_standard == "iso" else "ANSI B17.1"
        raise KeyseatRefused(f"no {name} key is listed for a {d * 1e3:.4g} mm shaft; give the keyseat, "
                             "e.g. 'keyseat 32x11mm' (width x depth)")
    else:
        width, depth = std
    if depth > DEEPEST_SEAT_PER_D * d * (1 + 1e-9):
        raise KeyseatRefused(f"a keyseat {depth * 1e3:.3g} mm deep in a {d * 1e3:.4g} mm shaft is deeper than any "
                             f"standard seat ({DEEPEST_SEAT_PER_D:g} d); check the key size (key BxH is the key, "
                             "keyseat WxD the seat)")
    if width > WIDEST_SEAT_PER_D * d * (1 + 1e-9):
        raise KeyseatRefused(f"a keyseat {width * 1e3:.3g} mm wide in a {d * 1e3:.4g} mm shaft is wider than any "
                             f"standard seat ({WIDEST_SEAT_PER_D:g} d)")
    chord = d / 2.0 - math.sqrt(max(d * d / 4.0 - width * width / 4.0, 0.0))
    if depth <= chord * (1 + 1e-6):
        raise KeyseatRefused(f"a keyseat {width * 1e3:.3g} mm wide and {depth * 1e3:.3g} mm deep does not reach below "
                             f"the round's edge ({chord * 1e3:.2g} mm at its side walls); check the size")
    radius = g.key_radius_m or default_keyseat_radius_m(width, g.key_standard)
    standard = std is not None and abs(width - std[0]) < 1e-7 and abs(depth - std[1]) < 1e-7
    ligament = None
    case = "standard" if standard else "non-standard"
    if g.profile == "tube":
        ligament = d / 2.0 - depth - g.second_m / 2.0
        if ligament <= 0:
            raise KeyseatRefused(f"the keyseat ({depth * 1e3:.3g} mm deep) reaches the bore: the wall is only "
                                 f"{(d - g.second_m) / 2 * 1e3:.3g} mm; this tube cannot be keyed")
        if ligament < THINNEST_LIGAMENT_PER_DEPTH * depth:
            raise KeyseatRefused(f"the keyseat leaves {ligament * 1e3:.2g} mm of wall under it (less than a quarter of "
                                 f"its {depth * 1e3:.3g} mm depth); this tube cannot be keyed")
        if ligament < SOUND_LIGAMENT_PER_DEPTH * depth:
            case = "thin"
        elif standard:
            case = "sound"
    return KeyseatReading(width, depth, radius, std, ligament, case)


def _solver_kts(geometry: ShaftGeometry) -> float:
    """Peak shear by the torsion solver / nominal shear of the plain section [-]."""
    from workbench.core.sections import round_properties, tube_properties
    from workbench.core.torsion_solver import solve_torsion

    g = geometry
    nominal = tube_properties(g.size_m, g.second_m)[2] if g.profile == "tube" else round_properties(g.size_m)[2]
    return solve_torsion(g).shear_per_torque_Pa_per_Nm / nominal


def keyseat_scale(geometry: ShaftGeometry) -> tuple[float, KeyseatReading, str]:
    """(factor on the handbook Kt/Kts >= 1, the reading, basis text) for a keyed round or tube."""
    reading = read_keyseat(geometry)
    if reading.case in ("standard", "sound"):
        return 1.0, reading, "handbook factor, standard keyseat" + (" in a sound wall" if reading.case == "sound" else "")
    from dataclasses import replace

    d = geometry.size_m
    ref_w, ref_d = reading.standard or _nearest_standard(d, geometry.key_standard)
    actual = replace(geometry, key_width_m=reading.width_m, key_depth_m=reading.depth_m, key_radius_m=reading.radius_m)
    reference = ShaftGeometry("round", d, keyed=True, key_standard=geometry.key_standard, key_width_m=ref_w,
                              key_depth_m=ref_d, key_radius_m=default_keyseat_radius_m(ref_w, geometry.key_standard))
    ratio = _solver_kts(actual) / _solver_kts(reference)
    what = "thin wall under the keyseat" if reading.case == "thin" else "non-standard keyseat"
    return max(1.0, ratio), reading, (f"handbook factor x {max(1.0, ratio):.2f} ({what}: solver Kts ratio "
                                      f"{ratio:.2f} to the standard seat in a solid round, floor 1)")
