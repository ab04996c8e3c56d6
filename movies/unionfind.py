"""Union-find, the one way the package groups things into classes.

Three shapes of the same structure, each where its callers need it:

- :class:`UnionFind` on any hashable names; each class is represented by its smallest member;
- :func:`partition_roots` on the integers ``0 .. n-1`` in one call (the scanning loops of the
  homology engine and the Jones polynomial call it once per glueing);
- :class:`ParityUnionFind`, which also keeps a sign (+1 / −1) of each member relative to its
  class, and notices a sign that contradicts the others (orientations of a surface).

>>> classes = UnionFind()
>>> classes.union(3, 7); classes.union(7, 5)
>>> classes.find(5), classes.find(4)
(3, 4)
>>> partition_roots(5, [(0, 3), (3, 4)])
[0, 1, 2, 0, 0]
"""

from __future__ import annotations

from typing import Hashable, Iterable

__all__ = ["UnionFind", "partition_roots", "ParityUnionFind"]


class UnionFind:
    """Classes of hashable, mutually comparable names; a name never seen is its own class.

    The representative of a class is its smallest member, so results do not depend on the order
    of the unions.

    >>> u = UnionFind()
    >>> u.union("b", "c"); u.union("a", "c")
    >>> u.find("c"), u.same("a", "b")
    ('a', True)
    """

    def __init__(self) -> None:
        self.parent: dict = {}

    def find(self, x: Hashable):
        parent = self.parent
        parent.setdefault(x, x)
        root = x
        while parent[root] != root:
            root = parent[root]
        while parent[x] != root:
            parent[x], x = root, parent[x]
        return root

    def union(self, x: Hashable, y: Hashable) -> None:
        rx, ry = self.find(x), self.find(y)
        if rx != ry:
            if ry < rx:
                rx, ry = ry, rx
            self.parent[ry] = rx

    def same(self, x: Hashable, y: Hashable) -> bool:
        return self.find(x) == self.find(y)


def partition_roots(n: int, pairs: Iterable[tuple[int, int]]) -> list[int]:
    """The smallest member of the class of each of ``0 .. n-1`` after joining every pair.

    >>> partition_roots(4, [(2, 1), (3, 2)])
    [0, 1, 1, 1]
    """
    parent = list(range(n))
    for a, b in pairs:
        while parent[a] != a:
            parent[a] = parent[parent[a]]
            a = parent[a]
        while parent[b] != b:
            parent[b] = parent[parent[b]]
            b = parent[b]
        if a != b:
            if b < a:
                a, b = b, a
            parent[b] = a
    roots = parent
    for x in range(n):
        r = x
        while roots[r] != r:
            r = roots[r]
        roots[x] = r
    return roots


class ParityUnionFind:
    """Union-find that also keeps the relative sign (+1 / −1) of each node to its root.

    ``join(a, b, same)`` asks for sign(a)·sign(b) = +1 when ``same`` and −1 otherwise; a request
    that contradicts the signs already fixed marks the class ``bad`` and returns False.

    >>> p = ParityUnionFind()
    >>> for node in "abc":
    ...     p.add(node)
    >>> p.join("a", "b", False), p.join("b", "c", False), p.join("a", "c", False)
    (True, True, False)
    >>> p.find("c")[1] * p.find("a")[1]
    1
    """

    def __init__(self) -> None:
        self.parent: dict = {}
        self.sign: dict = {}
        self.bad: set = set()  # roots of classes with an inconsistent sign

    def add(self, node: Hashable) -> None:
        if node not in self.parent:
            self.parent[node] = node
            self.sign[node] = 1

    def find(self, node: Hashable) -> tuple[Hashable, int]:
        path = []
        while self.parent[node] != node:
            path.append(node)
            node = self.parent[node]
        root, total = node, 1
        for item in reversed(path):
            total *= self.sign[item]
            self.parent[item] = root
            self.sign[item] = total
        return root, (self.sign[path[0]] if path else 1)

    def join(self, a: Hashable, b: Hashable, same: bool) -> bool:
        """Join with sign(a)·sign(b) = +1 when ``same``; returns False if that contradicts."""
        (ra, sa), (rb, sb) = self.find(a), self.find(b)
        want = 1 if same else -1
        if ra == rb:
            if sa * sb != want:
                self.bad.add(ra)
                return False
            return True
        self.parent[rb] = ra
        self.sign[rb] = sa * sb * want
        if rb in self.bad:
            self.bad.discard(rb)
            self.bad.add(ra)
        return True
