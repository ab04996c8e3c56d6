"""All the classical invariants of a diagram at once, as plain data.

This is what ``movies invariants`` prints; it is also a convenient single call from Python.

>>> from movies.diagram.pd import from_pd
>>> facts = classical_invariants(from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]]))
>>> facts["writhe"], facts["signature"], facts["jones"]
(3, -2, [[1, 1], [3, 1], [4, -1]])
"""

from __future__ import annotations

from fractions import Fraction

from movies.diagram.model import Diagram
from movies.invariants.alexander import alexander_polynomial, determinant
from movies.invariants.jones import jones_polynomial
from movies.invariants.signature import signature


def exponent_json(exponent: Fraction) -> int | str:
    """An exponent for JSON, exact: an int when whole, else a string such as ``"-3/2"``.

    JSON has no exact fractions and the program writes no floating point; ``Fraction(e)``
    reads both forms back.

    >>> exponent_json(Fraction(3)), exponent_json(Fraction(-3, 2))
    (3, '-3/2')
    >>> Fraction(exponent_json(Fraction(-3, 2)))
    Fraction(-3, 2)
    """
    exponent = Fraction(exponent)
    if exponent.denominator == 1:
        return int(exponent)
    return f"{exponent.numerator}/{exponent.denominator}"


def polynomial_terms(polynomial) -> list[list]:
    """[[exponent, coefficient], ...] in increasing exponent order, exponents exact.

    >>> from movies.algebra.laurent import LaurentPolynomial
    >>> from fractions import Fraction
    >>> polynomial_terms(LaurentPolynomial({Fraction(1, 2): -1, Fraction(5, 2): -1}))
    [['1/2', -1], ['5/2', -1]]
    """
    return [[exponent_json(e), c] for e, c in polynomial.terms()]


def classical_invariants(diagram: Diagram) -> dict:
    """Components, crossings, writhe, Jones, signature, linking matrix, Alexander, determinant.

    Parameters
    ----------
    diagram : Diagram
        Any diagram; the empty diagram has no Jones polynomial and is refused.

    Returns
    -------
    dict
        Plain data: polynomials as ``[[exponent, coefficient], ...]``.

    >>> from movies.diagram.pd import from_pd
    >>> classical_invariants(from_pd([[4, 1, 3, 2], [2, 3, 1, 4]]))["linking_matrix"]
    [[0, -1], [-1, 0]]
    """
    alexander = alexander_polynomial(diagram)
    return {
        "components": diagram.component_count(),
        "crossings": diagram.crossing_count(),
        "writhe": diagram.writhe(),
        "seifert_circles": diagram.seifert_circle_count(),
        "split_pieces": diagram.piece_count(),
        "jones": polynomial_terms(jones_polynomial(diagram)),
        "signature": signature(diagram),
        "linking_matrix": diagram.linking_matrix(),
        "alexander": polynomial_terms(alexander),
        "determinant": determinant(diagram),
    }
