"""Text filters of the SQLite job log: the trigram full-text index (FTS5, schema v3, layout 2)
where this SQLite has one, else LIKE over every row; both give the same answers.

A filter is split into case-folded words; every word must appear in ``jobs.search_text``. The index
holds, for each trigram (three characters in a row), the jobs whose text holds it (detail=none: not
where), over the text padded with two line breaks (schema.TEXT_PAD):

- a word of three characters or more is looked up as all of its trigrams (``"pum" AND "ump"`` for
  ``pump``): every job holding the word is found, and a few that hold the trigrams apart may be
  found too, which the LIKE check removes;
- a word of one or two ASCII characters is looked up as any trigram that begins with it (``"li"``:
  ``"lin" OR "lid" OR ...``, the trigrams read from the index's own term list): thanks to the
  padding every occurrence begins a trigram, so this finds exactly the jobs holding the word, and a
  word no job holds is answered from the term list alone;
- a shorter word with other characters is checked with LIKE only (the index folds case by its own
  table, the text was folded by Python's ``str.casefold``).

Every word is always checked with LIKE as well, so the answer is exactly the LIKE semantics whichever
way the rows were found; a count is read from the index alone only when every word was looked up
exactly (words of one to three characters).
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
    """FTS5 query for the words the trigram index can look up, or None (LIKE only)."""
    matched: int | None
    """How many jobs, bin included, the index matches, counted up to INDEX_LOOKUP_LIMIT + 1
    (None without the index)."""
    needs_like: bool
    """True if the index's count is not the answer: some word is not in ``expression`` or is
    looked up by trigrams that may sit apart (four characters or more) - or there is no index."""


MAX_PREFIX_TERMS = 400
"""A one- or two-character word beginning more distinct trigrams than this is checked with LIKE
alone (such a word is in most jobs: the newest-first LIKE scan fills a page at once)."""
NO_JOB = object()
"""What ``_word_expression`` returns for a word that no job's text holds."""


def word_trigrams(word: str) -> list[str]:
    """The distinct trigrams of a word of three characters or more, in order."""
    return list(dict.fromkeys(word[i:i + 3] for i in range(len(word) - 2)))


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
    _terms_ready = False
    """True once this connection has its ``temp`` term list (schema.TEXT_TERMS)."""

    def _text_plan(self, text: str, *, full_count: bool = False) -> TextPlan:
        """Split the filter text into words and, if the trigram index can serve some of them, count
        the jobs (bin included) the index finds for those words: up to INDEX_LOOKUP_LIMIT + 1, or
        all of them with ``full_count`` when the index's count is the answer."""
        words = filter_words(text)
        if not (self.text_index and words):
            return TextPlan(words, None, None, bool(words))
        parts: list[str] = []
        exact = True
        for word in dict.fromkeys(words):
            part = self._word_expression(word)
            if part is NO_JOB:
                return TextPlan(words, None, 0, False)
            if part is None:
                exact = False
                continue
            parts.append(part)
            exact = exact and len(word) <= schema.TEXT_INDEX_MIN_CHARS
        if not parts:
            return TextPlan(words, None, None, True)
        expression = " AND ".join(parts)
        cap = None if full_count and exact else INDEX_LOOKUP_LIMIT + 1
        matched = self._match_count(expression, cap=cap)
        if matched is None:  # the index could not answer: LIKE alone
            return TextPlan(words, None, None, True)
        return TextPlan(words, expression, matched, not exact)

    def _word_expression(self, word: str) -> str | object | None:
        """The FTS5 query finding the jobs that may hold ``word`` (see the module note), NO_JOB if
        the index shows that none does, or None if the index cannot look the word up."""
        if len(word) >= schema.TEXT_INDEX_MIN_CHARS:
            return " AND ".join(match_phrase(t) for t in word_trigrams(word))
        if not word.isascii():
            return None
        terms = self._terms_beginning(word)
        if terms is None or len(terms) > MAX_PREFIX_TERMS:
            return None
        if not terms:
            return NO_JOB
        return "(" + " OR ".join(match_phrase(t) for t in terms) + ")"

    def _terms_beginning(self, word: str) -> list[str] | None:
        """The index's trigrams that begin with ``word`` (read from the term list, a ``temp``
        fts5vocab table made once per connection); None if the index cannot say."""
        try:
            if not self._terms_ready:
                self.conn.execute(schema.TEXT_TERMS_CREATE)
                self._terms_ready = True
            rows = self.conn.execute(
                f"SELECT term FROM temp.{schema.TEXT_TERMS} WHERE term >= ? AND term < ? AND doc > 0 "
                f"LIMIT {MAX_PREFIX_TERMS + 1}",
                (word, word + "\U0010ffff"),
            ).fetchall()
        except sqlite3.Error:
            return None
        return [term for (term,) in rows]

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
