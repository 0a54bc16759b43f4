"""``shaftbench fit`` seen from outside: the JSON contract, text, exit codes, no tracebacks.

Check values: [JIS] JIS B 0401-2 (1999) shaft table (= ISO 286-2; V via a reproduction):
35 k6 +18/+2 um; 38.1 mm (1.5 in) h6 in 30-50: 0/-16 um; [DIN] DIN ISO 286 extract: 40 H7 +25/0.
Thermal: 35 mm x 11.5e-6/K x 30 K = 12.1 um (linear expansion, steel alpha from memory), tol 0.1 um.
"""

from __future__ import annotations

import json

import pytest
from hypothesis import given, settings, strategies as st

from workbench.cli import main

ONE_KEYS = ("size_m", "class", "upper_deviation_m", "lower_deviation_m", "max_m", "min_m", "tolerance_m")


def _json(capsys, *argv):
    assert main(["fit", *argv, "--json"]) == 0
    return json.loads(capsys.readouterr().out)


def test_one_class_json(capsys):
    data = _json(capsys, "35mm", "k6")
    assert all(k in data for k in ONE_KEYS)
    assert data["class"] == "k6"
    assert data["size_m"] == pytest.approx(0.035)
    assert data["upper_deviation_m"] == pytest.approx(18e-6, abs=1e-12)
    assert data["lower_deviation_m"] == pytest.approx(2e-6, abs=1e-12)
    assert data["max_m"] == pytest.approx(0.035018, abs=1e-12)
    assert data["min_m"] == pytest.approx(0.035002, abs=1e-12)
    assert data["tolerance_m"] == pytest.approx(16e-6, abs=1e-12)


def test_bare_size_is_mm(capsys):
    assert _json(capsys, "35", "k6")["size_m"] == pytest.approx(0.035)


def test_inch_size_text_to_a_ten_thousandth(capsys):
    data = _json(capsys, "1.5in", "h6")
    assert data["size_m"] == pytest.approx(0.0381)
    assert data["lower_deviation_m"] == pytest.approx(-16e-6, abs=1e-12)
    assert main(["fit", "1.5in", "h6"]) == 0
    out = capsys.readouterr().out
    assert "1.5000 in" in out and "1.4994 in" in out  # 1.5 - 0.016/25.4 = 1.49937 -> 1.4994


def test_fit_json(capsys):
    data = _json(capsys, "40mm", "H7/k6")
    for part in ("hole", "shaft"):
        assert all(k in data[part] for k in ONE_KEYS)
    assert data["hole"]["upper_deviation_m"] == pytest.approx(25e-6, abs=1e-12)
    assert data["max_clearance_m"] == pytest.approx(23e-6, abs=1e-12)   # 25 - 2
    assert data["min_clearance_m"] == pytest.approx(-18e-6, abs=1e-12)  # 0 - 18
    assert data["kind"] == "transition"


def test_measured_under_the_min(capsys):
    data = _json(capsys, "35mm", "k6", "--measured", "34.985mm")
    assert data["measured_m"] == pytest.approx(0.034985)
    assert data["within"] is False
    assert data["outside_by_m"] == pytest.approx(34.985e-3 - 35.002e-3, abs=1e-12)  # -17 um


def test_measured_within_and_over(capsys):
    assert _json(capsys, "35mm", "k6", "--measured", "35.010mm")["outside_by_m"] == 0
    over = _json(capsys, "35mm", "k6", "--measured", "35.020mm")
    assert over["within"] is False and over["outside_by_m"] == pytest.approx(2e-6, abs=1e-12)


def test_warm_part_reads_large(capsys):
    # 35.025 mm read at 50 degC: 35 mm x 11.5e-6 x 30 K = 12.1 um large -> 35.0129 at 20 degC (within k6)
    data = _json(capsys, "35mm", "k6", "--measured", "35.025mm", "--temperature", "50C")
    assert data["measured_m"] == pytest.approx(0.035025 / (1 + 11.5e-6 * 30), abs=1e-10)
    assert (0.035025 - data["measured_m"]) * 1e6 == pytest.approx(12.1, abs=0.1)
    assert data["within"] is True


def test_uncertainty_narrows_acceptance(capsys):
    # 35.017 is inside k6 (max 35.018) but within U = 2 um of the max: not accepted (ISO 14253-1)
    data = _json(capsys, "35mm", "k6", "--measured", "35.017mm", "--uncertainty", "0.002mm")
    assert data["within"] is False
    assert data["outside_by_m"] == pytest.approx(1e-6, abs=1e-12)
    assert data["decision"] == "not proven"


def test_ovality_and_taper(capsys):
    data = _json(capsys, "35mm", "k6", "--measured", "35.010mm", "35.004mm", "--measured", "35.012mm")
    assert data["ovality_m"] == pytest.approx(6e-6, abs=1e-12)
    assert data["taper_m"] == pytest.approx(35.012e-3 - 35.007e-3, abs=1e-12)


def test_shaft_range_for_a_measured_bore(capsys):
    data = _json(capsys, "40mm", "H7/k6", "--bore", "40.010mm")
    # shaft max = bore - min clearance = 40.010 + 0.018; min = bore - max clearance = 40.010 - 0.023
    assert data["shaft_for_bore"]["max_m"] == pytest.approx(0.040028, abs=1e-12)
    assert data["shaft_for_bore"]["min_m"] == pytest.approx(0.039987, abs=1e-12)


@pytest.mark.parametrize("argv,field", [
    (["35mm", "q6"], "CLASS"), (["35mm", "k66"], "CLASS"), (["0mm", "k6"], "SIZE"), (["501mm", "h6"], "SIZE"),
    (["20mm", "t6"], "CLASS"), (["35mm", "k6", "--measured", "5kg"], "measured"), (["35mm", "j9"], "CLASS"),
    (["35mm", "H7/H7"], "CLASS"), (["ten", "k6"], "SIZE"), (["35mm", "k6", "--measured", "35mm", "--temperature", "hot"], "temperature"),
    (["35mm", "k6", "--bore", "35mm"], "bore"),
])
def test_bad_input_is_one_line_exit_2(capsys, argv, field):
    assert main(["fit", *argv]) == 2
    err = capsys.readouterr().err
    assert err.count("\n") == 1 and field in err and "Traceback" not in err


_CLASS_TEXT = st.one_of(
    st.text(max_size=8),
    st.builds(lambda a, b: f"{a}{b}", st.sampled_from(["a", "B", "js", "JS", "k", "K", "zc", "ZC", "j", "J", "cd", "x"]),
              st.integers(min_value=-2, max_value=25)),
)
_SIZE_TEXT = st.one_of(
    st.text(max_size=8),
    st.builds(lambda v, u: f"{v}{u}", st.one_of(st.floats(min_value=-10, max_value=700), st.just(float("nan"))),
              st.sampled_from(["", "mm", "in", "kg", " mm"])),
)


@settings(max_examples=150, deadline=None)
@given(size=_SIZE_TEXT, text=_CLASS_TEXT)
def test_never_a_traceback(size, text):
    """Whatever is typed: exit 0 with limits that hold, or exit 2 with one line."""
    from workbench.fitcalc import fit_inputs
    from workbench.job import JobInputError

    try:
        data = fit_inputs(size, text)
    except JobInputError as err:
        assert "\n" not in str(err)
        return
    assert data["max_m"] >= data["min_m"]
    assert data["tolerance_m"] > 0
