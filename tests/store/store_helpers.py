"""Helpers for the job log tests: real results from ``evaluate_inputs``, child-process setup."""

from __future__ import annotations

import os
import sys
from functools import lru_cache
from pathlib import Path

import workbench
from workbench.demo import DEMO_INPUTS
from workbench.job import evaluate_inputs

# A handful of different jobs, as a fitter would type them.
JOB_INPUTS = {
    "demo": dict(DEMO_INPUTS),
    "small-fan": {"power": "1.5 kW", "speed": "2900 rpm", "shaft": "round 20mm keyed", "material": "1045-hr"},
    "mixer": {
        "power": "5.5 kW", "speed": "1450 rpm", "shaft": "hex 27mm", "candidate": "tube 40mm/30mm",
        "material": "4140-qt425",
    },
    "overloaded": {
        "power": "30 kW", "speed": "1470 rpm", "shaft": "round 25mm keyed", "mount": "vbelt",
        "pitch_diameter": "150mm", "overhang": "80mm",
    },
}


@lru_cache(maxsize=None)
def _result(name: str) -> str:
    import json

    return json.dumps(evaluate_inputs(dict(JOB_INPUTS[name])))


def result_for(name: str) -> dict:
    """A fresh copy of today's result for one of JOB_INPUTS."""
    import json

    return json.loads(_result(name))


def subprocess_env() -> dict[str, str]:
    """Environment for a child Python that must import this checkout of ``workbench``."""
    env = dict(os.environ)
    root = str(Path(workbench.__file__).resolve().parent.parent)
    env["PYTHONPATH"] = os.pathsep.join(p for p in (root, env.get("PYTHONPATH", "")) if p)
    return env


PYTHON = sys.executable
