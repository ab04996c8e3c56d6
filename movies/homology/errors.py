"""Errors of the homology engine.

>>> issubclass(HomologyError, MoviesError)
True
"""

from __future__ import annotations

from movies.errors import MoviesError

__all__ = ["HomologyError", "FieldError", "NotAKnotError"]


class HomologyError(MoviesError):
    """A homology computation that cannot be done as asked."""


class FieldError(HomologyError):
    """A ground ring name that is not ``"Q"``, ``"Z"`` or ``"F<prime>"``."""


class NotAKnotError(HomologyError):
    """An invariant defined here for knots only, asked of a link."""
