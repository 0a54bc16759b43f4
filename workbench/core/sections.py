"""Section properties of the bar profiles a fitter meets: round, tube, square, flat, hex, keyed round.

Every figure is per section, SI: area [m^2], torsion constant J [m^4] (twist rate = T / (G J)),
peak torsional shear per unit torque [Pa/(N*m)], bending section modulus Z [m^3] for a ROTATING
shaft (the worst orientation of the bending axis, since a side load fixed in space sweeps round
the section once per turn), and the diameters used by the fatigue size factor and the twist limit.
Each value's method is recorded in ``methods`` so that every figure shown can be traced.
"""

from __future__ import annotations

import functools
import math
from dataclasses import dataclass, field
from functools import cache

from workbench.core.geometry import ShaftGeometry
from workbench.core.rectangle import rectangle_coefficients

SQRT3 = math.sqrt(3.0)


@dataclass(frozen=True)
class Section:
    """Derived properties of one shaft section (SI units, see module docstring)."""

    geometry: ShaftGeometry
    area_m2: float
    torsion_constant_m4: float
    shear_per_torque_Pa_per_Nm: float
    section_modulus_m3: float
    size_factor_diameter_m: float
    key_width_m: float = 0.0
    key_depth_m: float = 0.0
    methods: dict[str, str] = field(default_factory=dict, compare=False)

    @property
    def stiffness_diameter_m(self) -> float:
        """Diameter of the solid round with the same torsion constant: d = (32 J / pi)^(1/4) [m]."""
        return (32.0 * self.torsion_constant_m4 / math.pi) ** 0.25


def round_properties(diameter_m: float) -> tuple[float, float, float, float]:
    """Solid round: (A, J, tau/T, Z) = (pi d^2/4, pi d^4/32, 16/(pi d^3), pi d^3/32).

    Exact elasticity (Saint-Venant torsion of a circle; Euler-Bernoulli bending).
    Source: Shigley's Mechanical Engineering Design, 9th ed., Eqs. 3-37 and 3-26/Table A-18.
    """
    d = diameter_m
    return math.pi * d * d / 4.0, math.pi * d**4 / 32.0, 16.0 / (math.pi * d**3), math.pi * d**3 / 32.0


def tube_properties(outside_m: float, inside_m: float) -> tuple[float, float, float, float]:
    """Round tube: A = pi (D^2 - d^2)/4, J = pi (D^4 - d^4)/32, tau/T = D/(2J), Z = 2 I / D = J / D.

    Exact (Shigley's Mechanical Engineering Design, 9th ed., Eq. 3-37 and Table A-18).
    """
    big, small = outside_m, inside_m
    polar = math.pi * (big**4 - small**4) / 32.0
    area = math.pi * (big * big - small * small) / 4.0
    return area, polar, big / (2.0 * polar), polar / big


def rectangle_properties(width_m: float, thickness_m: float) -> tuple[float, float, float, float]:
    """Solid rectangle b x c (any order): (A, J, tau/T, Z_rotating).

    J = k1 b c^3 and tau_max = T/(k2 b c^2) from the exact series (Timoshenko & Goodier, Theory of
    Elasticity, 3rd ed., Sec. 109). Z for a rotating bar is the smallest over all orientations of
    the bending axis, reached with the corner as extreme fibre:
    Z = 1 / sqrt((c1/I1)^2 + (c2/I2)^2), with I1 = b c^3/12, I2 = c b^3/12, c1 = c/2, c2 = b/2
    (superposition of bending about both principal axes, Shigley 9th ed., Sec. 3-10). For a square
    this gives a^3 / (6 sqrt 2), bending about a diagonal.
    """
    b, c = max(width_m, thickness_m), min(width_m, thickness_m)
    k1, k2 = rectangle_coefficients(b / c)
    i_weak = b * c**3 / 12.0
    i_strong = c * b**3 / 12.0
    z_rot = 1.0 / math.hypot((c / 2.0) / i_weak, (b / 2.0) / i_strong)
    return b * c, k1 * b * c**3, 1.0 / (k2 * b * c * c), z_rot


def hexagon_properties(across_flats_m: float) -> tuple[float, float, float, float]:
    """Regular hexagon, s across flats: (A, J, tau/T, Z).

    A = (sqrt 3 / 2) s^2; I = 5 sqrt3 s^4 / 144 about any centroidal axis (a regular polygon);
    Z = I / (s / sqrt 3) = 5 s^3 / 48 with a corner as extreme fibre (exact geometry).
    J = k1 s^4 and tau_max = T / (k2 s^3) with k1, k2 from data/section_coefficients.csv, computed
    by our torsion solver (all regular hexagons are similar, so two numbers cover every size) and
    within 0.3 % of Roark's Formulas for Stress and Strain, 7th ed., Table 10.7 (from memory).
    """
    k1, k2 = section_coefficients()["hex"]
    s = across_flats_m
    area = SQRT3 / 2.0 * s * s
    z = 5.0 * s**3 / 48.0
    return area, k1 * s**4, 1.0 / (k2 * s**3), z


@cache
def section_coefficients() -> dict[str, tuple[float, float]]:
    """(torsion coefficient, stress coefficient) per profile from data/section_coefficients.csv."""
    import csv

    from workbench.core.tables import data_dir

    with (data_dir() / "section_coefficients.csv").open(newline="", encoding="utf-8") as fh:
        return {row["profile"]: (float(row["torsion_coefficient"]), float(row["stress_coefficient"]))
                for row in csv.DictReader(fh)}


def needs_solver(geometry: ShaftGeometry) -> bool:
    """True where no closed form exists: ground flats on a round, rounded or chamfered corners."""
    return bool(geometry.flats or geometry.corner_radius_m or geometry.chamfer_m)


def solved_section(geometry: ShaftGeometry) -> tuple[float, float, float, float, str]:
    """(A, J, tau/T, Z_rotating, method) of a section by the numerical torsion solver (finite
    elements on the Prandtl stress function; see workbench.core.torsion_solver) and the polygon's
    exact area and bending properties (workbench.core.polygon_props)."""
    from workbench.core.polygon_props import polygon_properties
    from workbench.core.profiles import profile_polygon
    from workbench.core.torsion_solver import solve_torsion

    polygon = profile_polygon(geometry)
    props = polygon_properties(polygon.outer, polygon.holes)
    solution = solve_torsion(geometry)
    return (props.area_m2, solution.torsion_constant_m4, solution.shear_per_torque_Pa_per_Nm,
            props.rotating_section_modulus_m3, solution.method)


def section_for(geometry: ShaftGeometry, key=None) -> Section:
    """Section properties for ``geometry`` (see :func:`_section_for`); the properties of a section met
    before are remembered (the journals and shoulders of one shaft often share a diameter, and a
    keystroke re-checks the same bars). Section is frozen and nobody changes its ``methods``."""
    try:
        return _remembered_section(geometry, key)
    except TypeError:  # a key row that is not hashable: computed afresh
        return _section_for(geometry, key)


@functools.lru_cache(maxsize=1024)
def _remembered_section(geometry: ShaftGeometry, key) -> Section:
    return _section_for(geometry, key)


def _section_for(geometry: ShaftGeometry, key=None) -> Section:
    """Section properties for ``geometry``.

    ``key`` is the keyseat size row (an object with ``width_m`` and ``shaft_depth_m``) for a keyed
    round, found by the caller from the key tables when the geometry does not give one.
    Keyed rounds: stresses are NOMINAL on the full diameter, and the keyseat enters through Kt/Kts
    (Shigley 9th ed., Table 7-1 basis); area and mass deduct the keyseat (b x t1).
    """
    g = geometry
    methods: dict[str, str] = {}
    key_w = key_d = 0.0
    if needs_solver(g):
        area, polar, tau_t, z, how = solved_section(g)
        methods["section"] = f"numerical torsion solver ({how}); area and Z from the polygon"
        thickness = g.size_m if g.profile != "flat" else g.second_m
        size_d = g.size_m if g.profile in ("round", "tube", "hex") else 0.808 * math.sqrt(g.size_m * thickness)
    elif g.profile == "round":
        area, polar, tau_t, z = round_properties(g.size_m)
        methods["section"] = "exact, solid circle"
        size_d = g.size_m
    elif g.profile == "tube":
        area, polar, tau_t, z = tube_properties(g.size_m, g.second_m)
        methods["section"] = "exact, hollow circle"
        size_d = g.size_m
    elif g.profile in ("square", "flat"):
        thickness = g.size_m if g.profile == "square" else g.second_m
        area, polar, tau_t, z = rectangle_properties(g.size_m, thickness)
        methods["section"] = "exact series, rectangle (Timoshenko & Goodier sec. 109)"
        # Shigley 9th ed., Eq. 6-25: equivalent diameter of a rectangle, d_e = 0.808 sqrt(h b)
        size_d = 0.808 * math.sqrt(g.size_m * thickness)
    elif g.profile == "hex":
        area, polar, tau_t, z = hexagon_properties(g.size_m)
        methods["section"] = "regular hexagon: coefficients from our torsion solver (data/section_coefficients.csv)"
        size_d = g.size_m
    else:
        raise ValueError(f"unknown profile {g.profile!r}")
    if g.keyed and g.profile in ("round", "tube"):
        key_w = g.key_width_m or (key.width_m if key else 0.0)
        from workbench.core.keyseat_factors import stated_depth_m

        key_d = stated_depth_m(g.size_m, key_w, g.key_depth_m, key.shaft_depth_m if key else 0.0, g.key_standard)
        area -= key_w * key_d
        methods["keyseat"] = ("nominal stress on the full diameter, keyseat by Kt/Kts (Shigley 9th ed., Table 7-1); "
                              "twist on the plain round, as a keyseat runs only under the hub")
    return Section(
        geometry=g,
        area_m2=area,
        torsion_constant_m4=polar,
        shear_per_torque_Pa_per_Nm=tau_t,
        section_modulus_m3=z,
        size_factor_diameter_m=size_d,
        key_width_m=key_w,
        key_depth_m=key_d,
        methods=methods,
    )
