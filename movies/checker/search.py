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

#: seconds a search may take unless the movie or the command line says otherwise
DEFAULT_BUDGET = 5.0


@dataclass(frozen=True)
class Simplified:
    diagram: Diagram
    reached: bool
    moves: tuple[str, ...]


@dataclass(frozen=True)
class Certification:
    certified: bool
    moves: tuple[str, ...] = ()
    components: dict = field(default_factory=dict)  # component of the frame -> component of the claim


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


def simplify_frame(frame: Diagram, target: dict, budget: float) -> Simplified:
    """Run the search toward a simplify step's target."""
    kind = target["target"]
    goal = {"fewest": "fewest", "crossingless": "crossingless"}.get(kind)
    if kind == "crossings":
        goal = target["crossings"]
    elif kind == "diagram":
        goal = target["diagram"]
    from movies.diagram import simplify as engine

    result = engine.simplify(frame, target=goal, budget=budget)
    return Simplified(result.diagram, bool(result.reached), tuple(engine.describe(m) for m in result.moves))


def certify(frame: Diagram, claimed: Diagram, budget: float) -> Certification:
    """Try to prove that ``frame`` is isotopic to ``claimed``; maps components when it does."""
    for candidate in (claimed, reflect_and_switch(claimed)):
        match = isomorphism(frame, candidate)
        if match is not None:
            return Certification(True, (), dict(match["components"]))
    from movies.diagram import simplify as engine

    certificate = engine.certify_isotopy(frame, claimed, budget=budget)
    if certificate is None:
        return Certification(False)
    return Certification(True, tuple(engine.describe(m) for m in certificate.moves), dict(certificate.components))
