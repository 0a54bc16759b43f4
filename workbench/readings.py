"""How doubtful entries were read: the job's ``warnings``, collected while its inputs are parsed.

A parse helper that reads an entry in a way the person may not have meant (a decimal comma, a
per-minute speed, a bare number in an inch job, an assumed service factor, ...) calls :func:`note`;
:func:`collecting` gathers the notes of one job evaluation in order, without repeats. Outside a
``collecting`` block a note is dropped (a single field parsed on its own has no job to warn).
"""

from __future__ import annotations

from contextlib import contextmanager
from contextvars import ContextVar
from typing import Iterator

from workbench.field_names import option_for

_current: ContextVar[list[str] | None] = ContextVar("shaftbench_readings", default=None)


def note(field: str, text: str) -> None:
    """Record one warning about ``field`` (an input key): a one-line sentence naming the option."""
    notes = _current.get()
    if notes is None:
        return
    line = f"{option_for(field)}: {text}"
    if line not in notes:
        notes.append(line)


@contextmanager
def collecting() -> Iterator[list[str]]:
    """Collect the notes made inside the block into the yielded list."""
    notes: list[str] = []
    token = _current.set(notes)
    try:
        yield notes
    finally:
        _current.reset(token)
