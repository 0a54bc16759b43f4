"""The deflection-only walk of the beam gives the full solve's deflections to the bit (ours: the
same operations in the same order; tolerance none)."""

from __future__ import annotations

import random

from workbench.core.beam import _deflection, _forces_at_knots, _layout, _solve


def test_deflection_only_equals_the_full_solve_exactly():
    rng = random.Random(7)
    for _ in range(200):
        ends = sorted(rng.uniform(0.02, 1.0) for _ in range(rng.randint(1, 5)))
        x = 0.0
        segments = []
        for end in ends:
            if end - x > 1e-3:
                segments.append((x, end, rng.uniform(1e3, 1e6)))
                x = end
        length = segments[-1][1]
        supports = sorted(rng.uniform(0.0, length) for _ in range(2))
        if supports[1] - supports[0] < 1e-3:
            continue
        loads = [(rng.uniform(0.0, length), rng.uniform(-5e3, 5e3)) for _ in range(rng.randint(1, 20))]
        lay = _layout(segments, supports, [x for x, _ in loads])
        forces = _forces_at_knots(lay, loads)
        assert _deflection(lay, forces) == _solve(lay, forces)[4]
