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
