"""Job log export and import files: JSON (a list of job objects) and CSV (one job a row).

CSV cells that a spreadsheet would run as a formula (starting ``=``, ``+``, ``-``, ``@``, tab or
carriage return, after any leading apostrophes) get one more leading apostrophe on export, and lose
exactly one on import, so the round trip is exact and opening the file in a spreadsheet is safe
(common practice, after the OWASP note on CSV injection).
"""

from __future__ import annotations

import csv
import io
import json
import re
from collections.abc import Iterable
from pathlib import Path
from typing import IO, Any

from workbench.store.log import LogError

CSV_FIELDS = (
    "id", "created_at", "updated_at", "program_version", "asset", "location", "by", "note",
    "verdict", "material", "fitted", "deleted_at", "inputs", "result",
)
_TEXT_FIELDS = ("program_version", "asset", "location", "by", "note", "material", "fitted")
_FORMULA = re.compile(r"^'*[=+\-@\t\r]")


def _guard(cell: str) -> str:
    return "'" + cell if _FORMULA.match(cell) else cell


def _unguard(cell: str) -> str:
    return cell[1:] if cell.startswith("'") and _FORMULA.match(cell) else cell


def write_json(rows: Iterable[dict[str, Any]], out: IO[str]) -> int:
    """Write jobs as a JSON list, one job per line; returns how many."""
    count = 0
    out.write("[")
    for row in rows:
        out.write(",\n" if count else "\n")
        out.write(json.dumps(row, ensure_ascii=False, sort_keys=True))
        count += 1
    out.write("\n]\n")
    return count


def write_csv(rows: Iterable[dict[str, Any]], out: IO[str]) -> int:
    """Write jobs as CSV (inputs and result as JSON text in their cells); returns how many."""
    writer = csv.DictWriter(out, fieldnames=CSV_FIELDS, lineterminator="\n")
    writer.writeheader()
    count = 0
    for row in rows:
        cells = {name: row.get(name) for name in CSV_FIELDS}
        for name in _TEXT_FIELDS:
            cells[name] = _guard(cells[name] or "")
        cells["deleted_at"] = cells["deleted_at"] or ""
        cells["inputs"] = json.dumps(row["inputs"], ensure_ascii=False, sort_keys=True)
        cells["result"] = json.dumps(row["result"], ensure_ascii=False, sort_keys=True)
        writer.writerow(cells)
        count += 1
    return count


def read_jobs(text: str, *, name: str = "the file") -> list[dict[str, Any]]:
    """Jobs from the text of a JSON or CSV export (told apart by the first character)."""
    stripped = text.lstrip("\ufeff \t\r\n")
    if stripped.startswith("[") or stripped.startswith("{"):
        try:
            data = json.loads(stripped)
        except json.JSONDecodeError as err:
            raise LogError(f"{name} is not valid JSON (line {err.lineno}: {err.msg})") from None
        if isinstance(data, dict):
            data = data.get("jobs")
        if not isinstance(data, list):
            raise LogError(f"{name}: expected a list of jobs")
        return data
    reader = csv.DictReader(io.StringIO(stripped, newline=""))
    if not reader.fieldnames or not {"inputs", "result"} <= set(reader.fieldnames):
        raise LogError(f"{name} is neither a JSON nor a CSV job export (no inputs/result columns)")
    rows: list[dict[str, Any]] = []
    for number, cells in enumerate(reader, start=2):
        row: dict[str, Any] = dict(cells)
        for name_ in _TEXT_FIELDS:
            if isinstance(row.get(name_), str):
                row[name_] = _unguard(row[name_])
        try:
            row["inputs"] = json.loads(row["inputs"] or "null")
            row["result"] = json.loads(row["result"] or "null")
        except json.JSONDecodeError as err:
            raise LogError(f"{name} line {number}: inputs/result is not valid JSON ({err.msg})") from None
        row["deleted_at"] = row.get("deleted_at") or None
        rows.append(row)
    return rows


def read_jobs_file(path: Path) -> list[dict[str, Any]]:
    """Jobs from an export file; a missing or unreadable file is a LogError."""
    try:
        text = Path(path).read_text(encoding="utf-8")
    except FileNotFoundError:
        raise LogError(f"there is no file {path}") from None
    except (OSError, UnicodeDecodeError) as err:
        raise LogError(f"cannot read {path}: {getattr(err, 'strerror', None) or err}") from None
    return read_jobs(text, name=str(path))
