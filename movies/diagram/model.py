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
from typing import Mapping, NamedTuple

from movies.errors import DiagramError
from movies.unionfind import UnionFind

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
        uf = UnionFind()
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


    def as_data(self) -> dict:
        """Every name as plain JSON-ready data: what :meth:`summary` lists, for scripts.

        Faces list one boundary cycle per split piece they touch, each side as the edge and the
        hand (``L``/``R``) on which the face lies.

        >>> from movies.diagram.pd import from_pd
        >>> data = from_pd([[4, 1, 3, 2], [2, 3, 1, 4]]).as_data()
        >>> data["crossings"][0], data["components"][1], data["faces"][0]
        ({'name': 1, 'pd': [4, 1, 3, 2], 'sign': -1}, {'name': 2, 'edges': [3, 4], 'circle': False}, {'name': 1, 'boundary': [['1L', '4R']]})
        """
        return {
            "crossings": [{"name": name, "pd": list(self.crossings[name]), "sign": self.signs[name]}
                          for name in sorted(self.crossings)],
            "components": [{"name": name, "edges": list(self.components[name]),
                            "circle": self.components[name][0] in self.loops} for name in sorted(self.components)],
            "faces": [{"name": name, "boundary": [[repr(side) for side in cycle] for cycle in self.faces[name]]}
                      for name in sorted(self.faces)],
        }
