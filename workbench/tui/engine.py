"""The workbench's only road to the calculation: the job contract in :mod:`workbench.job`.

Everything heavy (pint, numpy, the core) is imported here lazily, on the first evaluation, which
runs in a worker thread after the first paint. Input errors come back as messages per field; a
failure of the core itself (a bug, or an input the contract let through) comes back the same way,
on the field it comes from, so that no entry can end the workbench.
"""

from __future__ import annotations

import time
from dataclasses import dataclass, field
from typing import Any


@dataclass
class Evaluation:
    """The outcome of evaluating one state of the job sheet.

    result:  the contract's result dict, or None when any field is invalid or the job is empty
    errors:  contract key -> one-line message, for every invalid field found
    elapsed_s: wall time of the evaluation
    """

    result: dict[str, Any] | None = None
    errors: dict[str, str] = field(default_factory=dict)
    elapsed_s: float = 0.0

    @property
    def ok(self) -> bool:
        """True when a result was computed from every field as typed."""
        return self.result is not None and not self.errors


def _job_module():
    import workbench.job as job  # lazy: pulls pint and the core

    return job


#: valid stand-ins used only to keep looking for further bad fields (never shown as a result)
STAND_INS = {
    "power": "1 kW",
    "speed": "1000 rpm",
    "ratio": "1",
    "efficiency": "1",
    "service_factor": "1",
    "peak_factor": "2",
    "mount": "coupling",
    "pitch_diameter": "100 mm",
    "overhang": "50 mm",
    "shaft": "round 30mm",
    "candidate": "round 30mm",
    "material": "1045-cd",
    "candidate_material": "1045-cd",
    "required_sf": "1.5",
    "criterion": "goodman",
    "reliability": "0.9",
}


def evaluate(inputs: dict[str, str]) -> Evaluation:
    """Evaluate the job; on an invalid field, find every other invalid field too.

    The contract raises on the first bad field. To mark all of them at once the bad field is given a
    valid stand-in (or left out) and the job evaluated again, until it passes or a field repeats. A
    result computed with a stand-in is never returned (it is not what was typed).
    """
    started = time.perf_counter()
    job = _job_module()
    errors: dict[str, str] = {}
    trial = dict(inputs)
    result = None
    for _ in range(len(inputs) + 1):
        try:
            result = job.evaluate_inputs(trial)
            break
        except Exception as err:  # noqa: BLE001 - every failure is a message, never the app's end
            if isinstance(err, job.JobInputError):
                key, message = getattr(err, "field", "") or "job", str(err)
            else:
                key, message = _blame(job, trial, err)
            if key in errors or key not in trial:
                errors.setdefault(key, message)
                break
            errors[key] = message
            if key in STAND_INS:
                trial[key] = STAND_INS[key]
            else:
                del trial[key]
    return Evaluation(
        result=None if errors else result,
        errors=errors,
        elapsed_s=time.perf_counter() - started,
    )


#: the fields tried, in this order, to find which one a failure of the core comes from
BLAME_ORDER = ("candidate", "shaft", "candidate_material", "material", "pitch_diameter", "overhang",
               "mount")


def _blame(job: Any, trial: dict[str, str], err: Exception) -> tuple[str, str]:
    """The field a failure of the core comes from, and a one-line message for it.

    The core may refuse what the contract let through (a flat that leaves no material). The field
    is found by giving each likely field its stand-in in turn: the first whose stand-in makes the
    job compute is the one named; if none does, the message goes to the whole job.
    """
    text = str(err).splitlines()[0] if str(err) else type(err).__name__
    for key in BLAME_ORDER:
        if key not in trial:
            continue
        probe = dict(trial)
        if key in STAND_INS:
            probe[key] = STAND_INS[key]
        else:
            del probe[key]
        try:
            job.evaluate_inputs(probe)
        except Exception:  # noqa: BLE001 - still failing: not this field
            continue
        return key, f"{key.replace('_', ' ')}: cannot be checked as typed ({text})"
    return "job", f"the check cannot be computed ({type(err).__name__}: {text})"


def warm_up() -> None:
    """Import what the first section view needs (numpy, scipy, the solver, the stress map), so
    that pressing F2 does not wait for it; run in a worker thread after the first verdict."""
    import scipy.sparse.linalg  # noqa: F401  (the solve)
    import scipy.spatial  # noqa: F401  (the mesh)

    import workbench.core.profiles  # noqa: F401
    import workbench.core.stress_map  # noqa: F401
    import workbench.core.torsion_solver  # noqa: F401


def substitute(inputs: dict[str, str]) -> tuple[dict[str, Any] | None, str]:
    """Equal-strength / equal-stiffness sizes for the job (result, message-if-not)."""
    job = _job_module()
    try:
        return job.substitute_inputs(inputs), ""
    except job.JobInputError as err:
        return None, str(err)
    except Exception as err:  # noqa: BLE001 - said on the view; the workbench stays
        return None, f"cannot be computed for this sheet ({type(err).__name__}: {err})"


def stock(
    inputs: dict[str, str], profile: str, system: str, materials: list[str]
) -> tuple[dict[str, Any] | None, str]:
    """Standard stock sizes that pass for the job (result, message-if-not)."""
    job = _job_module()
    try:
        return job.stock_inputs(inputs, profile, system, materials), ""
    except job.JobInputError as err:
        return None, str(err)
    except Exception as err:  # noqa: BLE001 - said on the view; the workbench stays
        return None, f"cannot be computed for this sheet ({type(err).__name__}: {err})"


def material_keys() -> list[str]:
    """What a material field completes: the keys a fitter types (a size-ranged grade once, its row
    picked by the bar size), then the common designations (EN19, C45…), in file order."""
    from workbench.core.material_names import grade_keys, material_names

    return grade_keys() + [entry.name for entry in material_names().values()]


def section_maps(specs: list[tuple[str, str]], cols: int, rows: int) -> list[dict[str, Any]]:
    """Relative shear-stress maps for (role, spec) pairs, each on its own ``cols`` x ``rows`` grid.

    Dicts with role, spec, inside, tau_rel (0..1 of that section's own peak), method, error.
    """
    from workbench.core.stress_map import shear_stress_map
    from workbench.specs import parse_spec

    out: list[dict[str, Any]] = []
    for role, spec in specs:
        try:
            geometry = parse_spec(spec)
            out.append(_map_dict(role, spec, shear_stress_map(geometry, cols, rows)))
        except Exception as err:  # noqa: BLE001 - shown to the fitter beside the drawing
            out.append({"role": role, "spec": spec, "error": f"{type(err).__name__}: {err}"})
    return out


def _map_dict(role: str, spec: str, smap: Any) -> dict[str, Any]:
    return {
        "role": role,
        "spec": spec,
        "inside": [[bool(v) for v in row] for row in smap.inside],
        "tau_rel": [[float(v) for v in row] for row in smap.tau_rel],
        "method": str(getattr(smap, "method", "")),
        "error": "",
    }


#: the result's shaft role -> the sheet's shaft key
SHAFT_KEYS = {"existing": "shaft", "candidate": "candidate"}


def grid_sizes(
    boxes_m: list[tuple[float, float]], max_cols: int, max_rows: int, cell_aspect: float = 2.0
) -> list[tuple[int, int]]:
    """(cols, rows) for each (width, height) box so that all are drawn to ONE length scale.

    A character cell is about ``cell_aspect`` times as tall as it is wide; the largest box just
    fits ``max_cols`` x ``max_rows`` and the others get the same millimetres per cell.
    """
    widest = max((w for w, _ in boxes_m), default=0.0)
    tallest = max((h for _, h in boxes_m), default=0.0)
    if widest <= 0 or tallest <= 0:
        return [(max_cols, max_rows) for _ in boxes_m]
    col_m = max(widest / max_cols, tallest / (cell_aspect * max_rows))  # width of one cell [m]
    row_m = col_m * cell_aspect  # height of one cell [m]
    return [(max(1, round(w / col_m)), max(1, round(h / row_m))) for w, h in boxes_m]


def peak_place(shaft: dict[str, Any], location_m: tuple[float, float] | None) -> str:
    """Where on the section the peak shear sits, in the fitter's words.

    Plain round or tube: the rim (tau = T r / J). Sharp square or flat: the middle of the (long)
    sides (Saint-Venant, Timoshenko & Goodier 3rd ed. §109). Solved profiles: read from the
    solver's peak location (profile frame: keyseat or single flat on +y).
    """
    profile = shaft.get("profile", "")
    dims = shaft.get("dimensions_m") or {}
    size_m = float(dims.get("size_m") or 0.0)
    if location_m is None or size_m <= 0:
        if profile in ("round", "tube"):
            return "at the rim"
        return "mid-side" if profile != "flat" else "mid-side, wide faces"
    x_m, y_m = (float(v) for v in location_m)
    if shaft.get("keyed"):
        half_width_m = float(dims.get("key_width_m") or 0.25 * size_m) / 2.0
        depth_m = float(dims.get("key_depth_m") or 0.1 * size_m)
        near_seat = abs(x_m) <= 1.25 * half_width_m and y_m >= size_m / 2.0 - 1.5 * depth_m
        return "at the keyseat corner" if near_seat else "at the rim"
    if profile in ("round", "tube"):
        radius_m = (x_m * x_m + y_m * y_m) ** 0.5
        if radius_m < 0.5 * size_m - 1e-4 * size_m:  # inside the circle: on a ground flat
            return "mid-flat" if abs(x_m) < 0.1 * size_m else "at the edge of a flat"
        return "at the rim"
    if min(abs(x_m), abs(y_m)) < 0.1 * size_m:
        return "mid-side"
    return "near a corner"


def _cell_of(
    location_m: tuple[float, float] | None,
    bounds_m: tuple[float, float, float, float],
    cols: int,
    rows: int,
) -> tuple[int, int] | None:
    """(row, col) of the grid cell holding ``location_m`` (row 0 at the top), or None."""
    if location_m is None:
        return None
    x0, y0, x1, y1 = bounds_m
    if x1 <= x0 or y1 <= y0:
        return None
    x_m, y_m = location_m
    col = min(cols - 1, max(0, int((x_m - x0) / (x1 - x0) * cols)))
    row = min(rows - 1, max(0, int((y1 - y_m) / (y1 - y0) * rows)))
    return row, col


def _map_is_solved(geometry: Any) -> bool:
    """True when the stress map of ``geometry`` comes from the numerical solver (the rule of
    ``workbench.core.stress_map``: closed forms only for the plain round/tube and sharp rectangle)."""
    from workbench.core.stress_map import map_method

    return map_method(geometry) == "solver"


def section_view(inputs: dict[str, str], max_cols: int, max_rows: int) -> dict[str, Any]:
    """Both sections of the job for the section view, shaded on ONE absolute scale.

    Evaluates the job through the contract with the keyseat solver
    (``evaluate_inputs(inputs, solver=True)``) and draws each shaft's shear map on grids sized to
    one common length scale. Each cell's stress is tau_rel x that section's peak shear at the
    design torque [Pa], so both drawings read against the same ramp.

    The peak of a keyed shaft is the solver's (the handbook figure nominal x Kts is given beside
    it); of any other section the contract's ``max_shear_stress_Pa`` (closed form or solver, as
    its ``methods`` say). When the job cannot be evaluated yet the maps are still drawn, each
    relative to its own peak, and ``message`` says why there is no common scale.

    Returns {"design_torque_Nm", "scale_Pa" (the larger peak; None when relative), "message",
    "sections": [{role, spec, inside, tau_rel, tau_Pa (grid, or None), peak_Pa, peak_place,
    peak_cell ((row, col) of a solved peak, else None), method, nominal_Pa,
    keyseat (solver vs handbook dict or None), error}]}.
    """
    specs = [(k, inputs[k]) for k in ("shaft", "candidate") if inputs.get(k)]
    view: dict[str, Any] = {"design_torque_Nm": None, "scale_Pa": None, "message": "", "sections": []}
    if not specs:
        view["message"] = "No shaft on the sheet yet."
        return view
    job = _job_module()
    from workbench.core.profiles import profile_polygon
    from workbench.core.stress_map import shear_stress_map
    from workbench.core.torsion_solver import solve_torsion
    from workbench.specs import parse_spec

    result = None
    try:
        result = job.evaluate_inputs(inputs, solver=True)
    except job.JobInputError as err:
        view["message"] = f"no common scale until the sheet computes: {err}"
    except Exception as err:  # noqa: BLE001 - the drawings can still be made
        view["message"] = f"no common scale ({type(err).__name__}: {err})"
    shafts = {SHAFT_KEYS.get(s.get("role"), ""): s for s in (result or {}).get("shafts", [])}
    torque_Nm = (result or {}).get("drive", {}).get("design_torque_Nm")
    view["design_torque_Nm"] = torque_Nm

    geometries: list[Any] = []
    boxes: list[tuple[float, float]] = []
    bounds: dict[str, tuple[float, float, float, float]] = {}
    for role, spec in specs:
        try:
            geometry = parse_spec(spec, role)
            x0, y0, x1, y1 = profile_polygon(geometry).bounds_m()
        except Exception as err:  # noqa: BLE001 - said beside the drawing
            geometries.append(err)
            boxes.append((0.0, 0.0))
            continue
        geometries.append(geometry)
        boxes.append((x1 - x0, y1 - y0))
        bounds[role] = (x0, y0, x1, y1)
    good_boxes = [b for b, g in zip(boxes, geometries) if not isinstance(g, Exception)]
    sizes = iter(grid_sizes(good_boxes, max_cols, max_rows))

    for (role, spec), geometry in zip(specs, geometries):
        if isinstance(geometry, Exception):
            view["sections"].append({"role": role, "spec": spec, "error": str(geometry)})
            continue
        cols, rows = next(sizes)
        try:
            entry = _map_dict(role, spec, shear_stress_map(geometry, cols, rows))
        except Exception as err:  # noqa: BLE001
            view["sections"].append({"role": role, "spec": spec, "error": f"{type(err).__name__}: {err}"})
            continue
        shaft = shafts.get(role)
        entry.update(
            tau_Pa=None, peak_Pa=None, nominal_Pa=None, keyseat=None, peak_place="", peak_cell=None
        )
        if shaft is not None and torque_Nm is not None:
            solver = shaft.get("keyseat_solver")
            location = None
            if solver:
                peak_Pa = float(solver["peak_shear_stress_Pa"])
                location = tuple(solver.get("peak_location_m") or ()) or None
                nominal_Pa = float(shaft["max_shear_stress_Pa"])
                entry["nominal_Pa"] = nominal_Pa
                entry["keyseat"] = {
                    "solver_peak_Pa": peak_Pa,
                    "Kts_solver": float(solver["Kts_solver"]),
                    "handbook_peak_Pa": nominal_Pa * float(solver["Kts_handbook"]),
                    "Kts_handbook": float(solver["Kts_handbook"]),
                    "torsion_constant_ratio": solver.get("torsion_constant_ratio"),
                    "method": solver.get("method", ""),
                }
            else:
                peak_Pa = float(shaft["max_shear_stress_Pa"])
                if _map_is_solved(geometry):
                    location = solve_torsion(geometry).peak_location_m  # cached by the checks
            entry["peak_Pa"] = peak_Pa
            entry["peak_place"] = peak_place(shaft, location)
            entry["peak_cell"] = _cell_of(location, bounds[role], cols, rows)
            entry["tau_Pa"] = [[t * peak_Pa for t in row] for row in entry["tau_rel"]]
        view["sections"].append(entry)
    peaks = [s["peak_Pa"] for s in view["sections"] if s.get("peak_Pa")]
    if peaks and len(peaks) == len([s for s in view["sections"] if not s.get("error")]):
        view["scale_Pa"] = max(peaks)
    return view


def fit_calculator(size: str, cls: str, measured: str = "") -> tuple[str | None, str]:
    """The fits calculator's text answer for typed size, class and optional measured size
    (answer, message-if-not); see workbench/fitcalc.py."""
    job = _job_module()
    from workbench.fitcalc import fit_inputs, fit_text

    try:
        readings = [[part for part in measured.replace(",", " ").split()]] if measured.strip() else None
        return fit_text(fit_inputs(size, cls, measured=readings)), ""
    except job.JobInputError as err:
        return None, str(err)
