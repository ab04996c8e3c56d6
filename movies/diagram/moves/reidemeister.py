"""The Reidemeister moves R1, R2 and R3, both ways where they have two.

>>> from movies.diagram.constructors import unknot
>>> r1_remove(r1_add(unknot(), 1, "L", +1), 1).crossing_count()
0
"""

from __future__ import annotations

from typing import Sequence

from movies.diagram.assembly import Hints, reencode, trace_cycles

from movies.diagram.model import Dart, Diagram, Side
from movies.errors import MoveError
from movies.diagram.moves.base import (
    NewNames, _Namer, _move, _rebuild, _check_edge, _check_hand, _side_in_face, _relabel_dart,
)


# ---------------------------------------------------------------------- R1


@_move
def r1_add(diagram: Diagram, edge: int, hand: str, sign: int, names: NewNames | None = None) -> Diagram:
    """Add a kink on ``edge`` into the face on side ``hand`` ("L" or "R"), with crossing ``sign``.

    New names, in order: the crossing; the edges: the kink's loop, then the part of ``edge``
    after the kink (a crossingless circle needs only the loop); the monogon face.

    >>> from movies.diagram.pd import from_pd
    >>> d = r1_add(from_pd([[4, 1, 3, 2], [2, 3, 1, 4]]), 1, "R", -1)
    >>> d.crossing_count(), d.writhe(), d.components[1]
    (3, -3, (1, 5, 6, 2))
    """
    _check_edge(diagram, edge)
    _check_hand(hand)
    if type(sign) is not int or sign not in (1, -1):
        raise MoveError(f"the sign of a kink is +1 or -1, not {sign!r}")
    namer = _Namer(diagram, names)
    crossing = namer.new("crossing")
    kink = namer.new("edge")
    crossings = dict(diagram.crossings)
    loops = set(diagram.loops)
    if edge in loops:
        loops.discard(edge)
        after = edge
    else:
        after = namer.new("edge")
        _relabel_dart(crossings, diagram.edge_ends[edge][1], after)
    # the strand arrives along `edge`, runs around the loop `kink` and leaves along `after`;
    # counterclockwise positions worked out from a picture of each of the four kinks
    crossings[crossing] = {
        ("L", 1): (edge, after, kink, kink),
        ("L", -1): (kink, edge, after, kink),
        ("R", 1): (kink, kink, after, edge),
        ("R", -1): (edge, kink, kink, after),
    }[(hand, sign)]
    signs = dict(diagram.signs)
    signs[crossing] = sign
    return _rebuild(diagram, crossings, signs, loops, namer.hints())


def kinks_at(diagram: Diagram, crossing: int) -> list[int]:
    """The edges that run from ``crossing`` straight back to it (each bounds a monogon).

    >>> from movies.diagram.pd import from_pd
    >>> kinks_at(from_pd([[1, 1, 2, 2]]), 1)
    [1, 2]
    """
    labels = diagram.crossing(crossing)
    return sorted({label for label in labels if labels.count(label) == 2})


@_move
def r1_remove(diagram: Diagram, crossing: int, kink: int | None = None) -> Diagram:
    """Remove the kink at ``crossing``; ``kink`` names its loop edge when there are two.

    The edge arriving at the kink keeps its name and runs on to where the edge leaving the kink
    ended; the loop and the leaving edge disappear. Split pieces lying inside the loop end up in
    the face around it (they are split, so moving them there is an isotopy too).  If the whole component was that kink, it
    becomes a crossingless circle named by its smallest remaining edge.

    >>> from movies.diagram.constructors import unknot
    >>> r1_remove(r1_add(unknot(), 1, "R", +1), 1) == unknot()
    True
    """
    loops_here = kinks_at(diagram, crossing)
    if not loops_here:
        raise MoveError(
            f"crossing {crossing} is not a kink: no edge runs from it straight back to it "
            f"(its edges are {list(diagram.crossings[crossing])})"
        )
    if kink is None:
        if len(loops_here) > 1:
            # a figure-eight curve: either loop is a kink; removing the larger keeps the smaller name
            kink = max(loops_here)
        else:
            kink = loops_here[0]
    elif kink not in loops_here:
        raise MoveError(f"edge {kink} is not a kink loop at crossing {crossing} (loops there: {loops_here})")
    monogon = diagram.side_face[Side(kink, "L")]
    outside = diagram.side_face[Side(kink, "R")]
    if len(diagram.faces[monogon][0]) != 1 or diagram.faces[monogon][0][0].edge != kink:
        monogon, outside = outside, monogon
    # the strand: arriving edge -> crossing -> kink -> crossing -> leaving edge
    arriving, leaving = _through_strand(diagram, kink)
    crossings, loops = _delete_crossings(diagram, [crossing], internal=[kink])
    absorb = _same_side_unions(diagram, [(arriving, leaving)])
    absorb[monogon] = outside
    signs = {name: s for name, s in diagram.signs.items() if name in crossings}
    return _rebuild(diagram, crossings, signs, loops, Hints(absorb=absorb))


def _delete_crossings(diagram: Diagram, doomed: Sequence[int], internal: Sequence[int]):
    """Remove crossings, letting each strand run straight through where they were.

    A strand that starts at a remaining crossing keeps the name of its first edge; one that
    closes up becomes a crossingless circle named by its smallest edge outside ``internal``
    (the edges the move itself removes). Returns the new crossings and loops.
    """
    doomed = set(doomed)
    ends = diagram.edge_ends
    crossings = {name: labels for name, labels in diagram.crossings.items() if name not in doomed}
    loops = set(diagram.loops)
    seen: set[int] = set()

    def chain_from(edge: int) -> list[int]:
        chain = [edge]
        while ends[chain[-1]][1].crossing in doomed:
            nxt = diagram.next_edge(chain[-1])
            if nxt == chain[0]:
                break
            chain.append(nxt)
        return chain

    for edge in sorted(e for e, (tail, _) in ends.items() if tail.crossing not in doomed):
        chain = chain_from(edge)
        seen.update(chain)
        if len(chain) > 1:
            _relabel_dart(crossings, ends[chain[-1]][1], edge)
    for edge in sorted(ends):
        if edge not in seen:
            chain = chain_from(edge)
            seen.update(chain)
            loops.add(min((e for e in chain if e not in internal), default=min(chain)))
    return crossings, loops


def _sector_face(diagram: Diagram, crossing: int, position: int) -> int:
    """The face in the corner of ``crossing`` between positions ``position - 1`` and ``position``."""
    edge = diagram.dart_edge[Dart(crossing, position)]
    arriving = diagram.edge_ends[edge][1] == Dart(crossing, position)
    return diagram.side_face[Side(edge, "L" if arriving else "R")]


def _through_strand(diagram: Diagram, edge: int) -> tuple[int, int]:
    """(edge arriving at the tail crossing of ``edge``, edge leaving its head crossing), same strand."""
    tail, head = diagram.edge_ends[edge]
    before = diagram.dart_edge[Dart(tail.crossing, (tail.position + 2) % 4)]
    after = diagram.dart_edge[Dart(head.crossing, (head.position + 2) % 4)]
    return before, after


def _same_side_unions(diagram: Diagram, pairs) -> dict[int, int]:
    unions: dict[int, int] = {}
    for first, last in pairs:
        for hand in "LR":
            a = diagram.side_face[Side(last, hand)]
            b = diagram.side_face[Side(first, hand)]
            if a != b:
                unions[a] = b
    return unions


# ---------------------------------------------------------------------- R2


@_move
def r2_add(
    diagram: Diagram, over: int, under: int, face: int, names: NewNames | None = None
) -> Diagram:
    """Push edge ``over`` across ``face`` and over edge ``under``, making a bigon.

    New names, in order: the crossings (first the one the pushed edge meets first); the edges:
    the pushed edge's stretch between the crossings, its part after them, the under edge's
    stretch between the crossings, its part after them (a crossingless circle needs no "after"
    part); the faces: the bigon, then the part of ``face`` that does not keep its name
    (the part whose boundary has the smallest side of the old face keeps it).

    >>> from movies.diagram.constructors import unlink
    >>> two = unlink(2)
    >>> d = r2_add(two, 1, 2, two.faces_beside(1)[1])
    >>> d.crossing_count(), d.writhe(), d.piece_count(), d.linking_matrix()
    (2, 0, 1, [[0, 0], [0, 0]])
    """
    _check_edge(diagram, over)
    _check_edge(diagram, under)
    if over == under:
        raise MoveError(
            f"R2 needs two different edges; to fold edge {over} over itself, first add a kink on it"
        )
    s1 = _side_in_face(diagram, over, face)
    s2 = _side_in_face(diagram, under, face)
    namer = _Namer(diagram, names)
    first, second = namer.new("crossing"), namer.new("crossing")
    crossings = dict(diagram.crossings)
    loops = set(diagram.loops)
    tip = namer.new("edge")
    if over in loops:
        loops.discard(over)
        over_after = over
    else:
        over_after = namer.new("edge")
        _relabel_dart(crossings, diagram.edge_ends[over][1], over_after)
    mid = namer.new("edge")
    if under in loops:
        loops.discard(under)
        under_after = under
    else:
        under_after = namer.new("edge")
        _relabel_dart(crossings, diagram.edge_ends[under][1], under_after)
    # Picture: `under` horizontal with `face` above it, the finger of `over` coming down into it
    # at x = -1 and x = +1.  Compass darts at a crossing, counterclockwise: E, N, W, S.
    down_at, up_at = ("plus", "minus") if s1 == "L" else ("minus", "plus")
    compass: dict[str, dict[str, tuple[int, bool]]] = {"minus": {}, "plus": {}}  # label, arriving
    compass[down_at].update(N=(over, True), S=(tip, False))
    compass[up_at].update(S=(tip, True), N=(over_after, False))
    if s2 == "L":  # `under` runs east
        compass["minus"].update(W=(under, True), E=(mid, False))
        compass["plus"].update(W=(mid, True), E=(under_after, False))
    else:  # runs west
        compass["plus"].update(E=(under, True), W=(mid, False))
        compass["minus"].update(E=(mid, True), W=(under_after, False))
    names_at = {down_at: first, up_at: second}
    raw: dict[int, tuple[int, int, int, int]] = {}
    arriving: set[Dart] = set()
    for where, darts in compass.items():
        name = names_at[where]
        # under-strand (E, W) at positions 0 and 2
        order = ["E", "N", "W", "S"]
        raw[name] = tuple(darts[c][0] for c in order)  # type: ignore[assignment]
        arriving |= {Dart(name, i) for i, c in enumerate(order) if darts[c][1]}
    tuples, new_signs = reencode(raw, arriving)
    crossings.update(tuples)
    signs = dict(diagram.signs)
    signs.update(new_signs)
    bigon_first = (Side(tip, "L"), Side(tip, "R"))
    return _rebuild(diagram, crossings, signs, loops, namer.hints(cut=frozenset({face}), first_new=bigon_first))


@_move
def r2_remove(diagram: Diagram, face: int) -> Diagram:
    """Remove the bigon ``face``: its two crossings go, its strands are pulled apart.

    Each strand's edge arriving at the bigon keeps its name and runs on past it. The faces at
    the two ends of the bigon become one (it keeps the smaller name), and so does the bigon.

    >>> from movies.diagram.constructors import unlink
    >>> two = unlink(2)
    >>> d = r2_add(two, 1, 2, two.faces_beside(1)[1])
    >>> bigon = [f for f, cycles in d.faces.items() if len(cycles[0]) == 2 and len(cycles) == 1][0]
    >>> r2_remove(d, bigon).crossing_count()
    0
    """
    cycles = diagram.face(face)
    if len(cycles) != 1 or len(cycles[0]) != 2:
        own = max(cycles, key=len) if cycles else ()
        raise MoveError(f"face {face} is not a bigon: its boundary has {len(own)} edge{'s' if len(own) != 1 else ''}" if len(cycles) == 1
                        else f"face {face} is not a bigon: it touches {len(cycles)} split pieces")
    corners = diagram.face_crossings(face)
    if len(set(corners)) != 2:
        raise MoveError(f"face {face} has only one corner crossing ({corners[0]}); that is a kink, use R1")
    (first, second) = cycles[0]
    over_edge = _over_at_both(diagram, [first.edge, second.edge], corners)
    if over_edge is None:
        raise MoveError(
            f"bigon {face} is not an R2 bigon: neither edge {first.edge} nor edge {second.edge} "
            f"is over at both crossings {sorted(set(corners))}"
        )
    strands = [_through_strand(diagram, side.edge) for side in cycles[0]]
    crossings, loops = _delete_crossings(diagram, sorted(set(corners)), internal=[first.edge, second.edge])
    absorb = _same_side_unions(diagram, strands)
    # the bigon joins the face at its ends: the corner opposite the bigon's corner
    corner = corners[0]
    bigon_positions = [p for p in range(4) if _sector_face(diagram, corner, p) == face]
    absorb[face] = _sector_face(diagram, corner, (bigon_positions[0] + 2) % 4)
    signs = {name: s for name, s in diagram.signs.items() if name in crossings}
    return _rebuild(diagram, crossings, signs, loops, Hints(absorb=absorb))


def _over_at_both(diagram: Diagram, edges: Sequence[int], corners: Sequence[int]) -> int | None:
    for edge in edges:
        tail, head = diagram.edge_ends[edge]
        if tail.position % 2 == 1 and head.position % 2 == 1:
            return edge
    return None


# ---------------------------------------------------------------------- R3


@_move
def r3(diagram: Diagram, face: int, names: NewNames | None = None) -> Diagram:
    """Slide a strand across the crossing of the other two, through the triangle ``face``.

    The three crossings keep their names, signs and over/under; each strand meets its two
    crossings in the opposite order afterwards. The triangle's three edges are replaced by new
    edges (new names in increasing order of the names they replace); the new triangle keeps the
    face's name.

    >>> from movies.diagram.constructors import from_braid
    >>> d = from_braid([1, 2, 1])
    >>> triangle = [f for f, c in d.faces.items() if len(c[0]) == 3 and len(set(d.face_crossings(f))) == 3][0]
    >>> e = r3(d, triangle)
    >>> e.writhe(), e.crossing_count()
    (3, 3)
    """
    cycles = diagram.face(face)
    own = [cycle for cycle in cycles if len(cycle) == 3]
    if len(cycles) != 1 or len(cycles[0]) != 3:
        raise MoveError(
            f"face {face} is not a triangle: "
            + (f"it touches {len(cycles)} split pieces" if len(cycles) > 1 else f"its boundary has {len(cycles[0])} edge{'s' if len(cycles[0]) != 1 else ''}")
        )
    del own
    edges = [side.edge for side in cycles[0]]
    if len(set(edges)) != 3 or any(e in diagram.loops for e in edges):
        raise MoveError(f"face {face} is not bounded by three different edges")
    corners = diagram.face_crossings(face)
    if len(set(corners)) != 3:
        raise MoveError(f"face {face} does not have three different corner crossings (it has {sorted(set(corners))})")
    if not any(_over_at_both(diagram, [e], corners) == e for e in edges):
        heights = ", ".join(
            f"edge {e} is {'over' if diagram.edge_ends[e][0].position % 2 else 'under'} at crossing "
            f"{diagram.edge_ends[e][0].crossing} and {'over' if diagram.edge_ends[e][1].position % 2 else 'under'} "
            f"at crossing {diagram.edge_ends[e][1].crossing}"
            for e in edges
        )
        raise MoveError(
            f"triangle {face} cannot be moved across: no strand is over at both of its corners ({heights})"
        )
    namer = _Namer(diagram, names)
    replacement = {edge: namer.new("edge") for edge in sorted(edges)}
    ends = diagram.edge_ends
    # strand through each triangle edge t: in_t -> u -> t -> v -> out_t becomes in_t -> v -> t' -> u -> out_t
    role: dict[int, dict[str, int]] = {name: {} for name in set(corners)}  # crossing -> role -> label
    for edge in edges:
        tail, head = ends[edge]
        u, v = tail.crossing, head.crossing
        before = diagram.dart_edge[Dart(u, (tail.position + 2) % 4)]
        after = diagram.dart_edge[Dart(v, (head.position + 2) % 4)]
        strand_at_u = "under" if tail.position % 2 == 0 else "over"
        strand_at_v = "under" if head.position % 2 == 0 else "over"
        role[v][strand_at_v + "_in"] = before
        role[v][strand_at_v + "_out"] = replacement[edge]
        role[u][strand_at_u + "_in"] = replacement[edge]
        role[u][strand_at_u + "_out"] = after
    crossings = dict(diagram.crossings)
    for name, r in role.items():
        if diagram.signs[name] > 0:
            crossings[name] = (r["under_in"], r["over_out"], r["under_out"], r["over_in"])
        else:
            crossings[name] = (r["under_in"], r["over_in"], r["under_out"], r["over_out"])
    new_edges = set(replacement.values())
    triangle = [c for c in trace_cycles(crossings, diagram.signs, diagram.loops) if all(s.edge in new_edges for s in c)]
    hints = namer.hints(place={triangle[0][0]: face}) if triangle else namer.hints()
    return _rebuild(diagram, crossings, dict(diagram.signs), diagram.loops, hints)
