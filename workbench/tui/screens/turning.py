"""Turning-sheet view: what to turn each step to, the keyseat to cut, the fits they make."""

from __future__ import annotations

from typing import Any

from rich.text import Text
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import VerticalScroll
from textual.screen import Screen
from textual.widgets import Footer, Static

WHICH = ("candidate", "existing", "both")


class TurningScreen(Screen):
    """The current job's turning sheets (the candidate's first; ``b`` cycles candidate / as found / both)."""

    BINDINGS = [
        Binding("escape,f10", "app.pop_screen", "Back", id="turning.back"),
        Binding("b", "cycle", "Which shaft", id="turning.which", tooltip="Candidate, shaft as found, or both"),
    ]

    def __init__(self, result: dict[str, Any] | None) -> None:
        super().__init__()
        self.result = result
        self.which = (result or {}).get("turning_sheets") or "candidate"

    def compose(self) -> ComposeResult:
        yield Static("Turning sheet — Esc to go back, b: which shaft", classes="view-title")
        with VerticalScroll(classes="view-body"):
            yield Static(self._body(), id="turning-body")
        yield Footer(compact=True)

    def _body(self):
        from workbench.report.turning_sheet import render_turning

        if not self.result:
            return Text("✗ no current result: fill in the sheet first", "bold")
        shown = render_turning({**self.result, "turning_sheets": self.which}, getattr(self.app, "system", "metric"))
        return shown if shown is not None else Text("no turning sheet for this job")

    def action_cycle(self) -> None:
        """Show the next of: candidate, shaft as found, both."""
        self.which = WHICH[(WHICH.index(self.which) + 1) % len(WHICH)] if self.which in WHICH else "candidate"
        self.query_one("#turning-body", Static).update(self._body())

    def set_system(self, system: str) -> None:
        """Redraw in the other unit system."""
        self.query_one("#turning-body", Static).update(self._body())
