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


def test_log_import_of_a_huge_integer_cuts_its_message_at_a_word(tmp_path, capsys):
    """A 5000-digit integer is past Python's 4300-digit conversion limit; the refusal is one line,
    exit 2, and its quoted reason is cut after a whole word with '…' (was 'value has 5000 di)')."""
    source = tmp_path / "big.json"
    source.write_text('{"jobs": [{"x": ' + "9" * 5000 + "}]}")
    code = main(["log", "import", str(source), "--log", str(tmp_path / "log.sqlite")])
    err = capsys.readouterr().err
    assert code == EXIT_BAD_INPUT and len(err.strip().splitlines()) == 1 and "Traceback" not in err
    assert "…" in err and " di)" not in err and "5000…" in err


from hypothesis import given, settings  # noqa: E402
from hypothesis import strategies as st  # noqa: E402


@settings(max_examples=200, deadline=None)
@given(words=st.lists(st.text(alphabet="abcdefghij0123456789()", min_size=1, max_size=12), min_size=1, max_size=30),
       limit=st.integers(min_value=5, max_value=120))
def test_cut_words_keeps_whole_words_and_the_limit(words, limit):
    """Property of workbench.text_cut.cut_words: at most `limit` characters, one line, unchanged when
    it fits, else ends in '…' after whole words only (unless the first word alone is too long)."""
    from workbench.text_cut import cut_words

    text = " ".join(words)
    out = cut_words(text, limit)
    assert len(out) <= limit and "\n" not in out
    if len(text) <= limit:
        assert out == text
        return
    assert out.endswith("…")
    kept = out[:-1].split()
    n = len(kept)
    assert n >= 1 and kept[:-1] == words[: n - 1]
    if n > 1:  # a later word is never cut inside (only trailing brackets/commas are dropped)
        assert kept[-1] == words[n - 1].rstrip(",;:(")
    else:
        assert words[0].startswith(kept[0])
