"""Text filters of the SQLite job log: the trigram full-text index (FTS5, schema v3) where this
SQLite has one, else LIKE over every row; both give the same answers.

A filter is split into case-folded words; every word must appear in ``jobs.search_text``. Words of
three characters or more are looked up in the trigram index; shorter words (the index holds only
three-character tokens) are checked with LIKE on the rows the other words found, or on every row
when no word is long enough. Every word is always checked with LIKE as well, so the answer is
exactly the LIKE semantics whichever way the rows were found.
"""

from __future__ import annotations

import sqlite3
from dataclasses import dataclass
from typing import Any

from workbench.store import schema
from workbench.store.values import text_value

INDEX_LOOKUP_LIMIT = 2000
"""Up to this many index matches, a text filter looks the matched jobs up by id; above it, scanning
the covering listing index in order is cheaper (measured at 100,000 jobs, bench/bench_log.py)."""


@dataclass(frozen=True)
class TextPlan:
    """How a text filter will be answered."""

    words: list[str]
    """Case-folded words; each must appear in search_text."""
    expression: str | None
    """FTS5 query for the words the trigram index can find, or None (LIKE only)."""
    matched: int | None
    """How many jobs, bin included, the index matches, counted up to INDEX_LOOKUP_LIMIT + 1
    (None without the index)."""
    needs_like: bool
    """True if some word is not in ``expression`` (shorter than three characters) - or no index."""


def match_phrase(word: str) -> str:
    """A word as an FTS5 string: between double quotes, inner quotes doubled, so that ``*``, ``-``,
    ``AND``, ``NEAR``, ``:`` and parentheses are plain characters (SQLite FTS5 query syntax, 3.1)."""
    return '"' + word.replace('"', '""') + '"'


def like_pattern(word: str) -> str:
    """``%word%`` with LIKE's own characters escaped (ESCAPE '\\')."""
    escaped = word.replace("\\", "\\\\").replace("%", "\\%").replace("_", "\\_")
    return f"%{escaped}%"


def filter_words(text: str) -> list[str]:
    """The case-folded words of a text filter (split at white space and NUL)."""
    # NUL ends a LIKE pattern inside SQLite (the rest would be ignored), so it separates words.
    return text_value(text, "text").replace("\x00", " ").casefold().split()


class TrigramSearch:
    """Text-filter planning for one SQLite connection (mixed into the SQLite job log)."""

    conn: sqlite3.Connection
    text_index: bool
    _match_count_cache: tuple[Any, int] | None

    def _text_plan(self, text: str, *, full_count: bool = False) -> TextPlan:
        """Split the filter text into words and, if the trigram index can serve it, count the
        jobs (bin included) whose text holds every word of three or more characters: up to
        INDEX_LOOKUP_LIMIT + 1, or all of them with ``full_count`` when every word is indexed."""
        words = filter_words(text)
        indexed = [w for w in words if len(w) >= schema.TEXT_INDEX_MIN_CHARS]
        if not (self.text_index and indexed):
            return TextPlan(words, None, None, bool(words))
        expression = " AND ".join(match_phrase(w) for w in indexed)
        every_word = len(indexed) == len(words)
        cap = None if full_count and every_word else INDEX_LOOKUP_LIMIT + 1
        matched = self._match_count(expression, cap=cap)
        if matched is None:  # the index could not answer: LIKE alone
            return TextPlan(words, None, None, True)
        return TextPlan(words, expression, matched, not every_word)

    def _match_count(self, expression: str, cap: int | None = None) -> int | None:
        """How many jobs (bin included) the index matches, counting no further than ``cap`` if
        given (the index stops early); None if the index cannot answer. The last full count is
        kept until the log changes (this connection's changes or another's commit)."""
        try:
            state = (
                expression,
                self.conn.total_changes,
                self.conn.execute("PRAGMA data_version").fetchone()[0],
            )
            cached = self._match_count_cache
            if cached is not None and cached[0] == state:
                return cached[1] if cap is None else min(cached[1], cap)
            query = f"SELECT rowid FROM {schema.TEXT_INDEX} WHERE {schema.TEXT_INDEX} MATCH ?"
            if cap is not None:
                query += f" LIMIT {int(cap)}"
            matched = int(self.conn.execute(f"SELECT count(*) FROM ({query})", (expression,)).fetchone()[0])
        except sqlite3.OperationalError:
            return None
        if cap is None or matched < cap:
            self._match_count_cache = (state, matched)
        return matched

    def _text_query(
        self, plan: TextPlan, clauses: list[str], params: list[Any]
    ) -> tuple[str, str, list[Any]]:
        """``(FROM ..., WHERE ..., params)`` selecting the jobs that pass every filter.

        With the index and at most INDEX_LOOKUP_LIMIT matches, the matched ids drive the query
        (row lookups by id); otherwise the covering index jobs_listing is scanned with LIKE, which
        also stops early when a page fills up.
        """
        clauses, params = list(clauses), list(params)
        for word in plan.words:
            clauses.append("search_text LIKE ? ESCAPE '\\'")  # measured faster than instr()
            params.append(like_pattern(word))
        source = "jobs"
        if plan.expression is not None and plan.matched is not None and plan.matched <= INDEX_LOOKUP_LIMIT:
            source = "jobs NOT INDEXED"  # the integer primary key is still used for the id lookups
            clauses.insert(
                0, f"id IN (SELECT rowid FROM {schema.TEXT_INDEX} WHERE {schema.TEXT_INDEX} MATCH ?)"
            )
            params.insert(0, plan.expression)
        where = " WHERE " + " AND ".join(clauses) if clauses else ""
        return source, where, params
