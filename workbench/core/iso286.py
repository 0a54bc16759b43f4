"""ISO 286 limits of size: standard tolerance grades and fundamental deviations, computed.

Everything here is computed from the rules of ISO 286-1 (1988 / 2010 editions, same values):
the standard tolerance unit and grade multipliers for IT5-IT18, the IT1-IT4 rule, the rounding
rules, the fundamental-deviation formulas of shafts a...zc and the hole rules (A-H mirror a-h,
the delta rule for K, M, N and P-ZC with its exceptions, JS, tabulated J). Where a value computed
this way and the value printed in the ISO 286-2 tables differ, the printed table governs: those
cells are listed, with their source, in ``data/iso286_table_values.csv`` (as are the deviations
the standard gives only as a table: j, J, p and s up to 50 mm).

Sizes are in metres in and out (SI); the tables work in millimetres and micrometres internally.
Sizes from just above 0 up to 500 mm; a size equal to a range limit belongs to the lower range
("over 30 up to and including 50").

Public API::

    tolerance_um(grade, size_m) -> float                IT value [um]
    limits(size_m, class_text) -> Zone                  one tolerance class, e.g. "k6", "H7"
    parse_class(text) -> (letter, grade, is_hole)       raises ToleranceError
"""

from __future__ import annotations

import functools
import math
import re
from dataclasses import dataclass

MAX_SIZE_MM = 500.0

MAIN_STEPS_MM = (0.0, 3.0, 6.0, 10.0, 18.0, 30.0, 50.0, 80.0, 120.0, 180.0, 250.0, 315.0, 400.0, 500.0)
"""Limits of the main size ranges of ISO 286-1 Table 1 (up to 500 mm)."""

INTERMEDIATE_STEPS_MM = (0.0, 3.0, 6.0, 10.0, 14.0, 18.0, 24.0, 30.0, 40.0, 50.0, 65.0, 80.0, 100.0,
                         120.0, 140.0, 160.0, 180.0, 200.0, 225.0, 250.0, 280.0, 315.0, 355.0, 400.0,
                         450.0, 500.0)
"""Limits of the intermediate size ranges, used by the deviations a, b, c and r...zc."""

GRADE_MULTIPLIERS = {5: 7, 6: 10, 7: 16, 8: 25, 9: 40, 10: 64, 11: 100, 12: 160, 13: 250,
                     14: 400, 15: 640, 16: 1000, 17: 1600, 18: 2500}
"""IT = multiplier x i for grades 5-18 (ISO 286-1, Table of standard tolerance formulae)."""

SHAFT_LETTERS = ("a", "b", "c", "cd", "d", "e", "ef", "f", "fg", "g", "h", "js", "j", "k", "m", "n",
                 "p", "r", "s", "t", "u", "v", "x", "y", "z", "za", "zb", "zc")
HOLE_LETTERS = tuple(letter.upper() for letter in SHAFT_LETTERS)

_INTERMEDIATE_LETTERS = frozenset({"a", "b", "c", "r", "s", "t", "u", "v", "x", "y", "z", "za", "zb", "zc"})
_UPPER_LETTERS = frozenset({"a", "b", "c", "cd", "d", "e", "ef", "f", "fg", "g", "h"})  # es; the rest give ei
_SMALLEST_SIZE_MM = {"a": 1.0, "b": 1.0, "t": 24.0, "v": 14.0, "y": 18.0}  # not defined up to and incl.
_LARGEST_SIZE_MM = {"cd": 10.0, "ef": 10.0, "fg": 10.0}  # ISO 286-1 defines them only up to 10 mm
_J_GRADES = {"j": (5, 6, 7, 8), "J": (6, 7, 8)}
_CLASS_RE = re.compile(r"^\s*([A-Za-z]{1,2})\s*(\d{1,2})\s*$")


class ToleranceError(ValueError):
    """A tolerance class that is not an ISO 286 class, or not defined for the size; one line."""


@dataclass(frozen=True)
class Zone:
    """The limits of one tolerance class at one size [m].

    ``name`` is the class as ISO writes it (``k6``, ``H7``); deviations are from the nominal size.
    """

    size_m: float
    name: str
    is_hole: bool
    upper_deviation_m: float
    lower_deviation_m: float

    @property
    def max_m(self) -> float:
        return self.size_m + self.upper_deviation_m

    @property
    def min_m(self) -> float:
        return self.size_m + self.lower_deviation_m

    @property
    def tolerance_m(self) -> float:
        return self.upper_deviation_m - self.lower_deviation_m


# --------------------------------------------------------------------------- size ranges


def _range(size_mm: float, steps: tuple[float, ...]) -> tuple[float, float]:
    """The (over, up to and including) range of ``steps`` that holds ``size_mm``."""
    if not 0.0 < size_mm <= MAX_SIZE_MM:
        raise ToleranceError(f"{size_mm:g} mm is outside ISO 286's range (over 0 up to 500 mm)")
    for low, high in zip(steps, steps[1:]):
        if size_mm <= high + 1e-9:
            return low, high
    raise AssertionError("unreachable")  # pragma: no cover


def _mean_mm(low: float, high: float) -> float:
    """Geometric mean D of a size range [mm]; the first range (up to 3 mm) uses 1 and 3 mm
    (ISO 286-1, clause on the standard tolerance unit)."""
    return math.sqrt(max(low, 1.0) * high)


# --------------------------------------------------------------------------- rounding


def _round_to(value: float, step: float) -> float:
    """Round half away from zero to a multiple of ``step``."""
    return math.floor(abs(value) / step + 0.5) * step * (1 if value >= 0 else -1)


def _round_it(value_um: float) -> float:
    """Rounding of computed IT5-IT18 values up to 500 mm, after the rounding table for standard
    tolerances of ISO 286-1:1988 (from memory): multiples of 1 um up to 100, 5 up to 200, 10 up to
    1000, 50 up to 2000, 100 up to 5000, 200 beyond. Where this and the printed Table 1 differ, the
    table row in data/iso286_table_values.csv governs."""
    for limit, step in ((100.0, 1.0), (200.0, 5.0), (1000.0, 10.0), (2000.0, 50.0), (5000.0, 100.0)):
        if value_um <= limit:
            return _round_to(value_um, step)
    return _round_to(value_um, 200.0)


def _round_it_fine(value_um: float) -> float:
    """Rounding of computed IT1-IT4 values: 0.1 um up to 1.2 um, 0.5 um up to 3 um, 1 um above
    (the printed ISO 286-1 Table 1 values, which govern, are kept in the table file)."""
    if value_um <= 1.2:
        return _round_to(value_um, 0.1)
    if value_um <= 3.0:
        return _round_to(value_um, 0.5)
    return _round_to(value_um, 1.0)


def _round_deviation(value_um: float) -> float:
    """Rounding of computed fundamental deviations, after the rounding table for fundamental
    deviations of ISO 286-1:1988 (sizes up to 500 mm; from memory): 1 um up to 45, 2 um up to 80,
    5 um up to 180, 10 um up to 560, 20 um up to 800, 50 um up to 2000, 100 um beyond."""
    magnitude = abs(value_um)
    for limit, step in ((45.0, 1.0), (80.0, 2.0), (180.0, 5.0), (560.0, 10.0), (800.0, 20.0), (2000.0, 50.0)):
        if magnitude <= limit:
            return math.copysign(_round_to(magnitude, step), value_um)
    return math.copysign(_round_to(magnitude, 100.0), value_um)


# --------------------------------------------------------------------------- table values


@functools.cache
def _table_values() -> dict[tuple[str, str, float, float], float]:
    """Printed ISO 286 values keyed by (quantity, symbol, over_mm, to_mm) -> um, from
    ``data/iso286_table_values.csv`` (quantity: IT, shaft or hole)."""
    from workbench.core.tables import _read_rows

    out = {}
    for _, row in _read_rows("iso286_table_values.csv", ("quantity", "symbol", "over_mm", "to_mm", "value_um")):
        key = (row["quantity"], row["symbol"], float(row["over_mm"]), float(row["to_mm"]))
        out[key] = float(row["value_um"])
    return out


def _table(quantity: str, symbol: str, low: float, high: float) -> float | None:
    return _table_values().get((quantity, symbol, low, high))


# --------------------------------------------------------------------------- standard tolerances


def tolerance_unit_um(d_mm: float) -> float:
    """Standard tolerance unit i = 0.45 D^(1/3) + 0.001 D  [um], D the range's geometric mean [mm]
    (ISO 286-1, formula for grades IT5-IT18 up to 500 mm)."""
    return 0.45 * d_mm ** (1.0 / 3.0) + 0.001 * d_mm


def computed_tolerance_um(grade: int, low_mm: float, high_mm: float) -> float:
    """IT value of ``grade`` for the main range (low, high] by the ISO 286-1 rules, rounded [um].

    IT5-IT10: multiplier x i (i on the range's geometric mean). IT11-IT18 follow the R5 series of
    preferred numbers the multipliers come from: ten times the grade five finer (IT11 = 10 x IT6,
    the multipliers 100 = 10 x 10; so the table's rounding carries over). IT1 = 0.8 + 0.020 D; IT2,
    IT3, IT4 lie in geometric progression between IT1 and IT5 (ISO 286-1, clause on grades IT1 to
    IT4).
    """
    d = _mean_mm(low_mm, high_mm)
    if grade >= 11:  # R5 progression: each five grades coarser is ten times wider (IT11 = 10 x IT6)
        return 10.0 * _tolerance_in_range_um(grade - 5, low_mm, high_mm)
    if grade >= 5:
        return _round_it(GRADE_MULTIPLIERS[grade] * tolerance_unit_um(d))
    it1 = 0.8 + 0.020 * d
    if grade == 1:
        return _round_it_fine(it1)
    it5 = GRADE_MULTIPLIERS[5] * tolerance_unit_um(d)
    return _round_it_fine(it1 * (it5 / it1) ** ((grade - 1) / 4.0))


def _tolerance_in_range_um(grade: int, low: float, high: float) -> float:
    printed = _table("IT", str(grade), low, high)
    return printed if printed is not None else computed_tolerance_um(grade, low, high)


def tolerance_um(grade: int, size_m: float) -> float:
    """Standard tolerance IT``grade`` [um] at ``size_m`` (grades 1-18, sizes over 0 up to 500 mm);
    the printed ISO 286-1 Table 1 value where it differs from the computed one."""
    if grade not in range(1, 19):
        raise ToleranceError(f"tolerance grade {grade} is not one of ISO 286's grades 1-18")
    low, high = _range(size_m * 1000.0, MAIN_STEPS_MM)
    if grade >= 14 and high <= 3.0 and size_m * 1000.0 <= 1.0:
        raise ToleranceError(f"ISO 286 gives no IT{grade} for sizes up to 1 mm")
    return _tolerance_in_range_um(grade, low, high)


# --------------------------------------------------------------------------- shaft deviations


def _computed_shaft_um(letter: str, grade: int, low: float, high: float) -> float:
    """Fundamental deviation of shaft ``letter`` for the range (low, high] by the ISO 286-1
    formulas (Table of formulae for fundamental deviations of shafts), signed, rounded [um]:
    es for a-h (negative), ei for k-zc (positive)."""
    d = _mean_mm(low, high)
    main_low, main_high = _range(high, MAIN_STEPS_MM)

    def it(g: int) -> float:
        return _tolerance_in_range_um(g, main_low, main_high)

    if letter == "a":
        value = -(265 + 1.3 * d) if d <= 120 else -3.5 * d
    elif letter == "b":
        value = -(140 + 0.85 * d) if d <= 160 else -1.8 * d
    elif letter == "c":
        value = -52 * d ** 0.2 if d <= 40 else -(95 + 0.8 * d)
    elif letter == "cd":
        value = -math.sqrt(_shaft_um("c", grade, low, high) * _shaft_um("d", grade, low, high))
    elif letter == "d":
        value = -16 * d ** 0.44
    elif letter == "e":
        value = -11 * d ** 0.41
    elif letter == "ef":
        value = -math.sqrt(_shaft_um("e", grade, low, high) * _shaft_um("f", grade, low, high))
    elif letter == "f":
        value = -5.5 * d ** 0.41
    elif letter == "fg":
        value = -math.sqrt(_shaft_um("f", grade, low, high) * _shaft_um("g", grade, low, high))
    elif letter == "g":
        value = -2.5 * d ** 0.34
    elif letter == "h":
        value = 0.0
    elif letter == "k":
        value = 0.6 * d ** (1.0 / 3.0) if 4 <= grade <= 7 else 0.0
    elif letter == "m":
        return it(7) - it(6)
    elif letter == "n":
        value = 5 * d ** 0.34
    elif letter == "r":
        value = math.sqrt(_shaft_um("p", grade, low, high) * _shaft_um("s", grade, low, high))
    elif letter == "s":  # up to 50 mm IT8 + 1 to 4: tabulated
        value = it(7) + 0.4 * d
    elif letter in ("t", "u", "v", "x", "y", "z"):
        factor = {"t": 0.63, "u": 1.0, "v": 1.25, "x": 1.6, "y": 2.0, "z": 2.5}[letter]
        value = it(7) + factor * d
    elif letter == "za":
        value = it(8) + 3.15 * d
    elif letter == "zb":
        value = it(9) + 4.0 * d
    elif letter == "zc":
        value = it(10) + 5.0 * d
    else:  # p (IT7 + 0 to 5), and j: only tabulated
        raise ToleranceError(f"ISO 286 tabulates {letter} for {low:g}-{high:g} mm; no value in the table file")
    return _round_deviation(value)


def _deviation_key(letter: str, grade: int) -> str:
    return f"{letter}{grade}" if letter in ("j", "J") else letter


def _shaft_um(letter: str, grade: int, low: float, high: float) -> float:
    """Signed fundamental deviation of a shaft [um], printed value first, then the formula.
    Note k: the printed value for grades 4-7; other grades give 0 (handled by the caller)."""
    if letter == "k" and not 4 <= grade <= 7:
        return 0.0
    if letter not in _INTERMEDIATE_LETTERS:
        low, high = _range(high, MAIN_STEPS_MM)
    printed = _table("shaft", _deviation_key(letter, grade), low, high)
    return printed if printed is not None else _computed_shaft_um(letter, grade, low, high)


def _delta_um(grade: int, size_mm: float) -> float:
    """Delta = IT(n) - IT(n-1) for grades 3-8 (ISO 286-1, holes K-ZC); 0 up to 3 mm."""
    low, high = _range(size_mm, MAIN_STEPS_MM)
    if high <= 3.0:
        return 0.0
    return _tolerance_in_range_um(grade, low, high) - _tolerance_in_range_um(grade - 1, low, high)


def _steps_for(letter: str) -> tuple[float, ...]:
    return INTERMEDIATE_STEPS_MM if letter.lower() in _INTERMEDIATE_LETTERS else MAIN_STEPS_MM


# --------------------------------------------------------------------------- classes


def parse_class(text: str) -> tuple[str, int, bool]:
    """Read a tolerance class such as ``k6``, ``H7``, ``js5``, ``ZC11``: (letter, grade, is_hole).

    The case of the letter says shaft (lower) or hole (upper), as ISO writes them.
    """
    match = _CLASS_RE.match(str(text))
    if not match:
        raise ToleranceError(f"{str(text).strip()!r} is not a tolerance class (e.g. k6, h7, H7, js6)")
    letters, grade = match[1], int(match[2])
    if letters in SHAFT_LETTERS:
        is_hole = False
    elif letters in HOLE_LETTERS:
        is_hole = True
    else:
        raise ToleranceError(f"{letters!r} is not an ISO 286 deviation letter (shafts a...zc, holes A...ZC)")
    if not 1 <= grade <= 18:
        raise ToleranceError(f"grade {grade} in {letters}{grade} is not one of ISO 286's grades 1-18")
    return letters, grade, is_hole


@functools.lru_cache(maxsize=4096)  # a pure table look-up; a job asks for the same few many times
def limits(size_m: float, class_text: str) -> Zone:
    """The limits of tolerance class ``class_text`` at nominal size ``size_m`` [m].

    Raises ToleranceError (one line) for an unknown class, a size outside 0-500 mm, or a class
    ISO 286 does not define for that size (j/J outside their grades, cd/ef/fg above 10 mm, t up to
    24 mm, v up to 14 mm, y up to 18 mm, a/b up to 1 mm, K-ZC delta classes below grade 3).
    """
    letters, grade, is_hole = parse_class(class_text)
    name = f"{letters}{grade}"
    if not math.isfinite(size_m) or not 0.0 < size_m <= MAX_SIZE_MM / 1000.0 + 1e-12:
        raise ToleranceError(f"{size_m * 1000:g} mm is outside ISO 286's range (over 0 up to 500 mm)")
    size_mm = size_m * 1000.0
    it = tolerance_um(grade, size_m)
    base = letters.lower()
    if base in _SMALLEST_SIZE_MM and size_mm <= _SMALLEST_SIZE_MM[base] + 1e-9:
        raise ToleranceError(f"ISO 286 does not define {name} for sizes up to {_SMALLEST_SIZE_MM[base]:g} mm")
    if base in _LARGEST_SIZE_MM and size_mm > _LARGEST_SIZE_MM[base] + 1e-9:
        raise ToleranceError(f"ISO 286 defines {name} only up to {_LARGEST_SIZE_MM[base]:g} mm")
    if base == "j" and grade not in _J_GRADES[letters] or (letters == "j" and grade == 8 and size_mm > 3.0):
        allowed = "5-7 (j8 up to 3 mm)" if letters == "j" else "6-8"
        raise ToleranceError(f"ISO 286 tabulates {letters} only in grades {allowed}, not {name} at {size_mm:g} mm")
    low, high = _range(size_mm, _steps_for(letters))
    upper, lower = (_hole_um if is_hole else _shaft_limits_um)(letters, grade, low, high, size_mm, it)
    return Zone(size_m, name, is_hole, round(upper * 1e-6, 12) + 0.0, round(lower * 1e-6, 12) + 0.0)  # no -0.0


def _shaft_limits_um(letter, grade, low, high, size_mm, it) -> tuple[float, float]:
    if letter == "js":
        return it / 2.0, -it / 2.0
    if letter == "j":
        ei = _shaft_um("j", grade, low, high)
        return ei + it, ei
    deviation = _shaft_um(letter, grade, low, high)
    if letter in _UPPER_LETTERS:
        return deviation, deviation - it
    return deviation + it, deviation


def _hole_um(letters, grade, low, high, size_mm, it) -> tuple[float, float]:
    """Hole limits by ISO 286-1's hole rules [um] (upper ES, lower EI).

    A-H: EI = -es of the same shaft letter. JS: +/- IT/2. J: tabulated ES. K, M, N up to IT8 and
    P-ZC up to IT7: ES = -ei + delta. K and N above IT8: ES = 0 (N up to 3 mm: -4 um, the table);
    M above IT8 and P-ZC above IT7: ES = -ei. Special case: M6 over 250 up to 315 mm, ES = -9 um.
    """
    shaft = letters.lower()
    if letters == "JS":
        return it / 2.0, -it / 2.0
    if letters == "J":
        es = _table("hole", f"J{grade}", *_range(size_mm, MAIN_STEPS_MM))
        if es is None:
            raise ToleranceError(f"no printed value for J{grade} at {size_mm:g} mm in the table file")
        return es, es - it
    if shaft in _UPPER_LETTERS:
        ei = -_shaft_um(shaft, grade, low, high)
        return ei + it, ei
    printed = _table("hole", f"{letters}{grade}", low, high)
    if printed is not None:
        return printed, printed - it
    delta_limit = 8 if letters in ("K", "M", "N") else 7
    if grade <= delta_limit and grade < 3:
        raise ToleranceError(f"ISO 286 gives {letters}{grade} no delta value (grades 3 and up)")
    ei_shaft = _shaft_um(shaft, 6 if shaft == "k" else grade, low, high)
    if grade <= delta_limit:
        es = -ei_shaft + _delta_um(grade, size_mm)
    elif letters in ("K", "N"):
        es = -4.0 if letters == "N" and high <= 3.0 else 0.0
    else:
        es = -ei_shaft
    return es, es - it
