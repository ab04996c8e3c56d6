"""Where a move happens: the edges, faces and crossings a statement names in the frame before it.

>>> from movies.diagram.pd import from_pd
>>> from movies.language.movie import Statement
>>> trefoil = from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]])
>>> place_of(Statement("R2+", 1, 1, "R2 add 1 over 3 in face 5", {"over": 1, "under": 3, "face": 5}), trefoil)
Highlight(edges=(1, 3), faces=(5,), crossings=())
"""

from __future__ import annotations

from movies.diagram import moves
from movies.diagram.model import Diagram
from movies.draw.svg import Highlight
from movies.errors import InternalError, MoviesError
from movies.language.movie import Statement


def _band_face(diagram: Diagram, first: int, second: int, face: int | None) -> tuple[int, ...]:
    if face is not None:
        return (face,)
    try:
        shared = moves.common_faces(diagram, first, second)
    except InternalError:
        raise
    except MoviesError:
        return ()
    return tuple(shared[:1]) if len(shared) == 1 else tuple(shared)


def place_of(statement: Statement, diagram: Diagram) -> Highlight:
    """The place of a move in the frame it acts on (an empty highlight for searches and claims).

    Parameters: a move statement from :mod:`movies.language.movie` and the frame before it.
    Returns a :class:`~movies.draw.svg.Highlight`: a band's two edges and its face, a new
    kink's edge and the face it goes into, the crossing (and loop) of a kink that goes, the
    two edges and the face of a new bigon, the bigon that goes and its crossings, the triangle
    of a third move and its crossings, the face where a circle is born, the circle that dies,
    the edges a twist's gate crosses and the faces it runs through.
    Names the frame does not have are kept; the drawing ignores them.

    >>> from movies.diagram.constructors import unlink
    >>> place_of(Statement("death", 1, 1, "death 2", {"component": 2}), unlink(2))
    Highlight(edges=(2,), faces=(), crossings=())
    """
    a, kind = statement.args, statement.kind
    try:
        if kind == "band":
            return Highlight(edges=(a["first"], a["second"]), faces=_band_face(diagram, a["first"], a["second"], a.get("face")))
        if kind == "R1+":
            left, right = diagram.faces_beside(a["edge"])
            return Highlight(edges=(a["edge"],), faces=(int(left if a["hand"] == "L" else right),))
        if kind == "R1-":
            loops = (a["kink"],) if a.get("kink") is not None else tuple(moves.kinks_at(diagram, a["crossing"]))
            return Highlight(edges=loops, crossings=(a["crossing"],))
        if kind == "R2+":
            return Highlight(edges=(a["over"], a["under"]), faces=(a["face"],))
        if kind in ("R2-", "R3"):
            return Highlight(faces=(a["face"],), crossings=tuple(sorted(set(diagram.face_crossings(a["face"])))))
        if kind == "birth":
            return Highlight(faces=(a["face"],))
        if kind == "death":
            return Highlight(edges=tuple(diagram.components.get(a["component"], ())))
        if kind == "twist":
            # the gate: the edges it crosses and the faces it runs through
            try:
                faces = moves.twist(diagram, a["edges"], a["turns"], a.get("start_face")).gate_faces
            except InternalError:
                raise
            except MoviesError:
                faces = ()
            return Highlight(edges=tuple(a["edges"]), faces=tuple(faces))
    except InternalError:
        raise
    except MoviesError:
        # the statement names something the frame lacks (an invalid step): mark what can be marked
        return Highlight(edges=tuple(v for k, v in a.items() if k in ("edge", "first", "second", "over", "under"))
                         + tuple(a.get("edges", ())),
                         faces=tuple(v for k, v in a.items() if k == "face" and v is not None),
                         crossings=tuple(v for k, v in a.items() if k == "crossing"))
    return Highlight()
