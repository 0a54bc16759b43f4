"""The ``shaftbench`` command seen from outside: options, exit codes, the JSON contract, the report.

Check values:
- T = P / omega with omega = 2 pi n / 60 (Shigley's Mechanical Engineering Design, 9th ed.,
  Sec. 3-8); trade form T[N m] = 9549.297 P[kW] / n[rpm] (shop data, C). Shaft torque behind a
  reduction = motor torque x ratio x efficiency; shaft speed = motor speed / ratio.
- Design torque = running x service factor; peak = running x peak factor (the job contract,
  DEVELOPERS.md). Relative tolerance 1e-12 for these identities, 1e-9 for the torque formula.
"""

from __future__ import annotations

import json
import math
import os
import subprocess
import sys

import pytest

from workbench.cli import EXIT_BAD_INPUT, EXIT_OK, build_parser, main

DEMO_POWER_W = 7500.0  # workbench/demo.py: 7.5 kW, 1460 rpm, ratio 3.2, 96 %, SF 1.5, peak 2.2
DEMO_SPEED_RPM = 1460.0
DEMO_RATIO = 3.2
DEMO_EFFICIENCY = 0.96

SHAFT_KEYS = (
    "role", "profile", "material", "torsion_constant_m4", "max_shear_stress_Pa", "bending_moment_Nm",
    "von_mises_stress_Pa", "twist_deg_per_m", "mass_kg_per_m", "endurance_limit_Pa", "Kf", "Kfs",
    "fatigue_criterion", "static_safety_factor", "fatigue_safety_factor", "verdict", "governing",
)
NUMERIC_SHAFT_KEYS = (
    "torsion_constant_m4", "max_shear_stress_Pa", "bending_moment_Nm", "von_mises_stress_Pa",
    "twist_deg_per_m", "mass_kg_per_m", "endurance_limit_Pa", "Kf", "Kfs",
    "static_safety_factor", "fatigue_safety_factor",
)
DRIVE_KEYS = ("running_torque_Nm", "design_torque_Nm", "peak_torque_Nm", "shaft_speed_rpm")

OPTIONS = {
    "--power": "power", "--speed": "speed", "--torque": "torque", "--ratio": "ratio",
    "--efficiency": "efficiency", "--service-factor": "service_factor", "--peak-factor": "peak_factor",
    "--shaft": "shaft", "--candidate": "candidate", "--material": "material",
    "--candidate-material": "candidate_material", "--required-sf": "required_sf",
}


def run_main(capsys, argv):
    """main(argv) -> (exit code, stdout, stderr); SystemExit from argparse counts as the code."""
    try:
        code = main(argv)
    except SystemExit as stop:
        code = stop.code
    out, err = capsys.readouterr()
    return code, out, err


def run_json(capsys, argv):
    code, out, err = run_main(capsys, [*argv, "--json"])
    assert code == EXIT_OK, err
    assert err == ""
    return json.loads(out)  # the whole of stdout is one JSON document


def is_number(value) -> bool:
    return isinstance(value, (int, float)) and not isinstance(value, bool)


def assert_bad_input(code, out, err, field):
    assert code == EXIT_BAD_INPUT
    assert out == ""
    lines = err.strip("\n").split("\n")
    assert len(lines) == 1, err
    assert "Traceback" not in err
    from workbench.field_names import option_for

    assert option_for(field) in lines[0], err  # messages name the CLI option, not the internal key


# --- options -----------------------------------------------------------------------------------


@pytest.mark.parametrize(("option", "key"), sorted(OPTIONS.items()))
def test_option_spelling(option, key):
    """Each option is spelled exactly and fills the job input key of the same meaning."""
    args = build_parser().parse_args(["check", option, "some text"])
    assert getattr(args, key) == "some text"


def test_every_option_reaches_the_job(capsys):
    argv = ["check", "--power", "11 kW", "--speed", "1470 rpm", "--ratio", "2", "--efficiency", "90%",
            "--service-factor", "1.25", "--peak-factor", "2.5", "--shaft", "round 45mm keyed",
            "--candidate", "hex 50mm", "--material", "1045-hr", "--candidate-material", "4140-qt650",
            "--required-sf", "2"]
    result = run_json(capsys, argv)
    drive = result["drive"]
    assert drive["power_W"] == 11000.0
    assert drive["motor_speed_rpm"] == 1470.0
    assert drive["ratio"] == 2.0
    assert drive["efficiency"] == pytest.approx(0.90)
    assert drive["service_factor"] == 1.25
    assert drive["peak_factor"] == 2.5
    assert result["settings"]["required_sf"] == 2.0
    existing, candidate = result["shafts"]
    assert (existing["profile"], existing["material"], existing["keyed"]) == ("round", "1045-hr", True)
    assert (candidate["profile"], candidate["material"]) == ("hex", "4140-qt650")
    assert result["inputs"]["candidate_material"] == "4140-qt650"


# --- the JSON contract -------------------------------------------------------------------------


@pytest.fixture(scope="module")
def demo_json():
    """`shaftbench check --demo --json` run as a separate process, parsed."""
    proc = subprocess.run(
        [sys.executable, "-m", "workbench", "check", "--demo", "--json"],
        capture_output=True, text=True, timeout=120,
    )
    assert proc.returncode == EXIT_OK, proc.stderr
    assert proc.stderr == ""
    assert proc.stdout.lstrip().startswith("{")
    return json.loads(proc.stdout)


def test_json_has_the_stable_keys_as_SI_numbers(demo_json):
    for key in DRIVE_KEYS:
        assert is_number(demo_json["drive"][key]), key
    assert [s["role"] for s in demo_json["shafts"]] == ["existing", "candidate"]
    for shaft in demo_json["shafts"]:
        missing = [k for k in SHAFT_KEYS if k not in shaft]
        assert not missing, missing
        for key in NUMERIC_SHAFT_KEYS:
            assert is_number(shaft[key]) and math.isfinite(shaft[key]), (shaft["role"], key, shaft[key])
        assert shaft["verdict"] in ("pass", "marginal", "fail")
        assert isinstance(shaft["governing"], str) and shaft["governing"]
        assert isinstance(shaft["fatigue_criterion"], str) and shaft["fatigue_criterion"]
        assert shaft["torsion_constant_m4"] > 0 and shaft["mass_kg_per_m"] > 0
    assert demo_json["verdict"] == demo_json["shafts"][-1]["verdict"]
    assert len(demo_json["cautions"]) >= 4


def test_json_torque_relations(demo_json):
    """Design = running x service factor; peak = running x peak factor (job contract), rel 1e-12;
    running = 9549.297 P[kW]/n x ratio x efficiency (Shigley 9th ed. Sec. 3-8), rel 1e-9."""
    drive = demo_json["drive"]
    running = drive["running_torque_Nm"]
    assert drive["design_torque_Nm"] == pytest.approx(running * drive["service_factor"], rel=1e-12)
    assert drive["peak_torque_Nm"] == pytest.approx(running * drive["peak_factor"], rel=1e-12)
    assert (drive["service_factor"], drive["peak_factor"]) == (1.5, 2.2)
    expected = 60000 / (2 * math.pi) * (DEMO_POWER_W / 1000) / DEMO_SPEED_RPM * DEMO_RATIO * DEMO_EFFICIENCY
    assert running == pytest.approx(expected, rel=1e-9)  # 150.6957 N*m
    assert drive["shaft_speed_rpm"] == pytest.approx(DEMO_SPEED_RPM / DEMO_RATIO, rel=1e-12)  # 456.25


def test_json_stress_follows_the_section(demo_json):
    """Pure torsion shear = design torque x (shear per unit torque) of the section, rel 1e-9."""
    design = demo_json["drive"]["design_torque_Nm"]
    for shaft in demo_json["shafts"]:
        assert shaft["max_shear_stress_Pa"] == pytest.approx(design * shaft["shear_per_torque_Pa_per_Nm"], rel=1e-9)


def test_torque_instead_of_power_and_speed(capsys):
    result = run_json(capsys, ["check", "--torque", "50 Nm", "--service-factor", "1.4",
                               "--peak-factor", "3", "--shaft", "round 25mm"])
    drive = result["drive"]
    assert drive["running_torque_Nm"] == pytest.approx(50.0, rel=1e-12)
    assert drive["design_torque_Nm"] == pytest.approx(70.0, rel=1e-12)
    assert drive["peak_torque_Nm"] == pytest.approx(150.0, rel=1e-12)
    assert result["shafts"][0]["role"] == "existing"
    # solid round, pure torsion: tau = 16 T / (pi d^3) (Shigley 9th ed. Eq. 3-37), rel 1e-9
    assert result["shafts"][0]["max_shear_stress_Pa"] == pytest.approx(16 * 70.0 / (math.pi * 0.025**3), rel=1e-9)


def test_hp_nameplate(capsys):
    """10 hp at 1750 rpm: T = 63025.36 x 10 / 1750 lbf*in = 360.145 lbf*in = 40.691 N*m
    (shop data C; 1 lbf*in = 0.11298483 N*m, NIST SP 811 App. B), rel 1e-6."""
    result = run_json(capsys, ["check", "--power", "10 hp", "--speed", "1750", "--shaft", "round 1in"])
    assert result["drive"]["running_torque_Nm"] == pytest.approx(63025.36 * 10 / 1750 * 0.11298483, rel=1e-6)


def test_candidate_only_job(capsys):
    result = run_json(capsys, ["check", "--torque", "80", "--candidate", "square 30mm"])
    assert [s["role"] for s in result["shafts"]] == ["candidate"]
    assert result["comparison"] is None


def test_required_sf_moves_the_verdict(capsys):
    """The same shaft passes at a low required SF and fails at a high one."""
    base = ["check", "--torque", "100", "--shaft", "round 30mm"]
    loose = run_json(capsys, [*base, "--required-sf", "1"])
    strict = run_json(capsys, [*base, "--required-sf", "10"])
    assert loose["verdict"] == "pass"
    assert strict["verdict"] == "fail"


def test_demo_options_override(capsys):
    result = run_json(capsys, ["check", "--demo", "--service-factor", "1.0"])
    assert result["drive"]["service_factor"] == 1.0
    assert result["inputs"]["service_factor"] == "1.0"


# --- the report -------------------------------------------------------------------------------


def test_report_carries_the_safety_cautions(capsys, monkeypatch):
    monkeypatch.setenv("COLUMNS", "240")
    code, out, err = run_main(capsys, ["check", "--demo"])
    assert code == EXIT_OK, err
    words = " ".join(out.replace("│", " ").split()).lower()
    for phrase in ("lock out", "guard", "not a design approval", "licensed engineer"):
        assert phrase in words, phrase
    assert "pass" in words or "fail" in words or "marginal" in words


def test_help_mentions_the_cautions(capsys):
    code, out, _ = run_main(capsys, ["--help"])
    assert code == 0
    text = " ".join(out.split()).lower()
    assert "not a design approval" in text and "licensed engineer" in text


def test_version(capsys):
    from workbench import __version__

    code, out, _ = run_main(capsys, ["--version"])
    assert code == 0
    assert __version__ in out


# --- substitute and stock ---------------------------------------------------------------------


def test_substitute_json(capsys):
    result = run_json(capsys, ["substitute", "--shaft", "round 35mm keyed"])
    assert result["existing"]["profile"] == "round"
    assert result["existing"]["size_m"] == pytest.approx(0.035)
    profiles = {row["profile"] for row in result["equivalents"]}
    assert {"square", "flat", "hex", "tube"} <= profiles
    for row in result["equivalents"]:
        assert row["basis"] in ("strength", "stiffness")
        assert is_number(row["size_m"]) and row["size_m"] > 0
        assert row["label"].startswith(row["profile"])
    # an equal-strength round is the plain round itself (ratio 1 to 1e-9)
    same = [r for r in result["equivalents"] if r["profile"] == "round" and r["basis"] == "strength"]
    assert same and same[0]["size_m"] == pytest.approx(0.035, rel=1e-9)
    assert result["cautions"]


def test_stock_json(capsys):
    result = run_json(capsys, ["stock", "--demo", "--profile", "square"])
    assert result["profile"] == "square" and result["system"] == "metric"
    rows = result["rows"]
    assert rows and all(r["spec"].startswith("square ") for r in rows)
    sizes = [r["size_m"] for r in rows]
    assert sizes == sorted(sizes)
    # without --all the list stops at the first pass, which is the smallest passing size
    assert rows[-1]["verdict"] == "pass"
    assert all(r["verdict"] != "pass" for r in rows[:-1])
    assert result["smallest"]["1045-cd"]["spec"] == rows[-1]["spec"]
    assert result["cautions"]


def test_stock_all_lists_more(capsys):
    short = run_json(capsys, ["stock", "--demo", "--profile", "square"])
    full = run_json(capsys, ["stock", "--demo", "--profile", "square", "--all"])
    assert len(full["rows"]) > len(short["rows"])


def test_stock_smallest_candidate_passes_as_a_check(capsys):
    """The smallest passing stock spec, fed back as the candidate, gets a pass."""
    stock = run_json(capsys, ["stock", "--demo", "--profile", "hex"])
    spec = stock["smallest"]["1045-cd"]["spec"]
    check = run_json(capsys, ["check", "--demo", "--candidate", spec])
    assert check["shafts"][-1]["spec"] == spec
    assert check["verdict"] == "pass"


# --- bad input --------------------------------------------------------------------------------


@pytest.mark.parametrize(
    ("argv", "field"),
    [
        (["check", "--demo", "--power", "35 mm"], "power"),
        (["check", "--demo", "--speed", "-1450"], "speed"),
        (["check", "--demo", "--shaft", "round 3m"], "shaft"),
        (["check", "--demo", "--candidate", "oval 30mm"], "candidate"),
        (["check", "--demo", "--material", "unobtainium"], "material"),
        (["check", "--demo", "--candidate-material", "unobtainium"], "candidate_material"),
        (["check", "--demo", "--required-sf", "0.5"], "required_sf"),
        (["check", "--torque", "50"], "shaft"),
        (["check", "--shaft", "round 35mm"], "power"),
        (["substitute", "--shaft", "tube 50mm/60mm"], "shaft"),
        (["stock", "--demo", "--profile", "oval"], "profile"),
    ],
)
def test_bad_input_exits_2_with_one_line(capsys, argv, field):
    assert_bad_input(*run_main(capsys, argv), field)


def test_unknown_option_is_a_usage_error(capsys):
    code, out, err = run_main(capsys, ["check", "--demo", "--bogus"])
    assert code == EXIT_BAD_INPUT
    assert len(err.strip().splitlines()) == 1 and "--bogus" in err


def test_bad_input_in_a_separate_process():
    proc = subprocess.run(
        [sys.executable, "-m", "workbench", "check", "--demo", "--power", "nan", "--json"],
        capture_output=True, text=True, timeout=120, env={**os.environ, "PYTHONWARNINGS": "ignore"},
    )
    assert_bad_input(proc.returncode, proc.stdout, proc.stderr, "power")
    assert proc.stderr.startswith("shaftbench: --power: ")


def test_unknown_material_message_quotes_the_key(capsys):
    code, out, err = run_main(capsys, ["check", "--demo", "--material", "nope"])
    assert code == EXIT_BAD_INPUT
    assert "'nope'" in err


def test_material_list_prints_every_typeable_name():
    """`--material list` lists the keys (a size-ranged grade once) and the designations."""
    import json as _json
    import subprocess as _sp
    import sys as _sys

    out = _sp.run([_sys.executable, "-m", "workbench", "check", "--material", "list", "--json"],
                  capture_output=True, text=True, check=True).stdout
    data = _json.loads(out)
    keys = [row["key"] for row in data["materials"]]
    assert "c45-qt" in keys and "1045-cd" in keys and "c45-qt-16-40" not in keys
    assert any(d["name"] == "EN19" and d["key"] == "42crmo4-qt" for d in data["designations"])


def test_stock_takes_units_and_still_the_old_system_option():
    import json as _json
    import subprocess as _sp
    import sys as _sys

    def labels(*options):
        out = _sp.run([_sys.executable, "-m", "workbench", "stock", "--demo", "--profile", "square",
                       "--json", *options], capture_output=True, text=True, check=True).stdout
        return _json.loads(out)["system"], [r["label"] for r in _json.loads(out)["rows"]]

    assert labels("--units", "inch") == labels("--system", "inch")
    assert labels("--units", "inch")[0] == "inch"
    help_text = _sp.run([_sys.executable, "-m", "workbench", "stock", "--help"],
                        capture_output=True, text=True).stdout
    assert "--units" in help_text and "--system" not in help_text  # one option shown


def test_substitute_rounds_to_a_caliper_step_up_and_shows_the_next_stock():
    """Equal strength in torsion of a plain round 40 mm by a square: side a with
    0.208 a^3 = pi d^3 / 16 (Roark 7th ed. Table 10.7 case 4 coefficient 0.208) gives a = 39.2 mm;
    the fitter's figure is the least size rounded UP to 0.1 mm."""
    import json as _json
    import subprocess as _sp
    import sys as _sys

    out = _sp.run([_sys.executable, "-m", "workbench", "substitute", "--shaft", "round 40mm", "--json"],
                  capture_output=True, text=True, check=True).stdout
    rows = [r for r in _json.loads(out)["equivalents"] if r["profile"] == "square" and r["basis"] == "strength"]
    (row,) = rows
    exact_mm = row["size_m"] * 1000
    assert abs(exact_mm - 39.23) < 0.2  # closed form above, 0.5 % tolerance for the 0.208 rounding
    shown = float(row["label"].split()[1].removesuffix("mm"))
    assert exact_mm <= shown < exact_mm + 0.1 + 1e-9
    assert row["next_stock"] == "square 40mm"


def test_double_d_flats_that_meet_are_refused_on_one_line(capsys):
    """Two flats each half the diameter deep leave nothing: refused naming --shaft, no traceback."""
    assert_bad_input(*run_main(capsys, ["check", "--power", "7.5", "--speed", "1450", "--shaft",
                                        "round 35mm double-d 17.5mm"]), "shaft")
