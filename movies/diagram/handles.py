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
from movies.diagram.moves.twist import arcs_tangled, gate_arcs, gate_path
from movies.errors import DiagramError, MoveError

__all__ = ["Gate", "HandleDiagram", "handle_diagram", "regated", "fibers", "closed_braid", "twisted",
           "gate_faces", "keep_off", "carried", "fiber_of", "capped", "slid"]

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

    def start_face(self, diagram: Diagram) -> int:
        return diagram.side_face[Side(self.edges[0], self.hand)]


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
        try:
            faces, directions = gate_path(diagram, edges, start_face)
        except MoveError as err:  # the notation names the start face with 'from face F'
            raise MoveError(f"handle {index}: " + str(err).replace("with start_face", "with 'from face F'")) from None
        left, _ = diagram.faces_beside(edges[0])
        checked.append(Gate(edges, "L" if faces[0] == left else "R"))
        paths.append((edges, faces, tuple(directions)))
    owner: dict[int, int] = {}
    for index, gate in enumerate(checked, start=1):
        for edge in gate.edges:
            if edge in owner:
                raise MoveError(f"handles {owner[edge]} and {index} both cross edge {edge}; a strand between "
                                "two handles needs an edge of its own for each")
            owner[edge] = index
    arcs: dict[int, list[tuple[Side, Side]]] = {}
    whose: dict[int, set[int]] = {}
    for index, path in enumerate(paths, start=1):
        for face, pairs in gate_arcs(*path).items():
            arcs.setdefault(face, []).extend(pairs)
            whose.setdefault(face, set()).add(index)
    tangled = arcs_tangled(diagram, arcs)
    if tangled is not None:
        crossing = sorted(whose[tangled])
        raise MoveError(f"handles {' and '.join(map(str, crossing))} cross each other in face {tangled}: "
                        "their gates cannot be drawn apart there")
    return HandleDiagram(diagram, tuple(checked), tuple(path[2] for path in paths))


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
        if amount:
            diagram = twist(diagram, gate.edges, amount, gate.start_face(diagram)).diagram
    return diagram


# ---------------------------------------------------------------------- handles along a movie


def gate_faces(link: HandleDiagram) -> list[tuple[int, ...]]:
    """The faces each gate runs through, in order.

    >>> gate_faces(fibers(1, 1))
    [(1, 2, 3)]
    """
    return [tuple(gate_path(link.diagram, gate.edges, gate.start_face(link.diagram))[0]) for gate in link.gates]


def keep_off(link: HandleDiagram, edges, crossings, what: str) -> None:
    """Refuse a step that acts on a gate: on an edge a gate crosses, or at a crossing at the end
    of such an edge.

    A step that keeps off every gate is, for every k, the same step in S³ between the twisted
    approximations, which is what makes the S³ inequalities hold for the surface. Whether it also
    keeps clear of a gate's path through the faces (a band across a face the gate runs through
    must not cut it) is checked afterwards, by :func:`carried`: the gate must still run through
    the faces of the new frame across the same edges. Raises :class:`~movies.errors.MoveError`
    naming the handle.

    >>> keep_off(fibers(1, 1), edges=(2,), crossings=(), what="a band")
    Traceback (most recent call last):
    ...
    movies.errors.MoveError: a band acts on edge 2, which handle 1 crosses (its gate crosses edges 1, 2): a step in a movie with handles keeps off the strands where they pass through a handle
    """
    for index, gate in enumerate(link.gates, start=1):
        where = set(gate.edges)
        crossed = ", ".join(map(str, gate.edges))
        hit = where & set(edges)
        if hit:
            raise MoveError(f"{what} acts on edge {min(hit)}, which handle {index} crosses (its gate crosses edges "
                            f"{crossed}): a step in a movie with handles keeps off the strands where they pass "
                            "through a handle")
        at = sorted(c for c in crossings if set(link.diagram.crossing(c)) & where)
        if at:
            raise MoveError(f"{what} moves crossing {at[0]}, at the end of an edge handle {index} crosses (its gate "
                            f"crosses edges {crossed}): a step in a movie with handles keeps off the strands where "
                            "they pass through a handle")


def carried(link: HandleDiagram, diagram: Diagram, reversed_components=()) -> HandleDiagram:
    """The same handles on the diagram after a step that kept off them, checked again.

    Each gate keeps its edges and the side of its first edge it starts on (sides, unlike face
    names, survive moves elsewhere); ``reversed_components`` names the components of ``diagram``
    whose orientation the step reversed (a band may), on which left and right trade places. The
    check fails, with the handle named, when the step cut the gate's path: a band or a finger
    across a face the gate runs through, on the wrong side of it, leaves the gate's edges in
    different faces.

    >>> from movies.diagram.moves import birth
    >>> from movies.diagram.constructors import unlink
    >>> link = handle_diagram(unlink(3), [([1, 2], None)])  # face 4 holds circle 3, off the gate
    >>> carried(link, birth(link.diagram, 4)).gates == link.gates
    True
    """
    flipped = set(reversed_components)
    starts = []
    for gate in link.gates:
        hand = gate.hand
        if diagram.component_of(gate.edges[0]) in flipped:
            hand = "R" if hand == "L" else "L"
        starts.append((gate.edges, diagram.side_face[Side(gate.edges[0], hand)]))
    try:
        return handle_diagram(diagram, starts)
    except MoveError as err:
        raise MoveError(f"the step cuts through a handle's gate: {err}") from None


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


def capped(link: HandleDiagram, component: int, diagram: Diagram) -> HandleDiagram | None:
    """The handles after the fiber ``component`` is capped off (``diagram`` is the frame without it).

    Its gate no longer crosses that edge; a gate left with no strands is dropped, and None is
    returned when no gate has strands left.

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
            kept.append((gate.edges, None, Side(gate.edges[0], gate.hand)))
            continue
        rest = tuple(e for e in gate.edges if e != edge)
        if not rest:
            continue
        if gate.edges[0] != edge:
            kept.append((rest, None, Side(rest[0], gate.hand)))
            continue
        # the gate began across the capped circle: it now begins in the face it entered next
        path = gate_path(link.diagram, gate.edges, gate.start_face(link.diagram))[0]
        left, _ = link.diagram.faces_beside(rest[0])
        kept.append((rest, None, Side(rest[0], "L" if path[1] == left else "R")))
    if not kept:
        return None
    return handle_diagram(diagram, [(edges, diagram.side_face[side]) for edges, _, side in kept])


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
    if crossing not in diagram.crossings:
        raise MoveError(f"crossing {crossing} is not in the diagram (crossings: {sorted(diagram.crossings)})")
    faces = gate_path(diagram, gate.edges, gate.start_face(diagram))[0]
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


def _through(diagram: Diagram, crossing: int, edge: int, forward: bool) -> int:
    """The edge that continues ``edge``'s strand through ``crossing`` (forward: edge runs into it)."""
    labels = diagram.crossing(crossing)
    index = labels.index(edge) if labels.count(edge) == 1 else None
    if index is None:  # pragma: no cover - a kink: both ends of the edge at this crossing
        raise MoveError(f"edge {edge} runs into and out of crossing {crossing}: a kink, not a slide")
    return labels[(index + 2) % 4]
