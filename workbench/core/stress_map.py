"""Map of the torsional shear stress over a bar section, sampled on a character-cell grid.

The map is relative: tau_rel = |tau| / tau_max in 0..1, so it does not depend on the torque.
Which field is used:

- round and tube: the exact field of elementary torsion, |tau| = T r / J, so tau_rel = r / r_outer
  (Timoshenko & Goodier, Theory of Elasticity, 3rd ed., §104 and §115; any strength-of-materials text);
- square and flat with sharp corners: the Saint-Venant series for the rectangle
  (Timoshenko & Goodier, 3rd ed., §109, the stress function as a cosine series in the short
  direction, differentiated term by term);
- everything else (keyseat, flats, hexagon, rounded or chamfered corners): the finite-element
  solution of :mod:`workbench.core.torsion_solver`.

The grid covers the section's bounding box, row 0 at the top, column 0 at the left; the caller
chooses cols/rows to suit its cell aspect. numpy is imported inside the functions.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from functools import lru_cache

from workbench.core.geometry import ShaftGeometry

MAP_RESOLUTION = 16
"""Solver resolution for maps: finer than the solver's default so that the recovered field is
smooth cell to cell (mirror-image cells of a hexagon agree within 3 % of the peak, against 13 %
at resolution 12); J and the peak need no more than the default."""
_SERIES_TERMS = 400  # odd terms n = 1, 3, ... 799; the 1/n^2 tail is below 0.1 % of the peak


@dataclass(frozen=True)
class StressMap:
    """Relative shear stress on a rows x cols grid over the section's bounding box.

    inside:  bool array [rows, cols], True where the cell centre lies in the section
    tau_rel: float array [rows, cols], |tau| / tau_max in 0..1 inside, 0 outside  [-]
    method:  one line naming the field used
    """

    inside: object
    tau_rel: object
    method: str


def shear_stress_map(geometry: ShaftGeometry, cols: int, rows: int) -> StressMap:
    """Relative torsional shear stress of ``geometry`` sampled at the centres of a cols x rows grid.

    Cached per geometry and grid; the arrays returned are read-only.
    """
    if cols < 1 or rows < 1:
        raise ValueError("a stress map needs at least one column and one row")
    from workbench.core.torsion_solver import _geometry_key

    return _map_cached(_geometry_key(geometry), int(cols), int(rows))


def map_method(geometry: ShaftGeometry) -> str:
    """How the map of ``geometry`` is made: "exact" (plain round or tube), "series" (square or flat
    with sharp corners) or "solver" (everything else)."""
    g = geometry
    if g.profile in ("round", "tube") and not g.keyed and not g.flats:
        return "exact"
    if g.profile in ("square", "flat") and g.corner_radius_m <= 0 and g.chamfer_m <= 0:
        return "series"
    return "solver"


@lru_cache(maxsize=64)
def _map_cached(geometry: ShaftGeometry, cols: int, rows: int) -> StressMap:
    import numpy as np

    g = geometry
    how = map_method(g)
    if how == "exact":
        inner_m = g.second_m if g.profile == "tube" else 0.0
        inside, tau_rel = round_shear_map(g.size_m, inner_m, cols, rows)
        method = "exact: tau = T r / J"
    elif how == "series":
        height_m = g.size_m if g.profile == "square" else g.second_m
        if height_m <= 0:
            raise ValueError("a flat needs its thickness")
        inside, tau_rel = rectangle_shear_map(g.size_m, height_m, cols, rows)
        method = f"Saint-Venant series for the rectangle, {_SERIES_TERMS} terms"
    else:
        from workbench.core.torsion_solver import solve_torsion

        solution = solve_torsion(g, MAP_RESOLUTION)
        inside, tau = solution.shear_on_grid(cols, rows)
        tau_rel = np.where(inside, np.clip(np.nan_to_num(tau) / solution.shear_per_torque_Pa_per_Nm, 0.0, 1.0), 0.0)
        method = solution.method
    inside = np.ascontiguousarray(inside, dtype=bool)
    tau_rel = np.ascontiguousarray(tau_rel, dtype=float)
    inside.flags.writeable = False
    tau_rel.flags.writeable = False
    return StressMap(inside=inside, tau_rel=tau_rel, method=method)


def round_shear_map(outside_m: float, inside_m: float, cols: int, rows: int):
    """(inside mask, tau/tau_max) of a round (inside_m = 0) or tube: tau_rel = r / r_outer.

    Exact field of elementary torsion of a circular section, tau = T r / J (Timoshenko & Goodier,
    Theory of Elasticity, 3rd ed., §104; hollow section §115).
    """
    import numpy as np

    r_out = outside_m / 2.0
    r_in = inside_m / 2.0
    xs = -r_out + (np.arange(cols) + 0.5) * outside_m / cols
    ys = r_out - (np.arange(rows) + 0.5) * outside_m / rows
    r = np.hypot(xs[np.newaxis, :], ys[:, np.newaxis])
    inside = (r <= r_out) & (r >= r_in)
    return inside, np.where(inside, r / r_out, 0.0)


def rectangle_shear_components(width_m: float, height_m: float, x_m, y_m):
    """Shear stress per unit (G theta) in a width x height rectangle centred at the origin [m].

    Returns (tau_xz, tau_yz) / (G theta) [m] at points (x_m, y_m). Prandtl stress function of the
    rectangle as the cosine series in the short direction (Timoshenko & Goodier, Theory of
    Elasticity, 3rd ed., §109): with u across the short half-side a and v along the long half-side b,
        phi/(G theta) = a^2 - u^2 - (32 a^2/pi^3) sum_{n odd} (-1)^((n-1)/2) / n^3
                        * cosh(n pi v / 2a) / cosh(n pi b / 2a) * cos(n pi u / 2a),
    and tau_xz = d(phi)/dy, tau_yz = -d(phi)/dx. The peak, at the middle of the long sides, is
        2 a [1 - (8/pi^2) sum_{n odd} 1 / (n^2 cosh(n pi b / 2a))]  (G theta).
    """
    import numpy as np

    x = np.asarray(x_m, dtype=float)
    y = np.asarray(y_m, dtype=float)
    short_is_x = width_m <= height_m
    a = (width_m if short_is_x else height_m) / 2.0
    b = (height_m if short_is_x else width_m) / 2.0
    u, v = (x, y) if short_is_x else (y, x)
    n = 2.0 * np.arange(_SERIES_TERMS) + 1.0
    sign = np.where(np.arange(_SERIES_TERMS) % 2 == 0, 1.0, -1.0)
    k = n * math.pi / (2.0 * a)
    uu = u[..., np.newaxis]
    va = np.abs(v)[..., np.newaxis]
    damp = 1.0 + np.exp(-2.0 * k * b)
    cosh_ratio = (np.exp(k * (va - b)) + np.exp(-k * (va + b))) / damp
    sinh_ratio = (np.exp(k * (va - b)) - np.exp(-k * (va + b))) / damp
    coef = 16.0 * a / math.pi**2 * sign / n**2
    dphi_du = -2.0 * u + np.sum(coef * cosh_ratio * np.sin(k * uu), axis=-1)
    dphi_dv = -np.sign(v) * np.sum(coef * sinh_ratio * np.cos(k * uu), axis=-1)
    dphi_dx, dphi_dy = (dphi_du, dphi_dv) if short_is_x else (dphi_dv, dphi_du)
    return dphi_dy, -dphi_dx


def rectangle_peak_shear(width_m: float, height_m: float) -> float:
    """Peak |tau| / (G theta) of a rectangle [m], at the middle of the long sides (T&G 3rd ed. §109)."""
    a = min(width_m, height_m) / 2.0
    b = max(width_m, height_m) / 2.0
    total = 0.0
    for i in range(_SERIES_TERMS):
        n = 2 * i + 1
        arg = n * math.pi * b / (2.0 * a)
        if arg > 700:
            break
        total += 1.0 / (n * n * math.cosh(arg))
    return 2.0 * a * (1.0 - 8.0 / math.pi**2 * total)


def rectangle_shear_map(width_m: float, height_m: float, cols: int, rows: int):
    """(inside mask, tau/tau_max) of a sharp-cornered rectangle by the series field (T&G §109)."""
    import numpy as np

    xs = -width_m / 2 + (np.arange(cols) + 0.5) * width_m / cols
    ys = height_m / 2 - (np.arange(rows) + 0.5) * height_m / rows
    tx, ty = rectangle_shear_components(width_m, height_m, xs[np.newaxis, :], ys[:, np.newaxis])
    tau_rel = np.clip(np.hypot(tx, ty) / rectangle_peak_shear(width_m, height_m), 0.0, 1.0)
    return np.ones((rows, cols), dtype=bool), tau_rel
