"""Plane geometry for pictures: sampling curves and finding where polylines cross.

A curve is a list of pieces, each ``("L", p0, p1)`` (a segment) or ``("Q", p0, c, p1)`` (a
quadratic Bézier with control point ``c``); consecutive pieces share their end points.

>>> sample([("L", (0, 0), (1, 0)), ("Q", (1, 0), (2, 0), (2, 1))], steps=2)
[(0.0, 0.0), (1.0, 0.0), (1.75, 0.25), (2.0, 1.0)]
>>> [round(v, 3) for v in crossings_between([[(0, 0), (2, 2)], [(0, 2), (2, 0)]])[0][4]]
[1.0, 1.0]
"""

from __future__ import annotations

import math

import numpy as np

Point = tuple[float, float]


def counterclockwise(vectors: list[Point], margin: float = 1e-9) -> bool:
    """True when the four vectors run counterclockwise once round, each turn at least ``margin``
    radians (the ends at a crossing in PD order, when the picture is not the mirror image).

    >>> counterclockwise([(1, 0), (0, 1), (-1, 0), (0, -1)]), counterclockwise([(1, 0), (0, -1), (-1, 0), (0, 1)])
    (True, False)
    """
    angles = [math.atan2(v[1], v[0]) for v in vectors]
    total = 0.0
    for k in range(4):
        turn = (angles[(k + 1) % 4] - angles[k]) % (2 * math.pi)
        if turn < margin:
            return False
        total += turn
    return abs(total - 2 * math.pi) < 1e-6


def expand_ranges(starts: np.ndarray, counts: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """For ranges ``starts[i] .. starts[i] + counts[i] - 1``: each position with the range it is in,
    as two flat arrays, without a Python loop (for listing pairs of points or segments in grid cells).

    >>> owner, position = expand_ranges(np.array([5, 0]), np.array([2, 3]))
    >>> owner.tolist(), position.tolist()
    ([0, 0, 1, 1, 1], [5, 6, 0, 1, 2])
    """
    total = int(counts.sum())
    owner = np.repeat(np.arange(len(counts)), counts)
    offset = np.arange(total) - np.repeat(np.cumsum(counts) - counts, counts)
    return owner, np.repeat(starts, counts) + offset


def sample(curve: list[tuple], steps: int = 6) -> list[Point]:
    """Points along a curve: segment ends, and ``steps`` pieces of every quadratic.

    Parameters: the curve's pieces; how finely to cut each quadratic. Returns the polyline.

    >>> sample([("Q", (0, 0), (1, 1), (2, 0))], steps=2)
    [(0.0, 0.0), (1.0, 0.5), (2.0, 0.0)]
    """
    points: list[Point] = []
    for piece in curve:
        if not points:
            points.append((float(piece[1][0]), float(piece[1][1])))
        if piece[0] == "L":
            points.append((float(piece[2][0]), float(piece[2][1])))
        else:
            _, p0, c, p1 = piece
            for k in range(1, steps):
                t = k / steps
                u = 1 - t
                points.append((u * u * p0[0] + 2 * u * t * c[0] + t * t * p1[0],
                               u * u * p0[1] + 2 * u * t * c[1] + t * t * p1[1]))
            # the end exactly, not a rounding error away from where the next piece starts
            points.append((float(p1[0]), float(p1[1])))
    return points


def crossings_between(polylines: list[list[Point]], closed: list[bool] | None = None,
                      tolerance: float = 1e-9) -> list[tuple[int, int, int, int, Point]]:
    """Every proper crossing of two segments among the polylines.

    Segments that only touch at an end point do not count (consecutive segments of a polyline,
    strands meeting at a shared point). Parameters: the polylines, which of them close up
    (last point joined to the first), and the relative tolerance for "at an end".
    Returns ``(i, s, j, t, point)``: polyline ``i`` segment ``s`` crosses polyline ``j``
    segment ``t`` at ``point``, with ``(i, s) < (j, t)``.

    >>> crossings_between([[(0, 0), (1, 1), (2, 0)], [(0, 1), (2, 1)]])
    []
    >>> len(crossings_between([[(0, 0), (2, 0), (2, 2), (1, -1)]]))
    1
    """
    closed = closed or [False] * len(polylines)
    starts, ends, owner, order = [], [], [], []
    for i, line in enumerate(polylines):
        pts = list(line) + ([line[0]] if closed[i] and len(line) > 2 else [])
        for s in range(len(pts) - 1):
            starts.append(pts[s])
            ends.append(pts[s + 1])
            owner.append(i)
            order.append(s)
    if not starts:
        return []
    a, b = np.asarray(starts, dtype=float), np.asarray(ends, dtype=float)
    i, j = _candidate_pairs(np.minimum(a, b), np.maximum(a, b))
    found: list[tuple[int, int, int, int, Point]] = []
    if not len(i):
        return found
    p, r = a[i], b[i] - a[i]
    q, s = a[j], b[j] - a[j]
    denom = r[:, 0] * s[:, 1] - r[:, 1] * s[:, 0]
    qp = q - p
    with np.errstate(divide="ignore", invalid="ignore"):
        t = (qp[:, 0] * s[:, 1] - qp[:, 1] * s[:, 0]) / denom
        u = (qp[:, 0] * r[:, 1] - qp[:, 1] * r[:, 0]) / denom
    ok = (np.abs(denom) > 1e-300) & (t > tolerance) & (t < 1 - tolerance) & (u > tolerance) & (u < 1 - tolerance)
    for k in np.nonzero(ok)[0]:
        point = p[k] + t[k] * r[k]
        found.append((owner[i[k]], order[i[k]], owner[j[k]], order[j[k]], (float(point[0]), float(point[1]))))
    return found


def _candidate_pairs(lo: np.ndarray, hi: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """The pairs ``i < j`` of segments whose bounding boxes meet (boxes ``lo``-``hi``).

    The boxes are filed under the cells of a grid (a few typical segment lengths wide) that
    they cover; only boxes sharing a cell are compared, all at once in numpy, and the few long
    segments (more than 16 cells) with every segment. Linear in the number of segments for
    drawings whose segments are short, where comparing every pair was quadratic.

    >>> lo = np.array([[0.0, 0.0], [0.5, 0.5], [5.0, 5.0]])
    >>> i, j = _candidate_pairs(lo, lo + 1.0)
    >>> list(zip(i.tolist(), j.tolist()))
    [(0, 1)]
    """
    n = len(lo)
    size = np.maximum(hi - lo, 0.0).max(axis=1)
    cell = max(float(np.median(size)) * 4, 1e-12)
    first = np.floor(lo / cell).astype(np.int64)
    last = np.floor(hi / cell).astype(np.int64)
    spans = last - first + 1
    long_ = spans.prod(axis=1) > 16  # the few long segments are compared with every segment
    short = np.nonzero(~long_)[0]
    lefts, rights = [], []
    if len(short):
        base = first[short].min(axis=0)
        first, last, spans = first[short] - base, last[short] - base, spans[short]
        width = int(last[:, 1].max()) + 2
        segs, keys = [], []
        for dx in range(int(spans[:, 0].max())):
            for dy in range(int(spans[:, 1].max())):
                index = np.nonzero((dx < spans[:, 0]) & (dy < spans[:, 1]))[0]
                segs.append(short[index])
                keys.append((first[index, 0] + dx) * width + first[index, 1] + dy)
        seg, key = np.concatenate(segs), np.concatenate(keys)
        order = np.lexsort((seg, key))
        seg, key = seg[order], key[order]
        count = np.searchsorted(key, key, "right") - np.arange(len(key)) - 1  # later entries in the cell
        left, right = expand_ranges(np.arange(len(key)) + 1, count)
        lefts.append(seg[left])
        rights.append(seg[right])
    for k in np.nonzero(long_)[0]:
        meets = (lo[k, 0] <= hi[:, 0]) & (lo[:, 0] <= hi[k, 0]) & (lo[k, 1] <= hi[:, 1]) & (lo[:, 1] <= hi[k, 1])
        others = np.nonzero(meets)[0]
        lefts.append(np.full(len(others), k))
        rights.append(others)
    if not lefts:
        return np.zeros(0, dtype=np.int64), np.zeros(0, dtype=np.int64)
    i, j = np.concatenate(lefts), np.concatenate(rights)
    i, j = np.minimum(i, j), np.maximum(i, j)
    pair = np.unique(i[i != j] * n + j[i != j])
    i, j = pair // n, pair % n
    meets = (lo[i, 0] <= hi[j, 0]) & (lo[j, 0] <= hi[i, 0]) & (lo[i, 1] <= hi[j, 1]) & (lo[j, 1] <= hi[i, 1])
    return i[meets], j[meets]


def round_the_circle(count: int, known: dict[int, float]) -> list[float] | None:
    """Angles for ``count`` places in counterclockwise order round a circle, place 0 first and
    increasing within one turn: the ``known`` angles (each taken as the first angle after the one
    before it), the other places evenly between their known neighbours. None with fewer than two
    known.

    >>> [round(a, 3) for a in round_the_circle(4, {1: 0.0, 3: math.pi})]
    [-1.571, 0.0, 1.571, 3.142]
    >>> round_the_circle(3, {0: 0.0, 1: 2.0, 2: 1.0}) is None  # 0, then 2, then 1 only after a whole turn
    True
    """
    marked = sorted(known)
    if len(marked) < 2:
        return None
    turn = 2 * math.pi
    value = {marked[0]: known[marked[0]]}
    for before, after in zip(marked, marked[1:]):
        value[after] = value[before] + (known[after] - value[before]) % turn
    if value[marked[-1]] - value[marked[0]] >= turn:
        return None
    value[marked[0] + count] = value[marked[0]] + turn
    stops = marked + [marked[0] + count]
    angles = [0.0] * count
    for a, b in zip(stops, stops[1:]):
        for j in range(a, b):
            # places before the first known one come round at the end of the turn: one turn back
            angles[j % count] = value[a] + (value[b] - value[a]) * (j - a) / (b - a) - (turn if j >= count else 0.0)
    return angles



def segments_cross(p: Point, q: Point, a: Point, b: Point) -> bool:
    """Whether the segments pq and ab cross at a point inside both (touching does not count).

    >>> segments_cross((0, 0), (2, 2), (0, 2), (2, 0)), segments_cross((0, 0), (1, 1), (1, 1), (2, 0))
    (True, False)
    """
    def side(u, v, w):
        return (v[0] - u[0]) * (w[1] - u[1]) - (v[1] - u[1]) * (w[0] - u[0])

    return (side(p, q, a) * side(p, q, b) < 0) and (side(a, b, p) * side(a, b, q) < 0)


def clear_of(starts: np.ndarray, ends: np.ndarray, lines: list[list[Point]], chunk: int = 200_000) -> np.ndarray:
    """For each segment ``starts[i]``-``ends[i]``, whether it crosses no segment of the polylines
    (at a point inside both, as :func:`segments_cross`: touching does not count), all at once.

    >>> clear_of(np.array([[0.0, 0.0], [0.0, 0.0]]), np.array([[2.0, 2.0], [2.0, -1.0]]), [[(0, 2), (2, 0)]]).tolist()
    [False, True]
    """
    a = np.asarray([p for line in lines for p in line[:-1]], dtype=float).reshape(-1, 2)
    b = np.asarray([p for line in lines for p in line[1:]], dtype=float).reshape(-1, 2)
    p, q = np.asarray(starts, dtype=float).reshape(-1, 2), np.asarray(ends, dtype=float).reshape(-1, 2)
    clear = np.ones(len(p), dtype=bool)
    if not len(a) or not len(p):
        return clear

    def side(u, v, w):
        return (v[..., 0] - u[..., 0]) * (w[..., 1] - u[..., 1]) - (v[..., 1] - u[..., 1]) * (w[..., 0] - u[..., 0])

    rows = max(1, chunk // len(a))
    for start in range(0, len(p), rows):
        u, v = p[start:start + rows, None, :], q[start:start + rows, None, :]
        hit = (side(u, v, a[None]) * side(u, v, b[None]) < 0) & (side(a[None], b[None], u) * side(a[None], b[None], v) < 0)
        clear[start:start + rows] = ~hit.any(axis=1)
    return clear


def polyline_length(line: list[Point]) -> float:
    """The length of a polyline.

    >>> polyline_length([(0, 0), (3, 4), (3, 5)])
    6.0
    """
    return sum(math.dist(p, q) for p, q in zip(line, line[1:]))
