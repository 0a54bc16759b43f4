"""The lathe-side fits calculator: typed strings -> a JSON-ready dict (CLI ``fit`` and the
workbench's fits view share it).

    fit_inputs("35mm", "k6") -> {"size_m", "class", "upper_deviation_m", ...}
    fit_inputs("40mm", "H7/k6") -> {"hole": {...}, "shaft": {...}, "max_clearance_m", ...}

Raises JobInputError naming the field (size, class, measured, temperature, uncertainty, bore).
"""

from __future__ import annotations

import re

from workbench.job import JobInputError

_INCH_UNITS = {"in", "inch", "inches"}
_TEMPERATURE = re.compile(r"^\s*([+-]?\d+(?:\.\d*)?)\s*(°\s*C|degC|deg\s*C|C|°\s*F|degF|deg\s*F|F|K)?\s*$", re.I)


def _length(field: str, text: str, *, allow_zero: bool = False) -> float:
    from workbench.units import LENGTH, QuantityError, parse_quantity

    try:
        return parse_quantity(field, str(text), LENGTH, "mm", allow_zero=allow_zero)
    except QuantityError as err:
        raise JobInputError(err.field, err.message) from None


def is_inch(text: str) -> bool:
    """True when a typed length is in inches (``1.5in``, ``1-1/2"``)."""
    from workbench.units import QuantityError, split_number

    try:
        _, unit = split_number("size", str(text))
    except QuantityError:
        return False
    return unit.strip().lower() in _INCH_UNITS


def parse_temperature(text: str) -> float:
    """A part temperature typed as ``45C``, ``45 degC``, ``113F`` or ``318K`` (bare = degC) -> degC."""
    match = _TEMPERATURE.match(str(text))
    if not match:
        raise JobInputError("temperature", f"{str(text).strip()!r} is not a temperature; expected e.g. 45C, 113F or 318K")
    value = float(match[1])
    unit = (match[2] or "C").replace("°", "").replace(" ", "").lower().replace("deg", "")
    celsius = {"c": value, "f": (value - 32.0) * 5.0 / 9.0, "k": value - 273.15}[unit]
    if not -60.0 <= celsius <= 300.0:
        raise JobInputError("temperature", f"{str(text).strip()!r} is out of range; expected -60 to 300 degC")
    return celsius


def _zone_dict(zone) -> dict:
    return {
        "size_m": zone.size_m,
        "class": zone.name,
        "part": "hole" if zone.is_hole else "shaft",
        "upper_deviation_m": zone.upper_deviation_m,
        "lower_deviation_m": zone.lower_deviation_m,
        "max_m": round(zone.max_m, 12),
        "min_m": round(zone.min_m, 12),
        "tolerance_m": round(zone.tolerance_m, 12),
    }


def fit_inputs(size_text: str, class_text: str, *, measured: list[list[str]] | None = None,
               temperature: str | None = None, uncertainty: str | None = None,
               expansion: str | None = None, bore: str | None = None) -> dict:
    """Limits of one class or a fit at a typed size, optionally against measured readings.

    ``measured``: sections, each a list of readings (a fit's readings are of its shaft). ``bore``
    (fits only): a measured hub or bearing bore; gives the shaft range that keeps the fit's
    clearances against that bore.
    """
    from workbench.core.fits import fit
    from workbench.core.iso286 import ToleranceError, limits
    from workbench.core.measured import STEEL_EXPANSION_PER_K, assess, shaft_range_for_bore

    size_m = _length("size", size_text)
    inch = is_inch(size_text)
    text = str(class_text).strip()
    try:
        if "/" in text:
            pair = fit(size_m, text)
            result = {
                "size_m": size_m, "class": f"{pair.hole.name}/{pair.shaft.name}",
                "hole": _zone_dict(pair.hole), "shaft": _zone_dict(pair.shaft),
                "max_clearance_m": pair.max_clearance_m, "min_clearance_m": pair.min_clearance_m,
                "kind": pair.kind,
            }
            zone = pair.shaft
        else:
            zone = limits(size_m, text)
            result = _zone_dict(zone)
    except ToleranceError as err:
        field = "size" if "outside ISO 286" in str(err) else "class"
        raise JobInputError(field, str(err)) from None
    result["units"] = "inch" if inch else "metric"
    if bore is not None:
        if "hole" not in result:
            raise JobInputError("bore", "give a fit (HOLE/SHAFT, e.g. H7/k6) to size a shaft to a measured bore")
        bore_m = _length("bore", bore)
        high, low = shaft_range_for_bore(bore_m, result["max_clearance_m"], result["min_clearance_m"])
        result["bore_m"] = bore_m
        result["shaft_for_bore"] = {"max_m": high, "min_m": low,
                                    "note": "shaft range that keeps the fit's clearances against the measured bore"}
    if measured:
        sections = [[_length("measured", r) for r in section] for section in measured if section]
        if not sections:
            raise JobInputError("measured", "give at least one reading, e.g. 34.985mm")
        temp = parse_temperature(temperature) if temperature not in (None, "") else None
        u = _length("uncertainty", uncertainty, allow_zero=True) if uncertainty not in (None, "") else 0.0
        if 2 * u >= zone.tolerance_m:
            raise JobInputError("uncertainty", f"{uncertainty!r} is as large as half the tolerance; no reading could be proven in")
        alpha = STEEL_EXPANSION_PER_K
        if expansion not in (None, ""):
            from workbench.units import QuantityError, parse_number

            try:
                alpha = parse_number("expansion", str(expansion).replace("/K", "").strip())
            except QuantityError as err:
                raise JobInputError(err.field, err.message) from None
            if not 0.0 <= alpha <= 50e-6:
                raise JobInputError("expansion", f"{expansion!r} is out of range; expected 0 to 50e-6 per K (steel 11.5e-6)")
        a = assess(zone.max_m, zone.min_m, sections, part_temperature_c=temp, expansion_per_K=alpha, uncertainty_m=u)
        result.update({
            "measured_m": a.measured_m, "within": a.within, "outside_by_m": a.outside_by_m,
            "readings_m": [list(s) for s in a.readings_m], "decision": a.decision,
            "acceptance_max_m": a.acceptance_max_m, "acceptance_min_m": a.acceptance_min_m,
            "uncertainty_m": u, "part_temperature_C": temp, "temperature_correction_m": a.temperature_correction_m,
            "ovality_m": a.ovality_m, "taper_m": a.taper_m,
        })
        if bore is not None:  # the clearance the measured shaft makes in the measured bore
            result["measured_clearance_m"] = result["bore_m"] - a.measured_m
    return result


# --------------------------------------------------------------------------- text


def _mm(value_m: float, signed: bool = False) -> str:
    return f"{value_m * 1000:+.3f} mm" if signed else f"{value_m * 1000:.3f} mm"


def _inch(value_m: float, signed: bool = False) -> str:
    return f"{value_m / 0.0254:+.4f} in" if signed else f"{value_m / 0.0254:.4f} in"


def _both(value_m: float, inch: bool, signed: bool = False) -> str:
    return f"{_inch(value_m, signed)} ({_mm(value_m, signed)})" if inch else _mm(value_m, signed)


def _zone_lines(zone: dict, inch: bool) -> list[str]:
    return [
        f"{zone['class']:<6} {zone['part']:<5}  max {_both(zone['max_m'], inch)}   min {_both(zone['min_m'], inch)}",
        f"{'':13}deviations {_both(zone['upper_deviation_m'], inch, True)} / {_both(zone['lower_deviation_m'], inch, True)}"
        f"   tolerance {_both(zone['tolerance_m'], inch)}",
    ]


def fit_text(result: dict) -> str:
    """The calculator's plain-text answer (inch limits to 0.0001 in when the size was in inches)."""
    inch = result.get("units") == "inch"
    size = f"{result['size_m'] / 0.0254:.4f} in ({result['size_m'] * 1000:g} mm)" if inch else f"{result['size_m'] * 1000:g} mm"
    lines = [f"{size} {result['class']}"]
    if "hole" in result:
        lines += _zone_lines(result["hole"], inch) + _zone_lines(result["shaft"], inch)
        lines.append(f"{result['kind']} fit: clearance max {_both(result['max_clearance_m'], inch, True)}, "
                     f"min {_both(result['min_clearance_m'], inch, True)} (negative = interference)")
        if "shaft_for_bore" in result:
            sfb = result["shaft_for_bore"]
            lines.append(f"for the measured bore {_both(result['bore_m'], inch)}: turn the shaft to "
                         f"{_both(sfb['min_m'], inch)} ... {_both(sfb['max_m'], inch)}")
    else:
        lines += _zone_lines(result, inch)
    if "measured_m" in result:
        by = result["outside_by_m"]
        um = by * 1e6
        thou = by / 0.0254 * 1000
        where = ("within the limits" if result["within"] else
                 f"{'over the max' if by > 0 else 'under the min'} by {abs(um):.1f} um ({abs(thou):.2f} thou)")
        at = " (referred to 20 degC)" if result.get("part_temperature_C") is not None else ""
        lines.append(f"measured {_both(result['measured_m'], inch)}{at}: {where} — {result['decision']}")
        if result.get("uncertainty_m"):
            lines.append(f"acceptance zone narrowed by the uncertainty (ISO 14253-1): "
                         f"{_both(result['acceptance_min_m'], inch)} ... {_both(result['acceptance_max_m'], inch)}")
        if result.get("part_temperature_C") is not None:
            lines.append(f"part at {result['part_temperature_C']:g} degC: reading corrected by "
                         f"{result['temperature_correction_m'] * 1e6:+.1f} um to 20 degC (ISO 1)")
        if result.get("ovality_m") is not None:
            lines.append(f"ovality {result['ovality_m'] * 1e6:.1f} um")
        if result.get("taper_m") is not None:
            lines.append(f"taper {result['taper_m'] * 1e6:.1f} um between sections")
    lines.append("Limits per ISO 286-1/-2. A bench check: confirm critical fits against the drawing.")
    return "\n".join(lines)
