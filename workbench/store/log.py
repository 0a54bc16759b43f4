"""The job log: every checked job in one SQLite file (stdlib ``sqlite3``).

A job is the inputs exactly as typed plus the result of ``workbench.job.evaluate_inputs`` on them,
with who/where/what notes. Every save is one durable transaction (WAL, ``synchronous=FULL``,
``BEGIN IMMEDIATE``); a file that is not ours, is damaged, or comes from a newer Shaftbench is refused
with a one-line message and left exactly as it was. Text filters use a trigram full-text index
(schema v3, SQLite FTS5) where this SQLite has one, else LIKE over every row; both give the same
answers.
"""

from __future__ import annotations

import json
import math
import os
import sqlite3
import time
from collections.abc import Iterable, Iterator, Mapping
from contextlib import contextmanager
from dataclasses import dataclass, field
from datetime import date, datetime, timedelta, timezone
from pathlib import Path
from typing import Any

from workbench.store import migrations, schema, sqlite_files
from workbench.store.paths import create_private_file, default_log_path, make_private_dirs
from workbench.store.search_words import job_search_text

__all__ = [
    "Difference",
    "JobLog",
    "JobRecord",
    "LogError",
    "Reopened",
    "compare_results",
    "default_log_path",
]

VERDICTS = ("pass", "marginal", "fail")
BUSY_TIMEOUT_S = 10.0
META_FIELDS = ("asset", "location", "by", "note", "fitted")
OUTCOME_FIELDS = ("fitted_on", "outcome", "outcome_date")
OUTCOMES = ("still-running", "failed", "removed")
"""How a fitted shaft ended: still running, failed again (on a date), removed."""
EDITABLE_FIELDS = META_FIELDS + OUTCOME_FIELDS


class LogError(Exception):
    """A problem with the job log that a person can act on; ``str(err)`` is one line."""


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
        }


@dataclass(frozen=True)
class Difference:
    """One figure that differs between the stored result and today's."""

    key: str
    """Where the figure sits, e.g. ``candidate.fatigue_safety_factor`` or ``verdict``."""
    stored: Any
    now: Any

    def __str__(self) -> str:
        return f"{self.key}: stored {_show(self.stored)}, now {_show(self.now)}"


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


# --------------------------------------------------------------------------------------------
# comparing results

DRIVE_FIGURES = ("running_torque_Nm", "design_torque_Nm", "peak_torque_Nm", "shaft_speed_rpm")
MOUNT_FIGURES = ("side_load_N", "bending_moment_Nm")
SHAFT_FIGURES = (
    "verdict",
    "max_shear_stress_Pa",
    "bending_stress_Pa",
    "von_mises_stress_Pa",
    "twist_deg_per_m",
    "endurance_limit_Pa",
    "static_safety_factor",
    "shear_yield_safety_factor",
    "fatigue_safety_factor",
)


def _show(value: Any) -> str:
    if value is None:
        return "-"
    if isinstance(value, float):
        return f"{value:.6g}"
    return str(value)


def _same(a: Any, b: Any, rel_tol: float) -> bool:
    numbers = (int, float)
    if isinstance(a, numbers) and isinstance(b, numbers) and not isinstance(a, bool) and not isinstance(b, bool):
        if math.isnan(a) or math.isnan(b):
            return math.isnan(a) and math.isnan(b)
        return math.isclose(a, b, rel_tol=rel_tol, abs_tol=1e-12)
    return a == b


def _shafts_by_role(result: Mapping[str, Any]) -> dict[str, Mapping[str, Any]]:
    shafts = result.get("shafts") or []
    return {str(s.get("role", i)): s for i, s in enumerate(shafts) if isinstance(s, Mapping)}


def compare_results(
    stored: Mapping[str, Any], now: Mapping[str, Any], rel_tol: float = 1e-3
) -> tuple[Difference, ...]:
    """The verdicts and key figures that differ between two results (numbers by ``rel_tol``).

    Compared: the overall verdict, the drive torques and shaft speed, the side load and bending
    moment, and for each shaft (matched by role) its verdict, stresses, twist, endurance limit and
    safety factors. The default tolerance of 0.1 % is below what any report shows.
    """
    found: list[Difference] = []

    def check(key: str, a: Any, b: Any) -> None:
        if not _same(a, b, rel_tol):
            found.append(Difference(key, a, b))

    check("verdict", stored.get("verdict"), now.get("verdict"))
    for group, names in (("drive", DRIVE_FIGURES), ("mount", MOUNT_FIGURES)):
        old = stored.get(group) or {}
        new = now.get(group) or {}
        for name in names:
            check(f"{group}.{name}", old.get(name), new.get(name))
    old_shafts, new_shafts = _shafts_by_role(stored), _shafts_by_role(now)
    for role in list(old_shafts) + [r for r in new_shafts if r not in old_shafts]:
        old, new = old_shafts.get(role), new_shafts.get(role)
        if old is None or new is None:
            check(f"{role}.spec", old and old.get("spec"), new and new.get("spec"))
            continue
        for name in SHAFT_FIGURES:
            check(f"{role}.{name}", old.get(name), new.get(name))
    return tuple(found)


# --------------------------------------------------------------------------------------------
# small helpers


def _now() -> str:
    return datetime.now(timezone.utc).isoformat(timespec="microseconds")


def _iso_utc(value: str, what: str) -> str:
    """Normalise an ISO time string to the stored form (UTC, microseconds)."""
    shown = _cut(repr(value))
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


def _cut(text: str, limit: int = 60) -> str:
    """A value for a one-line message: at most ``limit`` characters."""
    return text if len(text) <= limit else text[: limit - 1] + "…"


def _iso_date(value: Any, what: str) -> str:
    """An ISO calendar date (YYYY-MM-DD) or empty; a LogError naming ``what`` otherwise."""
    text = _text(value, what).strip()
    if not text:
        return ""
    try:
        return date.fromisoformat(text).isoformat()
    except ValueError:
        raise LogError(f"{what}: expected a date like 2025-03-01, got {_cut(repr(text))}") from None


def _bound(value: date | datetime | str | None, what: str, *, end: bool) -> str | None:
    """A ``since``/``until`` filter as a stored-form time; dates are whole UTC days (until inclusive)."""
    if value is None or value == "":
        return None
    if isinstance(value, str):
        text = value.strip()
        try:
            value = date.fromisoformat(text) if len(text) == 10 else datetime.fromisoformat(text.replace("Z", "+00:00"))
        except ValueError:
            raise LogError(f"{what}: expected a date like 2025-03-01 (UTC), got {_cut(repr(text))}") from None
    # At the calendar's edges a bound can fall past year 9999 or before year 1 in UTC, where no
    # stored time can be: such a bound lets every job through on its side, or none.
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
    raise LogError(f"{what}: expected a date, got {value!r}")


_MATCH_NONE_SINCE = "A"  # every stored time (digits first) sorts below it: created_at >= 'A' is never true
_MATCH_NONE_UNTIL = "0"  # every stored time sorts above it: created_at < '0' is never true


def _beyond(*, past_the_end: bool, end: bool) -> str | None:
    """The stored-form bound for a time outside the years 1 to 9999 in UTC (None: no bound)."""
    if end:
        return None if past_the_end else _MATCH_NONE_UNTIL
    return _MATCH_NONE_SINCE if past_the_end else None


def _text(value: Any, what: str) -> str:
    if value is None:
        return ""
    if not isinstance(value, str):
        raise LogError(f"{what}: expected text, got {type(value).__name__}")
    return value


def _outcome_fields(meta: Mapping[str, Any]) -> dict[str, str]:
    """``fitted_on``, ``outcome`` and ``outcome_date`` checked: dates as YYYY-MM-DD, the outcome one
    of OUTCOMES (``failed`` needs its date), the outcome not before the fitting."""
    fitted_on = _iso_date(meta.get("fitted_on"), "fitted_on")
    outcome = _text(meta.get("outcome"), "outcome").strip().casefold()
    outcome_date = _iso_date(meta.get("outcome_date"), "outcome_date")
    if outcome and outcome not in OUTCOMES:
        raise LogError(f"outcome: expected one of {', '.join(OUTCOMES)}, got {_cut(repr(outcome))}")
    if outcome == "failed" and not outcome_date:
        raise LogError("outcome: failed needs the date it failed (e.g. failed 2025-03-01)")
    if outcome_date and not outcome:
        raise LogError("outcome_date: give the outcome too (still-running, failed or removed)")
    if fitted_on and outcome_date and outcome_date < fitted_on:
        raise LogError(f"outcome_date: {outcome_date} is before the shaft was fitted ({fitted_on})")
    return {"fitted_on": fitted_on, "outcome": outcome, "outcome_date": outcome_date}


def _inputs_json(inputs: Any) -> str:
    if not isinstance(inputs, Mapping) or not all(
        isinstance(k, str) and isinstance(v, str) for k, v in inputs.items()
    ):
        raise LogError("inputs: expected a mapping of field name to the text as typed")
    return json.dumps(dict(inputs), ensure_ascii=False, sort_keys=True)


def _result_json(result: Any) -> str:
    if not isinstance(result, Mapping):
        raise LogError("result: expected the result mapping from evaluate_inputs")
    try:
        return json.dumps(result, ensure_ascii=False, sort_keys=True)
    except (TypeError, ValueError) as err:
        raise LogError(f"result: not JSON-ready ({err})") from None


def _verdict_of(result: Mapping[str, Any]) -> str:
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


INDEX_LOOKUP_LIMIT = 2000
"""Up to this many index matches, a text filter looks the matched jobs up by id; above it, scanning
the covering listing index in order is cheaper (measured at 100,000 jobs, bench/bench_log.py)."""


@dataclass(frozen=True)
class _TextPlan:
    """How a text filter will be answered."""

    words: list[str]
    """Case-folded words; each must appear in search_text."""
    expression: str | None
    """FTS5 query for the words the trigram index can find, or None (LIKE only)."""
    matched: int | None
    """How many jobs, bin included, the index matches, counted up to INDEX_LOOKUP_LIMIT + 1
    (None without the index)."""
    needs_like: bool
    """True if some word is not in ``expression`` (shorter than three characters) - or no index."""


def _verdicts(verdict: str | Iterable[str] | None) -> str | tuple[str, ...] | None:
    """A verdict filter in a hashable form (an iterable is read once, into a tuple)."""
    return verdict if verdict is None or isinstance(verdict, str) else tuple(verdict)


def _match_phrase(word: str) -> str:
    """A word as an FTS5 string: between double quotes, inner quotes doubled, so that ``*``, ``-``,
    ``AND``, ``NEAR``, ``:`` and parentheses are plain characters (SQLite FTS5 query syntax, 3.1)."""
    return '"' + word.replace('"', '""') + '"'


def _like_pattern(word: str) -> str:
    escaped = word.replace("\\", "\\\\").replace("%", "\\%").replace("_", "\\_")
    return f"%{escaped}%"


def _check_file(path: Path) -> None:
    """Refuse a file that is not an SQLite database, or that is shorter than its header says and
    that SQLite cannot recover from the WAL beside it (see workbench/store/sqlite_files.py)."""
    try:
        header = sqlite_files.read_header(path)
    except sqlite_files.FileProblem as problem:
        if str(problem) == "permission denied":
            raise LogError(f"cannot read the job log {path}: permission denied") from None
        if str(problem) == "folder":
            raise LogError(f"{path} is a folder, not a job log file") from None
        raise LogError(f"{path} is not a Shaftbench job log (not an SQLite file); it was left unchanged") from None
    if header is None or not header.short:
        return
    if sqlite_files.has_wal_frames(path) and sqlite_files.recoverable(path):
        return  # a checkpoint was cut short; SQLite replays the WAL on open and finishes it on close
    expected = header.page_size * header.page_count
    raise LogError(
        f"the job log {path} is damaged (cut short: {header.size} of {expected} bytes); "
        "it was left unchanged - restore it from a backup"
    )


def _friendly(err: sqlite3.Error, path: Path) -> LogError:
    text = str(err)
    low = text.lower()
    if sqlite_files.is_full_disk_error(err, path.parent):
        return LogError(f"the disk holding the job log {path} is full; nothing was saved - free some space")
    if "locked" in low or "busy" in low:
        return LogError(f"the job log {path} is busy (another program holds it); try again")
    if "readonly" in low or "read-only" in low:
        return LogError(f"the job log {path} is read-only; use --log to choose a writable file")
    if "unable to open" in low:
        return LogError(f"cannot open the job log {path} (is the folder writable?)")
    if "not a database" in low or "malformed" in low or "corrupt" in low:
        return LogError(f"the job log {path} is damaged ({text}); it was left unchanged")
    return LogError(f"job log {path}: {text}")


# --------------------------------------------------------------------------------------------
# the log


class JobLog:
    """An open job log file. Not shared between threads: open one per thread.

    >>> with JobLog.open(path) as log:        # doctest: +SKIP
    ...     job_id = log.save(inputs, result, asset="CV-07")
    """

    def __init__(self, conn: sqlite3.Connection, path: Path, *, text_index: bool = False) -> None:
        self._conn = conn
        self.path = path
        self.text_index = text_index
        """True if text filters use the trigram index (schema v3 with FTS5); False: LIKE over every row."""
        self._match_count_cache: tuple[Any, int] | None = None
        self._count_cache: tuple[Any, int] | None = None
        self.read_only = False
        """True if the log was opened read-only (this process may not write it)."""
        self._columns: tuple[str, ...] = schema.JOB_COLUMNS
        self.skipped: list[str] = []
        """One line for each stored job that could not be read and was left out of a listing or export."""

    # -- opening and closing -------------------------------------------------------------

    @classmethod
    def open(cls, path: str | os.PathLike[str] | None = None, *, create: bool = True) -> JobLog:
        """Open (and create or migrate, if needed) the job log at ``path`` or the default path.

        A log this process may not write (a read-only file, folder or mount) is opened read-only:
        it can be listed, shown and exported; a change to it is refused with a message.
        """
        if path is not None and not str(path).strip():
            raise LogError("the job log name is empty: name a file, or leave it out for the default log")
        path = Path(path).expanduser() if path else default_log_path()
        created = False
        read_only = False
        if path.exists():
            _check_file(path)
            read_only = not sqlite_files.writable(path)
        elif not create:
            raise LogError(f"there is no job log at {path}")
        else:
            try:
                make_private_dirs(path.parent)
                created = create_private_file(path)
            except PermissionError:
                raise LogError(f"cannot create the job log {path}: the folder is read-only") from None
            except OSError as err:
                if sqlite_files.is_full_disk_error(err, path.parent):
                    raise LogError(f"cannot create the job log {path}: the disk holding it is full") from None
                raise LogError(f"cannot create the job log {path}: {err.strerror or err}") from None
        side_files = sqlite_files.side_files_exist(path)
        conn: sqlite3.Connection | None = None
        try:
            if read_only:
                conn = sqlite_files.connect_read_only(path, BUSY_TIMEOUT_S)
                columns, text_index = cls._prepare_read_only(conn, path)
            else:
                conn = sqlite3.connect(
                    str(path), timeout=BUSY_TIMEOUT_S, isolation_level=None, check_same_thread=True
                )
                text_index = cls._prepare(conn, path)
                columns = schema.JOB_COLUMNS
        except BaseException as err:
            if conn is not None:
                conn.close()
            sqlite_files.tidy_empty_side_files(path, side_files)
            if created and path.exists() and path.stat().st_size == 0:
                path.unlink()
            if isinstance(err, sqlite3.Error):
                raise _friendly(err, path) from None
            raise
        log = cls(conn, path, text_index=text_index)
        log.read_only = read_only
        log._columns = columns
        return log

    @staticmethod
    def _identify(conn: sqlite3.Connection, path: Path) -> int:
        """The file's schema version after read-only probes; refuses a file that is not ours or is
        from a newer version. A file of ours whose version was lost (0 with our tables) gets the
        version its tables show."""
        version = migrations.user_version(conn)
        app_id = int(conn.execute("PRAGMA application_id").fetchone()[0])
        has_tables = conn.execute("SELECT count(*) FROM sqlite_master").fetchone()[0] > 0
        if app_id not in (0, schema.APPLICATION_ID) or (app_id == 0 and (version or has_tables)):
            raise LogError(f"{path} is an SQLite file but not a Shaftbench job log; it was left unchanged")
        if version > schema.LATEST_VERSION:
            raise LogError(
                f"the job log {path} was written by a newer Shaftbench (log format v{version}, this "
                f"version reads up to v{schema.LATEST_VERSION}); upgrade Shaftbench - the file was left unchanged"
            )
        if version == 0 and has_tables:
            found = migrations.version_from_tables(conn)
            if found is None:
                raise LogError(f"the job log {path} has tables but no job table of ours; it was left unchanged")
            return -found  # negative: the version must be written back before migrating
        return version

    @staticmethod
    def _prepare(conn: sqlite3.Connection, path: Path) -> bool:
        # Read-only probes first: nothing is written until the file is known to be ours.
        version = JobLog._identify(conn, path)
        conn.execute(f"PRAGMA busy_timeout = {int(BUSY_TIMEOUT_S * 1000)}")
        deadline = time.monotonic() + BUSY_TIMEOUT_S
        while True:  # switching to WAL needs a moment alone with the file
            try:
                mode = conn.execute("PRAGMA journal_mode = WAL").fetchone()[0]
                break
            except sqlite3.OperationalError as err:
                if "locked" not in str(err).lower() or time.monotonic() > deadline:
                    raise
                time.sleep(0.01)
        if str(mode).lower() != "wal":
            raise LogError(f"the job log {path} cannot use write-ahead logging (journal mode {mode})")
        conn.execute("PRAGMA synchronous = FULL")
        if version < 0:  # ours, with its version number lost: write back what the tables show
            version = -version
            conn.execute(f"PRAGMA user_version = {version}")
        if 0 < version < schema.LATEST_VERSION:
            JobLog._backup_before_migrating(conn, path, version)
        migrations.migrate(conn)
        return migrations.ensure_text_index(conn)

    @staticmethod
    def _prepare_read_only(conn: sqlite3.Connection, path: Path) -> tuple[tuple[str, ...], bool]:
        """Columns to read (missing ones of an older version read as empty) and whether the text
        index can be used, for a log opened read-only (nothing is migrated or written)."""
        version = abs(JobLog._identify(conn, path))
        if version == 0:
            raise LogError(f"the job log {path} is empty and read-only; use --log to choose a writable file")
        present = {row[1] for row in conn.execute("PRAGMA table_info(jobs)")}
        columns = tuple(
            name if name in present else f"'' AS {name}" if name != "deleted_at" else "NULL AS deleted_at"
            for name in schema.JOB_COLUMNS
        )
        parts = {row[0] for row in conn.execute("SELECT name FROM sqlite_master")}
        text_index = (
            migrations.text_index_supported()
            and {schema.TEXT_INDEX, *schema.TEXT_TRIGGERS} <= parts
            and "search_text" in present
        )
        return columns, bool(text_index)

    @staticmethod
    def _backup_before_migrating(conn: sqlite3.Connection, path: Path, version: int) -> None:
        """Copy an older log aside (``<name>.v<N>.bak``, mode 0600) before changing its format."""
        backup_path = path.with_name(f"{path.name}.v{version}.bak")
        if backup_path.exists():
            return
        create_private_file(backup_path)
        target = sqlite3.connect(str(backup_path))
        try:
            conn.backup(target)
        finally:
            target.close()

    def close(self) -> None:
        """Close the file (safe to call twice)."""
        if self._conn is not None:
            self._conn.close()
            self._conn = None  # type: ignore[assignment]

    def __enter__(self) -> JobLog:
        return self

    def __exit__(self, *exc: object) -> None:
        self.close()

    @property
    def conn(self) -> sqlite3.Connection:
        if self._conn is None:
            raise LogError("the job log is closed")
        return self._conn

    @contextmanager
    def _write(self) -> Iterator[sqlite3.Connection]:
        """One write transaction: all of it is saved (durably) or none of it."""
        conn = self.conn
        if self.read_only:
            raise LogError(f"the job log {self.path} is read-only; use --log to choose a writable file")
        try:
            conn.execute("BEGIN IMMEDIATE")
        except sqlite3.Error as err:
            raise _friendly(err, self.path) from None
        try:
            yield conn
            conn.execute("COMMIT")
        except BaseException as err:
            if conn.in_transaction:
                conn.execute("ROLLBACK")
            if isinstance(err, sqlite3.Error):
                raise _friendly(err, self.path) from None
            raise

    def _read(self, sql: str, params: Iterable[Any] = ()) -> list[tuple[Any, ...]]:
        try:
            return self.conn.execute(sql, tuple(params)).fetchall()
        except sqlite3.Error as err:
            raise _friendly(err, self.path) from None

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
    ) -> int:
        """Store one job durably; returns its id. ``inputs`` are kept exactly as typed."""
        row = self._row(
            inputs, result,
            dict(asset=asset, location=location, by=by, note=note, fitted=fitted,
                 fitted_on=fitted_on, outcome=outcome, outcome_date=outcome_date),
        )
        with self._write() as conn:
            cursor = conn.execute(_INSERT, row)
        return int(cursor.lastrowid)

    def _row(
        self,
        inputs: Any,
        result: Any,
        meta: Mapping[str, Any],
        *,
        created_at: str | None = None,
        updated_at: str | None = None,
        program_version: str | None = None,
        deleted_at: str | None = None,
    ) -> tuple[Any, ...]:
        inputs_json, result_json = _inputs_json(inputs), _result_json(result)
        text = {name: _text(meta.get(name), name) for name in META_FIELDS}
        ending = _outcome_fields(meta)
        if program_version is None:
            program = result.get("program")
            program_version = program.get("version") if isinstance(program, Mapping) else None
            if not isinstance(program_version, str):
                from workbench import __version__

                program_version = __version__
        now = _now()
        created = created_at or now
        material = material_of(inputs, result)
        return (
            created,
            updated_at or created,
            program_version,
            text["asset"],
            text["location"],
            text["by"],
            text["note"],
            _verdict_of(result),
            material,
            text["fitted"],
            deleted_at,
            inputs_json,
            result_json,
            job_search_text({**text, **ending, "material": material}, inputs, result),
            ending["fitted_on"],
            ending["outcome"],
            ending["outcome_date"],
        )

    def update(self, job_id: int, **changes: str) -> JobRecord:
        """Change what is recorded around a job - asset, location, by, note, fitted, fitted_on,
        outcome, outcome_date - and return it. Each field that changes is kept in the job's history
        (``changes``) with the time of the change; the job's ``updated_at`` is that time."""
        unknown = set(changes) - set(EDITABLE_FIELDS)
        if unknown:
            raise LogError(f"cannot change {', '.join(sorted(unknown))}: only {', '.join(EDITABLE_FIELDS)}")
        current = self.get(job_id)
        values = {name: getattr(current, name) for name in EDITABLE_FIELDS}
        values.update({name: _text(value, name) for name, value in changes.items()})
        values.update(_outcome_fields(values))
        changed = [name for name in EDITABLE_FIELDS if values[name] != getattr(current, name)]
        if not changed:
            return current
        now = _now()
        search = job_search_text({**values, "material": current.material}, current.inputs, current.result)
        with self._write() as conn:
            conn.execute(
                "UPDATE jobs SET asset = ?, location = ?, by = ?, note = ?, fitted = ?, fitted_on = ?, "
                "outcome = ?, outcome_date = ?, search_text = ?, updated_at = ? WHERE id = ?",
                (*(values[name] for name in EDITABLE_FIELDS), search, now, job_id),
            )
            conn.executemany(
                "INSERT INTO job_changes (job_id, changed_at, field, old_value, new_value) VALUES (?, ?, ?, ?, ?)",
                ((job_id, now, name, getattr(current, name), values[name]) for name in changed),
            )
        return self.get(job_id)

    def replace_result(self, job_id: int, inputs: Mapping[str, str], result: Mapping[str, Any],
                       **changes: str) -> JobRecord:
        """Store new inputs and result for an existing job (a job reopened, corrected and saved
        again as the same job), with any of the ``update`` fields; the change is kept in the
        job's history (field ``result``: the verdict before and after)."""
        unknown = set(changes) - set(EDITABLE_FIELDS)
        if unknown:
            raise LogError(f"cannot change {', '.join(sorted(unknown))}: only {', '.join(EDITABLE_FIELDS)}")
        current = self.get(job_id)
        values = {name: getattr(current, name) for name in EDITABLE_FIELDS}
        values.update({name: _text(value, name) for name, value in changes.items()})
        row = self._row(inputs, result, values, created_at=current.created_at, updated_at=_now(),
                        program_version=None, deleted_at=current.deleted_at)
        (_, now, version, asset, location, by, note, verdict, material, fitted, _, inputs_json,
         result_json, search, fitted_on, outcome, outcome_date) = row
        with self._write() as conn:
            conn.execute(
                "UPDATE jobs SET updated_at = ?, program_version = ?, asset = ?, location = ?, by = ?, "
                "note = ?, verdict = ?, material = ?, fitted = ?, inputs_json = ?, result_json = ?, "
                "search_text = ?, fitted_on = ?, outcome = ?, outcome_date = ? WHERE id = ?",
                (now, version, asset, location, by, note, verdict, material, fitted, inputs_json,
                 result_json, search, fitted_on, outcome, outcome_date, job_id),
            )
            history = [("result", f"{current.verdict or '-'} ({current.program_version})",
                        f"{verdict or '-'} ({version})")]
            history += [(name, getattr(current, name), values[name]) for name in EDITABLE_FIELDS
                        if values[name] != getattr(current, name)]
            conn.executemany(
                "INSERT INTO job_changes (job_id, changed_at, field, old_value, new_value) VALUES (?, ?, ?, ?, ?)",
                ((job_id, now, name, old, new) for name, old, new in history),
            )
        return self.get(job_id)

    def changes(self, job_id: int) -> list[dict[str, str]]:
        """The job's history after its save, oldest first: ``changed_at``, ``field``, ``old``, ``new``."""
        if "job_changes" not in {r[0] for r in self._read("SELECT name FROM sqlite_master")}:
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
            now = _now()
            conn.execute("UPDATE jobs SET deleted_at = ?, updated_at = ? WHERE id = ?", (now, now, job_id))

    def restore(self, job_id: int) -> None:
        """Bring a job back from the bin."""
        with self._write() as conn:
            found = conn.execute("SELECT deleted_at FROM jobs WHERE id = ?", (job_id,)).fetchone()
            if found is None:
                raise LogError(f"there is no job {job_id} in the log")
            if found[0] is None:
                raise LogError(f"job {job_id} is not in the bin")
            conn.execute("UPDATE jobs SET deleted_at = NULL, updated_at = ? WHERE id = ?", (_now(), job_id))

    def purge(self) -> int:
        """Remove every job in the bin for good; returns how many."""
        with self._write() as conn:
            cursor = conn.execute("DELETE FROM jobs WHERE deleted_at IS NOT NULL")
        return int(cursor.rowcount)

    def import_jobs(self, rows: Iterable[Mapping[str, Any]]) -> int:
        """Add exported jobs (dicts as from ``export_rows``) in one transaction; returns how many.

        Each job gets a new id; its times, notes and bin state are kept. A job already in the log
        (same creation time, inputs and result) is skipped, so importing a file twice adds nothing.
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
                created = _iso_utc(item["created_at"], "created_at") if item.get("created_at") else None
                updated = _iso_utc(item["updated_at"], "updated_at") if item.get("updated_at") else None
                deleted = _iso_utc(item["deleted_at"], "deleted_at") if item.get("deleted_at") else None
                version = item.get("program_version")
                prepared.append(
                    self._row(
                        inputs, result, item,
                        created_at=created, updated_at=updated, deleted_at=deleted,
                        program_version=version if isinstance(version, str) and version else None,
                    )
                )
            except (LogError, ValueError, RecursionError) as err:
                message = "nested too deeply to read" if isinstance(err, RecursionError) else str(err)
                raise LogError(f"job {number} of the import: {message}") from None
        added = 0
        with self._write() as conn:
            for row in prepared:
                created, inputs_json, result_json = row[0], row[11], row[12]  # see _row
                seen = conn.execute(
                    "SELECT 1 FROM jobs WHERE created_at = ? AND inputs_json = ? AND result_json = ?",
                    (created, inputs_json, result_json),
                ).fetchone()
                if seen is None:
                    conn.execute(_INSERT, row)
                    added += 1
        return added

    # -- reading -----------------------------------------------------------------------------

    def get(self, job_id: int) -> JobRecord:
        """The job with this id (also when it is in the bin)."""
        rows = self._read(f"SELECT {self._select} FROM jobs WHERE id = ?", (int(job_id),))
        if not rows:
            raise LogError(f"there is no job {job_id} in the log")
        try:
            return _record(rows[0])
        except DamagedRow as damage:
            raise LogError(f"{damage}; the other jobs are not affected") from None

    @property
    def _select(self) -> str:
        return ", ".join(self._columns)

    def _records(self, rows: Iterable[tuple[Any, ...]]) -> Iterator[JobRecord]:
        """The rows that can be read as records; each one that cannot is noted in ``skipped``."""
        for row in rows:
            try:
                yield _record(row)
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
        low, high = _bound(since, "since", end=False), _bound(until, "until", end=True)
        if low:
            clauses.append("created_at >= ?")
            params.append(low)
        if high:
            clauses.append("created_at < ?")
            params.append(high)
        return clauses, params, bool(verdict or low or high)

    def _text_plan(self, text: str, *, full_count: bool = False) -> _TextPlan:
        """Split the filter text into words and, if the trigram index can serve it, count the
        jobs (bin included) whose text holds every word of three or more characters: up to
        INDEX_LOOKUP_LIMIT + 1, or all of them with ``full_count`` when every word is indexed."""
        # NUL ends a LIKE pattern inside SQLite (the rest would be ignored), so it separates words.
        words = _text(text, "text").replace("\x00", " ").casefold().split()
        indexed = [w for w in words if len(w) >= schema.TEXT_INDEX_MIN_CHARS]
        if not (self.text_index and indexed):
            return _TextPlan(words, None, None, bool(words))
        expression = " AND ".join(_match_phrase(w) for w in indexed)
        every_word = len(indexed) == len(words)
        cap = None if full_count and every_word else INDEX_LOOKUP_LIMIT + 1
        matched = self._match_count(expression, cap=cap)
        if matched is None:  # the index could not answer: LIKE alone
            return _TextPlan(words, None, None, True)
        return _TextPlan(words, expression, matched, not every_word)

    def _match_count(self, expression: str, cap: int | None = None) -> int | None:
        """How many jobs (bin included) the index matches, counting no further than ``cap`` if
        given (the index stops early); None if the index cannot answer. The last full count is
        kept until the log changes (this connection's changes or another's commit)."""
        try:
            state = (
                expression,
                self.conn.total_changes,
                self.conn.execute("PRAGMA data_version").fetchone()[0],
            )
            cached = self._match_count_cache
            if cached is not None and cached[0] == state:
                return cached[1] if cap is None else min(cached[1], cap)
            query = f"SELECT rowid FROM {schema.TEXT_INDEX} WHERE {schema.TEXT_INDEX} MATCH ?"
            if cap is not None:
                query += f" LIMIT {int(cap)}"
            matched = int(self.conn.execute(f"SELECT count(*) FROM ({query})", (expression,)).fetchone()[0])
        except sqlite3.OperationalError:
            return None
        if cap is None or matched < cap:
            self._match_count_cache = (state, matched)
        return matched

    def _text_query(
        self, plan: _TextPlan, clauses: list[str], params: list[Any]
    ) -> tuple[str, str, list[Any]]:
        """``(FROM ..., WHERE ..., params)`` selecting the jobs that pass every filter.

        With the index and at most INDEX_LOOKUP_LIMIT matches, the matched ids drive the query
        (row lookups by id); otherwise the covering index jobs_listing is scanned with LIKE, which
        also stops early when a page fills up. Every word is always checked with LIKE as well, so the
        result is exactly the LIKE semantics whichever way the rows were found.
        """
        clauses, params = list(clauses), list(params)
        for word in plan.words:
            clauses.append("search_text LIKE ? ESCAPE '\\'")  # measured faster than instr()
            params.append(_like_pattern(word))
        source = "jobs"
        if plan.expression is not None and plan.matched is not None and plan.matched <= INDEX_LOOKUP_LIMIT:
            source = "jobs NOT INDEXED"  # the integer primary key is still used for the id lookups
            clauses.insert(
                0, f"id IN (SELECT rowid FROM {schema.TEXT_INDEX} WHERE {schema.TEXT_INDEX} MATCH ?)"
            )
            params.insert(0, plan.expression)
        where = " WHERE " + " AND ".join(clauses) if clauses else ""
        return source, where, params

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
        """Jobs newest first. ``text``: every word must appear (any case) in asset, location, notes or
        material - as plain characters, whatever they mean to SQL, LIKE or FTS5 (words are split at
        white space and NUL); ``since``/``until``: UTC dates (inclusive) or times; ``deleted``:
        False = live jobs, True = the bin, None = both."""
        verdict = _verdicts(verdict)
        clauses, params, _ = self._filters(verdict, since, until, deleted)
        limit, offset = max(0, int(limit)), max(0, int(offset))
        if limit == 0:
            return []
        cached = self._count_cache
        if cached is not None:
            if cached[0] == self._count_key(text, verdict, since, until, deleted) and offset >= cached[1]:
                return []  # count() just found fewer jobs than this page starts at (none, typically)
        plan = self._text_plan(text)
        if plan.matched == 0:
            return []
        source, where, params = self._text_query(plan, clauses, params)
        ids = [
            row[0]
            for row in self._read(
                f"SELECT id FROM {source}{where} ORDER BY created_at DESC, id DESC LIMIT ? OFFSET ?",
                [*params, limit, offset],
            )
        ]
        if not ids:
            return []
        rows = self._read(
            f"SELECT {self._select} FROM jobs WHERE id IN ({', '.join('?' * len(ids))})", ids
        )
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
        """How many jobs ``search`` with the same filters would find in all (always exact).

        A text filter with many matches and no verdict or date filter is counted from the index:
        all matches less those in the bin (the bin is counted with LIKE, it is small).
        """
        verdict = _verdicts(verdict)
        key = self._count_key(text, verdict, since, until, deleted)
        if key is not None and self._count_cache is not None and self._count_cache[0] == key:
            return self._count_cache[1]
        found = self._count(text, verdict, since, until, deleted)
        self._count_cache = (key, found) if key is not None else None
        return found

    def _count_key(self, *filters: Any) -> tuple[Any, ...] | None:
        """What a count depends on: the filters and the log's state (None if unhashable)."""
        try:
            hash(filters)
        except TypeError:
            return None
        data_version = self._read("PRAGMA data_version")[0][0]
        return (filters, self.conn.total_changes, data_version)

    def _count(
        self, text: str, verdict: str | Iterable[str] | None, since: Any, until: Any, deleted: bool | None
    ) -> int:
        clauses, params, narrowed = self._filters(verdict, since, until, deleted)
        plan = self._text_plan(text, full_count=not narrowed and deleted is not True)
        if plan.matched == 0:
            return 0
        if (
            plan.expression is not None
            and plan.matched is not None
            and plan.matched > INDEX_LOOKUP_LIMIT
            and not plan.needs_like
            and not narrowed
            and deleted is not True
        ):
            matched = self._match_count(plan.expression)
            if matched is not None:
                if deleted is None:
                    return matched
                _, where, bin_params = self._text_query(
                    _TextPlan(plan.words, None, None, True), ["deleted_at IS NOT NULL"], []
                )
                in_bin = int(self._read(f"SELECT count(*) FROM jobs{where}", bin_params)[0][0])
                return matched - in_bin
        source, where, params = self._text_query(plan, clauses, params)
        return int(self._read(f"SELECT count(*) FROM {source}{where}", params)[0][0])

    def iter_export_rows(self) -> Iterator[dict[str, Any]]:
        """Every job, bin included, oldest id first, as JSON-ready dicts (streamed).

        A job that cannot be read is left out and noted in ``skipped``."""
        try:
            cursor = self.conn.execute(f"SELECT {self._select} FROM jobs ORDER BY id")
        except sqlite3.Error as err:
            raise _friendly(err, self.path) from None
        try:
            while True:
                batch = cursor.fetchmany(500)
                if not batch:
                    return
                for record in self._records(batch):
                    yield record.as_dict()
        except sqlite3.Error as err:
            raise _friendly(err, self.path) from None
        finally:
            cursor.close()

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

    def forget_counts(self) -> None:
        """Drop the remembered counts (for timing; any change to the log makes them stale anyway)."""
        self._match_count_cache = None
        self._count_cache = None

    def integrity_ok(self) -> bool:
        """True if SQLite's ``PRAGMA integrity_check`` finds nothing wrong (reads the whole file) and,
        with the text index, FTS5's ``integrity-check`` finds the index itself sound (before SQLite
        3.44 it does not compare the index with the jobs' text; the tests do that)."""
        if self._read("PRAGMA integrity_check")[0][0] != "ok":
            return False
        if self.text_index:
            try:
                self.conn.execute(schema.TEXT_INDEX_CHECK)
            except sqlite3.DatabaseError:
                return False
        return True


_INSERT = (
    "INSERT INTO jobs (created_at, updated_at, program_version, asset, location, by, note, verdict, "
    "material, fitted, deleted_at, inputs_json, result_json, search_text, fitted_on, outcome, outcome_date) "
    "VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)"
)


class DamagedRow(Exception):
    """A stored job whose inputs or result cannot be read back; ``str(err)`` names the job."""


def _loaded(text: Any, job_id: Any, what: str, kind: type) -> Any:
    try:
        value = json.loads(text)
    except (TypeError, ValueError, RecursionError):
        raise DamagedRow(f"job {job_id} cannot be read: its stored {what} is damaged (not valid JSON)") from None
    if not isinstance(value, kind):
        raise DamagedRow(f"job {job_id} cannot be read: its stored {what} is damaged "
                         f"({'null' if value is None else type(value).__name__}, not an object)")
    return value


def _record(row: tuple[Any, ...]) -> JobRecord:
    (job_id, created, updated, version, asset, location, by, note, verdict, material, fitted,
     deleted_at, inputs_json, result_json, fitted_on, outcome, outcome_date) = row
    return JobRecord(
        id=job_id, created_at=created, updated_at=updated, program_version=version or "",
        asset=asset or "", location=location or "", by=by or "", note=note or "", verdict=verdict or "",
        material=material or "", fitted=fitted or "", deleted_at=deleted_at,
        inputs=_loaded(inputs_json, job_id, "inputs", dict), result=_loaded(result_json, job_id, "result", dict),
        fitted_on=fitted_on or "", outcome=outcome or "", outcome_date=outcome_date or "",
    )
