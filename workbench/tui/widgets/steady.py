"""Updates that repaint without a full relayout when nothing can change size.

A layout pass arranges every widget of the screen again (about 20 ms for the job sheet). Textual
asks for one whenever an Input's text changes (its virtual width follows the text) and whenever a
Static's content is replaced; on the job sheet neither usually changes any size: the inputs have a
fixed width and height, and the verdict panel's lines keep their count from one keystroke to the
next. These helpers ask for the pass only when a size can really change.
"""

from __future__ import annotations

from textual.content import Content
from textual.geometry import Size
from textual.widgets import Input, Static


class SteadyInput(Input):
    """An Input of fixed width and height: typing repaints it, it does not relayout the screen.

    Textual's Input sets its virtual size (the text's width, for its own horizontal scrolling) on
    every change, and that reactive asks for a screen layout. With a fixed size nothing else moves,
    so the virtual size is set quietly; with an auto width or height, Input's own behaviour stays.
    """

    def _watch_value(self, value: str) -> None:
        if not self.styles.auto_dimensions:
            self.set_reactive(Input.virtual_size, Size(self.content_width, 1))
            self.refresh()
        super()._watch_value(value)


def update_in_place(widget: Static, content) -> None:
    """``widget.update(content)``, with a layout pass only when the widget's size can change.

    The pass is skipped when the widget has a fixed height, or an auto height whose content still
    measures as many lines at the widget's present width as it fills now, and a width that does not
    follow its content. A hidden widget takes no room (showing it lays out anyway). Before the
    widget has a size, Textual's default (a pass) is kept.
    """
    if isinstance(content, str):  # shown as written: typed text is never read as markup
        content = Content(content)
    styles = widget.styles
    if widget.is_mounted and not widget.display:  # takes no room; showing it will lay out anyway
        widget.update(content, layout=False)
        return
    width_follows = styles.width is not None and styles.width.is_auto
    if not widget.is_mounted or not widget.size or width_follows:
        widget.update(content)
        return
    widget.update(content, layout=False)
    if styles.height is not None and styles.height.is_auto:
        region = widget.content_size
        needed = widget.get_content_height(widget.container_size, widget.app.size, region.width)
        if needed != region.height:
            widget.refresh(layout=True)
