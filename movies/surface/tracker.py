"""The surface a movie sweeps out: its components, Euler characteristic and orientations.

The movie is seen as a list of frames; each link component of each frame is a node. A step
links the components before it to those after it (:class:`Transition`): Reidemeister moves link
each component to itself; a band merges two, splits one or twists one; a birth starts a
component (a disk: +1 to χ), a death ends one (+1), a band costs −1. Each connected piece of
the resulting graph is a component of the surface.

Orientations: every link says whether the orientation of the component before agrees with the
orientation of the one after as the surface carries it (``same``), or is opposite; a twisting
band says the surface there is not orientable. The surface has an orientation inducing the
given orientation of the first frame when the signs can be chosen consistently with every first
frame component positive.

>>> steps = [Transition("band", links=((1, 1, True), (1, 2, True)), saddles=1),
...          Transition("death", ended=(2,), deaths=1), Transition("death", ended=(1,), deaths=1)]
>>> s = surface_of([1], steps)
>>> s.euler_characteristic, [(c.genus, c.boundary_start, c.boundary_end) for c in s.components]
(1, [(0, 1, 0)])
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Sequence

from movies.diagram.steps import Transition
from movies.unionfind import ParityUnionFind

#: a node of the surface graph: (frame number, component name)
Node = tuple[int, int]


@dataclass(frozen=True)
class Blowup:
    """One twist step: a CP²-bar summand for a +1 twist, a CP² summand for a −1 twist.

    ``algebraic`` is the surface's entry aᵢ of the class there: the strands through the gate
    counted with sign, each by the orientation the surface gives it (the start's orientation
    where the surface meets the start, the end's where it meets only the end).
    """

    step: int  # index into the transitions
    turns: int
    algebraic: int
    strands: int


@dataclass(frozen=True)
class SurfaceComponent:
    """One connected component of the surface."""

    euler_characteristic: int
    boundary_start: int
    boundary_end: int
    orientable: bool
    births: int
    deaths: int
    saddles: int
    start_components: tuple[int, ...]
    end_components: tuple[int, ...]

    @property
    def boundary(self) -> int:
        return self.boundary_start + self.boundary_end

    @property
    def genus(self) -> int | None:
        """Genus of an orientable component, (2 − χ − b)/2; None if it is not orientable."""
        if not self.orientable:
            return None
        return (2 - self.euler_characteristic - self.boundary) // 2

    @property
    def crosscaps(self) -> int | None:
        """Non-orientable genus (number of crosscaps), 2 − χ − b; None if orientable."""
        if self.orientable:
            return None
        return 2 - self.euler_characteristic - self.boundary


@dataclass(frozen=True)
class Surface:
    """The whole surface of a movie."""

    components: tuple[SurfaceComponent, ...]
    euler_characteristic: int
    births: int
    deaths: int
    saddles: int
    orientable: bool
    oriented_by_start: bool
    orientation_broken_at: int | None  # index of the step that first breaks the start orientation
    start_count: int
    end_count: int
    blowups: tuple[Blowup, ...] = ()
    #: last-frame components drawn against the orientation the surface gives them (when it is
    #: oriented by the start; within a piece that misses the start, against its first end component)
    end_reversed: tuple[int, ...] = ()

    @property
    def connected(self) -> bool:
        return len(self.components) == 1

    @property
    def every_component_meets_start(self) -> bool:
        return all(c.boundary_start > 0 for c in self.components)

    @property
    def every_component_meets_end(self) -> bool:
        return all(c.boundary_end > 0 for c in self.components)


def surface_of(start: Sequence[int], transitions: Sequence[Transition]) -> Surface:
    """The surface of a movie from its first frame's components and its steps.

    Parameters
    ----------
    start : sequence of int
        Component names of the first frame.
    transitions : sequence of Transition
        One per step, in order.

    Returns
    -------
    Surface
        Components with χ, boundary counts, genus and orientability; the totals; whether the
        surface is oriented compatibly with the first frame, and if not, the first step (index
        into ``transitions``) that breaks it.

    >>> surface_of([1, 2], [Transition("band", links=((1, 1, True), (2, 1, False)), saddles=1)]).oriented_by_start
    False
    >>> surface_of([1], [Transition("birth", started=(2,), births=1),
    ...                  Transition("band", links=((1, 1, False), (2, 1, True)), saddles=1)]).end_reversed
    (1,)
    """
    pieces = ParityUnionFind()  # connectivity and, within each piece, the orientation signs
    tied = ParityUnionFind()  # the same, with every first-frame component tied to one positive node
    positive: Node = (-1, 0)
    tied.add(positive)
    current = {k: (0, k) for k in start}
    for node in current.values():
        pieces.add(node)
        tied.add(node)
        tied.join(positive, node, True)
    morse: list[tuple[Node, int, int, int]] = []
    gates: list[tuple[int, int, list[tuple[Node, int]]]] = []
    broken_at: int | None = None
    for index, step in enumerate(transitions):
        frame = index + 1
        if step.turns:
            gates.append((index, step.turns, [(current[k], d) for k, d in step.gate]))
        after: dict[int, Node] = {}
        ok = True
        touched = {before for before, _, _ in step.links} | set(step.ended)
        carried = tuple((k, k, True) for k in current if k not in touched)
        for before, new, same in step.links + carried:
            node = (frame, new)
            after[new] = node
            for uf in (pieces, tied):
                uf.add(node)
            pieces.join(current[before], node, same)
            ok = tied.join(current[before], node, same) and ok
        for new in step.started:
            node = (frame, new)
            after[new] = node
            pieces.add(node)
            tied.add(node)
        for new in step.twisted:
            pieces.bad.add(pieces.find(after[new])[0])
            ok = False
        if step.births or step.deaths or step.saddles:
            if step.ended:
                where = current[step.ended[0]]
            elif step.started:
                where = after[step.started[0]]
            else:
                where = after[step.links[0][1]]
            morse.append((where, step.births, step.deaths, step.saddles))
        if not ok and broken_at is None:
            broken_at = index
        current = after
    end_nodes = set(current.values())
    members: dict[Node, list[Node]] = {}
    for node in pieces.parent:
        members.setdefault(pieces.find(node)[0], []).append(node)
    counts: dict[Node, list[int]] = {}
    for where, b, d, sd in morse:
        tally = counts.setdefault(pieces.find(where)[0], [0, 0, 0])
        tally[0] += b
        tally[1] += d
        tally[2] += sd
    bad_roots = {pieces.find(root)[0] for root in pieces.bad}
    components = []
    for root, nodes in members.items():
        b, d, sd = counts.get(root, [0, 0, 0])
        starts = tuple(sorted(k for (f, k) in nodes if f == 0))
        ends = tuple(sorted(k for (f, k) in nodes if (f, k) in end_nodes))
        components.append(
            SurfaceComponent(
                euler_characteristic=b + d - sd,
                boundary_start=len(starts),
                boundary_end=len(ends),
                orientable=root not in bad_roots,
                births=b, deaths=d, saddles=sd,
                start_components=starts, end_components=ends,
            )
        )
    components.sort(key=lambda c: (c.start_components == (), c.start_components, c.end_components == (), c.end_components, -c.saddles))
    births = sum(c.births for c in components)
    deaths = sum(c.deaths for c in components)
    saddles = sum(c.saddles for c in components)
    return Surface(
        components=tuple(components),
        euler_characteristic=births + deaths - saddles,
        births=births, deaths=deaths, saddles=saddles,
        orientable=all(c.orientable for c in components),
        oriented_by_start=broken_at is None,
        orientation_broken_at=broken_at,
        start_count=len(start), end_count=len(end_nodes),
        blowups=_blowups(gates, pieces, tied, positive, end_nodes),
        end_reversed=_end_reversed(pieces, tied, positive, current) if broken_at is None else (),
    )


def _end_reversed(pieces: ParityUnionFind, tied: ParityUnionFind, positive: Node, current: dict) -> tuple[int, ...]:
    """The last frame's components whose drawn orientation is not the one the surface induces.

    A band that does not respect the orientations reverses what it must of the rest of the
    frame, so a drawn orientation can disagree with the surface's; the s of the last frame that
    the inequalities need is that of the induced orientation.
    """
    reversed_ = []
    reference: dict = {}  # for pieces that miss the start: the sign of their first end component
    root_positive, sign_positive = tied.find(positive)
    for name in sorted(current):
        node = current[name]
        root, sign = tied.find(node)
        if root == root_positive:
            if sign != sign_positive:
                reversed_.append(name)
            continue
        piece, piece_sign = pieces.find(node)
        first = reference.setdefault(piece, piece_sign)
        if piece_sign != first:
            reversed_.append(name)
    return tuple(reversed_)


def _blowups(gates, pieces: ParityUnionFind, tied: ParityUnionFind, positive: Node, end_nodes: set) -> tuple[Blowup, ...]:
    """aᵢ for each twist: strand directions times the surface's orientation sign of their component."""
    anchor: dict[Node, int] = {}  # piece root -> sign of the root, from an end node, for pieces off the start
    for node in sorted(end_nodes):
        root, sign = pieces.find(node)
        anchor.setdefault(root, sign)

    def sign(node: Node) -> int:
        root, s = tied.find(node)
        if root == tied.find(positive)[0]:
            return s * tied.find(positive)[1]
        piece, within = pieces.find(node)
        return within * anchor.get(piece, 1)

    return tuple(Blowup(index, turns, sum(d * sign(node) for node, d in strands), len(strands))
                 for index, turns, strands in gates)
