"""Diagrams up to isotopy of the sphere: a canonical form that forgets every name.

Two diagrams are *the same on the sphere* when an orientation-preserving homeomorphism of S²
carries one onto the other, edge orientations and over/under included. Names of edges,
crossings, faces and components play no part.

How the form is built:

- A connected piece with crossings is a combinatorial map: every crossing has four darts in
  counterclockwise order, numbered from the incoming under-strand, so a homeomorphism fixes the
  position of every dart and is determined by where it sends one crossing. Starting from a
  crossing, a breadth-first walk that names crossings in the order it meets them writes a code
  (sign, then for each position the neighbouring crossing and position); the code rebuilds the
  piece, and the smallest code over all starts is canonical. Only starts with the smallest cheap
  invariant (sign and the sizes of the four corner faces) are tried. The starts that tie for the
  smallest code are the images of one start under the symmetries of the piece.
- A crossingless circle is a piece with two faces, left (``0``) and right (``1``) of its
  orientation; no symmetry of the sphere preserving the oriented circle swaps them.
- Pieces and regions form a tree (a piece touches one region through each of its faces). The
  tree is rooted at its centre (one node: every leaf is a region, so longest paths have even
  length) and encoded level by level from the leaves: a region by the sorted ranks of the
  pieces it holds, a piece by its code, the face it hangs from and the ranks of the regions at
  its other faces, in the face order of its canonical labelling, minimised over the tied
  labellings. Ranks are positions in the sorted list of keys of the level below, and the form
  lists every level, so it is flat plain data.

>>> from movies.diagram.pd import from_pd
>>> trefoil = from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]])
>>> same_on_sphere(trefoil, from_pd([[2, 6, 3, 5], [4, 2, 5, 1], [6, 4, 1, 3]]))
True
>>> same_on_sphere(trefoil, reflect_and_switch(trefoil))
True
"""

from __future__ import annotations

from dataclasses import dataclass

from movies.diagram.assembly import canonical_cycle

from movies.diagram.model import Diagram, Side, head_positions
from movies.errors import DiagramError

__all__ = [
    "canonical_form",
    "isomorphism",
    "reflect_and_switch",
    "same_on_sphere",
    "same_up_to_reflection",
]


@dataclass(frozen=True)
class _Labelling:
    """One canonical labelling of a piece: crossing names, edge names and local faces in order."""

    crossings: tuple[int, ...]
    edges: tuple[int, ...]
    faces: tuple[int, ...]


@dataclass(frozen=True)
class _Piece:
    """A split piece: its code, its tied canonical labellings and the region at each local face."""

    code: tuple[int, ...]
    labellings: tuple[_Labelling, ...]
    face_region: tuple[int, ...]


# ---------------------------------------------------------------------- one piece


def _loop_piece(diagram: Diagram, edge: int) -> _Piece:
    regions = tuple(_region_of(diagram, Side(edge, hand)) for hand in "LR")
    return _Piece((0,), (_Labelling((), (edge,), (0, 1)),), regions)


def _region_of(diagram: Diagram, side: Side) -> int:
    try:
        return diagram.side_face[side]
    except KeyError:
        raise DiagramError(f"the face data of the diagram has no face on side {side!r}") from None


def _crossing_piece(diagram: Diagram, edges: frozenset[int]) -> _Piece:
    names = sorted({end.crossing for e in edges for end in diagram.edge_ends[e]})
    local = {name: i for i, name in enumerate(names)}
    n = len(names)
    sign = [diagram.signs[name] for name in names]
    # darts are numbered 4 * crossing + position
    edge_at = [0] * (4 * n)
    other = [0] * (4 * n)
    for i, name in enumerate(names):
        for p, edge in enumerate(diagram.crossings[name]):
            edge_at[4 * i + p] = edge
            tail, head = diagram.edge_ends[edge]
            far = head if (tail.crossing, tail.position) == (name, p) else tail
            other[4 * i + p] = 4 * local[far.crossing] + far.position

    # faces: leave through a dart, arrive at the other end, leave again one position clockwise
    face_of = [-1] * (4 * n)
    face_size: list[int] = []
    face_region: list[int] = []
    for start in range(4 * n):
        if face_of[start] >= 0:
            continue
        face = len(face_size)
        dart, size = start, 0
        region = None
        while face_of[dart] < 0:
            face_of[dart] = face
            size += 1
            c, p = divmod(dart, 4)
            hand = "R" if p in head_positions(sign[c]) else "L"
            found = _region_of(diagram, Side(edge_at[dart], hand))
            if region is None:
                region = found
            elif found != region:
                raise DiagramError(
                    f"the face data of the diagram puts sides of one face in faces {region} and {found}"
                )
            arrive = other[dart]
            dart = 4 * (arrive // 4) + (arrive % 4 - 1) % 4
        face_size.append(size)
        face_region.append(region)

    def invariant(c: int) -> tuple[int, ...]:
        return (sign[c],) + tuple(face_size[face_of[4 * c + p]] for p in range(4))

    cheapest = min(invariant(c) for c in range(n))
    best: tuple[int, ...] | None = None
    tied: list[list[int]] = []
    for start in range(n):
        if invariant(start) != cheapest:
            continue
        code, order = _walk_code(start, n, sign, other)
        if best is None or code < best:
            best, tied = code, [order]
        elif code == best:
            tied.append(order)
    labellings = tuple(_labelling(order, names, edge_at, face_of) for order in tied)
    return _Piece((n,) + best, labellings, tuple(face_region))


def _walk_code(start: int, n: int, sign: list[int], other: list[int]) -> tuple[tuple[int, ...], list[int]]:
    label = [-1] * n
    label[start] = 0
    order = [start]
    code: list[int] = []
    k = 0
    while k < len(order):
        c = order[k]
        k += 1
        code.append(sign[c])
        for p in range(4):
            far = other[4 * c + p]
            j = far >> 2
            if label[j] < 0:
                label[j] = len(order)
                order.append(j)
            code.append(4 * label[j] + (far & 3))
    return tuple(code), order


def _labelling(order: list[int], names: list[int], edge_at: list[int], face_of: list[int]) -> _Labelling:
    edges: dict[int, None] = {}
    faces: dict[int, None] = {}
    for c in order:
        for p in range(4):
            edges.setdefault(edge_at[4 * c + p])
            faces.setdefault(face_of[4 * c + p])
    return _Labelling(tuple(names[c] for c in order), tuple(edges), tuple(faces))


# ---------------------------------------------------------------------- the tree of pieces


@dataclass(frozen=True)
class _Analysis:
    form: tuple
    walk: tuple  # canonical visiting order: ("region", name) and ("piece", labelling)


def _analyse(diagram: Diagram) -> _Analysis:
    pieces = [
        _loop_piece(diagram, next(iter(edges))) if len(edges) == 1 and next(iter(edges)) in diagram.loops
        else _crossing_piece(diagram, edges)
        for edges in diagram.pieces()
    ]
    if not pieces:
        return _Analysis(("sphere", "empty", ()), ())

    # nodes: ("P", index) and ("R", region name)
    neighbours: dict[tuple[str, int], list[tuple[str, int]]] = {}
    for i, piece in enumerate(pieces):
        if len(set(piece.face_region)) != len(piece.face_region):
            raise DiagramError("the face data of the diagram puts two faces of one split piece in one region")
        neighbours[("P", i)] = [("R", r) for r in piece.face_region]
        for r in piece.face_region:
            neighbours.setdefault(("R", r), []).append(("P", i))
    missing = sorted(set(diagram.faces) - {r for kind, r in neighbours if kind == "R"})
    if missing:
        raise DiagramError(f"faces {missing} of the diagram touch no edge")
    if sum(len(p.face_region) for p in pieces) != len(neighbours) - 1:
        raise DiagramError("the split pieces and regions of the diagram do not form a tree")

    root = _centre(neighbours)
    parent: dict[tuple[str, int], tuple[str, int] | None] = {root: None}
    levels: list[list[tuple[str, int]]] = [[root]]
    while True:
        nxt = []
        for node in levels[-1]:
            for other in neighbours[node]:
                if other not in parent:
                    parent[other] = node
                    nxt.append(other)
        if not nxt:
            break
        levels.append(nxt)
    if len(parent) != len(neighbours):
        raise DiagramError("the split pieces and regions of the diagram do not form a tree")

    rank: dict[tuple[str, int], int] = {}
    chosen: dict[int, _Labelling] = {}
    encoded: list[tuple] = []
    for level in reversed(levels):
        keys = {}
        for node in level:
            kind, name = node
            if kind == "R":
                keys[node] = tuple(sorted(rank[child] for child in neighbours[node] if child != parent[node]))
            else:
                keys[node], chosen[name] = _piece_key(pieces[name], parent[node], rank)
        order = sorted(set(keys.values()))
        where = {key: i for i, key in enumerate(order)}
        for node, key in keys.items():
            rank[node] = where[key]
        encoded.append(tuple(sorted(keys.values())))
    form = ("sphere", "piece" if root[0] == "P" else "region", tuple(reversed(encoded)))

    walk: list[tuple[str, object]] = []
    stack = [root]
    while stack:
        node = stack.pop()
        kind, name = node
        if kind == "R":
            walk.append(("region", name))
            children = sorted((c for c in neighbours[node] if c != parent[node]), key=lambda c: rank[c])
        else:
            labelling = chosen[name]
            walk.append(("piece", labelling))
            region_at = pieces[name].face_region
            children = [("R", region_at[f]) for f in labelling.faces if ("R", region_at[f]) != parent[node]]
        stack.extend(reversed(children))
    return _Analysis(form, tuple(walk))


def _piece_key(piece: _Piece, up: tuple[str, int] | None, rank: dict) -> tuple[tuple, _Labelling]:
    best = None
    for labelling in piece.labellings:
        port = -1
        kids = []
        for i, f in enumerate(labelling.faces):
            node = ("R", piece.face_region[f])
            if node == up:
                port = i
                kids.append(-1)
            else:
                kids.append(rank[node])
        candidate = (port, tuple(kids))
        if best is None or candidate < best[0]:
            best = (candidate, labelling)
    (port, kids), labelling = best
    return (piece.code, port, kids), labelling


def _centre(neighbours: dict) -> tuple[str, int]:
    degree = {node: len(adj) for node, adj in neighbours.items()}
    remaining = set(neighbours)
    leaves = [node for node, d in degree.items() if d <= 1]
    while len(remaining) > 2:
        remaining.difference_update(leaves)
        fresh = []
        for leaf in leaves:
            for other in neighbours[leaf]:
                if other in remaining:
                    degree[other] -= 1
                    if degree[other] == 1:
                        fresh.append(other)
        leaves = fresh
    # leaves are regions, so one centre remains; min() only makes the choice explicit
    return min(remaining)


# ---------------------------------------------------------------------- public functions


def canonical_form(diagram: Diagram) -> tuple:
    """A hashable form, equal for two diagrams exactly when they are the same on the sphere.

    Parameters: ``diagram``, any diagram (split pieces and crossingless circles allowed).
    Returns a tuple of strings, integers and tuples; names of the diagram do not enter it.

    >>> from movies.diagram.pd import from_pd
    >>> hopf = from_pd([[4, 1, 3, 2], [2, 3, 1, 4]])
    >>> canonical_form(hopf) == canonical_form(from_pd([[2, 3, 1, 4], [4, 1, 3, 2]]))
    True
    >>> canonical_form(from_pd([], loops=1))
    ('sphere', 'piece', ((((0,), -1, (0, 0)),), ((), ())))
    """
    return _analyse(diagram).form


def same_on_sphere(first: Diagram, second: Diagram) -> bool:
    """True when an orientation-preserving homeomorphism of S² carries ``first`` onto ``second``.

    Parameters: two diagrams. Returns a bool. Orientations of the edges and over/under at the
    crossings must match; names are ignored.

    >>> from movies.diagram.pd import from_pd
    >>> trefoil = from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]])
    >>> same_on_sphere(trefoil, from_pd([[3, 1, 4, 6], [5, 3, 6, 2], [1, 5, 2, 4]]))
    True
    >>> same_on_sphere(trefoil, from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]], loops=1))
    False
    """
    return canonical_form(first) == canonical_form(second)


def same_up_to_reflection(first: Diagram, second: Diagram) -> bool:
    """True when ``second`` is ``first`` or ``reflect_and_switch(first)`` on the sphere.

    Parameters: two diagrams. Returns a bool. Reflecting the sphere and switching every
    crossing is a rotation by π of space about an axis in the projection plane, so such
    diagrams are isotopic links with the same orientation.
    Two circles run the same way with their right sides in common become, reflected, two
    circles with their left sides in common: not the same on the sphere, but the same link.

    >>> from movies.diagram.pd import from_pd
    >>> a, b = from_pd([], loops=2), from_pd([], loops=1)
    >>> same_up_to_reflection(a, reflect_and_switch(a)), same_on_sphere(a, reflect_and_switch(a))
    (True, False)
    >>> same_up_to_reflection(a, b)
    False
    """
    form = canonical_form(second)
    return form == canonical_form(first) or form == canonical_form(reflect_and_switch(first))


def reflect_and_switch(diagram: Diagram) -> Diagram:
    """The diagram reflected in a line of the sphere, with every crossing switched.

    Parameters: a diagram. Returns a new diagram with the same names and edge orientations;
    every sign stays (reflection and switching each change it). A positive crossing
    ``(a, b, c, d)`` becomes ``(d, c, b, a)``, a negative one ``(b, a, d, c)``. Every face is the same region walked the other way, so each of its sides
    changes hand.

    >>> from movies.diagram.pd import from_pd
    >>> hopf = from_pd([[4, 1, 3, 2], [2, 3, 1, 4]])
    >>> mirror = reflect_and_switch(hopf)
    >>> mirror.crossings, mirror.signs, mirror.faces[1]
    ({1: (1, 4, 2, 3), 2: (3, 2, 4, 1)}, {1: -1, 2: -1}, ((1R, 4L),))
    >>> reflect_and_switch(mirror) == hopf
    True
    """
    crossings = {}
    for name, (a, b, c, d) in diagram.crossings.items():
        crossings[name] = (d, c, b, a) if diagram.signs[name] > 0 else (b, a, d, c)
    faces = {
        name: tuple(sorted(canonical_cycle(side.other() for side in reversed(cycle)) for cycle in cycles))
        for name, cycles in diagram.faces.items()
    }
    return Diagram(crossings, dict(diagram.signs), diagram.loops, dict(diagram.components), faces)


def isomorphism(first: Diagram, second: Diagram) -> dict[str, dict[int, int]] | None:
    """Names of ``second`` for the names of ``first`` under a homeomorphism, or None if none.

    Parameters: two diagrams. Returns None when they are not the same on the sphere, else a
    dict with keys ``"crossings"``, ``"edges"``, ``"faces"`` and ``"components"``, each mapping
    names of ``first`` to names of ``second``. A crossing goes to a crossing with the same
    labels in the same positions after the edges are renamed.

    >>> from movies.diagram.pd import from_pd
    >>> a = from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]])
    >>> b = from_pd([[2, 6, 3, 5], [4, 2, 5, 1], [6, 4, 1, 3]])
    >>> match = isomorphism(a, b)
    >>> [tuple(match["edges"][e] for e in a.crossings[x]) == b.crossings[match["crossings"][x]] for x in a.crossings]
    [True, True, True]
    >>> isomorphism(a, from_pd([[4, 1, 3, 2], [2, 3, 1, 4]])) is None
    True
    """
    one, two = _analyse(first), _analyse(second)
    if one.form != two.form:
        return None
    crossings: dict[int, int] = {}
    edges: dict[int, int] = {}
    faces: dict[int, int] = {}
    for (kind, x), (_, y) in zip(one.walk, two.walk):
        if kind == "region":
            faces[x] = y
        else:
            crossings.update(zip(x.crossings, y.crossings))
            edges.update(zip(x.edges, y.edges))
    components = {first.component_of(e): second.component_of(edges[e]) for e in edges}
    return {
        "crossings": dict(sorted(crossings.items())),
        "edges": dict(sorted(edges.items())),
        "faces": dict(sorted(faces.items())),
        "components": dict(sorted(components.items())),
    }
