"""Reading the text a user points at: a file, or a movie given as text, a path or a parsed movie.

>>> read_movie("start unknot\\ndeath 1").steps[0].kind
'death'
"""

from __future__ import annotations

import os

from movies.errors import InputError

__all__ = ["read_text", "read_movie"]


def read_text(path: str | os.PathLike) -> str:
    """A file's text, or an :class:`~movies.errors.InputError` that says why it cannot be read.

    >>> read_text("no/such/file.movie")
    Traceback (most recent call last):
    ...
    movies.errors.InputError: cannot read no/such/file.movie: No such file or directory
    """
    try:
        with open(path, encoding="utf-8") as handle:
            return handle.read()
    except OSError as err:
        raise InputError(f"cannot read {os.fspath(path)}: {err.strerror}") from None
    except UnicodeDecodeError:
        raise InputError(f"cannot read {os.fspath(path)}: it is not UTF-8 text") from None


def read_movie(source):
    """A :class:`~movies.language.movie.Movie` from whatever a notebook user would pass.

    Parameters
    ----------
    source : Movie, str or os.PathLike
        A parsed movie (returned as it is); a path (a ``pathlib.Path``, or a one-line string
        that names a file or ends in ``.movie``); otherwise the movie's text.

    Returns
    -------
    Movie

    Raises
    ------
    InputError
        A file that cannot be read; MovieSyntaxError (an InputError) for text that is not a movie.

    >>> read_movie("examples/movies/none-such.movie")
    Traceback (most recent call last):
    ...
    movies.errors.InputError: cannot read examples/movies/none-such.movie: No such file or directory
    """
    from movies.language.movie import Movie, parse_movie

    if isinstance(source, Movie):
        return source
    if isinstance(source, os.PathLike):
        return parse_movie(read_text(source))
    if not isinstance(source, str):
        raise InputError(f"a movie is its text, a path or a parsed Movie, not {type(source).__name__}")
    one_line = "\n" not in source.strip()
    if one_line and (source.strip().endswith(".movie") or os.path.isfile(source.strip())):
        return parse_movie(read_text(source.strip()))
    return parse_movie(source)
