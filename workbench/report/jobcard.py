"""The job card: a one-page record of a checked job, for the file and the workshop wall.

Built from Rich renderables and exported through a recording Console as HTML, SVG or plain text.
Everything a person typed is shown literally (never read as markup, control characters replaced).
"""

from __future__ import annotations

import io
import math
import re
from collections.abc import Callable, Mapping
from datetime import datetime, timezone
from typing import Any

from rich import box
from rich.console import Console, Group, RenderableType
from rich.panel import Panel
from rich.table import Table
from rich.text import Text

FORMATS = ("html", "svg", "text")
CARD_TITLE = "Shaftbench job card"
VERDICT_STYLES = {"pass": "bold green", "marginal": "bold yellow", "fail": "bold red"}
_CONTROL = re.compile(r"[\x00-\x08\x0b-\x1f\x7f-\x9f]")


def literal(value: Any, style: str = "") -> Text:
    """User text as a Rich Text shown exactly as typed: no markup, control characters as '?'."""
    return Text(_CONTROL.sub("?", "" if value is None else str(value)), style=style)


def number(value: Any, scale: float = 1.0, unit: str = "") -> str:
    """A result figure for display: ``value / scale`` to about three significant figures, plus unit."""
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        return "-"
    shown = value / scale
    if math.isinf(shown):
        text = "no limit" if shown > 0 else "-inf"
    elif math.isnan(shown):
        text = "-"
    elif abs(shown) >= 100 or shown == 0:
        text = f"{shown:,.0f}"
    elif abs(shown) >= 10:
        text = f"{shown:.1f}"
    elif abs(shown) >= 0.1:
        text = f"{shown:.2f}"
    else:
        text = f"{shown:.3g}"
    return f"{text} {unit}".rstrip() if text not in ("-", "no limit") else text


def when(iso: str | None) -> str:
    """A stored UTC ISO time as ``2025-03-01 08:30 UTC`` (or '-')."""
    if not iso:
        return "-"
    try:
        return datetime.fromisoformat(iso).strftime("%Y-%m-%d %H:%M UTC")
    except ValueError:
        return str(iso)


def local_when(iso: str | None) -> str:
    """A stored UTC ISO time in this computer's local time with the zone named:
    ``2025-03-01 09:30 CET`` (a zone without a short name shows as ``UTC+05:30``), or '-'."""
    if not iso:
        return "-"
    try:
        moment = datetime.fromisoformat(str(iso).replace("Z", "+00:00"))
    except ValueError:
        return str(iso)
    if moment.tzinfo is None:
        moment = moment.replace(tzinfo=timezone.utc)
    try:
        local = moment.astimezone()
    except (OverflowError, OSError, ValueError):  # outside what the platform's clock functions hold
        local = moment.astimezone(timezone.utc)
    zone = local.tzname() or ""
    if not zone.isalpha():
        offset = local.strftime("%z")
        zone = f"UTC{offset[:3]}:{offset[3:]}" if offset and offset != "+0000" else "UTC"
    return f"{local:%Y-%m-%d %H:%M} {zone}"


def verdict_text(verdict: Any) -> Text:
    """The verdict word in capitals, coloured (the word carries the meaning, not the colour)."""
    word = verdict if isinstance(verdict, str) and verdict else "no verdict"
    return Text(word.upper(), style=VERDICT_STYLES.get(word, "bold"))


def _pairs(rows: list[tuple[str, Any]]) -> Table:
    table = Table.grid(padding=(0, 2))
    table.add_column(style="dim", no_wrap=True)
    table.add_column()
    for label, value in rows:
        table.add_row(label, value if isinstance(value, Text) else literal(value))
    return table


def _section(title: str, body: RenderableType) -> Panel:
    return Panel(body, title=Text(title, style="bold"), title_align="left", box=box.SQUARE, padding=(0, 1))


def drive_rows(result: Mapping[str, Any]) -> list[tuple[str, str]]:
    """The drive's figures as (label, shown value) rows (the card's Drive section)."""
    drive = result.get("drive") or {}
    return [
        ("motor power", number(drive.get("power_W"), 1000, "kW")),
        ("motor speed", number(drive.get("motor_speed_rpm"), 1, "rpm")),
        ("ratio / efficiency", f"{number(drive.get('ratio'))} / {number(drive.get('efficiency'))}"),
        ("service / peak factor", f"{number(drive.get('service_factor'))} / {number(drive.get('peak_factor'))}"),
        ("shaft speed", number(drive.get("shaft_speed_rpm"), 1, "rpm")),
        ("running torque", number(drive.get("running_torque_Nm"), 1, "N·m")),
        ("design torque", number(drive.get("design_torque_Nm"), 1, "N·m")),
        ("peak torque", number(drive.get("peak_torque_Nm"), 1, "N·m")),
    ]


def mount_rows(result: Mapping[str, Any]) -> list[tuple[str, str]]:
    """The mounted element's figures and the verdict's settings as (label, shown value) rows."""
    mount = result.get("mount") or {}
    settings = result.get("settings") or {}
    return [
        ("element", str(mount.get("element") or "-")),
        ("load factor", number(mount.get("load_factor"))),
        ("pitch diameter", number(mount.get("pitch_diameter_m"), 1e-3, "mm")),
        ("overhang", number(mount.get("overhang_m"), 1e-3, "mm")),
        ("side load", number(mount.get("side_load_N"), 1, "N")),
        ("bending moment", number(mount.get("bending_moment_Nm"), 1, "N·m")),
        ("required safety factor", number(settings.get("required_sf"))),
        ("fatigue criterion", str(settings.get("fatigue_criterion") or "-")),
    ]


def shafts_of(result: Mapping[str, Any]) -> list[Mapping[str, Any]]:
    """The result's shafts that are mappings (a damaged result may hold anything)."""
    return [s for s in (result.get("shafts") or []) if isinstance(s, Mapping)]


def _word(verdict: Any) -> str:
    return verdict.upper() if isinstance(verdict, str) and verdict else "NO VERDICT"


SHAFT_ROWS: list[tuple[str, Callable[[Mapping[str, Any]], str]]] = [
    ("spec", lambda s: str(s.get("spec", "")) + (" (across flats)" if s.get("profile") == "hex" else "")),
    ("material", lambda s: str(s.get("material_name") or s.get("material") or "")),
    ("max shear (torsion)", lambda s: number(s.get("max_shear_stress_Pa"), 1e6, "MPa")),
    ("bending stress", lambda s: number(s.get("bending_stress_Pa"), 1e6, "MPa")),
    ("von Mises stress", lambda s: number(s.get("von_mises_stress_Pa"), 1e6, "MPa")),
    ("endurance limit", lambda s: number(s.get("endurance_limit_Pa"), 1e6, "MPa")),
    ("twist", lambda s: f"{number(s.get('twist_deg_per_m'), 1, '°/m')} "
                        f"(limit {number(s.get('twist_limit_deg_per_m'), 1, '°/m')})"),
    ("static safety factor", lambda s: number(s.get("static_safety_factor"))),
    ("shear-yield safety factor", lambda s: number(s.get("shear_yield_safety_factor"))),
    ("fatigue safety factor", lambda s: number(s.get("fatigue_safety_factor"))),
    ("Kf / Kfs", lambda s: f"{number(s.get('Kf'))} / {number(s.get('Kfs'))} ({s.get('feature', '')})"),
    ("mass", lambda s: number(s.get("mass_kg_per_m"), 1, "kg/m")),
    ("verdict", lambda s: _word(s.get("verdict"))),
]
"""The rows of the card's Shafts table: (label, shaft -> shown value)."""

OUTCOMES = {"still-running": "still running", "failed": "failed again", "removed": "removed"}
"""Outcome words a job can record (``log edit --outcome``) and how the card says them."""


def outcome_rows(fitted: str, extra: Mapping[str, Any]) -> list[tuple[str, str]]:
    """What was fitted and how it ended, as (label, shown value) rows."""
    rows = [("fitted", fitted or "not recorded")]
    if extra.get("fitted_on"):
        rows.append(("fitted on", str(extra["fitted_on"])))
    outcome = extra.get("outcome")
    if outcome:
        shown = OUTCOMES.get(str(outcome), str(outcome))
        if extra.get("outcome_date"):
            shown += f" on {extra['outcome_date']}"
        rows.append(("outcome", shown))
    else:
        rows.append(("outcome", "not recorded"))
    if extra.get("updated_at") and (outcome or extra.get("fitted_on")):
        rows.append(("recorded", local_when(str(extra["updated_at"]))))
    return rows


def _drive(result: Mapping[str, Any]) -> Table:
    return _pairs(drive_rows(result))


def _mount(result: Mapping[str, Any]) -> Table:
    return _pairs(mount_rows(result))


def _shafts(result: Mapping[str, Any]) -> RenderableType:
    shafts = shafts_of(result)
    if not shafts:
        return Text("no shaft in this job", style="dim")
    table = Table(box=box.SIMPLE_HEAD, pad_edge=False, expand=True)
    table.add_column("", style="dim", no_wrap=True)
    for shaft in shafts:
        table.add_column(literal(shaft.get("role", "shaft")), ratio=1)
    for label, cell in SHAFT_ROWS:
        if label == "verdict":
            table.add_row(label, *(verdict_text(s.get("verdict")) for s in shafts))
        else:
            table.add_row(label, *(literal(cell(s)) for s in shafts))
    whys = [
        Text.assemble((f"{s.get('role', 'shaft')}: ", "dim"), literal(s.get("why", "")))
        for s in shafts
        if s.get("why")
    ]
    notes = [
        Text.assemble((f"note ({s.get('role', 'shaft')}): ", "dim"), literal(note))
        for s in shafts
        for note in (s.get("notes") or [])
    ]
    return Group(table, *whys, *notes)


def _steps(result: Mapping[str, Any]) -> RenderableType | None:
    """The steps table of each shaft (the governing step marked ◀), or None when none has steps."""
    from workbench.report.steps import STEPS_LEGEND, is_numeric_column, step_columns, shaft_checks, steps_of, steps_rows

    parts: list[RenderableType] = []
    for shaft in (s for s in (result.get("shafts") or []) if isinstance(s, Mapping)):
        if not steps_of(shaft):
            continue
        table = Table(box=None, pad_edge=False, expand=False, header_style="bold underline",
                      title=Text.assemble((f"{shaft.get('role', 'shaft')}: ", "bold"), literal(shaft.get("spec", ""))),
                      title_justify="left", padding=(0, 1, 0, 0))
        for column in step_columns():
            table.add_column(column, justify="right" if is_numeric_column(column) else "left",
                             no_wrap=not column.startswith("step"), min_width=8 if column == "step" else None)
        for row in steps_rows(shaft):
            table.add_row(*(literal(cell) for cell in row), style="bold" if "◀" in row[0] else "")
        parts.append(table)
        checks = shaft_checks(shaft)
        if checks:
            parts.append(_pairs(checks))
    if not parts:
        return None
    parts.append(Text(STEPS_LEGEND, style="dim"))
    return Group(*parts)


def deciding_shaft(result: Mapping[str, Any]) -> Mapping[str, Any]:
    """The shaft the overall verdict is about: the candidate if there is one, else the existing."""
    shafts = shafts_of(result)
    for role in ("candidate", "existing"):
        for shaft in shafts:
            if shaft.get("role") == role:
                return shaft
    return {}


def _verdict(result: Mapping[str, Any], fitted: str, extra: Mapping[str, Any]) -> RenderableType:
    shaft = deciding_shaft(result)
    line = Text.assemble(("Overall: ", "bold"), verdict_text(result.get("verdict")))
    if shaft:
        line.append_text(Text.assemble(("  — ", "dim"), literal(shaft.get("role", "")), (" ", "dim"),
                                       literal(shaft.get("spec", ""))))
    parts: list[RenderableType] = [line]
    if shaft.get("governing"):
        parts.append(Text.assemble(("governed by: ", "dim"), literal(shaft.get("governing"))))
    if shaft.get("why"):
        parts.append(Text.assemble(("why: ", "dim"), literal(shaft.get("why"))))
    comparison = result.get("comparison") or {}
    if comparison:
        parts.append(Text.assemble(
            ("candidate / existing: ", "dim"),
            f"strength {number(comparison.get('strength_ratio'))}, "
            f"stiffness {number(comparison.get('stiffness_ratio'))}, "
            f"mass {number(comparison.get('mass_ratio'))}",
        ))
    for label, value in outcome_rows(fitted, extra):
        parts.append(Text.assemble((f"{label}: ", "dim"), literal(value)))
    return Group(*parts)


def _cautions(result: Mapping[str, Any]) -> RenderableType:
    cautions = result.get("cautions") or []
    if not cautions:
        return Text("none listed", style="dim")
    table = Table.grid(padding=(0, 1))
    table.add_column(no_wrap=True)
    table.add_column()
    for caution in cautions:
        table.add_row("-", literal(caution))
    return table


def _signatures() -> Table:
    table = Table.grid(padding=(1, 4), expand=True)
    for _ in range(3):
        table.add_column(ratio=1)
    line = "_" * 22
    table.add_row(f"Fitted by\n\n{line}", f"Checked by\n\n{line}", f"Date\n\n{line}")
    return table


def job_card(
    result: Mapping[str, Any],
    *,
    asset: str = "",
    location: str = "",
    by: str = "",
    note: str = "",
    fitted: str = "",
    job_id: int | None = None,
    created_at: str | None = None,
    program_version: str = "",
    extra: Mapping[str, Any] | None = None,
) -> RenderableType:
    """The job card as one Rich renderable (a saved job or one not saved yet); ``extra`` holds the
    recorded outcome (``outcome``, ``outcome_date``, ``fitted_on``, ``updated_at``) if any."""
    heading = Text(CARD_TITLE, style="bold")
    if job_id is not None:
        heading.append(f"  job {job_id}", style="bold")
    head = _pairs([
        ("asset", literal(asset or "-")),
        ("location", literal(location or "-")),
        ("date", local_when(created_at)),
        ("checked by", literal(by or "-")),
        ("program", literal(program_version or (result.get("program") or {}).get("version", "-"))),
    ])
    notes = literal(note) if note else Text("none", style="dim")
    steps = _steps(result)
    return Panel(
        Group(
            head,
            _section("Drive", _drive(result)),
            _section("Mount", _mount(result)),
            _section("Shafts", _shafts(result)),
            *([_section("Steps", steps)] if steps is not None else []),
            _section("Verdict", _verdict(result, fitted, extra or {})),
            _section("Notes", notes),
            _section("Safety cautions", _cautions(result)),
            _section("Signatures", _signatures()),
        ),
        title=heading,
        box=box.HEAVY,
        padding=(0, 1),
    )


def job_card_for_record(record: Any) -> RenderableType:
    """The job card of a stored job (a ``workbench.store.JobRecord``)."""
    from workbench.report.card_page import CardJob

    job = CardJob.from_record(record)
    card = job_card(
        job.result, asset=job.asset, location=job.location, by=job.by, note=job.note, fitted=job.fitted,
        job_id=job.job_id, created_at=job.created_at, program_version=job.program_version, extra=job.extra,
    )
    from workbench.report.turning_sheet import render_turning

    sheets = render_turning(job.result) if job.result.get("shafts") else None
    return card if sheets is None else Group(card, sheets)  # the turning sheet after the card


def card_page_for_records(records: list[Any], *, paper: str | None = None) -> str:
    """The printable HTML page of stored jobs' cards, one page per job (see ``card_page``)."""
    from workbench.report.card_page import CardJob, card_page

    return card_page([CardJob.from_record(r) for r in records], paper=paper)


def export_card(card: RenderableType, fmt: str, *, width: int = 96) -> str:
    """The card exported as ``html``, ``svg`` or ``text`` through a recording Console.

    The ``html`` here is the terminal look in a ``<pre>``; the printable page the CLI and the
    workbench write is ``card_page_for_records`` (workbench/report/card_page.py).
    """
    if fmt not in FORMATS:
        raise ValueError(f"card format must be one of {', '.join(FORMATS)}, not {fmt!r}")
    console = Console(
        record=True,
        file=io.StringIO(),
        width=width,
        force_terminal=fmt != "text",
        color_system="truecolor" if fmt != "text" else None,
        legacy_windows=False,
    )
    console.print(card)
    from rich.terminal_theme import DEFAULT_TERMINAL_THEME  # black on white: it goes on paper

    if fmt == "html":
        return console.export_html(inline_styles=True, theme=DEFAULT_TERMINAL_THEME)
    if fmt == "svg":
        return console.export_svg(title=CARD_TITLE, theme=DEFAULT_TERMINAL_THEME)
    return console.export_text(styles=False)
