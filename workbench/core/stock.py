"""Stock finder: check every standard bar size of a profile and find the smallest that passes."""

from __future__ import annotations

from dataclasses import dataclass
from typing import Callable

from workbench.core.checks import MaterialProps, Settings, ShaftCheck
from workbench.core.drive import DriveLoads
from workbench.core.evaluate import ShaftCase, check_case
from workbench.core.geometry import ShaftGeometry
from workbench.core.loads import Mount
from workbench.core.tables import StockSize, stock_sizes


@dataclass(frozen=True)
class StockRow:
    """One stock size in one material, checked as the candidate."""

    stock: StockSize
    geometry: ShaftGeometry
    material: MaterialProps
    check: ShaftCheck


def stock_geometry(stock: StockSize, keyed: bool = False, finish: str = "machined") -> ShaftGeometry:
    """The bar of a stock row as a shaft geometry; rounds and tubes carry a keyseat when ``keyed``."""
    key_standard = "ansi" if stock.system == "inch" else "iso"
    return ShaftGeometry(
        profile=stock.profile,
        size_m=stock.size_m,
        second_m=stock.second_m,
        keyed=keyed and stock.profile in ("round", "tube"),
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
) -> list[StockRow]:
    """Every stock size of ``profile`` in ``system`` checked in each material, smallest first.

    ``materials`` are functions of the bar size [m] (a grade's strength depends on its ruling section);
    one that returns None has no strength for that size, which is then skipped for it, never guessed.
    """
    rows = []
    for stock in stock_sizes(profile, system):
        geometry = stock_geometry(stock, keyed, finish)
        for material_for in materials:
            mat = material_for(geometry.size_m)
            if mat is None:
                continue
            check = check_case(ShaftCase("candidate", geometry, mat), loads, mount, settings)
            rows.append(StockRow(stock, geometry, mat, check))
    return rows


def smallest_passing(rows: list[StockRow]) -> dict[str, StockRow]:
    """The first (smallest, lightest) row with a ``pass`` verdict, per material key."""
    best: dict[str, StockRow] = {}
    for row in rows:
        if row.check.verdict == "pass" and row.material.key not in best:
            best[row.material.key] = row
    return best
