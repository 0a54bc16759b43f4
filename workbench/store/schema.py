"""The job log's tables, one statement list per schema version.

SQLite keeps the version in ``PRAGMA user_version``; ``PRAGMA application_id`` marks the file as
ours so that another program's SQLite file is never taken for a job log. From version 4 the jobs
table is one definition (``JOBS_V4``) rendered for each engine (``jobs_table``); each engine adds
its own indexes.
"""

from __future__ import annotations

APPLICATION_ID = 0x53424A4C  # "SBJL": Shaftbench job log
LATEST_VERSION = 4

# Version 1: one row per job; inputs and result as JSON text.
V1 = (
    """
    CREATE TABLE jobs (
        id              INTEGER PRIMARY KEY AUTOINCREMENT,
        created_at      TEXT NOT NULL,
        updated_at      TEXT NOT NULL,
        program_version TEXT NOT NULL DEFAULT '',
        asset           TEXT NOT NULL DEFAULT '',
        location        TEXT NOT NULL DEFAULT '',
        by              TEXT NOT NULL DEFAULT '',
        note            TEXT NOT NULL DEFAULT '',
        verdict         TEXT NOT NULL DEFAULT '',
        material        TEXT NOT NULL DEFAULT '',
        inputs_json     TEXT NOT NULL,
        result_json     TEXT NOT NULL
    )
    """,
    "CREATE INDEX jobs_created ON jobs(created_at)",
)

# Version 2: soft delete, the fitted candidate, and a case-folded search column held in a narrow
# covering index so that listing and text filtering never read the JSON (jobs_created stays: the
# import looks jobs up by creation time).
V1_TO_V2 = (
    "ALTER TABLE jobs ADD COLUMN fitted TEXT NOT NULL DEFAULT ''",
    "ALTER TABLE jobs ADD COLUMN deleted_at TEXT",
    "ALTER TABLE jobs ADD COLUMN search_text TEXT NOT NULL DEFAULT ''",
    # search_text is filled by the migration code (Python casefold, not SQL lower()).
    "CREATE INDEX jobs_listing ON jobs(deleted_at, created_at, id, verdict, search_text)",
)

# Version 3: a trigram full-text index over search_text, so that a text filter reads a few index
# pages instead of every row. It is an FTS5 "external content" table: it stores only the index and
# reads the text from jobs.search_text; three triggers keep it in step with every insert, update and
# delete (save, update, delete, restore, purge, import and any older code path alike), inside the
# same transaction. SQLite builds without FTS5 or its trigram tokenizer (added in SQLite 3.34) reach
# version 3 without the index and filter with LIKE; see migrations.ensure_text_index.
TEXT_INDEX = "jobs_text"
TEXT_TRIGGERS = ("jobs_text_insert", "jobs_text_delete", "jobs_text_update")
TEXT_INDEX_CREATE = (
    f"CREATE VIRTUAL TABLE {TEXT_INDEX} USING fts5("
    "search_text, content='jobs', content_rowid='id', tokenize='trigram', columnsize=0)"
)
TEXT_INDEX_TRIGGERS = (
    f"""
    CREATE TRIGGER {TEXT_TRIGGERS[0]} AFTER INSERT ON jobs BEGIN
        INSERT INTO {TEXT_INDEX}(rowid, search_text) VALUES (new.id, new.search_text);
    END
    """,
    f"""
    CREATE TRIGGER {TEXT_TRIGGERS[1]} AFTER DELETE ON jobs BEGIN
        INSERT INTO {TEXT_INDEX}({TEXT_INDEX}, rowid, search_text) VALUES ('delete', old.id, old.search_text);
    END
    """,
    f"""
    CREATE TRIGGER {TEXT_TRIGGERS[2]} AFTER UPDATE OF id, search_text ON jobs BEGIN
        INSERT INTO {TEXT_INDEX}({TEXT_INDEX}, rowid, search_text) VALUES ('delete', old.id, old.search_text);
        INSERT INTO {TEXT_INDEX}(rowid, search_text) VALUES (new.id, new.search_text);
    END
    """,
)
TEXT_INDEX_REBUILD = f"INSERT INTO {TEXT_INDEX}({TEXT_INDEX}) VALUES ('rebuild')"
TEXT_INDEX_CHECK = f"INSERT INTO {TEXT_INDEX}({TEXT_INDEX}) VALUES ('integrity-check')"
TEXT_INDEX_MIN_CHARS = 3
"""A trigram index finds words of three characters or more; shorter words are matched with LIKE."""

V3_COLUMNS = (
    "id", "created_at", "updated_at", "program_version", "asset", "location", "by", "note",
    "verdict", "material", "fitted", "deleted_at", "inputs_json", "result_json",
)
"""Columns of a job row at version 3 (what the v3 -> v4 step reads)."""

# Version 4: the inputs and the whole result in one compressed blob (payload.py), a client-made
# unique id (uid: a save resent after a lost answer, or an import run twice, adds nothing), the
# bench that saved the job and where an imported job came from (origin: "<bench> #<id>"), and
# updated_at NULL while it equals created_at. jobs_created is gone (the import finds jobs by uid).
# One definition of the table serves every engine: (column, kind); KINDS renders a kind per engine.
JOBS_V4 = (
    ("id", "id"),
    ("uid", "uid"),
    ("created_at", "time"),
    ("updated_at", "time?"),
    ("program_version", "text"),
    ("bench", "text"),
    ("origin", "text"),
    ("asset", "text"),
    ("location", "text"),
    ("by", "text"),
    ("note", "text"),
    ("verdict", "text"),
    ("material", "text"),
    ("fitted", "text"),
    ("deleted_at", "time?"),
    ("payload", "blob"),
    ("search_text", "text"),
)
KINDS = {
    "sqlite": {
        "id": "INTEGER PRIMARY KEY AUTOINCREMENT", "uid": "BLOB NOT NULL", "time": "TEXT NOT NULL",
        "time?": "TEXT", "text": "TEXT NOT NULL DEFAULT ''", "blob": "BLOB NOT NULL",
    },
    "postgresql": {
        "id": "BIGINT GENERATED BY DEFAULT AS IDENTITY PRIMARY KEY", "uid": "UUID NOT NULL",
        "time": "TEXT NOT NULL", "time?": "TEXT", "text": "TEXT NOT NULL DEFAULT ''",
        "blob": "BYTEA NOT NULL",
    },
}


def jobs_table(engine: str, name: str = "jobs") -> str:
    """CREATE TABLE for the v4 jobs table on ``engine`` ("sqlite" or "postgresql")."""
    kinds = KINDS[engine]
    body = ",\n    ".join(f"{column} {kinds[kind]}" for column, kind in JOBS_V4)
    return f"CREATE TABLE {name} (\n    {body}\n)"


SQLITE_V4_INDEXES = (
    "CREATE UNIQUE INDEX jobs_uid ON jobs(uid)",
    "CREATE INDEX jobs_listing ON jobs(deleted_at, created_at, id, verdict, search_text)",
)

# Counts by verdict and bin state, kept by triggers in the same transaction as every change, so
# that the total of a million jobs is read from a few rows instead of counted.
COUNTS_TABLE = "job_counts"
COUNT_TRIGGERS = ("job_counts_insert", "job_counts_delete", "job_counts_update")
SQLITE_COUNTS = (
    f"""CREATE TABLE {COUNTS_TABLE} (
        verdict TEXT NOT NULL, in_bin INTEGER NOT NULL, n INTEGER NOT NULL,
        PRIMARY KEY (verdict, in_bin)
    ) WITHOUT ROWID""",
    f"""CREATE TRIGGER {COUNT_TRIGGERS[0]} AFTER INSERT ON jobs BEGIN
        INSERT INTO {COUNTS_TABLE} VALUES (new.verdict, new.deleted_at IS NOT NULL, 1)
            ON CONFLICT (verdict, in_bin) DO UPDATE SET n = n + 1;
    END""",
    f"""CREATE TRIGGER {COUNT_TRIGGERS[1]} AFTER DELETE ON jobs BEGIN
        UPDATE {COUNTS_TABLE} SET n = n - 1 WHERE verdict = old.verdict AND in_bin = (old.deleted_at IS NOT NULL);
    END""",
    f"""CREATE TRIGGER {COUNT_TRIGGERS[2]} AFTER UPDATE OF verdict, deleted_at ON jobs BEGIN
        UPDATE {COUNTS_TABLE} SET n = n - 1 WHERE verdict = old.verdict AND in_bin = (old.deleted_at IS NOT NULL);
        INSERT INTO {COUNTS_TABLE} VALUES (new.verdict, new.deleted_at IS NOT NULL, 1)
            ON CONFLICT (verdict, in_bin) DO UPDATE SET n = n + 1;
    END""",
)
COUNTS_FILL = (
    f"INSERT INTO {COUNTS_TABLE} SELECT verdict, deleted_at IS NOT NULL, count(*) FROM jobs "
    "GROUP BY 1, 2"
)

JOB_COLUMNS = (
    "id", "created_at", "updated_at", "program_version", "asset", "location", "by", "note",
    "verdict", "material", "fitted", "deleted_at", "payload", "uid", "bench", "origin",
)
"""Columns of a job row at the latest version, in the order JobRecord is built from."""


def search_text(asset: str, location: str, note: str, material: str) -> str:
    """The case-folded text a job is found by: asset, location, notes and material."""
    return "\n".join((asset, location, note, material)).casefold()
