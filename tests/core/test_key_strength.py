"""Parallel-key strength (workbench.core.key_strength) against a published worked example.

Source: Shigley's Mechanical Engineering Design, 9th ed., Example 7-6 (figures from memory):
1-7/16 in shaft, 40 hp at 600 rev/min, 3/8 in square key of cold-drawn 1020 (S_y 65 kpsi),
shaft S_y 75 kpsi, design factor 2.80; F = T/r = 5850 lbf; shear needs l = 1.16 in, crushing
l = 1.34 in (S_sy = 0.577 S_y). The book rounds F and the strengths: tolerance 1 %.
"""

from __future__ import annotations

import pytest
from hypothesis import given, settings, strategies as st

from workbench.core.key_strength import (DEFAULT_HUB_MATERIAL, KeyCheck, hub_material, hub_materials,
                                         key_check)

IN_M = 0.0254  # exact, NIST SP 811 App. B.9
LBF_N = 4.4482216152605
KPSI_PA = 1000 * LBF_N / IN_M**2
HP_W = 745.69987158227022

TORQUE_NM = 40 * HP_W / (600 * 2 * 3.141592653589793 / 60)  # 4201.7 lbf in


def shigley_key(length_in: float, end: str = "square") -> KeyCheck:
    return key_check(TORQUE_NM, 1.4375 * IN_M, 0.375 * IN_M, 0.375 * IN_M, 0.1875 * IN_M,
                     length_in * IN_M, end, 65 * KPSI_PA, 75 * KPSI_PA, 75 * KPSI_PA, 2.80)


def test_shigley_example_7_6_required_length():
    """Crushing governs: l = 1.34 in (Shigley 9th ed. Ex. 7-6, from memory). rel 1 %."""
    result = shigley_key(1.5)
    assert result.required_length_m / IN_M == pytest.approx(1.34, rel=0.01)
    assert result.notes == ()  # the 1.5 in key is long enough


def test_shigley_example_7_6_shear_length():
    """A 1.16 in key has the design factor 2.80 in shear (Ex. 7-6, from memory). rel 1 %."""
    assert shigley_key(1.16).shear_safety_factor == pytest.approx(2.80, rel=0.01)


def test_shigley_example_7_6_crushing_length():
    """A 1.34 in key has the design factor 2.80 in crushing (Ex. 7-6, from memory). rel 1 %."""
    result = shigley_key(1.34)
    assert result.crush_safety_factor == pytest.approx(2.80, rel=0.01)
    assert "Shigley" in result.method and "DIN 6892" in result.method


def test_too_short_hub_says_so():
    """A 1 in key cannot give 2.80 in crushing (needs 1.34 in, Ex. 7-6): a note says so."""
    result = shigley_key(1.0)
    assert result.crush_safety_factor < 2.80
    assert result.notes and "too short" in result.notes[0] and "crushing" in result.notes[0]


def test_round_ended_key_loses_its_width():
    """DIN 6885-1 form A: bearing length l - b. A round-ended key of l + b = square key of l."""
    square = shigley_key(1.34)
    rounded = shigley_key(1.34 + 0.375, "round")
    assert rounded.effective_length_m == pytest.approx(square.effective_length_m, rel=1e-12)
    assert rounded.crush_safety_factor == pytest.approx(square.crush_safety_factor, rel=1e-12)
    assert rounded.required_length_m == pytest.approx(square.required_length_m + 0.375 * IN_M, rel=1e-12)


def test_din_key_hub_side_contact_height():
    """DIN 6885-1 key 10 x 8, t1 = 5.0 mm on a 35 mm shaft, 200 N m, round-ended 50 mm key.

    Hand calculation (DIN 6892 method C, nominal pressure): F = 2T/d = 11 428.6 N,
    l_eff = 50 - 10 = 40 mm; hub side contact h - t1 = 3 mm: p = 95.24 MPa, against a 235 MPa
    hub: n = 2.4675; shaft side t1 = 5 mm: p = 57.14 MPa against min(key 390, shaft 530) = 390:
    n = 6.83, so the hub side governs. Shear: tau = F / (10 x 40) = 28.57 MPa, n = 0.577 x 390 /
    28.57 = 7.876. rel 1e-3.
    """
    result = key_check(200.0, 0.035, 0.010, 0.008, 0.005, 0.050, "round", 390e6, 530e6, 235e6, 1.5)
    assert result.crush_safety_factor == pytest.approx(2.4675, rel=1e-3)
    assert result.shear_safety_factor == pytest.approx(7.876, rel=1e-3)
    # required: l_eff = 1.5 F / (235 MPa x 3 mm) = 24.32 mm, + b = 34.32 mm
    assert result.required_length_m == pytest.approx(0.03432, rel=1e-3)


@settings(max_examples=40, deadline=None)
@given(hub=st.floats(50e6, 1000e6), key=st.floats(200e6, 800e6), shaft=st.floats(200e6, 900e6))
def test_weakest_material_governs_crushing(hub, key, shaft):
    """Crushing never reads safer than the weakest of the three materials allows (hub side)."""
    result = key_check(200.0, 0.035, 0.010, 0.008, 0.005, 0.050, "square", key, shaft, hub, 1.5)
    force = 2 * 200.0 / 0.035
    hub_side = min(key, shaft, hub) * 0.003 * 0.050 / force
    assert result.crush_safety_factor <= hub_side * (1 + 1e-12)


@pytest.mark.parametrize("bad", [
    dict(key_end="hex"), dict(key_length_m=0.008, key_end="round"), dict(shaft_seat_depth_m=0.008),
    dict(torque_Nm=0.0)])
def test_bad_key_input_is_refused(bad):
    args = dict(torque_Nm=200.0, shaft_diameter_m=0.035, key_width_m=0.010, key_height_m=0.008,
                shaft_seat_depth_m=0.005, key_length_m=0.050, key_end="round", key_yield_Pa=390e6,
                shaft_yield_Pa=530e6, hub_yield_Pa=235e6, required_sf=1.5)
    args.update(bad)
    with pytest.raises(ValueError):
        key_check(**args)


def test_hub_materials_table():
    """Default steel (S235, 235 MPa from memory); 1045 HR 310 MPa (Shigley 9th ed. Table A-20)."""
    assert DEFAULT_HUB_MATERIAL == "steel"
    assert hub_material().yield_Pa == pytest.approx(235e6)
    assert hub_material("steel-1045").yield_Pa == pytest.approx(310e6)
    assert "Table A-20" in hub_material("steel-1045").source
    names = hub_materials()
    assert any(n.startswith("cast-iron") for n in names) and any(n.startswith("ductile") for n in names)
    assert all(m.source for m in names.values())
    # grey iron is weaker than the steels on the crushing check
    assert hub_material("cast-iron-200").yield_Pa < hub_material("steel").yield_Pa
    with pytest.raises(ValueError, match="steel"):
        hub_material("unobtainium")
