"""Fatigue of a rotating shaft: endurance limit with Marin factors, notch sensitivity, criteria.

Stresses [Pa], strengths [Pa], diameters [m]. Source throughout: Shigley's Mechanical Engineering
Design (Budynas & Nisbett), 9th ed., Ch. 6-7; the notch-sensitivity (Neuber constant) fits are from
the 10th ed., Eqs. 6-35a/b.
"""

from __future__ import annotations

import functools
import math

MPA = 1.0e6

# Shigley 9th ed., Table 6-2: ka = a * Sut^b with Sut in MPa.
SURFACE_FACTORS = {
    "ground": (1.58, -0.085),
    "machined": (4.51, -0.265),
    "cold-drawn": (4.51, -0.265),
    "hot-rolled": (57.7, -0.718),
    "forged": (272.0, -0.995),
}

# Shigley 9th ed., Table 6-5: reliability factor ke.
RELIABILITY_FACTORS = {
    0.50: 1.000,
    0.90: 0.897,
    0.95: 0.868,
    0.99: 0.814,
    0.999: 0.753,
    0.9999: 0.702,
}

CRITERIA = {
    "goodman": "DE-Goodman",
    "gerber": "DE-Gerber",
    "asme-elliptic": "DE-ASME elliptic",
    "soderberg": "DE-Soderberg",
}


def endurance_limit_specimen_Pa(tensile_Pa: float) -> float:
    """Rotating-beam endurance limit Se' [Pa]: 0.5 Sut for Sut <= 1400 MPa, else 700 MPa.

    Source: Shigley 9th ed., Eq. 6-8.
    """
    return 0.5 * tensile_Pa if tensile_Pa <= 1400.0 * MPA else 700.0 * MPA


def surface_factor(finish: str, tensile_Pa: float) -> float:
    """Marin surface factor ka = a Sut^b (Sut in MPa) for ``finish``; Shigley 9th ed., Eq. 6-19, Table 6-2."""
    a, b = SURFACE_FACTORS[finish]
    return min(1.0, a * (tensile_Pa / MPA) ** b)


def size_factor(diameter_m: float) -> float:
    """Marin size factor kb for rotating bending or torsion; Shigley 9th ed., Eq. 6-20.

    kb = (d/7.62)^-0.107 = 1.24 d^-0.107 for 2.79 <= d <= 51 mm; 1.51 d^-0.157 for 51 < d <= 254 mm
    (d in mm); 1 below 2.79 mm; held at the 254 mm value above that (the fit's range ends there).
    """
    d_mm = diameter_m * 1000.0
    if d_mm < 2.79:
        return 1.0
    if d_mm <= 51.0:
        return (d_mm / 7.62) ** -0.107
    return 1.51 * min(d_mm, 254.0) ** -0.157  # (d/7.62)^-0.107 form is the exact one below 51 mm


def reliability_factor(reliability: float) -> float:
    """Marin reliability factor ke; Shigley 9th ed., Table 6-5 (ke = 1 - 0.08 z_a), linear between rows."""
    levels = sorted(RELIABILITY_FACTORS)
    if reliability <= levels[0]:
        return RELIABILITY_FACTORS[levels[0]]
    for low, high in zip(levels, levels[1:]):
        if reliability <= high:
            frac = (reliability - low) / (high - low)
            return RELIABILITY_FACTORS[low] + frac * (RELIABILITY_FACTORS[high] - RELIABILITY_FACTORS[low])
    return RELIABILITY_FACTORS[levels[-1]]


def marin_factors(finish: str, tensile_Pa: float, size_diameter_m: float, reliability: float) -> dict[str, float]:
    """The Marin factors {ka, kb, kc, kd, ke} of Shigley 9th ed., Eq. 6-18.

    kc = 1 because torsion and bending are combined by von Mises (Shigley 9th ed., Sec. 6-14);
    kd = 1 (room temperature).
    """
    ka, kb, ke, _se = _marin(finish, tensile_Pa, size_diameter_m, reliability)
    return {"ka": ka, "kb": kb, "kc": 1.0, "kd": 1.0, "ke": ke}  # a fresh dict: the caller may keep it


def marin_endurance(finish: str, tensile_Pa: float, size_diameter_m: float,
                    reliability: float) -> tuple[float, float, float, float]:
    """(ka, kb, ke, Se [Pa]): the Marin factors of :func:`marin_factors` (kc = kd = 1) and the
    endurance limit :func:`endurance_limit_Pa` gives with them (Shigley 9th ed., Eq. 6-18)."""
    return _marin(finish, tensile_Pa, size_diameter_m, reliability)


@functools.lru_cache(maxsize=1024)  # pure; the steps of one shaft repeat it
def _marin(finish: str, tensile_Pa: float, size_diameter_m: float,
           reliability: float) -> tuple[float, float, float, float]:
    ka, kb, ke = surface_factor(finish, tensile_Pa), size_factor(size_diameter_m), reliability_factor(reliability)
    return ka, kb, ke, endurance_limit_Pa(tensile_Pa, {"ka": ka, "kb": kb, "kc": 1.0, "kd": 1.0, "ke": ke})


def endurance_limit_Pa(tensile_Pa: float, factors: dict[str, float]) -> float:
    """Endurance limit at the critical location Se = ka kb kc kd ke Se' [Pa]; Shigley 9th ed., Eq. 6-18."""
    product = 1.0
    for value in factors.values():
        product *= value
    return product * endurance_limit_specimen_Pa(tensile_Pa)


def neuber_sqrt_a_bending(tensile_Pa: float) -> float:
    """Neuber constant sqrt(a) [sqrt(mm)] for bending/axial, steels; Shigley 10th ed., Eq. 6-35a (Sut in MPa)."""
    s = tensile_Pa / MPA
    return max(0.0, 1.24 - 2.25e-3 * s + 1.60e-6 * s * s - 4.11e-10 * s**3)


def neuber_sqrt_a_torsion(tensile_Pa: float) -> float:
    """Neuber constant sqrt(a) [sqrt(mm)] for torsion, steels; Shigley 10th ed., Eq. 6-35b (Sut in MPa)."""
    s = tensile_Pa / MPA
    return max(0.0, 0.958 - 1.83e-3 * s + 1.43e-6 * s * s - 4.11e-10 * s**3)


def fatigue_notch_factor(kt: float, notch_radius_m: float, sqrt_a_sqrt_mm: float) -> float:
    """Fatigue stress-concentration factor Kf = 1 + (Kt - 1) / (1 + sqrt(a)/sqrt(r)).

    Source: Shigley 9th ed., Eq. 6-33 (Neuber); r in mm inside. Kt = 1 gives Kf = 1.
    """
    if kt <= 1.0:
        return 1.0
    r_mm = notch_radius_m * 1000.0
    if r_mm <= 0.0:
        return kt
    q = 1.0 / (1.0 + sqrt_a_sqrt_mm / math.sqrt(r_mm))
    return 1.0 + q * (kt - 1.0)


def von_mises_amplitudes(
    bending_alt_Pa: float, bending_mean_Pa: float, shear_alt_Pa: float, shear_mean_Pa: float
) -> tuple[float, float]:
    """(sigma_a', sigma_m') = (sqrt(sa^2 + 3 ta^2), sqrt(sm^2 + 3 tm^2)); Shigley 9th ed., Eqs. 7-5, 7-6.

    The stresses passed in already carry their Kf / Kfs.
    """
    return (
        math.sqrt(bending_alt_Pa**2 + 3.0 * shear_alt_Pa**2),
        math.sqrt(bending_mean_Pa**2 + 3.0 * shear_mean_Pa**2),
    )


def fatigue_safety_factor(
    criterion: str, alt_Pa: float, mean_Pa: float, endurance_Pa: float, tensile_Pa: float, yield_Pa: float
) -> float:
    """Fatigue safety factor n from von Mises alternating/mean stresses [Pa].

    Shigley 9th ed., Eqs. 7-8 (DE-Goodman), 7-10 (DE-Gerber), 7-12 (DE-ASME elliptic),
    7-14 (DE-Soderberg), written in terms of sigma_a' and sigma_m' (Eqs. 7-5/7-6) so that they
    hold for any section:
      Goodman      1/n = sa/Se + sm/Sut
      Gerber       1/n = (sa / 2Se) [1 + sqrt(1 + (2 sm Se / (Sut sa))^2)]
      ASME-ell.    1/n = sqrt((sa/Se)^2 + (sm/Sy)^2)
      Soderberg    1/n = sa/Se + sm/Sy
    Returns inf when both stresses are zero.
    """
    sa, sm = alt_Pa, mean_Pa
    if sa <= 0.0 and sm <= 0.0:
        return math.inf
    if criterion == "goodman":
        inverse = sa / endurance_Pa + sm / tensile_Pa
    elif criterion == "soderberg":
        inverse = sa / endurance_Pa + sm / yield_Pa
    elif criterion == "asme-elliptic":
        inverse = math.hypot(sa / endurance_Pa, sm / yield_Pa)
    elif criterion == "gerber":
        if sa <= 0.0:
            inverse = (sm / tensile_Pa) ** 2  # on the Gerber parabola n^2 sm^2 / Sut^2 = 1 -> n = Sut/sm
            inverse = math.sqrt(inverse)
        else:
            inverse = sa / (2.0 * endurance_Pa) * (1.0 + math.sqrt(1.0 + (2.0 * sm * endurance_Pa / (tensile_Pa * sa)) ** 2))
    else:
        raise ValueError(f"unknown criterion {criterion!r}")
    return 1.0 / inverse


def first_cycle_yield_stress_Pa(bending_max_Pa: float, shear_max_Pa: float) -> float:
    """Von Mises maximum stress for the first-cycle yield check, sigma'_max = sqrt(s^2 + 3 t^2).

    Source: Shigley 9th ed., Eq. 7-15 (stresses carrying Kf / Kfs). Yield factor n_y = Sy / sigma'_max (Eq. 7-16).
    """
    return math.sqrt(bending_max_Pa**2 + 3.0 * shear_max_Pa**2)
