"""The data tables travel with a non-editable install (they live in <repo>/data, not in the package)."""

from __future__ import annotations

import subprocess
import sys
import zipfile
from pathlib import Path

import pytest

REPO = Path(__file__).resolve().parents[2]


@pytest.mark.skipif(not (REPO / "pyproject.toml").is_file(), reason="needs the source checkout")
def test_wheel_carries_every_data_table(tmp_path):
    pytest.importorskip("hatchling")
    subprocess.run(
        [sys.executable, "-m", "pip", "wheel", "--no-deps", "--no-build-isolation", "-q", "-w", str(tmp_path), str(REPO)],
        check=True,
        capture_output=True,
    )
    wheel = next(tmp_path.glob("shaftbench-*.whl"))
    names = set(zipfile.ZipFile(wheel).namelist())
    for table in sorted([*(REPO / "data").glob("*.csv"), *(REPO / "data").glob("*.json")]):
        assert f"workbench/data/{table.name}" in names, table.name
    assert "workbench/core/tables.py" in names


def test_installed_layout_is_found_first(tmp_path, monkeypatch):
    """data_dir() prefers <package>/data (the wheel layout) over <repo>/data."""
    import shutil

    import workbench
    from workbench.core import tables

    package = tmp_path / "site" / "workbench"
    shutil.copytree(Path(workbench.__file__).parent, package, ignore=shutil.ignore_patterns("__pycache__"))
    shutil.copytree(REPO / "data", package / "data")
    code = (
        "import sys; sys.path.insert(0, sys.argv[1]);"
        "from workbench.core.tables import data_dir, materials;"
        "print(data_dir()); print(len(materials()))"
    )
    out = subprocess.run([sys.executable, "-c", code, str(tmp_path / "site")], check=True, capture_output=True,
                         text=True, cwd=tmp_path).stdout.split()
    assert Path(out[0]) == package / "data"
    assert int(out[1]) == len(tables.materials())
