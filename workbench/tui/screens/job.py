"""The main screen: the job sheet on the left, the verdict panel on the right."""

from __future__ import annotations

from typing import Any

from textual import work
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal
from textual.screen import Screen
from textual.widgets import Input, Static
from textual.worker import get_current_worker

from .. import engine
from ..messages import EvaluationReady, SheetChanged
from ..typeahead import MOVE_BINDINGS, TypeAheadMixin
from ..undo import History
from ..widgets.choice import Choice
from ..widgets.fitting_footer import FittingFooter
from ..widgets.job_sheet import JobSheet
from ..widgets.steady import update_in_place
from ..widgets.verdict_panel import VerdictPanel

NARROW_BELOW = 100
#: below this the verdict column is too narrow to read (a table of two shafts needs ~40 columns)
MIN_WIDTH, MIN_HEIGHT = 76, 16


class JobScreen(TypeAheadMixin, Screen):
    """Sheet + verdict; recomputes in a worker a moment after each edit."""

    BINDINGS = [
        *MOVE_BINDINGS,
        Binding("f8", "verdict_page", "Verdict", id="job.verdict_page",
                tooltip="Page through the verdict panel (its end goes back to the top)"),
        Binding("ctrl+l", "pick_material", "Materials", show=False, id="job.materials",
                tooltip="Search the material list (for the material field with the cursor)"),
        Binding("ctrl+n", "app.new_job", "New", id="job.new_job", tooltip="An empty sheet for a new job"),
        Binding("ctrl+z", "undo", "Undo", show=False, id="job.undo",
                tooltip="Put back the sheet before the last change"),
        Binding("ctrl+y", "redo", "Redo", show=False, id="job.redo"),
    ]

    def __init__(self, first_inputs: dict[str, str] | None = None) -> None:
        super().__init__(id="job")
        self.first_inputs = first_inputs
        self.generation = 0
        self.evaluation: engine.Evaluation | None = None
        self.last_inputs: dict[str, str] = {}
        self.wrong: dict[str, str] = {}
        self.needed: dict[str, str] = {}
        self.history = History()

    def compose(self) -> ComposeResult:
        yield Static("", id="title-bar")
        with Horizontal(id="job-body"):
            yield JobSheet(id="sheet")
            yield VerdictPanel(id="verdict")
        yield Static("", id="too-small")
        yield FittingFooter(compact=True)

    @property
    def sheet(self) -> JobSheet:
        return self.query_one(JobSheet)

    @property
    def panel(self) -> VerdictPanel:
        return self.query_one(VerdictPanel)

    def on_mount(self) -> None:
        if self.first_inputs:
            self.show_job_now(self.first_inputs)
        self.update_title()
        self.history.record(self.sheet.snapshot())
        self.query_one("#power").focus()

    def on_resize(self, event) -> None:
        width, height = event.size
        self.set_class(width < NARROW_BELOW, "-narrow")
        self.update_title()
        small = width < MIN_WIDTH or height < MIN_HEIGHT
        self.set_class(small, "-too-small")
        if small:
            self.query_one("#too-small", Static).update(
                f"This terminal is {width}×{height}: the workbench needs at least "
                f"{MIN_WIDTH}×{MIN_HEIGHT} to show the sheet and the verdict side by side. "
                "Make the window larger (or the font smaller); the job stays as it is."
            )

    def update_title(self) -> None:
        app = self.app
        system = getattr(app, "system", "metric")
        state = "no result yet"
        if self.evaluation is not None:
            if self.wrong:
                n = len(self.wrong)
                state = f"✗ {n} field{'s' if n > 1 else ''} to fix"
            elif self.needed:
                state = "… needs " + ", ".join(sorted(self.needed))
            elif self.evaluation.result is not None:
                state = "✓ up to date"
        tail = "Enter next field · PgDn next part"
        if self.has_class("-narrow"):  # the hints column is hidden: the focused field's hint here
            tail = self.focused_hint() or tail
        update_in_place(self.query_one("#title-bar", Static), f" Shaftbench · {state} · {system} · {tail}")

    def focused_hint(self) -> str:
        """"Label: hint" of the sheet field with the cursor ("" when it has none)."""
        focused = self.focused
        if focused is None or not focused.id:
            return ""
        try:
            row = self.sheet.row(focused.id)
        except Exception:  # noqa: BLE001 - not a sheet field (the verdict panel, a view)
            return ""
        label = str(row.label.render()).strip() or row.spec.label
        return f"{label}: {row.hint_text}" if row.hint_text else ""

    def on_descendant_focus(self, event) -> None:
        if self.has_class("-narrow"):
            self.update_title()

    # -- evaluation ----------------------------------------------------------------------------
    def on_sheet_changed(self, message: SheetChanged) -> None:
        self.history.record(self.sheet.snapshot())
        self.request_evaluation(message.inputs)

    def action_verdict_page(self) -> None:
        """Show the next screenful of the verdict panel (F8), so nothing in it is out of reach."""
        self.panel.page()

    def action_pick_material(self) -> None:
        """Open the material pick-list for the material field with the cursor (else the shaft's)."""
        from .materials import MaterialPicker

        focused = self.focused
        key = focused.id if focused is not None and focused.id in ("material", "candidate_material") \
            else "material"
        label = "the candidate" if key == "candidate_material" else "the shaft"

        def take(choice: str | None) -> None:
            if choice:
                self.sheet.row(key).set_value(choice)
                self.query_one(f"#{key}").focus()

        self.app.push_screen(MaterialPicker(label, self.sheet.value(key)), take)

    def action_undo(self) -> None:
        """Put back the sheet as it was before the last change."""
        state = self.history.undo()
        if state is None:
            self.notify("Nothing to undo.", severity="warning")
            return
        self.sheet.restore(state)

    def action_redo(self) -> None:
        """Put back a change just undone."""
        state = self.history.redo()
        if state is None:
            self.notify("Nothing to redo.", severity="warning")
            return
        self.sheet.restore(state)

    def request_evaluation(self, inputs: dict[str, str]) -> None:
        """Evaluate ``inputs`` in a worker; only the newest request's answer is shown."""
        self.generation += 1
        self.last_inputs = dict(inputs)
        self._evaluate(dict(inputs), self.generation)

    def show_job_now(self, inputs: dict[str, str]) -> None:
        """Put ``inputs`` on the sheet and show their evaluation at once (no debounce, no worker):
        used before the first paint, so that the first frame already holds the verdict."""
        with self.prevent(Input.Changed, Choice.Changed):  # evaluated here, and the spec lines set
            self.sheet.load_inputs(inputs)
        self.sheet.cancel_pending()
        self.generation += 1
        self.last_inputs = self.sheet.inputs()
        self.apply_evaluation(engine.evaluate(self.last_inputs) if self.last_inputs else engine.Evaluation())

    def warm_up(self) -> None:
        """Load what the first section view needs (numpy, scipy, the solver) in the background."""
        self.run_worker(engine.warm_up, thread=True, group="warm-up", exit_on_error=False)

    @work(thread=True, exclusive=True, group="evaluate")
    def _evaluate(self, inputs: dict[str, str], generation: int) -> None:
        evaluation = engine.evaluate(inputs) if inputs else engine.Evaluation()
        if not get_current_worker().is_cancelled:
            self.post_message(EvaluationReady(evaluation, generation))

    def on_evaluation_ready(self, message: EvaluationReady) -> None:
        if message.generation != self.generation:
            return
        self.apply_evaluation(message.evaluation)

    def apply_evaluation(self, evaluation: engine.Evaluation) -> None:
        """Show an evaluation: fresh result, or errors in place with the last good result dimmed.

        An error about a field that is still empty is not the fitter's mistake yet: it is listed
        as "still needed" on the panel, and only fields that hold text are marked red.
        """
        self.evaluation = evaluation
        typed = set(self.last_inputs)
        wrong = {k: m for k, m in evaluation.errors.items() if k in typed}
        needed = {k: m for k, m in evaluation.errors.items() if k not in typed}
        self.wrong, self.needed = wrong, needed
        self.sheet.show_errors(wrong)
        system = getattr(self.app, "system", "metric")
        dimmed = " (last good result shown dimmed)" if self.panel.result is not None else ""
        if wrong:
            self.panel.mark_stale(f"✗ not current — fix: {', '.join(sorted(wrong))}{dimmed}")
        elif needed:
            first = next(iter(needed.values()))
            self.panel.mark_stale(f"… still needed: {', '.join(sorted(needed))}{dimmed}\n  {first}")
        elif evaluation.result is not None:
            self.panel.show(evaluation.result, system)
        else:
            self.panel.show(None, system)
        self.update_title()

    @property
    def result(self) -> dict[str, Any] | None:
        """The current result, only when it matches the sheet."""
        if self.evaluation is not None and self.evaluation.ok:
            return self.evaluation.result
        return None
