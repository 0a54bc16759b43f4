"""ISO 286 limits against printed tables, and fits' clearances derived from them.

Sources (values transcribed by hand from the reproductions, never produced by the code):

- [DIN] "DIN ISO 286 ISO-Fundamental tolerances, Extract Part 2 for bores and shafts" (a
  supplier's extract of ISO 286-2, tolerance classes for bores D9 ... P9, sizes up to 250 mm):
  V via a reproduction.
- [JIS] JIS B 0401-2 (1999), "Dimensional tolerances for regularly used shaft fits", as printed
  in a cutting-tool maker's technical information pages. JIS B 0401 is the Japanese adoption of
  ISO 286 with identical values: V via a reproduction. (Its f8 upper value up to 3 mm reads -8,
  a misprint for -6; not used.)
- [H] ISO h-tolerance tables for bar stock h1-h9 up to 500 mm and h6-h12 up to 315 mm as printed
  in two suppliers' catalogues: V via a reproduction.
- [M] from memory (ISO 286-2 tables), marked per row.

Limits are in micrometres (upper, lower); tolerance 1e-9 um (the tables are exact to 0.5 um).
"""

from __future__ import annotations

import pytest

from workbench.core.fits import fit
from workbench.core.iso286 import ToleranceError, limits, tolerance_um

# (size mm, class, upper um, lower um, source)
HOLES = [
    (3, "D9", 45, 20, "DIN"), (6, "D9", 60, 30, "DIN"), (8, "D9", 76, 40, "DIN"), (18, "D9", 93, 50, "DIN"),
    (25, "D9", 117, 65, "DIN"), (40, "D9", 142, 80, "DIN"), (60, "D9", 174, 100, "DIN"), (100, "D9", 207, 120, "DIN"),
    (2, "E8", 28, 14, "DIN"), (25, "E8", 73, 40, "DIN"), (100, "E8", 126, 72, "DIN"), (200, "E8", 172, 100, "DIN"),
    (5, "F7", 22, 10, "DIN"), (12, "F7", 34, 16, "DIN"), (45, "F7", 50, 25, "DIN"), (150, "F7", 83, 43, "DIN"),
    (250, "F7", 96, 50, "DIN"),
    (10, "G6", 14, 5, "DIN"), (30, "G6", 20, 7, "DIN"), (80, "G6", 29, 10, "DIN"), (120, "G6", 34, 12, "DIN"),
    (9, "G7", 20, 5, "DIN"), (35, "G7", 34, 9, "DIN"), (190, "G7", 61, 15, "DIN"),
    (1, "H7", 10, 0, "DIN"), (40, "H7", 25, 0, "DIN"), (50, "H7", 25, 0, "DIN"), (50.5, "H7", 30, 0, "DIN"),
    (180, "H7", 40, 0, "DIN"), (16, "H8", 27, 0, "DIN"), (70, "H8", 46, 0, "DIN"), (230, "H9", 115, 0, "DIN"),
    (35, "H9", 62, 0, "DIN"), (4, "H10", 48, 0, "DIN"), (110, "H10", 140, 0, "DIN"), (28, "H11", 130, 0, "DIN"),
    (160, "H11", 250, 0, "DIN"),
    (2.5, "JS9", 12.5, -12.5, "DIN"), (15, "JS9", 21.5, -21.5, "DIN"), (90, "JS9", 43.5, -43.5, "DIN"),
    (2, "N9", -4, -29, "DIN"), (5, "N9", 0, -30, "DIN"), (10, "N9", 0, -36, "DIN"), (22, "N9", 0, -52, "DIN"),
    (60, "N9", 0, -74, "DIN"), (3, "P9", -6, -31, "DIN"), (10, "P9", -15, -51, "DIN"), (14, "P9", -18, -61, "DIN"),
    (42, "P9", -26, -88, "DIN"), (125, "P9", -43, -143, "DIN"), (250, "P9", -50, -165, "DIN"),
    # delta-rule holes and their exceptions, from memory (ISO 286-2 Tables 9-12)
    (35, "K6", 3, -13, "M"), (35, "K7", 7, -18, "M"), (100, "K6", 4, -18, "M"), (35, "M7", 0, -25, "M"),
    (35, "N7", -8, -33, "M"), (35, "P7", -17, -42, "M"), (35, "R7", -25, -50, "M"), (35, "S7", -34, -59, "M"),
    (300, "M6", -9, -41, "M"), (2, "K7", 0, -10, "M"), (35, "J7", 14, -11, "M"), (60, "J6", 13, -6, "M"),
    (60, "S7", -42, -72, "M"), (40, "U7", -51, -76, "M"), (100, "R7", -38, -73, "M"), (35, "N6", -12, -28, "M"),
    (35, "K8", 12, -27, "M"), (35, "M8", 5, -34, "M"), (35, "N8", -3, -42, "M"), (2, "N7", -4, -14, "M"),
]
SHAFTS = [
    (3, "b9", -140, -165, "JIS"), (3, "d9", -20, -45, "JIS"), (3, "e8", -14, -28, "JIS"), (3, "g6", -2, -8, "JIS"),
    (3, "js7", 5, -5, "JIS"), (3, "k6", 6, 0, "JIS"), (3, "m6", 8, 2, "JIS"), (3, "p6", 12, 6, "JIS"),
    (3, "s6", 20, 14, "JIS"), (3, "x6", 26, 20, "JIS"),
    (5, "c9", -70, -100, "JIS"), (5, "d8", -30, -48, "JIS"), (5, "f7", -10, -22, "JIS"), (5, "g5", -4, -9, "JIS"),
    (5, "js5", 2.5, -2.5, "JIS"), (5, "k5", 6, 1, "JIS"), (5, "r6", 23, 15, "JIS"), (5, "u6", 31, 23, "JIS"),
    (8, "e9", -25, -61, "JIS"), (8, "f8", -13, -35, "JIS"), (8, "h7", 0, -15, "JIS"), (8, "js6", 4.5, -4.5, "JIS"),
    (8, "m5", 12, 6, "JIS"), (8, "n6", 19, 10, "JIS"), (8, "x6", 43, 34, "JIS"),
    (12, "b9", -150, -193, "JIS"), (12, "e7", -32, -50, "JIS"), (12, "f6", -16, -27, "JIS"), (12, "k6", 12, 1, "JIS"),
    (12, "m6", 18, 7, "JIS"), (12, "p6", 29, 18, "JIS"), (12, "s6", 39, 28, "JIS"), (12, "x6", 51, 40, "JIS"),
    (16, "x6", 56, 45, "JIS"), (14, "js7", 9, -9, "JIS"),
    (20, "c9", -110, -162, "JIS"), (20, "d9", -65, -117, "JIS"), (20, "f7", -20, -41, "JIS"), (20, "g6", -7, -20, "JIS"),
    (20, "js6", 6.5, -6.5, "JIS"), (20, "k6", 15, 2, "JIS"), (20, "n6", 28, 15, "JIS"), (20, "r6", 41, 28, "JIS"),
    (20, "u6", 54, 41, "JIS"), (24, "x6", 67, 54, "JIS"), (28, "t6", 54, 41, "JIS"), (28, "u6", 61, 48, "JIS"),
    (28, "x6", 77, 64, "JIS"),
    (35, "b9", -170, -232, "JIS"), (35, "c9", -120, -182, "JIS"), (35, "d8", -80, -119, "JIS"),
    (35, "e9", -50, -112, "JIS"), (35, "f8", -25, -64, "JIS"), (35, "g5", -9, -20, "JIS"), (35, "h5", 0, -11, "JIS"),
    (35, "h9", 0, -62, "JIS"), (35, "js7", 12.5, -12.5, "JIS"), (35, "k5", 13, 2, "JIS"), (35, "k6", 18, 2, "JIS"),
    (35, "m6", 25, 9, "JIS"), (35, "n6", 33, 17, "JIS"), (35, "p6", 42, 26, "JIS"), (35, "r6", 50, 34, "JIS"),
    (35, "s6", 59, 43, "JIS"), (35, "t6", 64, 48, "JIS"), (40, "u6", 76, 60, "JIS"),
    (45, "b9", -180, -242, "JIS"), (45, "c9", -130, -192, "JIS"), (45, "t6", 70, 54, "JIS"), (45, "u6", 86, 70, "JIS"),
    (60, "b9", -190, -264, "JIS"), (60, "e7", -60, -90, "JIS"), (60, "f6", -30, -49, "JIS"), (60, "h8", 0, -46, "JIS"),
    (60, "js6", 9.5, -9.5, "JIS"), (60, "k6", 21, 2, "JIS"), (60, "m5", 24, 11, "JIS"), (60, "p6", 51, 32, "JIS"),
    (60, "r6", 60, 41, "JIS"), (60, "s6", 72, 53, "JIS"), (60, "u6", 106, 87, "JIS"), (70, "r6", 62, 43, "JIS"),
    (70, "s6", 78, 59, "JIS"),
    (450, "h9", 0, -155, "H"), (450, "h5", 0, -27, "H"), (350, "h7", 0, -57, "H"), (300, "h10", 0, -210, "H"),
    (300, "h11", 0, -320, "H"), (2, "h10", 0, -40, "H"), (150, "h1", 0, -3.5, "H"), (450, "h1", 0, -8, "H"),
    (40, "h3", 0, -4, "H"), (100, "h2", 0, -4, "H"), (200, "h4", 0, -14, "H"),
    # from memory (ISO 286-2 Tables 17-20)
    (35, "j6", 11, -5, "M"), (35, "j5", 6, -5, "M"), (35, "j7", 15, -10, "M"), (100, "k6", 25, 3, "M"),
    (200, "m6", 46, 17, "M"), (35, "f7", -25, -50, "M"), (400, "g6", -18, -54, "M"), (500, "f7", -68, -131, "M"),
]


@pytest.mark.parametrize("size_mm,name,upper_um,lower_um,source", HOLES + SHAFTS)
def test_limits_against_printed_tables(size_mm, name, upper_um, lower_um, source):
    zone = limits(size_mm / 1000.0, name)
    assert zone.upper_deviation_m * 1e6 == pytest.approx(upper_um, abs=1e-6), source
    assert zone.lower_deviation_m * 1e6 == pytest.approx(lower_um, abs=1e-6), source
    assert zone.max_m == pytest.approx((size_mm + upper_um / 1000.0) / 1000.0, abs=1e-12)
    assert zone.is_hole == name[0].isupper()


def test_the_reference_set_is_broad():
    """At least 60 pairs, shafts and holes, every grade 5-11, sizes spread up to 500 mm."""
    pairs = HOLES + SHAFTS
    assert len(pairs) >= 60
    grades = {int("".join(c for c in name if c.isdigit())) for _, name, *_ in pairs}
    assert set(range(5, 12)) <= grades
    assert max(size for size, *_ in pairs) >= 450 and min(size for size, *_ in pairs) <= 2


@pytest.mark.parametrize("edge_mm,name,lower_range,upper_range", [
    # a size equal to a range limit belongs to the lower range [JIS]/[DIN] values of both ranges
    (30.0, "f7", (-20, -41), (-25, -50)),     # 18-30 / 30-50 [JIS]
    (50.0, "k6", (18, 2), (21, 2)),           # 30-50 / 50-80 [JIS]
    (10.0, "N9", (0, -36), (0, -43)),          # 6-10 / 10-18 [DIN]
    (3.0, "P9", (-6, -31), (-12, -42)),        # up to 3 / 3-6 [DIN]
    (40.0, "u6", (76, 60), (86, 70)),          # intermediate step 30-40 / 40-50 [JIS]
    (18.0, "H7", (18, 0), (21, 0)),            # 10-18 / 18-30 [DIN]
    (120.0, "D9", (207, 120), (245, 145)),     # 80-120 / 120-180 [DIN]
])
def test_range_edges_belong_to_the_lower_range(edge_mm, name, lower_range, upper_range):
    at = limits(edge_mm / 1000.0, name)
    above = limits((edge_mm + 0.001) / 1000.0, name)
    assert (at.upper_deviation_m * 1e6, at.lower_deviation_m * 1e6) == pytest.approx(lower_range)
    assert (above.upper_deviation_m * 1e6, above.lower_deviation_m * 1e6) == pytest.approx(upper_range)


@pytest.mark.parametrize("grade,size_mm,it_um", [
    # ISO 286-1 Table 1 (IT values), [H] h-columns and [DIN] H-columns
    (5, 40, 11), (6, 40, 16), (7, 40, 25), (8, 40, 39), (9, 40, 62), (10, 40, 100), (11, 40, 160),
    (6, 2, 6), (11, 2, 60), (7, 300, 52), (9, 450, 155), (12, 300, 520),
])
def test_standard_tolerances(grade, size_mm, it_um):
    assert tolerance_um(grade, size_mm / 1000.0) == pytest.approx(it_um)


@pytest.mark.parametrize("size_mm,text,max_um,min_um,kind", [
    # clearances derived from the table values above (hole - shaft, in um)
    (40, "H7/k6", 25 - 2, 0 - 18, "transition"),     # [DIN] H7 +25/0, [JIS] k6 +18/+2
    (35, "H7/g6", 25 + 25, 0 + 9, "clearance"),      # [DIN] H7, [M] g6 -9/-25 (= [JIS] g6 30-50)
    (35, "H7/p6", 25 - 26, 0 - 42, "interference"),  # [JIS] p6 +42/+26
    (60, "H7/s6", 30 - 53, 0 - 72, "interference"),  # [DIN] H7 +30/0, [JIS] s6 +72/+53
    (20, "H7/f7", 21 + 41, 0 + 20, "clearance"),     # [DIN] H7 +21/0, [JIS] f7 -20/-41
    (12, "F7/h6", 34 + 11, 16 - 0, "clearance"),     # [DIN] F7 +34/+16, h6 0/-11
    (60, "H8/js6", 46 + 9.5, 0 - 9.5, "transition"),
])
def test_fit_clearances(size_mm, text, max_um, min_um, kind):
    result = fit(size_mm / 1000.0, text)
    assert result.max_clearance_m * 1e6 == pytest.approx(max_um, abs=1e-6)
    assert result.min_clearance_m * 1e6 == pytest.approx(min_um, abs=1e-6)
    assert result.kind == kind


@pytest.mark.parametrize("size_mm,name", [
    (35, "j9"), (35, "J5"), (20, "cd6"), (20, "t6"), (10, "v6"), (15, "y6"), (1, "a9"), (35, "K2"),
    (0, "h6"), (500.001, "h6"), (-3, "h6"),
])
def test_classes_not_defined_for_the_size(size_mm, name):
    with pytest.raises(ToleranceError):
        limits(size_mm / 1000.0, name)


@pytest.mark.parametrize("text", ["q6", "k", "6", "k0", "k19", "Hh7", "", "k 6 x", "js"])
def test_unknown_classes(text):
    with pytest.raises(ToleranceError):
        limits(0.035, text)


def test_fit_must_be_hole_over_shaft():
    with pytest.raises(ToleranceError):
        fit(0.04, "k6/H7")
    with pytest.raises(ToleranceError):
        fit(0.04, "H7")


# --------------------------------------------------------------------------- properties

from hypothesis import given, settings, strategies as st  # noqa: E402

from workbench.core.iso286 import HOLE_LETTERS, SHAFT_LETTERS  # noqa: E402


@settings(max_examples=300, deadline=None)
@given(size_mm=st.floats(min_value=0.01, max_value=500.0), letter=st.sampled_from(SHAFT_LETTERS + HOLE_LETTERS),
       grade=st.integers(min_value=1, max_value=18))
def test_every_class_is_defined_or_refused_and_lies_where_its_letter_says(size_mm, letter, grade):
    """ISO 286-1 zone positions: shafts a-h below the zero line (es <= 0), k-zc above it (ei >= 0);
    holes A-H above (EI >= 0); the zone's width is the grade's IT; JS/js symmetric."""
    try:
        zone = limits(size_mm / 1000.0, f"{letter}{grade}")
    except ToleranceError as err:
        assert "\n" not in str(err)
        return
    it = tolerance_um(grade, size_mm / 1000.0)
    assert zone.tolerance_m * 1e6 == pytest.approx(it, abs=1e-6)
    base = letter.lower()
    if base in ("a", "b", "c", "cd", "d", "e", "ef", "f", "fg", "g", "h"):
        if letter.islower():
            assert zone.upper_deviation_m <= 1e-12
        else:
            assert zone.lower_deviation_m >= -1e-12
    elif base in ("k", "m", "n", "p", "r", "s", "t", "u", "v", "x", "y", "z", "za", "zb", "zc") and letter.islower():
        assert zone.lower_deviation_m >= -1e-12
    if base == "js":
        assert zone.upper_deviation_m == pytest.approx(-zone.lower_deviation_m)


@settings(max_examples=100, deadline=None)
@given(size_mm=st.floats(min_value=1.0, max_value=500.0))
def test_shaft_letters_climb_from_a_to_zc(size_mm):
    """Fundamental deviations increase a -> h -> k -> zc (ISO 286-1, the position letters)."""
    order = ["a", "b", "c", "d", "e", "f", "g", "h", "k", "m", "n", "p", "r", "s", "u", "x", "z", "za", "zb", "zc"]
    edges = []
    for letter in order:
        try:
            zone = limits(size_mm / 1000.0, f"{letter}7")
        except ToleranceError:
            continue
        edges.append(zone.upper_deviation_m if letter in "abcdefgh" else zone.lower_deviation_m)
    assert edges == sorted(edges)
