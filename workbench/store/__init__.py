"""The SQLite job log: every checked job, its inputs as typed and its result."""

from workbench.store.log import (
    Difference,
    JobLog,
    JobRecord,
    LogError,
    Reopened,
    compare_results,
    default_log_path,
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
