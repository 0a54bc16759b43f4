"""Keys that move the cursor, handled in the order they were typed (typing ahead is safe).

Textual hands a key to the focused widget's own queue and at once reads the next key. A move made
by the widget when it gets round to its key (an Input's Enter posts ``Submitted``; a binding on the
widget runs later still) comes after the keys typed behind it were already handed to the same
widget: ``7.5⏎1450⏎`` typed quickly put ``7.51450`` in Power.

Here Enter and Tab are *priority* bindings: they run in the app's own pass over the key, before
the next key is read. The move first waits until the focused field and the widgets above it have
handled every key and message already handed to them (a letter that picks ``square`` hides the
keyseat row, so the move must see it), then moves; every key after it goes to the field that has
focus by then. Screens whose fields are filled in a row list :data:`MOVE_BINDINGS`.
"""

from __future__ import annotations

import asyncio

from textual.actions import SkipAction
from textual.binding import Binding
from textual.widget import Widget
from textual.widgets import Input

MOVE_BINDINGS = [
    Binding("enter", "typeahead_enter", "Next field", show=False, priority=True, id="field.enter"),
    Binding("tab", "typeahead_move(1)", "Next field", show=False, priority=True, id="field.next"),
    Binding("shift+tab", "typeahead_move(-1)", "Prev field", show=False, priority=True,
            id="field.prev"),
]


def is_field(widget: Widget | None) -> bool:
    """True for a text field or a pick-list of a form (what Enter and Tab move between)."""
    from .widgets.choice import Choice

    return isinstance(widget, (Input, Choice))


DRAIN_TIMEOUT_S = 1.0


async def handled_so_far(widget: Widget) -> None:
    """Wait until ``widget`` and each widget above it up to its screen has handled what it was
    handed before now (a callback posted behind those messages runs; bounded by a timeout)."""
    node = widget
    while node is not None:
        done = asyncio.Event()
        if node.call_later(done.set):
            try:
                await asyncio.wait_for(done.wait(), DRAIN_TIMEOUT_S)
            except TimeoutError:
                return
        if node is widget.screen:
            return
        node = node.parent


class TypeAheadMixin:
    """For a Screen: Enter and Tab move between fields at once, in key order.

    ``enter_on(widget)`` may be overridden: return True when the Enter was used there (for
    instance to save from the last field) and the cursor must not move.
    """

    def enter_on(self, widget: Widget) -> bool:  # noqa: ARG002 - a hook for screens
        return False

    async def action_typeahead_enter(self) -> None:
        focused = self.focused  # type: ignore[attr-defined]
        if not is_field(focused):
            raise SkipAction()  # a button, a table: Enter does what it does there
        await handled_so_far(focused)
        if self.focused is focused and not self.enter_on(focused):  # type: ignore[attr-defined]
            self.focus_next()  # type: ignore[attr-defined]

    async def action_typeahead_move(self, step: int) -> None:
        focused = self.focused  # type: ignore[attr-defined]
        if focused is not None:
            await handled_so_far(focused)
        if step > 0:
            self.focus_next()  # type: ignore[attr-defined]
        else:
            self.focus_previous()  # type: ignore[attr-defined]
