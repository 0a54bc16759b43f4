"""The v3 text index: same answers as a plain substring test, kept in step with every change.

The reference for every filter is the rule stated in ``JobLog.search``: each word of the filter,
case-folded, is a substring of the job's case-folded search text (workbench/store/search_words.py:
asset, location, notes, material, who, what was fitted, outcome, specs, verdict words).
"""

from __future__ import annotations

import sqlite3
from contextlib import closing

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st
from store_helpers import JOB_INPUTS, result_for

from workbench.store import JobLog, migrations, schema, text_search as log_module
from workbench.store.search_words import job_search_text

needs_index = pytest.mark.skipif(
    not migrations.text_index_supported(),
    reason=f"SQLite {sqlite3.sqlite_version} has no FTS5 trigram tokenizer (the LIKE path is used)",
)

# Text a fitter might type, plus characters that mean something to FTS5, LIKE, SQL or Rich markup.
NOTES = [
    ("CV-07 head drive", "Brindlemoor Quarry, line 3", "keyseat wear"),
    ("Pump P-101", "Boiler house", 'said "replace NEAR coupling"'),
    ("FAN*2", "Roof AND plant", "-bearing noise- (NDE)"),
    ("mixer M-3", "Batch plant", "NOT balanced; OR re-check ^top"),
    ("[bold]CV-08[/]", "x'); DROP TABLE jobs; --", "100% load, 5_6 shift"),
    ("Straße 4 Förderband", "ÅRHUS hall", "ΣΊΣΥΦΟΣ lift; İzmir spare"),
    ("col:value", "NEAR(a b, 2)", 'quote "" twice, tab\there'),
    ("hex 27mm", "north yard", "sheared at shoulder"),
]
TRICKY_FILTERS = [
    '"', '""', '"replace', 'near', 'NEAR', "NEAR(a", "and", "AND plant", "or", "NOT", "-", "-bearing",
    "*", "fan*", "fan*2", "^top", "col:value", "col:", ":", "(nde)", "(", ")", "%", "_", "5_6", "100%",
    "drop table", "'); drop", "[bold]", "[/]", "strasse", "STRAßE", "förder", "FÖRDER", "århus",
    "σίσυφος", "İzmir", "izmir", "tab", "\t", "line 3", "3", "li", "p-", "p-101", "zzzz", "e", "",
    "pump 4140", "4140-qt425", "1045", "\x00", "pump\x00boiler",
]


def _reference(jobs: dict[int, str], text: str) -> set[int]:
    words = text.replace("\x00", " ").casefold().split()  # NUL separates words, as documented
    return {job_id for job_id, searched in jobs.items() if all(w in searched for w in words)}


def _searched(record) -> str:
    meta = {name: getattr(record, name) for name in ("asset", "location", "note", "material", "by", "fitted",
                                                     "outcome")}
    return job_search_text(meta, record.inputs, record.result)


def _fill(log: JobLog, copies: int = 1) -> dict[int, str]:
    """Save NOTES (``copies`` times) with the real results; every third job goes to the bin."""
    names = list(JOB_INPUTS)
    log.import_jobs(
        {"inputs": JOB_INPUTS[names[i % len(names)]], "result": result_for(names[i % len(names)]),
         "asset": a, "location": loc, "note": n}
        for i, (a, loc, n) in enumerate(NOTES * copies)
    )
    jobs = {}
    for record in log.search(limit=10_000, deleted=None):
        jobs[record.id] = _searched(record)
        if record.id % 3 == 0:
            log.delete(record.id)
    return jobs


def _live(log: JobLog, ids: set[int]) -> set[int]:
    return {i for i in ids if not log.get(i).deleted}


def index_in_step(log: JobLog) -> bool:
    """True if the index holds exactly what a fresh rebuild from jobs.search_text would hold.

    (FTS5's own integrity-check does not compare an external-content index with its content in
    SQLite < 3.44, so the test compares every token instance with a rebuild in a copy.)
    """
    with closing(sqlite3.connect(":memory:", isolation_level=None)) as copy:
        log.conn.backup(copy)
        copy.execute(
            f"CREATE VIRTUAL TABLE temp.vocab USING fts5vocab(main, {schema.TEXT_INDEX}, 'instance')"
        )
        query = "SELECT term, doc, offset FROM temp.vocab ORDER BY 1, 2, 3"
        before = copy.execute(query).fetchall()
        copy.execute(schema.TEXT_INDEX_REBUILD)
        return before == copy.execute(query).fetchall()


@pytest.fixture
def filled(log_path):
    with JobLog.open(log_path) as log:
        jobs = _fill(log)
        yield log, jobs


@pytest.mark.parametrize("lookup_limit", [2000, 0], ids=["by-id", "listing-scan"])
@pytest.mark.parametrize("text", TRICKY_FILTERS)
def test_tricky_filters_find_exactly_the_substring_matches(filled, monkeypatch, text, lookup_limit):
    # lookup_limit 0 sends every indexed filter down the many-matches path (scan + index count).
    monkeypatch.setattr(log_module, "INDEX_LOOKUP_LIMIT", lookup_limit)
    log, jobs = filled
    log.forget_counts()
    expected_all = _reference(jobs, text)
    expected_live = _live(log, expected_all)
    assert {r.id for r in log.search(text=text, limit=1000, deleted=None)} == expected_all
    assert {r.id for r in log.search(text=text, limit=1000)} == expected_live
    assert {r.id for r in log.search(text=text, limit=1000, deleted=True)} == expected_all - expected_live
    assert log.count(text=text, deleted=None) == len(expected_all)
    assert log.count(text=text) == len(expected_live)
    assert log.count(text=text, deleted=True) == len(expected_all - expected_live)
    failing = {i for i in expected_live if log.get(i).verdict == "fail"}
    assert log.count(text=text, verdict="fail") == len(failing)
    assert {r.id for r in log.search(text=text, verdict="fail", limit=1000)} == failing


def test_the_premise_tricky_filters_do_find_jobs(filled):
    # Guard against a vacuous pass: most of the tricky filters must find something.
    log, jobs = filled
    found = [t for t in TRICKY_FILTERS if _reference(jobs, t)]
    assert len(found) >= len(TRICKY_FILTERS) - 5
    assert log.count(text='"replace near', deleted=None) == 1
    assert log.count(text="strasse", deleted=None) == 1  # ß case-folds to ss, both ways
    assert log.count(text="zzzz", deleted=None) == 0


@needs_index
def test_a_log_on_this_sqlite_uses_the_index(filled):
    log, _ = filled
    assert log.text_index
    assert index_in_step(log)


@pytest.mark.parametrize("lookup_limit", [2000, 0], ids=["by-id", "listing-scan"])
def test_random_filters_agree_with_the_substring_rule(log_path, monkeypatch, lookup_limit):
    monkeypatch.setattr(log_module, "INDEX_LOOKUP_LIMIT", lookup_limit)
    with JobLog.open(log_path) as log:
        jobs = _fill(log)
        corpus = "".join(jobs.values())
        pieces = st.integers(0, len(corpus) - 1).flatmap(
            lambda start: st.integers(1, 8).map(lambda size: corpus[start:start + size])
        )
        noise = st.text(alphabet=st.characters(blacklist_categories=("Cs",)), max_size=6)
        words = st.one_of(pieces, pieces.map(str.upper), noise)
        filters = st.lists(words, min_size=1, max_size=3).map(" ".join)

        @settings(max_examples=300, deadline=None, suppress_health_check=[HealthCheck.too_slow])
        @given(text=filters)
        def agree(text: str) -> None:
            log.forget_counts()
            expected = _reference(jobs, text)
            assert {r.id for r in log.search(text=text, limit=1000, deleted=None)} == expected
            assert log.count(text=text, deleted=None) == len(expected)
            assert log.count(text=text) == len(_live(log, expected))

        agree()


@needs_index
def test_every_change_keeps_the_index_in_step(log_path):
    with JobLog.open(log_path) as log:
        a = log.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset="Conveyor qv7")
        b = log.save(dict(JOB_INPUTS["mixer"]), result_for("mixer"), asset="Mixer qv8", note="old note")
        assert index_in_step(log)
        log.update(b, note="brand new wording")
        assert log.search(text="old note") == [] and [r.id for r in log.search(text="new wording")] == [b]
        log.delete(a)
        assert log.count(text="qv7") == 0 and log.count(text="qv7", deleted=True) == 1
        log.restore(a)
        assert log.count(text="qv7") == 1
        log.delete(a)
        assert log.purge() == 1
        assert log.count(text="qv7", deleted=None) == 0
        exported = log.export_rows()
        assert index_in_step(log)
    other = log_path.with_name("other.sqlite3")
    with JobLog.open(other) as log:
        assert log.import_jobs(exported) == 1
        assert [r.asset for r in log.search(text="QV8")] == ["Mixer qv8"]
        assert index_in_step(log)
        assert log.integrity_ok()


@needs_index
def test_index_in_step_notices_a_stale_index(log_path):
    # The check used above can fail: change the text behind the index's back.
    with JobLog.open(log_path) as log:
        job_id = log.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset="Pump P-1")
        log.conn.execute(f"DROP TRIGGER {schema.TEXT_TRIGGERS[2]}")
        log.conn.execute("UPDATE jobs SET search_text = 'crusher' WHERE id = ?", (job_id,))
        assert not index_in_step(log)


@pytest.mark.parametrize("lookup_limit", [2000, 0], ids=["by-id", "listing-scan"])
def test_counts_are_not_reused_after_a_change_here_or_in_another_connection(
    log_path, monkeypatch, lookup_limit
):
    monkeypatch.setattr(log_module, "INDEX_LOOKUP_LIMIT", lookup_limit)
    with JobLog.open(log_path) as first, JobLog.open(log_path) as second:
        # nothing found is remembered too: it must not hide what is saved next
        assert first.count(text="winch") == 0 and first.search(text="winch") == []
        first.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset="Winch W-1")
        assert first.count(text="winch") == 1 and len(first.search(text="winch")) == 1
        assert second.count(text="crane") == 0 and second.search(text="crane") == []
        first.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset="Crane C-1")
        assert second.count(text="crane") == 1 and len(second.search(text="crane")) == 1
        assert second.count(text="crane", deleted=None) == 1
        first.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset="Hoist H-9")
        assert first.count(text="hoist") == 1 and first.count(text="hoi") == 1
        assert len(first.search(text="hoist")) == 1
        job_id = first.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset="Hoist H-10")
        assert first.count(text="hoist") == 2  # this connection's change
        assert second.count(text="hoist") == 2
        second.delete(job_id)
        assert first.count(text="hoist") == 1  # another connection's commit
        assert first.count(text="hoist", deleted=True) == 1
        second.restore(job_id)
        assert [r.id for r in first.search(text="h-10")] == [job_id]
        assert first.count(text="h-10") == 1


def test_without_fts5_the_log_uses_like_and_rebuilds_the_index_later(log_path, monkeypatch):
    monkeypatch.setattr(migrations, "_trigram_available", False)  # as on an SQLite without trigram
    with JobLog.open(log_path) as log:
        assert not log.text_index
        jobs = _fill(log)
        assert migrations.user_version(log.conn) == schema.LATEST_VERSION
        assert {r.id for r in log.search(text="plant", deleted=None)} == _reference(jobs, "plant")
        assert log.count(text='"replace', deleted=None) == 1
        names = {r[0] for r in log.conn.execute("SELECT name FROM sqlite_master")}
        assert schema.TEXT_INDEX not in names
    monkeypatch.setattr(migrations, "_trigram_available", None)  # this SQLite again
    if not migrations.text_index_supported():
        pytest.skip("this SQLite has no FTS5 trigram tokenizer")
    with JobLog.open(log_path) as log:
        assert log.text_index and index_in_step(log)
        assert {r.id for r in log.search(text="plant", deleted=None)} == _reference(jobs, "plant")


@needs_index
def test_a_log_opened_without_fts5_is_reindexed_by_the_next_capable_open(log_path, monkeypatch):
    with JobLog.open(log_path) as log:
        first = log.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset="Screen S-1")
    monkeypatch.setattr(migrations, "_trigram_available", False)
    with JobLog.open(log_path) as log:  # the triggers go, so saving works without the module
        assert not log.text_index
        names = {r[0] for r in log.conn.execute("SELECT name FROM sqlite_master")}
        assert not names & set(schema.TEXT_TRIGGERS)
        second = log.save(dict(JOB_INPUTS["mixer"]), result_for("mixer"), asset="Screen S-2")
        log.update(first, asset="Sieve S-1")
        assert [r.id for r in log.search(text="screen")] == [second]
    monkeypatch.setattr(migrations, "_trigram_available", True)
    with JobLog.open(log_path) as log:
        assert log.text_index and index_in_step(log)
        assert [r.id for r in log.search(text="screen")] == [second]
        assert [r.id for r in log.search(text="sieve")] == [first]
