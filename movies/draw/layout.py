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
face's polygon; crossingless circles are circles. Coordinates are plain floats, y pointing up.

>>> from movies.diagram.pd import from_pd
>>> lay = layout(from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]]))
>>> sorted(lay.crossings), len(lay.edges[1])
([1, 2, 3], 5)
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np

from movies.diagram.model import Diagram, Side

#: subdivision points on each edge (at least 2, so that the subdivided graph is simple)
SUBDIVISION = 3

#: rounds of reweighting after the plain barycentric solve (see :func:`_barycentric`)
REWEIGHTING = 3

Point = tuple[float, float]


@dataclass
class Layout:
    """A drawing's skeleton, in plain floats (y up).

    ``crossings``: crossing -> its point. ``edges``: edge -> polyline from its tail crossing
    through its subdivision points to its head crossing. ``circles``: crossingless edge ->
    (centre, radius, counterclockwise). ``face_points``: face -> a point inside it (for its
    label). ``bounds``: (xmin, ymin, xmax, ymax) of everything.
    """

    crossings: dict[int, Point] = field(default_factory=dict)
    edges: dict[int, list[Point]] = field(default_factory=dict)
    circles: dict[int, tuple[Point, float, bool]] = field(default_factory=dict)
    face_points: dict[int, Point] = field(default_factory=dict)
    bounds: tuple[float, float, float, float] = (-1.0, -1.0, 1.0, 1.0)


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


def tutte_piece(diagram: Diagram, cycles: list[tuple[Side, ...]], outer: tuple[Side, ...]) -> _PieceGeometry:
    """Barycentric embedding of one piece with crossings, its ``outer`` cycle outermost.

    Parameters: the diagram, the face cycles of the piece, and the cycle that faces outwards.
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
    boundary: dict[int, Point] = {}
    centres: dict[tuple[Side, ...], int] = {}
    for cycle, walk in walks.items():
        n = len(walk)
        ring = [vertex(("r", cycle, i)) for i in range(n)]
        for i in range(n):
            link(walk[i], walk[(i + 1) % n])
            link(walk[i], ring[i])
            link(walk[(i + 1) % n], ring[i])
            link(ring[i], ring[(i + 1) % n])
        if cycle == outer:
            # clockwise: the outer face is on the left of its cycle
            for i, r in enumerate(ring):
                angle = math.pi / 2 - 2 * math.pi * (i + 0.5) / n
                boundary[r] = (math.cos(angle), math.sin(angle))
        else:
            centre = vertex(("f", cycle))
            centres[cycle] = centre
            for r in ring:
                link(centre, r)
    solved = _barycentric(len(index), adjacency, boundary)

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
    polygons = {cycle: [at(key) for key in _cycle_walk(diagram, cycle)] for cycle in cycles if cycle != outer}
    face_centres = {cycle: at(("f", cycle)) for cycle in centres}
    return _PieceGeometry(crossings, edges, polygons, face_centres)


def _conjugate_gradient(apply, rhs: np.ndarray, start: np.ndarray, diagonal: np.ndarray,
                        tolerance: float = 1e-13) -> np.ndarray:
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
                 rounds: int = REWEIGHTING) -> np.ndarray:
    """Positions with every inner vertex a weighted average of its neighbours.

    The first round weighs every edge alike (Tutte's embedding); each further round weighs an
    edge by its length in the round before, which pulls long edges in and lets crowded
    regions open up. Any positive weights keep the embedding planar (Floater 2003).
    """
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
        weights = np.clip(lengths / lengths.mean(), 0.05, 20.0)
    return xy


# ---------------------------------------------------------------------- room inside a face


def inscribed_disk(polygon: list[Point], hint: Point | None = None) -> tuple[Point, float]:
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
    for _ in range(4):
        grid = np.stack(np.meshgrid(np.linspace(0, 1, 13), np.linspace(0, 1, 13)), axis=-1).reshape(-1, 2)
        candidates = low + grid * span
        values = clearance(candidates)
        i = int(values.argmax())
        if values[i] > best_value:
            best, best_value = candidates[i], values[i]
        low, span = best - span / 6, span / 3
    return (float(best[0]), float(best[1])), float(max(best_value, 0.0))


# ---------------------------------------------------------------------- the whole diagram


def _cycle_piece(diagram: Diagram) -> dict[tuple[Side, ...], int]:
    piece_of = {edge: i for i, piece in enumerate(diagram.pieces()) for edge in piece}
    return {cycle: piece_of[cycle[0].edge] for region in diagram.faces.values() for cycle in region}


def _walk_length(diagram: Diagram, region: tuple[tuple[Side, ...], ...]) -> int:
    return sum(len(cycle) for cycle in region)


def outer_face(diagram: Diagram) -> int:
    """The face drawn outermost: the one touching most pieces, then the longest, then the first.

    >>> from movies.diagram.pd import from_pd
    >>> outer_face(from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]]))  # a three-sided face
    2
    """
    return min(diagram.faces, key=lambda f: (-len(diagram.faces[f]), -_walk_length(diagram, diagram.faces[f]), f))


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


def layout(diagram: Diagram) -> Layout:
    """A planar straight-line skeleton of the whole diagram (see the module docstring).

    Parameters: a diagram. Returns a :class:`Layout` with a point for every crossing and
    face, a polyline for every edge and a circle for every crossingless edge.

    >>> from movies.diagram.constructors import unlink
    >>> lay = layout(unlink(2))
    >>> sorted(lay.circles), sorted(lay.face_points)
    ([1, 2], [1, 2, 3])
    """
    result = Layout()
    if not diagram.faces:
        return result
    root = outer_face(diagram)
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

    def place_piece(piece: int, outer: tuple[Side, ...], centre: Point, radius: float) -> None:
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
        geometry = tutte_piece(diagram, piece_cycles[piece], outer)
        result.crossings.update({c: move(p) for c, p in geometry.crossings.items()})
        result.edges.update({e: [move(p) for p in pts] for e, pts in geometry.edges.items()})
        for cycle, polygon in geometry.face_polygons.items():
            region = side_region[cycle]
            moved = [move(p) for p in polygon]
            inner_centre, inner_radius = inscribed_disk(moved, move(geometry.face_centres[cycle]))
            if len(diagram.faces[region]) == 1:
                result.face_points[region] = inner_centre
            else:
                place_inside(region, cycle, inner_centre, 0.8 * inner_radius)

    roots = list(diagram.faces[root])
    count = len(roots)
    columns = max(1, math.ceil(math.sqrt(count)))
    disks = [((2.3 * (j % columns), -2.3 * (j // columns)), 1.0) for j in range(count)]
    place_region(root, None, disks)
    rows = math.ceil(count / columns) if count else 1
    # the outer face's label sits in the top-left corner, outside every piece
    result.face_points[root] = (-1.05, 1.12)
    width = 2.3 * (min(count, columns) - 1) if count else 0.0
    result.bounds = (-1.15, -2.3 * (rows - 1) - 1.15, width + 1.15, 1.25)
    return result
