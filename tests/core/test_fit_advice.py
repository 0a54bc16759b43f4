"""Recommended classes, bearings by designation, keyseats and the turning sheet's rows.

Check values (marked):
- DIN 6885-1 keyseat widths (V via a reproduction for the ISO 286 classes: [DIN] "DIN ISO 286
  extract" prints N9, JS9, P9 per size range; D10 and H9 from ISO 286-2, from memory): 12 mm key
  (38-44 mm shaft): N9 0/-43 um, JS9 +/-21.5, P9 -18/-61, H9 +43/0, D10 +120/+50. 10 mm key:
  N9 0/-36, JS9 +/-18, P9 -15/-51, D10 +98/+40 (from memory, DIN 6885-1 table of keyseat widths).
- DIN 6885-1 depth t1: 10 x 8 key t1 = 5.0 mm +0.2 (shaft 30-38 mm; t1 V in shop data, tolerance
  from memory); 5 x 5 key t1 = 3.0 mm +0.1.
- ANSI B17.1: 1/4 in key, keyseat width +0.002/-0 in, depth +0.010 in (from memory).
- ISO 15 / catalogue dimensions (from memory): 6207 35x72x17 r1.1; 6208 40x80x18 r1.1;
  22210 50x90x23 r1.1; 6308 40x90x23 r1.5. ISO 492 Normal bore 30-50 mm: 0/-12 um (from memory).
- Recommendations: common practice (makers' general guidance), see workbench/core/fit_advice.py.
"""

from __future__ import annotations

import pytest

from workbench.core import fit_advice
from workbench.core.bearings import BearingError, bearing
from workbench.core.turning import TurningOptions, turning_sheet, uniform_steps


@pytest.mark.parametrize("designation,d,D,B,r", [
    ("6207", 35, 72, 17, 1.1), ("6208-2RS", 40, 80, 18, 1.1), ("22210 E", 50, 90, 23, 1.1),
    ("6308", 40, 90, 23, 1.5), ("6004", 20, 42, 12, 0.6), ("NU208", 40, 80, 18, 1.1),
])
def test_bearing_dimensions(designation, d, D, B, r):
    b = bearing(designation)
    assert (b.bore_m, b.outside_m, b.width_m, b.corner_radius_m) == pytest.approx((d / 1e3, D / 1e3, B / 1e3, r / 1e3))


def test_bearing_bore_tolerance_iso492_normal():
    assert bearing("6207").bore_lower_deviation_m == pytest.approx(-12e-6)   # 30-50 mm
    assert bearing("6210").bore_lower_deviation_m == pytest.approx(-12e-6)   # 50 mm belongs to 30-50
    assert bearing("6211").bore_lower_deviation_m == pytest.approx(-15e-6)   # 55 mm: 50-80


@pytest.mark.parametrize("text", ["", "abc", "6299", "7", "62-07"])
def test_bad_designations(text):
    with pytest.raises(BearingError):
        bearing(text)


def test_recommendations_differ_where_they_must():
    d = 0.040
    pressed = fit_advice.journal_class(d).cls
    assert pressed == "k6"
    assert fit_advice.journal_class(d, mounting="adapter-sleeve").cls == "h9"
    assert fit_advice.journal_class(d, mounting="insert").cls == "h8"
    assert fit_advice.journal_class(d, mounting="insert", load="heavy").cls == "h7"
    assert fit_advice.journal_class(d, rotating="outer").cls == "g6"
    assert fit_advice.journal_class(d, load="light").cls == "k5"
    assert fit_advice.journal_class(d, load="heavy").cls == "m6"
    assert fit_advice.journal_class(0.015).cls == "js5"          # small ball bearing
    assert fit_advice.journal_class(0.150).cls == "m6"           # 100-200 mm
    assert fit_advice.journal_class(0.060, roller=True).cls == "m6"  # roller one step tighter
    assert fit_advice.seat_class("coupling").cls == "k6"
    assert fit_advice.seat_class("vbelt").cls == "j6"
    assert fit_advice.seat_class("vbelt", "heavy").cls == "k6"


def test_bearing_fit_uses_the_bearing_bore_not_a_hole_class():
    # 40 k6 (+18/+2, [JIS]) in a 40 mm bore 0/-12: interference 2+0 ... 18+12 um
    f = fit_advice.bearing_fit(0.040, 0.0, -12e-6, "k6")
    assert f["min_clearance_m"] == pytest.approx(-30e-6, abs=1e-12)
    assert f["max_clearance_m"] == pytest.approx(-2e-6, abs=1e-12)
    assert f["kind"] == "interference"   # against H7 the same k6 would be a transition fit


@pytest.mark.parametrize("fit,cls,hub,upper_um,lower_um,hub_upper_um,hub_lower_um", [
    ("normal", "N9", "JS9", 0, -43, 21.5, -21.5),
    ("tight", "P9", "P9", -18, -61, -18, -61),
    ("free", "H9", "D10", 43, 0, 120, 50),
])
def test_din_keyseat_widths_12mm_key(fit, cls, hub, upper_um, lower_um, hub_upper_um, hub_lower_um):
    k = fit_advice.keyseat(0.040, 0.012, 0.005, "iso", fit)
    assert (k["width_class"], k["hub_width_class"]) == (cls, hub)
    assert k["width_max_m"] == pytest.approx(0.012 + upper_um * 1e-6, abs=1e-12)
    assert k["width_min_m"] == pytest.approx(0.012 + lower_um * 1e-6, abs=1e-12)
    assert k["hub_width_max_m"] == pytest.approx(0.012 + hub_upper_um * 1e-6, abs=1e-12)
    assert k["hub_width_min_m"] == pytest.approx(0.012 + hub_lower_um * 1e-6, abs=1e-12)


def test_din_keyseat_depth_reading():
    k = fit_advice.keyseat(0.035, 0.010, 0.005, "iso")   # 10 x 8 key, t1 = 5.0 +0.2
    assert k["depth_m"] == pytest.approx(0.030)
    assert k["depth_tolerance_m"] == pytest.approx(0.0002)
    assert fit_advice.keyseat(0.015, 0.005, 0.003, "iso")["depth_tolerance_m"] == pytest.approx(0.0001)


def test_ansi_keyseat():
    k = fit_advice.keyseat(1.0 * 0.0254, 0.25 * 0.0254, 0.125 * 0.0254, "ansi")
    assert k["width_max_m"] - k["width_min_m"] == pytest.approx(0.002 * 0.0254)
    assert k["depth_tolerance_m"] == pytest.approx(0.010 * 0.0254)
    # ANSI B17.1: t1 at the side wall, S = D - Y - h/2, Y = (D - sqrt(D^2 - W^2))/2: D = 1 in,
    # W = h = 1/4 in -> S = 0.8591 in (the standard's table: 0.859 in, from memory); +-0.0005 in
    assert k["depth_m"] / 0.0254 == pytest.approx(0.8591, abs=0.0005)


def test_uniform_sheet_rows_and_fillet_window():
    steps = uniform_steps(0.040, keyed=True, fillet_m=0.0008)
    sheet = turning_sheet(steps, TurningOptions(bearing=bearing("6208"), element="coupling"),
                          key={"width_m": 0.012, "depth_m": 0.005})
    journal, seat = sheet["rows"]
    assert (journal["step"], journal["class"], seat["step"], seat["class"]) == ("journal", "k6", "seat", "k6")
    assert journal["max_m"] == pytest.approx(0.040018) and journal["min_m"] == pytest.approx(0.040002)
    assert journal["length_m"] == pytest.approx(0.018)               # the bearing width
    assert journal["fillet_min_m"] == pytest.approx(0.0008)
    assert journal["fillet_max_m"] == pytest.approx(0.0011)          # 6208 r_s min
    assert sheet["keyseat"]["width_class"] == "N9"


def test_fillet_larger_than_the_bearing_corner_is_flagged():
    steps = uniform_steps(0.040, keyed=False, fillet_m=0.004)
    sheet = turning_sheet(steps, TurningOptions(bearing=bearing("6208")))
    assert any("corner radius" in n for n in sheet["notes"])


def test_stepped_layout_rows_follow_the_steps():
    steps = [
        {"kind": "journal", "diameter_m": 0.035, "x_start_m": 0.0, "x_end_m": 0.017},
        {"kind": "shoulder", "diameter_m": 0.035, "x_start_m": 0.017, "x_end_m": 0.017, "fillet_m": 0.0007},
        {"kind": "body", "diameter_m": 0.040, "x_start_m": 0.017, "x_end_m": 0.3},
        {"kind": "seat", "diameter_m": 0.035, "x_start_m": 0.3, "x_end_m": 0.36, "keyed": True},
    ]
    sheet = turning_sheet(steps, TurningOptions(bearing=bearing("6207"), element="vbelt"),
                          key={"width_m": 0.010, "depth_m": 0.005})
    kinds = [r["step"] for r in sheet["rows"]]
    assert kinds == ["journal", "shoulder", "body", "seat"]
    shoulder = sheet["rows"][1]
    assert shoulder["fillet_min_m"] == pytest.approx(0.0007) and shoulder["fillet_max_m"] == pytest.approx(0.0011)
    assert sheet["rows"][2]["class"] == "h11"
    assert sheet["rows"][3]["length_m"] == pytest.approx(0.06)
    assert sheet["keyseat"]["length_m"] == pytest.approx(0.06)
