"""s of oriented links, where the free part of Bar-Natan homology settles it.

Normalised as Beliakova–Wehrli: s(unlink of n) = 1 − n, s(L₁ ⊔ L₂) = s(L₁) + s(L₂) − 1,
s(∅) = 1. The free part of Bar-Natan homology over F[H] has one generator for each orientation
of the link; in homological degree 0 sit the given orientation o, its reverse, and the
orientations that reverse a sublink whose linking number with the rest is zero. When only o
and its reverse are there, the two generators sit at q = s − 1 and s + 1, as for knots. A split
diagram is cut into its pieces first (the disjoint-union formula), so unlinks and split unions
of knots are covered too.

What is not covered yet: a non-split piece with more than two free generators in degree 0
(a sublink of linking number zero with the rest, e.g. the Whitehead link); there
:class:`SNotComputedError` says so. That case needs the canonical class itself.

>>> from movies.diagram.constructors import unlink
>>> from movies.diagram.pd import from_pd
>>> link_s(unlink(3)), link_s(from_pd([[4, 2, 3, 1], [2, 4, 1, 3]]))  # positive Hopf link
(-2, 1)
"""

from __future__ import annotations

from movies.diagram.model import Diagram, assemble
from movies.homology.errors import FieldError, HomologyError
from movies.homology.graded import bar_natan_module
from movies.homology.khovanov import bar_natan_complex
from movies.homology.rings import parse_field


class SNotComputedError(HomologyError):
    """s of this link needs the canonical class, which this version does not compute."""


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


def _piece_s(piece: Diagram, p: int) -> int:
    final = bar_natan_complex(piece, "Z")
    free = bar_natan_module(final, p, degrees={0})["free"]
    degrees = sorted(q for (h, q), rank in free.items() if h == 0 for _ in range(rank))
    if len(degrees) == 2 and degrees[1] - degrees[0] == 2:
        return degrees[0] + 1
    if len(degrees) == 2:  # pragma: no cover - would contradict the structure of the free part
        raise HomologyError(f"internal error: free generators in degree 0 at q = {degrees}, not s - 1 and s + 1")
    raise SNotComputedError(
        f"s of this link is not computed yet: {len(degrees)} orientations share homological degree 0 "
        "(a sublink has linking number zero with the rest), and telling their classes apart needs "
        "the canonical class"
    )


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

    Raises
    ------
    SNotComputedError
        For a non-split piece in which several orientations besides the given one and its
        reverse sit in homological degree 0.
    """
    ring = parse_field(field)
    if ring.name == "Z":
        raise FieldError("s is defined over a field: use 'Q' or 'F<p>'")
    p = ring.p
    pieces = split_pieces(diagram) if not diagram.is_empty() else []
    return sum(_piece_s(piece, p) for piece in pieces) - (len(pieces) - 1)
