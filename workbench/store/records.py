"""The job log's record types: a stored job, a changed figure, a recomputed job, and the error a
person can act on. Engine-neutral: nothing here knows which database holds the jobs."""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

VERDICTS = ("pass", "marginal", "fail")
META_FIELDS = ("asset", "location", "by", "note", "fitted")
"""The notes around a job that can be changed after it was saved."""
OUTCOME_FIELDS = ("fitted_on", "outcome", "outcome_date")
"""When the fitted shaft went in and how it ended (schema v4)."""
OUTCOMES = ("still-running", "failed", "removed")
"""How a fitted shaft ended: still running, failed again (on a date), removed."""
EDITABLE_FIELDS = META_FIELDS + OUTCOME_FIELDS
"""Everything ``JobLog.update`` (``shaftbench log edit``) can change."""


class LogError(Exception):
    """A problem with the job log that a person can act on; ``str(err)`` is one line."""


class DamagedRow(Exception):
    """A stored job whose inputs or result cannot be read back; ``str(err)`` names the job."""


@dataclass(frozen=True)
class JobRecord:
    """One job as stored: inputs as typed, the result computed then, and the notes around it."""

    id: int
    created_at: str
    """UTC ISO 8601 time the job was saved."""
    updated_at: str
    """UTC ISO 8601 time of the last change (notes, delete, restore)."""
    program_version: str
    """Shaftbench version that computed ``result``."""
    asset: str
    location: str
    by: str
    note: str
    verdict: str
    """``pass``, ``marginal``, ``fail`` or empty when the result had none."""
    material: str
    """Materials named in the inputs and result, comma separated (what text search sees)."""
    fitted: str
    """Which candidate spec was actually fitted (free text, empty if not recorded)."""
    deleted_at: str | None
    """UTC ISO time the job was moved to the bin, or None."""
    inputs: dict[str, str] = field(repr=False)
    result: dict[str, Any] = field(repr=False)
    fitted_on: str = ""
    """ISO date (YYYY-MM-DD) the fitted shaft went in, or empty."""
    outcome: str = ""
    """How it ended: empty (not recorded), ``still-running``, ``failed`` or ``removed``."""
    outcome_date: str = ""
    """ISO date of the outcome (when it failed, was removed or was last seen running), or empty."""
    uid: str = ""
    """The job's unique id, made by the bench that saved it (a resend of the same save adds nothing)."""
    bench: str = ""
    """The bench that saved the job (``$SHAFTBENCH_BENCH``, else the machine's name)."""
    origin: str = ""
    """Where an imported job came from: ``<bench> #<id there>``; empty for a job saved here."""

    @property
    def deleted(self) -> bool:
        """True if the job is in the bin (soft deleted)."""
        return self.deleted_at is not None

    def as_dict(self) -> dict[str, Any]:
        """The record as a JSON-ready dict (the export and ``--json`` shape)."""
        return {
            "id": self.id,
            "created_at": self.created_at,
            "updated_at": self.updated_at,
            "program_version": self.program_version,
            "asset": self.asset,
            "location": self.location,
            "by": self.by,
            "note": self.note,
            "verdict": self.verdict,
            "material": self.material,
            "fitted": self.fitted,
            "deleted_at": self.deleted_at,
            "inputs": self.inputs,
            "result": self.result,
            "fitted_on": self.fitted_on,
            "outcome": self.outcome,
            "outcome_date": self.outcome_date,
            "uid": self.uid,
            "bench": self.bench,
            "origin": self.origin,
        }


def show_value(value: Any) -> str:
    """A stored or recomputed figure as a short string (6 significant digits, ``-`` for none)."""
    if value is None:
        return "-"
    if isinstance(value, float):
        return f"{value:.6g}"
    return str(value)


@dataclass(frozen=True)
class Difference:
    """One figure that differs between the stored result and today's."""

    key: str
    """Where the figure sits, e.g. ``candidate.fatigue_safety_factor`` or ``verdict``."""
    stored: Any
    now: Any

    def __str__(self) -> str:
        return f"{self.key}: stored {show_value(self.stored)}, now {show_value(self.now)}"


@dataclass(frozen=True)
class Reopened:
    """A stored job recomputed with today's program."""

    record: JobRecord
    new_result: dict[str, Any] | None
    """Today's result, or None if today's program rejects the stored inputs (see ``error``)."""
    differences: tuple[Difference, ...]
    error: str = ""
    """Today's input error message when ``new_result`` is None."""

    @property
    def changed(self) -> bool:
        """True if today's result differs from the stored one (or cannot be computed)."""
        return bool(self.differences) or self.new_result is None
