"""Undo and redo of the sheet's changes: a bounded history of what every field held.

A step is one change of the sheet: the edits of one field in a row (typing ``1450`` is one step,
however slowly it is typed), a pick, a candidate taken from the stock finder, a new job.
``Ctrl+Z`` puts back the state before it, ``Ctrl+Y`` the state after it again.
"""

from __future__ import annotations

Snapshot = dict[str, str]

MAX_STEPS = 100


class History:
    """States of the sheet, oldest first, and the one now shown."""

    def __init__(self, first: Snapshot | None = None) -> None:
        self.states: list[Snapshot] = [dict(first)] if first is not None else []
        self.index = len(self.states) - 1
        self._last_keys: frozenset[str] = frozenset()

    def record(self, state: Snapshot) -> bool:
        """Add ``state`` after the present one (dropping any redo steps); False if unchanged."""
        if self.index >= 0 and self.states[self.index] == state:
            return False
        if self.index < 0:
            self.states, self.index = [dict(state)], 0
            return True
        changed = frozenset(k for k in set(state) | set(self.states[self.index])
                            if state.get(k) != self.states[self.index].get(k))
        at_newest = self.index == len(self.states) - 1
        if at_newest and self.index > 0 and changed <= self._last_keys:
            self.states[self.index] = dict(state)  # more typing in the same field: the same step
            return True
        self._last_keys = changed
        del self.states[self.index + 1 :]
        self.states.append(dict(state))
        if len(self.states) > MAX_STEPS:
            del self.states[0]
        self.index = len(self.states) - 1
        return True

    def undo(self) -> Snapshot | None:
        """The state before the present one (None at the oldest)."""
        if self.index <= 0:
            return None
        self.index -= 1
        self._last_keys = frozenset()
        return dict(self.states[self.index])

    def redo(self) -> Snapshot | None:
        """The state after the present one, after an undo (None at the newest)."""
        if self.index >= len(self.states) - 1:
            return None
        self.index += 1
        self._last_keys = frozenset()
        return dict(self.states[self.index])
