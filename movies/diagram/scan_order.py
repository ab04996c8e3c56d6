"""The order in which the scanning algorithms add the crossings of a PD code.

The Jones polynomial and the homology engine both add crossings one at a time, keeping the
boundary of the part already added short; they share this order so that the same diagram is
always scanned the same way. Connected pieces come one after another, each in a greedy order
from the best starting crossing.

>>> scan_order([(1, 5, 2, 4), (3, 1, 4, 6), (5, 3, 6, 2)])
[0, 1, 2]
>>> connected_pieces([(1, 2, 2, 1), (3, 4, 4, 3)])
[[0], [1]]
"""

from __future__ import annotations

from movies.errors import PDCodeError
from movies.unionfind import partition_roots

__all__ = ["checked_pd", "connected_pieces", "piece_order", "scan_order"]


def checked_pd(pd) -> list:
    """The PD code as a list of 4-tuples; PDCodeError unless every label occurs exactly twice.

    >>> checked_pd([[1, 1, 2, 2]])
    [(1, 1, 2, 2)]
    >>> checked_pd([[1, 2, 3, 4]])
    Traceback (most recent call last):
    ...
    movies.errors.PDCodeError: edge label 1 occurs 1 time(s) in the PD code; every edge label must occur exactly twice
    """
    if isinstance(pd, (str, bytes)):
        raise PDCodeError("a PD code is a list of crossings, not a string")
    crossings = []
    try:
        items = list(pd)
    except TypeError:
        raise PDCodeError(f"PD code {pd!r} is not a list of crossings") from None
    for i, c in enumerate(items):
        try:
            t = tuple(c)
        except TypeError:
            raise PDCodeError(f"crossing {i} ({c!r}) is not a list of four edge labels") from None
        if len(t) != 4:
            raise PDCodeError(f"crossing {i} ({list(t)!r}) has {len(t)} edge labels, not 4")
        crossings.append(t)
    count: dict = {}
    for i, t in enumerate(crossings):
        for label in t:
            try:
                count[label] = count.get(label, 0) + 1
            except TypeError:
                raise PDCodeError(f"edge label {label!r} of crossing {i} is not hashable") from None
    for label, k in count.items():
        if k != 2:
            raise PDCodeError(
                f"edge label {label!r} occurs {k} time(s) in the PD code; every edge label must "
                "occur exactly twice"
            )
    return crossings


def connected_pieces(crossings: list) -> list:
    """The connected pieces (lists of crossing indices, each sorted, ordered by first index).

    >>> connected_pieces([(1, 2, 2, 1), (3, 4, 4, 3), (1, 5, 5, 1)])
    [[0, 2], [1]]
    """
    n = len(crossings)
    first: dict = {}
    pairs = [(i, first.setdefault(label, i)) for i, c in enumerate(crossings) for label in c]
    groups: dict = {}
    for i, root in enumerate(partition_roots(n, pairs)):
        groups.setdefault(root, []).append(i)
    return [groups[r] for r in sorted(groups)]


# ------------------------------------------------------------------------------------- ordering
def _neighbours(cross: list) -> list:
    """nb[i][s] = index of the crossing holding the other end of edge cross[i][s]."""
    seen: dict = {}
    nb = [[-1] * 4 for _ in cross]
    for i, c in enumerate(cross):
        for s, label in enumerate(c):
            if label in seen:
                j, t = seen.pop(label)
                nb[i][s] = j
                nb[j][t] = i
            else:
                seen[label] = (i, s)
    return nb


def _greedy_from(nb: list, start: int):
    """Greedy order from ``start``: next the crossing with most edges on the boundary.

    Ties go to the crossing whose boundary edges were opened earliest (a sweeping front), then to
    the lowest index. Returns (order, cost) with cost = sum over steps of 2^(boundary size).
    """
    n = len(nb)
    shared = [0] * n
    age = [0] * n  # sum of the steps at which the crossing's boundary edges were opened
    done = [False] * n
    frontier = set()  # crossings not done with an edge on the boundary
    order = []
    size = 0
    cost = 0
    cur = start
    for step in range(n):
        done[cur] = True
        frontier.discard(cur)
        order.append(cur)
        for j in nb[cur]:
            if j == cur:
                continue
            if done[j]:
                size -= 1
            else:
                size += 1
                shared[j] += 1
                age[j] += step
                frontier.add(j)
        cost += 1 << size
        if step == n - 1:
            break
        cur = max(frontier, key=lambda j: (shared[j], -age[j], -j))
    return order, cost


def piece_order(cross: list) -> list:
    """A greedy order of one connected piece's crossings that keeps the scanned boundary short.

    >>> piece_order([(1, 5, 2, 4), (3, 1, 4, 6), (5, 3, 6, 2)])
    [0, 1, 2]
    """
    nb = _neighbours(cross)
    n = len(cross)
    if n <= 24:
        starts = range(n)
    else:
        k = 12
        starts = sorted({(i * n) // k for i in range(k)})
    best = None
    for s in starts:
        order, cost = _greedy_from(nb, s)
        if best is None or cost < best[1]:
            best = (order, cost)
    return best[0]


def scan_order(pd) -> list:
    """The order (crossing indices) in which the scanner adds the crossings of ``pd``.

    Pieces come one after another, each in its greedy order.

    >>> scan_order([(1, 5, 2, 4), (3, 1, 4, 6), (5, 3, 6, 2)])
    [0, 1, 2]
    """
    crossings = checked_pd(pd)
    out = []
    for piece in connected_pieces(crossings):
        sub = [crossings[i] for i in piece]
        out.extend(piece[i] for i in piece_order(sub))
    return out
