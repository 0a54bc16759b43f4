"""A cross-section drawn in characters, shear stress shaded with a ramp that reads without colour."""

from __future__ import annotations

from typing import Any

from rich.text import Text

#: low -> high shear; the character alone tells the level (NO_COLOR), the colour only repeats it
RAMP = "·:░▒▓█"
RAMP_COLOURS = ("#4b6fa5", "#3f9fb5", "#5bb56a", "#d6b83a", "#e07b2f", "#d43d2f")
PEAK_MARK = "◆"  # the cell holding a solved section's peak


def ramp_index(tau_rel: float) -> int:
    """The ramp step (0 … len(RAMP)-1) for a relative shear stress 0 … 1."""
    tau_rel = min(1.0, max(0.0, tau_rel))
    return min(len(RAMP) - 1, int(tau_rel * len(RAMP)))


def render_map(smap: dict[str, Any], colour: bool = True, scale_Pa: float | None = None) -> Text:
    """The drawing of one map dict as Rich text.

    With ``scale_Pa`` the cells are shaded by ``tau_Pa / scale_Pa`` (one absolute scale shared by
    every section drawn); without it by ``tau_rel`` (the section's own peak).
    """
    text = Text()
    absolute = scale_Pa is not None and scale_Pa > 0 and smap.get("tau_Pa") is not None
    levels = smap["tau_Pa"] if absolute else smap["tau_rel"]
    peak_cell = tuple(smap.get("peak_cell") or ()) or None
    for r, (inside_row, tau_row) in enumerate(zip(smap["inside"], levels)):
        for c, (inside, tau) in enumerate(zip(inside_row, tau_row)):
            if (r, c) == peak_cell:
                text.append(PEAK_MARK, "bold")
                continue
            if not inside:
                text.append(" ")
                continue
            step = ramp_index(tau / scale_Pa if absolute else tau)
            text.append(RAMP[step], RAMP_COLOURS[step] if colour else "")
        text.append("\n")
    return text


def legend(scale: list[str] | None = None) -> Text:
    """The ramp explained: bands' upper bounds when ``scale`` gives them, else low … peak."""
    if scale and len(scale) == len(RAMP):
        text = Text()
        for step, (char, bound) in enumerate(zip(RAMP, scale)):
            text.append(char * 2, RAMP_COLOURS[step])
            text.append(f" {bound}  ")
        return text
    text = Text("shear  low ")
    for step, char in enumerate(RAMP):
        text.append(char * 2, RAMP_COLOURS[step])
    text.append(" peak")
    return text
