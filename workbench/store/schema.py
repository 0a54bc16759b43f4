"""The job log's tables, one statement list per schema version.

The version is kept in ``PRAGMA user_version``; ``PRAGMA application_id`` marks the file as ours so
that another program's SQLite file is never taken for a job log.
"""

from __future__ import annotations

APPLICATION_ID = 0x53424A4C  # "SBJL": Shaftbench job log
LATEST_VERSION = 6
PAGE_SIZE = 8192
"""Bytes per page of a new log file (SQLite's default is 4096): a job row is about 800 bytes, and
larger pages leave less unused room at the end of each (measured: bench/bench_log.py)."""

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
# reads the text from jobs.search_text (through the view below); three triggers keep it in step
# with every insert, update and delete (save, update, delete, restore, purge, import and any older
# code path alike), inside the same transaction. SQLite builds without FTS5 or its trigram tokenizer (added in SQLite 3.34) reach
# version 3 without the index and filter with LIKE; see migrations.ensure_text_index.
TEXT_INDEX = "jobs_text"
TEXT_TRIGGERS = ("jobs_text_insert", "jobs_text_delete", "jobs_text_update")
TEXT_PAD = "char(10, 10)"
"""What the index appends to every job's text (SQL): two line breaks, so that every character is the
first of some trigram and a word of one or two characters is found through the trigrams it begins
(text_search.py). A filter word never holds a line break, so the padding matches nothing itself."""
TEXT_SOURCE = "jobs_text_source"
TEXT_SOURCE_CREATE = (
    f"CREATE VIEW {TEXT_SOURCE}(id, search_text) AS SELECT id, search_text || {TEXT_PAD} FROM jobs"
)
# Layout 2 of the index: detail=none keeps only which jobs hold each trigram, not
# where (a third of the size of layout 1's detail=full); the content is the padded view above.
# A word of three or more characters is looked up as all of its trigrams and confirmed with LIKE
# (the trigrams may sit apart); an older Shaftbench reading a layout-2 index falls back to LIKE.
TEXT_INDEX_CREATE = (
    f"CREATE VIRTUAL TABLE {TEXT_INDEX} USING fts5("
    f"search_text, content='{TEXT_SOURCE}', content_rowid='id', tokenize='trigram', columnsize=0, "
    "detail=none)"
)
TEXT_INDEX_LAYOUT_MARK = f"content='{TEXT_SOURCE}'"
"""Found in the index's CREATE statement (sqlite_master.sql) only in layout 2."""
TEXT_INDEX_TRIGGERS = (
    f"""
    CREATE TRIGGER {TEXT_TRIGGERS[0]} AFTER INSERT ON jobs BEGIN
        INSERT INTO {TEXT_INDEX}(rowid, search_text) VALUES (new.id, new.search_text || {TEXT_PAD});
    END
    """,
    f"""
    CREATE TRIGGER {TEXT_TRIGGERS[1]} AFTER DELETE ON jobs BEGIN
        INSERT INTO {TEXT_INDEX}({TEXT_INDEX}, rowid, search_text)
            VALUES ('delete', old.id, old.search_text || {TEXT_PAD});
    END
    """,
    f"""
    CREATE TRIGGER {TEXT_TRIGGERS[2]} AFTER UPDATE OF id, search_text ON jobs BEGIN
        INSERT INTO {TEXT_INDEX}({TEXT_INDEX}, rowid, search_text)
            VALUES ('delete', old.id, old.search_text || {TEXT_PAD});
        INSERT INTO {TEXT_INDEX}(rowid, search_text) VALUES (new.id, new.search_text || {TEXT_PAD});
    END
    """,
)
TEXT_INDEX_REBUILD = f"INSERT INTO {TEXT_INDEX}({TEXT_INDEX}) VALUES ('rebuild')"
TEXT_INDEX_CHECK = f"INSERT INTO {TEXT_INDEX}({TEXT_INDEX}) VALUES ('integrity-check')"
TEXT_INDEX_MIN_CHARS = 3
"""The index's tokens are trigrams: a word of three characters or more is looked up by its own
trigrams; a shorter word by the trigrams that begin with it (layout 2) or with LIKE."""
TEXT_TERMS = "jobs_text_terms"
TEXT_TERMS_CREATE = (
    f"CREATE VIRTUAL TABLE IF NOT EXISTS temp.{TEXT_TERMS} USING fts5vocab(main, {TEXT_INDEX}, 'row')"
)
"""The index's trigrams (one row each), a per-connection table in ``temp`` (the file is not touched)."""

# Version 4: how a job ended, kept with the time of each change. ``fitted_on`` and
# ``outcome_date`` are ISO dates (YYYY-MM-DD) or empty; ``outcome`` is empty, still-running, failed
# or removed. Every change made after the save (notes, outcome, a recomputed result) adds a row to
# job_changes: when, which field, the value before and after. search_text is rebuilt for every job
# from the wider set of words in workbench/store/search_words.py (specs, who, fitted, verdict...).
V3_TO_V4 = (
    "ALTER TABLE jobs ADD COLUMN fitted_on TEXT NOT NULL DEFAULT ''",
    "ALTER TABLE jobs ADD COLUMN outcome TEXT NOT NULL DEFAULT ''",
    "ALTER TABLE jobs ADD COLUMN outcome_date TEXT NOT NULL DEFAULT ''",
    """
    CREATE TABLE job_changes (
        id          INTEGER PRIMARY KEY AUTOINCREMENT,
        job_id      INTEGER NOT NULL,
        changed_at  TEXT NOT NULL,
        field       TEXT NOT NULL,
        old_value   TEXT NOT NULL DEFAULT '',
        new_value   TEXT NOT NULL DEFAULT ''
    )
    """,
    "CREATE INDEX job_changes_job ON job_changes(job_id, id)",
)

V4_COLUMNS = (
    "id", "created_at", "updated_at", "program_version", "asset", "location", "by", "note",
    "verdict", "material", "fitted", "deleted_at", "inputs_json", "result_json",
    "fitted_on", "outcome", "outcome_date",
)
"""Columns of a job row at version 4 (what the v4 -> v5 step reads)."""

# Version 5: the inputs and the whole result in one compressed blob (payload.py), a client-made
# unique id (uid: a save resent after a lost answer, or an import run twice, adds nothing), the
# bench that saved the job and where an imported job came from (origin: "<bench> #<id>"), and
# updated_at NULL while it equals created_at. jobs_created is gone (the import finds jobs by uid);
# counts by verdict and bin are kept by triggers. One definition of each table serves every engine:
# (column, kind); KINDS renders a kind per engine; each engine adds its own indexes.
JOBS_V5 = (
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
    ("fitted_on", "text"),
    ("outcome", "text"),
    ("outcome_date", "text"),
)
JOB_CHANGES_V5 = (
    ("id", "id"),
    ("job_id", "ref"),
    ("changed_at", "time"),
    ("field", "text"),
    ("old_value", "text"),
    ("new_value", "text"),
)
TABLES_V5 = {"jobs": JOBS_V5, "job_changes": JOB_CHANGES_V5}

# Version 6: the asset's tag key (workbench/core/asset_history.tag_key: case, spaces, separators
# and leading zeros ignored) in its own column with an index, so that an asset's history is found
# by index instead of by reading every job's asset text.
JOBS_V6 = (*JOBS_V5, ("asset_key", "text"))
TABLES = {5: TABLES_V5, 6: {"jobs": JOBS_V6, "job_changes": JOB_CHANGES_V5}}
ASSET_INDEX = "CREATE INDEX jobs_asset ON jobs(asset_key) WHERE asset_key <> ''"
KINDS = {
    "sqlite": {
        "id": "INTEGER PRIMARY KEY AUTOINCREMENT", "ref": "INTEGER NOT NULL", "uid": "BLOB NOT NULL",
        "time": "TEXT NOT NULL", "time?": "TEXT", "text": "TEXT NOT NULL DEFAULT ''", "blob": "BLOB NOT NULL",
    },
    "postgresql": {
        "id": "BIGINT GENERATED BY DEFAULT AS IDENTITY PRIMARY KEY", "ref": "BIGINT NOT NULL",
        "uid": "UUID NOT NULL", "time": "TEXT NOT NULL", "time?": "TEXT",
        "text": "TEXT NOT NULL DEFAULT ''", "blob": "BYTEA NOT NULL",
    },
}


def table_ddl(engine: str, table: str, name: str | None = None, version: int = LATEST_VERSION) -> str:
    """CREATE TABLE for a table (``jobs`` or ``job_changes``) as of ``version`` (5 or later) on
    ``engine`` ("sqlite" or "postgresql"), named ``name`` (default: the table's own name)."""
    kinds = KINDS[engine]
    body = ",\n    ".join(f"{column} {kinds[kind]}" for column, kind in TABLES[version][table])
    return f"CREATE TABLE {name or table} (\n    {body}\n)"


SQLITE_V5_INDEXES = (
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
    "verdict", "material", "fitted", "deleted_at", "payload", "fitted_on", "outcome", "outcome_date",
    "uid", "bench", "origin",
)
"""Columns of a job row at the latest version, in the order JobRecord is built from."""
COLUMN_ADDED_IN = {"fitted": 2, "deleted_at": 2, "fitted_on": 4, "outcome": 4, "outcome_date": 4,
                   "payload": 5, "uid": 5, "bench": 5, "origin": 5, "asset_key": 6}
"""The version that added each column after version 1 (a read-only older log is read without them)."""


def search_text(asset: str, location: str, note: str, material: str) -> str:
    """The case-folded search text of versions 2 and 3: asset, location, notes and material (the
    v1 -> v2 step fills it; v4 and later use text_search.job_search_text)."""
    return "\n".join((asset, location, note, material)).casefold()
