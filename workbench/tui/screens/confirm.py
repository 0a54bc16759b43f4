"""A yes/no question before something is thrown away (an unsaved job) or taken back (a draft)."""

from __future__ import annotations

from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Vertical
from textual.content import Content
from textual.screen import ModalScreen
from textual.widgets import Static


class ConfirmScreen(ModalScreen[bool]):
    """Asks ``question``; ``y`` answers True, ``n`` or Esc False. Nothing else is a yes."""

    BINDINGS = [
        Binding("y", "answer(True)", "Yes", id="confirm.yes"),
        Binding("n,escape", "answer(False)", "No", id="confirm.no"),
    ]

    DEFAULT_CSS = """
    ConfirmScreen { align: center middle; }
    ConfirmScreen #confirm-box { width: 64; max-width: 100%; height: auto; padding: 1 2;
                                 border: thick $warning; background: $panel; }
    ConfirmScreen #confirm-keys { margin-top: 1; text-style: bold; }
    """

    def __init__(self, question: str, yes: str = "yes", no: str = "no") -> None:
        super().__init__()
        self.question = question
        self.yes_word, self.no_word = yes, no

    def compose(self) -> ComposeResult:
        with Vertical(id="confirm-box"):
            yield Static(Content(self.question), id="confirm-question")
            yield Static(Content(f"y  {self.yes_word}    n / Esc  {self.no_word}"), id="confirm-keys")

    def action_answer(self, answer: bool) -> None:
        self.dismiss(answer)
