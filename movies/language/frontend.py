"""What both readers share: the grammar files, places in the text, numbers and nesting.

The located errors themselves live in :mod:`movies.errors` (:class:`~movies.errors.LocatedError`
and its kinds); this module finds the places they point at and applies the limits of
:mod:`movies.limits` that concern text: the digits of a number and how deep brackets nest.

>>> position("3_1 +\\nbraid[1]]", 14)
(2, 9)
>>> read_int(Token("INT", "12", line=1, column=7), "unlink(12)")
12
"""

from __future__ import annotations

import importlib.resources
import pathlib

from lark import Token

from movies import limits
from movies.errors import LocatedLimitError

__all__ = ["grammar_text", "position", "Lines", "read_int", "check_digits", "nesting_problem", "check_nesting"]

OPENERS = "([{"
CLOSERS = ")]}"


def grammar_text(name: str) -> str:
    """The text of ``grammar/<name>``, from the installed package data ``movies.grammar``
    or, in a source checkout run in place, from the grammar folder beside the package.

    >>> "-> connected_sum" in grammar_text("diagram.lark")
    True
    """
    try:
        return (importlib.resources.files("movies.grammar") / name).read_text(encoding="utf-8")
    except (ModuleNotFoundError, FileNotFoundError):  # pragma: no cover - uninstalled checkout
        return (pathlib.Path(__file__).resolve().parents[2] / "grammar" / name).read_text(encoding="utf-8")


def position(text: str, offset: int) -> tuple[int, int]:
    """Line and column (from 1) of a character offset.

    >>> position("start unknot\\nband 1 2", 13)
    (2, 1)
    """
    line = text.count("\n", 0, offset) + 1
    return line, offset - (text.rfind("\n", 0, offset) + 1) + 1


class Lines:
    """The lines of a text, split once, so that looking up a statement's line costs nothing.

    >>> Lines("a\\nb c")[2], Lines("a")[5]
    ('b c', '')
    """

    def __init__(self, text: str) -> None:
        self.rows = text.split("\n")

    def __getitem__(self, number: int) -> str:
        return self.rows[number - 1] if 0 < number <= len(self.rows) else ""

    def __len__(self) -> int:
        return len(self.rows)


def check_digits(digits: str, text: str, line: int, column: int, what: str = "") -> None:
    """Refuse a number with more digits than the limit allows, pointing at it.

    >>> check_digits("9" * 13, "torus(2, 9999999999999)", 1, 10)
    Traceback (most recent call last):
    ...
    movies.errors.LocatedLimitError: the number 9999999999999 has 13 digits; the limit is 12 (raise it with --limit digits=N) (line 1, column 10)
    """
    message = limits.digits_error(digits, what)
    if message:
        raise LocatedLimitError(message, text, line, column, "digits")


def read_int(token: Token, text: str) -> int:
    """The integer a token holds, refused (at the token) when it has too many digits.

    >>> from lark import Token
    >>> read_int(Token("INT", "42", line=1, column=6), "band 42 7")
    42
    """
    check_digits(str(token), text, token.line, token.column)
    return int(token)


def nesting_problem(text: str, comment: str | None = "%", strings: bool = False) -> int | None:
    """The offset of the first opening bracket that nests deeper than the depth limit, or None.

    Brackets are ``( [ {``, counted without matching their kinds (a mismatch is the parser's to
    report). ``comment`` starts a comment to the end of the line; with ``strings`` JSON strings
    are skipped. One pass over the text, before any parsing.

    >>> nesting_problem("mirror(" * 3 + "3_1" + ")" * 3)
    >>> with limits.using(depth=2):
    ...     nesting_problem("((x)) % ((((")
    ...     nesting_problem("(((x)))")
    2
    """
    limit = limits.current()["depth"]
    depth = 0
    quoted = escaped = skipping = False
    for offset, char in enumerate(text):
        if skipping:
            skipping = char != "\n"
        elif quoted:
            if escaped:
                escaped = False
            elif char == "\\":
                escaped = True
            elif char == '"':
                quoted = False
        elif char in OPENERS:
            depth += 1
            if depth > limit:
                return offset
        elif char in CLOSERS:
            depth = max(0, depth - 1)
        elif char == comment:
            skipping = True
        elif strings and char == '"':
            quoted = True
    return None


def depth_message(depth: int, what: str = "brackets", how: str = "") -> str:
    """The message for nesting past the depth limit.

    >>> depth_message(101)
    'brackets nest 101 deep here; the limit is 100 (raise it with --limit depth=N)'
    """
    return limits.exceeds("depth", f"{what} nest {depth} deep here{how}")


def check_nesting(text: str) -> None:
    """Refuse text whose brackets nest deeper than the limit, pointing at the bracket too many.

    >>> check_nesting("(" * 101 + "3_1" + ")" * 101)
    Traceback (most recent call last):
    ...
    movies.errors.LocatedLimitError: brackets nest 101 deep here; the limit is 100 (raise it with --limit depth=N) (line 1, column 101)
    """
    offset = nesting_problem(text)
    if offset is not None:
        raise LocatedLimitError(depth_message(limits.current()["depth"] + 1), text, *position(text, offset), "depth")
