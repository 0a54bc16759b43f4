"""Forward migrations of the job log; each step runs in one transaction and keeps every row."""

from __future__ import annotations

import sqlite3
from collections.abc import Callable

from workbench.store import schema


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


STEPS: dict[int, Callable[[sqlite3.Connection], None]] = {1: _create_v1, 2: _v1_to_v2}
"""STEPS[n] brings a log from version n - 1 to version n."""


def user_version(conn: sqlite3.Connection) -> int:
    """The schema version recorded in the file (0 for a new, empty file)."""
    return int(conn.execute("PRAGMA user_version").fetchone()[0])


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
            STEPS[current + 1](conn)
            conn.execute(f"PRAGMA user_version = {current + 1}")
            conn.execute("COMMIT")
        except BaseException:
            conn.execute("ROLLBACK")
            raise
