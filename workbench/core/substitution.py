"""Substitution: which square, flat, hex or tube stands in for the shaft as found.

Equal strength = the same peak torsional shear per unit torque (plain sections, same material);
equal stiffness = the same torsion constant J. Both scale exactly with size for a fixed shape
(tau/T ~ 1/s^3, J ~ s^4), so each size follows in closed form from the unit-size section.
Features such as keyseats and shoulders are not part of the equivalence: the full check judges them.
The figures hold for the BODY step only (the bar's own section, away from the journals and seat):
where the bar is turned to the existing journals and keyed seat it is no stronger there than the
shaft as found, and each shoulder adds a stress raiser (workbench.core.steps, step_checks).
"""

from __future__ import annotations

from dataclasses import dataclass

from workbench.core.geometry import ShaftGeometry
from workbench.core.sections import Section, section_for

HOLDS_FOR = "body"  # the step the equivalent-size figures hold for
FLAT_ASPECT = 2.0  # width / thickness of the flat bar offered (common stock proportion)
TUBE_BORE_RATIO = 0.75  # inside / outside diameter of the tube offered


@dataclass(frozen=True)
class Equivalent:
    """One equivalent bar: its geometry, the basis ("strength" or "stiffness"), and its ratios to
    the existing plain section (strength = inverse ratio of tau/T, stiffness of J, mass of area)."""

    basis: str
    geometry: ShaftGeometry
    strength_ratio: float
    stiffness_ratio: float
    mass_ratio: float


def _unit_geometry(profile: str) -> ShaftGeometry:
    """The profile at a main size of 1 m with its fixed proportions."""
    if profile == "flat":
        return ShaftGeometry("flat", 1.0, 1.0 / FLAT_ASPECT)
    if profile == "tube":
        return ShaftGeometry("tube", 1.0, TUBE_BORE_RATIO)
    return ShaftGeometry(profile, 1.0)


def _scaled(geometry: ShaftGeometry, scale: float) -> ShaftGeometry:
    return ShaftGeometry(geometry.profile, geometry.size_m * scale, geometry.second_m * scale)


def _plain(geometry: ShaftGeometry) -> ShaftGeometry:
    return ShaftGeometry(geometry.profile, geometry.size_m, geometry.second_m)


def equivalents(existing: ShaftGeometry, profiles=("square", "flat", "hex", "tube", "round")) -> list[Equivalent]:
    """Equal-strength and equal-stiffness sizes of each profile for the plain existing section.

    tau/T scales as 1/s^3 and J as s^4 for similar sections (dimensional analysis of Saint-Venant
    torsion; Timoshenko & Goodier, Theory of Elasticity, 3rd ed., Sec. 104), so
    s_strength = (tau/T at s = 1 / tau/T of the existing)^(1/3) and
    s_stiffness = (J of the existing / J at s = 1)^(1/4).
    """
    ref = section_for(_plain(existing))
    out = []
    for profile in profiles:
        unit = _unit_geometry(profile)
        unit_section = section_for(unit)
        s_strength = (unit_section.shear_per_torque_Pa_per_Nm / ref.shear_per_torque_Pa_per_Nm) ** (1.0 / 3.0)
        s_stiffness = (ref.torsion_constant_m4 / unit_section.torsion_constant_m4) ** 0.25
        for basis, scale in (("strength", s_strength), ("stiffness", s_stiffness)):
            geometry = _scaled(unit, scale)
            out.append(_equivalent(basis, geometry, ref))
    return out


def _equivalent(basis: str, geometry: ShaftGeometry, ref: Section) -> Equivalent:
    section = section_for(geometry)
    return Equivalent(
        basis=basis,
        geometry=geometry,
        strength_ratio=ref.shear_per_torque_Pa_per_Nm / section.shear_per_torque_Pa_per_Nm,
        stiffness_ratio=section.torsion_constant_m4 / ref.torsion_constant_m4,
        mass_ratio=section.area_m2 / ref.area_m2,
    )


def largest_journal_m(geometry: ShaftGeometry) -> float:
    """Largest round journal [m] the bar gives, by the same turning rule the check uses
    (:func:`workbench.core.steps.largest_turnable_journal_m`: inscribed size >= journal upper
    limit + clean-up allowance, common practice). A round or tube runs at its own diameter (a
    uniform shaft, nothing to turn); a square (side), hex (across flats) or flat (thickness) is
    turned, so it gives less than its inscribed size.
    """
    from workbench.core.steps import largest_turnable_journal_m

    if geometry.profile in ("round", "tube") and not geometry.flats:
        return geometry.size_m
    return largest_turnable_journal_m(geometry)


def fit_facts(existing: ShaftGeometry, candidate: ShaftGeometry | None = None) -> list[str]:
    """Plain-language fit facts for a fitter replacing ``existing`` (with ``candidate`` if given)."""
    from workbench.core.steps import JOURNAL_UPPER_DEVIATION_M, clean_up_allowance_m

    d_mm = existing.size_m * 1000.0
    need_mm = (existing.size_m + JOURNAL_UPPER_DEVIATION_M + clean_up_allowance_m(existing.size_m)) * 1000.0
    facts = [
        "Equivalent sizes hold for the body (the bar's own section) only: turned to the existing journals "
        "and keyed seat, a bar is no stronger there than the shaft as found, and each shoulder adds a stress "
        "raiser. The check (shaftbench check --candidate ...) checks every step.",
        "A square, hex or flat bar turned to a round journal at the bearing seats is only as strong "
        "and stiff there as that journal: check the journal as a round shaft of its own diameter.",
        "The largest journal a bar can give is its inscribed circle (the side of a square, the size "
        "across flats of a hex, the thickness of a flat) less the journal's upper limit and a clean-up "
        "allowance of max(1 mm, 2 % of the journal).",
        f"To give journals of the existing {d_mm:g} mm, a square needs a side of at least {need_mm:.4g} mm "
        f"and a hex at least {need_mm:.4g} mm across flats.",
        "Square-bore hubs and square-bore bearings take a square bar as it is, with no journal to turn "
        "and no keyseat.",
        "A keyseat in a round shaft raises the local stress (Kts about 3 in torsion for an end-mill "
        "keyseat); a bar that drives a square bore needs none.",
    ]
    if candidate is not None and candidate.profile in ("square", "hex", "flat"):
        journal = largest_journal_m(candidate) * 1000.0
        facts.append(
            f"The candidate {candidate.profile} gives journals up to {journal:.4g} mm"
            + (" — smaller than the existing shaft's diameter." if journal < d_mm - 1e-9 else ".")
        )
    return facts
