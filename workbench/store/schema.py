"""The job log's tables, one statement list per schema version.

The version is kept in ``PRAGMA user_version``; ``PRAGMA application_id`` marks the file as ours so
that another program's SQLite file is never taken for a job log.
"""

from __future__ import annotations

APPLICATION_ID = 0x53424A4C  # "SBJL": Shaftbench job log
LATEST_VERSION = 2

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

JOB_COLUMNS = (
    "id", "created_at", "updated_at", "program_version", "asset", "location", "by", "note",
    "verdict", "material", "fitted", "deleted_at", "inputs_json", "result_json",
)
"""Columns of a job row at the latest version, in the order JobRecord is built from."""


def search_text(asset: str, location: str, note: str, material: str) -> str:
    """The case-folded text a job is found by: asset, location, notes and material."""
    return "\n".join((asset, location, note, material)).casefold()
