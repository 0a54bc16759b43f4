"""First critical speed (workbench.core.critical_speed) against a closed form and a worked example.

Sources: Shigley's Mechanical Engineering Design, 9th ed., Sec. 7-6: Eq. 7-22 (uniform simply
supported shaft omega = (pi/l)^2 sqrt(E I / m)), Example 7-5 (1 in steel shaft, 31 in span,
35 lbf at 7 in and 55 lbf at 20 in from the left bearing, E = 30 Mpsi): Rayleigh 124.8 rad/s
(1192 rev/min), Dunkerley 120.4 rad/s, shaft alone 520.4 rad/s (weight density 0.282 lbf/in^3),
Dunkerley with the shaft's term 117.3 rad/s (all from memory; the book rounds its influence
coefficients to four figures: tolerance 0.5 %).
"""

from __future__ import annotations

import math

import pytest

from workbench.core.critical_speed import first_critical_speed

IN_M = 0.0254  # NIST SP 811 App. B.9 (exact)
LBF_N = 4.4482216152605
PSI_PA = LBF_N / IN_M**2
G_N = 9.80665
RAD_S = 60 / (2 * math.pi)  # rad/s -> rev/min


def test_uniform_shaft_closed_form():
    """Eq. 7-22: omega = (pi/l)^2 sqrt(EI/m) for a 40 mm steel shaft on a 1.2 m span.
    Rayleigh is an upper estimate: 0 to +0.2 %; Dunkerley (shaft term only) likewise."""
    d, span, rho, e = 0.040, 1.2, 7850.0, 207e9
    ei = e * math.pi * d**4 / 64
    m = rho * math.pi * d**2 / 4
    exact_rpm = (math.pi / span) ** 2 * math.sqrt(ei / m) * RAD_S
    result = first_critical_speed([(0.0, span, ei, m)], (0.0, span), [])
    assert exact_rpm <= result.rayleigh_rpm <= exact_rpm * 1.002
    assert result.dunkerley_rpm == pytest.approx(exact_rpm, rel=2e-3)
    assert result.governing_rpm == min(result.rayleigh_rpm, result.dunkerley_rpm)
    assert "Rayleigh" in result.method and "Dunkerley" in result.method


def example_7_5_segments(with_shaft_mass: bool):
    d, span = 1.0 * IN_M, 31 * IN_M
    ei = 30e6 * PSI_PA * math.pi * d**4 / 64
    rho = 0.282 * LBF_N / IN_M**3 / G_N  # 0.282 lbf/in^3 as a mass density
    m = rho * math.pi * d**2 / 4 if with_shaft_mass else 0.0
    masses = [(7 * IN_M, 35 * LBF_N / G_N), (20 * IN_M, 55 * LBF_N / G_N)]
    return [(0.0, span, ei, m)], (0.0, span), masses


def test_example_7_5_rayleigh_and_dunkerley_loads_only():
    """Ex. 7-5 (b), (d): Rayleigh 124.8 rad/s, Dunkerley 120.4 rad/s (from memory). rel 0.5 %."""
    result = first_critical_speed(*example_7_5_segments(False))
    assert result.rayleigh_rpm == pytest.approx(124.8 * RAD_S, rel=5e-3)
    assert result.rayleigh_rpm == pytest.approx(1192, rel=5e-3)
    assert result.dunkerley_rpm == pytest.approx(120.4 * RAD_S, rel=5e-3)
    assert result.governing_rpm == result.dunkerley_rpm
    assert result.shaft_only_rpm is None


def test_example_7_5_with_the_shaft_mass():
    """Ex. 7-5 (f): shaft alone 520.4 rad/s; 1/w^2 = 1/120.4^2 + 1/520.4^2 -> 117.3 rad/s
    (from memory). rel 0.5 %. Rayleigh with the shaft's mass stays above Dunkerley's."""
    result = first_critical_speed(*example_7_5_segments(True))
    assert result.shaft_only_rpm == pytest.approx(520.4 * RAD_S, rel=5e-3)
    assert result.dunkerley_rpm == pytest.approx(117.3 * RAD_S, rel=5e-3)
    assert result.rayleigh_rpm > result.dunkerley_rpm
    assert result.rayleigh_rpm < 124.8 * RAD_S  # the shaft's mass lowers it


def test_single_mass_on_a_stepped_shaft():
    """One mass on a massless shaft: omega = sqrt(g / delta) exactly (Rayleigh = Dunkerley), with
    delta = 3 W L^3 / (256 E I) for the stepped shaft of test_beam (moment-area). rel 1e-6."""
    L, ei, mass = 1.0, 200e9 * 0.3e-6, 400.0 / G_N
    segments = [(0.0, L / 4, ei, 0.0), (L / 4, 3 * L / 4, 2 * ei, 0.0), (3 * L / 4, L, ei, 0.0)]
    delta = 3 * mass * G_N * L**3 / (256 * ei)
    expected = math.sqrt(G_N / delta) * RAD_S
    result = first_critical_speed(segments, (0.0, L), [(L / 2, mass)])
    assert result.rayleigh_rpm == pytest.approx(expected, rel=1e-6)
    assert result.dunkerley_rpm == pytest.approx(expected, rel=1e-6)


def test_overhung_mass_single_closed_form():
    """One overhung mass on a massless uniform shaft: delta = a^2 (l + a) / (3 EI) per newton
    (Shigley 9th ed. Table A-9 case 10), omega = sqrt(1 / (m delta)). rel 1e-6."""
    span, a, ei, mass = 0.5, 0.1, 207e9 * math.pi * 0.03**4 / 64, 8.0
    result = first_critical_speed([(0.0, span + a, ei, 0.0)], (0.0, span), [(span + a, mass)])
    expected = math.sqrt(3 * ei / (mass * a**2 * (span + a))) * RAD_S
    assert result.rayleigh_rpm == pytest.approx(expected, rel=1e-6)
    assert result.dunkerley_rpm == pytest.approx(expected, rel=1e-6)


def test_overhung_and_inboard_masses_bracket():
    """Overhung pulley plus the shaft's mass: Dunkerley <= Rayleigh, governing is the lower."""
    ei, m = 207e9 * math.pi * 0.035**4 / 64, 7850 * math.pi * 0.035**2 / 4
    result = first_critical_speed([(0.0, 0.7, ei, m)], (0.05, 0.55), [(0.65, 12.0), (0.3, 5.0)])
    assert result.dunkerley_rpm <= result.rayleigh_rpm
    assert result.governing_rpm == result.dunkerley_rpm


def test_nothing_with_mass_is_refused():
    from workbench.core.beam import BeamInputError

    with pytest.raises(BeamInputError):
        first_critical_speed([(0.0, 0.5, 1e4, 0.0)], (0.0, 0.5), [])
