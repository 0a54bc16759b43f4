"""The job log review: find a saved job, look it over, reopen it, copy it, bin it, print its card.

Newest first, one page of rows at a time; every query runs in a worker thread with its own
connection, so a log of any size never blocks typing. Dismisses with
``{"action": "reopen" | "duplicate", "job_id": int, "inputs": dict}`` or None.
"""

from __future__ import annotations

from datetime import date
from pathlib import Path
from typing import Any

from rich.console import Group
from rich.text import Text
from textual import on, work
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, Vertical, VerticalScroll
from textual.coordinate import Coordinate
from textual.screen import ModalScreen, Screen
from textual.widgets import DataTable, Footer, Input, Label, Select, Static
from textual.worker import get_current_worker

PAGE_SIZE = 100
NARROW_BELOW = 110
"""Below this many columns the list takes the full width, a short summary of the highlighted job
sits under it instead of the whole card beside it, and the footer is compact."""
COLUMNS: tuple[tuple[str, str, int], ...] = (
    # key, heading, width (the asset column takes what is left, at least its width here)
    ("id", "id", 5),
    ("saved", "saved (UTC)", 16),
    ("verdict", "verdict", 8),
    ("asset", "asset", 12),
    ("location", "location", 12),
    ("material", "material", 14),
    ("by", "by", 10),
)
"""The list's columns in the order they are dropped last: id, saved, verdict and asset always show;
location, material and who checked it are added while the width allows."""
CELL_PADDING = 2
FULL_CARD_COLUMNS = 90
"""The preview shows the whole job card when its pane is at least this wide (the card's shafts table
needs it to show values beside its labels); narrower, it shows the short summary."""
VERDICT_CHOICES = [("pass", "pass"), ("marginal", "marginal"), ("fail", "fail")]
CARD_SUFFIXES = {".html": "html", ".htm": "html", ".svg": "svg", ".txt": "text"}


def _valid_date(text: str) -> bool:
    try:
        date.fromisoformat(text.strip())
    except ValueError:
        return False
    return True


def choose_columns(width: int, id_width: int = COLUMNS[0][2]) -> list[tuple[str, int]]:
    """The list's columns for a table ``width`` cells wide, as (key, width): the first four of
    COLUMNS always, then the others while they fit; the asset column takes the room left over.
    ``id_width``: the digits of the longest job number shown (never cut: 1000050 is not 10000)."""
    columns = [("id", "id", max(COLUMNS[0][2], id_width)), *COLUMNS[1:]]
    chosen = list(columns[:4])
    for column in columns[4:]:
        if sum(w + CELL_PADDING for _, _, w in chosen) + column[2] + CELL_PADDING > width:
            break
        chosen.append(column)
    spare = max(0, width - sum(w + CELL_PADDING for _, _, w in chosen))
    growing = [key for key, _, _ in chosen if key in ("asset", "location")]  # split what is left
    share = {key: spare // len(growing) + (1 if i < spare % len(growing) else 0) for i, key in enumerate(growing)}
    return [(key, w + share.get(key, 0)) for key, _, w in chosen]


def job_summary(record: Any) -> Text:
    """A few lines that say what a stored job is and how it came out (the narrow screen's preview)."""
    from workbench.report.jobcard import deciding_shaft, literal, number, shafts_of, verdict_text, when

    result = record.result if isinstance(record.result, dict) else {}
    text = Text.assemble((f"job {record.id}  ", "bold"), verdict_text(result.get("verdict")))
    shaft = deciding_shaft(result)
    if shaft:
        text.append_text(Text.assemble("  ", literal(shaft.get("role", "")), " ", literal(shaft.get("spec", ""))))
        if shaft.get("governing"):
            text.append_text(Text.assemble(("  governed by ", "dim"), literal(shaft.get("governing"))))
    if shaft.get("why"):
        text.append_text(Text.assemble("\n", ("why: ", "dim"), literal(shaft.get("why"))))
    text.append_text(Text.assemble(
        "\n", ("asset ", "dim"), literal(record.asset or "-"), ("  location ", "dim"), literal(record.location or "-"),
        ("  by ", "dim"), literal(record.by or "-"), ("  saved ", "dim"), when(record.created_at),
    ))
    drive = result.get("drive") if isinstance(result.get("drive"), dict) else {}
    text.append_text(Text.assemble(
        "\n", ("design torque ", "dim"), number(drive.get("design_torque_Nm"), 1, "N·m"),
        ("  shaft speed ", "dim"), number(drive.get("shaft_speed_rpm"), 1, "rpm"),
    ))
    for s in shafts_of(result):
        text.append_text(Text.assemble(
            "\n", (f"{s.get('role', 'shaft')}: ", "dim"), literal(s.get("spec", "")), "  ",
            literal(s.get("material_name") or s.get("material") or ""),
            ("  SF static ", "dim"), number(s.get("static_safety_factor")),
            (" fatigue ", "dim"), number(s.get("fatigue_safety_factor")), "  ", verdict_text(s.get("verdict")),
        ))
    outcome = getattr(record, "outcome", "") or "not recorded"
    text.append_text(Text.assemble(
        "\n", ("fitted: ", "dim"), literal(record.fitted or "not recorded"), ("  outcome: ", "dim"), literal(outcome),
    ))
    if record.note:
        text.append_text(Text.assemble("\n", ("note: ", "dim"), literal(record.note)))
    return text


class ConfirmScreen(ModalScreen[bool]):
    """A yes/no question; ``y`` answers yes, ``n`` or escape answers no."""

    DEFAULT_CSS = """
    ConfirmScreen { align: center middle; }
    ConfirmScreen > Vertical { width: 64; height: auto; border: thick $warning; padding: 1 2; background: $surface; }
    """
    BINDINGS = [
        Binding("y", "answer(True)", "Yes", id="review.confirm.yes"),
        Binding("n,escape", "answer(False)", "No", id="review.confirm.no"),
    ]

    def __init__(self, question: Text) -> None:
        super().__init__()
        self.question = question

    def compose(self) -> ComposeResult:
        with Vertical():
            yield Static(self.question)
            yield Label("y = yes    n / Esc = no")

    def action_answer(self, yes: bool) -> None:
        self.dismiss(yes)


class CardPathScreen(ModalScreen["Path | None"]):
    """Asks where to write a job card; the file suffix picks the format (.html, .svg, .txt)."""

    DEFAULT_CSS = """
    CardPathScreen { align: center middle; }
    CardPathScreen > Vertical { width: 80; height: auto; border: thick $accent; padding: 1 2; background: $surface; }
    """
    BINDINGS = [Binding("escape", "cancel", "Cancel", id="review.card.cancel")]

    def __init__(self, suggestion: Path) -> None:
        super().__init__()
        self.suggestion = suggestion

    def compose(self) -> ComposeResult:
        with Vertical():
            yield Label("Write the job card to (.html, .svg or .txt), Enter to write:")
            yield Input(str(self.suggestion), id="card-path")

    @on(Input.Submitted, "#card-path")
    def _submitted(self, event: Input.Submitted) -> None:
        text = event.value.strip()
        if text:
            self.dismiss(Path(text).expanduser())

    def action_cancel(self) -> None:
        self.dismiss(None)


class ReviewScreen(Screen["dict[str, Any] | None"]):
    """The job log: filter as you type, page through, act on the highlighted job."""

    DEFAULT_CSS = """
    ReviewScreen #review-filters { height: auto; }
    ReviewScreen #review-text { width: 2fr; }
    ReviewScreen #review-verdict { width: 22; }
    ReviewScreen .review-date { width: 20; }
    ReviewScreen #review-body { height: 1fr; }
    ReviewScreen #review-table { width: 3fr; }
    ReviewScreen #review-detail-scroll { width: 2fr; border-left: solid $primary; padding: 0 1; }
    ReviewScreen #review-status { height: 1; padding: 0 1; background: $boost; }
    ReviewScreen.-narrow #review-body { layout: vertical; }
    ReviewScreen.-narrow #review-table { width: 1fr; height: 1fr; }
    ReviewScreen.-narrow #review-detail-scroll { width: 1fr; height: 9; border-left: none;
                                                 border-top: solid $primary; }
    ReviewScreen.-narrow #review-verdict { width: 20; }
    ReviewScreen.-narrow .review-date { width: 14; }
    """

    BINDINGS = [
        Binding("escape", "close", "Close", id="review.close", tooltip="Leave the filter, or close the log"),
        Binding("o", "reopen", "Reopen", id="review.reopen", tooltip="Put this job back on the sheet"),
        Binding("c", "duplicate", "Copy", id="review.duplicate",
                tooltip="Start a new job from this one's inputs"),
        Binding("d", "delete", "Bin", id="review.delete", tooltip="Move this job to the bin (asks first)"),
        Binding("r", "restore", "Restore", id="review.restore", tooltip="Bring this job back from the bin"),
        Binding("x", "card", "Card", id="review.card", tooltip="Write this job's card to a file"),
        Binding("e", "edit", "Edit", id="review.edit",
                tooltip="Record what was fitted, when, and how it ended (kept with the time of the change)"),
        Binding("t", "recheck", "Recheck", id="review.recheck",
                tooltip="Recompute with today's program and list what differs"),
        Binding("b", "toggle_bin", "Show bin", id="review.bin", tooltip="Switch between the log and the bin"),
        Binding("f12", "asset", "Asset", id="review.asset",
                tooltip="The history of this job's asset: its shafts on a time chart, MTBR, flags"),
        Binding("n,pagedown", "page(1)", "Next page", id="review.next"),
        Binding("p,pageup", "page(-1)", "Prev page", id="review.prev"),
        Binding("slash", "focus_filter", "Filter", id="review.filter", show=False,
                tooltip="Back to the filter box (always in view at the top)"),
        Binding("down", "to_table", "Jobs", id="review.to_table", show=False,
                tooltip="From the filter, move to the list of jobs"),
    ]

    def __init__(
        self,
        log_path: str | Path | None = None,
        *,
        page_size: int = PAGE_SIZE,
        card_dir: str | Path | None = None,
        name: str | None = None,
        id: str | None = None,
    ) -> None:
        super().__init__(name=name, id=id)
        from workbench.store.paths import is_database_url

        self.log_path = (log_path if is_database_url(log_path) else Path(log_path).expanduser()) if log_path else None
        self.page_size = page_size
        self.card_dir = Path(card_dir) if card_dir else Path.cwd()
        self.page = 0
        self.total = 0
        self.show_bin = False
        self.records: dict[int, Any] = {}
        self.rechecks: dict[int, Any] = {}
        self.loads = 0
        """How many pages have been shown with their count (tests wait on it)."""
        self.counting = False
        """True while the page is shown and its filter's count is still being read."""
        self.columns: tuple[str, ...] = ()
        """Keys of the columns the list shows now (chosen by width, see COLUMNS)."""
        self._chosen: tuple[tuple[str, int], ...] = ()
        """The columns and their widths as laid out now."""

    # -- layout ---------------------------------------------------------------------------

    def compose(self) -> ComposeResult:
        with Horizontal(id="review-filters"):
            yield Input(placeholder="filter: asset, spec, name, notes, verdict…", id="review-text")
            yield Select(VERDICT_CHOICES, prompt="any verdict", id="review-verdict")
            yield Input(placeholder="since Y-M-D", id="review-since", classes="review-date")
            yield Input(placeholder="until Y-M-D", id="review-until", classes="review-date")
        with Horizontal(id="review-body"):
            yield DataTable(id="review-table", cursor_type="row", zebra_stripes=True)
            with VerticalScroll(id="review-detail-scroll"):
                yield Static(id="review-detail")
        yield Static(id="review-status")
        yield Footer()

    def on_mount(self) -> None:
        self._fit_to(self.size.width)
        self.query_one("#review-text", Input).focus()  # type to filter straight away
        self.reload()

    def on_resize(self, event: Any) -> None:
        self._fit_to(event.size.width)
        self.call_after_refresh(self._update_detail)  # the pane's new width picks card or summary

    def _fit_to(self, width: int) -> None:
        """Lay the screen out for ``width`` columns: narrow or wide, and the list's columns."""
        narrow = width < NARROW_BELOW
        self.set_class(narrow, "-narrow")
        footer = self.query_one(Footer)
        footer.compact = narrow
        footer.show_command_palette = not narrow  # Ctrl+P still opens it; its room goes to our keys
        table_width = width - 2 if narrow else (width * 3) // 5 - 2
        id_width = max((len(str(job_id)) for job_id in self.records), default=0)
        chosen = choose_columns(table_width, id_width)
        if tuple(chosen) == self._chosen and self.query_one(DataTable).columns:
            return
        self._chosen = tuple(chosen)
        self.columns = tuple(key for key, _ in chosen)
        table = self.query_one(DataTable)
        table.clear(columns=True)
        headings = {key: heading for key, heading, _ in COLUMNS}
        for key, column_width in chosen:
            table.add_column(headings[key], key=key, width=column_width)
        if self.records:
            self._fill_rows(list(self.records.values()))

    def check_action(self, action: str, parameters: tuple[object, ...]) -> bool | None:
        """Hide keys that do nothing here (restore outside the bin, paging a single page), so the
        footer has room for the ones that do."""
        if action == "restore":
            return self.show_bin
        if action == "delete":
            return not self.show_bin
        if action == "page":
            return self.total > self.page_size
        return True

    # -- loading --------------------------------------------------------------------------

    def filters(self) -> dict[str, Any] | None:
        """The filters as typed, or None while a date is half typed (the last page stays)."""
        since = self.query_one("#review-since", Input).value.strip()
        until = self.query_one("#review-until", Input).value.strip()
        for what, text in (("since", since), ("until", until)):
            if text and not _valid_date(text):
                self._status(f"{what}: type a date like 2025-03-01")
                return None
        verdict = self.query_one("#review-verdict", Select).value
        return {
            "text": self.query_one("#review-text", Input).value,
            "verdict": verdict if isinstance(verdict, str) else None,
            "since": since or None,
            "until": until or None,
            "deleted": self.show_bin,
        }

    def reload(self, page: int = 0) -> None:
        """Query the page (in a worker) with the current filters."""
        filters = self.filters()
        if filters is not None:
            self.page = max(0, page)
            self._load(filters, self.page)

    @work(thread=True, exclusive=True, group="review-load")
    def _load(self, filters: dict[str, Any], page: int) -> None:
        from workbench.store import JobLog, LogError

        worker = get_current_worker()
        try:
            with JobLog.open(self.log_path, create=False) as log:
                # The page first, then its count: a text filter's exact count can take longer than
                # the page (words the index cannot count alone), and the rows should not wait on it.
                records = log.search(limit=self.page_size, offset=page * self.page_size, **filters)
                if worker.is_cancelled:
                    return
                self.app.call_from_thread(self._show_page, records, None)
                total = log.count(**filters)
        except LogError as err:
            if not worker.is_cancelled:
                self.app.call_from_thread(self._show_error, str(err))
            return
        if not worker.is_cancelled:
            self.app.call_from_thread(self._show_total, total)

    def _show_error(self, message: str) -> None:
        self.records = {}
        self.total = 0
        self.query_one(DataTable).clear()
        self.query_one("#review-detail", Static).update("")
        self._status(message)
        self.loads += 1

    def _show_page(self, records: list[Any], total: int | None) -> None:
        """Show a page of jobs; ``total`` None: the count follows (``_show_total``)."""
        table = self.query_one(DataTable)
        keep = self.current_id()
        self.records = {r.id: r for r in records}
        self._fit_to(self.size.width)  # a longer job number widens the id column
        self.counting = total is None
        # while counting, the total is at least what this page shows (one more if it is full)
        self.total = total if total is not None else (
            self.page * self.page_size + len(records) + (len(records) == self.page_size))
        self._fill_rows(records)
        if keep in self.records:
            table.move_cursor(row=table.get_row_index(str(keep)))
        self._update_detail()
        self._update_status()
        self.refresh_bindings()
        if not self.counting:
            self.loads += 1

    def _fill_rows(self, records: list[Any]) -> None:
        from workbench.report.jobcard import literal, verdict_text, when

        table = self.query_one(DataTable)
        table.clear()
        cells = {
            "id": lambda r: Text(str(r.id), justify="right"),
            "saved": lambda r: when(r.created_at).removesuffix(" UTC"),
            "verdict": lambda r: verdict_text(r.verdict),
            "asset": lambda r: literal(r.asset),
            "location": lambda r: literal(r.location),
            "material": lambda r: literal(r.material),
            "by": lambda r: literal(r.by),
        }
        for r in records:
            table.add_row(*(cells[key](r) for key in self.columns), key=str(r.id))

    def _show_total(self, total: int) -> None:
        """The count of the filter's jobs, read after its page was shown."""
        self.counting = False
        self.total = total
        self._update_status()
        self.refresh_bindings()
        self.loads += 1

    def _status(self, message: str) -> None:
        self.query_one("#review-status", Static).update(Text(message))

    def _update_status(self) -> None:
        where = "bin" if self.show_bin else "log"
        if not self.total:
            filters = self.filters() or {}
            filtered = any(filters.get(k) for k in ("text", "verdict", "since", "until"))
            self._status(f"no jobs in the {where} match the filter" if filtered else f"the {where} is empty")
            return
        first = self.page * self.page_size + 1
        last = first + len(self.records) - 1
        if self.counting:
            self._status(f"{where}: jobs {first}-{last} of …  counting")
            return
        pages = (self.total + self.page_size - 1) // self.page_size
        self._status(f"{where}: jobs {first}-{last} of {self.total:,}  page {self.page + 1} of {pages}")

    # -- the highlighted job --------------------------------------------------------------

    def current_id(self) -> int | None:
        """The id of the highlighted job, or None."""
        table = self.query_one(DataTable)
        if not table.row_count:
            return None
        row_key, _ = table.coordinate_to_cell_key(Coordinate(table.cursor_row, 0))
        return int(row_key.value) if row_key.value is not None else None

    def current(self) -> Any | None:
        job_id = self.current_id()
        return self.records.get(job_id) if job_id is not None else None

    @on(DataTable.RowHighlighted)
    def _highlighted(self) -> None:
        self._update_detail()

    @on(DataTable.RowSelected)
    def _selected(self) -> None:
        self.action_reopen()

    def _update_detail(self) -> None:
        from workbench.report.jobcard import job_card_for_record, when

        detail = self.query_one("#review-detail", Static)
        record = self.current()
        if record is None:
            detail.update("")
            return
        parts: list[Any] = []
        if record.deleted_at:
            parts.append(Text(f"In the bin since {when(record.deleted_at)} (r restores it)", style="bold yellow"))
        if record.id in self.rechecks:
            from workbench.report.recheck import recheck_text

            parts.append(recheck_text(self.rechecks[record.id]))
        pane = self.query_one("#review-detail-scroll").size.width
        roomy = not self.has_class("-narrow") and pane >= FULL_CARD_COLUMNS
        parts.append(job_card_for_record(record) if roomy else job_summary(record))
        detail.update(Group(*parts))

    # -- actions --------------------------------------------------------------------------

    def action_close(self) -> None:
        if isinstance(self.focused, Input) and self.focused.value:
            self.query_one(DataTable).focus()
        else:
            self.dismiss(None)

    def action_to_table(self) -> None:
        self.query_one(DataTable).focus()

    def action_focus_filter(self) -> None:
        self.query_one("#review-text", Input).focus()

    def _choose(self, action: str) -> None:
        record = self.current()
        if record is None:
            self.notify("No job highlighted.", severity="warning")
            return
        self.dismiss({"action": action, "job_id": record.id, "inputs": dict(record.inputs)})

    def action_reopen(self) -> None:
        self._choose("reopen")

    def action_asset(self) -> None:
        """Open the asset history of the highlighted job (every asset if it names none)."""
        from workbench.tui.screens.asset import AssetScreen

        record = self.current()
        self.app.push_screen(AssetScreen(self.log_path, record.asset if record is not None else ""))

    def action_duplicate(self) -> None:
        self._choose("duplicate")

    def action_page(self, step: int) -> None:
        pages = max(1, (self.total + self.page_size - 1) // self.page_size)
        target = min(max(0, self.page + step), pages - 1)
        if target != self.page:
            self.reload(target)

    def action_toggle_bin(self) -> None:
        self.show_bin = not self.show_bin
        self.refresh_bindings()
        self.reload()

    def action_delete(self) -> None:
        from workbench.report.jobcard import literal

        record = self.current()
        if record is None:
            return
        if record.deleted_at:
            self.notify(f"Job {record.id} is already in the bin.", severity="warning")
            return
        question = Text.assemble(f"Move job {record.id} (", literal(record.asset or "no asset"),
                                 ") to the bin? It can be restored later.")

        def answered(yes: bool | None) -> None:
            if yes:
                self._change("delete", record.id)

        self.app.push_screen(ConfirmScreen(question), answered)

    def action_restore(self) -> None:
        record = self.current()
        if record is None:
            return
        if not record.deleted_at:
            self.notify(f"Job {record.id} is not in the bin.", severity="warning")
            return
        self._change("restore", record.id)

    @work(thread=True, group="review-write")
    def _change(self, what: str, job_id: int) -> None:
        from workbench.store import JobLog, LogError

        try:
            with JobLog.open(self.log_path, create=False) as log:
                getattr(log, what)(job_id)
        except LogError as err:
            self.app.call_from_thread(self.notify, str(err), severity="error")
            return
        done = "moved to the bin" if what == "delete" else "restored"
        self.app.call_from_thread(self.notify, f"Job {job_id} {done}.")
        self.app.call_from_thread(self.reload, self.page)

    def action_card(self) -> None:
        record = self.current()
        if record is None:
            return

        def chosen(path: Path | None) -> None:
            if path is not None:
                self._write_card(record, path)

        self.app.push_screen(CardPathScreen(self.card_dir / f"job-{record.id}-card.html"), chosen)

    @work(thread=True, group="review-write")
    def _write_card(self, record: Any, path: Path) -> None:
        from workbench.report.jobcard import card_page_for_records, export_card, job_card_for_record
        from workbench.safe_output import OutputError, write_output

        fmt = CARD_SUFFIXES.get(path.suffix.lower(), "text")
        try:
            text = (card_page_for_records([record]) if fmt == "html"
                    else export_card(job_card_for_record(record), fmt))
            write_output(path, text)
        except OutputError as err:
            self.app.call_from_thread(self.notify, str(err), severity="error", markup=False)
            return
        self.app.call_from_thread(self.notify, f"Card of job {record.id} written to {path}.", markup=False)

    def action_edit(self) -> None:
        from .outcome import OutcomeScreen

        record = self.current()
        if record is None:
            self.notify("No job highlighted.", severity="warning")
            return

        def edited(done: dict[str, Any] | None) -> None:
            if done:
                self.reload(self.page)

        self.app.push_screen(OutcomeScreen(record, self.log_path), edited)

    def action_recheck(self) -> None:
        record = self.current()
        if record is not None:
            self._recheck(record.id)

    @work(thread=True, exclusive=True, group="review-recheck")
    def _recheck(self, job_id: int) -> None:
        from workbench.store import JobLog, LogError

        try:
            with JobLog.open(self.log_path, create=False) as log:
                reopened = log.reopen(job_id)
        except LogError as err:
            self.app.call_from_thread(self.notify, str(err), severity="error")
            return

        def show() -> None:
            self.rechecks[job_id] = reopened
            self._update_detail()

        self.app.call_from_thread(show)

    # -- filters --------------------------------------------------------------------------

    @on(Input.Changed, "#review-text, #review-since, #review-until")
    def _filter_changed(self) -> None:
        self.reload()

    @on(Select.Changed, "#review-verdict")
    def _verdict_changed(self) -> None:
        self.reload()

    @on(Input.Submitted, "#review-text, #review-since, #review-until")
    def _filter_done(self) -> None:
        self.query_one(DataTable).focus()
