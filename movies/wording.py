"""Small pieces of the program's English, shared by every layer that writes to a person.

>>> plural(1, "band"), plural(3, "Reidemeister move")
('1 band', '3 Reidemeister moves')
"""

from __future__ import annotations

__all__ = ["plural"]


def plural(count: int, word: str) -> str:
    """``count word``, with an s unless the count is one.

    >>> plural(1, "band"), plural(2, "band"), plural(0, "death")
    ('1 band', '2 bands', '0 deaths')
    """
    return f"{count} {word}" + ("" if count == 1 else "s")
