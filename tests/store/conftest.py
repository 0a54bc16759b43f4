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
