"""The one family of errors the package raises.

Every error that reaches a user descends from :class:`MoviesError`, so a caller (the command line
above all) can catch one class and print a one-line reason instead of a traceback.

>>> try:
...     raise DiagramError("edge 7 is not in the diagram")
... except MoviesError as err:
...     print(err)
edge 7 is not in the diagram
"""

from __future__ import annotations


class MoviesError(Exception):
    """Root of every error the package raises on purpose."""

    #: exit code the command line uses for this kind of error
    exit_code = 2


class InputError(MoviesError):
    """Input that cannot be read: unparsable text, a malformed code, an unknown name."""


class PDCodeError(InputError):
    """A PD code that is not the code of an oriented link diagram on the 2-sphere."""


class BraidError(InputError):
    """A braid word that cannot be read (generator out of range, zero, not an integer)."""


class TableError(InputError):
    """A knot or link name the tables do not know."""


class DiagramError(MoviesError):
    """An operation on a diagram that names something the diagram does not have."""


class MoveError(DiagramError):
    """A Reidemeister or Morse move that does not apply where it was asked to."""
