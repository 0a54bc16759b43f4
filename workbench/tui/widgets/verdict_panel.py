"""The verdict panel: the shaft as found and the candidate side by side, readable at a glance.

Top to bottom in the order a fitter needs them, so that the first lines fit any usable terminal:
the verdict word, the "not current" mark, why each shaft passes or not, the warnings about this
job's inputs, the facts the verdict rests on (a material's size range) and the candidate / as
found ratios; then the comparison table. F8 pages through the panel when it is longer than the
screen (the footer shows the key).
"""

from __future__ import annotations

from typing import Any

from rich.console import Group
from rich.text import Text
from textual.containers import VerticalScroll
from textual.widgets import Static

from workbench.report import display
from workbench.report.steps import governing_step_name, steps_of

from .steady import update_in_place

_ROLE_TITLE = {"existing": "as found", "candidate": "candidate"}


def governing_sf(shaft: dict[str, Any]) -> float | None:
    """The smallest of the shaft's safety factors (the one the verdict rests on)."""
    values = [
        shaft.get(k)
        for k in ("static_safety_factor", "fatigue_safety_factor", "shear_yield_safety_factor")
    ]
    values = [v for v in values if isinstance(v, (int, float))]
    return min(values) if values else None


def verdict_rows(result: dict[str, Any], system: str, gauge_width: int = 10):
    """(label, [cell per shaft]) rows of the comparison table, cells as plain strings."""
    shafts = result.get("shafts", [])
    drive = result.get("drive", {})
    required = float(result.get("settings", {}).get("required_sf", 1.5) or 1.5)

    def each(fn):
        return [fn(s) for s in shafts]

    stepped = [] if not any(steps_of(s) for s in shafts) else [
        ("governing step", each(lambda s: governing_step_name(s, system) or "—")),
    ]
    return [
        ("profile", each(lambda s: s.get("spec", "—"))),
        ("material", each(lambda s: s.get("material", "—"))),
        ("running torque", each(lambda s: display.torque(drive.get("running_torque_Nm"), system))),
        ("design torque", each(lambda s: display.torque(drive.get("design_torque_Nm"), system))),
        ("max shear", each(lambda s: display.stress(s.get("max_shear_stress_Pa"), system))),
        ("combined (vM)", each(lambda s: display.stress(s.get("von_mises_stress_Pa"), system))),
        ("static SF", each(lambda s: display.factor(s.get("static_safety_factor")))),
        ("fatigue SF", each(lambda s: display.factor(s.get("fatigue_safety_factor")))),
        *stepped,
        ("twist", each(lambda s: display.twist(s.get("twist_deg_per_m"), system))),
        ("mass", each(lambda s: display.mass_per_length(s.get("mass_kg_per_m"), system))),
        (
            f"margin ┃={display.factor(required)}",
            each(lambda s: display.margin_gauge(governing_sf(s), required, gauge_width)),
        ),
        ("verdict", each(lambda s: display.verdict(s.get("verdict")))),
    ]


class VerdictPanel(VerticalScroll, can_focus=False):
    """Shows a result dict; ``mark_stale`` dims it when the sheet no longer matches it."""

    def __init__(self, **kwargs) -> None:
        super().__init__(**kwargs)
        self.result: dict[str, Any] | None = None
        self.system = "metric"
        self.stale_note = ""

    def compose(self):
        yield Static(self._banner_text(), id="verdict-banner")
        yield Static("", id="verdict-status")
        yield Static("", id="verdict-why")
        yield Static("", id="verdict-table")

    def page(self) -> None:
        """Show the next screenful of the panel; from the end, back to the top."""
        if self.scroll_y >= self.max_scroll_y:
            self.scroll_home(animate=False)
        else:
            self.scroll_page_down(animate=False)

    def _banner_text(self) -> Text:
        if self.result is None:
            return Text("· VERDICT —  fill in the drive and a shaft", style="bold")
        word = self.result.get("verdict")
        shafts = self.result.get("shafts", [])
        shaft = next((s for s in shafts if s.get("role") == "candidate"), shafts[0] if shafts else {})
        who = "candidate" if shaft.get("role") == "candidate" else "shaft as found"
        # a stale verdict never reads as today's: the word says so, not the dimming alone
        was = "NOT CURRENT · was " if self.stale_note else ""
        return Text(f"{was}{display.verdict(word)}  {who} {shaft.get('spec', '')}", style="bold")

    def show(self, result: dict[str, Any] | None, system: str | None = None) -> None:
        """Display ``result`` (None clears the panel) fresh (not stale)."""
        self.result = result
        if system:
            self.system = system
        self.stale_note = ""
        self.remove_class("-stale")
        self.refresh_view()

    def set_system(self, system: str) -> None:
        """Redraw in "metric" or "inch"."""
        self.system = system
        self.refresh_view()

    def mark_stale(self, note: str) -> None:
        """Dim the last good result and say why it is not current."""
        self.stale_note = note
        self.set_class(self.result is not None, "-stale")
        self.refresh_view()

    def refresh_view(self) -> None:
        """Rebuild the panel's text from the held result."""
        banner = self.query_one("#verdict-banner", Static)
        update_in_place(banner, self._banner_text())
        word = (self.result or {}).get("verdict") or "none"
        for w in ("pass", "marginal", "fail", "none"):
            banner.set_class(w == word, f"-{w}")
        table_widget = self.query_one("#verdict-table", Static)
        why_widget = self.query_one("#verdict-why", Static)
        status = self.query_one("#verdict-status", Static)
        update_in_place(status, Text(self.stale_note) if self.stale_note else "")
        status.display = bool(self.stale_note)
        if self.result is None:
            update_in_place(table_widget, "")
            update_in_place(why_widget, "")
            return
        from rich.table import Table  # first needed with the first result, after the first paint

        shafts = self.result.get("shafts", [])
        table = Table(box=None, pad_edge=False, padding=(0, 1), expand=False, show_edge=False)
        table.add_column("", style="dim", no_wrap=True, min_width=14)
        for shaft in shafts:
            table.add_column(_ROLE_TITLE.get(shaft.get("role"), str(shaft.get("role"))), min_width=10)
        gauge_width = 10 if self.size.width >= 48 else 8
        for label, cells in verdict_rows(self.result, self.system, gauge_width):
            if label == "verdict":
                styled = [
                    Text(c, style=_rich_verdict_style(s.get("verdict"))) for c, s in zip(cells, shafts)
                ]
                table.add_row(label, *styled)
            else:
                table.add_row(label, *cells)
        drive = self.result.get("drive", {})
        head = Text(
            f"shaft {display.number(drive.get('shaft_speed_rpm'))} rpm · "
            f"side load {display.force(self.result.get('mount', {}).get('side_load_N'), self.system)}",
            style="dim",
        )
        update_in_place(table_widget, Group(head, table))
        lines = []
        for shaft in shafts:
            title = _ROLE_TITLE.get(shaft.get("role"), "shaft")
            lines.append(Text.assemble((f"why ({title}): ", "bold"), str(shaft.get("why", "—"))))
        from workbench.field_names import workbench_warning_lines  # field labels, not CLI options

        lines.extend(Text(f"! {w}") for w in workbench_warning_lines(self.result))
        lines.extend(Text(f"· {n}") for n in shaft_notes(shafts))
        ratios = ratio_line(self.result.get("comparison") or {})
        if ratios:
            lines.append(Text(ratios))
        cautions = self.result.get("cautions") or []
        if cautions:
            lines.append(Text(f"⚠ {len(cautions)} safety cautions — F1 to read them", style="italic"))
        update_in_place(why_widget, Group(*lines))

    def on_resize(self) -> None:
        if self.result is not None:
            self.refresh_view()


def shaft_notes(shafts: list[dict[str, Any]]) -> list[str]:
    """The notes the verdict rests on (a material's size range…): the candidate's, and the shaft
    as found's only where its material differs (the same grade's note would say it twice)."""
    candidate = next((s for s in shafts if s.get("role") == "candidate"), None)
    out: list[str] = []
    for shaft in shafts:
        if candidate is not None and shaft is not candidate and \
                _grade(shaft.get("material")) == _grade(candidate.get("material")):
            continue
        title = _ROLE_TITLE.get(shaft.get("role"), "shaft")
        out.extend(f"{title}: {note}" if len(shafts) > 1 else str(note) for note in shaft.get("notes") or [])
    return out


def _grade(key: Any) -> str:
    """A material key without its size range (``42crmo4-qt`` for ``42crmo4-qt-16-40``)."""
    import re

    return re.sub(r"-\d+(?:\.\d+)?-\d+(?:\.\d+)?$", "", str(key or ""))


def ratio_line(comparison: dict[str, Any]) -> str:
    """"candidate / as found: strength 0.65×, stiffness 2.29×, mass 1.69×" (as the CLI report)."""
    parts = [
        f"{word} {comparison[key]:.2f}×"
        for word, key in (("strength", "strength_ratio"), ("stiffness", "stiffness_ratio"),
                          ("mass", "mass_ratio"))
        if isinstance(comparison.get(key), (int, float))
    ]
    return "candidate / as found: " + ", ".join(parts) if parts else ""


def _rich_verdict_style(word: str | None) -> str:
    return {"pass": "bold green", "marginal": "bold yellow", "fail": "bold red"}.get(word or "", "")
