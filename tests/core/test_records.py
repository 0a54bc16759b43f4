"""Frozen records built without their ``__init__`` equal the ones built with it (ours; no outside source)."""

from __future__ import annotations

from dataclasses import dataclass, fields

import pytest

from workbench.core.checks import SectionFigures
from workbench.core.geometry import ShaftGeometry
from workbench.core.records import built, built_from
from workbench.core.steps import Step


def test_a_built_step_equals_and_hashes_as_the_constructed_one():
    g = ShaftGeometry("round", 0.04, keyed=True)
    args = ("seat", "hub seat", 0.0, 0.05, 0.04, g, 0.0, 0.05, 0.001, True, 0.045, True, "sharp")
    made, fast = Step(*args), built(Step, *args)
    assert fast == made and hash(fast) == hash(made) and repr(fast) == repr(made)
    assert list(vars(fast)) == [f.name for f in fields(Step)] == list(vars(made))
    with pytest.raises(AttributeError):  # still frozen
        fast.kind = "body"


def test_built_from_takes_every_field_in_order_only():
    values = {f.name: float(i) for i, f in enumerate(fields(SectionFigures))}
    assert built_from(SectionFigures, values) == SectionFigures(**values)
    reordered = dict(reversed(list(values.items())))
    with pytest.raises(TypeError):
        built_from(SectionFigures, reordered)
    with pytest.raises(TypeError):
        built(SectionFigures, 1.0, 2.0)


def test_classes_whose_init_does_more_are_refused():
    @dataclass(frozen=True)
    class Checked:
        a: float

        def __post_init__(self):
            if self.a < 0:
                raise ValueError

    @dataclass
    class Loose:
        a: float

    for cls in (Checked, Loose):
        with pytest.raises(TypeError):
            built(cls, 1.0)


def test_the_step_wrapper_names_the_fields_in_their_order():
    # steps._step passes its arguments to built() by position: a field added to or moved in Step
    # must show here, not as a silently shifted value.
    import inspect

    from workbench.core.steps import _step

    assert list(inspect.signature(_step).parameters) == [f.name for f in fields(Step)]
