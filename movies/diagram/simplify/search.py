"""Simplifying a diagram by Reidemeister moves that the search finds by itself.

The strategy, repeated until the target is met or nothing more is found:

1. greedy: R1 and R2 removals while any applies (the first in :func:`candidates` order);
2. when stuck, a best-first search from the stuck diagram over R3 moves and removals, then
   R2 additions (at most ``lift`` of them above the stuck crossing count, each followed by R3s
   and removals), with a visited set of canonical forms. Children are ordered by crossing
   count; among R2 additions, those that make a triangle beside their bigon where an R3 can
   follow come first (:func:`child_key`); then the deepest child first, so that a chain of
   R3 moves, or what an R2 addition opened, is followed to its end before the next one is
   tried. It stops at
   the first diagram with fewer crossings than the stuck one. A child is built only when the
   search reaches it, so the many R2 additions of a diagram cost nothing until the R3 moves
   and removals at a lower crossing count have all been tried.

Every move applied counts against the budget (:class:`Budget`), a number of moves with a
wall-clock cap as a safety net only; two runs with the same inputs and budget give the same
answer unless the clock cuts one of them off.

>>> from movies.diagram.constructors import unknot
>>> from movies.diagram.simplify.records import MoveRecord, replay
>>> d = replay([MoveRecord("R1+", edge=1, hand="L", sign=1), MoveRecord("R1+", edge=1, hand="R", sign=-1)], unknot())
>>> result = simplify(d, target="crossingless")
>>> result.reached, result.diagram.crossing_count(), replay(result.moves, d) == result.diagram
(True, 0, True)
"""

from __future__ import annotations

import heapq
import time
from dataclasses import dataclass, field

from movies.diagram.isotopy import canonical_form
from movies.diagram.model import Diagram
from movies.diagram.simplify.records import CHANGE, MoveRecord, apply, candidates, inverse
from movies.errors import DiagramError, MoveError

__all__ = ["Budget", "SimplifyResult", "Step", "simplify", "descend"]

_REMOVALS = ("R1-", "R2-")
_LATERAL = ("R1-", "R2-", "R3")


@dataclass(frozen=True)
class Budget:
    """How much work a search may do: ``moves`` applied, and ``seconds`` as a safety net.

    >>> Budget(moves=200).moves
    200
    """

    moves: int = 1500
    seconds: float = 10.0

    @staticmethod
    def of(budget: "Budget | int | None") -> "Budget":
        """A Budget from a Budget, a number of moves, or None (the default).

        >>> Budget.of(30)
        Budget(moves=30, seconds=10.0)
        """
        if budget is None:
            return Budget()
        if isinstance(budget, Budget):
            return budget
        if isinstance(budget, int) and not isinstance(budget, bool) and budget >= 0:
            return Budget(moves=budget)
        raise DiagramError(f"a budget is a Budget or a number of moves (0 or more), not {budget!r}")


class Meter:
    """Counts the moves a search applies and says when the budget is spent.

    >>> m = Meter(Budget(moves=2))
    >>> m.spend(), m.spend(), m.spend(), m.stopped
    (True, True, False, 'moves')
    """

    def __init__(self, budget: Budget) -> None:
        self.budget = budget
        self.used = 0
        self.stopped: str | None = None
        self._deadline = time.monotonic() + budget.seconds

    def spend(self) -> bool:
        """Take one move from the budget; False (and ``stopped`` set) when none is left."""
        if self.stopped is not None:
            return False
        if self.used >= self.budget.moves:
            self.stopped = "moves"
            return False
        if time.monotonic() > self._deadline:
            self.stopped = "seconds"
            return False
        self.used += 1
        return True


@dataclass(frozen=True)
class Step:
    """One move of a path: the record and the frame after it."""

    record: MoveRecord
    diagram: Diagram
    #: what a search that carries something along the moves (``carry``) has after this one
    extra: object = None


def undoable(before: Diagram, record: MoveRecord, after: Diagram) -> bool:
    """Whether one move function call undoes ``record``; only an R2 removal can fail that.

    Additions, R3 and R1 removals are always undone by one move
    (:func:`~movies.diagram.simplify.records.inverse` finds it when it is needed); an R2
    removal that leaves both strands on one edge is not (``r2_add`` needs two edges).

    >>> from movies.diagram.constructors import unknot
    >>> undoable(unknot(), MoveRecord("R1+", edge=1, hand="L", sign=1), unknot())
    True
    """
    return record.kind != "R2-" or inverse(before, record, after) is not None


@dataclass(frozen=True)
class SimplifyResult:
    """What :func:`simplify` found.

    ``moves``: the records, to be replayed from ``start``; ``diagram``: the last frame;
    ``reached``: whether the target was met (for ``"fewest"``: the diagram is crossingless
    or the bounded search found nothing better before the budget ran out); ``explored``: moves
    applied, by the search and the path alike; ``stopped``: ``"goal"``, ``"exhausted"``
    (nothing better within the search bounds), ``"moves"`` or ``"seconds"`` (budget spent);
    ``comparison``: for a target diagram, ``"sphere"`` or ``"reflection"`` (the end is the
    target reflected, with crossings switched), else None.
    """

    start: Diagram
    moves: list[MoveRecord]
    diagram: Diagram
    reached: bool
    explored: int
    stopped: str
    target: object = "fewest"
    comparison: str | None = None
    steps: list[Step] = field(default_factory=list, repr=False)


def _corner_gap(diagram: Diagram, record: MoveRecord) -> int:
    """For an R2 addition, how promising it is: 0 best, 3 worst.

    Pushing edge ``over`` across the face to edge ``under`` cuts the face in two; when one
    side ``s`` of the face lies between them, the part there is a triangle (``over``,
    ``s``, ``under``). An R3 move can follow at once when ``over`` is also over at its corner
    with ``s``, or ``s`` is over at both ends: 0. Another triangle: 1; no triangle: 2;
    edges of two split pieces: 3.
    """
    for cycle in diagram.faces[record.face]:
        edges = [side.edge for side in cycle]
        if record.over not in edges or record.under not in edges:
            continue
        i, j, size = edges.index(record.over), edges.index(record.under), len(edges)
        if (j - i) % size == 2:
            between, corner_end = cycle[(i + 1) % size], True
        elif (i - j) % size == 2:
            between, corner_end = cycle[(i - 1) % size], False
        else:
            return 2
        tail, head = diagram.edge_ends[record.over] if record.over in diagram.edge_ends else (None, None)
        if tail is None or between.edge in diagram.loops:
            return 1
        # walking a side "L" runs tail -> head; the corner is where the walk of `over` ends/starts
        walk_ends_at_head = cycle[i].hand == "L"
        dart = head if walk_ends_at_head == corner_end else tail
        s_tail, s_head = diagram.edge_ends[between.edge]
        active = dart.position % 2 == 1 or (s_tail.position % 2 == 1 and s_head.position % 2 == 1)
        return 0 if active else 1
    return 3


def child_key(diagram: Diagram, record: MoveRecord) -> tuple[int, int]:
    """Search order of a child: crossings after the move, then R2 additions that make a
    triangle where an R3 can follow (and whatever follows them) before the others
    (:func:`_corner_gap`). The searches break ties by depth.

    >>> from movies.diagram.constructors import unlink
    >>> child_key(unlink(2), MoveRecord("R2+", over=1, under=2, face=2))
    (2, 3)
    """
    n = diagram.crossing_count() + CHANGE[record.kind]
    return (n, _corner_gap(diagram, record) if record.kind == "R2+" else 0)


def _greedy(diagram: Diagram, meter: Meter, reversible: bool, carry=None, extra=None) -> list[Step]:
    path: list[Step] = []
    while True:
        for record in candidates(diagram, _REMOVALS):
            if not meter.spend():
                return path
            after = apply(record, diagram)
            if reversible and not undoable(diagram, record, after):
                continue
            if carry is not None:
                try:
                    extra = carry(extra, diagram, record, after)
                except MoveError:
                    continue
            path.append(Step(record, after, extra))
            diagram = after
            break
        else:
            return path


def _improve(diagram: Diagram, meter: Meter, lift: int, reversible: bool, carry=None,
             extra=None) -> list[Step] | None:
    """A path to a diagram with fewer crossings, by best-first search; None if none is found."""
    floor = diagram.crossing_count()
    cap = floor + 2 * lift
    nodes: list[tuple[Diagram, int, Step | None]] = [(diagram, -1, Step(None, diagram, extra))]
    seen = {canonical_form(diagram)}
    heap: list[tuple[int, int, int, int, int, int, MoveRecord]] = []
    counter = 0

    def push(index: int, depth: int) -> None:
        nonlocal counter
        d = nodes[index][0]
        n = d.crossing_count()
        kinds = _LATERAL + (("R2+",) if n + 2 <= cap else ())
        for record in candidates(d, kinds):
            counter += 1
            # deepest first: a chain of R3 moves, or what an R2 addition opened, is followed
            # to its end before the next is tried (measured on scrambled 8-10 crossing knots:
            # a third of the moves breadth-first needs, for longer paths)
            heapq.heappush(heap, (*child_key(d, record), -(depth + 1), depth + 1, counter, index, record))

    push(0, 0)
    while heap:
        n_after, _, _, depth, _, parent, record = heapq.heappop(heap)
        if not meter.spend():
            return None
        before = nodes[parent][0]
        try:
            after = apply(record, before)
        except MoveError:
            continue
        if reversible and not undoable(before, record, after):
            continue
        carried = None
        if carry is not None:
            try:
                carried = carry(nodes[parent][2].extra, before, record, after)
            except MoveError:
                continue
        step = Step(record, after, carried)
        if after.crossing_count() < floor:
            path = [step]
            while parent > 0:
                _, parent_of, prior = nodes[parent]
                path.append(prior)
                parent = parent_of
            return path[::-1]
        form = canonical_form(after)
        if form in seen:
            continue
        seen.add(form)
        nodes.append((after, parent, step))
        push(len(nodes) - 1, depth)
    return None


def descend(diagram: Diagram, goal, meter: Meter, lift: int = 1, reversible: bool = False,
            carry=None, extra=None) -> tuple[list[Step], str]:
    """Greedy removals, then searches that unlock more, until ``goal(diagram)`` holds.

    Parameters: the start; ``goal``, a function of a diagram; a :class:`Meter`; ``lift``, how
    many R2 additions above a stuck crossing count a search may make; ``reversible``: take
    only moves that one move function call can undo (:func:`undoable`); ``carry(extra, before,
    record, after)``: what is carried along a move (``extra`` at the start), raising
    :class:`~movies.errors.MoveError` for a move that may not be made (a movie's handles).
    Returns the steps and why it stopped (``"goal"``, ``"exhausted"``, ``"moves"``, ``"seconds"``).

    >>> from movies.diagram.constructors import unknot
    >>> steps, why = descend(unknot(), lambda d: True, Meter(Budget()))
    >>> steps, why
    ([], 'goal')
    """
    path: list[Step] = []
    current = diagram
    while True:
        path += _greedy(current, meter, reversible, carry, path[-1].extra if path else extra)
        current = path[-1].diagram if path else diagram
        if goal(current):
            return path, "goal"
        if meter.stopped:
            return path, meter.stopped
        found = _improve(current, meter, lift, reversible, carry, path[-1].extra if path else extra)
        if found is None:
            return path, meter.stopped or "exhausted"
        path += found
        current = path[-1].diagram


def _goal(target):
    if target == "fewest" or target == "crossingless":
        return lambda d: d.crossing_count() == 0
    if isinstance(target, int) and not isinstance(target, bool) and target >= 0:
        return lambda d: d.crossing_count() <= target
    raise DiagramError(
        f'a target is "fewest", "crossingless", a crossing count (0 or more) or a Diagram, not {target!r}'
    )


def simplify(diagram: Diagram, target: object = "fewest", budget: Budget | int | None = None,
             lift: int = 1, carry=None, extra=None) -> SimplifyResult:
    """Simplify ``diagram`` by Reidemeister moves toward a crossing count, recording every move.

    Parameters: the diagram; ``target``: ``"fewest"`` (as few crossings as the search finds),
    ``"crossingless"`` or an int n (at most n crossings); a :class:`Diagram` target is for
    :func:`movies.diagram.simplify.certify.simplify`, which also takes these;
    ``budget``: a :class:`Budget` or a number of moves (default ``Budget()``, a few seconds);
    ``lift``: R2 additions a search may stack above a stuck crossing count; ``carry`` and
    ``extra``: what is carried along the moves, as for :func:`descend`. Returns a
    :class:`SimplifyResult`; running out of budget gives ``reached=False``, never an error.

    >>> from movies.diagram.constructors import unknot, from_braid
    >>> simplify(from_braid([1, -1, 1, -1]), "fewest").diagram.crossing_count()
    0
    >>> simplify(from_braid([1, 1, 1]), 2, budget=50).reached
    False
    """
    budget = Budget.of(budget)
    if isinstance(target, Diagram):
        # a target diagram is an isotopy question: the module above this one answers it
        raise DiagramError("simplify toward a diagram with movies.diagram.simplify.simplify (or certify_isotopy)")
    goal = _goal(target)
    meter = Meter(budget)
    steps, stopped = descend(diagram, goal, meter, lift, carry=carry, extra=extra)
    end = steps[-1].diagram if steps else diagram
    reached = stopped == "goal" or (target == "fewest" and stopped == "exhausted")
    return SimplifyResult(diagram, [s.record for s in steps], end, reached, meter.used, stopped, target, None,
                          steps)
