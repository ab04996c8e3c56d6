"""Plane geometry for pictures: sampling curves and finding where polylines cross.

A curve is a list of pieces, each ``("L", p0, p1)`` (a segment) or ``("Q", p0, c, p1)`` (a
quadratic Bézier with control point ``c``); consecutive pieces share their end points.

>>> sample([("L", (0, 0), (1, 0)), ("Q", (1, 0), (2, 0), (2, 1))], steps=2)
[(0.0, 0.0), (1.0, 0.0), (1.75, 0.25), (2.0, 1.0)]
>>> [round(v, 3) for v in crossings_between([[(0, 0), (2, 2)], [(0, 2), (2, 0)]])[0][4]]
[1.0, 1.0]
"""

from __future__ import annotations

import numpy as np

Point = tuple[float, float]


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
            for k in range(1, steps + 1):
                t = k / steps
                u = 1 - t
                points.append((u * u * p0[0] + 2 * u * t * c[0] + t * t * p1[0],
                               u * u * p0[1] + 2 * u * t * c[1] + t * t * p1[1]))
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
    lo, hi = np.minimum(a, b), np.maximum(a, b)
    found: list[tuple[int, int, int, int, Point]] = []
    n = len(a)
    chunk = 256
    for first in range(0, n, chunk):
        rows = slice(first, min(n, first + chunk))
        ra, rb, rlo, rhi = a[rows, None], b[rows, None], lo[rows, None], hi[rows, None]
        overlap = (rlo[..., 0] <= hi[None, :, 0]) & (lo[None, :, 0] <= rhi[..., 0]) & \
                  (rlo[..., 1] <= hi[None, :, 1]) & (lo[None, :, 1] <= rhi[..., 1])
        index = np.arange(first, min(n, first + chunk))[:, None]
        overlap &= np.arange(n)[None, :] > index
        pairs = np.argwhere(overlap)
        if not len(pairs):
            continue
        i = pairs[:, 0] + first
        j = pairs[:, 1]
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
