"""The Morse moves: saddles (bands), births and deaths.

>>> from movies.diagram.constructors import unlink
>>> saddle(unlink(2), 1, 2).effect
'merge'
"""

from __future__ import annotations

from dataclasses import dataclass

from movies.diagram.assembly import Hints, reencode

from movies.diagram.model import Diagram, Side
from movies.errors import MoveError
from movies.diagram.moves.base import (
    NewNames, _Namer, _move, _rebuild, _check_edge, _side_in_face, _relabel_dart,
)


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
    #: the edges (old names) that run the other way afterwards: a band that does not respect the
    #: orientation reverses a component, or the stretch of one between its two ends
    reversed_edges: tuple[int, ...] = ()


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
    reversed_edges: set[int] = set()
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
        tuple(sorted({k1, k2})), reversed_component, tuple(sorted(reversed_edges)),
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
