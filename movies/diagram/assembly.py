"""Assembling a diagram from crossings: tracing faces and components, and carrying names over.

:func:`assemble` turns crossings, signs and loops into a :class:`~movies.diagram.model.Diagram`,
tracing the faces and components and naming them. Given the frame before a move, it carries
the names over: a face or component keeps its name when any side or edge of it survives; a merge
keeps the smaller name; :class:`Hints` tell it the little a move cannot leave to the tracing
(which face its arc cuts, where a new circle lies, what a vanished face held).
:func:`check_regions` confirms after every move that pieces and regions form a tree.

>>> d = assemble({1: (4, 1, 3, 2), 2: (2, 3, 1, 4)}, {1: -1, 2: -1}, set())  # a Hopf link
>>> sorted(d.faces), d.component_count(), d.linking_matrix()
([1, 2, 3, 4], 2, [[0, -1], [-1, 0]])
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Iterable, Mapping

from movies.diagram.model import Dart, Diagram, Side, orbits
from movies.errors import DiagramError, NameInUseError
from movies.unionfind import UnionFind

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
    probe = Diagram(crossings, signs, loops)  # pieces and edge ends, computed once for the checks
    _check_planar(probe, cycles)
    components = trace_components(crossings, signs, loops)
    if not cycles:
        # the empty diagram: the whole sphere is one face with no boundary
        name = min(previous.faces, default=1) if previous is not None else 1
        return Diagram(crossings, signs, loops, {}, {name: ()})
    if previous is None:
        faces = _faces_side_by_side(probe, cycles)
        named_components = {i + 1: comp for i, comp in enumerate(components)}
    else:
        faces = _inherit_faces(previous, cycles, hints, crossings, signs, loops)
        named_components = _inherit_components(previous, components, hints)
    diagram = Diagram(crossings, signs, loops, named_components, faces)
    check_regions(diagram, cycles)
    return diagram


def check_regions(diagram: Diagram, traced=None) -> None:
    """Check that the faces are the traced cycles, and that pieces and regions form a tree.

    On the sphere every split piece touches each region at most once, and the graph with a node
    for each piece and each region, and an edge for each boundary cycle, is a tree.

    >>> from movies.diagram.pd import from_pd
    >>> check_regions(from_pd([], loops=2))

    ``traced``: the diagram's boundary cycles when the caller has just traced them.
    """
    cycles = sorted(c for region in diagram.faces.values() for c in region)
    if traced is None:
        traced = trace_cycles(diagram.crossings, diagram.signs, diagram.loops)
    traced = sorted(traced)
    if cycles != traced:
        raise DiagramError("the faces do not match the diagram's boundary cycles")
    pieces = diagram.pieces()
    piece_of = {edge: i for i, piece in enumerate(pieces) for edge in piece}
    uf = UnionFind()
    for name, region in diagram.faces.items():
        touching = [piece_of[cycle[0].edge] for cycle in region]
        if len(set(touching)) != len(touching):
            raise DiagramError(f"face {name} meets one split piece twice")
        for other in touching[1:]:
            uf.union(other, touching[0])
    if len(cycles) != len(pieces) + len(diagram.faces) - 1 or len({uf.find(i) for i in range(len(pieces))}) > 1:
        raise DiagramError("the split pieces and the faces between them do not form a tree")


def _check_planar(probe: Diagram, cycles) -> None:
    loops = probe.loops
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


def _faces_side_by_side(probe: Diagram, cycles) -> dict[int, tuple[tuple[Side, ...], ...]]:
    roots = {Side(min(piece), "R") for piece in probe.pieces()}
    common = tuple(sorted(cycle for cycle in cycles if any(side in roots for side in cycle)))
    regions = [common] if common else []
    regions += [(cycle,) for cycle in cycles if cycle not in common]
    regions.sort(key=lambda region: min(min(cycle) for cycle in region))
    return {i + 1: region for i, region in enumerate(regions)}


def _inherit_faces(previous: Diagram, cycles, hints: Hints, crossings, signs, loops):
    old_side_face = previous.side_face
    old_cycles = {cycle for region in previous.faces.values() for cycle in region}
    old_face_of_cycle = {cycle: name for name, region in previous.faces.items() for cycle in region}
    uf = UnionFind()
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
    uf = UnionFind()
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
