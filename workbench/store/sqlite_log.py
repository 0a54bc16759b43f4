"""The SQLite engine of the job log: one local file (stdlib ``sqlite3``), the embedded default.

WAL journal, ``synchronous=FULL``, a busy timeout, every write one ``BEGIN IMMEDIATE`` transaction.
Before anything is written the file is checked to be ours (``PRAGMA application_id``) and not from
a newer Shaftbench (``PRAGMA user_version``); an older log is copied aside and migrated. Text
filters and counts are answered by ``text_search.TrigramSearch``.
"""

from __future__ import annotations

import os
import sqlite3
import time
from collections.abc import Iterable, Iterator
from contextlib import contextmanager
from pathlib import Path
from typing import Any

from workbench.store import migrations, schema, sqlite_files
from workbench.store.log import INSERT, JobLog
from workbench.store.paths import create_private_file, default_log_path, make_private_dirs
from workbench.store.records import LogError
from workbench.store.text_search import INDEX_LOOKUP_LIMIT, TextPlan, TrigramSearch, filter_words
from workbench.store.values import bound

BUSY_TIMEOUT_S = 10.0
OLD_PAYLOAD = "CAST(X'00' || '[' || inputs_json || ',' || result_json || ']' AS BLOB) AS payload"
"""An older log's inputs and result read as one uncompressed payload (format 0), for reading it
read-only without migrating."""


def check_file(path: Path) -> None:
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


def friendly(err: sqlite3.Error, path: Path) -> LogError:
    """An SQLite error as the one-line message a person can act on."""
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


def sqlite_files_has_table(conn: sqlite3.Connection, name: str) -> bool:
    return conn.execute("SELECT 1 FROM sqlite_master WHERE name = ?", (name,)).fetchone() is not None


class SqliteJobLog(TrigramSearch, JobLog):
    """A job log in one SQLite file."""

    engine = "sqlite"

    def __init__(self, conn: sqlite3.Connection, path: Path, *, text_index: bool = False) -> None:
        self._conn = conn
        self.path = path
        self.text_index = text_index
        """True if text filters use the trigram index (schema v3 with FTS5); False: LIKE over every row."""
        self._match_count_cache: tuple[Any, int] | None = None
        self._count_cache: tuple[Any, int] | None = None
        self._has_counts = True
        self.skipped: list[str] = []

    # -- opening and closing -------------------------------------------------------------

    @classmethod
    def open_file(cls, path: str | os.PathLike[str] | None = None, *, create: bool = True) -> SqliteJobLog:
        """Open (and create or migrate, if needed) the job log file at ``path`` or the default path.

        A log this process may not write (a read-only file, folder or mount) is opened read-only:
        it can be listed, shown and exported; a change to it is refused with a message.
        """
        if path is not None and not str(path).strip():
            raise LogError("the job log name is empty: name a file, or leave it out for the default log")
        path = Path(path).expanduser() if path else default_log_path()
        created = False
        read_only = False
        if path.exists():
            check_file(path)
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
        columns, has_history = schema.JOB_COLUMNS, True
        try:
            if read_only:
                conn = sqlite_files.connect_read_only(path, BUSY_TIMEOUT_S)
                columns, text_index, has_history = cls._prepare_read_only(conn, path)
            else:
                conn = sqlite3.connect(
                    str(path), timeout=BUSY_TIMEOUT_S, isolation_level=None, check_same_thread=True
                )
                text_index = cls._prepare(conn, path)
        except BaseException as err:
            if conn is not None:
                conn.close()
            sqlite_files.tidy_empty_side_files(path, side_files)
            if created and path.exists() and path.stat().st_size == 0:
                path.unlink()
            if isinstance(err, sqlite3.Error):
                raise friendly(err, path) from None
            raise
        log = cls(conn, path, text_index=text_index)
        log.read_only, log._columns, log._has_history = read_only, columns, has_history
        log._has_counts = not read_only or sqlite_files_has_table(conn, schema.COUNTS_TABLE)
        return log

    @staticmethod
    def _identify(conn: sqlite3.Connection, path: Path) -> int:
        """The file's schema version after read-only probes; refuses a file that is not ours or is
        from a newer version. A file of ours whose version was lost (0 with our tables) gets the
        version its tables show, returned negative: it must be written back before migrating."""
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
            return -found
        return version

    @staticmethod
    def _prepare(conn: sqlite3.Connection, path: Path) -> bool:
        # Read-only probes first: nothing is written until the file is known to be ours.
        version = SqliteJobLog._identify(conn, path)
        conn.execute(f"PRAGMA busy_timeout = {int(BUSY_TIMEOUT_S * 1000)}")
        if version == 0 and not conn.execute("SELECT count(*) FROM sqlite_master").fetchone()[0]:
            # A new file: pages of 8 KiB hold a job row with less room left over (it is set before
            # the first write; an existing log keeps the size it was made with).
            conn.execute(f"PRAGMA page_size = {schema.PAGE_SIZE}")
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
            SqliteJobLog._backup_before_migrating(conn, path, version)
        migrations.migrate(conn)
        return migrations.ensure_text_index(conn)

    @staticmethod
    def _prepare_read_only(conn: sqlite3.Connection, path: Path) -> tuple[tuple[str, ...], bool, bool]:
        """For a log opened read-only (nothing is migrated or written): the columns to read (those an
        older version lacks read as empty), whether the text index can be used, whether the change
        history exists."""
        version = abs(SqliteJobLog._identify(conn, path))
        if version == 0:
            raise LogError(f"the job log {path} is empty and read-only; use --log to choose a writable file")
        present = {row[1] for row in conn.execute("PRAGMA table_info(jobs)")}
        def column(name: str) -> str:
            if name in present:
                return name
            if name == "payload" and {"inputs_json", "result_json"} <= present:
                return OLD_PAYLOAD
            return f"NULL AS {name}" if name in ("deleted_at", "uid", "payload") else f"'' AS {name}"

        columns = tuple(column(name) for name in schema.JOB_COLUMNS)
        parts = {row[0] for row in conn.execute("SELECT name FROM sqlite_master")}
        text_index = (  # today's layout only: an older one cannot find short words (read-only: LIKE)
            migrations.text_index_supported()
            and migrations.text_index_current(conn)
            and "search_text" in present
        )
        return columns, bool(text_index), "job_changes" in parts

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

    @property
    def conn(self) -> sqlite3.Connection:
        if self._conn is None:
            raise LogError("the job log is closed")
        return self._conn

    # -- the engine's part of the API ------------------------------------------------------

    @contextmanager
    def _write(self) -> Iterator[sqlite3.Connection]:
        """One write transaction: all of it is saved (durably) or none of it."""
        conn = self.conn
        if self.read_only:
            raise LogError(f"the job log {self.path} is read-only; use --log to choose a writable file")
        try:
            conn.execute("BEGIN IMMEDIATE")
        except sqlite3.Error as err:
            raise friendly(err, self.path) from None
        try:
            yield conn
            conn.execute("COMMIT")
        except BaseException as err:
            if conn.in_transaction:
                conn.execute("ROLLBACK")
            if isinstance(err, sqlite3.Error):
                raise friendly(err, self.path) from None
            raise

    def _read(self, sql: str, params: Iterable[Any] = ()) -> list[tuple[Any, ...]]:
        try:
            return self.conn.execute(sql, tuple(params)).fetchall()
        except sqlite3.Error as err:
            raise friendly(err, self.path) from None

    def _insert(self, conn: sqlite3.Connection, row: tuple[Any, ...]) -> int:
        return int(conn.execute(INSERT, (row[0].bytes, *row[1:])).lastrowid)

    def _uid_param(self, uid: Any) -> bytes:
        return uid.bytes

    def _stream(self, sql: str) -> Iterator[tuple[Any, ...]]:
        try:
            cursor = self.conn.execute(sql)
        except sqlite3.Error as err:
            raise friendly(err, self.path) from None
        try:
            while True:
                batch = cursor.fetchmany(500)
                if not batch:
                    return
                yield from batch
        except sqlite3.Error as err:
            raise friendly(err, self.path) from None
        finally:
            cursor.close()

    def _page_ids(
        self, text: str, filters: tuple[Any, ...], clauses: list[str], params: list[Any],
        limit: int, offset: int,
    ) -> list[int]:
        cached = self._count_cache
        if cached is not None and cached[0] == self._count_key(*filters) and offset >= cached[1]:
            return []  # count() just found fewer jobs than this page starts at (none, typically)
        plan = self._text_plan(text)
        if plan.matched == 0:
            return []
        source, where, params = self._text_query(plan, clauses, params)
        return [
            row[0]
            for row in self._read(
                f"SELECT id FROM {source}{where} ORDER BY created_at DESC, id DESC LIMIT ? OFFSET ?",
                [*params, limit, offset],
            )
        ]

    def _count_jobs(self, text: str, filters: tuple[Any, ...]) -> int:
        """Counted exactly. A text filter with many matches and no verdict or date filter is counted
        from the index: all matches less those in the bin (the bin is counted with LIKE, it is small).
        The count is remembered until the log changes."""
        key = self._count_key(*filters)
        if key is not None and self._count_cache is not None and self._count_cache[0] == key:
            return self._count_cache[1]
        found = self._count(*filters)
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

    def _count(self, text: str, verdict: Any, since: Any, until: Any, deleted: bool | None) -> int:
        clauses, params, narrowed = self._filters(verdict, since, until, deleted)
        if (self._has_counts and not filter_words(text) and bound(since, "since", end=False) is None
                and bound(until, "until", end=True) is None):
            return self._count_from_table(verdict, deleted)
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
                    TextPlan(plan.words, None, None, True), ["deleted_at IS NOT NULL"], []
                )
                in_bin = int(self._read(f"SELECT count(*) FROM jobs{where}", bin_params)[0][0])
                return matched - in_bin
        source, where, params = self._text_query(plan, clauses, params)
        return int(self._read(f"SELECT count(*) FROM {source}{where}", params)[0][0])

    def _count_from_table(self, verdict: Any, deleted: bool | None) -> int:
        """The number of jobs by verdict and bin state, from the counts the triggers keep."""
        clauses: list[str] = []
        params: list[Any] = []
        if deleted is not None:
            clauses.append("in_bin = ?")
            params.append(int(bool(deleted)))
        if verdict:
            wanted = [verdict] if isinstance(verdict, str) else list(verdict)
            clauses.append(f"verdict IN ({', '.join('?' * len(wanted))})")
            params.extend(wanted)
        where = " WHERE " + " AND ".join(clauses) if clauses else ""
        found = self._read(f"SELECT coalesce(sum(n), 0) FROM {schema.COUNTS_TABLE}{where}", params)
        return int(found[0][0])

    def bulk_insert(self, rows: Iterable[tuple[Any, ...]]) -> int:
        """Insert ready-made job rows (``values.job_row`` tuples with fresh uids) in one
        transaction, without looking for duplicates: the bulk path benchmarks fill a log with.
        The text index and the counts are made once at the end, in the same transaction."""
        count = 0
        with self._write() as conn:
            for trigger in (*schema.TEXT_TRIGGERS, *schema.COUNT_TRIGGERS):
                conn.execute(f"DROP TRIGGER IF EXISTS {trigger}")
            for row in rows:
                conn.execute(INSERT, (row[0].bytes, *row[1:]))
                count += 1
            conn.execute(f"DROP TABLE {schema.COUNTS_TABLE}")
            for statement in (*schema.SQLITE_COUNTS, schema.COUNTS_FILL):
                conn.execute(statement)
            if self.text_index:
                migrations.build_text_index(conn)
        return count

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
