"""Shortening a text for a one-line message: cut at a word boundary and marked with '…'."""

from __future__ import annotations


def cut_words(text: str, limit: int) -> str:
    """``text`` on one line, at most ``limit`` characters; a longer text is cut after its last
    whole word that fits (a single over-long word is cut inside) and ends with '…'. Brackets
    opened before the cut are not closed: the '…' says the rest is left out."""
    text = " ".join(str(text).split())
    if len(text) <= limit:
        return text
    room = max(limit - 1, 1)
    head = text[:room]
    if text[room] != " " and " " in head:
        head = head[: head.rindex(" ")]
    return head.rstrip(" ,;:(") + "…"
