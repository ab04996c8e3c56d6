"""The report layer: what the program says, as JSON, terminal text and one HTML page.

It only reads: a checked movie (:class:`~movies.checker.replay.CheckResult`), the answers of the
bounds questions, the invariants of a diagram. Nothing below it imports it.

- :mod:`.movie`: a checked movie as JSON-ready data, and its text layout;
- :mod:`.html`: the same as one self-contained HTML page, every frame drawn;
- :mod:`.places`: where a step acts in the frame before it, for the drawings;
- :mod:`.invariants`, :mod:`.questions`: the other commands' text layouts.

>>> from movies.checker.replay import check_movie
>>> from movies.report import as_json
>>> as_json(check_movie("start unknot\\ndeath 1"))["verdict"]
'verified'
"""

__all__ = ["as_json", "as_text", "movie_html", "html_repr"]

_HOMES = {"as_json": "movies.report.movie", "as_text": "movies.report.movie",
          "movie_html": "movies.report.html", "html_repr": "movies.report.html"}


def __getattr__(name: str):
    # imported on first use: the page's drawing code (and numpy) only when a page is asked for
    if name in _HOMES:
        import importlib

        return getattr(importlib.import_module(_HOMES[name]), name)
    raise AttributeError(f"module 'movies.report' has no attribute {name!r}")
