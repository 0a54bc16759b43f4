"""Rich renderings of a check, a substitution and a stock search, for the terminal report."""

from __future__ import annotations


from rich.console import Group
from rich.panel import Panel
from rich.table import Table
from rich.text import Text

from workbench.report import display as fmt
from workbench.report.steps import STEPS_LEGEND, is_numeric_column, shaft_checks, step_columns, steps_of, steps_rows

VERDICT_STYLE = {"pass": "bold green", "marginal": "bold yellow", "fail": "bold red"}


def verdict_text(word: str) -> Text:
    """The verdict as word + symbol (readable without colour)."""
    return Text(fmt.verdict(word), style=VERDICT_STYLE.get(word, "bold"))


def _drive_table(result: dict, system: str) -> Table:
    drive, mount = result["drive"], result["mount"]
    table = Table.grid(padding=(0, 2))
    table.add_column(style="dim")
    table.add_column()
    table.add_column(style="dim")
    table.add_column()
    power = "—" if drive["power_W"] is None else (
        f"{fmt.number(drive['power_W'] / 745.69987)} hp" if system == "inch" else f"{fmt.number(drive['power_W'] / 1000)} kW"
    )
    motor = "—" if drive["motor_speed_rpm"] is None else f"{fmt.number(drive['motor_speed_rpm'])} rpm"
    shaft = "—" if drive["shaft_speed_rpm"] is None else f"{fmt.number(drive['shaft_speed_rpm'])} rpm"
    table.add_row("power", power, "running torque", fmt.torque(drive["running_torque_Nm"], system))
    table.add_row("motor speed", motor, f"design torque (x{drive['service_factor']:g} service)",
                  fmt.torque(drive["design_torque_Nm"], system))
    table.add_row("ratio / efficiency", f"{drive['ratio']:g} / {drive['efficiency']:.0%}",
                  f"peak torque (x{drive['peak_factor']:g} start)", fmt.torque(drive["peak_torque_Nm"], system))
    table.add_row("shaft speed", shaft, "mounted", _mount_text(mount, system))
    if mount["side_load_N"]:
        table.add_row("side load (design)", fmt.force(mount["side_load_N"], system),
                      "bending moment", fmt.torque(mount["bending_moment_Nm"], system))
    return table


def _mount_text(mount: dict, system: str) -> str:
    if not mount["load_factor"]:
        return f"{mount['element']} (torque only)"
    return (f"{mount['element']} K={mount['load_factor']:g}, "
            f"{fmt.length(mount['pitch_diameter_m'], system)} pitch, {fmt.length(mount['overhang_m'], system)} overhang")


ROWS = (
    ("material", lambda s, u: s["material_name"]),
    ("max shear (design)", lambda s, u: fmt.stress(s["max_shear_stress_Pa"], u)),
    ("bending stress", lambda s, u: fmt.stress(s["bending_stress_Pa"], u)),
    ("von Mises / Tresca", lambda s, u: f"{fmt.stress(s['von_mises_stress_Pa'], u)} / {fmt.stress(s['tresca_stress_Pa'], u)}"),
    ("endurance limit Se", lambda s, u: fmt.stress(s["endurance_limit_Pa"], u)),
    ("Kf / Kfs", lambda s, u: f"{s['Kf']:.2f} / {s['Kfs']:.2f} ({s['feature']})"),
    ("static SF", lambda s, u: fmt.factor(s["static_safety_factor"])),
    ("fatigue SF", lambda s, u: f"{fmt.factor(s['fatigue_safety_factor'])} {s['fatigue_criterion']}"),
    ("twist", lambda s, u: f"{fmt.twist(s['twist_deg_per_m'], u)} (limit {fmt.twist(s['twist_limit_deg_per_m'], u)})"),
    ("mass", lambda s, u: fmt.mass_per_length(s["mass_kg_per_m"], u)),
)


def _shafts_table(result: dict, system: str) -> Table:
    table = Table(show_edge=False, expand=False, pad_edge=False)
    table.add_column("", style="dim", no_wrap=True)
    for shaft in result["shafts"]:
        table.add_column(Text(f"{shaft['role']}: {spec_label(shaft)}"), overflow="fold")
    for label, getter in ROWS:
        table.add_row(label, *(Text(getter(shaft, system)) for shaft in result["shafts"]))
    if any(shaft.get("buckling_safety_factor") is not None for shaft in result["shafts"]):
        table.add_row("buckling SF (thin tube)", *(Text(fmt.factor(shaft.get("buckling_safety_factor"))
                                                       if shaft.get("buckling_safety_factor") is not None else "—")
                                                  for shaft in result["shafts"]))
    table.add_row("verdict", *(verdict_text(shaft["verdict"]) for shaft in result["shafts"]))
    table.add_row("why", *(Text(shaft["why"]) for shaft in result["shafts"]))
    return table


def _across(spec: str) -> str:
    """A hex spec shown with "across flats" (its size is measured across the flats)."""
    return f"{spec} (across flats)" if spec.lower().startswith("hex ") and "across" not in spec else spec


def spec_label(shaft: dict) -> str:
    """A shaft's spec as shown: a hex size is said to be across flats."""
    spec = shaft["spec"]
    return f"{spec} (across flats)" if shaft.get("profile") == "hex" and "across" not in spec else spec


def warnings_text(result: dict) -> Text | None:
    """The job's warnings (assumptions and doubtful readings), one line each, for beside the verdict."""
    lines = result.get("warnings") or []
    if not lines:
        return None
    return Text("\n".join(f"⚠ {line}" for line in lines), style="yellow")


def steps_panel(result: dict, system: str) -> Panel | None:
    """Each shaft as its steps (◀ the governing one) and the whole-shaft checks; None if no steps."""
    parts = []
    for shaft in result["shafts"]:
        if not steps_of(shaft):
            continue
        table = Table(title=Text(f"{shaft['role']}: {shaft['spec']}"), title_justify="left",
                      box=None, show_edge=False, pad_edge=False, padding=(0, 1, 0, 0), header_style="bold underline")
        for column in step_columns(system):
            table.add_column(column, justify="right" if is_numeric_column(column) else "left",
                             no_wrap=not column.startswith("step"), min_width=8 if column == "step" else None)
        for row in steps_rows(shaft, system):
            table.add_row(*(Text(cell) for cell in row), style="bold" if "◀" in row[0] else "")
        parts.append(table)
        for label, value in shaft_checks(shaft, system):
            parts.append(Text.assemble((f"  {label}: ", "dim"), value))
    if not parts:
        return None
    parts.append(Text(STEPS_LEGEND, style="dim"))
    return Panel(Group(*parts), title="Steps", title_align="left")


def cautions_panel(cautions: list[str]) -> Panel:
    """The safety cautions, always shown."""
    body = Text("\n".join(f"! {line}" for line in cautions))
    return Panel(body, title="Safety", title_align="left", border_style="yellow")


def render_check(result: dict, system: str = "metric") -> Group:
    """The full report of one job as a Rich renderable."""
    parts = [
        Panel(_drive_table(result, system), title="Drive", title_align="left"),
        Panel(_shafts_table(result, system), title="Shafts", title_align="left"),
    ]
    comparison = result.get("comparison")
    summary = Text("Verdict: ")
    summary.append_text(verdict_text(result["verdict"]))
    if comparison:
        strength = comparison["strength_ratio"]
        summary.append(
            f"   candidate / existing: strength {'—' if strength is None else f'{strength:.2f}'}x, "
            f"stiffness {comparison['stiffness_ratio']:.2f}x, mass {comparison['mass_ratio']:.2f}x"
        )
    parts.append(summary)
    warned = warnings_text(result)
    if warned is not None:
        parts.append(warned)
    steps = steps_panel(result, system)
    if steps is not None:
        parts.append(steps)
    for shaft in result["shafts"]:
        solved = shaft.get("keyseat_solver")
        if solved:
            parts.append(Text(
                f"keyseat ({shaft['role']}): solver peak {fmt.stress(solved['peak_shear_stress_Pa'], system)}, "
                f"Kts {solved['Kts_solver']:.2f} by the solver vs {solved['Kts_handbook']:.2f} handbook (checks use "
                f"the handbook); J {solved['torsion_constant_ratio']:.0%} of the plain round — {solved['method']}"
            ))
        for note in [*shaft.get("notes", []), *shaft.get("steps_notes", [])]:
            parts.append(Text(f"note ({shaft['role']}): {note}", style="yellow"))
    from workbench.report.turning_sheet import render_turning

    sheets = render_turning(result, system)
    if sheets is not None:
        parts.append(sheets)
    parts.append(methods_panel(result))
    parts.append(cautions_panel(result["cautions"]))
    return Group(*parts)


def methods_panel(result: dict) -> Panel:
    """Where every figure comes from: each shaft's methods, the mount factor's source, the settings."""
    lines = Text()
    seen: dict[tuple[str, str], list[str]] = {}
    for shaft in result["shafts"]:
        for what, how in shaft["methods"].items():
            seen.setdefault((what, how), []).append(shaft["role"])
    every = len(result["shafts"])
    for (what, how), roles in seen.items():
        lines.append(f"{what}{'' if len(roles) == every else ' (' + ', '.join(roles) + ')'}: ", style="dim")
        lines.append(f"{how}\n")
    mount = result["mount"]
    lines.append("mount factor: ", style="dim")
    lines.append(f"{mount['element']} K = {mount['load_factor']:g} — {mount['source']}\n")
    settings = result["settings"]
    lines.append("verdict: ", style="dim")
    lines.append(f"required safety factor {settings['required_sf']:g}; reliability {settings['reliability']:g}; "
                 "marginal = within 10 % above the required factor, or twist over its limit; key factors count like "
                 "the others; a bearing slope over its limit or running at 75 % of the first critical speed is "
                 "marginal, over twice the slope limit or at 90 % fails")
    return Panel(lines, title="Methods and sources", title_align="left", border_style="dim")


def render_substitution(result: dict, system: str = "metric") -> Group:
    """Equivalent bars for the shaft as found, with their ratios and the fit facts."""
    table = Table(title=Text(f"Equivalents of {result['existing']['spec']} (plain sections, same material; "
                             "figures for the body step)"))
    for name in ("profile", "basis", "at least", "next stock up", "strength", "stiffness", "mass"):
        table.add_column(name)
    for row in result["equivalents"]:
        table.add_row(
            row["profile"], row["basis"], Text(_across(row["label"])), Text(_across(row.get("next_stock") or "—")),
            f"{row['strength_ratio']:.2f}", f"{row['stiffness_ratio']:.2f}", f"{row['mass_ratio']:.2f}",
        )
    facts = Text("\n".join(f"- {fact}" for fact in result["fit_facts"]))
    return Group(table, Panel(facts, title="Fit facts", title_align="left"), cautions_panel(result["cautions"]))



def render_stock(result: dict, system: str = "metric") -> Group:
    """Stock sizes checked as the candidate, smallest first, with the smallest that passes."""
    across = " (sizes across flats)" if result["profile"] == "hex" else ""
    table = Table(title=Text(f"{result['profile']} stock, {result['system']}{across}"))
    for name in ("size", "material", "verdict", "lowest SF", "governing", "mass", "journal"):
        table.add_column(name)
    for row in result["rows"]:
        journal = fmt.journal_limit(row["largest_journal_m"], system)
        if row["gives_existing_journal"] is False:
            journal += " *"
        governing = row["governing"] + (f" at {row['governing_step_label']}" if row.get("governing_step_label") else "")
        table.add_row(
            Text(row["label"]), row["material"], verdict_text(row["verdict"]),
            fmt.factor(row["min_safety_factor"]), Text(governing), fmt.mass_per_length(row["mass_kg_per_m"], system),
            journal,
        )
    lines = Text()
    for key, best in result["smallest"].items():
        lines.append(f"smallest that passes in {key}: ")
        lines.append(_across(best["spec"]), style="bold")
        lines.append("\n")
    for key, best in result.get("smallest_with_existing_journal", {}).items():
        if best is not result["smallest"].get(key) and best["spec"] != result["smallest"].get(key, {}).get("spec"):
            lines.append(f"smallest that passes and can be turned to the existing journals in {key}: ")
            lines.append(best["spec"], style="bold")
            lines.append("\n")
    if not result["smallest"]:
        lines.append("no stock size of this profile passes", style="bold red")
    if any(row["gives_existing_journal"] is False for row in result["rows"]):
        lines.append("\n* journal: the largest round a bar can be turned to is smaller than the existing "
                     "shaft; such a bar suits square-bore hubs and bearings, or bearings of that bore.")
    return Group(table, lines, cautions_panel(result["cautions"]))
