"""Command-palette entries for the workbench's main actions (only those that make sense now).

These are the palette's only entries: the toolkit's own generic commands (screenshot, maximize,
keys, themes by name) are not what a fitter needs and are left out (see ``ShaftbenchApp.COMMANDS``).
"""

from __future__ import annotations

from functools import partial

from textual.command import DiscoveryHit, Hit, Hits, Provider

# (title, action, help, needs a current result)
ACTIONS: tuple[tuple[str, str, str, bool], ...] = (
    ("Help and cautions", "help", "Keys, what each check means, safety cautions (F1)", False),
    ("Section view", "section", "Both cross-sections with shear stress shaded (F2)", False),
    ("Substitution sizes", "substitute", "Equal-strength / equal-stiffness sizes (F3)", False),
    ("Stock finder", "stock", "Standard sizes that pass; take one as candidate (F4)", False),
    ("Toggle metric / inch", "units", "Display units (inputs accept either) (F5)", False),
    ("Save job to log", "save", "Asset, location, by, note (F6)", True),
    ("Open job log", "review", "Reopen or duplicate a saved job (F7)", False),
    ("Turning sheet", "turning", "Sizes and limits to turn, keyseat to cut (F10)", True),
    ("Fits calculator", "fits", "ISO 286 limits of a class or fit, measured sizes (F11)", False),
    ("New job (clear the sheet)", "new_job", "An empty sheet; asks first if the job is not saved (Ctrl+N)",
     False),
    ("Undo the last change", "screen.undo", "Put back the sheet before the last change (Ctrl+Z)", False),
    ("Load demo job", "load_demo", "Put the demo job on the sheet", False),
    ("Light or dark screen", "toggle_light", "Switch the colour theme", False),
    ("Quit", "quit", "Leave the workbench; asks first if the job is not saved (Ctrl+Q)", False),
)


class WorkbenchCommands(Provider):
    """The workbench's actions, filtered to the current state of the job."""

    def _available(self):
        app = self.app
        has_result = getattr(getattr(app, "job_screen", None), "result", None) is not None
        for title, action, help_text, needs_result in ACTIONS:
            if needs_result and not has_result:
                continue
            yield title, action, help_text

    async def discover(self) -> Hits:
        for title, action, help_text in self._available():
            yield DiscoveryHit(title, partial(self.app.run_action, action), help=help_text)

    async def search(self, query: str) -> Hits:
        matcher = self.matcher(query)
        for title, action, help_text in self._available():
            score = matcher.match(title)
            if score > 0:
                yield Hit(score, matcher.highlight(title), partial(self.app.run_action, action), help=help_text)
