"""The outcome form of the job log: what was fitted, when, how it ended, and the notes of one job.

Opened with ``e`` on the log screen. Ctrl+S (or Enter on the last field) writes the changes through
``JobLog.update`` in a worker; each changed field is kept in the job's history with the time of
the change. A bad date or a failure without its date is named on the form's status line, and
nothing is written.
"""

from __future__ import annotations

from pathlib import Path
from typing import Any

from rich.text import Text
from textual import work
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, Vertical
from textual.screen import ModalScreen
from textual.widgets import Input, Label, Select, Static

OUTCOME_CHOICES = [("still running", "still-running"), ("failed again", "failed"), ("removed", "removed")]
OUTCOME_WORDS = {word for _, word in OUTCOME_CHOICES}
FIELDS = (
    ("fitted", "Fitted", "which spec went in"),
    ("fitted_on", "Fitted on", "YYYY-MM-DD"),
    ("outcome_date", "On", "YYYY-MM-DD (needed for failed)"),
    ("note", "Note", "notes (replace the old ones)"),
)


class OutcomeScreen(ModalScreen["dict[str, Any] | None"]):
    """Edit one logged job's fit and outcome; dismisses with the updated record's fields or None."""

    DEFAULT_CSS = """
    OutcomeScreen { align: center middle; }
    OutcomeScreen > Vertical { width: 72; height: auto; border: thick $accent; padding: 0 1; background: $surface; }
    OutcomeScreen .field-line { height: auto; }
    OutcomeScreen .field-label { width: 11; padding: 0 1 0 0; }
    OutcomeScreen Input { width: 1fr; }
    OutcomeScreen Select { width: 1fr; }
    OutcomeScreen #outcome-status { height: auto; }
    """
    BINDINGS = [
        Binding("escape", "cancel", "Cancel", id="outcome.cancel"),
        Binding("ctrl+s", "save", "Save", id="outcome.save", priority=True),
    ]

    def __init__(self, record: Any, log_path: str | Path | None) -> None:
        super().__init__()
        self.record = record
        self.log_path = log_path

    def compose(self) -> ComposeResult:
        record = self.record
        with Vertical():
            yield Static(Text(f"Job {record.id}: what was fitted and how it ended - Ctrl+S saves, Esc cancels",
                              style="bold"))
            yield Static(Text.assemble(("asset ", "dim"), record.asset or "-", ("  spec ", "dim"),
                                       str(record.inputs.get("candidate") or record.inputs.get("shaft") or "-")))
            with Horizontal(classes="field-line"):
                yield Label("Fitted", classes="field-label")
                yield Input(record.fitted, placeholder="which spec went in", id="outcome-fitted", compact=True)
            with Horizontal(classes="field-line"):
                yield Label("Fitted on", classes="field-label")
                yield Input(record.fitted_on, placeholder="YYYY-MM-DD", id="outcome-fitted_on", compact=True)
            with Horizontal(classes="field-line"):
                yield Label("Outcome", classes="field-label")
                yield Select(OUTCOME_CHOICES, prompt="not recorded", id="outcome-outcome",
                             value=record.outcome if record.outcome in OUTCOME_WORDS else Select.NULL,
                             compact=True)
            with Horizontal(classes="field-line"):
                yield Label("On", classes="field-label")
                yield Input(record.outcome_date, placeholder="YYYY-MM-DD (needed for failed)",
                            id="outcome-outcome_date", compact=True)
            with Horizontal(classes="field-line"):
                yield Label("Note", classes="field-label")
                yield Input(record.note, placeholder="notes", id="outcome-note", compact=True)
            yield Static("", id="outcome-status")

    def on_mount(self) -> None:
        self.query_one("#outcome-fitted", Input).focus()

    def on_input_submitted(self, event: Input.Submitted) -> None:
        event.stop()
        if event.input.id == "outcome-note":
            self.action_save()
        else:
            self.focus_next()

    def values(self) -> dict[str, str]:
        """The form as typed (the outcome as its stored word, empty when not recorded)."""
        found = {key: self.query_one(f"#outcome-{key}", Input).value.strip() for key, _, _ in FIELDS}
        outcome = self.query_one("#outcome-outcome", Select).value
        found["outcome"] = outcome if isinstance(outcome, str) else ""
        if not found["outcome"]:
            found["outcome_date"] = ""
        return found

    def action_cancel(self) -> None:
        self.dismiss(None)

    def action_save(self) -> None:
        self.query_one("#outcome-status", Static).update("saving…")
        self._save(self.values())

    @work(thread=True, exclusive=True, group="outcome")
    def _save(self, changes: dict[str, str]) -> None:
        from workbench.store import JobLog, LogError

        try:
            with JobLog.open(self.log_path, create=False) as log:
                record = log.update(self.record.id, **changes)
        except LogError as err:
            self.app.call_from_thread(self._failed, str(err))
            return
        self.app.call_from_thread(self._done, record)

    def _failed(self, message: str) -> None:
        self.query_one("#outcome-status", Static).update(Text(f"✗ not saved: {message}", style="bold red"))

    def _done(self, record: Any) -> None:
        self.app.notify(f"Job {record.id}: fit and outcome recorded.", markup=False)
        self.dismiss({"job_id": record.id})
