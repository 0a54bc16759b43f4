"""A footer that shows only the keys that fit whole: no key cut in half at the right edge.

Textual's footer lays every shown key in one row and clips the row at the screen's edge, so at
80 columns the last entries end in stray characters (``^p palette`` became ``pal e tte P``).
This one keeps the keys in their order and leaves out, whole, those that would not fit; F1 lists
every key.
"""

from __future__ import annotations

from textual.app import ComposeResult
from textual.widgets import Footer
from textual.widgets._footer import FooterKey


def key_width(key: FooterKey, compact: bool) -> int:
    """Columns one footer entry takes: key, a space, its description, and the gap after it."""
    text = len(key.key_display) + (1 + len(key.description) if key.description else 0)
    return text + (1 if compact else 2)


class FittingFooter(Footer):
    """:class:`Footer` that drops, whole, the entries beyond the screen's width."""

    def compose(self) -> ComposeResult:
        width = self.app.size.width
        used = 0
        for widget in super().compose():
            if isinstance(widget, FooterKey):
                needed = key_width(widget, self.compact)
                if used + needed - (1 if self.compact else 0) > width:
                    continue
                used += needed
            yield widget
        self._composed_width = width

    def on_resize(self) -> None:
        if getattr(self, "_composed_width", None) != self.app.size.width:
            self.refresh(recompose=True)
