"""The calculation core checked against published values and independent references.

Each test names its source, the check value and the tolerance. "from memory" marks a value
recalled without the document at hand; "V via a reproduction" a value seen in a faithful copy.
"""

from __future__ import annotations

import math

import pytest

from workbench.core import fatigue
from workbench.core.drive import drive_loads, torque_from_power_Nm
from workbench.core.loads import overhung_moment_Nm, side_load_N
from workbench.core.rectangle import rectangle_coefficients, rectangle_coefficients_approx
from workbench.core.sections import rectangle_properties, round_properties, tube_properties

# Exact unit definitions, NIST SP 811 (2008), Appendix B.8/B.9.
IN_M = 0.0254
LBF_N = 4.4482216152605
PSI_PA = LBF_N / IN_M**2
LBF_IN_NM = LBF_N * IN_M
HP_W = 745.69987158227022  # 1 hp = 550 ft*lbf/s, NIST SP 811 App. B.9


# --------------------------------------------------------------------------- power and torque


def test_trade_constant_kw_rpm():
    """T[N m] = 9549.297 P[kW]/n[rpm] (60000/2 pi; shop data, C). Tolerance 1e-6 relative."""
    assert torque_from_power_Nm(1000.0, 1.0) == pytest.approx(9549.297, rel=1e-6)


def test_trade_constant_hp_rpm_lbf_in():
    """T[lbf in] = 63025 H[hp]/n (33000*12/2 pi = 63025.35; Shigley 9th ed., Eq. 3-44). rel 1e-6.

    A widely copied table prints 63057, which is wrong: it must not pass.
    """
    torque_lbf_in = torque_from_power_Nm(HP_W, 1.0) / LBF_IN_NM
    assert torque_lbf_in == pytest.approx(63025.35, rel=1e-6)
    assert torque_lbf_in != pytest.approx(63057, rel=1e-4)


def test_trade_constant_hp_rpm_lbf_ft():
    """T[lbf ft] = 5252.113 H[hp]/n (33000/2 pi). rel 1e-6."""
    assert torque_from_power_Nm(HP_W, 1.0) / (LBF_N * 0.3048) == pytest.approx(5252.113, rel=1e-6)


def test_power_torque_against_pint():
    """Independent reference library (pint): T = P / omega for 7.5 kW at 1450 rpm. rel 1e-12."""
    import pint

    ureg = pint.UnitRegistry()
    expected = (ureg.Quantity(7.5, "kW") / ureg.Quantity(1450, "rpm")).to("N*m").magnitude
    assert torque_from_power_Nm(7500.0, 1450.0) == pytest.approx(expected, rel=1e-12)


def test_drive_ratio_efficiency_service_and_peak():
    """Shaft speed = motor/ratio; shaft torque = eta P / omega_shaft; design = x SF; peak = x peak
    factor (definitions: Shigley 9th ed., Eq. 3-40; AGMA 6010-E88 service factor practice)."""
    loads = drive_loads(power_W=7500.0, motor_speed_rpm=1460.0, ratio=3.2, efficiency=0.96,
                        service_factor=1.5, peak_factor=2.2)
    expected_running = 0.96 * 7500.0 / (2 * math.pi * (1460.0 / 3.2) / 60.0)
    assert loads.shaft_speed_rpm == pytest.approx(456.25)
    assert loads.running_torque_Nm == pytest.approx(expected_running, rel=1e-12)
    assert loads.design_torque_Nm == pytest.approx(1.5 * expected_running, rel=1e-12)
    assert loads.peak_torque_Nm == pytest.approx(2.2 * expected_running, rel=1e-12)


# --------------------------------------------------------------------------- sections


def test_circle_and_tube_against_numerical_integration():
    """J = integral of r^2 dA and A = integral of dA, by scipy's quadrature (independent reference
    library) against the exact circle and tube formulas (Shigley 9th ed., Table A-18). rel 1e-9."""
    from scipy import integrate

    d, di = 0.040, 0.030
    polar_num, _ = integrate.quad(lambda r: 2 * math.pi * r**3, 0, d / 2)
    area, polar, tau_t, z = round_properties(d)
    assert polar == pytest.approx(polar_num, rel=1e-9)
    assert tau_t == pytest.approx((d / 2) / polar_num, rel=1e-9)  # tau = T r / J at r = d/2
    assert z == pytest.approx(2 * (polar_num / 2) / d, rel=1e-9)  # Z = I / c with I = J/2

    polar_num, _ = integrate.quad(lambda r: 2 * math.pi * r**3, di / 2, d / 2)
    area_num, _ = integrate.quad(lambda r: 2 * math.pi * r, di / 2, d / 2)
    area, polar, tau_t, z = tube_properties(d, di)
    assert polar == pytest.approx(polar_num, rel=1e-9)
    assert area == pytest.approx(area_num, rel=1e-9)
    assert tau_t == pytest.approx((d / 2) / polar_num, rel=1e-9)


# Timoshenko & Goodier, Theory of Elasticity, 3rd ed., Sec. 109, table of k1, k2 for b/c
# (reproduced as Shigley 9th ed., Table 3-1, with alpha = k2 and beta = k1). Printed to 3 decimals.
RECTANGLE_TABLE = (
    (1.0, 0.141, 0.208),
    (1.5, 0.196, 0.231),
    (2.0, 0.229, 0.246),
    (2.5, 0.249, 0.258),
    (3.0, 0.263, 0.267),
    (4.0, 0.281, 0.282),
    (5.0, 0.291, 0.291),
    (10.0, 0.312, 0.312),
)


@pytest.mark.parametrize("aspect, k1, k2", RECTANGLE_TABLE)
def test_rectangle_series_against_classical_table(aspect, k1, k2):
    """Series k1, k2 vs the printed table; tolerance 0.0006 absolute (the table's 3rd-decimal rounding)."""
    series_k1, series_k2 = rectangle_coefficients(aspect)
    assert series_k1 == pytest.approx(k1, abs=6e-4)
    assert series_k2 == pytest.approx(k2, abs=6e-4)


def test_rectangle_series_limit_is_one_third():
    """b/c -> infinity: k1 = k2 = 1/3 (thin strip, Timoshenko & Goodier Sec. 109). abs 1e-3 at b/c = 1000."""
    k1, k2 = rectangle_coefficients(1000.0)
    assert k1 == pytest.approx(1 / 3, abs=1e-3)
    assert k2 == pytest.approx(1 / 3, abs=1e-3)


def test_rectangle_approximation_reads_low_on_stress():
    """The 3 + 1.8/(b/c) form (Shigley 9th ed., Eq. 3-40) under-reads tau_max by up to ~4.4 % near
    b/c = 2-2.5 against the exact series; it must not be what the core uses."""
    worst = max(
        rectangle_coefficients_approx(a)[1] / rectangle_coefficients(a)[1] - 1.0
        for a in (1.0, 1.5, 2.0, 2.5, 3.0, 4.0, 6.0, 10.0)
    )
    assert 0.035 < worst < 0.05
    _, _, tau_t, _ = rectangle_properties(0.050, 0.025)
    assert tau_t == pytest.approx(1 / (rectangle_coefficients(2.0)[1] * 0.050 * 0.025**2), rel=1e-12)


def test_square_rotating_section_modulus_is_diagonal_bending():
    """A square bending about its diagonal: Z = a^3 / (6 sqrt 2) (Roark's Formulas for Stress and
    Strain, Table A.1, square about a diagonal; from memory). rel 1e-12."""
    a = 0.030
    _, _, _, z = rectangle_properties(a, a)
    assert z == pytest.approx(a**3 / (6 * math.sqrt(2)), rel=1e-12)


# --------------------------------------------------------------------------- fatigue


def test_marin_surface_factor_example():
    """Shigley 9th ed., Example 6-3: machined, Sut = 520 MPa -> ka = 4.51(520)^-0.265 = 0.860
    (from memory). abs 0.001."""
    assert fatigue.surface_factor("machined", 520e6) == pytest.approx(0.860, abs=1e-3)


def test_marin_size_factor_example():
    """Shigley 9th ed., Example 6-4: 32 mm rotating shaft -> kb = (32/7.62)^-0.107 = 0.858
    (from memory). abs 0.001."""
    assert fatigue.size_factor(0.032) == pytest.approx(0.858, abs=1e-3)


@pytest.mark.parametrize("reliability, ke", [(0.5, 1.0), (0.9, 0.897), (0.99, 0.814), (0.9999, 0.702)])
def test_reliability_factor_table(reliability, ke):
    """Shigley 9th ed., Table 6-5 (V). Exact."""
    assert fatigue.reliability_factor(reliability) == pytest.approx(ke, abs=1e-12)


def test_endurance_limit_ceiling():
    """Shigley 9th ed., Eq. 6-8: Se' = 0.5 Sut up to 1400 MPa, 700 MPa above (V). Exact."""
    assert fatigue.endurance_limit_specimen_Pa(1000e6) == pytest.approx(500e6)
    assert fatigue.endurance_limit_specimen_Pa(1600e6) == pytest.approx(700e6)


# Shigley 9th ed., Example 7-1 (from memory for the printed answers; the inputs are the example's):
# machined shoulder, d = 1.100 in, r = 0.11 in, Kt = 1.68, Kts = 1.42, Ma = 1260 lbf in,
# Tm = 1100 lbf in, Sut = 105 kpsi, Sy = 82 kpsi, reliability 0.99.
EX71_D = 1.100 * IN_M
EX71_SUT = 105e3 * PSI_PA
EX71_SY = 82e3 * PSI_PA


def test_example_7_1_endurance_limit():
    """ka = 0.787, kb = 0.870, ke = 0.814, Se = 29.3 kpsi (Shigley 9th ed., Ex. 7-1; from memory).
    Tolerance 0.5 % (the metric and kpsi forms of Table 6-2 differ by ~0.1 %)."""
    factors = fatigue.marin_factors("machined", EX71_SUT, EX71_D, 0.99)
    assert factors["ka"] == pytest.approx(0.787, rel=5e-3)
    assert factors["kb"] == pytest.approx(0.870, rel=5e-3)
    assert factors["ke"] == pytest.approx(0.814, rel=1e-9)
    se = fatigue.endurance_limit_Pa(EX71_SUT, factors)
    assert se / PSI_PA / 1e3 == pytest.approx(29.3, rel=5e-3)


def test_example_7_1_notch_factors():
    """Kf = 1.58, Kfs = 1.39 from the charts' q = 0.85, qs = 0.92 (Shigley 9th ed., Ex. 7-1; from
    memory). Our Neuber fit (10th ed., Eqs. 6-35a/b) reads q from Sut: tolerance 1 % on Kf, 2 % on Kfs
    (chart reading vs fitted curve)."""
    r = 0.11 * IN_M
    kf = fatigue.fatigue_notch_factor(1.68, r, fatigue.neuber_sqrt_a_bending(EX71_SUT))
    kfs = fatigue.fatigue_notch_factor(1.42, r, fatigue.neuber_sqrt_a_torsion(EX71_SUT))
    assert kf == pytest.approx(1.58, rel=0.01)
    assert kfs == pytest.approx(1.39, rel=0.02)


@pytest.mark.parametrize(
    "criterion, n_book",
    [("goodman", 1.62), ("gerber", 1.87), ("asme-elliptic", 1.88), ("soderberg", 1.56)],
)
def test_example_7_1_fatigue_safety_factors(criterion, n_book):
    """Shigley 9th ed., Ex. 7-1 answers (from memory), with the example's Kf = 1.58, Kfs = 1.39 and
    Se = 29.3 kpsi. Tolerance 1 % (the book rounds intermediate stresses)."""
    k = LBF_IN_NM / (math.pi * EX71_D**3)
    alt, mean = fatigue.von_mises_amplitudes(32 * 1.58 * 1260 * k, 0.0, 0.0, 16 * 1.39 * 1100 * k)
    n = fatigue.fatigue_safety_factor(criterion, alt, mean, 29.3e3 * PSI_PA, EX71_SUT, EX71_SY)
    assert n == pytest.approx(n_book, rel=0.01)


def test_example_7_1_first_cycle_yield():
    """sigma'max = 18.3 kpsi, n_y = 82/18.3 = 4.48 (Shigley 9th ed., Ex. 7-1(b); from memory). rel 1 %."""
    k = LBF_IN_NM / (math.pi * EX71_D**3)
    peak = fatigue.first_cycle_yield_stress_Pa(32 * 1.58 * 1260 * k, 16 * 1.39 * 1100 * k)
    assert peak / PSI_PA / 1e3 == pytest.approx(18.3, rel=0.01)
    assert EX71_SY / peak == pytest.approx(4.48, rel=0.01)


@pytest.mark.parametrize(
    "criterion, d_in",
    [("gerber", 1.016), ("asme-elliptic", 1.012), ("soderberg", 1.090), ("goodman", 1.073)],
)
def test_solutions_manual_problem_7_1_diameters(criterion, d_in):
    """Budynas & Nisbett, Shigley's MED 8th ed., Solutions Manual, Problem 7-1 (V via a
    reproduction): Ma = 600, Mm = 500, Ta = 400, Tm = 300 lbf in, Kf = 2.2, Kfs = 1.8, Se = 30,
    Sut = 100, Sy = 80 kpsi, n = 2 gives these diameters. At each printed diameter our factor must
    be 2.0 within 0.5 % (the diameter is printed to 0.001 in, i.e. ~0.3 % in n)."""
    k = LBF_IN_NM / (math.pi * (d_in * IN_M) ** 3)
    alt, mean = fatigue.von_mises_amplitudes(32 * 2.2 * 600 * k, 32 * 2.2 * 500 * k, 16 * 1.8 * 400 * k, 16 * 1.8 * 300 * k)
    n = fatigue.fatigue_safety_factor(criterion, alt, mean, 30e3 * PSI_PA, 100e3 * PSI_PA, 80e3 * PSI_PA)
    assert n == pytest.approx(2.0, rel=5e-3)


def test_gerber_reduces_to_endurance_for_pure_alternating():
    """With no mean stress every criterion gives n = Se / sigma_a' (Shigley 9th ed., Sec. 6-12)."""
    for criterion in fatigue.CRITERIA:
        assert fatigue.fatigue_safety_factor(criterion, 100e6, 0.0, 200e6, 600e6, 400e6) == pytest.approx(2.0)


# --------------------------------------------------------------------------- loads and twist


def test_overhung_load_vbelt():
    """OHL = 2 T K / D (gear-reducer makers' data, V): 100 N m on a 200 mm V-belt sheave, K = 1.5
    -> 1500 N; at 60 mm overhang M = 90 N m. Exact."""
    force = side_load_N(100.0, 0.200, 1.5)
    assert force == pytest.approx(1500.0)
    assert overhung_moment_Nm(force, 0.060) == pytest.approx(90.0)


def test_twist_trade_formula():
    """Solid round: theta[deg] = 584 T L / (G d^4), T lbf in, L in, G psi, d in (shop data, V;
    Machinery's Handbook form). Our T/(G J) in SI must agree within 0.1 % (584 is 32*180/pi^2 = 583.6)."""
    from workbench.core.checks import MaterialProps, Settings, check_shaft
    from workbench.core.geometry import ShaftGeometry
    from workbench.core.loads import Mount
    from workbench.core.sections import section_for

    d_in, t_lbf_in, g_psi = 1.5, 5000.0, 11.5e6
    loads = drive_loads(torque_Nm=t_lbf_in * LBF_IN_NM, service_factor=1.0)
    mat = MaterialProps("x", "x", 600e6, 400e6, g_psi * PSI_PA, 7850.0)
    check = check_shaft(section_for(ShaftGeometry("round", d_in * IN_M)), mat, loads, Mount(), Settings())
    theta_per_inch = 584 * t_lbf_in * 1.0 / (g_psi * d_in**4)
    assert check.twist_deg_per_m * IN_M == pytest.approx(theta_per_inch, rel=1e-3)
