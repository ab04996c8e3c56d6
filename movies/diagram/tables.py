"""Knots and links looked up by their names in the KnotInfo and LinkInfo tables.

The tables come with the ``database_knotinfo`` package as two ``|``-separated text files. Each
file is read once, on the first lookup that needs it, into a small index (name, crossing number,
components, orientation, PD code and the position of the row in the file); ``table_row`` reads
one full row back from its position when a caller wants the other columns. The first line of
each file names the columns and the second gives their titles; the second is skipped.

Names accepted by :func:`lookup` (letters ``K``, ``L``, ``a``, ``n`` in either case, surrounding
blanks ignored):

- knots with at most 10 crossings by their classical names: ``0_1``, ``3_1``, ``10_165``, also with
  a leading ``K`` (``K3_1``);
- knots with 11 to 13 crossings: ``11a_1``, ``11a1``, ``K11a1``, ``K11a_1``, ``13n_5110``; the
  canonical spelling is ``11a_1``;
- links (2 to 5 components, at most 11 crossings): ``L7a1{0}``, ``L11n459{0,1,1}``, blanks in the
  braces allowed, ``L7a_1{0}`` also read. A link name without braces (``L7a1``) means the first
  orientation the table lists for that link, which is always the one written ``{0}``,
  ``{0,0}``, ... .

A name such as ``5a1`` is refused with a hint: the letters ``a``/``n`` belong to the
Dowker–Thistlethwaite numbering, which for knots of at most 10 crossings differs from the
classical one the table uses (Dowker–Thistlethwaite ``5a_1`` is the knot ``5_2``).

Facts about the PD codes, checked over every row of both tables (12965 knots with crossings,
4188 oriented links with 11408 components in all):

- every crossing ``[a, b, c, d]`` names its edges with labels that run consecutively along each
  component; each component carries a block of consecutive labels, and at every crossing where it
  passes under, ``c`` is the label after ``a`` in its block (wrapping from the largest to the
  smallest). So the labels follow the orientation the row is named for, and increasing labels
  orient every component, as the conventions of the project assume;
- every component of every link passes under at least once, so the under-strands alone orient
  all components. Only the Hopf link (both of its rows) has components of two edges, where the
  labels alone cannot tell the direction;
- the linking numbers computed from each oriented PD code, with the components ordered by their
  smallest label, equal the ``linking_matrix`` column on every row: each orientation of a link has
  its own PD code, and the components of that matrix are in the order of their smallest labels.

>>> trefoil = lookup("K3_1")
>>> trefoil.name, trefoil.kind, trefoil.pd
('3_1', 'knot', ((1, 5, 2, 4), (3, 1, 4, 6), (5, 3, 6, 2)))
>>> lookup("L2a1").name
'L2a1{0}'
"""

from __future__ import annotations

import csv
import dataclasses
import difflib
import os
import re

import database_knotinfo

from movies import limits
from movies.errors import InputError, LimitError, PDCodeError, TableError

__all__ = ["TableEntry", "canonical_name", "lookup", "table_names", "table_row"]

KNOT = "knot"
LINK = "link"

# Columns the index keeps for every row; everything else is read back on demand.
_PD_COLUMN = {KNOT: "pd_notation", LINK: "pd_notation_vector"}
_INDEX_COLUMNS = {
    KNOT: ("name", "crossing_number", "pd_notation", "dt_name"),
    LINK: ("name", "crossing_number", "pd_notation_vector", "components", "orientation",
           "name_unoriented"),
}
_FILE_STEM = {KNOT: database_knotinfo.Names.file_knot.value,
              LINK: database_knotinfo.Names.file_link.value}
_DELIMITER = database_knotinfo.Names.delimiter.value


@dataclasses.dataclass(frozen=True)
class TableEntry:
    """One knot, or one oriented link, as the tables give it.

    ``pd`` is the table's PD code, crossing by crossing, unchanged (empty for the unknot 0_1).
    ``orientation`` and ``unoriented_name`` are set for links only.
    """

    name: str
    kind: str
    pd: tuple[tuple[int, int, int, int], ...]
    components: int
    crossing_number: int
    orientation: str | None = None
    unoriented_name: str | None = None


@dataclasses.dataclass
class _Table:
    """The index of one table file: header, rows in table order, and where each row starts."""

    path: str
    header: list[str]
    rows: list[dict[str, str]]          # the _INDEX_COLUMNS of each row
    offsets: dict[str, tuple[int, int]]  # name -> (byte offset, byte length) of its line
    by_name: dict[str, int]              # name -> position in rows
    orientations: dict[str, list[str]]   # unoriented link name -> its oriented names, in order


_tables: dict[str, _Table] = {}
_entries: dict[str, TableEntry] = {}  # by the spelling asked for, and by the canonical name


def _table_path(kind: str) -> str:
    package_dir = database_knotinfo.__path__[0]
    return os.path.join(package_dir, database_knotinfo.Names.csv_path.value,
                        _FILE_STEM[kind] + ".csv")


def _split(line: str, max_fields: int | None = None) -> list[str]:
    # The files use no quoting; fall back to the csv reader if a row ever does.
    if '"' in line:
        return next(csv.reader([line], delimiter=_DELIMITER))
    if max_fields is None:
        return line.split(_DELIMITER)
    return line.split(_DELIMITER, max_fields)


def _load(kind: str) -> _Table:
    """Index one table file, once."""
    if kind in _tables:
        return _tables[kind]
    path = _table_path(kind)
    rows: list[dict[str, str]] = []
    offsets: dict[str, tuple[int, int]] = {}
    by_name: dict[str, int] = {}
    orientations: dict[str, list[str]] = {}
    with open(path, "rb") as handle:
        header_line = handle.readline()
        header = _split(header_line.decode("utf-8").rstrip("\r\n"))
        wanted = [(column, header.index(column)) for column in _INDEX_COLUMNS[kind]]
        last = max(position for _, position in wanted)
        offset = len(header_line)
        first = True
        for raw in handle:
            fields = _split(raw.decode("utf-8").rstrip("\r\n"), last + 1)
            start, offset = offset, offset + len(raw)
            if first:
                first = False
                if fields[0] == "Name":  # the row of column titles
                    continue
            row = {column: fields[position].strip() if position < len(fields) else ""
                   for column, position in wanted}
            name = row["name"]
            by_name[name] = len(rows)
            offsets[name] = (start, len(raw))
            rows.append(row)
            if kind == LINK:
                orientations.setdefault(row["name_unoriented"], []).append(name)
    _tables[kind] = _Table(path, header, rows, offsets, by_name, orientations)
    return _tables[kind]


def _parse_pd(text: str, name: str) -> tuple[tuple[int, int, int, int], ...]:
    """Read a PD code written ``[[1,5,2,4],...]`` or ``{{4, 1, 3, 2}, ...}``."""
    if not text:
        return ()
    body = re.fullmatch(r"\s*[\[{]\s*(.*?)\s*[\]}]\s*", text)
    crossings = re.findall(r"[\[{]([^\[\]{}]*)[\]}]", body.group(1)) if body else []
    result = []
    for crossing in crossings:
        labels = [part.strip() for part in crossing.split(",")]
        if len(labels) != 4 or not all(re.fullmatch(r"-?\d+", label) for label in labels):
            raise PDCodeError(f"the table's PD code of {name} has a crossing that is not four "
                              f"integers: {{{crossing}}}")
        result.append(tuple(int(label) for label in labels))
    if not result:
        raise PDCodeError(f"the table's PD code of {name} cannot be read: {text[:60]!r}")
    return tuple(result)


# --- names -------------------------------------------------------------------------------------

_CLASSICAL = re.compile(r"[kK]?(\d+)_(\d+)")
_LETTERED_KNOT = re.compile(r"[kK]?(\d+)([aAnN])_?(\d+)")
_LINK = re.compile(r"[lL](\d+)([aAnN])_?(\d+)\s*(\{[\d,\s]*\})?")

#: longer than any spelling of a table name, orientation braces included
_LONGEST_NAME = 80

_FIRST_LETTERED = 11  # knots from this many crossings on are named 11a_1, 11n_1, ...


def _knot_canonical(text: str) -> str:
    """The table name a knot spelling stands for (raises for refused or unknown spellings)."""
    table = _load(KNOT)
    match = _CLASSICAL.fullmatch(text)
    if match:
        crossings, index = int(match.group(1)), int(match.group(2))
        if crossings >= _FIRST_LETTERED:
            raise TableError(f"no knot named {text!r}: knots with {crossings} crossings are "
                             f"named {crossings}a_{index} or {crossings}n_{index} "
                             f"(alternating or not)")
        return _known_or_raise(f"{crossings}_{index}", text, KNOT)
    match = _LETTERED_KNOT.fullmatch(text)
    if match:
        crossings, letter, index = int(match.group(1)), match.group(2).lower(), int(match.group(3))
        dt_name = f"{crossings}{letter}_{index}"
        if crossings < _FIRST_LETTERED:
            holders = [row["name"] for row in table.rows if row["dt_name"] == dt_name]
            hint = (f"; in Dowker–Thistlethwaite numbering {dt_name} is the knot {holders[0]}"
                    if holders else "")
            raise TableError(f"no knot named {text!r}: knots with at most 10 crossings go by "
                             f"their classical names such as {crossings}_{index}{hint}")
        return _known_or_raise(dt_name, text, KNOT)
    raise _unknown(text)


def _link_canonical(text: str) -> str:
    """The oriented table name a link spelling stands for."""
    match = _LINK.fullmatch(text)
    if not match:
        raise _unknown(text)
    table = _load(LINK)
    crossings, letter, index = int(match.group(1)), match.group(2).lower(), int(match.group(3))
    unoriented = f"L{crossings}{letter}{index}"
    orientations = table.orientations.get(unoriented)
    if not orientations:
        _known_or_raise(unoriented, text, LINK)  # raises with a precise reason
    if match.group(4) is None:
        return orientations[0]
    oriented = unoriented + re.sub(r"\s+", "", match.group(4))
    if oriented not in table.by_name:
        listed = ", ".join(name[len(unoriented):] for name in orientations)
        raise TableError(f"{unoriented} has no orientation {oriented[len(unoriented):]}; "
                         f"the table lists {listed}")
    return oriented


def _known_or_raise(canonical: str, text: str, kind: str) -> str:
    """Return ``canonical`` if the table has it, else raise a TableError that says why not."""
    table = _load(kind)
    names = table.by_name if kind == KNOT else table.orientations
    if canonical in names:
        return canonical
    family = re.fullmatch(r"(L?\d+[an]?)_?(\d+)", canonical)
    crossings = int(re.match(r"L?(\d+)", canonical).group(1))
    limit = max(int(row["crossing_number"]) for row in table.rows)
    if crossings > limit:
        raise TableError(f"no {kind} named {text!r}: the {kind} table stops at {limit} crossings")
    prefix = family.group(1) if family else canonical
    sep = "_" if kind == KNOT else ""
    members = sorted(int(name[len(prefix) + len(sep):]) for name in names
                     if re.fullmatch(re.escape(prefix + sep) + r"\d+", name))
    if members:
        raise TableError(f"no {kind} named {text!r}: the table's {prefix}{sep}… run from "
                         f"{prefix}{sep}{members[0]} to {prefix}{sep}{members[-1]}")
    if not any(int(row["crossing_number"]) == crossings for row in table.rows):
        raise TableError(f"no {kind} named {text!r}: the table has no {kind}s with {crossings} "
                         f"crossing{'' if crossings == 1 else 's'}")
    raise TableError(f"no {kind} named {text!r}: no {kind} in the table has a name that starts "
                     f"with {prefix}{sep}")


def _unknown(text: str) -> TableError:
    """An error for an unreadable or unknown name, with close table names if there are any."""
    candidates = {name.lower(): name for name in _load(KNOT).by_name}
    candidates.update((name.lower(), name) for name in _load(LINK).orientations)
    close = [candidates[match] for match in
             difflib.get_close_matches(text.lower(), list(candidates), n=3, cutoff=0.6)]
    hint = f"; did you mean {', '.join(close)}?" if close else ""
    return TableError(f"no knot or link named {text!r}: expected a knot name such as 3_1, "
                      f"11a_1, K11a1 or a link name such as L7a1{{0}}{hint}")


def canonical_name(name: str) -> str:
    """The table's spelling of a knot or oriented-link name (see the module docstring).

    Parameters: ``name``, any accepted spelling. Returns the canonical spelling; raises
    :class:`~movies.errors.TableError` for a name the tables do not have.

    >>> canonical_name(" k11A1 "), canonical_name("L11n459{0, 1, 1}")
    ('11a_1', 'L11n459{0,1,1}')
    """
    if not isinstance(name, str):
        raise TableError(f"a table name must be text, not {type(name).__name__}")
    text = name.strip()
    for run in re.findall(r"[0-9]+", text):
        message = limits.digits_error(run)
        if message:
            raise LimitError(message, "digits")
    if len(text) > _LONGEST_NAME:  # no table name is this long; spare the search for close names
        raise TableError(f"no knot or link is named {text[:20]!r}…: table names have at most "
                         f"{_LONGEST_NAME} characters")
    if text[:1] in ("L", "l"):
        return _link_canonical(text)
    return _knot_canonical(text)


# --- public lookups ----------------------------------------------------------------------------

def lookup(name: str) -> TableEntry:
    """The knot or oriented link the tables call ``name``.

    Parameters: ``name``, in any spelling the module docstring lists; a link name without an
    orientation in braces means the first orientation the table lists (``{0}``, ``{0,0}``, ...).
    Returns a :class:`TableEntry` whose ``pd`` is the table's PD code as printed. Raises
    :class:`~movies.errors.TableError` for names the tables do not have, naming close ones.

    >>> entry = lookup("L11n459{0,1,1}")
    >>> entry.components, entry.crossing_number, entry.orientation, entry.unoriented_name
    (4, 11, '{0,1,1}', 'L11n459')
    >>> lookup("0_1").pd
    ()
    """
    if isinstance(name, str) and name in _entries:
        return _entries[name]
    canonical = canonical_name(name)
    if canonical in _entries:
        _entries[name] = _entries[canonical]
        return _entries[canonical]
    kind = LINK if canonical.startswith("L") else KNOT
    table = _load(kind)
    row = table.rows[table.by_name[canonical]]
    pd = _parse_pd(row[_PD_COLUMN[kind]], canonical)
    if kind == KNOT:
        entry = TableEntry(canonical, KNOT, pd, 1, int(row["crossing_number"]))
    else:
        entry = TableEntry(canonical, LINK, pd, int(row["components"]),
                           int(row["crossing_number"]), row["orientation"],
                           row["name_unoriented"])
    _entries[canonical] = _entries[name] = entry
    return entry


def table_names(kind: str | None = None, max_crossings: int | None = None) -> list[str]:
    """Canonical names in table order: knots first, then oriented links.

    Parameters: ``kind`` is ``"knot"``, ``"link"`` or None for both; ``max_crossings`` keeps
    names of at most that many crossings. Returns a new list of names.

    >>> table_names("knot", max_crossings=5)
    ['0_1', '3_1', '4_1', '5_1', '5_2']
    >>> table_names("link", max_crossings=2)
    ['L2a1{0}', 'L2a1{1}']
    """
    if kind not in (None, KNOT, LINK):
        raise InputError(f"kind must be 'knot', 'link' or None, not {kind!r}")
    kinds = [KNOT, LINK] if kind is None else [kind]
    names = []
    for each in kinds:
        for row in _load(each).rows:
            if max_crossings is None or int(row["crossing_number"]) <= max_crossings:
                names.append(row["name"])
    return names


def table_row(name: str) -> dict[str, str]:
    """Every column of one table row, as text, keyed by the table's column names.

    Parameters: ``name``, in any spelling :func:`lookup` accepts. Returns a new dict (blank
    entries are empty strings).

    >>> row = table_row("3_1")
    >>> row["braid_notation"], row["signature"]
    ('[1,1,1]', '-2')
    """
    canonical = canonical_name(name)
    kind = LINK if canonical.startswith("L") else KNOT
    table = _load(kind)
    start, length = table.offsets[canonical]
    with open(table.path, "rb") as handle:
        handle.seek(start)
        line = handle.read(length).decode("utf-8").rstrip("\r\n")
    fields = _split(line)
    fields += [""] * (len(table.header) - len(fields))
    return dict(zip(table.header, fields))
