"""Smooth strands through a layout's points, straight through the crossings, with gaps for the under-strand.

Every edge becomes a curve from its tail crossing to its head crossing. Near a crossing the
curve leaves along a *through direction*: the dart's own direction bent toward the opposite
dart's, so that the two strands pass nearly straight and cross transversally; at every other
point the corner is rounded by a quadratic Bézier whose ends sit a fraction ``smooth`` of the
way along the two segments beside it. The crossing points themselves stay exact.

Rounding can in principle make two strands touch where the straight-line layout had room; so
:func:`strands` checks the sampled curves for crossings away from the crossing points and falls
back to gentler settings, down to the straight-line layout itself, which is planar.

>>> from movies.diagram.pd import from_pd
>>> from movies.draw.layout import layout
>>> d = from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]])
>>> s = strands(d, layout(d))
>>> sorted(s.curves), s.curves[1][0][1] == layout(d).crossings[2]
([1, 2, 3, 4, 5, 6], True)
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np

from movies.diagram.model import Diagram, UNDER_IN, UNDER_OUT
from movies.draw.geometry import counterclockwise, crossings_between, sample
from movies.draw.layout import Layout, Point, dart_point

#: (how straight through crossings, how round the corners), gentlest last; (0, 0) is the layout itself
SETTINGS = ((1.0, 0.5), (0.6, 0.4), (0.3, 0.25), (0.0, 0.12), (0.0, 0.0))

#: points on a crossingless circle
CIRCLE_POINTS = 16


@dataclass
class Strands:
    """Curves ready to draw.

    ``curves``: edge -> full curve (pieces as in :mod:`movies.draw.geometry`), tail to head;
    circles are closed (the last piece ends where the first starts). ``gaps``: edge ->
    (gap at the tail, gap at the head): how much is cut off where the edge passes under
    (0 where it is the over-strand). ``directions``: (crossing, position) -> unit vector of the
    dart leaving the crossing. ``scale``: a typical length between neighbouring points;
    ``smallest_gap``: the narrowest gap (the stroke must stay thinner than that).
    """

    curves: dict[int, list[tuple]] = field(default_factory=dict)
    gaps: dict[int, tuple[float, float]] = field(default_factory=dict)
    directions: dict[tuple[int, int], Point] = field(default_factory=dict)
    setting: tuple[float, float] = SETTINGS[0]
    scale: float = 1.0
    smallest_gap: float = 0.0


def _unit(x: float, y: float) -> Point:
    length = math.hypot(x, y)
    return (x / length, y / length) if length > 0 else (1.0, 0.0)


def _round(points: list[Point], smooth: float, closed: bool = False) -> list[tuple]:
    """A polyline with its inner corners rounded (all corners when ``closed``)."""
    if smooth <= 0:
        pts = points + ([points[0]] if closed else [])
        return [("L", pts[k], pts[k + 1]) for k in range(len(pts) - 1)]
    n = len(points)
    corners = range(n) if closed else range(1, n - 1)

    def towards(p: Point, q: Point, f: float) -> Point:
        return (p[0] + f * (q[0] - p[0]), p[1] + f * (q[1] - p[1]))

    pieces: list[tuple] = []
    cursor = points[0] if not closed else towards(points[0], points[1], smooth)
    if closed:
        start = cursor
    for k in corners:
        if closed and k == 0:
            continue
        p, before, after = points[k], points[k - 1], points[(k + 1) % n]
        a, b = towards(p, before, smooth), towards(p, after, smooth)
        if math.dist(a, cursor) <= 1e-12 * (1.0 + math.dist(p, before)):
            a = cursor  # the same midpoint reached from both ends: no piece a rounding error long
        else:
            pieces.append(("L", cursor, a))
        pieces.append(("Q", a, p, b))
        cursor = b
    if closed:
        p, before, after = points[0], points[-1], points[1]
        a = towards(p, before, smooth)
        if math.dist(a, cursor) <= 1e-12 * (1.0 + math.dist(p, before)):
            a = cursor
        else:
            pieces.append(("L", cursor, a))
        pieces.append(("Q", a, p, start))
    else:
        pieces.append(("L", cursor, points[-1]))
    return pieces


def _circle(centre: Point, radius: float, counterclockwise: bool) -> list[tuple]:
    sign = 1 if counterclockwise else -1
    pts = [(centre[0] + radius * math.cos(sign * 2 * math.pi * k / CIRCLE_POINTS),
            centre[1] + radius * math.sin(sign * 2 * math.pi * k / CIRCLE_POINTS)) for k in range(CIRCLE_POINTS)]
    # a circle is rounded fully whatever the setting: nothing else runs close to it
    return _round(pts, 0.5, closed=True)


def _clearance(diagram: Diagram, lay: Layout) -> dict[int, float]:
    """crossing -> distance to the nearest point of the picture not on its own four edges."""
    names = sorted(lay.crossings)
    if not names:
        return {}
    owners, points = [], []
    for edge, pts in lay.edges.items():
        owners.extend([edge] * len(pts))
        points.extend(pts)
    for edge, (centre, radius, _) in lay.circles.items():
        for k in range(CIRCLE_POINTS):
            owners.append(edge)
            points.append((centre[0] + radius * math.cos(2 * math.pi * k / CIRCLE_POINTS),
                           centre[1] + radius * math.sin(2 * math.pi * k / CIRCLE_POINTS)))
    owners_array, cloud = np.asarray(owners), np.asarray(points)
    result = {}
    for name in names:
        mine = np.isin(owners_array, list(diagram.crossings[name]))
        rest = cloud[~mine]
        if not len(rest):
            result[name] = math.inf
            continue
        p = np.asarray(lay.crossings[name])
        result[name] = float(np.sqrt(((rest - p) ** 2).sum(axis=1)).min())
    return result


def _attempt(diagram: Diagram, lay: Layout, straight: float, smooth: float) -> Strands:
    result = Strands(setting=(straight, smooth))
    through: dict[tuple[int, int], Point] = {}
    reach: dict[int, float] = {}
    lengths = []
    clearance = _clearance(diagram, lay)
    for name, point in lay.crossings.items():
        darts = []
        for position, edge in enumerate(diagram.crossings[name]):
            neighbour = dart_point(diagram, lay.edges, name, position)
            darts.append((neighbour[0] - point[0], neighbour[1] - point[1]))
        reach[name] = 0.4 * min([math.hypot(*d) for d in darts] + [clearance[name]])
        own = [_unit(*d) for d in darts]
        chosen = own
        for amount in (straight, straight * 0.5, 0.0):
            bent = []
            for k in range(4):
                opposite = own[(k + 2) % 4]
                straightest = _unit(own[k][0] - opposite[0], own[k][1] - opposite[1])
                bent.append(_unit((1 - amount) * own[k][0] + amount * straightest[0],
                                  (1 - amount) * own[k][1] + amount * straightest[1]))
            if amount == 0.0 or counterclockwise(bent, math.radians(25)):
                chosen = bent
                break
        for k in range(4):
            through[(name, k)] = chosen[k]
    result.directions = through
    for edge, pts in lay.edges.items():
        (tail, head) = diagram.edge_ends[edge]
        t_dir, h_dir = through[tuple(tail)], through[tuple(head)]
        p0, p1 = pts[0], pts[-1]
        q0 = (p0[0] + reach[tail.crossing] * t_dir[0], p0[1] + reach[tail.crossing] * t_dir[1])
        q1 = (p1[0] + reach[head.crossing] * h_dir[0], p1[1] + reach[head.crossing] * h_dir[1])
        points = [p0, q0] + pts[1:-1] + [q1, p1]
        result.curves[edge] = _round(points, smooth)
        lengths.extend(math.hypot(points[k + 1][0] - points[k][0], points[k + 1][1] - points[k][1])
                       for k in range(len(points) - 1))
        gaps = []
        for dart, crossing in ((tail, tail.crossing), (head, head.crossing)):
            if dart.position in (UNDER_IN, UNDER_OUT):
                gaps.append(reach[crossing] * (1 - smooth) * 0.85)
            else:
                gaps.append(0.0)
        result.gaps[edge] = (gaps[0], gaps[1])
    for edge, (centre, radius, ccw) in lay.circles.items():
        result.curves[edge] = _circle(centre, radius, ccw)
        result.gaps[edge] = (0.0, 0.0)
    lengths.sort()
    result.scale = lengths[len(lengths) // 2] if lengths else 1.0
    result.smallest_gap = min((g for pair in result.gaps.values() for g in pair if g > 0), default=0.0)
    return result


def stray_crossings(diagram: Diagram, result: Strands) -> int:
    """How many times the curves cross away from the diagram's crossings (0 when drawn right).

    The curves meet at each crossing point only at their ends, so any proper crossing of two
    sampled segments is one too many.
    """
    edges = sorted(result.curves)
    polylines = [sample(result.curves[e]) for e in edges]
    closed = [e in diagram.loops for e in edges]
    return len(crossings_between(polylines, closed))


def strands(diagram: Diagram, lay: Layout) -> Strands:
    """The smoothest curves among :data:`SETTINGS` that cross only at the crossings.

    Parameters: the diagram and its layout. Returns :class:`Strands`.

    >>> from movies.diagram.constructors import from_braid
    >>> from movies.draw.layout import layout
    >>> d = from_braid([1, 1, 1])
    >>> stray_crossings(d, strands(d, layout(d)))
    0
    """
    result = None
    for straight, smooth in SETTINGS:
        result = _attempt(diagram, lay, straight, smooth)
        if stray_crossings(diagram, result) == 0:
            return result
    return result  # the straight-line layout; planar unless the numbers failed us
