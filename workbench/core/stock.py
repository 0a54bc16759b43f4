"""Stock finder: check every standard bar size of a profile and find the smallest that passes.

Each bar is checked as it will be turned (workbench.core.steps): it passes only if every step
passes; a bar that cannot be turned to the journals or seat asked for gets a row with no check and
the reason (``StockRow.refused``), never a pass.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Callable

from workbench.core.checks import MaterialProps, Settings, ShaftCheck
from workbench.core.drive import DriveLoads
from workbench.core.evaluate import ShaftCase, check_case
from workbench.core.geometry import ShaftGeometry
from workbench.core.layout import LayoutError
from workbench.core.loads import Mount
from workbench.core.tables import StockSize, stock_sizes


@dataclass(frozen=True)
class StockRow:
    """One stock size in one material, checked as the candidate."""

    stock: StockSize
    geometry: ShaftGeometry
    material: MaterialProps
    check: ShaftCheck | None
    refused: str = ""  # why the bar cannot be turned to the layout asked for (check is None then)


def stock_geometry(stock: StockSize, keyed: bool = False, finish: str = "machined") -> ShaftGeometry:
    """The bar of a stock row as a shaft geometry; with ``keyed`` its hub seat carries a keyseat
    (in the bar itself for a round or tube, in the turned seat for a square, hex or flat)."""
    key_standard = "ansi" if stock.system == "inch" else "iso"
    return ShaftGeometry(
        profile=stock.profile,
        size_m=stock.size_m,
        second_m=stock.second_m,
        keyed=keyed,
        key_standard=key_standard,
        finish=finish,
    )


def check_stock(
    profile: str,
    system: str,
    materials: list[Callable[[float], MaterialProps | None]],
    loads: DriveLoads,
    mount: Mount,
    settings: Settings,
    *,
    keyed: bool = False,
    finish: str = "machined",
    plan_for: Callable | None = None,
    layout=None,
    driven_load_N: float = 0.0,
    E_Pa: float = 207e9,
    hub_material: str | None = None,
) -> list[StockRow]:
    """Every stock size of ``profile`` in ``system`` checked in each material, smallest first.

    ``materials`` are functions of the bar size [m] (a grade's strength depends on its ruling section);
    one that returns None has no strength for that size, which is then skipped for it, never guessed.
    ``plan_for(geometry)`` gives the steps' plan of a bar (the existing journals and seat); None: as typed.
    """
    from workbench.core.keyseat_factors import KeyseatRefused, read_keyseat

    rows = []
    for stock in stock_sizes(profile, system):
        geometry = stock_geometry(stock, keyed, finish)
        if geometry.keyed:
            try:
                read_keyseat(geometry)
            except KeyseatRefused:  # a tube whose wall cannot hold the keyseat (or no listed key): not offered
                continue
        plan = plan_for(geometry) if plan_for else None
        for material_for in materials:
            mat = material_for(geometry.size_m)
            if mat is None:
                continue
            try:
                check = check_case(ShaftCase("candidate", geometry, mat, plan), loads, mount, settings, layout,
                                   driven_load_N, E_Pa, hub_material)
            except LayoutError as err:
                rows.append(StockRow(stock, geometry, mat, None, err.message))
                continue
            rows.append(StockRow(stock, geometry, mat, check))
    return rows


def smallest_passing(rows: list[StockRow]) -> dict[str, StockRow]:
    """The first (smallest, lightest) row with a ``pass`` verdict, per material key."""
    best: dict[str, StockRow] = {}
    for row in rows:
        if row.check is not None and row.check.verdict == "pass" and row.material.key not in best:
            best[row.material.key] = row
    return best
