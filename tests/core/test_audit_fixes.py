"""Defects found by an outside audit of the program, one test (or property) per rule."""

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from workbench.job import evaluate_inputs

_HUB_JOB = {"power": "7.5 kW", "speed": "1450", "ratio": "3", "service_factor": "1.5", "mount": "vbelt",
            "pitch_diameter": "200mm", "overhang": "60mm", "shaft": "round 35mm keyed",
            "bearing_span": "450mm", "bearing_type": "self-aligning-ball"}


def _key_job(hub_mm):
    result = evaluate_inputs(dict(_HUB_JOB, hub_length=f"{hub_mm}mm"))
    return result, result["shafts"][0]


@pytest.mark.parametrize("hub_mm", [5, 10])
def test_a_hub_no_longer_than_the_key_is_wide_fails_the_shaft(hub_mm):
    """Rule: a round-ended key's bearing length is l - b (DIN 6885-1 form A, as DIN 6892 uses it);
    at l <= b it is nil, the key carries no torque, so both key factors are 0 and the shaft fails.
    Before the fix the key check was skipped (null) and the verdict was pass."""
    result, shaft = _key_job(hub_mm)
    key = shaft["key"]
    assert key["shear_safety_factor"] == 0.0 and key["crush_safety_factor"] == 0.0
    assert key["key_length_m"] == pytest.approx(hub_mm / 1000)
    assert result["verdict"] == "fail"
    assert any(w.startswith("hub too short: the key needs at least") for w in result["warnings"])


@settings(max_examples=15, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(hub_mm=st.integers(min_value=2, max_value=120), shorter_mm=st.integers(min_value=1, max_value=60))
def test_key_figures_are_never_null_with_a_hub_and_a_shorter_hub_never_helps(hub_mm, shorter_mm):
    """Property: with a hub length and a keyed shaft the key figures are numbers, and the key
    factors fall (never rise) as the hub gets shorter (tau = F/(b l_eff), DIN 6892 method C)."""
    _, shaft = _key_job(hub_mm)
    key = shaft["key"]
    assert key["shear_safety_factor"] is not None and key["crush_safety_factor"] is not None
    assert key["key_length_m"] is not None
    short = max(2, hub_mm - shorter_mm)
    _, other = _key_job(short)
    assert other["key"]["shear_safety_factor"] <= key["shear_safety_factor"] + 1e-12
    assert other["key"]["crush_safety_factor"] <= key["crush_safety_factor"] + 1e-12


@pytest.mark.parametrize("spec", ["round 1.5in keyed", "round 1.5in key 3/8x3/8in"])
def test_ansi_keyseat_reads_the_same_for_both_spellings(spec):
    """ANSI B17.1 states the shaft keyseat depth at the side wall (h/2 = 3/16 in for a 3/8 key) and
    the reading across the seat as S = D - Y - h/2, Y = (D - sqrt(D^2 - W^2))/2 the chordal height.
    D = 1.5 in, W = h = 3/8 in: Y = 0.02381 in, S = 1.2887 in (the standard's table lists 1.289 in,
    from memory); tolerance 0.0005 in. Before the fix 'keyed' gave S = 1.3125 in (d - h/2)."""
    result = evaluate_inputs({"torque": "100 N*m", "shaft": spec})
    shaft = result["shafts"][0]
    inch = 0.0254
    assert shaft["dimensions_m"]["key_depth_m"] == pytest.approx(3 / 16 * inch, abs=1e-7)
    assert shaft["keyseat"]["shaft_depth_m"] == pytest.approx(3 / 16 * inch, abs=1e-7)
    assert shaft["keyseat"]["depth_m"] / inch == pytest.approx(1.2887, abs=0.0005)


def test_both_ansi_spellings_give_identical_figures():
    """The same B17.1 key typed two ways is one keyseat: every figure of the shaft is the same."""
    a = evaluate_inputs({"torque": "100 N*m", "shaft": "round 1.5in keyed", "hub_length": "40mm"})["shafts"][0]
    b = evaluate_inputs({"torque": "100 N*m", "shaft": "round 1.5in key 3/8x3/8in", "hub_length": "40mm"})["shafts"][0]
    for name in ("dimensions_m", "keyseat", "key", "static_safety_factor", "fatigue_safety_factor", "Kts"):
        assert a[name] == b[name], name


def test_own_weight_slope_of_a_uniform_shaft_matches_the_closed_form():
    """Shigley 9th ed. Table A-9 case 7 (simple supports, uniform load w): end slope wL^3/(24EI),
    mid-span deflection 5wL^4/(384EI). Round 20 mm steel, L = 1.5 m, E = 207 GPa, 7850 kg/m^3:
    w = 24.19 N/m, slope 2.092e-3 rad; tolerance 0.5 % (the weight is lumped in pieces)."""
    import math

    from workbench.core.stiffness import _own_weight_beam

    E, d, L, rho = 207e9, 0.020, 1.5, 7850.0
    ei = E * math.pi * d**4 / 64
    mass_per_m = rho * math.pi * d**2 / 4
    w = mass_per_m * 9.80665
    beam = _own_weight_beam(((0.0, L, ei, mass_per_m),), (0.0, L))
    assert w * L**3 / (24 * ei) == pytest.approx(2.092e-3, rel=2e-3)  # the check value itself
    assert abs(beam.slope_at(0.0)) == pytest.approx(w * L**3 / (24 * ei), rel=5e-3)
    assert abs(beam.slope_at(L)) == pytest.approx(w * L**3 / (24 * ei), rel=5e-3)
    assert abs(beam.deflection_at(L / 2)) == pytest.approx(5 * w * L**4 / (384 * ei), rel=5e-3)


def test_a_long_coupling_shaft_has_the_slope_of_its_own_weight():
    """The audit's case: a coupling (no side load) on a 1.5 m span gave slopes [0, 0]. With the
    own weight the slope is wL^3/(24EI) = 2.09e-3 rad (Table A-9 case 7, as above); 3 % allows the
    program's own steel E and density."""
    result = evaluate_inputs({"power": "0.5 kW", "speed": "600", "shaft": "round 20mm", "bearing_span": "1500mm",
                              "bearing_type": "self-aligning-ball", "mount": "coupling"})
    slopes = result["shafts"][0]["bearing_slopes_rad"]
    assert slopes[0] == pytest.approx(2.092e-3, rel=0.03) and slopes[1] == pytest.approx(2.092e-3, rel=0.03)


@pytest.mark.parametrize("size_mm, journal_mm", [(35, 33.95), (10, 8.95), (60, 58.77)])
def test_stock_journal_column_follows_the_turning_rule_of_check(size_mm, journal_mm):
    """One rule for check and stock (common practice): the bar's inscribed size must be at least the
    journal's upper limit (+0.05 mm) plus a clean-up of max(1 mm, 2 % d). Square 35: 33.95 mm;
    square 10: 8.95 mm; square 60: d = 59.95 / 1.02 = 58.77 mm (tolerance 0.01 mm). The stock rows
    showed 35.0 and 10.0 mm, journals check refuses."""
    from workbench.core.geometry import ShaftGeometry
    from workbench.core.steps import can_turn
    from workbench.job import stock_inputs

    result = stock_inputs({"torque": "200 N*m"}, "square", "metric", ["1045-cd"], keyed=True)
    row = next(r for r in result["rows"] if abs(r["size_m"] - size_mm / 1000) < 1e-9)
    assert row["largest_journal_m"] * 1000 == pytest.approx(journal_mm, abs=0.01)
    bar = ShaftGeometry("square", size_mm / 1000)
    assert can_turn(bar, row["largest_journal_m"]) and not can_turn(bar, row["largest_journal_m"] + 1e-5)


def test_as_bar_with_a_keyed_candidate_warns_that_keyed_is_ignored():
    """Contract of the turned-shaft issue: --as-bar runs the bar through square-bore units with no
    keyseat; a 'keyed' candidate word is not dropped silently but named in `warnings`."""
    from workbench.demo import demo_inputs

    inputs = dict(demo_inputs(), shaft="round 35mm keyed", candidate="square 35mm keyed", as_bar="yes")
    result = evaluate_inputs(inputs)
    assert ("--as-bar: the bar runs through square-bore units, no keyseat is cut; 'keyed' ignored"
            in result["warnings"])
    assert result["shafts"][1]["steps"][0]["keyed"] is False
    plain = evaluate_inputs(dict(inputs, candidate="square 35mm"))
    assert not any(w.startswith("--as-bar") for w in plain["warnings"])


@pytest.mark.parametrize("hours, heavy, extreme", [("1/2h", 1.0, 1.25), ("3h", 1.25, 1.5),
                                                   ("10h", 1.5, 1.75), ("24h", 1.75, 2.0)])
def test_duty_heavy_shock_column_reads_the_published_table(hours, heavy, extreme):
    """The heavy-shock column at 1/2, 3, 10, 24 h a day: 1.0 / 1.25 / 1.5 / 1.75, as in the csv's
    source (AGMA service factors, electric-motor input, Leeson manual p. 82) and in AGMA 6010-E88
    as reproduced in a gearmotor maker's catalogue (heavy shock 1.0/1.25/1.5/1.75 at 1/2, 2, 10,
    24 h). The 1.25/1.5/1.75/2.0 once recalled for heavy shock is that catalogue's heavy shock with
    more than 10 starts an hour, the table's `extreme` column. Exact (table values)."""
    from workbench.duty import duty_service_factor

    assert duty_service_factor("duty", f"crusher-heavy {hours}")[0] == heavy
    assert duty_service_factor("duty", f"crusher-extreme {hours}")[0] == extreme
