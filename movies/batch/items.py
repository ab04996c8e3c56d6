"""What a batch runs over: the items of a table range, a file of diagrams or a folder of movies.

>>> [item.key for item in table_items("knot", 0, 4)]
['0_1', '3_1', '4_1']
>>> crossing_range("3-12"), crossing_range("7")
((3, 12), (7, 7))
"""

from __future__ import annotations

from dataclasses import dataclass
from pathlib import Path

from movies.diagram.tables import lookup, table_names
from movies.errors import InputError

__all__ = ["Item", "crossing_range", "table_items", "file_items", "movie_items"]

#: the kinds of source a batch reads, as the database names them
SOURCES = ("knots", "links", "file", "movies")


@dataclass(frozen=True)
class Item:
    """One thing to run a task on: ``key`` names it in the database (a table name, ``line N`` of
    a file, a movie's file name), ``text`` is what the task reads (a diagram, a movie)."""

    key: str
    source: str
    text: str
    position: int


def crossing_range(text: str) -> tuple[int, int]:
    """``"3-12"`` or ``"7"`` as (low, high); raises :class:`~movies.errors.InputError` otherwise."""
    parts = text.split("-")
    try:
        low, high = (int(parts[0]), int(parts[-1])) if len(parts) in (1, 2) else (None, None)
    except ValueError:
        low = high = None
    if low is None or low < 0 or high < low:
        raise InputError(f"a crossing range is N or LOW-HIGH with 0 <= LOW <= HIGH, not {text!r}")
    return low, high


def table_items(kind: str, low: int, high: int) -> list[Item]:
    """Every knot (``kind="knot"``) or oriented link of the tables with ``low`` to ``high``
    crossings, in table order."""
    names = [name for name in table_names(kind, max_crossings=high) if lookup(name).crossing_number >= low]
    source = "knots" if kind == "knot" else "links"
    return [Item(name, source, name, position) for position, name in enumerate(names)]


def file_items(path: str | Path) -> list[Item]:
    """One item per line of a text file of diagrams, in the diagram notation; blank lines and lines
    starting with ``%`` are left out. Keys are ``line N``."""
    try:
        lines = Path(path).read_text(encoding="utf-8").splitlines()
    except (OSError, UnicodeDecodeError) as err:
        raise InputError(f"cannot read {path}: {err}") from None
    items = []
    for number, line in enumerate(lines, start=1):
        text = line.split("%", 1)[0].strip()
        if text:
            items.append(Item(f"line {number}", "file", text, len(items)))
    return items


def movie_items(folder: str | Path) -> list[Item]:
    """One item per ``*.movie`` file of a folder, by file name."""
    folder = Path(folder)
    if not folder.is_dir():
        raise InputError(f"{folder} is not a folder of movie files")
    items = []
    for path in sorted(folder.glob("*.movie")):
        try:
            text = path.read_text(encoding="utf-8")
        except (OSError, UnicodeDecodeError) as err:
            raise InputError(f"cannot read {path}: {err}") from None
        items.append(Item(path.name, "movies", text, len(items)))
    return items
