"""Section view: the shaft as found and the candidate, drawn with their shear stress shaded."""

from __future__ import annotations

from typing import Any

from rich.console import Group
from rich.text import Text
from textual import work
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, VerticalScroll
from textual.screen import Screen
from textual.widgets import Footer, Static

from .. import engine
from ..widgets.section_plot import legend, render_map

_ROLE_TITLE = {"shaft": "as found", "candidate": "candidate"}


class SectionScreen(Screen):
    """Both cross-sections side by side (stacked at 80 columns), computed in a worker."""

    BINDINGS = [Binding("escape,f2", "app.pop_screen", "Back", id="section.back")]

    def __init__(self, inputs: dict[str, str]) -> None:
        super().__init__()
        self.inputs = inputs
        self.maps: list[dict[str, Any]] = []

    def compose(self) -> ComposeResult:
        yield Static("Section view — shear stress from torsion, Esc to go back", classes="view-title")
        with VerticalScroll(classes="view-body"):
            yield Static(legend(), id="section-legend")
            with Horizontal(id="section-row"):
                yield Static("drawing…", id="section-shaft", classes="section-cell")
                yield Static("", id="section-candidate", classes="section-cell")
        yield Footer(compact=True)

    def on_mount(self) -> None:
        specs = [(k, self.inputs[k]) for k in ("shaft", "candidate") if self.inputs.get(k)]
        if not specs:
            self.query_one("#section-shaft", Static).update("No shaft on the sheet yet.")
            return
        rows = 11 if self.app.size.height < 30 else 17
        self._draw(specs, rows * 2, rows)

    @work(thread=True, exclusive=True, group="section")
    def _draw(self, specs: list[tuple[str, str]], cols: int, rows: int) -> None:
        maps = engine.section_maps(specs, cols, rows)
        self.app.call_from_thread(self._show, maps)

    def _show(self, maps: list[dict[str, Any]]) -> None:
        self.maps = maps
        cells = {"shaft": self.query_one("#section-shaft", Static)}
        cells["candidate"] = self.query_one("#section-candidate", Static)
        for smap in maps:
            title = Text(f"{_ROLE_TITLE.get(smap['role'], smap['role'])}: {smap['spec']}", "bold")
            if smap.get("error"):
                cells[smap["role"]].update(Group(title, Text(f"✗ {smap['error']}", "bold")))
                continue
            note = Text(f"method: {smap.get('method') or '—'}", "dim")
            cells[smap["role"]].update(Group(title, render_map(smap), note))
