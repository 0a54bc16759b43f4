"""Stored results, payload format 2 (Zstandard against DICTIONARY_2) and the formats before it.

Checks against things outside the code: the Zstandard frame format (RFC 8878) as the ``zstandard``
library reads and writes it with its own defaults, and a log holding format-1 (raw deflate) rows
as earlier versions wrote them, on both engines."""

from __future__ import annotations

import hashlib
import json

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from store_helpers import JOB_INPUTS, result_for

from workbench.store import JobLog, payload
from workbench.store.records import LogError
from workbench.store.values import job_row


def test_dictionary_2_is_never_edited():
    # The digest written down when the dictionary was made (its module note says the same).
    from workbench.store.payload_dict2 import DICTIONARY_2

    assert len(DICTIONARY_2) == 140262
    digest = hashlib.sha256(DICTIONARY_2).hexdigest()
    assert digest == "2706556e4a935d0d9246c800baa0db32ad1cd9f627fa22de7dfc838f59b34392"


def test_format_2_is_a_plain_zstandard_frame_against_the_dictionary():
    import zstandard

    from workbench.store.payload_dict2 import DICTIONARY_2

    raw = zstandard.ZstdCompressionDict(DICTIONARY_2, dict_type=zstandard.DICT_TYPE_RAWCONTENT)
    inputs, result = JOB_INPUTS["demo"], result_for("demo")
    blob = payload.encode(inputs, result)
    assert blob[0] == payload.FORMAT_ZSTD_2
    # RFC 8878 3.1.1: a frame starts with the magic number 0xFD2FB528 (little-endian).
    assert blob[1:5] == bytes.fromhex("28b52ffd")
    text = zstandard.ZstdDecompressor(dict_data=raw).decompressobj().decompress(blob[1:])
    assert json.loads(text) == [inputs, result]
    # A frame made by the library with its own settings (checksum, size in the header) reads too.
    other = zstandard.ZstdCompressor(level=3, dict_data=raw).compress(payload.payload_json(inputs, result))
    assert payload.decode(bytes([payload.FORMAT_ZSTD_2]) + other) == (inputs, result)


def test_format_2_is_much_smaller_than_format_1():
    for name in ("demo", "mixer", "overloaded"):
        inputs, result = JOB_INPUTS[name], result_for(name)
        new, old = payload.encode(inputs, result), payload.encode_deflate_1(inputs, result)
        assert len(new) <= 0.8 * len(old), name  # issue 13 goal 5: the log must shrink by > 12 %


json_values = st.recursive(
    st.none() | st.booleans() | st.integers() | st.floats(allow_nan=False) | st.text(),
    lambda inner: st.lists(inner, max_size=4) | st.dictionaries(st.text(), inner, max_size=4),
    max_leaves=20,
)


@settings(max_examples=40, deadline=None)
@given(st.dictionaries(st.text(), st.text(), max_size=5), st.dictionaries(st.text(), json_values, max_size=5))
def test_format_2_gives_back_exactly_what_was_stored(inputs, result):
    assert payload.decode(payload.encode(inputs, result)) == (inputs, result)


@pytest.mark.parametrize("cut", [1, 3, 10])
def test_a_cut_or_spoiled_format_2_payload_is_refused(cut):
    blob = payload.encode(JOB_INPUTS["demo"], result_for("demo"))
    with pytest.raises(LogError, match="unreadable payload"):
        payload.decode(blob[:-cut])
    with pytest.raises(LogError, match="unreadable payload"):
        payload.decode(bytes([payload.FORMAT_ZSTD_2]) + b"not a frame")


def test_a_log_with_format_1_and_format_2_rows_reads_every_row(log_target):
    rows = []
    for n, name in enumerate(["demo", "mixer", "overloaded", "demo"]):
        inputs, result = JOB_INPUTS[name], result_for(name)
        old = payload.encode_deflate_1(inputs, result) if n % 2 == 0 else None
        rows.append(job_row(inputs, result, {"asset": f"A-{n}"}, stored_payload=old,
                            created_at=f"2025-01-0{n + 1}T00:00:00.000000+00:00"))
    with JobLog.open(log_target) as log:
        assert log.bulk_insert(rows) == 4
        log.save(JOB_INPUTS["mixer"], result_for("mixer"), asset="A-new")
    with JobLog.open(log_target) as log:
        found = {job.asset: job for job in log.search(limit=10)}
        assert set(found) == {"A-0", "A-1", "A-2", "A-3", "A-new"}
        for asset, name in [("A-0", "demo"), ("A-1", "mixer"), ("A-2", "overloaded"), ("A-new", "mixer")]:
            job = log.get(found[asset].id)
            assert job.inputs == JOB_INPUTS[name] and job.result == result_for(name), asset
