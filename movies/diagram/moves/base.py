"""What every move shares: the names a caller may choose, the naming rule, the checks.

A move names what it creates with the smallest names above every name of their kind in the
frame before it, in the order the move documents, unless the caller passes :class:`NewNames`.
"""

from __future__ import annotations

import functools
from dataclasses import dataclass

from movies.diagram.assembly import Hints, assemble
from movies.errors import NameInUseError

from movies.diagram.model import Dart, Diagram, Side
from movies.errors import DiagramError, InternalError, MoveError


@dataclass(frozen=True, order=True)
class NewNames:
    """Names the caller chooses for what a move creates, used in the move's documented order.

    >>> NewNames(edges=(20, 21)).edges
    (20, 21)
    """

    edges: tuple[int, ...] = ()
    crossings: tuple[int, ...] = ()
    faces: tuple[int, ...] = ()
    components: tuple[int, ...] = ()


class _Namer:
    def __init__(self, diagram: Diagram, names: NewNames | None) -> None:
        self.diagram = diagram
        self.names = names or NewNames()
        self.used = {"edge": set(diagram.edges()), "crossing": set(diagram.crossings)}
        self.chosen = {"edge": list(self.names.edges), "crossing": list(self.names.crossings)}
        self.floor = {kind: max(used, default=0) for kind, used in self.used.items()}

    def new(self, kind: str) -> int:
        if self.chosen[kind]:
            name = self.chosen[kind].pop(0)
            if name in self.used[kind]:
                raise MoveError(f"the chosen {kind} name {name} is already in use")
        else:
            name = max(max(self.used[kind], default=0), self.floor[kind]) + 1
        self.used[kind].add(name)
        return name

    def hints(self, **kwargs) -> Hints:
        return Hints(face_names=self.names.faces, component_names=self.names.components, **kwargs)


def _move(function):
    """Report an unknown name (a DiagramError from a lookup) as a MoveError of the move."""

    @functools.wraps(function)
    def checked(*args, **kwargs):
        try:
            return function(*args, **kwargs)
        except MoveError:
            raise
        except DiagramError as err:
            raise MoveError(str(err)) from None

    return checked


def _rebuild(previous: Diagram, crossings, signs, loops, hints: Hints) -> Diagram:
    try:
        return assemble(crossings, signs, loops, previous=previous, hints=hints)
    except NameInUseError as err:
        raise MoveError(str(err)) from None
    except DiagramError as err:  # pragma: no cover - a move that breaks planarity is a bug
        raise InternalError(f"the move produced an invalid diagram: {err}") from err


def _check_edge(diagram: Diagram, edge: int) -> None:
    if edge not in diagram.loops and edge not in diagram.edge_ends:
        raise MoveError(f"edge {edge} is not in the diagram (edges: {diagram.edges()})")


def _check_hand(hand: str) -> str:
    if hand not in ("L", "R"):
        raise MoveError(f'the side of an edge is "L" or "R", not {hand!r}')
    return hand


def _side_in_face(diagram: Diagram, edge: int, face: int) -> str:
    diagram.face(face)
    hands = [hand for hand in "LR" if diagram.side_face[Side(edge, hand)] == face]
    if not hands:
        left, right = diagram.faces_beside(edge)
        raise MoveError(f"edge {edge} does not border face {face} (it lies between faces {int(left)} and {int(right)})")
    return hands[0]


def _relabel_dart(crossings: dict, dart: Dart, label: int) -> None:
    labels = list(crossings[dart.crossing])
    labels[dart.position] = label
    crossings[dart.crossing] = tuple(labels)
