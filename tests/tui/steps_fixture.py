"""A result dict with a fixed shaft-as-steps part of the job contract, for display tests.

The demo job's real result with its ``steps``, ``governing_step``, ``key``,
``critical_speed_rpm``, ``deflection_m``, ``bearing_slopes_rad``, ``layout`` and
``moment_diagram`` REPLACED by a fixed, invented set shaped as the contract (issue 8) names them,
so drawing and table tests (and the profile snapshots) do not move when the calculation does. No
test checks an engineering value from here; ``real_result()`` is the demo as computed today.
"""

from __future__ import annotations

import copy
import functools


def _step(kind, x0, x1, d, fillet=None, keyed=False, label="", m=0.0, t=0.0, kt=1.0, kts=1.0,
          static=9.0, fatigue=9.0):
    return {"kind": kind, "x_start_m": x0, "x_end_m": x1, "diameter_m": d, "fillet_m": fillet,
            "keyed": keyed, "label": label, "bending_moment_Nm": m, "torque_Nm": t, "Kt": kt,
            "Kts": kts, "static_safety_factor": static, "fatigue_safety_factor": fatigue}


def _moment_diagram(side_load_N: float, torque_Nm: float) -> dict:
    xs = [0.0, 0.02, 0.32, 0.38, 0.42]
    moments = [0.0, 0.0, -side_load_N * 0.06, 0.0, 0.0]
    torques = [torque_Nm, torque_Nm, torque_Nm, torque_Nm, 0.0]
    return {"x_m": xs, "moment_Nm": moments, "torque_Nm": torques}


@functools.cache
def _stepped_result() -> dict:
    from workbench.demo import demo_inputs
    from workbench.job import evaluate_inputs

    result = evaluate_inputs(demo_inputs())
    torque = result["drive"]["design_torque_Nm"]
    moment = result["mount"]["side_load_N"] * 0.06
    existing, candidate = result["shafts"]
    existing["steps"] = [
        _step("body", 0.0, 0.42, 0.040, None, False, "body, round 40 mm", moment, torque, 1.0, 1.0, 5.1, 3.2),
        _step("seat", 0.34, 0.42, 0.040, None, True, "hub seat, keyed, 40 mm", moment * 0.5, torque,
              2.14, 3.0, 3.9, 2.33),
    ]
    existing["governing_step"] = 1
    candidate["steps"] = [
        _step("journal", 0.0, 0.04, 0.040, None, False, "journal 40 mm", 0.0, torque, 1.0, 1.0, 8.0, 6.0),
        _step("shoulder", 0.04, 0.04, 0.040, 0.0008, False, "shoulder 40/50 mm", 0.5, torque, 2.3, 1.8, 7.0, 5.5),
        _step("body", 0.04, 0.30, 0.050, None, False, "body, square 50 mm", moment * 0.9, torque,
              1.0, 1.0, 6.5, 4.4),
        _step("shoulder", 0.30, 0.30, 0.040, 0.0008, False, "shoulder 50/40 mm", moment * 0.93, torque,
              2.3, 1.8, 3.3, 1.95),
        _step("journal", 0.30, 0.34, 0.040, None, False, "journal 40 mm", moment, torque, 1.0, 1.0, 4.2, 2.9),
        _step("seat", 0.34, 0.42, 0.040, None, True, "hub seat, keyed, 40 mm", moment * 0.5, torque,
              2.14, 3.0, 3.9, 2.33),
    ]
    candidate["governing_step"] = 3
    for shaft in (existing, candidate):
        shaft["key"] = {"shear_safety_factor": 6.1, "crush_safety_factor": 2.4, "required_length_m": 0.045,
                        "key_length_m": 0.08}
        shaft["slope_limit_rad"] = 0.001
        shaft["critical_speed_rpm"] = 9100.0
        shaft["deflection_m"] = 0.00004
        shaft["bearing_slopes_rad"] = [0.00012, 0.00035]
    result["layout"] = {"bearing_x_m": [0.02, 0.32], "bearing_span_m": 0.30, "load_x_m": 0.38}
    result["moment_diagram"] = _moment_diagram(result["mount"]["side_load_N"], torque)
    return result


def stepped_result() -> dict:
    """A fresh deep copy of the demo result with the steps part (see the module docstring)."""
    return copy.deepcopy(_stepped_result())


def real_result() -> dict:
    """The demo job's result as the program computes it today (steps included)."""
    from workbench.demo import demo_inputs
    from workbench.job import evaluate_inputs

    return evaluate_inputs(demo_inputs())
