"""Shaft spec strings (``workbench.specs``): every form in the module docstring, the words after
the size, the refusals, and the round trip ``parse_spec(format_spec(parse_spec(s)))``.

Inch sizes use 1 in = 0.0254 m exactly (NIST SP 811, Appendix B); tolerance 1e-12 relative.
"""

from __future__ import annotations

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from workbench.core.geometry import FINISHES, ShaftGeometry
from workbench.specs import MAX_SIZE_M, MIN_SIZE_M, format_spec, parse_spec
from workbench.units import QuantityError

IN = 0.0254  # m, exact (NIST SP 811 App. B)

# (spec, profile, size_m, second_m, keyed, key_standard, finish, shoulder)
DOCSTRING_FORMS = [
    ("round 35mm", "round", 0.035, 0.0, False, "iso", "machined", "none"),
    ("tube 60mm/50mm", "tube", 0.060, 0.050, False, "iso", "machined", "none"),
    ("square 30mm", "square", 0.030, 0.0, False, "iso", "machined", "none"),
    ("flat 50mm x 20mm", "flat", 0.050, 0.020, False, "iso", "machined", "none"),
    ("hex 27mm", "hex", 0.027, 0.0, False, "iso", "machined", "none"),
    ("round 1-1/4in keyed ground", "round", 1.25 * IN, 0.0, True, "ansi", "ground", "none"),
    ("round 40mm keyed sharp-shoulder", "round", 0.040, 0.0, True, "iso", "machined", "sharp"),
    ('round 1 1/4" keyseat 1/4x1/8in', "round", 1.25 * IN, 0.0, True, "ansi", "machined", "none"),
    ('round 1 1/4" key 5/16x5/16in', "round", 1.25 * IN, 0.0, True, "ansi", "machined", "none"),
    # size forms named in the docstring and DEVELOPERS.md
    ("round 1.25in", "round", 1.25 * IN, 0.0, False, "ansi", "machined", "none"),
    ("round 1.25 in", "round", 1.25 * IN, 0.0, False, "ansi", "machined", "none"),
    ('round 1 1/4"', "round", 1.25 * IN, 0.0, False, "ansi", "machined", "none"),
    ("round 35", "round", 0.035, 0.0, False, "iso", "machined", "none"),  # bare number: mm
    ("flat 50 x 20 mm", "flat", 0.050, 0.020, False, "iso", "machined", "none"),  # unit once
    ("tube 60/50", "tube", 0.060, 0.050, False, "iso", "machined", "none"),
    ("tube 60 mm / 50 mm", "tube", 0.060, 0.050, False, "iso", "machined", "none"),
    ("tube 2in/1-1/2in", "tube", 2 * IN, 1.5 * IN, False, "ansi", "machined", "none"),
    ("round 35mm round-shoulder", "round", 0.035, 0.0, False, "iso", "machined", "rounded"),
    ("ROUND 35mm KEYED", "round", 0.035, 0.0, True, "iso", "machined", "none"),
    ("  round   35mm  ", "round", 0.035, 0.0, False, "iso", "machined", "none"),
]


@pytest.mark.parametrize(
    ("spec", "profile", "size_m", "second_m", "keyed", "standard", "finish", "shoulder"), DOCSTRING_FORMS
)
def test_spec_forms(spec, profile, size_m, second_m, keyed, standard, finish, shoulder):
    g = parse_spec(spec)
    assert g.profile == profile
    assert g.size_m == pytest.approx(size_m, rel=1e-12)
    assert g.second_m == pytest.approx(second_m, rel=1e-12, abs=0.0)
    assert g.keyed is keyed
    assert g.key_standard == standard
    assert g.finish == finish
    assert g.shoulder == shoulder


def test_explicit_key_size():
    """``keyseat WxD`` is the seat; an inch seat's depth is at the side wall (ANSI B17.1), stored at
    the centreline: + r - sqrt(r^2 - (b/2)^2) = 0.625 - sqrt(0.625^2 - 0.125^2) = 0.012627 in (geometry)."""
    g = parse_spec('round 1 1/4" keyseat 1/4x1/8in')
    assert g.key_width_m == pytest.approx(0.25 * IN, rel=1e-12)
    assert g.key_depth_m == pytest.approx((0.125 + 0.625 - (0.625**2 - 0.125**2) ** 0.5) * IN, rel=1e-12)
    g = parse_spec("round 35mm keyseat 10x5mm")
    assert (g.key_width_m, g.key_depth_m) == (pytest.approx(0.010), pytest.approx(0.005))


def test_flat_is_stored_long_side_first():
    assert parse_spec("flat 20mm x 50mm") == parse_spec("flat 50mm x 20mm")


@pytest.mark.parametrize("finish", FINISHES)
def test_every_finish_word(finish):
    assert parse_spec(f"round 35mm {finish}").finish == finish


@pytest.mark.parametrize(
    ("spec", "fragment"),
    [
        ("", "is empty"),
        ("oval 35mm", "unknown profile"),
        ("round", "has no size"),
        ("round keyed", "has no size"),
        ("round 0mm", "greater than zero"),
        ("round 1.9mm", "too small"),
        ("round 3m", "too large"),
        ("round 35 kW", "is not a length"),
        ("round -35mm", "greater than zero"),
        ("round nan", "not a finite number"),
        ("tube 50mm/60mm", "inside diameter must be smaller"),
        ("tube 50mm/50mm", "inside diameter must be smaller"),
        ("tube 50mm", "outside/inside"),
        ("flat 50mm", "width x thickness"),
        ("round 35mm keyed polished", "unknown word"),
        ("round 35mm polished", "polished"),  # a stray first word is read as part of the unit
        ("round 35mm key", "'key' needs its size"),
        ("round 1/0in", "divides by zero"),
    ],
)
def test_bad_specs_name_the_field(spec, fragment):
    with pytest.raises(QuantityError) as info:
        parse_spec(spec, "candidate")
    assert info.value.field == "candidate"
    assert str(info.value).startswith("candidate: ")
    assert fragment in str(info.value)
    assert "\n" not in str(info.value)


def test_size_limits_match_the_module_constants():
    """The bench range is 2 mm .. 500 mm (MIN_SIZE_M, MAX_SIZE_M), both ends included."""
    assert parse_spec("round 2mm").size_m == pytest.approx(MIN_SIZE_M)
    assert parse_spec("round 500mm").size_m == pytest.approx(MAX_SIZE_M)


def _system(g: ShaftGeometry) -> str:
    return "inch" if g.key_standard == "ansi" else "metric"


@pytest.mark.parametrize("spec", [form[0] for form in DOCSTRING_FORMS])
def test_round_trip_of_every_form(spec):
    g = parse_spec(spec)
    text = format_spec(g, _system(g))
    assert parse_spec(text) == g


def test_format_spec_is_canonical():
    assert format_spec(parse_spec("round 40mm keyed sharp-shoulder")) == "round 40mm keyed sharp-shoulder"
    assert format_spec(parse_spec("flat 20 x 50 mm")) == "flat 50mm x 20mm"
    assert format_spec(parse_spec("round 1-1/4in keyed ground"), "inch") == "round 1-1/4in keyed ground"


_metric_mm = st.integers(min_value=20, max_value=999).map(lambda tenths: tenths / 10)  # 2.0 .. 99.9 mm
_words = st.lists(st.sampled_from(["keyed", *FINISHES, "sharp-shoulder", "round-shoulder"]), max_size=3)


@settings(max_examples=200, deadline=None)
@given(profile=st.sampled_from(["round", "square", "hex"]), size=_metric_mm, words=_words)
def test_round_trip_metric_tenths(profile, size, words):
    """Sizes to 0.1 mm below 100 mm survive format -> parse unchanged."""
    if profile != "round":
        words = [w for w in words if w != "keyed"]
    groups = {w: ("finish" if w in FINISHES else "shoulder" if w.endswith("shoulder") else w) for w in words}
    words = list({groups[w]: w for w in words}.values())  # each word once: a repeated word is refused
    g = parse_spec(f"{profile} {size:g}mm {' '.join(words)}")
    assert parse_spec(format_spec(g)) == g


@settings(max_examples=100, deadline=None)
@given(outside=st.integers(30, 999), wall=st.integers(5, 100))
def test_round_trip_metric_tube(outside, wall):
    inside = outside - wall
    if inside < 20:
        return
    g = parse_spec(f"tube {outside / 10:g}mm/{inside / 10:g}mm")
    assert parse_spec(format_spec(g)) == g
    assert g.size_m > g.second_m


@pytest.mark.parametrize("spec", ["round 1-1/16in", "round 1-3/16in", "square 2-5/16in"])
def test_round_trip_inch_sixteenths(spec):
    """Inch stock comes in 1/16 in steps (shop data, P); those sizes must round-trip exactly."""
    g = parse_spec(spec)
    assert parse_spec(format_spec(g, "inch")) == g


def test_round_trip_metric_above_100mm_with_hundredths():
    g = parse_spec("round 123.45mm")
    assert parse_spec(format_spec(g)) == g


@pytest.mark.parametrize("spec, word", [("round 35mm polished", "polished"), ("round 1 1/4 in shiny", "shiny"),
                                        ("square 30 mm keyd", "keyd")])
def test_a_stray_word_after_the_size_is_named_as_a_word(spec, word):
    """Regression: 'round 35mm polished' used to read as the unknown unit 'mm polished'."""
    with pytest.raises(QuantityError) as info:
        parse_spec(spec)
    assert info.value.field == "shaft"
    assert f"unknown word {word!r}" in str(info.value)


@pytest.mark.parametrize("spec, size_m", [("round 35MM", 0.035), ("round 1-1/4 IN", 0.03175)])
def test_shouted_units_are_read(spec, size_m):
    assert parse_spec(spec).size_m == pytest.approx(size_m, rel=1e-12)


def test_keyed_square_is_accepted_with_its_keyseat_at_the_turned_seat():
    g = parse_spec("square 30mm keyed")
    assert g.profile == "square" and g.keyed
    assert format_spec(g) == "square 30mm keyed"
