"""s of oriented links, from the canonical class of the orientation.

Normalised as Beliakova–Wehrli: s(unlink of n) = 1 − n, s(L₁ ⊔ L₂) = s(L₁) + s(L₂) − 1,
s(∅) = 1. A split diagram is cut into its pieces first (the disjoint-union formula); a
crossingless circle is an unknot (s = 0); every other piece gets s from its canonical class
(:mod:`movies.homology.canonical`), which is exact whatever other orientations share homological
degree 0 with the given one.

:func:`free_part_s` is the older route kept as a cross-check: when only the orientation and its
reverse sit in homological degree 0, the two free generators of Bar-Natan homology there sit
at q = s − 1 and s + 1, as for knots.

>>> from movies.diagram.constructors import unlink
>>> from movies.diagram.pd import from_pd
>>> link_s(unlink(3)), link_s(from_pd([[4, 2, 3, 1], [2, 4, 1, 3]]))  # positive Hopf link
(-2, 1)
"""

from __future__ import annotations

from movies.diagram.assembly import assemble

from movies.diagram.model import Diagram
from movies.homology.canonical import canonical_complex, s_from_canonical
from movies.homology.errors import FieldError
from movies.homology.graded import bar_natan_module
from movies.homology.khovanov import S_DEGREES, bar_natan_complex
from movies.homology.rings import parse_field

__all__ = ["link_s", "link_s_values", "free_part_s", "split_pieces"]


def split_pieces(diagram: Diagram) -> list[Diagram]:
    """The split pieces of a diagram, each as a diagram of its own (orientations kept).

    >>> from movies.diagram.constructors import unlink
    >>> [p.component_count() for p in split_pieces(unlink(2))]
    [1, 1]
    """
    result = []
    for piece in diagram.pieces():
        crossings = {name: labels for name, labels in diagram.crossings.items() if labels[0] in piece}
        signs = {name: diagram.signs[name] for name in crossings}
        loops = [edge for edge in diagram.loops if edge in piece]
        result.append(assemble(crossings, signs, loops))
    return result


def free_part_s(piece: Diagram, field: str = "Q") -> int | None:
    """s from the free part of Bar-Natan homology in degree 0, when that settles it.

    Returns None when more than two free generators sit in degree 0 (a sublink with linking
    number zero to the rest): their degrees alone cannot tell which class is the given one.

    >>> from movies.language.spec import parse_diagram
    >>> free_part_s(parse_diagram("L2a1{1}")), free_part_s(parse_diagram("L5a1{0}"))
    (1, None)
    """
    p = parse_field(field).p
    free = bar_natan_module(bar_natan_complex(piece, "Z", degrees=S_DEGREES), p, degrees={0})["free"]
    degrees = sorted(q for (h, q), rank in free.items() if h == 0 for _ in range(rank))
    if len(degrees) == 2 and degrees[1] - degrees[0] == 2:
        return degrees[0] + 1
    return None


def link_s_values(diagram: Diagram, fields=("Q",)) -> dict[str, int]:
    """s of an oriented link over several fields, from one scan over Z per split piece.

    Parameters
    ----------
    diagram : Diagram
        Any diagram; the empty one has s = 1.
    fields : iterable of str
        "Q", "F2", "F3", ...

    Returns
    -------
    dict
        field -> s, normalised as Beliakova–Wehrli.

    >>> from movies.language.spec import parse_diagram
    >>> link_s_values(parse_diagram("L5a1{0}"), ("Q", "F2"))
    {'Q': -1, 'F2': -1}
    """
    fields = list(fields)
    for name in fields:
        if parse_field(name).name == "Z":
            raise FieldError("s is defined over a field: use 'Q' or 'F<p>'")
    pieces = split_pieces(diagram) if not diagram.is_empty() else []
    totals = {name: 1 - len(pieces) for name in fields}
    for piece in pieces:
        if not piece.crossings:  # a crossingless circle: an unknot, s = 0
            continue
        canonical = canonical_complex(piece, degrees=S_DEGREES)
        for name in fields:
            totals[name] += s_from_canonical(canonical, name)
    return totals


def link_s(diagram: Diagram, field: str = "Q") -> int:
    """s of an oriented link over Q or F_p (Beliakova–Wehrli normalisation).

    Parameters
    ----------
    diagram : Diagram
        Any diagram; the empty one has s = 1.
    field : str
        "Q", "F2", "F3", ...

    Returns
    -------
    int

    >>> from movies.language.spec import parse_diagram
    >>> link_s(parse_diagram("L5a1{0}")), link_s(parse_diagram("mirror(L5a1{0})"), "F2")
    (-1, 1)
    """
    return link_s_values(diagram, (field,))[field]
