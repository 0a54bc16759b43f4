"""Forward migrations of the job log; each step runs in one transaction and keeps every row."""

from __future__ import annotations

import sqlite3
from collections.abc import Callable

from workbench.store import schema
from workbench.store.records import LogError


def _create_v1(conn: sqlite3.Connection) -> None:
    for statement in schema.V1:
        conn.execute(statement)
    conn.execute(f"PRAGMA application_id = {schema.APPLICATION_ID}")


def _v1_to_v2(conn: sqlite3.Connection) -> None:
    for statement in schema.V1_TO_V2:
        conn.execute(statement)
    rows = conn.execute("SELECT id, asset, location, note, material FROM jobs").fetchall()
    conn.executemany(
        "UPDATE jobs SET search_text = ? WHERE id = ?",
        ((schema.search_text(a, l, n, m), job_id) for job_id, a, l, n, m in rows),
    )


def _v2_to_v3(conn: sqlite3.Connection) -> None:
    # Without FTS5/trigram the log still becomes v3 (no table changes are needed for LIKE); the
    # index is built by ensure_text_index the first time a capable SQLite opens the file.
    if text_index_supported():
        build_text_index(conn)


def _v3_to_v4(conn: sqlite3.Connection) -> None:
    import json

    from workbench.store.search_words import job_search_text

    for statement in schema.V3_TO_V4:
        conn.execute(statement)

    def loaded(text: object) -> object:
        try:
            return json.loads(text) if isinstance(text, str) else None
        except (ValueError, RecursionError):
            return None  # a damaged row keeps what can be read; the log reports it when listed

    rows = conn.execute(
        "SELECT id, asset, location, by, note, material, fitted, inputs_json, result_json FROM jobs"
    ).fetchall()
    conn.executemany(
        "UPDATE jobs SET search_text = ? WHERE id = ?",
        (
            (job_search_text(dict(asset=a, location=l, by=b, note=n, material=m, fitted=f),
                             loaded(i), loaded(r)), job_id)
            for job_id, a, l, b, n, m, f, i, r in rows
        ),
    )


def _create_latest(conn: sqlite3.Connection) -> None:
    """A new, empty log at the latest version (what the steps from 1 would make, without them)."""
    conn.execute(f"PRAGMA application_id = {schema.APPLICATION_ID}")
    conn.execute(schema.table_ddl("sqlite", "jobs"))
    conn.execute(schema.table_ddl("sqlite", "job_changes"))
    conn.execute("CREATE INDEX job_changes_job ON job_changes(job_id, id)")
    for statement in (*schema.SQLITE_V5_INDEXES, *schema.SQLITE_COUNTS, schema.ASSET_INDEX):
        conn.execute(statement)
    if text_index_supported():
        build_text_index(conn)


def fill_asset_keys(conn: object) -> None:
    """Set every job's asset_key from its asset text (the v5 -> v6 step of either engine; ``conn``
    runs neutral SQL with ``?`` parameters)."""
    from workbench.core.asset_history import tag_key

    rows = conn.execute("SELECT id, asset FROM jobs WHERE asset <> ''", ()).fetchall()
    for job_id, asset in rows:
        key = tag_key(asset)
        if key:
            conn.execute("UPDATE jobs SET asset_key = ? WHERE id = ?", (key, job_id))


def _v5_to_v6(conn: sqlite3.Connection) -> None:
    conn.execute("ALTER TABLE jobs ADD COLUMN asset_key TEXT NOT NULL DEFAULT ''")
    fill_asset_keys(conn)
    conn.execute(schema.ASSET_INDEX)


def _v4_to_v5(conn: sqlite3.Connection) -> None:
    """Rebuild the jobs table in the v5 shape: inputs and result in one compressed payload, a uid
    per job (its content id, so an older export of the same job is still recognised), updated_at
    NULL while it equals created_at; ids, the id sequence and the change history are kept. The text
    index is rebuilt and the counts table filled. A row whose stored JSON cannot be read is kept as
    it was stored (payload format 0 holding the two texts; it reads as damaged, as before), so
    nothing is dropped."""
    import json
    import uuid

    from workbench.store import payload
    from workbench.store.values import content_uid

    sequence = conn.execute("SELECT seq FROM sqlite_sequence WHERE name = 'jobs'").fetchone()
    for trigger in schema.TEXT_TRIGGERS:
        conn.execute(f"DROP TRIGGER IF EXISTS {trigger}")
    conn.execute(f"DROP TABLE IF EXISTS {schema.TEXT_INDEX}")
    conn.execute(f"DROP VIEW IF EXISTS {schema.TEXT_SOURCE}")
    conn.execute(schema.table_ddl("sqlite", "jobs", "jobs_v5", version=5))
    columns = [c for c, _ in schema.JOBS_V5]
    insert = f"INSERT INTO jobs_v5 ({', '.join(columns)}) VALUES ({', '.join('?' * len(columns))})"
    seen: set[bytes] = set()
    cursor = conn.execute(f"SELECT {', '.join(schema.V4_COLUMNS)}, search_text FROM jobs ORDER BY id")
    while True:
        batch = cursor.fetchmany(1000)
        if not batch:
            break
        rows = []
        for (job_id, created, updated, version, asset, location, by, note, verdict, material, fitted,
             deleted_at, inputs_json, result_json, fitted_on, outcome, outcome_date, text) in batch:
            try:
                inputs, result = json.loads(inputs_json), json.loads(result_json)
                blob = payload.encode(inputs, result)
                uid = content_uid(created, inputs, result).bytes
            except (ValueError, TypeError, RecursionError, LogError):
                blob = bytes([payload.FORMAT_PLAIN]) + f"{inputs_json}\x00{result_json}".encode()
                uid = uuid.uuid4().bytes
            if uid in seen:  # the same job saved twice in the same microsecond: keep both
                uid = uuid.uuid4().bytes
            seen.add(uid)
            rows.append((job_id, uid, created, None if updated == created else updated, version or "", "", "",
                         asset or "", location or "", by or "", note or "", verdict or "", material or "",
                         fitted or "", deleted_at, blob, text or "", fitted_on or "", outcome or "",
                         outcome_date or ""))
        conn.executemany(insert, rows)
    conn.execute("DROP TABLE jobs")
    conn.execute("ALTER TABLE jobs_v5 RENAME TO jobs")
    if sequence is not None:
        conn.execute("DELETE FROM sqlite_sequence WHERE name = 'jobs'")
        conn.execute("INSERT INTO sqlite_sequence (name, seq) VALUES ('jobs', ?)", (sequence[0],))
    for statement in (*schema.SQLITE_V5_INDEXES, *schema.SQLITE_COUNTS, schema.COUNTS_FILL):
        conn.execute(statement)
    if text_index_supported():
        build_text_index(conn)


STEPS: dict[int, Callable[[sqlite3.Connection], None]] = {
    1: _create_v1, 2: _v1_to_v2, 3: _v2_to_v3, 4: _v3_to_v4, 5: _v4_to_v5, 6: _v5_to_v6,
}
"""STEPS[n] brings a log from version n - 1 to version n."""


def user_version(conn: sqlite3.Connection) -> int:
    """The schema version recorded in the file (0 for a new, empty file)."""
    return int(conn.execute("PRAGMA user_version").fetchone()[0])


def version_from_tables(conn: sqlite3.Connection) -> int | None:
    """The schema version a log's tables show, for a file of ours whose ``user_version`` was lost
    (reset to 0 by another tool): the newest version whose every column and table is there, or
    None if there is no jobs table of ours at all."""
    columns = {row[1] for row in conn.execute("PRAGMA table_info(jobs)")}
    tables = {row[0] for row in conn.execute("SELECT name FROM sqlite_master WHERE type = 'table'")}
    if {"id", "uid", "payload", "bench"} <= columns and "job_changes" in tables:
        return 6 if "asset_key" in columns else 5
    if not {"id", "created_at", "inputs_json", "result_json"} <= columns:
        return None
    if {"fitted_on", "outcome", "outcome_date"} <= columns and "job_changes" in tables:
        return 4
    if {"fitted", "deleted_at", "search_text"} <= columns:
        return 3 if schema.TEXT_INDEX in tables else 2
    return 1


def migrate(conn: sqlite3.Connection, target: int = schema.LATEST_VERSION) -> int:
    """Bring the log up to ``target``, one transaction per step; returns the version reached.

    ``conn`` must be in autocommit mode (``isolation_level=None``). Each step re-reads the version
    inside its write lock, so two processes opening a new log at once do not both create it.
    """
    while True:
        if user_version(conn) >= target:
            return user_version(conn)
        conn.execute("BEGIN IMMEDIATE")
        try:
            current = user_version(conn)
            if current >= target:
                conn.execute("ROLLBACK")
                return current
            if current == 0 and target == schema.LATEST_VERSION:
                _create_latest(conn)  # a new log is made at the latest version in one step
                reached = target
            else:
                STEPS[current + 1](conn)
                reached = current + 1
            conn.execute(f"PRAGMA user_version = {reached}")
            conn.execute("COMMIT")
        except BaseException:
            conn.execute("ROLLBACK")
            raise


# --------------------------------------------------------------------------------------------
# the trigram text index (schema v3)

_trigram_available: bool | None = None


def text_index_supported() -> bool:
    """True if this Python's SQLite has FTS5 with the trigram tokenizer (SQLite >= 3.34).

    Probed once per process on a private in-memory database, so the log file is never touched.
    """
    global _trigram_available
    if _trigram_available is None:
        probe = sqlite3.connect(":memory:")
        try:
            probe.execute("CREATE VIRTUAL TABLE probe USING fts5(x, tokenize='trigram')")
            _trigram_available = True
        except sqlite3.Error:
            _trigram_available = False
        finally:
            probe.close()
    return _trigram_available


def _text_index_parts(conn: sqlite3.Connection) -> set[str]:
    """The parts of the text index present in the file; the index counts only in layout 2."""
    names = (schema.TEXT_INDEX, schema.TEXT_SOURCE, *schema.TEXT_TRIGGERS)
    rows = conn.execute(
        f"SELECT name, sql FROM sqlite_master WHERE name IN ({', '.join('?' * len(names))})", names
    ).fetchall()
    return {
        name for name, sql in rows
        if name != schema.TEXT_INDEX or schema.TEXT_INDEX_LAYOUT_MARK in (sql or "")
    }


def text_index_current(conn: sqlite3.Connection) -> bool:
    """True if the file holds the text index in today's layout with its view and triggers."""
    return _text_index_parts(conn) == {schema.TEXT_INDEX, schema.TEXT_SOURCE, *schema.TEXT_TRIGGERS}


def build_text_index(conn: sqlite3.Connection) -> None:
    """(Re)create the index, its view and triggers and fill it from jobs.search_text (caller's
    transaction). An index in an older layout is replaced."""
    for trigger in schema.TEXT_TRIGGERS:
        conn.execute(f"DROP TRIGGER IF EXISTS {trigger}")
    conn.execute(f"DROP TABLE IF EXISTS {schema.TEXT_INDEX}")
    conn.execute(f"DROP VIEW IF EXISTS {schema.TEXT_SOURCE}")
    conn.execute(schema.TEXT_SOURCE_CREATE)
    conn.execute(schema.TEXT_INDEX_CREATE)
    for statement in schema.TEXT_INDEX_TRIGGERS:
        conn.execute(statement)
    conn.execute(schema.TEXT_INDEX_REBUILD)


def ensure_text_index(conn: sqlite3.Connection) -> bool:
    """Make the text index of a v3 or later log usable if this SQLite can; returns True if it is.

    The index counts as current only in today's layout (schema.TEXT_INDEX_CREATE) with its view
    and all three triggers; an index in an older layout is rebuilt once, in one transaction (about
    40 seconds per million jobs, measured). If this SQLite lacks FTS5 or the trigram tokenizer, the
    triggers are dropped (so that saving still works here) and searching falls back to LIKE; the
    next capable SQLite finds the triggers missing and rebuilds the index from ``jobs.search_text``.
    ``conn`` must be in autocommit mode, as for ``migrate``.
    """
    supported = text_index_supported()
    if supported and text_index_current(conn):
        return True
    if not supported and not _text_index_parts(conn) & set(schema.TEXT_TRIGGERS):
        return False
    conn.execute("BEGIN IMMEDIATE")
    try:
        if supported and not text_index_current(conn):
            build_text_index(conn)
        elif not supported:
            for trigger in schema.TEXT_TRIGGERS:
                conn.execute(f"DROP TRIGGER IF EXISTS {trigger}")
        conn.execute("COMMIT")
    except BaseException:
        conn.execute("ROLLBACK")
        raise
    return supported
