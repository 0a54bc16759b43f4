"""Bearing slope limits (workbench.core.bearing_limits) against Shigley's MED 9th ed. Table 7-2.

Table 7-2 (V via a reproduction of the 9th ed., p. 379): tapered roller 0.0005-0.0012 rad,
cylindrical roller 0.0008-0.0012, deep-groove ball 0.001-0.003, spherical ball 0.026-0.052,
self-align ball 0.026-0.052, uncrowned spur gear < 0.0005. The limit is the lower end. Exact.
"""

from __future__ import annotations

import pytest

from workbench.core.bearing_limits import (DEFAULT_BEARING_TYPE, bearing_slope_row, bearing_types,
                                           slope_limit_rad)

TABLE_7_2 = {
    "tapered-roller": (0.0005, 0.0012),
    "cylindrical-roller": (0.0008, 0.0012),
    "deep-groove-ball": (0.001, 0.003),
    "spherical-ball": (0.026, 0.052),
    "self-aligning-ball": (0.026, 0.052),
    "uncrowned-spur-gear": (0.0005, 0.0005),
}


@pytest.mark.parametrize("name, published", TABLE_7_2.items())
def test_slope_limits_match_table_7_2(name, published):
    assert slope_limit_rad(name) == published[0]
    row = bearing_slope_row(name)
    assert (row.slope_min_rad, row.slope_max_rad) == published
    assert "Table 7-2" in row.source and row.mark == "V"


def test_spherical_roller_is_marked_from_memory():
    row = bearing_slope_row("spherical-roller")
    assert row.mark == "M" and "from memory" in row.source
    assert 0.0012 < row.slope_min_rad < 0.026  # between the rigid rollers and the self-aligning balls


def test_names_usable_on_the_command_line():
    names = bearing_types()
    for name in ("deep-groove-ball", "spherical-roller", "self-aligning-ball", "cylindrical-roller",
                 "tapered-roller"):
        assert name in names
    assert all(" " not in n and n == n.lower() for n in names)
    assert DEFAULT_BEARING_TYPE in names
    assert "uncrowned-spur-gear" not in names  # a gear mesh, not a bearing type to pick
    assert slope_limit_rad("Deep Groove Ball") == slope_limit_rad("deep-groove-ball")


def test_unknown_type_lists_the_names():
    with pytest.raises(ValueError) as err:
        slope_limit_rad("plain-bush")
    assert "plain-bush" in str(err.value) and "deep-groove-ball" in str(err.value)
