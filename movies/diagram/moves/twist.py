"""Full twists on the strands a gate crosses: the step that takes a surface through a blow-up.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Sequence

from movies.diagram.assembly import reencode

from movies.diagram.model import Dart, Diagram, Side, orbits
from movies.errors import MoveError
from movies.diagram.moves.base import NewNames, _Namer, _move, _rebuild, _check_edge, _relabel_dart


# ---------------------------------------------------------------------- twists


@dataclass(frozen=True)
class TwistResult:
    """What a full twist did: the new diagram and the gate it was inserted on.

    ``gate_faces`` are the faces f_0, ..., f_k the gate passes through (names of the diagram
    before the move); ``directions`` hold +1 for each gate edge that crosses the gate going up
    (from its right to its left) and -1 for one going down; ``algebraic`` is their sum, the
    algebraic number of strands through the gate; ``crossings_added`` is ``|turns| k (k - 1)``.
    """

    diagram: Diagram
    gate_faces: tuple[int, ...]
    directions: tuple[int, ...]
    algebraic: int
    crossings_added: int


@_move
def twist(
    diagram: Diagram,
    edges: Sequence[int],
    turns: int,
    start_face: int | None = None,
    names: NewNames | None = None,
) -> TwistResult:
    """Insert ``turns`` full twists on the strands through ``edges``, along a gate across them.

    Parameters:

    ``edges``
        e_0, ..., e_{k-1}, different edges (crossingless circles allowed), in the order a gate
        crosses them. The gate is a simple path starting in face f_0 beside e_0 and crossing
        each e_{i-1} from f_{i-1} into f_i, the face on its other side, which must border e_i;
        it ends in f_k. Arcs of the gate that pass through one face must fit side by side.
    ``turns``
        a nonzero integer: +1 one right-handed full twist, -1 one left-handed, ``n`` means
        ``|n|`` twists of that hand (the braid word below repeated).
    ``start_face``
        f_0, one of the two faces beside e_0. Needed only when the gate fits starting from
        either side.
    ``names``
        names for the new crossings, edges and faces, used in the order below.

    The picture: the gate runs left to right, from f_0 to f_k; up is the gate's left. A strand
    goes up (direction +1) where the gate crosses it from the face on its left to the face on
    its right, since the face on the left of an upward strand lies to the west of it; otherwise
    it goes down (-1). A small box on the gate gets the braid (σ_1 ⋯ σ_{k-1})^{k·turns} for
    turns > 0, and its inverse word (σ_{k-1}^{-1} ⋯ σ_1^{-1})^{k·|turns|} for turns < 0, read
    from bottom to top, position i (from 1, left to right) being the strand of e_{i-1},
    whatever way each strand runs. Over and under are those of
    :func:`~movies.diagram.constructors.from_braid` (σ_i: over-strand from bottom left to top
    right); a crossing is positive exactly when its two strands run the same way, for σ_i, and
    when they run opposite ways, for σ_i^{-1}. So the writhe changes by
    ``2 * turns * sum(d_i * d_j for i < j)`` and the linking number of two components by
    ``turns`` times the sum of ``d_i * d_j`` over pairs of gate edges, one on each.

    Names: each e_i is cut where the gate crosses it; its first part (along its orientation,
    up to the box) keeps the name e_i. New names, in order: the crossings, in the order of the
    braid word; the edges, strand by strand in gate order, each strand's pieces along its
    orientation from the box's entry to the part that runs on to where e_i ended (that last
    one takes over e_i's old end); a crossingless circle cut by the gate stops being one, and
    its piece outside the box keeps its name at both ends, so it needs one name fewer. The faces:
    a face the box cuts into parts keeps its name on the part with the smallest side of the old
    diagram (split pieces lying in that face go there too); the other parts and the faces inside
    the box get new names in the order of the smallest side on their boundary. Faces away from the gate
    keep their names; so do components (a full twist is a pure braid).

    ``k = 1``: a full twist of one strand adds no crossing; the same diagram comes back.

    Returns a :class:`TwistResult`. Raises :class:`~movies.errors.MoveError` for no edges, a
    repeated or unknown edge, ``turns`` that is not a nonzero integer, a ``start_face`` not
    beside e_0, a gate step into a face that e_i does not border (naming the step), a gate
    that would have to cross itself, and a gate that fits from both sides of e_0 when
    ``start_face`` is not given (naming both faces).

    >>> from movies.diagram.constructors import unlink
    >>> two = unlink(2)  # two circles side by side, drawn counterclockwise
    >>> result = twist(two, [1, 2], +1)
    >>> result.gate_faces, result.directions, result.crossings_added
    ((1, 2, 3), (1, -1), 2)
    >>> d = result.diagram
    >>> d.pd_code(), d.writhe(), d.linking_matrix(), d.piece_count()
    ([(4, 1, 2, 3), (3, 2, 1, 4)], -2, [[0, -1], [-1, 0]], 1)
    >>> d.components  # each circle is cut once: one new edge inside the box for each
    {1: (1, 3), 2: (2, 4)}
    >>> twist(two, [1, 2], +1, start_face=2)
    Traceback (most recent call last):
    ...
    movies.errors.MoveError: no gate across edges [1, 2] from face 2: edges 1 and 2 do not share a face after crossing 1 from face 2 (the gate is in face 1; edge 2 borders faces 3 and 2)
    """
    edges = _edge_list(edges, "a twist", "a twist needs at least one edge for its gate to cross")
    if type(turns) is not int or turns == 0:
        raise MoveError(
            f"turns is a nonzero integer (+1 a right-handed full twist, -1 a left-handed one), not {turns!r}"
        )
    faces, directions = gate_path(diagram, edges, start_face)
    k = len(edges)
    word = _full_twist_word(k, turns) if k > 1 else []
    result = diagram
    if word:
        result = _insert_braid(diagram, edges, directions, word, faces, names)
    return TwistResult(result, tuple(int(f) for f in faces), tuple(directions), sum(directions), len(word))


def _insert_braid(diagram: Diagram, edges: Sequence[int], directions: Sequence[int], word: list[int],
                  faces: Sequence[int], names: NewNames | None) -> Diagram:
    """The diagram with the pure braid ``word`` in a box on the gate (see :func:`twist`)."""
    k = len(edges)
    # the box's segments, numbered as they appear; segment p < k enters position p at the bottom
    current = list(range(k))
    strand = list(range(k))  # segment -> the strand (gate position) it belongs to
    chain = [[p] for p in range(k)]  # strand -> its segments from the bottom of the box to the top
    events = []  # (generator, BL, BR, TR, TL) segments at each crossing, arms counterclockwise
    for generator in word:
        i = abs(generator) - 1
        bottom_left, bottom_right = current[i], current[i + 1]
        top_left, top_right = len(strand), len(strand) + 1
        # the strand from the bottom left leaves at the top right, and the other way round
        strand += [strand[bottom_right], strand[bottom_left]]
        chain[strand[bottom_left]].append(top_right)
        chain[strand[bottom_right]].append(top_left)
        current[i], current[i + 1] = top_left, top_right
        events.append((generator, bottom_left, bottom_right, top_right, top_left))
    namer = _Namer(diagram, names)
    crossing_names = [namer.new("crossing") for _ in events]
    crossings = dict(diagram.crossings)
    loops = set(diagram.loops)
    label: dict[int, int] = {}
    for p, edge in enumerate(edges):
        along = chain[p] if directions[p] > 0 else chain[p][::-1]
        label[along[0]] = edge
        if edge in loops:
            loops.discard(edge)
            label[along[-1]] = edge
            inner = along[1:-1]
        else:
            inner = along[1:]
        for segment in inner:
            label[segment] = namer.new("edge")
        if edge in diagram.edge_ends:
            _relabel_dart(crossings, diagram.edge_ends[edge][1], label[along[-1]])
    raw: dict[int, tuple[int, int, int, int]] = {}
    arriving: set[Dart] = set()
    for name, (generator, bl, br, tr, tl) in zip(crossing_names, events):
        # under-strand at positions 0 and 2: BR-TL for σ_i (over BL-TR), BL-TR for σ_i^{-1}
        arms = (br, tr, tl, bl) if generator > 0 else (bl, br, tr, tl)
        raw[name] = tuple(label[s] for s in arms)  # type: ignore[assignment]
        for position, segment in enumerate(arms):
            up = directions[strand[segment]] > 0
            at_bottom = segment in (bl, br)
            if up == at_bottom:  # an upward strand arrives from below, a downward one from above
                arriving.add(Dart(name, position))
    tuples, new_signs = reencode(raw, arriving)
    crossings.update(tuples)
    signs = dict(diagram.signs)
    signs.update(new_signs)
    return _rebuild(diagram, crossings, signs, loops, namer.hints(cut=frozenset(int(f) for f in faces)))


def _full_twist_word(strands: int, turns: int) -> list[int]:
    """(σ_1 ⋯ σ_{k-1})^{k·turns} for turns > 0; its inverse word for turns < 0."""
    if turns > 0:
        step = list(range(1, strands))
    else:
        step = [-g for g in range(strands - 1, 0, -1)]
    return step * (strands * abs(turns))


def gate_path(diagram: Diagram, edges: Sequence[int], start_face: int | None = None) -> tuple[list[int], list[int]]:
    """The faces a gate across ``edges`` runs through, and the direction of each strand it crosses.

    Parameters: the diagram; the edges the gate crosses, in order; the face it starts in, needed
    only when both sides of the first edge would do. Returns (faces f_0 .. f_k, directions): +1
    for a strand crossing the gate going up (from its right to its left), −1 going down. Raises
    :class:`~movies.errors.MoveError` saying why there is no such gate: no edges, an edge not in
    the diagram or crossed twice, a start face not beside the first edge, a step into a face the
    next edge does not border, a gate that would cross itself, or two possible start faces.

    >>> from movies.diagram.constructors import unlink
    >>> gate_path(unlink(2), [1, 2])
    ([1, 2, 3], [1, -1])
    """
    edges = _edge_list(edges, "a gate", "a gate needs at least one edge to cross")
    for edge in edges:
        _check_edge(diagram, edge)
    repeated = sorted({edge for edge in edges if edges.count(edge) > 1})
    if repeated:
        raise MoveError(
            f"the gate crosses edge {repeated[0]} more than once (edges {edges}); each edge at most once"
        )
    beside = [int(face) for face in diagram.faces_beside(edges[0])]
    if start_face is not None:
        diagram.face(start_face)
        if start_face not in beside:
            raise MoveError(
                f"start_face {start_face} does not border edge {edges[0]} "
                f"(it lies between faces {beside[0]} and {beside[1]})"
            )
        walk = _gate_walk(diagram, edges, start_face)
        if isinstance(walk, str):
            raise MoveError(f"no gate across edges {edges} from face {start_face}: {walk}")
        return walk
    walks = {face: _gate_walk(diagram, edges, face) for face in beside}
    fits = sorted(face for face in beside if not isinstance(walks[face], str))
    if len(fits) == 2:
        raise MoveError(
            f"a gate across edges {edges} can start in face {fits[0]} or in face {fits[1]} "
            "(the two sides of the first edge); say which with start_face"
        )
    if not fits:
        raise MoveError(
            f"no gate crosses edges {edges} in this order: starting in face {beside[0]}, "
            f"{walks[beside[0]]}; starting in face {beside[1]}, {walks[beside[1]]}"
        )
    return walks[fits[0]]  # type: ignore[return-value]


def _edge_list(edges, whose: str, empty: str) -> list[int]:
    """The edges as a list, or a MoveError: not a list of names, or none at all."""
    try:
        edges = list(edges)
    except TypeError:
        raise MoveError(f"the edges of {whose} are a list of edge names, not {edges!r}") from None
    if not edges:
        raise MoveError(empty)
    return edges


def gate_arcs(edges: Sequence[int], faces: Sequence[int], directions: Sequence[int]) -> dict[int, list[tuple[Side, Side]]]:
    """The arcs a gate draws inside each face it passes through (its two end stubs left out).

    >>> gate_arcs([1, 2], [1, 2, 3], [1, -1])
    {2: [(1R, 2R)]}
    """
    arcs: dict[int, list[tuple[Side, Side]]] = {}
    for i in range(1, len(edges)):
        entry = Side(edges[i - 1], "R" if directions[i - 1] > 0 else "L")
        leave = Side(edges[i], "L" if directions[i] > 0 else "R")
        arcs.setdefault(faces[i], []).append((entry, leave))
    return arcs


def _gate_walk(diagram: Diagram, edges: Sequence[int], start: int,
               simple: bool = True) -> tuple[list[int], list[int]] | str:
    """The faces and directions of the gate starting in face ``start``, or why there is none.

    ``simple=False`` leaves out the check that the path does not cross itself (for a handle's
    gate with turn-backs, which is checked straightened).

    ``start`` borders ``edges[0]``. Every edge has two different faces beside it (the drawn
    graph is 4-valent, hence has no bridge, and a crossingless circle separates the sphere),
    so the face the gate is in says which side of the next edge it meets, and crossing an edge
    leads to the face on its other side.
    """
    faces, directions = [start], []
    for i, edge in enumerate(edges):
        left, right = diagram.faces_beside(edge)
        here = faces[-1]
        if here not in (left, right):
            before = edges[i - 1]
            return (
                f"edges {before} and {edge} do not share a face after crossing {before} from face "
                f"{faces[-2]} (the gate is in face {here}; edge {edge} borders faces {left} and {right})"
            )
        # walking along the gate from the face on the edge's left to the one on its right, the
        # edge runs from the gate's right to its left: up
        directions.append(+1 if here == left else -1)
        faces.append(right if here == left else left)
    problem = _gate_crosses_itself(diagram, edges, faces, directions) if simple else None
    return problem if problem is not None else (faces, directions)


def _gate_crosses_itself(diagram: Diagram, edges: Sequence[int], faces: list[int],
                         directions: list[int]) -> str | None:
    """Why the gate's arcs inside some face cannot be drawn apart, or None when they can."""
    face = arcs_tangled(diagram, gate_arcs(edges, faces, directions))
    if face is None:
        return None
    described = ", ".join(f"edge {a.edge} to edge {b.edge}" for a, b in gate_arcs(edges, faces, directions)[face])
    return f"the gate would cross itself in face {face}: its arcs there ({described}) cannot be drawn apart"


def arcs_tangled(diagram: Diagram, arcs: dict[int, list[tuple]]) -> int | None:
    """The first face whose arcs cannot be drawn apart, or None when every face's can.

    Each arc runs inside its face from one side of the face's boundary to another (the arcs of
    one gate, or of several gates together). The arcs in one face can be drawn disjointly exactly
    when the map they make with the face's boundary cycles (cut at the arcs' ends) has Euler
    characteristic 2 on each of its connected parts, each arc leaving the boundary into the face:
    counterclockwise at an end come the boundary ahead (the face on its left), the arc, the
    boundary behind. Separate parts can then be nested in any face of one another, as the face's
    region allows.

    An end is a :class:`Side`, or (Side, rank) where several ends lie on one edge: the ranks
    order them along the edge (so a face beside it meets them in one order, the face on its other
    side in the other).

    >>> from movies.diagram.constructors import unlink
    >>> arcs_tangled(unlink(2), {2: [(Side(1, "R"), Side(2, "R"))]}) is None
    True
    """
    for face, pairs in sorted(arcs.items()):
        if len(pairs) < 2:
            continue  # one arc always fits
        partner: list[int] = []  # dart -> the other end of its edge
        point: list = []  # dart -> the end it sits at
        arc_dart: dict = {}

        def edge(a, b) -> tuple[int, int]:
            first, second = len(partner), len(partner) + 1
            partner.extend((second, first))
            point.extend((a, b))
            return first, second

        for a, b in pairs:
            arc_dart[a], arc_dart[b] = edge(a, b)
        on_side: dict[Side, list] = {}
        for end in arc_dart:
            on_side.setdefault(end if isinstance(end, Side) else end[0], []).append(end)
        for side, ends in on_side.items():  # a face runs along an edge's left side one way, its right the other
            ends.sort(key=lambda end: 0 if isinstance(end, Side) else end[1] if side.hand == "L" else -end[1])
        ahead: dict = {}
        behind: dict = {}
        for cycle in diagram.faces[face]:
            marked = [end for side in cycle for end in on_side.get(side, ())]
            for j, end in enumerate(marked):
                following = marked[(j + 1) % len(marked)]
                ahead[end], behind[following] = edge(end, following)
        turn = [0] * len(partner)  # dart -> the next dart counterclockwise around its end
        for end, dart in arc_dart.items():
            turn[ahead[end]], turn[dart], turn[behind[end]] = dart, behind[end], ahead[end]
        root = {end: end for end in arc_dart}

        def find(end):
            while root[end] != end:
                end = root[end]
            return end

        for dart in range(0, len(partner), 2):
            a, b = find(point[dart]), find(point[dart + 1])
            if a != b:
                root[max(a, b, key=_rank)] = min(a, b, key=_rank)
        euler = {find(end): 0 for end in arc_dart}
        for end in arc_dart:
            euler[find(end)] += 1  # vertices
        for dart in range(0, len(partner), 2):
            euler[find(point[dart])] -= 1  # edges
        for orbit in orbits({dart: turn[partner[dart]] for dart in range(len(partner))}):
            euler[find(point[orbit[0]])] += 1  # faces
        if any(value != 2 for value in euler.values()):
            return face
    return None


def _rank(end) -> tuple:
    """A total order on ends (a Side, or a Side with a rank), for choosing union-find roots."""
    return (end, -1) if isinstance(end, Side) else (end[0], end[1])
