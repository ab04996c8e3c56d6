"""Reading PD codes: validation, orientation and crossing signs.

A PD code lists each crossing as four edge labels ``[a, b, c, d]`` read counterclockwise from
the incoming under-strand, so ``a -> c`` is the under-strand. The under-strand fixes the
orientation of every component that passes under somewhere. A component that is never under
is oriented so that its labels increase along it (wrapping from its largest to its smallest
label); when such a component has only two edges that is ambiguous, and the over-strand at the
first crossing of the code where it appears is taken to run from its smaller label to its larger.
The crossing is positive when the over-strand runs ``d -> b``.

>>> trefoil = from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]])
>>> trefoil.signs
{1: 1, 2: 1, 3: 1}
>>> from_pd([[1, 2, 3]])
Traceback (most recent call last):
...
movies.errors.PDCodeError: crossing 1 of the PD code has 3 labels, not 4
"""

from __future__ import annotations

from collections import Counter
from typing import Iterable, Sequence

from movies import limits
from movies.diagram.assembly import assemble
from movies.diagram.model import Diagram, DiagramError
from movies.errors import InternalError, PDCodeError


def normalize_pd(code: Iterable[Sequence[int]]) -> list[tuple[int, int, int, int]]:
    """Check the shape of a PD code: lists of four integer labels, each label exactly twice.

    >>> normalize_pd([[1, 1, 2, 2]])
    [(1, 1, 2, 2)]
    >>> normalize_pd([[1, 2, 3, 4]])
    Traceback (most recent call last):
    ...
    movies.errors.PDCodeError: labels 1, 2, 3, 4 occur once each; every label must occur exactly twice
    """
    try:
        rows = [list(row) for row in code]
    except TypeError:
        raise PDCodeError("a PD code is a list of crossings, each a list of four labels") from None
    limits.check("crossings", len(rows), f"the PD code has {len(rows)} crossings")
    result = []
    for index, row in enumerate(rows, start=1):
        if len(row) != 4:
            raise PDCodeError(f"crossing {index} of the PD code has {len(row)} labels, not 4")
        for label in row:
            if isinstance(label, bool) or not isinstance(label, int):
                raise PDCodeError(f"crossing {index} of the PD code has the label {label!r}; labels are integers")
        result.append(tuple(row))
    counts = Counter(label for row in result for label in row)
    once = sorted(label for label, n in counts.items() if n == 1)
    many = sorted(label for label, n in counts.items() if n > 2)
    if once:
        raise PDCodeError(
            f"label{'s' if len(once) > 1 else ''} {', '.join(map(str, once))} "
            f"occur{'s' if len(once) == 1 else ''} once{' each' if len(once) > 1 else ''}; "
            "every label must occur exactly twice"
        )
    if many:
        detail = ", ".join(f"{label} ({counts[label]} times)" for label in many)
        raise PDCodeError(f"label{'s' if len(many) > 1 else ''} {detail} occur{'' if len(many) > 1 else 's'} more than twice; every label must occur exactly twice")
    return result


def crossing_signs(code: Iterable[Sequence[int]]) -> list[int]:
    """The sign of each crossing of a PD code, in the code's order.

    >>> crossing_signs([[4, 1, 3, 2], [2, 3, 1, 4]])
    [-1, -1]
    """
    rows = normalize_pd(code)
    return _orient(rows)


def _orient(rows: list[tuple[int, int, int, int]]) -> list[int]:
    # Darts: (crossing index, position); strands pair positions 0-2 and 1-3.
    where: dict[int, list[tuple[int, int]]] = {}
    for index, row in enumerate(rows):
        for position, label in enumerate(row):
            where.setdefault(label, []).append((index, position))

    def across(dart: tuple[int, int]) -> tuple[int, int]:
        return (dart[0], (dart[1] + 2) % 4)

    def far_end(label: int, dart: tuple[int, int]) -> tuple[int, int]:
        first, second = where[label]
        return second if dart == first else first

    # head[(index, position)] is True when the edge at that dart arrives there.
    head: dict[tuple[int, int], bool] = {}
    visited: set[tuple[int, int]] = set()
    for index in range(len(rows)):
        for position in range(4):
            start = (index, position)
            if start in visited:
                continue
            # walk the component through this dart; record the darts as (arrive, leave) pairs
            walk: list[tuple[tuple[int, int], tuple[int, int]]] = []
            dart = start
            while dart not in visited:
                leave = across(dart)
                visited.add(dart)
                visited.add(leave)
                walk.append((dart, leave))
                label = rows[leave[0]][leave[1]]
                dart = far_end(label, leave)
            forward = _direction(rows, walk)
            for arrive, leave in walk:
                head[arrive] = forward
                head[leave] = not forward
    signs = []
    for index in range(len(rows)):
        if not head[(index, 0)]:
            raise InternalError("orientation pass broke the under-strand rule")  # pragma: no cover
        signs.append(+1 if head[(index, 3)] else -1)
    return signs


def _direction(rows, walk) -> bool:
    """True when the walk (as recorded) runs along the component's orientation."""
    votes = set()
    for arrive, leave in walk:
        if arrive[1] == 0:
            votes.add(True)
        elif leave[1] == 0:
            votes.add(False)
    if len(votes) == 2:
        labels = sorted({rows[d[0]][d[1]] for pair in walk for d in pair})
        shown = ", ".join(map(str, labels[:8])) + (", ..." if len(labels) > 8 else "")
        raise PDCodeError(
            f"the orientation is inconsistent on the component with edges {shown}: its "
            "under-strands run a -> c at some crossings and c -> a at others"
        )
    if votes:
        return votes.pop()
    # never under: labels increase along the orientation
    sequence = [rows[leave[0]][leave[1]] for _, leave in walk]
    labels = sorted(set(sequence))
    if len(sequence) == 2:
        # walk[0] is at the first crossing of the code on this component
        first_arrive, first_leave = walk[0]
        return rows[first_arrive[0]][first_arrive[1]] < rows[first_leave[0]][first_leave[1]]
    successor = {labels[i]: labels[(i + 1) % len(labels)] for i in range(len(labels))}
    if all(successor[sequence[i]] == sequence[(i + 1) % len(sequence)] for i in range(len(sequence))):
        return True
    if all(successor[sequence[(i + 1) % len(sequence)]] == sequence[i] for i in range(len(sequence))):
        return False
    raise PDCodeError(
        f"the component with edges {', '.join(map(str, labels))} never passes under, so its "
        "orientation comes from its labels, but they are not numbered consecutively along it"
    )


def from_pd(code: Iterable[Sequence[int]], loops: int = 0) -> Diagram:
    """A diagram from a PD code, with ``loops`` extra crossingless circles side by side.

    Edge names are the PD labels; crossings are named 1, 2, ... in the code's order;
    the crossingless circles get the next edge names. Split pieces are placed side by side
    (see :func:`movies.diagram.model.assemble`).

    >>> d = from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]], loops=1)
    >>> d.crossing_count(), d.component_count(), sorted(d.loops)
    (3, 2, [7])
    >>> from_pd([[1, 2, 2, 1], [3, 4, 4, 3]]).piece_count()
    2
    >>> from_pd([[1, 3, 2, 4], [2, 4, 1, 3]])
    Traceback (most recent call last):
    ...
    movies.errors.PDCodeError: the PD code is not planar: the piece through edges [1, 2, 3, 4] is not planar: 2 crossings, 4 edges and 2 faces give Euler characteristic 0, not 2
    """
    rows = normalize_pd(code)
    if not rows and not loops:
        raise PDCodeError("the PD code is empty; write the unknot or the unlink by name instead")
    signs = _orient(rows)
    crossings = {i + 1: row for i, row in enumerate(rows)}
    sign_map = {i + 1: s for i, s in enumerate(signs)}
    start = max((label for row in rows for label in row), default=0) + 1
    loop_names = range(start, start + loops)
    limits.check("components", loops, f"{loops} crossingless circles")
    try:
        diagram = assemble(crossings, sign_map, loop_names)
    except DiagramError as err:
        raise PDCodeError(f"the PD code is not planar: {err}") from None
    count = diagram.component_count()
    limits.check("components", count, f"the PD code has {count} components")
    return diagram
