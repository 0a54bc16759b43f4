"""Asset history from the job log (either engine): the jobs of one asset, matched by tag as
``workbench/core/asset_history.py`` states, and the site's assets by how many shafts they take."""

from __future__ import annotations

from typing import Any

from workbench.core.asset_history import AssetHistory, AssetJob, build_history, tag_key, tag_of
from workbench.store.records import JobRecord, LogError

_ROWS = ("SELECT id, asset, created_at, fitted, verdict, fitted_on, outcome, outcome_date, bench "
         "FROM jobs WHERE deleted_at IS NULL AND asset <> '' ORDER BY id")


def _fitted_of(record: JobRecord) -> str:
    """What a job fitted: the fitted note, else the candidate checked, else the shaft as found."""
    if record.fitted:
        return record.fitted
    for role in ("candidate", "existing"):
        for shaft in record.result.get("shafts") or []:
            if isinstance(shaft, dict) and shaft.get("role") == role and shaft.get("spec"):
                return str(shaft["spec"])
    return record.inputs.get("candidate") or record.inputs.get("shaft") or ""


def _rows(log: Any) -> list[tuple[Any, ...]]:
    return log._read(_ROWS)


def asset_history(log: Any, tag: str, *, today: str | None = None) -> tuple[AssetHistory, list[JobRecord]]:
    """The history of the asset ``tag`` names (live jobs only) and its job records, oldest first."""
    key = tag_key(tag)
    if not key:
        raise LogError("asset: give a tag, e.g. CV-07")
    try:  # by the asset index (v6)
        ids = [row[0] for row in log._read(
            "SELECT id FROM jobs WHERE asset_key = ? AND deleted_at IS NULL ORDER BY id", (key,))]
    except LogError:  # an older log opened read-only has no asset_key: read every asset text
        ids = [row[0] for row in _rows(log) if tag_key(row[1]) == key]
    if not ids:
        raise LogError(f"no job in the log is for asset {tag_of(tag) or tag!r} (tags match ignoring case, "
                       "spaces, - _ . / and leading zeros)")
    records = [log.get(job_id) for job_id in ids]
    jobs = [AssetJob(r.id, r.created_at, _fitted_of(r), r.verdict, r.fitted_on, r.outcome, r.outcome_date,
                     r.asset, r.bench) for r in records]
    return build_history(jobs, today=today), records


def site_assets(log: Any, *, today: str | None = None) -> list[dict[str, Any]]:
    """Every asset with live jobs, the ones taking the most shafts first: tag, jobs, MTBR, flags."""
    groups: dict[str, list[AssetJob]] = {}
    for job_id, asset, created, fitted, verdict, fitted_on, outcome, outcome_date, bench in _rows(log):
        key = tag_key(asset)
        if key:
            groups.setdefault(key, []).append(AssetJob(job_id, created, fitted, verdict, fitted_on or "",
                                                       outcome or "", outcome_date or "", asset, bench or ""))
    found = []
    for key, jobs in groups.items():
        history = build_history(jobs, today=today)
        found.append({
            "tag": history.tag, "key": key, "shafts": len(jobs),
            "first": min(j.saved_at for j in jobs)[:10], "last": max(j.saved_at for j in jobs)[:10],
            "mtbr_days": history.mtbr_days, "flags": list(history.flags),
        })
    found.sort(key=lambda a: (-a["shafts"], a["tag"].casefold()))
    return found


def history_json(history: AssetHistory) -> dict[str, Any]:
    """The asset history as JSON-ready data (``shaftbench log asset TAG --json``)."""
    return {
        "tag": history.tag,
        "key": history.key,
        "mtbr_days": history.mtbr_days,
        "flags": list(history.flags),
        "replacements": [
            {
                "job_id": life.job.job_id, "saved_at": life.job.saved_at, "bench": life.job.bench,
                "fitted": life.job.fitted, "verdict": life.job.verdict, "outcome": life.job.outcome,
                "start": life.start, "start_from": life.start_from, "end": life.end, "end_from": life.end_from,
                "days": life.days, "running_days": life.running_days,
            }
            for life in history.lives
        ],
    }
