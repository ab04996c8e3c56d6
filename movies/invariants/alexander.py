"""The Alexander polynomial, the Conway polynomial and the determinant, from the Seifert matrix.

With ``V`` the Seifert matrix of the canonical surface (:mod:`movies.invariants.seifert`, of size
``m``), ``det(V - tVᵀ)`` is the Alexander polynomial up to a unit ``±t^k``.  Two normalisations:

``"conway"``
    ``Δ(t) = det(t^(-1/2)V - t^(1/2)Vᵀ)``, the one fixed by ``Δ(L₊) - Δ(L₋) = (t^(1/2) - t^(-1/2))Δ(L₀)``
    and ``Δ(unknot) = 1``: symmetric under ``t -> 1/t``, half-integral exponents for an even
    number of components, ``Δ(1) = 1`` for knots.  It is ``∇(t^(1/2) - t^(-1/2))`` for the Conway
    polynomial ``∇``.
``"table"``
    the same polynomial multiplied by ``±t^k`` so that its lowest exponent is 0 and its lowest
    coefficient is positive; this is how the knot table prints knots of at most 12 crossings
    (``3_1``: ``1-t+ t^2``, ``6_1``: ``2-5*t+ 2*t^2``).  The 13-crossing rows of that table use
    lowest exponent 0 with the sign of the Conway normalisation instead.

A split diagram has a disconnected canonical surface; its link is split and every Alexander
polynomial of it is 0 (join the pieces by tubes: each tube adds a class that links nothing).

The determinant is ``|Δ(-1)| = |det(V + Vᵀ)|`` (0 for split links).

>>> from movies.diagram.pd import from_pd
>>> trefoil = from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]])
>>> print(alexander_polynomial(trefoil))
1 - t + t^2
>>> print(alexander_polynomial(trefoil, "conway"))
t^(-1) - 1 + t
>>> print(conway_polynomial(trefoil))
1 + z^2
>>> determinant(trefoil)
3
"""

from __future__ import annotations

from fractions import Fraction
from typing import Sequence

from movies.algebra.laurent import LaurentPolynomial
from movies.diagram.model import Diagram
from movies.errors import DiagramError, InputError, InternalError
from movies.invariants.seifert import seifert_surface

__all__ = [
    "integer_determinant",
    "alexander_coefficients",
    "alexander_polynomial",
    "conway_polynomial",
    "determinant",
]

NORMALIZATIONS = ("table", "conway")


def integer_determinant(matrix: Sequence[Sequence[int]]) -> int:
    """The determinant of a square integer matrix, by fraction-free (Bareiss) elimination.

    >>> integer_determinant([[2, 1], [1, 2]]), integer_determinant([]), integer_determinant([[0, 1], [1, 0]])
    (3, 1, -1)
    """
    work = [list(map(int, row)) for row in matrix]
    size = len(work)
    sign, previous = 1, 1
    for k in range(size):
        if work[k][k] == 0:
            swap = next((i for i in range(k + 1, size) if work[i][k] != 0), None)
            if swap is None:
                return 0
            work[k], work[swap] = work[swap], work[k]
            sign = -sign
        pivot = work[k][k]
        for i in range(k + 1, size):
            for j in range(k + 1, size):
                work[i][j] = (work[i][j] * pivot - work[i][k] * work[k][j]) // previous
        previous = pivot
    return sign * work[size - 1][size - 1] if size else 1


def alexander_coefficients(seifert: Sequence[Sequence[int]]) -> list[int]:
    """Coefficients of ``det(V - tVᵀ)`` from degree 0 up (length ``m + 1``).

    The determinant has degree at most ``m``; it is evaluated exactly at ``t = 0, 1, ..., m``
    and interpolated.

    >>> alexander_coefficients([[-1, 0], [1, -1]])
    [1, -1, 1]
    """
    size = len(seifert)
    values = []
    for point in range(size + 1):
        values.append(integer_determinant(
            [[seifert[i][j] - point * seifert[j][i] for j in range(size)] for i in range(size)]))
    # Newton's divided differences at the nodes 0..m, then expand to monomials
    table = [Fraction(v) for v in values]
    newton = [table[0]]
    for level in range(1, size + 1):
        table = [(table[i + 1] - table[i]) / level for i in range(len(table) - 1)]
        newton.append(table[0])
    coefficients = [Fraction(0)] * (size + 1)
    basis = [Fraction(1)]  # Π_{i<level} (t - i)
    for level, weight in enumerate(newton):
        for i, c in enumerate(basis):
            coefficients[i] += weight * c
        following = [Fraction(0)] * (len(basis) + 1)
        for i, c in enumerate(basis):
            following[i + 1] += c
            following[i] -= level * c
        basis = following
    if any(c.denominator != 1 for c in coefficients):
        raise InternalError("non-integral Alexander coefficient")  # pragma: no cover
    return [int(c) for c in coefficients]


def _seifert_or_raise(diagram: Diagram):
    if diagram.is_empty():
        raise DiagramError("the empty diagram has no Alexander polynomial or determinant")
    return seifert_surface(diagram)


def alexander_polynomial(diagram: Diagram, normalization: str = "table") -> LaurentPolynomial:
    """The one-variable Alexander polynomial of the link, as a Laurent polynomial in ``t``.

    Parameters: ``diagram`` (not empty); ``normalization`` ``"table"`` (lowest exponent 0,
    lowest coefficient positive) or ``"conway"`` (symmetric, ``Δ(1) = 1`` for knots), see the
    module docstring.  Returns a :class:`~movies.algebra.laurent.LaurentPolynomial` (0 for a
    split diagram).

    >>> from movies.diagram.pd import from_pd
    >>> print(alexander_polynomial(from_pd([[4, 2, 3, 1], [2, 4, 1, 3]]), "conway"))
    -t^(-1/2) + t^(1/2)
    """
    if normalization not in NORMALIZATIONS:
        raise InputError(f"unknown normalization {normalization!r}; use one of {', '.join(NORMALIZATIONS)}")
    surface = _seifert_or_raise(diagram)
    if surface.pieces > 1:
        return LaurentPolynomial({}, "t")
    coefficients = alexander_coefficients(surface.matrix)
    size = len(surface.matrix)
    if normalization == "conway":
        shift = Fraction(-size, 2)
        return LaurentPolynomial({shift + i: c for i, c in enumerate(coefficients) if c}, "t")
    lowest = next((i for i, c in enumerate(coefficients) if c), None)
    if lowest is None:
        return LaurentPolynomial({}, "t")
    sign = 1 if coefficients[lowest] > 0 else -1
    return LaurentPolynomial({i - lowest: sign * c for i, c in enumerate(coefficients) if c}, "t")


def conway_polynomial(diagram: Diagram) -> LaurentPolynomial:
    """The Conway polynomial ``∇(z)``, with ``∇(t^(1/2) - t^(-1/2))`` the Conway-normalised Alexander polynomial.

    Parameters: ``diagram`` (not empty).  Returns a polynomial in ``z``; ``∇(unknot) = 1`` and
    ``∇(L₊) - ∇(L₋) = z∇(L₀)``, so the positive Hopf link has ``∇ = z``.

    >>> from movies.diagram.pd import from_pd
    >>> print(conway_polynomial(from_pd([[4, 2, 3, 1], [2, 4, 1, 3]])))
    z
    """
    delta = alexander_polynomial(diagram, "conway")
    # in x = t^(1/2): Δ is a Laurent polynomial in x; peel off c·(x - 1/x)^d from the top
    remaining = {int(2 * e): c for e, c in delta.terms()}
    result: dict[int, int] = {}
    while remaining:
        top = max(remaining)
        if top < 0:
            raise InternalError("Alexander polynomial is not Conway-symmetric")  # pragma: no cover
        c = remaining[top]
        result[top] = c
        # (x - 1/x)^top = Σ_i binom(top, i) (-1)^i x^(top - 2i)
        binomial = 1
        for i in range(top + 1):
            exponent = top - 2 * i
            remaining[exponent] = remaining.get(exponent, 0) - c * binomial * (-1) ** i
            if remaining[exponent] == 0:
                del remaining[exponent]
            binomial = binomial * (top - i) // (i + 1)
    return LaurentPolynomial(result, "z")


def determinant(diagram: Diagram) -> int:
    """The determinant ``|Δ(-1)| = |det(V + Vᵀ)|`` of the link (0 for a split diagram).

    Parameters: ``diagram`` (not empty).  Returns a non-negative int.

    >>> from movies.diagram.pd import from_pd
    >>> determinant(from_pd([[4, 2, 5, 1], [8, 6, 1, 5], [6, 3, 7, 4], [2, 7, 3, 8]]))
    5
    """
    surface = _seifert_or_raise(diagram)
    if surface.pieces > 1:
        return 0
    matrix = surface.matrix
    size = len(matrix)
    return abs(integer_determinant([[matrix[i][j] + matrix[j][i] for j in range(size)] for i in range(size)]))
