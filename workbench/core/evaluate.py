"""One whole job in the core: the drive's torques applied to each shaft (existing and candidate).

Pure SI floats in, plain dataclasses out; the string side (what was typed, JSON keys) is in
:mod:`workbench.job`.
"""

from __future__ import annotations

from dataclasses import dataclass

from workbench.core.checks import MaterialProps, Settings, ShaftCheck, check_shaft
from workbench.core.drive import DriveLoads
from workbench.core.geometry import ShaftGeometry
from workbench.core.loads import Mount
from workbench.core.sections import section_for
from workbench.core.tables import key_for_diameter


@dataclass(frozen=True)
class ShaftCase:
    """A shaft to check: its role ("existing" or "candidate"), geometry and material."""

    role: str
    geometry: ShaftGeometry
    material: MaterialProps


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


def check_case(case: ShaftCase, loads: DriveLoads, mount: Mount, settings: Settings) -> ShaftCheck:
    """Section properties (keyseat size from the key tables when needed) and every check of one shaft."""
    g = case.geometry
    key = key_for_diameter(g.size_m, g.key_standard) if g.keyed and not g.key_width_m else None
    return check_shaft(section_for(g, key), case.material, loads, mount, settings)


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
    loads: DriveLoads, mount: Mount, cases: list[ShaftCase], settings: Settings
) -> tuple[list[ShaftCheck], Comparison | None]:
    """Check every shaft; compare candidate with existing when both are given."""
    checks = [check_case(case, loads, mount, settings) for case in cases]
    roles = {case.role: check for case, check in zip(cases, checks)}
    comparison = None
    if "existing" in roles and "candidate" in roles:
        comparison = compare(roles["existing"], roles["candidate"])
    return checks, comparison
