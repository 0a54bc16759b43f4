"""Stock finder: standard bar sizes that pass for this job; Enter takes one as the candidate."""

from __future__ import annotations

from typing import Any

from rich.text import Text
from textual import work
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal
from textual.content import Content
from textual.screen import Screen
from textual.widgets import DataTable, Input, Label, Static

from workbench.report import display
from .. import engine
from ..fields import PROFILES
from ..widgets.choice import Choice
from ..widgets.fitting_footer import FittingFooter


class StockScreen(Screen[dict[str, str] | None]):
    """Pick profile and material(s); the list shows the passing sizes, smallest first."""

    BINDINGS = [
        Binding("escape,f4", "cancel", "Back", id="stock.back"),
        Binding("enter", "take", "Take as candidate", id="stock.take", priority=True),
        Binding("down", "move(1)", "Down", show=False, id="stock.down", priority=True),
        Binding("up", "move(-1)", "Up", show=False, id="stock.up", priority=True),
    ]

    def __init__(self, inputs: dict[str, str], profile: str, system: str, material: str) -> None:
        super().__init__()
        self.inputs = inputs
        self.system = system
        self.start_profile = profile if profile in PROFILES else "round"
        self.start_material = material
        self.rows: list[dict[str, Any]] = []
        self.searching = False

    def compose(self) -> ComposeResult:
        yield Static("Stock finder — pick, then Enter takes the highlighted size", classes="view-title")
        with Horizontal(classes="field-line"):
            yield Label("Profile", classes="field-label")
            yield Choice(PROFILES, self.start_profile, id="stock-profile", classes="field-control")
            yield Static("r t s f h", classes="field-hint")
        with Horizontal(classes="field-line"):
            yield Label("Material(s)", classes="field-label")
            yield Input(self.start_material, id="stock-materials", compact=True, classes="field-control")
            yield Static("comma between", classes="field-hint")
        yield Static("", id="stock-status", classes="view-note")
        yield DataTable(id="stock-table", cursor_type="row", zebra_stripes=True)
        yield FittingFooter(compact=True)  # whole keys only at 80 columns

    def on_mount(self) -> None:
        self.query_one("#stock-profile", Choice).focus()
        self._search()

    def materials(self) -> list[str]:
        """The material keys typed, in order."""
        text = self.query_one("#stock-materials", Input).value
        return [m.strip() for m in text.split(",") if m.strip()]

    def on_choice_changed(self, event: Choice.Changed) -> None:
        self._search()

    def on_input_changed(self, event: Input.Changed) -> None:
        self._search()

    def set_system(self, system: str) -> None:
        """Search again in the other unit system (inch sizes or metric sizes)."""
        self.system = system
        self._search()

    def _search(self) -> None:
        if not self.is_mounted:
            return
        self.searching = True
        self.query_one("#stock-status", Static).update("searching…")
        profile = self.query_one("#stock-profile", Choice).value
        self._find(dict(self.inputs), profile, self.system, self.materials())

    @work(thread=True, exclusive=True, group="stock")
    def _find(self, inputs: dict[str, str], profile: str, system: str, materials: list[str]) -> None:
        data, message = engine.stock(inputs, profile, system, materials)
        self.app.call_from_thread(self._show, data, message)

    def _show(self, data: dict[str, Any] | None, message: str) -> None:
        self.searching = False
        status = self.query_one("#stock-status", Static)
        table = self.query_one("#stock-table", DataTable)
        table.clear(columns=True)
        self.rows = []
        if data is None:
            status.update(Content(f"✗ {message}"))  # quotes typed text: never markup
            return
        rows = stock_rows(data, _required_sf(self.inputs))
        self.rows = rows
        table.add_columns("size", "material", "least SF", "margin", "verdict", "governed by", "mass",
                          "journal")
        for row in rows:
            table.add_row(
                Text(row["spec"]),  # Text, not a str: shown as written, and measured for the width
                Text(row["material"]),
                display.factor(row.get("sf")),
                "—" if row.get("margin") is None else f"{row['margin'] * 100:+.0f} %",
                display.verdict(row.get("verdict")),
                Text(row.get("governing") or "—"),
                display.mass_per_length(row.get("mass_kg_per_m"), self.system),
                display.journal_limit(row.get("journal_m"), self.system) + (" *" if row.get("journal_short") else ""),
            )
        first_pass = next((i for i, r in enumerate(rows) if r.get("verdict") == "pass"), 0)
        if rows:
            table.move_cursor(row=first_pass)  # the smallest clear pass, not a marginal size
        passing = sum(r.get("verdict") == "pass" for r in rows)
        short = " · * journal smaller than the shaft as found" if any(r.get("journal_short") for r in rows) else ""
        status.update(
            f"{passing} pass, {len(rows) - passing} marginal · Enter takes the highlighted one{short}"
            if rows
            else "no size passes"
        )

    def action_take(self) -> None:
        if isinstance(self.focused, Input):
            self.focus_next()
            return
        if self.searching:
            self.notify("Still searching…")
            return
        if not self.rows:
            self.notify("Nothing to take: no size passes.", severity="warning")
            return
        row = self.rows[self.query_one("#stock-table", DataTable).cursor_row]
        self.dismiss({"spec": row["spec"], "material": row["material"]})

    def action_move(self, step: int) -> None:
        """Move the highlighted size from anywhere on the screen (no need to Tab to the list)."""
        table = self.query_one("#stock-table", DataTable)
        if table.row_count:
            table.move_cursor(row=max(0, min(table.row_count - 1, table.cursor_row + step)))

    def action_cancel(self) -> None:
        self.dismiss(None)


def _required_sf(inputs: dict[str, str]) -> float:
    try:
        return float(inputs.get("required_sf", "") or 1.5)
    except ValueError:
        return 1.5


def governing_text(row: dict[str, Any], width: int = 18) -> str:
    """The check a stock row's verdict rests on, as the CLI's ``stock`` names it: ``twist``,
    ``fatigue at shoulder at bearing 1`` (cut to ``width`` with an ellipsis)."""
    text = str(row.get("governing") or "")
    if row.get("governing_step_label"):
        text += f" at {row['governing_step_label']}"
    return text if len(text) <= width else text[: width - 1] + "…"


def stock_rows(data: dict[str, Any], required_sf: float = 1.5) -> list[dict[str, Any]]:
    """The sizes that do not fail, smallest first (then by material), with their margin.

    margin = least safety factor ÷ required safety factor − 1 (0.25 = 25 % above the requirement).
    """
    out = []
    for row in data.get("rows") or []:
        if row.get("verdict") == "fail":
            continue
        sf = row.get("min_safety_factor")
        out.append(
            {
                "spec": row.get("spec", ""),
                "material": row.get("material", ""),
                "sf": sf,
                "margin": None if sf is None else sf / required_sf - 1.0,
                "verdict": row.get("verdict"),
                "governing": governing_text(row),
                "mass_kg_per_m": row.get("mass_kg_per_m"),
                "size": (row.get("size_m") or 0.0, row.get("second_m") or 0.0),
                "journal_m": row.get("largest_journal_m"),
                "journal_short": row.get("gives_existing_journal") is False,
            }
        )
    out.sort(key=lambda r: (r["size"], r["material"]))
    return out
