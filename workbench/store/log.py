"""The job log's engine-neutral API: every checked job, its inputs as typed and its result.

A job is the inputs exactly as typed plus the result of ``workbench.job.evaluate_inputs`` on them,
with who/where/what notes. ``JobLog.open`` picks the engine; the operations below are the same for
every engine and are written once here, in SQL that every engine runs (``?`` parameters). Each
engine (``sqlite_log.py``) supplies the connection, its transactions and error messages, and how it
answers text filters and counts. Every save is one durable transaction; a store that is not ours,
is damaged, or comes from a newer Shaftbench is refused with a one-line message and left exactly as
it was.
"""

from __future__ import annotations

import os
from collections.abc import Iterable, Iterator, Mapping
from contextlib import AbstractContextManager
from datetime import date, datetime
from pathlib import Path
from typing import Any

from workbench.core.asset_history import tag_key
from workbench.store import schema
from workbench.store.compare import compare_results
from workbench.store.paths import default_log_path, log_target
from workbench.store.records import (
    EDITABLE_FIELDS,
    VERDICTS,
    DamagedRow,
    Difference,
    JobRecord,
    LogError,
    Reopened,
)
from workbench.store.search_words import job_search_text
from workbench.store.values import (
    INSERT_COLUMNS,
    KEPT_ON_REPLACE,
    bound,
    content_uid,
    iso_utc,
    job_row,
    now_utc,
    outcome_fields,
    parse_uid,
    record_from_row,
    text_value,
)

__all__ = [
    "Difference",
    "JobLog",
    "JobRecord",
    "LogError",
    "Reopened",
    "compare_results",
    "default_log_path",
]

COLUMNS = ", ".join(schema.JOB_COLUMNS)
INSERT = (
    f"INSERT INTO jobs ({', '.join(INSERT_COLUMNS)}) "
    f"VALUES ({', '.join('?' * len(INSERT_COLUMNS))})"
)


def _verdicts(verdict: str | Iterable[str] | None) -> str | tuple[str, ...] | None:
    """A verdict filter in a hashable form (an iterable is read once, into a tuple)."""
    return verdict if verdict is None or isinstance(verdict, str) else tuple(verdict)


class JobLog:
    """An open job log. Not shared between threads: open one per thread.

    >>> with JobLog.open(path) as log:        # doctest: +SKIP
    ...     job_id = log.save(inputs, result, asset="CV-07")
    """

    path: Path
    read_only: bool = False
    """True if the log was opened read-only (this process may not write it)."""
    _columns: tuple[str, ...] = schema.JOB_COLUMNS
    """What each read selects, in JOB_COLUMNS order (an engine may read an older log's rows with
    defaults for the columns it lacks)."""
    _has_history: bool = True
    """False for an older log opened read-only (no job_changes table yet)."""
    skipped: list[str]
    """One line for each stored job that could not be read and was left out of a listing or export
    (engines set it to an empty list when they open)."""

    # -- opening and closing (the engine's) -----------------------------------------------------

    @classmethod
    def open(cls, path: str | os.PathLike[str] | None = None, *, create: bool = True) -> JobLog:
        """Open (and create or migrate, if needed) the job log at ``path`` or the default log.

        ``path`` (or ``$SHAFTBENCH_LOG``) is a file, or a ``postgresql://`` URL of a shared log."""
        target = log_target(path) if path is None or isinstance(path, str) else Path(path)
        if isinstance(target, str):
            from workbench.store.pg_log import PgJobLog

            return PgJobLog.open_url(target, create=create)
        from workbench.store.sqlite_log import SqliteJobLog

        return SqliteJobLog.open_file(target, create=create)

    def close(self) -> None:
        """Close the log (safe to call twice)."""
        raise NotImplementedError

    def __enter__(self) -> JobLog:
        return self

    def __exit__(self, *exc: object) -> None:
        self.close()

    # -- what each engine provides -------------------------------------------------------------

    def _write(self) -> AbstractContextManager[Any]:
        """One write transaction: all of it is saved (durably) or none of it; yields an object
        whose ``execute(sql, params)`` runs SQL with ``?`` parameters."""
        raise NotImplementedError

    def _read(self, sql: str, params: Iterable[Any] = ()) -> list[tuple[Any, ...]]:
        raise NotImplementedError

    def _insert(self, conn: Any, row: tuple[Any, ...]) -> int:
        """Insert one job row (INSERT_COLUMNS) inside ``_write``; returns its id."""
        raise NotImplementedError

    def _uid_param(self, uid: Any) -> Any:
        """A uid as this engine stores it."""
        raise NotImplementedError

    def _stream(self, sql: str) -> Iterator[tuple[Any, ...]]:
        """The rows of a query, fetched a batch at a time."""
        raise NotImplementedError

    def _page_ids(
        self, text: str, filters: tuple[Any, ...], clauses: list[str], params: list[Any],
        limit: int, offset: int,
    ) -> list[int]:
        """Ids of one page of jobs, newest first, that pass the clauses and hold every word."""
        raise NotImplementedError

    def _count_jobs(self, text: str, filters: tuple[Any, ...]) -> int:
        raise NotImplementedError

    def forget_counts(self) -> None:
        """Drop any remembered counts (for timing; any change to the log makes them stale anyway)."""

    def integrity_ok(self) -> bool:
        """True if the engine's own consistency check finds nothing wrong."""
        raise NotImplementedError

    # -- writing -----------------------------------------------------------------------------

    def save(
        self,
        inputs: Mapping[str, str],
        result: Mapping[str, Any],
        *,
        asset: str = "",
        location: str = "",
        by: str = "",
        note: str = "",
        fitted: str = "",
        fitted_on: str = "",
        outcome: str = "",
        outcome_date: str = "",
        uid: str | Any | None = None,
        bench: str | None = None,
    ) -> int:
        """Store one job durably; returns its id. ``inputs`` are kept exactly as typed.

        ``uid`` (made by the caller, e.g. ``uuid.uuid4()``) makes a resend safe: a job with this uid
        already in the log is not stored again, and its id is returned. ``bench`` defaults to
        ``values.bench_name()``."""
        row = job_row(inputs, result, dict(asset=asset, location=location, by=by, note=note, fitted=fitted,
                                           fitted_on=fitted_on, outcome=outcome, outcome_date=outcome_date),
                      uid=parse_uid(uid) if uid is not None else None, bench=bench)
        with self._write() as conn:
            found = conn.execute("SELECT id FROM jobs WHERE uid = ?", (self._uid_param(row[0]),)).fetchone()
            if found is not None:
                return int(found[0])
            return self._insert(conn, row)

    def update(self, job_id: int, **changes: str) -> JobRecord:
        """Change what is recorded around a job - asset, location, by, note, fitted, fitted_on,
        outcome, outcome_date - and return it. Each field that changes is kept in the job's history
        (``changes``) with the time of the change; the job's ``updated_at`` is that time."""
        unknown = set(changes) - set(EDITABLE_FIELDS)
        if unknown:
            raise LogError(f"cannot change {', '.join(sorted(unknown))}: only {', '.join(EDITABLE_FIELDS)}")
        current = self.get(job_id)
        values = {name: getattr(current, name) for name in EDITABLE_FIELDS}
        values.update({name: text_value(value, name) for name, value in changes.items()})
        values.update(outcome_fields(values))
        changed = [name for name in EDITABLE_FIELDS if values[name] != getattr(current, name)]
        if not changed:
            return current
        now = now_utc()
        search = job_search_text({**values, "material": current.material}, current.inputs, current.result)
        with self._write() as conn:
            conn.execute(
                "UPDATE jobs SET asset = ?, location = ?, by = ?, note = ?, fitted = ?, fitted_on = ?, "
                "outcome = ?, outcome_date = ?, search_text = ?, updated_at = ?, asset_key = ? WHERE id = ?",
                (*(values[name] for name in EDITABLE_FIELDS), search, now, tag_key(values["asset"]), job_id),
            )
            for name in changed:
                conn.execute(
                    "INSERT INTO job_changes (job_id, changed_at, field, old_value, new_value) VALUES (?, ?, ?, ?, ?)",
                    (job_id, now, name, getattr(current, name), values[name]),
                )
        return self.get(job_id)

    def replace_result(self, job_id: int, inputs: Mapping[str, str], result: Mapping[str, Any],
                       **changes: str) -> JobRecord:
        """Store new inputs and result for an existing job (a job reopened, corrected and saved
        again as the same job), with any of the ``update`` fields; the change is kept in the job's
        history (field ``result``: the verdict and program version before and after)."""
        unknown = set(changes) - set(EDITABLE_FIELDS)
        if unknown:
            raise LogError(f"cannot change {', '.join(sorted(unknown))}: only {', '.join(EDITABLE_FIELDS)}")
        current = self.get(job_id)
        values = {name: getattr(current, name) for name in EDITABLE_FIELDS}
        values.update({name: text_value(value, name) for name, value in changes.items()})
        row = dict(zip(INSERT_COLUMNS, job_row(inputs, result, values, created_at=current.created_at,
                                               updated_at=now_utc(), deleted_at=current.deleted_at)))
        kept = [name for name in INSERT_COLUMNS if name not in KEPT_ON_REPLACE]
        with self._write() as conn:
            conn.execute(
                f"UPDATE jobs SET {', '.join(f'{name} = ?' for name in kept)} WHERE id = ?",
                (*(row[name] for name in kept), job_id),
            )
            history = [("result", f"{current.verdict or '-'} ({current.program_version})",
                        f"{row['verdict'] or '-'} ({row['program_version']})")]
            history += [(name, getattr(current, name), values[name]) for name in EDITABLE_FIELDS
                        if values[name] != getattr(current, name)]
            for name, old, new in history:
                conn.execute(
                    "INSERT INTO job_changes (job_id, changed_at, field, old_value, new_value) VALUES (?, ?, ?, ?, ?)",
                    (job_id, row["updated_at"], name, old, new),
                )
        return self.get(job_id)

    def changes(self, job_id: int) -> list[dict[str, str]]:
        """The job's history after its save, oldest first: ``changed_at``, ``field``, ``old``, ``new``."""
        if not self._has_history:
            return []  # an older log opened read-only has no history table
        rows = self._read(
            "SELECT changed_at, field, old_value, new_value FROM job_changes WHERE job_id = ? ORDER BY id",
            (int(job_id),),
        )
        return [dict(changed_at=c, field=f, old=o, new=n) for c, f, o, n in rows]

    def delete(self, job_id: int) -> None:
        """Move a job to the bin (soft delete; ``restore`` brings it back, ``purge`` removes it)."""
        with self._write() as conn:
            found = conn.execute("SELECT deleted_at FROM jobs WHERE id = ?", (job_id,)).fetchone()
            if found is None:
                raise LogError(f"there is no job {job_id} in the log")
            if found[0] is not None:
                raise LogError(f"job {job_id} is already in the bin")
            now = now_utc()
            conn.execute("UPDATE jobs SET deleted_at = ?, updated_at = ? WHERE id = ?", (now, now, job_id))

    def restore(self, job_id: int) -> None:
        """Bring a job back from the bin."""
        with self._write() as conn:
            found = conn.execute("SELECT deleted_at FROM jobs WHERE id = ?", (job_id,)).fetchone()
            if found is None:
                raise LogError(f"there is no job {job_id} in the log")
            if found[0] is None:
                raise LogError(f"job {job_id} is not in the bin")
            conn.execute("UPDATE jobs SET deleted_at = NULL, updated_at = ? WHERE id = ?", (now_utc(), job_id))

    def purge(self) -> int:
        """Remove every job in the bin for good; returns how many."""
        with self._write() as conn:
            cursor = conn.execute("DELETE FROM jobs WHERE deleted_at IS NOT NULL", ())
        return int(cursor.rowcount)

    def import_jobs(self, rows: Iterable[Mapping[str, Any]], *, bench: str | None = None) -> int:
        """Add exported jobs (dicts as from ``export_rows``) in one transaction; returns how many.

        Each job gets a new id here; its uid, times, bench, notes, outcome and bin state are kept, and
        ``origin`` records where it came from (``<bench> #<its id there>``, kept if it had one).
        ``bench`` names the bench the jobs came from when a row does not say. A job whose uid is
        already in the log is skipped, so importing a file twice adds nothing; a job without a uid
        (older exports) gets its content id (``values.content_uid``: creation time, inputs, result).
        A bad row stops the import with a message naming the row, and nothing is added.
        """
        from workbench.store.exchange import loads_guarded, strict_json

        prepared: list[tuple[Any, ...]] = []
        for number, item in enumerate(rows, start=1):
            try:
                if not isinstance(item, Mapping):
                    raise LogError("expected an object")
                inputs, result = item.get("inputs"), item.get("result")
                if isinstance(inputs, str):
                    inputs = loads_guarded(inputs, "inputs")
                if isinstance(result, str):
                    result = loads_guarded(result, "result")
                if not isinstance(result, Mapping):
                    raise LogError("result: expected an object")
                result = strict_json(result)  # NaN and infinities are stored as null: strict JSON out
                created = iso_utc(item["created_at"], "created_at") if item.get("created_at") else now_utc()
                updated = iso_utc(item["updated_at"], "updated_at") if item.get("updated_at") else None
                deleted = iso_utc(item["deleted_at"], "deleted_at") if item.get("deleted_at") else None
                version = item.get("program_version")
                came_from = text_value(item.get("bench"), "bench") or (bench or "")
                origin = text_value(item.get("origin"), "origin")
                if not origin and item.get("id") not in (None, ""):
                    origin = f"{came_from or 'unnamed bench'} #{item['id']}"
                uid = parse_uid(item["uid"]) if item.get("uid") else None
                prepared.append(
                    job_row(
                        inputs, result, item,
                        uid=uid or content_uid(created, inputs, result), bench=came_from, origin=origin,
                        created_at=created, updated_at=updated, deleted_at=deleted,
                        program_version=version if isinstance(version, str) and version else None,
                    )
                )
            except (LogError, ValueError, TypeError, RecursionError) as err:
                message = "nested too deeply to read" if isinstance(err, RecursionError) else str(err)
                raise LogError(f"job {number} of the import: {message}") from None
        added = 0
        with self._write() as conn:
            for row in prepared:
                seen = conn.execute("SELECT 1 FROM jobs WHERE uid = ?", (self._uid_param(row[0]),)).fetchone()
                if seen is None:
                    self._insert(conn, row)
                    added += 1
        return added

    # -- reading -----------------------------------------------------------------------------

    def get(self, job_id: int) -> JobRecord:
        """The job with this id (also when it is in the bin)."""
        rows = self._read(f"SELECT {self._select} FROM jobs WHERE id = ?", (int(job_id),))
        if not rows:
            raise LogError(f"there is no job {job_id} in the log")
        try:
            return record_from_row(rows[0])
        except DamagedRow as damage:
            raise LogError(f"{damage}; the other jobs are not affected") from None

    @property
    def _select(self) -> str:
        return ", ".join(self._columns)

    def _records(self, rows: Iterable[tuple[Any, ...]]) -> Iterator[JobRecord]:
        """The rows that can be read as records; each one that cannot is noted in ``skipped``."""
        for row in rows:
            try:
                yield record_from_row(row)
            except DamagedRow as damage:
                self.skipped.append(str(damage))

    def _filters(
        self, verdict: str | Iterable[str] | None, since: Any, until: Any, deleted: bool | None
    ) -> tuple[list[str], list[Any], bool]:
        """SQL clauses and parameters for every filter but the text; the flag says whether any
        filter other than ``deleted`` is set."""
        clauses: list[str] = []
        params: list[Any] = []
        if deleted is False:
            clauses.append("deleted_at IS NULL")
        elif deleted is True:
            clauses.append("deleted_at IS NOT NULL")
        if verdict:
            wanted = [verdict] if isinstance(verdict, str) else list(verdict)
            bad = [v for v in wanted if v not in VERDICTS]
            if bad:
                raise LogError(f"verdict: expected one of {', '.join(VERDICTS)}, got {bad[0]!r}")
            clauses.append(f"verdict IN ({', '.join('?' * len(wanted))})")
            params.extend(wanted)
        low, high = bound(since, "since", end=False), bound(until, "until", end=True)
        if low:
            clauses.append("created_at >= ?")
            params.append(low)
        if high:
            clauses.append("created_at < ?")
            params.append(high)
        return clauses, params, bool(verdict or low or high)

    def search(
        self,
        text: str = "",
        verdict: str | Iterable[str] | None = None,
        since: date | datetime | str | None = None,
        until: date | datetime | str | None = None,
        limit: int = 50,
        offset: int = 0,
        deleted: bool | None = False,
    ) -> list[JobRecord]:
        """Jobs newest first. ``text``: every word must appear (any case) in the job's search text
        (asset, location, notes, material, who, fitted, outcome, specs, verdict words; see
        search_words.py) - as plain characters, whatever they mean to SQL, LIKE or FTS5 (words are split at
        white space and NUL); ``since``/``until``: UTC dates (inclusive) or times; ``deleted``:
        False = live jobs, True = the bin, None = both."""
        verdict = _verdicts(verdict)
        clauses, params, _ = self._filters(verdict, since, until, deleted)
        limit, offset = max(0, int(limit)), max(0, int(offset))
        if limit == 0:
            return []
        ids = self._page_ids(text, (text, verdict, since, until, deleted), clauses, params, limit, offset)
        if not ids:
            return []
        rows = self._read(f"SELECT {self._select} FROM jobs WHERE id IN ({', '.join('?' * len(ids))})", ids)
        by_id = {record.id: record for record in self._records(rows)}
        return [by_id[i] for i in ids if i in by_id]

    def count(
        self,
        text: str = "",
        verdict: str | Iterable[str] | None = None,
        since: date | datetime | str | None = None,
        until: date | datetime | str | None = None,
        deleted: bool | None = False,
    ) -> int:
        """How many jobs ``search`` with the same filters would find in all (always exact)."""
        verdict = _verdicts(verdict)
        return self._count_jobs(text, (text, verdict, since, until, deleted))

    def iter_export_rows(self) -> Iterator[dict[str, Any]]:
        """Every job, bin included, oldest id first, as JSON-ready dicts (streamed). A job that
        cannot be read is left out and noted in ``skipped``."""
        for record in self._records(self._stream(f"SELECT {self._select} FROM jobs ORDER BY id")):
            yield record.as_dict()

    def export_rows(self) -> list[dict[str, Any]]:
        """Every job, bin included, as JSON-ready dicts (``import_jobs`` takes them back)."""
        return list(self.iter_export_rows())

    def reopen(self, job_id: int, *, rel_tol: float = 1e-3) -> Reopened:
        """Recompute a stored job with today's program and say what differs from the stored result."""
        record = self.get(job_id)
        from workbench.job import JobInputError, evaluate_inputs

        try:
            new_result = evaluate_inputs(dict(record.inputs))
        except JobInputError as err:
            return Reopened(record, None, (), error=str(err))
        return Reopened(record, new_result, compare_results(record.result, new_result, rel_tol))
