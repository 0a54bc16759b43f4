"""A job's inputs and whole result as one compressed blob (schema v4), and back.

Format byte 1: the JSON text ``[inputs, result]`` (sorted keys, no spaces) compressed with raw
deflate (RFC 1951) against the preset dictionary ``payload_dict.DICTIONARY_1``. Nothing is dropped
or rounded: decoding gives back exactly the JSON that was encoded, so reopening a job compares the
whole stored result with today's. Format byte 0 is the same JSON uncompressed (for a future program
that finds no gain, and for tests).
"""

from __future__ import annotations

import json
import zlib
from collections.abc import Mapping
from typing import Any

from workbench.store.records import LogError

FORMAT_PLAIN = 0
FORMAT_DEFLATE_1 = 1


def _dictionary() -> bytes:
    from workbench.store.payload_dict import DICTIONARY_1

    return DICTIONARY_1


def payload_json(inputs: Mapping[str, str], result: Mapping[str, Any]) -> bytes:
    """The canonical JSON of one job's inputs and result (what a payload holds, and what the
    content id of a job without one is made from)."""
    try:
        return json.dumps([inputs, result], ensure_ascii=False, sort_keys=True, separators=(",", ":")).encode()
    except (TypeError, ValueError) as err:
        raise LogError(f"result: not JSON-ready ({err})") from None


def encode(inputs: Mapping[str, str], result: Mapping[str, Any]) -> bytes:
    """The stored blob of one job (format 1)."""
    packer = zlib.compressobj(9, zlib.DEFLATED, -15, 9, zlib.Z_DEFAULT_STRATEGY, zdict=_dictionary())
    return bytes([FORMAT_DEFLATE_1]) + packer.compress(payload_json(inputs, result)) + packer.flush()


def decode(blob: bytes) -> tuple[dict[str, str], dict[str, Any]]:
    """``(inputs, result)`` from a stored blob; LogError if it is not one this program reads."""
    blob = bytes(blob)
    if not blob:
        raise LogError("stored job: empty payload")
    kind, body = blob[0], blob[1:]
    try:
        if kind == FORMAT_DEFLATE_1:
            unpacker = zlib.decompressobj(-15, zdict=_dictionary())
            text = unpacker.decompress(body) + unpacker.flush()
        elif kind == FORMAT_PLAIN:
            text = body
        else:
            raise LogError(f"stored job: payload format {kind} is newer than this program")
        inputs, result = json.loads(text)
    except (zlib.error, ValueError, TypeError) as err:
        raise LogError(f"stored job: unreadable payload ({err})") from None
    return inputs, result
