"""The results of batches, in one SQLite file.

One row per item and task: the program's version, the task's options (as canonical JSON), the
status (``ok``, ``timeout``, ``error``), the result as the JSON the command line prints, the
reason of a timeout or an error, and the time taken in milliseconds. Rows are written by the
client in transactions, so an interrupted run leaves a consistent file; a second run with the same
version and options skips the items already there. The file marks itself as ours
(``PRAGMA application_id``), and any other file, or one that is not a database, is refused
without being touched.

>>> import tempfile, os
>>> path = os.path.join(tempfile.mkdtemp(), "r.sqlite")
>>> with ResultStore(path) as store:
...     store.write([Row("3_1", "knots", "3_1", 0, "invariants", "0.1.0", "{}", "ok", '{"s": 2}', "", 12)])
...     sorted(store.done("invariants", "0.1.0", "{}"))
['3_1']
"""

from __future__ import annotations

import json
import sqlite3
from dataclasses import dataclass
from pathlib import Path

from movies.errors import InputError

__all__ = ["Row", "ResultStore", "canonical_options", "STATUSES"]

#: 'MOVI', marking the file as a results database of this program
APPLICATION_ID = 0x4D4F5649
#: the layout of the tables; a file of another layout is refused
SCHEMA_VERSION = 1
STATUSES = ("ok", "timeout", "error")
_COLUMNS = ("item", "source", "input", "position", "task", "version", "options", "status", "result", "reason",
            "milliseconds")
_SCHEMA = f"""
CREATE TABLE results (
    item TEXT NOT NULL,          -- a table name, 'line N' of a file, a movie's file name
    source TEXT NOT NULL,        -- knots, links, file, movies
    input TEXT NOT NULL,         -- the diagram or the movie the task read
    position INTEGER NOT NULL,   -- the item's place in its source
    task TEXT NOT NULL,
    version TEXT NOT NULL,       -- of the program
    options TEXT NOT NULL,       -- the task's options, canonical JSON
    status TEXT NOT NULL CHECK (status IN {STATUSES}),
    result TEXT,                 -- the JSON the command line prints, for status ok
    reason TEXT NOT NULL,        -- why a timeout or an error
    milliseconds INTEGER NOT NULL,
    PRIMARY KEY (item, task, version, options)
);
"""


def canonical_options(options: dict) -> str:
    """The options as JSON with sorted keys and no blanks: equal options, equal text.

    >>> canonical_options({"b": 1, "a": [2]})
    '{"a":[2],"b":1}'
    """
    return json.dumps(options, sort_keys=True, separators=(",", ":"))


@dataclass(frozen=True)
class Row:
    """One result, as stored."""

    item: str
    source: str
    input: str
    position: int
    task: str
    version: str
    options: str
    status: str
    result: str | None
    reason: str
    milliseconds: int


class ResultStore:
    """A results database file: opened (created when missing or empty), checked, and closed."""

    def __init__(self, path: str | Path) -> None:
        self.path = Path(path)
        fresh = not self.path.exists() or self.path.stat().st_size == 0
        try:
            self.db = sqlite3.connect(self.path)
            if fresh:
                with self.db:
                    self.db.execute(f"PRAGMA application_id = {APPLICATION_ID}")
                    self.db.execute(f"PRAGMA user_version = {SCHEMA_VERSION}")
                    self.db.executescript(_SCHEMA)
            (application,) = self.db.execute("PRAGMA application_id").fetchone()
            (schema,) = self.db.execute("PRAGMA user_version").fetchone()
            tables = {name for (name,) in self.db.execute("SELECT name FROM sqlite_master WHERE type = 'table'")}
            if application != APPLICATION_ID:
                raise InputError(f"{self.path} is a database of something else (not a results file of movies); "
                                 "it is left as it is: give another file")
            if schema != SCHEMA_VERSION or tables != {"results"}:
                raise InputError(f"{self.path} is a results file of another layout (version {schema}); it is left "
                                 "as it is: give another file")
            self.db.execute("SELECT count(*) FROM results").fetchone()
        except sqlite3.DatabaseError as err:
            self.close()
            raise InputError(f"{self.path} is not a database this program can read ({err}); it is left as it is: "
                             "give another file") from None
        except InputError:
            self.close()
            raise

    def __enter__(self) -> "ResultStore":
        return self

    def __exit__(self, *exc) -> None:
        self.close()

    def close(self) -> None:
        db = getattr(self, "db", None)
        if db is not None:
            db.close()
            self.db = None

    def done(self, task: str, version: str, options: str) -> set[str]:
        """The items that already have a result for this task, version and options."""
        rows = self.db.execute("SELECT item FROM results WHERE task = ? AND version = ? AND options = ?",
                               (task, version, options))
        return {item for (item,) in rows}

    def write(self, rows: list[Row]) -> None:
        """Store rows in one transaction (a row for the same item, task, version and options replaces it)."""
        with self.db:
            self.db.executemany(f"INSERT OR REPLACE INTO results ({', '.join(_COLUMNS)}) "
                                f"VALUES ({', '.join('?' for _ in _COLUMNS)})",
                                [tuple(getattr(row, name) for name in _COLUMNS) for row in rows])

    def rows(self, task: str | None = None) -> list[Row]:
        """Every row (of one task), in the order of their sources."""
        query = f"SELECT {', '.join(_COLUMNS)} FROM results"
        query += " WHERE task = ?" if task else ""
        query += " ORDER BY task, version, options, source, position, item"
        return [Row(*values) for values in self.db.execute(query, (task,) if task else ())]
