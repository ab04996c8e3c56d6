"""The canonical class of an orientation, carried to the end of the scan, and s from it.

In the oriented resolution of a diagram (every crossing smoothed along the orientation: the
0-smoothing at a positive crossing, the 1-smoothing at a negative one) label each Seifert circle
X or X − H by the checkerboard colour of the region on the left of its strands. Circles that
meet at a crossing have regions of opposite colours on their left, so the labels differ there,
X·(X − H) = 0, and the product of the labels is a cycle α_o of homological degree 0 and q-degree
w − O. Swapping the colours gives the class of the reversed orientation.

Sano (2018): s = 2k + w − O + 1, with k the largest power of H that divides [α_o] modulo
H-torsion. At H = 1 the graded complex over F[H] becomes Lee's filtered complex, torsion dies,
and k becomes the filtration level: s − 1 is the largest q such that α_o is homologous to a
chain in the span of the generators of q-degree ≥ q. That is what :func:`canonical_s` computes,
over Q or F_p, with α_o carried through the scan (:class:`~movies.homology.scanning.CarriedClass`)
and the boundaries row-reduced by their lowest q-degree.

The method never looks at which other orientations share homological degree 0, so it is exact
for links with sublinks of linking number zero, split links and unlinks alike.

>>> from movies.diagram.pd import from_pd
>>> trefoil = from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]])
>>> canonical_s(trefoil), canonical_s(trefoil, "F2")
(2, 2)
"""

from __future__ import annotations

from dataclasses import dataclass
from fractions import Fraction

from movies.diagram.scan_order import scan_order
from movies.diagram.model import Diagram
from movies.errors import HomologyError, InternalError
from movies.homology.rings import Ring, parse_field
from movies.homology.scanning import CarriedClass, FinalComplex, finish, scan_complex

__all__ = ["CanonicalComplex", "canonical_complex", "canonical_chain", "read_canonical", "canonical_s", "s_from_canonical", "checkerboard"]


@dataclass
class CanonicalComplex:
    """The simplified Bar-Natan complex over Z with the canonical cycle in it.

    ``final`` is the complex (shifts applied); ``cycle`` maps generator indices to the integer
    coefficients of α_o at H = 1; ``q`` is its q-degree w − O.
    """

    final: FinalComplex
    cycle: dict[int, int]
    q: int


def checkerboard(diagram: Diagram) -> dict[int, int]:
    """A colouring of the faces by 0 and 1 in which faces across an edge differ.

    Faces that hold several split pieces are one region of the sphere, so the colouring is of
    the whole diagram; the face of the smallest name gets 0.

    >>> from movies.diagram.pd import from_pd
    >>> colours = checkerboard(from_pd([[4, 1, 3, 2], [2, 3, 1, 4]]))
    >>> sorted(colours.values())
    [0, 0, 1, 1]
    """
    neighbours: dict[int, set[int]] = {name: set() for name in diagram.faces}
    for edge in diagram.edges():
        left, right = diagram.faces_beside(edge)
        neighbours[left].add(right)
        neighbours[right].add(left)
    colour: dict[int, int] = {}
    for root in sorted(diagram.faces):
        if root in colour:
            continue
        colour[root] = 0
        stack = [root]
        while stack:
            face = stack.pop()
            for other in neighbours[face]:
                if other not in colour:
                    colour[other] = 1 - colour[face]
                    stack.append(other)
                elif colour[other] == colour[face]:  # pragma: no cover - a planar diagram is 2-colourable
                    raise InternalError(f"faces {face} and {other} cannot be coloured apart")
    return colour


def canonical_complex(diagram: Diagram, progress=None, degrees=None) -> CanonicalComplex:
    """The simplified complex over Z of a diagram with crossings, and α_o carried into it.

    Parameters
    ----------
    diagram : Diagram
        A diagram with at least one crossing and no crossingless circles (cut a split diagram
        into its pieces first).
    progress : callable, optional
        Called with (crossings added, total) after each crossing.
    degrees : (int, int), optional
        Only this range of homological degrees of the complex (s needs -1 to 1); see
        :func:`movies.homology.scanning.scan_complex`.

    Returns
    -------
    CanonicalComplex

    >>> from movies.diagram.pd import from_pd
    >>> hopf = canonical_complex(from_pd([[4, 2, 3, 1], [2, 4, 1, 3]]))
    >>> hopf.q, len(hopf.cycle) > 0
    (0, True)
    """

    if not diagram.crossings or diagram.loops:
        raise HomologyError("the canonical class is carried through diagrams whose every circle has a crossing")
    pd = [tuple(c) for c in diagram.pd_code()]
    n_plus = sum(1 for s in diagram.signs.values() if s > 0)
    n_minus = len(diagram.signs) - n_plus
    window = None if degrees is None else (degrees[0] + n_minus, degrees[1] + n_minus)
    cx = scan_complex(pd, Ring("Z", 0), scan_order(pd), progress, carried=[canonical_chain(diagram)], degrees=window)
    return read_canonical(finish(cx, n_plus, n_minus), diagram.writhe() - diagram.seifert_circle_count())


def canonical_chain(diagram: Diagram) -> CarriedClass:
    """α_o, ready to be carried through a scan of ``diagram``'s PD tuples (or of any diagram
    whose crossings are among them and whose faces are coloured alike, as in a family of twists):
    the oriented smoothing at each crossing, and the edges whose circles are labelled X − H.

    >>> from movies.diagram.pd import from_pd
    >>> sorted(canonical_chain(from_pd([[4, 2, 3, 1], [2, 4, 1, 3]])).smoothing.values())
    [0, 0]
    """
    smoothing = {diagram.crossings[name]: 0 if diagram.signs[name] > 0 else 1 for name in diagram.crossings}
    colour = checkerboard(diagram)
    minus_h = frozenset(edge for edge in diagram.edges() if colour[diagram.faces_beside(edge)[0]])
    return CarriedClass(smoothing, minus_h)


def read_canonical(final: FinalComplex, q: int) -> CanonicalComplex:
    """The final complex with the carried α_o, checked to be a cycle of degree (0, q = w − O)."""
    cycle = final.carried[0]
    _check_cycle(final, cycle, q)
    return CanonicalComplex(final, cycle, q)


def _check_cycle(final: FinalComplex, cycle: dict[int, int], q: int) -> None:
    """α_o must be a homogeneous cycle of degree (0, q); anything else is a bug here."""
    gens = final.generators
    for i in cycle:
        h, qi = gens[i]
        if h != 0 or qi < q or (qi - q) % 2:
            raise InternalError(f"the canonical class has a term at {(h, qi)}, not at q ≤ {q} in degree 0")
    image: dict[int, int] = {}
    for (i, j), c in final.entries.items():
        if i in cycle:
            image[j] = image.get(j, 0) + c * cycle[i]
    if any(image.values()):
        raise InternalError("the canonical class is not a cycle")


def s_from_canonical(canonical: CanonicalComplex, field: str = "Q") -> int:
    """s over a field from the complex and its canonical cycle (Sano's formula, at H = 1).

    Row-reduce the boundaries into degree 0 by their lowest-q generator, reduce α_o by them;
    the q-degree of the lowest generator left in α_o is s − 1.

    >>> from movies.diagram.pd import from_pd
    >>> s_from_canonical(canonical_complex(from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]])), "F3")
    2
    """
    ring = parse_field(field)
    if ring.name == "Z":
        raise HomologyError("s is defined over a field: use 'Q' or 'F<p>'")
    p = ring.p
    gens = canonical.final.generators
    # generators of degree 0 by (q, index): the lowest nonzero coordinate is the pivot
    rank = {i: r for r, i in enumerate(sorted((i for i, (h, _) in enumerate(gens) if h == 0), key=lambda i: (gens[i][1], i)))}
    norm = (lambda c: c % p) if p else Fraction
    boundaries: dict[int, dict[int, int]] = {}
    for (i, j), c in canonical.final.entries.items():
        if gens[i][0] == -1:
            boundaries.setdefault(i, {})[rank[j]] = c
    pivots: dict[int, dict] = {}
    for row in boundaries.values():
        vector = {k: norm(c) for k, c in row.items() if norm(c)}
        _reduce(vector, pivots, p)
        if vector:
            pivots[min(vector)] = vector
    alpha = {rank[i]: norm(c) for i, c in canonical.cycle.items() if norm(c)}
    _reduce(alpha, pivots, p)
    if not alpha:
        raise InternalError("the canonical class is a boundary in Lee homology")
    lowest = min(alpha)
    by_rank = {r: i for i, r in rank.items()}
    return gens[by_rank[lowest]][1] + 1


def _reduce(vector: dict, pivots: dict, p: int) -> None:
    """Clear the lowest coordinate of ``vector`` while some pivot row starts there."""
    while vector:
        low = min(vector)
        row = pivots.get(low)
        if row is None:
            return
        factor = vector[low] * (pow(row[low], -1, p) if p else 1 / row[low])
        for k, c in row.items():
            v = vector.get(k, 0) - factor * c
            if p:
                v %= p
            if v:
                vector[k] = v
            else:
                vector.pop(k, None)


def canonical_s(diagram: Diagram, field: str = "Q") -> int:
    """s of an oriented diagram with crossings and no crossingless circles, from α_o.

    >>> from movies.language.spec import parse_diagram
    >>> canonical_s(parse_diagram("L5a1{0}")), canonical_s(parse_diagram("mirror(L5a1{0})"))
    (-1, 1)
    """
    return s_from_canonical(canonical_complex(diagram, degrees=(-1, 1)), field)
