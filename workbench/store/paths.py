"""Where the job log lives, and creating its file and folder private to the owner."""

from __future__ import annotations

import os
from pathlib import Path

ENV_VAR = "SHAFTBENCH_LOG"
"""Environment variable that names the job log file (overridden by ``--log PATH``)."""

FILE_NAME = "jobs.sqlite3"
URL_SCHEMES = ("postgresql://", "postgres://")
"""A log named by one of these is a shared PostgreSQL log (``--log postgresql://user@host:5432/db``)."""


def is_database_url(value: object) -> bool:
    """True if ``value`` names a PostgreSQL job log rather than a file."""
    return isinstance(value, str) and value.strip().lower().startswith(URL_SCHEMES)


def log_target(value: str | os.PathLike[str] | None) -> str | Path:
    """What a ``--log`` value (or None: ``$SHAFTBENCH_LOG``, else the default file) names: a
    PostgreSQL URL (str) or a file path (Path)."""
    if value is None or value == "":
        env = os.environ.get(ENV_VAR)
        if env is not None and is_database_url(env):
            return env.strip()
        return default_log_path()
    if is_database_url(value):
        return str(value).strip()
    return Path(value).expanduser()


def default_log_path() -> Path:
    """The job log file to use when none is given: ``$SHAFTBENCH_LOG``, else the user data folder.

    ``SHAFTBENCH_LOG`` set but empty is refused (a LogError), like ``--log ""``: an empty name
    must not quietly mean the default log.
    """
    env = os.environ.get(ENV_VAR)
    if env is not None:
        if not env.strip():
            from workbench.store import LogError

            raise LogError(f"{ENV_VAR} is set but empty: name a job log file, or unset it to use the default log")
        return Path(env).expanduser()
    from platformdirs import user_data_dir

    return Path(user_data_dir("shaftbench", appauthor=False)) / FILE_NAME


def make_private_dirs(folder: Path) -> None:
    """Create ``folder`` and any missing parents; folders created here get mode 0700."""
    missing: list[Path] = []
    probe = folder
    while not probe.exists():
        missing.append(probe)
        if probe.parent == probe:
            break
        probe = probe.parent
    for new in reversed(missing):
        try:
            new.mkdir(mode=0o700)
        except FileExistsError:  # made by another process meanwhile
            continue
        os.chmod(new, 0o700)  # mkdir's mode is filtered by the umask


def create_private_file(path: Path) -> bool:
    """Create ``path`` empty with mode 0600 unless it exists; True if this call created it."""
    try:
        fd = os.open(path, os.O_WRONLY | os.O_CREAT | os.O_EXCL, 0o600)
    except FileExistsError:
        return False
    os.close(fd)
    os.chmod(path, 0o600)
    return True
