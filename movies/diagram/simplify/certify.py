"""Certifying that two diagrams are isotopic: one explicit move sequence from one to the other.

How :func:`certify_isotopy` finds it:

1. ``second`` is simplified greedily, and ``first`` is simplified (:func:`descend`) until it
   has no more crossings than that; then ``second`` further, if ``first`` went lower. Only
   moves that a single move function call can undo are used on ``second``'s side.
2. If the two ends differ, a search from both at once (best-first on crossing count, R3
   moves, removals and up to ``lift`` stacked R2 additions) looks for a diagram that both
   reach, the same on the sphere or the same up to reflection (then ``reflected`` is True).
3. The moves on ``second``'s side are undone in reverse order. Each undoing move is worked
   out on ``second``'s frames (:func:`~movies.diagram.simplify.records.inverse`), and its
   names are carried to the frame actually reached through an isomorphism of the sphere,
   found afresh after every step (any one will do: the next move is only named through it).

The certificate is the list of moves from ``first``; replaying them ends in a diagram that
:attr:`IsotopyCertificate.names` renames into ``second`` (or into its reflection, when
``reflected``). Reflecting the sphere and switching every crossing is a rotation of space,
so a reflected certificate is still an isotopy of links.

>>> from movies.diagram.constructors import from_braid
>>> from movies.diagram.simplify.records import replay
>>> cert = certify_isotopy(from_braid([1, 1, 1, 2]), from_braid([1, 1, 1]))
>>> rename(replay(cert.moves, from_braid([1, 1, 1, 2])), cert.names) == from_braid([1, 1, 1])
True
"""

from __future__ import annotations

import heapq
from dataclasses import dataclass

from movies.diagram.isotopy import canonical_form, isomorphism, reflect_and_switch
from movies.diagram.assembly import canonical_cycle
from movies.diagram.model import Diagram, Side
from movies.diagram.simplify.records import MoveRecord, apply, candidates, inverse, translate
from movies.diagram.simplify.search import (
    Budget, Meter, SimplifyResult, Step, _greedy, child_key, descend, undoable,
)
from movies.diagram.simplify.search import simplify as simplify_by_count
from movies.errors import DiagramError, InternalError, MoveError

__all__ = ["IsotopyCertificate", "certify_isotopy", "rename"]

_LATERAL = ("R1-", "R2-", "R3")


@dataclass(frozen=True)
class IsotopyCertificate:
    """An explicit isotopy from ``first`` to ``second``.

    ``moves``: records replayable from ``first``; ``end``: the frame they reach; ``names``:
    maps (``"edges"``, ``"crossings"``, ``"faces"``, ``"components"``) from ``end``'s names to
    ``second``'s, so that ``rename(end, names)`` is ``second`` (or
    ``reflect_and_switch(second)`` when ``reflected``); ``explored``: moves the search applied.
    """

    first: Diagram
    second: Diagram
    moves: list[MoveRecord]
    end: Diagram
    names: dict[str, dict[int, int]]
    reflected: bool
    explored: int


def rename(diagram: Diagram, names: dict[str, dict[int, int]]) -> Diagram:
    """The same diagram with its names passed through ``names`` (as an isomorphism gives them).

    Parameters: a diagram; maps with keys ``"edges"``, ``"crossings"``, ``"faces"``,
    ``"components"`` (every name of the diagram must be in them). Returns a new diagram.

    >>> from movies.diagram.constructors import unlink
    >>> d = rename(unlink(2), {"edges": {1: 2, 2: 1}, "crossings": {}, "faces": {1: 3, 2: 2, 3: 1},
    ...                        "components": {1: 2, 2: 1}})
    >>> d == unlink(2)
    True
    """
    edges, faces = names["edges"], dict(names["faces"])
    crossings, components = names["crossings"], names["components"]
    try:
        return Diagram(
            {crossings[x]: tuple(edges[e] for e in labels) for x, labels in diagram.crossings.items()},
            {crossings[x]: sign for x, sign in diagram.signs.items()},
            frozenset(edges[e] for e in diagram.loops),
            {components[k]: _from_smallest(tuple(edges[e] for e in path)) for k, path in diagram.components.items()},
            dict(sorted(
                (faces[f], tuple(sorted(canonical_cycle(Side(edges[s.edge], s.hand) for s in cycle)
                                        for cycle in cycles)))
                for f, cycles in diagram.faces.items()
            )),
        )
    except KeyError as err:
        raise DiagramError(f"the name {err.args[0]} of the diagram has no new name") from None


def _from_smallest(path: tuple[int, ...]) -> tuple[int, ...]:
    start = path.index(min(path))
    return path[start:] + path[:start]


def _invert(names: dict[str, dict[int, int]]) -> dict[str, dict[int, int]]:
    return {kind: {v: k for k, v in m.items()} for kind, m in names.items()}


def _match(first: Diagram, second: Diagram) -> dict[str, dict[int, int]] | None:
    names = isomorphism(first, second)
    if names is not None and not names["faces"] and len(first.faces) == len(second.faces) == 1:
        # the empty diagram: the one face of the sphere
        names["faces"] = {next(iter(first.faces)): next(iter(second.faces))}
    return names


class _Side:
    """One end of the meeting search: its frames, parents, and canonical forms seen."""

    def __init__(self, start: Diagram, cap: int, reversible: bool) -> None:
        self.nodes: list[tuple[Diagram, int, Step | None]] = [(start, -1, None)]
        self.seen: dict[tuple, int] = {canonical_form(start): 0}
        self.mirrored: dict[tuple, int] = {}
        self.cap = cap
        self.reversible = reversible
        self.heap: list = []
        self.counter = 0
        #: for the second side: the form of each frame reflected, with crossings switched
        self.mirror_forms: list[tuple] = []
        if reversible:
            self.mirror_forms.append(canonical_form(reflect_and_switch(start)))
            self.mirrored[self.mirror_forms[0]] = 0
        self.push(0, 0)

    def push(self, index: int, depth: int) -> None:
        d = self.nodes[index][0]
        n = d.crossing_count()
        kinds = _LATERAL + (("R2+",) if n + 2 <= self.cap else ())
        for record in candidates(d, kinds):
            self.counter += 1
            # breadth-first here: two searches meet sooner when neither runs deep alone
            heapq.heappush(self.heap, (*child_key(d, record), depth + 1, self.counter, index, record))

    def path(self, index: int) -> list[Step]:
        steps = []
        while index > 0:
            _, parent, step = self.nodes[index]
            steps.append(step)
            index = parent
        return steps[::-1]

    def expand(self) -> tuple[int, tuple] | None:
        """Build the next child; returns its index and form, or None if it is not new."""
        _, _, depth, _, parent, record = heapq.heappop(self.heap)
        before = self.nodes[parent][0]
        try:
            after = apply(record, before)
        except MoveError:
            return None
        if self.reversible and not undoable(before, record, after):
            return None
        form = canonical_form(after)
        if form in self.seen:
            return None
        self.nodes.append((after, parent, Step(record, after)))
        index = len(self.nodes) - 1
        self.seen[form] = index
        if self.reversible:
            self.mirror_forms.append(canonical_form(reflect_and_switch(after)))
            self.mirrored.setdefault(self.mirror_forms[-1], index)
        self.push(index, depth)
        return index, form


def _meet(a: Diagram, b: Diagram, meter: Meter, lift: int):
    """Paths from ``a`` and from ``b`` to a common diagram; (a steps, b steps, reflected) or None."""
    cap = max(a.crossing_count(), b.crossing_count()) + 2 * lift
    one, two = _Side(a, cap, False), _Side(b, cap, True)
    start = canonical_form(a)
    if start in two.seen:
        return [], [], False
    if start in two.mirrored:
        return [], [], True
    while one.heap or two.heap:
        # the side whose next child is lower goes first; ties go to the first side
        turn = one if not two.heap or (one.heap and one.heap[0][:3] <= two.heap[0][:3]) else two
        if not meter.spend():
            return None
        found = turn.expand()
        if found is None:
            continue
        index, form = found
        if turn is one:
            if form in two.seen:
                return one.path(index), two.path(two.seen[form]), False
            if form in two.mirrored:
                return one.path(index), two.path(two.mirrored[form]), True
        else:
            if form in one.seen:
                return one.path(one.seen[form]), two.path(index), False
            mirrored = two.mirror_forms[index]
            if mirrored in one.seen:
                return one.path(one.seen[mirrored]), two.path(index), True
    return None


def _search(first: Diagram, second: Diagram, meter: Meter, lift: int):
    b_steps = _greedy(second, meter, reversible=True)
    b_end = b_steps[-1].diagram if b_steps else second
    target = b_end.crossing_count()
    a_steps, _ = descend(first, lambda d: d.crossing_count() <= target, meter, lift)
    a_end = a_steps[-1].diagram if a_steps else first
    if a_end.crossing_count() < target and not meter.stopped:
        level = a_end.crossing_count()
        more, _ = descend(b_end, lambda d: d.crossing_count() <= level, meter, lift, reversible=True)
        b_steps += more
        b_end = b_steps[-1].diagram if b_steps else second
    if meter.stopped:
        return None
    met = _meet(a_end, b_end, meter, lift)
    if met is None:
        return None
    a_more, b_more, reflected = met
    return a_steps + a_more, b_steps + b_more, reflected


def certify_isotopy(first: Diagram, second: Diagram, budget: Budget | int | None = None,
                    lift: int = 1) -> IsotopyCertificate | None:
    """One explicit sequence of Reidemeister moves from ``first`` to a diagram equal to ``second``
    up to names (and, if need be, a reflection of the sphere with every crossing switched).

    Parameters: the two diagrams; ``budget``, a :class:`Budget` or a number of moves for the
    whole search (default ``Budget()``); ``lift``, R2 additions a search may stack. Returns an
    :class:`IsotopyCertificate`, or None when the budget ran out first (for diagrams of
    different links it always does: None says nothing about whether they are isotopic).

    >>> from movies.diagram.constructors import from_braid, mirror
    >>> certify_isotopy(from_braid([1, 1, 1]), mirror(from_braid([1, 1, 1])), budget=100) is None
    True
    """
    return certify_within(first, second, Meter(Budget.of(budget)), lift)


def certify_within(first: Diagram, second: Diagram, meter: Meter, lift: int = 1) -> IsotopyCertificate | None:
    """:func:`certify_isotopy` spending from a given :class:`Meter` (``meter.used`` tells the work).

    >>> from movies.diagram.constructors import unknot
    >>> certify_within(unknot(), unknot(), Meter(Budget())).moves
    []
    """
    found = _search(first, second, meter, lift)
    if found is None:
        return None
    a_steps, b_steps, reflected = found
    moves = [step.record for step in a_steps]
    current = a_steps[-1].diagram if a_steps else first
    frames = [second] + [step.diagram for step in b_steps]
    if reflected:
        frames = [reflect_and_switch(frame) for frame in frames]
    # worked out on the frames themselves (names are kept by a reflection, sides are not)
    undos = [inverse(frames[i], step.record, frames[i + 1]) for i, step in enumerate(b_steps)]
    if any(undo is None for undo in undos):  # pragma: no cover - undoable() was checked
        raise InternalError("a move of the second side has no undoing move")
    names = _match(current, frames[-1])
    for i in range(len(b_steps), 0, -1):
        if names is None:
            raise InternalError("the frames of the certificate do not match")
        record = translate(undos[i - 1], _invert(names))
        current = apply(record, current)
        moves.append(record)
        names = _match(current, frames[i - 1])
    if names is None:
        raise InternalError("the certificate does not end at the second diagram")
    return IsotopyCertificate(first, second, moves, current, names, reflected, meter.used)


def simplify(diagram: Diagram, target: object = "fewest", budget: Budget | int | None = None,
             lift: int = 1, carry=None, extra=None) -> SimplifyResult:
    """Simplify ``diagram`` toward ``target``: a crossing count (``"fewest"``, ``"crossingless"``,
    an int) or a :class:`Diagram` to reach up to isotopy of the sphere (or else up to reflection;
    the result's ``comparison`` says which).

    The crossing-count targets are :func:`movies.diagram.simplify.search.simplify`; a diagram
    target runs :func:`certify_within`. Running out of budget gives ``reached=False``.

    >>> from movies.diagram.constructors import from_braid
    >>> result = simplify(from_braid([1, 1, 1, 1, -1]), from_braid([1, 1, 1]))
    >>> result.reached, result.comparison, result.diagram.crossing_count()
    (True, 'sphere', 3)
    """
    if not isinstance(target, Diagram):
        return simplify_by_count(diagram, target, budget, lift, carry, extra)
    if carry is not None:
        raise DiagramError("a search toward a diagram carries nothing along its moves")
    meter = Meter(Budget.of(budget))
    certificate = certify_within(diagram, target, meter, lift)
    if certificate is None:
        return SimplifyResult(diagram, [], diagram, False, meter.used, meter.stopped or "exhausted", target)
    return SimplifyResult(diagram, list(certificate.moves), certificate.end, True, certificate.explored,
                          "goal", target, "reflection" if certificate.reflected else "sphere")
