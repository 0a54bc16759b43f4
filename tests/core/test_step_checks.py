"""The shaft checked step by step: the turned candidate is never stronger than the shaft it copies
at the copied steps; the verdict rules for key, slope and critical speed; the JSON of the steps."""

import math
import subprocess
import sys

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from workbench.core.steps import can_turn
from workbench.core.geometry import ShaftGeometry
from workbench.core.stiffness import KeyFigures, StiffnessFigures, layout_verdict
from workbench.job import evaluate_inputs


def _min_sf(step):
    values = [v for v in (step["static_safety_factor"], step["fatigue_safety_factor"]) if v is not None]
    return min(values) if values else math.inf


@settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(
    profile=st.sampled_from(["square", "hex", "flat"]),
    d_mm=st.integers(min_value=20, max_value=80),
    extra_mm=st.integers(min_value=2, max_value=30),
    mount=st.sampled_from([("vbelt", "200 mm"), ("sprocket", "150 mm"), ("gear", "120 mm"), ("coupling", "")]),
    overhang_mm=st.integers(min_value=20, max_value=150),
    span_mm=st.one_of(st.none(), st.integers(min_value=200, max_value=900)),
    hub_mm=st.one_of(st.none(), st.integers(min_value=20, max_value=38)),
    position=st.sampled_from(["overhung", "between"]),
    torque=st.sampled_from(["50 N*m", "200 N*m", "800 N*m"]),
)
def test_a_turned_candidate_is_never_stronger_at_the_existing_journals_and_seat(
        profile, d_mm, extra_mm, mount, overhang_mm, span_mm, hub_mm, position, torque):
    size_mm = d_mm + extra_mm
    candidate = f"{profile} {size_mm}mm" if profile != "flat" else f"flat {size_mm * 2}mm x {size_mm}mm"
    body = ShaftGeometry(profile, size_mm / 1000, size_mm / 1000 if profile == "flat" else 0.0)
    if profile == "flat":
        body = ShaftGeometry("flat", size_mm * 2 / 1000, size_mm / 1000)
    if not can_turn(body, d_mm / 1000):
        return
    job = {"torque": torque, "shaft": f"round {d_mm}mm keyed", "candidate": candidate, "mount": mount[0],
           "element_position": position}
    if mount[1]:
        job["pitch_diameter"] = mount[1]
    if position == "overhung":
        job["overhang"] = f"{overhang_mm} mm"
    else:
        if span_mm is None:
            return
        job["load_from_bearing"] = f"{span_mm // 2} mm"
    if span_mm is not None:
        job["bearing_span"] = f"{span_mm} mm"
    if hub_mm is not None:
        job["hub_length"] = f"{hub_mm} mm"
    result = evaluate_inputs(job)
    existing, cand = result["shafts"]
    for kind in ("seat", "journal"):
        e = min(_min_sf(s) for s in existing["steps"] if s["kind"] == kind)
        c = min(_min_sf(s) for s in cand["steps"] if s["kind"] == kind)
        assert c <= e * (1 + 1e-9), (kind, job)
    turned = [s for s in cand["steps"] if s["kind"] != "body"]
    assert all(abs(s["diameter_m"] - d_mm / 1000) < 1e-12 for s in turned)
    assert [s["keyed"] for s in cand["steps"] if s["kind"] == "seat"] == [True]
    assert min(_min_sf(s) for s in turned) <= min(_min_sf(s) for s in existing["steps"]) * (1 + 1e-9), job
    assert result["comparison"]["strength_ratio"] <= 1 + 1e-9


def run_cli(*args):
    return subprocess.run([sys.executable, "-m", "workbench", *args], capture_output=True, text=True, timeout=120)


def test_demo_square_no_longer_passes_above_the_keyed_round():
    """The case of the issue: a square 35 against a keyed round 35 cannot give the 35 mm journals
    (refused, naming the candidate); a square 40 turned to them is no stronger than the round."""
    proc = run_cli("check", "--demo", "--shaft", "round 35mm keyed", "--candidate", "square 35mm")
    assert proc.returncode == 2 and "Traceback" not in proc.stderr
    assert proc.stderr.startswith("shaftbench: --candidate: ") and "--as-bar" in proc.stderr
    result = evaluate_inputs({"power": "7.5 kW", "speed": "1460 rpm", "ratio": "3.2", "efficiency": "96%",
                              "service_factor": "1.5", "peak_factor": "2.2", "mount": "vbelt",
                              "pitch_diameter": "200 mm", "overhang": "60 mm", "shaft": "round 35mm keyed",
                              "candidate": "square 40mm"})
    existing, cand = result["shafts"]
    assert cand["fatigue_safety_factor"] <= existing["fatigue_safety_factor"]
    assert result["comparison"]["strength_ratio"] <= 1.0
    assert "shoulder" in cand["why"] or "keyseat" in cand["why"]


def test_as_bar_checks_the_bar_itself_without_keyseat():
    job = {"torque": "150 N*m", "shaft": "round 35mm keyed", "candidate": "square 35mm", "as_bar": "yes"}
    result = evaluate_inputs(job)
    cand = result["shafts"][1]
    assert [s["kind"] for s in cand["steps"]] == ["body"]
    assert cand["steps"][0]["keyed"] is False and cand["Kts"] == 1.0


@pytest.mark.parametrize("extra, field", [
    (["--journal", "30mm", "--fillet", "20mm"], "fillet"),
    (["--bearing-span", "100mm", "--hub-length", "150mm"], "hub_length"),
    (["--candidate", "square 40mm", "--candidate-journal", "45mm"], "candidate_journal"),
    (["--shaft", "round 35mm keyed", "--candidate", "square 35mm"], "candidate"),
    (["--element-position", "between", "--bearing-span", "450mm", "--load-from-bearing", "600mm"],
     "load_from_bearing"),
    (["--element-position", "sideways"], "element_position"),
    (["--bearing-type", "plain-bushing"], "bearing_type"),
    (["--driven-mass", "20 kg"], "driven_mass"),
    (["--hub-material", "wood"], "hub_material"),
    (["--journal", "60mm"], "journal"),
])
def test_bad_layout_input_exits_2_naming_the_option(extra, field):
    proc = run_cli("check", "--demo", *extra)
    assert proc.returncode == 2, proc.stderr
    assert proc.stdout == "" and "Traceback" not in proc.stderr
    assert len(proc.stderr.splitlines()) == 1
    assert proc.stderr.startswith(f"shaftbench: --{field.replace('_', '-')}: "), proc.stderr


def _stiff(slope1=0.0, slope2=0.0, limit=0.001, critical=None):
    return StiffnessFigures(0.0, (), (slope1, slope2), "deep-groove-ball", limit, critical, critical, critical, {})


@pytest.mark.parametrize("stiff, speed, expected", [
    (_stiff(0.0009), None, "pass"),
    (_stiff(0.0011), None, "marginal"),  # over the limit: at least marginal
    (_stiff(0.0021), None, "fail"),  # over twice the limit: fail
    (_stiff(critical=1000.0), 740.0, "pass"),
    (_stiff(critical=1000.0), 750.0, "marginal"),  # at 75 % of the first critical (common practice)
    (_stiff(critical=1000.0), 900.0, "fail"),  # at 90 %
])
def test_slope_and_critical_speed_rules(stiff, speed, expected):
    verdict, _, why = layout_verdict("pass", "fatigue", "n = 3", 1.5, 0.10, None, stiff, speed)
    assert verdict == expected, why


@pytest.mark.parametrize("n, expected", [(1.4, "fail"), (1.6, "marginal"), (1.7, "pass")])
def test_key_factors_enter_like_the_other_factors(n, expected):
    key = KeyFigures(5.0, n, 0.05, 0.08, "steel", "m")
    verdict, governing, _ = layout_verdict("pass", "fatigue", "n = 3", 1.5, 0.10, key, None, None)
    assert verdict == expected
    assert governing == ("key" if expected != "pass" else "fatigue")


def test_a_worse_strength_verdict_stands():
    verdict, governing, why = layout_verdict("fail", "fatigue", "n = 1.2", 1.5, 0.10, None, _stiff(0.0011), None)
    assert (verdict, governing, why) == ("fail", "fatigue", "n = 1.2")


def test_json_contract_of_the_steps():
    from workbench.demo import demo_inputs

    result = evaluate_inputs(demo_inputs())
    assert set(result["moment_diagram"]) == {"x_m", "moment_Nm", "torque_Nm"}
    assert result["layout"]["bearing_span_m"] == pytest.approx(0.45)
    for shaft in result["shafts"]:
        steps = shaft["steps"]
        gov = steps[shaft["governing_step"]]
        for key in ("static_safety_factor", "fatigue_safety_factor", "Kt", "Kts", "bending_moment_Nm"):
            assert shaft[key] == gov[key]
        for step in steps:
            assert step["kind"] in ("body", "journal", "seat", "shoulder")
            for key in ("diameter_m", "bending_moment_Nm", "torque_Nm", "Kt", "Kts", "x_start_m", "x_end_m",
                        "fillet_m", "keyed", "label"):
                assert key in step
        assert set(shaft["key"]) >= {"shear_safety_factor", "crush_safety_factor", "required_length_m"}
        assert shaft["key"]["key_length_m"] == pytest.approx(0.08)  # the hub length
        assert shaft["critical_speed_rpm"] > 0 and len(shaft["bearing_slopes_rad"]) == 2
        assert shaft["deflection_m"] > 0


def test_no_span_gives_null_stiffness_with_a_note():
    result = evaluate_inputs({"torque": "100 N*m", "shaft": "round 35mm keyed"})
    shaft = result["shafts"][0]
    assert shaft["critical_speed_rpm"] is None and shaft["bearing_slopes_rad"] is None
    assert shaft["key"]["shear_safety_factor"] is None and shaft["key"]["required_length_m"] > 0
    assert any(n.startswith("--bearing-span: none given") for n in result["warnings"])
    assert any(n.startswith("--hub-length: none given") for n in result["warnings"])


def test_uniform_shaft_moment_at_the_journal_is_F_times_overhang():
    """Overhung side load F = 2 T K / D (K = 1.5 V-belt) at the bearing: M = F a (cantilever statics)."""
    result = evaluate_inputs({"torque": "100 N*m", "mount": "vbelt", "pitch_diameter": "200 mm",
                              "overhang": "50 mm", "shaft": "round 35mm", "bearing_span": "400 mm"})
    journal = next(s for s in result["shafts"][0]["steps"] if s["kind"] == "journal")
    assert journal["bending_moment_Nm"] == pytest.approx(2 * 100 * 1.5 / 0.2 * 0.05, rel=1e-12)


def test_torque_stops_at_a_driven_element_between_the_bearings():
    result = evaluate_inputs({"torque": "100 N*m", "mount": "sprocket", "pitch_diameter": "150 mm",
                              "overhang": "50 mm", "shaft": "round 35mm", "bearing_span": "400 mm",
                              "driven_position": "between", "driven_from_bearing": "200 mm", "driven_mass": "30 kg"})
    steps = result["shafts"][0]["steps"]
    journal2 = [s for s in steps if s["kind"] == "journal"][-1]
    assert journal2["torque_Nm"] == 0.0
    assert result["layout"]["driven"]["mass_kg"] == 30.0
