"""Write data/unit_spellings.json: the common unit spellings of each kind of field, read by pint.

    python tools/make_unit_table.py [--check]

For every kind in :mod:`workbench.units` and every spelling in ``SPELLINGS`` the full parse path
(pint, with every per-field refusal; the table itself switched off) reads ``1 <spelling>`` once for
each field of that kind. A spelling enters the table only when every field accepts it with one and
the same factor; the factor is that value (the kind's SI unit per one of the spelling), and pint's
dimension of the spelling is written beside it. Spellings a field refuses are listed in the
script's output, never in the table. ``--check`` writes nothing and exits 1 when the file on disk
differs from what pint gives today (the test suite does the same check).
"""

from __future__ import annotations

import argparse
import json
import pathlib
import sys

ROOT = pathlib.Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

from workbench import unit_table, units  # noqa: E402
from workbench.units import DENSITY, FORCE, LENGTH, MASS, POWER, SPEED, STRESS, TORQUE, TWIST_RATE  # noqa: E402

# the spellings a fitter types most, as they read after units.split_number's rewrites
# ("Nm" -> "N*m", "lb-in" -> "lbf*in", '"' -> "in", "KW" -> "kW", "HP" -> "hp", ...)
SPELLINGS = {
    POWER: ("W", "kW", "MW", "hp", "watt", "watts", "kilowatt", "kilowatts", "horsepower"),
    SPEED: ("rpm", "r/min", "rev/min", "rad/s"),
    LENGTH: ("mm", "cm", "m", "in", "inch", "inches", "ft", "millimeter", "millimeters", "meter"),
    TORQUE: ("N*m", "kN*m", "N*mm", "lbf*in", "lbf*ft"),
    STRESS: ("Pa", "kPa", "MPa", "GPa", "psi", "ksi", "N/mm^2", "N/mm**2"),
    DENSITY: ("kg/m^3", "kg/m**3", "g/cm^3", "lb/in^3"),
    TWIST_RATE: ("deg/m", "degree/m", "deg/ft", "deg/in", "rad/m"),
    MASS: ("kg", "g", "lb", "t"),
    FORCE: ("N", "kN", "lbf"),
}

# the job inputs that read each kind (workbench/job.py, workbench/specs.py)
FIELDS = {
    POWER: ("power",),
    SPEED: ("speed",),
    LENGTH: ("pitch_diameter", "overhang", "shaft", "candidate", "bearing_span", "load_from_bearing",
             "hub_length", "journal", "seat", "fillet", "candidate_journal", "candidate_seat", "candidate_fillet",
             "driven_from_bearing"),
    TORQUE: ("torque",),
    STRESS: ("material", "candidate_material"),
    DENSITY: ("material", "candidate_material"),
    TWIST_RATE: ("twist_limit",),
    MASS: ("element_mass", "driven_mass"),
    FORCE: ("driven_load",),
}


def dimension(ureg, spelling: str) -> dict[str, float]:
    """pint's dimensionality of ``spelling`` as {base dimension: exponent}, sorted by name."""
    return {name: float(power) for name, power in sorted(ureg.parse_units(spelling).dimensionality.items())}


def build() -> tuple[dict, list[str]]:
    """The table as written to the file, and the lines saying what was left to pint and why."""
    ureg = units.registry()
    skipped: list[str] = []
    sections = []
    with unit_table.pint_only():
        for kind, spellings in SPELLINGS.items():
            entries = {}
            for spelling in spellings:
                _, unit_text = units.split_number("unit table", f"1 {spelling}")
                if unit_text != spelling:
                    skipped.append(f"{kind.name}: {spelling!r} reads as {unit_text!r} after the rewrites")
                    continue
                factors = set()
                for field in FIELDS[kind]:
                    try:
                        factors.add(units.parse_quantity(field, f"1 {spelling}", kind, spelling))
                    except units.QuantityError as err:
                        factors.add(f"refused: {err}")
                if len(factors) != 1 or not isinstance(next(iter(factors)), float):
                    skipped.append(f"{kind.name}: {spelling!r} left to pint ({'; '.join(map(str, factors))})")
                    continue
                entries[spelling] = {
                    "factor": factors.pop(),
                    "dimension": dimension(ureg, spelling),
                }
            sections.append({
                "kind": unit_table.kind_key(kind),
                "si_unit": kind.si_unit,
                "dimensionality": kind.dimensionality,
                "fields": list(FIELDS[kind]),
                "spellings": entries,
            })
    import pint

    table = {
        "about": "Common unit spellings per kind of field: factor to the kind's SI unit for one of the "
                 "spelling, and pint's dimension of it ({base dimension: exponent}). Made by tools/make_unit_table.py from pint and "
                 "the full parse path of workbench/units.py; do not edit by hand.",
        "source": f"pint {pint.__version__} default definitions (NIST SP 811 factors)",
        "kinds": sections,
    }
    return table, skipped


def render(table: dict) -> str:
    return json.dumps(table, indent=1, ensure_ascii=False) + "\n"


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--check", action="store_true", help="compare with the file on disk, write nothing")
    args = parser.parse_args(argv)
    table, skipped = build()
    path = ROOT / "data" / unit_table.TABLE_FILE
    for line in skipped:
        print(f"  not tabled: {line}")
    text = render(table)
    if args.check:
        same = path.exists() and path.read_text(encoding="utf-8") == text
        print(f"{path.name}: {'up to date' if same else 'DIFFERS from what pint gives today'}")
        return 0 if same else 1
    path.write_text(text, encoding="utf-8")
    print(f"wrote {path.name}: {sum(len(s['spellings']) for s in table['kinds'])} spellings")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
