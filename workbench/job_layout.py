"""The layout and the steps of a job: reading their inputs (strings as typed) and writing their
JSON (``steps``, ``key``, stiffness figures per shaft; ``layout`` and ``moment_diagram`` at the top).

Input keys (CLI option in brackets; bare numbers: mm, kg, N):
  bearing_span (--bearing-span)        bearing centre to centre
  bearing_type (--bearing-type)        key of data/bearing_slopes.csv (default deep-groove-ball)
  element_position (--element-position) overhung (default) | between
  load_from_bearing (--load-from-bearing) between: bearing 1 centre to the element's load line
  hub_length (--hub-length)            the driving element's hub = seat length (and key length)
  element_mass (--element-mass)        the driving element's mass
  journal, seat, fillet                the shaft as found, if not uniform
  candidate_journal, candidate_seat, candidate_fillet   the candidate as turned
  driven_position (--driven-position)  between | far-end: a driven element on the same shaft
  driven_from_bearing (--driven-from-bearing)  between: from bearing 1; far-end: beyond bearing 2
  driven_mass (--driven-mass), driven_load (--driven-load)  its mass and radial load
  as_bar (--as-bar)                    the candidate runs through square-bore units as it is
  hub_material (--hub-material)        key of data/hub_materials.csv (default steel)
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Mapping

from workbench.core.evaluate import ShaftCase
from workbench.core.layout import DRIVEN_POSITIONS, POSITIONS, DrivenElement, Layout, Placed, moment_diagram
from workbench.core.stiffness import DEFAULT_BEARING_TYPE
from workbench.core.steps import StepPlan, inscribed_m
from workbench.units import FORCE, LENGTH, MASS, QuantityError, parse_quantity

YES = ("yes", "true", "1", "on", "y")
NO = ("", "no", "false", "0", "off", "n")


@dataclass(frozen=True)
class LayoutInputs:
    """The layout of a job and what goes with it, read from the inputs."""

    layout: Layout
    driven_load_N: float
    hub_material: str | None
    sizes: dict  # key -> SI length (journal, seat, fillet, candidate_*), None where not given
    as_bar: bool


def _given(inputs: Mapping[str, str], key: str) -> str:
    value = inputs.get(key)
    return "" if value is None else str(value).strip()


def _length(inputs, key, *, high=20.0, allow_zero=False, low=None):
    text = _given(inputs, key)
    return None if not text else parse_quantity(key, text, LENGTH, "mm", low=low, high=high, allow_zero=allow_zero)


def parse_layout(inputs: Mapping[str, str], mount) -> LayoutInputs:
    """Read the layout inputs; QuantityError naming the input for anything unusable."""
    position = (_given(inputs, "element_position") or "overhung").lower()
    if position not in POSITIONS:
        raise QuantityError("element_position", f"unknown {position!r}; expected overhung or between")
    span = _length(inputs, "bearing_span", low=10e-3, high=20.0)
    bearing_type = _given(inputs, "bearing_type") or None
    if bearing_type is not None:
        from workbench.core.bearing_limits import bearing_slope_row

        try:
            bearing_type = bearing_slope_row(bearing_type).key
        except ValueError as err:
            raise QuantityError("bearing_type", str(err)) from None
    load_from = _length(inputs, "load_from_bearing", high=20.0)
    if load_from is not None and position != "between":
        raise QuantityError("load_from_bearing", "is for --element-position between; an overhung element's "
                                                 "distance is --overhang")
    hub = _length(inputs, "hub_length", low=2e-3, high=5.0)
    mass_text = _given(inputs, "element_mass")
    mass = parse_quantity("element_mass", mass_text, MASS, "kg", high=20000.0, allow_zero=True) if mass_text else 0.0
    overhang = mount.overhang_m
    if mount.load_factor == 0.0:  # a coupling: the typed overhang if any, else the hub beside the bearing
        overhang = _length(inputs, "overhang", high=2.0, allow_zero=True)
    driven = None
    driven_load = 0.0
    driven_position = _given(inputs, "driven_position").lower()
    others = [k for k in ("driven_from_bearing", "driven_mass", "driven_load") if _given(inputs, k)]
    if driven_position in ("", "none"):
        if others:
            raise QuantityError(others[0], "needs --driven-position between or far-end")
    else:
        if driven_position not in DRIVEN_POSITIONS:
            raise QuantityError("driven_position", f"unknown {driven_position!r}; expected between or far-end")
        distance = _length(inputs, "driven_from_bearing", high=20.0, allow_zero=driven_position == "far-end")
        if distance is None:
            if driven_position == "far-end" or span is None:
                raise QuantityError("driven_from_bearing", "is needed to place the driven element")
            distance = span / 2.0
        dm_text, dl_text = _given(inputs, "driven_mass"), _given(inputs, "driven_load")
        driven_mass = parse_quantity("driven_mass", dm_text, MASS, "kg", high=50000.0, allow_zero=True) if dm_text else 0.0
        driven_load = parse_quantity("driven_load", dl_text, FORCE, "N", high=5e6, allow_zero=True) if dl_text else 0.0
        driven = DrivenElement(driven_position, distance, driven_mass, driven_load)
    sizes = {key: _length(inputs, key, low=2e-3, high=2.0) for key in
             ("journal", "seat", "candidate_journal", "candidate_seat")}
    for key in ("fillet", "candidate_fillet"):  # 0 = a sharp corner
        sizes[key] = _length(inputs, key, high=0.5, allow_zero=True)
    as_bar_text = _given(inputs, "as_bar").lower()
    if as_bar_text not in YES + NO:
        raise QuantityError("as_bar", f"{as_bar_text!r}: expected yes or no")
    hub_material = _given(inputs, "hub_material") or None
    if hub_material is not None:
        from workbench.core.key_strength import hub_material as find

        try:
            hub_material = find(hub_material).name
        except ValueError as err:
            raise QuantityError("hub_material", str(err)) from None
    layout = Layout(position, overhang if position == "overhung" else 0.0, load_from, span, bearing_type, hub,
                    mass, driven)
    return LayoutInputs(layout, driven_load, hub_material, sizes, as_bar_text in YES)


def with_plans(inputs: Mapping[str, str], cases: list, layout_in: LayoutInputs) -> list:
    """Each case with the plan of its steps (see workbench.core.steps for the defaults).

    The shaft as found: uniform unless --journal/--seat are given; a non-round shaft as found runs
    in square-bore units as it is. The candidate keeps the existing journal and seat; it is keyed at
    its seat whenever the hub is keyed (either spec says ``keyed``); a round candidate smaller than
    the existing journal is checked as a uniform shaft of its own size (new bearings and hub bore).
    """
    sizes = layout_in.sizes
    existing = next((c for c in cases if c.role == "existing"), None)
    hub_keyed = any(c.geometry.keyed for c in cases)
    out = []
    existing_journal = existing_seat = None
    existing_bar = False
    for case in cases:
        g = case.geometry
        round_body = g.profile in ("round", "tube") and not g.flats
        if case.role == "existing":
            existing_bar = not round_body and sizes["journal"] is None
            plan = StepPlan(g, sizes["journal"], sizes["seat"], sizes["fillet"], keyed_seat=g.keyed,
                            as_bar=existing_bar)
            if not existing_bar:
                existing_journal = sizes["journal"] or inscribed_m(g)
                existing_seat = sizes["seat"] or inscribed_m(g)
        else:
            journal = sizes["candidate_journal"]
            seat = sizes["candidate_seat"]
            # a size taken from the shaft as found that this bar cannot give is the candidate's fault
            journal_field = "candidate_journal" if journal is not None else "candidate"
            seat_field = "candidate_seat" if seat is not None else "candidate"
            as_bar = layout_in.as_bar or (existing_bar and journal is None)
            if journal is None and existing_journal is not None:
                journal = existing_journal
                if round_body and inscribed_m(g) < existing_journal - 1e-9:
                    journal = None  # a smaller round: its own size, uniform
            if seat is None and existing_seat is not None and journal is not None:
                seat = existing_seat if not (round_body and inscribed_m(g) < existing_seat - 1e-9) else None
            plan = StepPlan(g, journal, seat, sizes["candidate_fillet"], keyed_seat=hub_keyed and not as_bar,
                            as_bar=as_bar, journal_field=journal_field, seat_field=seat_field,
                            fillet_field="candidate_fillet")
        out.append(ShaftCase(case.role, case.geometry, case.material, plan))  # replace(case, plan=plan)
    return out


def _finite(value):
    return value if value is not None and math.isfinite(value) else None


def step_fields(check) -> dict:
    """The per-shaft JSON of the step check: steps, governing_step, key, critical speed, deflection, slopes."""
    steps = []
    for item in check.steps:
        step = item.step
        steps.append({
            "kind": step.kind,
            "label": step.label,
            "x_start_m": step.x_start_m,
            "x_end_m": step.x_end_m,
            "diameter_m": step.diameter_m,
            "fillet_m": step.fillet_m if step.kind == "shoulder" else None,
            "keyed": step.keyed,
            "profile": step.geometry.profile,
            "larger_diameter_m": step.larger_m or None,
            "feature": item.feature,
            "bending_moment_Nm": item.bending_moment_Nm,
            "torque_Nm": item.torque_Nm,
            "Kt": item.Kt,
            "Kts": item.Kts,
            "Kf": item.Kf,
            "Kfs": item.Kfs,
            "static_safety_factor": _finite(item.figures.static_sf),
            "fatigue_safety_factor": _finite(item.figures.fatigue_sf),
        })
    key = None
    if check.key is not None:
        k = check.key
        key = {"shear_safety_factor": _finite(k.shear_safety_factor),
               "crush_safety_factor": _finite(k.crush_safety_factor),
               "required_length_m": k.required_length_m, "key_length_m": k.key_length_m,
               "hub_material": k.hub_material, "method": k.method}
    stiff = check.stiffness
    return {
        "steps": steps,
        "steps_notes": list(check.notes),
        "governing_step": check.governing_step,
        "governing_step_label": check.steps[check.governing_step].step.label if check.steps else None,
        "key": key,
        "critical_speed_rpm": None if stiff is None else _finite(stiff.critical_speed_rpm),
        "critical_speed": None if stiff is None else {
            "rayleigh_rpm": _finite(stiff.rayleigh_rpm), "dunkerley_rpm": _finite(stiff.dunkerley_rpm)},
        "deflection_m": None if stiff is None else stiff.deflection_m,
        "bearing_slopes_rad": None if stiff is None else list(stiff.bearing_slopes_rad),
        "slope_limit_rad": None if stiff is None else stiff.slope_limit_rad,
    }


def layout_dict(layout_in: LayoutInputs, check) -> dict:
    """The resolved layout (defaults filled in) as placed for the last shaft checked."""
    lay = layout_in.layout
    out = {
        "element_position": lay.position,
        "overhang_m": lay.overhang_m,
        "load_from_bearing_m": lay.load_from_bearing_m,
        "bearing_span_m": lay.bearing_span_m,
        "bearing_type": lay.bearing_type or DEFAULT_BEARING_TYPE,
        "hub_length_m": lay.hub_length_m,
        "element_mass_kg": lay.element_mass_kg,
        "driven": None if lay.driven is None else {
            "position": lay.driven.position, "distance_m": lay.driven.distance_m,
            "mass_kg": lay.driven.mass_kg, "radial_load_N": layout_in.driven_load_N},
        "as_bar": layout_in.as_bar,
        "hub_material": layout_in.hub_material or "steel",
    }
    placed = getattr(check, "placed", None)
    if placed is not None:
        out["bearing_x_m"] = list(placed.bearing_x_m)
        out["load_x_m"] = placed.load_x_m
        out["overhang_m"] = placed.bearing_x_m[0] - placed.load_x_m if lay.position == "overhung" else None
    return out


def moment_diagram_dict(check, loads) -> dict:
    """x, bending moment (design level) and torque along the shaft of the last shaft checked."""
    placed = getattr(check, "placed", None)
    if placed is None:
        return {"x_m": [], "moment_Nm": [], "torque_Nm": []}
    end = max([placed.length_m] + [item.step.x_end_m for item in check.steps])
    placed = Placed(placed.layout, placed.load_x_m, placed.bearing_x_m, placed.seat_m, placed.seat_check_m,
                    placed.driven_x_m, end, placed.notes)  # replace(placed, length_m=end)
    xs, moments, torques = moment_diagram(placed, list(check.side_loads), loads.design_torque_Nm)
    return {"x_m": list(xs), "moment_Nm": list(moments), "torque_Nm": list(torques)}
