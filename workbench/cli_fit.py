"""``shaftbench fit SIZE CLASS``: the lathe-side limits and fits calculator.

    shaftbench fit 35mm k6
    shaftbench fit 1.5in h6
    shaftbench fit 40mm H7/k6 [--bore 40.010mm]
    shaftbench fit 35mm k6 --measured 34.985mm [--measured 34.990mm 34.987mm] [--temperature 45C]
                   [--uncertainty 0.002mm] [--json]

Exit 0 computed, 2 bad input (one line naming the field).
"""

from __future__ import annotations

import argparse
import json
import sys


def add_fit_command(commands) -> None:
    fit = commands.add_parser("fit", help="ISO 286 limits of a class or a fit; measured sizes against them")
    fit.add_argument("size", metavar="SIZE", help="nominal size, e.g. 35mm or 1.5in (bare number: mm)")
    fit.add_argument("fit_class", metavar="CLASS", help="a class (k6, H7, js6) or a fit HOLE/SHAFT (H7/k6)")
    fit.add_argument("--measured", metavar="LEN", nargs="+", action="append",
                     help="measured size(s); repeat the option per section along the part, give several "
                          "readings (e.g. at 0 and 90 degrees) after one option; a fit's readings are of its shaft")
    fit.add_argument("--temperature", metavar="TEMP", help="part temperature when measured, e.g. 45C (refers the reading to 20 degC, ISO 1)")
    fit.add_argument("--expansion", metavar="PER_K", help="expansion coefficient per K (default steel 11.5e-6)")
    fit.add_argument("--uncertainty", metavar="LEN", help="measurement uncertainty U; narrows the acceptance zone (ISO 14253-1)")
    fit.add_argument("--bore", metavar="LEN", help="measured bore of a reused hub or bearing: the shaft range for the fit")
    fit.add_argument("--json", action="store_true", help="print one JSON object (SI units)")
    fit.set_defaults(func=run_fit)


def run_fit(args: argparse.Namespace) -> int:
    from workbench.fitcalc import fit_inputs, fit_text

    from workbench.job import JobInputError

    measured = [[part for value in group for part in value.split(",") if part.strip()] for group in (args.measured or [])]
    try:
        result = fit_inputs(args.size, args.fit_class, measured=measured or None, temperature=args.temperature,
                            uncertainty=args.uncertainty, expansion=args.expansion, bore=args.bore)
    except JobInputError as err:
        # SIZE and CLASS are positional: name them as the usage line does, not as options
        positional = {"size": "SIZE", "class": "CLASS"}.get(err.field)
        if positional is None:
            raise
        raise JobInputError(positional, f"{err.message.rstrip()}") from None
    if args.json:
        sys.stdout.write(json.dumps(result, indent=2, allow_nan=False) + "\n")
    else:
        sys.stdout.write(fit_text(result) + "\n")
    return 0
