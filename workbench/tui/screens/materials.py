"""The material pick-list: type to search, arrows to move, Enter takes the highlighted steel.

Shows every key the job accepts (a size-ranged grade once: its row is picked by the bar size) with
its condition, yield and tensile strength and the designations read as it (EN19 -> 42crmo4-qt).
The search matches key, name, condition and designations, in any case.
"""

from __future__ import annotations

from rich.text import Text
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Vertical
from textual.content import Content
from textual.screen import ModalScreen
from textual.widgets import DataTable, Input, Static


def matching(rows: list[dict[str, str]], query: str) -> list[dict[str, str]]:
    """The rows whose key, name, condition or designations hold every word of ``query``."""
    words = query.lower().replace("-", " ").split()
    out = []
    for row in rows:
        text = " ".join(row.get(k, "") for k in ("key", "name", "condition", "also")).lower()
        text += " " + text.replace("-", " ").replace(" ", "")
        if all(word in text for word in words):
            out.append(row)
    return out


class MaterialPicker(ModalScreen[str | None]):
    """Search the material table; dismisses with the key taken (None on Esc)."""

    BINDINGS = [
        Binding("escape", "cancel", "Cancel", id="materials.cancel"),
        Binding("enter", "take", "Take", priority=True, id="materials.take"),
        Binding("down", "move(1)", "Down", show=False, priority=True, id="materials.down"),
        Binding("up", "move(-1)", "Up", show=False, priority=True, id="materials.up"),
    ]

    DEFAULT_CSS = """
    MaterialPicker { align: center middle; }
    MaterialPicker #materials-box { width: 100%; max-width: 110; height: 90%; border: round $accent;
                                    background: $surface; padding: 0 1; }
    MaterialPicker #materials-query { margin: 0 0 1 0; }
    MaterialPicker DataTable { height: 1fr; }
    MaterialPicker #materials-note { height: auto; color: $text-muted; }
    """

    def __init__(self, field_label: str, current: str = "") -> None:
        super().__init__()
        self.field_label = field_label
        self.current = current.strip().lower()  # highlighted at first; the search starts empty
        from workbench.core.material_names import listing

        self.all_rows = listing()
        self.rows: list[dict[str, str]] = []

    def compose(self) -> ComposeResult:
        with Vertical(id="materials-box"):
            yield Static(Content(f"Material for {self.field_label} · type to search · Enter takes · Esc"),
                         classes="view-title")
            yield Input("", placeholder="search: EN19, c45, stainless, 4140…",
                        id="materials-query", compact=True)
            yield DataTable(id="materials-table", cursor_type="row", zebra_stripes=True)
            yield Static("", id="materials-note")

    def on_mount(self) -> None:
        table = self.query_one(DataTable)
        table.add_columns("key", "material", "yield MPa", "tensile MPa", "bar sizes", "also typed as")
        self._fill()
        keys = [row["key"] for row in self.rows]
        if self.current in keys:
            table.move_cursor(row=keys.index(self.current))
        self.query_one(Input).focus()

    def _fill(self) -> None:
        table = self.query_one(DataTable)
        table.clear()
        self.rows = matching(self.all_rows, self.query_one(Input).value)
        for row in self.rows:
            table.add_row(Text(row["key"]), Text(row["name"]), row["yield_MPa"], row["tensile_MPa"],
                          Text(row["sizes"]), Text(row["also"]))  # Text: literal, measured for width
        note = self.query_one("#materials-note", Static)
        if self.rows:
            note.update(Content(f"{len(self.rows)} of {len(self.all_rows)} · strengths are the table's "
                                "minimums for the sizes shown; confirm with the mill certificate"))
        else:
            from workbench.core.material_names import nearest_names

            close = nearest_names(self.query_one(Input).value)
            note.update(Content("no material matches" + (f"; nearest names: {', '.join(close)}" if close else "")))

    def on_input_changed(self, event: Input.Changed) -> None:
        event.stop()
        self._fill()

    def action_move(self, step: int) -> None:
        table = self.query_one(DataTable)
        if self.rows:
            table.move_cursor(row=max(0, min(len(self.rows) - 1, table.cursor_row + step)))

    def action_take(self) -> None:
        if not self.rows:
            return
        row = self.query_one(DataTable).cursor_row
        self.dismiss(self.rows[max(0, min(row, len(self.rows) - 1))]["key"])

    def action_cancel(self) -> None:
        self.dismiss(None)
