"""``--material list``: every material name the job accepts, with the properties that matter."""

from __future__ import annotations

import json
import sys


def print_material_list(json_out: bool = False) -> int:
    """Print the typeable material keys (a size-ranged grade once: its row is picked by the bar
    size), their condition, yield and tensile strength, and the designations read as each."""
    from workbench.core.material_names import listing, material_names

    rows = listing()
    if json_out:
        names = [{"name": m.name, "standard": m.standard, "key": m.key, "supply": m.supply,
                  "others": list(m.others)} for m in material_names().values()]
        sys.stdout.write(json.dumps({"materials": rows, "designations": names}, indent=2) + "\n")
        return 0
    from rich.console import Console
    from rich.table import Table
    from rich.text import Text

    table = Table(title="Materials (--material KEY; a name in the last column is read as that key)")
    for column in ("key", "material", "yield MPa", "tensile MPa", "bar sizes", "also typed as"):
        table.add_column(column, overflow="fold")
    for row in rows:
        words = row["name"] if row["condition"].split(" ")[0].lower() in row["name"].lower() else \
            f"{row['name']}, {row['condition']}"
        table.add_row(row["key"], Text(words), row["yield_MPa"],
                      row["tensile_MPa"], row["sizes"], Text(row["also"]))
    console = Console()
    console.print(table)
    console.print("Designations (how each is read, and what else it may mean):")
    for entry in material_names().values():
        others = f"; or {', '.join(entry.others)}" if entry.others else ""
        console.print(Text(f"  {entry.name} — {entry.standard}: {entry.key}, {entry.supply}{others}"))
    console.print("Or type your own: custom Sy=350MPa Sut=600MPa (E, G, rho optional).")
    return 0
