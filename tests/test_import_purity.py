"""The core is pure and start-up is light — proved in clean interpreters.

- ``workbench.core`` and every module under it import none of textual, rich, sqlite3, pint or the
  CLI. Only the numerical solver modules may import numpy/scipy; the closed-form modules may not.
- ``shaftbench --help`` / ``--version`` build no unit registry (pint is never imported) and load
  neither the workbench UI nor the job log.
"""

from __future__ import annotations

import json
import pkgutil
import subprocess
import sys
import textwrap

import pytest

import workbench.core

FORBIDDEN_IN_CORE = ("textual", "rich", "sqlite3", "_sqlite3", "pint", "workbench.cli", "workbench.units",
                     "workbench.specs", "workbench.job", "workbench.tui", "workbench.store", "workbench.report")
NUMERICAL = ("numpy", "scipy")
SOLVER_MODULES = {"workbench.core.torsion_solver", "workbench.core.profiles", "workbench.core.stress_map"}

CORE_MODULES = ["workbench.core"] + sorted(
    info.name for info in pkgutil.walk_packages(workbench.core.__path__, prefix="workbench.core.")
)


def loaded_after(code: str) -> set[str]:
    """Run ``code`` in a fresh interpreter (no site tweaks beyond the venv) and return sys.modules."""
    probe = code + "\nimport json, sys\nprint(json.dumps(sorted(sys.modules)))\n"
    proc = subprocess.run([sys.executable, "-c", probe], capture_output=True, text=True, timeout=120)
    assert proc.returncode == 0, proc.stderr
    return set(json.loads(proc.stdout.strip().splitlines()[-1]))


def hits(modules: set[str], names) -> list[str]:
    """Names in ``names`` that were imported, themselves or any submodule of them."""
    return sorted(n for n in names if any(m == n or m.startswith(n + ".") for m in modules))


def test_the_core_has_modules_to_check():
    assert {"workbench.core.checks", "workbench.core.drive", "workbench.core.evaluate"} <= set(CORE_MODULES)


@pytest.mark.parametrize("module", CORE_MODULES)
def test_core_module_is_pure(module):
    modules = loaded_after(f"import {module}")
    assert module in modules
    assert hits(modules, FORBIDDEN_IN_CORE) == []
    if module not in SOLVER_MODULES:
        assert hits(modules, NUMERICAL) == [], f"{module} pulls numpy/scipy; only the solver modules may"


def test_whole_core_evaluation_stays_pure():
    """Running a full check through the core (not just importing it) pulls nothing forbidden."""
    code = textwrap.dedent(
        """
        from workbench.core.checks import MaterialProps, Settings
        from workbench.core.drive import drive_loads
        from workbench.core.evaluate import ShaftCase, evaluate
        from workbench.core.geometry import ShaftGeometry
        from workbench.core.loads import Mount
        loads = drive_loads(power_W=7500.0, motor_speed_rpm=1460.0, ratio=3.2, efficiency=0.96,
                            service_factor=1.5, peak_factor=2.2)
        steel = MaterialProps("1045-cd", "1045 CD", 630e6, 530e6, 79.3e9, 7850.0)
        cases = [ShaftCase("existing", ShaftGeometry("round", 0.040, keyed=True), steel),
                 ShaftCase("candidate", ShaftGeometry("square", 0.040), steel)]
        checks, comparison = evaluate(loads, Mount("vbelt", 1.5, 0.2, 0.06), cases,
                                      Settings(1.5, "goodman", 0.9, None))
        assert len(checks) == 2 and comparison is not None
        """
    )
    modules = loaded_after(code)
    assert hits(modules, FORBIDDEN_IN_CORE) == []
    assert hits(modules, NUMERICAL) == []


def test_job_contract_import_builds_no_registry():
    """Importing the job contract (and units/specs) must not import pint: the registry is lazy."""
    modules = loaded_after("import workbench.job, workbench.specs, workbench.units")
    assert hits(modules, ("pint", "textual", "rich", "sqlite3")) == []


@pytest.mark.parametrize("argv", [["--help"], ["--version"], ["check", "--help"], ["stock", "--help"]])
def test_help_and_version_build_no_unit_registry(argv):
    code = textwrap.dedent(
        f"""
        import contextlib, io
        from workbench.cli import main
        with contextlib.redirect_stdout(io.StringIO()) as out:
            try:
                main({argv!r})
            except SystemExit as stop:
                assert stop.code in (0, None), stop.code
            else:
                raise AssertionError("--help/--version must exit")
        assert "shaftbench" in out.getvalue()
        """
    )
    modules = loaded_after(code)
    assert "pint" not in modules
    assert hits(modules, ("textual", "workbench.tui", "numpy", "scipy")) == []
