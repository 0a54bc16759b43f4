"""Layout 2 of the text index (detail=none over padded text): short words through the index,
absent words from the term list, older layouts rebuilt, and the page size of a new log.

The reference for every answer is the substring rule of ``JobLog.search`` (see
test_store_text_index.py): each case-folded word is a substring of the job's search text.
"""

from __future__ import annotations

import sqlite3
import pytest
from store_helpers import JOB_INPUTS, result_for

from workbench.store import JobLog, migrations, schema, sqlite_files
from workbench.store.text_search import NO_JOB, word_trigrams

pytestmark = pytest.mark.skipif(
    not migrations.text_index_supported(),
    reason=f"SQLite {sqlite3.sqlite_version} has no FTS5 trigram tokenizer (the LIKE path is used)",
)

ASSETS = ["Pump P-7", "Fan F-12 x", "Mixer M-3 qz", "Screen S-9 line 4", "Hoist H-1 zy"]


def _texts(log: JobLog) -> dict[int, str]:
    return dict(log.conn.execute("SELECT id, search_text FROM jobs").fetchall())


def _reference(texts: dict[int, str], text: str) -> set[int]:
    words = text.casefold().split()
    return {i for i, searched in texts.items() if all(w in searched for w in words)}


@pytest.fixture
def log(log_path):
    with JobLog.open(log_path) as opened:
        for i, asset in enumerate(ASSETS):
            opened.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset=asset,
                        note=["", "q", "end zq", "bent", "a b"][i])
        yield opened


def test_word_trigrams_are_the_distinct_three_character_pieces():
    assert word_trigrams("pump") == ["pum", "ump"]
    assert word_trigrams("aaaa") == ["aaa"]
    assert word_trigrams("abc") == ["abc"]


def test_the_last_characters_of_every_job_are_found_through_the_index(log):
    # The padding makes the last one or two characters of a text the start of a trigram. Some texts
    # are set by hand (the triggers keep the index in step) so that they end in different ways.
    for job_id, text in ((1, "pump p-7\nqz"), (2, "fan\n7"), (3, "x\nbent k")):
        log.conn.execute("UPDATE jobs SET search_text = ? WHERE id = ?", (text, job_id))
    texts = _texts(log)
    endings = {t[-n:] for t in texts.values() for n in (1, 2) if not t[-n:].isspace() and " " not in t[-n:]}
    assert len(endings) >= 3
    for word in sorted(endings):
        log.forget_counts()
        plan = log._text_plan(word)
        assert plan.expression is not None, word  # served by the index, not by LIKE alone
        assert not plan.needs_like
        expected = _reference(texts, word)
        assert {r.id for r in log.search(text=word, limit=100, deleted=None)} == expected
        assert log.count(text=word, deleted=None) == len(expected)


def test_a_short_word_no_job_holds_is_answered_from_the_term_list(log):
    assert log._word_expression("q#") is NO_JOB
    plan = log._text_plan("q#")
    assert plan.matched == 0 and plan.expression is None
    assert log.search(text="q#") == [] and log.count(text="q#") == 0
    assert log.count(text="zq") == len(_reference(_texts(log), "zq")) == 1


def test_a_long_word_whose_trigrams_sit_apart_is_not_found(log_path):
    with JobLog.open(log_path) as log:
        apart = log.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset="pum xx ump")
        whole = log.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset="pump")
        assert log._text_plan("pump").needs_like  # the index alone could count "apart" too
        assert [r.id for r in log.search(text="pump")] == [whole]
        assert log.count(text="pump") == 1
        assert apart in {r.id for r in log.search(text="pum ump")}


def test_a_short_non_ascii_word_is_checked_with_like(log_path):
    with JobLog.open(log_path) as log:
        job = log.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset="Straße Ø 4")
        assert log._word_expression("ø") is None
        assert [r.id for r in log.search(text="Ø")] == [job]
        assert log.count(text="ø 4") == 1


def _old_layout(conn: sqlite3.Connection) -> None:
    """Put back the index of layout 1 (detail=full over jobs.search_text, unpadded)."""
    for trigger in schema.TEXT_TRIGGERS:
        conn.execute(f"DROP TRIGGER {trigger}")
    conn.execute(f"DROP TABLE {schema.TEXT_INDEX}")
    conn.execute(f"DROP VIEW {schema.TEXT_SOURCE}")
    conn.execute(f"CREATE VIRTUAL TABLE {schema.TEXT_INDEX} USING fts5(search_text, content='jobs', "
                 "content_rowid='id', tokenize='trigram', columnsize=0)")
    conn.execute(f"CREATE TRIGGER {schema.TEXT_TRIGGERS[0]} AFTER INSERT ON jobs BEGIN "
                 f"INSERT INTO {schema.TEXT_INDEX}(rowid, search_text) VALUES (new.id, new.search_text); END")
    conn.execute(f"CREATE TRIGGER {schema.TEXT_TRIGGERS[1]} AFTER DELETE ON jobs BEGIN SELECT 1; END")
    conn.execute(f"CREATE TRIGGER {schema.TEXT_TRIGGERS[2]} AFTER UPDATE ON jobs BEGIN SELECT 1; END")
    conn.execute(schema.TEXT_INDEX_REBUILD)


def test_an_index_of_the_older_layout_is_rebuilt_when_the_log_is_opened(log_path):
    with JobLog.open(log_path) as log:
        ids = [log.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset=a) for a in ASSETS]
        _old_layout(log.conn)
        assert not migrations.text_index_current(log.conn)
    with JobLog.open(log_path) as log:
        assert migrations.text_index_current(log.conn)
        sql = log.conn.execute("SELECT sql FROM sqlite_master WHERE name = ?", (schema.TEXT_INDEX,)).fetchone()[0]
        assert "detail=none" in sql
        assert [r.id for r in log.search(text="p-7")] == [ids[0]]
        assert log.count(text="x") == len(_reference(_texts(log), "x"))


def test_a_read_only_log_with_the_older_layout_filters_with_like(log_path, monkeypatch):
    with JobLog.open(log_path) as log:
        ids = [log.save(dict(JOB_INPUTS["demo"]), result_for("demo"), asset=a) for a in ASSETS]
        _old_layout(log.conn)
        log.conn.execute("PRAGMA wal_checkpoint(TRUNCATE)")
    monkeypatch.setattr(sqlite_files, "writable", lambda path: False)  # as on a read-only mount
    with JobLog.open(log_path) as log:
        assert log.read_only and not log.text_index
        assert [r.id for r in log.search(text="zy")] == [ids[4]]
        assert log.count(text="x") == len(_reference(_texts(log), "x")) >= 1


def test_a_new_log_has_pages_of_eight_kib(log_path):
    with JobLog.open(log_path) as log:
        assert log.conn.execute("PRAGMA page_size").fetchone()[0] == schema.PAGE_SIZE == 8192
