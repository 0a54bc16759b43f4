"""How an asset history is shown: a time chart drawn with text (terminal and workbench), a table
of the replacements, and a printable HTML page. User text is always shown literally."""

from __future__ import annotations

import html
from datetime import date, timedelta
from typing import Any

from workbench.core.asset_history import SHORT_FRACTION, SHORT_MIN_EARLIER, AssetHistory

RULES = (
    "Tags match ignoring case, spaces, - _ . / and leading zeros (CV-07 = cv7); the tag is the first "
    "word of the asset, or two when the first is letters and the second starts with a digit.",
    "A shaft's life runs from its fitted date (else the day its job was saved) to its failed or removed "
    "date (else the next replacement); MTBR is the mean of the closed lives.",
    f"Flagged: the last life under {SHORT_FRACTION:g} x the median of the {SHORT_MIN_EARLIER}+ lives "
    "before it (a rule of thumb), and a MARGINAL shaft fitted that failed.",
)
FULL, OPEN = "█", "░"


def _day(text: str) -> date:
    return date.fromisoformat(text[:10])


def chart_lines(history: AssetHistory, width: int = 60, *, today: str | None = None) -> list[str]:
    """The time chart: one row per fitted shaft, a bar from when it went in to when it came out
    (``█``) or to today while still in (``░``), on one time axis; the axis dates below."""
    if not history.lives:
        return []
    end_day = _day(today) if today else date.today()
    first = min(_day(life.start) for life in history.lives)
    last = max([end_day, *(_day(life.end) for life in history.lives if life.end)])
    span = max(1, (last - first).days)
    label_w = 7
    bar_w = max(10, width - label_w - 12)
    lines = []
    for life in history.lives:
        a = (_day(life.start) - first).days * bar_w // span
        b_day = _day(life.end) if life.end else end_day
        b = max(a + 1, (b_day - first).days * bar_w // span)
        mark = FULL if life.end else OPEN
        days = life.days if life.days is not None else life.running_days
        tail = f" {days:.0f} d" if days is not None else ""
        lines.append(f"{'#' + str(life.job.job_id):>{label_w}} " + " " * a + mark * (b - a)
                     + " " * (bar_w - b) + tail)
    middle = first + timedelta(days=span // 2)
    axis = f"{first.isoformat()}{middle.isoformat():^{max(10, bar_w - 20)}}{last.isoformat()}"
    lines.append(" " * (label_w + 1) + axis[: bar_w + 12])
    return lines


def summary_line(history: AssetHistory) -> str:
    closed = history.closed_days
    mtbr = f"MTBR {history.mtbr_days:.0f} days over {len(closed)} closed life/lives" if history.mtbr_days is not None \
        else "MTBR: no shaft has come out yet"
    return f"{history.tag}: {len(history.lives)} shaft(s) fitted; {mtbr}"


def history_renderable(history: AssetHistory, *, width: int = 80, today: str | None = None) -> Any:
    """The asset history for a terminal (Rich): summary, flags, time chart, replacement table."""
    from rich.console import Group
    from rich.table import Table
    from rich.text import Text

    parts: list[Any] = [Text(summary_line(history), style="bold")]
    for flag in history.flags:
        parts.append(Text(f"FLAG  {flag}", style="bold yellow"))
    parts.append(Text("\n".join(chart_lines(history, width - 2, today=today))))
    table = Table(box=None, padding=(0, 1), show_edge=False)
    for heading in ("job", "fitted", "verdict", "in", "out", "days", "how it ended"):
        table.add_column(heading, justify="right" if heading in ("job", "days") else "left")
    for life in history.lives:
        days = f"{life.days:.0f}" if life.days is not None else f"{life.running_days or 0:.0f}+"
        table.add_row(str(life.job.job_id), Text(life.job.fitted or "-"), life.job.verdict.upper() or "-",
                      f"{life.start} ({life.start_from})", f"{life.end or '-'} ({life.end_from})", days,
                      Text(life.job.outcome or "not recorded"))
    parts.append(table)
    for rule in RULES:
        parts.append(Text(rule, style="dim"))
    return Group(*parts)


def sites_renderable(assets: list[dict[str, Any]]) -> Any:
    """The site's assets, most shafts first (Rich table)."""
    from rich.table import Table
    from rich.text import Text

    table = Table(title="assets by shafts fitted", title_justify="left")
    for heading in ("asset", "shafts", "first", "last", "MTBR days", "flags"):
        table.add_column(heading, justify="right" if heading in ("shafts", "MTBR days") else "left")
    for a in assets:
        table.add_row(Text(a["tag"]), str(a["shafts"]), a["first"], a["last"],
                      f"{a['mtbr_days']:.0f}" if a["mtbr_days"] is not None else "-", str(len(a["flags"])))
    return table


def history_html(history: AssetHistory, *, today: str | None = None) -> str:
    """A printable HTML page of the asset history (A4 or Letter, black on white)."""
    e = html.escape
    rows = "".join(
        f"<tr><td>{life.job.job_id}</td><td>{e(life.job.fitted or '-')}</td><td>{e(life.job.verdict.upper() or '-')}</td>"
        f"<td>{e(life.start)} ({e(life.start_from)})</td><td>{e(life.end or '-')} ({e(life.end_from)})</td>"
        f"<td>{'%.0f' % life.days if life.days is not None else '%.0f+' % (life.running_days or 0)}</td>"
        f"<td>{e(life.job.outcome or 'not recorded')}</td></tr>"
        for life in history.lives
    )
    flags = "".join(f"<li>{e(flag)}</li>" for flag in history.flags) or "<li>none</li>"
    chart = e("\n".join(chart_lines(history, 90, today=today)))
    rules = "".join(f"<li>{e(rule)}</li>" for rule in RULES)
    return f"""<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8"><title>Asset history {e(history.tag)}</title>
<style>
@page {{ size: auto; margin: 15mm; }}
body {{ font-family: sans-serif; font-size: 10pt; color: #000; background: #fff; }}
h1 {{ font-size: 14pt; }} table {{ border-collapse: collapse; width: 100%; }}
td, th {{ border: 1px solid #000; padding: 2pt 4pt; text-align: left; overflow-wrap: anywhere; }}
pre {{ font-size: 9pt; white-space: pre-wrap; }} tr {{ break-inside: avoid; }}
</style></head><body>
<h1>Asset history: {e(history.tag)}</h1>
<p>{e(summary_line(history))}</p>
<h2>Flags</h2><ul>{flags}</ul>
<h2>Time chart</h2><pre>{chart}</pre>
<h2>Replacements</h2>
<table><tr><th>job</th><th>fitted</th><th>verdict</th><th>in</th><th>out</th><th>days</th><th>how it ended</th></tr>{rows}</table>
<h2>Rules</h2><ul>{rules}</ul>
<p>A bench check is not design approval. Lock out and tag out the drive before any work on it.</p>
</body></html>
"""
