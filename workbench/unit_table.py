"""Common unit spellings answered without pint: a table made FROM pint, read at the boundary.

pint stays the one authority on units. ``tools/make_unit_table.py`` asks the full parse path of
:mod:`workbench.units` (pint, and every per-field refusal it makes) how it reads ``1 <spelling>``
for each kind of field and writes what it accepted to ``data/unit_spellings.json``: per kind, each
spelling with its factor to the kind's SI unit and pint's dimension of it. Only spellings that the
full path accepts for EVERY field of that kind are written, so a spelling a field refuses (Hz for a
shaft speed, an energy for a torque, a logarithmic unit, an odd rate, ...) is never in the table and
always goes to pint, which refuses it.

:func:`si_factor` answers a spelling found in the table; for anything else it returns None and
the caller uses pint. ``tests/test_unit_table.py`` proves every entry gives pint's answer and the
full path's answer, field by field. A kind is found by its whole definition (name, SI unit,
dimensionality, examples): a kind whose definition changed since the table was made finds no
section and goes to pint until the table is made again.

Regenerate after changing a kind, the spelling rewrites or a refusal::

    python tools/make_unit_table.py
"""

from __future__ import annotations

import json
from contextlib import contextmanager
from functools import cache
from typing import Iterator

TABLE_FILE = "unit_spellings.json"

_enabled = True


def kind_key(kind) -> str:
    """The table's key for a kind: its whole definition, so that a changed kind finds no section."""
    return repr(kind)


@cache
def _table() -> dict[str, dict[str, float]]:
    """kind key -> {spelling: factor to the kind's SI unit}, read once from the data file."""
    from workbench.core.tables import data_dir

    with open(data_dir() / TABLE_FILE, encoding="utf-8") as fh:
        raw = json.load(fh)
    return {
        section["kind"]: {spelling: float(entry["factor"]) for spelling, entry in section["spellings"].items()}
        for section in raw["kinds"]
    }


@cache
def _section(kind) -> dict[str, float]:
    return _table().get(kind_key(kind), {})


def si_factor(kind, unit_text: str) -> float | None:
    """The factor from ``unit_text`` to ``kind``'s SI unit when the table holds that exact spelling
    for that kind, else None (the caller asks pint, which also makes every refusal)."""
    if not _enabled:
        return None
    return _section(kind).get(unit_text)


@contextmanager
def pint_only() -> Iterator[None]:
    """Within the block every spelling goes to pint (used to make the table and to test it)."""
    global _enabled
    before, _enabled = _enabled, False
    try:
        yield
    finally:
        _enabled = before
