"""``shaftbench log ...`` and the ``--save`` options of ``shaftbench check``.

Only argparse is imported at start-up; the store, Rich and the job card load when a command runs.
Every problem a person can cause ends as one line on stderr and exit code 2; answering no to a
question (``log purge``) changes nothing and exits with 1.
"""

from __future__ import annotations

import argparse
import sys
from collections.abc import Callable
from pathlib import Path
from typing import Any

VERDICTS = ("pass", "marginal", "fail")
EXIT_OK, EXIT_USAGE = 0, 2
EXIT_DECLINED = 1
"""A question was answered no (``log purge`` without ``--yes``): nothing was changed."""


# --------------------------------------------------------------------------------------------
# check --save


def add_save_options(parser: argparse.ArgumentParser) -> None:
    """Add ``--save --asset --location --by --note --fitted --log`` to a command (``check``)."""
    group = parser.add_argument_group("job log")
    group.add_argument("--save", action="store_true", help="save the job in the job log")
    group.add_argument("--asset", default="", help="asset tag of the drive, e.g. 'CV-07 head drive'")
    group.add_argument("--location", default="", help="where the drive is")
    group.add_argument("--by", default="", help="who checked the job")
    group.add_argument("--note", default="", help="free notes for the log")
    group.add_argument("--fitted", default="", help="which candidate spec was actually fitted")
    _add_log_path(group)


def _add_log_path(parser: Any) -> None:
    parser.add_argument(
        "--log", metavar="PATH", default=None, type=log_path_arg,
        help="job log file (default: $SHAFTBENCH_LOG, else jobs.sqlite3 in the user data folder)",
    )


MAX_JOB_ID = 2**63 - 1
"""The largest job number SQLite can hold (a signed 64-bit integer)."""


def cut(text: str, limit: int = 60) -> str:
    """``text`` for a one-line message: at most ``limit`` characters, the cut marked with '…'."""
    from workbench.text_cut import cut_words

    text = str(text)
    return text if len(text) <= limit else cut_words(text, limit)


def log_path_arg(text: str) -> str:
    """argparse type of ``--log``: any non-empty path (an empty one would quietly mean the default)."""
    if not text.strip():
        raise argparse.ArgumentTypeError("expected a job log file name, got an empty text "
                                         "(leave --log out to use the default log)")
    return text


def job_id_arg(text: str) -> int:
    """argparse type of a job ID: a whole number from 1 to 2^63 - 1 (what SQLite can hold)."""
    value = _whole_number(text)
    if value is None or not 1 <= value <= MAX_JOB_ID:
        raise argparse.ArgumentTypeError(f"expected a job number from 1 to {MAX_JOB_ID}, got {cut(text)!r}")
    return value


def limit_arg(text: str) -> int:
    """argparse type of ``--limit``: a whole number of 1 or more (huge values mean 'no limit')."""
    value = _whole_number(text)
    if value is None or value < 1:
        raise argparse.ArgumentTypeError(f"expected a whole number of 1 or more, got {cut(text)!r}")
    return min(value, MAX_JOB_ID)


def _whole_number(text: str) -> int | None:
    """A whole number of ASCII digits (None otherwise). More than 30 digits reads as 10**30, far past
    any job number, without converting a pasted 5,000-digit string (Python refuses past 4,300)."""
    digits = text.strip().lstrip("+")
    if not (digits.isascii() and digits.isdigit()):
        return None
    return 10**30 if len(digits) > 30 else int(digits)


def save_from_args(args: argparse.Namespace, inputs: dict[str, str], result: dict[str, Any]) -> int | None:
    """Save the job if ``--save`` was given; returns its id, or None without ``--save``.

    Raises ``workbench.store.LogError`` (one-line message) if the log cannot be written.
    """
    if not getattr(args, "save", False):
        return None
    from workbench.store import JobLog

    meta = {name: getattr(args, name, "") or "" for name in ("asset", "location", "by", "note", "fitted")}
    if getattr(args, "demo", False):  # the demo job comes with its invented plant's notes
        from workbench.demo import DEMO_META

        meta = {name: meta[name] or DEMO_META.get(name, "") for name in meta}
    with JobLog.open(getattr(args, "log", None)) as log:
        return log.save(inputs, result, **meta)


# --------------------------------------------------------------------------------------------
# log


def add_log_command(subparsers: Any) -> argparse.ArgumentParser:
    """Add ``log`` and its subcommands; each sets ``func(args) -> exit code``."""
    log = subparsers.add_parser(
        "log", help="list, show, export and tidy the job log",
        description="The job log: every job saved with 'check --save' or from the workbench.",
    )
    log.set_defaults(func=_needs_subcommand(log))
    sub = log.add_subparsers(dest="log_command", metavar="COMMAND")

    def command(name: str, help_: str, func: Callable[[argparse.Namespace], int]) -> argparse.ArgumentParser:
        parser = sub.add_parser(name, help=help_, description=help_)
        _add_log_path(parser)
        parser.set_defaults(func=_guarded(func))
        return parser

    listing = command("list", "list jobs, newest first", _cmd_list)
    listing.add_argument("--text", default="",
                         help="words to find (any case): asset, location, notes, material, who checked it, "
                              "what was fitted and how it ended, the shaft specs, verdict and governing check")
    listing.add_argument("--verdict", choices=VERDICTS, help="only jobs with this verdict")
    listing.add_argument("--since", metavar="DATE", help="only jobs saved on or after DATE (YYYY-MM-DD, UTC)")
    listing.add_argument("--until", metavar="DATE", help="only jobs saved on or before DATE (YYYY-MM-DD, UTC)")
    listing.add_argument("--limit", type=limit_arg, default=50, help="at most this many jobs (default 50)")
    listing.add_argument("--deleted", action="store_true", help="list the jobs in the bin instead")
    listing.add_argument("--json", action="store_true", help="print JSON instead of a table")

    show = command("show", "show one job and check it against today's program", _cmd_show)
    show.add_argument("id", type=job_id_arg, metavar="ID")
    show.add_argument("--json", action="store_true", help="print the stored job as JSON")

    export = command("export", "write every job (bin included) to CSV or JSON", _cmd_export)
    export.add_argument("--format", choices=("csv", "json"), default="json")
    export.add_argument("-o", "--output", metavar="FILE", help="write to FILE instead of the screen")

    imp = command("import", "add the jobs of another job log file or of a CSV or JSON export "
                  "(jobs already there are skipped)", _cmd_import)
    imp.add_argument("file", metavar="FILE", help="an SQLite job log, or a JSON/CSV export")
    imp.add_argument("--bench", default=None, metavar="NAME",
                     help="the bench the jobs came from, for jobs that do not name one "
                          "(default: the file's name without its extension)")

    card = command("card", "print or write the job card of a job (html: a printable page, one page per job)",
                   _cmd_card)
    card.add_argument("id", type=job_id_arg, metavar="ID", nargs="+")
    card.add_argument("--format", choices=("html", "svg", "text"), default="text")
    card.add_argument("--paper", choices=("a4", "letter"), default=None,
                      help="html: fix the paper size (default: the printer's paper; the card fits both)")
    card.add_argument("-o", "--output", metavar="FILE", help="write to FILE instead of the screen")

    edit = command("edit", "change a saved job's notes and record what was fitted and how it ended "
                           "(each change is kept with its time)", _cmd_edit)
    edit.add_argument("id", type=job_id_arg, metavar="ID")
    for option, help_ in (("--asset", "asset tag"), ("--location", "where the drive is"),
                          ("--by", "who checked the job"), ("--note", "the notes (replaces them)"),
                          ("--fitted", "which candidate spec was actually fitted")):
        edit.add_argument(option, metavar="TEXT", help=help_)
    edit.add_argument("--add-note", metavar="TEXT", help="add a line to the notes")
    edit.add_argument("--fitted-on", metavar="DATE", help="the date it was fitted (YYYY-MM-DD; 'none' clears)")
    edit.add_argument(
        "--outcome", nargs="+", metavar="WORD",
        help="how it ended: still-running [DATE] | failed DATE | removed [DATE] | none (clears)",
    )

    delete = command("delete", "move a job to the bin (restore brings it back)", _cmd_delete)
    delete.add_argument("id", type=job_id_arg, metavar="ID")
    restore = command("restore", "bring a job back from the bin", _cmd_restore)
    restore.add_argument("id", type=job_id_arg, metavar="ID")
    purge = command("purge", "remove every job in the bin for good (asks first)", _cmd_purge)
    purge.add_argument(
        "-y", "--yes", action="store_true",
        help="do not ask; needed when input is not a terminal (scripts). Answering no exits with 1",
    )
    asset = command("asset", "the history of one asset: its shafts in time order, MTBR and flags", _cmd_asset)
    asset.add_argument("tag", metavar="TAG", help="the asset tag, as people write it (CV-07, cv07, 'CV 07 head drive')")
    asset.add_argument("--json", action="store_true", help="print JSON instead of the chart and table")
    asset.add_argument("-o", "--output", metavar="FILE", help="write a printable HTML asset report to FILE")
    assets = command("assets", "the site's assets, the ones taking the most shafts first", _cmd_assets)
    assets.add_argument("--json", action="store_true", help="print JSON instead of a table")
    command("seed-demo", "add the demo's invented asset history (CV-07 head drive) to the log", _cmd_seed_demo)
    return log


def _needs_subcommand(parser: argparse.ArgumentParser) -> Callable[[argparse.Namespace], int]:
    def func(args: argparse.Namespace) -> int:
        parser.print_usage(sys.stderr)
        print("shaftbench log: choose a command: list, show, edit, export, import, card, delete, restore, purge, "
              "asset, assets, seed-demo",
              file=sys.stderr)
        return EXIT_USAGE

    return func


MESSAGE_LIMIT = 300
"""A one-line message is cut to this many characters (a pasted 100 kB value is not echoed whole)."""


def _fail(message: str) -> int:
    print(f"shaftbench log: {cut(' '.join(str(message).split()), MESSAGE_LIMIT)}", file=sys.stderr)
    return EXIT_USAGE


def _guarded(func: Callable[[argparse.Namespace], int]) -> Callable[[argparse.Namespace], int]:
    """Run a command; a LogError or OS error becomes one line on stderr and exit code 2.

    What the command printed is flushed here, so that a full disk or a closed pipe on standard
    output is reported now and not as an "Exception ignored" when Python exits.
    """

    def run(args: argparse.Namespace) -> int:
        from workbench.safe_output import OutputError, describe_os_error
        from workbench.store import LogError

        try:
            code = func(args)
            sys.stdout.flush()
            return code
        except BrokenPipeError:
            return stdout_closed()
        except (LogError, OutputError) as err:
            return _fail(str(err))
        except OSError as err:
            where = f" {err.filename}" if getattr(err, "filename", None) else " the output"
            stdout_closed()
            return _fail(f"cannot write{where}: {describe_os_error(err)}")
        except KeyboardInterrupt:
            return 130

    run.__name__ = func.__name__
    run.__doc__ = func.__doc__
    return run


def stdout_closed() -> int:
    """Point standard output at the null device after it failed (closed pipe, full disk), so that
    Python's own flush at exit has nothing left to fail on; returns exit code 1."""
    import os

    try:
        devnull = os.open(os.devnull, os.O_WRONLY)
        os.dup2(devnull, sys.stdout.fileno())
        os.close(devnull)
    except (OSError, ValueError, AttributeError):
        pass
    return 1


def _console(file: Any = None) -> Any:
    from rich.console import Console

    return Console(file=file, highlight=False, soft_wrap=False)


def _open(args: argparse.Namespace, *, create: bool = False) -> Any:
    from workbench.store import JobLog

    return JobLog.open(args.log, create=create)


def _write_out(args: argparse.Namespace, text: str) -> None:
    if args.output:
        from workbench.safe_output import write_output

        write_output(args.output, text)
        print(f"wrote {args.output}", file=sys.stderr)
    else:
        sys.stdout.write(text)


def _report_skipped(log: Any) -> None:
    """One line on stderr for each stored job that could not be read (the others were shown)."""
    for line in dict.fromkeys(getattr(log, "skipped", [])):
        print(f"shaftbench log: {line}; skipped", file=sys.stderr)


def _summary(record: Any) -> dict[str, Any]:
    full = record.as_dict()
    return {k: v for k, v in full.items() if k not in ("inputs", "result")}


def _cmd_list(args: argparse.Namespace) -> int:
    if args.limit < 1:
        return _fail("--limit: expected a whole number of 1 or more")
    from rich.table import Table

    from workbench.report.jobcard import literal, verdict_text, when
    from workbench.store.paths import log_target

    path = log_target(args.log)
    if isinstance(path, Path) and not path.exists():
        if args.json:
            sys.stdout.write("[]\n")
        else:
            print(f"no jobs saved yet (no job log at {path})")
        return EXIT_OK
    with _open(args, create=False) as log:
        filters = dict(text=args.text, verdict=args.verdict, since=args.since, until=args.until,
                       deleted=bool(args.deleted))
        records = log.search(limit=args.limit, **filters)
        total = log.count(**filters)
        _report_skipped(log)
    if args.json:
        from workbench.store.exchange import dumps_strict

        sys.stdout.write(dumps_strict([_summary(r) for r in records], indent=1) + "\n")
        return EXIT_OK
    console = _console()
    if not records:
        console.print("no jobs match" if total == 0 else "no jobs on this page")
        return EXIT_OK
    table = Table(title="jobs in the bin" if args.deleted else None, title_justify="left")
    for heading in ("id", "saved", "asset", "location", "verdict", "material", "by"):
        table.add_column(heading, justify="right" if heading == "id" else "left")
    for r in records:
        table.add_row(str(r.id), when(r.created_at), literal(r.asset), literal(r.location),
                      verdict_text(r.verdict), literal(r.material), literal(r.by))
    console.print(table)
    console.print(f"{len(records)} of {total} job{'s' if total != 1 else ''}")
    return EXIT_OK


def _cmd_show(args: argparse.Namespace) -> int:
    with _open(args) as log:
        record = log.get(args.id)
        if args.json:
            from workbench.store.exchange import dumps_strict

            sys.stdout.write(dumps_strict(record.as_dict(), indent=1) + "\n")
            return EXIT_OK
        reopened = log.reopen(args.id)
        history = log.changes(args.id)
    from rich.table import Table
    from rich.text import Text

    from workbench.report.jobcard import job_card_for_record, literal, when
    from workbench.report.recheck import recheck_text

    console = _console()
    console.print(job_card_for_record(record))
    inputs = Table.grid(padding=(0, 2))
    inputs.add_column(style="dim")
    inputs.add_column()
    for key, value in record.inputs.items():
        inputs.add_row(literal(key), literal(value))
    console.print(Text("Inputs as typed", style="bold"))
    console.print(inputs)
    if history:
        from workbench.report.jobcard import local_when

        console.print(Text("Changes since it was saved", style="bold"))
        changes = Table.grid(padding=(0, 2))
        for _ in range(3):
            changes.add_column()
        for change in history:
            changes.add_row(local_when(change["changed_at"]), literal(change["field"]),
                            Text.assemble(literal(cut(change["old"] or "-", 40)), " -> ",
                                          literal(cut(change["new"] or "-", 40))))
        console.print(changes)
    if record.deleted:
        console.print(Text(f"This job is in the bin since {when(record.deleted_at)}.", style="bold"))
    console.print(recheck_text(reopened))
    return EXIT_OK


def _cmd_export(args: argparse.Namespace) -> int:
    from contextlib import closing

    from workbench.store.exchange import write_csv, write_json

    writer = write_csv if args.format == "csv" else write_json
    with _open(args) as log, closing(log.iter_export_rows()) as rows:  # rows end before the log
        if args.output:
            from workbench.safe_output import open_output

            with open_output(args.output) as out:
                count = writer(rows, out)
            print(f"exported {count} job{'s' if count != 1 else ''} to {args.output}", file=sys.stderr)
        else:
            writer(rows, sys.stdout)
            sys.stdout.flush()
        _report_skipped(log)
    return EXIT_OK


def _cmd_import(args: argparse.Namespace) -> int:
    from workbench.store.exchange import read_jobs_file, read_log_file

    source = Path(args.file).expanduser()
    rows = read_log_file(source) if _is_sqlite_file(source) else read_jobs_file(source)
    bench = args.bench if args.bench is not None else source.stem
    with _open(args, create=True) as log:
        added = log.import_jobs(rows, bench=bench)
    skipped = len(rows) - added
    note = f" ({skipped} already in the log)" if skipped else ""
    print(f"imported {added} job{'s' if added != 1 else ''}{note}")
    return EXIT_OK


def _is_sqlite_file(path: Path) -> bool:
    try:
        with open(path, "rb") as handle:
            return handle.read(16) == b"SQLite format 3\x00"
    except OSError:
        return False


def _cmd_card(args: argparse.Namespace) -> int:
    from workbench.report.jobcard import card_page_for_records, export_card, job_card_for_record

    ids = list(dict.fromkeys(args.id))
    if args.format == "svg" and len(ids) > 1:
        return _fail("--format svg: one job a file (give one ID, or use --format html for several)")
    with _open(args) as log:
        records = [log.get(job_id) for job_id in ids]
    if args.format == "html":
        text = card_page_for_records(records, paper=args.paper)
    else:
        text = "\n".join(export_card(job_card_for_record(r), args.format) for r in records)
    _write_out(args, text)
    return EXIT_OK


OUTCOME_WORDS = ("still-running", "failed", "removed")


def _outcome_arg(words: list[str]) -> dict[str, str]:
    """``--outcome WORD [DATE]`` as the log's outcome fields (``none`` clears them)."""
    word = words[0].strip().casefold().replace("_", "-").replace(" ", "-")
    if word in ("none", "clear", "-"):
        if len(words) > 1:
            raise ValueError("--outcome none takes no date")
        return {"outcome": "", "outcome_date": ""}
    if word in ("running", "still", "ok"):
        word = "still-running"
    if word not in OUTCOME_WORDS:
        raise ValueError(f"--outcome: expected still-running, failed DATE, removed or none, got {cut(words[0])!r}")
    if len(words) > 2:
        raise ValueError(f"--outcome: expected a word and at most one date, got {cut(' '.join(words))!r}")
    return {"outcome": word, "outcome_date": words[1] if len(words) == 2 else ""}


def _cmd_edit(args: argparse.Namespace) -> int:
    from workbench.report.jobcard import OUTCOMES, local_when

    changes: dict[str, str] = {
        name: getattr(args, name) for name in ("asset", "location", "by", "note", "fitted")
        if getattr(args, name) is not None
    }
    if args.fitted_on is not None:
        changes["fitted_on"] = "" if args.fitted_on.strip().casefold() in ("none", "-", "") else args.fitted_on
    if args.outcome:
        try:
            changes.update(_outcome_arg(args.outcome))
        except ValueError as err:
            return _fail(str(err))
    if not changes and args.add_note is None:
        return _fail("edit: nothing to change; give --note, --add-note, --fitted, --fitted-on, --outcome, "
                     "--asset, --location or --by (see shaftbench log edit --help)")
    with _open(args) as log:
        before = log.get(args.id)
        if args.add_note is not None:
            base = changes.get("note", before.note)
            changes["note"] = f"{base}\n{args.add_note}" if base else args.add_note
        after = log.update(args.id, **changes)
    changed = [name for name in changes if getattr(after, name) != getattr(before, name)]
    if not changed:
        print(f"job {args.id}: nothing changed")
        return EXIT_OK
    ending = ""
    if after.outcome:
        ending = f"; outcome {OUTCOMES.get(after.outcome, after.outcome)}"
        ending += f" on {after.outcome_date}" if after.outcome_date else ""
    print(f"job {args.id} updated ({', '.join(changed)}) at {local_when(after.updated_at)}{ending}")
    return EXIT_OK


def _cmd_delete(args: argparse.Namespace) -> int:
    with _open(args) as log:
        log.delete(args.id)
    print(f"job {args.id} moved to the bin (shaftbench log restore {args.id} brings it back)")
    return EXIT_OK


def _cmd_restore(args: argparse.Namespace) -> int:
    with _open(args) as log:
        log.restore(args.id)
    print(f"job {args.id} restored")
    return EXIT_OK


def _jobs(n: int) -> str:
    return f"{n} job{'s' if n != 1 else ''}"


def _confirmed(question: str) -> bool:
    """Ask a yes/no question on the terminal (prompt on stderr); only y or yes is a yes."""
    sys.stderr.write(f"{question} [y/N] ")
    sys.stderr.flush()
    answer = sys.stdin.readline()  # "" at end of input: no
    return answer.strip().casefold() in ("y", "yes")


def _cmd_purge(args: argparse.Namespace) -> int:
    interactive = sys.stdin is not None and sys.stdin.isatty()
    if not args.yes and not interactive:
        return _fail("purge removes the jobs in the bin for good; add --yes to confirm "
                     "(input is not a terminal)")
    with _open(args) as log:
        if not args.yes:
            in_bin = log.count(deleted=True)
            if in_bin == 0:
                print("the bin is empty: nothing to remove")
                return EXIT_OK
            if not _confirmed(f"Remove the {_jobs(in_bin)} in the bin for good? This cannot be undone."):
                print("nothing removed")
                return EXIT_DECLINED
        removed = log.purge()
    print(f"removed {_jobs(removed)} from the bin for good")
    return EXIT_OK


def _cmd_asset(args: argparse.Namespace) -> int:
    from workbench.report.asset_report import history_html, history_renderable
    from workbench.store.assets import asset_history, history_json

    with _open(args) as log:
        history, _ = asset_history(log, args.tag)
    if args.output:
        from workbench.safe_output import write_output

        write_output(args.output, history_html(history))
        print(f"wrote the asset report to {args.output}", file=sys.stderr)
        return EXIT_OK
    if args.json:
        import json

        sys.stdout.write(json.dumps(history_json(history), ensure_ascii=False, indent=1) + "\n")
        return EXIT_OK
    console = _console()
    console.print(history_renderable(history, width=min(console.width, 120)))
    return EXIT_OK


def _cmd_assets(args: argparse.Namespace) -> int:
    from workbench.report.asset_report import sites_renderable
    from workbench.store.assets import site_assets

    with _open(args) as log:
        found = site_assets(log)
    if args.json:
        import json

        sys.stdout.write(json.dumps(found, ensure_ascii=False, indent=1) + "\n")
        return EXIT_OK
    if not found:
        print("no job in the log names an asset")
        return EXIT_OK
    _console().print(sites_renderable(found))
    return EXIT_OK


def _cmd_seed_demo(args: argparse.Namespace) -> int:
    from workbench.demo_history import demo_history_rows

    rows = demo_history_rows()
    with _open(args, create=True) as log:
        added = log.import_jobs(rows)
    print(f"added {added} demo job{'s' if added != 1 else ''} for asset CV-07 head drive"
          + (f" ({len(rows) - added} already in the log)" if added < len(rows) else ""))
    return EXIT_OK
