"""Bare lengths on the sheet follow the display: millimetres in metric, inches in inch.

The CLI keeps one rule (a bare length is mm). On the workbench a fitter who has switched the
display to inch (F5) types inch sizes; a bare number there is read as inches and goes into the job
WITH its unit (``1.25`` -> ``1.25in``), so the job log holds what was meant and a saved job reopens
the same in either display. A bare number that is an implausibly small millimetre size but a
plausible inch size gets a "did you mean inches?" in its error line. Switching the display writes
the old unit into every bare length already on the sheet, so F5 never changes the job.
"""

from __future__ import annotations

import re

#: sheet fields that hold one length (the shaft blocks' size fields are handled by the spec builder)
LENGTH_KEYS = frozenset({
    "pitch_diameter", "overhang", "bearing_span", "load_from_bearing", "hub_length", "journal", "seat",
    "fillet", "candidate_journal", "candidate_seat", "candidate_fillet",
})

_BARE = re.compile(r"^(?:\d+(?:\.\d*)?|\.\d+)$")
_FRACTION = re.compile(r"^(?:\d+[- ])?\d+/\d+$")
_SHAPE_WORDS = ("d-flat", "double-d", "radius", "chamfer")

#: largest bare value taken as a likely inch size in a "did you mean" (a 12 in shaft is large)
LIKELY_INCH_MAX = 12.0


def is_bare(text: str) -> bool:
    """True for a number or a fraction with no unit (``40``, ``1.25``, ``1-1/4``, ``1 1/4``, ``5/8``)."""
    text = text.strip()
    return bool(_BARE.match(text) or _FRACTION.match(text))


def bare_length(text: str, system: str) -> str:
    """``text`` with ``in`` added when the display is inch and it is a bare length."""
    text = text.strip()
    return f"{text}in" if system == "inch" and is_bare(text) else text


def pin_unit(text: str, system: str) -> str:
    """``text`` with the display's unit written out when it is a bare length (``2`` -> ``2in`` in
    inch, ``40`` -> ``40mm`` in metric; a bare fraction in metric stays, to be refused): used when
    the display changes, so that what is on the sheet keeps the meaning it was typed with."""
    text = text.strip()
    if system == "inch":
        return bare_length(text, system)
    return f"{text}mm" if _BARE.match(text) else text


def pin_size_unit(size: str, system: str) -> str:
    """:func:`pin_unit` for a shaft Size field (its size and the sizes after shape words)."""
    tokens = size_text(size, system).split() if system == "inch" else size.split()
    out = []
    for index, token in enumerate(tokens):
        after_word = index > 0 and tokens[index - 1].lower() in _SHAPE_WORDS
        out.append(pin_unit(token, system) if index == 0 or after_word else token)
    return " ".join(out)


def size_text(size: str, system: str) -> str:
    """A shaft Size field for the spec builder: in inch display, the bare size and the bare size
    after each shape word get ``in`` (``1.5 d-flat 0.1`` -> ``1.5in d-flat 0.1in``)."""
    if system != "inch":
        return size
    tokens = size.split()
    # a mixed fraction typed with a space (1 1/4) is one size
    if len(tokens) >= 2 and tokens[0].isdigit() and _FRACTION.match(tokens[1]):
        tokens = [f"{tokens[0]}-{tokens[1]}", *tokens[2:]]
    out = []
    for index, token in enumerate(tokens):
        after_word = index > 0 and tokens[index - 1].lower() in _SHAPE_WORDS
        out.append(bare_length(token, system) if index == 0 or after_word else token)
    return " ".join(out)


def hint_for(hint: str, system: str) -> str:
    """A field hint that names the bare unit of the display."""
    return hint.replace("bare = mm", "bare = in") if system == "inch" else hint


def inch_guess(typed: str, message: str, system: str) -> str:
    """``message`` plus "did you mean … in?" when a bare size read as mm is too small and would be
    a plausible inch size; else ``message`` as it is."""
    if system == "inch" or "too small" not in message:
        return message
    first = typed.split()[0] if typed.split() else ""
    if not is_bare(first):
        return message
    try:
        value = _value(first)
    except (ValueError, ZeroDivisionError):
        return message
    if 0.1 <= value <= LIKELY_INCH_MAX:
        return f"{message} — did you mean {first} in? (write {first}in, or F5 for inch: bare = in)"
    return message


def _value(text: str) -> float:
    if "-" in text:
        whole, _, fraction = text.partition("-")
        return float(whole) + _fraction_value(fraction)
    return _fraction_value(text) if "/" in text else float(text)


def _fraction_value(text: str) -> float:
    numerator, _, denominator = text.partition("/")
    return float(numerator) / float(denominator)
