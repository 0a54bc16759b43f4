"""Messages the workbench's widgets and screens post to each other (small dataclasses)."""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

from textual.message import Message


@dataclass
class SheetChanged(Message):
    """The job sheet settled after an edit; ``inputs`` is the contract dict as typed."""

    inputs: dict[str, str]


@dataclass
class EvaluationReady(Message):
    """A worker finished evaluating the sheet; ``evaluation`` is an ``engine.Evaluation``."""

    evaluation: Any
    generation: int


@dataclass
class CandidateTaken(Message):
    """The fitter took a stock size: set it as the candidate (``spec``, ``material``)."""

    spec: str
    material: str


@dataclass
class UnitsToggled(Message):
    """The display system changed to ``system`` ("metric" or "inch")."""

    system: str
