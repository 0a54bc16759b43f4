"""The unsaved sheet kept as a draft file when the workbench stops unexpectedly.

If anything escapes (a bug), the app writes the sheet as typed to a small JSON file beside the job
log before it closes; the next start offers it back. A draft is only ever the fields as typed and
the asset/location/by/note of the job: nothing is computed from it until it is back on the sheet.
"""

from __future__ import annotations

import json
import os
import time
from pathlib import Path
from typing import Any

SUFFIX = ".draft.json"


def draft_path(log_path: str | None) -> Path:
    """The draft file that belongs to the job log ``log_path`` (the default log when None)."""
    if log_path:
        log = Path(log_path).expanduser()
    else:
        from workbench.store.paths import default_log_path

        log = default_log_path()
    return log.with_name(log.name + SUFFIX)


def save_draft(path: Path, inputs: dict[str, str], meta: dict[str, str], reason: str) -> bool:
    """Write the draft atomically (a temporary file renamed over it); False if it cannot be
    written (the app is already stopping: nothing more can be done)."""
    record = {
        "kept_at": time.strftime("%Y-%m-%d %H:%M %Z"),
        "reason": reason[:300],
        "inputs": {str(k): str(v) for k, v in inputs.items()},
        "meta": {str(k): str(v) for k, v in meta.items()},
    }
    part = path.with_name(path.name + ".part")
    try:
        path.parent.mkdir(parents=True, exist_ok=True)
        with open(part, "w", encoding="utf-8") as handle:
            json.dump(record, handle, ensure_ascii=False)
        os.replace(part, path)
    except OSError:
        try:
            part.unlink()
        except OSError:
            pass
        return False
    return True


def load_draft(path: Path) -> dict[str, Any] | None:
    """The draft kept at ``path``, or None (no draft, or a file that is not one of ours)."""
    try:
        with open(path, encoding="utf-8") as handle:
            record = json.load(handle)
    except (OSError, ValueError):
        return None
    if not isinstance(record, dict) or not isinstance(record.get("inputs"), dict):
        return None
    inputs = {str(k): str(v) for k, v in record["inputs"].items()}
    meta = record.get("meta") if isinstance(record.get("meta"), dict) else {}
    return {"kept_at": str(record.get("kept_at", "")), "reason": str(record.get("reason", "")),
            "inputs": inputs, "meta": {str(k): str(v) for k, v in meta.items()}}


def discard_draft(path: Path) -> None:
    """Remove the draft (taken back, or declined)."""
    try:
        path.unlink()
    except OSError:
        pass
