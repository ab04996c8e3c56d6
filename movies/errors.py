"""The one family of errors the package raises.

Every error the package raises on purpose descends from :class:`MoviesError`, so a caller (the
command line above all) can catch one class and print a one-line reason instead of a
traceback. ``exit_code`` is what the command line returns for it: 2 for input it cannot use,
3 for :class:`InternalError` (a bug of the program, never of the input).

::

    MoviesError
    ├── InputError                 input that cannot be read or used (exit 2)
    │   ├── PDCodeError, BraidError (GeneratorError), TableError
    │   ├── LimitError             input past one of the limits of movies.limits
    │   └── the located errors of the readers (below)
    ├── DiagramError               a name the diagram does not have (exit 2)
    │   ├── MoveError, NameInUseError, EmptyDiagramError, NotNullHomologousError
    ├── HomologyError              FieldError, NotAKnotError (exit 2)
    └── InternalError              a failed internal check: a bug (exit 3)
        └── InternalInconsistency  a verified movie that breaks a theorem

A located error (:class:`LocatedError`) also carries the ``line`` and ``column`` (from 1) of the
spot in the text and draws it with a caret (``context()``); each reader error is a located
version of one of the classes above, so ``except TableError`` catches an unknown table name
whether it was met in a movie, in a diagram spec or in a call from Python.

>>> try:
...     raise DiagramError("edge 7 is not in the diagram")
... except MoviesError as err:
...     print(err)
edge 7 is not in the diagram
>>> InternalError.exit_code, SpecTableError.exit_code
(3, 2)
"""

from __future__ import annotations


class MoviesError(Exception):
    """Root of every error the package raises on purpose."""

    #: exit code the command line uses for this kind of error
    exit_code = 2


class InputError(MoviesError):
    """Input that cannot be read: unparsable text, a malformed code, an unknown name."""


class ColumnTextError(InputError):
    """A table entry whose text is not in any form its column uses."""


class PDCodeError(InputError):
    """A PD code that is not the code of an oriented link diagram on the 2-sphere."""


class BraidError(InputError):
    """A braid word that cannot be read (generator out of range, zero, not an integer)."""


class GeneratorError(BraidError):
    """A braid generator that cannot be used; ``position`` is its place in the word (from 1)."""

    def __init__(self, message: str, position: int) -> None:
        super().__init__(message)
        self.position = position


class TableError(InputError):
    """A knot or link name the tables do not know."""


class LimitError(InputError):
    """Input past one of the limits of :mod:`movies.limits`; ``name`` is the limit's name,
    ``position`` the place (from 1) in a list the input came as (a braid word), when it has one."""

    def __init__(self, message: str, name: str = "", position: int | None = None) -> None:
        super().__init__(message)
        self.name = name
        self.position = position


class DiagramError(MoviesError):
    """An operation on a diagram that names something the diagram does not have."""


class MoveError(DiagramError):
    """A Reidemeister or Morse move that does not apply where it was asked to."""


class NotNullHomologousError(DiagramError):
    """s of a link in a connected sum of S¹×S² asked for a link that is not null-homologous."""


class NotTwoDivisibleError(DiagramError):
    """Khovanov homology of a link in a connected sum of S¹×S² asked for a link that is not 2-divisible."""


class NameInUseError(DiagramError):
    """A name the caller chose for something new is already taken."""


class EmptyDiagramError(DiagramError):
    """The empty diagram has no bracket or Jones polynomial in Laurent polynomials (it is 1/d)."""


class HomologyError(MoviesError):
    """A homology computation that cannot be done as asked."""


class FieldError(HomologyError):
    """A ground ring name that is not ``"Q"``, ``"Z"`` or ``"F<prime>"``."""


class NotAKnotError(HomologyError):
    """An invariant defined here for knots only, asked of a link."""


class InternalError(MoviesError):
    """A failed internal consistency check: a bug of the program, never a fault of the input."""

    exit_code = 3


class InternalInconsistency(InternalError):
    """A fully verified movie broke a theorem: that is a bug of this program, never of the movie."""


# ---------------------------------------------------------------------- located errors


class LocatedError(MoviesError):
    """Where in the text an error is: ``line`` and ``column`` (from 1), and the ``text``.

    ``reason`` is the message without the place; ``str()`` adds the place.

    >>> err = LocatedError("unexpected ']'", "3_1 +\\nbraid[1]]", 2, 9)
    >>> str(err)
    "unexpected ']' (line 2, column 9)"
    """

    def __init__(self, reason: str, text: str, line: int, column: int) -> None:
        super().__init__(f"{reason} (line {line}, column {column})")
        self.reason = reason
        self.text = text
        self.line = line
        self.column = column

    def context(self, span: int = 40) -> str:
        """The offending line (at most ``span`` characters either side) and a caret under the spot.

        >>> err = SpecSyntaxError("unexpected ']'", "3_1 +\\nbraid[1]]", 2, 9)
        >>> print(err.context())
        braid[1]]
                ^
        """
        line = _line_of(self.text, self.line)
        spot = self.column - 1
        start = max(0, spot - span)
        before, after = line[start:spot], line[spot:spot + span]
        pad = "".join("\t" if ch == "\t" else " " for ch in before)
        return f"{before}{after}\n{pad}^"

    def moved(self, text: str, line: int, column: int) -> "LocatedError":
        """The same error, of the same class, pointing at another place in another text.

        >>> err = SpecSyntaxError("unexpected ','", "3_1 ,", 1, 5).moved("start 3_1 ,", 1, 11)
        >>> type(err).__name__, err.line, err.column
        ('SpecSyntaxError', 1, 11)
        """
        moved = type(self)(self.reason, text, line, column)
        for key, value in vars(self).items():  # what a subclass carries besides the place
            if key not in ("reason", "text", "line", "column"):
                setattr(moved, key, value)
        return moved


#: kept for the readers' older name
Located = LocatedError


def _line_of(text: str, number: int) -> str:
    """Line ``number`` (from 1) of ``text`` without splitting all of it."""
    if number < 1:
        return ""
    start = 0
    for _ in range(number - 1):
        start = text.find("\n", start) + 1
        if start == 0:
            return ""
    end = text.find("\n", start)
    return text[start:] if end < 0 else text[start:end]


class LocatedLimitError(LocatedError, LimitError):
    """Text past one of the limits of :mod:`movies.limits`, with the spot; ``name`` is the limit's."""

    def __init__(self, reason: str, text: str, line: int, column: int, name: str = "") -> None:
        super().__init__(reason, text, line, column)
        self.name = name


class SpecSyntaxError(LocatedError, InputError):
    """Text that the diagram notation cannot read."""


class SpecInputError(LocatedError, InputError):
    """Text that reads but asks for something that cannot be made (``unlink(-1)``, ...)."""


class SpecTableError(LocatedError, TableError):
    """A table name in the text that the tables do not have."""


class SpecBraidError(LocatedError, BraidError):
    """A braid word in the text with a generator or strand count that cannot be used."""


class SpecPDCodeError(LocatedError, PDCodeError):
    """A PD code in the text that is not the code of a diagram."""


class SpecDiagramError(LocatedError, DiagramError):
    """An edge, face or component number in the text that its diagram does not have."""


class MovieSyntaxError(LocatedError, InputError):
    """A movie file the language cannot read; carries the line, column and a caret picture."""


class MovieInputError(LocatedError, InputError):
    """A statement that reads but cannot mean anything (a polynomial that does not parse, ...)."""


#: the located class for an error of each kind, most specific first
_LOCATED: tuple[tuple[type, type], ...] = (
    (LimitError, LocatedLimitError),
    (TableError, SpecTableError),
    (BraidError, SpecBraidError),
    (PDCodeError, SpecPDCodeError),
    (DiagramError, SpecDiagramError),
    (MoviesError, SpecInputError),
)


def located(err: MoviesError, text: str, line: int, column: int) -> LocatedError:
    """A located version of ``err`` (same message, the class that fits its kind).

    A located error is only moved; an :class:`InternalError` is a bug and is never
    turned into a complaint about the input, so it is refused here.

    >>> err = located(TableError("no knot named '3_9'"), "3_9", 1, 1)
    >>> type(err).__name__, isinstance(err, TableError), err.column
    ('SpecTableError', True, 1)
    """
    if isinstance(err, InternalError):
        raise TypeError("an internal error is not a fault of the input") from err
    if isinstance(err, LocatedError):
        return err.moved(text, line, column)
    for base, kind in _LOCATED:
        if isinstance(err, base):
            found = kind(str(err), text, line, column)
            if isinstance(err, LimitError):
                found.name, found.position = err.name, err.position
            return found
    raise TypeError(f"not an error of the package: {err!r}")
