"""The report layer: what the program says, as JSON, terminal text and one HTML page.

It only reads: a checked movie (:class:`~movies.checker.replay.CheckResult`), the answers of the
bounds questions, the invariants of a diagram. Nothing below it imports it.

- :mod:`.movie`: a checked movie as JSON-ready data, and its text layout;
- :mod:`.html`: the same as one self-contained HTML page, every frame drawn;
- :mod:`.places`: where a step acts in the frame before it, for the drawings;
- :mod:`.invariants`, :mod:`.questions`: the other commands' text layouts.

>>> from movies.checker.replay import check_movie
>>> as_json(check_movie("start unknot\\ndeath 1"))["verdict"]
'verified'
"""

from movies.report.html import html_repr, movie_html
from movies.report.movie import as_json, as_text

__all__ = ["as_json", "as_text", "movie_html", "html_repr"]
