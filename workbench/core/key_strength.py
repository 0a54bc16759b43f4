"""Strength of a parallel (feather) key: shear through the key and crushing of its flanks.

Method: nominal, uniformly distributed stresses on one parallel key, as in DIN 6892 method C
(the simple check of DIN 6892:2012, without its load-sharing and load-peak factors) and as in
Shigley's Mechanical Engineering Design, 9th ed., Sec. 7-7 (Example 7-6) for square keys:

- tangential force at the shaft surface  F = 2 T / d                        [N]
- shear through the key, on b x l_eff:   tau = F / (b l_eff),  n_s = S_sy / tau, with
  S_sy = 0.577 S_y of the key (distortion-energy theory, Shigley 9th ed. Eq. 5-21)
- crushing of the flanks: on the hub side the contact height is h - t1 (t1 = shaft keyseat
  depth), sigma = F / ((h - t1) l_eff), against the weakest of key, shaft and hub; the shaft
  side (contact height t1, key and shaft material) is checked as well and the lower factor kept.
  For a square key with t1 = h/2 both give Shigley's sigma = F / (l h / 2).
- effective (bearing) length: a round-ended key l_eff = l - b (DIN 6885-1 form A), a
  square-ended key l_eff = l (form B; Shigley's keys).

Hub materials come from ``data/hub_materials.csv``; the default hub is ``steel`` (S235, the
weakest common hub steel). Grey cast iron has no yield point: its tensile strength stands in
(common practice, conservative).

Public API::

    key_check(torque_Nm, shaft_diameter_m, key_width_m, key_height_m, shaft_seat_depth_m,
              key_length_m, key_end, key_yield_Pa, shaft_yield_Pa, hub_yield_Pa,
              required_sf) -> KeyCheck
    hub_material(name) -> HubMaterial      hub_materials() -> dict[str, HubMaterial]
    DEFAULT_HUB_MATERIAL = "steel"         KEY_ENDS = ("round", "square")
"""

from __future__ import annotations

import functools
from dataclasses import dataclass

from workbench.core.tables import _number, _read_rows

KEY_ENDS = ("round", "square")
DEFAULT_HUB_MATERIAL = "steel"
SHEAR_YIELD_RATIO = 0.577
"""S_sy / S_y by the distortion-energy theory (Shigley's MED 9th ed. Eq. 5-21)."""


@dataclass(frozen=True)
class KeyCheck:
    """Safety factors of one parallel key and the length the required factor needs.

    shear_safety_factor: S_sy(key) / tau  [-]
    crush_safety_factor: weakest flank strength / bearing stress, lower of hub and shaft side  [-]
    required_length_m: overall key length for the required factor in both checks (b added for a
        round-ended key)  [m]
    effective_length_m: bearing length of the key as given (l - b round-ended, l square)  [m]
    method: the method's name; notes: plain sentences for the fitter (e.g. the hub is too short)
    """

    shear_safety_factor: float
    crush_safety_factor: float
    required_length_m: float
    effective_length_m: float
    method: str
    notes: tuple[str, ...] = ()


def key_check(torque_Nm: float, shaft_diameter_m: float, key_width_m: float, key_height_m: float,
              shaft_seat_depth_m: float, key_length_m: float, key_end: str, key_yield_Pa: float,
              shaft_yield_Pa: float, hub_yield_Pa: float, required_sf: float) -> KeyCheck:
    """Shear and crushing safety factors of a parallel key, and its required length.

    torque_Nm: torque through the key [N m]; shaft_diameter_m: d at the seat [m];
    key_width_m b, key_height_m h, shaft_seat_depth_m t1 (keyseat depth in the shaft) [m];
    key_length_m l, overall [m]; key_end "round" (l_eff = l - b) or "square" (l_eff = l);
    key_yield_Pa, shaft_yield_Pa, hub_yield_Pa: yield (or crushing) strengths [Pa];
    required_sf: the safety factor both checks must reach [-].

    F = 2T/d; tau = F/(b l_eff), n_s = 0.577 S_y,key / tau; sigma_hub = F/((h - t1) l_eff)
    against min(S_y key, shaft, hub); sigma_shaft = F/(t1 l_eff) against min(S_y key, shaft).
    Source: DIN 6892:2012 method C (nominal pressure, one key, no load factors) and Shigley's
    Mechanical Engineering Design, 9th ed., Sec. 7-7 and Example 7-6 (square key, t1 = h/2).
    Raises ValueError for a key end that is not round or square, or sizes that are not positive
    (a keyseat as deep as the key, a key no longer than its width when round-ended).
    """
    if key_end not in KEY_ENDS:
        raise ValueError(f"key end {key_end!r}: use one of {', '.join(KEY_ENDS)}")
    for name, value in (("torque", torque_Nm), ("shaft diameter", shaft_diameter_m),
                        ("key width", key_width_m), ("key height", key_height_m),
                        ("keyseat depth", shaft_seat_depth_m), ("key length", key_length_m),
                        ("key yield", key_yield_Pa), ("shaft yield", shaft_yield_Pa),
                        ("hub yield", hub_yield_Pa), ("required safety factor", required_sf)):
        if not value > 0:
            raise ValueError(f"{name} must be positive (got {value})")
    hub_contact_m = key_height_m - shaft_seat_depth_m
    if not hub_contact_m > 0:
        raise ValueError("the keyseat depth t1 must be less than the key height h")
    end_allowance_m = key_width_m if key_end == "round" else 0.0
    effective_m = key_length_m - end_allowance_m
    if not effective_m > 0:
        raise ValueError("a round-ended key must be longer than it is wide")

    force_N = 2.0 * torque_Nm / shaft_diameter_m
    shear_strength_Pa = SHEAR_YIELD_RATIO * key_yield_Pa
    hub_side_Pa = min(key_yield_Pa, shaft_yield_Pa, hub_yield_Pa)
    shaft_side_Pa = min(key_yield_Pa, shaft_yield_Pa)
    # force each face can carry per metre of bearing length at the required factor
    shear_per_m = shear_strength_Pa * key_width_m
    crush_per_m = min(hub_side_Pa * hub_contact_m, shaft_side_Pa * shaft_seat_depth_m)

    shear_sf = shear_per_m * effective_m / force_N
    crush_sf = crush_per_m * effective_m / force_N
    needed_effective_m = required_sf * force_N / min(shear_per_m, crush_per_m)
    required_m = needed_effective_m + end_allowance_m
    notes = []
    if required_m > key_length_m * (1 + 1e-9):
        which = "crushing" if crush_per_m < shear_per_m else "shear"
        notes.append(f"the key is too short: {which} needs {required_m * 1e3:.0f} mm of key "
                     f"({key_end}-ended), the hub gives {key_length_m * 1e3:.0f} mm")
    return KeyCheck(
        shear_safety_factor=shear_sf,
        crush_safety_factor=crush_sf,
        required_length_m=required_m,
        effective_length_m=effective_m,
        method=("parallel key, nominal stresses: DIN 6892 method C style "
                "(Shigley 9th ed. Sec. 7-7 for square keys)"),
        notes=tuple(notes),
    )


# --------------------------------------------------------------------------- hub materials


@dataclass(frozen=True)
class HubMaterial:
    """A hub material for the crushing check: its key, yield (or crushing) strength, source.

    name: the key a job names (``steel``, ``cast-iron-250``…); yield_Pa [Pa]; source: the
    document (and, in brackets, how sure); description and basis ("yield" or "tensile", the
    figure that stands in where the material has no yield point) are for display.
    """

    name: str
    yield_Pa: float
    source: str
    description: str = ""
    basis: str = "yield"
    mark: str = "M"


@functools.cache
def hub_materials() -> dict[str, HubMaterial]:
    """All hub materials of ``data/hub_materials.csv``, by key (loaded once)."""
    filename = "hub_materials.csv"
    out = {}
    for line, row in _read_rows(filename, ("key", "name", "yield_MPa", "basis")):
        out[row["key"]] = HubMaterial(
            name=row["key"], yield_Pa=_number(filename, line, row, "yield_MPa") * 1e6,
            source=row["source"], description=row["name"], basis=row["basis"], mark=row["mark"])
    return out


def hub_material(name: str | None = None) -> HubMaterial:
    """The hub material called ``name`` (default ``steel``); ValueError listing the names."""
    table = hub_materials()
    key = (name or DEFAULT_HUB_MATERIAL).strip().lower()
    if key not in table:
        raise ValueError(f"hub material {name!r} is not known; use one of {', '.join(table)}")
    return table[key]
