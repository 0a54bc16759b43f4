"""Torsional buckling of a thin-walled round tube.

A long thin tube under torsion buckles elastically at the shear stress

    tau_cr = E / (3 sqrt(2) (1 - nu^2)^(3/4)) * (t / r)^(3/2)        (~ 0.272 E (t/r)^1.5 for nu = 0.3)

with r the mean radius and t the wall (Timoshenko & Gere, Theory of Elastic Stability, 2nd ed.,
Sec. 11.10, long-tube limit; the same expression is in Roark's Formulas for Stress and Strain,
7th ed., Table 15.2, thin-walled circular tube under torsion — both from memory, verify). Tests on
real tubes buckle lower: a knock-down factor of 0.67 for torsion is applied (NASA SP-8007,
Buckling of Thin-Walled Circular Cylinders, 1968, from memory). The length between supports is
not known at the bench, so the long-tube value (the lowest for any length) is used: conservative.

The formula is for thin shells; for r/t below 10 the elastic buckling stress is far above yield
(0.272 E (0.1)^1.5 = 0.0086 E, about 1.8 GPa for steel) and yield governs, so none is reported.
"""

from __future__ import annotations

import math

POISSON = 0.3  # steel (common value)
KNOCK_DOWN = 0.67  # NASA SP-8007 torsion knock-down (from memory)
THIN_WALL_R_PER_T = 10.0  # below this the tube is thick-walled: yield governs (stated above)


def buckling_shear_stress_Pa(outside_m: float, inside_m: float, E_Pa: float, nu: float = POISSON) -> float | None:
    """Knocked-down elastic torsional buckling shear stress [Pa] of a long round tube, or None for a
    thick wall (r/t < 10). r = mean radius, t = wall [m]; E [Pa]. Source: module docstring."""
    t = (outside_m - inside_m) / 2.0
    r = (outside_m + inside_m) / 4.0
    if t <= 0 or r / t < THIN_WALL_R_PER_T:
        return None
    classic = E_Pa / (3.0 * math.sqrt(2.0) * (1.0 - nu * nu) ** 0.75) * (t / r) ** 1.5
    return KNOCK_DOWN * classic


def elastic_modulus_Pa(G_Pa: float, nu: float = POISSON) -> float:
    """E = 2 G (1 + nu) [Pa] (isotropic elasticity)."""
    return 2.0 * G_Pa * (1.0 + nu)
