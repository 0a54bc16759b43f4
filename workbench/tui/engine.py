"""The workbench's only road to the calculation: the job contract in :mod:`workbench.job`.

Everything heavy (pint, numpy, the core) is imported here lazily, on the first evaluation, which
runs in a worker thread after the first paint. When a piece the workbench needs is missing the
functions return a clear "not available" message instead of raising.
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
    missing: a message when the calculation itself is not available (module not installed yet)
    elapsed_s: wall time of the evaluation
    """

    result: dict[str, Any] | None = None
    errors: dict[str, str] = field(default_factory=dict)
    missing: str = ""
    elapsed_s: float = 0.0

    @property
    def ok(self) -> bool:
        """True when a result was computed from every field as typed."""
        return self.result is not None and not self.errors and not self.missing


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
    try:
        job = _job_module()
    except ImportError as err:
        return Evaluation(missing=f"calculation not available ({err})")
    errors: dict[str, str] = {}
    trial = dict(inputs)
    result = None
    for _ in range(len(inputs) + 1):
        try:
            result = job.evaluate_inputs(trial)
            break
        except job.JobInputError as err:
            key = getattr(err, "field", "") or "job"
            message = str(err)
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


def substitute(inputs: dict[str, str]) -> tuple[dict[str, Any] | None, str]:
    """Equal-strength / equal-stiffness sizes for the job (result, message-if-not)."""
    try:
        job = _job_module()
        fn = job.substitute_inputs
    except (ImportError, AttributeError) as err:
        return None, f"substitution not available ({err})"
    try:
        return fn(inputs), ""
    except job.JobInputError as err:
        return None, str(err)


def stock(
    inputs: dict[str, str], profile: str, system: str, materials: list[str]
) -> tuple[dict[str, Any] | None, str]:
    """Standard stock sizes that pass for the job (result, message-if-not)."""
    try:
        job = _job_module()
        fn = job.stock_inputs
    except (ImportError, AttributeError) as err:
        return None, f"stock finder not available ({err})"
    try:
        return fn(inputs, profile, system, materials), ""
    except job.JobInputError as err:
        return None, str(err)


def material_keys() -> list[str]:
    """The material keys of the shop table, or [] when the table is not available yet."""
    try:
        from workbench.core.tables import materials
    except ImportError:
        return []
    try:
        rows = materials()
    except Exception:  # a half-written table must not take the sheet down
        return []
    keys: list[str] = []
    for row in rows if not isinstance(rows, dict) else rows.values():
        key = row if isinstance(row, str) else getattr(row, "key", None)
        if key is None and isinstance(row, dict):
            key = row.get("key")
        if key:
            keys.append(str(key))
    if isinstance(rows, dict) and not keys:
        keys = [str(k) for k in rows]
    return keys


def section_maps(specs: list[tuple[str, str]], cols: int, rows: int) -> list[dict[str, Any]]:
    """Shear-stress maps for (role, spec) pairs: dicts with role, spec, inside, tau_rel, method, error."""
    out: list[dict[str, Any]] = []
    try:
        from workbench.core.stress_map import shear_stress_map
        from workbench.specs import parse_spec
    except ImportError as err:
        return [{"role": r, "spec": s, "error": f"section view not available ({err})"} for r, s in specs]
    for role, spec in specs:
        try:
            geometry = parse_spec(spec)
            smap = shear_stress_map(geometry, cols, rows)
            out.append(
                {
                    "role": role,
                    "spec": spec,
                    "inside": [[bool(v) for v in row] for row in smap.inside],
                    "tau_rel": [[float(v) for v in row] for row in smap.tau_rel],
                    "method": str(getattr(smap, "method", "")),
                    "error": "",
                }
            )
        except Exception as err:  # noqa: BLE001 - shown to the fitter beside the drawing
            out.append({"role": role, "spec": spec, "error": f"{type(err).__name__}: {err}"})
    return out
