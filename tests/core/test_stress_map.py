"""The relative shear-stress map: exact fields where they exist, the solver elsewhere.

Sources: Timoshenko & Goodier, Theory of Elasticity, 3rd ed. (T&G): circle §104, hollow circle
§115, rectangle series §109. Tolerances per test.
"""

from __future__ import annotations


import numpy as np
import pytest

from workbench.core.geometry import ShaftGeometry
from workbench.core.stress_map import (
    StressMap,
    rectangle_peak_shear,
    rectangle_shear_components,
    shear_stress_map,
)


def _centres(width_m, height_m, cols, rows):
    xs = -width_m / 2 + (np.arange(cols) + 0.5) * width_m / cols
    ys = height_m / 2 - (np.arange(rows) + 0.5) * height_m / rows
    return xs[None, :], ys[:, None]


def test_round_map_is_r_over_R():
    # T&G §104: tau = T r / J, so tau/tau_max = r / R exactly (1e-12)
    d = 0.04
    m = shear_stress_map(ShaftGeometry("round", d), 30, 20)
    assert isinstance(m, StressMap)
    assert m.inside.shape == (20, 30) and m.tau_rel.shape == (20, 30)
    x, y = _centres(d, d, 30, 20)
    r = np.hypot(x, y)
    assert np.array_equal(m.inside, r <= d / 2)
    assert np.allclose(m.tau_rel[m.inside], (r / (d / 2))[m.inside], atol=1e-12)
    assert (m.tau_rel[~m.inside] == 0).all()
    assert m.method.startswith("exact")


def test_tube_map_excludes_the_bore():
    # T&G §115: tau/tau_max = r / R_outer on R_inner <= r <= R_outer
    m = shear_stress_map(ShaftGeometry("tube", 0.06, 0.04), 40, 40)
    x, y = _centres(0.06, 0.06, 40, 40)
    r = np.hypot(x, y)
    assert not m.inside[20, 20]  # the centre cell is in the bore
    assert np.array_equal(m.inside, (r <= 0.03) & (r >= 0.02))
    assert m.tau_rel[m.inside].min() >= 0.02 / 0.03 - 1e-12


@pytest.mark.parametrize("width,height", [(0.02, 0.02), (0.05, 0.02), (0.01, 0.03)])
def test_rectangle_series_boundary_conditions(width, height):
    # T&G §109: the stress is tangent to a free side (tau_xz = 0 on x = +/-w/2, tau_yz = 0 on
    # y = +/-h/2), zero at the corners and at the centre; peak at the middle of the long sides.
    # Tolerance 0.2 % of the peak (series truncated at 400 terms).
    peak = rectangle_peak_shear(width, height)
    t = np.linspace(-0.45, 0.45, 19)
    txz, _ = rectangle_shear_components(width, height, np.full_like(t, width / 2), t * height)
    _, tyz = rectangle_shear_components(width, height, t * width, np.full_like(t, height / 2))
    assert np.abs(txz).max() < 2e-3 * peak
    assert np.abs(tyz).max() < 2e-3 * peak
    corner = np.hypot(*rectangle_shear_components(width, height, np.array(width / 2), np.array(height / 2)))
    centre = np.hypot(*rectangle_shear_components(width, height, np.array(0.0), np.array(0.0)))
    assert corner < 2e-3 * peak and centre < 1e-12
    long_mid = (0.0, height / 2) if width >= height else (width / 2, 0.0)
    at_mid = np.hypot(*rectangle_shear_components(width, height, np.array(long_mid[0]), np.array(long_mid[1])))
    # on the short-direction series' own edge (square case) the 1/n^2 tail leaves ~1e-6
    assert at_mid == pytest.approx(peak, rel=1e-5)


@pytest.mark.parametrize("aspect,k1,k2", [(1.0, 0.141, 0.208), (2.0, 0.229, 0.246), (10.0, 0.312, 0.312)])
def test_rectangle_peak_against_the_printed_table(aspect, k1, k2):
    # T&G §109 table (from memory): tau_max = T/(k2 b c^2) and T = G theta k1 b c^3, so the
    # peak per G theta is (k1/k2) c; within 0.5 % (3-digit table)
    c = 0.01
    assert rectangle_peak_shear(aspect * c, c) == pytest.approx(k1 / k2 * c, rel=0.005)


def test_rectangle_map_agrees_with_the_solver():
    # two independent methods on the same grid: series (T&G §109) vs finite elements, within
    # 2 % of the peak in every cell
    from workbench.core.torsion_solver import solve_torsion

    g = ShaftGeometry("flat", 0.05, 0.02)
    m = shear_stress_map(g, 50, 20)
    assert m.method.startswith("Saint-Venant series")
    s = solve_torsion(g)  # the solver's default resolution, not the map's
    inside, tau = s.shear_on_grid(50, 20)
    fe = np.nan_to_num(tau) / s.shear_per_torque_Pa_per_Nm
    assert inside.all() and m.inside.all()
    assert np.abs(fe - m.tau_rel).max() < 0.02
    # the hottest cells are at the middle of the long sides (rows 0 and 19)
    hot = np.unravel_index(np.argmax(m.tau_rel), m.tau_rel.shape)
    assert hot[0] in (0, 19) and abs(hot[1] - 24.5) <= 1


def test_keyed_round_uses_the_solver():
    m = shear_stress_map(ShaftGeometry("round", 0.035, keyed=True, key_width_m=0.010,
                                       key_depth_m=0.005, key_radius_m=0.0007), 60, 30)
    assert m.method.startswith("finite elements")
    assert m.inside.shape == (30, 60)
    assert not m.inside[0, 30]  # the keyseat, top centre
    assert m.inside[15, 30]
    vals = m.tau_rel[m.inside]
    assert vals.min() >= 0 and vals.max() <= 1
    assert vals.max() > 0.6  # a coarse grid misses the fillet's peak but sees the flanks
    assert (m.tau_rel[~m.inside] == 0).all()


@pytest.mark.parametrize("geometry", [
    ShaftGeometry("hex", 0.03),
    ShaftGeometry("square", 0.03, corner_radius_m=0.003),
    ShaftGeometry("square", 0.03, chamfer_m=0.003),
    ShaftGeometry("round", 0.03, flats=2, flat_depth_m=0.003),
])
def test_other_profiles_use_the_solver(geometry):
    m = shear_stress_map(geometry, 24, 12)
    assert m.method.startswith("finite elements")
    assert 0.8 < m.tau_rel.max() <= 1.0
    assert m.inside.sum() > 0.5 * m.inside.size


def test_map_is_cached_and_read_only():
    g = ShaftGeometry("hex", 0.025)
    a = shear_stress_map(g, 20, 10)
    b = shear_stress_map(ShaftGeometry("hex", 0.025, finish="ground"), 20, 10)
    assert a is b
    with pytest.raises(ValueError):
        a.tau_rel[0, 0] = 0.5
    with pytest.raises(ValueError):
        shear_stress_map(g, 0, 10)


def test_symmetry_of_the_hexagon_map():
    # the hexagon is symmetric about both axes, its mesh is not: mirrored cells agree to the
    # discretisation error of the recovered gradient -- median 0.5 %, worst cell 4 % of the peak
    # (measured 0.16 % / 2.7 % at MAP_RESOLUTION 16; the worst cells hug the boundary)
    m = shear_stress_map(ShaftGeometry("hex", 0.03), 40, 40)
    assert np.array_equal(m.inside, m.inside[::-1, :])
    assert np.array_equal(m.inside, m.inside[:, ::-1])
    for mirrored in (m.tau_rel[::-1, :], m.tau_rel[:, ::-1]):
        diff = np.abs(m.tau_rel - mirrored)[m.inside]
        assert np.median(diff) < 0.005
        assert diff.max() < 0.04
