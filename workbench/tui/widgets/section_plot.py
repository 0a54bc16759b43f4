"""A cross-section drawn in characters, shear stress shaded with a ramp that reads without colour."""

from __future__ import annotations

from typing import Any

from rich.text import Text

#: low -> high shear; the character alone tells the level (NO_COLOR), the colour only repeats it
RAMP = "·:░▒▓█"
RAMP_COLOURS = ("#4b6fa5", "#3f9fb5", "#5bb56a", "#d6b83a", "#e07b2f", "#d43d2f")


def ramp_index(tau_rel: float) -> int:
    """The ramp step (0 … len(RAMP)-1) for a relative shear stress 0 … 1."""
    tau_rel = min(1.0, max(0.0, tau_rel))
    return min(len(RAMP) - 1, int(tau_rel * len(RAMP)))


def render_map(smap: dict[str, Any], colour: bool = True) -> Text:
    """The drawing of one map dict (``inside`` and ``tau_rel`` grids) as Rich text."""
    text = Text()
    for inside_row, tau_row in zip(smap["inside"], smap["tau_rel"]):
        for inside, tau in zip(inside_row, tau_row):
            if not inside:
                text.append(" ")
                continue
            step = ramp_index(tau)
            text.append(RAMP[step], RAMP_COLOURS[step] if colour else "")
        text.append("\n")
    return text


def legend() -> Text:
    """One line explaining the ramp."""
    text = Text("shear  low ")
    for step, char in enumerate(RAMP):
        text.append(char * 2, RAMP_COLOURS[step])
    text.append(" peak")
    return text
