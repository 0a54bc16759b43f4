"""A footer that shows only the keys that fit whole: no key cut in half at the right edge.

Textual's footer lays every shown key in one row and clips the row at the screen's edge, so at
80 columns the last entries end in stray characters (``^p palette`` became ``pal e tte P``).
This one keeps the keys in their order and leaves out, whole, those that would not fit (the
palette, quit and new-job keys first: they are standard and listed in F1 help); F1 lists every key.
"""

from __future__ import annotations

from textual.app import ComposeResult
from textual.widgets import Footer
from textual.widgets._footer import FooterKey


def key_width(key: FooterKey, compact: bool) -> int:
    """Columns one footer entry takes: key, a space, its description, and the gap after it."""
    text = len(key.key_display) + (1 + len(key.description) if key.description else 0)
    return text + (1 if compact else 2)


#: actions given up first when the keys do not all fit (each is in F1 help and the palette)
DROP_FIRST = ("command_palette", "app.command_palette", "quit", "app.quit", "app.new_job")


class FittingFooter(Footer):
    """:class:`Footer` that leaves out, whole, the entries that do not fit the screen's width:
    first those of :data:`DROP_FIRST`, then from the right."""

    def compose(self) -> ComposeResult:
        width = self.app.size.width
        widgets = list(super().compose())
        keys = [w for w in widgets if isinstance(w, FooterKey)]
        total = sum(key_width(k, self.compact) for k in keys) - (1 if self.compact and keys else 0)
        dropped: set[int] = set()
        order = sorted(range(len(keys)), key=lambda i: (
            DROP_FIRST.index(keys[i].action) if keys[i].action in DROP_FIRST else len(DROP_FIRST), -i))
        for index in order:
            if total <= width:
                break
            dropped.add(id(keys[index]))
            total -= key_width(keys[index], self.compact)
        for widget in widgets:
            if id(widget) not in dropped:
                yield widget
        self._composed_width = width

    def on_resize(self) -> None:
        if getattr(self, "_composed_width", None) != self.app.size.width:
            self.refresh(recompose=True)
