"""The ``shaftbench`` command: the workbench by default, and scriptable subcommands.

    shaftbench [--demo] [--log PATH]        open the workbench (Textual)
    shaftbench check   [job options] [--json] [--save ...]
    shaftbench substitute --shaft SPEC [--json]
    shaftbench stock --profile square [--units metric] [--materials a,b] [job options] [--json]
    shaftbench log ...                      the job log (list, show, export, import, card, ...)
    shaftbench fit SIZE CLASS [--measured LEN ...] [--json]   ISO 286 limits and fits (cli_fit.py)

Exit codes: 0 computed, 2 bad input (one line on stderr, never a traceback).
Nothing heavy is imported at module level: ``--help`` and ``--version`` build no unit registry.
"""

from __future__ import annotations

import argparse
import json
import sys

from workbench import __version__

EXIT_OK = 0
EXIT_BAD_INPUT = 2

# (option, input key, help). Every option is a string exactly as typed; the job contract reads it.
JOB_OPTIONS = (
    ("--power", "power", "motor nameplate power, e.g. '7.5 kW' or '10 hp' (bare number: kW)"),
    ("--speed", "speed", "motor nameplate speed, e.g. '1450 rpm', '1450 r/min', '24 rev/s' (bare number: rpm; "
     "Hz is refused: on a nameplate it is the supply frequency)"),
    ("--torque", "torque", "torque at the shaft instead of power and speed, e.g. '50 N*m', '400 lbf*in'"),
    ("--ratio", "ratio", "drive ratio = motor speed / shaft speed: '25' or '25:1' a reduction (motor:shaft turns), "
     "'1:1.4' a speed-up; '1/25' is refused as ambiguous (default 1)"),
    ("--efficiency", "efficiency", "drive efficiency, '0.95' or '95%%' (default 1)"),
    ("--service-factor", "service_factor", "service factor for the driven machine's duty; overrides --duty "
     "(none given: 1.0 assumed and said in the warnings; below 1.0 the shaft is checked at 1.0)"),
    ("--duty", "duty", "driven machine's duty, picks the service factor from the AGMA table: '[MACHINE-]LOAD HOURS', "
     "LOAD uniform | moderate | heavy | extreme, HOURS a day, e.g. 'conveyor-uniform 10h', 'crusher-heavy 24h'"),
    ("--peak-factor", "peak_factor", "start/peak torque as a multiple of running torque (default 2; NEMA design B motors start at 0.7-2.75x full-load torque, EASA after NEMA MG 10)"),
    ("--mount", "mount", "coupling | sprocket | timing-belt | gear | vbelt | flat-belt (default coupling)"),
    ("--pitch-diameter", "pitch_diameter", "pitch diameter of the pulley/sprocket/gear (bare: mm)"),
    ("--overhang", "overhang", "nearest bearing to the element's load line (bare: mm)"),
    ("--shaft", "shaft", "the shaft as found, e.g. 'hex 27mm' (across flats), 'round 35mm keyed'"),
    ("--candidate", "candidate", "the replacement, e.g. 'hex 27mm' (across flats), 'square 30mm', 'flat 50mm x 20mm'"),
    ("--material", "material", "material key for both shafts (default 1045-cd), or 'custom Sy=350MPa Sut=600MPa'"),
    ("--candidate-material", "candidate_material", "material of the candidate, if different"),
    ("--required-sf", "required_sf", "required safety factor for the verdict (default 1.5)"),
    ("--criterion", "criterion", "fatigue criterion: goodman (default), gerber, asme-elliptic, soderberg"),
    ("--reliability", "reliability", "fatigue reliability, e.g. 0.9 (default) or 99%%"),
    ("--twist-limit", "twist_limit", "allowed twist, e.g. '0.25 deg/m' (default 1 deg over 20 diameters)"),
    # the layout and the steps of the shaft (README "Layout and steps")
    ("--bearing-span", "bearing_span", "bearing centre to centre (bare: mm); without it no deflection, slope or critical speed"),
    ("--bearing-type", "bearing_type", "for the slope limit: deep-groove-ball (default), self-aligning-ball, spherical-ball, "
                                       "spherical-roller, cylindrical-roller, tapered-roller"),
    ("--element-position", "element_position", "overhung (default, beyond bearing 1 at --overhang) | between the bearings"),
    ("--load-from-bearing", "load_from_bearing", "between: bearing 1 centre to the element's load line (bare: mm)"),
    ("--hub-length", "hub_length", "hub length of the element = its seat and key length (bare: mm)"),
    ("--element-mass", "element_mass", "mass of the element (bare: kg); its weight adds to the side load"),
    ("--journal", "journal", "bearing journal diameter of the shaft as found (default: uniform)"),
    ("--seat", "seat", "hub seat diameter of the shaft as found (default: uniform)"),
    ("--fillet", "fillet", "shoulder fillet radius of the shaft as found (default r/d 0.02)"),
    ("--candidate-journal", "candidate_journal", "journal the candidate is turned to (default: the existing journal)"),
    ("--candidate-seat", "candidate_seat", "hub seat the candidate is turned to (default: the existing seat)"),
    ("--candidate-fillet", "candidate_fillet", "shoulder fillet radius of the candidate (default r/d 0.02, the minimum to cut)"),
    ("--driven-position", "driven_position", "a driven element on the shaft: between (the bearings) | far-end (beyond bearing 2)"),
    ("--driven-from-bearing", "driven_from_bearing", "between: from bearing 1; far-end: beyond bearing 2 (bare: mm)"),
    ("--driven-mass", "driven_mass", "mass of the driven element (bare: kg)"),
    ("--driven-load", "driven_load", "radial load of the driven element besides its weight (bare: N)"),
    ("--hub-material", "hub_material", "hub material for key crushing: steel (default), steel-s355, cast-iron-200, ..."),
    # the turning sheet (workbench/turning_job.py)
    ("--bearing", "bearing", "bearing designation (ISO 15), e.g. 6208 or 22210: journal length, fit, fillet limit"),
    ("--bearing-mounting", "bearing_mounting", "pressed (default) | adapter-sleeve | insert (set-screw or eccentric-collar unit)"),
    ("--rotating-ring", "rotating_ring", "ring that turns relative to the load: inner (default) | outer"),
    ("--bearing-load", "bearing_load", "light | normal (default) | heavy, as a share of the bearing's rating"),
    ("--journal-class", "journal_class", "journal class instead of the recommended one, e.g. k6"),
    ("--seat-class", "seat_class", "hub seat class instead of the recommended one, e.g. j6"),
    ("--key-fit", "key_fit", "keyseat width fit: free | normal (default) | tight (DIN 6885-1)"),
    ("--turning-sheets", "turning_sheets", "sheets the report prints: candidate (default) | existing | both"),
)


class _Parser(argparse.ArgumentParser):
    """argparse that reports a usage error in one line and exits 2."""

    def error(self, message: str) -> None:  # noqa: D102 - argparse hook
        from workbench.cli_log import MESSAGE_LIMIT, cut

        # self.prog is the whole command ("shaftbench log show"), so the hint names the right help.
        message = cut(" ".join(message.split()), MESSAGE_LIMIT)
        sys.stderr.write(f"shaftbench: {message} (see {self.prog} --help)\n")
        raise SystemExit(EXIT_BAD_INPUT)

    def parse_args(self, args=None, namespace=None):  # noqa: D102 - argparse hook
        # Unknown options are reported by the subcommand that was chosen, so the hint names its help.
        parsed, extras = self.parse_known_args(args, namespace)
        if extras:
            words = [self.prog, getattr(parsed, "command", None), getattr(parsed, "log_command", None)]
            self.prog = " ".join(w for w in words if w)
            self.error(f"unrecognized arguments: {' '.join(extras)}")
        return parsed


def _add_job_options(parser: argparse.ArgumentParser, only: tuple[str, ...] | None = None) -> None:
    group = parser.add_argument_group("job")
    for option, key, text in JOB_OPTIONS:
        if only is None or key in only:
            group.add_argument(option, dest=key, metavar="TEXT", help=text)
    if only is None:
        group.add_argument("--as-bar", dest="as_bar", action="store_const", const="yes",
                           help="the candidate runs through square-bore bearings and hubs as it is: no journal, no keyseat")


def _add_output_options(parser: argparse.ArgumentParser, units_help: str = "units of the report") -> None:
    parser.add_argument("--json", action="store_true", help="print one JSON object (SI units) instead of the report")
    parser.add_argument("--units", choices=("metric", "inch"), default="metric", type=str.lower, help=units_help)


def build_parser() -> argparse.ArgumentParser:
    parser = _Parser(
        prog="shaftbench",
        description="Bench checks for replacement shafts of motor drives. With no subcommand, opens the workbench.",
        epilog="Results are a bench check, not a design approval: lock out the drive, refit guards, and "
        "defer to local codes and a licensed engineer.",
    )
    parser.add_argument("--version", action="version", version=f"shaftbench {__version__}")
    parser.add_argument("--demo", action="store_true", help="open the workbench on the demo job")
    parser.add_argument("--log", metavar="PATH", type=_log_path_arg,
                        help="job log file (default: $SHAFTBENCH_LOG or the user data dir)")
    commands = parser.add_subparsers(dest="command", metavar="COMMAND", parser_class=_Parser)

    check = commands.add_parser("check", help="check the shaft as found and/or a candidate")
    _add_job_options(check)
    _add_output_options(check)
    check.add_argument("--demo", action="store_true", help="start from the demo job (options given override it)")
    check.add_argument("--solver", action="store_true",
                       help="also solve keyed sections numerically and show the solver's keyseat peak beside Kts")
    _add_save_options(check)
    check.set_defaults(func=run_check)

    substitute = commands.add_parser("substitute", help="equivalent square, flat, hex and tube sizes for a shaft")
    _add_job_options(substitute, only=("shaft", "candidate"))
    _add_output_options(substitute)
    substitute.set_defaults(func=run_substitute)

    stock = commands.add_parser("stock", help="check standard stock sizes and find the smallest that passes")
    _add_job_options(stock)
    _add_output_options(stock, "metric | inch: the stock sizes searched and the report's units (default metric)")
    stock.add_argument("--demo", action="store_true", help="start from the demo job")
    stock.add_argument("--profile", default="round", help="round | square | flat | hex | tube (default round)")
    # the older name of --units, kept so that scripts written for it still run; not in --help
    stock.add_argument("--system", dest="units", choices=("metric", "inch"), type=str.lower,
                       help=argparse.SUPPRESS)
    stock.add_argument("--materials", metavar="KEYS", help="comma-separated material keys (default: the job's)")
    stock.add_argument("--all", action="store_true", help="list every size, not only up to the first passes")
    stock.add_argument("--keyed", action="store_true",
                       help="keyed stock: each bar's hub seat carries a keyseat, whatever its profile "
                            "(implied when the shaft as found is keyed)")
    stock.set_defaults(func=run_stock)

    _add_log_command(commands)
    from workbench.cli_fit import add_fit_command

    add_fit_command(commands)
    return parser


def _log_path_arg(text: str) -> str:
    from workbench.cli_log import log_path_arg

    return log_path_arg(text)


def _add_save_options(parser: argparse.ArgumentParser) -> None:
    from workbench.cli_log import add_save_options

    add_save_options(parser)


def _add_log_command(commands) -> None:
    from workbench.cli_log import add_log_command

    add_log_command(commands)


def _inputs_from(args: argparse.Namespace) -> dict[str, str]:
    inputs: dict[str, str] = {}
    if getattr(args, "demo", False):
        from workbench.demo import demo_inputs

        inputs.update(demo_inputs())
    for _, key, _ in JOB_OPTIONS:
        value = getattr(args, key, None)
        if value is not None:
            inputs[key] = value
    if getattr(args, "as_bar", None):
        inputs["as_bar"] = "yes"
    return inputs


def _print_json(data: dict) -> None:
    sys.stdout.write(json.dumps(data, indent=2, allow_nan=False) + "\n")


def _render(renderable) -> None:
    from rich.console import Console

    Console().print(renderable)


def run_check(args: argparse.Namespace) -> int:
    from workbench.job import evaluate_inputs

    inputs = _inputs_from(args)
    result = evaluate_inputs(inputs, solver=args.solver)
    job_id = None
    if getattr(args, "save", False):
        from workbench.cli_log import save_from_args

        job_id = save_from_args(args, inputs, result)
    if args.json:
        if job_id is not None:
            result = {**result, "job_id": job_id}
        _print_json(result)
    else:
        from workbench.report.check_report import render_check

        _render(render_check(result, args.units))
        if job_id is not None:
            print(f"saved as job {job_id}")
    return EXIT_OK


def run_substitute(args: argparse.Namespace) -> int:
    from workbench.job import substitute_inputs

    result = substitute_inputs(_inputs_from(args))
    if args.json:
        _print_json(result)
    else:
        from workbench.report.check_report import render_substitution

        _render(render_substitution(result, args.units))
    return EXIT_OK


def run_stock(args: argparse.Namespace) -> int:
    from workbench.job import stock_inputs

    keys = [k.strip() for k in args.materials.split(",") if k.strip()] if args.materials else None
    result = stock_inputs(_inputs_from(args), args.profile.lower(), args.units, keys, keyed=args.keyed)
    if not args.all:
        result = {**result, "rows": _up_to_first_passes(result["rows"])}
    if args.json:
        _print_json(result)
    else:
        from workbench.report.check_report import render_stock

        _render(render_stock(result, args.units))
    return EXIT_OK


def _up_to_first_passes(rows: list[dict]) -> list[dict]:
    """Rows of each material up to and including its first pass (the rest only grow)."""
    done: set[str] = set()
    kept = []
    for row in rows:
        if row["material"] in done:
            continue
        kept.append(row)
        if row["verdict"] == "pass":
            done.add(row["material"])
    return kept


def run_workbench(args: argparse.Namespace) -> int:
    if args.log is None:
        from workbench.store.paths import default_log_path

        default_log_path()  # an empty $SHAFTBENCH_LOG is refused before the workbench opens
    from workbench.tui.app import run

    return run(demo=args.demo, log_path=args.log)


def main(argv: list[str] | None = None) -> int:
    parser = build_parser()
    args = parser.parse_args(argv)
    func = getattr(args, "func", None) or run_workbench
    if "list" in (str(getattr(args, "material", "") or "").lower(),
                  str(getattr(args, "candidate_material", "") or "").lower()):
        from workbench.cli_materials import print_material_list

        return print_material_list(json_out=bool(getattr(args, "json", False)))
    try:
        code = func(args)
        sys.stdout.flush()  # a closed pipe or full disk shows here, not as "Exception ignored" at exit
        return code
    except BrokenPipeError:  # the reader went away (`| head`): nothing to say
        from workbench.cli_log import stdout_closed

        return stdout_closed()
    except Exception as err:  # user-caused errors are messages; anything else is our bug
        from workbench.cli_log import MESSAGE_LIMIT, cut, stdout_closed
        from workbench.job import JobInputError
        from workbench.store.log import LogError

        if isinstance(err, JobInputError):  # name the option, not the internal key (--pitch-diameter)
            from workbench.field_names import option_for

            err = f"{option_for(err.field)}: {err.message}"
        if isinstance(err, (str, LogError)):
            sys.stderr.write(f"shaftbench: {cut(' '.join(str(err).split()), MESSAGE_LIMIT)}\n")
            return EXIT_BAD_INPUT
        if isinstance(err, OSError) and err.errno is not None:
            from workbench.safe_output import describe_os_error

            stdout_closed()
            where = err.filename if getattr(err, "filename", None) else "the output"
            sys.stderr.write(f"shaftbench: cannot write {where}: {describe_os_error(err)}\n")
            return EXIT_BAD_INPUT
        raise


if __name__ == "__main__":
    raise SystemExit(main())
