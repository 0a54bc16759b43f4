"""The table of common unit spellings (data/unit_spellings.json) gives pint's answers, and only those.

- Every entry is what pint and the full parse path of ``workbench.units`` give today, field by
  field (the table is rebuilt here by ``tools/make_unit_table.py`` and compared with the file).
- Every entry's factor is pint's own conversion to the kind's SI unit and its dimension pint's.
- A few factors are also checked against NIST SP 811 (2008), Appendix B: 1 in = 0.0254 m (exact),
  1 hp = 745.69987 W, 1 lbf*in = 0.11298483 N*m, 1 psi = 6894.757 Pa (8 significant digits given,
  relative tolerance 1e-7).
- The fast path can never skip a refusal: for spellings a field refuses, and for any spelling of a
  mixed vocabulary, the answer with the table is the answer without it (same value or same message).
- ``check --demo --json`` and an ordinary non-demo job import neither pint nor numpy/scipy.
"""

from __future__ import annotations

import importlib.util
import json
import pathlib
import subprocess
import sys
import textwrap

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from workbench import unit_table, units
from workbench.core.tables import data_dir
from workbench.demo import demo_inputs
from workbench.job import JobInputError, evaluate_inputs
from workbench.units import LENGTH, POWER, SPEED, STRESS, TORQUE, TWIST_RATE, Kind, QuantityError, parse_quantity

ROOT = pathlib.Path(__file__).resolve().parent.parent


def _maker():
    spec = importlib.util.spec_from_file_location("make_unit_table", ROOT / "tools" / "make_unit_table.py")
    module = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(module)
    return module


MAKER = _maker()
FILE = json.loads((data_dir() / unit_table.TABLE_FILE).read_text(encoding="utf-8"))
KINDS = {unit_table.kind_key(kind): kind for kind in MAKER.SPELLINGS}
ENTRIES = [
    (KINDS[section["kind"]], spelling, entry)
    for section in FILE["kinds"]
    for spelling, entry in section["spellings"].items()
]


def outcome(field: str, text: str, kind: Kind, default_unit: str, **bounds) -> tuple[str, object]:
    """("value", SI float) or ("refused", message) of one parse."""
    try:
        return "value", parse_quantity(field, text, kind, default_unit, **bounds)
    except QuantityError as err:
        return "refused", str(err)


def pint_outcome(*args, **kwargs):
    with unit_table.pint_only():
        return outcome(*args, **kwargs)


def test_the_table_has_the_common_spellings():
    """The spellings the demo and the defaults use are tabled (else the fast path would not help)."""
    tabled = {(kind.name, spelling) for kind, spelling, _ in ENTRIES}
    for pair in [("power", "kW"), ("power", "hp"), ("speed", "rpm"), ("length", "mm"), ("length", "in"),
                 ("torque", "N*m"), ("torque", "lbf*in"), ("stress", "MPa"), ("stress", "GPa"),
                 ("density", "kg/m^3"), ("twist per length", "deg/m")]:
        assert pair in tabled


def test_the_file_is_what_pint_and_the_full_path_give_today():
    """Rebuilt from pint and the full parse path (every field of each kind): identical to the file."""
    table, _ = MAKER.build()
    assert table["kinds"] == FILE["kinds"], "run: python tools/make_unit_table.py"


@pytest.mark.parametrize(("kind", "spelling", "entry"), ENTRIES, ids=[f"{k.name}:{s}" for k, s, _ in ENTRIES])
def test_every_entry_is_pints_conversion(kind, spelling, entry):
    """pint itself (no code of ours): the factor is Quantity(1, spelling).to(SI unit), same dimension."""
    ureg = units.registry()
    quantity = ureg.Quantity(1.0, spelling)
    assert quantity.check(kind.dimensionality)
    assert quantity.to(kind.si_unit).magnitude == pytest.approx(entry["factor"], rel=1e-12)
    assert dict(quantity.dimensionality) == pytest.approx(entry["dimension"])
    assert set(dict(quantity.dimensionality)) == set(entry["dimension"])


@pytest.mark.parametrize(
    ("kind", "spelling", "nist"),
    [(LENGTH, "in", 0.0254), (POWER, "hp", 745.69987), (TORQUE, "lbf*in", 0.11298483), (STRESS, "psi", 6894.757)],
)
def test_factors_against_nist_sp811(kind, spelling, nist):
    """NIST SP 811 (2008) App. B, 8 significant digits: rel. tolerance 1e-7."""
    assert unit_table.si_factor(kind, spelling) == pytest.approx(nist, rel=1e-7)


FIELD_KINDS = [(field, kind) for kind, fields in MAKER.FIELDS.items() for field in fields]
POSITIVE = st.floats(min_value=1e-6, max_value=1e7, allow_nan=False, allow_infinity=False)


@settings(max_examples=150, deadline=None)
@given(data=st.data(), value=POSITIVE)
def test_an_entry_reads_exactly_as_pint_reads_it(data, value):
    """Any value, any tabled spelling, any field of its kind: the same float, bit for bit."""
    kind, spelling, _ = data.draw(st.sampled_from(ENTRIES))
    field = data.draw(st.sampled_from(MAKER.FIELDS[kind]))
    text = f"{value!r} {spelling}"
    assert outcome(field, text, kind, "mm") == pint_outcome(field, text, kind, "mm")


# Spellings that a field refuses or that pint reads as another kind (issue 10's list and more):
# whatever the full path says about them, the table must say the same — it never answers them.
HOSTILE = [
    ("speed", SPEED, "50 Hz"), ("speed", SPEED, "1460 mHz"), ("speed", SPEED, "1450 percent/s"),
    ("speed", SPEED, "24 rev/s"), ("speed", SPEED, "1450 1/s"), ("speed", SPEED, "3000 kHz"),
    ("torque", TORQUE, "0.1 kWh"), ("torque", TORQUE, "50 kcal"), ("torque", TORQUE, "5 J"),
    ("torque", TORQUE, "100 N"), ("torque", TORQUE, "100 m"), ("power", POWER, "70 dBm"),
    ("power", POWER, "3 dBW"), ("power", POWER, "7.5 kWh"), ("power", POWER, "7.5 N*m"),
    ("twist_limit", TWIST_RATE, "0.25 1/m"), ("twist_limit", TWIST_RATE, "0.25 deg"),
    ("pitch_diameter", LENGTH, "200 mm^2"), ("overhang", LENGTH, "60 N*m"), ("shaft", LENGTH, "40 MPa"),
    ("material", STRESS, "350 N*m"), ("material", STRESS, "350 kg/m^3"),
]


@pytest.mark.parametrize(("field", "kind", "text"), HOSTILE, ids=[t for _, _, t in HOSTILE])
def test_the_fast_path_cannot_skip_a_refusal(field, kind, text):
    """The spelling is not tabled for this kind, and the answer is the full path's (refusal included)."""
    _, unit_text = units.split_number(field, text)
    assert unit_table.si_factor(kind, unit_text) is None
    assert outcome(field, text, kind, "mm") == pint_outcome(field, text, kind, "mm")


VOCABULARY = sorted({s for spellings in MAKER.SPELLINGS.values() for s in spellings}
                    | {text.split(" ", 1)[1] for _, _, text in HOSTILE}
                    | {"", "banana", "mm mm", "MM", "Nm", "kNm", "lb-in", "ft-lb", "\"", "KW", "HP", "rpm rpm"})


@settings(max_examples=200, deadline=None)
@given(field_kind=st.sampled_from(FIELD_KINDS), spelling=st.sampled_from(VOCABULARY),
       value=st.floats(min_value=-1e3, max_value=1e6, allow_nan=False, allow_infinity=False),
       bounded=st.booleans())
def test_any_spelling_in_any_field_reads_as_without_the_table(field_kind, spelling, value, bounded):
    """A mixed vocabulary (tabled, refused, junk) in every field, with and without bounds."""
    field, kind = field_kind
    bounds = {"low": 1e-3, "high": 1e3} if bounded else {}
    text = f"{value!r} {spelling}".strip()
    assert outcome(field, text, kind, "mm", **bounds) == pint_outcome(field, text, kind, "mm", **bounds)


def test_a_changed_kind_finds_no_table_section():
    """A kind whose definition changed after the table was made goes to pint (fail safe)."""
    changed = Kind("power", "W", "[power]", "7.5 kW only")
    assert unit_table.si_factor(POWER, "kW") == 1000.0
    assert unit_table.si_factor(changed, "kW") is None


def _job_outcome(inputs):
    try:
        return evaluate_inputs(inputs)
    except JobInputError as err:
        return str(err)


@pytest.mark.parametrize("inputs", [
    demo_inputs(),
    {"power": "10 hp", "speed": "1750 rpm", "mount": "sprocket", "pitch_diameter": "6 in",
     "overhang": "2-1/2in", "shaft": "round 1-1/4in keyed", "candidate": "square 1-1/4in",
     "twist_limit": "0.5 deg/ft"},
    {"torque": "400 lbf*in", "shaft": "tube 60mm/50mm", "material": "custom Sy=350MPa Sut=600MPa G=79GPa"},
    {"power": "7.5", "speed": "1460", "shaft": "hex 27", "candidate": "flat 50 x 20 mm"},
    {"power": "7.5 kW", "speed": "50 Hz", "shaft": "round 35mm"},
    {"torque": "0.1 kWh", "shaft": "round 35mm"},
])
def test_a_whole_job_reads_the_same_with_and_without_the_table(inputs):
    """The job contract's whole result (or its one-line refusal) does not depend on the table."""
    fast = _job_outcome(inputs)
    with unit_table.pint_only():
        slow = _job_outcome(inputs)
    assert fast == slow


def _modules_after(code: str) -> set[str]:
    probe = textwrap.dedent(code) + "\nimport json, sys\nprint(json.dumps(sorted(sys.modules)))\n"
    proc = subprocess.run([sys.executable, "-c", probe], capture_output=True, text=True, timeout=120)
    assert proc.returncode == 0, proc.stderr
    return set(json.loads(proc.stdout.strip().splitlines()[-1]))


@pytest.mark.parametrize("argv", [
    ["check", "--demo", "--json"],
    ["check", "--power", "11 kW", "--speed", "970 rpm", "--shaft", "round 45mm keyed", "--json"],
])
def test_a_common_check_imports_neither_pint_nor_numpy(argv):
    modules = _modules_after(f"""
        import contextlib, io
        from workbench.cli import main
        with contextlib.redirect_stdout(io.StringIO()) as out:
            assert main({argv!r}) == 0
        assert '"verdict"' in out.getvalue()
    """)
    assert not {"pint", "numpy", "scipy"} & modules


def test_an_uncommon_spelling_still_goes_to_pint():
    modules = _modules_after("""
        from workbench.units import SPEED, parse_quantity
        assert abs(parse_quantity("speed", "1460 revolution/minute", SPEED, "rpm") - 1460) < 1e-9
    """)
    assert "pint" in modules


TOKENS = ["1", "7.5", "1460", "1/4", "1-1/4", "1 1/4", " ", "", "mm", "MM", "in", "IN", "inch", '"', "″", "''",
          "Nm", "kNm", "N*m", "N·m", "lb-in", "lbf in", "in-lb", "ft.lb", "pound foot", "rpm", "RPM", "Rpm",
          "kW", "KW", "kw", "HP", "hp", "x", "/", "-", "MPa", "deg/m", "banana"]


@settings(max_examples=300, deadline=None)
@given(st.lists(st.sampled_from(TOKENS), min_size=1, max_size=5))
def test_skipping_the_rewrites_changes_no_reading(tokens):
    """split_number skips its spelling rewrites when one search finds nothing any would change:
    the reading (number and unit, or the refusal) is the one with every rewrite applied."""
    import re

    text = "".join(tokens)

    def read():
        try:
            return units.split_number("x", text)
        except QuantityError as err:
            return str(err)

    quick = read()
    saved = units._ANY_REWRITE
    units._ANY_REWRITE = re.compile("")  # matches every text: every rewrite applied
    try:
        full = read()
    finally:
        units._ANY_REWRITE = saved
    assert quick == full
