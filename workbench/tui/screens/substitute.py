"""Substitution view: equal-strength and equal-stiffness sizes of the other bar profiles."""

from __future__ import annotations

from typing import Any

from rich.console import Group
from rich.table import Table
from rich.text import Text
from textual import work
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import VerticalScroll
from textual.screen import Screen
from textual.widgets import Static

from workbench.report import display
from .. import engine
from ..widgets.fitting_footer import FittingFooter


class SubstituteScreen(Screen):
    """Sizes in square, flat, hex and tube that match the shaft as found."""

    BINDINGS = [Binding("escape,f3", "app.pop_screen", "Back", id="substitute.back")]

    def __init__(self, inputs: dict[str, str]) -> None:
        super().__init__()
        self.inputs = inputs
        self.data: dict[str, Any] | None = None

    def compose(self) -> ComposeResult:
        yield Static("Substitution sizes — Esc to go back", classes="view-title")
        with VerticalScroll(classes="view-body"):
            yield Static("working…", id="substitute-body")
        yield FittingFooter(compact=True)  # whole keys only at 80 columns

    def on_mount(self) -> None:
        self._compute(dict(self.inputs))

    def set_system(self, system: str) -> None:
        """Redraw in the other unit system."""
        if self.data is not None:
            self.query_one("#substitute-body", Static).update(render_substitution(self.data, system))

    @work(thread=True, exclusive=True, group="substitute")
    def _compute(self, inputs: dict[str, str]) -> None:
        data, message = engine.substitute(inputs)
        self.app.call_from_thread(self._show, data, message)

    def _show(self, data: dict[str, Any] | None, message: str) -> None:
        body = self.query_one("#substitute-body", Static)
        if data is None:
            body.update(Text(f"✗ {message}", "bold"))
            return
        self.data = data
        body.update(render_substitution(data, getattr(self.app, "system", "metric")))


def _size(row: dict[str, Any], system: str) -> str:
    """A substitute's size in the display system (flat: width × thickness; tube: OD/ID)."""
    size, second = row.get("size_m"), row.get("second_m") or 0.0
    unit = "in" if system == "inch" else "mm"
    scale = 1 / display.M_PER_IN if system == "inch" else 1000.0
    if row.get("profile") == "flat":
        return f"{display.number(size * scale)}×{display.number(second * scale)} {unit}"
    if row.get("profile") == "tube":
        return f"{display.number(size * scale)}/{display.number(second * scale)} {unit}"
    return display.length(size, system)


def render_substitution(data: dict[str, Any], system: str):
    """Equal-strength / equal-stiffness sizes per profile, their ratios, and the fit facts."""
    existing = data.get("existing", {})
    head = Text.assemble(("Shaft as found: ", "bold"), str(existing.get("spec", "—")))
    by_profile: dict[str, dict[str, dict[str, Any]]] = {}
    for row in data.get("equivalents", []):
        by_profile.setdefault(str(row.get("profile")), {})[str(row.get("basis"))] = row
    table = Table(box=None, padding=(0, 1), show_edge=False)
    for column in ("profile", "equal strength", "equal stiffness", "stiff ×", "mass ×", "next stock"):
        table.add_column(column, no_wrap=True)
    for profile, rows in by_profile.items():
        if profile == "round":
            continue
        strength, stiffness = rows.get("strength", {}), rows.get("stiffness", {})
        table.add_row(
            profile,
            _size(strength, system) if strength else "—",
            _size(stiffness, system) if stiffness else "—",
            display.factor(strength.get("stiffness_ratio")),
            display.factor(strength.get("mass_ratio")),
            strength.get("next_stock") or "none stocked",
        )
    note = Text("stiff × and mass × of the equal-strength size, ÷ the shaft as found", "dim")
    facts = Text("Fit facts\n", "bold")
    for fact in data.get("fit_facts", []):
        facts.append(f"• {fact}\n")
    return Group(head, Text(""), table, note, Text(""), facts)
