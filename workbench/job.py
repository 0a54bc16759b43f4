"""The job contract: inputs exactly as typed (a dict of strings) -> a JSON-ready result dict.

The CLI, the workbench and the job log all go through :func:`evaluate_inputs`; the keys of both
dicts are documented in DEVELOPERS.md ("The job contract") and are stable.
"""

from __future__ import annotations

import math
import re
from typing import Mapping

from workbench import __version__
from workbench.cautions import CAUTIONS
from workbench.core.checks import MaterialProps, Settings, ShaftCheck
from workbench.core.drive import drive_loads
from workbench.core.evaluate import ShaftCase, evaluate
from workbench.core.fatigue import CRITERIA
from workbench.core.loads import Mount
from workbench.core.tables import material, material_for_size, materials, mount_factors
from workbench.core.keyseat_factors import KeyseatRefused, read_keyseat
from workbench.core.layout import LayoutError
from workbench.core.material_names import designation, grade_keys, nearest_names, reading_note
from workbench.job_layout import layout_dict, moment_diagram_dict, parse_layout, step_fields, with_plans
from workbench.field_names import option_for
from workbench.field_rules import parse_ratio, question_speeds, service_factor_for_shaft
from workbench.readings import collecting, note
from workbench.spec_rules import question_hex, question_inch_job
from workbench.specs import parse_spec
from workbench.turning_job import attach_turning
from workbench.units import (
    DENSITY,
    POWER,
    SPEED,
    STRESS,
    TORQUE,
    TWIST_RATE,
    LENGTH,
    QuantityError,
    parse_fraction,
    parse_number,
    parse_quantity,
)

INPUT_KEYS = (
    "power", "speed", "torque", "ratio", "efficiency", "service_factor", "peak_factor",
    "mount", "pitch_diameter", "overhang", "shaft", "candidate", "material", "candidate_material",
    "required_sf", "criterion", "reliability", "twist_limit", "duty",
    # the layout and the steps (issue 8); see workbench/job_layout.py
    "bearing_span", "bearing_type", "element_position", "load_from_bearing", "hub_length", "element_mass",
    "journal", "seat", "fillet", "candidate_journal", "candidate_seat", "candidate_fillet",
    "driven_position", "driven_from_bearing", "driven_mass", "driven_load", "as_bar", "hub_material",
    # the turning sheet (workbench/turning_job.py)
    "bearing", "bearing_mounting", "rotating_ring", "bearing_load", "journal_class", "seat_class", "key_fit",
    "turning_sheets",
)
DEFAULT_MATERIAL = "1045-cd"
MOUNT_ALIASES = {
    "pulley": "vbelt", "v-belt": "vbelt", "vee-belt": "vbelt", "belt": "vbelt", "chain": "sprocket",
    "flatbelt": "flat-belt", "flat belt": "flat-belt", "timing": "timing-belt", "toothed-belt": "timing-belt",
    "pinion": "gear", "none": "coupling", "direct": "coupling",
}


class JobInputError(ValueError):
    """Something a person typed cannot be used. ``field`` is the input key; ``str()`` is one line."""

    def __init__(self, field: str, message: str) -> None:
        super().__init__(f"{field}: {message}")
        self.field = field
        self.message = message


def _given(inputs: Mapping[str, str], key: str) -> str:
    value = inputs.get(key)
    return "" if value is None else str(value).strip()


def _fraction(inputs, key, default, low, high) -> float:
    text = _given(inputs, key)
    return default if not text else parse_fraction(key, text, low=low, high=high)


def _number(inputs, key, default, low, high) -> float:
    text = _given(inputs, key)
    if not text:
        return default
    value = parse_number(key, text)
    if not low <= value <= high:
        raise QuantityError(key, f"{text!r} is out of range; expected {low:g} to {high:g}")
    return value


def parse_material(field: str, text: str, size_m: float) -> MaterialProps:
    """A material from the table by key (``1045-cd``; ``c45-qt`` picks the row for the bar size),
    by a common designation (``EN19``, ``C45``, ``1045``: see ``data/material_names.csv``; the
    shaft's notes say how it was read), or typed in:
    ``custom Sy=350MPa Sut=600MPa [E=207GPa G=79.3GPa rho=7850]``."""
    text = text.strip()
    if text.lower().startswith("custom"):
        return _custom_material(field, text)
    named = designation(text)
    key = named.key if named is not None else text.lower()
    if named is None and key not in materials() and key not in grade_keys():
        conditions = [k for k in grade_keys() if k.startswith(key + "-")] if key else []
        if conditions:  # a grade without its supply condition: the strengths differ too much to guess
            raise QuantityError(field, f"{text!r} names the grade but not its supply condition: "
                                       f"{', '.join(conditions)} (--material list shows each)")
        close = nearest_names(text)
        hint = f"; did you mean {', '.join(close)}?" if close else ""
        raise QuantityError(field, f"unknown material {text!r}{hint} (--material list shows every name)")
    grade = _size_ranged_grade(key)
    if grade and not materials()[key].covers(size_m):
        key = grade  # another size range of the same grade: the row for this bar is picked
    try:
        row = material(key) if key in materials() else material_for_size(key, size_m)
    except KeyError as err:
        raise QuantityError(field, str(err.args[0])) from None
    return MaterialProps(row.key, row.name, row.tensile_Pa, row.yield_Pa, row.G_Pa, row.density_kg_m3)


_PART_NAMES = {"sy": "Sy", "sut": "Sut", "g": "G", "e": "E", "rho": "rho"}


def _custom_material(field: str, text: str) -> MaterialProps:
    values = {}
    for part in text.split()[1:]:
        name, sep, value = part.partition("=")
        if not sep or not name.strip() or not value.strip():
            raise QuantityError(field, f"custom material needs NAME=VALUE pairs, not {part!r}")
        key = name.strip().lower()
        if key in values:
            raise QuantityError(field, f"custom material gives {name.strip()} twice; give each value once")
        values[key] = value
    need = {"sy", "sut"}
    if not need <= values.keys():
        raise QuantityError(field, "custom material needs at least Sy=... and Sut=... (e.g. custom Sy=350MPa Sut=600MPa)")
    def parse_quantity(field_, text, kind, unit, **limits):  # name the part that is wrong (E=banana)
        from workbench.units import parse_quantity as parse

        part = next((k for k, v in original.items() if v is text), "")
        try:
            return parse(field_, text, kind, unit, **limits)
        except QuantityError as err:
            raise QuantityError(field_, f"custom material {_PART_NAMES.get(part, part)}: "
                                        f"{err.message}") from None

    original = dict(values)
    sy = parse_quantity(field, values.pop("sy"), STRESS, "MPa", low=20e6, high=3000e6)
    sut = parse_quantity(field, values.pop("sut"), STRESS, "MPa", low=20e6, high=3000e6)
    if sy > sut:
        raise QuantityError(field, "custom material: Sy must not exceed Sut")
    g = parse_quantity(field, values.pop("g", "79.3 GPa"), STRESS, "GPa", low=10e9, high=200e9)
    rho = parse_quantity(field, values.pop("rho", "7850"), DENSITY, "kg/m^3", low=1000.0, high=20000.0)
    if "e" in values:  # parsed so that a typo is refused; the checks take G (twist) and E = 2 G (1 + nu)
        parse_quantity(field, values.pop("e"), STRESS, "GPa", low=20e9, high=500e9)
    if values:
        raise QuantityError(field, f"custom material: unknown {', '.join(values)} (use Sy, Sut, G, E, rho)")
    return MaterialProps("custom", f"custom (Sy {sy / 1e6:g} MPa, Sut {sut / 1e6:g} MPa)", sut, sy, g, rho)


def _mount(inputs: Mapping[str, str]) -> Mount:
    element = _given(inputs, "mount").lower()
    if not element:
        for key in ("pitch_diameter", "overhang"):
            if _given(inputs, key):
                raise QuantityError("mount", f"is not given, but {option_for(key)} is: name the element that carries "
                                             "it (vbelt, sprocket, gear, timing-belt, flat-belt) or leave it out")
        element = "coupling"
    element = MOUNT_ALIASES.get(element, element)
    factors = mount_factors()
    if element not in factors:
        raise QuantityError("mount", f"unknown element {element!r}; expected one of {', '.join(factors)}")
    factor = factors[element].load_factor
    if factor == 0.0:
        for key in ("pitch_diameter", "overhang"):
            if _given(inputs, key):
                note(key, f"ignored: a {element} carries no side load")
        return Mount(element, 0.0, 0.0, 0.0)
    pd_text, oh_text = _given(inputs, "pitch_diameter"), _given(inputs, "overhang")
    if not pd_text:
        raise QuantityError("pitch_diameter", f"is needed for a {element} (e.g. 200 mm)")
    between = (_given(inputs, "element_position").lower() == "between")
    if not oh_text and not between:
        raise QuantityError("overhang", f"is needed for a {element}: bearing to load line (e.g. 60 mm)")
    question_inch_job("pitch_diameter", pd_text, inputs)
    question_inch_job("overhang", oh_text, inputs)
    pitch = parse_quantity("pitch_diameter", pd_text, LENGTH, "mm", low=5e-3, high=3.0)
    overhang = parse_quantity("overhang", oh_text, LENGTH, "mm", high=2.0, allow_zero=True) if oh_text else 0.0
    return Mount(element, factor, pitch, overhang)


def _drive(inputs: Mapping[str, str]):
    torque_text = _given(inputs, "torque")
    power_text, speed_text = _given(inputs, "power"), _given(inputs, "speed")
    ratio = parse_ratio("ratio", _given(inputs, "ratio"))
    efficiency = _fraction(inputs, "efficiency", 1.0, 0.3, 1.0)
    service = service_factor_for_shaft(_given(inputs, "service_factor"), _given(inputs, "duty"))
    peak = _number(inputs, "peak_factor", 2.0, 1.0, 6.0)
    speed = parse_quantity("speed", speed_text, SPEED, "rpm", low=1.0, high=30000.0) if speed_text else None
    question_speeds(speed, ratio)
    if torque_text:
        if power_text:
            raise QuantityError("torque", "give either a torque or power and speed, not both")
        torque = parse_quantity("torque", torque_text, TORQUE, "N*m", low=0.01, high=1e6)
        return drive_loads(torque_Nm=torque, motor_speed_rpm=speed, ratio=ratio, efficiency=efficiency,
                           service_factor=service, peak_factor=peak)
    if not power_text:
        raise QuantityError("power", "is needed (e.g. 7.5 kW or 10 hp), or give a torque instead")
    power = parse_quantity("power", power_text, POWER, "kW", low=1.0, high=5e6)
    if speed is None:
        raise QuantityError("speed", "is needed with a power (e.g. 1450 rpm)")
    return drive_loads(power_W=power, motor_speed_rpm=speed, ratio=ratio, efficiency=efficiency,
                       service_factor=service, peak_factor=peak)


def _settings(inputs: Mapping[str, str]) -> Settings:
    criterion = (_given(inputs, "criterion") or "goodman").lower()
    if criterion not in CRITERIA:
        raise QuantityError("criterion", f"unknown {criterion!r}; expected one of {', '.join(CRITERIA)}")
    twist_text = _given(inputs, "twist_limit")
    twist = parse_quantity("twist_limit", twist_text, TWIST_RATE, "deg/m", low=0.01, high=50.0) if twist_text else None
    return Settings(
        required_sf=_number(inputs, "required_sf", 1.5, 1.0, 10.0),
        criterion=criterion,
        reliability=_fraction(inputs, "reliability", 0.90, 0.5, 0.9999),
        twist_limit_deg_per_m=twist,
    )


def check_spec_reading(key: str, spec: str, geometry, inputs: Mapping[str, str]) -> None:
    """Refuse a keyseat that cannot be checked; warn on bare numbers in an inch job and on a hex
    size that reads like an across-corners measurement (workbench.spec_rules)."""
    if geometry.keyed and geometry.profile in ("round", "tube"):
        try:
            reading = read_keyseat(geometry)
        except KeyseatRefused as err:
            raise QuantityError(key, str(err)) from None
        if reading.case == "thin":
            note(key, f"thin wall under the keyseat ({reading.ligament_m * 1e3:.3g} mm under a "
                      f"{reading.depth_m * 1e3:.3g} mm seat): keyseat factors scaled by the torsion solver")
        elif reading.case == "non-standard":
            note(key, "non-standard keyseat: handbook factors scaled by the torsion solver's ratio to the standard seat")
    question_inch_job(key, spec, inputs)
    if geometry.profile == "hex":
        question_hex(key, geometry)


def parse_cases(inputs: Mapping[str, str]) -> list[ShaftCase]:
    """The shafts of a job (existing first), with their materials; raises QuantityError."""
    cases = []
    mat_text = _given(inputs, "material") or DEFAULT_MATERIAL
    for role, key in (("existing", "shaft"), ("candidate", "candidate")):
        spec = _given(inputs, key)
        if not spec:
            continue
        geometry = parse_spec(spec, key)
        check_spec_reading(key, spec, geometry, inputs)
        text = (_given(inputs, "candidate_material") or mat_text) if role == "candidate" else mat_text
        field = "candidate_material" if role == "candidate" and _given(inputs, "candidate_material") else "material"
        cases.append(ShaftCase(role, geometry, parse_material(field, text, geometry.size_m)))
    if not cases:
        raise QuantityError("shaft", "give the shaft as found and/or a candidate (e.g. round 35mm)")
    return cases


def evaluate_inputs(inputs: Mapping[str, str], *, solver: bool = False) -> dict:
    """Evaluate a job typed as strings; return the JSON-ready result dict (see DEVELOPERS.md).

    With ``solver``, each keyed shaft also gets ``keyseat_solver``: the numerical solver's peak
    shear at the keyseat beside the handbook Kts estimate (the checks keep the handbook basis).
    Raises JobInputError naming the field for anything that cannot be used. ``warnings`` lists,
    one line each, every assumption or doubtful reading of the inputs that did not stop the check.
    """
    with collecting() as notes:
        result = _evaluate_inputs(inputs, solver=solver)
    result["warnings"] = notes + [w for w in result.get("warnings", []) if w not in notes]
    return result


def _evaluate_inputs(inputs: Mapping[str, str], *, solver: bool = False) -> dict:
    unknown = [k for k in inputs if k not in INPUT_KEYS]
    if unknown:
        raise JobInputError(unknown[0], f"is not a job input (known: {', '.join(INPUT_KEYS)})")
    try:
        loads = _drive(inputs)
        mount = _mount(inputs)
        settings = _settings(inputs)
        cases = parse_cases(inputs)
        layout_in = parse_layout(inputs, mount)
        cases = with_plans(inputs, cases, layout_in)
        checks, comparison = evaluate(loads, mount, cases, settings, layout_in.layout, layout_in.driven_load_N,
                                      E_Pa=[_modulus(case) for case in cases], hub_material=layout_in.hub_material)
    except (QuantityError, LayoutError) as err:
        raise JobInputError(err.field, err.message) from None
    shafts = [_shaft_dict(case, check, inputs) for case, check in zip(cases, checks)]
    if solver:
        for shaft, case, check in zip(shafts, cases, checks):
            if case.geometry.keyed and case.geometry.profile in ("round", "tube"):
                try:
                    shaft["keyseat_solver"] = keyseat_solver(case.geometry, check, loads.design_torque_Nm)
                except ValueError as err:  # a section the solver cannot build: a message, never a traceback
                    raise JobInputError("shaft" if case.role == "existing" else "candidate", str(err)) from None
    result = {
        "program": {"name": "shaftbench", "version": __version__},
        "inputs": {k: str(v) for k, v in inputs.items()},
        "drive": {
            "power_W": loads.power_W,
            "motor_speed_rpm": loads.motor_speed_rpm,
            "shaft_speed_rpm": loads.shaft_speed_rpm,
            "ratio": loads.ratio,
            "efficiency": loads.efficiency,
            "service_factor": loads.service_factor,
            "peak_factor": loads.peak_factor,
            "running_torque_Nm": loads.running_torque_Nm,
            "design_torque_Nm": loads.design_torque_Nm,
            "peak_torque_Nm": loads.peak_torque_Nm,
        },
        "mount": {
            "element": mount.element,
            "load_factor": mount.load_factor,
            "pitch_diameter_m": mount.pitch_diameter_m,
            "overhang_m": mount.overhang_m,
            "side_load_N": checks[0].side_load_N,
            "bending_moment_Nm": max((c.bending_moment_Nm for c in checks[0].steps), default=checks[0].bending_moment_Nm),
            "source": mount_factors()[mount.element].source,
        },
        "settings": {
            "required_sf": settings.required_sf,
            "fatigue_criterion": CRITERIA[settings.criterion],
            "reliability": settings.reliability,
            "twist_limit_deg_per_m": settings.twist_limit_deg_per_m,
        },
        "shafts": shafts,
        "comparison": None if comparison is None else {
            "strength_ratio": _finite(comparison.strength_ratio),
            "stiffness_ratio": comparison.stiffness_ratio,
            "mass_ratio": comparison.mass_ratio,
        },
        "verdict": shafts[-1]["verdict"],
        "cautions": list(CAUTIONS),
    }
    warnings = result.setdefault("warnings", [])
    for check in checks:
        warnings.extend(w for w in check.assumptions if w not in warnings)
    if layout_in.as_bar and any(c.role == "candidate" and c.geometry.keyed for c in cases):
        warnings.append(AS_BAR_KEYED_WARNING)
    result["layout"] = layout_dict(layout_in, checks[-1])
    result["moment_diagram"] = moment_diagram_dict(checks[-1], loads)
    attach_turning(result, inputs)
    return result


AS_BAR_KEYED_WARNING = ("--as-bar: the bar runs through square-bore units, no keyseat is cut; "
                        "'keyed' ignored")


def _finite(value: float) -> float | None:
    """JSON has no infinity: an unlimited safety factor (no load of that kind) is written as null."""
    return value if math.isfinite(value) else None


def _shaft_dict(case: ShaftCase, check: ShaftCheck, inputs: Mapping[str, str]) -> dict:
    g = case.geometry
    section = check.section
    dims = {"size_m": g.size_m}
    if g.second_m:
        dims["second_m"] = g.second_m
    if section.key_width_m:
        dims["key_width_m"] = section.key_width_m
        dims["key_depth_m"] = section.key_depth_m
    return {
        "role": case.role,
        "spec": _given(inputs, "shaft" if case.role == "existing" else "candidate"),
        "profile": g.profile,
        "dimensions_m": dims,
        "keyed": g.keyed or bool(case.plan and case.plan.keyed_seat and not case.plan.as_bar),
        "finish": g.finish,
        "shoulder": g.shoulder,
        "material": case.material.key,
        "material_name": case.material.name,
        "tensile_Pa": case.material.tensile_Pa,
        "yield_Pa": case.material.yield_Pa,
        "area_m2": section.area_m2,
        "torsion_constant_m4": section.torsion_constant_m4,
        "shear_per_torque_Pa_per_Nm": section.shear_per_torque_Pa_per_Nm,
        "section_modulus_m3": section.section_modulus_m3,
        "max_shear_stress_Pa": check.max_shear_stress_Pa,
        "bending_moment_Nm": check.bending_moment_Nm,
        "bending_stress_Pa": check.bending_stress_Pa,
        "von_mises_stress_Pa": check.von_mises_stress_Pa,
        "tresca_stress_Pa": check.tresca_stress_Pa,
        "twist_deg_per_m": check.twist_deg_per_m,
        "twist_limit_deg_per_m": check.twist_limit_deg_per_m,
        "mass_kg_per_m": check.mass_kg_per_m,
        "endurance_limit_Pa": check.endurance_limit_Pa,
        "marin": check.marin,
        "feature": check.feature,
        "Kt": check.Kt,
        "Kts": check.Kts,
        "Kf": check.Kf,
        "Kfs": check.Kfs,
        "fatigue_criterion": check.fatigue_criterion,
        "static_safety_factor": _finite(check.static_safety_factor),
        "shear_yield_safety_factor": _finite(check.shear_yield_safety_factor),
        "fatigue_safety_factor": _finite(check.fatigue_safety_factor),
        "verdict": check.verdict,
        "buckling_safety_factor": None if check.buckling_shear_Pa is None else _finite(check.buckling_safety_factor),
        "buckling_shear_stress_Pa": check.buckling_shear_Pa,
        "governing": check.governing,
        "why": check.why,
        "methods": check.methods,
        "notes": _material_notes(case) + _reading_notes(case, inputs),
        **step_fields(check),
    }


def keyseat_solver(geometry, check: ShaftCheck, design_torque_Nm: float) -> dict:
    """The solver's view of a keyseat: true elastic peak shear and the Kts it implies, beside the
    handbook estimate used by the checks (Shigley 9th ed., Table 7-1, end-mill keyseat Kts = 3.0).

    The solver models a long keyseat away from its run-out (2-D), with the standard's bottom radius
    (DIN 6885-1 r1 / B17.1 fillet); the handbook's factor also covers the 3-D stress at the end of
    an end-milled seat. A non-standard seat or a thin tube wall scales the handbook factor by the
    solver (workbench.core.keyseat_factors).
    """
    from workbench.core.torsion_solver import solve_torsion

    solution = solve_torsion(geometry)
    nominal = check.section.shear_per_torque_Pa_per_Nm
    return {
        "peak_shear_stress_Pa": design_torque_Nm * solution.shear_per_torque_Pa_per_Nm,
        "Kts_solver": solution.shear_per_torque_Pa_per_Nm / nominal,
        "Kts_handbook": check.Kts,
        "torsion_constant_m4": solution.torsion_constant_m4,
        "torsion_constant_ratio": solution.torsion_constant_m4 / check.section.torsion_constant_m4,
        "peak_location_m": list(solution.peak_location_m),
        "method": solution.method,
    }


def _modulus(case: ShaftCase) -> float:
    """Young's modulus [Pa] of a case's material: the table's, else 207 GPa (steel, Shigley 9th ed. Table A-5)."""
    row = materials().get(case.material.key)
    return row.E_Pa if row is not None else 207e9


def _size_ranged_grade(key: str) -> str:
    """``c45-qt`` for a size-ranged row key ``c45-qt-16-40``; "" for any other key."""
    if key not in materials() or materials()[key].size_max_m is None:
        return ""
    match = re.fullmatch(r"(.+)-\d+(?:\.\d+)?-\d+(?:\.\d+)?", key)
    return match.group(1) if match else ""


def _reading_notes(case: ShaftCase, inputs: Mapping[str, str]) -> list[str]:
    """How a material designation (EN19, C45…) typed for this shaft was read, if one was; and
    the size-range row picked when the one typed is for another bar size."""
    text = _given(inputs, "material") or DEFAULT_MATERIAL
    if case.role == "candidate":
        text = _given(inputs, "candidate_material") or text
    typed = text.strip().lower()
    if _size_ranged_grade(typed) and typed != case.material.key:
        return [f"{typed} is the row for another bar size; this {case.geometry.size_m * 1000:g} mm bar "
                f"takes {case.material.key} (the row is picked by the bar size: type "
                f"{_size_ranged_grade(typed)})"]
    note = reading_note(text, case.material.key)
    return [note] if note else []


def _material_notes(case: ShaftCase) -> list[str]:
    """Cautions about the material row: strengths that hold for another bar size."""
    row = materials().get(case.material.key)
    if row is None or row.covers(case.geometry.size_m):
        return []
    low = 0 if row.size_min_m is None else row.size_min_m * 1000
    high = "any" if row.size_max_m is None else f"{row.size_max_m * 1000:g}"
    return [
        f"{row.name}: the tabled strengths hold for {low:g}-{high} mm bar; this bar is "
        f"{case.geometry.size_m * 1000:g} mm — larger bar is usually weaker, confirm with the mill certificate."
    ]


def substitute_inputs(inputs: Mapping[str, str]) -> dict:
    """Equivalent square, flat, hex, tube and round sizes for the shaft as found (``inputs['shaft']``).

    Needs only ``shaft`` (and optionally ``candidate`` for its journal fact); returns
    ``{"existing": {...}, "equivalents": [...], "fit_facts": [...], "cautions": [...]}``.
    """
    from workbench.core.substitution import HOLDS_FOR, equivalents, fit_facts
    from workbench.measured import measured_size_text
    from workbench.specs import format_spec

    try:
        spec = _given(inputs, "shaft")
        if not spec:
            raise QuantityError("shaft", "give the shaft as found (e.g. round 35mm)")
        existing = parse_spec(spec, "shaft")
        candidate = parse_spec(_given(inputs, "candidate"), "candidate") if _given(inputs, "candidate") else None
    except QuantityError as err:
        raise JobInputError(err.field, err.message) from None
    system = "inch" if existing.key_standard == "ansi" else "metric"
    rows = []
    for eq in equivalents(existing):
        stock = _next_stock(eq.geometry, system)
        rows.append({
            "profile": eq.geometry.profile,
            "basis": eq.basis,
            "size_m": eq.geometry.size_m,
            "second_m": eq.geometry.second_m,
            "label": measured_size_text(eq.geometry, system),  # as measured; exact in size_m
            "strength_ratio": eq.strength_ratio,
            "stiffness_ratio": eq.stiffness_ratio,
            "mass_ratio": eq.mass_ratio,
            "next_stock": None if stock is None else format_spec(stock, system),
            "holds_for_step": HOLDS_FOR,
        })
    return {
        "existing": {"spec": spec, "profile": existing.profile, "size_m": existing.size_m},
        "equivalents": rows,
        "fit_facts": fit_facts(existing, candidate),
        "cautions": list(CAUTIONS),
    }


def _next_stock(geometry, system: str):
    """The smallest stock bar of the same profile at least as large in every dimension (or None)."""
    from workbench.core.stock import stock_geometry
    from workbench.core.tables import stock_sizes

    for stock in stock_sizes(geometry.profile, system):
        if stock.size_m >= geometry.size_m - 1e-9 and (
            geometry.profile not in ("flat",) or stock.second_m >= geometry.second_m - 1e-9
        ) and (geometry.profile != "tube" or stock.second_m <= geometry.second_m + 1e-9):
            return stock_geometry(stock)
    return None


_STOCK_PROBE_SIZE_M = 0.03


def _material_for_size(key: str):
    def material_at(size_m: float) -> MaterialProps | None:
        try:
            return parse_material("material", key, size_m)
        except QuantityError:  # a size-ranged grade with no row for this bar size: no strength to check with
            return None

    return material_at


def stock_inputs(inputs: Mapping[str, str], profile: str, system: str = "metric", materials_keys=None,
                 keyed: bool = False) -> dict:
    """Check every stock size of ``profile`` in ``system`` as the candidate, in each material.

    Each bar is checked as it will be turned: to the existing journals and seat (or those given),
    every step checked. Its seat carries a keyseat, whatever the profile, when the shaft as found is
    keyed or ``keyed`` asks for keyed stock. A bar that cannot be turned to the journal gets a row
    with verdict "fail" and the reason. Returns
    ``{"profile", "system", "rows": [...], "smallest": {material: row}, "cautions"}``; each row has
    ``spec`` and ``material`` ready to be taken as the job's candidate.
    """
    from workbench.core.stock import check_stock, smallest_passing
    from workbench.core.tables import STOCK_PROFILES, STOCK_SYSTEMS
    from workbench.specs import format_spec

    if profile not in STOCK_PROFILES:
        raise JobInputError("profile", f"unknown {profile!r}; expected one of {', '.join(STOCK_PROFILES)}")
    if system not in STOCK_SYSTEMS:
        raise JobInputError("system", f"unknown {system!r}; expected metric or inch")
    try:
        loads = _drive(inputs)
        mount = _mount(inputs)
        settings = _settings(inputs)
        shaft_text = _given(inputs, "shaft")
        existing = parse_spec(shaft_text, "shaft") if shaft_text else None
        keys = list(materials_keys or [_given(inputs, "candidate_material") or _given(inputs, "material") or DEFAULT_MATERIAL])
        for key in keys:  # fail early, naming the field, on an unknown material
            parse_material("material", key, _STOCK_PROBE_SIZE_M)
        mats = [_material_for_size(key) for key in keys]
        layout_in = parse_layout(inputs, mount)
        if existing is not None:  # the existing layout itself must be sound
            with_plans(inputs, [ShaftCase("existing", existing, None)], layout_in)
    except QuantityError as err:
        raise JobInputError(err.field, err.message) from None
    from workbench.core.steps import can_turn
    from workbench.core.substitution import largest_journal_m

    keyed = bool(keyed or (existing and existing.keyed))
    e_pa = materials()[keys[0]].E_Pa if keys[0] in materials() else 207e9

    def plan_for(geometry):
        cases = ([ShaftCase("existing", existing, None)] if existing is not None else []) + [
            ShaftCase("candidate", geometry, None)]
        return with_plans(inputs, cases, layout_in)[-1].plan

    rows = check_stock(profile, system, mats, loads, mount, settings, keyed=keyed, plan_for=plan_for,
                       layout=layout_in.layout, driven_load_N=layout_in.driven_load_N, E_Pa=e_pa,
                       hub_material=layout_in.hub_material)
    journal_needed = None
    if existing is not None and existing.profile in ("round", "tube"):
        journal_needed = layout_in.sizes["journal"] or existing.size_m
    if layout_in.sizes["candidate_journal"]:
        journal_needed = layout_in.sizes["candidate_journal"]
    out_rows = []
    for row in rows:
        check = row.check
        journal = largest_journal_m(row.geometry)
        gives = None if journal_needed is None else (
            abs(journal - journal_needed) <= 1e-9 and row.geometry.profile in ("round", "tube")
            or can_turn(row.geometry, journal_needed))
        if check is None:
            out_rows.append({
                "largest_journal_m": journal, "gives_existing_journal": gives,
                "label": row.stock.label + (" mm" if system == "metric" else " in"),
                "spec": format_spec(row.geometry, system), "size_m": row.geometry.size_m,
                "second_m": row.geometry.second_m, "material": row.material.key, "verdict": "fail",
                "governing": "turning", "why": row.refused, "min_safety_factor": None,
                "static_safety_factor": None, "fatigue_safety_factor": None, "twist_deg_per_m": None,
                "mass_kg_per_m": None, "governing_step": None, "governing_step_label": None, "keyed": keyed,
            })
            continue
        out_rows.append({
            "keyed": keyed,
            "governing_step": check.governing_step,
            "governing_step_label": check.steps[check.governing_step].step.label,
            "largest_journal_m": journal,
            "gives_existing_journal": gives,
            "label": row.stock.label + (" mm" if system == "metric" else " in"),
            "spec": format_spec(row.geometry, system),
            "size_m": row.geometry.size_m,
            "second_m": row.geometry.second_m,
            "material": row.material.key,
            "verdict": check.verdict,
            "governing": check.governing,
            "why": check.why,
            "min_safety_factor": _finite(check.min_safety_factor),
            "static_safety_factor": _finite(check.static_safety_factor),
            "fatigue_safety_factor": _finite(check.fatigue_safety_factor),
            "twist_deg_per_m": check.twist_deg_per_m,
            "mass_kg_per_m": check.mass_kg_per_m,
        })
    smallest = {}
    for key, row in smallest_passing(rows).items():
        smallest[key] = out_rows[rows.index(row)]
    with_journal = {}
    if journal_needed is not None:
        for row in out_rows:
            if row["verdict"] == "pass" and row["gives_existing_journal"] and row["material"] not in with_journal:
                with_journal[row["material"]] = row
    return {"profile": profile, "system": system, "rows": out_rows, "smallest": smallest,
            "smallest_with_existing_journal": with_journal, "cautions": list(CAUTIONS)}
