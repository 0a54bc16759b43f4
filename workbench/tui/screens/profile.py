"""Profile view: each shaft's side profile with its steps, the bending-moment diagram and the
steps table, the governing step marked.

Drawn from the result already on the sheet (no new calculation): the drawing fills the first
screenful, the steps tables and the whole-shaft checks follow below it (PgDn / ↓ to read them).
"""

from __future__ import annotations

from collections.abc import Mapping
from typing import Any

from rich.console import Group
from rich.table import Table
from rich.text import Text
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import VerticalScroll
from textual.screen import Screen
from textual.widgets import Footer, Static

from workbench.report.steps import STEPS_LEGEND, is_numeric_column, step_columns, shaft_checks, steps_of, steps_rows
from ..widgets.shaft_profile import ShaftProfile

_ROLE = {"existing": "as found", "candidate": "candidate"}


def steps_tables(result: Mapping[str, Any] | None, system: str) -> Group:
    """The steps table and the whole-shaft checks of each shaft, for the part under the drawing."""
    parts: list[Any] = []
    for shaft in (result or {}).get("shafts") or []:
        if not isinstance(shaft, Mapping) or not steps_of(shaft):
            continue
        parts.append(Text(f"Steps — {_ROLE.get(shaft.get('role'), 'shaft')}: {shaft.get('spec', '')}",
                          "bold"))
        table = Table(box=None, padding=(0, 1), show_edge=False, pad_edge=False)
        for column in step_columns(system):
            table.add_column(column, no_wrap=column != "step",
                             justify="right" if is_numeric_column(column) else "left")
        for row in steps_rows(shaft, system):
            style = "bold" if "◀" in row[0] else ""
            table.add_row(*row, style=style)
        parts.append(table)
        checks = shaft_checks(shaft, system)
        if checks:
            grid = Table.grid(padding=(0, 2))
            grid.add_column(style="dim", no_wrap=True)
            grid.add_column()
            for label, value in checks:
                grid.add_row(label, value)
            parts.append(grid)
        for note in shaft.get("steps_notes") or []:
            parts.append(Text(f"note: {note}", style="italic"))
        parts.append(Text(""))
    if not parts:
        parts.append(Text("no steps in this result", style="dim"))
    parts.append(Text(STEPS_LEGEND, style="dim"))
    return Group(*parts)


class ProfileScreen(Screen):
    """The shaft drawn along its axis: steps, bearings, load, moment diagram; then the tables."""

    BINDINGS = [
        Binding("escape,f9", "app.pop_screen", "Back", id="profile.back"),
        Binding("pagedown", "page(1)", "Tables", id="profile.page_down", show=False),
        Binding("pageup", "page(-1)", "Drawing", id="profile.page_up", show=False),
    ]

    def __init__(self, result: Mapping[str, Any] | None) -> None:
        super().__init__()
        self.result = result

    def compose(self) -> ComposeResult:
        yield Static("Shaft profile and bending moment — PgDn steps table · Esc back",
                     classes="view-title")
        system = getattr(self.app, "system", "metric")
        with VerticalScroll(classes="view-body", id="profile-body"):
            yield ShaftProfile(self.result, system, id="profile-drawing")
            yield Static(steps_tables(self.result, system), id="profile-tables")
        yield Footer(compact=True)

    def on_resize(self) -> None:
        self._fit()

    def on_mount(self) -> None:
        self.call_after_refresh(self._fit)

    def _fit(self) -> None:
        """Make the drawing exactly one screenful of the body, then draw it."""
        body = self.query_one("#profile-body", VerticalScroll)
        drawing = self.query_one(ShaftProfile)
        height = max(12, body.size.height)
        drawing.styles.height = height
        drawing.redraw_at(max(20, body.size.width - 2), height)

    def action_page(self, step: int) -> None:
        """PgDn: the tables under the drawing; PgUp: back to the drawing."""
        body = self.query_one("#profile-body", VerticalScroll)
        if step > 0:
            body.scroll_page_down(animate=False)
        else:
            body.scroll_page_up(animate=False)

    def set_system(self, system: str) -> None:
        """Redraw in the other unit system (F5)."""
        self.query_one(ShaftProfile).set_system(system)
        self.query_one("#profile-tables", Static).update(steps_tables(self.result, system))
