"""Save prompt: asset, location, by and a note, then the job goes to the job log."""

from __future__ import annotations

from typing import Any

from textual import work
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, Vertical
from textual.content import Content
from textual.screen import ModalScreen
from textual.widgets import Input, Label, Static

from ..typeahead import MOVE_BINDINGS, TypeAheadMixin

META_FIELDS = (("asset", "Asset"), ("location", "Location"), ("by", "By"), ("note", "Note"))


def save_job(log_path: str | None, inputs: dict[str, str], result: dict[str, Any], meta: dict[str, str]):
    """Write one job to the job log; returns the new entry's id (whatever the log returns)."""
    from workbench.store.log import JobLog

    with JobLog.open(log_path) as log:  # one connection per thread, opened here in the worker
        return log.save(inputs, result, **meta)


class SaveScreen(TypeAheadMixin, ModalScreen[dict[str, Any] | None]):
    """Asks for the job's asset, location, who did it and a note; Enter on the note saves."""

    BINDINGS = [
        Binding("escape", "cancel", "Cancel", id="save.cancel"),
        Binding("ctrl+s", "save", "Save", id="save.save", priority=True),
        *MOVE_BINDINGS,
    ]

    def __init__(
        self,
        inputs: dict[str, str],
        result: dict[str, Any],
        meta: dict[str, str],
        log_path: str | None,
    ) -> None:
        super().__init__()
        self.inputs = inputs
        self.result = result
        self.meta = dict(meta)
        self.log_path = log_path

    def compose(self) -> ComposeResult:
        with Vertical(id="save-dialog"):
            yield Static("Save to the job log — Enter on Note saves, Esc cancels", classes="view-title")
            for key, label in META_FIELDS:
                with Horizontal(classes="field-line"):
                    yield Label(label, classes="field-label")
                    yield Input(self.meta.get(key, ""), id=f"save-{key}", compact=True)
            yield Static("", id="save-status", classes="view-error")

    def on_mount(self) -> None:
        self.query_one("#save-asset", Input).focus()

    def enter_on(self, widget) -> bool:
        """Enter on the note saves; on the other fields it moves on (see typeahead)."""
        if widget.id == "save-note":
            self.action_save()
            return True
        return False

    def values(self) -> dict[str, str]:
        """The four fields as typed."""
        return {key: self.query_one(f"#save-{key}", Input).value.strip() for key, _ in META_FIELDS}

    def action_cancel(self) -> None:
        self.dismiss(None)

    def action_save(self) -> None:
        meta = self.values()
        if not meta["asset"]:
            self.query_one("#save-status", Static).update("✗ Asset is needed to find the job again.")
            self.query_one("#save-asset", Input).focus()
            return
        self.query_one("#save-status", Static).update("saving…")
        self._save(meta)

    @work(thread=True, exclusive=True, group="save")
    def _save(self, meta: dict[str, str]) -> None:
        try:
            job_id = save_job(self.log_path, self.inputs, self.result, meta)
        except Exception as err:  # noqa: BLE001 - shown to the fitter, the sheet stays as it is
            self.app.call_from_thread(self._failed, f"{type(err).__name__}: {err}")
            return
        self.app.call_from_thread(self._done, job_id, meta)

    def _failed(self, message: str) -> None:
        # the message may quote the log's path: shown as written, never read as markup
        self.query_one("#save-status", Static).update(Content(f"✗ not saved: {message}"))

    def _done(self, job_id: Any, meta: dict[str, str]) -> None:
        self.app.notify(f"Saved to the job log as job {job_id}.")
        self.dismiss({"job_id": job_id, **meta})
