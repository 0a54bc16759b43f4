"""The turning sheet inside the job contract: read the fitter's typed options and give each
shaft of a result its ``turning`` rows and ``keyseat``.

Input keys (CLI options): ``bearing`` (--bearing, an ISO 15 designation such as 6208),
``bearing_mounting`` (--bearing-mounting pressed | adapter-sleeve | insert), ``rotating_ring``
(--rotating-ring inner | outer), ``bearing_load`` (--bearing-load light | normal | heavy),
``journal_class`` / ``seat_class`` (--journal-class, --seat-class: override the recommendation),
``key_fit`` (--key-fit free | normal | tight), ``turning_sheets`` (--turning-sheets candidate |
existing | both: which sheets the report and the job card print; the JSON has every shaft's).
"""

from __future__ import annotations

import functools
from typing import Mapping

from workbench.core.bearings import BearingError, bearing
from workbench.core.fit_advice import KEY_FITS, LOADS, MOUNTINGS, ROTATING_RINGS
from workbench.core.iso286 import ToleranceError, parse_class
from workbench.core.stress_raisers import stress_raisers
from workbench.core.tables import key_for_diameter
from workbench.core.turning import TurningOptions, turning_sheet, uniform_steps
from workbench.units import LENGTH, QuantityError, parse_quantity

TURNING_KEYS = ("bearing", "bearing_mounting", "rotating_ring", "bearing_load", "journal_class", "seat_class",
                "key_fit", "turning_sheets")
SHEET_CHOICES = ("candidate", "existing", "both")
_MOUNTING_ALIASES = {"press": "pressed", "pressed-on": "pressed", "cylindrical": "pressed", "sleeve": "adapter-sleeve",
                     "adapter": "adapter-sleeve", "set-screw": "insert", "setscrew": "insert",
                     "eccentric-collar": "insert", "collar": "insert", "insert-unit": "insert"}


def _input_error(field: str, message: str) -> Exception:
    """The job contract's JobInputError (imported here, at the error: workbench.job imports this module)."""
    from workbench.job import JobInputError

    return JobInputError(field, message)


def _given(inputs: Mapping[str, str], key: str) -> str:
    value = inputs.get(key)
    return "" if value is None else str(value).strip()


def _choice(inputs, key, choices, default, aliases=None) -> str:
    text = _given(inputs, key).lower()
    if not text:
        return default
    text = (aliases or {}).get(text, text)
    if text not in choices:
        raise _input_error(key, f"unknown {text!r}; expected one of {', '.join(choices)}")
    return text


def turning_options(inputs: Mapping[str, str], element: str):
    """TurningOptions from the typed inputs; raises JobInputError naming the field."""
    b = None
    if _given(inputs, "bearing"):
        try:
            b = bearing(_given(inputs, "bearing"))
        except BearingError as err:
            raise _input_error("bearing", str(err)) from None
    classes = {}
    for key in ("journal_class", "seat_class"):
        text = _given(inputs, key)
        if not text:
            classes[key] = None
            continue
        try:
            letters, grade, is_hole = parse_class(text)
        except ToleranceError as err:
            raise _input_error(key, str(err)) from None
        if is_hole:
            raise _input_error(key, f"{text!r} is a hole class; give the shaft's class in lower case, e.g. k6")
        classes[key] = f"{letters}{grade}"
    hub_length = None
    if _given(inputs, "hub_length"):
        try:
            hub_length = parse_quantity("hub_length", _given(inputs, "hub_length"), LENGTH, "mm")
        except QuantityError as err:
            raise _input_error(err.field, err.message) from None
    mounting = _choice(inputs, "bearing_mounting", MOUNTINGS, "pressed", _MOUNTING_ALIASES)
    if b is not None and b.tapered_bore and not _given(inputs, "bearing_mounting"):
        mounting = "adapter-sleeve"
    return TurningOptions(
        bearing=b, mounting=mounting,
        rotating=_choice(inputs, "rotating_ring", ROTATING_RINGS, "inner"),
        load=_choice(inputs, "bearing_load", LOADS, "normal"),
        element=element, journal_class=classes["journal_class"], seat_class=classes["seat_class"],
        key_fit=_choice(inputs, "key_fit", KEY_FITS, "normal"), hub_length_m=hub_length,
    )


def sheets_wanted(inputs: Mapping[str, str]) -> str:
    """Which shafts' sheets the report and card print: candidate (default), existing or both."""
    return _choice(inputs, "turning_sheets", SHEET_CHOICES, "candidate")


def _turned_size_m(shaft: Mapping) -> float:
    dims = shaft["dimensions_m"]
    return dims["second_m"] if shaft["profile"] == "flat" and dims.get("second_m") else dims["size_m"]


def _assumed_fillet_m(shaft: Mapping, diameter_m: float) -> float:
    """The fillet radius the strength check assumed at a shoulder typed in the spec (r/d of
    data/stress_raisers.csv: sharp 0.02, rounded 0.1); 0 where the spec names no shoulder."""
    word = {"sharp": "sharp-shoulder", "rounded": "round-shoulder"}.get(shaft.get("shoulder") or "none")
    return 0.0 if word is None else stress_raisers()[word].notch_radius_per_d * diameter_m


def attach_turning(result: dict, inputs: Mapping[str, str]) -> None:
    """Give each shaft of ``result`` its ``turning`` rows and ``keyseat`` (None when not keyed),
    plus ``turning_sheet`` (bearing, notes, options); sets ``result["turning_sheets"]``.
    Raises JobInputError naming the field (a class not defined at a step's size)."""
    options = turning_options(inputs, result["mount"]["element"])
    result["turning_sheets"] = sheets_wanted(inputs)
    for shaft in result["shafts"]:
        steps = shaft.get("steps")
        if not steps:
            d = _turned_size_m(shaft)
            steps = uniform_steps(d, bool(shaft.get("keyed")), _assumed_fillet_m(shaft, d))
        standard = "ansi" if _is_inch_spec(shaft.get("spec", "")) else "iso"
        key = _key_for(shaft, steps, standard)
        try:
            sheet = turning_sheet(steps, options, key=key, key_standard=standard)
        except ToleranceError as err:
            field = "journal_class" if options.journal_class else "seat_class" if options.seat_class else "shaft"
            raise _input_error(field, str(err)) from None
        shaft["turning"] = sheet["rows"]
        shaft["keyseat"] = sheet["keyseat"]
        shaft["turning_sheet"] = {"bearing": sheet["bearing"], "notes": sheet["notes"], "options": sheet["options"]}


def _key_for(shaft: Mapping, steps, standard: str) -> dict | None:
    """The keyseat's key (width, shaft depth t1, length) at the keyed seat: the shaft's own key
    when the seat is at the shaft's size, else the standard key for the seat's diameter
    (DIN 6885-1 / ANSI B17.1, data/keys_*.csv); the key length the key check used, if any."""
    seats = [s for s in steps if s["kind"] == "seat" and s.get("keyed")]
    if not seats:
        return None
    d = float(seats[0]["diameter_m"])
    dims = shaft["dimensions_m"]
    length = (shaft.get("key") or {}).get("key_length_m")
    if dims.get("key_width_m") and dims.get("key_depth_m") and abs(dims["size_m"] - d) < 1e-9:
        return {"width_m": dims["key_width_m"], "depth_m": dims["key_depth_m"], "length_m": length}
    row = key_for_diameter(d, standard)
    if row is None:
        return None
    return {"width_m": row.width_m, "depth_m": row.shaft_depth_m, "length_m": length}


@functools.lru_cache(maxsize=256)
def _is_inch_spec(spec: str) -> bool:
    from workbench.specs import parse_spec
    from workbench.units import QuantityError

    try:
        return parse_spec(spec, "shaft").key_standard == "ansi"
    except QuantityError:  # the spec was read once already; this only picks the key standard
        return False
