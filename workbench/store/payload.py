"""A job's inputs and whole result as one compressed blob (schema v4), and back.

Format byte 2 (written now): the JSON text ``[inputs, result]`` (sorted keys, no spaces) as one
Zstandard frame (RFC 8878; level 15, no checksum, size or dictionary id in the frame header)
against the raw-content dictionary ``payload_dict2.DICTIONARY_2``; about half the size of format 1.
Format byte 1 (still read): the same JSON compressed with raw deflate (RFC 1951) against the
preset dictionary ``payload_dict.DICTIONARY_1``. Nothing is dropped
or rounded: decoding gives back exactly the JSON that was encoded, so reopening a job compares the
whole stored result with today's. Format byte 0 is the same JSON uncompressed (for a future program
that finds no gain, and for tests).
"""

from __future__ import annotations

import json
import threading
import zlib
from collections.abc import Mapping
from typing import Any

from workbench.store.records import LogError

FORMAT_PLAIN = 0
FORMAT_DEFLATE_1 = 1
FORMAT_ZSTD_2 = 2
ZSTD_LEVEL = 15
"""Measured on the demo-like jobs: 15 is within 2 % of 19's size at a tenth of its time (0.6 ms)."""

_per_thread = threading.local()
"""Each thread's Zstandard compressor and decompressor (their objects are not thread-safe); the
dictionary is digested once per thread."""


def _dictionary() -> bytes:
    from workbench.store.payload_dict import DICTIONARY_1

    return DICTIONARY_1


def _zstd() -> Any:
    """This thread's ``(compressor, decompressor)`` for format 2 (zstandard imported lazily)."""
    pair = getattr(_per_thread, "zstd", None)
    if pair is None:
        import zstandard

        from workbench.store.payload_dict2 import DICTIONARY_2

        dictionary = zstandard.ZstdCompressionDict(DICTIONARY_2, dict_type=zstandard.DICT_TYPE_RAWCONTENT)
        dictionary.precompute_compress(level=ZSTD_LEVEL)
        packer = zstandard.ZstdCompressor(
            level=ZSTD_LEVEL, dict_data=dictionary,
            write_checksum=False, write_content_size=False, write_dict_id=False,
        )
        pair = (packer, zstandard.ZstdDecompressor(dict_data=dictionary))
        _per_thread.zstd = pair
    return pair


def payload_json(inputs: Mapping[str, str], result: Mapping[str, Any]) -> bytes:
    """The canonical JSON of one job's inputs and result (what a payload holds, and what the
    content id of a job without one is made from)."""
    try:
        return json.dumps([inputs, result], ensure_ascii=False, sort_keys=True, separators=(",", ":")).encode()
    except (TypeError, ValueError) as err:
        raise LogError(f"result: not JSON-ready ({err})") from None


def encode(inputs: Mapping[str, str], result: Mapping[str, Any]) -> bytes:
    """The stored blob of one job (format 2)."""
    return bytes([FORMAT_ZSTD_2]) + _zstd()[0].compress(payload_json(inputs, result))


def encode_deflate_1(inputs: Mapping[str, str], result: Mapping[str, Any]) -> bytes:
    """The blob of format 1, as earlier versions wrote it (kept for tests and comparisons)."""
    packer = zlib.compressobj(9, zlib.DEFLATED, -15, 9, zlib.Z_DEFAULT_STRATEGY, zdict=_dictionary())
    return bytes([FORMAT_DEFLATE_1]) + packer.compress(payload_json(inputs, result)) + packer.flush()


def decode(blob: bytes) -> tuple[dict[str, str], dict[str, Any]]:
    """``(inputs, result)`` from a stored blob; LogError if it is not one this program reads."""
    blob = bytes(blob)
    if not blob:
        raise LogError("stored job: empty payload")
    kind, body = blob[0], blob[1:]
    try:
        if kind == FORMAT_ZSTD_2:
            text = _unzstd(body)
        elif kind == FORMAT_DEFLATE_1:
            unpacker = zlib.decompressobj(-15, zdict=_dictionary())
            text = unpacker.decompress(body) + unpacker.flush()
        elif kind == FORMAT_PLAIN:
            text = body
        else:
            raise LogError(f"stored job: payload format {kind} is newer than this program")
        inputs, result = json.loads(text)
    except (zlib.error, ValueError, TypeError, _ZstdError) as err:
        raise LogError(f"stored job: unreadable payload ({err})") from None
    return inputs, result


class _ZstdError(Exception):
    """A format 2 body that is not a whole Zstandard frame."""


def _unzstd(body: bytes) -> bytes:
    import zstandard

    unpacker = _zstd()[1].decompressobj()
    try:
        text = unpacker.decompress(body)
    except zstandard.ZstdError as err:
        raise _ZstdError(str(err)) from None
    if not unpacker.eof:
        raise _ZstdError("cut short")
    return text
