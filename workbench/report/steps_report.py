"""The steps of each shaft and the layout checks (key, slopes, critical speed) in the CLI report."""

from __future__ import annotations

from rich.panel import Panel
from rich.table import Table
from rich.text import Text

from workbench.report import display as fmt


def _layout_line(shaft: dict, system: str) -> str:
    parts = []
    key = shaft.get("key")
    if key:
        if key["shear_safety_factor"] is None:
            parts.append(f"key: needs {fmt.length(key['required_length_m'], system)} (no hub length given)")
        else:
            parts.append(f"key SF shear {fmt.factor(key['shear_safety_factor'])} / crushing "
                         f"{fmt.factor(key['crush_safety_factor'])} over {fmt.length(key['key_length_m'], system)}, "
                         f"needs {fmt.length(key['required_length_m'], system)}")
    if shaft.get("critical_speed_rpm"):
        parts.append(f"first critical {fmt.number(shaft['critical_speed_rpm'])} rpm")
    slopes = shaft.get("bearing_slopes_rad")
    if slopes:
        parts.append(f"bearing slopes {slopes[0]:.2g} / {slopes[1]:.2g} rad (limit {shaft['slope_limit_rad']:g})")
    if shaft.get("deflection_m"):
        parts.append(f"deflection at the element {fmt.length(shaft['deflection_m'], system)}")
    return "; ".join(parts)


def steps_panels(result: dict, system: str = "metric") -> list:
    """One panel per shaft: its steps with moment, torque, Kt/Kts and safety factors; the governing
    step marked; then the key, slope and critical-speed figures."""
    panels = []
    for shaft in result["shafts"]:
        steps = shaft.get("steps") or []
        if not steps:
            continue
        table = Table(show_edge=False, pad_edge=False)
        for name in ("", "step", "size", "M", "T", "Kt/Kts", "static", "fatigue"):
            table.add_column(name, no_wrap=name not in ("step", "size"))
        for i, step in enumerate(steps):
            mark = "▶" if i == shaft.get("governing_step") else ""
            size = fmt.length(step["diameter_m"], system)
            if step["kind"] == "shoulder" and step.get("larger_diameter_m"):
                size = f"{fmt.length(step['larger_diameter_m'], system)}→{size} r{fmt.length(step['fillet_m'], system)}"
            table.add_row(mark, Text(step["label"]), Text(size), fmt.torque(step["bending_moment_Nm"], system),
                          fmt.torque(step["torque_Nm"], system), f"{step['Kt']:.2f}/{step['Kts']:.2f}",
                          fmt.factor(step["static_safety_factor"]), fmt.factor(step["fatigue_safety_factor"]))
        line = _layout_line(shaft, system)
        body = Table.grid()
        body.add_row(table)
        if line:
            body.add_row(Text(line))
        for note in shaft.get("steps_notes") or []:
            body.add_row(Text(f"note: {note}", style="yellow"))
        panels.append(Panel(body, title=f"Steps: {shaft['role']} {shaft['spec']}", title_align="left"))
    return panels
