"""Checking and shaping what goes into the job log and comes out of it (engine-neutral): times in
the stored form, filter bounds, the JSON of inputs and results, and one job as a table row."""

from __future__ import annotations

import json
from collections.abc import Mapping
from datetime import date, datetime, timedelta, timezone
from typing import Any

from workbench.store.records import META_FIELDS, OUTCOMES, DamagedRow, JobRecord, LogError
from workbench.store.search_words import job_search_text


def now_utc() -> str:
    """The current time in the stored form (UTC ISO 8601, microseconds)."""
    return datetime.now(timezone.utc).isoformat(timespec="microseconds")


def cut(text: str, limit: int = 60) -> str:
    """A value for a one-line message: at most ``limit`` characters."""
    return text if len(text) <= limit else text[: limit - 1] + "…"


def iso_utc(value: str, what: str) -> str:
    """Normalise an ISO time string to the stored form (UTC, microseconds)."""
    shown = cut(repr(value))
    try:
        moment = datetime.fromisoformat(str(value).replace("Z", "+00:00"))
    except ValueError:
        raise LogError(f"{what}: expected an ISO date-time like 2025-03-01T08:30:00Z, got {shown}") from None
    if moment.tzinfo is None:
        moment = moment.replace(tzinfo=timezone.utc)
    try:
        return moment.astimezone(timezone.utc).isoformat(timespec="microseconds")
    except OverflowError:  # e.g. 9999-12-31T23:00-05:00 is in the year 10000 in UTC
        raise LogError(f"{what}: {shown} is outside the years 1 to 9999 in UTC") from None


def iso_date(value: Any, what: str) -> str:
    """An ISO calendar date (YYYY-MM-DD) or empty; a LogError naming ``what`` otherwise."""
    text = text_value(value, what).strip()
    if not text:
        return ""
    try:
        return date.fromisoformat(text).isoformat()
    except ValueError:
        raise LogError(f"{what}: expected a date like 2025-03-01, got {cut(repr(text))}") from None


MATCH_NONE_SINCE = "A"
"""A lower bound above every stored time (they start with digits): ``created_at >= 'A'`` is never true."""
MATCH_NONE_UNTIL = "0"
"""An upper bound below every stored time: ``created_at < '0'`` is never true."""


def _beyond(*, past_the_end: bool, end: bool) -> str | None:
    """The stored-form bound for a time outside the years 1 to 9999 in UTC (None: no bound)."""
    if end:
        return None if past_the_end else MATCH_NONE_UNTIL
    return MATCH_NONE_SINCE if past_the_end else None


def bound(value: date | datetime | str | None, what: str, *, end: bool) -> str | None:
    """A ``since``/``until`` filter as a stored-form time; dates are whole UTC days (until inclusive).

    At the calendar's edges a bound can fall past year 9999 or before year 1 in UTC, where no stored
    time can be: such a bound lets every job through on its side, or none.
    """
    if value is None or value == "":
        return None
    if isinstance(value, str):
        text = value.strip()
        try:
            value = date.fromisoformat(text) if len(text) == 10 else datetime.fromisoformat(text.replace("Z", "+00:00"))
        except ValueError:
            raise LogError(f"{what}: expected a date like 2025-03-01 (UTC), got {cut(repr(text))}") from None
    if isinstance(value, datetime):
        moment = value if value.tzinfo else value.replace(tzinfo=timezone.utc)
        try:
            return moment.astimezone(timezone.utc).isoformat(timespec="microseconds")
        except OverflowError:
            offset = moment.utcoffset() or timedelta(0)
            return _beyond(past_the_end=offset < timedelta(0), end=end)
    if isinstance(value, date):
        try:
            day = value + timedelta(days=1) if end else value
        except OverflowError:
            return _beyond(past_the_end=True, end=end)
        return datetime(day.year, day.month, day.day, tzinfo=timezone.utc).isoformat(timespec="microseconds")
    raise LogError(f"{what}: expected a date, got {cut(repr(value))}")


def text_value(value: Any, what: str) -> str:
    """A note field as text (None is empty); anything else is refused naming the field."""
    if value is None:
        return ""
    if not isinstance(value, str):
        raise LogError(f"{what}: expected text, got {type(value).__name__}")
    return value


def outcome_fields(meta: Mapping[str, Any]) -> dict[str, str]:
    """``fitted_on``, ``outcome`` and ``outcome_date`` checked: dates as YYYY-MM-DD, the outcome one
    of OUTCOMES (``failed`` needs its date), the outcome not before the fitting."""
    fitted_on = iso_date(meta.get("fitted_on"), "fitted_on")
    outcome = text_value(meta.get("outcome"), "outcome").strip().casefold()
    outcome_date = iso_date(meta.get("outcome_date"), "outcome_date")
    if outcome and outcome not in OUTCOMES:
        raise LogError(f"outcome: expected one of {', '.join(OUTCOMES)}, got {cut(repr(outcome))}")
    if outcome == "failed" and not outcome_date:
        raise LogError("outcome: failed needs the date it failed (e.g. failed 2025-03-01)")
    if outcome_date and not outcome:
        raise LogError("outcome_date: give the outcome too (still-running, failed or removed)")
    if fitted_on and outcome_date and outcome_date < fitted_on:
        raise LogError(f"outcome_date: {outcome_date} is before the shaft was fitted ({fitted_on})")
    return {"fitted_on": fitted_on, "outcome": outcome, "outcome_date": outcome_date}


def inputs_json(inputs: Any) -> str:
    """The inputs as stored: a JSON object of field name -> text as typed."""
    if not isinstance(inputs, Mapping) or not all(
        isinstance(k, str) and isinstance(v, str) for k, v in inputs.items()
    ):
        raise LogError("inputs: expected a mapping of field name to the text as typed")
    return json.dumps(dict(inputs), ensure_ascii=False, sort_keys=True)


def result_json(result: Any) -> str:
    """The result as stored: JSON text of the whole result mapping."""
    if not isinstance(result, Mapping):
        raise LogError("result: expected the result mapping from evaluate_inputs")
    try:
        return json.dumps(result, ensure_ascii=False, sort_keys=True)
    except (TypeError, ValueError) as err:
        raise LogError(f"result: not JSON-ready ({err})") from None


def verdict_of(result: Mapping[str, Any]) -> str:
    verdict = result.get("verdict")
    return verdict if isinstance(verdict, str) else ""


def material_of(inputs: Mapping[str, str], result: Mapping[str, Any]) -> str:
    """The materials a job names (input keys and the result's material names), comma separated."""
    names: list[str] = []
    for value in (inputs.get("material"), inputs.get("candidate_material")):
        if value:
            names.append(value.strip())
    for shaft in result.get("shafts") or []:
        if isinstance(shaft, Mapping):
            for key in ("material", "material_name"):
                value = shaft.get(key)
                if isinstance(value, str) and value.strip():
                    names.append(value.strip())
    unique = dict.fromkeys(n for n in names if n)
    return ", ".join(unique)


INSERT_COLUMNS = (
    "created_at", "updated_at", "program_version", "asset", "location", "by", "note", "verdict",
    "material", "fitted", "deleted_at", "inputs_json", "result_json", "search_text",
    "fitted_on", "outcome", "outcome_date",
)
"""The columns of ``job_row``'s tuple, in order."""


def job_row(
    inputs: Any,
    result: Any,
    meta: Mapping[str, Any],
    *,
    created_at: str | None = None,
    updated_at: str | None = None,
    program_version: str | None = None,
    deleted_at: str | None = None,
) -> tuple[Any, ...]:
    """One job as the values of INSERT_COLUMNS, every field checked (LogError names a bad one)."""
    stored_inputs, stored_result = inputs_json(inputs), result_json(result)
    text = {name: text_value(meta.get(name), name) for name in META_FIELDS}
    ending = outcome_fields(meta)
    if program_version is None:
        program = result.get("program")
        program_version = program.get("version") if isinstance(program, Mapping) else None
        if not isinstance(program_version, str):
            from workbench import __version__

            program_version = __version__
    created = created_at or now_utc()
    material = material_of(inputs, result)
    return (
        created,
        updated_at or created,
        program_version,
        text["asset"],
        text["location"],
        text["by"],
        text["note"],
        verdict_of(result),
        material,
        text["fitted"],
        deleted_at,
        stored_inputs,
        stored_result,
        job_search_text({**text, **ending, "material": material}, inputs, result),
        ending["fitted_on"],
        ending["outcome"],
        ending["outcome_date"],
    )


def _loaded(text: Any, job_id: Any, what: str, kind: type) -> Any:
    try:
        value = json.loads(text)
    except (TypeError, ValueError, RecursionError):
        raise DamagedRow(f"job {job_id} cannot be read: its stored {what} is damaged (not valid JSON)") from None
    if not isinstance(value, kind):
        raise DamagedRow(f"job {job_id} cannot be read: its stored {what} is damaged "
                         f"({'null' if value is None else type(value).__name__}, not an object)")
    return value


def record_from_row(row: tuple[Any, ...]) -> JobRecord:
    """A JobRecord from a row of ``schema.JOB_COLUMNS``; DamagedRow if its JSON cannot be read."""
    (job_id, created, updated, version, asset, location, by, note, verdict, material, fitted,
     deleted_at, stored_inputs, stored_result, fitted_on, outcome, outcome_date) = row
    return JobRecord(
        id=job_id, created_at=created, updated_at=updated, program_version=version or "",
        asset=asset or "", location=location or "", by=by or "", note=note or "", verdict=verdict or "",
        material=material or "", fitted=fitted or "", deleted_at=deleted_at,
        inputs=_loaded(stored_inputs, job_id, "inputs", dict), result=_loaded(stored_result, job_id, "result", dict),
        fitted_on=fitted_on or "", outcome=outcome or "", outcome_date=outcome_date or "",
    )
