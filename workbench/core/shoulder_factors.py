"""Stress-concentration factors of a shoulder fillet on a stepped round shaft: Kt (bending), Kts (torsion).

Both come from the published curve fits of Peterson's charts for a stepped bar of circular cross
section with a shoulder fillet (Pilkey & Pilkey, Peterson's Stress Concentration Factors, 3rd ed.,
2008: Chart 3.10 for bending, Chart 3.12 for torsion). With t = (D - d)/2 the shoulder height,

    K = C1 + C2 (2t/D) + C3 (2t/D)^2 + C4 (2t/D)^3,   Ci = a_i + b_i sqrt(t/r) + c_i (t/r)

the nominal stress taken on the smaller diameter d (sigma = 32 M / (pi d^3), tau = 16 T / (pi d^3)).
The bending fit holds for 0.1 <= t/r <= 20 (two sets of coefficients, split at t/r = 2), the
torsion fit for 0.25 <= t/r <= 4. Shigley's Mechanical Engineering Design, 9th ed., Figs. A-15-9
(bending) and A-15-8 (torsion) reproduce the same charts.

Outside the fits' range:
- a fillet large against the step (t/r below the range) is taken at the range's lower end, which
  reads higher than the true factor (the factor grows with t/r): conservative;
- a fillet too small for the range (t/r above it, e.g. a sharp corner) is taken at the
  SHARP-SHOULDER BOUND: the larger of the fit at its upper end and Shigley 9th ed. Table 7-1's
  sharp-shoulder estimate (Kt 2.7, Kts 2.2), with a note saying so.
A non-round larger part (a square, hex or flat body turned down to a round journal) is taken as the
round of its CIRCUMSCRIBED diameter, the conservative side (a higher D/d gives a higher factor);
:func:`shoulder_factors` records a note when the caller says the body is not round.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field

# (a, b, c) of C1..C4 for each range: Pilkey & Pilkey, Peterson's SCF 3rd ed., Chart 3.10 (bending).
_BENDING_LOW = ((0.947, 1.206, -0.131), (0.022, -3.405, 0.915), (0.869, 1.777, -0.555), (-0.810, 0.422, -0.260))
_BENDING_HIGH = ((1.232, 0.832, -0.008), (-3.813, 0.968, -0.260), (7.423, -4.868, 0.869), (-3.839, 3.070, -0.600))
# Pilkey & Pilkey, Peterson's SCF 3rd ed., Chart 3.12 (torsion), 0.25 <= t/r <= 4.0.
_TORSION = ((0.905, 0.783, -0.075), (-0.437, -1.969, 0.553), (1.557, 1.073, -0.578), (-1.061, 0.171, 0.086))

BENDING_RANGE = (0.1, 20.0)
TORSION_RANGE = (0.25, 4.0)
# Shigley 9th ed., Table 7-1: shoulder fillet, sharp (r/d = 0.02): Kt 2.7, Kts 2.2 (first-iteration estimates).
SHARP_KT = 2.7
SHARP_KTS = 2.2
SOURCE = ("Peterson's Stress Concentration Factors, 3rd ed. (Pilkey & Pilkey), curve fits of Charts 3.10 "
          "(bending) and 3.12 (torsion)")


@dataclass(frozen=True)
class ShoulderFactors:
    """Kt, Kts of one shoulder [-], the ratios they were taken at, and notes on any bound used."""

    Kt: float
    Kts: float
    D_over_d: float
    r_over_d: float
    notes: tuple[str, ...] = field(default=())

    @property
    def bounded(self) -> bool:
        """True when either factor was taken at the sharp-shoulder bound."""
        return any("sharp-shoulder bound" in note for note in self.notes)


def _fit(coefficients, t_over_r: float, two_t_over_D: float) -> float:
    root = math.sqrt(t_over_r)
    c = [a + b * root + k * t_over_r for a, b, k in coefficients]
    x = two_t_over_D
    return c[0] + c[1] * x + c[2] * x * x + c[3] * x * x * x


def bending_fit(D_m: float, d_m: float, r_m: float) -> float:
    """Kt in bending of a stepped round bar by Peterson's Chart 3.10 fit, INSIDE its range [-].

    D, d: larger and smaller diameters [m], r: fillet radius [m]; requires 0.1 <= t/r <= 20 with
    t = (D - d)/2. Source: Pilkey & Pilkey, Peterson's Stress Concentration Factors, 3rd ed., Chart 3.10.
    """
    t = (D_m - d_m) / 2.0
    t_over_r = t / r_m
    coefficients = _BENDING_LOW if t_over_r <= 2.0 else _BENDING_HIGH
    return _fit(coefficients, t_over_r, 2.0 * t / D_m)


def torsion_fit(D_m: float, d_m: float, r_m: float) -> float:
    """Kts in torsion of a stepped round bar by Peterson's Chart 3.12 fit, INSIDE its range [-].

    D, d: larger and smaller diameters [m], r: fillet radius [m]; requires 0.25 <= t/r <= 4.
    Source: Pilkey & Pilkey, Peterson's Stress Concentration Factors, 3rd ed., Chart 3.12.
    """
    t = (D_m - d_m) / 2.0
    return _fit(_TORSION, t / r_m, 2.0 * t / D_m)


def _bounded(fit, low: float, high: float, sharp: float, D_m: float, d_m: float, r_m: float, what: str):
    """The fit inside [low, high] of t/r; the lower end below it; the sharp-shoulder bound above it."""
    t = (D_m - d_m) / 2.0
    t_over_r = math.inf if r_m <= 0.0 else t / r_m
    if t_over_r < low:
        return max(1.0, fit(D_m, d_m, t / low)), None
    if t_over_r > high:
        edge = fit(D_m, d_m, t / high)
        return max(edge, sharp), (f"{what}: fillet r/d {r_m / d_m:.3f} is below the range of Peterson's fit "
                                  f"(t/r {t_over_r:.3g} > {high:g}); checked at the sharp-shoulder bound "
                                  f"{max(edge, sharp):.2f}")
    return max(1.0, fit(D_m, d_m, r_m)), None


def shoulder_factors(D_m: float, d_m: float, r_m: float, *, body_round: bool = True) -> ShoulderFactors:
    """Kt (bending) and Kts (torsion) of a shoulder from diameter D down to d with fillet radius r.

    D_m: the larger part's diameter [m] (for a non-round body its circumscribed diameter; pass
    ``body_round=False`` to have that noted); d_m: the smaller diameter [m], on which the nominal
    stresses are taken; r_m: fillet radius [m] (0 = sharp corner).
    No step (D <= d) gives 1.0, 1.0. Sources and the out-of-range rules: see the module docstring.
    """
    if d_m <= 0.0:
        raise ValueError("the smaller diameter must be positive")
    if D_m <= d_m * (1.0 + 1e-9):
        return ShoulderFactors(1.0, 1.0, D_m / d_m, r_m / d_m)
    notes = []
    kt, note_b = _bounded(bending_fit, *BENDING_RANGE, SHARP_KT, D_m, d_m, r_m, "bending")
    kts, note_t = _bounded(torsion_fit, *TORSION_RANGE, SHARP_KTS, D_m, d_m, r_m, "torsion")
    notes.extend(n for n in (note_b, note_t) if n)
    if not body_round:
        notes.append("non-round body: D taken as its circumscribed diameter (the conservative side)")
    return ShoulderFactors(kt, kts, D_m / d_m, r_m / d_m, tuple(notes))
