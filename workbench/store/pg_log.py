"""The PostgreSQL engine of the job log: one shared log for every bench of a site (psycopg 3).

``--log postgresql://user@host:5432/db`` (or ``$SHAFTBENCH_LOG``) selects it. Credentials come from
the URL, the environment (``PGPASSWORD``, ``PGUSER``, ...) or a ``.pgpass`` file, as libpq reads
them; messages name the log by its URL with any password removed, never echoed.

- The tables are the same definition as SQLite's (``schema.jobs_table``); the schema version is kept
  in ``shaftbench_meta`` with the mark that the database holds a Shaftbench log. A database with
  tables of its own but no such mark is not ours, and one of a newer version is refused; both are
  left untouched (nothing is written before these checks). Creating and migrating hold an advisory
  lock, so benches starting at once do not both create the tables.
- The id is the site-unique job number (an identity column): job cards cite it. The uid, made by the
  bench, makes a resend harmless; the bench name is stored with every job.
- A save is one transaction: it is reported done only after the server's COMMIT (with the server's
  default ``synchronous_commit = on`` that is durable). If the connection is lost during a save, the
  save is REFUSED with nothing half-written: PostgreSQL rolls back a transaction whose COMMIT did
  not arrive, and if the COMMIT arrived but its answer was lost, saving again stores nothing twice
  (same uid). The message says the job was not saved and to save again.
- Text filters: every word must be in ``search_text``: ``LIKE '%word%'`` served by a pg_trgm GIN
  index for words of three characters or more; a shorter word (pg_trgm extracts no trigram from it)
  is tested with ``strpos`` on the rows the other words found, or on every row when no word is long
  enough (its count then reads every job).
"""

from __future__ import annotations

import re
import uuid
from collections.abc import Iterable, Iterator
from contextlib import contextmanager
from typing import Any
from urllib.parse import urlsplit, urlunsplit

from workbench.store import schema
from workbench.store.log import INSERT, JobLog
from workbench.store.records import LogError
from workbench.store.text_search import filter_words, like_pattern

APPLICATION = "shaftbench-job-log"
META_TABLE = "shaftbench_meta"
CONNECT_TIMEOUT_S = 10
LOCK_KEY = 0x53424A4C  # advisory lock held while creating or migrating ("SBJL")

# Forward steps of the PostgreSQL log; STEPS[n] brings it from version n - 1 to n. The first
# PostgreSQL version is 5, the SQLite version whose tables it shares.
V5 = (
    "CREATE EXTENSION IF NOT EXISTS pg_trgm",
    f"CREATE TABLE {META_TABLE} (key TEXT PRIMARY KEY, value TEXT NOT NULL)",
    schema.table_ddl("postgresql", "jobs", version=5),
    schema.table_ddl("postgresql", "job_changes", version=5),
    "CREATE INDEX job_changes_job ON job_changes (job_id, id)",
    "CREATE UNIQUE INDEX jobs_uid ON jobs (uid)",
    "CREATE INDEX jobs_listing ON jobs (deleted_at, created_at, id)",
    "CREATE INDEX jobs_time ON jobs (created_at, id)",
    "CREATE INDEX jobs_text ON jobs USING gin (search_text gin_trgm_ops)",
)
FIRST_VERSION = 5


def _create_v5(conn: Any) -> None:
    for statement in V5:
        conn.execute(statement)
    conn.execute(f"INSERT INTO {META_TABLE} (key, value) VALUES ('application', %s)", (APPLICATION,))
    conn.execute(f"INSERT INTO {META_TABLE} (key, value) VALUES ('schema_version', '5')")


def _v5_to_v6(conn: Any) -> None:
    from workbench.store.migrations import fill_asset_keys

    conn.execute("ALTER TABLE jobs ADD COLUMN asset_key TEXT NOT NULL DEFAULT ''")
    fill_asset_keys(_Writer(conn))
    conn.execute(schema.ASSET_INDEX)


STEPS = {5: _create_v5, 6: _v5_to_v6}


def shown_url(url: str) -> str:
    """The URL as messages may show it: any password removed (``user:***@`` is not shown either)."""
    try:
        parts = urlsplit(url)
    except ValueError:
        return "the PostgreSQL job log"
    host = parts.hostname or ""
    if parts.port:
        host = f"{host}:{parts.port}"
    if parts.username:
        host = f"{parts.username}@{host}"
    return urlunsplit((parts.scheme, host, parts.path, "", ""))


def _scrub(text: str, url: str) -> str:
    """``text`` with the URL's password (if any) and the raw URL replaced."""
    try:
        password = urlsplit(url).password
    except ValueError:
        password = None
    text = text.replace(url, shown_url(url))
    if password:
        text = text.replace(password, "***")
    return re.sub(r"password=\S+", "password=***", text)


def friendly(err: Exception, url: str) -> LogError:
    """A psycopg error as one line a person can act on, naming the log without its password."""
    import psycopg

    where = shown_url(url)
    first = _scrub(str(err).strip().splitlines()[0] if str(err).strip() else type(err).__name__, url)
    if isinstance(err, psycopg.OperationalError):
        return LogError(f"the shared job log {where} cannot be reached ({first}); nothing was changed "
                        "(a save in progress was not confirmed: save again when it is back - the same "
                        "save is never stored twice)")
    return LogError(f"shared job log {where}: {first}")


def _sql(statement: str) -> str:
    """Neutral SQL (``?`` parameters) for psycopg (``%s``)."""
    return statement.replace("%", "%%").replace("?", "%s")


class _Writer:
    """What the neutral API writes through inside one transaction."""

    def __init__(self, conn: Any) -> None:
        self.conn = conn

    def execute(self, statement: str, params: Iterable[Any] = ()) -> Any:
        return self.conn.execute(_sql(statement), tuple(params))


class PgJobLog(JobLog):
    """A job log in a PostgreSQL database, shared by every bench that names it."""

    engine = "postgresql"
    text_index = True

    def __init__(self, conn: Any, url: str) -> None:
        self._conn = conn
        self._url = url
        self.path = shown_url(url)  # type: ignore[assignment]  # what messages and screens show

    @classmethod
    def open_url(cls, url: str, *, create: bool = True) -> PgJobLog:
        """Connect, check the database is ours (or empty), and create or migrate the tables."""
        try:
            import psycopg
        except ImportError:
            raise LogError("a PostgreSQL job log needs the psycopg package (pip install 'psycopg[binary]')") from None
        try:
            conn = psycopg.connect(url, autocommit=True, connect_timeout=CONNECT_TIMEOUT_S,
                                   application_name="shaftbench")
        except psycopg.Error as err:
            raise friendly(err, url) from None
        except Exception as err:  # a URL libpq cannot parse
            raise LogError(f"cannot use the job log URL {shown_url(url)}: {_scrub(str(err), url)}") from None
        try:
            cls._prepare(conn, url, create=create)
        except BaseException as err:
            conn.close()
            if isinstance(err, psycopg.Error):
                raise friendly(err, url) from None
            raise
        return cls(conn, url)

    @staticmethod
    def _prepare(conn: Any, url: str, *, create: bool) -> None:
        where = shown_url(url)
        with conn.transaction():
            conn.execute("SELECT pg_advisory_xact_lock(%s)", (LOCK_KEY,))
            version = PgJobLog._version(conn, where)
            if version is None:
                if not create:
                    raise LogError(f"there is no job log in {where}")
                version = FIRST_VERSION - 1
            if version > schema.LATEST_VERSION:
                raise LogError(
                    f"the job log {where} was written by a newer Shaftbench (log format v{version}, this "
                    f"version reads up to v{schema.LATEST_VERSION}); upgrade Shaftbench - it was left unchanged"
                )
            for step in range(version + 1, schema.LATEST_VERSION + 1):
                STEPS[step](conn)
                conn.execute(f"UPDATE {META_TABLE} SET value = %s WHERE key = 'schema_version'", (str(step),))

    @staticmethod
    def _version(conn: Any, where: str) -> int | None:
        """The log's schema version; None for a database with no tables (a new log). Refuses a
        database that holds tables but not our mark (read-only probes)."""
        has_meta = conn.execute("SELECT to_regclass(%s) IS NOT NULL", (META_TABLE,)).fetchone()[0]
        if not has_meta:
            tables = conn.execute(
                "SELECT count(*) FROM pg_tables WHERE schemaname = current_schema()"
            ).fetchone()[0]
            if tables:
                raise LogError(f"{where} holds other tables but no Shaftbench job log; it was left unchanged")
            return None
        rows = dict(conn.execute(f"SELECT key, value FROM {META_TABLE}").fetchall())
        if rows.get("application") != APPLICATION or not str(rows.get("schema_version", "")).isdigit():
            raise LogError(f"{where} holds a table {META_TABLE} that is not a Shaftbench job log's; "
                           "it was left unchanged")
        return int(rows["schema_version"])

    def close(self) -> None:
        if self._conn is not None:
            self._conn.close()
            self._conn = None

    @property
    def conn(self) -> Any:
        if self._conn is None:
            raise LogError("the job log is closed")
        return self._conn

    # -- the engine's part of the API ------------------------------------------------------

    @contextmanager
    def _write(self) -> Iterator[_Writer]:
        import psycopg

        try:
            with self.conn.transaction():
                yield _Writer(self.conn)
        except psycopg.Error as err:
            raise friendly(err, self._url) from None

    def _read(self, sql: str, params: Iterable[Any] = ()) -> list[tuple[Any, ...]]:
        import psycopg

        try:
            return self.conn.execute(_sql(sql), tuple(params)).fetchall()
        except psycopg.Error as err:
            raise friendly(err, self._url) from None

    def _insert(self, conn: _Writer, row: tuple[Any, ...]) -> int:
        return int(conn.execute(INSERT + " RETURNING id", row).fetchone()[0])

    def _uid_param(self, uid: uuid.UUID) -> uuid.UUID:
        return uid

    def _stream(self, sql: str) -> Iterator[tuple[Any, ...]]:
        import psycopg

        try:
            with self.conn.transaction():
                with self.conn.cursor(name="shaftbench_export") as cursor:
                    cursor.execute(_sql(sql))
                    while True:
                        batch = cursor.fetchmany(500)
                        if not batch:
                            return
                        yield from batch
        except psycopg.Error as err:
            raise friendly(err, self._url) from None

    def _text_clauses(self, text: str, clauses: list[str], params: list[Any]) -> tuple[str, list[Any]]:
        clauses, params = list(clauses), list(params)
        for word in filter_words(text):
            if len(word) >= schema.TEXT_INDEX_MIN_CHARS:
                clauses.append("search_text LIKE ?")  # the trigram index; backslash escapes, as in SQLite
                params.append(like_pattern(word))
            else:
                # pg_trgm takes no trigram from a 1-2 character word and would read its whole index:
                # strpos (the same test: the word is in the text) keeps such a word off the index
                clauses.append("strpos(search_text, ?) > 0")
                params.append(word)
        return (" WHERE " + " AND ".join(clauses) if clauses else ""), params

    def _page_ids(
        self, text: str, filters: tuple[Any, ...], clauses: list[str], params: list[Any],
        limit: int, offset: int,
    ) -> list[int]:
        where, params = self._text_clauses(text, clauses, params)
        rows = self._read(
            f"SELECT id FROM jobs{where} ORDER BY created_at DESC, id DESC LIMIT ? OFFSET ?",
            [*params, limit, offset],
        )
        return [int(row[0]) for row in rows]

    def _count_jobs(self, text: str, filters: tuple[Any, ...]) -> int:
        _, verdict, since, until, deleted = filters
        clauses, params, _ = self._filters(verdict, since, until, deleted)
        where, params = self._text_clauses(text, clauses, params)
        return int(self._read(f"SELECT count(*) FROM jobs{where}", params)[0][0])

    def bulk_insert(self, rows: Iterable[tuple[Any, ...]]) -> int:
        """Insert ready-made job rows (``values.job_row`` tuples with fresh uids) in one
        transaction with COPY, without looking for duplicates (benchmarks fill a log with it)."""
        import psycopg

        from workbench.store.values import INSERT_COLUMNS

        count = 0
        try:
            with self.conn.transaction():
                with self.conn.cursor().copy(
                    f"COPY jobs ({', '.join(INSERT_COLUMNS)}) FROM STDIN"
                ) as copy:
                    for row in rows:
                        copy.write_row(row)
                        count += 1
            self.conn.execute("VACUUM (ANALYZE) jobs")  # as autovacuum would: index-only counts
        except psycopg.Error as err:
            raise friendly(err, self._url) from None
        return count

    def integrity_ok(self) -> bool:
        """True if the log's mark and version are in place and every job row can be counted."""
        version = self._read(f"SELECT value FROM {META_TABLE} WHERE key = 'schema_version'")
        self._read("SELECT count(*) FROM jobs")
        return bool(version) and int(version[0][0]) == schema.LATEST_VERSION


def drop_log_tables(url: str) -> None:
    """Remove a PostgreSQL job log's tables (benchmarks and tests on a scratch database only)."""
    import psycopg

    with psycopg.connect(url, autocommit=True, connect_timeout=CONNECT_TIMEOUT_S) as conn:
        conn.execute(f"DROP TABLE IF EXISTS jobs, job_changes, {META_TABLE}")
