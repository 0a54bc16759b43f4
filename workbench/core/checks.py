"""The checks of one shaft and its verdict: static yield, fatigue, twist, mass.

A rotating shaft with a steady torque and a side load fixed in space sees fully reversed bending
and steady torsion (Shigley's Mechanical Engineering Design, 9th ed., Sec. 7-4):
Ma = M, Mm = 0, Tm = T, Ta = 0. Fatigue is checked at the DESIGN torque (running x service
factor); static yield at the PEAK torque (running x start/peak factor), the side load scaling with
the torque it transmits. The section is checked at the bearing nearest the mounted element, where
the overhung moment is largest; keyseat and shoulder factors are applied there (conservative).
"""

from __future__ import annotations

import functools
import math
from dataclasses import dataclass, field

from workbench.core import fatigue
from workbench.core.drive import DriveLoads
from workbench.core.loads import Mount, overhung_moment_Nm, side_load_N
from workbench.core.records import built, built_from
from workbench.core.sections import Section
from workbench.core.stress_raisers import stress_raisers

DISTORTION_ENERGY_SHEAR = 0.577  # Ssy = 0.577 Sy (Shigley 9th ed., Eq. 5-21)
MARGINAL_BAND = 0.10  # within 10 % above the required factor reads "marginal" (our own rule, stated)
TWIST_DIAMETERS = 20.0  # 1 degree over 20 diameters (common practice)


@dataclass(frozen=True)
class Settings:
    """What a verdict is judged against.

    required_sf: required safety factor on static and fatigue checks [-]; default 1.5 (common
                 practice for shafts with well-known loads, cf. Shigley 9th ed., Ex. 7-2 design factor)
    criterion:   fatigue criterion key (see fatigue.CRITERIA)
    reliability: fatigue reliability for the Marin factor ke
    twist_limit_deg_per_m: allowed twist rate; None = 1 degree over 20 diameters (common practice)
    """

    required_sf: float = 1.5
    criterion: str = "goodman"
    reliability: float = 0.90
    twist_limit_deg_per_m: float | None = None


@dataclass(frozen=True)
class MaterialProps:
    """The strengths and constants a check needs [Pa, kg/m^3]."""

    key: str
    name: str
    tensile_Pa: float
    yield_Pa: float
    G_Pa: float
    density_kg_m3: float


@dataclass(frozen=True)
class ShaftCheck:
    """Everything computed for one shaft (SI)."""

    section: Section
    material: MaterialProps
    side_load_N: float
    bending_moment_Nm: float
    max_shear_stress_Pa: float
    bending_stress_Pa: float
    von_mises_stress_Pa: float
    tresca_stress_Pa: float
    twist_deg_per_m: float
    twist_limit_deg_per_m: float
    mass_kg_per_m: float
    marin: dict[str, float]
    endurance_limit_Pa: float
    Kt: float
    Kts: float
    Kf: float
    Kfs: float
    feature: str
    fatigue_criterion: str
    fatigue_alt_Pa: float
    fatigue_mean_Pa: float
    peak_von_mises_Pa: float
    static_safety_factor: float
    shear_yield_safety_factor: float
    fatigue_safety_factor: float
    verdict: str
    governing: str
    why: str
    methods: dict[str, str] = field(default_factory=dict)
    steps: tuple = ()  # StepCheck items (workbench.core.step_checks), the shaft checked step by step
    governing_step: int | None = None  # index into ``steps`` whose figures the shaft's are
    notes: tuple[str, ...] = ()  # facts of the step check of this shaft (bounds used, how it is turned)
    assumptions: tuple[str, ...] = ()  # layout defaults taken where the job gives less (job warnings)
    key: object = None  # KeyFigures of the hub-seat key (workbench.core.stiffness), when keyed
    stiffness: object = None  # StiffnessFigures (deflection, slopes, critical speed), when the span is known
    placed: object = None  # the layout placed along the shaft (workbench.core.layout.Placed)
    side_loads: tuple = ()  # (x_m, force_N) side loads at the design torque, for the moment diagram
    buckling_safety_factor: float = math.inf  # thin tube: torsional buckling stress / shear at static torque
    buckling_shear_Pa: float | None = None  # knocked-down buckling shear stress (workbench.core.buckling)

    @property
    def min_safety_factor(self) -> float:
        return min(self.static_safety_factor, self.fatigue_safety_factor, self.buckling_safety_factor)


def _feature_factors(section: Section, tensile_Pa: float) -> tuple[str, float, float, float, float]:
    """(feature, Kt, Kts, Kf, Kfs) at the checked section; the worst present feature governs each."""
    return _features_of(section.geometry, section.size_factor_diameter_m, tensile_Pa)


@functools.lru_cache(maxsize=512)  # pure in the (frozen) geometry, its size-factor diameter and the steel
def _features_of(g, d_m: float, tensile_Pa: float) -> tuple[str, float, float, float, float]:
    table = stress_raisers()
    present = []
    if g.keyed and g.profile in ("round", "tube"):
        from dataclasses import replace

        from workbench.core.keyseat_factors import keyseat_scale

        scale, _, _ = keyseat_scale(g)  # 1 for a standard seat in a solid round or a sound wall
        key = table["keyseat"]
        present.append(replace(key, Kt=key.Kt * scale, Kts=key.Kts * scale) if scale != 1.0 else key)
    if g.shoulder == "sharp":
        present.append(table["sharp-shoulder"])
    elif g.shoulder == "rounded":
        present.append(table["round-shoulder"])
    if not present:
        return "plain bar", 1.0, 1.0, 1.0, 1.0
    sqrt_a_b = fatigue.neuber_sqrt_a_bending(tensile_Pa)
    sqrt_a_t = fatigue.neuber_sqrt_a_torsion(tensile_Pa)
    rows = []
    for raiser in present:
        radius = raiser.notch_radius_per_d * d_m
        kf = fatigue.fatigue_notch_factor(raiser.Kt, radius, sqrt_a_b)
        kfs = fatigue.fatigue_notch_factor(raiser.Kts, radius, sqrt_a_t)
        rows.append((raiser.feature, raiser.Kt, raiser.Kts, kf, kfs))
    worst = max(rows, key=lambda row: max(row[3], row[4]))
    return (worst[0], *(max(row[i] for row in rows) for i in range(1, 5)))


def static_torque_Nm(loads: DriveLoads) -> float:
    """The torque the static (first-cycle yield) check is made at [N*m]: the larger of the peak
    and the design torque (a service factor above the start factor still loads the shaft)."""
    return loads.static_torque_Nm


@dataclass(frozen=True)
class SectionFigures:
    """Stresses [Pa] and safety factors [-] of one section under one moment and torque."""

    shear_Pa: float
    bending_Pa: float
    von_mises_Pa: float
    tresca_Pa: float
    marin: dict[str, float]
    endurance_Pa: float
    alt_Pa: float
    mean_Pa: float
    peak_von_mises_Pa: float
    static_sf: float
    shear_yield_sf: float
    fatigue_sf: float


def section_figures(
    section: Section, material: MaterialProps, kf: float, kfs: float, design_torque_Nm: float,
    static_torque_Nm_: float, moment_design_Nm: float, moment_static_Nm: float, settings: Settings,
) -> SectionFigures:
    """Stresses and safety factors of one section (the equations of :func:`check_shaft`).

    Nominal tau = T (tau/T), sigma = M / Z; fatigue with fully reversed bending and steady torsion at
    the design torque (Shigley 9th ed., Eqs. 7-5..7-14, Se by Eq. 6-18 with kb of this section);
    static first-cycle yield at the static torque and its moment (Eqs. 7-15/7-16); shear yield
    n = 0.577 Sy / (Kfs tau_static).
    """
    tau_per_t = section.shear_per_torque_Pa_per_Nm
    z = section.section_modulus_m3
    tensile = material.tensile_Pa
    tau = design_torque_Nm * tau_per_t
    sigma = moment_design_Nm / z
    ka, kb, ke, se = fatigue.marin_endurance(section.geometry.finish, tensile, section.size_factor_diameter_m,
                                             settings.reliability)
    marin = {"ka": ka, "kb": kb, "kc": 1.0, "kd": 1.0, "ke": ke}  # fatigue.marin_factors, a fresh dict
    # fatigue.von_mises_amplitudes(kf sigma, 0, 0, kfs tau): fully reversed bending, steady torsion
    alt = math.sqrt((kf * sigma) ** 2 + 3.0 * 0.0**2)
    mean = math.sqrt(0.0**2 + 3.0 * (kfs * tau) ** 2)
    n_fatigue = fatigue.fatigue_safety_factor(settings.criterion, alt, mean, se, tensile, material.yield_Pa)
    tau_peak = static_torque_Nm_ * tau_per_t
    sigma_peak = moment_static_Nm / z
    peak_vm = math.sqrt((kf * sigma_peak) ** 2 + 3.0 * (kfs * tau_peak) ** 2)  # fatigue.first_cycle_yield_stress_Pa
    n_static = material.yield_Pa / peak_vm if peak_vm > 0 else math.inf
    n_shear = DISTORTION_ENERGY_SHEAR * material.yield_Pa / (kfs * tau_peak) if tau_peak > 0 else math.inf
    return built(SectionFigures, tau, sigma, math.sqrt(sigma**2 + 3.0 * tau**2), math.sqrt(sigma**2 + 4.0 * tau**2),
                 marin, se, alt, mean, peak_vm, n_static, n_shear, n_fatigue)


def twist_limit_deg_per_m(section: Section, settings: Settings) -> float:
    """Allowed twist rate [deg/m]: the stated limit, or 1 degree over 20 diameters (common practice),
    using the diameter of the round of equal torsional stiffness."""
    if settings.twist_limit_deg_per_m:
        return settings.twist_limit_deg_per_m
    return 1.0 / (TWIST_DIAMETERS * section.stiffness_diameter_m)


def check_shaft(
    section: Section, material: MaterialProps, loads: DriveLoads, mount: Mount, settings: Settings
) -> ShaftCheck:
    """Run every check on one shaft and give its verdict.

    Stresses: tau = T (tau/T) of the section; sigma_b = M / Z (rotating, worst orientation).
    Combined nominal stresses at design torque: von Mises sqrt(s^2 + 3 t^2), Tresca sqrt(s^2 + 4 t^2)
    (Shigley 9th ed., Sec. 5-4/5-5). Fatigue: Shigley 9th ed., Eqs. 7-5..7-14 with Se of Eq. 6-18.
    Static: first-cycle yield at the static torque (larger of peak and design), n = Sy / sigma'_max (Eqs. 7-15, 7-16), and shear
    yield n = 0.577 Sy / (Kfs tau_peak). Twist rate theta' = T / (G J) [rad/m] at design torque.
    Verdict: fail if the lowest of the static and fatigue factors is below ``required_sf``;
    marginal if it is within 10 % above it, or the twist rate exceeds its limit; pass otherwise.
    """
    return built_from(ShaftCheck, shaft_check_fields(section, material, loads, mount, settings))


def shaft_check_fields(
    section: Section, material: MaterialProps, loads: DriveLoads, mount: Mount, settings: Settings
) -> dict:
    """The fields of :func:`check_shaft`'s ShaftCheck by name, in field order (a caller that
    replaces some of them builds the record once, with :func:`workbench.core.records.built_from`)."""
    g = section.geometry
    feature, kt, kts, kf, kfs = _feature_factors(section, material.tensile_Pa)

    force_design = side_load_N(loads.design_torque_Nm, mount.pitch_diameter_m, mount.load_factor)
    moment_design = overhung_moment_Nm(force_design, mount.overhang_m)
    force_peak = side_load_N(static_torque_Nm(loads), mount.pitch_diameter_m, mount.load_factor)
    moment_peak = overhung_moment_Nm(force_peak, mount.overhang_m)

    fig = section_figures(section, material, kf, kfs, loads.design_torque_Nm, static_torque_Nm(loads),
                          moment_design, moment_peak, settings)
    tau, sigma, von_mises, tresca = fig.shear_Pa, fig.bending_Pa, fig.von_mises_Pa, fig.tresca_Pa
    marin, se, alt, mean, peak_vm = fig.marin, fig.endurance_Pa, fig.alt_Pa, fig.mean_Pa, fig.peak_von_mises_Pa
    n_static, n_shear, n_fatigue = fig.static_sf, fig.shear_yield_sf, fig.fatigue_sf

    twist = math.degrees(loads.design_torque_Nm / (material.G_Pa * section.torsion_constant_m4))
    limit = twist_limit_deg_per_m(section, settings)

    buckle_Pa, n_buckling = tube_buckling(section, material, static_torque_Nm(loads))
    verdict, governing, why = _verdict(n_static, n_fatigue, twist, limit, feature, settings, n_buckling)
    methods = dict(section.methods)
    if buckle_Pa is not None:
        methods["buckling"] = ("thin tube, torsional buckling: long-tube elastic stress x 0.67 knock-down "
                               "(Timoshenko & Gere 2nd ed. Sec. 11.10; NASA SP-8007; from memory)")
    methods["fatigue"] = f"{fatigue.CRITERIA[settings.criterion]}, Shigley 9th ed. Eqs. 7-5..7-14; Se by Eq. 6-18"
    methods["static"] = "first-cycle yield at the larger of peak and design torque, Shigley 9th ed. Eqs. 7-15/7-16"
    methods["twist"] = "theta = T/(G J) at design torque; limit " + (
        "as given" if settings.twist_limit_deg_per_m else "1 deg over 20 diameters (common practice)"
    )
    return {  # every field of ShaftCheck, in its order
        "section": section,
        "material": material,
        "side_load_N": force_design,
        "bending_moment_Nm": moment_design,
        "max_shear_stress_Pa": tau,
        "bending_stress_Pa": sigma,
        "von_mises_stress_Pa": von_mises,
        "tresca_stress_Pa": tresca,
        "twist_deg_per_m": twist,
        "twist_limit_deg_per_m": limit,
        "mass_kg_per_m": section.area_m2 * material.density_kg_m3,
        "marin": marin,
        "endurance_limit_Pa": se,
        "Kt": kt,
        "Kts": kts,
        "Kf": kf,
        "Kfs": kfs,
        "feature": feature,
        "fatigue_criterion": fatigue.CRITERIA[settings.criterion],
        "fatigue_alt_Pa": alt,
        "fatigue_mean_Pa": mean,
        "peak_von_mises_Pa": peak_vm,
        "static_safety_factor": n_static,
        "shear_yield_safety_factor": n_shear,
        "fatigue_safety_factor": n_fatigue,
        "verdict": verdict,
        "governing": governing,
        "why": why,
        "methods": methods,
        "steps": (),
        "governing_step": None,
        "notes": (),
        "assumptions": (),
        "key": None,
        "stiffness": None,
        "placed": None,
        "side_loads": (),
        "buckling_safety_factor": n_buckling,
        "buckling_shear_Pa": buckle_Pa,
    }


def tube_buckling(section: Section, material: MaterialProps, torque_Nm: float) -> tuple[float | None, float]:
    """(knocked-down torsional buckling shear [Pa] or None, its safety factor [-]) of a thin tube at
    ``torque_Nm``, on the nominal shear of the plain tube (workbench.core.buckling)."""
    g = section.geometry
    if g.profile != "tube" or torque_Nm <= 0:
        return None, math.inf
    from workbench.core.buckling import buckling_shear_stress_Pa, elastic_modulus_Pa

    tau_cr = buckling_shear_stress_Pa(g.size_m, g.second_m, elastic_modulus_Pa(material.G_Pa))
    if tau_cr is None:
        return None, math.inf
    return tau_cr, tau_cr / (torque_Nm * section.shear_per_torque_Pa_per_Nm)


TWIST_FAIL_MULTIPLE = 2.0  # twist above 2 x its limit fails (our rule, stated); up to 2 x is marginal


def _verdict(
    n_static: float, n_fatigue: float, twist: float, limit: float, feature: str, settings: Settings,
    n_buckling: float = math.inf,
) -> tuple[str, str, str]:
    """(verdict, governing check, one-line why) from the safety factors and the twist rate.

    Twist over TWIST_FAIL_MULTIPLE (2) x its limit fails; over the limit up to that, marginal."""
    where = "in the plain bar" if feature == "plain bar" else f"at the {feature}"
    if n_fatigue <= n_static:
        governing, n, what = "fatigue", n_fatigue, f"fatigue {where}"
    else:
        governing, n, what = "static", n_static, f"yield at peak torque {where}"
    if n_buckling < n:
        governing, n, what = "buckling", n_buckling, "torsional buckling of the thin tube wall"
    required = settings.required_sf
    if n < required:
        return "fail", governing, f"{what}: n = {n:.2f} is below the required {required:g}"
    if twist > TWIST_FAIL_MULTIPLE * limit:
        return "fail", "twist", (f"twist {twist:.2f} deg/m is {twist / limit:.1f}x the {limit:.2f} deg/m limit "
                                 f"(over {TWIST_FAIL_MULTIPLE:g}x fails; strength n = {n:.2f})")
    if twist > limit:
        return "marginal", "twist", f"twist {twist:.2f} deg/m exceeds the {limit:.2f} deg/m limit (strength n = {n:.2f})"
    if n < required * (1.0 + MARGINAL_BAND):
        return "marginal", governing, f"{what}: n = {n:.2f} is within 10 % of the required {required:g}"
    return "pass", governing, f"{what} governs: n = {n:.2f} against the required {required:g}"
