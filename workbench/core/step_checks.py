"""Each step of a shaft checked at its own moment and torque; the shaft's figures are its governing step's.

Per step (Shigley's Mechanical Engineering Design, 9th ed., Ch. 6-7, as in :mod:`workbench.core.checks`):
nominal stresses on the step's own section; its own Kt/Kts:
- hub seat: the keyseat (data/stress_raisers.csv, Shigley 9th ed. Table 7-1, end-mill keyseat);
- shoulder: Peterson's stepped-shaft fits (:mod:`workbench.core.shoulder_factors`) from D/d and r/d;
  a shoulder at the end of a keyed seat takes, factor by factor, the LARGER of the keyseat's and the
  shoulder's Kt, Kts, Kf, Kfs (the keyseat may run out into the fillet); a stress raiser typed in the
  spec ("sharp-shoulder", "round-shoulder") is Table 7-1's and is taken at the hub seat's shoulder;
- journal and body: plain (a non-round body's own peak stress is in its section's tau/T);
its own Marin size factor (kb of the step's size); Kf, Kfs by Neuber (Shigley 9th ed. Eq. 6-33);
static (first-cycle yield) and fatigue safety factors. The governing step is the one with the
lowest of its static and fatigue factors (on a tie, the one with the larger Kf + Kfs, then the first).
No solver is called here: journals and seats are rounds (closed form), the body is the section the
bar already has.
"""

from __future__ import annotations

import functools
from dataclasses import dataclass, replace

from workbench.core import fatigue
from workbench.core.checks import (
    MARGINAL_BAND, MaterialProps, SectionFigures, Settings, ShaftCheck, _verdict, section_figures, shaft_check_fields,
    static_torque_Nm,
)
from workbench.core.drive import DriveLoads
from workbench.core.layout import GRAVITY_M_S2, MomentLine, Placed, SideLoads, point_loads, torque_fraction
from workbench.core.loads import Mount, side_load_N
from workbench.core.records import built, built_from
from workbench.core.sections import Section, section_for
from workbench.core.shoulder_factors import shoulder_factors
from workbench.core.steps import Step
from workbench.core.stiffness import key_figures, layout_verdict, stiffness_figures
from workbench.core.stress_raisers import stress_raisers
from workbench.core.tables import key_for_diameter

_WORDS = {"sharp": "sharp-shoulder", "rounded": "round-shoulder"}


@dataclass(frozen=True)
class StepCheck:
    """One step checked: its moments [N*m], torques [N*m], factors [-] and figures."""

    step: Step
    section: Section
    bending_moment_Nm: float  # at the design torque (with the elements' weights)
    static_moment_Nm: float  # at the static-check torque
    torque_Nm: float  # design torque carried by the step
    static_torque_Nm: float
    feature: str
    Kt: float
    Kts: float
    Kf: float
    Kfs: float
    figures: SectionFigures
    notes: tuple[str, ...] = ()

    @property
    def min_safety_factor(self) -> float:
        return min(self.figures.static_sf, self.figures.fatigue_sf)

    @property
    def where(self) -> str:
        """'hub seat, keyseat and shoulder, 35 mm' — the step, its raisers and its size."""
        d_m = self.step.diameter_m
        inch = self.step.geometry.key_standard == "ansi"  # an inch spec: say the size in inches
        size = f"{d_m / 0.0254:.4g} in" if inch else f"{d_m * 1000.0:.4g} mm"
        label = self.step.label
        if self.feature and self.feature != "plain bar" and self.feature not in label:
            label = f"{label}, {self.feature}"
        return f"{label}, {size}"


@functools.lru_cache(maxsize=256)  # pure in the (frozen) geometry
def _keyseat_scale(geometry) -> float:
    """The factor on the handbook keyseat Kt/Kts for this seat (1 for a standard seat in a solid
    round or a sound tube wall); a seat the ligament rule refuses was refused when the spec was read."""
    from dataclasses import replace

    from workbench.core.keyseat_factors import KeyseatRefused, keyseat_scale

    try:
        return keyseat_scale(replace(geometry, keyed=True))[0]
    except KeyseatRefused:
        return 1.0


@functools.lru_cache(maxsize=1024)  # pure in what it reads of the step; repeated steps and keystrokes find it
def _step_features(kind: str, keyed: bool, g, diameter_m: float, larger_m: float, fillet_m: float,
                   larger_round: bool, feature_word: str, d_m: float, tensile_Pa: float) -> tuple:
    table = stress_raisers()
    rows = []  # (name, Kt, Kts, notch radius)
    notes: list[str] = []
    if keyed and g.profile in ("round", "tube"):
        raiser = table["keyseat"]
        scale = _keyseat_scale(g)  # non-standard seat or thin tube wall (workbench.core.keyseat_factors)
        rows.append(("keyseat", raiser.Kt * scale, raiser.Kts * scale, raiser.notch_radius_per_d * d_m))
    if kind == "shoulder" and larger_m > diameter_m * (1.0 + 1e-9):
        factors = shoulder_factors(larger_m, diameter_m, fillet_m, body_round=larger_round)
        rows.append(("shoulder", factors.Kt, factors.Kts, fillet_m))
        notes.extend(f"shoulder {note}" if note.startswith(("bending", "torsion")) else note for note in factors.notes)
    if feature_word in _WORDS:
        raiser = table[_WORDS[feature_word]]
        rows.append((raiser.feature, raiser.Kt, raiser.Kts, raiser.notch_radius_per_d * d_m))
    if not rows:
        return "plain bar", 1.0, 1.0, 1.0, 1.0, tuple(notes)
    sqrt_a_b = fatigue.neuber_sqrt_a_bending(tensile_Pa)
    sqrt_a_t = fatigue.neuber_sqrt_a_torsion(tensile_Pa)
    out = []
    for name, kt, kts, radius in rows:
        out.append((name, kt, kts, fatigue.fatigue_notch_factor(kt, radius, sqrt_a_b),
                    fatigue.fatigue_notch_factor(kts, radius, sqrt_a_t)))
    names = [row[0] for row in out]
    words = names[0] if len(names) == 1 else ", ".join(names[:-1]) + " and " + names[-1]
    return (words, *(max(row[i] for row in out) for i in range(1, 5)), tuple(notes))


def _section(step: Step, body_section: Section) -> Section:
    if step.kind == "body":
        return body_section
    g = step.geometry
    key = key_for_diameter(g.size_m, g.key_standard) if g.keyed and not g.key_width_m else None
    return section_for(g, key)


def check_steps(
    steps: list[Step], placed: Placed, body_section: Section, material: MaterialProps, loads: DriveLoads,
    mount: Mount, settings: Settings, driven_load_N: float = 0.0, notes: tuple[str, ...] = (),
    E_Pa: float = 207e9, hub_material: str | None = None,
) -> ShaftCheck:
    """Every step checked; the ShaftCheck carries the governing step's figures and all the steps.

    Area, torsion constant, mass, twist and the pure-torsion peak shear stay those of the bar as typed
    (``body_section``); the stresses of the check (bending, von Mises, Tresca) and every factor are the
    governing step's; the
    static-check torque is :func:`workbench.core.checks.static_torque_Nm`. The side load of the
    driving element is 2 T K / D at each torque level; weights (m g) and the driven element's load
    are the same at both.
    """
    base = shaft_check_fields(body_section, material, loads, mount, settings)
    layout = placed.layout
    static_T = static_torque_Nm(loads)
    design_T = loads.design_torque_Nm
    weight = layout.element_mass_kg * GRAVITY_M_S2
    driven = driven_load_N + (layout.driven.mass_kg * GRAVITY_M_S2 if layout.driven else 0.0)
    pull_design = side_load_N(design_T, mount.pitch_diameter_m, mount.load_factor)
    pull_static = side_load_N(static_T, mount.pitch_diameter_m, mount.load_factor)
    forces_design = point_loads(placed, SideLoads(pull_design, weight, driven))
    forces_static = point_loads(placed, SideLoads(pull_static, weight, driven))
    line_design = MomentLine(placed, forces_design)
    line_static = MomentLine(placed, forces_static)
    checks: list[StepCheck] = []
    all_notes = list(notes)
    assumptions = list(placed.notes)
    sections: dict = {}  # journals, seats and shoulders of one size share one section
    tensile = material.tensile_Pa
    best = None  # (lowest factor, -(Kf + Kfs), index) of the governing step so far
    for index, step in enumerate(steps):
        if step.kind == "body":
            section = body_section
        else:
            section = sections.get(step.geometry)
            if section is None:
                section = sections[step.geometry] = _section(step, body_section)
        feature, kt, kts, kf, kfs, step_notes = _step_features(
            step.kind, step.keyed, step.geometry, step.diameter_m, step.larger_m, step.fillet_m, step.larger_round,
            step.feature_word, section.size_factor_diameter_m, tensile)
        if step_notes:
            all_notes.extend(n for n in step_notes if n not in all_notes)  # each fact once
        share = torque_fraction(placed, step.check_from_m, step.check_to_m)
        m_design = line_design.max_over(step.check_from_m, step.check_to_m)
        m_static = line_static.max_over(step.check_from_m, step.check_to_m)
        t_design, t_static = share * design_T, share * static_T
        figures = section_figures(section, material, kf, kfs, t_design, t_static, m_design, m_static, settings)
        checks.append(built(StepCheck, step, section, m_design, m_static, t_design, t_static, feature, kt, kts, kf,
                            kfs, figures, step_notes))
        rank = (min(figures.static_sf, figures.fatigue_sf), -kf - kfs, index)  # StepCheck.min_safety_factor
        if best is None or rank < best:
            best = rank
    index = best[2]  # the lowest factor; on a tie the larger Kf + Kfs, then the first
    gov = checks[index]
    fig = gov.figures
    verdict, governing, why = _verdict(fig.static_sf, fig.fatigue_sf, base["twist_deg_per_m"],
                                       base["twist_limit_deg_per_m"], gov.where, settings,
                                       base["buckling_safety_factor"])
    key = _key(checks, placed, material, static_T, hub_material, settings)
    masses = [(placed.load_x_m, layout.element_mass_kg)]
    if layout.driven is not None:
        masses.append((placed.driven_x_m, layout.driven.mass_kg))
    stiffness = stiffness_figures(steps, placed, forces_design, masses, E_Pa, material.density_kg_m3,
                                  layout.bearing_type)
    if stiffness is not None:
        assumptions.extend(n for n in stiffness.notes if n not in assumptions)
    if key is not None:
        # "no hub length" is already said by the layout's warning
        all_notes.extend(n for n in key.notes if not n.startswith("no hub length") and n not in all_notes)
        assumptions.extend(n for n in key.notes if n.startswith("hub too short") and n not in assumptions)
    verdict, governing, why = layout_verdict(verdict, governing, why, settings.required_sf, MARGINAL_BAND, key,
                                             stiffness, loads.shaft_speed_rpm)
    methods = base["methods"]  # a fresh dict of this check's own
    methods["steps"] = _STEPS_METHOD
    base.update(
        side_load_N=pull_design,
        bending_moment_Nm=gov.bending_moment_Nm,
        bending_stress_Pa=fig.bending_Pa,
        von_mises_stress_Pa=fig.von_mises_Pa,
        tresca_stress_Pa=fig.tresca_Pa,
        marin=fig.marin,
        endurance_limit_Pa=fig.endurance_Pa,
        Kt=gov.Kt, Kts=gov.Kts, Kf=gov.Kf, Kfs=gov.Kfs,
        feature=gov.feature,
        fatigue_alt_Pa=fig.alt_Pa,
        fatigue_mean_Pa=fig.mean_Pa,
        peak_von_mises_Pa=fig.peak_von_mises_Pa,
        static_safety_factor=fig.static_sf,
        shear_yield_safety_factor=fig.shear_yield_sf,
        fatigue_safety_factor=fig.fatigue_sf,
        verdict=verdict,
        governing=governing,
        why=why,
        methods=methods,
        steps=tuple(checks),
        governing_step=index,
        notes=tuple(all_notes),
        assumptions=tuple(assumptions),
        key=key,
        stiffness=stiffness,
        placed=placed,
        side_loads=tuple(forces_design),
    )
    return built_from(ShaftCheck, base)


_STEPS_METHOD = ("each step at its own moment and torque; shoulders by Peterson's SCF 3rd ed. Charts "
                 "3.10/3.12 fits; keyseat by Shigley 9th ed. Table 7-1; the weakest step governs")


def _key(checks: list[StepCheck], placed: Placed, material: MaterialProps, torque_Nm: float,
         hub_material: str | None, settings: Settings):
    """The key of the keyed hub seat at the static-check torque (the largest), or None if not keyed.
    The key is taken of the shaft's own steel (common practice when the key stock is not known)."""
    seat = next((c for c in checks if c.step.kind == "seat" and c.step.keyed), None)
    if seat is None:
        return None
    g = seat.step.geometry
    row = key_for_diameter(g.size_m, g.key_standard)
    return key_figures(torque_Nm, g, row, placed.layout.hub_length_m, material.yield_Pa, material.yield_Pa,
                       hub_material, settings.required_sf)
