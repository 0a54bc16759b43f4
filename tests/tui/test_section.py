"""The section view: both sections on one length scale and one absolute shear scale, the peak and
where it sits, and the keyseat solver beside the handbook factor.

Check values (each with its source and tolerance):
- design torque of the demo job, T = 9549.297 P[kW] / n[rpm] x ratio x efficiency x service factor
  (power-torque constant 60000/2pi; shop data, computed) = 226.04 N m, tolerance 1e-4 relative;
- square bar peak shear tau = T / (alpha b c^2), alpha = 0.208 for b/c = 1 (Shigley's Mechanical
  Engineering Design, 9th ed., Sec. 3-12, Eq. 3-40 and its table of alpha), tolerance 0.5 %;
- round bar peak shear tau = 16 T / (pi d^3) (Shigley 9th ed., Eq. 3-37), tolerance 1e-6;
- handbook keyseat peak = 16 T / (pi d^3) x Kts with Kts = 3.0 for an end-mill keyseat
  (Shigley 9th ed., Table 7-1), tolerance 1e-6.
"""

from __future__ import annotations

import math

import pytest
from textual.widgets import LoadingIndicator, Static

from workbench.demo import demo_inputs
from workbench.tui import engine
from workbench.tui.screens.section import SectionScreen, scale_bounds
from workbench.tui.widgets.section_plot import PEAK_MARK, render_map

from .conftest import plain_text, settle

DEMO_TORQUE_NM = 9549.297 * 7.5 / 1460 * 3.2 * 0.96 * 1.5  # 226.04 N m


def _by_role(view):
    return {s["role"]: s for s in view["sections"]}


def test_demo_sections_share_one_absolute_scale():
    view = engine.section_view(demo_inputs(), 34, 17)
    assert view["design_torque_Nm"] == pytest.approx(DEMO_TORQUE_NM, rel=1e-4)
    shaft, candidate = _by_role(view)["shaft"], _by_role(view)["candidate"]
    # square 45 mm: tau = T / (0.208 a^3) (Shigley 9th ed., Eq. 3-40), 0.5 %
    assert candidate["peak_Pa"] == pytest.approx(DEMO_TORQUE_NM / (0.208 * 0.045**3), rel=5e-3)
    assert candidate["peak_place"] == "mid-side"
    # the common scale is the larger peak: the keyseat's, not the square's
    assert view["scale_Pa"] == max(shaft["peak_Pa"], candidate["peak_Pa"]) == shaft["peak_Pa"]
    for section in (shaft, candidate):
        cells = [t for row, ins in zip(section["tau_Pa"], section["inside"]) for t, i in zip(row, ins) if i]
        assert max(cells) <= section["peak_Pa"] * (1 + 1e-9)
        assert max(cells) > 0.5 * section["peak_Pa"]  # the grid reaches the high-stress region
    # drawn on one scale, the square's hottest cells sit in a lower band than its own peak would
    square_steps = {ch for ch in render_map(candidate, colour=False, scale_Pa=view["scale_Pa"]).plain}
    assert "█" not in square_steps and "▓" not in square_steps
    assert "█" in render_map(candidate, colour=False).plain  # its own peak: the top band


def test_keyseat_solver_beside_handbook_factor():
    view = engine.section_view(demo_inputs(), 34, 17)
    shaft = _by_role(view)["shaft"]
    nominal_Pa = 16 * DEMO_TORQUE_NM / (math.pi * 0.04**3)  # Shigley 9th ed., Eq. 3-37
    assert shaft["nominal_Pa"] == pytest.approx(nominal_Pa, rel=1e-4)
    keyseat = shaft["keyseat"]
    # handbook: nominal x Kts 3.0 (Shigley 9th ed., Table 7-1, end-mill keyseat)
    assert keyseat["Kts_handbook"] == 3.0
    assert keyseat["handbook_peak_Pa"] == pytest.approx(3.0 * nominal_Pa, rel=1e-4)
    # the solver's long-keyseat peak lies above the plain round and below the handbook figure
    # with the DIN 6885-1 bottom radius r1 (0.25 mm for b = 12) the solver reads near the handbook's 3.0
    assert 1.0 < keyseat["Kts_solver"] < 1.2 * keyseat["Kts_handbook"]
    assert keyseat["solver_peak_Pa"] == pytest.approx(keyseat["Kts_solver"] * nominal_Pa, rel=1e-3)
    assert shaft["peak_Pa"] == keyseat["solver_peak_Pa"]
    assert shaft["peak_place"] == "at the keyseat corner"
    row, col = shaft["peak_cell"]
    assert row <= 2  # top of the drawing (keyseat on +y); with the standard's small radius either corner may peak
    assert PEAK_MARK in render_map(shaft, colour=False).plain


def test_plain_round_peak_is_at_the_rim_and_field_is_linear():
    view = engine.section_view({"torque": "100", "shaft": "round 40mm"}, 21, 21)
    shaft = _by_role(view)["shaft"]
    assert shaft["peak_Pa"] == pytest.approx(16 * 100 / (math.pi * 0.04**3), rel=1e-6)
    assert shaft["peak_place"] == "at the rim" and shaft["peak_cell"] is None
    # tau = T r / J at each cell centre (exact field; Timoshenko & Goodier 3rd ed. §104), 1e-9
    rows, cols = len(shaft["tau_Pa"]), len(shaft["tau_Pa"][0])
    radius_m = 0.02
    for r, c in [(rows // 2, cols // 2), (0, cols // 2), (rows // 2, 1), (3, 4)]:
        x_m = -radius_m + (c + 0.5) * 0.04 / cols
        y_m = radius_m - (r + 0.5) * 0.04 / rows
        if shaft["inside"][r][c]:
            expected = shaft["peak_Pa"] * math.hypot(x_m, y_m) / radius_m
            assert shaft["tau_Pa"][r][c] == pytest.approx(expected, rel=1e-9)


@pytest.mark.parametrize(
    ("spec", "place"),
    [("round 40mm d-flat 3mm", "mid-flat"), ("square 40mm radius 4mm", "mid-side"), ("hex 27mm", "mid-side")],
)
def test_solved_profiles_say_where_the_peak_is(spec, place):
    view = engine.section_view({"torque": "100", "shaft": spec}, 20, 10)
    shaft = _by_role(view)["shaft"]
    assert shaft["peak_place"] == place
    assert shaft["peak_cell"] is not None and shaft["method"].startswith("finite elements")


def test_grid_sizes_keep_one_length_scale():
    # a 40 mm round beside a 60 x 30 mm flat: the flat fills 34 columns, the round 40/60 of that;
    # a cell is twice as tall as wide, so 30 mm take 34 x 30/60 / 2 = 8.5 rows
    sizes = engine.grid_sizes([(0.040, 0.040), (0.060, 0.030)], 34, 17)
    assert sizes[1][0] == 34 and sizes[0][0] == round(34 * 40 / 60)
    cell_width_m = 0.060 / 34
    assert sizes[0][1] == round(0.040 / (2 * cell_width_m)) and sizes[1][1] in (8, 9)
    # limited by height: two 100 mm squares in a 50 x 10 box take 20 x 10
    assert engine.grid_sizes([(0.1, 0.1), (0.1, 0.1)], 50, 10) == [(20, 10), (20, 10)]


def test_without_a_design_torque_the_maps_stay_relative():
    view = engine.section_view({"shaft": "round 40mm keyed", "candidate": "square 40mm"}, 20, 10)
    assert view["scale_Pa"] is None and "power" in view["message"]
    assert all(s["peak_Pa"] is None and s["tau_Pa"] is None for s in view["sections"])
    assert all(any(any(row) for row in s["inside"]) for s in view["sections"])


def test_scale_bounds_in_both_systems():
    # 6 bands up to the peak; 41.8 MPa = 6.06 kpsi (NIST SP 811: 1 psi = 6894.757 Pa)
    assert scale_bounds(42e6, "metric") == ["≤7.00", "≤14.0", "≤21.0", "≤28.0", "≤35.0", "≤42.0"]
    assert scale_bounds(42e6, "inch")[-1] == "≤6.09"


async def test_section_screen_shows_peaks_solver_and_handbook(make_app):
    app = make_app(demo=True)
    async with app.run_test(size=(120, 40)) as pilot:
        await settle(pilot)
        await pilot.press("f2")
        await settle(pilot)
        screen = app.screen
        assert isinstance(screen, SectionScreen)
        assert not screen.query_one(LoadingIndicator).display  # the solve finished
        legend = plain_text(screen.query_one("#section-legend", Static))
        assert "one scale for both" in legend and "226 N·m" in legend
        shaft = plain_text(screen.query_one("#section-shaft", Static))
        for words in ("at the keyseat corner", "solver", "handbook", "Table 7-1", "run-out", "Kts"):
            assert words in shaft
        assert "mid-side" in plain_text(screen.query_one("#section-candidate", Static))
        await pilot.press("f5")
        assert "kpsi" in plain_text(screen.query_one("#section-legend", Static))
        assert "kpsi" in plain_text(screen.query_one("#section-shaft", Static))
