"""What is mounted on the shaft: the side load of a pulley, sprocket or gear and its bending moment.

Forces [N], torques and moments [N*m], lengths [m].
"""

from __future__ import annotations

from dataclasses import dataclass


@dataclass(frozen=True)
class Mount:
    """The element on the shaft end.

    element:          key of data/mount_factors.csv ("coupling", "sprocket", "vbelt", ...)
    load_factor:      overhung-load factor K of that element [-] (0 for a coupling)
    pitch_diameter_m: pitch diameter of the pulley/sprocket/gear [m] (0 for a coupling)
    overhang_m:       distance from the nearest bearing to the element's load line [m]
    """

    element: str = "coupling"
    load_factor: float = 0.0
    pitch_diameter_m: float = 0.0
    overhang_m: float = 0.0

    @property
    def carries_side_load(self) -> bool:
        return self.load_factor > 0.0 and self.pitch_diameter_m > 0.0


def side_load_N(torque_Nm: float, pitch_diameter_m: float, load_factor: float) -> float:
    """Overhung (side) load F = 2 T K / D [N] of a drive element of pitch diameter D carrying torque T.

    K = 1.00 sprocket or timing belt, 1.25 gear, 1.50 V-belt, 2.50 flat belt (gear-reducer makers'
    engineering data for overhung load; the 2T/D part is the tangential force, Shigley 9th ed.,
    Sec. 13-14; K accounts for belt pre-tension and the radial gear-force component).
    """
    if pitch_diameter_m <= 0.0 or load_factor <= 0.0:
        return 0.0
    return 2.0 * torque_Nm * load_factor / pitch_diameter_m


def overhung_moment_Nm(side_load: float, overhang_m: float) -> float:
    """Bending moment M = F a [N*m] at the bearing nearest an element overhung by ``a`` (cantilever statics)."""
    return side_load * overhang_m
