"""The driven machine's duty -> service factor, from data/service_factors.csv (``--duty``).

Syntax (ours): ``[MACHINE-]LOAD HOURS`` — LOAD is the driven machine's shock class, one of
uniform, moderate, heavy, extreme (the table's columns); HOURS the running time a day, ``10h``,
``10 h``, ``10 h/day`` or ``1/2h``. An optional machine name before the class, joined by ``-``,
is kept only as a label: ``conveyor-uniform 10h``, ``crusher-heavy 24h``, ``uniform 3h``.
The table's row for the hours is the first whose hours are at least the duty (6 h reads the
3-10 h row). For a shaft's strength check the factor is never below 1.0 (the floor).
"""

from __future__ import annotations

import re

from workbench.units import QuantityError, parse_number

SHAFT_FLOOR = 1.0
_DUTY = re.compile(r"^\s*(?:(?P<machine>[a-z][\w-]*?)-)?(?P<load>[a-z]+)\s+(?P<hours>[\d./\s-]+?)\s*(?:h|hr|hrs|hours?)"
                   r"(?:\s*/\s*(?:d|day))?\s*$", re.I)
HELP = ("driven machine's duty for the service factor: '[MACHINE-]LOAD HOURS', LOAD uniform | moderate | heavy | "
        "extreme, HOURS a day, e.g. 'conveyor-uniform 10h', 'crusher-heavy 24h' (AGMA table, data/service_factors.csv)")


def duty_service_factor(field: str, text: str) -> tuple[float, str]:
    """(service factor >= 1.0, how it was read) for a duty; raises QuantityError naming ``field``."""
    from workbench.core.tables import SERVICE_LOADS, service_factor

    match = _DUTY.match(text)
    if not match:
        raise QuantityError(field, f"{text!r}: write the load class and hours a day, e.g. 'uniform 10h' or "
                                   "'conveyor-moderate 24h'")
    load = match["load"].lower()
    if load not in SERVICE_LOADS:
        raise QuantityError(field, f"unknown load class {match['load']!r}; expected one of {', '.join(SERVICE_LOADS)}")
    hours = parse_number(field, match["hours"].strip())
    if not 0 < hours <= 24:
        raise QuantityError(field, f"{hours:g} hours a day is out of range; expected over 0 up to 24")
    factor = service_factor(hours, load)
    machine = f"{match['machine']}, " if match["machine"] else ""
    used = max(factor, SHAFT_FLOOR)
    floor = f" (table {factor:g}, floor 1.0 for the shaft)" if factor < SHAFT_FLOOR else ""
    return used, f"{text!r} read as {machine}{load} load, {hours:g} h a day: service factor {used:g}{floor}"
