"""The turning sheet: what to turn each step of a shaft to, and the keyseat to cut.

One row per turned step (body, journal, seat, shoulder) with the size, the tolerance class and
its limits, the length along the shaft, the shoulder fillet window and a finish; plus the
keyseat (width with class, micrometer reading across it with tolerance, length). Until a shaft
has a stepped layout, it is one diameter: a journal and a hub seat at the shaft's size.

Rules (common practice unless a standard is named; see workbench/core/fit_advice.py):
- journal class from the bearing's mounting, rotating ring, size and load, fitted against the
  bearing bore's own ISO 492 Normal tolerance; length = the bearing width when the bearing is
  named; fillet window: at least the fillet the strength check assumed, at most the bearing's
  smallest corner radius r_s min (ISO 15), so the ring seats on the shoulder;
- hub seat class by element (hub bored H7); length = the hub length when given;
- body: the bar as it is, h11 where it is turned to clean up (common practice);
- keyseat by DIN 6885-1 (metric) or ANSI B17.1 (inch).
SI floats (m); no printing.
"""

from __future__ import annotations

import functools
from dataclasses import dataclass
from typing import Mapping, Sequence

from workbench.core import fit_advice
from workbench.core.bearings import Bearing
from workbench.core.fits import fit
from workbench.core.iso286 import limits

BODY_CLASS = "h11"
M_PER_IN = 0.0254


@dataclass(frozen=True)
class TurningOptions:
    """What the fitter said about the bearings, hubs and key (None/defaults = recommended)."""

    bearing: Bearing | None = None
    mounting: str = "pressed"
    rotating: str = "inner"
    load: str = "normal"
    element: str = "coupling"
    journal_class: str | None = None
    seat_class: str | None = None
    key_fit: str = "normal"
    hub_length_m: float | None = None


def uniform_steps(diameter_m: float, keyed: bool, fillet_m: float = 0.0) -> list[dict]:
    """Today's single-diameter shaft as steps: one journal and the hub seat at its size."""
    return [
        {"kind": "journal", "label": "bearing journal", "diameter_m": diameter_m, "fillet_m": fillet_m, "keyed": False},
        {"kind": "seat", "label": "hub seat", "diameter_m": diameter_m, "fillet_m": fillet_m, "keyed": keyed},
    ]


def _inch(value_m: float) -> float:
    return round(value_m / M_PER_IN, 4)


@functools.lru_cache(maxsize=1024)  # pure in (size, class, kind): the journals of one shaft share them
def _zone_fields(diameter: float, cls: str, kind: str) -> tuple:
    """(class name, upper and lower deviation, max and min [m], max and min [in], Ra [um]) of a row."""
    zone = limits(diameter, cls)
    return (zone.name, zone.upper_deviation_m, zone.lower_deviation_m, round(zone.max_m, 12), round(zone.min_m, 12),
            _inch(zone.max_m), _inch(zone.min_m), fit_advice.finish_Ra_um(zone.name, kind))


def _row(step: Mapping, cls: str, reason: str, source: str) -> dict:
    diameter = float(step["diameter_m"])
    kind = step["kind"]
    name, upper, lower, max_m, min_m, max_in, min_in, ra = _zone_fields(diameter, cls, kind)
    x0, x1 = step.get("x_start_m"), step.get("x_end_m")
    return {
        "step": kind,
        "label": step.get("label") or kind,
        "diameter_m": diameter,
        "class": name,
        "upper_deviation_m": upper,
        "lower_deviation_m": lower,
        "max_m": max_m,
        "min_m": min_m,
        "max_in": max_in,
        "min_in": min_in,
        "x_start_m": x0,
        "x_end_m": x1,
        "length_m": None if x0 is None or x1 is None or float(x1) <= float(x0) else round(float(x1) - float(x0), 12),
        "fillet_min_m": None,
        "fillet_max_m": None,
        "finish_Ra_um": ra,
        "reason": reason,
        "source": source,
    }


def turning_sheet(steps: Sequence[Mapping], options: TurningOptions, *, key: Mapping | None = None,
                  key_standard: str = "iso", roller: bool | None = None) -> dict:
    """The sheet for one shaft: ``{"rows": [...], "keyseat": {...} | None, "bearing": {...} | None,
    "notes": [...]}``.

    ``steps``: mappings with ``kind``, ``diameter_m`` and optionally ``label``, ``x_start_m``,
    ``x_end_m``, ``fillet_m``, ``keyed`` (the shaft's steps, or :func:`uniform_steps`).
    ``key``: ``{"width_m", "depth_m"[, "length_m"]}`` of the keyseat (shaft depth t1; key length)
    when the seat is keyed.
    """
    b = options.bearing
    is_roller = roller if roller is not None else bool(b and "roller" in b.kind)
    rows, notes = [], []
    journals = [s for s in steps if s["kind"] == "journal"]
    for step in steps:
        kind = step["kind"]
        d = float(step["diameter_m"])
        if kind == "journal":
            if options.journal_class:
                cls, reason, source = options.journal_class, "class given by the fitter", "as given"
            else:
                rec = fit_advice.journal_class(d, mounting=options.mounting, rotating=options.rotating,
                                               load=options.load, roller=is_roller)
                cls, reason, source = rec.cls, rec.reason, rec.source
            row = _row(step, cls, reason, source)
            if b is not None:
                if abs(b.bore_m - d) < 1e-9:
                    row["length_m"] = b.width_m  # the journal is as long as the bearing is wide
                    row["fit"] = fit_advice.bearing_fit(b.bore_m, b.bore_upper_deviation_m, b.bore_lower_deviation_m, row["class"])
                else:
                    notes.append(f"bearing {b.designation} has a {b.bore_m * 1000:g} mm bore; the journal is "
                                 f"{d * 1000:g} mm: check the bearing designation")
        elif kind == "seat":
            if options.seat_class:
                cls, reason, source = options.seat_class, "class given by the fitter", "as given"
            else:
                rec = fit_advice.seat_class(options.element, options.load)
                cls, reason, source = rec.cls, rec.reason, rec.source
            row = _row(step, cls, reason, source)
            if row["length_m"] is None and options.hub_length_m:
                row["length_m"] = options.hub_length_m
            hub = fit(d, f"H7/{row['class']}")
            row["fit"] = {"hub_class": "H7", "max_clearance_m": hub.max_clearance_m,
                          "min_clearance_m": hub.min_clearance_m, "kind": hub.kind, "basis": "hub bored H7 (ISO 286)"}
        else:
            row = _row(step, BODY_CLASS, "free size: turned to clean up or left as drawn bar", "common practice (P)")
            if kind == "shoulder":
                row["length_m"] = None  # a shoulder is a place on the axis, not a length
                row["larger_diameter_m"] = step.get("larger_diameter_m")
        fillet = float(step.get("fillet_m") or 0.0)
        if kind == "shoulder" or fillet > 0.0:
            row["fillet_min_m"] = fillet
            near_journal = kind == "journal" or (kind == "shoulder" and journals and _next_to_journal(steps, step))
            if b is not None and near_journal:
                row["fillet_max_m"] = b.corner_radius_m
                if fillet > b.corner_radius_m + 1e-12:
                    notes.append(f"the fillet the strength check assumed ({fillet * 1000:g} mm) is larger than bearing "
                                 f"{b.designation}'s corner radius ({b.corner_radius_m * 1000:g} mm): the ring would not seat; "
                                 "use a relief groove or a spacer ring with a larger chamfer")
        rows.append(row)
    keyseat = None
    keyed_steps = [s for s in steps if s["kind"] == "seat" and s.get("keyed")]
    if key and keyed_steps:
        seat = keyed_steps[0]
        length = None
        if seat.get("x_start_m") is not None and seat.get("x_end_m") is not None:
            length = float(seat["x_end_m"]) - float(seat["x_start_m"])
        length = key.get("length_m") or options.hub_length_m or length or None  # 0 = not known
        keyseat = fit_advice.keyseat(float(seat["diameter_m"]), float(key["width_m"]), float(key["depth_m"]),
                                     key_standard, options.key_fit, length)
    bearing = None
    if b is not None:
        bearing = {"designation": b.designation, "kind": b.kind, "bore_m": b.bore_m, "outside_m": b.outside_m,
                   "width_m": b.width_m, "corner_radius_m": b.corner_radius_m, "tapered_bore": b.tapered_bore,
                   "bore_upper_deviation_m": b.bore_upper_deviation_m, "bore_lower_deviation_m": b.bore_lower_deviation_m,
                   "source": b.source, "mark": b.mark}
        if b.tapered_bore and options.mounting == "pressed":
            notes.append(f"{b.designation} has a tapered bore (K): it goes on an adapter sleeve or a tapered seat, "
                         "not pressed onto a cylindrical journal")
    return {"rows": rows, "keyseat": keyseat, "bearing": bearing, "notes": notes,
            "options": {"mounting": options.mounting, "rotating_ring": options.rotating, "load": options.load,
                        "element": options.element, "key_fit": options.key_fit}}


def _next_to_journal(steps: Sequence[Mapping], shoulder: Mapping) -> bool:
    """A shoulder whose smaller side is a journal (the journal's diameter, beside it)."""
    index = list(steps).index(shoulder)
    neighbours = [steps[i] for i in (index - 1, index + 1) if 0 <= i < len(steps)]
    return any(n["kind"] == "journal" and abs(float(n["diameter_m"]) - float(shoulder["diameter_m"])) < 1e-9
               for n in neighbours)
