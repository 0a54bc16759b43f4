"""An invented asset history for the demo (no real plant): the demo conveyor's head drive,
four shafts over three years, the third a MARGINAL bar that failed early.

``shaftbench log seed-demo`` adds these jobs to the log (again adds nothing: each has a fixed uid).
"""

from __future__ import annotations

import uuid
from typing import Any

from workbench.demo import DEMO_META, demo_inputs

SEED_NAMESPACE = uuid.UUID("0d5e7a1c-3b2f-5e8d-a4c6-53424a4c4445")
_HISTORY = (
    # (saved, candidate, candidate material, fitted, fitted_on, outcome, outcome_date, note)
    ("2023-02-10T09:30:00Z", "round 40mm keyed", "1045-cd", "round 40mm keyed", "2023-02-11",
     "failed", "2024-03-15", "first replacement after the original shaft sheared at the keyseat"),
    ("2024-03-16T07:45:00Z", "round 42mm keyed", "1045-cd", "round 42mm keyed, journals turned to 40",
     "2024-03-16", "failed", "2025-03-01", "bearing seat fretted again"),
    ("2025-03-03T13:10:00Z", "square 45mm", "1018-cd", "square 45mm 1018 from the rack", "2025-03-03",
     "failed", "2025-06-20", "only bar on the rack that weekend; sheared at the pulley shoulder"),
    ("2025-06-22T10:00:00Z", "square 45mm", "1045-cd", "square 45mm 1045", "2025-06-23",
     "still-running", "2026-11-30", "checked at the autumn shutdown, running"),
)


def demo_history_rows() -> list[dict[str, Any]]:
    """The demo asset's jobs as import rows (computed now with today's program)."""
    from workbench.job import evaluate_inputs

    rows = []
    for n, (saved, candidate, material, fitted, fitted_on, outcome, outcome_date, note) in enumerate(_HISTORY):
        inputs = demo_inputs()
        inputs["candidate"] = candidate
        inputs["candidate_material"] = material
        rows.append({
            "uid": str(uuid.uuid5(SEED_NAMESPACE, f"demo history {n}")),
            "created_at": saved, "inputs": inputs, "result": evaluate_inputs(dict(inputs)),
            "asset": DEMO_META["asset"], "location": DEMO_META["location"], "by": "demo fitter",
            "note": note, "fitted": fitted, "fitted_on": fitted_on, "outcome": outcome,
            "outcome_date": outcome_date, "bench": "demo bench",
        })
    return rows
