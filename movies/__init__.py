"""Check cobordisms and slice surfaces written as movies of link diagrams."""

from movies.errors import MoviesError

__all__ = ["MoviesError"]
__version__ = "0.1.0"
