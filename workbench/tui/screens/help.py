"""Help and cautions: the keys, what each check means with its source, and the safety cautions."""

from __future__ import annotations

from typing import Any

from rich.text import Text
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import VerticalScroll
from textual.screen import Screen
from textual.widgets import Static

from ..widgets.fitting_footer import FittingFooter

#: (heading, [(term, text)]) of the help: rendered as two columns, so that a long line wraps
#: under its own text, never back to the left edge
HELP_PARTS: tuple[tuple[str, tuple[tuple[str, str], ...]], ...] = (
    ("Keys", (
        ("Tab / Shift+Tab", "next / previous field (the order of the sheet)"),
        ("Enter", "next field; keys typed ahead land in the field they were meant for"),
        ("PgDn / PgUp", "jump to the next / previous part of the sheet"),
        ("← → or a letter", "pick in a list field (‹ round ›): r t s f h, k = keyed …"),
        ("→", "accept the greyed completion (materials)"),
        ("Ctrl+L", "material pick-list: search by key, name or designation (EN19, C45)"),
        ("F1", "this help"), ("F2", "section view"), ("F3", "substitution sizes"),
        ("F4", "stock finder"), ("F5", "metric / inch display (and the unit of a bare length)"),
        ("F6", "save to the job log"), ("F7", "open the job log"),
        ("F8", "page through the verdict panel (its end goes back to the top)"),
        ("F9", "shaft profile: the steps, bending-moment diagram, governing step marked"),
        ("F10 / F11", "turning sheet / fits calculator"),
        ("Ctrl+N", "new job (asks first if the job on the sheet is not saved)"),
        ("Ctrl+Z / Ctrl+Y", "undo / redo the last changes of the sheet"),
        ("Ctrl+P", "command palette"), ("Ctrl+Q", "quit (asks first if the job is not saved)"),
        ("Esc", "back from any view"),
    )),
    ("Typing", (
        ("units", "Any field takes metric or inch: 7.5 kW, 10 hp, 1460 rpm, 200 mm, 8 in, 1-1/4in."),
        ("bare numbers", "kW, rpm; lengths follow the display: mm in metric, inches after F5 (the "
                         "hint says which). Switching writes the unit into what is already typed."),
        ("whole specs", 'A size field also takes a whole spec: "tube 60mm/50mm", "flat 50mm x 20mm ground".'),
        ("round", "40 d-flat 2: one ground flat 2 mm deep · 40 double-d 2: two opposite flats"),
        ("square, flat", "40 radius 3: rounded corners · 40 chamfer 2: chamfered corners"),
        ("materials", "a key (1045-cd), a grade whose row is picked by the bar size (c45-qt), or a "
                      "designation (EN8, EN19, 42CrMo4): the panel says how it was read; a bare grade (1045, c45) "
                      "asks for its supply condition"),
        ("defaults", "a field showing 'default …' is empty: the default is used until you type"),
        ("results", "follow every keystroke; a field that cannot be read is marked where it is, and "
                    "the last good result stays, marked NOT CURRENT, until it is fixed"),
    )),
    ("What the panel shows", (
        ("max shear", "torsion alone at the design torque"),
        ("combined (vM)", "von Mises stress from the bending of the side load and torsion"),
        ("static SF", "yield against the peak (start) torque and bending"),
        ("fatigue SF", "the chosen fatigue rule for a rotating shaft"),
        ("margin", "smallest safety factor on a bar from 0 to 2 × required; ┃ = required"),
        ("verdict", "✓ PASS, ▲ MARGINAL or ✗ FAIL against the required safety factor"),
        ("ratios", "candidate ÷ as found: strength, stiffness, mass"),
    )),
)


def hanging(entries, term_width: int = 19):
    """A two-column grid: each text wraps under itself, never back under its term."""
    from rich.table import Table

    grid = Table.grid(padding=(0, 1))
    grid.add_column(width=term_width, no_wrap=True)
    grid.add_column(ratio=1)
    for term, text in entries:
        grid.add_row(Text(f"  {term}"), Text(text))
    return grid


def help_keys():
    """The keys, typing rules and panel legend of the help screen."""
    from rich.console import Group

    parts = []
    for heading, entries in HELP_PARTS:
        parts += [Text(heading, "bold"), hanging(entries), Text("")]
    return Group(*parts)


class HelpScreen(Screen):
    """Keys, method notes from the current result, and its safety cautions."""

    BINDINGS = [Binding("escape,f1", "app.pop_screen", "Back", id="help.back")]

    def __init__(self, evaluation: Any = None) -> None:
        super().__init__()
        self.evaluation = evaluation

    def compose(self) -> ComposeResult:
        yield Static("Help and cautions — Esc to go back", classes="view-title")
        with VerticalScroll(classes="view-body", id="help-body"):
            yield Static(help_keys(), id="help-keys")
            yield Static(self._result_text(), id="help-result")
        yield FittingFooter(compact=True)  # whole keys only at 80 columns

    def _result_text(self):
        from rich.console import Group

        result = getattr(self.evaluation, "result", None) if self.evaluation else None
        if not result:
            return Text("Methods and cautions appear here once the sheet has a result.", "italic")
        parts = [Text("Safety cautions", "bold"),
                 hanging([("⚠", str(c)) for c in result.get("cautions", [])], term_width=4)]
        for shaft in result.get("shafts", []):
            role = "as found" if shaft.get("role") == "existing" else "candidate"
            parts.append(Text(f"\nChecks for the {role} shaft ({shaft.get('spec', '')})", "bold"))
            entries = [("why", str(shaft.get("why", "—")))]
            entries += [(str(name), str(note)) for name, note in (shaft.get("methods") or {}).items()]
            parts.append(hanging(entries))
        return Group(*parts)
