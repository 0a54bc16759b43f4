"""The data tables and their loader (workbench.core.tables).

Transcription checks compare a few rows per source with the value printed in the cited table
(exact match after unit conversion, rel. tolerance 1e-12 for float round-off only).
"""

from __future__ import annotations

import csv
import importlib.util
import math
import pathlib
import shutil
import subprocess
import sys

import pytest

from workbench.core import tables
from workbench.core.tables import (
    MARKS,
    key_for_diameter,
    material,
    material_for_size,
    materials,
    mount_factors,
    service_factor,
    service_factors,
    stock_sizes,
)

REPO = pathlib.Path(__file__).resolve().parents[2]
MM = 1e-3
INCH = 0.0254
MPA = 1e6
EXACT = 1e-12  # float round-off only

LOADER_FILES = ("materials.csv", "keys_iso_din6885.csv", "keys_ansi_b17_1.csv", "stock_metric.csv",
                "stock_inch.csv", "mount_factors.csv", "service_factors.csv")
# every table under data/, including those read by other modules (stress_raisers.csv)
CSV_FILES = tuple(sorted({*LOADER_FILES, *(p.name for p in (REPO / "data").glob("*.csv"))}))


def same(a: float, b: float) -> bool:
    return math.isclose(a, b, rel_tol=EXACT, abs_tol=0.0)


# --------------------------------------------------------------------------- every file


@pytest.mark.parametrize("filename", CSV_FILES)
def test_every_row_has_a_source_and_a_valid_mark(filename):
    with (REPO / "data" / filename).open(newline="", encoding="utf-8") as fh:
        rows = list(csv.DictReader(fh))
    assert rows, filename
    for n, row in enumerate(rows, start=2):
        assert row["source"].strip(), f"{filename}:{n} has no source"
        assert row["mark"] in MARKS, f"{filename}:{n} mark {row['mark']!r}"


@pytest.mark.parametrize("filename", CSV_FILES)
def test_data_readme_has_a_section_per_file(filename):
    readme = (REPO / "data" / "README.md").read_text(encoding="utf-8")
    assert f"## `{filename}`" in readme


def test_data_dir_is_the_checkout_data_folder():
    assert tables.data_dir() == REPO / "data"


def _load_tables_copy(root: pathlib.Path, monkeypatch):
    """Import a copy of tables.py placed at root/workbench/core/tables.py."""
    target = root / "workbench" / "core" / "tables.py"
    target.parent.mkdir(parents=True)
    shutil.copy(tables.__file__, target)
    spec = importlib.util.spec_from_file_location("tables_copy", target)
    module = importlib.util.module_from_spec(spec)
    monkeypatch.setitem(sys.modules, "tables_copy", module)  # dataclasses look the module up
    spec.loader.exec_module(module)
    return module


def test_data_dir_prefers_the_installed_package_data(tmp_path, monkeypatch):
    # wheel layout: site-packages/workbench/data (pyproject force-include "data" -> "workbench/data")
    copy = _load_tables_copy(tmp_path / "site", monkeypatch)
    shutil.copytree(REPO / "data", tmp_path / "site" / "workbench" / "data")
    assert copy.data_dir() == (tmp_path / "site" / "workbench" / "data").resolve()
    assert copy.material("1045-cd").yield_Pa == material("1045-cd").yield_Pa


def test_data_dir_missing_names_both_places(tmp_path, monkeypatch):
    copy = _load_tables_copy(tmp_path / "empty", monkeypatch)
    with pytest.raises(FileNotFoundError, match="data tables not found") as err:
        copy.data_dir()
    assert str(tmp_path / "empty" / "workbench" / "data") in str(err.value)


def test_a_bad_mark_is_reported_with_file_and_line(tmp_path, monkeypatch):
    bad = tmp_path / "data"
    shutil.copytree(REPO / "data", bad)
    text = (bad / "mount_factors.csv").read_text(encoding="utf-8").splitlines()
    text[2] = text[2][:-1] + "X"  # line 3: mark V -> X
    (bad / "mount_factors.csv").write_text("\n".join(text) + "\n", encoding="utf-8")
    monkeypatch.setattr(tables, "data_dir", lambda: bad)
    tables.mount_factors.cache_clear()
    try:
        with pytest.raises(tables.TableError, match=r"mount_factors.csv:3: mark 'X'"):
            tables.mount_factors()
    finally:
        tables.mount_factors.cache_clear()


def test_loader_imports_nothing_heavy():
    code = ("import sys, workbench.core.tables as t; t.materials(); t.stock_sizes(); "
            "print(sorted(m for m in ('numpy','scipy','pint','rich','textual','sqlite3','pandas') if m in sys.modules))")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True, cwd=REPO)
    assert out.stdout.strip() == "[]"


# --------------------------------------------------------------------------- materials


# Shigley's Mechanical Engineering Design, 9th ed., Table A-20 (MPa, elongation %)
@pytest.mark.parametrize("key, sut_MPa, sy_MPa, elong_pct", [
    ("1018-hr", 400, 220, 25),
    ("1020-cd", 470, 390, 15),
    ("1045-hr", 570, 310, 16),
    ("1045-cd", 630, 530, 12),
    ("1050-cd", 690, 580, 10),
])
def test_carbon_steels_match_shigley_9th_table_a20(key, sut_MPa, sy_MPa, elong_pct):
    m = material(key)
    assert same(m.tensile_Pa, sut_MPa * MPA) and same(m.yield_Pa, sy_MPa * MPA)
    assert m.elongation_pct == elong_pct
    assert "Table A-20" in m.source and m.mark == "V"
    assert same(m.size_min_m, 18 * MM) and same(m.size_max_m, 32 * MM)  # table heading: 18-32 mm bar


@pytest.mark.parametrize("key, sut_MPa, sy_MPa, cited", [
    ("1144-cd", 690, 621, "Mott"),              # Mott, Machine Elements in Mech. Design, App. 3
    ("1144-hr", 648, 352, "Mott"),
    ("4140-qt540", 951, 834, "ASM"),            # ASM property data, AISI 4140 Q&T 540 degC
    ("4140-ann", 655, 417, "ASM"),
    ("304", 515, 205, "ASTM A276"),             # ASTM A276 annealed minimum
    ("316", 515, 205, "ASTM A276"),
    ("c45-qt-16-40", 650, 430, "EN 10083"),     # EN 10083 C45 +QT 16-40 mm: Rm 650-800 -> 650
    ("c45-n-16-100", 580, 305, "EN 10083"),
    ("42crmo4-qt-40-100", 900, 650, "EN 10083"),  # Rm 900-1100 -> 900
])
def test_other_grades_match_their_cited_source(key, sut_MPa, sy_MPa, cited):
    m = material(key)
    assert same(m.tensile_Pa, sut_MPa * MPA) and same(m.yield_Pa, sy_MPa * MPA)
    assert cited in m.source


def test_marks_carried_over_from_shop_data():
    assert material("303").mark == "M"  # ASTM A582 303 about 620/240: recalled
    assert material("304").mark == "V"


def test_elastic_constants_match_shigley_9th_table_a5():
    for m in materials().values():
        if m.family == "stainless":
            assert (m.E_Pa, m.G_Pa) == (190e9, 73.1e9), m.key
        else:
            assert (m.E_Pa, m.G_Pa) == (207e9, 79.3e9), m.key


def test_shear_modulus_consistent_with_poisson_ratio_table_a5():
    # G = E / (2 (1 + nu)), nu from Shigley 9th Table A-5: carbon/alloy 0.292, stainless 18-8 0.305; tol 2 %
    for m in materials().values():
        nu = 0.305 if m.family == "stainless" else 0.292
        assert math.isclose(m.G_Pa, m.E_Pa / (2 * (1 + nu)), rel_tol=0.02), m.key


def test_every_material_is_sane():
    for key, m in materials().items():
        assert key == key.lower() == m.key
        assert 0 < m.yield_Pa < m.tensile_Pa, key
        assert 7700 <= m.density_kg_m3 <= 8100, key
        if m.size_min_m is not None and m.size_max_m is not None:
            assert m.size_min_m < m.size_max_m, key


@pytest.mark.parametrize("grade", ["c45-n", "c45-qt", "42crmo4-qt"])
def test_en_size_ranges_are_contiguous_and_strength_falls_with_size(grade):
    rows = [m for k, m in materials().items() if k.startswith(grade + "-")]
    assert len(rows) >= 3
    assert rows[0].size_min_m is None
    for lower, upper in zip(rows, rows[1:]):
        assert same(lower.size_max_m, upper.size_min_m)
        assert upper.yield_Pa < lower.yield_Pa and upper.tensile_Pa < lower.tensile_Pa


def test_material_lookup_ignores_case_and_suggests_close_keys():
    assert material(" 1045-CD ") is material("1045-cd")
    with pytest.raises(KeyError, match="1045-cd"):
        material("1045cd")


@pytest.mark.parametrize("size_mm, expected", [
    (16, "c45-qt-0-16"),    # boundary: "up to 16" row, not "over 16"
    (16.5, "c45-qt-16-40"),
    (40, "c45-qt-16-40"),
    (100, "c45-qt-40-100"),
])
def test_material_for_size_picks_the_ruling_section_row(size_mm, expected):
    assert material_for_size("c45-qt", size_mm * MM).key == expected


def test_material_for_size_refuses_a_size_outside_the_rows():
    with pytest.raises(KeyError, match="no row for 120 mm"):
        material_for_size("c45-qt", 0.120)
    with pytest.raises(KeyError, match="18-32 mm"):
        material_for_size("1045-cd", 0.050)


# --------------------------------------------------------------------------- keys


# DIN 6885-1 / ISO 773 (mm): diameter -> b, h, t1; boundaries belong to the lower row
@pytest.mark.parametrize("d_mm, b_mm, h_mm, t1_mm", [
    (35, 10, 8, 5.0),
    (38, 10, 8, 5.0),       # "over 30 up to 38"
    (38.01, 12, 8, 5.0),
    (30, 8, 7, 4.0),
    (30.01, 10, 8, 5.0),
    (50, 14, 9, 5.5),
    (6.01, 2, 2, 1.2),
    (130, 32, 18, 11.0),
])
def test_iso_key_for_diameter(d_mm, b_mm, h_mm, t1_mm):
    k = key_for_diameter(d_mm * MM, "iso")
    assert k is not None and k.standard == "iso"
    assert same(k.width_m, b_mm * MM) and same(k.height_m, h_mm * MM) and same(k.shaft_depth_m, t1_mm * MM)


# ANSI B17.1 square keys, Shigley 9th ed. Table 7-6 (in): shaft depth h/2
@pytest.mark.parametrize("d_in, w_in", [
    (1.5, 3 / 8),
    (1.375, 5 / 16),        # "over 1-1/4 up to 1-3/8"
    (1.376, 3 / 8),
    (1.0, 1 / 4),
    (6.5, 1.5),
])
def test_ansi_key_for_diameter(d_in, w_in):
    k = key_for_diameter(d_in * INCH, "ansi")
    assert k is not None and k.standard == "ansi"
    assert same(k.width_m, w_in * INCH) and same(k.height_m, w_in * INCH)
    assert same(k.shaft_depth_m, w_in * INCH / 2)


@pytest.mark.parametrize("d_m, standard", [(6 * MM, "iso"), (131 * MM, "iso"), (0.3125 * INCH, "ansi"),
                                          (6.6 * INCH, "ansi")])
def test_key_for_diameter_outside_the_table_is_none(d_m, standard):
    assert key_for_diameter(d_m, standard) is None


def test_key_tables_are_contiguous():
    for standard in tables.KEY_STANDARDS:
        rows = tables.key_sizes(standard)
        for lower, upper in zip(rows, rows[1:]):
            assert same(lower.shaft_to_m, upper.shaft_over_m)
            assert upper.width_m > lower.width_m


def test_unknown_key_standard_is_an_error():
    with pytest.raises(ValueError, match="iso, ansi"):
        key_for_diameter(0.03, "jis")


# --------------------------------------------------------------------------- stock


def test_stock_lists_are_sorted_unique_and_complete():
    for system in tables.STOCK_SYSTEMS:
        for profile in tables.STOCK_PROFILES:
            rows = stock_sizes(profile, system)
            assert rows, (profile, system)
            keys = [(s.size_m, s.second_m) for s in rows]
            assert keys == sorted(keys) and len(set(keys)) == len(keys), (profile, system)
            assert len({s.label for s in rows}) == len(rows)
            for s in rows:
                assert (s.profile, s.system) == (profile, system)
                if profile in ("flat", "tube"):
                    assert 0 < s.second_m < s.size_m, s
                else:
                    assert s.second_m == 0.0
    everything = stock_sizes()
    assert [s.size_m for s in everything] == sorted(s.size_m for s in everything)


def test_metric_rounds_follow_en_10060():
    # EN 10060 stockist sizes 16-130 mm (V); 10-15 mm recalled (M)
    rounds = {round(s.size_m / MM, 6): s for s in stock_sizes("round", "metric")}
    for d in (16, 19, 35, 63, 73, 130):
        assert rounds[d].mark == "V" and rounds[d].label == str(d)
    assert 34 not in rounds
    assert rounds[12].mark == "M"


def test_inch_labels_and_values():
    by_label = {s.label: s for s in stock_sizes("round", "inch")}
    assert same(by_label["1-1/4"].size_m, 1.25 * INCH)
    assert same(by_label["2-15/16"].size_m, (2 + 15 / 16) * INCH)
    tube = [s for s in stock_sizes("tube", "inch") if s.label == "2 x 0.250 wall"][0]
    assert same(tube.second_m, 1.5 * INCH)
    flat = [s for s in stock_sizes("flat", "metric") if s.label == "50 x 20"][0]
    assert same(flat.size_m, 50 * MM) and same(flat.second_m, 20 * MM)


def test_unknown_profile_is_an_error():
    with pytest.raises(ValueError, match="round"):
        stock_sizes("octagon")


# --------------------------------------------------------------------------- factors


def test_mount_factors_match_overhung_load_table():
    # OHL = 2 T K / D, gear-reducer makers' engineering data (shop-data reference): exact
    expected = {"coupling": 0.0, "sprocket": 1.00, "timing-belt": 1.00, "gear": 1.25, "vbelt": 1.50,
                "flat-belt": 2.50, "variable-pitch": 3.50}
    assert {k: v.load_factor for k, v in mount_factors().items()} == expected
    assert mount_factors()["coupling"].mark == "P"


def test_service_factors_match_agma_table():
    """AGMA service factors, electric-motor input, as reproduced in a gear-reducer maker's manual
    (Leeson product manual p. 82), exact: occasional 1/2 h -/-/1.0/1.25 (unspecified = 1.00),
    < 3 h 1.0/1.0/1.25/1.50, 3-10 h 1.0/1.25/1.50/1.75, over 10 h 1.25/1.50/1.75/2.00. The row
    once labelled 2 h is the 'less than 3 hours' row; no factor is below 1."""
    rows = [(r.hours_per_day, r.uniform, r.moderate, r.heavy, r.extreme) for r in service_factors()]
    assert rows == [(0.5, 1.0, 1.0, 1.0, 1.25), (3, 1.0, 1.0, 1.25, 1.5), (10, 1.0, 1.25, 1.5, 1.75),
                    (24, 1.25, 1.5, 1.75, 2.0)]


@pytest.mark.parametrize("hours, load, expected", [
    (0.5, "uniform", 1.0), (1, "heavy", 1.25), (6, "moderate", 1.25), (10, "moderate", 1.25),
    (16, "heavy", 1.75), (24, "uniform", 1.25), (24, "extreme", 2.0), (3, "extreme", 1.5),
])
def test_service_factor_reads_the_next_row_up(hours, load, expected):
    assert service_factor(hours, load) == expected


@pytest.mark.parametrize("hours, load", [(0, "uniform"), (25, "uniform"), (8, "violent")])
def test_service_factor_rejects_bad_input(hours, load):
    with pytest.raises(ValueError):
        service_factor(hours, load)
