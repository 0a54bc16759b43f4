"""The shaft as steps, for display: names, the steps table and the whole-shaft checks.

Reads the ``steps`` part of a result dict (each shaft's ``steps`` list, ``governing_step``,
``key``, ``critical_speed_rpm``, ``deflection_m``, ``bearing_slopes_rad``) and turns it into
plain strings that the workbench, the CLI report and the job card all show the same way. Display
only: no calculation here. A result without steps (an older stored job) gives empty tables.
"""

from __future__ import annotations

import math
import re
from collections.abc import Mapping, Sequence
from typing import Any

from workbench.report import display

_ENDS_IN_SIZE = re.compile(r"\d\s*(mm|in|\")$")
KIND_NAMES = {"body": "body", "journal": "journal", "seat": "hub seat", "shoulder": "shoulder"}
KIND_LETTERS = {"body": "B", "journal": "J", "seat": "S", "shoulder": "|"}

NUMERIC_COLUMNS = frozenset({"M", "T", "static", "fatigue"})


def step_columns(system: str = "metric") -> tuple[str, ...]:
    """Headings of the steps table, units in the heading: at (from–to along the shaft), d (turned
    diameter; the body's inscribed size), r (fillet radius), M bending moment and T torque at the
    step, static and fatigue safety factors. Right-aligned columns start with M, T or a factor."""
    length, torque = ("in", "lbf·in") if system == "inch" else ("mm", "N·m")
    return ("#", "step", f"at {length}", f"d {length}", f"r {length}", f"M {torque}",
            f"T {torque}", "Kt/Kts", "static", "fatigue")


STEPS_LEGEND = ("◀ governing step · at: from–to along the shaft · d diameter · r fillet · M bending "
                "moment, T torque at the step · static / fatigue: safety factors")


def is_numeric_column(heading: str) -> bool:
    """True for the right-aligned columns of :func:`step_columns`."""
    return heading.split()[0] in NUMERIC_COLUMNS


def steps_of(shaft: Mapping[str, Any]) -> list[Mapping[str, Any]]:
    """The shaft's steps (an empty list when the result has none)."""
    steps = shaft.get("steps")
    if not isinstance(steps, Sequence) or isinstance(steps, str):
        return []
    return [s for s in steps if isinstance(s, Mapping)]


def governing_index(shaft: Mapping[str, Any]) -> int | None:
    """Index of the governing step, or None when the shaft has no (valid) one."""
    index = shaft.get("governing_step")
    if isinstance(index, bool) or not isinstance(index, int):
        return None
    return index if 0 <= index < len(steps_of(shaft)) else None


def _num(value: Any) -> float | None:
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        return None
    return float(value)


def step_name(step: Mapping[str, Any], system: str = "metric") -> str:
    """A step as a fitter reads it: its own label (e.g. "hub seat, keyseat") with its turned
    diameter added unless the label ends in a size; without a label "hub seat, keyed, 35.0 mm"."""
    label = step.get("label")
    diameter = _num(step.get("diameter_m"))
    if isinstance(label, str) and label.strip():
        label = label.strip()
        if diameter and not _ENDS_IN_SIZE.search(label):
            label = f"{label}, {display.length(diameter, system)}"
        return label
    kind = KIND_NAMES.get(str(step.get("kind")), str(step.get("kind", "step")))
    parts = [kind]
    if step.get("keyed"):
        parts.append("keyed")
    if diameter:
        parts.append(display.length(diameter, system))
    return ", ".join(parts)


def governing_step_name(shaft: Mapping[str, Any], system: str = "metric") -> str | None:
    """The governing step's name, or None when the shaft has no steps."""
    index = governing_index(shaft)
    return None if index is None else step_name(steps_of(shaft)[index], system)


def _bare_length(length_m: float | None, system: str) -> str:
    if length_m is None:
        return "—"
    return display.number(length_m / display.M_PER_IN if system == "inch" else length_m * 1000.0)


def _bare_torque(torque_Nm: float | None, system: str) -> str:
    if torque_Nm is None:
        return "—"
    return display.number(abs(torque_Nm) / display.NM_PER_LBF_IN if system == "inch" else abs(torque_Nm))


def _span(step: Mapping[str, Any], system: str) -> str:
    start, end = _num(step.get("x_start_m")), _num(step.get("x_end_m"))
    if start is None or end is None:
        return "—"
    if end == start:
        return f"at {_bare_length(start, system)}"
    if system == "inch":
        return f"{_bare_length(start, system)}–{_bare_length(end, system)}"
    return f"{start * 1000:.0f}–{end * 1000:.0f}"


def _fillet(step: Mapping[str, Any], system: str) -> str:
    fillet = _num(step.get("fillet_m"))
    if fillet is None:
        return "—"
    if fillet == 0:
        return "sharp"
    return _bare_length(fillet, system)


def step_row(index: int, step: Mapping[str, Any], system: str, governing: bool) -> list[str]:
    """One row of the steps table, as strings in :func:`step_columns` order (◀ marks governing)."""
    kt, kts = _num(step.get("Kt")), _num(step.get("Kts"))
    return [
        f"{index}{' ◀' if governing else ''}",
        step_name(step, system),
        _span(step, system),
        _bare_length(_num(step.get("diameter_m")), system),
        _fillet(step, system),
        _bare_torque(_num(step.get("bending_moment_Nm")), system),
        _bare_torque(_num(step.get("torque_Nm")), system),
        f"{display.factor(kt)}/{display.factor(kts)}",
        display.factor(_num(step.get("static_safety_factor"))),
        display.factor(_num(step.get("fatigue_safety_factor"))),
    ]


def steps_rows(shaft: Mapping[str, Any], system: str = "metric") -> list[list[str]]:
    """Every row of the shaft's steps table (empty when it has no steps)."""
    governing = governing_index(shaft)
    return [step_row(i, step, system, i == governing) for i, step in enumerate(steps_of(shaft))]


def shaft_checks(shaft: Mapping[str, Any], system: str = "metric") -> list[tuple[str, str]]:
    """(label, value) of the whole-shaft checks beside the steps: key, whirl, deflection, slopes.

    A check that could not be made (no bearing span given) reads "not checked".
    """
    rows: list[tuple[str, str]] = []
    key = shaft.get("key")
    if isinstance(key, Mapping):
        needed = _num(key.get("required_length_m"))
        need = f"needs {display.length(needed, system)} of key" if needed else ""
        if _num(key.get("shear_safety_factor")) is None:
            rows.append(("key shear / crushing", f"not checked (no hub length){' · ' + need if need else ''}"))
        else:
            rows.append((
                "key shear / crushing",
                f"{display.factor(_num(key.get('shear_safety_factor')))} / "
                f"{display.factor(_num(key.get('crush_safety_factor')))}" + (f" · {need}" if need else ""),
            ))
    if "critical_speed_rpm" in shaft:
        whirl = _num(shaft.get("critical_speed_rpm"))
        rows.append(("first critical speed", "not checked (no span)" if whirl is None
                     else f"{display.number(whirl)} rpm"))
    if "deflection_m" in shaft:
        rows.append(("deflection at the element", _deflection(shaft.get("deflection_m"), system)))
    if "bearing_slopes_rad" in shaft:
        slopes = _slopes(shaft.get("bearing_slopes_rad"))
        limit = _num(shaft.get("slope_limit_rad"))
        if limit is not None and not slopes.startswith("not"):
            slopes += f" (limit {display.number(limit, 2)} rad)"
        rows.append(("slope at the bearings", slopes))
    return rows


def _deflection(value: Any, system: str) -> str:
    if isinstance(value, Mapping):
        value = next((v for v in value.values() if _num(v) is not None), None)
    elif isinstance(value, Sequence) and not isinstance(value, str):
        numbers = [_num(v) for v in value if _num(v) is not None]
        value = max(numbers, key=abs) if numbers else None
    number = _num(value)
    if number is None:
        return "not checked (no span)"
    if system == "inch":
        return f"{display.number(abs(number) / display.M_PER_IN)} in"
    return f"{display.number(abs(number) * 1000.0)} mm"


def _slopes(value: Any) -> str:
    if isinstance(value, Mapping):
        value = list(value.values())
    if not isinstance(value, Sequence) or isinstance(value, str):
        return "not checked (no span)"
    numbers = [_num(v) for v in value]
    if not numbers or all(v is None for v in numbers):
        return "not checked (no span)"
    return " · ".join("—" if v is None else f"{display.number(abs(v), 2)} rad" for v in numbers)


def shaft_length_m(shafts: Sequence[Mapping[str, Any]]) -> float:
    """Overall length covered by the shafts' steps [m] (0 when none has steps)."""
    ends = [_num(s.get("x_end_m")) for shaft in shafts for s in steps_of(shaft)]
    ends = [e for e in ends if e is not None and math.isfinite(e)]
    return max(ends, default=0.0)
