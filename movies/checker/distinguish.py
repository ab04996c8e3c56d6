"""Telling two diagrams apart: the first invariant that differs, if any.

An isotopy claim that the search cannot prove is checked this way: a difference proves it
false, agreement leaves it open. Invariants are tried cheapest first.

>>> from movies.diagram.pd import from_pd
>>> from movies.diagram.isotopy import reflect_and_switch
>>> right = from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]])
>>> first_difference(right, reflect_and_switch(right)) is None
True
>>> first_difference(right, from_pd([[2, 5, 3, 6], [4, 1, 5, 2], [6, 3, 1, 4]])).invariant
'signature'
"""

from __future__ import annotations

from dataclasses import dataclass
from itertools import permutations
from typing import Any, Callable

from movies.diagram.model import Diagram
from movies.homology import khovanov_homology, rasmussen_s
from movies.invariants.alexander import alexander_polynomial
from movies.invariants.jones import jones_polynomial
from movies.invariants.signature import signature


@dataclass(frozen=True)
class Difference:
    """An invariant on which two diagrams disagree, with both values (as text)."""

    invariant: str
    first: str
    second: str

    def __str__(self) -> str:
        return f"{self.invariant}: {self.first} against {self.second}"


def _linking_up_to_order(first: Diagram, second: Diagram) -> bool:
    a, b = first.linking_matrix(), second.linking_matrix()
    if len(a) != len(b):
        return False
    if len(a) > 7:  # too many orders to try: compare the multisets of rows
        return sorted(sorted(r) for r in a) == sorted(sorted(r) for r in b)
    n = len(a)
    return any(all(a[i][j] == b[p[i]][p[j]] for i in range(n) for j in range(n)) for p in permutations(range(n)))


def _nonempty(f: Callable[[Diagram], Any]) -> Callable[[Diagram], Any]:
    return lambda d: None if d.is_empty() else f(d)


def _khovanov(field: str) -> Callable[[Diagram], Any]:
    return lambda d: None if d.is_empty() else khovanov_homology(d, field)


def _s(field: str) -> Callable[[Diagram], Any]:
    return lambda d: rasmussen_s(d, field) if d.component_count() == 1 else None


#: (name, how to compute it) in the order they are tried, cheapest first
INVARIANTS: list[tuple[str, Callable[[Diagram], Any]]] = [
    ("number of components", lambda d: d.component_count()),
    ("signature", _nonempty(signature)),
    ("Jones polynomial", _nonempty(jones_polynomial)),
    ("Alexander polynomial", _nonempty(alexander_polynomial)),
    ("Khovanov homology over Q", _khovanov("Q")),
    ("Khovanov homology over F2", _khovanov("F2")),
    ("s over Q", _s("Q")),
    ("s over F2", _s("F2")),
]


def first_difference(first: Diagram, second: Diagram) -> Difference | None:
    """The first invariant that differs: components, linking numbers, signature, Jones, Alexander,
    Khovanov homology over Q and F2, s over Q and F2.

    Parameters
    ----------
    first, second : Diagram

    Returns
    -------
    Difference or None
        None when every invariant agrees (which proves nothing).

    >>> from movies.diagram.constructors import unlink
    >>> str(first_difference(unlink(2), unlink(3)))
    'number of components: 2 against 3'
    """
    for name, compute in INVARIANTS[:1]:
        one, two = compute(first), compute(second)
        if one != two:
            return Difference(name, str(one), str(two))
    if not _linking_up_to_order(first, second):
        return Difference("linking numbers", str(first.linking_matrix()), str(second.linking_matrix()))
    for name, compute in INVARIANTS[1:]:
        one, two = compute(first), compute(second)
        if one != two:
            return Difference(name, str(one), str(two))
    return None
