"""The job card as a printable HTML page: one page per job on A4 or Letter, made of sections.

A card is a list of :class:`PageSection` built in order by the builders in :data:`CARD_SECTIONS`
(each takes a :class:`CardJob` and returns a section, or None to leave it out). To add a section -
a steps page, a turning sheet - write a builder and register it with :func:`add_section`; a section
with ``own_page=True`` starts on a page of its own after the one-page card (a turning sheet), the
others share the card's page. Every text a person typed is HTML-escaped; nothing is ever read as
markup. Print rules (common practice for printable HTML, CSS Paged Media and Fragmentation):

- ``@page`` margins of 10-11 mm and, when a paper is named, its size; with none the printer's paper
  is used and the card is laid out to fit both A4 (210 x 297 mm) and Letter (216 x 279 mm);
- each job's card starts on a new page (``break-before: page``); no section is split over two pages
  (``break-inside: avoid``), so the safety cautions stay whole;
- tables take the page width with fixed layout and long words wrap anywhere, so nothing is clipped;
- no text is smaller than 9 pt; black on white; the verdict is a word, never only a colour.
"""

from __future__ import annotations

import html
from collections.abc import Callable, Iterable, Mapping, Sequence
from dataclasses import dataclass, field
from typing import Any

PAPERS = {"a4": "A4", "letter": "letter"}
"""Paper names accepted by ``--paper`` and their CSS ``@page size``."""


@dataclass(frozen=True)
class CardJob:
    """What a card shows of one job (a saved one or one not saved yet)."""

    result: Mapping[str, Any]
    asset: str = ""
    location: str = ""
    by: str = ""
    note: str = ""
    fitted: str = ""
    job_id: int | None = None
    created_at: str | None = None
    program_version: str = ""
    extra: Mapping[str, Any] = field(default_factory=dict)
    """Further facts of the record for sections that need them (outcome, fitted date, ...)."""

    @classmethod
    def from_record(cls, record: Any) -> CardJob:
        """The card facts of a stored job (a ``workbench.store.JobRecord``)."""
        extra = {
            name: getattr(record, name)
            for name in ("outcome", "outcome_date", "fitted_on", "updated_at")
            if getattr(record, name, None)
        }
        return cls(
            result=record.result, asset=record.asset, location=record.location, by=record.by,
            note=record.note, fitted=record.fitted, job_id=record.id, created_at=record.created_at,
            program_version=record.program_version, extra=extra,
        )


@dataclass(frozen=True)
class PageSection:
    """One boxed section of the card."""

    key: str
    """Stable name (``drive``, ``cautions``...), used as the CSS class and by :func:`add_section`."""
    title: str
    body_html: str
    """The section's body, already escaped (build it with :func:`esc`, :func:`pairs`, :func:`grid`)."""
    own_page: bool = False
    """True: starts a new page after the card (e.g. a turning sheet); may run over several pages."""
    half: bool = False
    """True: shares a row with the next half-width section (drive beside mount)."""


SectionBuilder = Callable[[CardJob], "PageSection | None"]


def esc(value: Any) -> str:
    """Any value as HTML text: escaped, control characters shown as '?'."""
    from workbench.report.jobcard import literal

    return html.escape(literal(value).plain, quote=True)


def pairs(rows: Iterable[tuple[str, Any]]) -> str:
    """A two-column label/value table (values escaped)."""
    body = "".join(f"<tr><th>{esc(label)}</th><td>{esc(value)}</td></tr>" for label, value in rows)
    return f'<table class="pairs">{body}</table>'


def pairs_across(rows: Sequence[tuple[str, Any]], columns: int = 2) -> str:
    """Label/value pairs laid out ``columns`` pairs to a table row (a compact page head)."""
    cells = [f"<th>{esc(label)}</th><td>{esc(value)}</td>" for label, value in rows]
    cells += ["<th></th><td></td>"] * (-len(cells) % columns)
    body = "".join("<tr>" + "".join(cells[i:i + columns]) + "</tr>" for i in range(0, len(cells), columns))
    return f'<table class="pairs across">{body}</table>'


def grid(headings: Sequence[str], rows: Iterable[Sequence[Any]]) -> str:
    """A table with a heading row; the first column is the row label (all cells escaped)."""
    head = "".join(f"<th>{esc(h)}</th>" for h in headings)
    body = "".join(
        "<tr>" + "".join(f"<{'th' if i == 0 else 'td'}>{esc(c)}</{'th' if i == 0 else 'td'}>"
                         for i, c in enumerate(row)) + "</tr>"
        for row in rows
    )
    return f'<table class="grid"><thead><tr>{head}</tr></thead><tbody>{body}</tbody></table>'


# --------------------------------------------------------------------------------------------
# the card's own sections


def _head(job: CardJob) -> PageSection:
    from workbench.report.jobcard import local_when

    version = job.program_version or (job.result.get("program") or {}).get("version", "-")
    rows = [
        ("asset", job.asset or "-"),
        ("location", job.location or "-"),
        ("saved", local_when(job.created_at) if job.created_at else "not saved"),
        ("checked by", job.by or "-"),
        ("program", f"Shaftbench {version}"),
    ]
    return PageSection("head", "Job", pairs_across(rows))


def _drive(job: CardJob) -> PageSection:
    from workbench.report.jobcard import number

    drive = job.result.get("drive") or {}
    rows = [
        ("motor", f"{number(drive.get('power_W'), 1000, 'kW')} at {number(drive.get('motor_speed_rpm'), 1, 'rpm')}"),
        ("ratio / efficiency", f"{number(drive.get('ratio'))} / {number(drive.get('efficiency'))}"),
        ("service / peak factor", f"{number(drive.get('service_factor'))} / {number(drive.get('peak_factor'))}"),
        ("shaft speed", number(drive.get("shaft_speed_rpm"), 1, "rpm")),
        ("torque running / design / peak",
         f"{number(drive.get('running_torque_Nm'))} / {number(drive.get('design_torque_Nm'))} / "
         f"{number(drive.get('peak_torque_Nm'), 1, 'N·m')}"),
    ]
    return PageSection("drive", "Drive", pairs(rows), half=True)


def _mount(job: CardJob) -> PageSection:
    from workbench.report.jobcard import mount_rows

    rows = [row for row in mount_rows(job.result) if row[0] not in ("required safety factor", "fatigue criterion")]
    return PageSection("mount", "Mount", pairs(rows), half=True)


_SHAFT_ROWS: list[tuple[str, Callable[[Mapping[str, Any]], str]]] = []
"""The printable card's shaft rows (built on first use from jobcard.SHAFT_ROWS, related figures
sharing a row so that the card stays on one page)."""


def _shaft_rows() -> list[tuple[str, Callable[[Mapping[str, Any]], str]]]:
    from workbench.report.jobcard import SHAFT_ROWS, number

    if not _SHAFT_ROWS:
        by_label = dict(SHAFT_ROWS)
        _SHAFT_ROWS.extend([
            ("spec", by_label["spec"]),
            ("material", by_label["material"]),
            ("stress shear / bending / von Mises", lambda s: (
                f"{number(s.get('max_shear_stress_Pa'), 1e6)} / {number(s.get('bending_stress_Pa'), 1e6)} / "
                f"{number(s.get('von_mises_stress_Pa'), 1e6, 'MPa')}")),
            ("endurance limit", by_label["endurance limit"]),
            ("safety factor static / shear-yield / fatigue", lambda s: (
                f"{number(s.get('static_safety_factor'))} / {number(s.get('shear_yield_safety_factor'))} / "
                f"{number(s.get('fatigue_safety_factor'))}")),
            ("twist", by_label["twist"]),
            ("Kf / Kfs", by_label["Kf / Kfs"]),
            ("mass", by_label["mass"]),
            ("verdict", by_label["verdict"]),
        ])
    return _SHAFT_ROWS


def _shafts(job: CardJob) -> PageSection:
    from workbench.report.jobcard import shafts_of

    shafts = shafts_of(job.result)
    if not shafts:
        return PageSection("shafts", "Shafts", "<p>no shaft in this job</p>")
    table = grid(
        ["", *(s.get("role", "shaft") for s in shafts)],
        ([label, *(cell(s) for s in shafts)] for label, cell in _shaft_rows()),
    )
    from workbench.report.jobcard import deciding_shaft

    deciding = deciding_shaft(job.result)
    whys = "".join(  # the deciding shaft's why is in the Verdict section
        f"<p>why ({esc(s.get('role', 'shaft'))}): {esc(s.get('why'))}</p>"
        for s in shafts if s.get("why") and s is not deciding
    )
    said: dict[str, list[str]] = {}  # the same note on both shafts is printed once, naming both
    for s in shafts:
        for n in s.get("notes") or []:
            said.setdefault(str(n), []).append(str(s.get("role", "shaft")))
    notes = "".join(f"<p>note ({esc(', '.join(roles))}): {esc(n)}</p>" for n, roles in said.items())
    return PageSection("shafts", "Shafts", table + whys + notes)


def _steps(job: CardJob) -> PageSection | None:
    """Each shaft as its steps (the governing one marked ◀) and its whole-shaft checks (key,
    critical speed, deflection, slopes); None when no shaft has steps (report/steps.py, shared with
    the report and the workbench)."""
    from workbench.report.steps import shaft_checks, step_columns, steps_of, steps_rows

    parts = []
    for shaft in (s for s in (job.result.get("shafts") or []) if isinstance(s, Mapping)):
        if not steps_of(shaft):
            continue
        parts.append(f"<p><b>{esc(shaft.get('role', 'shaft'))}: {esc(shaft.get('spec', ''))}</b></p>")
        parts.append(grid(step_columns(), steps_rows(shaft)))
        checks = shaft_checks(shaft)
        if checks:
            parts.append("<p>" + esc(" · ".join(f"{label}: {value}" for label, value in checks)) + "</p>")
    if not parts:
        return None
    # a page of its own after the card (before the turning sheets): the card stays one page
    return PageSection("steps", "Steps of the shafts (◀ the governing step)", "".join(parts), own_page=True)


def _verdict(job: CardJob) -> PageSection:
    from workbench.report.jobcard import deciding_shaft, number

    result = job.result
    verdict = result.get("verdict")
    word = verdict.upper() if isinstance(verdict, str) and verdict else "NO VERDICT"
    shaft = deciding_shaft(result)
    lines = [f'<p class="verdict-line">Overall: <span class="verdict-word">{esc(word)}</span>'
             + (f" — {esc(shaft.get('role', ''))} {esc(shaft.get('spec', ''))}" if shaft else "") + "</p>"]
    if shaft.get("governing"):
        lines.append(f"<p>governed by: {esc(shaft.get('governing'))}</p>")
    if shaft.get("why"):
        lines.append(f"<p>why: {esc(shaft.get('why'))}</p>")
    settings = result.get("settings") or {}
    if settings:
        lines.append(f"<p>required safety factor {esc(number(settings.get('required_sf')))}, "
                     f"fatigue criterion {esc(settings.get('fatigue_criterion') or '-')}</p>")
    comparison = result.get("comparison") or {}
    if comparison:
        lines.append(
            "<p>candidate / existing: "
            f"strength {esc(number(comparison.get('strength_ratio')))}, "
            f"stiffness {esc(number(comparison.get('stiffness_ratio')))}, "
            f"mass {esc(number(comparison.get('mass_ratio')))}</p>"
        )
    return PageSection("verdict", "Verdict", "".join(lines))


def _outcome(job: CardJob) -> PageSection:
    from workbench.report.jobcard import outcome_rows

    return PageSection("outcome", "Fitted and outcome", pairs(outcome_rows(job.fitted, job.extra)), half=True)


def _notes(job: CardJob) -> PageSection:
    body = "".join(f"<p>{esc(line)}</p>" for line in job.note.splitlines()) if job.note else "<p>none</p>"
    return PageSection("notes", "Notes", body, half=True)


def _cautions(job: CardJob) -> PageSection:
    cautions = job.result.get("cautions") or []
    if not cautions:
        return PageSection("cautions", "Safety cautions", "<p>none listed</p>")
    items = "".join(f"<li>{esc(c)}</li>" for c in cautions)
    return PageSection("cautions", "Safety cautions", f"<ul>{items}</ul>")


def _signatures(job: CardJob) -> PageSection:
    cells = "".join(f"<td><span>{label}</span></td>" for label in ("Fitted by", "Checked by", "Date"))
    return PageSection("signatures", "Signatures", f'<table class="sig"><tr>{cells}</tr></table>')


CARD_SECTIONS: list[tuple[str, SectionBuilder]] = [
    ("head", _head),
    ("drive", _drive),
    ("mount", _mount),
    ("shafts", _shafts),
    ("steps", _steps),
    ("verdict", _verdict),
    ("outcome", _outcome),
    ("notes", _notes),
    ("cautions", _cautions),
    ("signatures", _signatures),
]
"""The card's sections in page order, as (key, builder)."""


def add_section(key: str, builder: SectionBuilder, *, before: str | None = None) -> None:
    """Register a section builder (at the end, or before the section named ``before``).

    Registering a key again replaces its builder, so importing a module twice adds nothing.
    """
    for i, (existing, _) in enumerate(CARD_SECTIONS):
        if existing == key:
            CARD_SECTIONS[i] = (key, builder)
            return
    keys = [k for k, _ in CARD_SECTIONS]
    CARD_SECTIONS.insert(keys.index(before) if before in keys else len(CARD_SECTIONS), (key, builder))


def card_sections(job: CardJob) -> list[PageSection]:
    """The sections of one job's card, in order, leaving out those whose builder gave None."""
    built = (builder(job) for _, builder in CARD_SECTIONS)
    return [section for section in built if section is not None]


# --------------------------------------------------------------------------------------------
# the page

_CSS = """
@page { margin: 10mm 11mm; PAGE_SIZE }
* { box-sizing: border-box; }
html { color: #000; background: #fff; }
body { margin: 0; font-family: "DejaVu Sans", "Liberation Sans", Arial, Helvetica, sans-serif;
       font-size: 9.5pt; line-height: 1.1; }
.card { max-width: 188mm; margin: 0 auto; }
.card + .card, .job + .job, .own-page { break-before: page; page-break-before: always; }
h1 { font-size: 13pt; margin: 0 0 1.5mm; display: flex; justify-content: space-between; gap: 4mm; }
h1 .job { white-space: nowrap; }
h2 { font-size: 10pt; margin: 0; position: absolute; top: -0.65em; left: 2mm; padding: 0 1mm;
     background: #fff; line-height: 1.1; }
section { position: relative; border: 0.3mm solid #000; padding: 1.6mm 2mm 0.8mm; margin: 2.6mm 0 0;
          break-inside: avoid; page-break-inside: avoid; }
section.own-page { break-inside: auto; page-break-inside: auto; }
.row { display: flex; gap: 2mm; }
.row > section { flex: 1 1 0; min-width: 0; }
table { width: 100%; border-collapse: collapse; table-layout: fixed; }
th, td { text-align: left; vertical-align: top; padding: 0.3mm 1.2mm;
         overflow-wrap: anywhere; word-break: break-word; font-size: 9pt; }
table.pairs th { width: 46%; font-weight: normal; }
table.pairs.across th { width: 14%; }
table.grid thead th { border-bottom: 0.3mm solid #000; }
table.grid tbody th { width: 30%; font-weight: normal; }
tr { break-inside: avoid; page-break-inside: avoid; }
p { margin: 0.6mm 0; overflow-wrap: anywhere; }
ul { margin: 0; padding-left: 5mm; }
.verdict-word { font-weight: bold; font-size: 11pt; }
section.cautions { border-width: 0.6mm; }
table.sig td { height: 9mm; vertical-align: bottom; border-bottom: 0.3mm solid #000; }
table.sig td + td { border-left: 4mm solid #fff; }
@media screen { body { padding: 8mm; } }
"""


def _page_css(paper: str | None) -> str:
    size = f"size: {PAPERS[paper]};" if paper else ""
    return _CSS.replace("PAGE_SIZE", size)


def _card_html(job: CardJob) -> str:
    from workbench.report.jobcard import CARD_TITLE

    title = f'<h1><span>{esc(CARD_TITLE)}</span>' + (
        f'<span class="job">job {esc(job.job_id)}</span>' if job.job_id is not None else "") + "</h1>"
    parts: list[str] = [title]
    own_pages: list[str] = []
    pending_half: list[str] = []

    def flush_half() -> None:
        if pending_half:
            parts.append('<div class="row">' + "".join(pending_half) + "</div>")
            pending_half.clear()

    for section in card_sections(job):
        box = (f'<section class="{esc(section.key)}{" own-page" if section.own_page else ""}">'
               f"<h2>{esc(section.title)}</h2>{section.body_html}</section>")
        if section.own_page:
            own_pages.append(box)
            continue
        if section.half:
            pending_half.append(box)
            if len(pending_half) == 2:
                flush_half()
            continue
        flush_half()
        parts.append(box)
    flush_half()
    # one block per job, so the next job's card starts a new page after this one's own pages too
    return '<div class="job"><div class="card">' + "".join(parts) + "</div>" + "".join(own_pages) + "</div>"


def card_page(jobs: Sequence[CardJob], *, paper: str | None = None) -> str:
    """A printable HTML page of the cards of ``jobs``, each starting on a new page.

    ``paper``: ``a4`` or ``letter`` fixes the paper size; None leaves it to the printer.
    """
    if paper is not None and paper not in PAPERS:
        raise ValueError(f"paper must be one of {', '.join(PAPERS)}, not {paper!r}")
    if not jobs:
        raise ValueError("a card page needs at least one job")
    names = ", ".join(f"job {job.job_id}" for job in jobs if job.job_id is not None)
    title = "Shaftbench job card" + (f" - {names}" if names else "")
    body = "".join(_card_html(job) for job in jobs)
    return (
        "<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\">"
        f"<title>{esc(title)}</title><style>{_page_css(paper)}</style></head>"
        f"<body>{body}</body></html>\n"
    )


def _register_turning_sheets() -> None:
    """The turning sheets: each shaft's on a page of its own after the card (report/turning_sheet.py)."""
    from workbench.report.turning_sheet import register_card_sections

    register_card_sections()


_register_turning_sheets()
