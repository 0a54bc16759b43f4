"""Sizes as a fitter measures them: an equivalent bar's exact size rounded to the caliper's step.

An equal-strength or equal-stiffness size is a least size (``square 39.2284mm``). At the bench it
is read off a caliper: to 0.1 mm in metric work, to 0.01 in in inch work (common practice). Each
outside size is rounded UP to that step and a tube's bore DOWN, so the rounded bar is never the
weaker; the exact figure stays in the JSON's ``size_m`` / ``second_m``.
"""

from __future__ import annotations

import dataclasses
import math

#: caliper step [m]: 0.1 mm metric, 0.01 in inch (common practice)
STEP_M = {"metric": 1e-4, "inch": 0.01 * 0.0254}


def _up(value_m: float, step_m: float) -> float:
    return math.ceil(value_m / step_m - 1e-9) * step_m


def _down(value_m: float, step_m: float) -> float:
    return math.floor(value_m / step_m + 1e-9) * step_m


def measured_size_text(geometry, system: str = "metric") -> str:
    """``square 39.3mm`` for a least size of 39.2284 mm (inch: ``square 1.55in``)."""
    step = STEP_M.get(system, STEP_M["metric"])
    second = geometry.second_m
    if second:
        second = _down(second, step) if geometry.profile == "tube" else _up(second, step)
    g = dataclasses.replace(geometry, size_m=_up(geometry.size_m, step), second_m=second)

    def size(value_m: float) -> str:
        if system == "inch":
            return f"{value_m / 0.0254:.2f}in"
        return f"{value_m * 1000:.1f}".rstrip("0").rstrip(".") + "mm"

    if g.profile == "tube":
        return f"tube {size(g.size_m)}/{size(g.second_m)}"
    if g.profile == "flat":
        return f"flat {size(g.size_m)} x {size(g.second_m)}"
    return f"{g.profile} {size(g.size_m)}"
