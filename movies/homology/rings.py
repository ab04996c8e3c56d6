"""Ground rings of the engine: the integers and the prime fields, with exact arithmetic.

A ring is a small immutable record: ``p = 0`` for Z (and for Q, which the engine computes over Z
and finishes over the rationals), ``p`` prime for F_p. Coefficients are Python ints, reduced
mod p for F_p. The scanning algorithm only needs to know which coefficients are units it may
divide by (+-1 over Z, everything nonzero over F_p) and their inverses.

>>> ring = parse_field("F3")
>>> ring.name, ring.p, ring.is_unit(2), ring.inverse(2)
('F3', 3, True, 2)
>>> parse_field("Z").is_unit(2)
False
"""

from __future__ import annotations

import re
from dataclasses import dataclass

from movies import limits
from movies.homology.errors import FieldError

__all__ = ["Ring", "parse_field"]


@dataclass(frozen=True)
class Ring:
    """The ground ring: ``name`` as the user wrote it canonically, ``p`` its characteristic."""

    name: str
    p: int

    def reduce(self, value: int) -> int:
        """The canonical representative of ``value`` (mod p for a prime field).

        >>> Ring("F2", 2).reduce(-3)
        1
        """
        return value % self.p if self.p else value

    def is_unit(self, value: int) -> bool:
        """Whether ``value`` may be divided by during elimination.

        >>> Ring("Z", 0).is_unit(-1), Ring("F5", 5).is_unit(10)
        (True, False)
        """
        if self.p:
            return value % self.p != 0
        return value in (1, -1)

    def inverse(self, value: int) -> int:
        """The inverse of a unit.

        >>> Ring("F7", 7).inverse(3)
        5
        """
        if self.p:
            return pow(value, -1, self.p)
        return value  # +-1


def _is_prime(n: int) -> bool:
    if n < 2:
        return False
    k = 2
    while k * k <= n:
        if n % k == 0:
            return False
        k += 1
    return True


def parse_field(field: str) -> Ring:
    """The ring named ``field``: ``"Q"``, ``"Z"`` or ``"F<p>"`` with p prime (``"F2"``, ``"F3"``).

    Parameters: ``field``, a string (case of the letter ignored). Returns a :class:`Ring`; Q
    and Z share the integer ring (``p = 0``), the caller tells them apart by ``name``. Raises
    :class:`FieldError` for anything else.

    >>> parse_field("q"), parse_field("F2")
    (Ring(name='Q', p=0), Ring(name='F2', p=2))
    >>> parse_field("F4")
    Traceback (most recent call last):
    ...
    movies.errors.FieldError: ground ring 'F4': 4 is not a prime
    """
    if not isinstance(field, str):
        raise FieldError(f"ground ring {field!r} is not a name such as 'Q', 'Z', 'F2' or 'F3'")
    text = field.strip().upper()
    if text in ("Q", "Z"):
        return Ring(text, 0)
    if re.fullmatch(r"F[0-9]+", text):
        p = limits.number(text[1:], "the ground ring")
        if not _is_prime(p):
            raise FieldError(f"ground ring {field!r}: {p} is not a prime")
        return Ring(f"F{p}", p)
    raise FieldError(f"ground ring {field!r} is not one of 'Q', 'Z', 'F2', 'F3', 'F5', ...")
