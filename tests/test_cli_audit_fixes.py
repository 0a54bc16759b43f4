"""CLI wording found by an outside audit: help texts, refusal reasons and option names."""

from __future__ import annotations

import pytest

from workbench.cli import EXIT_BAD_INPUT, build_parser, main


def test_check_help_says_hex_sizes_are_across_flats():
    """A hex is sized across flats (the trade's and ISO 1035-3's convention); a size taken across
    corners reads 15 % larger (1/cos 30 deg), so the help of both specs says which is meant."""
    check = build_parser()._subparsers._group_actions[0].choices["check"]
    helps = {a.dest: a.help for a in check._actions}
    assert "'hex 27mm' (across flats)" in helps["shaft"]
    assert "'hex 27mm' (across flats)" in helps["candidate"]


def test_a_hex_journal_refusal_says_across_flats(capsys):
    code = main(["check", "--torque", "100 N*m", "--shaft", "round 35mm keyed", "--candidate", "hex 35mm"])
    err = capsys.readouterr().err
    assert code == EXIT_BAD_INPUT and err.startswith("shaftbench: --candidate: ")
    assert "across flats" in err and len(err.strip().splitlines()) == 1


@pytest.mark.parametrize("speed, hz", [("1450 percent/s", False), ("1450 1/s", False),
                                       ("50 Hz", True), ("1460 mHz", True)])
def test_a_speed_refusal_gives_its_own_reason(capsys, speed, hz):
    """Hz is refused as the supply frequency; a rate with no revolutions (percent/s, 1/s) is refused
    as no speed unit at all, not with the Hz reason (rules of workbench.field_rules)."""
    code = main(["check", "--torque", "100 N*m", "--speed", speed, "--shaft", "round 35mm"])
    err = capsys.readouterr().err
    assert code == EXIT_BAD_INPUT and err.startswith("shaftbench: --speed: ") and len(err.strip().splitlines()) == 1
    assert ("supply frequency" in err) is hz
    if not hz:
        assert "not a speed unit" in err and "revolutions per time" in err


@pytest.mark.parametrize("argv, name", [(["35mm", "zz6"], "CLASS"), (["0mm", "h6"], "SIZE")])
def test_fit_names_its_positional_arguments_as_the_usage_line_does(capsys, argv, name):
    """`fit SIZE CLASS` takes positional arguments: a refusal names SIZE / CLASS, never an option
    (--size / --class) that does not exist."""
    assert main(["fit", *argv]) == EXIT_BAD_INPUT
    err = capsys.readouterr().err
    assert err.startswith(f"shaftbench: {name}: ") and "--size" not in err and "--class" not in err
