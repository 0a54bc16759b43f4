"""Fits calculator view: ISO 286 limits of a class or a fit, and a measured size against them."""

from __future__ import annotations

from rich.text import Text
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, VerticalScroll
from textual.screen import Screen
from textual.widgets import Footer, Input, Label, Static

from .. import engine


class FitsScreen(Screen):
    """Type a size, a class (k6, H7, H7/k6) and optionally a measured size; Enter computes."""

    BINDINGS = [Binding("escape,f11", "app.pop_screen", "Back", id="fits.back")]

    def compose(self) -> ComposeResult:
        yield Static("Fits calculator (ISO 286) — Enter computes, Esc to go back", classes="view-title")
        with Horizontal(id="fits-fields"):
            yield Label("size")
            yield Input(value="35mm", id="fit-size", placeholder="35mm or 1.5in")
            yield Label("class")
            yield Input(value="k6", id="fit-class", placeholder="k6, H7 or H7/k6")
            yield Label("measured")
            yield Input(id="fit-measured", placeholder="optional, e.g. 34.985mm")
        with VerticalScroll(classes="view-body"):
            yield Static("", id="fits-body")
        yield Footer(compact=True)

    def on_mount(self) -> None:
        self.query_one("#fit-size", Input).focus()
        self.compute()

    def on_input_submitted(self, event: Input.Submitted) -> None:
        event.stop()
        self.compute()
        order = ["fit-size", "fit-class", "fit-measured"]
        if event.input.id in order[:-1]:
            self.query_one(f"#{order[order.index(event.input.id) + 1]}", Input).focus()

    def compute(self) -> None:
        """Compute from the three fields and show the answer (or the one-line message)."""
        size = self.query_one("#fit-size", Input).value
        cls = self.query_one("#fit-class", Input).value
        measured = self.query_one("#fit-measured", Input).value.strip()
        text, message = engine.fit_calculator(size, cls, measured)
        body = self.query_one("#fits-body", Static)
        body.update(Text(text) if text is not None else Text(f"✗ {message}", "bold"))
