"""A one-line pick-list for the job sheet: ←/→ step, a letter jumps to the entry starting with it."""

from __future__ import annotations

from dataclasses import dataclass

from rich.text import Text
from textual.binding import Binding
from textual.message import Message
from textual.reactive import reactive
from textual.widget import Widget


class Choice(Widget, can_focus=True):
    """Shows ``‹ vbelt ›``; left/right or space cycle, typing a letter picks the next match."""

    BINDINGS = [
        Binding("left", "step(-1)", "Prev", show=False, id="choice.prev"),
        Binding("right,space", "step(1)", "Next", show=False, id="choice.next"),
        Binding("enter", "done", "Next field", show=False, id="choice.done"),
    ]

    DEFAULT_CSS = """
    Choice { height: 1; width: 22; padding: 0; background: $boost; }
    Choice:focus { background: $accent 30%; text-style: bold; }
    Choice.-invalid { background: $error 30%; }
    """

    value: reactive[str] = reactive("", layout=False)

    @dataclass
    class Changed(Message):
        """The picked entry changed."""

        choice: "Choice"
        value: str

        @property
        def control(self) -> "Choice":
            return self.choice

    def __init__(self, options: tuple[str, ...], value: str | None = None, **kwargs) -> None:
        super().__init__(**kwargs)
        self.options = tuple(options)
        self.set_reactive(Choice.value, value if value in self.options else self.options[0])

    def render(self) -> Text:
        value, room = self.value, self.size.width - 4  # "‹ " and " ›" around the entry
        if 0 < room < len(value):
            value = value[: room - 1] + "…"  # a long entry is cut, never wrapped
        return Text.assemble(("‹ ", "dim"), value, (" ›", "dim"), no_wrap=True)

    def get_content_height(self, container, viewport, width: int) -> int:
        """Always one line: a long entry is cut at the field's width, never wrapped."""
        return 1

    def watch_value(self, value: str) -> None:
        self.post_message(self.Changed(self, value))

    def action_step(self, step: int) -> None:
        index = self.options.index(self.value) if self.value in self.options else 0
        self.value = self.options[(index + step) % len(self.options)]

    def action_done(self) -> None:
        """Enter keeps the pick and moves on, as it does in the text fields of the sheet."""
        self.screen.focus_next()

    def on_key(self, event) -> None:
        char = event.character
        if not char or not char.isprintable() or char == " ":
            return
        char = char.lower()
        index = self.options.index(self.value) if self.value in self.options else -1
        order = self.options[index + 1 :] + self.options[: index + 1]
        for option in order:
            if option.lower().startswith(char):
                self.value = option
                event.stop()
                event.prevent_default()
                return
