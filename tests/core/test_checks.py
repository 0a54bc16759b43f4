"""Behaviour of the checks, the verdict rule, substitution and the stock finder."""

from __future__ import annotations

import math

import pytest
from hypothesis import given, settings, strategies as st

from workbench.core.checks import MARGINAL_BAND, MaterialProps, Settings, check_shaft
from workbench.core.drive import drive_loads
from workbench.core.geometry import ShaftGeometry
from workbench.core.loads import Mount
from workbench.core.sections import section_for
from workbench.core.substitution import equivalents, fit_facts, largest_journal_m
from workbench.job import evaluate_inputs, stock_inputs, substitute_inputs

STEEL = MaterialProps("t", "test steel", 630e6, 530e6, 79.3e9, 7850.0)
VBELT = Mount("vbelt", 1.5, 0.200, 0.060)


def _check(geometry, torque_Nm=150.0, mount=VBELT, settings_=Settings(), service=1.5, peak=2.2):
    loads = drive_loads(torque_Nm=torque_Nm, service_factor=service, peak_factor=peak)
    return check_shaft(section_for(geometry), STEEL, loads, mount, settings_)


def test_verdict_follows_the_lowest_factor_and_the_required_factor():
    """fail below the required factor; marginal within 10 % above it; pass beyond (our stated rule)."""
    check = _check(ShaftGeometry("round", 0.030))
    n = check.min_safety_factor
    assert _check(ShaftGeometry("round", 0.030), settings_=Settings(required_sf=n * 1.01)).verdict == "fail"
    marginal = Settings(required_sf=n / (1 + MARGINAL_BAND / 2))
    assert _check(ShaftGeometry("round", 0.030), settings_=marginal).verdict == "marginal"
    relaxed = Settings(required_sf=max(1.0, n / (1 + 2 * MARGINAL_BAND)), twist_limit_deg_per_m=50.0)
    assert _check(ShaftGeometry("round", 0.030), settings_=relaxed).verdict == "pass"


def test_twist_over_the_limit_reads_marginal_and_names_twist():
    """Twist over its limit up to 2x reads marginal; over 2x it fails (our stated rule, checks.TWIST_FAIL_MULTIPLE)."""
    twist = _check(ShaftGeometry("round", 0.060), settings_=Settings(twist_limit_deg_per_m=50.0)).twist_deg_per_m
    check = _check(ShaftGeometry("round", 0.060), settings_=Settings(twist_limit_deg_per_m=twist / 1.5))
    assert check.verdict == "marginal"
    assert check.governing == "twist"
    assert "twist" in check.why
    over = _check(ShaftGeometry("round", 0.060), settings_=Settings(twist_limit_deg_per_m=twist / 2.5))
    assert over.verdict == "fail" and over.governing == "twist"


def test_coupling_gives_no_bending_and_torsion_only_fatigue():
    """Coupling: M = 0, so sigma_a' = 0 and Goodman n = Sut / (sqrt3 Kfs tau) (Shigley 9th ed., Eq. 7-8)."""
    check = _check(ShaftGeometry("round", 0.030), mount=Mount())
    assert check.bending_moment_Nm == 0.0
    assert check.fatigue_safety_factor == pytest.approx(STEEL.tensile_Pa / (math.sqrt(3) * check.max_shear_stress_Pa))


def test_keyseat_raises_the_fatigue_factors():
    plain = _check(ShaftGeometry("round", 0.040))
    keyed = _check(ShaftGeometry("round", 0.040, keyed=True, key_width_m=0.012, key_depth_m=0.005))
    assert plain.Kf == plain.Kfs == 1.0
    assert keyed.Kt == pytest.approx(2.14) and keyed.Kts == pytest.approx(3.0)
    assert 1.0 < keyed.Kf < keyed.Kt and 1.0 < keyed.Kfs < keyed.Kts
    assert keyed.fatigue_safety_factor < plain.fatigue_safety_factor
    assert keyed.feature == "keyseat" and "keyseat" in keyed.why


@settings(max_examples=60, deadline=None)
@given(st.sampled_from(["round", "square", "hex"]), st.floats(0.010, 0.150), st.floats(1.05, 2.0))
def test_a_bigger_bar_is_never_weaker_or_more_flexible(profile, size_m, growth):
    small = _check(ShaftGeometry(profile, size_m))
    big = _check(ShaftGeometry(profile, size_m * growth))
    assert big.static_safety_factor > small.static_safety_factor
    assert big.twist_deg_per_m < small.twist_deg_per_m
    assert big.mass_kg_per_m > small.mass_kg_per_m


def test_equal_strength_square_for_a_round():
    """tau_round = 16T/(pi d^3) = tau_square = T/(k2 a^3) with k2 = 0.208 (Timoshenko & Goodier
    Sec. 109) gives a = d (pi / (16 k2))^(1/3) = 0.981 d. Tolerance 0.002 (k2 printed to 3 digits)."""
    rows = {(e.geometry.profile, e.basis): e for e in equivalents(ShaftGeometry("round", 0.040))}
    square = rows[("square", "strength")]
    assert square.geometry.size_m / 0.040 == pytest.approx((math.pi / (16 * 0.208)) ** (1 / 3), abs=2e-3)
    assert square.strength_ratio == pytest.approx(1.0, rel=1e-9)
    assert rows[("square", "stiffness")].stiffness_ratio == pytest.approx(1.0, rel=1e-9)
    assert rows[("round", "strength")].geometry.size_m == pytest.approx(0.040, rel=1e-9)


def test_fit_facts_name_the_journal_limit():
    square = ShaftGeometry("square", 0.035)
    # turning rule (common practice): inscribed >= journal + 0.05 mm upper limit + max(1 mm, 2 % d):
    # square 35 -> 35 - 0.05 - 1 = 33.95 mm; flat 50 x 20 -> 20 - 0.05 - 1 = 18.95 mm
    assert largest_journal_m(square) == pytest.approx(0.03395, abs=1e-9)
    assert largest_journal_m(ShaftGeometry("flat", 0.050, 0.020)) == pytest.approx(0.01895, abs=1e-9)
    facts = " ".join(fit_facts(ShaftGeometry("round", 0.040), square))
    assert "journals up to 33.95 mm" in facts and "smaller than the existing" in facts
    assert "Square-bore" in facts


def test_stock_finder_smallest_passing_is_the_first_pass():
    inputs = {"torque": "150 N*m", "service_factor": "1.5", "mount": "vbelt", "pitch_diameter": "200 mm",
              "overhang": "40 mm", "shaft": "round 40mm keyed"}
    result = stock_inputs(inputs, "square", "metric", ["1045-cd"])
    rows = [r for r in result["rows"] if r["material"] == "1045-cd"]
    best = result["smallest"]["1045-cd"]
    index = rows.index(best)
    assert best["verdict"] == "pass"
    assert all(r["verdict"] != "pass" for r in rows[:index])
    assert index > 0  # the smallest squares do not carry 300 N m
    # taking the row as the candidate reproduces its verdict through the job contract
    again = evaluate_inputs({**inputs, "candidate": best["spec"], "material": "1045-cd"})
    assert again["shafts"][1]["verdict"] == "pass"
    assert again["shafts"][1]["fatigue_safety_factor"] == pytest.approx(best["fatigue_safety_factor"])


def test_substitute_inputs_lists_every_profile_both_bases():
    result = substitute_inputs({"shaft": "round 1-1/4in keyed"})
    kinds = {(row["profile"], row["basis"]) for row in result["equivalents"]}
    for profile in ("square", "flat", "hex", "tube"):
        assert (profile, "strength") in kinds and (profile, "stiffness") in kinds
    assert all(row["label"].endswith("in") or " x " in row["label"] for row in result["equivalents"])
    assert result["cautions"]


def test_stock_finder_checks_each_bar_turned_to_the_existing_journals():
    """A square of side a turns to journals of at most a less the clean-up allowance: for a 40 mm
    round as found, squares that cannot give 40 mm + 0.05 mm upper limit + 1 mm clean-up are rows
    that fail with the reason, and the smallest passing square gives the existing journals."""
    inputs = {"torque": "150 N*m", "mount": "vbelt", "pitch_diameter": "200 mm", "overhang": "60 mm",
              "shaft": "round 40mm keyed"}
    result = stock_inputs(inputs, "square", "metric", ["1045-cd"])
    smallest = result["smallest"]["1045-cd"]
    assert smallest["size_m"] >= 0.04105 - 1e-12 and smallest["gives_existing_journal"] is True
    assert result["smallest_with_existing_journal"]["1045-cd"] == smallest
    small = [r for r in result["rows"] if r["size_m"] < 0.04105]
    assert small and all(r["verdict"] == "fail" and "cannot give a 40 mm journal" in r["why"] for r in small)
    assert all(r["keyed"] for r in result["rows"])  # the hub is keyed: every bar's seat is keyed


def test_stock_finder_never_borrows_strength_from_another_bar_size():
    """EN 10083 C45 +QT strengths hold only up to 100 mm ruling section (shop data, steelmaker sheets):
    larger stock is skipped for that grade, not checked with a smaller bar's (higher) strengths."""
    inputs = {"torque": "500 N*m", "shaft": "round 60mm"}
    result = stock_inputs(inputs, "round", "metric", ["c45-qt"])
    sizes = [row["size_m"] for row in result["rows"]]
    assert sizes and max(sizes) <= 0.100 + 1e-12
    materials = {row["material"] for row in result["rows"]}
    assert materials <= {"c45-qt-0-16", "c45-qt-16-40", "c45-qt-40-100"}
