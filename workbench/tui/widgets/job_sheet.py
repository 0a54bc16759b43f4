"""The job sheet: every field of the job, top to bottom in the order the work goes."""

from __future__ import annotations

from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import VerticalScroll
from textual.css.query import NoMatches
from textual.timer import Timer
from textual.widgets import Input, Static

from ..fields import (
    CHOICE_DEFAULTS,
    ERROR_TARGET,
    FIELD_BY_KEY,
    SECOND_LABEL,
    SECTIONS,
    SHOWN_WHEN,
    SIZE_HINT,
    SIZE_PLACEHOLDER,
    compose_spec,
    is_full_spec,
    profile_words_tip,
    split_size_words,
    split_spec,
)
from ..inch_rule import LENGTH_KEYS, bare_length, hint_for, inch_guess, pin_size_unit, pin_unit, size_text
from ..messages import SheetChanged
from .choice import Choice
from .field_row import FieldGrid, FieldRow
from .steady import update_in_place

DEBOUNCE_S = 0.12
SHAFT_PREFIXES = ("shaft", "candidate")
_SHAFT_PARTS = ("profile", "size", "second", "keyseat", "finish")


class JobSheet(VerticalScroll, can_focus=False):
    """The form. Posts :class:`SheetChanged` (debounced) whenever what is typed changes.

    The sheet itself never takes focus (its fields do, and scroll into view): a focusable scroll
    container would be focused first at start-up and then blurred, and each change restyles
    every widget of the sheet.
    """

    BINDINGS = [
        Binding("pagedown", "section(1)", "Next part", show=False, id="sheet.next_section"),
        Binding("pageup", "section(-1)", "Prev part", show=False, id="sheet.prev_section"),
    ]

    def __init__(self, **kwargs) -> None:
        super().__init__(**kwargs)
        self._timer: Timer | None = None
        self._loading = False
        self._shown_errors: dict[str, str] = {}
        self._rows: dict[str, FieldRow] = {}

    def compose(self) -> ComposeResult:
        """Each part: its title, one grid holding every label, control and hint, a spec line."""
        self._rows = {}
        for section in SECTIONS:
            yield Static(section.title, classes="section-title", id=f"title-{section.id}")
            with FieldGrid(classes="field-grid", id=f"fields-{section.id}"):
                for spec in section.fields:
                    row = self._rows[spec.key] = FieldRow(spec)
                    yield from row.widgets()
            if section.id in SHAFT_PREFIXES:
                yield Static("", classes="spec-line", id=f"spec-{section.id}")

    def on_mount(self) -> None:
        for prefix in SHAFT_PREFIXES:
            self._apply_profile(prefix)
        self._apply_shown()

    # -- reading -------------------------------------------------------------------------------
    def row(self, key: str) -> FieldRow:
        """The row of a sheet field (``NoMatches`` for a key with no row)."""
        try:
            return self._rows[key]
        except KeyError:
            raise NoMatches(f"no sheet field {key!r}") from None

    def invalid_keys(self) -> set[str]:
        """The fields currently marked invalid."""
        return {key for key, row in self._rows.items() if row.invalid}

    def value(self, key: str) -> str:
        """What is in a sheet field."""
        return self.row(key).value

    @property
    def system(self) -> str:
        """The display, "metric" or "inch": a bare length on the sheet is mm or inches with it."""
        try:
            return getattr(self.app, "system", "metric")
        except Exception:  # noqa: BLE001 - no app yet (built outside one): the metric default
            return "metric"

    def shaft_spec(self, prefix: str) -> str:
        """The spec string built from a shaft block ("" when no size is typed); in inch display
        a bare size goes in with ``in`` (see :mod:`workbench.tui.inch_rule`)."""
        profile, size, second, keyseat, finish = (self.value(f"{prefix}_{part}") for part in _SHAFT_PARTS)
        system = self.system
        return compose_spec(profile, size_text(size, system), bare_length(second, system), keyseat, finish)

    def inputs(self) -> dict[str, str]:
        """The contract dict: only fields that hold something, strings exactly as typed."""
        out: dict[str, str] = {}
        for key, spec in FIELD_BY_KEY.items():
            if key.startswith(SHAFT_PREFIXES) and key.split("_", 1)[1] in _SHAFT_PARTS:
                continue
            text = self.value(key)
            if not text or CHOICE_DEFAULTS.get(key) == text or not self._shown(key):
                continue
            out[key] = bare_length(text, self.system) if key in LENGTH_KEYS else text
        for prefix in SHAFT_PREFIXES:
            spec = self.shaft_spec(prefix)
            if spec:
                out[prefix] = spec
        return out

    def snapshot(self) -> dict[str, str]:
        """What every field holds, pick-lists included, as shown (for undo and a new job)."""
        return {key: row.control.value for key, row in self._rows.items()}

    # -- writing -------------------------------------------------------------------------------
    def restore(self, values: dict[str, str]) -> None:
        """Put back a :meth:`snapshot` (fields it does not name are left as they are)."""
        self._loading = True
        try:
            for key, value in values.items():
                if key in self._rows:
                    self._rows[key].set_value(value)
            for prefix in SHAFT_PREFIXES:
                self._apply_profile(prefix)
        finally:
            self._loading = False
        self._schedule()

    def load_inputs(self, inputs: dict[str, str]) -> None:
        """Fill the sheet from a contract dict (demo job, a reopened log entry); clears the rest."""
        self._loading = True
        try:
            for key, spec in FIELD_BY_KEY.items():
                if key.startswith(SHAFT_PREFIXES) and key.split("_", 1)[1] in _SHAFT_PARTS:
                    continue
                self.row(key).set_value(inputs.get(key, spec.choices[0] if spec.choices else ""))
            for prefix in SHAFT_PREFIXES:
                self.set_shaft(prefix, inputs.get(prefix, ""))
        finally:
            self._loading = False
        self._schedule()

    def set_shaft(self, prefix: str, spec: str) -> None:
        """Fill a shaft block from a spec string; a spec the fields cannot hold goes whole into Size."""
        parts = split_spec(spec) if spec else None
        if parts is None:
            parts = {"profile": self.value(f"{prefix}_profile"), "size": spec, "second": ""}
            parts.update(keyseat="plain", finish="machined")
        for part in _SHAFT_PARTS:
            self.row(f"{prefix}_{part}").set_value(parts[part])
        self._apply_profile(prefix)

    def set_candidate(self, spec: str, material: str) -> None:
        """Make ``spec`` in ``material`` the candidate (from the stock finder)."""
        self.set_shaft("candidate", spec)
        if material:
            same = material == (self.value("material") or "1045-cd")
            self.row("candidate_material").set_value("" if same else material)
        self._schedule()

    def set_system(self, system: str, previous: str) -> None:
        """The display changed (F5) from ``previous``: every bare length already typed gets the
        unit it was typed in (the job does not change), and hints name the new bare unit."""
        self._loading = True
        try:
            for key, row in self._rows.items():
                value = row.value
                if not value:
                    continue
                if key in LENGTH_KEYS or key.endswith("_second"):
                    row.set_value(pin_unit(value, previous))
                elif key.endswith("_size") and not is_full_spec(value):
                    row.set_value(pin_size_unit(value, previous))
        finally:
            self._loading = False
        for key, row in self._rows.items():
            if "bare = mm" in row.spec.hint and not key.endswith(("_size", "_second")):
                row.set_hint(hint_for(row.spec.hint, system))
        for prefix in SHAFT_PREFIXES:
            self._apply_profile(prefix)
        self._shown_errors = {}  # messages may read differently now
        self._schedule()

    def show_errors(self, errors: dict[str, str]) -> None:
        """Mark every invalid field in place; clears the others. A bare size too small for mm
        that reads as a plausible inch size gets "did you mean … in?"."""
        targets = {ERROR_TARGET.get(k, k): m for k, m in errors.items()}
        for key in list(targets):
            if key.endswith("_size") or key in LENGTH_KEYS:
                targets[key] = inch_guess(self.value(key), targets[key], self.system)
        if targets == self._shown_errors:
            return  # the usual keystroke: nothing to re-mark
        for key in set(targets) | set(self._shown_errors):
            if targets.get(key) != self._shown_errors.get(key):
                try:
                    self.row(key).set_error(targets.get(key, ""))
                except NoMatches:  # a key with no row of its own: the panel names it
                    continue
        self._shown_errors = targets

    def set_material_suggestions(self, keys: list[str]) -> None:
        """Complete material keys in both material fields."""
        for key in ("material", "candidate_material"):
            self.row(key).set_suggestions(keys)

    # -- behaviour -----------------------------------------------------------------------------
    def _apply_profile(self, prefix: str) -> None:
        profile = self.value(f"{prefix}_profile")
        second = self.row(f"{prefix}_second")
        second.display = profile in SECOND_LABEL
        second.set_label(SECOND_LABEL.get(profile, "Bore"))
        size_row = self.row(f"{prefix}_size")
        size_row.set_hint(hint_for(SIZE_HINT.get(profile, ""), self.system))
        second.set_hint(hint_for(FIELD_BY_KEY[f"{prefix}_second"].hint, self.system))
        size_row.set_placeholder(SIZE_PLACEHOLDER.get(profile, "e.g. 40"))
        self._update_spec_line(prefix)

    def _update_spec_line(self, prefix: str) -> None:
        spec = self.shaft_spec(prefix)
        size = self.value(f"{prefix}_size")
        note = "  (typed in full)" if size and is_full_spec(size) else ""
        text = f"→ {spec}{note}" if spec else "→ no size yet"
        tip = profile_words_tip(self.value(f"{prefix}_profile"))
        if tip and not is_full_spec(size) and not split_size_words(size)[1]:
            text += f"\n{tip}"  # how to enter flats, radii, chamfers: until they are used
        update_in_place(self.query_one(f"#spec-{prefix}", Static), text)

    def _shown(self, key: str) -> bool:
        """False for a field that only applies to another choice (e.g. From bearing, overhung)."""
        rule = SHOWN_WHEN.get(key)
        return rule is None or self.value(rule[0]) in rule[1]

    def _apply_shown(self) -> None:
        for key in SHOWN_WHEN:
            self.row(key).display = self._shown(key)

    def on_choice_changed(self, event: Choice.Changed) -> None:
        key = event.choice.id or ""
        if any(rule[0] == key for rule in SHOWN_WHEN.values()):
            self._apply_shown()
        if key.endswith("_profile"):
            self._apply_profile(key.rsplit("_", 1)[0])
        elif key.startswith(SHAFT_PREFIXES):
            self._update_spec_line(key.split("_", 1)[0])
        self._schedule()

    def on_input_changed(self, event: Input.Changed) -> None:
        key = event.input.id or ""
        if key.startswith(SHAFT_PREFIXES) and not key.endswith("material"):
            self._update_spec_line(key.split("_", 1)[0])
        self._schedule()

    def on_input_submitted(self, event: Input.Submitted) -> None:
        event.stop()
        self.screen.focus_next()

    def _schedule(self) -> None:
        if self._loading or not self.is_mounted:
            return
        if self._timer is not None:
            self._timer.stop()
        self._timer = self.set_timer(DEBOUNCE_S, self._emit)

    def cancel_pending(self) -> None:
        """Drop a change not yet posted (its inputs were just evaluated another way)."""
        if self._timer is not None:
            self._timer.stop()
            self._timer = None

    def _emit(self) -> None:
        self._timer = None
        self.post_message(SheetChanged(self.inputs()))

    def action_section(self, step: int) -> None:
        """Move the cursor to the first field of the next (or previous) part of the sheet."""
        firsts = [section.fields[0].key for section in SECTIONS]
        focused = self.screen.focused
        current = 0
        if focused is not None:
            for index, section in enumerate(SECTIONS):
                if any(focused.id == f.key for f in section.fields):
                    current = index
        target = firsts[(current + step) % len(firsts)]
        widget = self.query_one(f"#{target}")
        self.screen.set_focus(widget)  # at once (focus() waits its turn: keys typed after would not)
        self.query_one(f"#title-{SECTIONS[(current + step) % len(SECTIONS)].id}").scroll_visible(
            top=True
        )
