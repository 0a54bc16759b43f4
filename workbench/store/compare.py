"""Comparing a stored result with today's: which verdicts and key figures differ."""

from __future__ import annotations

import math
from collections.abc import Mapping
from typing import Any

from workbench.store.records import Difference

DRIVE_FIGURES = ("running_torque_Nm", "design_torque_Nm", "peak_torque_Nm", "shaft_speed_rpm")
MOUNT_FIGURES = ("side_load_N", "bending_moment_Nm")
SHAFT_FIGURES = (
    "verdict",
    "max_shear_stress_Pa",
    "bending_stress_Pa",
    "von_mises_stress_Pa",
    "twist_deg_per_m",
    "endurance_limit_Pa",
    "static_safety_factor",
    "shear_yield_safety_factor",
    "fatigue_safety_factor",
)


def _same(a: Any, b: Any, rel_tol: float) -> bool:
    numbers = (int, float)
    if isinstance(a, numbers) and isinstance(b, numbers) and not isinstance(a, bool) and not isinstance(b, bool):
        if math.isnan(a) or math.isnan(b):
            return math.isnan(a) and math.isnan(b)
        return math.isclose(a, b, rel_tol=rel_tol, abs_tol=1e-12)
    return a == b


def _shafts_by_role(result: Mapping[str, Any]) -> dict[str, Mapping[str, Any]]:
    shafts = result.get("shafts") or []
    return {str(s.get("role", i)): s for i, s in enumerate(shafts) if isinstance(s, Mapping)}


def compare_results(
    stored: Mapping[str, Any], now: Mapping[str, Any], rel_tol: float = 1e-3
) -> tuple[Difference, ...]:
    """The verdicts and key figures that differ between two results (numbers by ``rel_tol``).

    Compared: the overall verdict, the drive torques and shaft speed, the side load and bending
    moment, and for each shaft (matched by role) its verdict, stresses, twist, endurance limit and
    safety factors. The default tolerance of 0.1 % is below what any report shows.
    """
    found: list[Difference] = []

    def check(key: str, a: Any, b: Any) -> None:
        if not _same(a, b, rel_tol):
            found.append(Difference(key, a, b))

    check("verdict", stored.get("verdict"), now.get("verdict"))
    for group, names in (("drive", DRIVE_FIGURES), ("mount", MOUNT_FIGURES)):
        old = stored.get(group) or {}
        new = now.get(group) or {}
        for name in names:
            check(f"{group}.{name}", old.get(name), new.get(name))
    old_shafts, new_shafts = _shafts_by_role(stored), _shafts_by_role(now)
    for role in list(old_shafts) + [r for r in new_shafts if r not in old_shafts]:
        old, new = old_shafts.get(role), new_shafts.get(role)
        if old is None or new is None:
            check(f"{role}.spec", old and old.get("spec"), new and new.get("spec"))
            continue
        for name in SHAFT_FIGURES:
            check(f"{role}.{name}", old.get(name), new.get(name))
    return tuple(found)
