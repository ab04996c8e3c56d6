"""The checker's use of the Reidemeister search: simplify steps and isotopy claims.

Thin glue between the movie's statements and :mod:`movies.diagram.simplify`; the search itself
lives there. Moves found are reported as text a user can paste back into a movie.

>>> from movies.diagram.constructors import unknot
>>> certify(unknot(), unknot(), 1).certified
True
"""

from __future__ import annotations

from dataclasses import dataclass, field

from movies.diagram.isotopy import isomorphism, reflect_and_switch
from movies.diagram.model import Diagram
from movies.errors import MoveError

#: seconds a search may take unless the movie or the command line says otherwise
DEFAULT_BUDGET = 5.0


@dataclass(frozen=True)
class Simplified:
    diagram: Diagram
    reached: bool
    moves: tuple[str, ...]
    why: str = ""  # why the search stopped short of its target (empty when it reached it)
    records: tuple = ()  # the moves as MoveRecords, in order


@dataclass(frozen=True)
class Certification:
    certified: bool
    moves: tuple[str, ...] = ()
    components: dict = field(default_factory=dict)  # component of the frame -> component of the claim
    why: str = ""  # why no certificate was found


def stop_reason(stopped: str | None, budget: float) -> str:
    """Why a search stopped without reaching its target, in the report's words.

    >>> stop_reason("seconds", 5.0)
    "it ran out of time (5 seconds; raise it with --budget or a 'budget N seconds' statement)"
    >>> stop_reason("exhausted", 5.0)
    'no sequence of Reidemeister moves within its bounds reaches it (it adds at most a few crossings before removing them)'
    """
    shown = f"{budget:g}"
    if stopped == "seconds":
        return f"it ran out of time ({shown} seconds; raise it with --budget or a 'budget N seconds' statement)"
    if stopped == "moves":
        return (f"it tried all {_budget(budget).moves} moves its budget of {shown} seconds allows "
                f"(raise it with --budget or a 'budget N seconds' statement)")
    return ("no sequence of Reidemeister moves within its bounds reaches it "
            "(it adds at most a few crossings before removing them)")


def describe_target(target: dict) -> str:
    """How a simplify target reads in a report.

    >>> describe_target({"target": "crossings", "crossings": 3})
    'at most 3 crossings'
    """
    kind = target["target"]
    if kind == "crossings":
        return f"at most {target['crossings']} crossings"
    if kind == "diagram":
        return target["spec"]
    return {"fewest": "the fewest crossings", "crossingless"
            : "a crossingless diagram"}[kind]


def _budget(seconds: float):
    from movies.diagram.simplify import Budget

    # moves are the real limit (so that a run can be repeated); seconds are the safety net
    return Budget(moves=max(200, int(300 * seconds)), seconds=float(seconds))


def simplify_frame(frame: Diagram, target: dict, budget: float, handles=None) -> Simplified:
    """Run the search toward a simplify step's target (a dict as the movie reader builds it).

    Parameters: the frame; ``target`` (``{"target": "fewest" | "crossingless" | "crossings" |
    "diagram", ...}``); the budget in seconds. Returns a :class:`Simplified`: the frame it
    reached, whether that is the target, the moves as movie lines, and why it stopped short. With
    ``handles`` (the frame's :class:`~movies.diagram.handles.HandleDiagram`) the search takes
    only moves that keep them.

    >>> from movies.diagram.constructors import from_braid
    >>> found = simplify_frame(from_braid([1, -1]), {"target": "crossingless"}, 1)
    >>> found.reached, found.moves
    (True, ('R2 remove face 1',))
    """
    kind = target["target"]
    goal = {"fewest": "fewest", "crossingless": "crossingless"}.get(kind)
    if kind == "crossings":
        goal = target["crossings"]
    elif kind == "diagram":
        goal = target["diagram"]
    from movies.diagram import simplify as engine

    carry = None
    if handles is not None:
        if kind == "diagram":
            raise MoveError("in a movie with handles, 'simplify to' takes a crossing count or 'crossingless'; "
                            "for a diagram write 'isotopic to DIAGRAM with handle across ...'")
        from movies.diagram.handles import carried, pieces, swept

        def carry(link, before, record, after):
            return carried(link, after, pieces(record, before, after), sweeps=swept(record, before, after))

    result = engine.simplify(frame, target=goal, budget=_budget(budget), carry=carry, extra=handles)
    why = "" if result.reached else stop_reason(result.stopped, budget)
    return Simplified(result.diagram, bool(result.reached), tuple(str(m) for m in result.moves), why,
                      tuple(result.moves))


def certify(frame: Diagram, claimed: Diagram, budget: float) -> Certification:
    """Try to prove that ``frame`` is isotopic to ``claimed``; maps components when it does.

    Parameters: the two diagrams and the budget in seconds. Returns a :class:`Certification`:
    the moves (movie lines) from ``frame`` to ``claimed`` and the components matched, or, when
    none was found, why the search stopped (which says nothing about whether they are isotopic).

    >>> from movies.diagram.constructors import from_braid, unlink
    >>> certify(from_braid([1, -1]), unlink(2), 1).certified
    True
    """
    for candidate in (claimed, reflect_and_switch(claimed)):
        match = isomorphism(frame, candidate)
        if match is not None:
            return Certification(True, (), dict(match["components"]))
    from movies.diagram.simplify.certify import certify_within
    from movies.diagram.simplify.search import Meter

    meter = Meter(_budget(budget))
    certificate = certify_within(frame, claimed, meter)
    if certificate is None:
        return Certification(False, why=stop_reason(meter.stopped, budget))
    return Certification(True, tuple(str(m) for m in certificate.moves),
                         dict(certificate.names["components"]))
