"""Turning-sheet view: what to turn each step to, the keyseat to cut, the fits they make.

The fitter can name the bearing, its mounting, the load and the key fit in the view's own row;
Enter recomputes the job with them (the sheet's other inputs as typed).
"""

from __future__ import annotations

from typing import Any

from rich.text import Text
from textual import work
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, VerticalScroll
from textual.screen import Screen
from textual.widgets import Footer, Input, Label, Static

from .. import engine

WHICH = ("candidate", "existing", "both")
# (input key, label, placeholder)
OPTION_FIELDS = (
    ("bearing", "bearing", "6208"),
    ("bearing_mounting", "mounting", "pressed"),
    ("bearing_load", "load", "normal"),
    ("key_fit", "key fit", "normal"),
)


class TurningScreen(Screen):
    """The current job's turning sheets (the candidate's first; ``b`` cycles candidate / as found / both)."""

    BINDINGS = [
        Binding("escape,f10", "app.pop_screen", "Back", id="turning.back"),
        Binding("ctrl+b", "cycle", "Which shaft", id="turning.which", tooltip="Candidate, shaft as found, or both"),
    ]

    def __init__(self, result: dict[str, Any] | None, inputs: dict[str, str] | None = None) -> None:
        super().__init__()
        self.result = result
        self.inputs = dict(inputs or {})
        self.which = (result or {}).get("turning_sheets") or "candidate"
        self.message = ""

    def compose(self) -> ComposeResult:
        yield Static("Turning sheet — Enter recomputes, Ctrl+B which shaft, Esc back", classes="view-title")
        with Horizontal(id="turning-options"):
            for key, label, placeholder in OPTION_FIELDS:
                yield Label(label)
                yield Input(value=self.inputs.get(key, ""), placeholder=placeholder, id=f"turning-{key}")
        with VerticalScroll(classes="view-body"):
            yield Static(self._body(), id="turning-body")
        yield Footer(compact=True)

    def _body(self):
        from rich.console import Group

        from workbench.report.turning_sheet import render_turning

        if not self.result:
            return Text(f"✗ {self.message or 'no current result: fill in the sheet first'}", "bold")
        shown = render_turning({**self.result, "turning_sheets": self.which}, getattr(self.app, "system", "metric"))
        parts = [Text(f"✗ {self.message}", "bold")] if self.message else []
        parts.append(shown if shown is not None else Text("no turning sheet for this job"))
        return Group(*parts)

    def _redraw(self) -> None:
        self.query_one("#turning-body", Static).update(self._body())

    def action_cycle(self) -> None:
        """Show the next of: candidate, shaft as found, both."""
        self.which = WHICH[(WHICH.index(self.which) + 1) % len(WHICH)] if self.which in WHICH else "candidate"
        self._redraw()

    def set_system(self, system: str) -> None:
        """Redraw in the other unit system."""
        self._redraw()

    def on_input_submitted(self, event: Input.Submitted) -> None:
        event.stop()
        inputs = dict(self.inputs)
        for key, _, _ in OPTION_FIELDS:
            value = self.query_one(f"#turning-{key}", Input).value.strip()
            if value:
                inputs[key] = value
            else:
                inputs.pop(key, None)
        self._recompute(inputs)

    @work(thread=True, exclusive=True, group="turning")
    def _recompute(self, inputs: dict[str, str]) -> None:
        evaluation = engine.evaluate(inputs)
        self.app.call_from_thread(self._show, inputs, evaluation)

    def _show(self, inputs: dict[str, str], evaluation) -> None:
        if evaluation.result is not None and not evaluation.errors:
            self.inputs, self.result, self.message = inputs, evaluation.result, ""
        else:
            self.message = "; ".join(evaluation.errors.values()) or "cannot compute the job"
        self._redraw()
