"""The turning sheet shown: one table per shaft for the terminal report, the job card's own page
per shaft, and plain rows for the workbench view. Reads the result dict only (``turning``,
``keyseat``, ``turning_sheet`` of each shaft; ``turning_sheets`` says which shafts to show).
"""

from __future__ import annotations

from typing import Any, Mapping

HEADINGS = ("step", "size", "limits mm / in", "length", "fillet r", "Ra um")
M_PER_IN = 0.0254


def sheet_shafts(result: Mapping[str, Any], which: str | None = None) -> list[Mapping[str, Any]]:
    """The shafts whose sheet to show: the candidate (default), the shaft as found, or both; the
    only shaft when the job has one."""
    which = which or result.get("turning_sheets") or "candidate"
    shafts = [s for s in result.get("shafts") or [] if s.get("turning")]
    if which == "both" or len(shafts) <= 1:
        return shafts
    wanted = "candidate" if which == "candidate" else "existing"
    chosen = [s for s in shafts if s.get("role") == wanted]
    return chosen or shafts[-1:]


def _mm(value_m: float | None, decimals: int = 3) -> str:
    return "-" if value_m is None else f"{value_m * 1000:.{decimals}f}"


def _in(value_m: float | None) -> str:
    return "-" if value_m is None else f"{value_m / M_PER_IN:.4f}"


def _fillet(row: Mapping[str, Any]) -> str:
    low, high = row.get("fillet_min_m"), row.get("fillet_max_m")
    if low is None and high is None:
        return "-"
    if high is None:
        return f">={low * 1000:g} mm"
    return f"{(low or 0) * 1000:g}-{high * 1000:g} mm"


def sheet_rows(shaft: Mapping[str, Any], system: str = "metric") -> list[tuple[str, ...]]:
    """One tuple of strings per turned step: step, size and class, limits (min-max) in mm and in
    inches to 0.0001 in on two lines, length, fillet window, Ra. ``system`` inch puts inches first."""
    out = []
    for row in shaft.get("turning") or []:
        size = f"{_in(row['diameter_m'])} in" if system == "inch" else f"{row['diameter_m'] * 1000:g} mm"
        length = "-" if row.get("length_m") is None else (
            f"{_in(row['length_m'])} in" if system == "inch" else f"{row['length_m'] * 1000:.4g} mm")
        mm, inch = f"{_mm(row['min_m'])}-{_mm(row['max_m'])}", f"{_in(row['min_m'])}-{_in(row['max_m'])}"
        limits = f"{inch} in\n{mm}" if system == "inch" else f"{mm}\n{inch} in"
        out.append((str(row.get("label") or row["step"]), f"{size} {row['class']}", limits,
                    length, _fillet(row), f"{row['finish_Ra_um']:g}"))
    return out


def keyseat_lines(shaft: Mapping[str, Any]) -> list[str]:
    """The keyseat to cut, in words (empty when the shaft is not keyed)."""
    k = shaft.get("keyseat")
    if not k:
        return []
    inch = k.get("standard") == "ANSI B17.1"

    def size(v):
        return f"{v / M_PER_IN:.4f} in" if inch else f"{v * 1000:.3f} mm"

    length = "" if k.get("length_m") is None else f", length {size(k['length_m'])} (hub length)"
    return [
        f"keyseat ({k['standard']}, {k['key_fit']} fit): width {size(k['key_width_m'])} {k['width_class']} = "
        f"{size(k['width_min_m'])} to {size(k['width_max_m'])}{length}; hub {k['hub_width_class']} "
        f"{size(k['hub_width_min_m'])} to {size(k['hub_width_max_m'])}",
        f"micrometer over the keyseat ({k.get('reading_rule', 'd - t1')}): {size(k['depth_m'])} +0 / -{size(k['depth_tolerance_m'])} "
        f"(t1 = {size(k['shaft_depth_m'])})",
    ]


def fit_lines(shaft: Mapping[str, Any]) -> list[str]:
    """The fit each journal and seat makes, the bearing named, and the sheet's notes."""
    lines = []
    info = shaft.get("turning_sheet") or {}
    b = info.get("bearing")
    if b:
        lines.append(f"bearing {b['designation']} ({b['kind']}): bore {b['bore_m'] * 1000:g} mm "
                     f"{b['bore_upper_deviation_m'] * 1e6:+g}/{b['bore_lower_deviation_m'] * 1e6:+g} um (ISO 492 Normal), "
                     f"OD {b['outside_m'] * 1000:g} mm, width {b['width_m'] * 1000:g} mm, corner r min {b['corner_radius_m'] * 1000:g} mm")
    for row in shaft.get("turning") or []:
        f = row.get("fit")
        if f:
            against = "the bearing bore" if "bearing" in f.get("basis", "") else f"a hub bored {f.get('hub_class', 'H7')}"
            lines.append(f"{row.get('label') or row['step']} {row['class']} on {against}: {f['kind']}, clearance "
                         f"{f['max_clearance_m'] * 1e6:+.0f} to {f['min_clearance_m'] * 1e6:+.0f} um "
                         f"(negative = interference) - {row['reason']}")
    lines.extend(f"note: {n}" for n in info.get("notes") or [])
    return lines


def render_turning(result: Mapping[str, Any], system: str = "metric"):
    """The turning sheets as Rich renderables for the CLI report (None when there is none)."""
    from rich.console import Group
    from rich.panel import Panel
    from rich.table import Table
    from rich.text import Text

    panels = []
    for shaft in sheet_shafts(result):
        from rich import box

        table = Table(expand=False, pad_edge=False, box=box.SIMPLE_HEAD)
        for name in HEADINGS:
            table.add_column(name, no_wrap=name.startswith("limits"))
        for row in sheet_rows(shaft, system):
            table.add_row(*(Text(cell) for cell in row))
        extra = [Text(line) for line in keyseat_lines(shaft) + fit_lines(shaft)]
        title = f"Turning sheet — {shaft.get('role', 'shaft')} {shaft.get('spec', '')}"
        panels.append(Panel(Group(table, *extra), title=Text(title), title_align="left"))
    return Group(*panels) if panels else None


# --------------------------------------------------------------------------- the job card's pages


def _card_section(role: str):
    def build(job):
        from workbench.report.card_page import PageSection, esc, grid

        shafts = [s for s in sheet_shafts(job.result) if s.get("role") == role]
        if not shafts:
            return None
        shaft = shafts[0]
        table = grid(HEADINGS, ([c.replace("\n", " / ") for c in row] for row in sheet_rows(shaft, "metric")))
        lines = "".join(f"<p>{esc(line)}</p>" for line in keyseat_lines(shaft) + fit_lines(shaft))
        caution = ("<p>Turn to the limits above; measure at 20 degC or correct for temperature. "
                   "A bench check, not a design approval: lock out the drive before fitting.</p>")
        title = f"Turning sheet - {role} {shaft.get('spec', '')}"
        return PageSection(f"turning-{role}", title, table + lines + caution, own_page=True)

    return build


def register_card_sections() -> None:
    """Add one own-page turning sheet per shaft (candidate first) after the card's sections."""
    from workbench.report.card_page import add_section

    add_section("turning-candidate", _card_section("candidate"))
    add_section("turning-existing", _card_section("existing"))
