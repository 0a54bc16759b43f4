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
NEW_SCREEN_TIMEOUT_S = 0.5


async def key_in_order(app, event) -> bool:
    """Handle a key typed while a field has focus in the app's own pass; True when it was used.

    A field's editing keys (Backspace, Delete, arrows, Ctrl+W…) and the screen's keys (F6 save,
    ↓ to the list) are bindings, and Textual runs a focused widget's binding only after the key
    has gone through the widget and come back to the app: behind keys typed after it (``conv``,
    two fast Backspaces and ``ab`` gave ``conv``, not ``coab``). Here such a key first waits for
    the field to handle what it already has, then runs its binding at once; a key that opens a
    screen waits (bounded) until that screen has put its cursor somewhere, so the keys after it
    land there. Printable keys typed in a text field go the usual way (in order already).
    """
    from .widgets.choice import Choice

    try:
        focused = app.focused
    except Exception:  # noqa: BLE001 - no screen yet (start-up, shut-down): the usual way
        return False
    if focused is None or not is_field(focused):
        return False
    if event.is_printable and not isinstance(focused, Choice):
        return False
    await handled_so_far(focused)
    screen = app.screen
    # priority bindings first (Enter, Tab, Ctrl+Q), then the field's and the screen's own
    if not (await app._check_bindings(event.key, priority=True) or await app._check_bindings(event.key)):
        return False
    if app.screen is not screen:  # a view or a dialog opened: wait for its cursor
        waited = 0.0
        while app.screen.focused is None and waited < NEW_SCREEN_TIMEOUT_S:
            await asyncio.sleep(0.01)
            waited += 0.01
    return True


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
