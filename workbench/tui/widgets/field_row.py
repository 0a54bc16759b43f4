"""One row of the job sheet: label, the control and a hint on one grid line, an error line under it.

The row is a single grid container (no inner containers) and its error line is mounted only the
first time the field is found invalid: the sheet has some thirty rows, and every widget styled
before the first frame costs start-up time.
"""

from __future__ import annotations

from textual.app import ComposeResult
from textual.suggester import SuggestFromList
from textual.widget import Widget
from textual.widgets import Input, Label, Static

from ..fields import FieldSpec
from .choice import Choice


class FieldRow(Widget):
    """A labelled input or pick-list for one field; ``set_error`` marks it invalid in place."""

    def __init__(self, spec: FieldSpec, **kwargs) -> None:
        super().__init__(id=f"row-{spec.key}", classes="field-row", **kwargs)
        self.spec = spec
        self._control: Input | Choice | None = None
        self._error: Static | None = None

    def compose(self) -> ComposeResult:
        spec = self.spec
        yield Label(spec.label, classes="field-label", id=f"label-{spec.key}")
        if spec.choices:
            self._control = Choice(spec.choices, id=spec.key, classes="field-control")
        else:
            self._control = Input(
                placeholder=spec.placeholder,
                id=spec.key,
                classes="field-control",
                compact=True,
                select_on_focus=False,
            )
        yield self._control
        yield Static(spec.hint, classes="field-hint", id=f"hint-{spec.key}")

    @property
    def control(self) -> Input | Choice:
        """The input or pick-list of this row."""
        if self._control is None:
            self._control = self.query_one(f"#{self.spec.key}")
        return self._control

    @property
    def value(self) -> str:
        """The field's text as typed (or the picked entry)."""
        control = self.control
        return control.value.strip() if isinstance(control, Input) else control.value

    def set_value(self, value: str) -> None:
        """Put ``value`` in the field as if typed."""
        control = self.control
        if isinstance(control, Choice):
            if value in control.options:
                control.value = value
        else:
            control.value = value
            control.cursor_position = len(value)

    def set_label(self, label: str) -> None:
        """Change the label text (e.g. "Bore" / "Thickness" with the profile)."""
        self.query_one(".field-label", Label).update(label)

    def set_hint(self, hint: str) -> None:
        """Change the hint beside the field."""
        self.query_one(".field-hint", Static).update(hint)

    def set_placeholder(self, placeholder: str) -> None:
        """Change the greyed example shown while a text field is empty."""
        control = self.control
        if isinstance(control, Input):
            control.placeholder = placeholder

    def set_suggestions(self, words: list[str]) -> None:
        """Offer completions (→ accepts) for a text field."""
        control = self.control
        if isinstance(control, Input) and words:
            control.suggester = SuggestFromList(words, case_sensitive=False)

    def set_error(self, message: str) -> None:
        """Mark the field invalid with ``message`` under it, or clear the mark with ""."""
        self.set_class(bool(message), "-invalid")
        self.control.set_class(bool(message), "-invalid")
        text = f"✗ {message}" if message else ""
        if self._error is None:
            if not message:
                return
            self._error = Static(text, classes="field-error", id=f"error-{self.spec.key}")
            self.mount(self._error)
        else:
            self._error.update(text)
