"""The shop tables under ``data/``, loaded once and converted to SI floats.

Each CSV row carries a ``source`` (book or standard, edition, table) and a ``mark``:
V seen in the named document, C computed from the named formula, M recalled (verify),
P common practice. ``data/README.md`` describes every file. This module uses only the
standard library (csv, dataclasses, functools) so that it stays cheap to import.

Public API::

    data_dir() -> Path
    materials() -> dict[str, Material]          material(key) -> Material
    material_for_size(key, size_m) -> Material  (picks the ruling-section row of a grade)
    key_for_diameter(diameter_m, standard) -> KeySize | None     key_sizes(standard) -> list
    stock_sizes(profile=None, system=None) -> list[StockSize]
    mount_factors() -> dict[str, MountFactor]
    service_factors() -> list[ServiceFactorRow]  service_factor(hours_per_day, load) -> float
"""

from __future__ import annotations

import csv
import functools
import pathlib
import re
from dataclasses import dataclass

MARKS = ("V", "C", "M", "P")
"""Valid values of the ``mark`` column (see the module docstring)."""

KEY_STANDARDS = ("iso", "ansi")
STOCK_SYSTEMS = ("metric", "inch")
STOCK_PROFILES = ("round", "square", "flat", "hex", "tube")
SERVICE_LOADS = ("uniform", "moderate", "heavy", "extreme")

_MM_TO_M = 1e-3
_IN_TO_M = 0.0254  # exact by definition (international inch, 1959)
_MPA_TO_PA = 1e6
_GPA_TO_PA = 1e9

_KEY_FILES = {"iso": ("keys_iso_din6885.csv", "mm", _MM_TO_M), "ansi": ("keys_ansi_b17_1.csv", "in", _IN_TO_M)}
_STOCK_FILES = {"metric": ("stock_metric.csv", _MM_TO_M), "inch": ("stock_inch.csv", _IN_TO_M)}


class TableError(ValueError):
    """A data file is missing a column, has an unreadable number or an invalid mark (our bug)."""


# --------------------------------------------------------------------------- locating the data


def data_dir() -> pathlib.Path:
    """Return the directory that holds the CSV tables.

    An installed wheel carries them as ``workbench/data`` (see ``pyproject.toml``,
    ``force-include``); a source checkout keeps them in ``<repo>/data``. Raises
    ``FileNotFoundError`` naming both places if neither holds ``materials.csv``.
    """
    package_dir = pathlib.Path(__file__).resolve().parent.parent
    candidates = (package_dir / "data", package_dir.parent / "data")
    for candidate in candidates:
        if (candidate / "materials.csv").is_file():
            return candidate
    tried = " and ".join(str(c) for c in candidates)
    raise FileNotFoundError(f"shaftbench data tables not found (looked in {tried})")


def _read_rows(filename: str, required: tuple[str, ...]) -> list[tuple[int, dict[str, str]]]:
    """Read one CSV file as (line number, row) pairs, checking columns, source and mark."""
    path = data_dir() / filename
    with path.open(newline="", encoding="utf-8") as fh:
        reader = csv.DictReader(fh)
        missing = [c for c in (*required, "source", "mark") if c not in (reader.fieldnames or ())]
        if missing:
            raise TableError(f"{filename}: missing column(s) {', '.join(missing)}")
        rows = []
        for row in reader:
            line = reader.line_num
            row = {k: (v or "").strip() for k, v in row.items() if k is not None}
            if not any(row.values()):
                continue
            if not row["source"]:
                raise TableError(f"{filename}:{line}: empty source")
            if row["mark"] not in MARKS:
                raise TableError(f"{filename}:{line}: mark {row['mark']!r} is not one of {', '.join(MARKS)}")
            rows.append((line, row))
    return rows


def _number(filename: str, line: int, row: dict[str, str], column: str) -> float:
    try:
        return float(row[column])
    except ValueError:
        raise TableError(f"{filename}:{line}: column {column} is not a number: {row[column]!r}") from None


def _optional(filename: str, line: int, row: dict[str, str], column: str) -> float | None:
    return None if row[column] == "" else _number(filename, line, row, column)


# --------------------------------------------------------------------------- materials


@dataclass(frozen=True)
class Material:
    """One shaft steel in one condition (and, for EN grades, one ruling-section range).

    size_min_m, size_max_m: ruling section the strengths hold for (None = no bound)  [m]
    tensile_Pa, yield_Pa: minimum (or typical, see source) ultimate and yield strength  [Pa]
    E_Pa, G_Pa: Young's and shear modulus  [Pa];  density_kg_m3  [kg/m^3]
    elongation_pct: elongation at break  [%], None where the source gives none
    """

    key: str
    name: str
    aisi: str
    en: str
    condition: str
    family: str
    size_min_m: float | None
    size_max_m: float | None
    tensile_Pa: float
    yield_Pa: float
    E_Pa: float
    G_Pa: float
    density_kg_m3: float
    elongation_pct: float | None
    source: str
    mark: str

    def covers(self, size_m: float) -> bool:
        """True if a ruling section of ``size_m`` [m] lies in this row's size range.

        Both bounds are inclusive (a 16 mm bar is covered by a 0-16 row and a 16-40 row;
        ``material_for_size`` then takes the lower row, as EN 10083 reads "over 16 up to 40");
        an open bound accepts any size on that side.
        """
        if self.size_min_m is not None and size_m < self.size_min_m * (1 - 1e-12):
            return False
        if self.size_max_m is not None and size_m > self.size_max_m * (1 + 1e-12):
            return False
        return True


_FAMILIES = ("carbon", "free-machining", "alloy", "stainless")


@functools.cache
def materials() -> dict[str, Material]:
    """All materials of ``data/materials.csv`` by lowercase key, in file order (SI units)."""
    fn = "materials.csv"
    columns = ("key", "name", "aisi", "en", "condition", "family", "size_min_mm", "size_max_mm",
               "tensile_MPa", "yield_MPa", "E_GPa", "G_GPa", "density_kg_m3", "elongation_pct")
    out: dict[str, Material] = {}
    for line, r in _read_rows(fn, columns):
        key = r["key"].lower()
        if not key or key in out:
            raise TableError(f"{fn}:{line}: empty or repeated key {key!r}")
        if r["family"] not in _FAMILIES:
            raise TableError(f"{fn}:{line}: family {r['family']!r} is not one of {', '.join(_FAMILIES)}")
        size_min = _optional(fn, line, r, "size_min_mm")
        size_max = _optional(fn, line, r, "size_max_mm")
        out[key] = Material(
            key=key, name=r["name"], aisi=r["aisi"], en=r["en"], condition=r["condition"], family=r["family"],
            size_min_m=None if size_min is None else size_min * _MM_TO_M,
            size_max_m=None if size_max is None else size_max * _MM_TO_M,
            tensile_Pa=_number(fn, line, r, "tensile_MPa") * _MPA_TO_PA,
            yield_Pa=_number(fn, line, r, "yield_MPa") * _MPA_TO_PA,
            E_Pa=_number(fn, line, r, "E_GPa") * _GPA_TO_PA,
            G_Pa=_number(fn, line, r, "G_GPa") * _GPA_TO_PA,
            density_kg_m3=_number(fn, line, r, "density_kg_m3"),
            elongation_pct=_optional(fn, line, r, "elongation_pct"),
            source=r["source"], mark=r["mark"],
        )
    return out


def material(key: str) -> Material:
    """The material with this key (case and surrounding blanks ignored).

    Raises ``KeyError`` whose message lists the closest known keys.
    """
    table = materials()
    wanted = key.strip().lower()
    try:
        return table[wanted]
    except KeyError:
        import difflib  # only on the error path

        close = difflib.get_close_matches(wanted, list(table), n=5, cutoff=0.5)
        close += [k for k in table if k.startswith(wanted + "-") and k not in close]
        hint = f"; did you mean {', '.join(close[:6])}?" if close else ""
        raise KeyError(f"unknown material {key!r}{hint}") from None


def material_for_size(key: str, size_m: float) -> Material:
    """The material row for ``key`` that covers a ruling section of ``size_m`` [m].

    ``key`` is either a full key (returned if its size range covers ``size_m``) or a grade
    and condition without the size range, e.g. ``c45-qt`` or ``42crmo4-qt``, which picks the
    ``c45-qt-<over>-<to>`` row whose range holds the size; on a boundary the lower row wins.
    Raises ``KeyError`` if no row does.
    """
    table = materials()
    wanted = key.strip().lower()
    if wanted in table:
        row = table[wanted]
        if row.covers(size_m):
            return row
        raise KeyError(f"material {wanted!r} holds for {_range_text(row)}, not {size_m * 1e3:g} mm")
    rows = [
        m for k, m in table.items()
        if k.startswith(wanted + "-") and _RANGE_SUFFIX.fullmatch(k[len(wanted) + 1:]) and m.size_max_m is not None
    ]
    if not rows:
        material(key)  # raises KeyError with suggestions
    for row in rows:
        if row.covers(size_m):
            return row
    ranges = ", ".join(_range_text(r) for r in rows)
    raise KeyError(f"material {wanted!r} has no row for {size_m * 1e3:g} mm (rows: {ranges})")


_RANGE_SUFFIX = re.compile(r"\d+(?:\.\d+)?-\d+(?:\.\d+)?")
"""What follows a grade-and-condition key in a size-ranged row's key (``c45-qt`` + ``16-40``)."""


def _range_text(row: Material) -> str:
    lo = "0" if row.size_min_m is None else f"{row.size_min_m * 1e3:g}"
    hi = "any" if row.size_max_m is None else f"{row.size_max_m * 1e3:g}"
    return f"{lo}-{hi} mm"


# --------------------------------------------------------------------------- keys


@dataclass(frozen=True)
class KeySize:
    """One row of a parallel-key table: shafts over ``shaft_over_m`` up to ``shaft_to_m``.

    standard: "iso" (DIN 6885-1 / ISO 773) or "ansi" (ANSI B17.1 square keys)
    width_m, height_m: key section b x h  [m];  shaft_depth_m: keyseat depth in the shaft t1  [m]
    """

    standard: str
    shaft_over_m: float
    shaft_to_m: float
    width_m: float
    height_m: float
    shaft_depth_m: float
    source: str
    mark: str


@functools.cache
def key_sizes(standard: str) -> tuple[KeySize, ...]:
    """All rows of the key table of ``standard`` ("iso" or "ansi"), ascending, in SI units."""
    if standard not in _KEY_FILES:
        raise ValueError(f"key standard {standard!r} is not one of {', '.join(KEY_STANDARDS)}")
    fn, unit, scale = _KEY_FILES[standard]
    cols = tuple(f"{c}_{unit}" for c in ("shaft_over", "shaft_to", "key_width", "key_height", "shaft_depth"))
    rows = []
    for line, r in _read_rows(fn, cols):
        over, to, width, height, depth = (_number(fn, line, r, c) * scale for c in cols)
        if not over < to:
            raise TableError(f"{fn}:{line}: shaft range is empty")
        rows.append(KeySize(standard, over, to, width, height, depth, r["source"], r["mark"]))
    rows.sort(key=lambda k: k.shaft_over_m)
    return tuple(rows)


def key_for_diameter(diameter_m: float, standard: str) -> KeySize | None:
    """The standard parallel key for a shaft of ``diameter_m`` [m], or None outside the table.

    Source of the rows: DIN 6885-1 / ISO 773 ("iso") or ANSI B17.1 as in Shigley 9th ed.
    Table 7-6 ("ansi"); see ``data/README.md``. A diameter exactly on a boundary belongs to the
    lower row: the tables read "over 30 up to 38 mm", so 38 mm takes the 30-38 row and the first
    row's lower bound is excluded. Both bounds are scaled by (1 + 1e-9) so that a boundary value
    that went through a unit conversion (1.375 in -> m) still lands in the lower row.
    """
    for row in key_sizes(standard):
        if row.shaft_over_m * (1 + 1e-9) < diameter_m <= row.shaft_to_m * (1 + 1e-9):
            return row
    return None


# --------------------------------------------------------------------------- stock sizes


@dataclass(frozen=True)
class StockSize:
    """One bar size on the rack.

    profile: round | square | flat | hex | tube;  system: metric | inch
    size_m: round d, square side, flat width, hex across flats, tube OD  [m]
    second_m: flat thickness or tube ID, 0.0 otherwise  [m]
    label: what the fitter reads on the rack (``35``, ``50 x 20``, ``1-1/4``)
    """

    profile: str
    system: str
    size_m: float
    second_m: float
    label: str
    source: str
    mark: str


@functools.cache
def _stock(system: str) -> tuple[StockSize, ...]:
    fn, scale = _STOCK_FILES[system]
    rows = []
    for line, r in _read_rows(fn, ("profile", "size", "second", "label")):
        if r["profile"] not in STOCK_PROFILES:
            raise TableError(f"{fn}:{line}: profile {r['profile']!r} is not one of {', '.join(STOCK_PROFILES)}")
        second = _optional(fn, line, r, "second")
        if r["profile"] in ("flat", "tube") and second is None:
            raise TableError(f"{fn}:{line}: a {r['profile']} needs the second dimension")
        rows.append(StockSize(r["profile"], system, _number(fn, line, r, "size") * scale,
                              0.0 if second is None else second * scale, r["label"], r["source"], r["mark"]))
    return tuple(rows)


def stock_sizes(profile: str | None = None, system: str | None = None) -> list[StockSize]:
    """Stock bar sizes, optionally of one profile and/or one system, sorted by size then second.

    Raises ``ValueError`` for an unknown profile or system.
    """
    if profile is not None and profile not in STOCK_PROFILES:
        raise ValueError(f"profile {profile!r} is not one of {', '.join(STOCK_PROFILES)}")
    if system is not None and system not in STOCK_SYSTEMS:
        raise ValueError(f"system {system!r} is not one of {', '.join(STOCK_SYSTEMS)}")
    return list(_sorted_stock(profile, system))  # a fresh list: the caller may change it


@functools.lru_cache(maxsize=64)  # the rack tables are read once (_stock); their sorted selections too
def _sorted_stock(profile: str | None, system: str | None) -> tuple[StockSize, ...]:
    systems = STOCK_SYSTEMS if system is None else (system,)
    found = [s for sy in systems for s in _stock(sy) if profile is None or s.profile == profile]
    return tuple(sorted(found, key=lambda s: (s.size_m, s.second_m, s.system, s.profile)))


# --------------------------------------------------------------------------- mounted elements


@dataclass(frozen=True)
class MountFactor:
    """Overhung-load factor K of a drive element: side load OHL = 2 T K / D.

    element: key used in job inputs (``coupling``, ``sprocket``, ``gear`` ...)
    load_factor: K  [-]  (0 for a coupling: torque only)
    """

    element: str
    load_factor: float
    description: str
    source: str
    mark: str


@functools.cache
def mount_factors() -> dict[str, MountFactor]:
    """Overhung-load factors of ``data/mount_factors.csv`` by element name."""
    fn = "mount_factors.csv"
    out: dict[str, MountFactor] = {}
    for line, r in _read_rows(fn, ("element", "load_factor", "description")):
        if r["element"] in out:
            raise TableError(f"{fn}:{line}: repeated element {r['element']!r}")
        out[r["element"]] = MountFactor(r["element"], _number(fn, line, r, "load_factor"),
                                        r["description"], r["source"], r["mark"])
    return out


# --------------------------------------------------------------------------- service factors


@dataclass(frozen=True)
class ServiceFactorRow:
    """One row of the service-factor table: duty up to ``hours_per_day`` hours a day.

    uniform, moderate, heavy, extreme: service factor for that class of shock load of the driven machine [-]
    """

    hours_per_day: float
    uniform: float
    moderate: float
    heavy: float
    extreme: float
    source: str
    mark: str

    def factor(self, load: str) -> float:
        """The factor for ``load`` ("uniform", "moderate", "heavy" or "extreme")."""
        if load not in SERVICE_LOADS:
            raise ValueError(f"load {load!r} is not one of {', '.join(SERVICE_LOADS)}")
        return getattr(self, load)


@functools.cache
def _service_rows() -> tuple[ServiceFactorRow, ...]:
    fn = "service_factors.csv"
    rows = [ServiceFactorRow(*(_number(fn, line, r, c) for c in ("hours_per_day", *SERVICE_LOADS)),
                             r["source"], r["mark"])
            for line, r in _read_rows(fn, ("hours_per_day", *SERVICE_LOADS))]
    return tuple(sorted(rows, key=lambda r: r.hours_per_day))


def service_factors() -> list[ServiceFactorRow]:
    """The service-factor table (AGMA style), ascending by hours a day."""
    return list(_service_rows())


def service_factor(hours_per_day: float, load: str) -> float:
    """Service factor [-] for a drive run ``hours_per_day`` hours a day under ``load``.

    Takes the first row whose hours are at least ``hours_per_day`` (a 6 h/day duty reads the
    10 h row), which errs on the safe side between rows. Raises ``ValueError`` for hours outside
    0 < h <= 24 or an unknown load class.
    """
    if not 0 < hours_per_day <= 24:
        raise ValueError(f"hours per day must be over 0 and at most 24, not {hours_per_day:g}")
    for row in _service_rows():
        if hours_per_day <= row.hours_per_day:
            return row.factor(load)
    raise ValueError(f"no service-factor row for {hours_per_day:g} h/day")  # table lacks a 24 h row
