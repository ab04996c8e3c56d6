"""Errors of the homology engine (they live in :mod:`movies.errors` with every other error).

>>> issubclass(HomologyError, MoviesError)
True
"""

from __future__ import annotations

from movies.errors import FieldError, HomologyError, MoviesError, NotAKnotError

__all__ = ["HomologyError", "FieldError", "NotAKnotError", "MoviesError"]
