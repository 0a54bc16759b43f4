"""Job log export and import files: JSON (a list of job objects, for round trips) and a flat CSV
(one job a row, one figure a column, for a spreadsheet).

The JSON export holds everything and ``log import`` takes it back. The CSV holds what a planner
reads - the drive, each shaft's spec, material, safety factors and verdict, the governing check, what
was fitted and how it ended - in plain columns with the unit in each heading; it is not read back
(CSV files made by older versions, with ``inputs``/``result`` columns, still are).

CSV cells that a spreadsheet would run as a formula (starting ``=``, ``+``, ``-``, ``@``, tab or
carriage return, after any leading apostrophes) get one more leading apostrophe on export, and lose
exactly one on import, so the round trip is exact and opening the file in a spreadsheet is safe
(common practice, after the OWASP note on CSV injection).
"""

from __future__ import annotations

import csv
import io
import json
import math
import re
from collections.abc import Callable, Iterable, Mapping
from pathlib import Path
from typing import IO, Any

from workbench.store.log import LogError

CSV_FIELDS = (
    "id", "created_at", "updated_at", "program_version", "asset", "location", "by", "note",
    "verdict", "material", "fitted", "deleted_at", "inputs", "result",
)
"""Columns of the CSV files of older versions (inputs and result as JSON text), still imported."""
_TEXT_FIELDS = ("program_version", "asset", "location", "by", "note", "material", "fitted")
_FORMULA = re.compile(r"^'*[=+\-@\t\r]")


def _guard(cell: str) -> str:
    return "'" + cell if _FORMULA.match(cell) else cell


def _unguard(cell: str) -> str:
    return cell[1:] if cell.startswith("'") and _FORMULA.match(cell) else cell


def strict_json(value: Any) -> Any:
    """``value`` with every NaN or infinite float replaced by None, so that the JSON written is
    strict (RFC 8259 has no NaN or Infinity; Python writes them, other readers refuse them)."""
    if isinstance(value, float):
        return value if math.isfinite(value) else None
    if isinstance(value, Mapping):
        return {key: strict_json(item) for key, item in value.items()}
    if isinstance(value, (list, tuple)):
        return [strict_json(item) for item in value]
    return value


def dumps_strict(value: Any, **options: Any) -> str:
    """``json.dumps`` of ``strict_json(value)``; never writes NaN or Infinity."""
    return json.dumps(strict_json(value), ensure_ascii=False, allow_nan=False, **options)


def loads_guarded(text: str, what: str) -> Any:
    """``json.loads`` whose every failure is a one-line LogError naming ``what``: bad JSON, nesting
    deeper than Python's recursion limit, integers longer than Python converts (4,300 digits)."""
    try:
        return json.loads(text)
    except json.JSONDecodeError as err:
        raise LogError(f"{what} is not valid JSON (line {err.lineno}: {err.msg})") from None
    except RecursionError:
        raise LogError(f"{what} is nested too deeply to read") from None
    except ValueError as err:  # e.g. an integer of more than 4,300 digits
        from workbench.text_cut import cut_words

        raise LogError(f"{what} holds a value that cannot be read ({cut_words(str(err), 80)})") from None


def write_json(rows: Iterable[dict[str, Any]], out: IO[str]) -> int:
    """Write jobs as a JSON list, one job per line; returns how many. Strict JSON: a NaN or
    infinite figure is written as null."""
    count = 0
    out.write("[")
    for row in rows:
        out.write(",\n" if count else "\n")
        out.write(dumps_strict(row, sort_keys=True))
        count += 1
    out.write("\n]\n")
    return count


def _figure(value: Any, scale: float = 1.0) -> str:
    """A number for a spreadsheet cell: six significant figures; empty when missing or not a number."""
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        return ""
    shown = value / scale
    if math.isnan(shown):
        return ""
    if math.isinf(shown):
        return "inf" if shown > 0 else "-inf"
    return f"{shown:.6g}"


def _shaft(result: Mapping[str, Any], role: str) -> Mapping[str, Any]:
    for shaft in result.get("shafts") or []:
        if isinstance(shaft, Mapping) and shaft.get("role") == role:
            return shaft
    return {}


def _section(result: Mapping[str, Any], name: str) -> Mapping[str, Any]:
    value = result.get(name)
    return value if isinstance(value, Mapping) else {}


def _deciding(result: Mapping[str, Any]) -> Mapping[str, Any]:
    return _shaft(result, "candidate") or _shaft(result, "existing")


_Cell = Callable[[Mapping[str, Any], Mapping[str, Any]], Any]
_JOB_COLUMNS: list[tuple[str, _Cell]] = [
    ("id", lambda row, r: row.get("id")),
    ("saved_utc", lambda row, r: row.get("created_at") or ""),
    ("changed_utc", lambda row, r: row.get("updated_at") or ""),
    ("asset", lambda row, r: row.get("asset") or ""),
    ("location", lambda row, r: row.get("location") or ""),
    ("checked_by", lambda row, r: row.get("by") or ""),
    ("verdict", lambda row, r: r.get("verdict") if isinstance(r.get("verdict"), str) else ""),
    ("governing_check", lambda row, r: _deciding(r).get("governing") or ""),
    ("why", lambda row, r: _deciding(r).get("why") or ""),
    ("power_kW", lambda row, r: _figure(_section(r, "drive").get("power_W"), 1000)),
    ("motor_speed_rpm", lambda row, r: _figure(_section(r, "drive").get("motor_speed_rpm"))),
    ("ratio", lambda row, r: _figure(_section(r, "drive").get("ratio"))),
    ("shaft_speed_rpm", lambda row, r: _figure(_section(r, "drive").get("shaft_speed_rpm"))),
    ("running_torque_Nm", lambda row, r: _figure(_section(r, "drive").get("running_torque_Nm"))),
    ("design_torque_Nm", lambda row, r: _figure(_section(r, "drive").get("design_torque_Nm"))),
    ("peak_torque_Nm", lambda row, r: _figure(_section(r, "drive").get("peak_torque_Nm"))),
    ("mount", lambda row, r: _section(r, "mount").get("element") or ""),
    ("side_load_N", lambda row, r: _figure(_section(r, "mount").get("side_load_N"))),
    ("bending_moment_Nm", lambda row, r: _figure(_section(r, "mount").get("bending_moment_Nm"))),
    ("required_sf", lambda row, r: _figure(_section(r, "settings").get("required_sf"))),
]
_SHAFT_COLUMNS: list[tuple[str, Callable[[Mapping[str, Any]], Any]]] = [
    ("spec", lambda s: s.get("spec") or ""),
    ("material", lambda s: s.get("material_name") or s.get("material") or ""),
    ("static_sf", lambda s: _figure(s.get("static_safety_factor"))),
    ("shear_yield_sf", lambda s: _figure(s.get("shear_yield_safety_factor"))),
    ("fatigue_sf", lambda s: _figure(s.get("fatigue_safety_factor"))),
    ("max_shear_MPa", lambda s: _figure(s.get("max_shear_stress_Pa"), 1e6)),
    ("von_mises_MPa", lambda s: _figure(s.get("von_mises_stress_Pa"), 1e6)),
    ("twist_deg_per_m", lambda s: _figure(s.get("twist_deg_per_m"))),
    ("mass_kg_per_m", lambda s: _figure(s.get("mass_kg_per_m"))),
    ("verdict", lambda s: s.get("verdict") or ""),
    ("governing_check", lambda s: s.get("governing") or ""),
]
_TAIL_COLUMNS: list[tuple[str, _Cell]] = [
    ("strength_ratio", lambda row, r: _figure(_section(r, "comparison").get("strength_ratio"))),
    ("stiffness_ratio", lambda row, r: _figure(_section(r, "comparison").get("stiffness_ratio"))),
    ("mass_ratio", lambda row, r: _figure(_section(r, "comparison").get("mass_ratio"))),
    ("fitted", lambda row, r: row.get("fitted") or ""),
    ("fitted_on", lambda row, r: row.get("fitted_on") or ""),
    ("outcome", lambda row, r: row.get("outcome") or ""),
    ("outcome_date", lambda row, r: row.get("outcome_date") or ""),
    ("note", lambda row, r: row.get("note") or ""),
    ("in_bin_since_utc", lambda row, r: row.get("deleted_at") or ""),
    ("program_version", lambda row, r: row.get("program_version") or ""),
]

FLAT_CSV_COLUMNS: tuple[str, ...] = (
    *(name for name, _ in _JOB_COLUMNS),
    *(f"{role}_{name}" for role in ("existing", "candidate") for name, _ in _SHAFT_COLUMNS),
    *(name for name, _ in _TAIL_COLUMNS),
)
"""The flat CSV's columns, in order: job, drive and mount, then each shaft, then fit and outcome."""
_NUMERIC = {"id"} | {name for name in FLAT_CSV_COLUMNS if name.endswith(
    ("_kW", "_rpm", "_Nm", "_N", "_MPa", "_sf", "_per_m", "ratio"))}


def flat_row(row: Mapping[str, Any]) -> list[str]:
    """One exported job (a dict as from ``export_rows``) as the flat CSV's cells, in column order.

    Text cells a spreadsheet would run as a formula get a leading apostrophe (see the module note).
    """
    result = row.get("result") if isinstance(row.get("result"), Mapping) else {}
    cells: list[Any] = [cell(row, result) for _, cell in _JOB_COLUMNS]
    for role in ("existing", "candidate"):
        shaft = _shaft(result, role)
        cells.extend(cell(shaft) if shaft else "" for _, cell in _SHAFT_COLUMNS)
    cells.extend(cell(row, result) for _, cell in _TAIL_COLUMNS)
    out = []
    for name, value in zip(FLAT_CSV_COLUMNS, cells):
        text = "" if value is None else str(value)
        out.append(text if name in _NUMERIC else _guard(text))
    return out


def write_csv(rows: Iterable[dict[str, Any]], out: IO[str]) -> int:
    """Write jobs as the flat CSV (one job a row, FLAT_CSV_COLUMNS); returns how many."""
    writer = csv.writer(out, lineterminator="\n")
    writer.writerow(FLAT_CSV_COLUMNS)
    count = 0
    for row in rows:
        writer.writerow(flat_row(row))
        count += 1
    return count


def read_jobs(text: str, *, name: str = "the file") -> list[dict[str, Any]]:
    """Jobs from the text of a JSON or CSV export (told apart by the first character)."""
    stripped = text.lstrip("\ufeff \t\r\n")
    if stripped.startswith("[") or stripped.startswith("{"):
        data = loads_guarded(stripped, name)
        if isinstance(data, dict):
            data = data.get("jobs")
        if not isinstance(data, list):
            raise LogError(f"{name}: expected a list of jobs")
        return data
    reader = csv.DictReader(io.StringIO(stripped, newline=""))
    if reader.fieldnames and "existing_spec" in reader.fieldnames and "inputs" not in reader.fieldnames:
        raise LogError(f"{name} is the spreadsheet CSV export, which is not read back; import the JSON "
                       "export instead (shaftbench log export --format json)")
    if not reader.fieldnames or not {"inputs", "result"} <= set(reader.fieldnames):
        raise LogError(f"{name} is neither a JSON nor a CSV job export (no inputs/result columns)")
    rows: list[dict[str, Any]] = []
    for number, cells in enumerate(reader, start=2):
        row: dict[str, Any] = dict(cells)
        for name_ in _TEXT_FIELDS:
            if isinstance(row.get(name_), str):
                row[name_] = _unguard(row[name_])
        row["inputs"] = loads_guarded(row["inputs"] or "null", f"{name} line {number}: inputs")
        row["result"] = loads_guarded(row["result"] or "null", f"{name} line {number}: result")
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


def read_log_file(path: Path) -> list[dict[str, Any]]:
    """Every job (bin included) of another SQLite job log, read from a private copy of it so that
    the source is never changed (not even migrated); LogError if it is not a job log."""
    import shutil
    import tempfile

    from workbench.store.log import JobLog

    with tempfile.TemporaryDirectory(prefix="shaftbench-import-") as folder:
        copy = Path(folder) / "source.sqlite3"
        try:
            shutil.copyfile(path, copy)
            for suffix in ("-wal",):
                if Path(f"{path}{suffix}").exists():
                    shutil.copyfile(f"{path}{suffix}", f"{copy}{suffix}")
        except OSError as err:
            raise LogError(f"cannot read {path}: {err.strerror or err}") from None
        try:
            with JobLog.open(copy, create=False) as source:
                return source.export_rows()
        except LogError as err:
            raise LogError(str(err).replace(str(copy), str(path))) from None
