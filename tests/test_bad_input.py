"""Whatever a person types into one field, the job contract either computes or refuses that field.

Property: starting from a valid job, replace ONE input with arbitrary text. ``evaluate_inputs``
then returns a JSON-ready result (no NaN or infinity anywhere) or raises ``JobInputError`` whose
``.field`` is the key that was changed and whose ``str()`` is one line starting with that key.
No other exception may escape. The same holds through the command line (exit 2, one line on
stderr, no traceback).
"""

from __future__ import annotations

import json
import subprocess
import sys

import pytest
from hypothesis import HealthCheck, example, given, settings
from hypothesis import strategies as st

from workbench.cli import EXIT_BAD_INPUT, main
from workbench.field_names import option_for
from workbench.job import INPUT_KEYS, JobInputError, evaluate_inputs, stock_inputs, substitute_inputs

POWER_JOB = {
    "power": "7.5 kW", "speed": "1460 rpm", "ratio": "3.2", "efficiency": "96%", "service_factor": "1.5",
    "peak_factor": "2.2", "mount": "vbelt", "pitch_diameter": "200 mm", "overhang": "60 mm",
    "shaft": "round 40mm keyed", "candidate": "square 45mm", "material": "1045-cd",
    "candidate_material": "4140-qt650", "required_sf": "1.5", "criterion": "goodman",
    "reliability": "0.9", "twist_limit": "0.5 deg/m",
}
TORQUE_JOB = {
    "torque": "200 Nm", "shaft": "tube 60mm/30mm keyed", "candidate": "flat 100mm x 65mm",
    "mount": "gear", "pitch_diameter": "120", "overhang": "40", "material": "4140-qt650",
}
# A size-ranged grade (c45-qt) is left out of the bases: a changed shaft size may then legitimately
# be refused as "material has no row for this size", which names the material, not the shaft.

# A blank field is "not given": the refusal may then name the field that becomes required.
REQUIRED_WHEN_BLANK = {"torque": {"power"}}
# The candidate is turned to the journals and seat of the shaft as found: a shaft as found that
# the candidate bar cannot be turned to is refused naming the candidate (the bar that falls short).
CROSS_FIELD = {"shaft": {"candidate"}}

UNITS = [
    "", "kW", "W", "hp", "HP", "rpm", "Hz", "mm", "m", "in", "inch", '"', "''", "ft", "Nm", "N*m", "kNm",
    "lbf*in", "lb-ft", "MPa", "ksi", "GPa", "kg/m^3", "deg/m", "rad", "%", "s", "kg", "J", "V",
    "mph", "degC", "furlong", "/", "**", "^2", "x 20mm", "/50mm", "keyed", "mm keyed ground",
]
WEIRD = [
    "nan", "NaN", "-nan", "inf", "-inf", "Infinity", "1e400", "-1e400", "1e-400", "0", "-0", "-1",
    "0/0", "1/0", "1-1/0", "9" * 400, "1e308", "-1e308", "0x1F", "1_000", "١٤٥٠", "½", "²",
    "[bold red]7.5[/]", "<b>7.5 kW</b>", "$(echo hi)", "\x1b[31m7.5\x1b[0m", "7.5\nkW", "7.5\x00kW",
    "round 35mm\nkeyed", "custom", "custom Sy=0 Sut=0", "custom Sy=nan Sut=inf", "custom Sy=600MPa Sut=400MPa",
    "custom Sy=1kW Sut=2kW", "custom Sy=350MPa Sut=600MPa rho=-1", "custom ==", "tube 1e400mm/1mm",
    "flat nan x 20", "round 35mm key 1e9x1e9mm", "round 35mm key 0x0mm", "round 35mm key -1x-1",
    "hex 2mm keyed", "round 2mm keyed", "round 500mm keyed", "tube 500mm/499.99mm keyed",
    "flat 500mm x 2mm", "square 1/2in keyed", "100%", "1000%", "-5%", "nan%", "%", "1e-9",
]

numbers = st.one_of(
    st.floats(allow_nan=True, allow_infinity=True).map(repr),
    st.integers(min_value=-(10**30), max_value=10**30).map(str),
    st.fractions(max_denominator=64).map(lambda f: f"{f.numerator}/{f.denominator}"),
    st.sampled_from(["0", "-0", "1e-300", "1e300", ".5", "5.", "+7", "1-1/4", "1 1/4", "3/0"]),
)
with_unit = st.builds(lambda n, sep, u: f"{n}{sep}{u}", numbers, st.sampled_from(["", " ", "  "]), st.sampled_from(UNITS))
spec_like = st.builds(
    lambda p, s, w: f"{p} {s} {w}".strip(),
    st.sampled_from(["round", "tube", "square", "flat", "hex", "Round", "oval", ""]),
    with_unit,
    st.sampled_from(["", "keyed", "key 10x5mm", "ground", "forged", "sharp-shoulder", "key", "polished"]),
)
any_text = st.one_of(
    st.text(max_size=30),
    st.text(alphabet=st.characters(codec="ascii"), max_size=20),
    with_unit,
    spec_like,
    st.sampled_from(WEIRD),
)


def assert_refusal_names(err: JobInputError, key: str) -> None:
    text = str(err)
    assert err.field == key, (err.field, key, text)
    assert text.startswith(f"{key}: "), text
    assert len(text.splitlines()) == 1, repr(text)


def check_one_field(base: dict, key: str, value: str) -> None:
    inputs = {**base, key: value}
    try:
        result = evaluate_inputs(inputs)
    except JobInputError as err:
        if not value.strip() and err.field in REQUIRED_WHEN_BLANK.get(key, ()):
            assert_refusal_names(err, err.field)
        elif err.field in CROSS_FIELD.get(key, ()):
            assert_refusal_names(err, err.field)
            assert "cannot give" in err.message or "no wall" in err.message
        else:
            assert_refusal_names(err, key)
        return
    json.dumps(result, allow_nan=False)  # raises ValueError on NaN/inf anywhere in the result
    assert result["verdict"] in ("pass", "marginal", "fail")


SETTINGS = settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.too_slow])


@pytest.mark.parametrize("key", INPUT_KEYS)
@SETTINGS
@given(value=any_text)
@example(value="nan")
@example(value="inf")
@example(value="-1")
@example(value="0")
@example(value="1e400")
@example(value="35 mm")
@example(value="7.5 kW")
@example(value="<b>[red]x[/red]</b>")
def test_one_broken_field_power_job(key, value):
    check_one_field(POWER_JOB, key, value)


@pytest.mark.parametrize("key", [k for k in INPUT_KEYS if k != "power"])  # power + torque is refused
@SETTINGS
@given(value=any_text)
@example(value="nan")
@example(value="-1450")
@example(value="1450 kW")
def test_one_broken_field_torque_job(key, value):
    check_one_field(TORQUE_JOB, key, value)


def test_power_with_a_torque_is_refused_as_torque():
    with pytest.raises(JobInputError) as info:
        evaluate_inputs({**TORQUE_JOB, "power": "7.5 kW", "speed": "1450"})
    assert_refusal_names(info.value, "torque")


def test_unknown_key_is_named():
    with pytest.raises(JobInputError) as info:
        evaluate_inputs({**POWER_JOB, "colour": "red"})
    assert_refusal_names(info.value, "colour")


@settings(max_examples=150, deadline=None)
@given(value=st.one_of(spec_like, st.sampled_from(WEIRD), st.text(max_size=20)))
def test_substitute_refuses_only_the_shaft(value):
    try:
        result = substitute_inputs({"shaft": value})
    except JobInputError as err:
        assert_refusal_names(err, "shaft")
        return
    json.dumps(result, allow_nan=False)
    assert result["equivalents"]


@settings(max_examples=40, deadline=None)
@given(value=st.one_of(with_unit, st.sampled_from(WEIRD)))
def test_stock_refuses_only_the_torque(value):
    try:
        result = stock_inputs({"torque": value}, "round")
    except JobInputError as err:
        assert_refusal_names(err, "torque")
        return
    json.dumps(result, allow_nan=False)


# --- the explicit cases, through the command line --------------------------------------------

EXPLICIT = [
    (["--shaft", "round 3m"], "shaft", "too large"),
    (["--power", "35 mm"], "power", "not a power"),
    (["--speed", "-1450"], "speed", "greater than zero"),
    (["--power", "nan"], "power", "not a finite number"),
    (["--power", "inf"], "power", "not a finite number"),
    (["--shaft", "round 0mm"], "shaft", "greater than zero"),
    (["--shaft", "tube 50mm/60mm"], "shaft", "inside diameter"),
    (["--candidate", "<b>square</b> 30mm"], "candidate", "unknown profile"),
    (["--efficiency", "150%"], "efficiency", "out of range"),
    (["--ratio", "0"], "ratio", "out of range"),
    (["--twist-limit", "1 kW"], "twist_limit", "not a twist"),
    (["--material", "custom Sy=600MPa Sut=400MPa"], "material", "Sy must not exceed Sut"),
]


@pytest.mark.parametrize(("extra", "field", "fragment"), EXPLICIT)
def test_explicit_cases_through_main(capsys, extra, field, fragment):
    try:
        code = main(["check", "--demo", *extra, "--json"])
    except SystemExit as stop:  # pragma: no cover - a usage error would surface here
        code = stop.code
    out, err = capsys.readouterr()
    assert code == EXIT_BAD_INPUT
    assert out == ""
    assert "Traceback" not in err
    assert len(err.splitlines()) == 1, err
    assert err.startswith(f"shaftbench: {option_for(field)}: "), err
    assert fragment in err


@pytest.mark.parametrize(("extra", "field", "fragment"), EXPLICIT[:4])
def test_explicit_cases_in_a_process(extra, field, fragment):
    proc = subprocess.run(
        [sys.executable, "-m", "workbench", "check", "--demo", *extra],
        capture_output=True, text=True, timeout=120,
    )
    assert proc.returncode == EXIT_BAD_INPUT
    assert proc.stdout == ""
    assert "Traceback" not in proc.stderr
    assert proc.stderr.count("\n") == 1
    assert proc.stderr.startswith(f"shaftbench: {option_for(field)}: ") and fragment in proc.stderr


@pytest.mark.parametrize("grade", ["1045", "c45"])
def test_ambiguous_grade_is_refused(grade):
    with pytest.raises(JobInputError) as info:
        evaluate_inputs({"torque": "50", "shaft": "round 25mm", "material": grade})
    assert_refusal_names(info.value, "material")
