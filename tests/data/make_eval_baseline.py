"""Record the whole JSON result of ~50 varied jobs, as computed before the evaluation was sped up
(run once, before that change; rerun only when a figure changes on purpose, saying why).

    python tests/data/make_eval_baseline.py   -> tests/data/eval_baseline.json.gz

The test tests/test_eval_speed_identical.py evaluates the same jobs (each twice, so that anything
remembered between calls serves the second one) and asserts the result equals this recording
exactly, so a remembered figure that went stale would fail it.
"""

from __future__ import annotations

import gzip
import json
from pathlib import Path

from workbench.demo import demo_inputs
from workbench.job import JobInputError, evaluate_inputs

BASE = {
    "power": "11 kW", "speed": "970 rpm", "ratio": "2.5", "efficiency": "0.95", "service_factor": "1.25",
    "mount": "sprocket", "pitch_diameter": "180 mm", "overhang": "45 mm",
    "shaft": "round 45mm keyed", "candidate": "hex 55mm", "material": "4140-qt540",
    "bearing_span": "400 mm", "hub_length": "70 mm", "element_mass": "4 kg",
}


def jobs() -> list[dict[str, str]]:
    """The recorded jobs: the demo, its variations and non-demo jobs over bar shapes, units and options."""
    demo = demo_inputs()
    out = [demo]
    variants = [
        {}, {"speed": "1200 rpm"}, {"bearing_span": "380 mm"}, {"candidate": "square 50mm"},
        {"candidate": "hex 50mm"}, {"candidate": "round 45mm keyed"}, {"candidate": "tube 60mm/30mm"},
        {"candidate": "flat 80mm x 50mm"}, {"as_bar": "yes"}, {"candidate_journal": "45 mm"},
        {"candidate_fillet": "2 mm"}, {"element_position": "between", "load_from_bearing": "150 mm"},
        {"driven_position": "between", "driven_from_bearing": "120 mm", "driven_load": "800 N"},
        {"journal_class": "k6"}, {"seat_class": "j6"}, {"key_fit": "tight"}, {"turning_sheets": "both"},
        {"bearing": "6208"}, {"criterion": "gerber"}, {"reliability": "0.99"}, {"duty": "conveyor-moderate 24h"},
        {"required_sf": "2"}, {"twist_limit": "0.5 deg/m"}, {"hub_material": "cast-iron-250"},
        {"candidate_material": "4140-qt540"}, {"shaft": "round 40mm"}, {"torque": "300 N*m", "power": ""},
    ]
    for extra in variants:
        out.append({k: v for k, v in {**demo, **extra}.items() if v != ""})
        out.append({k: v for k, v in {**BASE, **extra}.items() if v != ""})
    inch = {
        "power": "15 hp", "speed": "1750 rpm", "ratio": "3", "service_factor": "1.4", "mount": "vbelt",
        "pitch_diameter": "8 in", "overhang": "2.5 in", "shaft": "round 1.5in keyed", "candidate": "square 1.75in",
        "material": "1045-cd", "bearing_span": "16 in", "hub_length": "3 in", "element_mass": "12 lb",
    }
    out += [inch, {**inch, "candidate": "hex 1.75in"}, {**inch, "candidate": "tube 2.25in/1in"},
            {**inch, "speed": "1160 rpm", "bearing_span": "18 in"}]
    return out


def record() -> list[dict]:
    """Each job with its result dict, or the refusal (field, message) for a job that is refused."""
    rows = []
    for job in jobs():
        try:
            rows.append({"inputs": job, "result": evaluate_inputs(job)})
        except JobInputError as err:
            rows.append({"inputs": job, "refused": [err.field, err.message]})
    return rows


if __name__ == "__main__":
    path = Path(__file__).with_name("eval_baseline.json.gz")
    path.write_bytes(gzip.compress((json.dumps(record(), sort_keys=True, separators=(",", ":")) + "\n").encode(), mtime=0))
    print(path.name)
