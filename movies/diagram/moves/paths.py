"""A band along a path: its core leaves one edge, runs through faces crossing other edges over or
under, and reaches another edge.

The band is performed as what it is up to isotopy: a finger of the first edge pushed along the
path, over or under each edge it crosses (one Reidemeister II move each), then the band across
the last face. So the surface is one saddle, as for a band across one face, and the frame it
leaves is that of the finger and the band. A band across one face is the path that crosses
nothing.

Names: each crossing of the path makes two crossings, two faces (a bigon and the part of the face
beyond) and edges as :func:`~movies.diagram.moves.reidemeister.r2_add` names them, in the order
of the path; then the band names what it makes as :func:`~movies.diagram.moves.morse.saddle`
does.

>>> from movies.diagram.constructors import from_braid
>>> nested = from_braid([], 3)  # three nested circles: a band from circle 1 over circle 2 to circle 3
>>> result = path_band(nested, 1, 3, ((2, True),))
>>> result.effect, result.diagram.component_count(), result.diagram.crossing_count(), result.faces
('merge', 2, 2, (2, 3))
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Sequence

from movies.diagram.model import Diagram
from movies.diagram.moves.base import NewNames, _check_edge
from movies.diagram.moves.morse import SaddleResult, saddle
from movies.diagram.moves.reidemeister import r1_add, r2_add
from movies.errors import MoveError

__all__ = ["PathBand", "path_band", "path_faces"]


@dataclass(frozen=True)
class PathBand:
    """The band's outcome (as :class:`SaddleResult`) and the faces of the frame before it that the path runs through."""

    saddle: SaddleResult
    faces: tuple[int, ...]

    @property
    def diagram(self) -> Diagram:
        return self.saddle.diagram

    @property
    def effect(self) -> str:
        return self.saddle.effect


def path_faces(diagram: Diagram, first: int, second: int, path: Sequence[tuple[int, bool]],
               face: int | None = None) -> tuple[int, ...]:
    """The faces the path runs through, from the one beside ``first`` to the one beside ``second``.

    Raises :class:`~movies.errors.MoveError` saying why there is no such path.

    >>> from movies.diagram.constructors import from_braid
    >>> path_faces(from_braid([], 3), 1, 3, ((2, False),))
    (2, 3)
    """
    _check_edge(diagram, first)
    _check_edge(diagram, second)
    crossed = [edge for edge, _ in path]
    for edge in crossed:
        _check_edge(diagram, edge)
    if len(set(crossed)) != len(crossed) or {first, second} & set(crossed):
        raise MoveError(f"a band's path crosses each edge at most once, and not the edges it joins "
                        f"(edges {first} and {second}; crossed {', '.join(map(str, crossed))})")
    target = crossed[0] if crossed else second
    beside = [f for f in dict.fromkeys(diagram.faces_beside(first)) if f in diagram.faces_beside(target)]
    if face is not None:
        if face not in diagram.faces_beside(first):
            raise MoveError(f"face {face} is not beside edge {first} (it lies between faces "
                            f"{' and '.join(map(str, diagram.faces_beside(first)))})")
        if face not in beside:
            raise MoveError(f"the path cannot start in face {face}: edge {target} does not border it")
        beside = [face]
    if not beside:
        raise MoveError(f"edges {first} and {target} do not border a common face, so the path cannot start")
    if len(beside) > 1:
        raise MoveError(f"the path can start in face {beside[0]} or face {beside[1]}; name it with 'in face F'")
    faces = [beside[0]]
    for index, edge in enumerate(crossed):
        left, right = diagram.faces_beside(edge)
        here = faces[-1]
        beyond = right if here == left else left
        upcoming = crossed[index + 1] if index + 1 < len(crossed) else second
        if beyond not in diagram.faces_beside(upcoming):
            raise MoveError(f"after crossing edge {edge} the path is in face {beyond}, which edge {upcoming} "
                            f"does not border (it lies between faces {' and '.join(map(str, diagram.faces_beside(upcoming)))})")
        faces.append(beyond)
    return tuple(faces)


#: the sign of the kinks that make right-handed half twists (three of them on an unknot's band
#: give the right-handed trefoil; tested against the knot table)
RIGHT_HANDED_KINK = -1


def path_band(diagram: Diagram, first: int, second: int, path: Sequence[tuple[int, bool]],
              face: int | None = None, names: NewNames | None = None, twists: int = 0) -> PathBand:
    """A band from edge ``first`` to edge ``second`` whose core crosses the edges of ``path`` in
    order, each over (``True``) or under (``False``).

    Parameters
    ----------
    diagram : Diagram
    first, second : int
        The edges the band joins.
    path : sequence of (int, bool)
        The edges the core crosses, in order, and whether it passes over each.
    face : int, optional
        The face beside ``first`` where the path starts, when both would do.
    names : NewNames, optional
        Names for what the final band makes (the finger's moves name theirs in order).
    twists : int
        Half twists of the band, right-handed for positive numbers: made as kinks of the finger's
        tip in the last face, the band leaving from the last kink's loop (its two sides then cross
        once at each kink).

    Returns
    -------
    PathBand
    """
    from movies.diagram.constructors import mirror

    faces = path_faces(diagram, first, second, path, face)
    tip, here, current = first, faces[0], diagram
    for edge, over in path:
        before_edges, before_faces = set(current.edges()), set(current.faces)
        if over:
            current = r2_add(current, tip, edge, here)
        else:  # under: the same finger in the mirror image, which keeps every name
            current = mirror(r2_add(mirror(current), tip, edge, here))
        made_edges = sorted(set(current.edges()) - before_edges)
        made_faces = sorted(set(current.faces) - before_faces)
        tip = made_edges[0]  # r2_add names the pushed edge's stretch between the crossings first
        bigon = made_faces[0]
        here = next(f for f in current.faces_beside(tip) if f != bigon)
    for _ in range(abs(twists)):
        left, _right = current.faces_beside(tip)
        before_edges = set(current.edges())
        current = r1_add(current, tip, "L" if here == left else "R", RIGHT_HANDED_KINK if twists > 0 else -RIGHT_HANDED_KINK)
        tip = min(set(current.edges()) - before_edges)  # r1_add names the kink's loop first
    return PathBand(saddle(current, tip, second, here, names), faces)
