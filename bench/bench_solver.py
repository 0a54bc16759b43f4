"""Time the numerical torsion solver at its default resolution, profile by profile.

Prints, for each profile: the median time of a fresh solve (cache cleared: polygon, mesh,
assembly, sparse solve, peak search) with its range (min-max) over the repeats, as a ratio
against the 250 ms anchor (target per solve on a 2-core machine); the mesh size; the error
against the exact solution where one exists (Timoshenko & Goodier, Theory of Elasticity, 3rd ed.,
§§104-109); and the time of a cached repeat (a dictionary look-up). The one-off cost of importing
scipy is printed separately (not in the solve times).

    python bench/bench_solver.py [repeats]
"""

from __future__ import annotations

import math
import statistics
import sys
import time

ANCHOR_MS = 250.0


def _rectangle_series(long_m: float, short_m: float) -> tuple[float, float]:
    """(J, tau_max/T) of a rectangle by the series of T&G 3rd ed. §109."""
    b, c = long_m, short_m
    s_j = sum(math.tanh(n * math.pi * b / (2 * c)) / n**5 for n in range(1, 400, 2))
    s_t = sum(1 / (n * n * math.cosh(min(n * math.pi * b / (2 * c), 700))) for n in range(1, 400, 2))
    j = (1 - 192 / math.pi**5 * (c / b) * s_j) / 3 * b * c**3
    return j, c * (1 - 8 / math.pi**2 * s_t) / j


def main(repeats: int = 3) -> None:
    start = time.perf_counter()
    import scipy.sparse.linalg  # noqa: F401
    import scipy.spatial  # noqa: F401

    print(f"scipy import (once per process): {1e3 * (time.perf_counter() - start):.0f} ms")

    from workbench.core.geometry import ShaftGeometry as G
    from workbench.core.torsion_solver import DEFAULT_RESOLUTION, clear_cache, solve_torsion

    d = 0.035
    od, bore = 0.06, 0.045
    cases = [
        ("round 35", G("round", d), (math.pi * d**4 / 32, 16 / (math.pi * d**3))),
        ("tube 60/45", G("tube", od, bore),
         (math.pi * (od**4 - bore**4) / 32, 16 * od / (math.pi * (od**4 - bore**4)))),
        ("round 35 keyed (DIN 10x5, r0.7)",
         G("round", d, keyed=True, key_width_m=0.010, key_depth_m=0.005, key_radius_m=0.0007), None),
        ("round 35 D-flat 3", G("round", d, flats=1, flat_depth_m=0.003), None),
        ("round 35 double-D 3", G("round", d, flats=2, flat_depth_m=0.003), None),
        ("square 30", G("square", 0.03), _rectangle_series(0.03, 0.03)),
        ("square 30 r3", G("square", 0.03, corner_radius_m=0.003), None),
        ("square 30 chamfer 2", G("square", 0.03, chamfer_m=0.002), None),
        ("flat 50x20", G("flat", 0.05, 0.02), _rectangle_series(0.05, 0.02)),
        ("flat 100x10", G("flat", 0.10, 0.01), _rectangle_series(0.10, 0.01)),
        ("hex 27", G("hex", 0.027), None),
    ]
    print(f"default resolution {DEFAULT_RESOLUTION} cells across the short side; median [min-max] of {repeats}")
    print(f"{'profile':34s} {'solve ms':>20s} {'x anchor':>8s} {'elements':>9s} {'J err':>9s} {'tau err':>9s} "
          f"{'repeat us':>10s}")
    worst = 0.0
    for name, geometry, exact in cases:
        samples = []
        for _ in range(repeats):
            clear_cache()
            t0 = time.perf_counter()
            sol = solve_torsion(geometry)
            samples.append(time.perf_counter() - t0)
        median = statistics.median(samples)
        worst = max(worst, median)
        spread = f"{median * 1e3:.1f} [{min(samples) * 1e3:.1f}-{max(samples) * 1e3:.1f}]"
        t0 = time.perf_counter()
        for _ in range(1000):
            solve_torsion(geometry)
        repeat_us = (time.perf_counter() - t0) * 1e6 / 1000
        if exact:
            j_err = f"{100 * (sol.torsion_constant_m4 / exact[0] - 1):+.3f}%"
            t_err = f"{100 * (sol.shear_per_torque_Pa_per_Nm / exact[1] - 1):+.3f}%"
        else:
            j_err = t_err = "-"
        print(f"{name:34s} {spread:>20s} {median * 1e3 / ANCHOR_MS:8.2f} {sol.element_count:9d} {j_err:>9s} "
              f"{t_err:>9s} {repeat_us:10.1f}")
    print(f"slowest median solve: {worst * 1e3:.1f} ms = {worst * 1e3 / ANCHOR_MS:.2f}x the {ANCHOR_MS:.0f} ms anchor")


if __name__ == "__main__":
    main(int(sys.argv[1]) if len(sys.argv) > 1 else 5)
