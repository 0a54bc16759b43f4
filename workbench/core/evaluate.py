"""One whole job in the core: the drive's torques applied to each shaft (existing and candidate).

Pure SI floats in, plain dataclasses out; the string side (what was typed, JSON keys) is in
:mod:`workbench.job`.
"""

from __future__ import annotations

from dataclasses import dataclass

from workbench.core.checks import MaterialProps, Settings, ShaftCheck
from workbench.core.drive import DriveLoads
from workbench.core.geometry import ShaftGeometry
from workbench.core.layout import Layout, place
from workbench.core.loads import Mount
from workbench.core.step_checks import check_steps
from workbench.core.steps import JOURNAL_LENGTH_PER_D, StepPlan, build_steps
from workbench.core.sections import section_for
from workbench.core.tables import key_for_diameter


@dataclass(frozen=True)
class ShaftCase:
    """A shaft to check: its role ("existing" or "candidate"), geometry and material."""

    role: str
    geometry: ShaftGeometry
    material: MaterialProps
    plan: StepPlan | None = None  # how it is turned (None: as typed, uniform for a round)


@dataclass(frozen=True)
class Comparison:
    """Candidate / existing ratios [-].

    strength_ratio: lowest safety factor of the candidate / that of the existing shaft
                    (static and fatigue, all features and materials included)
    stiffness_ratio: torsional stiffness G J of the candidate / existing
    mass_ratio: mass per metre of the candidate / existing
    """

    strength_ratio: float
    stiffness_ratio: float
    mass_ratio: float


def default_layout(mount: Mount) -> Layout:
    """The layout when none is given: today's overhung element at ``mount.overhang_m``."""
    return Layout("overhung", mount.overhang_m)


def default_plan(geometry: ShaftGeometry) -> StepPlan:
    """The shaft as typed: uniform if round; its keyseat at the hub seat."""
    return StepPlan(geometry, keyed_seat=geometry.keyed)


def check_case(
    case: ShaftCase, loads: DriveLoads, mount: Mount, settings: Settings, layout: Layout | None = None,
    driven_load_N: float = 0.0, E_Pa: float = 207e9, hub_material: str | None = None,
) -> ShaftCheck:
    """Section properties (keyseat size from the key tables when needed) and every check of one
    shaft, step by step along the layout (raises LayoutError for a layout that cannot be made)."""
    g = case.geometry
    key = key_for_diameter(g.size_m, g.key_standard) if g.keyed and not g.key_width_m else None
    plan = case.plan or default_plan(g)
    layout = layout or default_layout(mount)
    journal_guess = plan.journal_m or plan.body.size_m
    placed = place(layout, JOURNAL_LENGTH_PER_D * journal_guess)
    steps, notes = build_steps(plan, placed)
    return check_steps(steps, placed, section_for(g, key), case.material, loads, mount, settings,
                       driven_load_N=driven_load_N, notes=tuple(notes), E_Pa=E_Pa, hub_material=hub_material)


def compare(existing: ShaftCheck, candidate: ShaftCheck) -> Comparison:
    """Candidate-to-existing ratios of strength, torsional stiffness and mass."""
    stiff_e = existing.material.G_Pa * existing.section.torsion_constant_m4
    stiff_c = candidate.material.G_Pa * candidate.section.torsion_constant_m4
    return Comparison(
        strength_ratio=candidate.min_safety_factor / existing.min_safety_factor,
        stiffness_ratio=stiff_c / stiff_e,
        mass_ratio=candidate.mass_kg_per_m / existing.mass_kg_per_m,
    )


def evaluate(
    loads: DriveLoads, mount: Mount, cases: list[ShaftCase], settings: Settings, layout: Layout | None = None,
    driven_load_N: float = 0.0, E_Pa=None, hub_material: str | None = None,
) -> tuple[list[ShaftCheck], Comparison | None]:
    """Check every shaft; compare candidate with existing when both are given.
    ``E_Pa``: Young's modulus of each case's material [Pa] (a list; None = 207 GPa steel)."""
    moduli = E_Pa or [207e9] * len(cases)
    checks = [check_case(case, loads, mount, settings, layout, driven_load_N, e, hub_material)
              for case, e in zip(cases, moduli)]
    roles = {case.role: check for case, check in zip(cases, checks)}
    comparison = None
    if "existing" in roles and "candidate" in roles:
        comparison = compare(roles["existing"], roles["candidate"])
    return checks, comparison
