"""Random legal Reidemeister moves, from a fixed seed: diagrams to test a simplifier on.

>>> from movies.diagram.constructors import unknot
>>> d, steps = scramble(unknot(), 6, seed=1)
>>> d.crossing_count() >= 6, len(steps) > 0
(True, True)
"""

from __future__ import annotations

import random

from movies.diagram.model import Diagram
from movies.diagram.simplify.records import MoveRecord, apply, candidates

__all__ = ["scramble"]


def scramble(diagram: Diagram, crossings: int, seed: int, weights: tuple[int, int, int] = (1, 3, 3),
             shuffles: int = 0, hide: int = 1) -> tuple[Diagram, list[MoveRecord]]:
    """Random R1+, R2+ and R3 moves from ``diagram`` until it has at least ``crossings`` crossings.

    Parameters: the start; the crossing count to reach; ``seed`` for :class:`random.Random`;
    ``weights`` of R1+, R2+ and R3 when choosing the next kind (a kind that does not apply is
    skipped); ``shuffles``, R3 moves to make after the count is reached; ``hide``: draw that
    many moves of the chosen kind and make the one after which the fewest R1 and R2 removals
    apply (1: plain random moves; more: diagrams that greedy removal alone cannot undo, as
    their kinks and bigons get covered by the moves that follow). Returns the last
    frame and the moves (replayable from ``diagram``). Same inputs, same result.

    >>> from movies.diagram.constructors import unknot
    >>> scramble(unknot(), 4, seed=3) == scramble(unknot(), 4, seed=3)
    True
    """
    rng = random.Random(seed)
    moves: list[MoveRecord] = []
    current = diagram
    extra = shuffles
    while current.crossing_count() < crossings or extra > 0:
        if current.crossing_count() >= crossings:
            kinds = ["R3"]
            extra -= 1
        else:
            kinds = rng.choices(["R1+", "R2+", "R3"], weights=weights, k=1)
        options = candidates(current, kinds)
        if not options:
            continue
        best = None
        for record in [rng.choice(options) for _ in range(hide)]:
            after = apply(record, current)
            left = len(candidates(after, ("R1-", "R2-")))
            if best is None or left < best[0]:
                best = (left, record, after)
        _, record, current = best
        moves.append(record)
    return current, moves
