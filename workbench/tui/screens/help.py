"""Help and cautions: the keys, what each check means with its source, and the safety cautions."""

from __future__ import annotations

from typing import Any

from rich.text import Text
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import VerticalScroll
from textual.screen import Screen
from textual.widgets import Footer, Static

KEYS_TEXT = """\
Keys
  Tab / Shift+Tab   next / previous field (the order of the sheet)
  Enter             next field
  PgDn / PgUp       jump to the next / previous part of the sheet
  ← → or a letter   pick in a list field (‹ round ›): r t s f h, k = keyed …
  →                 accept the greyed completion (materials)
  F1 this help   F2 section view   F3 substitution sizes   F4 stock finder
  F5 metric / inch display   F6 save to the job log   F7 open the job log
  F9 shaft profile: the steps, bending-moment diagram, governing step marked
  Ctrl+P command palette   Ctrl+Q quit   Esc back from any view

Typing
  Any field takes metric or inch: 7.5 kW, 10 hp, 1460 rpm, 200 mm, 8 in, 1-1/4in.
  A bare number is kW, rpm or mm. A size field also takes a whole spec:
  "tube 60mm/50mm", "flat 50mm x 20mm ground".
  Shapes the solver works out, typed after the size (bare = mm):
    round          40 d-flat 2     one ground flat 2 mm deep
                   40 double-d 2   two opposite ground flats
    square, flat   40 radius 3     rounded corners, radius 3 mm
                   40 chamfer 2    chamfered corners, 2 mm
  F2 shows where the peak shear sits on each of them.
  Results follow every keystroke; a field that cannot be read is marked where it
  is, and the last good result stays on the right, dimmed, until it is fixed.

What the panel shows
  max shear      torsion alone at the design torque
  combined (vM)  von Mises stress from the bending of the side load and torsion
  static SF      yield against the peak (start) torque and bending
  fatigue SF     the chosen fatigue rule for a rotating shaft
  margin         smallest safety factor on a bar from 0 to 2 × required; ┃ = required
  verdict        ✓ PASS, ▲ MARGINAL or ✗ FAIL against the required safety factor
"""


class HelpScreen(Screen):
    """Keys, method notes from the current result, and its safety cautions."""

    BINDINGS = [Binding("escape,f1", "app.pop_screen", "Back", id="help.back")]

    def __init__(self, evaluation: Any = None) -> None:
        super().__init__()
        self.evaluation = evaluation

    def compose(self) -> ComposeResult:
        yield Static("Help and cautions — Esc to go back", classes="view-title")
        with VerticalScroll(classes="view-body", id="help-body"):
            yield Static(KEYS_TEXT, id="help-keys")
            yield Static(self._result_text(), id="help-result")
        yield Footer(compact=True)

    def _result_text(self) -> Text:
        result = getattr(self.evaluation, "result", None) if self.evaluation else None
        text = Text()
        if not result:
            text.append("Methods and cautions appear here once the sheet has a result.\n", "italic")
            return text
        text.append("Safety cautions\n", "bold")
        for caution in result.get("cautions", []):
            text.append(f"  ⚠ {caution}\n")
        for shaft in result.get("shafts", []):
            role = "as found" if shaft.get("role") == "existing" else "candidate"
            text.append(f"\nChecks for the {role} shaft ({shaft.get('spec', '')})\n", "bold")
            text.append(f"  why: {shaft.get('why', '—')}\n")
            methods = shaft.get("methods") or {}
            for name, note in methods.items():
                text.append(f"  {name}: ", "bold")
                text.append(f"{note}\n")
        return text
