"""The measured geometry of one shaft section, in SI floats.

This is the single description of a bar profile shared by the section formulas, the numerical
torsion solver, the stress map and the workbench. It holds only dimensions and flags; the numbers
derived from them live in :mod:`workbench.core.sections`.
"""

from __future__ import annotations

from dataclasses import dataclass

PROFILES = ("round", "tube", "square", "flat", "hex")
FINISHES = ("ground", "machined", "cold-drawn", "hot-rolled", "forged")
SHOULDERS = ("none", "sharp", "rounded")


@dataclass(frozen=True)
class ShaftGeometry:
    """One bar section as measured at the bench.

    profile:   "round" | "tube" | "square" | "flat" | "hex"
    size_m:    round: diameter; tube: outside diameter; square: side; flat: width (long side);
               hex: size across flats  [m]
    second_m:  tube: inside diameter; flat: thickness (short side); otherwise 0  [m]
    keyed:     a standard parallel-key keyseat is cut (in a round or tube section; on a square, hex or
               flat bar in its turned hub seat); its size comes from
               the key table for ``size_m`` unless ``key_width_m``/``key_depth_m`` are given
    key_standard: "iso" (DIN 6885-1 / ISO 773 metric) or "ansi" (ANSI B17.1 inch)
    key_width_m, key_depth_m, key_radius_m: an explicit keyseat (0 = from the table)  [m]
    finish:    surface finish for the Marin surface factor (see FINISHES)
    shoulder:  stress raiser at the checked section besides the keyseat (see SHOULDERS)
    flats:     round only: number of ground flats (0, 1 = D profile, 2 = double-D)
    flat_depth_m: depth of each ground flat from the round surface  [m]
    corner_radius_m: square/flat: corner radius  [m]
    chamfer_m: square/flat: corner chamfer leg  [m]
    """

    profile: str
    size_m: float
    second_m: float = 0.0
    keyed: bool = False
    key_standard: str = "iso"
    key_width_m: float = 0.0
    key_depth_m: float = 0.0
    key_radius_m: float = 0.0
    finish: str = "machined"
    shoulder: str = "none"
    flats: int = 0
    flat_depth_m: float = 0.0
    corner_radius_m: float = 0.0
    chamfer_m: float = 0.0
