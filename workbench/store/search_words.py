"""What a job is found by: the words people type when they look for one.

A text filter matches a job when every word appears, in any case, in its search text: the asset,
location and notes, the material, who checked it, what was fitted and how it ended, the specs of
the shaft as found and of the candidate (as typed and as the program read them), the mounted
element, and the verdict and governing check words (``pass``, ``marginal``, ``fail``, ``fatigue``,
``twist``...). The text is case-folded (``str.casefold``), one field a line.
"""

from __future__ import annotations

from collections.abc import Mapping
from typing import Any

OUTCOME_WORDS = {"still-running": "still running", "failed": "failed again", "removed": "removed"}
"""Each outcome and the words it is found by besides its own (``failed`` is also ``failed again``)."""


def job_search_text(meta: Mapping[str, Any], inputs: Any, result: Any) -> str:
    """The case-folded text a job is found by (see the module note).

    ``meta`` holds asset, location, by, note, material, fitted, outcome (missing keys are empty);
    ``inputs`` and ``result`` may be damaged (anything): only the strings found are used.
    """
    parts: list[str] = [str(meta.get(name) or "") for name in ("asset", "location", "note", "material")]
    parts += [str(meta.get(name) or "") for name in ("by", "fitted")]
    outcome = str(meta.get("outcome") or "")
    if outcome:
        parts.append(f"{outcome} {OUTCOME_WORDS.get(outcome, '')}".strip())
    if isinstance(inputs, Mapping):
        for key in ("shaft", "candidate", "mount"):
            value = inputs.get(key)
            if isinstance(value, str):
                parts.append(value)
    if isinstance(result, Mapping):
        verdict = result.get("verdict")
        if isinstance(verdict, str):
            parts.append(verdict)
        mount = result.get("mount")
        if isinstance(mount, Mapping) and isinstance(mount.get("element"), str):
            parts.append(mount["element"])
        for shaft in result.get("shafts") or []:
            if isinstance(shaft, Mapping):
                parts.extend(
                    str(shaft[key]) for key in ("spec", "profile", "verdict", "governing")
                    if isinstance(shaft.get(key), str)
                )
    unique = dict.fromkeys(p.strip() for p in parts)  # keep order, drop repeats (spec typed = spec read)
    return "\n".join(p for p in unique if p).casefold()
