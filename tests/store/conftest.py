"""Fixtures for the job log tests."""

from __future__ import annotations

from pathlib import Path

import pytest

from workbench.demo import DEMO_META


@pytest.fixture
def log_path(tmp_path: Path) -> Path:
    """A job log path in a folder that does not exist yet."""
    return tmp_path / "logs" / "jobs.sqlite3"


@pytest.fixture
def demo_meta() -> dict:
    return dict(DEMO_META)


# -- PostgreSQL: a real server (.ci/pg_cluster.sh starts one; .ci/run exports its URL) -----------

import os  # noqa: E402
import uuid  # noqa: E402

PG_URL_VAR = "SHAFTBENCH_TEST_PG_URL"


@pytest.fixture(scope="session")
def pg_server_url() -> str:
    """The test server's URL; the PostgreSQL tests skip without it, except in CI, where they fail."""
    url = os.environ.get(PG_URL_VAR, "").strip()
    if not url:
        if os.environ.get("SHAFTBENCH_CI"):
            pytest.fail(f"{PG_URL_VAR} is not set in CI: the PostgreSQL tests must run there")
        pytest.skip(f"no PostgreSQL test server ({PG_URL_VAR} not set; .ci/pg_cluster.sh start makes one)")
    return url


def _with_database(url: str, name: str) -> str:
    head, _, _ = url.rpartition("/")
    return f"{head}/{name}"


@pytest.fixture
def pg_url(pg_server_url: str):
    """A URL of a new, empty database on the test server (dropped afterwards)."""
    import psycopg

    name = "t_" + uuid.uuid4().hex[:12]
    with psycopg.connect(pg_server_url, autocommit=True) as admin:
        admin.execute(f"CREATE DATABASE {name}")
    yield _with_database(pg_server_url, name)
    with psycopg.connect(pg_server_url, autocommit=True) as admin:
        admin.execute(f"DROP DATABASE IF EXISTS {name} WITH (FORCE)")


@pytest.fixture(params=["sqlite", "postgresql"])
def log_target(request, tmp_path: Path) -> str:
    """A job log of each engine: a new SQLite file, or a new PostgreSQL database."""
    if request.param == "sqlite":
        return str(tmp_path / "logs" / "jobs.sqlite3")
    return request.getfixturevalue("pg_url")
