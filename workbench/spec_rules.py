"""Doubtful readings of shaft sizes that do not stop a check: said in the job's ``warnings``.

- Bare numbers in an inch job (ours, stated): the CLI's rule is that a bare length is millimetres.
  Where another length of the same job is written in inches, a bare one is still read as mm, and
  the warning says so (``--overhang 4`` beside ``--pitch-diameter 6in`` is 4 mm, not 4 in).
- Hex sizes are ACROSS FLATS. A hex size that is no stock across-flats size, while the same figure
  across corners (s = AC x sqrt(3)/2) is one, was probably measured across corners: said so.
"""

from __future__ import annotations

import math
import re
from typing import Mapping

from workbench.core.tables import stock_sizes
from workbench.readings import note
from workbench.specs import _WORD_RE

_INCH = re.compile(r"(\d\s*(in|inch|inches)\b|\"|″|'')", re.I)
_LENGTH_KEYS = ("pitch_diameter", "overhang", "shaft", "candidate")
_UNIT_LETTER = re.compile(r"[A-Za-z\"″']")


def _is_inch(text: str) -> bool:
    return bool(_INCH.search(text))


def _size_part(key: str, text: str) -> str:
    """The size of a spec (after the profile word, before the words), or the whole length entry."""
    if key not in ("shaft", "candidate"):
        return text
    _, _, rest = " ".join(text.split()).partition(" ")
    match = _WORD_RE.search(" " + rest)
    return (" " + rest)[: match.start()].strip() if match else rest.strip()


def question_inch_job(key: str, text: str, inputs: Mapping[str, str]) -> None:
    """Warn when ``text`` (a length entry or a spec) has a bare number while another length of the
    job is in inches."""
    text = str(text or "").strip()
    if not text:
        return
    size = _size_part(key, text)
    if _UNIT_LETTER.search(size):
        return
    others = [k for k in _LENGTH_KEYS if k != key and _is_inch(str(inputs.get(k) or ""))]
    if others:
        from workbench.field_names import option_for

        note(key, f"{size!r} has no unit and is read as millimetres, but {option_for(others[0])} is in inches; "
                  f"write the unit ({size}in or {size}mm)")


def question_hex(key: str, geometry) -> None:
    """Warn when a hex size looks like an across-corners measurement (see the module docstring)."""
    system = "inch" if geometry.key_standard == "ansi" else "metric"
    sizes = [s.size_m for s in stock_sizes("hex", system)]
    if not sizes:
        return
    typed = geometry.size_m
    tol = 0.2e-3
    if any(abs(s - typed) <= tol for s in sizes):
        return
    flats = typed * math.sqrt(3.0) / 2.0
    match = [s for s in sizes if abs(s - flats) <= 0.3e-3 + 0.005 * s]
    if match:
        note(key, f"hex sizes are across flats; {typed * 1e3:.4g} mm is no stock hex, but measured across corners "
                  f"it is a {match[0] * 1e3:.4g} mm hex (across flats) — measure across the flats")
