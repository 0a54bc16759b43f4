"""Asset history view: one asset's shafts on a time chart drawn in text, its MTBR and flags, the
replacements table and the rules; with no tag, the site's assets by shafts fitted. Read-only."""

from __future__ import annotations

from pathlib import Path
from typing import Any

from rich.text import Text
from textual import work
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import VerticalScroll
from textual.screen import Screen
from textual.widgets import Footer, Static


class AssetScreen(Screen):
    """The history of the asset ``tag`` (or every asset when ``tag`` is empty)."""

    BINDINGS = [
        Binding("escape,f12", "app.pop_screen", "Back", id="asset.back"),
        Binding("a", "all_assets", "All assets", id="asset.all", tooltip="The site's assets, most shafts first"),
    ]

    def __init__(self, log_path: str | Path | None, tag: str = "", *, today: str | None = None) -> None:
        super().__init__()
        self.log_path = log_path
        self.tag = tag
        self.today = today
        """The day open intervals run to (tests fix it; None = today)."""
        self.shown: Any = None
        """What the view shows now (a Rich renderable)."""

    def compose(self) -> ComposeResult:
        title = f"Asset history - {self.tag}" if self.tag else "Assets by shafts fitted"
        yield Static(Text(title + " — Esc to go back"), classes="view-title", id="asset-title")
        with VerticalScroll(classes="view-body", id="asset-body"):
            yield Static(Text("reading the log…"), id="asset-content")
        yield Footer()

    def on_mount(self) -> None:
        self._load(self.tag, self.size.width or 80)

    @work(thread=True, exclusive=True)
    def _load(self, tag: str, width: int) -> None:
        from workbench.report.asset_report import history_renderable, sites_renderable
        from workbench.store import JobLog, LogError
        from workbench.store.assets import asset_history, site_assets

        try:
            with JobLog.open(self.log_path, create=False) as log:
                if tag:
                    history, _ = asset_history(log, tag, today=self.today)
                    shown: Any = history_renderable(history, width=max(40, width - 4), today=self.today)
                else:
                    found = site_assets(log, today=self.today)
                    shown = sites_renderable(found) if found else Text("No job in the log names an asset.")
        except LogError as err:
            shown = Text(str(err), style="bold red")
        self.app.call_from_thread(self._show, shown)

    def _show(self, shown: Any) -> None:
        self.shown = shown
        self.query_one("#asset-content", Static).update(shown)

    def action_all_assets(self) -> None:
        self.tag = ""
        self.query_one("#asset-title", Static).update(Text("Assets by shafts fitted — Esc to go back"))
        self._load("", self.size.width or 80)
