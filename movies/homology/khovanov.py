"""Khovanov and Bar-Natan homology of a diagram, and Rasmussen's s-invariant of a knot.

Conventions (the project's): Kh(unknot) = q + q⁻¹; the positive trefoil has
Kh = q + q³ + t²q⁵ + t³q⁹ over Q and a Z/2 at t³q⁷ over Z; the graded Euler characteristic
is (q + q⁻¹)·V with t^(1/2) = -q; reduced homology through a basepoint is normalised so that
the unknot has homology 1 (for knots its Euler characteristic is V(q²)). Bar-Natan's theory
is A = R[H][X]/(X² - HX), deg H = -2. For a knot the free part of Bar-Natan homology over a
field F is F[H] ⊕ F[H] in homological degree 0 at q = s - 1 and s + 1, which defines s^F.

Everything is computed by the scanning algorithm of :mod:`movies.homology.scanning`. Over Q
the scan runs over Z (eliminating ±1 entries only, which keeps the inner loop in integers) and
the small final complex is finished over the rationals.

A long computation may be stopped with Ctrl-C: the functions keep no state besides caches of
finished pieces, so KeyboardInterrupt simply propagates and nothing half-built is left.

>>> from movies.diagram.pd import from_pd
>>> trefoil = from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]])
>>> khovanov_homology(trefoil)
{(0, 1): 1, (0, 3): 1, (2, 5): 1, (3, 9): 1}
>>> rasmussen_s(trefoil), rasmussen_s(trefoil, field="F2")
(2, 2)
>>> poincare_polynomial(trefoil, field="Z")
'q + q^3 + t^2 q^5 + t^3 q^9 + Z/2 t^3 q^7'
"""

from __future__ import annotations

from typing import Callable

from movies.diagram.scan_order import scan_order
from movies.diagram.model import Diagram
from movies.errors import FieldError, HomologyError, InternalError, NotAKnotError
from movies.homology.graded import bar_natan_module, khovanov_integral, khovanov_ranks
from movies.homology.rings import Ring, parse_field
from movies.homology.scanning import FinalComplex, finish, scan_complex

__all__ = [
    "khovanov_homology",
    "bar_natan_homology",
    "rasmussen_s",
    "poincare_polynomial",
    "bar_natan_complex",
    "S_DEGREES",
]

Progress = Callable[[int, int], None]

#: The homological degrees s is read from: Bar-Natan homology in degree 0 needs the complex in
#: degrees -1, 0 and 1 only, and the scan may leave out the rest (see ``scan_complex``).
S_DEGREES = (-1, 1)


def _diagram(diagram) -> Diagram:
    if isinstance(diagram, Diagram):
        return diagram
    from movies.diagram.pd import from_pd

    return from_pd(diagram)


def _signs(d: Diagram) -> tuple[int, int]:
    n = len(d.crossings)
    n_plus = sum(1 for s in d.signs.values() if s > 0)
    return n_plus, n - n_plus


def _with_loops(final: FinalComplex, loops: int) -> FinalComplex:
    """Tensor with ∅{+1} ⊕ ∅{-1} once for each crossingless circle."""
    gens, entries = final.generators, final.entries
    for _ in range(loops):
        n = len(gens)
        gens = [(h, q + 1) for h, q in gens] + [(h, q - 1) for h, q in gens]
        entries = {**entries, **{(i + n, j + n): c for (i, j), c in entries.items()}}
    return FinalComplex(gens, entries)


def bar_natan_complex(diagram, field: str = "Z", progress: Progress | None = None,
                      degrees: tuple[int, int] | None = None) -> FinalComplex:
    """The simplified Bar-Natan complex of a diagram, over Z (also for Q) or F_p.

    Parameters: a :class:`~movies.diagram.model.Diagram` (or a PD code); ``field``; an optional
    ``progress(done, total)`` callback; ``degrees``, a pair ``(lo, hi)`` of homological degrees
    when only that part of the complex is wanted (homology is then right in ``lo + 1 .. hi - 1``;
    :data:`S_DEGREES` for s). Returns a :class:`~movies.homology.scanning.FinalComplex`.

    >>> from movies.diagram.pd import from_pd
    >>> bar_natan_complex(from_pd([[4, 1, 3, 2], [2, 3, 1, 4]])).generators
    [(-2, -6), (-2, -4), (0, -2), (0, 0)]
    >>> bar_natan_complex(from_pd([[4, 1, 3, 2], [2, 3, 1, 4]]), degrees=(-1, 1)).generators
    [(0, -2), (0, 0)]
    """
    d = _diagram(diagram)
    ring = parse_field(field)
    if ring.name == "Q":
        ring = Ring("Z", 0)
    pd = [tuple(c) for c in d.pd_code()]
    n_plus, n_minus = _signs(d)
    window = None if degrees is None else (degrees[0] + n_minus, degrees[1] + n_minus)
    cx = scan_complex(pd, ring, scan_order(pd), progress, degrees=window)
    return _with_loops(finish(cx, n_plus, n_minus), d.loop_count())


def _reduced_complex(d: Diagram, ring: Ring, basepoint, progress) -> FinalComplex:
    """The reduced complex (H = 0): the marked edge is cut, the arc left at the end is read
    through the basepoint, where a dot acts as 0."""
    pd = [tuple(c) for c in d.pd_code()]
    labels = sorted({label for c in pd for label in c})
    if not pd:
        if not d.loop_count():
            raise HomologyError("the empty diagram has no basepoint for reduced homology")
        return _with_loops(FinalComplex([(0, 0)], {}), d.loop_count() - 1)
    if basepoint is not None and basepoint not in labels:
        raise HomologyError(f"the basepoint {basepoint!r} is not an edge through a crossing "
                            f"(edges: {labels})")
    order = scan_order(pd)
    # A basepoint may slide along its component without changing reduced homology; the cut
    # edge stays on the boundary to the end, so put it at the last crossing of the scan.
    last = pd[order[-1]]
    if basepoint is None:
        basepoint = last[0]
    else:
        component = next(edges for edges in d.components.values() if basepoint in edges)
        basepoint = next((e for e in last if e in component), basepoint)
    fresh = labels[-1] + 1
    # cut the marked edge: its first occurrence gets a new label, so it stays on the boundary
    cut = [list(c) for c in pd]
    for c in cut:
        if basepoint in c:
            c[c.index(basepoint)] = fresh
            break
    cut = [tuple(c) for c in cut]
    cx = scan_complex(cut, ring, order, progress)
    n_plus, n_minus = _signs(d)
    return _with_loops(finish(cx, n_plus, n_minus, without_h=True), d.loop_count())


def khovanov_homology(diagram, field: str = "Q", reduced: bool = False, basepoint=None,
                      progress: Progress | None = None):
    """Khovanov homology of a link diagram.

    Parameters: a :class:`~movies.diagram.model.Diagram` (or a PD code); ``field``: ``"Q"``,
    ``"Z"`` or ``"F<p>"``; ``reduced``: reduced homology through a basepoint on the edge
    ``basepoint`` (only its component matters; for a link give it, the default is an edge at
    the last crossing the scan adds); ``progress(done, total)``,
    called after each crossing.
    Returns {(i, j): dimension} over a field; over Z
    {"free": {(i, j): rank}, "torsion": {(i, j): {order: count}}}.

    >>> from movies.diagram.pd import from_pd
    >>> trefoil = from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]])
    >>> khovanov_homology(trefoil, field="Z")["torsion"]
    {(3, 7): {2: 1}}
    >>> khovanov_homology(trefoil, reduced=True)
    {(0, 2): 1, (2, 6): 1, (3, 8): 1}
    """
    d = _diagram(diagram)
    ring = parse_field(field)
    scan_ring = Ring("Z", 0) if ring.name == "Q" else ring
    if reduced:
        final = _reduced_complex(d, scan_ring, basepoint, progress)
    else:
        final = bar_natan_complex(d, scan_ring.name, progress)
    if ring.name == "Z":
        return khovanov_integral(final)
    return khovanov_ranks(final, ring.p)


def bar_natan_homology(diagram, field: str = "Q", progress: Progress | None = None) -> dict:
    """Bar-Natan homology over F[H] for a field F (``"Q"`` or ``"F<p>"``).

    Returns {"free": {(i, j): rank}, "torsion": {(i, j): {k: count}}}: free summands F[H]
    generated in bidegree (i, j), and summands F[H]/(H^k) generated there.

    >>> from movies.diagram.pd import from_pd
    >>> bar_natan_homology(from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]]))["free"]
    {(0, 1): 1, (0, 3): 1}
    """
    ring = parse_field(field)
    if ring.name == "Z":
        raise FieldError("Bar-Natan homology is computed over F[H] for a field F; Z[H] is not "
                         "a principal ideal domain (use 'Q' or 'F<p>')")
    final = bar_natan_complex(diagram, "Z" if ring.name == "Q" else ring.name, progress)
    return bar_natan_module(final, ring.p)


def rasmussen_s(diagram, field: str = "Q", progress: Progress | None = None) -> int:
    """Rasmussen's invariant s^F of a knot, from Bar-Natan homology over F[H].

    The free part is two copies of F[H] in homological degree 0 at q = s - 1 and s + 1.
    Raises :class:`NotAKnotError` for a diagram of several components (or none).

    >>> from movies.diagram.pd import from_pd
    >>> rasmussen_s(from_pd([[4, 2, 5, 1], [8, 6, 1, 5], [6, 3, 7, 4], [2, 7, 3, 8]]))  # 4_1
    0
    """
    d = _diagram(diagram)
    if d.component_count() != 1:
        raise NotAKnotError(
            f"s is computed here for knots only; this diagram has {d.component_count()} "
            "components")
    ring = parse_field(field)
    if ring.name == "Z":
        raise FieldError("s is defined over a field: use 'Q' or 'F<p>'")
    final = bar_natan_complex(d, "Z" if ring.name == "Q" else ring.name, progress, S_DEGREES)
    return s_from_complex(final, ring.p)


def s_from_complex(final: FinalComplex, p: int) -> int:
    """s of a knot from its final Bar-Natan complex, over Q (p = 0) or F_p.

    The complex may be the one computed over Z: tensoring it with the field gives the
    complex over that field. Raises an internal error when the free part is not two copies of
    F[H] two apart in degree 0 (Rasmussen's theorem says it is, for every knot).

    >>> from movies.diagram.constructors import from_braid
    >>> final = bar_natan_complex(from_braid([1, 1, 1]), "Z")
    >>> s_from_complex(final, 0), s_from_complex(final, 2)
    (2, 2)

    References
    ----------
    J. Rasmussen, "Khovanov homology and the slice genus" (2010); D. Bar-Natan, "Khovanov's
    homology for tangles and cobordisms" (2005), for the theory over F[H].
    """
    free = bar_natan_module(final, p, degrees={0})["free"]  # s needs degree 0 only
    degrees = sorted(q for (h, q), r in free.items() for _ in range(r))
    if len(degrees) != 2 or any(h != 0 for h, _ in free) or degrees[1] - degrees[0] != 2:
        raise InternalError(f"the free part of Bar-Natan homology of a knot is "
                            f"{free}, not two copies of F[H] at q = s - 1, s + 1")
    return degrees[0] + 1


def _monomial(i: int, j: int) -> str:
    parts = []
    if i:
        parts.append("t" if i == 1 else f"t^{i}")
    if j:
        parts.append("q" if j == 1 else f"q^{j}")
    return " ".join(parts) or "1"


def poincare_polynomial(diagram, field: str = "Q", reduced: bool = False,
                        progress: Progress | None = None) -> str:
    """Khovanov homology written as a polynomial in t (homological) and q (quantum degree).

    Over a field each term is ``rank t^i q^j``; over Z the torsion follows as ``Z/n t^i q^j``
    (with a count in front when there are several).

    >>> from movies.diagram.pd import from_pd
    >>> poincare_polynomial(from_pd([[4, 1, 3, 2], [2, 3, 1, 4]]))
    't^-2 q^-6 + t^-2 q^-4 + q^-2 + 1'
    """
    result = khovanov_homology(diagram, field, reduced, progress=progress)
    if "free" in result:
        free, torsion = result["free"], result["torsion"]
    else:
        free, torsion = result, {}
    terms = []
    for (i, j), r in sorted(free.items()):
        terms.append((f"{r} " if r > 1 else "") + _monomial(i, j))
    for (i, j), orders in sorted(torsion.items()):
        for n, count in sorted(orders.items()):
            terms.append((f"{count} " if count > 1 else "") + f"Z/{n} " + _monomial(i, j))
    return " + ".join(terms) if terms else "0"
