"""The oriented link diagram on the 2-sphere, with stable names.

A :class:`Diagram` is plain, immutable data:

``crossings``
    crossing name -> its four edge labels ``(a, b, c, d)`` read counterclockwise from the
    incoming under-strand (the PD convention: ``a -> c`` is the under-strand).
``signs``
    crossing name -> ``+1`` when the over-strand runs ``d -> b``, ``-1`` when it runs ``b -> d``.
``loops``
    the edges that are crossingless circles.
``components``
    component name -> its edges in order along the orientation (starting at its smallest edge).
``faces``
    face name -> the boundary cycles of that region of the sphere.  A region of a split diagram
    is bounded by one cycle from each split piece that touches it; a cycle is a tuple of
    :class:`Side` values, walked with the region on the left, starting at its smallest side.

Edges, crossings, components and faces are named by integers.  A name stays as long as the
thing exists; the moves (:mod:`movies.diagram.moves`) document which names they keep and how
they make new ones.  New names are always the smallest integers larger than every name of
that kind in the frame before the move, handed out in the order each move documents, unless
the caller chooses them.

>>> from movies.diagram.pd import from_pd
>>> trefoil = from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]])
>>> trefoil.writhe(), len(trefoil.faces), trefoil.seifert_circle_count()
(3, 5, 2)
>>> trefoil.faces_beside(1)
(1, 2)
"""

from __future__ import annotations

from dataclasses import dataclass, field
from functools import cached_property
from typing import Iterable, Mapping, NamedTuple

from movies.errors import DiagramError, NameInUseError

#: position of a crossing's incoming under-strand, the other positions follow counterclockwise
UNDER_IN, UNDER_OUT = 0, 2


class Side(NamedTuple):
    """One side of an edge: ``hand`` is ``"L"`` (left of its orientation) or ``"R"``.

    >>> Side(4, "L")
    4L
    """

    edge: int
    hand: str

    def __repr__(self) -> str:
        return f"{self.edge}{self.hand}"

    def other(self) -> "Side":
        """The other side of the same edge.

        >>> Side(4, "L").other()
        4R
        """
        return Side(self.edge, "R" if self.hand == "L" else "L")


class Dart(NamedTuple):
    """An end of an edge at a crossing: the crossing's name and the position 0..3 there."""

    crossing: int
    position: int


def orbits(successor: Mapping) -> list[list]:
    """The cycles of a permutation given as a mapping, each from its smallest element.

    >>> orbits({1: 3, 3: 1, 2: 2})
    [[1, 3], [2]]
    """
    seen: set = set()
    result = []
    for start in sorted(successor):
        if start in seen:
            continue
        cycle = []
        item = start
        while item not in seen:
            seen.add(item)
            cycle.append(item)
            item = successor[item]
        result.append(cycle)
    return result


def head_positions(sign: int) -> tuple[int, int]:
    """The two positions of a crossing where an edge arrives, for a crossing of this sign.

    >>> head_positions(+1), head_positions(-1)
    ((0, 3), (0, 1))
    """
    return (UNDER_IN, 3) if sign > 0 else (UNDER_IN, 1)


@dataclass(frozen=True, eq=False)
class Diagram:
    """An oriented link diagram on the 2-sphere; see the module docstring for the fields.

    Build diagrams with the constructors (:func:`movies.diagram.pd.from_pd` and
    :mod:`movies.diagram.constructors`) or by moves; the fields are checked on the way in.
    Two diagrams compare equal with ``==`` only when every field, names included, is equal;
    use :mod:`movies.diagram.isotopy` to compare up to isotopy of the sphere.

    >>> from movies.diagram.pd import from_pd
    >>> hopf = from_pd([[4, 1, 3, 2], [2, 3, 1, 4]])
    >>> hopf.component_count(), hopf.signs
    (2, {1: -1, 2: -1})
    """

    crossings: Mapping[int, tuple[int, int, int, int]]
    signs: Mapping[int, int]
    loops: frozenset[int] = frozenset()
    components: Mapping[int, tuple[int, ...]] = field(default_factory=dict)
    faces: Mapping[int, tuple[tuple[Side, ...], ...]] = field(default_factory=dict)

    # ------------------------------------------------------------------ basic structure

    @cached_property
    def edge_ends(self) -> dict[int, tuple[Dart, Dart]]:
        """edge -> (tail dart, head dart) for every edge that is not a loop.

        >>> from movies.diagram.pd import from_pd
        >>> from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]]).edge_ends[1]
        (Dart(crossing=2, position=1), Dart(crossing=1, position=0))
        """
        tails: dict[int, Dart] = {}
        heads: dict[int, Dart] = {}
        for name, labels in self.crossings.items():
            incoming = head_positions(self.signs[name])
            for position, label in enumerate(labels):
                target = heads if position in incoming else tails
                if label in target:
                    raise DiagramError(f"edge {label} {'ends' if target is heads else 'starts'} twice")
                target[label] = Dart(name, position)
        if set(tails) != set(heads):
            raise DiagramError(f"edges {sorted(set(tails) ^ set(heads))} do not both start and end")
        return {edge: (tails[edge], heads[edge]) for edge in tails}

    @cached_property
    def dart_edge(self) -> dict[Dart, int]:
        """dart -> the edge attached there."""
        return {
            Dart(name, position): label
            for name, labels in self.crossings.items()
            for position, label in enumerate(labels)
        }

    def edges(self) -> list[int]:
        """All edge names, loops included, sorted.

        >>> from movies.diagram.pd import from_pd
        >>> from_pd([[4, 1, 3, 2], [2, 3, 1, 4]]).edges()
        [1, 2, 3, 4]
        """
        return sorted(set(self.edge_ends) | set(self.loops))

    def next_edge(self, edge: int) -> int:
        """The edge that follows ``edge`` along its component.

        >>> from movies.diagram.pd import from_pd
        >>> from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]]).next_edge(6)
        1
        """
        if edge in self.loops:
            return edge
        _, head = self._ends(edge)
        return self.dart_edge[Dart(head.crossing, (head.position + 2) % 4)]

    def _ends(self, edge: int) -> tuple[Dart, Dart]:
        try:
            return self.edge_ends[edge]
        except KeyError:
            raise DiagramError(f"edge {edge} is not in the diagram (edges: {self.edges()})") from None

    def crossing(self, name: int) -> tuple[int, int, int, int]:
        """The PD labels of a crossing, with a clear error for an unknown name."""
        try:
            return self.crossings[name]
        except KeyError:
            raise DiagramError(
                f"crossing {name} is not in the diagram (crossings: {sorted(self.crossings)})"
            ) from None

    def over_edges(self, name: int) -> tuple[int, int]:
        """(incoming, outgoing) edges of the over-strand at a crossing.

        >>> from movies.diagram.pd import from_pd
        >>> from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]]).over_edges(1)
        (4, 5)
        """
        a, b, c, d = self.crossing(name)
        return (d, b) if self.signs[name] > 0 else (b, d)

    def under_edges(self, name: int) -> tuple[int, int]:
        """(incoming, outgoing) edges of the under-strand at a crossing."""
        a, b, c, d = self.crossing(name)
        return (a, c)

    # ------------------------------------------------------------------ faces

    @cached_property
    def side_face(self) -> dict[Side, int]:
        """side -> the face it lies in."""
        return {side: name for name, cycles in self.faces.items() for cycle in cycles for side in cycle}

    def faces_beside(self, edge: int) -> tuple[int, int]:
        """The faces (left, right) of an edge, seen along its orientation.

        >>> from movies.diagram.pd import from_pd
        >>> from_pd([[4, 1, 3, 2], [2, 3, 1, 4]]).faces_beside(3)
        (4, 2)
        """
        if edge not in self.loops and edge not in self.edge_ends:
            raise DiagramError(f"edge {edge} is not in the diagram (edges: {self.edges()})")
        return (self.side_face[Side(edge, "L")], self.side_face[Side(edge, "R")])

    def face(self, name: int) -> tuple[tuple[Side, ...], ...]:
        """The boundary cycles of a face, with a clear error for an unknown name."""
        try:
            return self.faces[name]
        except KeyError:
            raise DiagramError(f"face {name} is not in the diagram (faces: {sorted(self.faces)})") from None

    def face_crossings(self, name: int) -> list[int]:
        """The crossings at the corners of a face, in walking order (repeats possible).

        >>> from movies.diagram.pd import from_pd
        >>> sorted(from_pd([[4, 1, 3, 2], [2, 3, 1, 4]]).face_crossings(1))
        [1, 2]
        """
        corners = []
        for cycle in self.face(name):
            for side in cycle:
                if side.edge in self.loops:
                    continue
                tail, head = self.edge_ends[side.edge]
                corners.append((head if side.hand == "L" else tail).crossing)
        return corners

    def region_of_piece(self, piece: int) -> list[int]:
        """The faces in which split piece ``piece`` (an index into :meth:`pieces`) meets others.

        Those are the faces that hold a cycle of this piece and a cycle of another piece.

        >>> from movies.diagram.pd import from_pd
        >>> two = from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]], loops=1)
        >>> two.region_of_piece(1), two.faces[2]
        ([2], ((1R, 3R, 5R), (7R,)))
        """
        edges = set(self.pieces()[piece])
        return sorted(
            name
            for name, cycles in self.faces.items()
            if len(cycles) > 1 and any(cycle[0].edge in edges for cycle in cycles)
        )

    # ------------------------------------------------------------------ pieces and components

    @cached_property
    def _pieces(self) -> tuple[frozenset[int], ...]:
        uf = _UnionFind()
        for edge in self.edges():
            uf.find(edge)
        for labels in self.crossings.values():
            for label in labels[1:]:
                uf.union(label, labels[0])
        groups: dict[int, set[int]] = {}
        for edge in self.edges():
            groups.setdefault(uf.find(edge), set()).add(edge)
        return tuple(sorted((frozenset(g) for g in groups.values()), key=min))

    def pieces(self) -> tuple[frozenset[int], ...]:
        """The split pieces (connected pieces of the drawn curves) as sets of edges.

        >>> from movies.diagram.constructors import unlink
        >>> unlink(2).pieces()
        (frozenset({1}), frozenset({2}))
        """
        return self._pieces

    def piece_count(self) -> int:
        """Number of split pieces of the drawing (a crossingless circle is a piece)."""
        return len(self._pieces)

    def component_count(self) -> int:
        """Number of link components."""
        return len(self.components)

    @cached_property
    def edge_component(self) -> dict[int, int]:
        """edge -> name of its component."""
        return {edge: name for name, edges in self.components.items() for edge in edges}

    def component_of(self, edge: int) -> int:
        """The component an edge belongs to."""
        try:
            return self.edge_component[edge]
        except KeyError:
            raise DiagramError(f"edge {edge} is not in the diagram (edges: {self.edges()})") from None

    def loop_count(self) -> int:
        """Number of crossingless circles."""
        return len(self.loops)

    # ------------------------------------------------------------------ numbers

    def crossing_count(self) -> int:
        """Number of crossings."""
        return len(self.crossings)

    def writhe(self) -> int:
        """Sum of the crossing signs."""
        return sum(self.signs.values())

    def pd_code(self) -> list[tuple[int, int, int, int]]:
        """The PD code, crossings in name order (crossingless circles are not in it).

        >>> from movies.diagram.pd import from_pd
        >>> from_pd([[4, 1, 3, 2], [2, 3, 1, 4]]).pd_code()
        [(4, 1, 3, 2), (2, 3, 1, 4)]
        """
        return [self.crossings[name] for name in sorted(self.crossings)]

    def linking_matrix(self) -> list[list[int]]:
        """Linking numbers between components, in component-name order; writhe-free diagonal 0.

        >>> from movies.diagram.pd import from_pd
        >>> from_pd([[4, 1, 3, 2], [2, 3, 1, 4]]).linking_matrix()
        [[0, -1], [-1, 0]]
        """
        order = sorted(self.components)
        index = {name: i for i, name in enumerate(order)}
        twice = [[0] * len(order) for _ in order]
        for name, (a, b, c, d) in self.crossings.items():
            i, j = index[self.edge_component[a]], index[self.edge_component[b]]
            if i != j:
                twice[i][j] += self.signs[name]
                twice[j][i] += self.signs[name]
        return [[value // 2 for value in row] for row in twice]

    def linking_number(self, first: int, second: int) -> int:
        """Linking number of two named components (half the signed count of their crossings)."""
        for name in (first, second):
            if name not in self.components:
                raise DiagramError(f"component {name} is not in the diagram (components: {sorted(self.components)})")
        total = 0
        for name, (a, b, c, d) in self.crossings.items():
            pair = {self.edge_component[a], self.edge_component[b]}
            if pair == {first, second} and first != second:
                total += self.signs[name]
        return total // 2

    def seifert_circles(self) -> list[tuple[int, ...]]:
        """The Seifert circles of the oriented smoothing, as cycles of edges.

        At each crossing the oriented smoothing joins each incoming edge to the outgoing edge
        of the other strand.

        >>> from movies.diagram.pd import from_pd
        >>> from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]]).seifert_circles()
        [(1, 5, 3), (2, 6, 4)]
        """
        successor: dict[int, int] = {}
        for name, (a, b, c, d) in self.crossings.items():
            over_in, over_out = self.over_edges(name)
            successor[a] = over_out
            successor[over_in] = c
        circles = [(edge,) for edge in sorted(self.loops)]
        circles += [tuple(cycle) for cycle in orbits(successor)]
        return sorted(circles)

    def seifert_circle_count(self) -> int:
        """Number of Seifert circles."""
        return len(self.seifert_circles())

    def is_crossingless(self) -> bool:
        """True when the diagram has no crossings (possibly no components either)."""
        return not self.crossings

    def is_empty(self) -> bool:
        """True for the empty diagram (no components)."""
        return not self.crossings and not self.loops

    # ------------------------------------------------------------------ names

    def next_names(self, kind: str, count: int) -> list[int]:
        """The ``count`` names a move would hand out next for ``kind`` (edge/crossing/face/component).

        >>> from movies.diagram.pd import from_pd
        >>> from_pd([[4, 1, 3, 2], [2, 3, 1, 4]]).next_names("edge", 2)
        [5, 6]
        """
        used = {
            "edge": self.edges(),
            "crossing": list(self.crossings),
            "face": list(self.faces),
            "component": list(self.components),
        }[kind]
        start = max(used, default=0) + 1
        return list(range(start, start + count))

    def __eq__(self, other: object) -> bool:
        if not isinstance(other, Diagram):
            return NotImplemented
        return (
            dict(self.crossings) == dict(other.crossings)
            and dict(self.signs) == dict(other.signs)
            and self.loops == other.loops
            and dict(self.components) == dict(other.components)
            and dict(self.faces) == dict(other.faces)
        )

    def __hash__(self) -> int:
        return hash((tuple(sorted(self.crossings.items())), self.loops))

    def __repr__(self) -> str:
        return (
            f"<Diagram: {self.crossing_count()} crossings, {self.component_count()} components, "
            f"{self.piece_count()} pieces, writhe {self.writhe()}>"
        )

    def summary(self) -> str:
        """A readable listing of every name: crossings, components, faces.

        >>> from movies.diagram.pd import from_pd
        >>> print(from_pd([[4, 1, 3, 2], [2, 3, 1, 4]]).summary())
        crossings (PD a b c d, sign):
          1: 4 1 3 2  -
          2: 2 3 1 4  -
        components (edges along the orientation):
          1: 1 2
          2: 3 4
        faces (sides walked with the face on the left; L/R = left/right of the edge):
          1: 1L 4R
          2: 1R 3R
          3: 2L 4L
          4: 2R 3L
        """
        lines = ["crossings (PD a b c d, sign):"]
        for name in sorted(self.crossings):
            labels = " ".join(str(x) for x in self.crossings[name])
            lines.append(f"  {name}: {labels}  {'+' if self.signs[name] > 0 else '-'}")
        if not self.crossings:
            lines.append("  (none)")
        lines.append("components (edges along the orientation):")
        for name in sorted(self.components):
            kind = "  (crossingless circle)" if self.components[name][0] in self.loops else ""
            lines.append(f"  {name}: {' '.join(str(e) for e in self.components[name])}{kind}")
        if not self.components:
            lines.append("  (none)")
        lines.append("faces (sides walked with the face on the left; L/R = left/right of the edge):")
        for name in sorted(self.faces):
            cycles = " | ".join(" ".join(repr(s) for s in cycle) for cycle in self.faces[name])
            lines.append(f"  {name}: {cycles}")
        return "\n".join(lines)


# ---------------------------------------------------------------------- assembling diagrams


def trace_cycles(
    crossings: Mapping[int, tuple[int, int, int, int]],
    signs: Mapping[int, int],
    loops: Iterable[int] = (),
) -> list[tuple[Side, ...]]:
    """The face boundary cycles of every split piece, each on its own (no nesting yet).

    Walking with the face on the left, one arrives at a crossing through position ``p`` and
    leaves through position ``p - 1`` (counterclockwise numbering).

    >>> trace_cycles({1: (4, 1, 3, 2), 2: (2, 3, 1, 4)}, {1: -1, 2: -1})
    [(1L, 4R), (1R, 3R), (2L, 4L), (2R, 3L)]
    """
    probe = Diagram(crossings, signs, frozenset(loops))
    ends = probe.edge_ends
    dart_edge = probe.dart_edge
    other_end: dict[Dart, Dart] = {}
    for tail, head in ends.values():
        other_end[tail] = head
        other_end[head] = tail
    # arriving at a dart, the walk leaves through the previous position and arrives at the far end
    walk = {dart: other_end[Dart(dart.crossing, (dart.position - 1) % 4)] for dart in other_end}
    cycles: list[tuple[Side, ...]] = []
    for orbit in orbits(walk):
        sides = []
        for dart in orbit:
            leave = Dart(dart.crossing, (dart.position - 1) % 4)
            edge = dart_edge[leave]
            sides.append(Side(edge, "L" if ends[edge][0] == leave else "R"))
        cycles.append(canonical_cycle(sides))
    for loop in loops:
        cycles.append((Side(loop, "L"),))
        cycles.append((Side(loop, "R"),))
    return sorted(cycles)


def canonical_cycle(cycle: Iterable[Side]) -> tuple[Side, ...]:
    """Rotate a cycle to start at its smallest side.

    >>> canonical_cycle([Side(5, "L"), Side(2, "R"), Side(7, "L")])
    (2R, 7L, 5L)
    """
    cycle = list(cycle)
    start = cycle.index(min(cycle))
    return tuple(cycle[start:] + cycle[:start])


def trace_components(
    crossings: Mapping[int, tuple[int, int, int, int]],
    signs: Mapping[int, int],
    loops: Iterable[int] = (),
) -> list[tuple[int, ...]]:
    """The components as edge cycles along the orientation, each from its smallest edge.

    >>> trace_components({1: (4, 1, 3, 2), 2: (2, 3, 1, 4)}, {1: -1, 2: -1})
    [(1, 2), (3, 4)]
    """
    probe = Diagram(crossings, signs, frozenset(loops))
    result = [(loop,) for loop in sorted(loops)]
    result += [tuple(cycle) for cycle in orbits({edge: probe.next_edge(edge) for edge in probe.edge_ends})]
    return sorted(result)


class _UnionFind:
    def __init__(self) -> None:
        self.parent: dict[int, int] = {}

    def find(self, x: int) -> int:
        self.parent.setdefault(x, x)
        while self.parent[x] != x:
            self.parent[x] = self.parent[self.parent[x]]
            x = self.parent[x]
        return x

    def union(self, x: int, y: int) -> None:
        rx, ry = self.find(x), self.find(y)
        if rx != ry:
            self.parent[max(rx, ry)] = min(rx, ry)


@dataclass
class Hints:
    """What a move tells :func:`assemble` about faces that the combinatorics alone cannot.

    ``cut``
        old faces that the move's arc cuts across: each changed cycle that comes from one
        of them becomes a region of its own (the one with the smallest old side keeps the name).
    ``place``
        side -> old face: the new cycle through that side belongs to that face's region
        (a circle born in a face; the new triangle of an R3 move).
    ``absorb``
        old face -> old face: whatever lay in the first (other pieces) goes to the second.
    ``face_names`` / ``component_names``
        names the caller chose for the new faces / components, used in order.
    """

    cut: frozenset[int] = frozenset()
    place: Mapping[Side, int] = field(default_factory=dict)
    absorb: Mapping[int, int] = field(default_factory=dict)
    face_names: tuple[int, ...] = ()
    component_names: tuple[int, ...] = ()
    #: new side -> the old side it continues (for edges whose orientation the move reversed)
    side_alias: Mapping[Side, Side] = field(default_factory=dict)
    #: new faces through these sides are named first, in this order
    first_new: tuple[Side, ...] = ()
    #: pairs of old components that the move joins into one
    joined: tuple[tuple[int, int], ...] = ()


def _fresh(taken: set[int], floor: int, chosen: list[int], kind: str) -> int:
    if chosen:
        name = chosen.pop(0)
        if name in taken:
            raise NameInUseError(f"the chosen {kind} name {name} is already in use")
    else:
        name = max(max(taken, default=0), floor) + 1
    taken.add(name)
    return name


def assemble(
    crossings: Mapping[int, tuple[int, int, int, int]],
    signs: Mapping[int, int],
    loops: Iterable[int] = (),
    previous: Diagram | None = None,
    hints: Hints | None = None,
    root_face: Mapping[int, Side] | None = None,
) -> Diagram:
    """Build a checked diagram, carrying names over from ``previous`` (the frame before a move).

    Without ``previous`` every piece is placed side by side in one common region: for each
    split piece, the face on the right of its smallest edge (so that circles side by side in the
    plane, run counterclockwise, have their outsides in common). Faces and components are then
    numbered 1, 2, ... in the order of their smallest side / edge.

    With ``previous``, a cycle (component) that keeps any side (edge) of the old diagram
    inherits the old face (component) names; merged ones keep the smallest name; see
    :class:`Hints` for what a move adds.

    >>> d = assemble({1: (4, 1, 3, 2), 2: (2, 3, 1, 4)}, {1: -1, 2: -1})
    >>> d.faces[1]
    ((1L, 4R),)
    """
    hints = hints or Hints()
    crossings = {name: tuple(labels) for name, labels in crossings.items()}
    signs = dict(signs)
    loops = frozenset(loops)
    cycles = trace_cycles(crossings, signs, loops)
    _check_planar(crossings, signs, loops, cycles)
    components = trace_components(crossings, signs, loops)
    if not cycles:
        # the empty diagram: the whole sphere is one face with no boundary
        name = min(previous.faces, default=1) if previous is not None else 1
        return Diagram(crossings, signs, loops, {}, {name: ()})
    if previous is None:
        faces = _faces_side_by_side(crossings, signs, loops, cycles)
        named_components = {i + 1: comp for i, comp in enumerate(components)}
    else:
        faces = _inherit_faces(previous, cycles, hints, crossings, signs, loops)
        named_components = _inherit_components(previous, components, hints)
    diagram = Diagram(crossings, signs, loops, named_components, faces)
    check_regions(diagram)
    return diagram


def check_regions(diagram: Diagram) -> None:
    """Check that the faces are the traced cycles, and that pieces and regions form a tree.

    On the sphere every split piece touches each region at most once, and the graph with a node
    for each piece and each region, and an edge for each boundary cycle, is a tree.

    >>> from movies.diagram.pd import from_pd
    >>> check_regions(from_pd([], loops=2))
    """
    cycles = sorted(c for region in diagram.faces.values() for c in region)
    traced = trace_cycles(diagram.crossings, diagram.signs, diagram.loops)
    if cycles != traced:
        raise DiagramError("the faces do not match the diagram's boundary cycles")
    pieces = diagram.pieces()
    piece_of = {edge: i for i, piece in enumerate(pieces) for edge in piece}
    uf = _UnionFind()
    for name, region in diagram.faces.items():
        touching = [piece_of[cycle[0].edge] for cycle in region]
        if len(set(touching)) != len(touching):
            raise DiagramError(f"face {name} meets one split piece twice")
        for other in touching[1:]:
            uf.union(other, touching[0])
    if len(cycles) != len(pieces) + len(diagram.faces) - 1 or len({uf.find(i) for i in range(len(pieces))}) > 1:
        raise DiagramError("the split pieces and the faces between them do not form a tree")


def _check_planar(crossings, signs, loops, cycles) -> None:
    probe = Diagram(crossings, signs, loops)
    piece_of_edge = {}
    for index, piece in enumerate(probe.pieces()):
        for edge in piece:
            piece_of_edge[edge] = index
    face_count: dict[int, int] = {}
    for cycle in cycles:
        piece = piece_of_edge[cycle[0].edge]
        face_count[piece] = face_count.get(piece, 0) + 1
    for index, piece in enumerate(probe.pieces()):
        vertices = len({probe.edge_ends[e][0].crossing for e in piece if e not in loops})
        if not vertices:
            continue
        # a connected 4-valent piece on the sphere has V - E + F = 2 with E = 2V
        if face_count[index] != vertices + 2:
            raise DiagramError(
                f"the piece through edges {sorted(piece)[:6]}{'...' if len(piece) > 6 else ''} is not planar: "
                f"{vertices} crossings, {2 * vertices} edges and {face_count[index]} faces give Euler "
                f"characteristic {face_count[index] - vertices}, not 2"
            )


def _piece_index(crossings, signs, loops) -> dict[int, int]:
    probe = Diagram(crossings, signs, loops)
    return {edge: i for i, piece in enumerate(probe.pieces()) for edge in piece}


def _faces_side_by_side(crossings, signs, loops, cycles) -> dict[int, tuple[tuple[Side, ...], ...]]:
    piece_of = _piece_index(crossings, signs, loops)
    probe = Diagram(crossings, signs, loops)
    roots = {Side(min(piece), "R") for piece in probe.pieces()}
    common = tuple(sorted(cycle for cycle in cycles if any(side in roots for side in cycle)))
    regions = [common] if common else []
    regions += [(cycle,) for cycle in cycles if cycle not in common]
    regions.sort(key=lambda region: min(min(cycle) for cycle in region))
    del piece_of
    return {i + 1: region for i, region in enumerate(regions)}


def _inherit_faces(previous: Diagram, cycles, hints: Hints, crossings, signs, loops):
    old_side_face = previous.side_face
    old_cycles = {cycle for region in previous.faces.values() for cycle in region}
    old_face_of_cycle = {cycle: name for name, region in previous.faces.items() for cycle in region}
    uf = _UnionFind()
    for name in previous.faces:
        uf.find(name)
    sources: dict[tuple[Side, ...], set[int]] = {}
    def old_face_of(side: Side) -> int | None:
        return old_side_face.get(hints.side_alias.get(side, side))

    for cycle in cycles:
        found = {old_face_of(s) for s in cycle} - {None}
        found |= {hints.place[s] for s in cycle if s in hints.place}
        sources[cycle] = found
        first = None
        for name in found:
            if first is None:
                first = name
            else:
                uf.union(first, name)
    for source, target in hints.absorb.items():
        uf.union(source, target)
    cut_roots = {uf.find(name) for name in hints.cut}

    groups: dict[int, list[tuple[Side, ...]]] = {}  # root -> cycles
    separate: dict[int, list[tuple[Side, ...]]] = {}  # cut root -> changed cycles
    orphans: list[tuple[Side, ...]] = []
    for cycle in cycles:
        found = sources[cycle]
        if not found:
            orphans.append(cycle)
            continue
        root = uf.find(next(iter(found)))
        untouched = cycle in old_cycles and old_face_of_cycle[cycle] in found
        if root in cut_roots and not untouched:
            separate.setdefault(root, []).append(cycle)
        else:
            groups.setdefault(root, []).append(cycle)

    members: dict[int, set[int]] = {}
    for name in previous.faces:
        members.setdefault(uf.find(name), set()).add(name)

    taken: set[int] = set()
    floor = max(previous.faces, default=0)
    chosen = list(hints.face_names)
    faces: dict[int, tuple[tuple[Side, ...], ...]] = {}
    pending_new: list[tuple[tuple[Side, ...], ...]] = []
    for root in sorted(set(groups) | set(separate)):
        name = min(members[root])
        parts = sorted(separate.get(root, []), key=lambda c: _smallest_old_side(c, old_face_of))
        rest = groups.get(root, [])
        if parts:
            keeper, others = parts[0], parts[1:]
            faces[name] = tuple(sorted([keeper] + rest))
            taken.add(name)
            pending_new.extend((cycle,) for cycle in others)
        else:
            faces[name] = tuple(sorted(rest))
            taken.add(name)
    pending_new.extend((cycle,) for cycle in orphans)
    priority = {side: i for i, side in enumerate(hints.first_new)}

    def order(region) -> tuple:
        ranks = [priority[side] for side in region[0] if side in priority]
        return (min(ranks) if ranks else len(priority), min(region[0]))

    pending_new.sort(key=order)
    for region in pending_new:
        faces[_fresh(taken, floor, chosen, "face")] = region
    return faces


def _smallest_old_side(cycle, old_face_of) -> tuple:
    kept = [side for side in cycle if old_face_of(side) is not None]
    return (0, min(kept)) if kept else (1, min(cycle))


def _inherit_components(previous: Diagram, components, hints: Hints):
    old_edge_component = previous.edge_component
    uf = _UnionFind()
    for a, b in hints.joined:
        uf.union(a, b)
    found_of = []
    for comp in components:
        found = {old_edge_component[e] for e in comp if e in old_edge_component}
        found_of.append(found)
        names = sorted(found)
        for other in names[1:]:
            uf.union(names[0], other)
    keeper: dict[int, tuple[int, ...]] = {}
    fresh_needed = []
    for comp, found in zip(components, found_of):
        if not found:
            fresh_needed.append(comp)
            continue
        root = uf.find(min(found))
        anchor = min(e for e in comp if e in old_edge_component)
        if root not in keeper or anchor < min(e for e in keeper[root] if e in old_edge_component):
            if root in keeper:
                fresh_needed.append(keeper[root])
            keeper[root] = comp
        else:
            fresh_needed.append(comp)
    result = {root: comp for root, comp in keeper.items()}
    taken = set(result)
    floor = max(previous.components, default=0)
    chosen = list(hints.component_names)
    for comp in sorted(fresh_needed):
        result[_fresh(taken, floor, chosen, "component")] = comp
    return dict(sorted(result.items()))


def reencode(
    crossings: Mapping[int, tuple[int, int, int, int]],
    arriving: set[Dart],
) -> tuple[dict[int, tuple[int, int, int, int]], dict[int, int]]:
    """PD tuples and signs for crossings whose strands may have been re-oriented.

    ``crossings`` gives each crossing's labels counterclockwise with the under-strand at
    positions 0 and 2 (any PD tuple does); ``arriving`` holds the darts, in those positions,
    where an edge now arrives. Each tuple is re-read from its incoming under-strand.

    >>> reencode({1: (1, 5, 2, 4)}, {Dart(1, 2), Dart(1, 1)})
    ({1: (2, 4, 1, 5)}, {1: 1})
    """
    tuples: dict[int, tuple[int, int, int, int]] = {}
    signs: dict[int, int] = {}
    for name, labels in crossings.items():
        start = 0 if Dart(name, 0) in arriving else 2
        if (Dart(name, start) in arriving) == (Dart(name, (start + 2) % 4) in arriving):
            raise DiagramError(f"crossing {name}: its under-strand does not run through it")
        rotated = tuple(labels[(start + i) % 4] for i in range(4))
        tuples[name] = rotated  # type: ignore[assignment]
        signs[name] = +1 if Dart(name, (start + 3) % 4) in arriving else -1
    return tuples, signs
