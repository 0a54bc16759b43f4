"""Stress-concentration factors of the features at the checked section (keyseat, shoulders).

Loaded once from ``data/stress_raisers.csv`` (first-iteration estimates of Shigley's Mechanical
Engineering Design, 9th ed., Table 7-1), with the notch radius as a fraction of the diameter.
"""

from __future__ import annotations

import csv
from dataclasses import dataclass
from functools import cache

from workbench.core.tables import data_dir


@dataclass(frozen=True)
class StressRaiser:
    """Kt (bending), Kts (torsion) and notch radius / diameter of one feature, with its source."""

    feature: str
    Kt: float
    Kts: float
    notch_radius_per_d: float
    description: str
    source: str
    mark: str


@cache
def stress_raisers() -> dict[str, StressRaiser]:
    """All features by name: ``keyseat``, ``sharp-shoulder``, ``round-shoulder``."""
    with (data_dir() / "stress_raisers.csv").open(newline="", encoding="utf-8") as fh:
        return {
            row["feature"]: StressRaiser(
                feature=row["feature"],
                Kt=float(row["Kt"]),
                Kts=float(row["Kts"]),
                notch_radius_per_d=float(row["notch_radius_per_d"]),
                description=row["description"],
                source=row["source"],
                mark=row["mark"],
            )
            for row in csv.DictReader(fh)
        }
