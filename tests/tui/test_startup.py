"""Start-up stays light: opening the workbench module pulls in no numpy, scipy, pint or core."""

from __future__ import annotations

import json
import subprocess
import sys

HEAVY = ("numpy", "scipy", "pint", "workbench.job", "workbench.core", "sqlite3")


def test_importing_the_app_leaves_heavy_modules_unloaded():
    code = (
        "import json, sys; import workbench.tui.app; "
        f"print(json.dumps([m for m in {HEAVY!r} if m in sys.modules]))"
    )
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True)
    assert json.loads(out.stdout) == []
