"""Where everything goes: a straight-line planar picture of a diagram from its combinatorics alone.

Each split piece with crossings is drawn by Tutte's barycentric method. The 4-valent graph of
the piece is subdivided (``SUBDIVISION`` points on every edge, so that kinks and parallel edges
become simple), its faces are read off the diagram's face cycles (the rotation at each crossing
is the counterclockwise PD order), and every face is triangulated by a *ring*: one helper vertex
per corner of the face, joined to its two neighbours along the face, the ring closed up, and
(inside) a centre joined to the whole ring. The result is a simplicial triangulated disk even
when a face meets a crossing twice; its boundary is the ring of the chosen outer face, put on a
circle, clockwise (the outer face lies on the left of its cycle). Solving the barycentric system
(every inner vertex the average of its neighbours) gives a planar straight-line embedding
(Tutte 1963; Floater 2003 for triangulations), and the helpers are dropped.

Split pieces nest: a piece lies in a face of another, so it is drawn into a disk inside that
face's polygon; crossingless circles are circles. A diagram that is a closed braid is drawn as
one instead (:func:`braid_layout`). Coordinates are plain floats, y pointing up.

>>> from movies.language.spec import parse_diagram
>>> lay = layout(parse_diagram("5_2"))
>>> sorted(lay.crossings), len(lay.edges[1]), lay.braid
([1, 2, 3, 4, 5], 5, False)
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field, replace

import numpy as np

from movies.diagram.model import Diagram, Side
from movies.draw.geometry import counterclockwise, crossings_between, expand_ranges, round_the_circle

#: subdivision points on each edge (at least 2, so that the subdivided graph is simple)
SUBDIVISION = 3

#: rounds of the planarity-keeping spring refinement after the barycentric solve (see :func:`refine`)
REFINEMENT = 30

#: barycentric sweeps of the helper vertices in each round of the refinement
HELPER_SWEEPS = 1

#: rounds of reweighting after the plain barycentric solve (see :func:`_barycentric`)
REWEIGHTING = 1

#: each reweighting round weighs an edge by its length to this power
WEIGHT_POWER = 1.0

Point = tuple[float, float]

#: where the outer face's name goes: the top-left corner, outside every piece
OUTER_LABEL = (-1.05, 1.12)


@dataclass
class Layout:
    """A drawing's skeleton, in plain floats (y up).

    ``crossings``: crossing -> its point. ``edges``: edge -> polyline from its tail crossing
    through its subdivision points to its head crossing. ``circles``: crossingless edge ->
    (centre, radius, counterclockwise). ``face_points``: face -> a point inside it (for its
    label). ``bounds``: (xmin, ymin, xmax, ymax) of everything. ``outer``: the face drawn
    outermost; ``outside``: the edges around it (the next frame of a movie keeps that face
    outside if it can).
    """

    crossings: dict[int, Point] = field(default_factory=dict)
    edges: dict[int, list[Point]] = field(default_factory=dict)
    circles: dict[int, tuple[Point, float, bool]] = field(default_factory=dict)
    face_points: dict[int, Point] = field(default_factory=dict)
    bounds: tuple[float, float, float, float] = (-1.0, -1.0, 1.0, 1.0)
    outside: frozenset[int] = frozenset()
    outer: int | None = None
    #: drawn as a closed braid (the next frame of a movie stays one while it can)
    braid: bool = False


# ---------------------------------------------------------------------- one piece by Tutte


@dataclass
class _PieceGeometry:
    crossings: dict[int, Point]
    edges: dict[int, list[Point]]
    face_polygons: dict[tuple[Side, ...], list[Point]]  # inner face cycles -> polygon
    face_centres: dict[tuple[Side, ...], Point]


def _cycle_walk(diagram: Diagram, cycle: tuple[Side, ...]) -> list[tuple]:
    """The vertices met walking a face cycle: ('c', crossing) and ('e', edge, i)."""
    walk: list[tuple] = []
    for side in cycle:
        tail, head = diagram.edge_ends[side.edge]
        points = [("e", side.edge, i) for i in range(1, SUBDIVISION + 1)]
        if side.hand == "L":
            walk.append(("c", tail.crossing))
            walk.extend(points)
        else:
            walk.append(("c", head.crossing))
            walk.extend(reversed(points))
    return walk


def tutte_piece(diagram: Diagram, cycles: list[tuple[Side, ...]], outer: tuple[Side, ...],
                anchors: dict[tuple, Point] | None = None) -> _PieceGeometry:
    """Barycentric embedding of one piece with crossings, its ``outer`` cycle outermost.

    Parameters: the diagram, the face cycles of the piece, and the cycle that faces outwards;
    ``anchors``, where some crossings (``("c", name)``) and edge points (``("e", edge, i)``)
    were in the frame before: the embedding is turned to match them and the refinement pulls
    them back there (see :func:`refine`), so that a movie's frames change only where a step acts.
    Returns the piece's geometry inside the unit disk (the outer ring on the unit circle).

    >>> from movies.diagram.pd import from_pd
    >>> d = from_pd([[4, 1, 3, 2], [2, 3, 1, 4]])
    >>> cycles = [c for region in d.faces.values() for c in region]
    >>> g = tutte_piece(d, cycles, cycles[0])
    >>> all(math.hypot(*p) < 1 for p in g.crossings.values())
    True
    """
    index: dict[tuple, int] = {}

    def vertex(key: tuple) -> int:
        if key not in index:
            index[key] = len(index)
        return index[key]

    adjacency: list[set[int]] = []

    def link(a: int, b: int) -> None:
        while len(adjacency) <= max(a, b):
            adjacency.append(set())
        adjacency[a].add(b)
        adjacency[b].add(a)

    walks = {cycle: [vertex(key) for key in _cycle_walk(diagram, cycle)] for cycle in cycles}
    drawn = len(index)  # the vertices so far are the drawn ones: crossings and subdivision points
    boundary: dict[int, Point] = {}
    centres: dict[tuple[Side, ...], int] = {}
    triangles: list[tuple[int, int, int]] = []
    strokes: list[tuple[int, int]] = []
    for cycle, walk in walks.items():
        n = len(walk)
        ring = [vertex(("r", cycle, i)) for i in range(n)]
        for i in range(n):
            link(walk[i], walk[(i + 1) % n])
            link(walk[i], ring[i])
            link(walk[(i + 1) % n], ring[i])
            link(ring[i], ring[(i + 1) % n])
            triangles += [(walk[i], walk[(i + 1) % n], ring[i]), (walk[(i + 1) % n], ring[(i + 1) % n], ring[i])]
            strokes.append((walk[i], walk[(i + 1) % n]))
        if cycle == outer:
            # clockwise: the outer face is on the left of its cycle
            angles = _outer_angles(_cycle_walk(diagram, cycle), anchors or {})
            for i, r in enumerate(ring):
                angle = (angles[i] + angles[i + 1]) / 2
                boundary[r] = (math.cos(angle), math.sin(angle))
        else:
            centre = vertex(("f", cycle))
            centres[cycle] = centre
            for i, r in enumerate(ring):
                link(centre, r)
                triangles.append((centre, r, ring[(i + 1) % n]))
    solved = _barycentric(len(index), adjacency, boundary)
    pinned = _turned_to(solved, index, anchors) if anchors else None
    arms = []  # each crossing with the first point of its four edges, counterclockwise (PD order)
    kinked = {label for labels in diagram.crossings.values() if len(set(labels)) < 4 for label in labels}
    for name in sorted({key[1] for key in index if key[0] == "c"}):
        if kinked.intersection(diagram.crossings[name]):
            continue  # a kink's loop is shaped by its own small face: turning next to it squeezes it
        row = [index[("c", name)]]
        for position, edge in enumerate(diagram.crossings[name]):
            tail, _ = diagram.edge_ends[edge]
            row.append(index[("e", edge, 1 if tuple(tail) == (name, position) else SUBDIVISION)])
        arms.append(row)
    points = [index[key] for key in index if key[0] == "c"]
    anchored, anchored_room = None, 0.0
    if REFINEMENT and pinned is not None:
        trial = refine(pinned[0], adjacency, boundary, triangles, drawn, strokes, REFINEMENT, arms, pinned[1:])
        if _planar(trial, strokes):
            anchored, anchored_room = trial, _room(trial, points, strokes)
    if REFINEMENT and anchored is not None and anchored_room >= ANCHORED_ROOM:
        solved = anchored
    elif REFINEMENT:
        opened = refine(solved, adjacency, boundary, triangles, drawn, strokes, REFINEMENT, arms)
        room = _room(opened, points, strokes)
        choices = [opened]
        if room < ROOMY and arms:
            # the crossings opened, unless that crowds some crossing much more than the plain springs do
            plain = refine(solved, adjacency, boundary, triangles, drawn, strokes, REFINEMENT)
            choices = [opened, plain] if room >= 0.5 * _room(plain, points, strokes) else [plain]
        elif arms:
            choices = [opened, None]  # the plain springs only if the opened layout is not planar
        for refined in choices:
            if refined is None:
                refined = refine(solved, adjacency, boundary, triangles, drawn, strokes, REFINEMENT)
            if _planar(refined, strokes):
                solved = refined
                break
        # held in place, a step's new crossings can be squeezed: the anchored picture is kept only
        # if it leaves every crossing at least half the room the picture laid out alone leaves
        if anchored is not None and anchored_room >= 0.5 * _room(solved, points, strokes):
            solved = anchored

    def at(key: tuple) -> Point:
        x, y = solved[index[key]]
        return (float(x), float(y))

    crossings = {key[1]: at(key) for key in index if key[0] == "c"}
    edges: dict[int, list[Point]] = {}
    for cycle in cycles:
        for side in cycle:
            if side.hand == "L":
                tail, head = diagram.edge_ends[side.edge]
                edges[side.edge] = (
                    [crossings[tail.crossing]]
                    + [at(("e", side.edge, i)) for i in range(1, SUBDIVISION + 1)]
                    + [crossings[head.crossing]]
                )
    polygons = {cycle: _polygon(edges, cycle) for cycle in cycles if cycle != outer}
    face_centres = {cycle: at(("f", cycle)) for cycle in centres}
    return _PieceGeometry(crossings, edges, polygons, face_centres)


def _outer_angles(walk: list[tuple], anchors: dict[tuple, Point]) -> list[float]:
    """Angles on the unit circle for the vertices of the outer walk (clockwise), and the first
    again less a turn: evenly spaced, or, where at least two of them are anchored, near the
    angles of their anchors (the others spaced evenly between them), so that a movie's frame
    keeps its outside where it was.

    >>> [round(a, 3) for a in _outer_angles([("c", 1), ("c", 2)], {})]
    [1.571, -1.571, -4.712]
    >>> [round(a, 3) + 0.0 for a in _outer_angles([("c", 1), ("c", 2), ("c", 3)], {("c", 1): (1, 0), ("c", 2): (0, -1)})]
    [0.0, -1.676, -3.979, -6.283]
    """
    n = len(walk)
    even = [math.pi / 2 - 2 * math.pi * i / n for i in range(n + 1)]
    # clockwise: the angles turned the other way are the counterclockwise ones
    known = {i: -math.atan2(anchors[key][1], anchors[key][0]) for i, key in enumerate(walk) if key in anchors}
    placed = round_the_circle(n, known)
    if placed is None:
        return even
    angles = [-a for a in placed]
    # a blend with even spacing keeps every gap open
    turn = 2 * math.pi
    blended = [ANCHORED_SPACING * angles[i] + (1 - ANCHORED_SPACING) * (angles[0] - turn * i / n) for i in range(n)]
    return blended + [blended[0] - turn]


#: how closely the outer ring follows the anchors (the rest: evenly spaced)
ANCHORED_SPACING = 0.8


def _polygon(edges: dict[int, list[Point]], cycle: tuple[Side, ...]) -> list[Point]:
    """The polygon of a face cycle, walked with the face on the left."""
    points: list[Point] = []
    for side in cycle:
        line = edges[side.edge]
        points.extend(line[:-1] if side.hand == "L" else line[::-1][:-1])
    return points


def _spacing(edges: dict[int, list[Point]]) -> float:
    """The shortest step between neighbouring points of any edge (how crowded a picture is)."""
    return min(math.hypot(q[0] - p[0], q[1] - p[1]) for pts in edges.values() for p, q in zip(pts, pts[1:]))


def turned_inside_out(geometry: _PieceGeometry, cycles: list[tuple[Side, ...]], outer: tuple[Side, ...]) -> _PieceGeometry:
    """The same piece with ``outer`` made the outside face, by inversion in a circle inside it.

    The map z -> 1/z keeps the picture planar, the crossings transversal and the orientation; the
    segments are halved first, since inversion bends them. Returns a geometry in the unit disk.
    """
    (ox, oy), _ = inscribed_disk(geometry.face_polygons[outer], geometry.face_centres.get(outer))

    def invert(p: Point) -> Point:
        # z -> 1/z about the centre: an inversion followed by a reflection, so orientation is kept
        dx, dy = p[0] - ox, p[1] - oy
        r2 = dx * dx + dy * dy
        return (dx / r2, -dy / r2)

    edges = {}
    for edge, pts in geometry.edges.items():
        dense = [pts[0]]
        for p, q in zip(pts, pts[1:]):
            dense += [((p[0] + q[0]) / 2, (p[1] + q[1]) / 2), q]
        edges[edge] = [invert(p) for p in dense]
    crossings = {name: invert(p) for name, p in geometry.crossings.items()}
    every = [p for pts in edges.values() for p in pts]
    cx = (min(p[0] for p in every) + max(p[0] for p in every)) / 2
    cy = (min(p[1] for p in every) + max(p[1] for p in every)) / 2
    reach = max(math.hypot(p[0] - cx, p[1] - cy) for p in every) / 0.97

    def fit(p: Point) -> Point:
        return ((p[0] - cx) / reach, (p[1] - cy) / reach)

    edges = {edge: [fit(p) for p in pts] for edge, pts in edges.items()}
    crossings = {name: fit(p) for name, p in crossings.items()}
    polygons = {cycle: _polygon(edges, cycle) for cycle in cycles if cycle != outer}
    return _PieceGeometry(crossings, edges, polygons, {})


def piece_geometry(diagram: Diagram, cycles: list[tuple[Side, ...]], outer: tuple[Side, ...],
                   anchors: dict[tuple, Point] | None = None) -> _PieceGeometry:
    """The better of two pictures of a piece whose outside face is ``outer``.

    Tutte's embedding with ``outer`` outside crowds the rest when ``outer`` is small (a kink's
    monogon facing out leaves the piece hanging from one crossing); the embedding with the
    longest face outside, turned inside out, often has more room. Whichever is less crowded wins.
    With ``anchors`` (see :func:`tutte_piece`) only the first, to stay like the frame before.

    >>> from movies.diagram.pd import from_pd
    >>> d = from_pd([[1, 1, 2, 2]])
    >>> cycles = [c for region in d.faces.values() for c in region]
    >>> sorted(piece_geometry(d, cycles, min(cycles, key=len)).edges)
    [1, 2]
    """
    chosen = direct = tutte_piece(diagram, cycles, outer, anchors)
    longest = max(cycles, key=lambda c: (len(c), c))
    if len(longest) > len(outer) and not anchors:  # anchored to the frame before: keep its outside
        turned = turned_inside_out(tutte_piece(diagram, cycles, longest), cycles, outer)
        # the turned picture has its segments halved: compare like with like
        # inversion bends segments into arcs: keep the turned picture only if it is still planar
        if 2 * _spacing(turned.edges) > _spacing(direct.edges) and not _crossings_of(turned.edges):
            chosen = turned
    crossings, edges = _open_kinks(diagram, chosen.crossings, chosen.edges, outer)
    polygons = {cycle: _polygon(edges, cycle) for cycle in cycles if cycle != outer}
    return _PieceGeometry(crossings, edges, polygons, chosen.face_centres)


def _hanging_parts(diagram: Diagram, edges: set[int], outer: tuple[Side, ...]) -> list[tuple[int, int, set[int]]]:
    """Parts of a piece that hang from one crossing: (crossing, first position, their edges).

    A part hangs from crossing c when the edges at two neighbouring positions ``first`` and
    ``first + 1`` reach each other, but not the other two, without passing through c (a kink
    is the smallest). Of the two sides the smaller is listed, unless the ``outer`` face lies
    inside it; biggest parts first.
    """
    outer_edges = {side.edge for side in outer}
    found = []
    for name, labels in diagram.crossings.items():
        if labels[0] not in edges:
            continue
        for first in range(4):
            start = {labels[first], labels[(first + 1) % 4]}
            reached, todo = set(start), list(start)
            while todo:
                edge = todo.pop()
                for dart in diagram.edge_ends[edge]:
                    if dart.crossing == name:
                        continue
                    for other in diagram.crossings[dart.crossing]:
                        if other not in reached:
                            reached.add(other)
                            todo.append(other)
            rest = {labels[(first + 2) % 4], labels[(first + 3) % 4]}
            if reached & rest or outer_edges <= reached:
                continue  # not cut off, or the outer face lies inside this part
            others = edges - reached
            if len(others) < len(reached) and not outer_edges <= others:
                continue  # the other side is the smaller part: that one hangs
            found.append((name, first, reached))
    found.sort(key=lambda item: (-len(item[2]), item[0], item[1]))
    return found


def _open_kinks(diagram: Diagram, crossings: dict[int, Point], edges: dict[int, list[Point]],
                outer: tuple[Side, ...]) -> tuple[dict[int, Point], dict[int, list[Point]]]:
    """Open up every part that hangs from one crossing (kinks above all) to a useful size.

    The barycentric embedding shrinks such a part to almost nothing: it meets the rest only
    at one crossing. Each is stretched about that crossing, in polar coordinates (angles
    spread over the free angle between the crossing's other two ends, radii scaled up to the
    nearest other point), a map that keeps it planar; it is kept only if the new picture
    crosses nothing (else a smaller stretch is tried, or none). A kink's loop becomes a teardrop.
    """
    crossings, edges = dict(crossings), dict(edges)
    for name, first, part in _hanging_parts(diagram, set(edges), outer):
        c = crossings[name]
        labels = diagram.crossings[name]

        def direction(position: int) -> float:
            q = dart_point(diagram, edges, name, position)
            return math.atan2(q[1] - c[1], q[0] - c[0])

        before, after = direction((first - 1) % 4), direction((first + 2) % 4)
        sector = (after - before) % (2 * math.pi)
        inside = {d.crossing for e in part for d in diagram.edge_ends[e]} - {name}
        mine = set(labels) | part
        others = [q for e, pts in edges.items() if e not in mine for q in pts]
        others += [p for n, p in crossings.items() if n != name and n not in inside]
        room = min((math.hypot(q[0] - c[0], q[1] - c[1]) for q in others), default=1.0)

        def polar(q: Point) -> tuple[float, float]:
            return math.hypot(q[0] - c[0], q[1] - c[1]), (math.atan2(q[1] - c[1], q[0] - c[0]) - before) % (2 * math.pi)

        points = [q for e in part for q in edges[e] if q != c] + [crossings[n] for n in inside]
        if not points:
            continue
        radii, angles = zip(*(polar(q) for q in points))
        low, high, far = min(angles), max(angles), max(radii)
        if not (0 < low <= high < sector) or far <= 0:
            continue
        width = min(0.7 * sector, math.radians(120 if len(part) > 1 else 70))
        for scale in (0.55, 0.35, 0.2, 0.1, 0.05):
            grow = scale * room / far
            if grow <= 1 and len(part) > 1:
                break

            def stretch(q: Point) -> Point:
                if q == c:
                    return q
                r, a = polar(q)
                f = 0.5 if high == low else (a - low) / (high - low)
                angle = before + sector / 2 + (f - 0.5) * width
                return (c[0] + grow * r * math.cos(angle), c[1] + grow * r * math.sin(angle))

            trial = dict(edges)
            for e in part:
                trial[e] = [stretch(q) for q in edges[e]]
            if len(part) == 1:
                # a kink: round its three points into a teardrop
                (e,) = part
                tail, head = diagram.edge_ends[e]
                ring = [(c[0] + f * scale * room * math.cos(before + sector / 2 + a * width / 2),
                         c[1] + f * scale * room * math.sin(before + sector / 2 + a * width / 2))
                        for f, a in ((0.75, -1.0), (1.0, 0.0), (0.75, 1.0))]
                trial[e] = [c] + (ring if tail.position == first else ring[::-1]) + [c]
            if not crossings_between([trial[e] for e in sorted(trial)]):
                edges = trial
                crossings.update({n: stretch(crossings[n]) for n in inside})
                break
    return crossings, edges


def _conjugate_gradient(apply, rhs: np.ndarray, start: np.ndarray, diagonal: np.ndarray,
                        tolerance: float = 1e-11) -> np.ndarray:
    """Solve ``apply(x) = rhs`` (symmetric positive definite) column by column, Jacobi-preconditioned.

    A sparse solve by hand: the barycentric system has a few nonzeros a row, and dense
    factorisation would cost cubic time.

    >>> m = np.array([[4.0, 1.0], [1.0, 3.0]])
    >>> x = _conjugate_gradient(lambda v: m @ v, np.array([[1.0], [2.0]]), np.zeros((2, 1)), np.diag(m))
    >>> [round(float(v), 6) for v in x[:, 0]]
    [0.090909, 0.636364]
    """
    x = start.copy()
    r = rhs - apply(x)
    z = r / diagonal[:, None]
    p = z.copy()
    rz = (r * z).sum(axis=0)
    goal = tolerance * np.maximum(np.abs(rhs).max(axis=0), 1e-300)
    for _ in range(20 * len(rhs) + 50):
        if (np.abs(r).max(axis=0) <= goal).all():
            break
        q = apply(p)
        pq = (p * q).sum(axis=0)
        alpha = np.where(pq > 0, rz / np.where(pq > 0, pq, 1.0), 0.0)
        x += alpha * p
        r -= alpha * q
        z = r / diagonal[:, None]
        rz_new = (r * z).sum(axis=0)
        beta = np.where(rz > 0, rz_new / np.where(rz > 0, rz, 1.0), 0.0)
        p = z + beta * p
        rz = rz_new
    return x


def _barycentric(total: int, adjacency: list[set[int]], boundary: dict[int, Point],
                 rounds: int | None = None) -> np.ndarray:
    """Positions with every inner vertex a weighted average of its neighbours.

    The first round weighs every edge alike (Tutte's embedding); each further round weighs an
    edge by its length in the round before, which pulls long edges in and lets crowded
    regions open up. Any positive weights keep the embedding planar (Floater 2003).
    """
    rounds = REWEIGHTING if rounds is None else rounds
    pairs = np.array(sorted({(a, b) for a in range(total) for b in adjacency[a] if a < b}), dtype=int).reshape(-1, 2)
    fixed = np.zeros(total, dtype=bool)
    xy = np.zeros((total, 2))
    for v, p in boundary.items():
        fixed[v] = True
        xy[v] = p
    inner = np.nonzero(~fixed)[0]
    if not len(inner):
        return xy
    slot = -np.ones(total, dtype=int)
    slot[inner] = np.arange(len(inner))
    weights = np.ones(len(pairs))
    a, b = pairs[:, 0], pairs[:, 1]
    both = ~fixed[a] & ~fixed[b]
    ia, ib = slot[a[both]], slot[b[both]]
    for round_ in range(rounds + 1):
        degree = np.bincount(slot[a[~fixed[a]]], weights[~fixed[a]], len(inner)) + \
            np.bincount(slot[b[~fixed[b]]], weights[~fixed[b]], len(inner))
        rhs = np.zeros((len(inner), 2))
        for here, there in ((a, b), (b, a)):
            pull = ~fixed[here] & fixed[there]
            for axis in (0, 1):
                rhs[:, axis] += np.bincount(slot[here[pull]], weights[pull] * xy[there[pull], axis], len(inner))
        w = weights[both]

        def apply(x: np.ndarray) -> np.ndarray:
            out = degree[:, None] * x
            for axis in range(x.shape[1]):
                out[:, axis] -= np.bincount(ia, w * x[ib, axis], len(inner)) + np.bincount(ib, w * x[ia, axis], len(inner))
            return out

        start = xy[inner] if round_ else np.zeros((len(inner), 2))
        xy[inner] = _conjugate_gradient(apply, rhs, start, degree)
        lengths = np.sqrt(((xy[a] - xy[b]) ** 2).sum(axis=1))
        weights = np.clip((lengths / lengths.mean()) ** WEIGHT_POWER, 1e-3, 1e3)
    return xy


def _crossings_of(edges: dict[int, list[Point]]) -> list:
    return crossings_between([edges[e] for e in sorted(edges)])


def _planar(xy: np.ndarray, strokes: list[tuple[int, int]]) -> bool:
    """True when no two drawn segments cross (segments that share an end do not count)."""
    return not crossings_between([[tuple(xy[a]), tuple(xy[b])] for a, b in strokes])


def _orientations(xy: np.ndarray, tri: np.ndarray) -> np.ndarray:
    a, b, c = xy[tri[:, 0]], xy[tri[:, 1]], xy[tri[:, 2]]
    return (b[:, 0] - a[:, 0]) * (c[:, 1] - a[:, 1]) - (b[:, 1] - a[:, 1]) * (c[:, 0] - a[:, 0])


def _repulsion(pts: np.ndarray, ideal: float) -> tuple[np.ndarray, np.ndarray]:
    """The push on each point from the points within three ideal lengths, and the distance to
    its nearest neighbour (at most three ideal lengths: farther ones are not looked for).

    The points are binned in square cells three ideal lengths wide, so only the points of a
    cell and its eight neighbours are compared, all at once in numpy: linear in the number of
    points, where comparing every pair was quadratic (2.5 s of the 3.4 s a 100-crossing drawing
    took; now a few milliseconds a round).

    >>> force, nearest = _repulsion(np.array([[0.0, 0.0], [1.0, 0.0]]), 1.0)
    >>> force.tolist(), nearest.tolist()
    ([[-1.0, 0.0], [1.0, 0.0]], [1.0, 1.0])
    """
    n = len(pts)
    reach = 3 * ideal
    cells = np.floor(pts / reach).astype(np.int64)
    cells -= cells.min(axis=0) - 1
    span = int(cells[:, 1].max()) + 2
    keys = cells[:, 0] * span + cells[:, 1]
    order = np.argsort(keys, kind="stable")
    ordered = keys[order]
    firsts, seconds = [], []
    for dx in (-1, 0, 1):
        for dy in (-1, 0, 1):
            wanted = keys + dx * span + dy
            start = np.searchsorted(ordered, wanted, "left")
            count = np.searchsorted(ordered, wanted, "right") - start
            # every point against every point of the neighbouring cell, without a Python loop
            owner, position = expand_ranges(start, count)
            firsts.append(owner)
            seconds.append(order[position])
    first, second = np.concatenate(firsts), np.concatenate(seconds)
    keep = first != second
    first, second = first[keep], second[keep]
    delta = pts[first] - pts[second]
    dist2 = (delta ** 2).sum(axis=1)
    near = dist2 < reach ** 2
    push = np.where(near, ideal ** 2 / np.where(near, dist2, 1.0), 0.0)
    force = np.stack([np.bincount(first, delta[:, axis] * push, n) for axis in (0, 1)], axis=1)
    nearest2 = np.full(n, reach ** 2)
    np.minimum.at(nearest2, first, dist2)
    nearest = np.sqrt(nearest2)
    return force, nearest


#: room about every crossing (nearest other vertex over the median edge) at which an opened
#: layout is kept without comparing it with the plain one
ROOMY = 0.25

#: how hard the arms of a crossing are turned toward a right-angled cross, against the springs
OPENING = 80.0


def _opening(pts: np.ndarray, arms: np.ndarray, quarter: np.ndarray) -> np.ndarray:
    """The push on each arm's point turning it about its crossing toward the nearest cross of
    four directions a right angle apart (shape: crossings × 4 × 2).

    >>> pts = np.array([[0.0, 0.0], [1.0, 0.0], [0.5, 0.5], [-1.0, 0.0], [0.0, -1.0]])
    >>> push = _opening(pts, np.array([[0, 1, 2, 3, 4]]), np.arange(4) * (np.pi / 2))
    >>> bool(push[0, 1, 0] < 0 and push[0, 1, 1] > 0)  # the arm at 45 degrees turns on toward 90
    True
    """
    vectors = pts[arms[:, 1:]] - pts[arms[:, :1]]
    angles = np.arctan2(vectors[..., 1], vectors[..., 0])
    offsets = angles - quarter
    mean = np.arctan2(np.sin(offsets).sum(axis=1), np.cos(offsets).sum(axis=1))
    turn = (mean[:, None] + quarter - angles + np.pi) % (2 * np.pi) - np.pi
    perpendicular = np.stack([-vectors[..., 1], vectors[..., 0]], axis=-1)
    return OPENING * turn[..., None] * perpendicular


def _room(xy: np.ndarray, centres: list[int], strokes: list[tuple[int, int]]) -> float:
    """The closest any drawn vertex comes to a crossing (``centres``), over the median drawn edge."""
    if not centres:
        return 1.0
    ends = np.asarray(strokes, dtype=int)
    used = np.unique(ends.ravel())
    median = float(np.median(np.sqrt(((xy[ends[:, 0]] - xy[ends[:, 1]]) ** 2).sum(axis=1))))
    distances = np.sqrt(((xy[np.asarray(centres, dtype=int)][:, None, :] - xy[used][None, :, :]) ** 2).sum(axis=2))
    distances[distances == 0] = np.inf  # the crossing itself
    return float(distances.min()) / median if median > 0 else 0.0


def refine(xy: np.ndarray, adjacency: list[set[int]], boundary: dict[int, Point], triangles: list[tuple[int, int, int]],
           drawn: int, strokes: list[tuple[int, int]], rounds: int, arms=(), anchors=None) -> np.ndarray:
    """Spread a barycentric picture out by springs, never letting a triangle turn over.

    Drawn vertices (``0 .. drawn-1``) repel each other and are pulled along the drawn edges
    (``strokes``) toward a common length; helper vertices follow as barycentres of their
    neighbours. A move is undone for every vertex of a triangle it would turn over or flatten,
    so every triangle keeps its orientation: the triangulated disk stays embedded, and with it
    the drawn graph stays a planar straight-line drawing.

    ``arms`` lists each crossing's vertex and the first vertex of its four edges, counterclockwise:
    those are pushed, each about its crossing, toward four directions a right angle apart (the
    nearest such cross to where they are), so that the strands cross openly.

    ``anchors`` (drawn vertices, their targets): those are pulled toward their targets instead,
    as far as the triangles let them go.

    Parameters: positions, the triangulation (adjacency, fixed boundary, triangles), how many
    vertices are drawn, the drawn edges, the number of rounds, the arms and the anchors.
    Returns new positions.
    """
    arms = np.asarray(arms, dtype=int).reshape(-1, 5)
    quarter = np.arange(4) * (np.pi / 2)
    xy = xy.copy()
    tri = np.asarray(triangles, dtype=int)
    sign = np.sign(_orientations(xy, tri))
    fixed = np.zeros(len(xy), dtype=bool)
    fixed[list(boundary)] = True
    helpers = np.array([v for v in range(drawn, len(xy)) if not fixed[v]], dtype=int)
    # helper -> neighbour pairs, for the barycentric update of all helpers at once
    rows = np.array([i for i, v in enumerate(helpers) for _ in adjacency[v]], dtype=int)
    cols = np.array([u for v in helpers for u in adjacency[v]], dtype=int)
    degree = np.bincount(rows, minlength=len(helpers)).astype(float)
    edges = np.asarray(strokes, dtype=int)
    movable = ~fixed[:drawn]
    for round_ in range(rounds):
        pts = xy[:drawn]
        lengths = np.sqrt(((pts[edges[:, 0]] - pts[edges[:, 1]]) ** 2).sum(axis=1))
        ideal = float(np.median(lengths))
        if ideal <= 0:
            break
        force, nearest = _repulsion(pts, ideal)
        pull = (pts[edges[:, 1]] - pts[edges[:, 0]]) * (lengths / ideal)[:, None]
        np.add.at(force, edges[:, 0], pull)
        np.add.at(force, edges[:, 1], -pull)
        if len(arms):
            np.add.at(force, arms[:, 1:].ravel(), _opening(pts, arms, quarter).reshape(-1, 2))
        if anchors is not None:
            force[anchors[0]] = ANCHOR_PULL * (anchors[1] - pts[anchors[0]])
        size = np.sqrt((force ** 2).sum(axis=1))
        # a step of at most a third of the distance to the nearest other drawn vertex
        step = np.minimum(size, 0.3 * nearest) * (1 - round_ / rounds)
        move = np.where(size[:, None] > 0, force / np.maximum(size, 1e-300)[:, None] * step[:, None], 0.0)
        move[~movable] = 0.0
        trial = xy.copy()
        trial[:drawn] += move
        for _ in range(HELPER_SWEEPS):
            if len(helpers):
                sums = np.stack([np.bincount(rows, trial[cols, axis], len(helpers)) for axis in (0, 1)], axis=1)
                trial[helpers] = sums / degree[:, None]
        for _ in range(8):
            bad = np.sign(_orientations(trial, tri)) != sign
            if not bad.any():
                break
            undo = np.unique(tri[bad].ravel())
            trial[undo] = xy[undo]
        else:
            trial = xy
        xy = trial
    return xy


# ---------------------------------------------------------------------- room inside a face


#: room about every crossing at which a picture anchored to the frame before is kept outright
ANCHORED_ROOM = 0.15

#: how hard an anchored vertex is pulled toward its place in the frame before (per unit of distance)
ANCHOR_PULL = 10.0


def _turned_to(solved: np.ndarray, index: dict[tuple, int], anchors: dict[tuple, Point]):
    """The embedding turned about the centre (never reflected) to best match the anchored
    crossings, with the anchors as (vertex indices, targets); None with fewer than two."""
    keys = [key for key in anchors if key in index]
    if sum(key[0] == "c" for key in keys) < 2:
        return None
    where = np.array([index[key] for key in keys], dtype=int)
    target = np.array([anchors[key] for key in keys], dtype=float)
    now = solved[where, 0] + 1j * solved[where, 1]
    total = complex((target[:, 0] + 1j * target[:, 1]) @ np.conj(now))
    if abs(total) < 1e-12:
        return None
    turned = (solved[:, 0] + 1j * solved[:, 1]) * (total / abs(total))
    return np.stack([turned.real, turned.imag], axis=1), where, target


def inscribed_disk(polygon: list[Point], hint: Point | None = None, rounds: int = 4) -> tuple[Point, float]:
    """A large disk inside a simple polygon: its centre and radius (a grid search, refined).

    >>> (cx, cy), r = inscribed_disk([(0, 0), (4, 0), (4, 2), (0, 2)])
    >>> round(cx, 1), round(cy, 1), round(r, 1)
    (2.0, 1.0, 1.0)
    """
    pts = np.asarray(polygon, dtype=float)
    a, b = pts, np.roll(pts, -1, axis=0)

    def clearance(q: np.ndarray) -> np.ndarray:
        # distance from each query point to the boundary, negative outside
        d = b - a
        lengths = np.maximum((d ** 2).sum(axis=1), 1e-300)
        t = np.clip(((q[:, None, :] - a[None]) * d[None]).sum(axis=2) / lengths, 0.0, 1.0)
        nearest = a[None] + t[..., None] * d[None]
        dist = np.sqrt(((q[:, None, :] - nearest) ** 2).sum(axis=2)).min(axis=1)
        # even-odd rule for inside
        xa, ya, xb, yb = a[:, 0], a[:, 1], b[:, 0], b[:, 1]
        qx, qy = q[:, 0:1], q[:, 1:2]
        straddle = (ya[None] > qy) != (yb[None] > qy)
        with np.errstate(divide="ignore", invalid="ignore"):
            xcross = xa[None] + (qy - ya[None]) * (xb - xa)[None] / (yb - ya)[None]
        inside = (straddle & (qx < xcross)).sum(axis=1) % 2 == 1
        return np.where(inside, dist, -dist)

    low, high = pts.min(axis=0), pts.max(axis=0)
    best = np.asarray(hint if hint is not None else pts.mean(axis=0), dtype=float)
    best_value = clearance(best[None])[0]
    span = high - low
    grid = np.stack(np.meshgrid(np.linspace(0, 1, 13), np.linspace(0, 1, 13)), axis=-1).reshape(-1, 2)
    for _ in range(rounds):
        candidates = low + grid * span
        values = clearance(candidates)
        i = int(values.argmax())
        if values[i] > best_value:
            best, best_value = candidates[i], values[i]
        low, span = best - span / 6, span / 3
    if best_value <= 0:
        # a thin face may slip between the grid's points: the midpoints of pairs of its corners do not
        ends = pts[::max(1, len(pts) // 40)]
        i, j = np.triu_indices(len(ends), 1)
        middles = (ends[i] + ends[j]) / 2
        if len(middles):
            values = clearance(middles)
            k = int(values.argmax())
            if values[k] > best_value:
                best, best_value = middles[k], values[k]
    return (float(best[0]), float(best[1])), float(max(best_value, 0.0))


# ---------------------------------------------------------------------- the whole diagram


def _cycle_piece(diagram: Diagram) -> dict[tuple[Side, ...], int]:
    piece_of = {edge: i for i, piece in enumerate(diagram.pieces()) for edge in piece}
    return {cycle: piece_of[cycle[0].edge] for region in diagram.faces.values() for cycle in region}


def _walk_length(diagram: Diagram, region: tuple[tuple[Side, ...], ...]) -> int:
    return sum(len(cycle) for cycle in region)


def outer_face(diagram: Diagram, before: frozenset[int] = frozenset()) -> int:
    """The face drawn outermost: the one with most of the edges ``before`` (the edges around the
    face outside in the frame before, in a movie), then the one touching most pieces, then the
    longest, then the first.

    >>> from movies.diagram.pd import from_pd
    >>> d = from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]])
    >>> outer_face(d), outer_face(d, frozenset({2, 4, 6}))  # a three-sided face; the other one
    (2, 3)
    """
    def kept(f: int) -> int:
        return len(before.intersection(side.edge for cycle in diagram.faces[f] for side in cycle))

    return min(diagram.faces, key=lambda f: (-kept(f), -len(diagram.faces[f]), -_walk_length(diagram, diagram.faces[f]), f))


def drawn_outside(diagram: Diagram, lay: Layout) -> int:
    """The face a layout draws outermost (in a movie it may differ from :func:`outer_face`).

    >>> from movies.language.spec import parse_diagram
    >>> d = parse_diagram("5_2")
    >>> drawn_outside(d, layout(d)) == outer_face(d)
    True
    """
    return lay.outer if lay.outer is not None else outer_face(diagram)


class _Transform:
    def __init__(self, centre: Point, radius: float) -> None:
        self.centre, self.radius = centre, radius

    def __call__(self, p: Point) -> Point:
        return (self.centre[0] + self.radius * p[0], self.centre[1] + self.radius * p[1])


def _children_disks(centre: Point, radius: float, count: int, label: bool) -> tuple[list[tuple[Point, float]], Point]:
    """Disks for ``count`` pieces side by side inside a disk, and a spot for the face label above them."""
    if count == 0:
        return [], centre
    drop = 0.18 * radius if label else 0.0
    rho = min(0.62 * radius if label else 0.8 * radius, 0.92 * radius / count)
    while True:
        spacing = 2.1 * rho
        far = (count - 1) * spacing / 2
        if math.hypot(far, drop) + rho <= 0.92 * radius:
            break
        rho *= 0.93
    disks = [((centre[0] - far + j * spacing, centre[1] - drop), rho) for j in range(count)]
    top = centre[1] - drop + rho
    spot = (centre[0], (top + centre[1] + radius) / 2)
    return disks, spot


def layout(diagram: Diagram, previous: Layout | None = None) -> Layout:
    """A planar straight-line skeleton of the whole diagram (see the module docstring).

    Parameters: a diagram; ``previous``, the layout of the frame before in a movie: where both
    are drawn as one piece, the crossings they share and the edges that still join the same
    crossings are pulled back to where they were (see :func:`tutte_piece`). A closed braid is
    drawn as one (:func:`braid_layout`), in a movie while the frames before were.
    Returns a :class:`Layout` with a point for every crossing and
    face, a polyline for every edge and a circle for every crossingless edge.

    >>> from movies.diagram.constructors import unlink
    >>> lay = layout(unlink(2))
    >>> sorted(lay.circles), sorted(lay.face_points)
    ([1, 2], [1, 2, 3])
    """
    braided = braid_layout(diagram, previous=previous) if previous is None or previous.braid else None
    if braided is not None and previous is None:
        return braided
    drawn = _laid_out(diagram, previous)
    if previous is None and diagram.piece_count() == 1 and diagram.crossings and _quality(diagram, drawn) < 1:
        drawn = _other_outsides(diagram, drawn)
    if braided is None:
        return drawn
    # a frame after a closed braid: as a closed braid again, unless that moves it more
    return min((braided, drawn), key=lambda lay: _moved(aligned(lay, previous), previous))


#: how many other faces (the longest first) a crowded or shallow picture tries as its outside
OTHER_OUTSIDES = 5


def _other_outsides(diagram: Diagram, drawn: Layout) -> Layout:
    """The best of the picture and those with another face outside, by :func:`_quality`:
    Tutte's embedding crowds a part of the diagram cut off from the outside by a short cycle,
    and another outside can give it room."""
    faces = sorted((f for f in diagram.faces if f != drawn.outer), key=lambda f: (-_walk_length(diagram, diagram.faces[f]), f))
    best, score = drawn, _quality(diagram, drawn)
    for face in faces[:OTHER_OUTSIDES]:
        trial = _laid_out(diagram, None, face)
        value = _quality(diagram, trial)
        if value > score:
            best, score = trial, value
        if score >= 1:
            break
    return best


def _quality(diagram: Diagram, lay: Layout) -> float:
    """How readable a picture is, 1 or more when readable: the smallest crossing angle over 30°,
    the closest two crossings come over 3% of the width, or the shortest first piece of an edge
    at a crossing (where the under-strand's gap is cut) over 1% of it, whichever is least.

    >>> from movies.language.spec import parse_diagram
    >>> d = parse_diagram("4_1")
    >>> _quality(d, layout(d)) >= 1
    True
    """
    smallest, arm = 90.0, math.inf
    for name in diagram.crossings:
        darts = [dart_point(diagram, lay.edges, name, position) for position in range(4)]
        arm = min([arm] + [math.dist(lay.crossings[name], q) for q in darts])
        over = math.atan2(darts[1][1] - darts[3][1], darts[1][0] - darts[3][0])
        under = math.atan2(darts[2][1] - darts[0][1], darts[2][0] - darts[0][0])
        turn = abs(math.degrees(over - under)) % 180
        smallest = min(smallest, turn, 180 - turn)
    points = list(lay.crossings.values())
    closest = min((math.dist(p, q) for i, p in enumerate(points) for q in points[i + 1:]), default=1.0)
    width = lay.bounds[2] - lay.bounds[0]
    return min(smallest / 30.0, closest / (0.03 * width), arm / (0.01 * width))


def _moved(lay: Layout, previous: Layout) -> float:
    """The mean distance the crossings shared with ``previous`` moved (0 with none shared)."""
    shared = [c for c in lay.crossings if c in previous.crossings]
    return sum(math.dist(lay.crossings[c], previous.crossings[c]) for c in shared) / len(shared) if shared else 0.0


def _laid_out(diagram: Diagram, previous: Layout | None, root: int | None = None) -> Layout:
    """The layout by Tutte's method (see :func:`layout`), with ``root`` outside if given."""
    result = Layout()
    if not diagram.faces or not any(diagram.faces.values()):
        # the empty diagram: one face, the whole sphere, and a short strip to name it in
        result.face_points = {name: (0.0, 0.0) for name in diagram.faces}
        result.bounds = (-1.15, -0.3, 1.15, 0.3)
        return result
    follow = previous is not None and previous.bounds == ONE_PIECE
    if root is None:
        root = outer_face(diagram, previous.outside if follow else frozenset())
    result.outer = root
    result.outside = frozenset(side.edge for cycle in diagram.faces[root] for side in cycle)
    cycle_piece = _cycle_piece(diagram)
    pieces = diagram.pieces()
    piece_cycles: dict[int, list[tuple[Side, ...]]] = {}
    for cycle, piece in cycle_piece.items():
        piece_cycles.setdefault(piece, []).append(cycle)
    side_region = {cycle: name for name, region in diagram.faces.items() for cycle in region}

    def place_region(region: int, arriving: tuple[Side, ...] | None, disks: list[tuple[Point, float]]) -> None:
        """Draw the pieces of ``region`` other than the one whose cycle is ``arriving``."""
        others = [cycle for cycle in diagram.faces[region] if cycle != arriving]
        for cycle, (centre, radius) in zip(others, disks):
            place_piece(cycle_piece[cycle], cycle, centre, radius)

    def place_inside(region: int, arriving, centre: Point, radius: float) -> None:
        count = len(diagram.faces[region]) - 1
        disks, spot = _children_disks(centre, radius, count, label=True)
        result.face_points[region] = spot
        place_region(region, arriving, disks)

    def place_piece(piece: int, outer: tuple[Side, ...], centre: Point, radius: float, anchors=None) -> None:
        edges = pieces[piece]
        move = _Transform(centre, radius)
        if len(edges) == 1 and next(iter(edges)) in diagram.loops:
            (loop,) = edges
            r = 0.85 * radius
            # the side facing outwards is the right side exactly when the circle runs counterclockwise
            counterclockwise = outer[0].hand == "R"
            result.circles[loop] = (centre, r, counterclockwise)
            inside = [c for c in piece_cycles[piece] if c != outer][0]
            place_inside(side_region[inside], inside, centre, 0.9 * r)
            return
        geometry = piece_geometry(diagram, piece_cycles[piece], outer, anchors)
        result.crossings.update({c: move(p) for c, p in geometry.crossings.items()})
        result.edges.update({e: [move(p) for p in pts] for e, pts in geometry.edges.items()})
        for cycle, polygon in geometry.face_polygons.items():
            region = side_region[cycle]
            moved = [move(p) for p in polygon]
            hint = geometry.face_centres.get(cycle)
            if len(diagram.faces[region]) == 1 and hint is not None:
                # a rough spot; the picture looks for room in the face as drawn when it labels it
                result.face_points[region] = move(hint)
                continue
            inner_centre, inner_radius = inscribed_disk(moved, move(hint) if hint else None)
            if len(diagram.faces[region]) == 1:
                result.face_points[region] = inner_centre
            else:
                place_inside(region, cycle, inner_centre, 0.8 * inner_radius)

    roots = list(diagram.faces[root])
    count = len(roots)
    columns = max(1, math.ceil(math.sqrt(count)))
    disks = [((2.3 * (j % columns), -2.3 * (j // columns)), 1.0) for j in range(count)]
    circles = [cycle for cycle in roots if _is_circle(diagram, pieces[cycle_piece[cycle]])]
    beside = (follow and 2 <= count <= 1 + len(CORNERS)
              and len(circles) == count - 1)
    if (follow and count == 1 and not circles) or beside:
        # one piece drawn in the unit disk, as before: its own coordinates are the picture's; circles
        # beside it (born, or about to die) in the corners, so the picture keeps its size
        (main,) = [cycle for cycle in roots if cycle not in circles]
        braided = (braid_layout(_without_circles(diagram, circles), root, previous) if circles and previous.braid
                   else None)
        if braided is not None:  # still the closed braid it was, with circles beside it
            result.crossings, result.edges, result.braid = braided.crossings, braided.edges, True
            result.face_points.update(braided.face_points)
        else:
            place_piece(cycle_piece[main], main, (0.0, 0.0), 1.0, _anchors(diagram, previous))
        for cycle, centre in zip(circles, CORNERS):
            place_piece(cycle_piece[cycle], cycle, centre, CORNER_RADIUS)
        columns, count = 1, 1
    else:
        place_region(root, None, disks)
    rows = math.ceil(count / columns) if count else 1
    # the outer face's label sits in the top-left corner, outside every piece
    result.face_points[root] = OUTER_LABEL
    width = 2.3 * (min(count, columns) - 1) if count else 0.0
    result.bounds = (-1.15, -2.3 * (rows - 1) - 1.15, width + 1.15, 1.25)
    return result


#: the bounds of a picture of one piece (or of pieces nested in one)
ONE_PIECE = (-1.15, -1.15, 1.15, 1.25)

#: where crossingless circles beside one piece go in a movie's frame (the top-left corner holds
#: the outer face's label), and their disks' radius: outside the unit disk, inside the bounds
CORNERS = ((1.0, 1.05), (1.0, -1.0), (-1.0, -1.0))
CORNER_RADIUS = 0.15


def _in_corner(point: Point, radius: float = 0.0) -> bool:
    """Whether a point (or a circle about it) lies in one of the :data:`CORNERS`' disks."""
    return any(math.dist(point, corner) + radius <= CORNER_RADIUS + 1e-9 for corner in CORNERS)


def _is_circle(diagram: Diagram, edges) -> bool:
    """Whether a piece is one crossingless circle with nothing inside its disk but its faces."""
    return len(edges) == 1 and next(iter(edges)) in diagram.loops


def _anchors(diagram: Diagram, previous: Layout) -> dict[tuple, Point]:
    """Where the crossings shared with ``previous`` were, and the inner points of the edges that
    still join the same two shared crossings (``("c", name)``, ``("e", edge, i)``)."""
    anchors: dict[tuple, Point] = {("c", c): previous.crossings[c] for c in diagram.crossings if c in previous.crossings}
    for edge in _kept_edges(diagram, previous, {c for _, c in anchors}):
        for i, point in enumerate(previous.edges[edge][1:-1], start=1):
            anchors[("e", edge, i)] = point
    return anchors


def _kept_edges(diagram: Diagram, previous: Layout, shared) -> list[int]:
    """Edges drawn before between the same two shared crossings, with the same number of points."""
    kept = []
    for edge, (tail, head) in diagram.edge_ends.items():
        points = previous.edges.get(edge)
        if (points is None or len(points) != SUBDIVISION + 2 or tail.crossing not in shared
                or head.crossing not in shared):
            continue
        if points[0] == previous.crossings[tail.crossing] and points[-1] == previous.crossings[head.crossing]:
            kept.append(edge)
    return kept


def braid_layout(diagram: Diagram, outside: int | None = None, previous: Layout | None = None) -> Layout | None:
    """The diagram drawn as a closed braid (:mod:`movies.draw.braids`), or None where it is not
    one or no picture of it passes the checks (planar, every crossing in PD order); with
    ``outside``, only a picture with that face outside; with ``previous`` (a movie's frame
    before), columns and levels where its crossings were.

    >>> from movies.diagram.constructors import torus_link
    >>> lay = braid_layout(torus_link(3, 4))
    >>> lay.braid, len(lay.crossings)
    (True, 8)
    """
    from movies.draw.braids import braid_drawings, braid_plan

    plan = braid_plan(diagram)
    if plan is None:
        return None
    for crossings, edges, outer in braid_drawings(diagram, plan, previous.crossings if previous else None):
        if outside is not None and outer != outside:
            continue
        if not _in_pd_order(diagram, crossings, edges) or crossings_between([edges[e] for e in sorted(edges)]):
            continue
        faces: dict[int, Point] = {}
        for face, (cycle,) in diagram.faces.items():
            inner = plan.inner if outer == plan.outer else plan.outer
            faces[face] = OUTER_LABEL if face == outer else (0.0, 0.0) if face == inner else \
                inscribed_disk(_polygon(edges, cycle))[0]
        around = frozenset(side.edge for cycle in diagram.faces[outer] for side in cycle)
        return Layout(crossings, edges, {}, faces, ONE_PIECE, around, outer, True)
    return None


def _without_circles(diagram: Diagram, circles: list[tuple[Side, ...]]) -> Diagram:
    """The diagram with the crossingless circles of these face cycles gone (the faces beside each
    merge, keeping the outer one's name)."""
    from movies.diagram.moves.morse import death

    for cycle in circles:
        diagram = death(diagram, diagram.component_of(cycle[0].edge))
    return diagram


def aligned(lay: Layout, previous: Layout | None) -> Layout:
    """The layout turned about its centre to match the crossings it shares with ``previous``.

    Consecutive frames of a movie are laid out one by one, and the same crossings may come out
    turned round the picture; turning the new one (never reflecting it: that would draw the
    mirror image) by the angle that best matches the shared crossings, in the least-squares
    sense, keeps what a step does not touch near where it was. Only a drawing of one piece
    (or of several nested in one) is turned, about the centre of its disk; anything else, or
    fewer than two shared crossings, comes back as it is.

    >>> from movies.diagram.constructors import from_braid
    >>> d = from_braid([1, 1, 1])
    >>> lay = layout(d)
    >>> turned = Layout({c: (-y, x) for c, (x, y) in lay.crossings.items()}, bounds=lay.bounds)
    >>> back = aligned(lay, turned)
    >>> all(math.dist(back.crossings[c], turned.crossings[c]) < 1e-9 for c in lay.crossings)
    True
    """
    if previous is None or lay.bounds != ONE_PIECE:
        return lay
    shared = [c for c in lay.crossings if c in previous.crossings]
    if len(shared) < 2:
        return lay
    total = sum(complex(*previous.crossings[c]) * complex(*lay.crossings[c]).conjugate() for c in shared)
    if abs(total) < 1e-12:
        return lay
    turn = total / abs(total)

    def rotate(p: Point) -> Point:
        z = complex(*p) * turn
        return (z.real, z.imag)

    return replace(
        lay,
        crossings={c: rotate(p) for c, p in lay.crossings.items()},
        edges={e: [rotate(p) for p in pts] for e, pts in lay.edges.items()},
        # circles in the corners stay there: turned, they would leave the picture
        circles={e: ((centre if _in_corner(centre, r) else rotate(centre)), r, ccw)
                 for e, (centre, r, ccw) in lay.circles.items()},
        face_points={f: (p if p == OUTER_LABEL or _in_corner(p) else rotate(p)) for f, p in lay.face_points.items()},
    )


def settled(diagram: Diagram, lay: Layout, previous: Layout | None) -> Layout:
    """The layout with what it shares with ``previous`` moved back toward where it was.

    After :func:`aligned`, the crossings a step did not touch may still sit elsewhere, since
    each frame is laid out on its own. This moves each shared crossing, and each edge whose two
    ends are the same shared crossings as before, the fraction ``t`` of the way to its old place
    (the other edges keep their points and follow their ends), for the largest ``t`` of 1, 0.6,
    0.3 that keeps the drawing planar and every crossing's ends counterclockwise in PD order
    (else it would draw the mirror image); with none, the layout comes back as it is.

    >>> from movies.diagram.constructors import from_braid
    >>> d = from_braid([1, 1, 1])
    >>> lay = layout(d)
    >>> settled(d, lay, lay).crossings == lay.crossings
    True
    """
    if previous is None or lay.bounds != previous.bounds or lay.circles or previous.circles:
        return lay
    shared = [c for c in lay.crossings if c in previous.crossings]
    if not shared:
        return lay
    kept = [e for e in _kept_edges(diagram, previous, set(shared))
            if e in lay.edges and len(previous.edges[e]) == len(lay.edges[e])]

    def blend(p: Point, q: Point, t: float) -> Point:
        return (p[0] + t * (q[0] - p[0]), p[1] + t * (q[1] - p[1]))

    for t in (1.0, 0.6, 0.3):
        crossings = dict(lay.crossings)
        for c in shared:
            crossings[c] = blend(lay.crossings[c], previous.crossings[c], t)
        edges = {}
        for e, pts in lay.edges.items():
            if e in kept:
                pts = [blend(p, q, t) for p, q in zip(pts, previous.edges[e])]
            tail, head = diagram.edge_ends[e]
            edges[e] = [crossings[tail.crossing]] + list(pts[1:-1]) + [crossings[head.crossing]]
        if crossings_between([edges[e] for e in sorted(edges)]) or not _in_pd_order(diagram, crossings, edges):
            continue
        points = dict(lay.face_points)
        return replace(lay, crossings=crossings, edges=edges, face_points=points)
    return lay


def _in_pd_order(diagram: Diagram, crossings: dict, edges: dict) -> bool:
    """Whether at every crossing the four ends leave counterclockwise in PD order."""
    for name, labels in diagram.crossings.items():
        x, y = crossings[name]
        darts = [dart_point(diagram, edges, name, position) for position in range(4)]
        if not counterclockwise([(q[0] - x, q[1] - y) for q in darts]):
            return False
    return True


def dart_point(diagram: Diagram, edges: dict, name: int, position: int) -> Point:
    """The first point after crossing ``name`` on the edge at its slot ``position``.

    >>> from movies.diagram.constructors import from_braid
    >>> d = from_braid([1, 1])
    >>> lay = layout(d)
    >>> dart_point(d, lay.edges, 1, 0) in (lay.edges[d.crossings[1][0]][1], lay.edges[d.crossings[1][0]][-2])
    True
    """
    edge = diagram.crossings[name][position]
    tail, _ = diagram.edge_ends[edge]
    pts = edges[edge]
    return pts[1] if (tail.crossing, tail.position) == (name, position) else pts[-2]
