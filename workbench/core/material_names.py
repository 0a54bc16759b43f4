"""Material names a fitter uses (EN8, EN19, 709M40, 42CrMo4) -> rows of the material table.

``data/materials.csv`` keys carry the supply condition and, for EN grades, the size range
(``c45-qt-16-40``). A fitter names a steel as it is stamped or ordered. This module reads
``data/material_names.csv``: each common designation, the standard it comes from, the table key it
is read as (the grade's usual supply condition, or the weakest one where there is no usual one),
that condition in words, and the other conditions to offer. A bare grade (``1045``, ``c45``) is
not a designation: its conditions differ too much to pick one (the job refuses it, listing them). A size-ranged grade key (``c45-qt``)
is completed with the row for the bar's size by :func:`workbench.core.tables.material_for_size`.

Pure: no Textual, Rich, SQLite or pint.
"""

from __future__ import annotations

import csv
import difflib
import functools
import re
from dataclasses import dataclass

from .tables import MARKS, data_dir, materials


@dataclass(frozen=True)
class MaterialName:
    """One designation of ``data/material_names.csv``.

    name: as written (``EN19``);  standard: where the name comes from and what it is close to
    key: table key or grade key it is read as (``42crmo4-qt``);  supply: that condition in words
    others: other table keys (each with a few words) a fitter may mean instead
    """

    name: str
    standard: str
    key: str
    supply: str
    others: tuple[str, ...]
    source: str
    mark: str


def _fold(text: str) -> str:
    """A name folded for lookup: case, blanks, hyphens and a leading AISI/SAE/BS/EN word ignored
    (``En 8``, ``en-8`` and ``EN8`` are one name; ``SAE 1045`` is ``1045``)."""
    folded = re.sub(r"[\s_\-]+", "", text.strip().lower())
    return re.sub(r"^(aisi|sae|aisisae|bs970|bs)(?=\d)", "", folded)


@functools.cache
def material_names() -> dict[str, MaterialName]:
    """The designations by folded name, in file order."""
    path = data_dir() / "material_names.csv"
    out: dict[str, MaterialName] = {}
    with path.open(newline="", encoding="utf-8") as handle:
        for row in csv.DictReader(handle):
            row = {k: (v or "").strip() for k, v in row.items() if k}
            if not row.get("name"):
                continue
            if not row.get("source") or row.get("mark") not in MARKS:
                raise ValueError(f"material_names.csv: {row['name']}: needs a source and a mark")
            others = tuple(o.strip() for o in row.get("others", "").split(",") if o.strip())
            out[_fold(row["name"])] = MaterialName(row["name"], row["standard"], row["key"].lower(),
                                                   row["supply"], others, row["source"], row["mark"])
    return out


def grade_keys() -> list[str]:
    """Keys a fitter may type: every row without a size range, and each size-ranged grade once
    without its range (``c45-qt`` for ``c45-qt-0-16``, ``c45-qt-16-40``…), in file order."""
    out: list[str] = []
    for key, row in materials().items():
        if row.size_max_m is not None and re.search(r"-\d+(?:\.\d+)?-\d+(?:\.\d+)?$", key):
            key = re.sub(r"-\d+(?:\.\d+)?-\d+(?:\.\d+)?$", "", key)
        if key not in out:
            out.append(key)
    return out


def designation(text: str) -> MaterialName | None:
    """The designation ``text`` names (``EN19``, ``en 8``, ``SAE 1045``), or None.

    A table key or grade key is not a designation (``1045-cd`` is read as itself).
    """
    wanted = text.strip().lower()
    if wanted in materials() or wanted in grade_keys():
        return None
    return material_names().get(_fold(text))


def reading_note(text: str, row_key: str) -> str:
    """One line saying how a designation was read, and what else it may mean; "" for a key."""
    found = designation(text)
    if found is None:
        return ""
    others = "; ".join(found.others)
    offer = f" If the bar is supplied otherwise, name it: {others}." if others else ""
    return (f"{found.name} ({found.standard}) read as {row_key}: {found.supply}.{offer}")


def nearest_names(text: str, n: int = 5) -> list[str]:
    """The table keys, grade keys and designations closest to ``text`` (for "did you mean")."""
    wanted = text.strip().lower()
    keys = list(materials()) + [k for k in grade_keys() if k not in materials()]
    names = [m.name for m in material_names().values()]
    by_fold = {_fold(name): name for name in names}
    close = difflib.get_close_matches(wanted, keys, n=n, cutoff=0.6)
    close += [by_fold[f] for f in difflib.get_close_matches(_fold(text), list(by_fold), n=n, cutoff=0.6)]
    close += [k for k in grade_keys() if wanted and k.startswith(wanted) and k not in close]
    seen: list[str] = []
    for item in close:
        if item not in seen:
            seen.append(item)
    return seen[:n]


def listing() -> list[dict[str, str]]:
    """Rows for ``--material list`` and the workbench's pick-list: each typeable key with its name,
    condition, yield and tensile strength [MPa] (the range for a size-ranged grade), and the
    designations that are read as it."""
    table = materials()
    names_for: dict[str, list[str]] = {}
    for entry in material_names().values():
        names_for.setdefault(entry.key, []).append(entry.name)
    rows: list[dict[str, str]] = []
    for key in grade_keys():
        members = [m for k, m in table.items() if k == key or k.startswith(key + "-") and
                   re.fullmatch(r"\d+(?:\.\d+)?-\d+(?:\.\d+)?", k[len(key) + 1:])]
        first = members[0]
        ys = sorted({round(m.yield_Pa / 1e6) for m in members})
        uts = sorted({round(m.tensile_Pa / 1e6) for m in members})
        sized = len(members) > 1 or first.size_max_m is not None
        lo = min((m.size_min_m or 0.0) for m in members) * 1e3
        hi = max((m.size_max_m or 0.0) for m in members) * 1e3
        rows.append({
            "key": key,
            "name": re.sub(r"\s+(up to|\d+-)\s*\d+.*mm$", "", first.name),
            "condition": first.condition,
            "yield_MPa": f"{ys[0]}" if len(ys) == 1 else f"{ys[0]}-{ys[-1]}",
            "tensile_MPa": f"{uts[0]}" if len(uts) == 1 else f"{uts[0]}-{uts[-1]}",
            "sizes": f"{lo:g}-{hi:g} mm (row picked by bar size)" if len(members) > 1 else (
                f"{lo:g}-{hi:g} mm" if sized else "any size"),
            "also": ", ".join(names_for.get(key, [])),
        })
    return rows
