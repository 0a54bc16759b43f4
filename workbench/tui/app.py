"""The Shaftbench workbench application and its entry point :func:`run`."""

from __future__ import annotations

from pathlib import Path
from typing import Any

from textual.app import App
from textual.binding import Binding

from .screens.job import JobScreen


def _workbench_commands():
    """The palette provider, imported when the palette first opens (keeps start-up light)."""
    from .commands import WorkbenchCommands

    return WorkbenchCommands


class ShaftbenchApp(App):
    """Keyboard-driven workbench: job sheet, verdict, and the views pushed over it by F-keys."""

    CSS_PATH = Path(__file__).with_name("app.tcss")  # absolute: subclasses elsewhere find it too
    TITLE = "Shaftbench"
    COMMANDS = {_workbench_commands}  # ours only: the toolkit's own (screenshot, maximize…) left out
    ENABLE_COMMAND_PALETTE = True

    BINDINGS = [
        Binding("f1", "help", "Help", id="app.help", tooltip="Keys, what each check means, cautions"),
        Binding("f2", "section", "Section", id="app.section", tooltip="Cross-sections with shear"),
        Binding("f3", "substitute", "Swap", id="app.substitute", tooltip="Equal-strength sizes"),
        Binding("f4", "stock", "Stock", id="app.stock", tooltip="Standard sizes that pass"),
        Binding("f5", "units", "Units", id="app.units", tooltip="Metric / inch display"),
        Binding("f6", "save", "Save", id="app.save", tooltip="Save the job to the job log"),
        Binding("f7", "review", "Log", id="app.review", tooltip="Open the job log"),
        Binding("f9", "profile", "Profile", id="app.profile", tooltip="Side profile, steps, moment diagram"),
        Binding("f10", "turning", "Turning", id="app.turning", tooltip="Turning sheet: sizes, limits, keyseat", show=False),
        Binding("f11", "fits", "Fits", id="app.fits", tooltip="ISO 286 limits and fits calculator", show=False),
        Binding("ctrl+q", "quit", "Quit", id="app.quit", priority=True),
    ]

    def __init__(
        self,
        *,
        demo: bool = False,
        log_path: str | None = None,
        initial_inputs: dict[str, str] | None = None,
    ) -> None:
        super().__init__()
        self.demo = demo
        self.log_path = log_path
        self.system = "metric"
        self.initial_inputs = initial_inputs
        self.meta: dict[str, str] = {}
        self.clean_inputs: dict[str, str] = {}  # the sheet as last saved, reopened or started
        self.logged_job_id: int | None = None
        """The log's job the sheet holds (reopened or saved), so saving again asks update or new."""

    async def on_event(self, event) -> None:
        """Keys typed ahead are handled in the order typed (see :mod:`workbench.tui.typeahead`)."""
        from textual import events

        if isinstance(event, events.Key) and not event.is_forwarded:
            from .typeahead import key_in_order

            if await key_in_order(self, event):
                return
        await super().on_event(event)

    def get_default_screen(self) -> JobScreen:
        """The job sheet is the bottom screen: one screen to compose before the first frame."""
        inputs = self.initial_inputs
        if self.demo and inputs is None:
            from workbench.demo import DEMO_META, demo_inputs

            inputs = demo_inputs()
            self.meta = dict(DEMO_META)
        self.clean_inputs = dict(inputs or {})
        # the first job is loaded and evaluated as the sheet mounts: the first frame shows its verdict
        self._job_screen = JobScreen(first_inputs=inputs)
        return self._job_screen

    def on_mount(self) -> None:
        self.call_after_refresh(self._after_first_paint)

    def _after_first_paint(self) -> None:
        if self.clean_inputs:
            self.mark_clean()  # the job started with, as the sheet holds it
        self._load_materials()
        self.job_screen.warm_up()
        self._offer_draft()

    # -- unsaved work ---------------------------------------------------------------------------
    def unsaved(self) -> bool:
        """True when the sheet holds a job that differs from the one last saved, reopened or
        started with (an empty sheet is never unsaved work)."""
        inputs = self.inputs()
        return bool(inputs) and inputs != self.clean_inputs

    def mark_clean(self) -> None:
        """The sheet as it is now counts as kept (just saved, reopened or loaded)."""
        self.clean_inputs = self.inputs()

    def then_if_confirmed(self, what: str, action) -> None:
        """Run ``action`` at once when nothing unsaved would be lost; else ask first."""
        if not self.unsaved():
            action()
            return
        from .screens.confirm import ConfirmScreen

        def answered(yes: bool | None) -> None:
            if yes:
                action()

        self.push_screen(
            ConfirmScreen(f"The job on the sheet is not saved (F6 saves it). {what} and lose it?",
                          yes=f"{what.lower()}, losing it", no="keep the job"),
            answered,
        )

    def _handle_exception(self, error: Exception) -> None:
        """Anything unexpected that escapes: keep the unsaved sheet as a draft, then stop."""
        self._keep_draft(f"{type(error).__name__}: {error}")
        super()._handle_exception(error)

    def _keep_draft(self, reason: str) -> None:
        from .draft import draft_path, save_draft

        try:
            inputs = self.job_screen.sheet.inputs()
            if inputs:
                save_draft(draft_path(self.log_path), inputs, self.meta, reason)
        except Exception:  # noqa: BLE001 - the app is stopping; nothing more can be done
            pass

    def _offer_draft(self) -> None:
        from .draft import discard_draft, draft_path, load_draft

        try:
            path = draft_path(self.log_path)
        except Exception:  # noqa: BLE001 - no log folder to look in: no draft either
            return
        draft = load_draft(path)
        if draft is None:
            return
        from .screens.confirm import ConfirmScreen

        def answered(yes: bool | None) -> None:
            discard_draft(path)
            if yes:
                self.meta = draft["meta"]
                self.clean_inputs = {}
                self.job_screen.sheet.load_inputs(draft["inputs"])

        self.push_screen(
            ConfirmScreen(
                f"An unsaved sheet was kept when the workbench stopped unexpectedly "
                f"({draft['kept_at']}). Put it back on the sheet?",
                yes="put it back", no="throw it away",
            ),
            answered,
        )

    def _load_materials(self) -> None:
        def work() -> list[str]:
            from . import engine

            return engine.material_keys()

        def done(keys: list[str]) -> None:
            self.job_screen.sheet.set_material_suggestions(keys)
            self.material_keys = keys

        self.material_keys: list[str] = []
        self.run_worker(lambda: self.call_from_thread(done, work()), thread=True, group="materials")

    @property
    def job_screen(self) -> JobScreen:
        """The job sheet screen (always at the bottom of the stack)."""
        return self._job_screen

    def inputs(self) -> dict[str, str]:
        """The job as typed on the sheet."""
        return self.job_screen.sheet.inputs()

    # -- actions -------------------------------------------------------------------------------
    def _on_job_screen(self) -> bool:
        return isinstance(self.screen, JobScreen)

    def action_help(self) -> None:
        """Show keys, what each check means, and the safety cautions."""
        from .screens.help import HelpScreen

        self.push_screen(HelpScreen(self.job_screen.evaluation))

    def action_section(self) -> None:
        """Draw both cross-sections with the shear stress shaded."""
        from .screens.section import SectionScreen

        self.push_screen(SectionScreen(self.inputs()))

    def action_profile(self) -> None:
        """Draw the shafts' steps and the bending-moment diagram, governing step marked."""
        from .screens.profile import ProfileScreen

        self.push_screen(ProfileScreen(self.job_screen.result or self.job_screen.panel.result))

    def action_substitute(self) -> None:
        """Equal-strength and equal-stiffness sizes in the other profiles."""
        from .screens.substitute import SubstituteScreen

        self.push_screen(SubstituteScreen(self.inputs()))

    def action_stock(self) -> None:
        """Find standard bar sizes that pass; take one as the candidate."""
        from .screens.stock import StockScreen

        sheet = self.job_screen.sheet
        self.push_screen(
            StockScreen(
                self.inputs(),
                profile=sheet.value("candidate_profile"),
                system=self.system,
                material=sheet.value("candidate_material") or sheet.value("material") or "1045-cd",
            ),
            self._take_candidate,
        )

    def _take_candidate(self, choice: dict[str, str] | None) -> None:
        if not choice:
            return
        self.job_screen.sheet.set_candidate(choice["spec"], choice.get("material", ""))
        self.notify(f"Candidate set: {choice['spec']} {choice.get('material', '')}".strip(), markup=False)

    def action_toggle_light(self) -> None:
        """Light or dark screen (a bright workshop, a dim one)."""
        self.theme = "textual-light" if self.theme != "textual-light" else "textual-dark"

    def action_turning(self) -> None:
        """The turning sheet of the current job (screens/turning.py)."""
        from .screens.turning import TurningScreen

        self.push_screen(TurningScreen(self.job_screen.result, self.inputs()))

    def action_fits(self) -> None:
        """The ISO 286 limits and fits calculator (screens/fits.py)."""
        from .screens.fits import FitsScreen

        self.push_screen(FitsScreen())

    def action_units(self) -> None:
        """Toggle the display between metric and inch (inputs accept either)."""
        self.system = "inch" if self.system == "metric" else "metric"
        screen = self.job_screen
        screen.panel.set_system(self.system)
        # what is typed keeps its meaning; from now on a bare length means the new display's unit
        screen.sheet.set_system(self.system, previous="metric" if self.system == "inch" else "inch")
        screen.update_title()
        if hasattr(self.screen, "set_system"):
            self.screen.set_system(self.system)

    def action_save(self) -> None:
        """Save the job (inputs, result, asset, location, by, note) to the job log."""
        from .screens.save import SaveScreen

        result = self.job_screen.result
        if result is None:
            self.notify("Nothing to save yet: the sheet has no current result.", severity="warning")
            return
        self.push_screen(SaveScreen(self.inputs(), result, self.meta, self.log_path, job_id=self.logged_job_id),
                         self._saved)

    def _saved(self, outcome: dict[str, Any] | None) -> None:
        if outcome:
            self.mark_clean()
            self.meta = {k: outcome[k] for k in ("asset", "location", "by", "note") if k in outcome}
            self.logged_job_id = outcome.get("job_id")

    def action_review(self) -> None:
        """Open the job log; reopen or duplicate a saved job."""
        from .screens.review import ReviewScreen

        self.push_screen(ReviewScreen(log_path=self.log_path), self._reviewed)

    def _reviewed(self, choice: dict[str, Any] | None) -> None:
        if not choice or "inputs" not in choice:
            return
        self.then_if_confirmed("Reopen the saved job", lambda: self._reopen(choice))

    def _reopen(self, choice: dict[str, Any]) -> None:
        inputs = {k: str(v) for k, v in choice["inputs"].items()}
        self.job_screen.sheet.load_inputs(inputs)
        self.mark_clean()
        job_id = choice.get("job_id", "?")
        self.logged_job_id = None
        if choice.get("action") == "duplicate":
            self.meta = {}
            self.notify(f"Copy of job {job_id} on the sheet; saving makes a new entry.")
            return
        self._report_reopen(job_id)

    def _report_reopen(self, job_id: Any) -> None:
        """Say plainly whether today's program gives the stored result (a method may have changed)."""
        from workbench.store.log import JobLog, LogError

        try:
            with JobLog.open(self.log_path, create=False) as log:
                reopened = log.reopen(int(job_id))
        except (LogError, ValueError, TypeError) as err:
            self.notify(f"Job {job_id} reopened; could not compare with the stored result: {err}", severity="warning",
                        markup=False)
            return
        record = reopened.record
        self.logged_job_id = record.id
        self.meta = {"asset": record.asset, "location": record.location, "by": record.by, "note": record.note}
        if reopened.error:
            self.notify(f"Job {job_id} reopened, but today's program refuses it: {reopened.error}",
                        severity="error", timeout=20, markup=False)
        elif reopened.differences:
            lines = "\n".join(str(d) for d in reopened.differences[:6])
            more = f"\n… and {len(reopened.differences) - 6} more" if len(reopened.differences) > 6 else ""
            self.notify(f"Job {job_id} reopened — today's result DIFFERS from the stored one:\n{lines}{more}",
                        severity="warning", timeout=30, markup=False)
        else:
            self.notify(f"Job {job_id} reopened — today's result matches the stored one.")

    def action_load_demo(self) -> None:
        """Put the demo job on the sheet."""
        from workbench.demo import DEMO_META, demo_inputs

        def load() -> None:
            self.meta = dict(DEMO_META)
            self.logged_job_id = None
            self.job_screen.sheet.load_inputs(demo_inputs())
            self.mark_clean()

        self.then_if_confirmed("Load the demo job", load)

    def action_new_job(self) -> None:
        """An empty sheet for a new job (asks first when the job on the sheet is not saved)."""
        self.then_if_confirmed("Start a new job", self._new_job)

    action_clear_sheet = action_new_job  # the palette's older name

    def _new_job(self) -> None:
        from .fields import FIELD_BY_KEY

        self.meta = {}
        self.clean_inputs = {}
        self.logged_job_id = None
        sheet = self.job_screen.sheet
        sheet.restore({key: (spec.choices[0] if spec.choices else "") for key, spec in FIELD_BY_KEY.items()})
        self.job_screen.set_focus(self.job_screen.query_one("#power"))
        sheet.scroll_home(animate=False)

    async def action_quit(self) -> None:
        """Leave the workbench; asks first when the job on the sheet is not saved."""
        from .screens.confirm import ConfirmScreen

        if isinstance(self.screen, ConfirmScreen):
            return  # already asking
        self.then_if_confirmed("Quit", self.exit)


def run(*, demo: bool = False, log_path: str | None = None) -> int:
    """Open the workbench (on the demo job with ``demo``); returns the process exit code."""
    app = ShaftbenchApp(demo=demo, log_path=log_path)
    app.run()
    return app.return_code or 0
