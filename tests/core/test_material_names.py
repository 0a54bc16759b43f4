"""Material names a fitter uses: designations read as table rows, size ranges picked by bar size.

Check values are the table's own rows (data/materials.csv, sources in its source column): EN19 is
BS 970 709M40, close to 42CrMo4 (EN 10083-3), whose +QT row for a 16-40 mm ruling section gives
750 MPa yield; EN8 is 080M40, close to C40 / AISI 1040 (correspondences from memory, marked M).
"""

from __future__ import annotations

import pytest

from workbench.core.material_names import designation, grade_keys, listing, material_names, nearest_names
from workbench.core.tables import materials
from workbench.job import JobInputError, evaluate_inputs

JOB = {"power": "7.5 kW", "speed": "1450 rpm"}


def _shaft(material: str, spec: str = "round 40mm keyed") -> dict:
    return evaluate_inputs({**JOB, "shaft": spec, "material": material})["shafts"][0]


@pytest.mark.parametrize("typed", ["EN19", "en19", "EN 19", "en-19", "709M40"])
def test_en19_is_read_as_42crmo4_hardened_and_tempered_for_the_bar_size(typed):
    shaft = _shaft(typed)
    assert shaft["material"] == "42crmo4-qt-16-40"  # 40 mm bar: the 16-40 mm row (EN 10083-3)
    note = " ".join(shaft["notes"])
    assert "BS 970" in note and "42CrMo4" in note and "tempered" in note
    assert "4140-ann" in note and "4140-norm" in note  # the other supply conditions are offered


def test_en8_names_its_standard_and_is_read_as_1040():
    shaft = _shaft("EN8")
    assert shaft["material"] == "1040-hr"
    note = " ".join(shaft["notes"])
    assert "BS 970" in note and "C40" in note and "1040-cd" in note


def test_a_grade_key_and_a_wrong_range_pick_the_row_for_the_bar():
    assert _shaft("c45-qt", "round 60mm")["material"] == "c45-qt-40-100"
    shaft = _shaft("c45-qt-16-40", "round 60mm")  # typed for another bar size
    assert shaft["material"] == "c45-qt-40-100"
    assert "another bar size" in " ".join(shaft["notes"])
    assert _shaft("c45-qt-16-40", "round 30mm")["notes"] == []  # the right row: nothing to say


def test_a_table_key_is_never_read_as_a_designation():
    assert designation("1045-cd") is None and designation("304") is None
    assert _shaft("1045-cd")["material"] == "1045-cd"


@pytest.mark.parametrize(("grade", "conditions"), [("1045", ("1045-hr", "1045-cd")), ("c45", ("c45-n", "c45-qt"))])
def test_a_grade_without_its_supply_condition_lists_the_conditions(grade, conditions):
    """AISI 1045 hot-rolled vs cold-drawn: Sy 310 vs 530 MPa (Shigley 9th ed. Table A-20)."""
    with pytest.raises(JobInputError) as err:
        evaluate_inputs({**JOB, "shaft": "round 40mm", "material": grade})
    assert "supply condition" in str(err.value)
    assert all(c in str(err.value) for c in conditions)


def test_a_miss_suggests_the_nearest_names():
    with pytest.raises(JobInputError) as err:
        evaluate_inputs({**JOB, "shaft": "round 40mm", "material": "EN18"})
    assert "EN8" in str(err.value) and "EN19" in str(err.value) and "list" in str(err.value)
    assert "c45-qt" in nearest_names("c45q")


def test_every_designation_points_at_a_real_row_and_names_its_standard():
    keys = set(materials()) | set(grade_keys())
    for entry in material_names().values():
        assert entry.key in keys, entry.name
        assert entry.standard and entry.supply and entry.source
        for other in entry.others:
            assert other.split(" ")[0] in keys, (entry.name, other)


def test_listing_shows_each_size_ranged_grade_once_with_its_strength_range():
    rows = {row["key"]: row for row in listing()}
    assert "c45-qt" in rows and "c45-qt-16-40" not in rows
    assert rows["42crmo4-qt"]["yield_MPa"] == "500-900"  # EN 10083-3 rows 160-250 mm .. up to 16 mm
    assert "EN19" in rows["42crmo4-qt"]["also"]
    assert len(rows) == len(grade_keys())
