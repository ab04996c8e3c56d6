"""How large an input may be: the limits, as plain data, and the checks that apply them.

Every limit is checked before the work it guards begins, so that an input past it is refused at
once, with a message that names the input, the limit and how to raise it, instead of running for
hours or filling the machine's memory. The defaults are far above any diagram or movie made by
hand or by the table: the largest table knots have 13 crossings, homology is out of reach long
before 100 crossings, and a hand-written movie has tens of steps.

=============  =========  ========================================================================
name           default    what it bounds
=============  =========  ========================================================================
``crossings``  2000       crossings of one diagram (a spec, a PD code, a braid, every frame)
``strands``    500        strands of a braid or a torus link
``components`` 1000       components of one diagram
``depth``      100        nesting: brackets, and diagrams inside diagrams (``#``, ``+``, mirror, reverse)
``lines``      100000     lines of a movie file
``digits``     12         digits of one number anywhere in the input
``seconds``    3600       seconds one search may take (``--budget``, ``budget N seconds``)
``blowups``    1000       CP²-bar summands asked about (``movies bounds --blowups``)
=============  =========  ========================================================================

The command line raises a limit with ``--limit NAME=VALUE`` (repeatable); Python code with
:func:`using`.

>>> current()["crossings"]
2000
>>> with using(crossings=5000):
...     current()["crossings"]
5000
>>> check("crossings", 2001, "torus(2, 2001) would have 2001 crossings")
Traceback (most recent call last):
...
movies.errors.LimitError: torus(2, 2001) would have 2001 crossings; the limit is 2000 (raise it with --limit crossings=N)
"""

from __future__ import annotations

import contextlib
import contextvars
import math
import re
from fractions import Fraction
from typing import Iterator, Mapping

from movies.errors import InputError, LimitError

__all__ = ["DEFAULTS", "MEANING", "current", "using", "check", "exceeds", "number", "seconds", "setting",
           "show_number"]

#: the limits and their defaults
DEFAULTS: Mapping[str, int] = {
    "crossings": 2000,
    "strands": 500,
    "components": 1000,
    "depth": 100,
    "lines": 100_000,
    "digits": 12,
    "seconds": 3600,
    "blowups": 1000,
}

#: what each limit bounds, as the help text says it
MEANING: Mapping[str, str] = {
    "crossings": "crossings of one diagram",
    "strands": "strands of a braid or torus link",
    "components": "components of one diagram",
    "depth": "nesting depth of a diagram (brackets, '#', '+', mirror, reverse)",
    "lines": "lines of a movie",
    "digits": "digits of one number",
    "seconds": "seconds one search may take",
    "blowups": "CP²-bar summands of a question",
}

_CURRENT: contextvars.ContextVar[Mapping[str, int]] = contextvars.ContextVar("movies_limits", default=DEFAULTS)


def current() -> dict[str, int]:
    """The limits in force (a copy).

    >>> sorted(current()) == sorted(DEFAULTS)
    True
    """
    return dict(_CURRENT.get())


@contextlib.contextmanager
def using(changes: Mapping[str, int] | None = None, **more: int) -> Iterator[dict[str, int]]:
    """Run a block with some limits changed; the others keep their values.

    >>> with using({"digits": 20}, lines=10):
    ...     current()["digits"], current()["lines"], current()["depth"]
    (20, 10, 100)
    """
    new = current()
    for name, value in {**(changes or {}), **more}.items():
        if name not in DEFAULTS:
            raise InputError(f"there is no limit named {name!r}; the limits are {', '.join(DEFAULTS)}")
        if isinstance(value, bool) or not isinstance(value, int) or value < 1:
            raise InputError(f"the limit {name} is a whole number, 1 or more, not {value!r}")
        new[name] = value
    token = _CURRENT.set(new)
    try:
        yield dict(new)
    finally:
        _CURRENT.reset(token)


def exceeds(name: str, subject: str) -> str:
    """The message for an input past limit ``name``: ``subject``, the limit, and how to raise it.

    >>> exceeds("strands", "braid(600)[1] would have 600 strands")
    'braid(600)[1] would have 600 strands; the limit is 500 (raise it with --limit strands=N)'
    """
    return f"{subject}; the limit is {_CURRENT.get()[name]} (raise it with --limit {name}=N)"


def check(name: str, value: int, subject: str) -> None:
    """Raise :class:`~movies.errors.LimitError` when ``value`` is past limit ``name``.

    ``subject`` says what the input is and how much of the limited thing it has, e.g.
    ``"unlink(5000) would have 5000 components"``.

    >>> check("components", 1000, "unlink(1000) would have 1000 components")
    """
    if value > _CURRENT.get()[name]:
        raise LimitError(exceeds(name, subject), name)


def show_number(digits: str) -> str:
    """A number as a message shows it: in full when short, else its ends and its length.

    >>> show_number("12345"), show_number("9" * 5000)
    ('12345', '99999999…99999999')
    """
    if len(digits) <= 24:
        return digits
    return f"{digits[:8]}…{digits[-8:]}"


def digits_error(text: str, what: str = "") -> str | None:
    """The message when the number ``text`` has more digits than the limit allows, else None.

    >>> digits_error("123") is None
    True
    >>> digits_error("-" + "1" * 13, "--strands")
    '--strands: the number -1111111111111 has 13 digits; the limit is 12 (raise it with --limit digits=N)'
    """
    count = sum(1 for char in text if char.isdigit())
    if count <= _CURRENT.get()["digits"]:
        return None
    prefix = f"{what}: " if what else ""
    return exceeds("digits", f"{prefix}the number {show_number(text.strip())} has {count} digits")


_INTEGER = re.compile(r"\s*[+-]?[0-9]+\s*")


def number(text: str, what: str) -> int:
    """The integer written in ``text``, refused when it is not one or is past the digits limit.

    ``what`` names the input in messages (an option, a statement's word).

    >>> number("42", "--strands"), number(" -7 ", "--genus")
    (42, -7)
    >>> number("4x", "--strands")
    Traceback (most recent call last):
    ...
    movies.errors.InputError: --strands is a whole number, not '4x'
    """
    if not isinstance(text, str) or not _INTEGER.fullmatch(text):
        raise InputError(f"{what} is a whole number, not {show_number(str(text))!r}")
    message = digits_error(text, what)
    if message:
        raise LimitError(message, "digits")
    return int(text)


_DECIMAL = re.compile(r"\s*(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)\s*")


def seconds(text: str, what: str) -> float:
    """A time allowed to a search, in seconds: a plain decimal number, 0 or more, within the limit.

    Refused: negative numbers, ``nan``, ``inf``, exponents, anything else that is not digits
    with at most one point.

    >>> seconds("2.5", "--budget")
    2.5
    >>> seconds("nan", "--budget")
    Traceback (most recent call last):
    ...
    movies.errors.InputError: --budget is a number of seconds, 0 or more, such as 5 or 0.5, not 'nan'
    >>> seconds("5000", "--budget")
    Traceback (most recent call last):
    ...
    movies.errors.LimitError: --budget 5000 would let one search run 5000 seconds; the limit is 3600 (raise it with --limit seconds=N)
    """
    if not isinstance(text, str) or not _DECIMAL.fullmatch(text):
        raise InputError(f"{what} is a number of seconds, 0 or more, such as 5 or 0.5, not {show_number(str(text))!r}")
    whole = text.strip().split(".")[0]
    message = digits_error(whole, what)
    if message:
        raise LimitError(message, "digits")
    exact = Fraction(text.strip())
    check("seconds", math.ceil(exact), f"{what} {text.strip()} would let one search run {text.strip()} seconds")
    return float(exact)


_SETTING = re.compile(r"\s*([A-Za-z]+)\s*=\s*([0-9]+)\s*")


def setting(text: str) -> tuple[str, int]:
    """``NAME=VALUE`` as the command line's ``--limit`` takes it.

    >>> setting("crossings=5000")
    ('crossings', 5000)
    >>> setting("size=3")
    Traceback (most recent call last):
    ...
    movies.errors.InputError: --limit: there is no limit named 'size'; the limits are crossings, strands, components, depth, lines, digits, seconds, blowups
    """
    found = _SETTING.fullmatch(text) if isinstance(text, str) else None
    if not found:
        raise InputError(f"--limit takes NAME=VALUE with a whole number, e.g. crossings=5000, not {show_number(str(text))!r}")
    name, value = found.group(1).lower(), found.group(2)
    if name not in DEFAULTS:
        raise InputError(f"--limit: there is no limit named {name!r}; the limits are {', '.join(DEFAULTS)}")
    if len(value.lstrip("0")) > 18:
        raise InputError(f"--limit {name}: {show_number(value)} is more than any computer could use")
    if int(value) < 1:
        raise InputError(f"--limit {name}: a limit is 1 or more")
    return name, int(value)
