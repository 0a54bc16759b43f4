"""Checking and shaping what goes into the job log and comes out of it (engine-neutral): times in
the stored form, filter bounds, the JSON of inputs and results, and one job as a table row."""

from __future__ import annotations

import json
import os
from collections.abc import Mapping
from datetime import date, datetime, timedelta, timezone
from typing import Any

from workbench.core.asset_history import tag_key
from workbench.store import payload
from workbench.store.payload import payload_json
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
    "uid", "created_at", "updated_at", "program_version", "bench", "origin", "asset", "location",
    "by", "note", "verdict", "material", "fitted", "deleted_at", "payload", "search_text",
    "fitted_on", "outcome", "outcome_date", "asset_key",
)
"""The columns of ``job_row``'s tuple, in order (``uid`` is a ``uuid.UUID``; engines adapt it)."""
KEPT_ON_REPLACE = ("uid", "created_at", "deleted_at", "bench", "origin")
"""Columns a job keeps when its result is replaced (``JobLog.replace_result``)."""

UID_NAMESPACE = "6f1d3c2e-8a4b-5c7d-9e0f-53424a4c0005"
"""Namespace (a UUID) of the content ids given to jobs that came without a uid (older logs and
exports). ``uuid`` is imported only when a uid is made or read: it is slow to import."""
BENCH_ENV_VAR = "SHAFTBENCH_BENCH"


def bench_name() -> str:
    """The name this bench saves its jobs under: ``$SHAFTBENCH_BENCH``, else the machine's name."""
    name = os.environ.get(BENCH_ENV_VAR, "").strip()
    if name:
        return name
    import socket

    return socket.gethostname() or "bench"


def content_uid(created_at: str, inputs: Any, result: Any) -> Any:
    """The uid of a job that has none: a name-based UUID (RFC 4122 version 5) of its creation time,
    inputs and result, so that the same job imported or migrated twice gets the same uid."""
    import uuid

    return uuid.uuid5(uuid.UUID(UID_NAMESPACE), created_at + "\n" + payload_json(inputs, result).decode())


def parse_uid(value: Any) -> Any:
    """A uid given as text or a UUID (LogError naming the field otherwise)."""
    import uuid

    if isinstance(value, uuid.UUID):
        return value
    try:
        return uuid.UUID(str(value))
    except ValueError:
        raise LogError(f"uid: expected a UUID like 1b4e28ba-2fa1-11d2-883f-0016d3cca427, got {cut(repr(value))}") from None


def job_row(
    inputs: Any,
    result: Any,
    meta: Mapping[str, Any],
    *,
    uid: Any = None,
    bench: str | None = None,
    origin: str = "",
    created_at: str | None = None,
    updated_at: str | None = None,
    program_version: str | None = None,
    deleted_at: str | None = None,
    stored_payload: bytes | None = None,
) -> tuple[Any, ...]:
    """One job as the values of INSERT_COLUMNS, every field checked (LogError names a bad one).

    Without ``uid`` a new random one is made (a fresh save); the caller passes ``content_uid`` for
    jobs that come without one. ``bench`` defaults to ``bench_name()``. ``stored_payload``: the
    payload already encoded for these inputs and result (bulk paths that store one result many
    times; encoding it checked that they are JSON-ready); otherwise it is encoded here."""
    if uid is None:
        import uuid

        uid = uuid.uuid4()
    if stored_payload is None:
        inputs_json(inputs)  # checks the inputs' shape
        result_json(result)  # checks the result is a JSON-ready mapping
    elif not (
        isinstance(inputs, Mapping) and isinstance(result, Mapping)
        and all(isinstance(k, str) and isinstance(v, str) for k, v in inputs.items())
    ):  # encoding the payload checked that they are JSON-ready
        raise LogError("inputs and result: expected the mappings the stored payload was made from")
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
        uid,
        created,
        None if updated_at in (None, created) else updated_at,
        program_version,
        text_value(bench, "bench") if bench is not None else bench_name(),
        text_value(origin, "origin"),
        text["asset"],
        text["location"],
        text["by"],
        text["note"],
        verdict_of(result),
        material,
        text["fitted"],
        deleted_at,
        stored_payload if stored_payload is not None else payload.encode(inputs, result),
        job_search_text({**text, **ending, "material": material}, inputs, result),
        ending["fitted_on"],
        ending["outcome"],
        ending["outcome_date"],
        tag_key(text["asset"]),
    )


def uid_text(value: Any) -> str:
    """A stored uid (16 bytes in SQLite, a UUID in PostgreSQL) as its usual text form."""
    if value is None or value == "":
        return ""
    if isinstance(value, (bytes, bytearray, memoryview)) and len(value) == 16:
        h = bytes(value).hex()  # the RFC 4122 text form, 8-4-4-4-12 hex digits
        return f"{h[:8]}-{h[8:12]}-{h[12:16]}-{h[16:20]}-{h[20:]}"
    return str(value)


def _decoded(stored: Any, job_id: Any) -> tuple[dict[str, str], dict[str, Any]]:
    try:
        inputs, result = payload.decode(stored)
    except LogError as err:
        raise DamagedRow(f"job {job_id} cannot be read: {str(err).replace('stored job: ', 'its ')}") from None
    for what, value in (("inputs", inputs), ("result", result)):
        if not isinstance(value, dict):
            raise DamagedRow(f"job {job_id} cannot be read: its stored {what} is damaged "
                             f"({'null' if value is None else type(value).__name__}, not an object)")
    return inputs, result


def record_from_row(row: tuple[Any, ...]) -> JobRecord:
    """A JobRecord from a row of ``schema.JOB_COLUMNS``; DamagedRow if its payload cannot be read."""
    (job_id, created, updated, version, asset, location, by, note, verdict, material, fitted,
     deleted_at, stored, fitted_on, outcome, outcome_date, uid, bench, origin) = row
    inputs, result = _decoded(stored, job_id)
    return JobRecord(
        id=job_id, created_at=created, updated_at=updated or created, program_version=version or "",
        asset=asset or "", location=location or "", by=by or "", note=note or "", verdict=verdict or "",
        material=material or "", fitted=fitted or "", deleted_at=deleted_at,
        inputs=inputs, result=result,
        fitted_on=fitted_on or "", outcome=outcome or "", outcome_date=outcome_date or "",
        uid=uid_text(uid), bench=bench or "", origin=origin or "",
    )
