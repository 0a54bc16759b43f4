"""Record the figures of uniform round shafts with no layout options, as computed by the
single-section check that preceded step-by-step checking (run once, before that change).

    python tests/data/make_uniform_baseline.py   -> tests/data/uniform_round_baseline.json

The regression test (tests/core/test_steps_regression.py) asserts that the step-by-step check
gives these figures exactly for the same jobs. Jobs keep the service factor at or below the peak
factor and use explicit units, so that they do not depend on unrelated input rules.
"""

from __future__ import annotations

import itertools
import json
from pathlib import Path

from workbench.job import evaluate_inputs

FIELDS = (
    "static_safety_factor", "fatigue_safety_factor", "shear_yield_safety_factor", "Kt", "Kts", "Kf",
    "Kfs", "bending_moment_Nm", "bending_stress_Pa", "von_mises_stress_Pa", "tresca_stress_Pa",
    "max_shear_stress_Pa", "twist_deg_per_m", "twist_limit_deg_per_m", "endurance_limit_Pa", "marin",
    "verdict", "governing", "section_modulus_m3", "mass_kg_per_m",
)


def jobs() -> list[dict[str, str]]:
    out = []
    drives = [
        {"power": "7.5 kW", "speed": "1460 rpm", "ratio": "3.2", "service_factor": "1.5", "peak_factor": "2.2"},
        {"power": "2.2 kW", "speed": "960 rpm"},
        {"torque": "400 N*m", "service_factor": "1.25", "peak_factor": "2.5"},
        {"power": "30 kW", "speed": "1475 rpm", "ratio": "10", "efficiency": "95%", "peak_factor": "2"},
    ]
    mounts = [
        {},
        {"mount": "vbelt", "pitch_diameter": "200 mm", "overhang": "60 mm"},
        {"mount": "sprocket", "pitch_diameter": "150 mm", "overhang": "45 mm"},
        {"mount": "gear", "pitch_diameter": "120 mm", "overhang": "0 mm"},
        {"mount": "flat-belt", "pitch_diameter": "300 mm", "overhang": "90 mm"},
    ]
    shafts = ["round 35mm keyed", "round 40mm", "round 25mm keyed sharp-shoulder", "round 50mm round-shoulder",
              "round 60mm keyed ground", "round 1-1/4in keyed"]
    extras = [{}, {"material": "1018-cd", "criterion": "gerber", "reliability": "0.99"}]
    for drive, mount, shaft, extra in itertools.product(drives, mounts, shafts, extras):
        job = {**drive, **mount, "shaft": shaft, **extra}
        if shaft == "round 40mm":
            job["candidate"] = "round 45mm keyed"
        out.append(job)
    return out


def record(job: dict[str, str]) -> dict:
    result = evaluate_inputs(job)
    return {
        "inputs": job,
        "mount": {"side_load_N": result["mount"]["side_load_N"], "bending_moment_Nm": result["mount"]["bending_moment_Nm"]},
        "shafts": [{k: shaft[k] for k in FIELDS} for shaft in result["shafts"]],
    }


if __name__ == "__main__":
    target = Path(__file__).with_name("uniform_round_baseline.json")
    target.write_text(json.dumps([record(job) for job in jobs()], indent=1) + "\n", encoding="utf-8")
    print(f"wrote {target}")
