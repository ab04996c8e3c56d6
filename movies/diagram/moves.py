"""Reidemeister and Morse moves as checked operations on diagrams.

Every move takes a :class:`~movies.diagram.model.Diagram` and the names of what it acts on,
and returns the new diagram, or raises :class:`~movies.errors.MoveError` saying exactly why
the move does not apply there. Names follow one rule: everything the move does not touch
keeps its name; where an edge is cut, its first part (along the orientation) keeps the name;
new things get the smallest names above every name of their kind in the frame before the
move, in the order each move lists, unless the caller passes ``names``.

==========  =====================================================================
move        what it needs
==========  =====================================================================
R1 add      an edge, the side ("L"/"R") the kink goes to, the crossing sign
R1 remove   a crossing with a monogon face (a kink)
R2 add      an edge pushed over another edge across a face they share
R2 remove   a bigon face whose one edge is over at both of its crossings
R3          a triangle face with one edge over at both of its crossings
saddle      two edges on a common face (the band runs across that face)
birth       a face; a new crossingless circle appears there
death       a crossingless circle component
twist       the edges a path (the gate) crosses in order; full twists on those strands
==========  =====================================================================

>>> from movies.diagram.constructors import unknot
>>> d = r1_add(unknot(), 1, "L", +1)
>>> d.crossing_count(), d.writhe()
(1, 1)
>>> r1_remove(d, 1).crossing_count()
0
"""

from __future__ import annotations

import functools
from dataclasses import dataclass
from typing import Sequence

from movies.diagram.model import (
    Dart, Diagram, Hints, NameInUseError, Side, assemble, orbits, reencode, trace_cycles,
)
from movies.errors import DiagramError, InternalError, MoveError


@dataclass(frozen=True)
class NewNames:
    """Names the caller chooses for what a move creates, used in the move's documented order.

    >>> NewNames(edges=(20, 21)).edges
    (20, 21)
    """

    edges: tuple[int, ...] = ()
    crossings: tuple[int, ...] = ()
    faces: tuple[int, ...] = ()
    components: tuple[int, ...] = ()


class _Namer:
    def __init__(self, diagram: Diagram, names: NewNames | None) -> None:
        self.diagram = diagram
        self.names = names or NewNames()
        self.used = {"edge": set(diagram.edges()), "crossing": set(diagram.crossings)}
        self.chosen = {"edge": list(self.names.edges), "crossing": list(self.names.crossings)}
        self.floor = {kind: max(used, default=0) for kind, used in self.used.items()}

    def new(self, kind: str) -> int:
        if self.chosen[kind]:
            name = self.chosen[kind].pop(0)
            if name in self.used[kind]:
                raise MoveError(f"the chosen {kind} name {name} is already in use")
        else:
            name = max(max(self.used[kind], default=0), self.floor[kind]) + 1
        self.used[kind].add(name)
        return name

    def hints(self, **kwargs) -> Hints:
        return Hints(face_names=self.names.faces, component_names=self.names.components, **kwargs)


def _move(function):
    """Report an unknown name (a DiagramError from a lookup) as a MoveError of the move."""

    @functools.wraps(function)
    def checked(*args, **kwargs):
        try:
            return function(*args, **kwargs)
        except MoveError:
            raise
        except DiagramError as err:
            raise MoveError(str(err)) from None

    return checked


def _rebuild(previous: Diagram, crossings, signs, loops, hints: Hints) -> Diagram:
    try:
        return assemble(crossings, signs, loops, previous=previous, hints=hints)
    except NameInUseError as err:
        raise MoveError(str(err)) from None
    except DiagramError as err:  # pragma: no cover - a move that breaks planarity is a bug
        raise InternalError(f"the move produced an invalid diagram: {err}") from err


def _check_edge(diagram: Diagram, edge: int) -> None:
    if edge not in diagram.loops and edge not in diagram.edge_ends:
        raise MoveError(f"edge {edge} is not in the diagram (edges: {diagram.edges()})")


def _check_hand(hand: str) -> str:
    if hand not in ("L", "R"):
        raise MoveError(f'the side of an edge is "L" or "R", not {hand!r}')
    return hand


def _side_in_face(diagram: Diagram, edge: int, face: int) -> str:
    diagram.face(face)
    hands = [hand for hand in "LR" if diagram.side_face[Side(edge, hand)] == face]
    if not hands:
        left, right = diagram.faces_beside(edge)
        raise MoveError(f"edge {edge} does not border face {face} (it lies between faces {int(left)} and {int(right)})")
    return hands[0]


def _relabel_dart(crossings: dict, dart: Dart, label: int) -> None:
    labels = list(crossings[dart.crossing])
    labels[dart.position] = label
    crossings[dart.crossing] = tuple(labels)


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


# ---------------------------------------------------------------------- saddles


@dataclass(frozen=True)
class SaddleResult:
    """What a band did: the new diagram, whether it respects the orientation, and its effect.

    ``effect`` is ``"merge"`` (two components became one), ``"split"`` (one became two) or
    ``"twist"`` (a band that does not respect the orientation, on one component: still one).
    ``joined`` are the components (old names) the band touched; ``reversed_component`` is the
    one whose orientation a merging band that does not respect the orientation reversed.
    """

    diagram: Diagram
    face: int
    respects_orientation: bool
    effect: str
    components_before: tuple[int, ...]
    components_after: tuple[int, ...]
    joined: tuple[int, ...] = ()
    reversed_component: int | None = None


def common_faces(diagram: Diagram, first: int, second: int) -> list[int]:
    """The faces that both edges border.

    >>> from movies.diagram.constructors import unlink
    >>> common_faces(unlink(2), 1, 2)
    [2]
    """
    _check_edge(diagram, first)
    _check_edge(diagram, second)
    a = set(diagram.faces_beside(first))
    b = set(diagram.faces_beside(second))
    return sorted(int(f) for f in a & b)


@_move
def saddle(
    diagram: Diagram, first: int, second: int, face: int | None = None, names: NewNames | None = None
) -> SaddleResult:
    """A band move between edges ``first`` and ``second`` across a face they share.

    ``face`` is needed when they share more than one. The band respects the orientation when
    both edges are walked the same way around the face; then the edge ``first`` keeps its name
    from its start to the band and on along the old ``second`` (and vice versa), so no edge
    names change. A band from an edge to itself cuts off a crossingless circle (new edge name).
    A band that does not respect the orientation keeps the orientation of ``first``'s component
    and reverses what it must of the rest.

    >>> from movies.diagram.constructors import unlink
    >>> result = saddle(unlink(2), 1, 2)
    >>> result.effect, result.respects_orientation, result.diagram.component_count()
    ('merge', True, 1)
    """
    shared = common_faces(diagram, first, second)
    if face is None:
        if not shared:
            raise MoveError(
                f"edges {first} and {second} do not border a common face "
                f"(faces of {first}: {[int(f) for f in diagram.faces_beside(first)]}, "
                f"of {second}: {[int(f) for f in diagram.faces_beside(second)]})"
            )
        if len(shared) > 1:
            raise MoveError(f"edges {first} and {second} share faces {shared}; name the face the band runs across")
        face = shared[0]
    s1 = _side_in_face(diagram, first, face)
    s2 = _side_in_face(diagram, second, face)
    before = tuple(sorted(diagram.components))
    k1, k2 = diagram.component_of(first), diagram.component_of(second)
    namer = _Namer(diagram, names)
    crossings = dict(diagram.crossings)
    signs = dict(diagram.signs)
    loops = set(diagram.loops)
    alias: dict[Side, Side] = {}
    if first == second:
        respects = True
        circle = namer.new("edge")
        loops.add(circle)
        effect = "split"
    elif s1 == s2:
        respects = True
        _splice_oriented(diagram, first, second, crossings, loops)
        effect = "merge" if k1 != k2 else "split"
    else:
        respects = False
        ends = diagram.edge_ends
        if k1 != k2:
            # reverse the second component, then splice as an oriented band
            reversed_edges = set(diagram.components[k2])
            effect = "merge"
        else:
            # one component: the stretch strictly between the two edges runs backwards after
            reversed_edges = set(_between(diagram, first, second))
            effect = "twist"
        for edge in reversed_edges:
            for hand in "LR":
                alias[Side(edge, hand)] = Side(edge, hand).other()
        arriving = {head for edge, (tail, head) in ends.items() if edge not in reversed_edges}
        arriving |= {tail for edge, (tail, head) in ends.items() if edge in reversed_edges}
        if first in loops or second in loops:
            loops.discard(first if first in loops else second)
        else:
            # first: its tail .. band .. old tail of second (arriving there);
            # second: old head of second or of first (leaving there) .. band .. the other head
            _relabel_dart(crossings, ends[second][0], first)
            _relabel_dart(crossings, ends[first][1], second)
            if k1 == k2:
                arriving.discard(ends[first][1])
                arriving.add(ends[second][0])
        crossings, signs = reencode(crossings, arriving)
        signs = {**diagram.signs, **signs}
    # the band's strip joins the faces beyond the two edges (needed when a circle's name goes)
    beyond = {diagram.side_face[Side(first, s1).other()], diagram.side_face[Side(second, s2).other()]}
    place = {}
    if first == second:
        # the circle cut off runs along the edge: its other side faces what lay beyond the edge
        place[Side(circle, s1).other()] = diagram.side_face[Side(first, s1).other()]
    hints = namer.hints(cut=frozenset({face}), side_alias=alias, absorb={max(beyond): min(beyond)}, place=place,
                        joined=((k1, k2),) if effect == "merge" else ())
    new = _rebuild(diagram, crossings, signs, loops, hints)
    reversed_component = k2 if (not respects and k1 != k2) else None
    return SaddleResult(
        new, face, respects, effect, before, tuple(sorted(new.components)),
        tuple(sorted({k1, k2})), reversed_component,
    )


def _splice_oriented(diagram: Diagram, first: int, second: int, crossings: dict, loops: set) -> None:
    # first: tail..band..head of second;  second: tail..band..head of first
    ends = diagram.edge_ends
    if first in loops and second in loops:
        loops.discard(max(first, second))
        return
    if first in loops or second in loops:
        loops.discard(first if first in loops else second)
        return
    _relabel_dart(crossings, ends[second][1], first)
    _relabel_dart(crossings, ends[first][1], second)


def _between(diagram: Diagram, first: int, second: int) -> list[int]:
    """Edges strictly after ``first`` and strictly before ``second`` along their component."""
    stretch = []
    edge = diagram.next_edge(first)
    while edge != second:
        stretch.append(edge)
        edge = diagram.next_edge(edge)
    return stretch


@_move
def birth(diagram: Diagram, face: int, counterclockwise: bool = True, names: NewNames | None = None) -> Diagram:
    """A new crossingless circle in ``face``, bounding a small disk there.

    ``counterclockwise`` means the small disk is on the circle's left. New names: the edge
    (also the component's name is new), then the small disk's face.

    >>> from movies.diagram.constructors import unknot
    >>> d = birth(unknot(), 1)
    >>> d.component_count(), d.piece_count(), len(d.faces)
    (2, 2, 3)
    """
    diagram.face(face)
    namer = _Namer(diagram, names)
    circle = namer.new("edge")
    loops = set(diagram.loops) | {circle}
    outside = Side(circle, "R" if counterclockwise else "L")
    return _rebuild(diagram, diagram.crossings, diagram.signs, loops, namer.hints(place={outside: face}))


@_move
def death(diagram: Diagram, component: int) -> Diagram:
    """Cap off a component that is a crossingless circle; the faces on its two sides merge.

    >>> from movies.diagram.constructors import unknot
    >>> death(unknot(), 1).is_empty()
    True
    """
    if component not in diagram.components:
        raise MoveError(f"component {component} is not in the diagram (components: {sorted(diagram.components)})")
    edges = diagram.components[component]
    if len(edges) != 1 or edges[0] not in diagram.loops:
        raise MoveError(
            f"component {component} is not a crossingless circle (it passes through "
            f"{len({diagram.edge_ends[e][0].crossing for e in edges if e in diagram.edge_ends})} crossings); "
            "only a crossingless circle can die"
        )
    circle = edges[0]
    left, right = diagram.faces_beside(circle)
    loops = set(diagram.loops) - {circle}
    return _rebuild(diagram, diagram.crossings, diagram.signs, loops, Hints(absorb={int(left): int(right)}))


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
    try:
        edges = list(edges)
    except TypeError:
        raise MoveError(f"the edges of a twist are a list of edge names, not {edges!r}") from None
    if not edges:
        raise MoveError("a twist needs at least one edge for its gate to cross")
    if type(turns) is not int or turns == 0:
        raise MoveError(
            f"turns is a nonzero integer (+1 a right-handed full twist, -1 a left-handed one), not {turns!r}"
        )
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
    else:
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
        walk = walks[fits[0]]
    faces, directions = walk  # type: ignore[misc]
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


def _gate_walk(diagram: Diagram, edges: Sequence[int], start: int) -> tuple[list[int], list[int]] | str:
    """The faces and directions of the gate starting in face ``start``, or why there is none.

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
    problem = _gate_crosses_itself(diagram, edges, faces, directions)
    return problem if problem is not None else (faces, directions)


def _gate_crosses_itself(diagram: Diagram, edges: Sequence[int], faces: list[int],
                         directions: list[int]) -> str | None:
    """Why the gate's arcs inside some face cannot be drawn apart, or None when they can.

    Inside face f_i (0 < i < k) the gate is an arc from the side of ``edges[i-1]`` facing it to
    the side of ``edges[i]`` facing it; the two ends of the gate are short stubs that never get
    in the way. The arcs in one face can be drawn disjointly exactly when the map they make
    with the face's boundary cycles (cut at the arcs' ends) has Euler characteristic 2 on each
    of its connected parts, each arc leaving the boundary into the face: counterclockwise at
    an end come the boundary ahead (the face on its left), the arc, the boundary behind.
    Separate parts can then be nested in any face of one another, as the face's region allows.
    """
    arcs: dict[int, list[tuple[Side, Side]]] = {}
    for i in range(1, len(edges)):
        entry = Side(edges[i - 1], "R" if directions[i - 1] > 0 else "L")
        leave = Side(edges[i], "L" if directions[i] > 0 else "R")
        arcs.setdefault(faces[i], []).append((entry, leave))
    for face, pairs in sorted(arcs.items()):
        if len(pairs) < 2:
            continue  # one arc always fits
        partner: list[int] = []  # dart -> the other end of its edge
        point: list[Side] = []  # dart -> the end it sits at
        arc_dart: dict[Side, int] = {}

        def edge(a: Side, b: Side) -> tuple[int, int]:
            first, second = len(partner), len(partner) + 1
            partner.extend((second, first))
            point.extend((a, b))
            return first, second

        for a, b in pairs:
            arc_dart[a], arc_dart[b] = edge(a, b)
        ahead: dict[Side, int] = {}
        behind: dict[Side, int] = {}
        for cycle in diagram.faces[face]:
            marked = [side for side in cycle if side in arc_dart]
            for j, side in enumerate(marked):
                following = marked[(j + 1) % len(marked)]
                ahead[side], behind[following] = edge(side, following)
        turn = [0] * len(partner)  # dart -> the next dart counterclockwise around its end
        for side, dart in arc_dart.items():
            turn[ahead[side]], turn[dart], turn[behind[side]] = dart, behind[side], ahead[side]
        root = {side: side for side in arc_dart}

        def find(side: Side) -> Side:
            while root[side] != side:
                side = root[side]
            return side

        for dart in range(0, len(partner), 2):
            a, b = find(point[dart]), find(point[dart + 1])
            if a != b:
                root[max(a, b)] = min(a, b)
        euler = {find(side): 0 for side in arc_dart}
        for side in arc_dart:
            euler[find(side)] += 1  # vertices
        for dart in range(0, len(partner), 2):
            euler[find(point[dart])] -= 1  # edges
        for orbit in orbits({dart: turn[partner[dart]] for dart in range(len(partner))}):
            euler[find(point[orbit[0]])] += 1  # faces
        if any(value != 2 for value in euler.values()):
            described = ", ".join(f"edge {a.edge} to edge {b.edge}" for a, b in pairs)
            return (f"the gate would cross itself in face {face}: its arcs there ({described}) "
                    "cannot be drawn apart")
    return None
