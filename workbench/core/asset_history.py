"""The history of one asset (a drive, a conveyor's head shaft...): its shaft replacements in time
order, the service life of each shaft, the mean time between replacements, and two warning flags.

Pure: plain values in and out, dates as ISO strings (YYYY-MM-DD or full ISO times), intervals in
days. Nothing here reads the job log; ``workbench/store/assets.py`` feeds it.

Rules (stated here once, shown by the CLI and the workbench):

- **Tag matching.** People write a tag many ways: ``CV-07``, ``cv07``, ``CV 07``, ``CV-07 head
  drive``. The tag is the first word of the asset text - or the first two words when the first is
  letters only and the second starts with a digit (``CV 07 head drive`` -> ``CV 07``). Two tags are
  the same asset when their keys are equal: the key is the tag case-folded, with spaces, ``-``,
  ``_``, ``.`` and ``/`` removed and the leading zeros of each number dropped (``CV-07`` = ``cv7``).
- **A replacement** is each job of the asset that fitted a shaft: the ``fitted`` note, else the
  candidate checked, else the shaft as found.
- **Service life of a shaft** runs from when it went in - the job's fitted date, else the day the
  job was saved - to when it came out: the outcome's date when the outcome is ``failed`` or
  ``removed``, else the next replacement's start. The last shaft, still in, has an open interval
  (running for so many days), not counted in the mean. Each end names where its date came from.
- **MTBR** (mean time between replacements) is the mean of the closed service lives, in days.
- **Short-interval flag** (a rule of thumb, common practice, from memory): the last closed service
  life is shorter than half the median of the closed service lives before it, with at least two
  before it.
- **Marginal fitted and failed flag**: a shaft whose check said MARGINAL was fitted and failed.
"""

from __future__ import annotations

import re
from dataclasses import dataclass, field
from datetime import date, datetime

SHORT_FRACTION = 0.5
"""The short-interval flag's fraction of the median of the earlier service lives (common practice)."""
SHORT_MIN_EARLIER = 2
"""How many earlier closed service lives the short-interval flag needs."""

_SEPARATORS = re.compile(r"[\s\-_./]+")
_NUMBER = re.compile(r"\d+")


def tag_of(asset: str) -> str:
    """The tag part of an asset text (the rule in the module docstring), as written."""
    words = asset.split()
    if not words:
        return ""
    if len(words) > 1 and words[0].isalpha() and words[1][:1].isdigit():
        return f"{words[0]} {words[1]}"
    return words[0]


def tag_key(asset_or_tag: str) -> str:
    """The matching key of a tag (or of an asset text: its tag is taken first)."""
    tag = _SEPARATORS.sub("", tag_of(asset_or_tag).casefold())
    return _NUMBER.sub(lambda m: str(int(m.group())), tag)


@dataclass(frozen=True)
class AssetJob:
    """One job of an asset, as the history needs it."""

    job_id: int
    saved_at: str
    """ISO time the job was saved."""
    fitted: str
    """What was fitted (spec text); empty if the job fitted nothing known."""
    verdict: str = ""
    """The verdict of the shaft fitted (the job's verdict): pass, marginal, fail or empty."""
    fitted_on: str = ""
    outcome: str = ""
    """Empty, ``still-running``, ``failed`` or ``removed``."""
    outcome_date: str = ""
    asset: str = ""
    bench: str = ""


@dataclass(frozen=True)
class ServiceLife:
    """One fitted shaft: when it went in, when (if) it came out, and how long it ran."""

    job: AssetJob
    start: str
    start_from: str
    """``fitted date`` or ``save time``."""
    end: str | None
    end_from: str
    """``failed date``, ``removed date``, ``next replacement`` or ``still in`` (end None)."""
    days: float | None
    """Service life in days; None while still in."""
    running_days: float | None = None
    """Days in service so far (open interval, up to ``today``)."""


@dataclass(frozen=True)
class AssetHistory:
    tag: str
    key: str
    lives: tuple[ServiceLife, ...]
    mtbr_days: float | None
    flags: tuple[str, ...] = field(default=())

    @property
    def closed_days(self) -> list[float]:
        return [life.days for life in self.lives if life.days is not None]


def _day(text: str) -> date:
    text = text.strip()
    if len(text) == 10:
        return date.fromisoformat(text)
    return datetime.fromisoformat(text.replace("Z", "+00:00")).date()


def _between(a: str, b: str) -> float:
    return float((_day(b) - _day(a)).days)


def _median(values: list[float]) -> float:
    ordered = sorted(values)
    mid = len(ordered) // 2
    return ordered[mid] if len(ordered) % 2 else (ordered[mid - 1] + ordered[mid]) / 2


def build_history(jobs: list[AssetJob], *, today: str | None = None) -> AssetHistory:
    """The history of one asset from its jobs (any order): service lives, MTBR and flags."""
    ordered = sorted(jobs, key=lambda j: (j.fitted_on or j.saved_at[:10], j.saved_at, j.job_id))
    today = today or date.today().isoformat()
    lives: list[ServiceLife] = []
    for i, job in enumerate(ordered):
        start, start_from = (job.fitted_on, "fitted date") if job.fitted_on else (job.saved_at[:10], "save time")
        end: str | None
        if job.outcome in ("failed", "removed") and job.outcome_date:
            end, end_from = job.outcome_date, f"{job.outcome} date"
        elif i + 1 < len(ordered):
            nxt = ordered[i + 1]
            end = nxt.fitted_on or nxt.saved_at[:10]
            end_from = "next replacement"
        else:
            end, end_from = None, "still in"
        if end is None:
            lives.append(ServiceLife(job, start, start_from, None, end_from, None,
                                     running_days=max(0.0, _between(start, today))))
        else:
            lives.append(ServiceLife(job, start, start_from, end, end_from, max(0.0, _between(start, end))))
    closed = [life.days for life in lives if life.days is not None]
    mtbr = sum(closed) / len(closed) if closed else None
    flags: list[str] = []
    if len(closed) >= SHORT_MIN_EARLIER + 1:
        last, earlier = closed[-1], closed[:-1]
        median = _median(earlier)
        if last < SHORT_FRACTION * median:
            flags.append(f"last shaft lasted {last:.0f} days, under half the median of the ones before "
                         f"({median:.0f} days)")
    for life in lives:
        if life.job.verdict == "marginal" and life.job.outcome == "failed":
            flags.append(f"job {life.job.job_id}: a MARGINAL shaft ({life.job.fitted or 'as checked'}) "
                         f"was fitted and failed on {life.job.outcome_date}")
    shown = tag_of(ordered[-1].asset) if ordered and ordered[-1].asset else ""
    return AssetHistory(shown, tag_key(shown) if shown else "", tuple(lives), mtbr, tuple(flags))
