"""Save prompt: asset, location, by and a note, then the job goes to the job log.

When the sheet holds a job that is already in the log (reopened from it, or saved before), the
prompt asks whether the save updates that job or makes a new one - it never duplicates silently:
until one of the two is picked, saving only says that a choice is needed.
"""

from __future__ import annotations

from typing import Any

from textual import work
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, Vertical
from textual.content import Content
from textual.screen import ModalScreen
from textual.widgets import Input, Label, RadioButton, RadioSet, Static

from ..typeahead import MOVE_BINDINGS, TypeAheadMixin

META_FIELDS = (("asset", "Asset"), ("location", "Location"), ("by", "By"), ("note", "Note"))


def save_job(log_path: str | None, inputs: dict[str, str], result: dict[str, Any], meta: dict[str, str],
             update: int | None = None):
    """Write one job to the job log; returns its id. ``update``: the id of a job to update in place
    (new inputs and result, the change kept in its history) instead of adding a new one."""
    from workbench.store.log import JobLog

    with JobLog.open(log_path) as log:  # one connection per thread, opened here in the worker
        if update is not None:
            return log.replace_result(update, inputs, result, **meta).id
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
        job_id: int | None = None,
    ) -> None:
        super().__init__()
        self.inputs = inputs
        self.result = result
        self.meta = dict(meta)
        self.log_path = log_path
        self.job_id = job_id
        """The log's job this sheet came from (reopened or saved before), or None for a new job."""

    def compose(self) -> ComposeResult:
        with Vertical(id="save-dialog"):
            yield Static("Save to the job log — Enter on Note saves, Esc cancels", classes="view-title")
            if self.job_id is not None:
                yield Label(f"This sheet is job {self.job_id} of the log. Save it as:", id="save-as-label")
                with RadioSet(id="save-as"):
                    yield RadioButton(f"an update of job {self.job_id}", id="save-as-update")
                    yield RadioButton("a new job", id="save-as-new")
            for key, label in META_FIELDS:
                with Horizontal(classes="field-line"):
                    yield Label(label, classes="field-label")
                    yield Input(self.meta.get(key, ""), id=f"save-{key}", compact=True)
            yield Static("", id="save-status", classes="view-error")

    def on_mount(self) -> None:
        if self.job_id is not None:
            self.query_one("#save-as", RadioSet).focus()
        else:
            self.query_one("#save-asset", Input).focus()

    def choice(self) -> str | None:
        """``update``, ``new``, or None while the sheet is a logged job and neither is picked."""
        if self.job_id is None:
            return "new"
        pressed = self.query_one("#save-as", RadioSet).pressed_button
        if pressed is None:
            return None
        return "update" if pressed.id == "save-as-update" else "new"

    def on_radio_set_changed(self, event: RadioSet.Changed) -> None:
        event.stop()
        self.query_one("#save-status", Static).update("")
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
        if self.choice() is None:
            self.query_one("#save-status", Static).update(
                f"✗ Choose first: update job {self.job_id}, or save a new job (↑↓ then Enter).")
            self.query_one("#save-as", RadioSet).focus()
            return
        if not meta["asset"]:
            self.query_one("#save-status", Static).update("✗ Asset is needed to find the job again.")
            self.query_one("#save-asset", Input).focus()
            return
        self.query_one("#save-status", Static).update("saving…")
        self._save(meta)

    @work(thread=True, exclusive=True, group="save")
    def _save(self, meta: dict[str, str]) -> None:
        update = self.job_id if self.choice() == "update" else None
        try:
            job_id = save_job(self.log_path, self.inputs, self.result, meta, update=update)
        except Exception as err:  # noqa: BLE001 - shown to the fitter, the sheet stays as it is
            from workbench.store import LogError

            message = str(err) if isinstance(err, LogError) else f"{type(err).__name__}: {err}"
            self.app.call_from_thread(self._failed, message)
            return
        self.app.call_from_thread(self._done, job_id, meta, update is not None)

    def _failed(self, message: str) -> None:
        # the message may quote the log's path: shown as written, never read as markup
        self.query_one("#save-status", Static).update(Content(f"✗ not saved: {message}"))

    def _done(self, job_id: Any, meta: dict[str, str], updated: bool = False) -> None:
        self.app.notify(f"Job {job_id} updated in the job log." if updated
                        else f"Saved to the job log as job {job_id}.")
        self.dismiss({"job_id": job_id, "updated": updated, **meta})
