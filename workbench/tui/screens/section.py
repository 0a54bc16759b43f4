"""Section view: the shaft as found and the candidate, shaded on one shear-stress scale.

Both drawings share one length scale (millimetres per character cell) and one stress scale (shear
at the design torque, MPa or kpsi), so the fitter compares them cell for cell. Under each drawing:
its peak shear and where it sits, and the method; for a keyed shaft the solver's peak beside the
handbook estimate (nominal × Kts, Shigley 9th ed., Table 7-1). The solve runs in a worker.
"""

from __future__ import annotations

from typing import Any

from rich.console import Group
from rich.text import Text
from textual import work
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, VerticalScroll
from textual.screen import Screen
from textual.widgets import LoadingIndicator, Static
from textual.worker import get_current_worker

from workbench.report import display
from .. import engine
from ..widgets.section_plot import PEAK_MARK, RAMP, legend, render_map
from ..widgets.fitting_footer import FittingFooter

_ROLE_TITLE = {"shaft": "as found", "candidate": "candidate"}

WHY_KEYSEAT_DIFFERS = (
    "why they differ: the solver models a long keyseat away from its run-out; the handbook "
    "factor also covers the end-milled run-out (the checks use the handbook)."
)


def stress_figure(stress_Pa: float, system: str) -> str:
    """A stress as a bare number in MPa (metric) or kpsi (inch)."""
    if system == "inch":
        return display.number(stress_Pa / display.PA_PER_PSI / 1000.0)
    return display.number(stress_Pa / 1e6)


def stress_unit(system: str) -> str:
    """The stress unit shown for ``system``."""
    return "kpsi" if system == "inch" else "MPa"


def scale_bounds(scale_Pa: float, system: str) -> list[str]:
    """The upper bound of each ramp band, the last one the common peak (``≤`` written)."""
    steps = len(RAMP)
    return [f"≤{stress_figure(scale_Pa * (i + 1) / steps, system)}" for i in range(steps)]


def section_text(section: dict[str, Any], scale_Pa: float | None, system: str) -> Group:
    """Title, drawing, peak and method (and the keyseat comparison) of one section."""
    role = _ROLE_TITLE.get(section.get("role", ""), section.get("role", ""))
    title = Text(f"{role}: {section.get('spec', '')}", "bold")
    if section.get("error"):
        return Group(title, Text(f"✗ {section['error']}", "bold"))
    parts: list[Any] = [title, render_map(section, scale_Pa=scale_Pa)]
    peak_Pa = section.get("peak_Pa")
    if peak_Pa is not None:
        parts.append(
            Text.assemble(
                (f"{PEAK_MARK} " if section.get("peak_cell") else "", "bold"),
                ("peak ", "bold"),
                (display.stress(peak_Pa, system), "bold"),
                f" {section.get('peak_place', '')}",
            )
        )
    keyseat = section.get("keyseat")
    if keyseat:
        unit = stress_unit(system)
        rows = Text()
        rows.append(f"{'keyseat':<9}{'solver':>9}{'handbook':>10}\n", "bold")
        rows.append(
            f"{'peak':<9}{stress_figure(keyseat['solver_peak_Pa'], system):>9}"
            f"{stress_figure(keyseat['handbook_peak_Pa'], system):>10} {unit}\n"
        )
        rows.append(
            f"{'Kts':<9}{display.factor(keyseat['Kts_solver']):>9}"
            f"{display.factor(keyseat['Kts_handbook']):>10}\n"
        )
        rows.append(
            f"handbook = nominal {display.stress(section.get('nominal_Pa'), system)} × Kts "
            "(Shigley 9th ed., Table 7-1)\n",
            "dim",
        )
        rows.append(WHY_KEYSEAT_DIFFERS, "italic")
        parts.append(rows)
    parts.append(Text(f"method: {section.get('method') or '—'}", "dim"))
    return Group(*parts)


class SectionScreen(Screen):
    """Both cross-sections side by side on one scale, computed in a worker."""

    BINDINGS = [Binding("escape,f2", "app.pop_screen", "Back", id="section.back")]

    def __init__(self, inputs: dict[str, str]) -> None:
        super().__init__()
        self.inputs = inputs
        self.view: dict[str, Any] | None = None
        self.maps: list[dict[str, Any]] = []
        self.system = "metric"

    def compose(self) -> ComposeResult:
        yield Static("Section view — shear stress from torsion, Esc to go back", classes="view-title")
        with VerticalScroll(classes="view-body"):
            yield Static("solving… (the first solve also loads the solver)", id="section-status")
            yield LoadingIndicator(id="section-loading")
            yield Static(legend(), id="section-legend")
            with Horizontal(id="section-row"):
                yield Static("", id="section-shaft", classes="section-cell")
                yield Static("", id="section-candidate", classes="section-cell")
        yield FittingFooter(compact=True)  # whole keys only at 80 columns

    def on_mount(self) -> None:
        self.system = getattr(self.app, "system", "metric")
        if not any(self.inputs.get(k) for k in ("shaft", "candidate")):
            self._done("No shaft on the sheet yet.")
            self.query_one("#section-legend", Static).display = False
            return
        rows = 11 if self.app.size.height < 30 else 17
        cell_cols = max(10, (self.app.size.width - 2) // 2 - 2)
        self._solve(dict(self.inputs), min(2 * rows, cell_cols), rows)

    @work(thread=True, exclusive=True, group="section")
    def _solve(self, inputs: dict[str, str], max_cols: int, max_rows: int) -> None:
        view = engine.section_view(inputs, max_cols, max_rows)
        if not get_current_worker().is_cancelled:
            self.app.call_from_thread(self._show, view)

    def _done(self, status: str) -> None:
        self.query_one("#section-loading", LoadingIndicator).display = False
        widget = self.query_one("#section-status", Static)
        widget.update(Text(status, "italic"))
        widget.display = bool(status)

    def _show(self, view: dict[str, Any]) -> None:
        self.view = view
        self.maps = view["sections"]
        self._done(view.get("message", ""))
        self.render_view()

    def set_system(self, system: str) -> None:
        """Redraw the figures in "metric" or "inch" (called by the units toggle)."""
        self.system = system
        if self.view is not None:
            self.render_view()

    def render_view(self) -> None:
        """Rebuild the legend and both cells from the held view."""
        view = self.view or {}
        scale_Pa = view.get("scale_Pa")
        legend_widget = self.query_one("#section-legend", Static)
        if scale_Pa:
            head = Text.assemble(
                ("shear at the design torque ", "bold"),
                (display.torque(view.get("design_torque_Nm"), self.system), "bold"),
                f", one scale for both, {stress_unit(self.system)}:\n",
            )
            legend_widget.update(Text.assemble(head, legend(scale_bounds(scale_Pa, self.system))))
        else:
            legend_widget.update(
                Text.assemble(legend(), "  (each section against its own peak)")
            )
        cells = {
            "shaft": self.query_one("#section-shaft", Static),
            "candidate": self.query_one("#section-candidate", Static),
        }
        for section in self.maps:
            cell = cells.get(section.get("role", ""))
            if cell is not None:
                cell.update(section_text(section, scale_Pa, self.system))
