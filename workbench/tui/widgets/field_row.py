"""One row of the job sheet: label, control and hint, placed straight into a part's field grid.

A row is a plain helper object, not a container: its label, control and hint are children of the
grid of its part of the sheet (see :class:`FieldGrid`). Textual reuses a computed style only
between widgets with the same parent, so one grid per part styles thirty labels, controls and
hints almost as cheaply as one of each; a container per row would style every one afresh and make
start-up slower. The error line is mounted into the grid, under the row, only the first time the
field is found invalid.
"""

from __future__ import annotations

from textual.containers import Container
from textual.content import Content
from textual.geometry import Size
from textual.suggester import SuggestFromList
from textual.widget import Widget
from textual.widgets import Input, Label, Static

from ..fields import FieldSpec
from .choice import Choice
from .steady import SteadyInput


class FieldGrid(Container):
    """The fields of one part of the sheet: a grid of label | control | hint (and error) lines."""


class FieldError(Static):
    """A row's error line: spans the grid's three columns and is as tall as its text needs there.

    A grid measures an auto-height row cell by cell, at the width of the column the cell starts
    in; this line spans all columns, so it measures itself at the whole grid's width instead.
    """

    def get_content_height(self, container: Size, viewport: Size, width: int) -> int:
        full_width = container.width - self.styles.gutter.width
        return super().get_content_height(container, viewport, max(width, full_width))


class FieldRow:
    """A labelled input or pick-list for one field; ``set_error`` marks it invalid in place."""

    def __init__(self, spec: FieldSpec) -> None:
        self.spec = spec
        key = spec.key
        self.label = Label(spec.label, classes="field-label", id=f"label-{key}")
        self.control: Input | Choice
        if spec.choices:
            self.control = Choice(spec.choices, id=key, classes="field-control")
        else:
            self.control = SteadyInput(
                placeholder=spec.placeholder,
                id=key,
                classes="field-control",
                compact=True,
                select_on_focus=False,
                validate_on=(),  # the job contract validates; Input's own pass would restyle
            )
        self.hint = Static(spec.hint, classes="field-hint", id=f"hint-{key}")
        self.hint_text = spec.hint  # also shown in the title line while the field has the cursor
        self.error: Static | None = None
        self._display = True

    def widgets(self) -> tuple[Widget, Widget, Widget]:
        """The row's widgets in grid order: label, control, hint."""
        return (self.label, self.control, self.hint)

    @property
    def invalid(self) -> bool:
        """True while the field is marked invalid."""
        return self.label.has_class("-invalid")

    @property
    def display(self) -> bool:
        """Whether the row takes its place on the sheet."""
        return self._display

    @display.setter
    def display(self, show: bool) -> None:
        if show == self._display:
            return
        self._display = show
        for widget in self.widgets():
            widget.display = show
        if self.error is not None:
            self.error.display = show and self.invalid

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
        self.label.update(label)

    def set_hint(self, hint: str) -> None:
        """Change the hint beside the field."""
        self.hint_text = hint
        self.hint.update(hint)

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
        invalid = bool(message)
        self.label.set_class(invalid, "-invalid")
        self.control.set_class(invalid, "-invalid")
        text = Content(f"✗ {message}" if message else "")  # the message quotes typed text
        if self.error is None:
            if not message:
                return
            self.error = FieldError(text, classes="field-error", id=f"error-{self.spec.key}")
            self.error.display = self._display
            grid = self.hint.parent
            if grid is not None:
                grid.mount(self.error, after=self.hint)
        else:
            self.error.update(text)
            self.error.display = invalid and self._display
