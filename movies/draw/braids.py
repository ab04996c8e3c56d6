"""Closed braids drawn as closed braids: the Seifert circles as concentric levels round an axis.

A diagram is a closed braid when its Seifert circles can be nested one inside the next, every
crossing joining two neighbouring levels: then the faces with edges of one Seifert circle only
are the disk inside the innermost level and the outside of the outermost, and a ray from the
axis outwards passes through one face between each two levels. Cutting each level where the ray
crosses it orders the crossings along each level; together these orders are the braid word,
read round the axis. Crossings on levels that do not meet share a column (an angle), so the
picture has as few columns as the word allows.

Each crossing sits between its two levels at its column's angle; each edge runs round its own
level from one crossing to the next and bends to the crossings at its ends. The radii are chosen
so that the strands cross near right angles. The caller checks the picture (planar, and every
crossing's ends counterclockwise in PD order: not the mirror image); of the four ways to draw
it (either end of the levels inside, either way round) the first that passes is kept.

>>> from movies.diagram.constructors import from_braid
>>> plan = braid_plan(from_braid([1, 1, 1]))
>>> len(plan.levels), plan.columns
(2, 3)
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from movies.diagram.model import Diagram
from movies.draw.geometry import round_the_circle

__all__ = ["BraidPlan", "braid_plan", "braid_drawings"]

Point = tuple[float, float]


@dataclass(frozen=True)
class BraidPlan:
    """A closed braid read off a diagram: ``levels``, Seifert circles (cycles of edges) from one
    end of the nest to the other; ``column``, crossing -> its column (0 .. ``columns`` - 1) in
    the order round the axis; ``inner`` and ``outer``, the faces inside the first level and
    outside the last."""

    levels: tuple[tuple[int, ...], ...]
    column: dict[int, int]
    columns: int
    inner: int
    outer: int


def braid_plan(diagram: Diagram) -> BraidPlan | None:
    """The closed braid a diagram is, or None (a split or crossingless diagram, or Seifert
    circles that do not nest in a row).

    >>> from movies.language.spec import parse_diagram
    >>> braid_plan(parse_diagram("3_1")).columns, braid_plan(parse_diagram("5_2")) is None
    (3, True)
    """
    if not diagram.crossings or diagram.loops or diagram.piece_count() != 1:
        return None
    circles = diagram.seifert_circles()
    level_of_edge = {edge: i for i, circle in enumerate(circles) for edge in circle}
    joins: dict[int, set[int]] = {i: set() for i in range(len(circles))}
    for name, labels in diagram.crossings.items():
        pair = {level_of_edge[e] for e in labels}
        if len(pair) != 2:
            return None  # a crossing of one Seifert circle with itself: not a braid
        a, b = pair
        joins[a].add(b)
        joins[b].add(a)
    ends = [i for i, near in joins.items() if len(near) <= 1]
    if len(circles) > 1 and (len(ends) != 2 or any(len(near) > 2 for near in joins.values())):
        return None
    # the levels in a row, from one end
    order = [ends[0]]
    while len(order) < len(circles):
        following = [j for j in joins[order[-1]] if j not in order]
        if len(following) != 1:
            return None  # pragma: no cover - a path graph always continues
        order.append(following[0])
    position = {circle: k for k, circle in enumerate(order)}
    # faces with the edges of one level only: inside the first level and outside the last
    alone = {}
    for face, cycles in diagram.faces.items():
        levels = {level_of_edge[side.edge] for cycle in cycles for side in cycle}
        if len(levels) == 1:
            alone.setdefault(position[levels.pop()], []).append(face)
    first, last = alone.get(0, []), alone.get(len(order) - 1, [])
    if len(first) != 1 or len(last) != 1 or first == last:
        return None
    ray = _ray(diagram, level_of_edge, position, first[0], last[0])
    if ray is None:
        return None
    column = _columns(diagram, [circles[i] for i in order], ray)
    if column is None:
        return None
    return BraidPlan(tuple(circles[i] for i in order), column, max(column.values()) + 1, first[0], last[0])


def _ray(diagram: Diagram, level_of_edge, position, inner: int, outer: int) -> list[int] | None:
    """Edges, one of each level in order, that a path of faces from ``inner`` to ``outer`` crosses."""
    sides = {face: {side.edge for cycle in cycles for side in cycle} for face, cycles in diagram.faces.items()}
    by_edge: dict[int, list[int]] = {}
    for face, edges in sides.items():
        for edge in edges:
            by_edge.setdefault(edge, []).append(face)
    path: list[int] = []
    face = inner
    for k in range(len(position)):
        step = None
        for edge in sorted(sides[face]):
            if position[level_of_edge[edge]] != k:
                continue
            beyond = [f for f in by_edge[edge] if f != face]
            if beyond and (k + 1 == len(position)) == (beyond[0] == outer):
                step = (edge, beyond[0])
                break
        if step is None:
            return None
        path.append(step[0])
        face = step[1]
    return path if face == outer else None


def _columns(diagram: Diagram, levels: list[tuple[int, ...]], ray: list[int]) -> dict[int, int] | None:
    """Each crossing's column: the order along each level, cut where the ray crosses it, read as
    one order round the axis; crossings on levels that do not meet share columns."""
    before: dict[int, set[int]] = {name: set() for name in diagram.crossings}
    for circle, cut in zip(levels, ray):
        start = circle.index(cut)
        walk = circle[start:] + circle[:start]
        met = [diagram.edge_ends[edge][1].crossing for edge in walk]  # the crossing at each edge's head
        for a, b in zip(met, met[1:]):
            if a == b:
                return None  # pragma: no cover - a level meets a crossing once
            before[b].add(a)
    column: dict[int, int] = {}
    remaining = dict(before)
    while remaining:
        ready = [c for c, need in remaining.items() if need <= column.keys()]
        if not ready:
            return None  # the orders do not agree: not a braid read this way
        for c in sorted(ready):
            column[c] = 1 + max((column[p] for p in before[c]), default=-1)
            del remaining[c]
    return column


def braid_drawings(diagram: Diagram, plan: BraidPlan, before: dict[int, Point] | None = None):
    """The four pictures of a closed braid (either end of the levels inside, either way round),
    each as (crossings, edges, the face outside): points and polylines in the unit disk.

    ``before``: where crossings were in the frame before (a movie's). Each picture then puts a
    column at the angle its crossings had, where those angles come round in the columns' order
    and leave room, and scales the levels to the radius they had.

    >>> from movies.diagram.constructors import from_braid
    >>> d = from_braid([1, 1, 1])
    >>> crossings, edges, outside = next(braid_drawings(d, braid_plan(d)))
    >>> sorted(crossings) == sorted(d.crossings) and sorted(edges) == d.edges()
    True
    """
    n = len(plan.levels)
    level_of_edge = {edge: i for i, circle in enumerate(plan.levels) for edge in circle}
    between = {name: sorted({level_of_edge[e] for e in labels}) for name, labels in diagram.crossings.items()}
    # more room round the axis than the word needs where the levels are many: the inner ones
    # would be crowded at the axis
    columns = max(plan.columns, 2, math.ceil(BEND * math.pi * (n - 1) / MOST_SQUEEZE))
    half = math.pi / columns  # half the angle between columns
    for inward in (True, False):
        for turning in (1, -1):
            at = _column_angles(plan, columns, turning, before)
            gap = min((at[(k + 1) % columns] - at[k]) % (2 * math.pi) for k in range(columns))
            bend = BEND * gap / 2  # the angle over which a strand bends to its crossing
            radius = _radii(n, bend)
            if not inward:
                radius = radius[::-1]
            crossings: dict[int, Point] = {}
            for name, (low, high) in between.items():
                r = (radius[low] + radius[high]) / 2
                angle = turning * at[plan.column[name]]
                crossings[name] = (r * math.cos(angle), r * math.sin(angle))
            scale = _scale(crossings, before)
            crossings = {name: (x * scale, y * scale) for name, (x, y) in crossings.items()}
            edges: dict[int, list[Point]] = {}
            for edge, (tail, head) in diagram.edge_ends.items():
                r = radius[level_of_edge[edge]] * scale
                start = at[plan.column[tail.crossing]]
                end = at[plan.column[head.crossing]]
                while end <= start:
                    end += 2 * math.pi
                steps = max(2, math.ceil((end - start - 2 * bend) / (half / 2)))
                arc = [start + bend + (end - start - 2 * bend) * k / steps for k in range(steps + 1)]
                edges[edge] = ([crossings[tail.crossing]]
                               + [(r * math.cos(turning * a), r * math.sin(turning * a)) for a in arc]
                               + [crossings[head.crossing]])
            yield crossings, edges, plan.outer if inward else plan.inner


def _column_angles(plan: BraidPlan, columns: int, turning: int, before: dict[int, Point] | None) -> list[float]:
    """The angle of each column, increasing: evenly spaced, or where ``before`` gives the angles
    of at least two columns' crossings in the columns' order, those (the others spaced evenly
    between them), as long as no two columns come closer than half the even spacing.

    >>> from movies.diagram.constructors import from_braid
    >>> plan = braid_plan(from_braid([1, 1, 1]))
    >>> [round(a, 3) for a in _column_angles(plan, 3, 1, None)]
    [1.047, 3.142, 5.236]
    """
    even = [(2 * k + 1) * math.pi / columns for k in range(columns)]
    if not before:
        return even
    seen: dict[int, list[float]] = {}
    for name, k in plan.column.items():
        if name in before:
            x, y = before[name]
            seen.setdefault(k, []).append(math.atan2(turning * y, x))
    mean = {k: math.atan2(sum(math.sin(a) for a in angles), sum(math.cos(a) for a in angles)) for k, angles in seen.items()}
    angles = round_the_circle(columns, mean)
    if angles is None:
        return even
    gaps = [(angles[(k + 1) % columns] - angles[k]) % (2 * math.pi) for k in range(columns)]
    if min(gaps) < 0.5 * (2 * math.pi / columns) or abs(sum(gaps) - 2 * math.pi) > 1e-9:
        return even
    return angles


def _scale(crossings: dict[int, Point], before: dict[int, Point] | None) -> float:
    """The factor that gives the shared crossings the mean distance from the axis they had
    (at most to the unit circle); 1 without a frame before."""
    shared = [c for c in crossings if before and c in before]
    if not shared:
        return 1.0
    now = sum(math.hypot(*crossings[c]) for c in shared)
    then = sum(math.hypot(*before[c]) for c in shared)
    outer = max(math.hypot(*p) for p in crossings.values())
    return min(then / now, 0.97 / outer) if now > 0 else 1.0


#: the share of half a column's angle over which a strand bends to its crossing
BEND = 0.45

#: the largest (levels - 1) * bend: the innermost level's radius is 1 - this of the middle one's
MOST_SQUEEZE = 0.7


def _radii(levels: int, bend: float) -> list[float]:
    """Radii of the levels, the outermost 0.92: a gap of 2 r bend at the middle radius r makes the
    strands cross at right angles there (and within 30° of it across the nest, where that fits).

    >>> [round(r, 3) for r in _radii(2, 0.3)]
    [0.495, 0.92]
    """
    # levels at r0, r0 + g, ..., with g = 2 r_mid bend and the outermost at 0.92
    middle = 0.92 / (1 + (levels - 1) * bend)  # r_mid = r_out - (levels - 1) g / 2
    gap = 2 * middle * bend
    return [0.92 - gap * (levels - 1 - k) for k in range(levels)]
