"""The shaft's side profile with its steps, and the bending-moment diagram, in terminal cells.

Drawn with block characters only (Rich text, no plotting library). Every shaft of a result is
drawn to the same length scale, one under the other, then the bending-moment diagram (|M| along
the shaft, eighth-blocks) and a torque line. Marks read without colour: the governing step is
underlined by a ``━`` run and named, a keyseat is a notch ``▄`` in the top edge, ``▲`` is a
bearing centre and ``↓`` the element's load line. Colour only adds to these marks.

:func:`draw_profiles` is a plain function of the result dict and the cell size (tested directly);
:class:`ShaftProfile` shows it at the size its screen gives it.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from typing import Any

from rich.text import Text
from textual.widgets import Static

from workbench.report import display
from workbench.report.steps import (KIND_LETTERS, governing_index, shaft_length_m, step_name,
                                    steps_of)

_ROLE = {"existing": "as found", "candidate": "candidate"}
_EIGHTHS = " ▁▂▃▄▅▆▇█"
GOVERNING_STYLE = "bold red"
SHAFT_STYLE = "bright_white"
KEY_STYLE = "yellow"


def _num(value: Any) -> float | None:
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        return None
    return float(value)


class _Scale:
    """Column <-> position along the shaft."""

    def __init__(self, length_m: float, width: int) -> None:
        self.length_m = length_m
        self.width = max(8, width)

    def x(self, column: int) -> float:
        """Position at the centre of a column [m]."""
        return (column + 0.5) * self.length_m / self.width

    def column(self, x_m: float) -> int:
        """The column holding position ``x_m``."""
        return min(self.width - 1, max(0, int(x_m / self.length_m * self.width)))


def _step_at(steps: Sequence[Mapping[str, Any]], x_m: float) -> int | None:
    """Index of the step drawn at ``x_m``: the narrowest step covering it, then the shortest
    (a hub seat or journal laid over the body it is turned from wins over the body)."""
    best, best_key = None, None
    for index, step in enumerate(steps):
        x0, x1, d = _num(step.get("x_start_m")), _num(step.get("x_end_m")), _num(step.get("diameter_m"))
        if x0 is None or x1 is None or d is None or x1 <= x0:
            continue
        key = (d, x1 - x0)
        if x0 <= x_m <= x1 and (best_key is None or key < best_key):
            best, best_key = index, key
    return best


def bearing_positions(result: Mapping[str, Any], shafts: Sequence[Mapping[str, Any]]) -> list[float]:
    """Bearing centres [m]: from the layout when given, else the centres of the journals."""
    layout = result.get("layout")
    if isinstance(layout, Mapping):
        for key in ("bearing_x_m",):
            value = layout.get(key)
            if isinstance(value, Sequence) and not isinstance(value, str):
                positions = [_num(v) for v in value]
                if positions and all(p is not None for p in positions):
                    return [p for p in positions if p is not None]
    for shaft in shafts:
        journals = [s for s in steps_of(shaft) if s.get("kind") == "journal"]
        if journals:
            return [0.5 * (float(s["x_start_m"]) + float(s["x_end_m"])) for s in journals]
    return []


def load_positions(result: Mapping[str, Any], shafts: Sequence[Mapping[str, Any]]) -> list[float]:
    """Load lines of the mounted elements [m]: from the layout (the driving element's ``load_x_m``,
    a driven element placed from its bearing), else the centres of the hub seats."""
    layout = result.get("layout")
    if isinstance(layout, Mapping):
        found = [float(v) for k, v in layout.items()
                 if k.endswith("_x_m") and k != "bearing_x_m" and _num(v) is not None]
        driven, bearings = layout.get("driven"), layout.get("bearing_x_m")
        if isinstance(driven, Mapping) and isinstance(bearings, Sequence) and len(bearings) == 2:
            distance = _num(driven.get("distance_m"))
            base = _num(bearings[0] if driven.get("position") == "between" else bearings[1])
            if distance is not None and base is not None:
                found.append(base + distance)  # between: from bearing 1; far-end: beyond bearing 2
        if found:
            return sorted(set(found))
    for shaft in shafts:
        seats = [s for s in steps_of(shaft) if s.get("kind") == "seat"]
        if seats:
            return [0.5 * (float(s["x_start_m"]) + float(s["x_end_m"])) for s in seats]
    return []


def _unit_levels(steps: Sequence[Mapping[str, Any]], d_max: float, units: int) -> dict[float, int]:
    """Half-cells of radius for each diameter: in proportion to the largest, except that two
    different diameters never draw alike (each smaller one at least a half-cell below the next
    larger), so a 40 mm journal on a 45 mm bar still shows its shoulder."""
    diameters = sorted({d for d in (_num(s.get("diameter_m")) for s in steps) if d}, reverse=True)
    out: dict[float, int] = {}
    previous = units + 1
    for d in diameters:
        level = max(1, min(round(d / d_max * units), previous - 1))
        out[d] = level
        previous = level
    return out


def _profile_rows(shaft: Mapping[str, Any], scale: _Scale, half: int, levels: dict[float, int],
                  bearings: list[float], system: str) -> list[Text]:
    steps = steps_of(shaft)
    governing = governing_index(shaft)
    index_at = [_step_at(steps, scale.x(c)) for c in range(scale.width)]
    units = []
    for index in index_at:
        d = _num(steps[index].get("diameter_m")) if index is not None else None
        units.append(levels.get(d, 0) if d else 0)
    keyed = []
    for c, index in enumerate(index_at):
        step = steps[index] if index is not None else {}
        inside = 0 < c < scale.width - 1 and index_at[c - 1] == index and index_at[c + 1] == index
        keyed.append(bool(step.get("keyed")) and inside)

    def style(c: int) -> str:
        if index_at[c] is not None and index_at[c] == governing:
            return GOVERNING_STYLE
        return SHAFT_STYLE

    rows = []
    for k in range(half, 0, -1):  # top half, outermost row first
        line = Text()
        for c in range(scale.width):
            u = units[c]
            char = "█" if u >= 2 * k else "▄" if u == 2 * k - 1 else " "
            top_row = u in (2 * k, 2 * k - 1)
            if keyed[c] and top_row:  # a shallow notch in the top edge
                char, cell_style = ("▆" if u == 2 * k else "▂"), KEY_STYLE
            else:
                cell_style = style(c)
            line.append(char, cell_style)
        rows.append(line)
    for k in range(1, half + 1):  # bottom half, mirrored
        line = Text()
        for c in range(scale.width):
            u = units[c]
            char = "█" if u >= 2 * k else "▀" if u == 2 * k - 1 else " "
            line.append(char, style(c))
        rows.append(line)

    # step letters with the bearings under them
    marks = [" "] * scale.width
    for x in bearings:
        marks[scale.column(x)] = "▲"
    for index, step in enumerate(steps):
        columns = [c for c, i in enumerate(index_at) if i == index]
        if not columns or step.get("kind") == "shoulder":
            continue
        middle = columns[len(columns) // 2]
        free = sorted((c for c in columns if marks[c] == " "), key=lambda c: abs(c - middle))
        if free:
            marks[free[0]] = KIND_LETTERS.get(str(step.get("kind")), "?")
    rows.append(Text("".join(marks), style="dim"))

    # the governing step, underlined (named in the shaft's title line)
    line = Text()
    if governing is not None:
        step = steps[governing]
        x0 = _num(step.get("x_start_m")) or 0.0
        x1 = _num(step.get("x_end_m")) or x0
        c0, c1 = sorted((scale.column(x0), scale.column(x1)))
        line.append(" " * c0)
        line.append("━" * (c1 - c0 + 1), GOVERNING_STYLE)
    rows.append(line)
    return rows


def _title(shaft: Mapping[str, Any], system: str, width: int) -> Text:
    """"as found: round 40mm keyed · governing ━ hub seat, keyed, 40 mm, fatigue 2.33"."""
    title = Text.assemble((f"{_ROLE.get(shaft.get('role'), 'shaft')}: ", "bold"), str(shaft.get("spec", "")))
    governing = governing_index(shaft)
    if governing is not None:
        step = steps_of(shaft)[governing]
        title.append(" · governing ", "dim")
        title.append("━ ", GOVERNING_STYLE)
        title.append(step_name(step, system), "bold")
        static = _num(step.get("static_safety_factor"))
        fatigue = _num(step.get("fatigue_safety_factor"))
        figures = [f"{w} {display.factor(v)}" for w, v in (("static", static), ("fatigue", fatigue)) if v is not None]
        if figures:
            title.append(f" ({', '.join(figures)})")
    title.truncate(width, overflow="ellipsis")
    return title


def _column_max(xs: list[float], values: list[float], scale: _Scale, column: int) -> float:
    """Largest |value| of a piecewise-linear curve over one column."""
    a = column * scale.length_m / scale.width
    b = (column + 1) * scale.length_m / scale.width
    best = 0.0
    for i in range(len(xs)):
        if a <= xs[i] <= b:
            best = max(best, abs(values[i]))
    for i in range(len(xs) - 1):
        x0, x1 = xs[i], xs[i + 1]
        if x1 <= x0:
            continue
        for x in (a, b, 0.5 * (a + b)):
            if x0 <= x <= x1:
                t = (x - x0) / (x1 - x0)
                best = max(best, abs(values[i] + t * (values[i + 1] - values[i])))
    return best


def _diagram_rows(diagram: Mapping[str, Any], scale: _Scale, rows: int, system: str) -> list[Text]:
    xs = [float(x) for x in diagram.get("x_m") or []]
    moments = [float(m) for m in diagram.get("moment_Nm") or []]
    torques = [float(t) for t in diagram.get("torque_Nm") or []]
    if len(xs) < 2 or len(moments) != len(xs):
        return [Text("no bending-moment diagram in this result", style="dim")]
    levels = [_column_max(xs, moments, scale, c) for c in range(scale.width)]
    peak = max(levels)
    peak_at = xs[max(range(len(xs)), key=lambda i: abs(moments[i]))]
    head = Text.assemble(("bending moment |M|", "bold"),
                         f" max {display.torque(peak, system)} at {display.length(peak_at, system)}")
    t_levels = [_column_max(xs, torques, scale, c) for c in range(scale.width)] if len(torques) == len(xs) else []
    t_peak = max(t_levels, default=0.0)
    if t_levels:
        head.append(" · ")
        head.append("═", "magenta")
        head.append(f" torque {display.torque(t_peak, system)}")
    head.truncate(scale.width, overflow="ellipsis")
    out = [head]
    eighths = [0 if peak <= 0 else round(level / peak * rows * 8) for level in levels]
    for r in range(rows, 0, -1):
        line = "".join(_EIGHTHS[max(0, min(8, e - 8 * (r - 1)))] for e in eighths)
        out.append(Text(line, style="cyan"))
    if t_levels:
        out.append(Text("".join("═" if t > 1e-9 * max(1.0, t_peak) else "─" for t in t_levels), style="magenta"))
    return out


def draw_profiles(result: Mapping[str, Any] | None, width: int, height: int,
                  system: str = "metric") -> Text:
    """Side profiles of every shaft in ``result`` and the bending-moment diagram, as one Text.

    ``width`` and ``height`` are the cells available; the profiles get 2 to 4 rows above and
    below the centre line and the diagram 2 to 8 rows, by the height.
    """
    if not result:
        return Text("No result yet: fill in the drive and a shaft on the sheet.", style="bold")
    shafts = [s for s in (result.get("shafts") or []) if isinstance(s, Mapping)]
    drawn = [s for s in shafts if steps_of(s)]
    if not drawn:
        return Text("This result has no steps to draw (it was made before the shaft was "
                    "checked step by step).", style="bold")
    length_m = shaft_length_m(drawn)
    if length_m <= 0:
        return Text("The steps have no length to draw.", style="bold")
    scale = _Scale(length_m, width)
    d_max = max(_num(s.get("diameter_m")) or 0.0 for shaft in drawn for s in steps_of(shaft))
    n = len(drawn)
    fixed = 4 + 3 * n  # load row, diagram title and torque line, legend; per shaft title, letters, ━
    half = max(2, min(4, (height - fixed - 3) // (2 * n)))
    diagram_rows = max(2, min(8, height - fixed - 2 * n * half))
    all_steps = [s for shaft in drawn for s in steps_of(shaft)]
    levels = _unit_levels(all_steps, d_max, 2 * half)  # one scale for every shaft drawn
    bearings = bearing_positions(result, drawn)
    loads = load_positions(result, drawn)

    lines: list[Text] = []
    arrow = [" "] * scale.width
    for x in loads:
        arrow[scale.column(x)] = "↓"
    lines.append(Text("".join(arrow), style="bold"))
    for shaft in drawn:
        lines.append(_title(shaft, system, scale.width))
        lines.extend(_profile_rows(shaft, scale, half, levels, bearings, system))
    diagram = result.get("moment_diagram")
    if isinstance(diagram, Mapping):
        lines.extend(_diagram_rows(diagram, scale, diagram_rows, system))
    legend = Text(f"0–{display.length(length_m, system)} · B body J journal S hub seat "
                  "▂ keyseat ▲ bearing ↓ load ━ governing", style="dim")
    legend.truncate(scale.width, overflow="ellipsis")
    lines.append(legend)
    return Text("\n").join(lines)


class ShaftProfile(Static):
    """Draws :func:`draw_profiles` for a result at the size its screen gives it (``redraw_at``)."""

    def __init__(self, result: Mapping[str, Any] | None, system: str = "metric", **kwargs) -> None:
        super().__init__("", **kwargs)
        self.result = result
        self.system = system
        self._cells = (78, 20)

    def redraw_at(self, width: int, height: int) -> None:
        """Draw to ``width`` x ``height`` cells."""
        self._cells = (max(20, width), max(12, height))
        self.update(draw_profiles(self.result, *self._cells, self.system))

    def set_system(self, system: str) -> None:
        """Redraw in "metric" or "inch"."""
        self.system = system
        self.redraw_at(*self._cells)
