"""Links in connected sums of S¹×S², drawn as link diagrams with handles.

M_r = #ʳ S¹×S² is 0-surgery on an r-component unlink; isotope each unknot Uᵢ to a small circle
around a bundle of strands, and in the diagram it is a *gate*: a simple path across the diagram
that crosses each strand of the bundle once (the same object as the gate of a twist step). The
disk Uᵢ bounds, capped off, is the 2-sphere of the i-th summand; the strands through the gate
are where the link meets it. A :class:`HandleDiagram` is a diagram with its gates.

For an orientation, aᵢ is the algebraic number of strands through gate i (one way minus the
other): (a₁, …, a_r) is the class of the link in H₁(M_r) = Zʳ. The link is *null-homologous*
when every aᵢ = 0, and *2-divisible* when every bundle has an even number of strands.

``L(k)`` (:func:`twisted`) is the link in S³ with k full twists inserted at every gate
(right-handed for k > 0): −1/k surgery on the unlink, which is S³ again (the Rolfsen twist).

>>> h = fibers(1, 1)  # two circles through one handle, one each way
>>> h.homology_class(), h.null_homologous(), h.two_divisible()
((0,), True, True)
>>> twisted(h, 2).crossing_count()  # T(2, 4) with one strand reversed
4

References
----------
C. Manolescu, M. Marengon, S. Sarkar, M. Willis, "A generalization of Rasmussen's invariant,
with applications to surfaces in some four-manifolds" (2019): the setting. D. Rolfsen, "Knots
and Links" (1976): the twist.
"""

from __future__ import annotations

from dataclasses import dataclass
from itertools import product
from typing import Sequence

from movies.diagram.constructors import braid_closure, from_braid, reverse
from movies.diagram.model import Diagram, Side
from movies.diagram.moves import twist
from movies.diagram.moves.reidemeister import kinks_at
from movies.diagram.moves.base import _check_edge
from movies.diagram.moves.twist import _gate_walk, arcs_tangled, gate_arcs, gate_path
from movies.errors import DiagramError, InternalError, MoveError

__all__ = ["Gate", "HandleDiagram", "handle_diagram", "regated", "fibers", "closed_braid", "twisted",
           "gate_faces", "keep_off", "pieces", "swept", "carried", "fiber_of", "capped", "slid", "slid_past_strand", "pulled", "pushed", "straightened",
           "handle_gate_path"]

#: how many orientations the search for null-homologous ones tries at most (2^components)
MOST_ORIENTATIONS = 1 << 16


@dataclass(frozen=True)
class Gate:
    """One handle: the edges its gate crosses, in order, and the side of the first edge it starts on.

    ``hand`` is ``"L"`` or ``"R"``: the gate starts in the face on that side of ``edges[0]``.
    Sides, unlike face names, survive the moves at other gates, so a gate stays located.
    """

    edges: tuple[int, ...]
    hand: str

    def start_face(self, diagram: Diagram) -> int | None:
        """The face the gate starts in (None for a handle no strand passes through: it can be
        moved anywhere off the link, so it has no place in the diagram)."""
        return diagram.side_face[Side(self.edges[0], self.hand)] if self.edges else None

    def straight(self) -> tuple[int, ...]:
        """The edges with every turn-back left out: what the handle's sphere meets after each is
        pulled back (see :func:`straightened`)."""
        return straightened(self.edges)


@dataclass(frozen=True)
class HandleDiagram:
    """A link diagram with r handles (gates): a link in #ʳ S¹×S², with its orientation.

    Build one with :func:`handle_diagram`, which checks the gates.
    """

    diagram: Diagram
    gates: tuple[Gate, ...]
    directions: tuple[tuple[int, ...], ...]  # per gate: +1 or -1 for each strand, in the gate's order

    def homology_class(self) -> tuple[int, ...]:
        """(a₁, …, a_r): the strands through each gate, counted with their directions."""
        return tuple(sum(d) for d in self.directions)

    def null_homologous(self) -> bool:
        return not any(self.homology_class())

    def two_divisible(self) -> bool:
        """Every bundle has an even number of strands (whatever the orientation)."""
        return all(len(gate.edges) % 2 == 0 for gate in self.gates)

    def null_homologous_orientations(self) -> list[tuple[int, ...]]:
        """Every set of components whose reversal makes the link null-homologous (() = as given).

        Both an orientation and its total reversal are listed. Raises
        :class:`~movies.errors.DiagramError` past :data:`MOST_ORIENTATIONS`.

        >>> fibers(2, 0).null_homologous_orientations()
        [(1,), (2,)]
        """
        names = sorted(self.diagram.components)
        if 1 << len(names) > MOST_ORIENTATIONS:
            raise DiagramError(f"{len(names)} components have {2 ** len(names)} orientations; "
                               f"at most {MOST_ORIENTATIONS} are tried")
        of = [[self.diagram.component_of(edge) for edge in gate.edges] for gate in self.gates]
        found = []
        for flips in product((False, True), repeat=len(names)):
            reversed_ = {name for name, flip in zip(names, flips) if flip}
            if all(sum(-d if k in reversed_ else d for d, k in zip(directions, components)) == 0
                   for directions, components in zip(self.directions, of)):
                found.append(tuple(sorted(reversed_)))
        return sorted(found, key=lambda s: (len(s), s))


def straightened(edges: Sequence[int]) -> tuple[int, ...]:
    """The edges a gate crosses with every turn-back left out.

    A strand that crosses a gate and straight back (the same edge twice in a row: between the two
    passages the edge has no crossing and the gate crosses nothing else) can be pulled back off
    the handle's sphere by an isotopy; after that, the strands on either side may turn back in
    turn, so the turn-backs cancel like a free reduction.

    >>> straightened([4, 1, 2, 2, 1, 7])
    (4, 7)
    """
    kept: list[int] = []
    for edge in edges:
        if kept and kept[-1] == edge:
            kept.pop()
        else:
            kept.append(edge)
    return tuple(kept)


def handle_gate_path(diagram: Diagram, edges: Sequence[int],
                     start_face: int | None = None) -> tuple[list[int], list[int]]:
    """The faces a handle's gate runs through and the direction of each strand it crosses.

    As :func:`~movies.diagram.moves.twist.gate_path`, except that a strand may turn straight back
    through the gate (the same edge twice in a row, see :func:`straightened`); the gate with its
    turn-backs left out must be a simple path. Raises :class:`~movies.errors.MoveError` saying why.

    >>> from movies.diagram.constructors import unknot
    >>> handle_gate_path(unknot(), [1, 1], 1)
    ([1, 2, 1], [1, -1])
    """
    edges = list(edges)
    straight = straightened(edges)
    repeated = sorted({edge for edge in straight if straight.count(edge) > 1})
    if not repeated and len(straight) == len(edges):
        return gate_path(diagram, edges, start_face)
    if repeated:
        raise MoveError(f"the gate crosses edge {repeated[0]} more than once, and not straight back (edges "
                        f"{edges}); a strand crosses a gate twice only by turning straight back, as in "
                        f"'... {repeated[0]} {repeated[0]} ...'")
    for edge in set(edges):
        _check_edge(diagram, edge)
    beside = [int(face) for face in diagram.faces_beside(edges[0])]
    if start_face is not None and start_face not in beside:
        raise MoveError(f"start_face {start_face} does not border edge {edges[0]} "
                        f"(it lies between faces {beside[0]} and {beside[1]})")
    found, why = {}, {}
    for face in [start_face] if start_face is not None else beside:
        walk = _gate_walk(diagram, edges, face, simple=False)
        if isinstance(walk, str):
            why[face] = walk
        elif _drawable(diagram, [(edges, *walk)]) is not None:
            why[face] = f"the gate would cross itself in face {_drawable(diagram, [(edges, *walk)])}"
        else:
            found[face] = walk
    if len(found) == 2:
        raise MoveError(f"a gate across edges {edges} can start in face {beside[0]} or in face {beside[1]} "
                        "(the two sides of the first edge); say which with start_face")
    if not found:
        raise MoveError(f"no gate crosses edges {edges} in this order: " + "; ".join(
            f"starting in face {face}, {reason}" for face, reason in why.items()))
    return next(iter(found.values()))


#: how many turn-backs, over all gates, a frame may have (each is drawn two ways when checked)
MOST_TURN_BACKS = 10


def _drawable(diagram: Diagram, paths) -> int | None:
    """None when the gates (edges, faces, directions) can be drawn in the diagram without any
    crossing another or itself; otherwise a face where they cannot.

    Where a strand turns back through a gate, the two passages lie on one edge in an order the
    edges do not record: both orders are tried.
    """
    twice = [(number, edge) for number, (edges, _, _) in enumerate(paths)
             for edge in dict.fromkeys(edges) if edges.count(edge) == 2]
    if len(twice) > MOST_TURN_BACKS:
        raise MoveError(f"the gates have {len(twice)} strands turning back through them; at most "
                        f"{MOST_TURN_BACKS} are checked: pull some back first")
    face = None
    for flips in product((False, True), repeat=len(twice)):
        swapped = {pair for pair, flip in zip(twice, flips) if flip}
        arcs: dict[int, list] = {}
        for number, (edges, faces, directions) in enumerate(paths):
            rank, seen = list(range(len(edges))), {}
            for i, edge in enumerate(edges):
                if edge in seen and (number, edge) in swapped:
                    rank[i], rank[seen[edge]] = seen[edge], i
                seen.setdefault(edge, i)
            for i in range(1, len(edges)):
                entry = (Side(edges[i - 1], "R" if directions[i - 1] > 0 else "L"), rank[i - 1])
                leave = (Side(edges[i], "L" if directions[i] > 0 else "R"), rank[i])
                arcs.setdefault(faces[i], []).append((entry, leave))
        face = arcs_tangled(diagram, arcs)
        if face is None:
            return None
    return face


def handle_diagram(diagram: Diagram, gates: Sequence[tuple[Sequence[int], int | None]]) -> HandleDiagram:
    """A diagram with handles, each gate given as (edges crossed in order, start face or None).

    Every gate is checked as a twist's gate is (the edges exist, each crossed once, each step
    into a face the next edge borders, the path simple; the start face is needed only when both
    sides of the first edge would do), and the gates together: no edge crossed by two gates, and
    no two gates crossing each other in a face.

    Raises :class:`~movies.errors.MoveError` naming the handle and the reason.

    >>> from movies.diagram.constructors import unlink
    >>> handle_diagram(unlink(2), [([1, 2], None)]).homology_class()
    (0,)
    >>> handle_diagram(unlink(2), [([1, 2], None), ([2], 3)])
    Traceback (most recent call last):
    ...
    movies.errors.MoveError: handles 1 and 2 both cross edge 2; a strand between two handles needs an edge of its own for each
    """
    if not gates:
        raise MoveError("a handle diagram needs at least one handle")
    checked, paths = [], []
    for index, (edges, start_face) in enumerate(gates, start=1):
        edges = tuple(edges)
        if not edges:  # a handle no strand passes through
            checked.append(Gate((), "L"))
            paths.append(((), [], ()))
            continue
        try:
            faces, directions = handle_gate_path(diagram, edges, start_face)
        except MoveError as err:  # the notation names the start face with 'from face F'
            raise MoveError(f"handle {index}: " + str(err).replace("with start_face", "with 'from face F'")) from None
        left, _ = diagram.faces_beside(edges[0])
        checked.append(Gate(edges, "L" if faces[0] == left else "R"))
        paths.append((edges, faces, directions))
    owner: dict[int, int] = {}
    for index, gate in enumerate(checked, start=1):
        for edge in dict.fromkeys(gate.edges):
            if edge in owner:
                raise MoveError(f"handles {owner[edge]} and {index} both cross edge {edge}; a strand between "
                                "two handles needs an edge of its own for each")
            owner[edge] = index
    tangled = _drawable(diagram, paths) if len(paths) > 1 else None
    if tangled is not None:
        crossing = [index for index, (_, faces, _) in enumerate(paths, start=1) if tangled in faces[1:-1]]
        raise MoveError(f"handles {' and '.join(map(str, crossing))} cross each other in face {tangled}: "
                        "their gates cannot be drawn apart there")
    return HandleDiagram(diagram, tuple(checked), tuple(tuple(path[2]) for path in paths))


def regated(link: HandleDiagram, diagram: Diagram) -> HandleDiagram:
    """The same handles on a diagram with the same names (its mirror image, or with components
    reversed: both keep every edge and face), checked again.

    >>> from movies.diagram.constructors import mirror
    >>> regated(fibers(1, 1), mirror(fibers(1, 1).diagram)).homology_class()
    (0,)
    """
    return handle_diagram(diagram, [(gate.edges, gate.start_face(link.diagram)) for gate in link.gates])


def fibers(p: int, q: int) -> HandleDiagram:
    """F(p, q): p fibers of one handle running one way and q the other (p + q nested circles).

    Each fiber S¹×pt is a small circle through the gate once; L(k) of F(p, q) is the torus link
    T(p + q, (p + q)k) with q strands reversed.

    >>> fibers(2, 1).homology_class()
    (1,)
    """
    if p < 0 or q < 0 or p + q == 0:
        raise DiagramError(f"fibers need p, q >= 0 and at least one circle, not ({p}, {q})")
    circles = from_braid([], strands=p + q)  # nested circles 1, ..., p + q, all one way
    if q:
        circles = reverse(circles, range(p + 1, p + q + 1))
    # face 1 is inside the innermost circle: the gate runs from there out, crossing each once
    return handle_diagram(circles, [(list(range(1, p + q + 1)), 1)])


def closed_braid(word: Sequence[int], strands: int | None = None,
                 reversed_components: Sequence[int] = ()) -> HandleDiagram:
    """The closure of a braid through one handle: the handle is the braid axis, so every strand
    passes through it once; ``reversed_components`` (names in the closure) run the other way.

    L(k) of it is the closure of the braid followed by k full twists (Δ²ᵏ).

    >>> h = closed_braid([1, 1, 1])
    >>> h.homology_class(), closed_braid([1, 1, 1, 1], reversed_components=[2]).homology_class()
    ((2,), (0,))
    """
    diagram, closing = braid_closure(word, strands)
    if reversed_components:
        diagram = reverse(diagram, reversed_components)
    try:
        return handle_diagram(diagram, [(closing, None)])
    except MoveError:  # both sides of the outermost closing arc would do: the gate runs inward from outside
        outside = diagram.side_face[Side(closing[0], "L")]
        return handle_diagram(diagram, [(closing, outside)])


def twisted(link: HandleDiagram, k: int | Sequence[int]) -> Diagram:
    """L(k): the diagram in S³ with k full twists at every gate (or kᵢ at gate i).

    Right-handed for k > 0, left-handed for k < 0, nothing for 0 (L(0) is the diagram itself).
    The gates share no edge, so the twists are inserted one after another, each found again by
    the side of its first edge.

    >>> twisted(fibers(3, 0), 1).linking_matrix()  # T(3, 3): every pair links once
    [[0, 1, 1], [1, 0, 1], [1, 1, 0]]
    """
    turns = [k] * len(link.gates) if isinstance(k, int) else list(k)
    if len(turns) != len(link.gates):
        raise DiagramError(f"{len(turns)} numbers of twists for {len(link.gates)} handles")
    diagram = link.diagram
    for gate, amount in zip(link.gates, turns):
        straight = gate.straight()  # a strand turning back through the gate is pulled back first
        if amount and straight:
            diagram = twist(diagram, straight, amount, gate.start_face(diagram)).diagram
    return diagram


# ---------------------------------------------------------------------- handles along a movie


def gate_faces(link: HandleDiagram) -> list[tuple[int, ...]]:
    """The faces each gate runs through, in order.

    >>> gate_faces(fibers(1, 1))
    [(1, 2, 3)]
    """
    return [tuple(handle_gate_path(link.diagram, gate.edges, gate.start_face(link.diagram))[0]) if gate.edges else ()
            for gate in link.gates]


def keep_off(link: HandleDiagram, record, what: str) -> None:
    """Refuse a band along a path, or with twists, that touches an edge a gate crosses.

    Every other step may act on a strand through a handle, away from where it passes through:
    :func:`carried` finds where the passage went. A band along a path is several moves at once
    (a finger over or under each edge it crosses, then the band); it is refused on such a strand
    rather than followed. Raises :class:`~movies.errors.MoveError` naming the handle.

    >>> from movies.diagram.steps import MoveRecord
    >>> keep_off(fibers(1, 1), MoveRecord("band", first=2, second=1, path=((1, True),)), "a band")
    Traceback (most recent call last):
    ...
    movies.errors.MoveError: a band acts on edge 2, which handle 1 crosses (its gate crosses edges 1, 2): a band along a path or with twists keeps off the strands that pass through a handle; take it in steps (Reidemeister moves, then a band across one face)
    """
    if record.kind != "band" or not (record.path or record.twists):
        return
    touched = [record.first, record.second] + [edge for edge, _ in record.path or ()]
    for index, gate in enumerate(link.gates, start=1):
        hit = [edge for edge in touched if edge in gate.edges]
        if hit:
            raise MoveError(f"{what} acts on edge {hit[0]}, which handle {index} crosses (its gate crosses edges "
                            f"{', '.join(map(str, gate.edges))}): a band along a path or with twists keeps off the "
                            "strands that pass through a handle; take it in steps (Reidemeister moves, then a band "
                            "across one face)")


def pieces(record, before: Diagram, after: Diagram) -> dict[int, tuple[int, ...]]:
    """For each edge a step changed, the edges of the new frame that together make up its old
    stretch of strand (a passage through a gate on it now lies on one of them).

    Edges not listed are unchanged. Adding crossings splits an edge (R1, R2 add), removing them
    merges it into the edge its stretch became (R1, R2 remove), R3 replaces the triangle's edges,
    and a band cuts its two edges and reconnects them (one across the other).

    >>> from movies.diagram.constructors import unlink
    >>> from movies.diagram.steps import MoveRecord, apply
    >>> record = MoveRecord("R2+", over=1, under=2, face=2)
    >>> two = unlink(2)
    >>> pieces(record, two, apply(record, two))
    {1: (1, 3), 2: (2, 4)}
    """
    kind = record.kind
    new = set(after.edges()) - set(before.edges())
    if kind == "R1+":
        return {record.edge: tuple(sorted({record.edge} | new))}
    if kind == "R2+":
        added = set(after.crossings) - set(before.crossings)

        def on_strand(edge, over):  # a new edge leaving a new crossing on the over (odd) or under strand
            tail = after.edge_ends[edge][0]
            return tail.crossing in added and (tail.position % 2 == 1) == over

        return {record.over: tuple(sorted({record.over} | {e for e in new if on_strand(e, True)})),
                record.under: tuple(sorted({record.under} | {e for e in new if on_strand(e, False)}))}
    if kind in ("R1-", "R2-"):
        found = {}
        for edge in before.edges():
            if edge in after.edge_ends or edge in after.loops:
                continue
            back = edge
            while back not in after.edge_ends and back not in after.loops:
                back = _previous(before, back)
            found[edge] = (back,)
        return found
    if kind == "R3":
        found = {}
        for edge in new:
            tail, head = after.edge_ends[edge]
            for old in before.edges():
                if old in before.edge_ends and old not in after.edges():
                    ends = before.edge_ends[old]
                    if (ends[0].crossing, ends[1].crossing) == (head.crossing, tail.crossing):
                        found[old] = (edge,)
        return found
    if kind == "band" and not (record.path or record.twists):
        joined = {record.first, record.second}
        kept = tuple(sorted(edge for edge in joined | new if edge in after.edges()))
        return {edge: kept for edge in joined}
    return {}


def _previous(diagram: Diagram, edge: int) -> int:
    """The edge before ``edge`` along its strand."""
    if edge in diagram.loops:
        return edge
    tail = diagram.edge_ends[edge][0]
    return diagram.dart_edge[type(tail)(tail.crossing, (tail.position + 2) % 4)]


def _small_faces(diagram: Diagram, edges) -> list[int]:
    """The faces of ``diagram`` bounded by one cycle of one or two of ``edges`` only (a kink's
    monogon, a finger's bigon)."""
    edges = set(edges)
    return [face for face, cycles in diagram.faces.items()
            if len(cycles) == 1 and len(cycles[0]) <= 2 and all(side.edge in edges for side in cycles[0])]


def swept(record, before: Diagram, after: Diagram) -> tuple[set[int], set[int], set[int]]:
    """Where a Reidemeister move sweeps: (faces of the old frame that must hold no end of a gate,
    faces of the old frame no gate may run through at all, faces of the new frame that must hold
    no end of a gate).

    A gate's ends are where the handle's circle passes through the plane of the diagram; a kink
    or a finger that closes around one, or one removed around one, passes the strand through
    that circle. A strand through a handle may run through a bigon (the two strands pass each
    other inside the handle's disk), but no gate may cross an R3 triangle: the third strand
    would sweep across the disk.

    >>> from movies.diagram.steps import MoveRecord, apply
    >>> from movies.diagram.constructors import unknot
    >>> record = MoveRecord("R1+", edge=1, hand="L", sign=1)
    >>> swept(record, unknot(), apply(record, unknot()))
    (set(), set(), {3})
    """
    kind = record.kind
    new_edges = set(after.edges()) - set(before.edges())
    if kind in ("R1+", "R2+"):
        return set(), set(), set(_small_faces(after, new_edges))
    if kind == "R1-":
        loops = [record.kink] if record.kink is not None else [max(kinks_at(before, record.crossing))]
        return set(_small_faces(before, loops)), set(), set()
    if kind == "R2-":
        return {record.face}, set(), set()
    if kind == "R3":
        return set(), {record.face}, set()
    return set(), set(), set()


def carried(link: HandleDiagram, diagram: Diagram, changed: dict[int, tuple[int, ...]] | None = None,
            reversed_edges=(), sweeps: tuple[set[int], set[int], set[int]] = (set(), set(), set()),
            band: bool = False, leaving=None) -> HandleDiagram:
    """The same handles on the frame after a step, checked again.

    Each gate keeps the side of its first edge it starts on (sides, unlike face names, survive
    moves elsewhere; ``reversed_edges``, old names, are the edges the step reversed, on which left
    and right trade places). A passage on an edge the step changed lies on one of its pieces
    (``changed``, from :func:`pieces`); every choice is tried, in order, and the first that makes
    each gate a path through the new frame, drawn apart from the others, is taken. Any such choice
    is the same step made on one side of the passage or the other, away from the handle's circle.
    When none is, the step cut through the gate (a finger or a band across it, or a strand pulled
    through it), and the check fails with the handle named.

    A ``band`` is different: on either side of a passage it makes a different surface, so when
    the choices leave the gates crossing different edges the band is ambiguous, and ``leaving``
    ((handle, edges) pairs, as the movie's ``leaving handle H across ...`` writes them) must say
    which; otherwise the check fails, listing them.

    >>> from movies.diagram.moves import birth
    >>> from movies.diagram.constructors import unlink
    >>> link = handle_diagram(unlink(3), [([1, 2], None)])  # face 4 holds circle 3, off the gate
    >>> carried(link, birth(link.diagram, 4)).gates == link.gates
    True
    """
    changed = changed or {}
    ends_before, crossed_before, ends_after = sweeps
    for index, faces in enumerate(gate_faces(link), start=1):
        if faces and ({faces[0], faces[-1]} & ends_before or set(faces) & crossed_before):
            raise MoveError(f"the step sweeps across handle {index}: its gate runs through face "
                            f"{sorted(({faces[0], faces[-1]} & ends_before) | (set(faces) & crossed_before))[0]}, "
                            "where the move would pass a strand through the handle's circle")
    flipped = set(reversed_edges)
    hands, choices = [], []
    for gate in link.gates:
        hand = gate.hand
        if gate.edges and gate.edges[0] in flipped:
            hand = "R" if hand == "L" else "L"
        hands.append(hand)
        choices.append([changed.get(edge, (edge,)) for edge in gate.edges])
    flat = [options for gate_choices in choices for options in gate_choices]
    tried, problem, found = 0, None, {}
    for picked in product(*flat):
        tried += 1
        if tried > MOST_CHOICES:
            break
        starts, at = [], 0
        for gate, hand in zip(link.gates, hands):
            edges = tuple(picked[at:at + len(gate.edges)])
            at += len(gate.edges)
            starts.append((edges, diagram.side_face.get(Side(edges[0], hand)) if edges else None))
        if any(edges and face is None for edges, face in starts):
            continue
        try:
            result = handle_diagram(diagram, starts)
        except MoveError as err:
            problem = problem or err
            continue
        closed = [face for faces in gate_faces(result) if faces for face in (faces[0], faces[-1]) if face in ends_after]
        if closed:
            problem = problem or MoveError(f"a kink or finger would close around the end of a gate in face {closed[0]}")
            continue
        if any(sweeps) and result.directions != link.directions:  # a Reidemeister move keeps every passage
            raise InternalError("a Reidemeister move changed how the strands pass through a handle")
        if not (band or leaving):
            return result
        found.setdefault(tuple(gate.edges for gate in result.gates), result)
    if not found:
        raise MoveError(f"the step cuts through a handle's gate: {problem or 'no way to keep the gates'}")
    if leaving:
        wanted = dict(leaving)
        if any(not 1 <= handle <= len(link.gates) for handle in wanted):
            raise MoveError(f"'leaving' names a handle that is not there (handles 1 to {len(link.gates)})")
        fits = [result for gates, result in found.items()
                if all(gates[handle - 1] == tuple(edges) for handle, edges in wanted.items())]
        if not fits:
            raise MoveError(f"after the band the gates cannot cross what 'leaving' says; they can: "
                            f"{_ways(found)}")
        return fits[0]
    if len(found) > 1:
        raise MoveError("the band can run on either side of where a strand passes through a handle, and the two "
                        f"make different surfaces; say which with 'leaving ...': {_ways(found)}")
    return next(iter(found.values()))


def _ways(found: dict) -> str:
    """The choices of gates after a band, as the movie writes them."""
    return "; or ".join(" and ".join(f"handle {index} across {' '.join(map(str, edges))}"
                                     for index, edges in enumerate(gates, start=1) if edges)
                        for gates in found)


#: how many ways of placing the passages on the pieces of changed edges :func:`carried` tries
MOST_CHOICES = 4096


def fiber_of(link: HandleDiagram, component: int) -> tuple[int, int]:
    """The handle (1, 2, ...) a fiber passes through, and its direction there (+1 or −1).

    A fiber is a crossingless circle that passes through one gate once and through no other.
    Raises :class:`~movies.errors.MoveError` saying why ``component`` is not one.

    >>> fiber_of(fibers(1, 1), 2)
    (1, -1)
    """
    diagram = link.diagram
    if component not in diagram.components:
        raise MoveError(f"component {component} is not in the frame (components: {sorted(diagram.components)})")
    edges = set(diagram.components[component])
    if any(set(diagram.crossing(c)) & edges for c in diagram.crossings):
        raise MoveError(f"component {component} has crossings; a fiber is a crossingless circle through one handle")
    through = [(index, gate.edges.index(edge), direction)
               for index, (gate, directions) in enumerate(zip(link.gates, link.directions), start=1)
               for edge, direction in zip(gate.edges, directions) if edge in edges]
    if len(through) != 1:
        said = "no handle" if not through else f"{len(through)} times through the handles"
        raise MoveError(f"component {component} passes through {said}; a fiber passes through one handle once")
    index, _, direction = through[0]
    return index, direction


def capped(link: HandleDiagram, component: int, diagram: Diagram) -> HandleDiagram:
    """The handles after the fiber ``component`` is capped off (``diagram`` is the frame without it).

    Its gate no longer crosses that edge (a handle keeps its number when no strand is left
    through it).

    >>> from movies.diagram.moves import death
    >>> link = fibers(1, 1)
    >>> capped(link, 1, death(link.diagram, 1)).gates
    (Gate(edges=(2,), hand='R'),)
    """
    index, _ = fiber_of(link, component)
    (edge,) = link.diagram.components[component]
    kept = []
    for number, gate in enumerate(link.gates, start=1):
        if number != index:
            kept.append((gate.edges, None, Side(gate.edges[0], gate.hand) if gate.edges else None))
            continue
        rest = tuple(e for e in gate.edges if e != edge)
        if not rest:
            kept.append(((), None, None))
            continue
        if gate.edges[0] != edge:
            kept.append((rest, None, Side(rest[0], gate.hand)))
            continue
        # the gate began across the capped circle: it now begins in the face it entered next
        path = handle_gate_path(link.diagram, gate.edges, gate.start_face(link.diagram))[0]
        left, _ = link.diagram.faces_beside(rest[0])
        kept.append((rest, None, Side(rest[0], "L" if path[1] == left else "R")))
    return handle_diagram(diagram, [(edges, diagram.side_face[side] if side else None) for edges, _, side in kept])


def pulled(link: HandleDiagram, handle: int, edge: int) -> HandleDiagram:
    """The handles after the strand on ``edge``, which turns straight back through gate
    ``handle``, is pulled back off it.

    Between its two passages the edge has no crossing and the gate crosses nothing else, so the
    arc they bound with the gate can be lifted over the diagram and pushed back through the
    handle's disk: an isotopy in the complement of the handle's circle, so every L(k) keeps its
    link type. The frame stays; the gate loses the two passages (the handle keeps its number when
    no strand is left through it). Raises
    :class:`~movies.errors.MoveError` saying why the edge does not turn back through that gate.

    >>> from movies.language.spec import parse_handle_diagram
    >>> link = parse_handle_diagram("unlink(2) with handle across 1 2 2 from face 1")
    >>> pulled(link, 1, 2).gates
    (Gate(edges=(1,), hand='L'),)
    """
    if not 1 <= handle <= len(link.gates):
        raise MoveError(f"there is no handle {handle} (handles 1 to {len(link.gates)})")
    diagram, gate = link.diagram, link.gates[handle - 1]
    edges = gate.edges
    at = next((j for j in range(len(edges) - 1) if edges[j] == edges[j + 1] == edge), None)
    if at is None:
        crossed = ", ".join(map(str, edges))
        raise MoveError(f"edge {edge} does not turn straight back through handle {handle} (its gate crosses edges "
                        f"{crossed}): only a strand the gate crosses twice in a row is pulled back")
    faces = handle_gate_path(diagram, edges, gate.start_face(diagram))[0]
    rest = edges[:at] + edges[at + 2:]
    kept = []
    for number, other in enumerate(link.gates, start=1):
        if number != handle:
            kept.append((other.edges, other.start_face(diagram)))
        else:  # the gate still starts in the face it started in (beside its new first edge)
            kept.append((rest, faces[0] if rest else None))
    return handle_diagram(diagram, kept)


def pushed(link: HandleDiagram, handle: int, edge: int, face: int | None = None) -> HandleDiagram:
    """The handles after a finger of the strand on ``edge`` is pushed through gate ``handle`` and
    back: the gate crosses ``edge`` twice more, in a row (a turn-back, see :func:`pulled`).

    The finger crosses the gate in ``face``, a face beside ``edge`` that the gate runs through (or,
    for a handle no strand passes through yet, the face the gate is put in: the face on the
    edge's left unless ``face`` says otherwise); where the gate runs through it more than once,
    the first place that can be drawn is taken. An isotopy off the handle's circle: every L(k)
    keeps its link type. Raises :class:`~movies.errors.MoveError` saying why it does not apply.

    >>> from movies.language.spec import parse_handle_diagram
    >>> pushed(parse_handle_diagram("unknot with handle"), 1, 1).gates
    (Gate(edges=(1, 1), hand='L'),)
    """
    if not 1 <= handle <= len(link.gates):
        raise MoveError(f"there is no handle {handle} (handles 1 to {len(link.gates)})")
    diagram, gate = link.diagram, link.gates[handle - 1]
    if edge not in diagram.edges():
        raise MoveError(f"edge {edge} is not in the diagram (edges: {', '.join(map(str, diagram.edges()))})")
    beside = [int(f) for f in diagram.faces_beside(edge)]
    if face is not None and face not in beside:
        raise MoveError(f"face {face} does not border edge {edge} (it lies between faces {beside[0]} and {beside[1]})")
    if gate.edges:
        faces = handle_gate_path(diagram, gate.edges, gate.start_face(diagram))[0]
        places = [(i, faces[0]) for i, f in enumerate(faces) if f in beside and (face is None or f == face)]
    else:
        places = [(0, face if face is not None else diagram.side_face[Side(edge, "L")])]
    if not places:
        raise MoveError(f"the gate of handle {handle} runs through no face beside edge {edge}"
                        + (f" (faces {beside[0]} and {beside[1]})" if face is None else f" in face {face}")
                        + ": a finger is pushed through a handle where its gate passes by")
    problem = None
    for at, start in places:
        edges = gate.edges[:at] + (edge, edge) + gate.edges[at:]  # the gate still starts in its face
        kept = [(other.edges, other.start_face(diagram)) if number != handle else (edges, start)
                for number, other in enumerate(link.gates, start=1)]
        try:
            return handle_diagram(diagram, kept)
        except MoveError as err:
            problem = problem or err
    raise MoveError(f"edge {edge} cannot be pushed through handle {handle}: {problem}")


def slid(link: HandleDiagram, handle: int, crossing: int) -> HandleDiagram:
    """The handles after sliding gate ``handle`` along its bundle past ``crossing``, where two of
    its strands cross.

    The gate must cross the two strands consecutively, on the edges that run into (or out of)
    ``crossing``, through the face at that corner; it then crosses their continuations beyond
    the crossing, in the other order. The gate sweeps only the corner of a face and the crossing
    itself, where both strands pass through it: an isotopy of the handle's circle off the link,
    so every twisted approximation stays the same up to isotopy. Raises
    :class:`~movies.errors.MoveError` saying why the slide does not apply.

    >>> from movies.language.spec import parse_handle_diagram
    >>> after = slid(parse_handle_diagram("braid(2)[1, 1] with handle across 1 3 from face 1"), 1, 1)
    >>> after.gates[0].edges, after.homology_class()
    ((4, 2), (2,))
    """
    if not 1 <= handle <= len(link.gates):
        raise MoveError(f"there is no handle {handle} (handles 1 to {len(link.gates)})")
    diagram, gate = link.diagram, link.gates[handle - 1]
    if not gate.edges:
        raise MoveError(f"no strand passes through handle {handle}: its gate has nothing to slide along")
    if crossing not in diagram.crossings:
        raise MoveError(f"crossing {crossing} is not in the diagram (crossings: {sorted(diagram.crossings)})")
    faces = handle_gate_path(diagram, gate.edges, gate.start_face(diagram))[0]
    at = set(diagram.crossing(crossing))
    for j in range(len(gate.edges) - 1):
        a, b = gate.edges[j], gate.edges[j + 1]
        if a not in at or b not in at:
            continue
        ends = [diagram.edge_ends[e] for e in (a, b)]
        heads = [end[1].crossing == crossing for end in ends]
        tails = [end[0].crossing == crossing for end in ends]
        if not (all(heads) or all(tails)):
            continue
        corner = faces[j + 1]
        if crossing not in diagram.face_crossings(corner):
            continue
        beyond = [_through(diagram, crossing, e, forward=all(heads)) for e in (a, b)]
        edges = gate.edges[:j] + (beyond[1], beyond[0]) + gate.edges[j + 2:]
        starts = []
        for number, other in enumerate(link.gates, start=1):
            if number != handle:
                starts.append((other.edges, other.start_face(diagram)))
                continue
            if j > 0:
                starts.append((edges, faces[0]))
            else:  # the first edge changes: the gate still starts in the face it started in, now beside it
                starts.append((edges, faces[0] if faces[0] in diagram.faces_beside(edges[0]) else None))
        try:
            result = handle_diagram(diagram, starts)
        except MoveError as err:
            raise MoveError(f"handle {handle} cannot slide past crossing {crossing}: {err}") from None
        if result.homology_class() != link.homology_class():  # pragma: no cover - the strands are the same ones
            raise MoveError(f"handle {handle} slid past crossing {crossing} would change the class")
        return result
    raise MoveError(f"handle {handle} cannot slide past crossing {crossing}: its gate does not cross two strands "
                    f"that run into (or out of) crossing {crossing} one after the other, through the corner there")


def slid_past_strand(link: HandleDiagram, handle: int, crossings: Sequence[int]) -> HandleDiagram:
    """The handles after sliding gate ``handle`` along its bundle past one strand that crosses
    every strand of the bundle, over all of them or under all, at ``crossings`` (in the gate's order).

    The gate must run along the strand: from the corner of the first crossing, through the face
    between each two strands of the bundle and the stretch of the strand between their crossings,
    to the corner of the last. It then crosses the bundle's continuations beyond the strand. The
    handle's circle stays small around the bundle and passes under the strand (or over it), an
    isotopy off the link, so every L(k) keeps its link type. Raises
    :class:`~movies.errors.MoveError` saying why the slide does not apply.

    >>> from movies.language.spec import parse_handle_diagram
    >>> link = parse_handle_diagram("pd[[1,5,2,4],[3,1,4,6],[5,3,6,2]] with handle across 4 from face 1")
    >>> slid_past_strand(link, 1, [2]).gates
    (Gate(edges=(3,), hand='R'),)
    """
    if not 1 <= handle <= len(link.gates):
        raise MoveError(f"there is no handle {handle} (handles 1 to {len(link.gates)})")
    diagram, gate = link.diagram, link.gates[handle - 1]
    edges, crossings = gate.edges, tuple(crossings)
    refuse = f"handle {handle} cannot slide past the strand through crossings {', '.join(map(str, crossings))}: "
    if not edges:
        raise MoveError(refuse + "no strand passes through it")
    if gate.straight() != edges:
        raise MoveError(refuse + "a strand turns back through its gate; pull it back first")
    if len(crossings) != len(edges):
        raise MoveError(refuse + f"the strand must cross each of the {len(edges)} strands through the handle "
                        f"(its gate crosses edges {', '.join(map(str, edges))}), once each, in the gate's order")
    faces = handle_gate_path(diagram, edges, gate.start_face(diagram))[0]
    beyond, strand, over = [], [], set()
    for edge, crossing in zip(edges, crossings):
        labels = diagram.crossing(crossing)
        if labels.count(edge) != 1:
            raise MoveError(refuse + f"edge {edge} of the bundle does not run into crossing {crossing} (or runs into "
                            "it twice, a kink)")
        at = labels.index(edge)
        beyond.append(labels[(at + 2) % 4])
        strand.append({labels[(at + 1) % 4], labels[(at + 3) % 4]})
        over.add(at % 2 == 0)  # the bundle's strand is the under-strand (PD positions 0, 2): the strand is over
    if len(over) > 1:
        raise MoveError(refuse + "the strand passes over some strands of the bundle and under others; the handle's "
                        "circle slides past a strand that lies over the whole bundle or under it")
    between = []
    for i in range(len(edges) - 1):
        shared = strand[i] & strand[i + 1]
        if not shared:
            raise MoveError(refuse + f"crossings {crossings[i]} and {crossings[i + 1]} are not next to each other "
                            "along one strand")
        (stretch,) = sorted(shared)[:1]
        if not (_corner(diagram, faces[i + 1], edges[i], stretch)
                and _corner(diagram, faces[i + 1], stretch, edges[i + 1])):
            raise MoveError(refuse + f"the gate does not run along the strand between crossings {crossings[i]} and "
                            f"{crossings[i + 1]} (face {faces[i + 1]} is not the corner between edges {edges[i]}, "
                            f"{stretch} and {edges[i + 1]})")
        between.append(stretch)
    ends = sorted(e for e in strand[0] - set(between[:1]) if _corner(diagram, faces[0], edges[0], e))
    last = sorted(e for e in strand[-1] - set(between[-1:]) if _corner(diagram, faces[-1], edges[-1], e))
    if not ends or not last:
        raise MoveError(refuse + "the gate does not start and end in the corners of the first and last crossing "
                        "beside the strand")
    start = next((face for face in diagram.faces_beside(ends[0]) if face != faces[0]), faces[0])
    kept = [(other.edges, other.start_face(diagram)) if number != handle else (tuple(beyond), start)
            for number, other in enumerate(link.gates, start=1)]
    try:
        return handle_diagram(diagram, kept)
    except MoveError as err:
        raise MoveError(refuse + str(err)) from None


def _corner(diagram: Diagram, face: int, a: int, b: int) -> bool:
    """Whether edges ``a`` and ``b`` follow one another on the boundary of ``face`` (meet at a corner of it)."""
    for cycle in diagram.faces[face]:
        for j, side in enumerate(cycle):
            following = cycle[(j + 1) % len(cycle)]
            if {side.edge, following.edge} == {a, b}:
                return True
    return False


def _through(diagram: Diagram, crossing: int, edge: int, forward: bool) -> int:
    """The edge that continues ``edge``'s strand through ``crossing`` (forward: edge runs into it)."""
    labels = diagram.crossing(crossing)
    index = labels.index(edge) if labels.count(edge) == 1 else None
    if index is None:  # pragma: no cover - a kink: both ends of the edge at this crossing
        raise MoveError(f"edge {edge} runs into and out of crossing {crossing}: a kink, not a slide")
    return labels[(index + 2) % 4]
