"""The turning sheet in ``check``: the JSON contract, the fitter's options, the report.

Check values: 40 k6 +18/+2 um, 40 j6 +11/-5 um ([JIS] JIS B 0401-2 1999 shaft table / ISO 286-2
from memory for j6); 12 mm key N9 0/-43 um ([DIN] extract, 10-18 mm); 6208 width 18 mm (ISO 15,
from memory); DIN 6885-1 38-44 mm shaft: 12 x 8 key, t1 = 5.0 mm (shop data, V).
"""

from __future__ import annotations

import json

import pytest

from workbench.cli import main

ROW_KEYS = ("step", "diameter_m", "class", "max_m", "min_m", "length_m", "max_in", "min_in",
            "fillet_min_m", "fillet_max_m", "finish_Ra_um")
KEYSEAT_KEYS = ("width_class", "width_max_m", "width_min_m", "depth_m", "depth_tolerance_m", "length_m")


def _check(capsys, *argv):
    assert main(["check", "--demo", *argv, "--json"]) == 0
    return json.loads(capsys.readouterr().out)


def test_every_shaft_has_turning_rows(capsys):
    data = _check(capsys)
    for shaft in data["shafts"]:
        assert shaft["turning"], shaft["role"]
        for row in shaft["turning"]:
            assert all(k in row for k in ROW_KEYS)
            assert row["step"] in ("body", "journal", "seat", "shoulder")
            assert row["max_m"] > row["min_m"]
    existing = data["shafts"][0]
    journal = next(r for r in existing["turning"] if r["step"] == "journal")
    assert journal["class"] == "k6"
    assert journal["max_m"] == pytest.approx(0.040018) and journal["min_m"] == pytest.approx(0.040002)
    assert journal["max_in"] == pytest.approx(1.5755, abs=5e-5)


def test_keyed_shaft_has_a_keyseat(capsys):
    data = _check(capsys)
    existing, candidate = data["shafts"]
    k = existing["keyseat"]
    assert all(key in k for key in KEYSEAT_KEYS)
    assert k["width_class"] == "N9"
    assert k["width_max_m"] == pytest.approx(0.012) and k["width_min_m"] == pytest.approx(0.011957)
    assert k["depth_m"] == pytest.approx(0.040 - 0.005)
    assert k["depth_tolerance_m"] == pytest.approx(0.0002)
    assert candidate["keyseat"] is None or candidate.get("keyed")


def test_options_change_the_sheet(capsys):
    data = _check(capsys, "--bearing", "6208", "--bearing-mounting", "insert", "--seat-class", "h6", "--key-fit", "tight")
    shaft = data["shafts"][0]
    rows = {r["step"]: r for r in shaft["turning"]}
    assert rows["journal"]["class"] == "h8"
    assert rows["journal"]["length_m"] == pytest.approx(0.018)
    assert rows["seat"]["class"] == "h6"
    assert shaft["keyseat"]["width_class"] == "P9"
    assert shaft["turning_sheet"]["bearing"]["designation"] == "6208"


def test_journal_class_override(capsys):
    data = _check(capsys, "--journal-class", "m6")
    journals = [r for r in data["shafts"][0]["turning"] if r["step"] == "journal"]
    assert journals and all(r["class"] == "m6" for r in journals)


@pytest.mark.parametrize("argv,field", [
    (["--bearing", "9999x"], "bearing"), (["--bearing-mounting", "glued"], "bearing_mounting"),
    (["--rotating-ring", "both"], "rotating_ring"), (["--bearing-load", "huge"], "bearing_load"),
    (["--journal-class", "q6"], "journal_class"), (["--journal-class", "H7"], "journal_class"),
    (["--seat-class", "t6x"], "seat_class"), (["--key-fit", "snug"], "key_fit"),
    (["--turning-sheets", "all"], "turning_sheets"), (["--journal-class", "j9"], "journal_class"),
])
def test_bad_options_exit_2_naming_the_field(capsys, argv, field):
    assert main(["check", "--demo", *argv]) == 2
    err = capsys.readouterr().err
    assert err.count("\n") == 1 and "--" + field.replace("_", "-") in err and "Traceback" not in err


def test_report_prints_the_candidates_sheet_by_default(capsys):
    assert main(["check", "--demo"]) == 0
    out = capsys.readouterr().out
    assert "Turning sheet — candidate" in out and "Turning sheet — existing" not in out
    assert main(["check", "--demo", "--turning-sheets", "both"]) == 0
    out = capsys.readouterr().out
    assert "Turning sheet — candidate" in out and "Turning sheet — existing" in out
    assert "40.002-40.018" in out


def test_one_row_per_step_with_the_steps_kind_words(capsys):
    data = _check(capsys, "--bearing", "6208", "--turning-sheets", "both")
    for shaft in data["shafts"]:
        steps = shaft.get("steps")
        if not steps:
            continue
        assert [r["step"] for r in shaft["turning"]] == [s["kind"] for s in steps]
        assert [r["diameter_m"] for r in shaft["turning"]] == pytest.approx([s["diameter_m"] for s in steps])
        for row in shaft["turning"]:
            if row["step"] == "journal":
                assert row["length_m"] == pytest.approx(0.018)   # 6208 width (ISO 15, from memory)
            if row["step"] == "shoulder" and row["fillet_max_m"] is not None:
                assert row["fillet_min_m"] <= row["fillet_max_m"] + 1e-12
                assert row["fillet_max_m"] == pytest.approx(0.0011)  # 6208 r_s min


def test_keyed_seat_on_a_square_candidate_gets_the_seats_key(capsys):
    data = _check(capsys, "--candidate", "square 45mm keyed")
    candidate = data["shafts"][1]
    seat = next(r for r in candidate["turning"] if r["step"] == "seat")
    k = candidate["keyseat"]
    assert k is not None
    # DIN 6885-1: a 40 mm seat (38-44 mm) takes a 12 x 8 key, t1 = 5.0 mm (shop data, V)
    assert seat["diameter_m"] == pytest.approx(0.040)
    assert k["key_width_m"] == pytest.approx(0.012) and k["depth_m"] == pytest.approx(0.035)


from hypothesis import given, settings, strategies as st  # noqa: E402


@settings(max_examples=40, deadline=None)
@given(key=st.sampled_from(["bearing", "journal_class", "seat_class", "key_fit", "bearing_mounting"]),
       text=st.one_of(st.text(max_size=10), st.sampled_from(["6207", "22210K", "k6", "H7", "zc18", "j9", "h1"])))
def test_typed_options_never_give_a_traceback(key, text):
    """Whatever is typed in a turning-sheet option: a result with a sheet, or one JobInputError line."""
    from workbench.demo import demo_inputs
    from workbench.job import JobInputError, evaluate_inputs

    try:
        result = evaluate_inputs({**demo_inputs(), key: text})
    except JobInputError as err:
        assert "\n" not in str(err)
        return
    assert all(s["turning"] for s in result["shafts"])


def test_inch_shaft_gets_an_ansi_keyseat_and_inch_limits(capsys):
    # 1-1/4 in shaft: 1/4 in square key, depth h/2 = 1/8 in (ANSI B17.1 via Shigley 9th ed. Table 7-6, V);
    # keyseat width +0.002/-0 in, depth +0.010 in (ANSI B17.1, from memory); 31.75 k6 = +18/+2 um (30-50)
    assert main(["check", "--torque", "200 N*m", "--shaft", "round 1-1/4in keyed", "--json"]) == 0
    shaft = json.loads(capsys.readouterr().out)["shafts"][0]
    k = shaft["keyseat"]
    assert k["standard"] == "ANSI B17.1"
    assert k["width_min_m"] == pytest.approx(0.25 * 0.0254) and k["width_max_m"] == pytest.approx(0.252 * 0.0254)
    # reading across the seat S = D - Y - h/2 (ANSI B17.1, t1 at the side wall), Y = (D - sqrt(D^2 - W^2))/2:
    # 1.25 - 0.01263 - 0.125 = 1.1124 in (the standard's table: 1.112 in, from memory); +-0.0005 in
    assert k["depth_m"] / 0.0254 == pytest.approx(1.1124, abs=0.0005)
    assert k["depth_tolerance_m"] == pytest.approx(0.010 * 0.0254)
    assert k["length_m"] is None  # a coupling with no hub length given: not known, not zero
    journal = next(r for r in shaft["turning"] if r["step"] == "journal")
    assert journal["max_in"] == pytest.approx(round((31.75 + 0.018) / 25.4, 4))
    assert journal["min_in"] == pytest.approx(round((31.75 + 0.002) / 25.4, 4))
