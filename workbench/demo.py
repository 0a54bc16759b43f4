"""The demo job: an invented plant scenario used by ``--demo`` (no real plant or asset)."""

from __future__ import annotations

DEMO_META = {
    "asset": "CV-07 head drive",
    "location": "Brindlemoor Quarry, crusher line 2",
    "by": "demo fitter",
    "note": "Conveyor jackshaft worn at both bearing seats; square bar from the rack, to be turned to the old 40 mm "
            "journals and the keyed pulley seat.",
}

DEMO_INPUTS = {
    "power": "7.5 kW",
    "speed": "1460 rpm",
    "ratio": "3.2",
    "efficiency": "96%",
    "service_factor": "1.5",
    "peak_factor": "2.2",
    "mount": "vbelt",
    "pitch_diameter": "200 mm",
    "overhang": "60 mm",
    "shaft": "round 40mm keyed",
    "candidate": "square 45mm",
    "material": "1045-cd",
    "bearing_span": "450 mm",
    "bearing_type": "self-aligning-ball",
    "hub_length": "80 mm",
    "element_mass": "6 kg",
}


def demo_inputs() -> dict[str, str]:
    """A fresh copy of the demo job's inputs, as a person would have typed them."""
    return dict(DEMO_INPUTS)
