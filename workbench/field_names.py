"""What each job input is called where a person sees it: its CLI option and its workbench label.

Messages name the option (``--pitch-diameter``) on the command line and the field label in the
workbench, never the internal key (``pitch_diameter``). Both sides use these two maps.
"""

from __future__ import annotations

import re

OPTIONS = {
    "power": "--power", "speed": "--speed", "torque": "--torque", "ratio": "--ratio",
    "efficiency": "--efficiency", "service_factor": "--service-factor", "duty": "--duty",
    "peak_factor": "--peak-factor", "mount": "--mount", "pitch_diameter": "--pitch-diameter",
    "overhang": "--overhang", "shaft": "--shaft", "candidate": "--candidate", "material": "--material",
    "candidate_material": "--candidate-material", "required_sf": "--required-sf",
    "criterion": "--criterion", "reliability": "--reliability", "twist_limit": "--twist-limit",
    "profile": "--profile", "system": "--system",
}

LABELS = {
    "power": "Power", "speed": "Speed", "torque": "or Torque", "ratio": "Ratio", "efficiency": "Efficiency",
    "service_factor": "Service factor", "duty": "Duty", "peak_factor": "Start torque ×", "mount": "Element",
    "pitch_diameter": "Pitch dia.", "overhang": "Overhang", "shaft": "Shaft as found",
    "candidate": "Candidate", "material": "Material", "candidate_material": "Candidate material",
    "required_sf": "Required SF", "criterion": "Fatigue criterion", "reliability": "Reliability",
    "twist_limit": "Twist limit", "profile": "Profile", "system": "Units",
}


def option_for(key: str) -> str:
    """The CLI option of an input key (``pitch_diameter`` -> ``--pitch-diameter``); an option stays."""
    if key.startswith("--") or key.isupper():  # an option, or a positional argument (SIZE, CLASS)
        return key
    return OPTIONS.get(key, "--" + key.replace("_", "-"))


def label_for(key: str) -> str:
    """The workbench label of an input key (``pitch_diameter`` -> ``Pitch diameter``)."""
    return LABELS.get(key, key.replace("_", " ").capitalize())


_BY_OPTION = {option: key for key, option in OPTIONS.items()}


_OPTION_WORD = re.compile(r"(?<![\w-])--([a-z][a-z0-9]*(?:-[a-z0-9]+)*)")


def warning_for_workbench(line: str) -> str:
    """A job warning as the workbench shows it: every ``--option`` becomes its field label
    (``--overhang: ...`` -> ``Overhang: ...``, ``give --duty or --service-factor`` -> ``give Duty
    or Service factor``); a line without one is left as it is."""

    def label(match: re.Match[str]) -> str:
        option = match.group(0)
        return label_for(_BY_OPTION.get(option, option[2:].replace("-", "_")))

    return _OPTION_WORD.sub(label, line)


def workbench_warning_lines(result: dict) -> list[str]:
    """The job's ``warnings`` worded for the workbench's verdict panel (labels, not options)."""
    return [warning_for_workbench(line) for line in result.get("warnings") or []]
